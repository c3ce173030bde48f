"""Check vectors for docs/methods.md, computed with numpy only.

Run: python3 docs/check-vectors.py
Each block is headed by the section of docs/methods.md whose *computed* values it prints. Inputs are
stated in the code; nothing is read from the project, so the numbers are independent of the TypeScript.
"""
import numpy as np

PI = np.pi
K_AVG = PI / (2 * np.sqrt(2))  # sine form factor: the average-responding meter's scale


def section(title):
    print(f"\n== {title}")


def per_bin_rms(x):
    """RMS of each real DFT bin (DC as its mean)."""
    n = len(x)
    c = np.abs(np.fft.rfft(x) / n) * np.sqrt(2)
    c[0] /= np.sqrt(2)
    return c


# §1.2 closed forms, one period of 1e6 samples, peak 1
section("§1.2 waveform figures (DC-coupled and AC-coupled average-meter error)")
t = np.arange(1_000_000) / 1_000_000
waves = {
    "sine": np.sin(2 * PI * t),
    "square": np.where(t < 0.5, 1.0, -1.0),
    "triangle": 2 * np.abs(2 * ((t + 0.25) % 1) - 1) - 1,
    "sawtooth": 2 * t - 1,
    "half-wave rectified sine": np.maximum(np.sin(2 * PI * t), 0),
    "full-wave rectified sine": np.abs(np.sin(2 * PI * t)),
    "pulse D=0.25": np.where(t < 0.25, 1.0, 0.0),
}
for name, x in waves.items():
    mean, mav, rms, peak = x.mean(), np.abs(x).mean(), np.sqrt((x**2).mean()), np.abs(x).max()
    ac = x - mean
    ac_rms, ac_mav = np.sqrt((ac**2).mean()), np.abs(ac).mean()
    print(f"{name:26s} mean {mean:.5f} MAV {mav:.5f} RMS {rms:.5f} FF {rms / mav:.5f} CF {peak / rms:.5f}"
          f" DC-coupled {100 * (K_AVG * mav / rms - 1):+.2f} %"
          f" | AC RMS {ac_rms:.5f} AC reading {K_AVG * ac_mav:.5f} AC-coupled {100 * (K_AVG * ac_mav / ac_rms - 1):+.2f} %")

# §1.3 mixed-harmonic vector
section("§1.3 230 V + 4.6 V 3rd + 11.5 V 5th + 6.9 V 7th, 10 cycles of 50 Hz at 10 240 S/s")
fs, n = 10240.0, 2048
tt = np.arange(n) / fs
x = np.sqrt(2) * sum(a * np.sin(2 * PI * 50 * h * tt) for h, a in ((1, 230), (3, 4.6), (5, 11.5), (7, 6.9)))
c = per_bin_rms(x)
print(f"RMS {np.sqrt((x**2).mean()):.5f} V, THD_F {100 * np.sqrt(sum(c[10 * h]**2 for h in range(2, 41))) / c[10]:.5f} %")


# §2.4 grouping vector
def group(c, h, n_per=10):
    k, half = h * n_per, n_per // 2
    return np.sqrt(c[k - half]**2 / 2 + sum(c[k + i]**2 for i in range(-half + 1, half)) + c[k + half]**2 / 2)


def subgroup(c, h, n_per=10):
    return np.sqrt(sum(c[h * n_per + i]**2 for i in (-1, 0, 1)))


section("§2.4 grouping vector")
tones = ((50, 230.0), (250, 10.0), (255, 3.0), (270, 2.0), (275, 1.0), (285, 0.5))
x = np.sqrt(2) * sum(a * np.sin(2 * PI * f * tt) for f, a in tones)
c = per_bin_rms(x)
print(f"C_50 {c[50]:.4f}  G_sg,5 {subgroup(c, 5):.4f}  G_g,5 {group(c, 5):.4f}  G_g,6 {group(c, 6):.4f}"
      f"  G_sg,6 {subgroup(c, 6):.4f}")
print(f"C_ig,5 {np.sqrt(sum(c[50 + i]**2 for i in range(1, 10))):.4f}"
      f"  C_isg,5 {np.sqrt(sum(c[50 + i]**2 for i in range(2, 9))):.4f}")

section("§2.5 leakage: 230 V at 50.5 Hz in a 10-cycle 50 Hz window")
c = per_bin_rms(np.sqrt(2) * 230 * np.sin(2 * PI * 50.5 * tt))
print(f"bin 10 {c[10]:.2f}, bin 50 {c[50]:.3f}, THD from bins {100 * np.sqrt(sum(c[10 * h]**2 for h in range(2, 41))) / c[10]:.2f} %,"
      f" subgroup {subgroup(c, 1):.2f}, group {group(c, 1):.2f}")

# §3.4 Urms(1/2) dip
section("§3.4 Urms(1/2): 230 -> 115 V at 200 ms for 100 ms, 10 kS/s")
fs, spc = 10000, 200
k = np.arange(25 * spc)
amp = np.where((k >= 10 * spc) & (k < 15 * spc), 115.0, 230.0)
u = amp * np.sqrt(2) * np.sin(2 * PI * 50 * k / fs)
vals = np.array([np.sqrt((u[i:i + spc]**2).mean()) for i in range(0, len(u) - spc + 1, spc // 2)])
start = int(np.argmax(vals < 207.0))
end = next(i for i in range(start, len(vals)) if vals[i] >= 207.0 + 4.6)
print(f"values {np.round(vals[17:32], 2)}; start window {start * 10}-{start * 10 + 20} ms;"
      f" duration {(end - start) * 10} ms; residual {vals.min():.2f} V")

# §5.3 IEEE 1459 single phase
section("§5.3 IEEE 1459 single-phase vector, 12.8 kS/s, 10 cycles")
fs = 12800.0
tt = np.arange(int(fs * 0.2)) / fs
w = 2 * PI * 50
vh = {1: 230.0, 3: 6.9, 5: 11.5}
ih = {1: (10.0, 30.0), 3: (3.0, -60.0), 5: (2.0, 45.0)}  # (RMS, theta_h = alpha_h - beta_h in degrees)
v = np.sqrt(2) * sum(a * np.sin(h * w * tt) for h, a in vh.items())
i = np.sqrt(2) * sum(a * np.sin(h * w * tt - np.deg2rad(th)) for h, (a, th) in ih.items())
V, I, P = np.sqrt((v**2).mean()), np.sqrt((i**2).mean()), (v * i).mean()
V1, I1, th1 = vh[1], ih[1][0], np.deg2rad(ih[1][1])
VH, IH = np.hypot(vh[3], vh[5]), np.hypot(ih[3][0], ih[5][0])
PH = sum(vh[h] * ih[h][0] * np.cos(np.deg2rad(ih[h][1])) for h in (3, 5))
S, S1 = V * I, V1 * I1
SH = VH * IH
for name, val in (("V", V), ("I", I), ("P", P), ("P1", V1 * I1 * np.cos(th1)), ("PH", PH),
                  ("Q1", V1 * I1 * np.sin(th1)), ("S", S), ("SN", np.sqrt(S**2 - S1**2)), ("DI", V1 * IH),
                  ("DV", VH * I1), ("SH", SH), ("DH", np.sqrt(SH**2 - PH**2)), ("N", np.sqrt(S**2 - P**2)),
                  ("THDV %", 100 * VH / V1), ("THDI %", 100 * IH / I1), ("PF", P / S), ("PF1", np.cos(th1)),
                  ("SN/S1", np.sqrt(S**2 - S1**2) / S1)):
    print(f"  {name:7s} {val:.6f}")


# §5.4 and §7 three phase
def sequence(a_, b_, c_):
    op = np.exp(2j * PI / 3)
    return (a_ + b_ + c_) / 3, (a_ + op * b_ + op * op * c_) / 3, (a_ + op * op * b_ + op * c_) / 3


def polar(mag, deg):
    return mag * np.exp(1j * np.deg2rad(deg))


section("§5.4 / §7 three-phase vector (fundamentals)")
Va, Vb, Vc = polar(230, 0), polar(220, -118), polar(235, 121)
Ia, Ib, Ic = polar(10, -30), polar(12, -150), polar(8, 90)
V0, V1p, V2p = sequence(Va, Vb, Vc)
mags = np.abs([Va, Vb, Vc])
ll = np.abs([Va - Vb, Vb - Vc, Vc - Va])
Ve4 = np.sqrt((3 * (mags**2).sum() + (ll**2).sum()) / 18)
In = Ia + Ib + Ic
Ie = np.sqrt((abs(Ia)**2 + abs(Ib)**2 + abs(Ic)**2 + abs(In)**2) / 3)
Sc = Va * np.conj(Ia) + Vb * np.conj(Ib) + Vc * np.conj(Ic)
_, I1p, _ = sequence(Ia, Ib, Ic)
S1p = 3 * V1p * np.conj(I1p)
Se = 3 * Ve4 * Ie
print(f"|V0| {abs(V0):.4f} |V1| {abs(V1p):.4f} |V2| {abs(V2p):.4f}; line {np.round(ll, 4)}")
print(f"Ve 4-wire {Ve4:.4f}, 3-wire {np.sqrt((ll**2).sum() / 9):.4f}; |In| {abs(In):.4f}; Ie {Ie:.4f}; Se {Se:.2f}")
print(f"P {Sc.real:.3f} Q {Sc.imag:.3f} S_A {np.sum(mags * np.abs([Ia, Ib, Ic])):.3f} S_V {abs(Sc):.3f}"
      f" S1+ {abs(S1p):.3f} (P1+ {S1p.real:.3f}, Q1+ {S1p.imag:.3f}) PF {Sc.real / Se:.5f}"
      f" SU1 {np.sqrt(Se**2 - abs(S1p)**2):.3f}")


def vuf_from_line(l):
    beta = (l**4).sum() / ((l**2).sum())**2
    r = np.sqrt(3 - 6 * beta)
    return beta, 100 * np.sqrt((1 - r) / (1 + r))


def lvur(l):
    return 100 * np.max(np.abs(l - l.mean())) / l.mean()


beta, vuf = vuf_from_line(np.array([460.0, 467.0, 450.0]))
print(f"460/467/450 V: beta {beta:.8f} VUF {vuf:.4f} % LVUR {lvur(np.array([460.0, 467.0, 450.0])):.4f} %")
print(f"phase set: VUF {100 * abs(V2p) / abs(V1p):.4f} % (line-magnitude formula {vuf_from_line(ll)[1]:.4f} %),"
      f" V0/V1 {100 * abs(V0) / abs(V1p):.4f} %, PVUR {100 * np.max(np.abs(mags - mags.mean())) / mags.mean():.4f} %,"
      f" (max-min)/avg {100 * (mags.max() - mags.min()) / mags.mean():.4f} %, LVUR {lvur(ll):.4f} %")

# §6 K-factor and factor K
section("§6 K-factor and factor K on the published spectrum")
h = np.array([1, 5, 7, 11, 13, 17, 19, 23, 25])
r = np.array([1, 0.20, 0.14, 0.091, 0.077, 0.058, 0.056, 0.043, 0.040])
k_factor = (r**2 * h**2).sum() / (r**2).sum()
factor_k = np.sqrt(1 + 0.091 / (r**2).sum() * (r[1:]**2 * h[1:]**1.7).sum())
print(f"I/I1 {np.sqrt((r**2).sum()):.4f}; K-factor {k_factor:.4f}; factor K (q 1.7, e/(1+e) 0.091, n >= 2)"
      f" {factor_k:.5f}, derate to {100 / factor_k:.2f} %")

# §9 frequency
section("§9 frequency: 49.95 Hz, 10 kS/s, 10 s")
fs = 10000.0
tt = np.arange(int(fs * 10)) / fs
x = np.sin(2 * PI * 49.95 * tt + 0.3)
s = np.where((x[:-1] < 0) & (x[1:] >= 0))[0]
tz = (s - x[s] / (x[s + 1] - x[s])) / fs
print(f"zero crossings: {len(tz) - 1} cycles, {(len(tz) - 1) / (tz[-1] - tz[0]):.6f} Hz")
seg = x[:2000] * (0.5 - 0.5 * np.cos(2 * PI * np.arange(2000) / 2000))
mag = np.abs(np.fft.rfft(seg))
k = int(np.argmax(mag))
if mag[k + 1] >= mag[k - 1]:
    a = mag[k + 1] / mag[k]
    d = (2 * a - 1) / (a + 1)
else:
    a = mag[k - 1] / mag[k]
    d = -(2 * a - 1) / (a + 1)
print(f"Hann 2-point: k {k}, delta {d:.5f}, f {(k + d) * fs / 2000:.5f} Hz")
