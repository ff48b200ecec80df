#!/usr/bin/python3
"""Independent references for package tdsfit's tests.

Run with Debian's interpreter, numpy and scipy (not the python3 first on
PATH), from the repository root:

    /usr/bin/python3 tdsfit/testdata/make_references.py

It writes three files next to itself:

slab_reference.json
    The transfer function of a slab in air relative to air, T =
    4n/(1+n)^2 * exp(i(n-1)wd/c) * sum_{j=0}^{M} (r^2 exp(2inwd/c))^j, with
    the Fabry-Perot sum added term by term (M = 0, a finite number of
    echoes, or until the terms fall below 1e-18 for all echoes), in the
    e^{-iwt} convention of physics.md section 1 (Duvillaret, Garet & Coutaz,
    IEEE J. Sel. Top. Quantum Electron. 2, 739 (1996)).

eo_reference.json
    The electro-optic response G(f) = t_THz * (1/L) int_0^L exp(i dk z) dz
    of ZnTe and GaP detectors, the integral done numerically with
    scipy.integrate.quad, the index from the Lorentz models of the optics
    catalogue (read from optics/materials.json), t_THz = 2/(1+n).

fit_reference.json
    A seeded noisy permittivity of a two-oscillator Lorentz + Drude model
    and its weighted least-squares fit by scipy.optimize.curve_fit
    (Levenberg-Marquardt, MINPACK), with pcov = s^2 (J^T J)^-1
    (absolute_sigma=False): the parameters and their one-sigma errors.
"""
import json
import os

import numpy as np
from scipy import integrate, optimize

C = 299792458.0
HERE = os.path.dirname(os.path.abspath(__file__))


def slab_T(n, f, d, echoes):
    k0d = 2 * np.pi * f * d / C
    r = (n - 1) / (n + 1)
    x = r * r * np.exp(2j * n * k0d)
    s, term, j = 0j, 1 + 0j, 0
    while True:
        s += term
        j += 1
        if echoes >= 0 and j > echoes:
            break
        term = term * x
        if echoes < 0 and abs(term) < 1e-18:
            break
    return 4 * n / (1 + n) ** 2 * np.exp(1j * (n - 1) * k0d) * s


def slab_reference():
    cases = []
    for n, f, d in [
        (3.4175 + 0j, 1.0e12, 500e-6),
        (3.4175 + 0j, 0.3e12, 500e-6),
        (3.4175 + 0.002j, 2.2e12, 1e-3),
        (1.52 + 0.01j, 0.7e12, 2e-3),
        (3.2 + 0.05j, 4.1e12, 20e-6),
        (13.5 + 1.84j, 5.28e12, 20e-6),
        (2.0 + 0.5j, 1.5e12, 100e-6),
    ]:
        for echoes in (0, 1, 3, -1):
            t = slab_T(n, f, d, echoes)
            cases.append({"n": n.real, "kappa": n.imag, "freq_hz": f, "thickness_m": d,
                          "echoes": echoes, "re": t.real, "im": t.imag})
    return {"generator": "tdsfit/testdata/make_references.py", "cases": cases}


def lorentz_eps(entry, f):
    lz = entry["lorentz"]
    w = 2 * np.pi * f
    eps = complex(lz["eps_inf"])
    for o in lz["oscillators"]:
        W = 2 * np.pi * o["freq_thz"] * 1e12
        g = 2 * np.pi * o["width_thz"] * 1e12
        eps += o["delta_eps"] * W * W / (W * W - w * w - 1j * g * w)
    return eps


def index_of(eps):
    n = np.sqrt(complex(eps))
    if n.imag < 0:
        n = -n
    return n


def eo_reference():
    with open(os.path.join(HERE, "..", "..", "optics", "materials.json")) as fh:
        mats = {m["name"]: m for m in json.load(fh)["materials"]}
    out = []
    for name, L, ng in [("znte", 1e-3, 3.13), ("gap", 300e-6, 3.56), ("znte", 100e-6, 3.13)]:
        for fthz in [0.1, 0.5, 1.0, 1.7, 2.5, 3.0, 4.0, 5.0, 5.32, 6.0, 8.0, 10.98, 12.5]:
            f = fthz * 1e12
            n = index_of(lorentz_eps(mats[name], f))
            dk = 2 * np.pi * f / C * (n - ng)
            re = integrate.quad(lambda z: (np.exp(1j * dk * z)).real, 0, L, epsabs=1e-16, epsrel=1e-13, limit=2000)[0]
            im = integrate.quad(lambda z: (np.exp(1j * dk * z)).imag, 0, L, epsabs=1e-16, epsrel=1e-13, limit=2000)[0]
            g = 2 / (1 + n) * (re + 1j * im) / L
            out.append({"material": name, "thickness_m": L, "group_index": ng, "freq_hz": f,
                        "re": g.real, "im": g.imag})
    return {"generator": "tdsfit/testdata/make_references.py", "cases": out}


def fit_model(f, p):
    """eps(f) with f and every frequency parameter in THz."""
    einf, f1, w1, d1, f2, w2, d2, fp, gs = p
    eps = einf + 0j
    for W, g, de in ((f1, w1, d1), (f2, w2, d2)):
        eps = eps + de * W * W / (W * W - f * f - 1j * g * f)
    return eps - fp * fp / (f * f + 1j * gs * f)


def fit_jac(f, p):
    einf, f1, w1, d1, f2, w2, d2, fp, gs = p
    cols = [np.ones_like(f) + 0j]
    for W, g, de in ((f1, w1, d1), (f2, w2, d2)):
        D = W * W - f * f - 1j * g * f
        cols += [2 * de * W * (-f * f - 1j * g * f) / D ** 2, 1j * f * de * W * W / D ** 2, W * W / D]
    Q = f * f + 1j * gs * f
    cols += [-2 * fp / Q, 1j * f * fp * fp / Q ** 2]
    return np.array(cols).T


def fit_reference():
    rng = np.random.default_rng(20240611)
    f = np.linspace(0.2, 8.0, 300)
    truth = np.array([4.0, 2.0, 0.15, 1.2, 5.5, 0.3, 0.8, 3.0, 1.5])
    sigma = 0.01 * (1 + f / 4)
    eps = fit_model(f, truth) + sigma * (rng.standard_normal(f.size) + 1j * rng.standard_normal(f.size))
    p0 = np.array([3.8, 2.05, 0.2, 1.0, 5.4, 0.4, 1.0, 2.7, 1.8])
    ydata = np.concatenate([eps.real, eps.imag])
    sig2 = np.concatenate([sigma, sigma])
    x = np.arange(2 * f.size)

    def model(_x, *p):
        e = fit_model(f, np.array(p))
        return np.concatenate([e.real, e.imag])

    def jac(_x, *p):
        J = fit_jac(f, np.array(p))
        return np.vstack([J.real, J.imag])

    popt, pcov = optimize.curve_fit(model, x, ydata, p0=p0, sigma=sig2, absolute_sigma=False,
                                    method="lm", jac=jac, xtol=1e-15, ftol=1e-15, gtol=1e-15, maxfev=10000)
    res = (model(x, *popt) - ydata) / sig2
    chi2 = float(res @ res)
    # Back to SI: every parameter but eps_inf and the strengths is in THz.
    si = np.array([1, 1e12, 1e12, 1, 1e12, 1e12, 1, 1e12, 1e12])
    return {
        "generator": "tdsfit/testdata/make_references.py",
        "scipy": __import__("scipy").__version__,
        "freq_hz": list(f * 1e12), "eps_re": list(eps.real), "eps_im": list(eps.imag), "sigma": list(sigma),
        "initial": list(p0 * si), "truth": list(truth * si),
        "popt": list(popt * si), "perr": list(np.sqrt(np.diag(pcov)) * si), "chi2": chi2, "dof": int(2 * f.size - 9),
    }


def main():
    for name, fn in (("slab_reference.json", slab_reference), ("eo_reference.json", eo_reference),
                     ("fit_reference.json", fit_reference)):
        with open(os.path.join(HERE, name), "w") as fh:
            json.dump(fn(), fh, indent=1)
            fh.write("\n")


if __name__ == "__main__":
    main()
