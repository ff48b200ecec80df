#!/usr/bin/python3
"""Time numpy.fft.rfft (and irfft) at the lengths of the Go FFT benchmarks.

Usage: /usr/bin/python3 bench/numpy_fft.py [--repeat R] [N ...]
Prints one JSON object: {"numpy": version, "rfft_ns": {N: ns}, "irfft_ns": {N: ns}}
with the median over R repeats of the mean time per call (timeit; the count
per repeat is chosen by Timer.autorange, so each repeat lasts >= 0.2 s).
"""
import json
import statistics
import sys
import timeit

import numpy as np

DEFAULT_LENGTHS = [1024, 2048, 4096, 8192, 16384, 32768, 65536, 5000, 4099]


def per_call_ns(fn, repeat):
    t = timeit.Timer(fn)
    number, _ = t.autorange()
    return statistics.median(t.repeat(repeat, number)) / number * 1e9


def main(argv):
    repeat = 5
    args = list(argv)
    if args[:1] == ["--repeat"]:
        repeat = int(args[1])
        args = args[2:]
    lengths = [int(a) for a in args] or DEFAULT_LENGTHS
    rng = np.random.default_rng(5)
    out = {"numpy": np.__version__, "repeat": repeat, "rfft_ns": {}, "irfft_ns": {}}
    for n in lengths:
        x = rng.standard_normal(n)
        spec = np.fft.rfft(x)
        out["rfft_ns"][str(n)] = per_call_ns(lambda: np.fft.rfft(x), repeat)
        out["irfft_ns"][str(n)] = per_call_ns(lambda: np.fft.irfft(spec, n), repeat)
    json.dump(out, sys.stdout)
    print()


if __name__ == "__main__":
    main(sys.argv[1:])
