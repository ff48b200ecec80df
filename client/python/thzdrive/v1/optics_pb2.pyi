from thzdrive.v1 import caution_pb2 as _caution_pb2
from thzdrive.v1 import pulse_pb2 as _pulse_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

DESCRIPTOR: _descriptor.FileDescriptor
POLARIZATION_P: Polarization
POLARIZATION_S: Polarization
POLARIZATION_UNSPECIFIED: Polarization
TARGET_PLACEMENT_DEPTH: TargetPlacement
TARGET_PLACEMENT_FRONT_SURFACE: TargetPlacement
TARGET_PLACEMENT_LAYER_AVERAGE: TargetPlacement
TARGET_PLACEMENT_UNSPECIFIED: TargetPlacement

class ConstantIndex(_message.Message):
    __slots__ = ["kappa", "n"]
    KAPPA_FIELD_NUMBER: _ClassVar[int]
    N_FIELD_NUMBER: _ClassVar[int]
    kappa: float
    n: float
    def __init__(self, n: _Optional[float] = ..., kappa: _Optional[float] = ...) -> None: ...

class DielectricModel(_message.Message):
    __slots__ = ["eps_inf", "oscillators", "plasma_frequency_thz", "scattering_rate_thz"]
    EPS_INF_FIELD_NUMBER: _ClassVar[int]
    OSCILLATORS_FIELD_NUMBER: _ClassVar[int]
    PLASMA_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    SCATTERING_RATE_THZ_FIELD_NUMBER: _ClassVar[int]
    eps_inf: float
    oscillators: _containers.RepeatedCompositeFieldContainer[LorentzOscillator]
    plasma_frequency_thz: float
    scattering_rate_thz: float
    def __init__(self, eps_inf: _Optional[float] = ..., oscillators: _Optional[_Iterable[_Union[LorentzOscillator, _Mapping]]] = ..., plasma_frequency_thz: _Optional[float] = ..., scattering_rate_thz: _Optional[float] = ...) -> None: ...

class FieldFactor(_message.Message):
    __slots__ = ["amplitude", "phase_rad"]
    AMPLITUDE_FIELD_NUMBER: _ClassVar[int]
    PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    amplitude: float
    phase_rad: float
    def __init__(self, amplitude: _Optional[float] = ..., phase_rad: _Optional[float] = ...) -> None: ...

class FreeSpace(_message.Message):
    __slots__ = ["length_mm"]
    LENGTH_MM_FIELD_NUMBER: _ClassVar[int]
    length_mm: float
    def __init__(self, length_mm: _Optional[float] = ...) -> None: ...

class Layer(_message.Message):
    __slots__ = ["incoherent", "medium", "name", "thickness_um"]
    INCOHERENT_FIELD_NUMBER: _ClassVar[int]
    MEDIUM_FIELD_NUMBER: _ClassVar[int]
    NAME_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    incoherent: bool
    medium: Medium
    name: str
    thickness_um: float
    def __init__(self, name: _Optional[str] = ..., medium: _Optional[_Union[Medium, _Mapping]] = ..., thickness_um: _Optional[float] = ..., incoherent: bool = ...) -> None: ...

class ListMaterialsRequest(_message.Message):
    __slots__ = []
    def __init__(self) -> None: ...

class ListMaterialsResponse(_message.Message):
    __slots__ = ["materials"]
    MATERIALS_FIELD_NUMBER: _ClassVar[int]
    materials: _containers.RepeatedCompositeFieldContainer[Material]
    def __init__(self, materials: _Optional[_Iterable[_Union[Material, _Mapping]]] = ...) -> None: ...

class LorentzOscillator(_message.Message):
    __slots__ = ["delta_eps", "frequency_thz", "linewidth_thz"]
    DELTA_EPS_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    LINEWIDTH_THZ_FIELD_NUMBER: _ClassVar[int]
    delta_eps: float
    frequency_thz: float
    linewidth_thz: float
    def __init__(self, frequency_thz: _Optional[float] = ..., linewidth_thz: _Optional[float] = ..., delta_eps: _Optional[float] = ...) -> None: ...

class Material(_message.Message):
    __slots__ = ["description", "kappa_at_1thz", "n_at_1thz", "name", "source", "temperature_k", "valid_from_thz", "valid_to_thz"]
    DESCRIPTION_FIELD_NUMBER: _ClassVar[int]
    KAPPA_AT_1THZ_FIELD_NUMBER: _ClassVar[int]
    NAME_FIELD_NUMBER: _ClassVar[int]
    N_AT_1THZ_FIELD_NUMBER: _ClassVar[int]
    SOURCE_FIELD_NUMBER: _ClassVar[int]
    TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    VALID_FROM_THZ_FIELD_NUMBER: _ClassVar[int]
    VALID_TO_THZ_FIELD_NUMBER: _ClassVar[int]
    description: str
    kappa_at_1thz: float
    n_at_1thz: float
    name: str
    source: str
    temperature_k: float
    valid_from_thz: float
    valid_to_thz: float
    def __init__(self, name: _Optional[str] = ..., description: _Optional[str] = ..., source: _Optional[str] = ..., temperature_k: _Optional[float] = ..., valid_from_thz: _Optional[float] = ..., valid_to_thz: _Optional[float] = ..., n_at_1thz: _Optional[float] = ..., kappa_at_1thz: _Optional[float] = ...) -> None: ...

class Medium(_message.Message):
    __slots__ = ["constant", "dielectric", "material", "tabulated"]
    CONSTANT_FIELD_NUMBER: _ClassVar[int]
    DIELECTRIC_FIELD_NUMBER: _ClassVar[int]
    MATERIAL_FIELD_NUMBER: _ClassVar[int]
    TABULATED_FIELD_NUMBER: _ClassVar[int]
    constant: ConstantIndex
    dielectric: DielectricModel
    material: str
    tabulated: TabulatedIndex
    def __init__(self, material: _Optional[str] = ..., constant: _Optional[_Union[ConstantIndex, _Mapping]] = ..., tabulated: _Optional[_Union[TabulatedIndex, _Mapping]] = ..., dielectric: _Optional[_Union[DielectricModel, _Mapping]] = ...) -> None: ...

class PropagateRequest(_message.Message):
    __slots__ = ["pad_to_samples", "sample", "target", "train", "waveform"]
    PAD_TO_SAMPLES_FIELD_NUMBER: _ClassVar[int]
    SAMPLE_FIELD_NUMBER: _ClassVar[int]
    TARGET_FIELD_NUMBER: _ClassVar[int]
    TRAIN_FIELD_NUMBER: _ClassVar[int]
    WAVEFORM_FIELD_NUMBER: _ClassVar[int]
    pad_to_samples: int
    sample: SampleStack
    target: Target
    train: _containers.RepeatedCompositeFieldContainer[TrainElement]
    waveform: _pulse_pb2.Waveform
    def __init__(self, waveform: _Optional[_Union[_pulse_pb2.Waveform, _Mapping]] = ..., train: _Optional[_Iterable[_Union[TrainElement, _Mapping]]] = ..., sample: _Optional[_Union[SampleStack, _Mapping]] = ..., target: _Optional[_Union[Target, _Mapping]] = ..., pad_to_samples: _Optional[int] = ...) -> None: ...

class PropagateResponse(_message.Message):
    __slots__ = ["absorbed_fraction", "cautions", "field_at_target", "incident_peak_field_kv_per_cm", "resolved", "target_peak_field_kv_per_cm", "transfer"]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    FIELD_AT_TARGET_FIELD_NUMBER: _ClassVar[int]
    INCIDENT_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    TARGET_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    TRANSFER_FIELD_NUMBER: _ClassVar[int]
    absorbed_fraction: float
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    field_at_target: _pulse_pb2.SampledTrace
    incident_peak_field_kv_per_cm: float
    resolved: PropagateRequest
    target_peak_field_kv_per_cm: float
    transfer: TransferFunction
    def __init__(self, transfer: _Optional[_Union[TransferFunction, _Mapping]] = ..., field_at_target: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ..., incident_peak_field_kv_per_cm: _Optional[float] = ..., target_peak_field_kv_per_cm: _Optional[float] = ..., absorbed_fraction: _Optional[float] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[PropagateRequest, _Mapping]] = ...) -> None: ...

class SampleStack(_message.Message):
    __slots__ = ["exit_medium", "incidence_angle_deg", "layers", "polarization"]
    EXIT_MEDIUM_FIELD_NUMBER: _ClassVar[int]
    INCIDENCE_ANGLE_DEG_FIELD_NUMBER: _ClassVar[int]
    LAYERS_FIELD_NUMBER: _ClassVar[int]
    POLARIZATION_FIELD_NUMBER: _ClassVar[int]
    exit_medium: Medium
    incidence_angle_deg: float
    layers: _containers.RepeatedCompositeFieldContainer[Layer]
    polarization: Polarization
    def __init__(self, layers: _Optional[_Iterable[_Union[Layer, _Mapping]]] = ..., exit_medium: _Optional[_Union[Medium, _Mapping]] = ..., incidence_angle_deg: _Optional[float] = ..., polarization: _Optional[_Union[Polarization, str]] = ...) -> None: ...

class Slab(_message.Message):
    __slots__ = ["incoherent", "medium", "thickness_um"]
    INCOHERENT_FIELD_NUMBER: _ClassVar[int]
    MEDIUM_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    incoherent: bool
    medium: Medium
    thickness_um: float
    def __init__(self, medium: _Optional[_Union[Medium, _Mapping]] = ..., thickness_um: _Optional[float] = ..., incoherent: bool = ...) -> None: ...

class TabulatedIndex(_message.Message):
    __slots__ = ["frequency_thz", "kappa", "n"]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    KAPPA_FIELD_NUMBER: _ClassVar[int]
    N_FIELD_NUMBER: _ClassVar[int]
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    kappa: _containers.RepeatedScalarFieldContainer[float]
    n: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, frequency_thz: _Optional[_Iterable[float]] = ..., n: _Optional[_Iterable[float]] = ..., kappa: _Optional[_Iterable[float]] = ...) -> None: ...

class Target(_message.Message):
    __slots__ = ["depth_um", "layer", "placement"]
    DEPTH_UM_FIELD_NUMBER: _ClassVar[int]
    LAYER_FIELD_NUMBER: _ClassVar[int]
    PLACEMENT_FIELD_NUMBER: _ClassVar[int]
    depth_um: float
    layer: int
    placement: TargetPlacement
    def __init__(self, layer: _Optional[int] = ..., placement: _Optional[_Union[TargetPlacement, str]] = ..., depth_um: _Optional[float] = ...) -> None: ...

class TrainElement(_message.Message):
    __slots__ = ["attenuator", "field_factor", "gap", "name", "slab"]
    ATTENUATOR_FIELD_NUMBER: _ClassVar[int]
    FIELD_FACTOR_FIELD_NUMBER: _ClassVar[int]
    GAP_FIELD_NUMBER: _ClassVar[int]
    NAME_FIELD_NUMBER: _ClassVar[int]
    SLAB_FIELD_NUMBER: _ClassVar[int]
    attenuator: WireGridAttenuator
    field_factor: FieldFactor
    gap: FreeSpace
    name: str
    slab: Slab
    def __init__(self, name: _Optional[str] = ..., slab: _Optional[_Union[Slab, _Mapping]] = ..., attenuator: _Optional[_Union[WireGridAttenuator, _Mapping]] = ..., field_factor: _Optional[_Union[FieldFactor, _Mapping]] = ..., gap: _Optional[_Union[FreeSpace, _Mapping]] = ...) -> None: ...

class TransferFunction(_message.Message):
    __slots__ = ["absorbed_fraction", "amplitude", "frequency_thz", "phase_rad"]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    AMPLITUDE_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    absorbed_fraction: _containers.RepeatedScalarFieldContainer[float]
    amplitude: _containers.RepeatedScalarFieldContainer[float]
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    phase_rad: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, frequency_thz: _Optional[_Iterable[float]] = ..., amplitude: _Optional[_Iterable[float]] = ..., phase_rad: _Optional[_Iterable[float]] = ..., absorbed_fraction: _Optional[_Iterable[float]] = ...) -> None: ...

class WireGridAttenuator(_message.Message):
    __slots__ = ["angle_deg"]
    ANGLE_DEG_FIELD_NUMBER: _ClassVar[int]
    angle_deg: float
    def __init__(self, angle_deg: _Optional[float] = ...) -> None: ...

class Polarization(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class TargetPlacement(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
