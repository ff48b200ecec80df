#!/usr/bin/python3
"""Formats the outputs tools/bench collects in one directory as markdown.

Usage: /usr/bin/python3 bench/report.py DIR
DIR holds go_*.txt (go test -bench output), numpy_fft.json, fftw.json,
numpy_plan.json, load_before and load_after. Times are medians over the
repetitions (-count for Go, --repeat for the references); allocations per
operation are the largest seen. Standard library only.
"""
import json
import os
import platform
import re
import statistics
import subprocess
import sys

LINE = re.compile(r"^(Benchmark\S+?)(?:-(\d+))?\s+\d+\s+(.*)$")


def parse_go(path):
    """{name: {"ns": [..], "allocs": [..], "bytes": [..], metric: [..]}}"""
    out = {}
    if not os.path.exists(path):
        return out
    for line in open(path):
        m = LINE.match(line.strip())
        if not m:
            continue
        name, procs, rest = m.group(1), m.group(2), m.group(3)
        key = name if procs is None else f"{name}-{procs}"
        rec = out.setdefault(key, {})
        fields = rest.split()
        for value, unit in zip(fields[0::2], fields[1::2]):
            rec.setdefault(unit, []).append(float(value))
    return out


def med(rec, unit):
    v = rec.get(unit)
    return statistics.median(v) if v else None


def top(rec, unit):
    v = rec.get(unit)
    return max(v) if v else None


def fmt_t(ns):
    if ns is None:
        return "–"
    if ns >= 1e6:
        return f"{ns / 1e6:.2f} ms"
    if ns >= 1e3:
        return f"{ns / 1e3:.1f} µs"
    return f"{ns:.0f} ns"


def fmt_a(x):
    return "–" if x is None else f"{x:.0f}"


def load(d, name):
    p = os.path.join(d, name)
    if not os.path.exists(p):
        return {}
    with open(p) as f:
        return json.load(f)


def find(go, prefix):
    """The record whose name is prefix with any -GOMAXPROCS suffix."""
    for k, v in go.items():
        if k == prefix or re.fullmatch(re.escape(prefix) + r"-\d+", k):
            return v
    return {}


def cpu_model():
    try:
        for line in open("/proc/cpuinfo"):
            if line.startswith("model name"):
                return line.split(":", 1)[1].strip()
    except OSError:
        pass
    return platform.processor() or "unknown"


def main(d):
    go = {}
    for f in sorted(os.listdir(d)):
        if f.startswith("go_") and f.endswith(".txt"):
            go.update(parse_go(os.path.join(d, f)))
    nfft = load(d, "numpy_fft.json")
    fftw = load(d, "fftw.json")
    nplan = load(d, "numpy_plan.json")
    goversion = subprocess.run(["go", "version"], capture_output=True, text=True).stdout.strip()
    lb = open(os.path.join(d, "load_before")).read().split()[:3]
    la = open(os.path.join(d, "load_after")).read().split()[:3]

    print("### Machine\n")
    print(f"- CPU: {cpu_model()}, {os.cpu_count()} logical CPUs (nproc)")
    print(f"- load average (1, 5, 15 min) before: {' '.join(lb)}; after: {' '.join(la)}")
    print(f"- {goversion}; numpy {nfft.get('numpy', '?')}; "
          + (f"FFTW {fftw['fftw']}" if "fftw" in fftw else f"FFTW skipped ({fftw.get('skipped', 'not run')})"))
    print()

    print("### Real FFT (pulse.Transform), median time per transform\n")
    print("| N | Forward | allocs/op | numpy rfft | Forward / numpy | FFTW r2c | Forward / FFTW | Inverse | numpy irfft | Inverse / numpy |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for n in ["1024", "2048", "4096", "8192", "16384", "32768", "65536", "5000", "4099"]:
        f = find(go, f"BenchmarkForward/{n}")
        i = find(go, f"BenchmarkInverse/{n}")
        fns, ins = med(f, "ns/op"), med(i, "ns/op")
        npf = nfft.get("rfft_ns", {}).get(n)
        npi = nfft.get("irfft_ns", {}).get(n)
        fw = fftw.get("r2c_ns", {}).get(n)
        r = lambda a, b: f"{a / b:.2f}" if a and b else "–"
        print(f"| {n} | {fmt_t(fns)} | {fmt_a(top(f, 'allocs/op'))} | {fmt_t(npf)} | {r(fns, npf)} | "
              f"{fmt_t(fw)} | {r(fns, fw)} | {fmt_t(ins)} | {fmt_t(npi)} | {r(ins, npi)} |")
    print()

    print("### Physics stages, median time per call\n")
    print("| benchmark | time | allocs/op | B/op |")
    print("|---|---|---|---|")
    for name in ["BenchmarkPropagate1Layer", "BenchmarkPropagate10Layers",
                 "BenchmarkPlainStack1Layer", "BenchmarkPlainStack10Layers",
                 "BenchmarkEvaluate1Layer", "BenchmarkEvaluate10Layers",
                 "BenchmarkDriveLinear4096", "BenchmarkDriveNonlinear4096"]:
        rec = find(go, name)
        if rec:
            print(f"| {name[len('Benchmark'):]} | {fmt_t(med(rec, 'ns/op'))} | {fmt_a(top(rec, 'allocs/op'))} | {fmt_a(top(rec, 'B/op'))} |")
    print()

    print("### The plan, in-process and over gRPC\n")
    print("| samples | plan.Run | allocs/op | numpy plan | numpy / plan.Run | PlanExperiment in-process | over gRPC | allocs/op | gRPC echo, same payload | gRPC / echo | response |")
    print("|---|---|---|---|---|---|---|---|---|---|---|")
    for n in ["4096", "32768"]:
        run = find(go, f"BenchmarkRun/{n}")
        inp = find(go, f"BenchmarkPlanInProcess/{n}")
        grpc = find(go, f"BenchmarkPlanGRPC/{n}")
        echo = find(go, f"BenchmarkEchoGRPC/{n}")
        npl = nplan.get("plans", {}).get(n, {}).get("ns")
        rn, gn, en = med(run, "ns/op"), med(grpc, "ns/op"), med(echo, "ns/op")
        size = med(grpc, "resp-bytes")
        cells = [n, fmt_t(rn), fmt_a(top(run, "allocs/op")), fmt_t(npl),
                 f"{npl / rn:.2f}×" if rn and npl else "–",
                 fmt_t(med(inp, "ns/op")), fmt_t(gn), fmt_a(top(grpc, "allocs/op")), fmt_t(en),
                 f"{gn / en:.2f}" if gn and en else "–",
                 f"{size / 1e3:.0f} kB" if size else "–"]
        print("| " + " | ".join(cells) + " |")
    print()
    print("The same plan by both (Go's max|Q| is refined between samples, numpy's is the largest sample):\n")
    print("| samples | max\\|Q\\| Go | max\\|Q\\| numpy | field inside Go | numpy | absorbed fraction Go | numpy |")
    print("|---|---|---|---|---|---|---|")
    for n in ["4096", "32768"]:
        p = nplan.get("plans", {}).get(n)
        run = find(go, f"BenchmarkRun/{n}")
        if p and run:
            q, e, a = med(run, "maxQ-A.sqrt(amu)"), med(run, "inside-kV/cm"), med(run, "absorbed-fraction")
            g = lambda x: f"{x:.6g}" if x is not None else "–"
            print(f"| {n} | {g(q)} Å√amu | {p['max_q_a_sqrt_amu']:.6g} Å√amu | {g(e)} kV/cm | "
                  f"{p['inside_peak_kv_per_cm']:.6g} kV/cm | {g(a)} | {p['absorbed_fraction']:.6g} |")
    print()

    print("Where plan.Run's time goes (BenchmarkRunStages, each stage alone on the same inputs):\n")
    print("| samples | calibrate | analyze | propagate | (its Evaluate) | drive the mode |")
    print("|---|---|---|---|---|---|")
    for n in ["4096", "32768"]:
        st = [med(find(go, f"BenchmarkRunStages/{n}/{s}"), "ns/op") for s in
              ["calibrate", "analyze", "propagate", "evaluate", "drive"]]
        if any(st):
            print(f"| {n} | " + " | ".join(fmt_t(x) for x in st) + " |")
    print()

    print("### Sweep of 10 000 points over pulse energy (streamed from a real server on loopback)\n")
    print("| GOMAXPROCS | time per sweep | points/s | speed-up over one core | cores the process got (CPU time / wall time) |")
    print("|---|---|---|---|---|")
    base = None
    sweeps = sorted(((int(re.search(r"procs=(\d+)", k).group(1)), v) for k, v in go.items()
                     if k.startswith("BenchmarkSweep10k/procs=")), key=lambda kv: kv[0])
    for procs, rec in sweeps:
        pts = med(rec, "points/s")
        if base is None:
            base = pts
        used = med(rec, "cores-used")
        print(f"| {procs} | {fmt_t(med(rec, 'ns/op'))} | {pts:.0f} | {pts / base:.2f}× | "
              + (f"{used:.2f} |" if used else "– |"))
    print()

    # The targets of the issue, met or missed.
    print("### Targets\n")
    print("| target | measured | met |")
    print("|---|---|---|")
    f4 = med(find(go, "BenchmarkForward/4096"), "ns/op")
    n4 = nfft.get("rfft_ns", {}).get("4096")
    if f4 and n4:
        print(f"| real FFT at 4 096 within 1.5× of numpy (stretch: match) | {f4 / n4:.2f}× numpy | {'yes' if f4 / n4 <= 1.5 else 'no'}{' (stretch too)' if f4 <= n4 else ''} |")
    r32 = med(find(go, "BenchmarkRun/32768"), "ns/op")
    np32 = nplan.get("plans", {}).get("32768", {}).get("ns")
    if r32 and np32:
        print(f"| plan at 32 768 samples at least 2× faster than numpy | numpy time / plan.Run time = {np32 / r32:.2f} | {'yes' if np32 / r32 >= 2 else 'no'} |")
    for n in ["4096", "32768"]:
        g = med(find(go, f"BenchmarkPlanGRPC/{n}"), "ns/op")
        e = med(find(go, f"BenchmarkEchoGRPC/{n}"), "ns/op")
        if g and e:
            print(f"| PlanExperiment over gRPC within 1.2× of the echo floor ({n}) | {g / e:.2f}× | {'yes' if g / e <= 1.2 else 'no'} |")
    if len(sweeps) >= 2:
        s = med(sweeps[-1][1], "points/s") / med(sweeps[0][1], "points/s")
        print(f"| sweep throughput on {sweeps[-1][0]} cores >= 1.8× one core's | {s:.2f}× | {'yes' if s >= 1.8 else 'no'} |")
    hot = [n for n in ["BenchmarkPlainStack1Layer", "BenchmarkPlainStack10Layers", "BenchmarkEvaluate1Layer",
                       "BenchmarkEvaluate10Layers", "BenchmarkDriveLinear4096"] if find(go, n)]
    allocs = {n: top(find(go, n), "allocs/op") for n in hot}
    print(f"| zero allocations per frequency in the optics and mode hot loops | "
          + ", ".join(f"{n[len('Benchmark'):]} {a:.0f}" for n, a in allocs.items())
          + f" allocs/op | {'yes' if all(a == 0 for a in allocs.values()) else 'no'} |")


if __name__ == "__main__":
    main(sys.argv[1])
