#!/usr/bin/python3
"""Independent reference for the optics package's multilayer solver.

Run with Debian's interpreter and numpy (not the python3 first on PATH):

    /usr/bin/python3 optics/testdata/tmm_reference.py > optics/testdata/tmm_reference.json

It computes r, t, R, T and the absorptance of each layer of seeded random
stacks with a different formulation from the Go code: wave amplitudes and
Fresnel interface matrices (Born & Wolf, Principles of Optics, 7th ed.,
§1.5-1.6; the interface/propagation-matrix method as described by Katsidis &
Siapkas, Appl. Opt. 41, 3978 (2002) and by Byrnes, arXiv:1603.02720), with
Born & Wolf's sign convention for p, where r_p = (nb cos ta - na cos tb) /
(nb cos ta + na cos tb) is minus the package's r_p, and t_p is the same.
The layer absorptance is the Poynting flux entering the layer minus the flux
leaving it, from the forward and backward amplitudes at each interface.
"""
import json

import numpy as np


def q_of(n, beta):
    """Normal index n*cos(theta) on the branch Im q >= 0."""
    q = np.sqrt(complex(n) ** 2 - beta ** 2 + 0j)
    if q.imag < 0 or (q.imag == 0 and q.real < 0):
        q = -q
    return q


def fresnel_bw(pol, na, nb, qa, qb):
    """Born & Wolf Fresnel coefficients in terms of q = n cos(theta)."""
    if pol == "s":
        return (qa - qb) / (qa + qb), 2 * qa / (qa + qb)
    ca, cb = qa / na, qb / nb  # cos(theta)
    den = nb * ca + na * cb
    return (nb * ca - na * cb) / den, 2 * na * ca / den


def solve(pol, n_amb, layers, n_exit, angle, freq):
    c = 299792458.0
    k0 = 2 * np.pi * freq / c
    beta = n_amb * np.sin(angle)
    ns = [complex(n_amb)] + [complex(n) for n, _ in layers] + [complex(n_exit)]
    ds = [0.0] + [d for _, d in layers] + [0.0]
    qs = [q_of(n, beta) for n in ns]
    if pol == "p" and beta == 0:
        pol_eff = "s"  # identical at normal incidence up to the p sign convention
    else:
        pol_eff = pol
    m = np.eye(2, dtype=complex)
    mats = []
    for j in range(len(ns) - 1):
        r, t = fresnel_bw(pol_eff, ns[j], ns[j + 1], qs[j], qs[j + 1])
        if j > 0:
            dlt = k0 * qs[j] * ds[j]
            p = np.array([[np.exp(-1j * dlt), 0], [0, np.exp(1j * dlt)]])
        else:
            p = np.eye(2, dtype=complex)
        lmat = np.array([[1, r], [r, 1]]) / t
        mats.append(p @ lmat)
        m = m @ p @ lmat
    t = 1 / m[0, 0]
    r = m[1, 0] / m[0, 0]
    if pol == "p" and beta == 0:
        r = -r  # Born & Wolf sign for p at normal incidence

    # Amplitudes (forward v, backward w) at the start of each medium
    # (just after its front interface; for the ambient, at the interface).
    vw = [None] * len(ns)
    vw[-1] = np.array([t, 0])
    for j in range(len(ns) - 2, -1, -1):
        vw[j] = mats[j] @ vw[j + 1]

    def flux(j, v, w):
        n, q = ns[j], qs[j]
        if pol == "s" or beta == 0:
            return ((v + w) * np.conj(q * (v - w))).real
        cos = q / n
        # Born & Wolf p: tangential E = cos(v - w), Z0*H_y = n(v + w)
        return (cos * (v - w) * np.conj(n * (v + w))).real

    s_inc = qs[0].real
    absorb = []
    for j in range(1, len(ns) - 1):
        v, w = vw[j]
        dlt = k0 * qs[j] * ds[j]
        s_in = flux(j, v, w)
        s_out = flux(j, v * np.exp(1j * dlt), w * np.exp(-1j * dlt))
        absorb.append((s_in - s_out) / s_inc)
    big_t = flux(len(ns) - 1, t, 0) / s_inc
    return r, t, abs(r) ** 2, big_t, absorb


def main():
    rng = np.random.default_rng(20240611)
    cases = []
    for k in range(48):
        pol = "s" if k % 2 == 0 else "p"
        n_amb = float(rng.uniform(1.0, 2.0))
        nl = int(rng.integers(1, 6))
        layers = []
        for _ in range(nl):
            n = complex(rng.uniform(0.3, 4.0), rng.uniform(0.0, 0.6))
            d = float(rng.uniform(0.0, 60e-6))
            layers.append((n, d))
        n_exit = complex(rng.uniform(1.0, 4.0), rng.uniform(0.0, 0.3))
        angle = 0.0 if k % 6 < 2 else float(rng.uniform(0.0, np.radians(85.0)))
        freq = float(rng.uniform(0.1e12, 3e12))
        r, t, big_r, big_t, absorb = solve(pol, n_amb, layers, n_exit, angle, freq)
        cases.append({
            "pol": pol,
            "ambient_n": n_amb,
            "layers": [{"n": [n.real, n.imag], "thickness_m": d} for n, d in layers],
            "exit_n": [n_exit.real, n_exit.imag],
            "angle_rad": angle,
            "freq_hz": freq,
            "r_born_wolf": [r.real, r.imag],
            "t": [t.real, t.imag],
            "R": big_r,
            "T": big_t,
            "A_layers": absorb,
        })
    json.dump({"generator": "tmm_reference.py (numpy %s)" % np.__version__, "cases": cases}, __import__("sys").stdout, indent=1)


if __name__ == "__main__":
    main()
