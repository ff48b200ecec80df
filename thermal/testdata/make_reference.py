#!/usr/bin/python3
"""Reference values for package thermal's tests, computed with Debian's
numpy and scipy (run with /usr/bin/python3, numpy 1.24, scipy 1.10):

    cd thermal/testdata && /usr/bin/python3 make_reference.py

Writes
  debye_reference.csv     C/(3 n kB) and the Debye function D3 by adaptive
                          quadrature (scipy.integrate.quad, QUADPACK qags)
  debye_enthalpy.csv      ∫ C dT between two temperatures for a Debye solid,
                          by quad over T of the quad-evaluated C(T)
  pchip_table.csv         the input table: Debye C/(3 n kB) of Theta = 300 K at
                          eight temperatures, times 1e6 J/(m^3 K)
  pchip_reference.csv     scipy.interpolate.PchipInterpolator values and
                          integrals for that table
  lax_reference.csv       centre rise of a Gaussian spot on a half-space, by
                          quad of the surface Green's function over the spot

Nothing here uses package thermal: the numbers are independent of it.
"""
import csv
import math

import numpy as np
from scipy.integrate import quad
from scipy.interpolate import PchipInterpolator

EPSREL = 1e-13


def heat_integrand(x):
    # x^4 e^x / (e^x - 1)^2 written with e^-x so that it never overflows.
    if x == 0.0:
        return 0.0
    em = math.exp(-x)
    return x**4 * em / (-math.expm1(-x)) ** 2


def energy_integrand(x):
    # x^3 / (e^x - 1) = x^3 e^-x / (1 - e^-x)
    if x == 0.0:
        return 0.0
    return x**3 * math.exp(-x) / (-math.expm1(-x))


def integral(f, y):
    # Split long ranges so that QUADPACK resolves the peak near x ~ 3-4.
    edges = [0.0] + [e for e in (1.0, 4.0, 10.0, 30.0) if e < y] + [y]
    total = 0.0
    for a, b in zip(edges[:-1], edges[1:]):
        v, _ = quad(f, a, b, epsabs=0.0, epsrel=EPSREL, limit=200)
        total += v
    return total


def capacity_ratio(y):
    """C / (3 n kB) = (3 / y^3) ∫_0^y x^4 e^x/(e^x-1)^2 dx, y = Theta/T."""
    return 3.0 * integral(heat_integrand, y) / y**3


def debye3(y):
    """Debye function D3(y) = (3 / y^3) ∫_0^y x^3/(e^x-1) dx."""
    return 3.0 * integral(energy_integrand, y) / y**3


def write_debye():
    ys = [1e-3, 0.01, 0.05, 0.1, 0.25, 0.5, 0.75, 1.0, 1.5, 2.0, 2.5, 2.9,
          3.0, 3.1, 3.5, 4.0, 5.0, 6.0, 7.5, 10.0, 15.0, 20.0, 30.0, 40.0,
          50.0, 75.0, 100.0]
    with open("debye_reference.csv", "w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(["theta_over_t", "capacity_over_3nkb", "debye3"])
        for y in ys:
            w.writerow([repr(y), "%.17g" % capacity_ratio(y), "%.17g" % debye3(y)])


def write_debye_enthalpy():
    # Volumetric enthalpy ∫_{T0}^{T1} C dT with C = 3 n kB capacity_ratio(Theta/T),
    # reported per 3 n kB (unit: K), so the Go test multiplies by 3 n kB.
    cases = [  # theta_k, t0_k, t1_k
        (343.0, 10.0, 20.0),
        (343.0, 4.0, 300.0),
        (343.0, 300.0, 301.0),
        (645.0, 80.0, 95.0),
        (2230.0, 300.0, 1200.0),
        (100.0, 150.0, 900.0),
        (343.0, 2000.0, 2000.001),
        (100.0, 4.0, 4.1),
        (343.0, 80.0, 83.9),
    ]
    with open("debye_enthalpy.csv", "w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(["theta_k", "t0_k", "t1_k", "enthalpy_over_3nkb_k"])
        for theta, t0, t1 in cases:
            v, _ = quad(lambda t: capacity_ratio(theta / t), t0, t1,
                        epsabs=0.0, epsrel=1e-12, limit=200)
            w.writerow([repr(theta), repr(t0), repr(t1), "%.17g" % v])


def write_pchip():
    # Table: the Debye C/(3 n kB) of Theta = 300 K sampled at a few
    # temperatures, scaled by 1e6 J/(m^3 K). The values are only the input of
    # the interpolation; the check values are scipy's interpolant and integral.
    temps = np.array([5.0, 10.0, 20.0, 40.0, 80.0, 150.0, 300.0, 600.0])
    caps = np.array([1e6 * capacity_ratio(300.0 / t) for t in temps])
    p = PchipInterpolator(temps, caps)
    with open("pchip_table.csv", "w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(["temperature_k", "capacity_j_per_m3k"])
        for t, c in zip(temps, caps):
            w.writerow([repr(float(t)), "%.17g" % c])
    probes = [5.0, 7.5, 10.0, 13.0, 27.0, 40.0, 55.5, 99.0, 150.0, 222.0, 300.0, 450.0, 599.0, 600.0]
    spans = [(5.0, 600.0), (7.5, 13.0), (27.0, 222.0), (300.0, 301.0), (10.0, 10.0), (450.0, 599.0)]
    with open("pchip_reference.csv", "w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(["kind", "a_k", "b_k", "value"])
        for t in probes:
            w.writerow(["capacity", repr(t), "", "%.17g" % float(p(t))])
        for a, b in spans:
            w.writerow(["enthalpy", repr(a), repr(b), "%.17g" % float(p.integrate(a, b))])


def write_lax():
    # Centre rise of a Gaussian spot I(r) = P/(pi a^2) exp(-r^2/a^2) on a
    # half-space: superpose the surface point-source rise 1/(2 pi kappa r):
    # dT = ∫_0^inf I(r) / (2 pi kappa r) 2 pi r dr.
    cases = [  # power_w, a_m, kappa_w_per_mk
        (0.45, 0.1e-3, 27.0),  # Incropera et al., problem 4.16 inputs
        (1e-3, 50e-6, 0.1),
        (2.0, 1e-3, 400.0),
    ]
    with open("lax_reference.csv", "w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(["power_w", "radius_one_over_e_m", "conductivity_w_per_mk", "rise_k"])
        for p, a, k in cases:
            f = lambda r: p / (math.pi * a * a) * math.exp(-r * r / (a * a)) / (2 * math.pi * k * r) * 2 * math.pi * r
            v, _ = quad(f, 0.0, 40 * a, epsabs=0.0, epsrel=1e-13, limit=200)
            w.writerow([repr(p), repr(a), repr(k), "%.17g" % v])


if __name__ == "__main__":
    write_debye()
    write_debye_enthalpy()
    write_pchip()
    write_lax()
