from thzdrive.v1 import caution_pb2 as _caution_pb2
from thzdrive.v1 import mode_pb2 as _mode_pb2
from thzdrive.v1 import optics_pb2 as _optics_pb2
from thzdrive.v1 import pulse_pb2 as _pulse_pb2
from thzdrive.v1 import thermal_pb2 as _thermal_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

DESCRIPTOR: _descriptor.FileDescriptor

class HeatingConditions(_message.Message):
    __slots__ = ["absorbed_fraction", "base_temperature_k", "damage_class", "damage_threshold_mj_per_cm2", "heat_capacity", "large_rise_fraction", "margin_fraction", "repetition_rate_khz", "thermal_conductivity_w_per_m_k", "thickness_um", "transition_temperature_k", "z_nu"]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    BASE_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    DAMAGE_CLASS_FIELD_NUMBER: _ClassVar[int]
    DAMAGE_THRESHOLD_MJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    HEAT_CAPACITY_FIELD_NUMBER: _ClassVar[int]
    LARGE_RISE_FRACTION_FIELD_NUMBER: _ClassVar[int]
    MARGIN_FRACTION_FIELD_NUMBER: _ClassVar[int]
    REPETITION_RATE_KHZ_FIELD_NUMBER: _ClassVar[int]
    THERMAL_CONDUCTIVITY_W_PER_M_K_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    TRANSITION_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    Z_NU_FIELD_NUMBER: _ClassVar[int]
    absorbed_fraction: float
    base_temperature_k: float
    damage_class: _thermal_pb2.DamageClass
    damage_threshold_mj_per_cm2: float
    heat_capacity: _thermal_pb2.HeatCapacityModel
    large_rise_fraction: float
    margin_fraction: float
    repetition_rate_khz: float
    thermal_conductivity_w_per_m_k: float
    thickness_um: float
    transition_temperature_k: float
    z_nu: float
    def __init__(self, heat_capacity: _Optional[_Union[_thermal_pb2.HeatCapacityModel, _Mapping]] = ..., thermal_conductivity_w_per_m_k: _Optional[float] = ..., repetition_rate_khz: _Optional[float] = ..., base_temperature_k: _Optional[float] = ..., transition_temperature_k: _Optional[float] = ..., z_nu: _Optional[float] = ..., margin_fraction: _Optional[float] = ..., large_rise_fraction: _Optional[float] = ..., damage_class: _Optional[_Union[_thermal_pb2.DamageClass, str]] = ..., damage_threshold_mj_per_cm2: _Optional[float] = ..., absorbed_fraction: _Optional[float] = ..., thickness_um: _Optional[float] = ...) -> None: ...

class PlanExperimentRequest(_message.Message):
    __slots__ = ["calibration", "heating", "label", "method", "mode", "pad_to_samples", "probe_depth_nm", "sample", "target", "train", "waveform"]
    CALIBRATION_FIELD_NUMBER: _ClassVar[int]
    HEATING_FIELD_NUMBER: _ClassVar[int]
    LABEL_FIELD_NUMBER: _ClassVar[int]
    METHOD_FIELD_NUMBER: _ClassVar[int]
    MODE_FIELD_NUMBER: _ClassVar[int]
    PAD_TO_SAMPLES_FIELD_NUMBER: _ClassVar[int]
    PROBE_DEPTH_NM_FIELD_NUMBER: _ClassVar[int]
    SAMPLE_FIELD_NUMBER: _ClassVar[int]
    TARGET_FIELD_NUMBER: _ClassVar[int]
    TRAIN_FIELD_NUMBER: _ClassVar[int]
    WAVEFORM_FIELD_NUMBER: _ClassVar[int]
    calibration: _pulse_pb2.EnergyCalibration
    heating: HeatingConditions
    label: str
    method: _mode_pb2.DriveMethod
    mode: _mode_pb2.PhononMode
    pad_to_samples: int
    probe_depth_nm: float
    sample: _optics_pb2.SampleStack
    target: _optics_pb2.Target
    train: _containers.RepeatedCompositeFieldContainer[_optics_pb2.TrainElement]
    waveform: _pulse_pb2.Waveform
    def __init__(self, waveform: _Optional[_Union[_pulse_pb2.Waveform, _Mapping]] = ..., calibration: _Optional[_Union[_pulse_pb2.EnergyCalibration, _Mapping]] = ..., train: _Optional[_Iterable[_Union[_optics_pb2.TrainElement, _Mapping]]] = ..., sample: _Optional[_Union[_optics_pb2.SampleStack, _Mapping]] = ..., target: _Optional[_Union[_optics_pb2.Target, _Mapping]] = ..., mode: _Optional[_Union[_mode_pb2.PhononMode, _Mapping]] = ..., probe_depth_nm: _Optional[float] = ..., method: _Optional[_Union[_mode_pb2.DriveMethod, str]] = ..., pad_to_samples: _Optional[int] = ..., heating: _Optional[_Union[HeatingConditions, _Mapping]] = ..., label: _Optional[str] = ...) -> None: ...

class PlanExperimentResponse(_message.Message):
    __slots__ = ["cautions", "heating", "mode", "optics", "resolved", "source"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    HEATING_FIELD_NUMBER: _ClassVar[int]
    MODE_FIELD_NUMBER: _ClassVar[int]
    OPTICS_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    SOURCE_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    heating: _thermal_pb2.HeatingBudget
    mode: _mode_pb2.ModeDrive
    optics: PlanOptics
    resolved: PlanExperimentRequest
    source: PlanSource
    def __init__(self, source: _Optional[_Union[PlanSource, _Mapping]] = ..., optics: _Optional[_Union[PlanOptics, _Mapping]] = ..., mode: _Optional[_Union[_mode_pb2.ModeDrive, _Mapping]] = ..., heating: _Optional[_Union[_thermal_pb2.HeatingBudget, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[PlanExperimentRequest, _Mapping]] = ...) -> None: ...

class PlanOptics(_message.Message):
    __slots__ = ["absorbed_fraction", "field_ratio", "target_peak_field_kv_per_cm", "transfer"]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    FIELD_RATIO_FIELD_NUMBER: _ClassVar[int]
    TARGET_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    TRANSFER_FIELD_NUMBER: _ClassVar[int]
    absorbed_fraction: float
    field_ratio: float
    target_peak_field_kv_per_cm: float
    transfer: _optics_pb2.TransferFunction
    def __init__(self, target_peak_field_kv_per_cm: _Optional[float] = ..., field_ratio: _Optional[float] = ..., absorbed_fraction: _Optional[float] = ..., transfer: _Optional[_Union[_optics_pb2.TransferFunction, _Mapping]] = ...) -> None: ...

class PlanSource(_message.Message):
    __slots__ = ["incident", "peak_field_kv_per_cm", "peak_fluence_uj_per_cm2", "pulse_energy_uj", "spectral_peak_thz"]
    INCIDENT_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    SPECTRAL_PEAK_THZ_FIELD_NUMBER: _ClassVar[int]
    incident: _pulse_pb2.SampledTrace
    peak_field_kv_per_cm: float
    peak_fluence_uj_per_cm2: float
    pulse_energy_uj: float
    spectral_peak_thz: float
    def __init__(self, peak_field_kv_per_cm: _Optional[float] = ..., peak_fluence_uj_per_cm2: _Optional[float] = ..., pulse_energy_uj: _Optional[float] = ..., spectral_peak_thz: _Optional[float] = ..., incident: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ...) -> None: ...

class SweepAxis(_message.Message):
    __slots__ = ["count", "logarithmic", "parameter", "start", "stop", "values"]
    COUNT_FIELD_NUMBER: _ClassVar[int]
    LOGARITHMIC_FIELD_NUMBER: _ClassVar[int]
    PARAMETER_FIELD_NUMBER: _ClassVar[int]
    START_FIELD_NUMBER: _ClassVar[int]
    STOP_FIELD_NUMBER: _ClassVar[int]
    VALUES_FIELD_NUMBER: _ClassVar[int]
    count: int
    logarithmic: bool
    parameter: str
    start: float
    stop: float
    values: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, parameter: _Optional[str] = ..., values: _Optional[_Iterable[float]] = ..., start: _Optional[float] = ..., stop: _Optional[float] = ..., count: _Optional[int] = ..., logarithmic: bool = ...) -> None: ...

class SweepHeadline(_message.Message):
    __slots__ = ["absorbed_fraction", "caution_codes", "displacement_pm", "incident_peak_field_kv_per_cm", "max_q_a_sqrt_amu", "overlap", "peak_field_inside_kv_per_cm", "peak_temperature_k", "pulse_energy_uj", "quanta", "steady_state_temperature_k"]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    CAUTION_CODES_FIELD_NUMBER: _ClassVar[int]
    DISPLACEMENT_PM_FIELD_NUMBER: _ClassVar[int]
    INCIDENT_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    MAX_Q_A_SQRT_AMU_FIELD_NUMBER: _ClassVar[int]
    OVERLAP_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_INSIDE_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    QUANTA_FIELD_NUMBER: _ClassVar[int]
    STEADY_STATE_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    absorbed_fraction: float
    caution_codes: _containers.RepeatedScalarFieldContainer[_caution_pb2.CautionCode]
    displacement_pm: float
    incident_peak_field_kv_per_cm: float
    max_q_a_sqrt_amu: float
    overlap: float
    peak_field_inside_kv_per_cm: float
    peak_temperature_k: float
    pulse_energy_uj: float
    quanta: float
    steady_state_temperature_k: float
    def __init__(self, incident_peak_field_kv_per_cm: _Optional[float] = ..., pulse_energy_uj: _Optional[float] = ..., peak_field_inside_kv_per_cm: _Optional[float] = ..., max_q_a_sqrt_amu: _Optional[float] = ..., displacement_pm: _Optional[float] = ..., quanta: _Optional[float] = ..., overlap: _Optional[float] = ..., absorbed_fraction: _Optional[float] = ..., peak_temperature_k: _Optional[float] = ..., steady_state_temperature_k: _Optional[float] = ..., caution_codes: _Optional[_Iterable[_Union[_caution_pb2.CautionCode, str]]] = ...) -> None: ...

class SweepPointError(_message.Message):
    __slots__ = ["code", "fields", "message"]
    CODE_FIELD_NUMBER: _ClassVar[int]
    FIELDS_FIELD_NUMBER: _ClassVar[int]
    MESSAGE_FIELD_NUMBER: _ClassVar[int]
    code: str
    fields: _containers.RepeatedScalarFieldContainer[str]
    message: str
    def __init__(self, code: _Optional[str] = ..., message: _Optional[str] = ..., fields: _Optional[_Iterable[str]] = ...) -> None: ...

class SweepRequest(_message.Message):
    __slots__ = ["axes", "first_index", "full_results", "plan", "point_count"]
    AXES_FIELD_NUMBER: _ClassVar[int]
    FIRST_INDEX_FIELD_NUMBER: _ClassVar[int]
    FULL_RESULTS_FIELD_NUMBER: _ClassVar[int]
    PLAN_FIELD_NUMBER: _ClassVar[int]
    POINT_COUNT_FIELD_NUMBER: _ClassVar[int]
    axes: _containers.RepeatedCompositeFieldContainer[SweepAxis]
    first_index: int
    full_results: bool
    plan: PlanExperimentRequest
    point_count: int
    def __init__(self, plan: _Optional[_Union[PlanExperimentRequest, _Mapping]] = ..., axes: _Optional[_Iterable[_Union[SweepAxis, _Mapping]]] = ..., full_results: bool = ..., first_index: _Optional[int] = ..., point_count: _Optional[int] = ...) -> None: ...

class SweepResponse(_message.Message):
    __slots__ = ["coordinates", "error", "headline", "index", "result", "total"]
    COORDINATES_FIELD_NUMBER: _ClassVar[int]
    ERROR_FIELD_NUMBER: _ClassVar[int]
    HEADLINE_FIELD_NUMBER: _ClassVar[int]
    INDEX_FIELD_NUMBER: _ClassVar[int]
    RESULT_FIELD_NUMBER: _ClassVar[int]
    TOTAL_FIELD_NUMBER: _ClassVar[int]
    coordinates: _containers.RepeatedScalarFieldContainer[float]
    error: SweepPointError
    headline: SweepHeadline
    index: int
    result: PlanExperimentResponse
    total: int
    def __init__(self, index: _Optional[int] = ..., total: _Optional[int] = ..., coordinates: _Optional[_Iterable[float]] = ..., headline: _Optional[_Union[SweepHeadline, _Mapping]] = ..., result: _Optional[_Union[PlanExperimentResponse, _Mapping]] = ..., error: _Optional[_Union[SweepPointError, _Mapping]] = ...) -> None: ...
