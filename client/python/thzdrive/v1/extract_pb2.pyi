from thzdrive.v1 import caution_pb2 as _caution_pb2
from thzdrive.v1 import optics_pb2 as _optics_pb2
from thzdrive.v1 import pulse_pb2 as _pulse_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

DESCRIPTOR: _descriptor.FileDescriptor
ECHO_MODEL_ALL: EchoModel
ECHO_MODEL_COUNT: EchoModel
ECHO_MODEL_FIRST_PASS: EchoModel
ECHO_MODEL_UNSPECIFIED: EchoModel

class CorrectDetectorRequest(_message.Message):
    __slots__ = ["calibration_n_thz", "detector", "margin_db", "pad_to_samples", "regularization", "trace", "trust_fraction"]
    CALIBRATION_N_THZ_FIELD_NUMBER: _ClassVar[int]
    DETECTOR_FIELD_NUMBER: _ClassVar[int]
    MARGIN_DB_FIELD_NUMBER: _ClassVar[int]
    PAD_TO_SAMPLES_FIELD_NUMBER: _ClassVar[int]
    REGULARIZATION_FIELD_NUMBER: _ClassVar[int]
    TRACE_FIELD_NUMBER: _ClassVar[int]
    TRUST_FRACTION_FIELD_NUMBER: _ClassVar[int]
    calibration_n_thz: float
    detector: ElectroOpticDetector
    margin_db: float
    pad_to_samples: int
    regularization: float
    trace: _pulse_pb2.SampledTrace
    trust_fraction: float
    def __init__(self, trace: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ..., detector: _Optional[_Union[ElectroOpticDetector, _Mapping]] = ..., calibration_n_thz: _Optional[float] = ..., regularization: _Optional[float] = ..., trust_fraction: _Optional[float] = ..., margin_db: _Optional[float] = ..., pad_to_samples: _Optional[int] = ...) -> None: ...

class CorrectDetectorResponse(_message.Message):
    __slots__ = ["cautions", "corrected_peak_field_kv_per_cm", "corrected_trace", "frequency_thz", "measured_peak_field_kv_per_cm", "regularization", "resolved", "response_amplitude", "response_phase_rad", "signal_band", "trust_band"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    CORRECTED_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    CORRECTED_TRACE_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    MEASURED_PEAK_FIELD_KV_PER_CM_FIELD_NUMBER: _ClassVar[int]
    REGULARIZATION_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    RESPONSE_AMPLITUDE_FIELD_NUMBER: _ClassVar[int]
    RESPONSE_PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    SIGNAL_BAND_FIELD_NUMBER: _ClassVar[int]
    TRUST_BAND_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    corrected_peak_field_kv_per_cm: float
    corrected_trace: _pulse_pb2.SampledTrace
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    measured_peak_field_kv_per_cm: float
    regularization: float
    resolved: CorrectDetectorRequest
    response_amplitude: _containers.RepeatedScalarFieldContainer[float]
    response_phase_rad: _containers.RepeatedScalarFieldContainer[float]
    signal_band: FrequencyBand
    trust_band: FrequencyBand
    def __init__(self, corrected_trace: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ..., frequency_thz: _Optional[_Iterable[float]] = ..., response_amplitude: _Optional[_Iterable[float]] = ..., response_phase_rad: _Optional[_Iterable[float]] = ..., trust_band: _Optional[_Union[FrequencyBand, _Mapping]] = ..., signal_band: _Optional[_Union[FrequencyBand, _Mapping]] = ..., regularization: _Optional[float] = ..., measured_peak_field_kv_per_cm: _Optional[float] = ..., corrected_peak_field_kv_per_cm: _Optional[float] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[CorrectDetectorRequest, _Mapping]] = ...) -> None: ...

class ElectroOpticDetector(_message.Message):
    __slots__ = ["crystal", "faust_henry_coefficient", "probe_group_index", "probe_wavelength_nm", "thickness_um", "thz_medium"]
    CRYSTAL_FIELD_NUMBER: _ClassVar[int]
    FAUST_HENRY_COEFFICIENT_FIELD_NUMBER: _ClassVar[int]
    PROBE_GROUP_INDEX_FIELD_NUMBER: _ClassVar[int]
    PROBE_WAVELENGTH_NM_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    THZ_MEDIUM_FIELD_NUMBER: _ClassVar[int]
    crystal: _pulse_pb2.ElectroOpticCrystal
    faust_henry_coefficient: float
    probe_group_index: float
    probe_wavelength_nm: float
    thickness_um: float
    thz_medium: _optics_pb2.Medium
    def __init__(self, crystal: _Optional[_Union[_pulse_pb2.ElectroOpticCrystal, str]] = ..., thickness_um: _Optional[float] = ..., probe_wavelength_nm: _Optional[float] = ..., probe_group_index: _Optional[float] = ..., thz_medium: _Optional[_Union[_optics_pb2.Medium, _Mapping]] = ..., faust_henry_coefficient: _Optional[float] = ...) -> None: ...

class ExtractMediumRequest(_message.Message):
    __slots__ = ["film", "margin_db", "processing", "reference", "sample", "slab"]
    FILM_FIELD_NUMBER: _ClassVar[int]
    MARGIN_DB_FIELD_NUMBER: _ClassVar[int]
    PROCESSING_FIELD_NUMBER: _ClassVar[int]
    REFERENCE_FIELD_NUMBER: _ClassVar[int]
    SAMPLE_FIELD_NUMBER: _ClassVar[int]
    SLAB_FIELD_NUMBER: _ClassVar[int]
    film: FilmSpecimen
    margin_db: float
    processing: _pulse_pb2.Processing
    reference: _pulse_pb2.SampledTrace
    sample: _pulse_pb2.SampledTrace
    slab: SlabSpecimen
    def __init__(self, reference: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ..., sample: _Optional[_Union[_pulse_pb2.SampledTrace, _Mapping]] = ..., processing: _Optional[_Union[_pulse_pb2.Processing, _Mapping]] = ..., margin_db: _Optional[float] = ..., slab: _Optional[_Union[SlabSpecimen, _Mapping]] = ..., film: _Optional[_Union[FilmSpecimen, _Mapping]] = ...) -> None: ...

class ExtractMediumResponse(_message.Message):
    __slots__ = ["cautions", "frequency_thz", "log_transmission_std", "optical_constants", "phase_offset_rad", "reference_peak_time_ps", "reported_band", "resolved", "sample_peak_time_ps", "sheet_conductance", "transmission_amplitude", "transmission_phase_rad", "unconverged_bins", "usable_band"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    LOG_TRANSMISSION_STD_FIELD_NUMBER: _ClassVar[int]
    OPTICAL_CONSTANTS_FIELD_NUMBER: _ClassVar[int]
    PHASE_OFFSET_RAD_FIELD_NUMBER: _ClassVar[int]
    REFERENCE_PEAK_TIME_PS_FIELD_NUMBER: _ClassVar[int]
    REPORTED_BAND_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    SAMPLE_PEAK_TIME_PS_FIELD_NUMBER: _ClassVar[int]
    SHEET_CONDUCTANCE_FIELD_NUMBER: _ClassVar[int]
    TRANSMISSION_AMPLITUDE_FIELD_NUMBER: _ClassVar[int]
    TRANSMISSION_PHASE_RAD_FIELD_NUMBER: _ClassVar[int]
    UNCONVERGED_BINS_FIELD_NUMBER: _ClassVar[int]
    USABLE_BAND_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    log_transmission_std: _containers.RepeatedScalarFieldContainer[float]
    optical_constants: OpticalConstants
    phase_offset_rad: float
    reference_peak_time_ps: float
    reported_band: FrequencyBand
    resolved: ExtractMediumRequest
    sample_peak_time_ps: float
    sheet_conductance: SheetConductance
    transmission_amplitude: _containers.RepeatedScalarFieldContainer[float]
    transmission_phase_rad: _containers.RepeatedScalarFieldContainer[float]
    unconverged_bins: int
    usable_band: FrequencyBand
    def __init__(self, frequency_thz: _Optional[_Iterable[float]] = ..., transmission_amplitude: _Optional[_Iterable[float]] = ..., transmission_phase_rad: _Optional[_Iterable[float]] = ..., log_transmission_std: _Optional[_Iterable[float]] = ..., optical_constants: _Optional[_Union[OpticalConstants, _Mapping]] = ..., sheet_conductance: _Optional[_Union[SheetConductance, _Mapping]] = ..., usable_band: _Optional[_Union[FrequencyBand, _Mapping]] = ..., reported_band: _Optional[_Union[FrequencyBand, _Mapping]] = ..., phase_offset_rad: _Optional[float] = ..., unconverged_bins: _Optional[int] = ..., reference_peak_time_ps: _Optional[float] = ..., sample_peak_time_ps: _Optional[float] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[ExtractMediumRequest, _Mapping]] = ...) -> None: ...

class FilmSpecimen(_message.Message):
    __slots__ = ["film_thickness_um", "substrate", "substrate_mismatch_um"]
    FILM_THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    SUBSTRATE_FIELD_NUMBER: _ClassVar[int]
    SUBSTRATE_MISMATCH_UM_FIELD_NUMBER: _ClassVar[int]
    film_thickness_um: float
    substrate: _optics_pb2.Medium
    substrate_mismatch_um: float
    def __init__(self, substrate: _Optional[_Union[_optics_pb2.Medium, _Mapping]] = ..., substrate_mismatch_um: _Optional[float] = ..., film_thickness_um: _Optional[float] = ...) -> None: ...

class FitDielectricModelRequest(_message.Message):
    __slots__ = ["extraction", "initial", "max_frequency_thz", "max_iterations", "min_frequency_thz", "permittivity"]
    EXTRACTION_FIELD_NUMBER: _ClassVar[int]
    INITIAL_FIELD_NUMBER: _ClassVar[int]
    MAX_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    MAX_ITERATIONS_FIELD_NUMBER: _ClassVar[int]
    MIN_FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    PERMITTIVITY_FIELD_NUMBER: _ClassVar[int]
    extraction: ExtractMediumRequest
    initial: _optics_pb2.DielectricModel
    max_frequency_thz: float
    max_iterations: int
    min_frequency_thz: float
    permittivity: PermittivitySpectrum
    def __init__(self, permittivity: _Optional[_Union[PermittivitySpectrum, _Mapping]] = ..., extraction: _Optional[_Union[ExtractMediumRequest, _Mapping]] = ..., initial: _Optional[_Union[_optics_pb2.DielectricModel, _Mapping]] = ..., min_frequency_thz: _Optional[float] = ..., max_frequency_thz: _Optional[float] = ..., max_iterations: _Optional[int] = ...) -> None: ...

class FitDielectricModelResponse(_message.Message):
    __slots__ = ["cautions", "chi_square", "correlation", "data_eps_imag", "data_eps_real", "data_eps_std", "degrees_of_freedom", "extraction", "frequency_thz", "iterations", "model", "model_eps_imag", "model_eps_real", "model_std", "parameters", "reduced_chi_square", "resolved"]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    CHI_SQUARE_FIELD_NUMBER: _ClassVar[int]
    CORRELATION_FIELD_NUMBER: _ClassVar[int]
    DATA_EPS_IMAG_FIELD_NUMBER: _ClassVar[int]
    DATA_EPS_REAL_FIELD_NUMBER: _ClassVar[int]
    DATA_EPS_STD_FIELD_NUMBER: _ClassVar[int]
    DEGREES_OF_FREEDOM_FIELD_NUMBER: _ClassVar[int]
    EXTRACTION_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    ITERATIONS_FIELD_NUMBER: _ClassVar[int]
    MODEL_EPS_IMAG_FIELD_NUMBER: _ClassVar[int]
    MODEL_EPS_REAL_FIELD_NUMBER: _ClassVar[int]
    MODEL_FIELD_NUMBER: _ClassVar[int]
    MODEL_STD_FIELD_NUMBER: _ClassVar[int]
    PARAMETERS_FIELD_NUMBER: _ClassVar[int]
    REDUCED_CHI_SQUARE_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    chi_square: float
    correlation: _containers.RepeatedScalarFieldContainer[float]
    data_eps_imag: _containers.RepeatedScalarFieldContainer[float]
    data_eps_real: _containers.RepeatedScalarFieldContainer[float]
    data_eps_std: _containers.RepeatedScalarFieldContainer[float]
    degrees_of_freedom: int
    extraction: ExtractMediumResponse
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    iterations: int
    model: _optics_pb2.DielectricModel
    model_eps_imag: _containers.RepeatedScalarFieldContainer[float]
    model_eps_real: _containers.RepeatedScalarFieldContainer[float]
    model_std: _optics_pb2.DielectricModel
    parameters: _containers.RepeatedCompositeFieldContainer[FittedParameter]
    reduced_chi_square: float
    resolved: FitDielectricModelRequest
    def __init__(self, model: _Optional[_Union[_optics_pb2.DielectricModel, _Mapping]] = ..., model_std: _Optional[_Union[_optics_pb2.DielectricModel, _Mapping]] = ..., parameters: _Optional[_Iterable[_Union[FittedParameter, _Mapping]]] = ..., correlation: _Optional[_Iterable[float]] = ..., chi_square: _Optional[float] = ..., degrees_of_freedom: _Optional[int] = ..., reduced_chi_square: _Optional[float] = ..., iterations: _Optional[int] = ..., frequency_thz: _Optional[_Iterable[float]] = ..., data_eps_real: _Optional[_Iterable[float]] = ..., data_eps_imag: _Optional[_Iterable[float]] = ..., data_eps_std: _Optional[_Iterable[float]] = ..., model_eps_real: _Optional[_Iterable[float]] = ..., model_eps_imag: _Optional[_Iterable[float]] = ..., extraction: _Optional[_Union[ExtractMediumResponse, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[FitDielectricModelRequest, _Mapping]] = ...) -> None: ...

class FittedParameter(_message.Message):
    __slots__ = ["name", "std", "value"]
    NAME_FIELD_NUMBER: _ClassVar[int]
    STD_FIELD_NUMBER: _ClassVar[int]
    VALUE_FIELD_NUMBER: _ClassVar[int]
    name: str
    std: float
    value: float
    def __init__(self, name: _Optional[str] = ..., value: _Optional[float] = ..., std: _Optional[float] = ...) -> None: ...

class FrequencyBand(_message.Message):
    __slots__ = ["bins", "high_thz", "low_thz"]
    BINS_FIELD_NUMBER: _ClassVar[int]
    HIGH_THZ_FIELD_NUMBER: _ClassVar[int]
    LOW_THZ_FIELD_NUMBER: _ClassVar[int]
    bins: int
    high_thz: float
    low_thz: float
    def __init__(self, low_thz: _Optional[float] = ..., high_thz: _Optional[float] = ..., bins: _Optional[int] = ...) -> None: ...

class OpticalConstants(_message.Message):
    __slots__ = ["absorption_per_cm", "absorption_std_per_cm", "eps_imag", "eps_real", "eps_std", "index_std", "iterations", "kappa", "n"]
    ABSORPTION_PER_CM_FIELD_NUMBER: _ClassVar[int]
    ABSORPTION_STD_PER_CM_FIELD_NUMBER: _ClassVar[int]
    EPS_IMAG_FIELD_NUMBER: _ClassVar[int]
    EPS_REAL_FIELD_NUMBER: _ClassVar[int]
    EPS_STD_FIELD_NUMBER: _ClassVar[int]
    INDEX_STD_FIELD_NUMBER: _ClassVar[int]
    ITERATIONS_FIELD_NUMBER: _ClassVar[int]
    KAPPA_FIELD_NUMBER: _ClassVar[int]
    N_FIELD_NUMBER: _ClassVar[int]
    absorption_per_cm: _containers.RepeatedScalarFieldContainer[float]
    absorption_std_per_cm: _containers.RepeatedScalarFieldContainer[float]
    eps_imag: _containers.RepeatedScalarFieldContainer[float]
    eps_real: _containers.RepeatedScalarFieldContainer[float]
    eps_std: _containers.RepeatedScalarFieldContainer[float]
    index_std: _containers.RepeatedScalarFieldContainer[float]
    iterations: _containers.RepeatedScalarFieldContainer[int]
    kappa: _containers.RepeatedScalarFieldContainer[float]
    n: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, n: _Optional[_Iterable[float]] = ..., kappa: _Optional[_Iterable[float]] = ..., index_std: _Optional[_Iterable[float]] = ..., eps_real: _Optional[_Iterable[float]] = ..., eps_imag: _Optional[_Iterable[float]] = ..., eps_std: _Optional[_Iterable[float]] = ..., absorption_per_cm: _Optional[_Iterable[float]] = ..., absorption_std_per_cm: _Optional[_Iterable[float]] = ..., iterations: _Optional[_Iterable[int]] = ...) -> None: ...

class PermittivitySpectrum(_message.Message):
    __slots__ = ["eps_imag", "eps_real", "eps_std", "frequency_thz"]
    EPS_IMAG_FIELD_NUMBER: _ClassVar[int]
    EPS_REAL_FIELD_NUMBER: _ClassVar[int]
    EPS_STD_FIELD_NUMBER: _ClassVar[int]
    FREQUENCY_THZ_FIELD_NUMBER: _ClassVar[int]
    eps_imag: _containers.RepeatedScalarFieldContainer[float]
    eps_real: _containers.RepeatedScalarFieldContainer[float]
    eps_std: _containers.RepeatedScalarFieldContainer[float]
    frequency_thz: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, frequency_thz: _Optional[_Iterable[float]] = ..., eps_real: _Optional[_Iterable[float]] = ..., eps_imag: _Optional[_Iterable[float]] = ..., eps_std: _Optional[_Iterable[float]] = ...) -> None: ...

class SheetConductance(_message.Message):
    __slots__ = ["conductivity_imag_siemens_per_cm", "conductivity_real_siemens_per_cm", "conductivity_std_siemens_per_cm", "imag_siemens", "real_siemens", "std_siemens"]
    CONDUCTIVITY_IMAG_SIEMENS_PER_CM_FIELD_NUMBER: _ClassVar[int]
    CONDUCTIVITY_REAL_SIEMENS_PER_CM_FIELD_NUMBER: _ClassVar[int]
    CONDUCTIVITY_STD_SIEMENS_PER_CM_FIELD_NUMBER: _ClassVar[int]
    IMAG_SIEMENS_FIELD_NUMBER: _ClassVar[int]
    REAL_SIEMENS_FIELD_NUMBER: _ClassVar[int]
    STD_SIEMENS_FIELD_NUMBER: _ClassVar[int]
    conductivity_imag_siemens_per_cm: _containers.RepeatedScalarFieldContainer[float]
    conductivity_real_siemens_per_cm: _containers.RepeatedScalarFieldContainer[float]
    conductivity_std_siemens_per_cm: _containers.RepeatedScalarFieldContainer[float]
    imag_siemens: _containers.RepeatedScalarFieldContainer[float]
    real_siemens: _containers.RepeatedScalarFieldContainer[float]
    std_siemens: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, real_siemens: _Optional[_Iterable[float]] = ..., imag_siemens: _Optional[_Iterable[float]] = ..., std_siemens: _Optional[_Iterable[float]] = ..., conductivity_real_siemens_per_cm: _Optional[_Iterable[float]] = ..., conductivity_imag_siemens_per_cm: _Optional[_Iterable[float]] = ..., conductivity_std_siemens_per_cm: _Optional[_Iterable[float]] = ...) -> None: ...

class SlabSpecimen(_message.Message):
    __slots__ = ["echo_count", "echoes", "max_index_std", "thickness_um"]
    ECHOES_FIELD_NUMBER: _ClassVar[int]
    ECHO_COUNT_FIELD_NUMBER: _ClassVar[int]
    MAX_INDEX_STD_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    echo_count: int
    echoes: EchoModel
    max_index_std: float
    thickness_um: float
    def __init__(self, thickness_um: _Optional[float] = ..., echoes: _Optional[_Union[EchoModel, str]] = ..., echo_count: _Optional[int] = ..., max_index_std: _Optional[float] = ...) -> None: ...

class EchoModel(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
