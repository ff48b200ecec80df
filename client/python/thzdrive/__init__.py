"""Python client of thzdrive, the terahertz pump-experiment planning service.

    import thzdrive
    with thzdrive.connect("127.0.0.1:50051") as c:
        metrics, f_thz, amp = c.analyze_pulse(thzdrive.single_cycle(1.0, 100.0))

thzdrive.v1 holds the messages and gRPC stubs generated from
proto/thzdrive/v1 (regenerate with `go generate ./api/...` at the repository
root); thzdrive.helpers the thin layer that returns numpy arrays and
namedtuples. Needs grpcio, protobuf (>= 4.21) and numpy; on Debian 12 the
packages python3-grpcio, python3-protobuf and python3-numpy.

Laser safety: thzdrive plans experiments with class 4 pump lasers and
invisible THz and near-infrared beams; it does not make them safe. The local
laser safety officer, the facility's rules and IEC 60825-1 / ANSI Z136.1
govern.
"""

from thzdrive.helpers import (  # noqa: F401
    LASER_SAFETY,
    SERVICE_CONFIG,
    Caution,
    Client,
    Plan,
    PlanHeadline,
    PulseMetrics,
    Sweep,
    bad_request_fields,
    connect,
    single_cycle,
    trace_time_ps,
)
from thzdrive.v1 import caution_pb2, mode_pb2, optics_pb2, plan_pb2, pulse_pb2, thermal_pb2  # noqa: F401

__all__ = [
    "LASER_SAFETY", "SERVICE_CONFIG", "Caution", "Client", "Plan", "PlanHeadline", "PulseMetrics",
    "Sweep", "bad_request_fields", "connect", "single_cycle", "trace_time_ps",
    "caution_pb2", "mode_pb2", "optics_pb2", "plan_pb2", "pulse_pb2", "thermal_pb2",
]
