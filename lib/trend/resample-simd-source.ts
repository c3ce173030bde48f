/**
 * The WebAssembly text of the window resampler that resample-simd.ts runs (compiled to the bytes in
 * resample-simd-bytes.ts by `npm run build:wasm`; tests/trend/resample-simd.test.ts checks the two agree).
 *
 * resampleL (L = 1 … 4 channels) computes, for each of `m` output points k, on every channel c < L,
 *   out[c·M + k] = Σ_{j=0..7} w[ph[k] + j] · src[c·stride/8 + at[k] + j]
 * the same 8-point Lagrange interpolation as window-thd.ts's JavaScript loops, with the taps' weights
 * loaded once per point for all channels. The eight products are summed in two f64x2 lanes
 * ((j = 0, 2, 4, 6) and (1, 3, 5, 7)), then the lanes added: the same terms in another order, so a
 * point can differ from the JavaScript sum in its last bits (~1e-16 relative).
 *
 * Parameters (byte addresses in the module's memory): tab (weights, 8 per phase), at (int32 first tap
 * per point), ph (int32 weights row per point, already × 8), src (channel 0's samples; channel c at
 * src + c·stride), out (channel 0's M points; channel c at out + c·M·8), m (points).
 */

/** Output points per channel, as window-thd.ts's M. */
export const SIMD_POINTS = 2048;

function channel(c: number): string {
	return `
      (local.set $acc (f64x2.add
        (f64x2.add (f64x2.mul (v128.load (local.get $s)) (local.get $w01)) (f64x2.mul (v128.load offset=16 (local.get $s)) (local.get $w23)))
        (f64x2.add (f64x2.mul (v128.load offset=32 (local.get $s)) (local.get $w45)) (f64x2.mul (v128.load offset=48 (local.get $s)) (local.get $w67)))))
      (f64.store offset=${c * SIMD_POINTS * 8} (local.get $o)
        (f64.add (f64x2.extract_lane 0 (local.get $acc)) (f64x2.extract_lane 1 (local.get $acc))))
      (local.set $s (i32.add (local.get $s) (local.get $stride)))`;
}

function resampleFunction(lanes: number): string {
	const channels = Array.from({ length: lanes }, (_, c) => channel(c)).join('');
	return `
  (func (export "resample${lanes}") (param $tab i32) (param $at i32) (param $ph i32) (param $src i32) (param $stride i32) (param $out i32) (param $m i32)
    (local $k i32) (local $w i32) (local $s i32) (local $o i32)
    (local $w01 v128) (local $w23 v128) (local $w45 v128) (local $w67 v128) (local $acc v128)
    (if (i32.eqz (local.get $m)) (then (return)))
    (loop $point
      (local.set $w (i32.add (local.get $tab) (i32.shl (i32.load (i32.add (local.get $ph) (i32.shl (local.get $k) (i32.const 2)))) (i32.const 3))))
      (local.set $s (i32.add (local.get $src) (i32.shl (i32.load (i32.add (local.get $at) (i32.shl (local.get $k) (i32.const 2)))) (i32.const 3))))
      (local.set $w01 (v128.load (local.get $w)))
      (local.set $w23 (v128.load offset=16 (local.get $w)))
      (local.set $w45 (v128.load offset=32 (local.get $w)))
      (local.set $w67 (v128.load offset=48 (local.get $w)))
      (local.set $o (i32.add (local.get $out) (i32.shl (local.get $k) (i32.const 3))))${channels}
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br_if $point (i32.lt_u (local.get $k) (local.get $m)))))`;
}

/**
 * The module's text: resample1 … resample4 over a memory the caller makes (imported as host.mem), never
 * grown here: growing a memory detaches its old buffer, and one detached buffer anywhere makes V8 check
 * every typed-array access in optimised code for detachment from then on (the whole analysis ~25 % slower,
 * measured).
 */
export function resampleSimdWat(): string {
	return `(module
  (import "host" "mem" (memory 1))${[1, 2, 3, 4].map(resampleFunction).join('')})
`;
}
