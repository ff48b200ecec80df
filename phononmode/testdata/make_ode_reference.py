#!/usr/bin/python3
"""Independent reference for the nonlinear drive of package phononmode.

Solves, with SciPy's DOP853 (Hairer's 8th-order Dormand-Prince pair, adaptive
step, rtol 1e-12), the equation of motion of one mode

    Q'' + g Q' + W^2 Q + a3 Q^2 + a4 Q^3 = Z cos(theta) E(t) + 0.5 eps0 V dEps/dQ E(t)^2

with the work W(t) = int F Q' dt carried as a third component, for the
analytic single-cycle field (first derivative of a Gaussian, physics.md 2)

    E(t) = E0 sqrt(e) ((t - t0)/tau) exp(-(t - t0)^2 / (2 tau^2)),

from rest at t = 0, and writes Q at the sample times, the final work and the
parameters to ode_reference.json. The Go test builds the same mode and the
sampled field from the parameters in that file.

Run with Debian's interpreter (python3-numpy, python3-scipy):
    /usr/bin/python3 make_ode_reference.py
"""
import json
import math

import numpy as np
import scipy
from scipy.integrate import solve_ivp

# CODATA 2018 (physics.md 0).
EPS0 = 8.8541878128e-12
E_CHARGE = 1.602176634e-19
DALTON = 1.66053906660e-27
THZ = 1e12

p = {
    "freq_hz": 2.0 * THZ,
    "linewidth_hz": 0.1 * THZ,
    "zstar_c_per_sqrt_kg": E_CHARGE / math.sqrt(DALTON),  # 1 e/sqrt(amu)
    "cell_volume_m3": 100e-30,  # 100 A^3
    "a3_per_m_sqrt_kg_s2": 2.0e48,
    "a4_per_m2_kg_s2": 3.0e71,
    "deps_dq_per_m_sqrt_kg": 1.0e25,
    "polar_angle_rad": 0.3,
    "e0_v_per_m": 3.0e8,  # 3 MV/cm
    "tau_s": 1.0 / (2 * math.pi * 2.0 * THZ),
    "t0_s": 0.5e-12,
    "start_s": 0.0,
    "step_s": 5e-15,
    "samples": 1201,
}

W = 2 * math.pi * p["freq_hz"]
G = 2 * math.pi * p["linewidth_hz"]
ZC = p["zstar_c_per_sqrt_kg"] * math.cos(p["polar_angle_rad"])
RAMAN = 0.5 * EPS0 * p["cell_volume_m3"] * p["deps_dq_per_m_sqrt_kg"]
A3 = p["a3_per_m_sqrt_kg_s2"]
A4 = p["a4_per_m2_kg_s2"]

# Scaled variables for conditioning: t = TS*tau, Q = QS*y0, Q' = QS/TS*y1,
# work = QS^2/TS^2*y2.
TS = 1e-12
QS = 1e-24


def field(t):
    x = (t - p["t0_s"]) / p["tau_s"]
    return p["e0_v_per_m"] * math.sqrt(math.e) * x * math.exp(-x * x / 2)


def rhs(tau, y):
    t = TS * tau
    q = QS * y[0]
    v = QS / TS * y[1]
    e = field(t)
    f = ZC * e + RAMAN * e * e
    acc = f - G * v - W * W * q - A3 * q * q - A4 * q * q * q
    return [y[1], acc * TS * TS / QS, f * v * TS * TS * TS / (QS * QS)]


times = p["start_s"] + p["step_s"] * np.arange(p["samples"])
sol = solve_ivp(rhs, (times[0] / TS, times[-1] / TS), [0.0, 0.0, 0.0],
                method="DOP853", t_eval=times / TS, rtol=1e-12, atol=1e-14,
                max_step=p["step_s"] / TS)
assert sol.success, sol.message

out = {
    "generator": "make_ode_reference.py, scipy %s solve_ivp DOP853 rtol=1e-12 atol=1e-14 (scaled)"
                 % scipy.__version__,
    "params": p,
    "q_m_sqrt_kg": [float(QS * y) for y in sol.y[0]],
    "work_j": float(QS * QS / (TS * TS) * sol.y[2][-1]),
}
with open("ode_reference.json", "w") as fh:
    json.dump(out, fh, indent=1)
print("max|Q| =", max(abs(q) for q in out["q_m_sqrt_kg"]), "work =", out["work_j"])
