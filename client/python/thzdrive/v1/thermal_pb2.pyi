from thzdrive.v1 import caution_pb2 as _caution_pb2
from google.protobuf.internal import containers as _containers
from google.protobuf.internal import enum_type_wrapper as _enum_type_wrapper
from google.protobuf import descriptor as _descriptor
from google.protobuf import message as _message
from typing import ClassVar as _ClassVar, Iterable as _Iterable, Mapping as _Mapping, Optional as _Optional, Union as _Union

DAMAGE_CLASS_DIELECTRIC: DamageClass
DAMAGE_CLASS_METAL_OR_SEMICONDUCTOR: DamageClass
DAMAGE_CLASS_UNSPECIFIED: DamageClass
DESCRIPTOR: _descriptor.FileDescriptor
SAMPLE_GEOMETRY_BULK: SampleGeometry
SAMPLE_GEOMETRY_FILM: SampleGeometry
SAMPLE_GEOMETRY_UNSPECIFIED: SampleGeometry

class DebyeModel(_message.Message):
    __slots__ = ["atoms_per_nm3", "debye_temperature_k"]
    ATOMS_PER_NM3_FIELD_NUMBER: _ClassVar[int]
    DEBYE_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    atoms_per_nm3: float
    debye_temperature_k: float
    def __init__(self, debye_temperature_k: _Optional[float] = ..., atoms_per_nm3: _Optional[float] = ...) -> None: ...

class EstimateHeatingRequest(_message.Message):
    __slots__ = ["absorbed_fluence_uj_per_cm2", "absorbed_fraction", "absorption_coefficient_per_cm", "absorption_depth_um", "base_temperature_k", "damage_class", "damage_threshold_mj_per_cm2", "geometry", "heat_capacity", "incident_fluence_uj_per_cm2", "large_rise_fraction", "margin_fraction", "pulse_energy_uj", "repetition_rate_khz", "spot_radius_um", "thermal_conductivity_w_per_m_k", "thickness_um", "transition_temperature_k", "z_nu"]
    ABSORBED_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    ABSORBED_FRACTION_FIELD_NUMBER: _ClassVar[int]
    ABSORPTION_COEFFICIENT_PER_CM_FIELD_NUMBER: _ClassVar[int]
    ABSORPTION_DEPTH_UM_FIELD_NUMBER: _ClassVar[int]
    BASE_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    DAMAGE_CLASS_FIELD_NUMBER: _ClassVar[int]
    DAMAGE_THRESHOLD_MJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    GEOMETRY_FIELD_NUMBER: _ClassVar[int]
    HEAT_CAPACITY_FIELD_NUMBER: _ClassVar[int]
    INCIDENT_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    LARGE_RISE_FRACTION_FIELD_NUMBER: _ClassVar[int]
    MARGIN_FRACTION_FIELD_NUMBER: _ClassVar[int]
    PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    REPETITION_RATE_KHZ_FIELD_NUMBER: _ClassVar[int]
    SPOT_RADIUS_UM_FIELD_NUMBER: _ClassVar[int]
    THERMAL_CONDUCTIVITY_W_PER_M_K_FIELD_NUMBER: _ClassVar[int]
    THICKNESS_UM_FIELD_NUMBER: _ClassVar[int]
    TRANSITION_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    Z_NU_FIELD_NUMBER: _ClassVar[int]
    absorbed_fluence_uj_per_cm2: float
    absorbed_fraction: float
    absorption_coefficient_per_cm: float
    absorption_depth_um: float
    base_temperature_k: float
    damage_class: DamageClass
    damage_threshold_mj_per_cm2: float
    geometry: SampleGeometry
    heat_capacity: HeatCapacityModel
    incident_fluence_uj_per_cm2: float
    large_rise_fraction: float
    margin_fraction: float
    pulse_energy_uj: float
    repetition_rate_khz: float
    spot_radius_um: float
    thermal_conductivity_w_per_m_k: float
    thickness_um: float
    transition_temperature_k: float
    z_nu: float
    def __init__(self, incident_fluence_uj_per_cm2: _Optional[float] = ..., absorbed_fraction: _Optional[float] = ..., absorbed_fluence_uj_per_cm2: _Optional[float] = ..., pulse_energy_uj: _Optional[float] = ..., spot_radius_um: _Optional[float] = ..., repetition_rate_khz: _Optional[float] = ..., geometry: _Optional[_Union[SampleGeometry, str]] = ..., thickness_um: _Optional[float] = ..., absorption_coefficient_per_cm: _Optional[float] = ..., absorption_depth_um: _Optional[float] = ..., heat_capacity: _Optional[_Union[HeatCapacityModel, _Mapping]] = ..., thermal_conductivity_w_per_m_k: _Optional[float] = ..., base_temperature_k: _Optional[float] = ..., transition_temperature_k: _Optional[float] = ..., z_nu: _Optional[float] = ..., margin_fraction: _Optional[float] = ..., large_rise_fraction: _Optional[float] = ..., damage_class: _Optional[_Union[DamageClass, str]] = ..., damage_threshold_mj_per_cm2: _Optional[float] = ...) -> None: ...

class EstimateHeatingResponse(_message.Message):
    __slots__ = ["budget", "cautions", "resolved"]
    BUDGET_FIELD_NUMBER: _ClassVar[int]
    CAUTIONS_FIELD_NUMBER: _ClassVar[int]
    RESOLVED_FIELD_NUMBER: _ClassVar[int]
    budget: HeatingBudget
    cautions: _containers.RepeatedCompositeFieldContainer[_caution_pb2.Caution]
    resolved: EstimateHeatingRequest
    def __init__(self, budget: _Optional[_Union[HeatingBudget, _Mapping]] = ..., cautions: _Optional[_Iterable[_Union[_caution_pb2.Caution, _Mapping]]] = ..., resolved: _Optional[_Union[EstimateHeatingRequest, _Mapping]] = ...) -> None: ...

class HeatCapacityModel(_message.Message):
    __slots__ = ["constant_j_per_cm3_k", "debye", "table"]
    CONSTANT_J_PER_CM3_K_FIELD_NUMBER: _ClassVar[int]
    DEBYE_FIELD_NUMBER: _ClassVar[int]
    TABLE_FIELD_NUMBER: _ClassVar[int]
    constant_j_per_cm3_k: float
    debye: DebyeModel
    table: HeatCapacityTable
    def __init__(self, constant_j_per_cm3_k: _Optional[float] = ..., table: _Optional[_Union[HeatCapacityTable, _Mapping]] = ..., debye: _Optional[_Union[DebyeModel, _Mapping]] = ...) -> None: ...

class HeatCapacityTable(_message.Message):
    __slots__ = ["capacity_j_per_cm3_k", "temperature_k"]
    CAPACITY_J_PER_CM3_K_FIELD_NUMBER: _ClassVar[int]
    TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    capacity_j_per_cm3_k: _containers.RepeatedScalarFieldContainer[float]
    temperature_k: _containers.RepeatedScalarFieldContainer[float]
    def __init__(self, temperature_k: _Optional[_Iterable[float]] = ..., capacity_j_per_cm3_k: _Optional[_Iterable[float]] = ...) -> None: ...

class HeatingBudget(_message.Message):
    __slots__ = ["absorbed_fluence_uj_per_cm2", "absorbed_power_mw", "absorbed_pulse_energy_uj", "absorption_depth_um", "damage_threshold_mj_per_cm2", "incident_fluence_uj_per_cm2", "margin_fraction_of_tc", "margin_k", "peak_energy_density_j_per_cm3", "peak_temperature_k", "reduced_temperature_base", "reduced_temperature_peak", "reduced_temperature_steady_state", "relaxation_factor_peak", "relaxation_factor_steady_state", "single_pulse_rise_k", "steady_state_rise_k", "steady_state_temperature_k"]
    ABSORBED_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    ABSORBED_POWER_MW_FIELD_NUMBER: _ClassVar[int]
    ABSORBED_PULSE_ENERGY_UJ_FIELD_NUMBER: _ClassVar[int]
    ABSORPTION_DEPTH_UM_FIELD_NUMBER: _ClassVar[int]
    DAMAGE_THRESHOLD_MJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    INCIDENT_FLUENCE_UJ_PER_CM2_FIELD_NUMBER: _ClassVar[int]
    MARGIN_FRACTION_OF_TC_FIELD_NUMBER: _ClassVar[int]
    MARGIN_K_FIELD_NUMBER: _ClassVar[int]
    PEAK_ENERGY_DENSITY_J_PER_CM3_FIELD_NUMBER: _ClassVar[int]
    PEAK_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    REDUCED_TEMPERATURE_BASE_FIELD_NUMBER: _ClassVar[int]
    REDUCED_TEMPERATURE_PEAK_FIELD_NUMBER: _ClassVar[int]
    REDUCED_TEMPERATURE_STEADY_STATE_FIELD_NUMBER: _ClassVar[int]
    RELAXATION_FACTOR_PEAK_FIELD_NUMBER: _ClassVar[int]
    RELAXATION_FACTOR_STEADY_STATE_FIELD_NUMBER: _ClassVar[int]
    SINGLE_PULSE_RISE_K_FIELD_NUMBER: _ClassVar[int]
    STEADY_STATE_RISE_K_FIELD_NUMBER: _ClassVar[int]
    STEADY_STATE_TEMPERATURE_K_FIELD_NUMBER: _ClassVar[int]
    absorbed_fluence_uj_per_cm2: float
    absorbed_power_mw: float
    absorbed_pulse_energy_uj: float
    absorption_depth_um: float
    damage_threshold_mj_per_cm2: float
    incident_fluence_uj_per_cm2: float
    margin_fraction_of_tc: float
    margin_k: float
    peak_energy_density_j_per_cm3: float
    peak_temperature_k: float
    reduced_temperature_base: float
    reduced_temperature_peak: float
    reduced_temperature_steady_state: float
    relaxation_factor_peak: float
    relaxation_factor_steady_state: float
    single_pulse_rise_k: float
    steady_state_rise_k: float
    steady_state_temperature_k: float
    def __init__(self, incident_fluence_uj_per_cm2: _Optional[float] = ..., absorbed_fluence_uj_per_cm2: _Optional[float] = ..., absorbed_pulse_energy_uj: _Optional[float] = ..., absorption_depth_um: _Optional[float] = ..., peak_energy_density_j_per_cm3: _Optional[float] = ..., absorbed_power_mw: _Optional[float] = ..., steady_state_rise_k: _Optional[float] = ..., steady_state_temperature_k: _Optional[float] = ..., single_pulse_rise_k: _Optional[float] = ..., peak_temperature_k: _Optional[float] = ..., margin_k: _Optional[float] = ..., margin_fraction_of_tc: _Optional[float] = ..., reduced_temperature_base: _Optional[float] = ..., reduced_temperature_steady_state: _Optional[float] = ..., reduced_temperature_peak: _Optional[float] = ..., relaxation_factor_steady_state: _Optional[float] = ..., relaxation_factor_peak: _Optional[float] = ..., damage_threshold_mj_per_cm2: _Optional[float] = ...) -> None: ...

class SampleGeometry(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []

class DamageClass(int, metaclass=_enum_type_wrapper.EnumTypeWrapper):
    __slots__ = []
