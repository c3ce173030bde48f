"""Aliasing bound of the flickermeter's block squares (docs/flicker.md, "Block squares"), numpy only.

Run: python3 docs/flicker-alias-bound.py
Nothing is read from the project: the kernel, the decimation rule and the filters are restated here from
their closed forms, so the numbers are independent of the TypeScript.

Model: v = sum_h a_h sin(h theta + phi_h), harmonics below fs/2 only (the recorder's anti-alias filter). v^2 holds a_i a_j at (i - j) f0 and (i + j) f0 (i != j) and
a_i^2 / 2 at 2 i f0; the demodulator divides by mean(v^2) = sum a_h^2 / 2. Every component above F/2
(F = fs/D, the chain rate; frequencies first folded at fs, as the samples hold them) folds to its distance from the nearest multiple of F, attenuated by the kernel
at its true frequency. The folded tones are weighted by the chain (0.05 Hz high-pass, 6th-order Butterworth,
lamp filter: analogue formulas) and added with their phases aligned (the worst case). A steady weighted tone
of amplitude w gives a Pinst of at most S w^2 (S: the scale that makes 0.25 % at 8.8 Hz give max Pinst 1),
and a constant Pinst P gives Pst = sqrt(0.5096 P) (the Pst weights sum to 0.5096).
"""
import numpy as np

MIN_CHAIN_HZ = 1600.0
PST_WEIGHT_SUM = 0.0314 + 0.0525 + 0.0657 + 0.28 + 0.08


def decimation(fs):
    """The rule of lib/flicker/design.ts: the largest D with fs/D >= 1600 that divides the (whole) rate,
    unless that leaves the chain at 3200 S/s or more: then the largest that divides 10 minutes of samples."""
    most = int(fs // MIN_CHAIN_HZ)

    def largest_dividing(n):
        for d in range(most, 1, -1):
            if n % d == 0:
                return d
        return 1

    d = largest_dividing(fs)
    return d if 2 * d > most else max(d, largest_dividing(round(600 * fs)))


def kernel(f, d, fs, order):
    """order 2: triangle of 2D taps (the code's kernel); order 1: a plain D-sample block mean."""
    if d == 1:
        return np.ones_like(f)
    x = np.pi * f / fs
    s = np.sin(x)
    box = np.where(s == 0, 1.0, np.sin(d * x) / np.where(s == 0, 1.0, d * s))
    return np.abs(box) if order == 1 else box * box * np.abs(np.cos(x))


def weighting(f, lamp):
    """|F(j w)| of the lamp filter, IEC 61000-4-15:2010, 5.4 (from memory)."""
    k, lam, f1, f2, f3, f4 = {
        "230V": (1.74802, 4.05981, 9.15494, 2.27979, 1.22535, 21.9),
        "120V": (1.6357, 4.167375, 9.077169, 2.939902, 1.394468, 17.31512),
    }[lamp]
    t = 2 * np.pi
    w, w1, w2, w3, w4, l = t * f, t * f1, t * f2, t * f3, t * f4, t * lam
    bp = k * w1 * w / np.hypot(w1 * w1 - w * w, 2 * l * w)
    return bp * np.hypot(1, w / w2) / (np.hypot(1, w / w3) * np.hypot(1, w / w4))


def chain(f, nominal, lamp):
    hp = f / np.hypot(f, 0.05)
    lp = 1 / np.sqrt(1 + (f / {50: 35.0, 60: 42.0}[nominal]) ** 12)
    return hp * lp * weighting(f, lamp)


def scale():
    g = chain(np.array([8.8]), 50, "230V")[0]
    h = 1 / np.hypot(1, 2 * np.pi * 2 * 8.8 * 0.3)
    return 2 / ((g * 0.0025) ** 2 * (1 + h))


def compatibility_levels():
    """IEC 61000-2-2:2002 Table 1, LV compatibility levels in % of the fundamental (from memory), all at once."""
    a = {1: 100.0, 2: 2.0, 3: 5.0, 4: 1.0, 5: 6.0, 6: 0.5, 7: 5.0, 9: 1.5, 11: 3.5, 13: 3.0, 15: 0.4, 21: 0.3}
    for h in range(8, 51):
        if h in a:
            continue
        if h % 2 == 0:
            a[h] = 0.25 * 10 / h + 0.25
        elif h % 3 == 0:
            a[h] = 0.2 if h <= 45 else 0.0
        elif h >= 17:
            a[h] = 2.27 * 17 / h - 0.27
    return {h: v / 100 for h, v in a.items() if v > 0}


def odd_only(a):
    return {h: v for h, v in a.items() if h % 2 == 1}


def v2_lines(a):
    """Frequencies (in multiples of f0) and amplitudes of v^2 / mean(v^2), phases aligned."""
    mean = sum(x * x for x in a.values()) / 2
    lines = {}
    hs = sorted(a)
    for i in hs:
        lines[2 * i] = lines.get(2 * i, 0) + a[i] ** 2 / 2
        for j in hs:
            if j < i:
                lines[i - j] = lines.get(i - j, 0) + a[i] * a[j]
                lines[i + j] = lines.get(i + j, 0) + a[i] * a[j]
    m = np.array(sorted(lines))
    return m, np.array([lines[k] for k in m]) / mean


def worst(nominal, lamp, f0s, rates, order, a):
    """Largest Pinst the folding adds, and where: (pinst, fs, f0)."""
    s = scale()
    best = (0.0, None, None)
    for fs in rates:
        d = decimation(fs)
        fc = fs / d
        for f0 in f0s:
            # the recorder's anti-alias filter: no harmonic at or above fs/2
            m, amp = v2_lines({h: x for h, x in a.items() if h * f0 < fs / 2})
            f = np.abs(m * f0 - np.round(m * f0 / fs) * fs)  # what the squares hold at the input rate
            fold = f > fc / 2  # what the block squares fold (the chain at fs would not)
            fa = np.abs(f - np.round(f / fc) * fc)
            w = np.sum(amp[fold] * kernel(f[fold], d, fs, order) * chain(fa[fold], nominal, lamp))
            pinst = s * w * w
            if pinst > best[0]:
                best = (pinst, fs, f0)
    return best


def report():
    a = compatibility_levels()
    print(f"THD of the spectrum used: {100 * np.sqrt(sum(v * v for h, v in a.items() if h > 1)):.1f} %")
    rates = sorted(set(list(range(3200, 26001, 100)) + [6400, 10000, 12800, 25600, 50000, 100000, 1_000_000]))
    cases = [(50, "230V", np.arange(47.0, 52.0001, 0.02)), (60, "120V", np.arange(56.4, 62.4001, 0.02))]
    for nominal, lamp, f0s in cases:
        for order, name in [(2, "triangle (the code)"), (1, "block mean only")]:
            p, fs, f0 = worst(nominal, lamp, f0s, rates, order, a)
            pst = np.sqrt(PST_WEIGHT_SUM * p)
            print(
                f"{nominal} Hz, {lamp} lamp, {name}: worst Pinst {p:.2e} (Pst {pst:.4f}) at fs {fs} S/s, f0 {f0:.2f} Hz"
            )
    # the case of tests/flicker/decimated.test.ts: odd harmonics only, fs = 12800 S/s (D = 8, F = 1600)
    for f0 in [50.0, 50.275, 60.0, 60.275]:
        nominal, lamp = (50, "230V") if f0 < 55 else (60, "120V")
        for order in (2, 1):
            p, _, _ = worst(nominal, lamp, [f0], [12800], order, odd_only(a))
            print(f"odd harmonics, fs 12800, f0 {f0}: order {order}: Pinst {p:.2e}, Pst {np.sqrt(PST_WEIGHT_SUM * p):.4f}")


if __name__ == "__main__":
    report()
