"""Tests of the Python client against a real thzdrived.

Run with Debian's Python (python3-grpcio, python3-protobuf, python3-numpy)
from the repository root (tools/check does):

    /usr/bin/python3 -m unittest discover -s client/python/tests -v

setUpClass builds thzdrived and the Go reference client (goclient/) with
`go build` into a temporary directory, starts thzdrived on 127.0.0.1 with
ports picked by the system (--grpc-listen/--http-listen 127.0.0.1:0, the
addresses read from its JSON log), and stops it with SIGTERM at the end,
requiring a clean drain (exit 0). Every wait is bounded.
"""

import json
import math
import os
import shutil
import signal
import subprocess
import sys
import tempfile
import time
import unittest
import urllib.error
import urllib.request

HERE = os.path.dirname(os.path.abspath(__file__))
PYROOT = os.path.dirname(HERE)  # client/python
REPO = os.path.dirname(os.path.dirname(PYROOT))
sys.path.insert(0, PYROOT)
sys.path.insert(0, os.path.join(PYROOT, "examples"))

import grpc  # noqa: E402
import numpy as np  # noqa: E402
from google.protobuf import json_format  # noqa: E402

import plan_demo  # noqa: E402
import thzdrive  # noqa: E402
from thzdrive.v1 import plan_pb2, pulse_pb2  # noqa: E402

REL = 1e-12  # the bound for numbers compared between clients


def assert_same_tree(tc, path, a, b):
    """a and b (JSON-like trees) hold the same keys, strings and numbers, the
    numbers to REL relative. Keys with default values may be absent on one
    side (both encoders omit them); those compare as 0/""/False/[]."""
    if isinstance(a, dict) or isinstance(b, dict):
        a, b = a or {}, b or {}
        tc.assertIsInstance(a, dict, path)
        tc.assertIsInstance(b, dict, path)
        for k in sorted(set(a) | set(b)):
            assert_same_tree(tc, path + "." + k, a.get(k), b.get(k))
    elif isinstance(a, list) or isinstance(b, list):
        a, b = a or [], b or []
        tc.assertEqual(len(a), len(b), path)
        for i, (x, y) in enumerate(zip(a, b)):
            assert_same_tree(tc, "%s[%d]" % (path, i), x, y)
    elif isinstance(a, (int, float)) or isinstance(b, (int, float)):
        if isinstance(a, bool) or isinstance(b, bool):
            tc.assertEqual(bool(a), bool(b), path)
            return
        x, y = float(a or 0), float(b or 0)
        tc.assertTrue(math.isfinite(x) and math.isfinite(y), path)
        tc.assertLessEqual(abs(x - y), REL * max(abs(x), abs(y)), "%s: %r vs %r" % (path, a, b))
    else:
        tc.assertEqual(a or "", b or "", path)


def to_tree(msg):
    return json_format.MessageToDict(msg, preserving_proto_field_name=True)


class ClientTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        if shutil.which("go") is None:
            raise unittest.SkipTest("go is not on PATH: cannot build thzdrived")
        cls.tmp = tempfile.mkdtemp(prefix="thzdrive-pytest-")
        cls.thzdrived = os.path.join(cls.tmp, "thzdrived")
        cls.goclient = os.path.join(cls.tmp, "goclient")
        subprocess.run(["go", "build", "-o", cls.thzdrived, "./server/cmd/thzdrived"], cwd=REPO, check=True, timeout=600)
        subprocess.run(["go", "build", "-o", cls.goclient, "./client/python/tests/goclient"], cwd=REPO, check=True, timeout=600)
        cls.log_path = os.path.join(cls.tmp, "thzdrived.log")
        cls.log = open(cls.log_path, "wb")
        env = {k: v for k, v in os.environ.items() if not k.startswith("THZDRIVE_")}
        cls.proc = subprocess.Popen(
            [cls.thzdrived, "--grpc-listen", "127.0.0.1:0", "--http-listen", "127.0.0.1:0", "--log-format", "json"],
            stdout=cls.log, stderr=cls.log, env=env)
        cls.grpc_addr = cls.http_addr = None
        deadline = time.monotonic() + 30
        while (cls.grpc_addr is None or cls.http_addr is None) and time.monotonic() < deadline:
            if cls.proc.poll() is not None:
                break
            with open(cls.log_path, "rb") as f:
                for line in f:
                    try:
                        rec = json.loads(line)
                    except ValueError:
                        continue
                    cls.grpc_addr = rec.get("grpc", cls.grpc_addr)
                    cls.http_addr = rec.get("http", cls.http_addr)
            time.sleep(0.05)
        if cls.grpc_addr is None or cls.http_addr is None:
            cls._stop()
            with open(cls.log_path, "rb") as f:
                raise RuntimeError("thzdrived did not report its addresses:\n" + f.read().decode(errors="replace"))
        cls.client = thzdrive.connect(cls.grpc_addr, timeout=60)

    @classmethod
    def _stop(cls):
        if cls.proc.poll() is None:
            cls.proc.send_signal(signal.SIGTERM)
            try:
                cls.proc.wait(timeout=30)
            except subprocess.TimeoutExpired:
                cls.proc.kill()
                cls.proc.wait(timeout=10)
        cls.log.close()

    @classmethod
    def tearDownClass(cls):
        cls.client.close()
        cls._stop()
        code = cls.proc.returncode
        shutil.rmtree(cls.tmp, ignore_errors=True)
        if code != 0:
            raise AssertionError("thzdrived did not drain cleanly on SIGTERM: exit %s" % code)

    def go_call(self, method, request):
        """The Go client's response to the same request bytes, as a JSON tree."""
        out = subprocess.run([self.goclient, "-server", self.grpc_addr, "-method", method],
                             input=request.SerializeToString(), capture_output=True, timeout=120)
        self.assertEqual(out.returncode, 0, out.stderr.decode(errors="replace"))
        return json.loads(out.stdout)

    # -- Python and Go clients agree (to 1e-12) on the demo --------------

    def test_analyze_pulse_equals_go_client(self):
        request = pulse_pb2.AnalyzePulseRequest(waveform=plan_demo.demo_pulse())
        go = self.go_call("AnalyzePulse", request)
        raw = self.client.call("AnalyzePulse", request)
        assert_same_tree(self, "AnalyzePulseResponse", to_tree(raw), go)
        # The helper's namedtuple and arrays carry the same numbers.
        metrics, f_thz, amp = self.client.analyze_pulse(request)
        for name, value in metrics._asdict().items():
            assert_same_tree(self, "metrics." + name, value, go["metrics"].get(name, 0))
        np.testing.assert_allclose(f_thz, go["spectrum"]["frequency_thz"], rtol=REL, atol=0)
        np.testing.assert_allclose(amp, go["spectrum"]["amplitude_kv_per_cm_per_thz"], rtol=REL, atol=0)

    def test_plan_equals_go_client(self):
        request = plan_demo.demo_request()
        go = self.go_call("PlanExperiment", request)
        plan = self.client.plan(request)
        assert_same_tree(self, "PlanExperimentResponse", to_tree(plan.response), go)
        h = plan.headline
        self.assertLessEqual(abs(h.max_q_a_sqrt_amu - go["mode"]["max_q_a_sqrt_amu"]), REL * h.max_q_a_sqrt_amu)
        self.assertLessEqual(abs(h.peak_temperature_k - go["heating"]["peak_temperature_k"]), REL * h.peak_temperature_k)
        np.testing.assert_allclose(plan.q_a_sqrt_amu, go["mode"]["q"]["q_a_sqrt_amu"], rtol=REL, atol=0)

    def test_http_gateway_equals_grpc(self):
        # The same plan as JSON over HTTP, as LabVIEW would send it.
        request = plan_demo.demo_request()
        body = json_format.MessageToJson(request).encode()
        req = urllib.request.Request("http://%s/v1/experiment:plan" % self.http_addr, data=body,
                                     headers={"Content-Type": "application/json"}, method="POST")
        with urllib.request.urlopen(req, timeout=60) as resp:
            self.assertEqual(resp.status, 200)
            via_http = json.loads(resp.read())
        via_grpc = self.client.call("PlanExperiment", request)
        got = json_format.ParseDict(via_http, plan_pb2.PlanExperimentResponse())
        assert_same_tree(self, "PlanExperimentResponse", to_tree(got), to_tree(via_grpc))

    # -- sanity of the numbers -------------------------------------------

    def test_single_cycle_spectral_peak(self):
        # physics.md §2: a single cycle (first derivative of a Gaussian) with
        # f_peak = 1 THz peaks at 1 THz; E0 = 100 kV/cm gives a plane-wave
        # fluence of 10.18 uJ/cm^2 (worked check derived from the Gaussian
        # integral).
        metrics, f_thz, amp = self.client.analyze_pulse(thzdrive.single_cycle(1.0, 100.0, step_fs=5, span_ps=40))
        self.assertLessEqual(abs(metrics.spectral_peak_thz - 1.0), metrics.resolution_thz)
        self.assertLessEqual(abs(f_thz[np.argmax(amp)] - 1.0), metrics.resolution_thz)
        self.assertAlmostEqual(metrics.fluence_uj_per_cm2 / 10.177, 1.0, delta=0.005)
        self.assertAlmostEqual(metrics.peak_field_kv_per_cm, 100.0, delta=0.1)
        self.assertTrue(np.all(np.diff(f_thz) > 0))
        self.assertEqual(f_thz.shape, amp.shape)

    def test_plan_arrays(self):
        plan = self.client.plan(plan_demo.demo_request())
        q, t = plan.q_a_sqrt_amu, plan.time_ps
        self.assertEqual(q.shape, t.shape)
        self.assertGreater(len(q), 100)
        # The headline max |Q| is refined between samples: at least the
        # largest sample, and close to it.
        self.assertLessEqual(np.abs(q).max(), plan.headline.max_q_a_sqrt_amu * (1 + REL))
        self.assertGreater(np.abs(q).max(), plan.headline.max_q_a_sqrt_amu * (1 - 1e-3))
        step = plan.response.mode.q.step_fs * 1e-3
        np.testing.assert_allclose(np.diff(t), step, rtol=1e-9)
        # Causality (physics.md §1): the mode is at rest long before the
        # pulse, up to what of its ringing wraps around the periodic
        # transform window (measured ~1.4e-6 of the peak for this plan).
        self.assertLess(np.abs(q[t < -5]).max(), 1e-5 * np.abs(q).max())
        self.assertTrue(all(c.code.startswith("CAUTION_CODE_") for c in plan.cautions))

    def test_sweep_linear_mode_scales_with_sqrt_energy(self):
        # A linear mode's amplitude is proportional to the field, and the
        # field to the square root of the pulse energy: 4x energy, 2x Q.
        request = plan_pb2.SweepRequest(plan=plan_demo.demo_request(), axes=[
            plan_pb2.SweepAxis(parameter="calibration.pulse_energy_uj", values=[0.5, 1.0, 2.0])])
        sw = self.client.sweep(request)
        self.assertEqual(list(sw.index), [0, 1, 2])
        self.assertEqual(sw.coordinates.shape, (3, 1))
        self.assertEqual(sw.errors, {})
        q = sw.headline["max_q_a_sqrt_amu"]
        self.assertAlmostEqual(q[2] / q[0], 2.0, delta=1e-9)
        e = sw.headline["pulse_energy_uj"]
        np.testing.assert_allclose(e, [0.5, 1.0, 2.0], rtol=1e-12)

    def test_bad_request_names_the_field(self):
        bad = pulse_pb2.Waveform(trace=pulse_pb2.SampledTrace(
            step_fs=10, field=[0, 1, 2, float("nan"), 1, 0, 0, 0]))
        with self.assertRaises(grpc.RpcError) as cm:
            self.client.analyze_pulse(bad)
        self.assertEqual(cm.exception.code(), grpc.StatusCode.INVALID_ARGUMENT)
        fields = [f for f, _ in thzdrive.bad_request_fields(cm.exception)]
        self.assertEqual(fields, ["waveform.trace.field[3]"])

    # -- the README's example and the example script ---------------------

    def test_readme_python_example(self):
        with open(os.path.join(REPO, "README.md"), encoding="utf-8") as f:
            readme = f.read()
        marker = "<!-- python-example"
        self.assertIn(marker, readme)
        block = readme.split(marker, 1)[1].split("```python\n", 1)[1].split("```", 1)[0]
        self.assertIn("127.0.0.1:50051", block)
        out = subprocess.run([sys.executable, "-c", block.replace("127.0.0.1:50051", self.grpc_addr)],
                             cwd=REPO, capture_output=True, text=True, timeout=120)
        self.assertEqual(out.returncode, 0, out.stderr)
        spectral_peak, fluence, argmax = (float(x) for x in out.stdout.split())
        self.assertAlmostEqual(spectral_peak, 1.0, delta=0.05)  # 1 THz single cycle
        self.assertAlmostEqual(fluence / 10.177, 1.0, delta=0.005)  # physics.md §2 worked check
        self.assertAlmostEqual(argmax, 1.0, delta=0.05)


    def test_example_script(self):
        script = os.path.join(PYROOT, "examples", "plan_demo.py")
        out = subprocess.run([sys.executable, script, "--server", self.grpc_addr],
                             capture_output=True, text=True, timeout=120)
        self.assertEqual(out.returncode, 0, out.stderr)
        for needle in ("INVENTED", "class 4", "IEC 60825-1", "ANSI Z136.1", "laser safety officer",
                       "spectral peak 1.500 THz", "max |Q|", "Heating"):
            self.assertIn(needle, out.stdout)
        js = subprocess.run([sys.executable, script, "--server", self.grpc_addr, "--json"],
                            capture_output=True, text=True, timeout=120)
        self.assertEqual(js.returncode, 0, js.stderr)
        doc = json.loads(js.stdout)
        self.assertTrue(doc["invented"])
        self.assertIn("IEC 60825-1", doc["laser_safety"])
        want = self.client.plan(plan_demo.demo_request()).headline._asdict()
        assert_same_tree(self, "headline", doc["plan"], want)


if __name__ == "__main__":
    unittest.main()
