#!/usr/bin/env python3
"""Plans an INVENTED demo experiment with thzdrive and prints the headline numbers.

The scenario is examples/demo-scenario.yaml, the one the command-line tool's
demo uses: made up to show what thzdrive computes, it describes no real
instrument or measured material.

Start a server, then run this with Debian's Python (python3-grpcio,
python3-protobuf, python3-numpy, python3-yaml), from the repository root:

    go run ./server/cmd/thzdrived &
    /usr/bin/python3 client/python/examples/plan_demo.py --server 127.0.0.1:50051

--scenario FILE plans your own scenario instead: a PlanExperimentRequest in
the proto JSON mapping (.json, or .yaml/.yml), the same format as the
command-line tool's scenario files.
"""

import argparse
import json
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), ".."))

from google.protobuf import json_format  # noqa: E402

import thzdrive  # noqa: E402
from thzdrive.v1 import plan_pb2  # noqa: E402

# The demo scenario shared with the command-line tool: an INVENTED
# experiment, a PlanExperimentRequest in the proto JSON mapping written as
# YAML (reading it needs PyYAML: Debian's python3-yaml).
DEMO_SCENARIO = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "..",
                                              "examples", "demo-scenario.yaml"))

INVENTED = ("This demo plans examples/demo-scenario.yaml, an INVENTED scenario: the source, the\n"
            "cryostat and the crystal are made up to show what thzdrive computes. They describe\n"
            "no real instrument or material measurement.")


def demo_request():
    """The invented demo plan (examples/demo-scenario.yaml)."""
    return load_scenario(DEMO_SCENARIO)


def demo_pulse():
    """The invented source's waveform shape, as the demo plan gives it."""
    return demo_request().waveform


def load_scenario(path):
    """A PlanExperimentRequest from a JSON (or, with PyYAML, YAML) file."""
    with open(path, encoding="utf-8") as f:
        text = f.read()
    if path.endswith((".yaml", ".yml")):
        try:
            import yaml
        except ImportError:
            sys.exit("plan_demo.py: reading %s needs PyYAML (Debian: apt-get install python3-yaml), "
                     "or give --scenario a .json file" % path)
        obj = yaml.safe_load(text)
    else:
        obj = json.loads(text)
    return json_format.ParseDict(obj, plan_pb2.PlanExperimentRequest())


def main(argv=None):
    ap = argparse.ArgumentParser(description="Plan the invented demo experiment (or --scenario FILE) with thzdrive.")
    ap.add_argument("--server", default=os.environ.get("THZDRIVE_SERVER", "127.0.0.1:50051"),
                    help="thzdrived gRPC address (default $THZDRIVE_SERVER or 127.0.0.1:50051)")
    ap.add_argument("--scenario", help="plan this PlanExperimentRequest (proto JSON mapping, .json or .yaml)")
    ap.add_argument("--json", action="store_true", help="print the headline numbers as JSON")
    args = ap.parse_args(argv)

    request = load_scenario(args.scenario) if args.scenario else demo_request()
    with thzdrive.connect(args.server) as c:
        metrics, f_thz, amp = c.analyze_pulse(request.waveform)
        plan = c.plan(request)

    if args.json:
        out = {"invented": args.scenario is None, "laser_safety": thzdrive.LASER_SAFETY,
               "pulse": metrics._asdict(), "plan": plan.headline._asdict(),
               "cautions": [c.code for c in plan.cautions]}
        print(json.dumps(out, indent=2))
        return 0

    h = plan.headline
    print(INVENTED if args.scenario is None else "Scenario: " + args.scenario)
    print()
    print(thzdrive.LASER_SAFETY)
    print()
    print("Source waveform    spectral peak %.3f THz, centroid %.3f THz, band (-20 dB) %.2f-%.2f THz"
          % (metrics.spectral_peak_thz, metrics.centroid_thz, metrics.band_low_thz, metrics.band_high_thz))
    print("                   spectrum: %d points, 0 to %.1f THz; |E(f)| peaks at %.3f THz"
          % (len(f_thz), f_thz[-1], f_thz[amp.argmax()]))
    print("Source             %.1f kV/cm peak, %.2f uJ, %.1f uJ/cm^2 peak fluence"
          % (h.incident_peak_field_kv_per_cm, h.pulse_energy_uj, h.peak_fluence_uj_per_cm2))
    print("Optics             %.1f kV/cm at the target (x%.3f), absorbed fraction %.4f"
          % (h.target_peak_field_kv_per_cm, h.field_ratio, h.absorbed_fraction))
    print("Mode               max |Q| %.4g A sqrt(amu) at %.2f ps, displacement %.3g pm (Lindemann %.3g)"
          % (h.max_q_a_sqrt_amu, h.max_q_time_ps, h.displacement_pm, h.lindemann_ratio))
    print("                   %.3g meV per cell = %.3g quanta, overlap %.3f"
          % (h.mode_energy_mev, h.quanta, h.overlap))
    print("Heating            peak %.2f K, steady state %.2f K, margin to Tc %.2f K"
          % (h.peak_temperature_k, h.steady_state_temperature_k, h.margin_k))
    print("Q(t)               %d samples from %.2f to %.2f ps" % (len(plan.q_a_sqrt_amu), plan.time_ps[0], plan.time_ps[-1]))
    if plan.cautions:
        print()
        print("Cautions:")
        for c in plan.cautions:
            print("  [%s] %s: %s" % (c.stage or "-", c.code, c.message))
    return 0


if __name__ == "__main__":
    sys.exit(main())
