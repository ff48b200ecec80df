#!/usr/bin/python3
"""Writes windows_reference.csv and spline_reference.csv, the references for
TestWindowsMatchScipy and TestResampleMatchesScipy.

Run with Debian's interpreter, numpy and scipy (python3-numpy, python3-scipy):

    /usr/bin/python3 make_window_spline_reference.py

windows_reference.csv: symmetric windows of scipy.signal.windows
(sym=True), rows  <name>,<alpha>,<N>,<n>,<w_n>  (alpha 0 where unused).

spline_reference.csv: a fixed set of non-uniform sample times (a uniform
grid with seeded jitter) of a first-derivative Gaussian, and the natural
cubic spline through them (scipy.interpolate.CubicSpline, bc_type="natural")
evaluated on the uniform grid that pulse.Resample documents: step = median
spacing (numpy.median), start = first time, last point not after the last
time. Rows:  knot,<i>,<t_i>,<y_i>   grid,<start>,<step>   value,<j>,<y_j>
"""
import numpy as np
from scipy.interpolate import CubicSpline
from scipy.signal import windows


def write_windows():
    rows = ["# made by make_window_spline_reference.py with scipy windows, sym=True"]
    for n in (8, 9, 10, 33):
        for name, alpha, w in (
            ("hann", 0, windows.hann(n, sym=True)),
            ("blackman", 0, windows.blackman(n, sym=True)),
            ("tukey", 0.5, windows.tukey(n, 0.5, sym=True)),
            ("tukey", 0.3, windows.tukey(n, 0.3, sym=True)),
            ("tukey", 1.0, windows.tukey(n, 1.0, sym=True)),
        ):
            rows += ["%s,%r,%d,%d,%r" % (name, alpha, n, i, float(v)) for i, v in enumerate(w)]
    with open("windows_reference.csv", "w") as f:
        f.write("\n".join(rows) + "\n")


def write_spline():
    rng = np.random.default_rng(31415)
    h = 25e-15
    n = 400
    t = (np.arange(n) - n / 2) * h + rng.uniform(-0.3, 0.3, n) * h
    tau = 1 / (2 * np.pi * 1e12)
    y = 1e7 * np.sqrt(np.e) * (t / tau) * np.exp(-t**2 / (2 * tau**2))
    step = float(np.median(np.diff(t)))
    m = int(np.floor((t[-1] - t[0]) / step * (1 + 1e-12))) + 1
    grid = t[0] + np.arange(m) * step
    grid = np.minimum(grid, t[-1])
    vals = CubicSpline(t, y, bc_type="natural")(grid)
    rows = ["# made by make_window_spline_reference.py with scipy CubicSpline, natural"]
    rows += ["knot,%d,%r,%r" % (i, float(a), float(b)) for i, (a, b) in enumerate(zip(t, y))]
    rows.append("grid,%r,%r" % (float(t[0]), step))
    rows += ["value,%d,%r" % (j, float(v)) for j, v in enumerate(vals)]
    with open("spline_reference.csv", "w") as f:
        f.write("\n".join(rows) + "\n")


if __name__ == "__main__":
    write_windows()
    write_spline()
