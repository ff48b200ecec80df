#!/usr/bin/python3
"""Writes fft_reference.csv, the reference for TestForwardMatchesNumpy.

Run with Debian's interpreter and numpy (python3-numpy):

    /usr/bin/python3 make_fft_reference.py

The file holds six fixed traces (see the lengths in main), each a
first-derivative Gaussian pulse plus a seeded pseudo-random component, and
their one-sided spectra in the project's convention (physics.md section 1):

    E_k = dt * sum_n x_n exp(+2 pi i k n / N) = dt * conj(numpy.fft.rfft(x))[k]

for real x. Every number is written with repr(), which round-trips float64
exactly, so the Go test reads the very trace numpy transformed.

Rows:  step,<case>,<dt>
       trace,<case>,<n>,<x_n>
       spectrum,<case>,<k>,<re>,<im>
"""
import numpy as np

E0 = 1e7                      # V/m (100 kV/cm)
TAU = 1 / (2 * np.pi * 1e12)  # s, 1 THz spectral peak


def trace(n, dt, seed):
    t = (np.arange(n) - n // 2) * dt
    x = E0 * np.sqrt(np.e) * (t / TAU) * np.exp(-t**2 / (2 * TAU**2))
    rng = np.random.default_rng(seed)
    return x + 0.01 * E0 * rng.standard_normal(n)


def main():
    rows = ["# made by make_fft_reference.py with numpy " + np.__version__]
    # Lengths chosen to cover the three paths of pulse.Transform and every
    # radix of its own complex FFT: 1000 = 2*4*5^3, 4096 = 2*4^5*2 and
    # 1350 = 2*3^3*5^2 take the half-length complex FFT; 999 = 3^3*37 and
    # 2018 = 2*1009 take Bluestein's algorithm; 1125 = 3^2*5^3 takes gonum's
    # FFTPACK.
    for case, n, dt, seed in (("even", 1000, 20e-15, 20240611), ("odd", 999, 20e-15, 7),
                              ("pow2", 4096, 5e-15, 11), ("smooth", 1350, 15e-15, 12),
                              ("rough", 2018, 10e-15, 13), ("oddsmooth", 1125, 20e-15, 14)):
        x = trace(n, dt, seed)
        spec = dt * np.conj(np.fft.rfft(x))
        rows.append("step,%s,%r" % (case, dt))
        rows += ["trace,%s,%d,%r" % (case, i, float(v)) for i, v in enumerate(x)]
        rows += ["spectrum,%s,%d,%r,%r" % (case, k, float(c.real), float(c.imag)) for k, c in enumerate(spec)]
    with open("fft_reference.csv", "w") as f:
        f.write("\n".join(rows) + "\n")


if __name__ == "__main__":
    main()
