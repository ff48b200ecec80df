from thzdrive.v1 import extract_pb2 as _extract_pb2
from thzdrive.v1 import mode_pb2 as _mode_pb2
from thzdrive.v1 import optics_pb2 as _optics_pb2
from thzdrive.v1 import plan_pb2 as _plan_pb2
from thzdrive.v1 import pulse_pb2 as _pulse_pb2
from thzdrive.v1 import thermal_pb2 as _thermal_pb2
from google.protobuf import descriptor as _descriptor
from typing import ClassVar as _ClassVar

DESCRIPTOR: _descriptor.FileDescriptor
