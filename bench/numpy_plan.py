#!/usr/bin/python3
"""The benchmark plan computed the way a careful lab does it in numpy, entirely
in the frequency domain: the reference for plan.Run (BenchmarkRun in
plan/bench_test.go, the same inputs; invented, not a measurement).

  source   1 THz single cycle (first derivative of a Gaussian), sampled every
           dt over the span, calibrated to 1 uJ in a 400 um (1/e^2 radius)
           spot: F0 = 2W/(pi w^2), E_peak = sqrt(Z0 F0 / integral g^2 dt)
           (physics.md section 3)
  window   1 mm of a lossless n = 3.4175 slab, first pass only, relative to
           air: t = 4n/(1+n)^2 exp(i w (n-1) d/c)
  sample   bulk crystal, eps(w) = eps_inf + dEps W^2/(W^2 - w^2 - i g w),
           eps_inf = 8, 2 THz, 0.15 THz wide, dEps = 2; n~ = sqrt(eps),
           field inside t = 2/(1 + n~) (screened by its own mode)
  mode     that oscillator: Q(w) = Z* E_in(w)/(W^2 - w^2 - i g w),
           Z* = W sqrt(dEps eps0 V), V = 150 A^3 (Born and Huang)

One rfft of the zero-padded calibrated trace, the transfer functions as
vectorised array expressions (physics convention e^{-iwt}, conjugated once
for numpy's e^{-2 pi i kn/N} forward sign), one irfft for the field inside
and one for Q(t). It returns the numbers a lab reads off: incident and inside
peak field, max|Q|, and the absorbed fraction (1 - |r|^2 weighted by the
incident power spectrum).

Usage: /usr/bin/python3 bench/numpy_plan.py [--repeat R]
Prints one JSON object: for each case ("4096": 2 000 samples of 10 fs padded
to 4 096; "32768": 20 000 samples of 2 fs, 40 ps, padded to 32 768) the
median over R repeats of the mean time per plan (timeit, the count per
repeat from Timer.autorange) and the plan's headline numbers.
"""
import json
import statistics
import sys
import timeit

import numpy as np

C = 299792458.0
Z0 = 376.730313668
EPS0 = 8.8541878128e-12
AMU = 1.66053906660e-27
A_SQRT_AMU = 1e-10 * np.sqrt(AMU)  # 1 angstrom * sqrt(amu) in m sqrt(kg)
KV_PER_CM = 1e5

CASES = {"4096": (10e-15, 20e-12, 4096), "32768": (2e-15, 40e-12, 32768)}


def shape(dt, span, f_peak=1e12):
    """The single cycle as plan's pulse.Model samples it (centred window)."""
    n = int(round(span / dt))
    t = -n * dt / 2 + dt * np.arange(n)
    tau = 1 / (2 * np.pi * f_peak)
    return t, np.sqrt(np.e) * (t / tau) * np.exp(-0.5 * (t / tau) ** 2)


def plan(g, dt, n_fft, energy=1e-6, spot=400e-6, n_win=3.4175, d_win=1e-3,
         eps_inf=8.0, f_mode=2e12, width=0.15e12, d_eps=2.0, cell=150e-30):
    # Calibration by pulse energy and spot.
    f0 = 2 * energy / (np.pi * spot * spot)
    gn = g / np.abs(g).max()
    e_peak = np.sqrt(Z0 * f0 / (np.dot(gn, gn) * dt))
    e_inc = gn * e_peak

    # One forward transform (numpy's sign: the conjugate of the physics one).
    spec = np.fft.rfft(e_inc, n_fft)
    w = 2 * np.pi * np.fft.rfftfreq(n_fft, dt)

    # Transfer to the inside of the sample, physics convention e^{-iwt}.
    t_win = 4 * n_win / (1 + n_win) ** 2 * np.exp(1j * w * (n_win - 1) * d_win / C)
    W, gam = 2 * np.pi * f_mode, 2 * np.pi * width
    den = W * W - w * w - 1j * gam * w
    eps = eps_inf + d_eps * W * W / den
    n_s = np.sqrt(eps)  # principal branch: kappa >= 0 for a passive eps
    t_in = 2 / (1 + n_s)
    h = t_win * t_in
    h[0] = 0  # a radiated pulse has no DC component
    z_star = W * np.sqrt(d_eps * EPS0 * cell)

    inside_spec = np.conj(h) * spec
    e_in = np.fft.irfft(inside_spec, n_fft)
    q = np.fft.irfft(inside_spec * np.conj(z_star / den), n_fft)

    # Absorbed fraction: all that enters the half-space, 1 - |r|^2, behind
    # the window's first pass, weighted by the incident power per bin.
    r = (1 - n_s) / (1 + n_s)
    a = (1 - np.abs(r) ** 2) * np.abs(t_win) ** 2
    p = spec.real ** 2 + spec.imag ** 2
    absorbed = np.dot(a[1:], p[1:]) / p.sum()
    return {
        "incident_peak_kv_per_cm": e_peak / KV_PER_CM,
        "inside_peak_kv_per_cm": np.abs(e_in).max() / KV_PER_CM,
        "max_q_a_sqrt_amu": np.abs(q).max() / A_SQRT_AMU,
        "absorbed_fraction": absorbed,
    }


def main(argv):
    repeat = 5
    if argv[:1] == ["--repeat"]:
        repeat = int(argv[1])
    out = {"numpy": np.__version__, "repeat": repeat, "plans": {}}
    for name, (dt, span, n_fft) in CASES.items():
        _, g = shape(dt, span)
        res = plan(g, dt, n_fft)
        t = timeit.Timer(lambda: plan(g, dt, n_fft))
        number, _ = t.autorange()
        res["ns"] = statistics.median(t.repeat(repeat, number)) / number * 1e9
        res["samples"] = len(g)
        res["fft_length"] = n_fft
        out["plans"][name] = res
    json.dump(out, sys.stdout)
    print()


if __name__ == "__main__":
    main(sys.argv[1:])
