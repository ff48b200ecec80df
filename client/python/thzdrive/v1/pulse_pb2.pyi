from thzdrive.v1 import caution_pb2 as _caution_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

BASELINE_REMOVAL_LINEAR: BaselineRemoval
BASELINE_REMOVAL_NONE: BaselineRemoval
BASELINE_REMOVAL_PRE_PULSE: BaselineRemoval
BASELINE_REMOVAL_UNSPECIFIED: BaselineRemoval
DESCRIPTOR: _descriptor.FileDescriptor
ELECTRO_OPTIC_CRYSTAL_CUSTOM: ElectroOpticCrystal
ELECTRO_OPTIC_CRYSTAL_GAP: ElectroOpticCrystal
ELECTRO_OPTIC_CRYSTAL_UNSPECIFIED: ElectroOpticCrystal
ELECTRO_OPTIC_CRYSTAL_ZNTE: ElectroOpticCrystal
FIELD_UNIT_ARBITRARY: FieldUnit
FIELD_UNIT_KV_PER_CM: FieldUnit
FIELD_UNIT_UNSPECIFIED: FieldUnit
PULSE_SHAPE_CARRIER: PulseShape
PULSE_SHAPE_CENTRAL_LOBE: PulseShape
PULSE_SHAPE_SINGLE_CYCLE: PulseShape
PULSE_SHAPE_UNSPECIFIED: PulseShape
TIME_WINDOW_BLACKMAN: TimeWindow
TIME_WINDOW_HANN: TimeWindow
TIME_WINDOW_NONE: TimeWindow
TIME_WINDOW_TUKEY: TimeWindow
TIME_WINDOW_UNSPECIFIED: TimeWindow

class AnalyzePulseRequest(_message.Message):
    __slots__ = ["processing", "waveform"]
    PROCESSING_FIELD_NUMBER: _ClassVar[int]
    WAVEFORM_FIELD_NUMBER: _ClassVar[int]
    processing: Processing
    waveform: Waveform
    def __init__(self, waveform: _Optional[_Union[Waveform, _Mapping]] = ..., processing: _Optional[_Union[Processing, _Mapping]] = ...) -> None: ...

class AnalyzePulseResponse(_message.Message):
    __slots__ = ["cautions", "metrics", "processed_trace", "resolved", "spectrum"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    METRICS_FIELD_NUMBER: _ClassVar[int]
    PROCESSED_TRACE_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    SPECTRUM_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    metrics: PulseMetrics
    processed_trace: SampledTrace
    resolved: AnalyzePulseRequest
    spectrum: Spectrum
    def __init__(self, metrics: _Optional[_Union[PulseMetrics, _Mapping]] = ..., spectrum: _Optional[_Union[Spectrum, _Mapping]] = ..., processed_trace: _Optional[_Union[SampledTrace, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[AnalyzePulseRequest, _Mapping]] = ...) -> None: ...

class AveragePower(_message.Message):
    __slots__ = ["average_power_mw", "repetition_rate_khz"]
    AVERAGE_POWER_MW_FIELD_NUMBER: _ClassVar[int]
    REPETITION_RATE_KHZ_FIELD_NUMBER: _ClassVar[int]
    average_power_mw: float
    repetition_rate_khz: float
    def __init__(self, average_power_mw: _Optional[float] = ..., repetition_rate_khz: _Optional[float] = ...) -> None: ...

class CalibrateFieldRequest(_message.Message):
    __slots__ = ["electro_optic", "energy", "waveform"]
    ELECTRO_OPTIC_FIELD_NUMBER: _ClassVar[int]
    ENERGY_FIELD_NUMBER: _ClassVar[int]
    WAVEFORM_FIELD_NUMBER: _ClassVar[int]
    electro_optic: ElectroOpticCalibration
    energy: EnergyCalibration
    waveform: Waveform
    def __init__(self, waveform: _Optional[_Union[Waveform, _Mapping]] = ..., energy: _Optional[_Union[EnergyCalibration, _Mapping]] = ..., electro_optic: _Optional[_Union[ElectroOpticCalibration, _Mapping]] = ...) -> None: ...

class CalibrateFieldResponse(_message.Message):
    __slots__ = ["calibrated_trace", "cautions", "field_per_unit_modulation_kv_per_cm", "focused_peak_field_kv_per_cm", "focused_trace", "half_wave_field_kv_per_cm", "peak_field_kv_per_cm", "peak_fluence_uj_per_cm2", "resolved"]
    CALIBRATED_TRACE_FIELD_NUMBER: _ClassVar[int]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    FIELD_PER_UNIT_MODULATION_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    FOCUSED_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    FOCUSED_TRACE_FIELD_NUMBER: _ClassVar[int]
    HALF_WAVE_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    calibrated_trace: SampledTrace
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    field_per_unit_modulation_kv_per_cm: float
    focused_peak_field_kv_per_cm: float
    focused_trace: SampledTrace
    half_wave_field_kv_per_cm: float
    peak_field_kv_per_cm: float
    peak_fluence_uj_per_cm2: float
    resolved: CalibrateFieldRequest
    def __init__(self, peak_field_kv_per_cm: _Optional[float] = ..., peak_fluence_uj_per_cm2: _Optional[float] = ..., calibrated_trace: _Optional[_Union[SampledTrace, _Mapping]] = ..., focused_peak_field_kv_per_cm: _Optional[float] = ..., focused_trace: _Optional[_Union[SampledTrace, _Mapping]] = ..., field_per_unit_modulation_kv_per_cm: _Optional[float] = ..., half_wave_field_kv_per_cm: _Optional[float] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[CalibrateFieldRequest, _Mapping]] = ...) -> None: ...

class ElectroOpticCalibration(_message.Message):
    __slots__ = ["crystal", "modulation_trace", "n_probe", "n_thz", "peak_modulation", "probe_wavelength_nm", "r41_pm_per_v", "thickness_um", "to_phonon_thz"]
    CRYSTAL_FIELD_NUMBER: _ClassVar[int]
    MODULATION_TRACE_FIELD_NUMBER: _ClassVar[int]
    N_PROBE_FIELD_NUMBER: _ClassVar[int]
    N_THZ_FIELD_NUMBER: _ClassVar[int]
    PEAK_MODULATION_FIELD_NUMBER: _ClassVar[int]
    PROBE_WAVELENGTH_NM_FIELD_NUMBER: _ClassVar[int]
    R41_PM_PER_V_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    TO_PHONON_THZ_FIELD_NUMBER: _ClassVar[int]
    crystal: ElectroOpticCrystal
    modulation_trace: SampledTrace
    n_probe: float
    n_thz: float
    peak_modulation: float
    probe_wavelength_nm: float
    r41_pm_per_v: float
    thickness_um: float
    to_phonon_thz: float
    def __init__(self, crystal: _Optional[_Union[ElectroOpticCrystal, str]] = ..., n_probe: _Optional[float] = ..., r41_pm_per_v: _Optional[float] = ..., n_thz: _Optional[float] = ..., to_phonon_thz: _Optional[float] = ..., thickness_um: _Optional[float] = ..., probe_wavelength_nm: _Optional[float] = ..., peak_modulation: _Optional[float] = ..., modulation_trace: _Optional[_Union[SampledTrace, _Mapping]] = ...) -> None: ...

class EnergyCalibration(_message.Message):
    __slots__ = ["average_power", "focus_reference_frequency_thz", "focus_scaling", "pulse_energy_uj", "spot_x", "spot_y"]
    AVERAGE_POWER_FIELD_NUMBER: _ClassVar[int]
    FOCUS_REFERENCE_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    FOCUS_SCALING_FIELD_NUMBER: _ClassVar[int]
    PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    SPOT_X_FIELD_NUMBER: _ClassVar[int]
    SPOT_Y_FIELD_NUMBER: _ClassVar[int]
    average_power: AveragePower
    focus_reference_frequency_thz: float
    focus_scaling: bool
    pulse_energy_uj: float
    spot_x: SpotSize
    spot_y: SpotSize
    def __init__(self, pulse_energy_uj: _Optional[float] = ..., average_power: _Optional[_Union[AveragePower, _Mapping]] = ..., spot_x: _Optional[_Union[SpotSize, _Mapping]] = ..., spot_y: _Optional[_Union[SpotSize, _Mapping]] = ..., focus_scaling: bool = ..., focus_reference_frequency_thz: _Optional[float] = ...) -> None: ...

class ModelPulse(_message.Message):
    __slots__ = ["carrier_frequency_thz", "carrier_phase_rad", "envelope_fwhm_ps", "peak_field_kv_per_cm", "peak_frequency_thz", "shape", "span_ps", "step_fs"]
    CARRIER_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    CARRIER_PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    ENVELOPE_FWHM_PS_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    SHAPE_FIELD_NUMBER: _ClassVar[int]
    SPAN_PS_FIELD_NUMBER: _ClassVar[int]
    STEP_FS_FIELD_NUMBER: _ClassVar[int]
    carrier_frequency_thz: float
    carrier_phase_rad: float
    envelope_fwhm_ps: float
    peak_field_kv_per_cm: float
    peak_frequency_thz: float
    shape: PulseShape
    span_ps: float
    step_fs: float
    def __init__(self, shape: _Optional[_Union[PulseShape, str]] = ..., peak_frequency_thz: _Optional[float] = ..., carrier_frequency_thz: _Optional[float] = ..., envelope_fwhm_ps: _Optional[float] = ..., carrier_phase_rad: _Optional[float] = ..., peak_field_kv_per_cm: _Optional[float] = ..., step_fs: _Optional[float] = ..., span_ps: _Optional[float] = ...) -> None: ...

class Processing(_message.Message):
    __slots__ = ["baseline", "pad_to_samples", "tukey_alpha", "window"]
    BASELINE_FIELD_NUMBER: _ClassVar[int]
    PAD_TO_SAMPLES_FIELD_NUMBER: _ClassVar[int]
    TUKEY_ALPHA_FIELD_NUMBER: _ClassVar[int]
    WINDOW_FIELD_NUMBER: _ClassVar[int]
    baseline: BaselineRemoval
    pad_to_samples: int
    tukey_alpha: float
    window: TimeWindow
    def __init__(self, baseline: _Optional[_Union[BaselineRemoval, str]] = ..., window: _Optional[_Union[TimeWindow, str]] = ..., tukey_alpha: _Optional[float] = ..., pad_to_samples: _Optional[int] = ...) -> None: ...

class PulseMetrics(_message.Message):
    __slots__ = ["band_high_thz", "band_low_thz", "bandwidth_fwhm_thz", "centroid_thz", "dc_area_ratio", "dynamic_range_db", "edge_ratio", "fluence_uj_per_cm2", "nyquist_thz", "peak_field_kv_per_cm", "peak_sign", "peak_time_ps", "peak_to_peak_kv_per_cm", "resolution_thz", "spectral_peak_thz"]
    BANDWIDTH_FWHM_THZ_FIELD_NUMBER: _ClassVar[int]
    BAND_HIGH_THZ_FIELD_NUMBER: _ClassVar[int]
    BAND_LOW_THZ_FIELD_NUMBER: _ClassVar[int]
    CENTROID_THZ_FIELD_NUMBER: _ClassVar[int]
    DC_AREA_RATIO_FIELD_NUMBER: _ClassVar[int]
    DYNAMIC_RANGE_DB_FIELD_NUMBER: _ClassVar[int]
    EDGE_RATIO_FIELD_NUMBER: _ClassVar[int]
    FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    NYQUIST_THZ_FIELD_NUMBER: _ClassVar[int]
    PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    PEAK_SIGN_FIELD_NUMBER: _ClassVar[int]
    PEAK_TIME_PS_FIELD_NUMBER: _ClassVar[int]
    PEAK_TO_PEAK_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    RESOLUTION_THZ_FIELD_NUMBER: _ClassVar[int]
    SPECTRAL_PEAK_THZ_FIELD_NUMBER: _ClassVar[int]
    band_high_thz: float
    band_low_thz: float
    bandwidth_fwhm_thz: float
    centroid_thz: float
    dc_area_ratio: float
    dynamic_range_db: float
    edge_ratio: float
    fluence_uj_per_cm2: float
    nyquist_thz: float
    peak_field_kv_per_cm: float
    peak_sign: int
    peak_time_ps: float
    peak_to_peak_kv_per_cm: float
    resolution_thz: float
    spectral_peak_thz: float
    def __init__(self, peak_field_kv_per_cm: _Optional[float] = ..., peak_time_ps: _Optional[float] = ..., peak_sign: _Optional[int] = ..., peak_to_peak_kv_per_cm: _Optional[float] = ..., spectral_peak_thz: _Optional[float] = ..., centroid_thz: _Optional[float] = ..., bandwidth_fwhm_thz: _Optional[float] = ..., band_low_thz: _Optional[float] = ..., band_high_thz: _Optional[float] = ..., dynamic_range_db: _Optional[float] = ..., dc_area_ratio: _Optional[float] = ..., fluence_uj_per_cm2: _Optional[float] = ..., nyquist_thz: _Optional[float] = ..., resolution_thz: _Optional[float] = ..., edge_ratio: _Optional[float] = ...) -> None: ...

class SampledTrace(_message.Message):
    __slots__ = ["field", "field_unit", "start_ps", "step_fs", "time_ps"]
    FIELD_FIELD_NUMBER: _ClassVar[int]
    FIELD_UNIT_FIELD_NUMBER: _ClassVar[int]
    START_PS_FIELD_NUMBER: _ClassVar[int]
    STEP_FS_FIELD_NUMBER: _ClassVar[int]
    TIME_PS_FIELD_NUMBER: _ClassVar[int]
    field: _containers.RepeatedScalarFieldContainer[float]
    field_unit: FieldUnit
    start_ps: float
    step_fs: float
    time_ps: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, start_ps: _Optional[float] = ..., step_fs: _Optional[float] = ..., time_ps: _Optional[_Iterable[float]] = ..., field: _Optional[_Iterable[float]] = ..., field_unit: _Optional[_Union[FieldUnit, str]] = ...) -> None: ...

class Spectrum(_message.Message):
    __slots__ = ["amplitude_kv_per_cm_per_thz", "frequency_thz", "phase_rad"]
    AMPLITUDE_KV_PER_CM_PER_THZ_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    amplitude_kv_per_cm_per_thz: _containers.RepeatedScalarFieldContainer[float]
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    phase_rad: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, frequency_thz: _Optional[_Iterable[float]] = ..., amplitude_kv_per_cm_per_thz: _Optional[_Iterable[float]] = ..., phase_rad: _Optional[_Iterable[float]] = ...) -> None: ...

class SpotSize(_message.Message):
    __slots__ = ["fwhm_um", "knife_edge_10_90_um", "radius_um"]
    FWHM_UM_FIELD_NUMBER: _ClassVar[int]
    KNIFE_EDGE_10_90_UM_FIELD_NUMBER: _ClassVar[int]
    RADIUS_UM_FIELD_NUMBER: _ClassVar[int]
    fwhm_um: float
    knife_edge_10_90_um: float
    radius_um: float
    def __init__(self, radius_um: _Optional[float] = ..., fwhm_um: _Optional[float] = ..., knife_edge_10_90_um: _Optional[float] = ...) -> None: ...

class Waveform(_message.Message):
    __slots__ = ["model", "trace"]
    MODEL_FIELD_NUMBER: _ClassVar[int]
    TRACE_FIELD_NUMBER: _ClassVar[int]
    model: ModelPulse
    trace: SampledTrace
    def __init__(self, model: _Optional[_Union[ModelPulse, _Mapping]] = ..., trace: _Optional[_Union[SampledTrace, _Mapping]] = ...) -> None: ...

class PulseShape(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class FieldUnit(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class BaselineRemoval(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class TimeWindow(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class ElectroOpticCrystal(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
