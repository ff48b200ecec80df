from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

CAUTION_CODE_CROSSES_TRANSITION: CautionCode
CAUTION_CODE_DC_OFFSET: CautionCode
CAUTION_CODE_DETECTOR_BAND_LIMIT: CautionCode
CAUTION_CODE_ECHO_IN_WINDOW: CautionCode
CAUTION_CODE_EO_OVER_ROTATION: CautionCode
CAUTION_CODE_EXTRACTION_UNCONVERGED: CautionCode
CAUTION_CODE_FIELD_BEYOND_TABLE_TOP: CautionCode
CAUTION_CODE_FIELD_IMPLAUSIBLE: CautionCode
CAUTION_CODE_FIT_POOR: CautionCode
CAUTION_CODE_HEATING_LARGE: CautionCode
CAUTION_CODE_LINDEMANN_DAMAGE: CautionCode
CAUTION_CODE_LINDEMANN_WARNING: CautionCode
CAUTION_CODE_LOW_DYNAMIC_RANGE: CautionCode
CAUTION_CODE_MATERIAL_EXTRAPOLATED: CautionCode
CAUTION_CODE_MODE_NOT_DECAYED: CautionCode
CAUTION_CODE_MODE_OUTSIDE_BAND: CautionCode
CAUTION_CODE_NONLINEAR_REGIME: CautionCode
CAUTION_CODE_NOT_DECAYED: CautionCode
CAUTION_CODE_OPTICAL_DAMAGE: CautionCode
CAUTION_CODE_RESTSTRAHLEN: CautionCode
CAUTION_CODE_SMALL_MARGIN: CautionCode
CAUTION_CODE_SOURCE_SHORTFALL: CautionCode
CAUTION_CODE_TARGET_UNREACHABLE: CautionCode
CAUTION_CODE_UNDERSAMPLED: CautionCode
CAUTION_CODE_UNSPECIFIED: CautionCode
DESCRIPTOR: _descriptor.FileDescriptor

class Caution(_message.Message):
    __slots__ = ["code", "message", "stage", "values"]
    CODE_FIELD_NUMBER: _ClassVar[int]
    MESSAGE_FIELD_NUMBER: _ClassVar[int]
    STAGE_FIELD_NUMBER: _ClassVar[int]
    VALUES_FIELD_NUMBER: _ClassVar[int]
    code: CautionCode
    message: str
    stage: str
    values: _containers.RepeatedCompositeFieldContainer[CautionValue]
    def __init__(self, code: _Optional[_Union[CautionCode, str]] = ..., message: _Optional[str] = ..., values: _Optional[_Iterable[_Union[CautionValue, _Mapping]]] = ..., stage: _Optional[str] = ...) -> None: ...

class CautionValue(_message.Message):
    __slots__ = ["name", "value"]
    NAME_FIELD_NUMBER: _ClassVar[int]
    VALUE_FIELD_NUMBER: _ClassVar[int]
    name: str
    value: float
    def __init__(self, name: _Optional[str] = ..., value: _Optional[float] = ...) -> None: ...

class CautionCode(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
