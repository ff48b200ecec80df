#!/usr/bin/python3
"""Writes model_reference.csv, the reference for TestModelMatchesQuadrature.

Run with Debian's interpreter and scipy (python3-scipy):

    /usr/bin/python3 make_model_reference.py

For each model waveform of physics.md section 2 (written out again here
from the formulas, not from the Go code) it integrates numerically, with
scipy.integrate.quad (QUADPACK), the square integral  int E(t)^2 dt  and the
spectrum  E(w) = int E(t) exp(+i w t) dt  (physics.md section 1) at a few
frequencies, so the closed forms in model.go are checked against an
independent quadrature. Rows:

    model,<case>,<shape>,<peak_hz>,<carrier_hz>,<fwhm_s>,<phase_rad>,<e0_v_per_m>
    square,<case>,<value>
    spectrum,<case>,<f_hz>,<re>,<im>,<quad error estimate>
"""
import numpy as np
from scipy.integrate import quad

CASES = [
    # case, shape, peak_hz, carrier_hz, fwhm_s, phase_rad, e0
    ("single", "SingleCycle", 1e12, 0, 0, 0, 1e7),
    ("lobe", "CentralLobe", 1e12, 0, 0, 0, 1e7),
    ("lobe07", "CentralLobe", 0.7e12, 0, 0, 0, 3e6),
    ("carrier", "Carrier", 0, 2e12, 0.5e-12, 0.7, 1e7),
    ("fewcycle", "Carrier", 0, 0.3e12, 2e-12, 1.2, 2e6),
]


def field(shape, peak, carrier, fwhm, phase, e0):
    if shape == "SingleCycle":
        tau = 1 / (2 * np.pi * peak)
        return lambda t: e0 * np.sqrt(np.e) * (t / tau) * np.exp(-t**2 / (2 * tau**2)), 12 * tau
    if shape == "CentralLobe":
        tau = np.sqrt(2) / (2 * np.pi * peak)
        return lambda t: e0 * (1 - t**2 / tau**2) * np.exp(-t**2 / (2 * tau**2)), 12 * tau
    a = 2 * np.log(2) / fwhm**2
    return lambda t: e0 * np.exp(-a * t**2) * np.cos(2 * np.pi * carrier * t + phase), 6 * fwhm


def main():
    rows = ["# made by make_model_reference.py with scipy.integrate.quad"]
    for case, shape, peak, carrier, fwhm, phase, e0 in CASES:
        e, half = field(shape, peak, carrier, fwhm, phase, e0)
        rows.append("model,%s,%s,%r,%r,%r,%r,%r" % (case, shape, peak, carrier, fwhm, phase, e0))
        # Integrate in units of ps and V/m, then rescale, so that quad's
        # absolute tolerance means something.
        s = 1e-12
        sq, _ = quad(lambda u: e(u * s)**2, -half / s, half / s, epsabs=0, epsrel=1e-13, limit=500)
        rows.append("square,%s,%r" % (case, sq * s))
        fref = peak if peak else carrier
        for f in (0.25 * fref, 0.5 * fref, fref, 1.7 * fref, 3 * fref):
            w = 2 * np.pi * f * s
            re, ere = quad(lambda u: e(u * s), -half / s, half / s, weight="cos", wvar=w, epsabs=0, epsrel=1e-12, limit=500)
            im, eim = quad(lambda u: e(u * s), -half / s, half / s, weight="sin", wvar=w, epsabs=0, epsrel=1e-12, limit=500)
            rows.append("spectrum,%s,%r,%r,%r,%r" % (case, f, re * s, im * s, max(ere, eim) * s))
    with open("model_reference.csv", "w") as f:
        f.write("\n".join(rows) + "\n")


if __name__ == "__main__":
    main()
