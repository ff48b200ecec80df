"""Thin helpers over the generated thzdrive.v1 stubs.

connect() opens a channel to one or more thzdrived servers and returns a
Client whose methods take the generated request messages and return numpy
arrays and namedtuples of the headline numbers. Nothing here computes
physics: every number comes from the server. For anything the helpers do not
cover, Client.stub is the generated PumpPlannerStub.

    import thzdrive
    with thzdrive.connect("127.0.0.1:50051") as c:
        metrics, f_thz, amp = c.analyze_pulse(thzdrive.single_cycle(1.0, 100.0))
        print(metrics.spectral_peak_thz)

Laser safety: thzdrive plans experiments with class 4 pump lasers and
invisible THz and near-infrared beams; it does not make them safe. The local
laser safety officer, the facility's rules and IEC 60825-1 / ANSI Z136.1
govern.
"""

import collections
import json

import grpc
import numpy as np
from google.protobuf import descriptor_pb2, descriptor_pool, message_factory

from thzdrive.v1 import caution_pb2
from thzdrive.v1 import optics_pb2
from thzdrive.v1 import plan_pb2
from thzdrive.v1 import pulse_pb2
from thzdrive.v1 import service_pb2_grpc

__all__ = [
    "LASER_SAFETY",
    "SERVICE_CONFIG",
    "Caution",
    "Client",
    "Plan",
    "PlanHeadline",
    "PulseMetrics",
    "Sweep",
    "bad_request_fields",
    "connect",
    "single_cycle",
    "trace_time_ps",
]

LASER_SAFETY = (
    "Laser safety: the pump lasers behind table-top THz sources are class 4, and "
    "THz and near-infrared beams are invisible. thzdrive plans an experiment; it "
    "does not make it safe. Your local laser safety officer, your facility's rules "
    "and IEC 60825-1 / ANSI Z136.1 govern."
)

# The same gRPC service config as the Go client (client.ServiceConfig):
# round-robin over every resolved address, retries of UNAVAILABLE calls.
# Every PumpPlanner method is stateless and idempotent.
SERVICE_CONFIG = json.dumps({
    "loadBalancingConfig": [{"round_robin": {}}],
    "methodConfig": [{
        "name": [{"service": "thzdrive.v1.PumpPlanner"}],
        "retryPolicy": {
            "maxAttempts": 5,
            "initialBackoff": "0.05s",
            "maxBackoff": "1s",
            "backoffMultiplier": 2,
            "retryableStatusCodes": ["UNAVAILABLE"],
        },
    }],
})


def _scalar_tuple(name, descriptor):
    """A namedtuple type with the singular scalar fields of a message, in
    proto order and with the proto names (so units stay in the names)."""
    fields = [f.name for f in descriptor.fields
              if f.label != f.LABEL_REPEATED and f.type != f.TYPE_MESSAGE]
    return collections.namedtuple(name, fields)


# Headline numbers of a waveform: every field of thzdrive.v1.PulseMetrics.
PulseMetrics = _scalar_tuple("PulseMetrics", pulse_pb2.PulseMetrics.DESCRIPTOR)

# One caution: code name (e.g. "CAUTION_CODE_NOT_DECAYED"), stage, message,
# and the numbers behind it as {name_with_unit: value}.
Caution = collections.namedtuple("Caution", ["code", "stage", "message", "values"])

# Headline numbers of a plan, stage by stage (0 where a stage is absent).
PlanHeadline = collections.namedtuple("PlanHeadline", [
    # source
    "incident_peak_field_kv_per_cm", "peak_fluence_uj_per_cm2", "pulse_energy_uj", "spectral_peak_thz",
    # optics
    "target_peak_field_kv_per_cm", "field_ratio", "absorbed_fraction",
    # mode
    "peak_field_inside_kv_per_cm", "max_q_a_sqrt_amu", "max_q_time_ps", "displacement_pm",
    "lindemann_ratio", "mode_energy_mev", "quanta", "overlap",
    # heating
    "peak_temperature_k", "steady_state_temperature_k", "margin_k",
])

# A plan: the headline numbers, Q(t) at the target and its depth average
# (Å·sqrt(amu)) on the time axis time_ps, the cautions, and the whole
# PlanExperimentResponse.
Plan = collections.namedtuple("Plan", [
    "headline", "time_ps", "q_a_sqrt_amu", "depth_average_q_a_sqrt_amu", "cautions", "response"])

# A sweep: the points in grid order. index (n,), coordinates (n, axes) in
# each axis' unit, headline {SweepHeadline field: array (n,)} (NaN where a
# point failed), errors {index: SweepPointError}.
Sweep = collections.namedtuple("Sweep", ["index", "coordinates", "headline", "errors"])

_SWEEP_FIELDS = [f.name for f in plan_pb2.SweepHeadline.DESCRIPTOR.fields
                 if f.label != f.LABEL_REPEATED]


def single_cycle(peak_frequency_thz, peak_field_kv_per_cm, step_fs=10.0, span_ps=20.0):
    """A model single-cycle waveform (first derivative of a Gaussian)."""
    return pulse_pb2.Waveform(model=pulse_pb2.ModelPulse(
        shape=pulse_pb2.PULSE_SHAPE_SINGLE_CYCLE,
        peak_frequency_thz=peak_frequency_thz,
        peak_field_kv_per_cm=peak_field_kv_per_cm,
        step_fs=step_fs,
        span_ps=span_ps,
    ))


def trace_time_ps(trace):
    """The time axis (ps) of a SampledTrace or ModeTrace as a numpy array."""
    if len(getattr(trace, "time_ps", ())) > 0:
        return np.asarray(trace.time_ps, dtype=float)
    n = len(trace.field) if hasattr(trace, "field") else len(trace.q_a_sqrt_amu)
    return trace.start_ps + trace.step_fs * 1e-3 * np.arange(n, dtype=float)


def _cautions(msgs):
    return [Caution(caution_pb2.CautionCode.Name(c.code), c.stage, c.message,
                    {v.name: v.value for v in c.values}) for c in msgs]


def _plan_headline(r):
    s, o, m, h = r.source, r.optics, r.mode, r.heating
    return PlanHeadline(
        s.peak_field_kv_per_cm, s.peak_fluence_uj_per_cm2, s.pulse_energy_uj, s.spectral_peak_thz,
        o.target_peak_field_kv_per_cm, o.field_ratio, o.absorbed_fraction,
        m.peak_field_inside_kv_per_cm, m.max_q_a_sqrt_amu, m.max_q_time_ps, m.displacement_pm,
        m.lindemann_ratio, m.mode_energy_mev, m.quanta, m.overlap,
        h.peak_temperature_k, h.steady_state_temperature_k, h.margin_k,
    )


class Client:
    """A connection to thzdrived. Use connect() to make one."""

    def __init__(self, channel, token=None, timeout=120.0):
        self.channel = channel
        self.stub = service_pb2_grpc.PumpPlannerStub(channel)
        self.timeout = timeout
        self._metadata = (("authorization", "Bearer " + token),) if token else None

    def close(self):
        self.channel.close()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()

    def call(self, method, request, timeout=None):
        """Calls a unary method by name ("PlanExperiment", ...) and returns
        the response message."""
        return getattr(self.stub, method)(
            request, timeout=timeout or self.timeout, metadata=self._metadata)

    def analyze_pulse(self, waveform_or_request, timeout=None):
        """AnalyzePulse of a Waveform (or a whole AnalyzePulseRequest).
        Returns (PulseMetrics, frequency_thz, amplitude_kv_per_cm_per_thz)."""
        req = waveform_or_request
        if isinstance(req, pulse_pb2.Waveform):
            req = pulse_pb2.AnalyzePulseRequest(waveform=req)
        r = self.call("AnalyzePulse", req, timeout)
        metrics = PulseMetrics(*(getattr(r.metrics, f) for f in PulseMetrics._fields))
        return (metrics,
                np.asarray(r.spectrum.frequency_thz, dtype=float),
                np.asarray(r.spectrum.amplitude_kv_per_cm_per_thz, dtype=float))

    def plan(self, request, timeout=None):
        """PlanExperiment. Returns a Plan (headline numbers, Q(t) arrays,
        cautions, the whole response)."""
        r = self.call("PlanExperiment", request, timeout)
        q = r.mode.q
        return Plan(_plan_headline(r), trace_time_ps(q),
                    np.asarray(q.q_a_sqrt_amu, dtype=float),
                    np.asarray(q.depth_average_q_a_sqrt_amu, dtype=float),
                    _cautions(r.cautions), r)

    def sweep(self, request, timeout=None):
        """Sweep, collected into arrays in grid order (the server streams
        points as they are ready, in any order)."""
        points = list(self.stub.Sweep(request, timeout=timeout or self.timeout, metadata=self._metadata))
        points.sort(key=lambda p: p.index)
        n = len(points)
        index = np.array([p.index for p in points], dtype=np.int64)
        axes = len(request.axes)
        coords = np.array([list(p.coordinates) for p in points], dtype=float).reshape(n, axes)
        headline = {f: np.full(n, np.nan) for f in _SWEEP_FIELDS}
        errors = {}
        for i, p in enumerate(points):
            if p.HasField("error"):
                errors[p.index] = p.error
                continue
            for f in _SWEEP_FIELDS:
                headline[f][i] = getattr(p.headline, f)
        return Sweep(index, coords, headline, errors)

    def list_materials(self, timeout=None):
        """The material catalogue as a list of Material messages."""
        return list(self.call("ListMaterials", optics_pb2.ListMaterialsRequest(), timeout).materials)


def connect(address="127.0.0.1:50051", token=None, root_certificates=None, tls=False, timeout=120.0):
    """Opens a channel to thzdrived and returns a Client.

    address: a gRPC target, "host:port"; "dns:///name:port" balances
    round-robin over every address the name resolves to, and
    "ipv4:10.0.0.1:50051,10.0.0.2:50051" over a fixed list. Calls that find
    a replica gone (UNAVAILABLE) are retried by gRPC itself.
    token: a bearer token, sent with every call (servers run with
    --token-file). tls / root_certificates: TLS, with the system roots or
    the given PEM bytes. timeout: default deadline of a call, seconds.
    """
    options = [
        ("grpc.service_config", SERVICE_CONFIG),
        ("grpc.enable_retries", 1),
        ("grpc.max_receive_message_length", 256 << 20),
        ("grpc.max_send_message_length", 256 << 20),
    ]
    if tls or root_certificates is not None:
        channel = grpc.secure_channel(address, grpc.ssl_channel_credentials(root_certificates), options)
    else:
        channel = grpc.insecure_channel(address, options)
    return Client(channel, token=token, timeout=timeout)


def _rpc_status_classes():
    """google.rpc.Status and google.rpc.BadRequest message classes, built in a
    private descriptor pool so that the googleapis-common-protos package is
    not needed (and does not clash when it is installed)."""
    f = descriptor_pb2.FileDescriptorProto(name="thzdrive_private/google_rpc.proto", package="google.rpc",
                                           syntax="proto3")
    opt = descriptor_pb2.FieldDescriptorProto
    st = f.message_type.add(name="Status")
    st.field.add(name="code", number=1, type=opt.TYPE_INT32, label=opt.LABEL_OPTIONAL)
    st.field.add(name="message", number=2, type=opt.TYPE_STRING, label=opt.LABEL_OPTIONAL)
    st.field.add(name="details", number=3, type=opt.TYPE_MESSAGE, label=opt.LABEL_REPEATED,
                 type_name=".google.rpc.AnyDetail")
    anyd = f.message_type.add(name="AnyDetail")  # google.protobuf.Any's wire layout
    anyd.field.add(name="type_url", number=1, type=opt.TYPE_STRING, label=opt.LABEL_OPTIONAL)
    anyd.field.add(name="value", number=2, type=opt.TYPE_BYTES, label=opt.LABEL_OPTIONAL)
    br = f.message_type.add(name="BadRequest")
    br.field.add(name="field_violations", number=1, type=opt.TYPE_MESSAGE, label=opt.LABEL_REPEATED,
                 type_name=".google.rpc.BadRequest.FieldViolation")
    fv = br.nested_type.add(name="FieldViolation")
    fv.field.add(name="field", number=1, type=opt.TYPE_STRING, label=opt.LABEL_OPTIONAL)
    fv.field.add(name="description", number=2, type=opt.TYPE_STRING, label=opt.LABEL_OPTIONAL)
    pool = descriptor_pool.DescriptorPool()
    pool.Add(f)
    get = getattr(message_factory, "GetMessageClass", None)
    if get is None:  # protobuf < 4.22
        get = message_factory.MessageFactory(pool).GetPrototype
    return (get(pool.FindMessageTypeByName("google.rpc.Status")),
            get(pool.FindMessageTypeByName("google.rpc.BadRequest")))


_STATUS = None


def bad_request_fields(error):
    """The (field path, reason) pairs of the google.rpc.BadRequest detail of
    a failed call (a grpc.RpcError with INVALID_ARGUMENT), e.g.
    [("waveform.trace.field[3]", "must be a number, got NaN")]; [] if none."""
    global _STATUS
    if _STATUS is None:
        _STATUS = _rpc_status_classes()
    status_cls, bad_request_cls = _STATUS
    out = []
    for key, value in (error.trailing_metadata() or ()):
        if key != "grpc-status-details-bin":
            continue
        st = status_cls.FromString(value)
        for d in st.details:
            if d.type_url.endswith("/google.rpc.BadRequest"):
                out += [(v.field, v.description) for v in bad_request_cls.FromString(d.value).field_violations]
    return out
