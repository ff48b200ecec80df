from thzdrive.v1 import caution_pb2 as _caution_pb2
from thzdrive.v1 import optics_pb2 as _optics_pb2
from thzdrive.v1 import pulse_pb2 as _pulse_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

DESCRIPTOR: _descriptor.FileDescriptor
DRIVE_METHOD_EXACT: DriveMethod
DRIVE_METHOD_TIME_DOMAIN: DriveMethod
DRIVE_METHOD_UNSPECIFIED: DriveMethod

class DriveModeRequest(_message.Message):
    __slots__ = ["method", "mode", "pad_to_samples", "probe_depth_nm", "sample", "target", "train", "waveform"]
    METHOD_FIELD_NUMBER: _ClassVar[int]
    MODE_FIELD_NUMBER: _ClassVar[int]
    PAD_TO_SAMPLES_FIELD_NUMBER: _ClassVar[int]
    PROBE_DEPTH_NM_FIELD_NUMBER: _ClassVar[int]
    SAMPLE_FIELD_NUMBER: _ClassVar[int]
    TARGET_FIELD_NUMBER: _ClassVar[int]
    TRAIN_FIELD_NUMBER: _ClassVar[int]
    WAVEFORM_FIELD_NUMBER: _ClassVar[int]
    method: DriveMethod
    mode: PhononMode
    pad_to_samples: int
    probe_depth_nm: float
    sample: _optics_pb2.SampleStack
    target: _optics_pb2.Target
    train: _containers.RepeatedCompositeFieldContainer[_optics_pb2.TrainElement]
    waveform: _pulse_pb2.Waveform
    def __init__(self, waveform: _Optional[_Union[_pulse_pb2.Waveform, _Mapping]] = ..., train: _Optional[_Iterable[_Union[_optics_pb2.TrainElement, _Mapping]]] = ..., sample: _Optional[_Union[_optics_pb2.SampleStack, _Mapping]] = ..., target: _Optional[_Union[_optics_pb2.Target, _Mapping]] = ..., mode: _Optional[_Union[PhononMode, _Mapping]] = ..., probe_depth_nm: _Optional[float] = ..., method: _Optional[_Union[DriveMethod, str]] = ..., pad_to_samples: _Optional[int] = ...) -> None: ...

class DriveModeResponse(_message.Message):
    __slots__ = ["cautions", "drive", "resolved"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    DRIVE_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    drive: ModeDrive
    resolved: DriveModeRequest
    def __init__(self, drive: _Optional[_Union[ModeDrive, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[DriveModeRequest, _Mapping]] = ...) -> None: ...

class ModeDrive(_message.Message):
    __slots__ = ["absorbed_energy_density_j_per_cm3", "anharmonic_shift_thz", "delta_eps", "depth_average_max_q_a_sqrt_amu", "displacement_pm", "effective_charge_e_per_sqrt_amu", "field_inside", "lindemann_ratio", "max_q_a_sqrt_amu", "max_q_time_ps", "method", "mode_energy_mev", "overlap", "peak_field_inside_kv_per_cm", "q", "quanta", "relative_amplitude_at_mode"]
    ABSORBED_ENERGY_DENSITY_J_PER_CM3_FIELD_NUMBER: _ClassVar[int]
    ANHARMONIC_SHIFT_THZ_FIELD_NUMBER: _ClassVar[int]
    DELTA_EPS_FIELD_NUMBER: _ClassVar[int]
    DEPTH_AVERAGE_MAX_Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    DISPLACEMENT_PM_FIELD_NUMBER: _ClassVar[int]
    EFFECTIVE_CHARGE_E_PER_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    FIELD_INSIDE_FIELD_NUMBER: _ClassVar[int]
    LINDEMANN_RATIO_FIELD_NUMBER: _ClassVar[int]
    MAX_Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    MAX_Q_TIME_PS_FIELD_NUMBER: _ClassVar[int]
    METHOD_FIELD_NUMBER: _ClassVar[int]
    MODE_ENERGY_MEV_FIELD_NUMBER: _ClassVar[int]
    OVERLAP_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_INSIDE_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    QUANTA_FIELD_NUMBER: _ClassVar[int]
    Q_FIELD_NUMBER: _ClassVar[int]
    RELATIVE_AMPLITUDE_AT_MODE_FIELD_NUMBER: _ClassVar[int]
    absorbed_energy_density_j_per_cm3: float
    anharmonic_shift_thz: float
    delta_eps: float
    depth_average_max_q_a_sqrt_amu: float
    displacement_pm: float
    effective_charge_e_per_sqrt_amu: float
    field_inside: _pulse_pb2.SampledTrace
    lindemann_ratio: float
    max_q_a_sqrt_amu: float
    max_q_time_ps: float
    method: DriveMethod
    mode_energy_mev: float
    overlap: float
    peak_field_inside_kv_per_cm: float
    q: ModeTrace
    quanta: float
    relative_amplitude_at_mode: float
    def __init__(self, peak_field_inside_kv_per_cm: _Optional[float] = ..., max_q_a_sqrt_amu: _Optional[float] = ..., max_q_time_ps: _Optional[float] = ..., depth_average_max_q_a_sqrt_amu: _Optional[float] = ..., displacement_pm: _Optional[float] = ..., lindemann_ratio: _Optional[float] = ..., mode_energy_mev: _Optional[float] = ..., quanta: _Optional[float] = ..., absorbed_energy_density_j_per_cm3: _Optional[float] = ..., overlap: _Optional[float] = ..., relative_amplitude_at_mode: _Optional[float] = ..., anharmonic_shift_thz: _Optional[float] = ..., delta_eps: _Optional[float] = ..., effective_charge_e_per_sqrt_amu: _Optional[float] = ..., method: _Optional[_Union[DriveMethod, str]] = ..., q: _Optional[_Union[ModeTrace, _Mapping]] = ..., field_inside: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ...) -> None: ...

class ModeTrace(_message.Message):
    __slots__ = ["depth_average_q_a_sqrt_amu", "q_a_sqrt_amu", "start_ps", "step_fs"]
    DEPTH_AVERAGE_Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    START_PS_FIELD_NUMBER: _ClassVar[int]
    STEP_FS_FIELD_NUMBER: _ClassVar[int]
    depth_average_q_a_sqrt_amu: _containers.RepeatedScalarFieldContainer[float]
    q_a_sqrt_amu: _containers.RepeatedScalarFieldContainer[float]
    start_ps: float
    step_fs: float
    def __init__(self, start_ps: _Optional[float] = ..., step_fs: _Optional[float] = ..., q_a_sqrt_amu: _Optional[_Iterable[float]] = ..., depth_average_q_a_sqrt_amu: _Optional[_Iterable[float]] = ...) -> None: ...

class PhononMode(_message.Message):
    __slots__ = ["anharmonic_a3_per_ps2_per_a_sqrt_amu", "anharmonic_a4_per_ps2_per_a2_amu", "bond_length_a", "cell_volume_a3", "delta_eps", "effective_charge_e_per_sqrt_amu", "effective_mass_amu", "frequency_thz", "linewidth_thz", "polarization_angle_deg", "raman_deps_dq_per_a_sqrt_amu", "target_oscillator"]
    ANHARMONIC_A3_PER_PS2_PER_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    ANHARMONIC_A4_PER_PS2_PER_A2_AMU_FIELD_NUMBER: _ClassVar[int]
    BOND_LENGTH_A_FIELD_NUMBER: _ClassVar[int]
    CELL_VOLUME_A3_FIELD_NUMBER: _ClassVar[int]
    DELTA_EPS_FIELD_NUMBER: _ClassVar[int]
    EFFECTIVE_CHARGE_E_PER_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    EFFECTIVE_MASS_AMU_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    LINEWIDTH_THZ_FIELD_NUMBER: _ClassVar[int]
    POLARIZATION_ANGLE_DEG_FIELD_NUMBER: _ClassVar[int]
    RAMAN_DEPS_DQ_PER_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    TARGET_OSCILLATOR_FIELD_NUMBER: _ClassVar[int]
    anharmonic_a3_per_ps2_per_a_sqrt_amu: float
    anharmonic_a4_per_ps2_per_a2_amu: float
    bond_length_a: float
    cell_volume_a3: float
    delta_eps: float
    effective_charge_e_per_sqrt_amu: float
    effective_mass_amu: float
    frequency_thz: float
    linewidth_thz: float
    polarization_angle_deg: float
    raman_deps_dq_per_a_sqrt_amu: float
    target_oscillator: int
    def __init__(self, target_oscillator: _Optional[int] = ..., frequency_thz: _Optional[float] = ..., linewidth_thz: _Optional[float] = ..., delta_eps: _Optional[float] = ..., effective_charge_e_per_sqrt_amu: _Optional[float] = ..., cell_volume_a3: _Optional[float] = ..., effective_mass_amu: _Optional[float] = ..., bond_length_a: _Optional[float] = ..., anharmonic_a3_per_ps2_per_a_sqrt_amu: _Optional[float] = ..., anharmonic_a4_per_ps2_per_a2_amu: _Optional[float] = ..., raman_deps_dq_per_a_sqrt_amu: _Optional[float] = ..., polarization_angle_deg: _Optional[float] = ...) -> None: ...

class SizeFieldRequest(_message.Message):
    __slots__ = ["displacement_pm", "drive", "max_peak_field_kv_per_cm", "max_q_a_sqrt_amu", "quanta", "source_limit_uj", "spot_x", "spot_y"]
    DISPLACEMENT_PM_FIELD_NUMBER: _ClassVar[int]
    DRIVE_FIELD_NUMBER: _ClassVar[int]
    MAX_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    MAX_Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    QUANTA_FIELD_NUMBER: _ClassVar[int]
    SOURCE_LIMIT_UJ_FIELD_NUMBER: _ClassVar[int]
    SPOT_X_FIELD_NUMBER: _ClassVar[int]
    SPOT_Y_FIELD_NUMBER: _ClassVar[int]
    displacement_pm: float
    drive: DriveModeRequest
    max_peak_field_kv_per_cm: float
    max_q_a_sqrt_amu: float
    quanta: float
    source_limit_uj: float
    spot_x: _pulse_pb2.SpotSize
    spot_y: _pulse_pb2.SpotSize
    def __init__(self, drive: _Optional[_Union[DriveModeRequest, _Mapping]] = ..., max_q_a_sqrt_amu: _Optional[float] = ..., displacement_pm: _Optional[float] = ..., quanta: _Optional[float] = ..., spot_x: _Optional[_Union[_pulse_pb2.SpotSize, _Mapping]] = ..., spot_y: _Optional[_Union[_pulse_pb2.SpotSize, _Mapping]] = ..., source_limit_uj: _Optional[float] = ..., max_peak_field_kv_per_cm: _Optional[float] = ...) -> None: ...

class SizeFieldResponse(_message.Message):
    __slots__ = ["achieved", "cautions", "drive", "incident_peak_field_kv_per_cm", "peak_fluence_uj_per_cm2", "pulse_energy_uj", "reachable", "resolved", "source_margin"]
    ACHIEVED_FIELD_NUMBER: _ClassVar[int]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    DRIVE_FIELD_NUMBER: _ClassVar[int]
    INCIDENT_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    REACHABLE_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    SOURCE_MARGIN_FIELD_NUMBER: _ClassVar[int]
    achieved: float
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    drive: ModeDrive
    incident_peak_field_kv_per_cm: float
    peak_fluence_uj_per_cm2: float
    pulse_energy_uj: float
    reachable: bool
    resolved: SizeFieldRequest
    source_margin: float
    def __init__(self, reachable: bool = ..., incident_peak_field_kv_per_cm: _Optional[float] = ..., pulse_energy_uj: _Optional[float] = ..., peak_fluence_uj_per_cm2: _Optional[float] = ..., achieved: _Optional[float] = ..., source_margin: _Optional[float] = ..., drive: _Optional[_Union[ModeDrive, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[SizeFieldRequest, _Mapping]] = ...) -> None: ...

class DriveMethod(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
