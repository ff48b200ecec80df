package thermal

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"thzdrive/caution"
	"thzdrive/units"
)

// Defaults that Estimate fills in for zero-valued fields.
const (
	// DefaultZNu is mean-field dynamics, the assumption with the fewest
	// parameters when the universality class is not known.
	DefaultZNu = ZNuMeanField
	// DefaultMarginFraction: SmallMargin is raised when the heated spot comes
	// within 5 % of Tc from below (common practice; no source).
	DefaultMarginFraction = 0.05
	// DefaultLargeRiseFraction: HeatingLarge is raised when the total rise,
	// steady state plus one pulse, exceeds 10 % of the base temperature
	// (common practice; no source). Past it the sample is no longer at the
	// temperature the experiment names, and the constant conductivity behind
	// the steady-state rise starts to fail.
	DefaultLargeRiseFraction = 0.1
)

// Geometry is how the absorbed energy is distributed in depth.
type Geometry int

const (
	// GeometryUnspecified is the zero value; Estimate refuses it.
	GeometryUnspecified Geometry = iota
	// Film: uniform over the thickness, u = F_abs/d.
	Film
	// Bulk: Beer–Lambert, u(z) = F_in α e^{-αz}, hottest at the surface.
	Bulk
)

func (g Geometry) String() string {
	switch g {
	case GeometryUnspecified:
		return "unspecified"
	case Film:
		return "film"
	case Bulk:
		return "bulk"
	}
	return fmt.Sprintf("Geometry(%d)", int(g))
}

// Inputs is everything Estimate needs. All quantities are SI; a zero means
// "not given" where the field's comment allows that.
type Inputs struct {
	// FluenceJPerM2 is the incident on-axis (peak) fluence of one pump
	// pulse at the sample surface, J/m^2. Zero: derived from PulseEnergyJ
	// and SpotRadiusM as 2W/(πw^2).
	FluenceJPerM2 float64
	// AbsorbedFraction is the fraction A (0 < A <= 1) of the incident energy
	// absorbed in the sample: a film's absorptance from the optics of its
	// stack; 1 - R for a bulk sample. Give it or AbsorbedFluenceJPerM2.
	AbsorbedFraction float64
	// AbsorbedFluenceJPerM2 is the absorbed on-axis fluence, J/m^2, for a
	// caller who has it directly (optical pumps). Give it or AbsorbedFraction.
	AbsorbedFluenceJPerM2 float64
	// PulseEnergyJ is the incident pulse energy, J. Zero: derived from the
	// fluence for a Gaussian spot (needs SpotRadiusM).
	PulseEnergyJ float64
	// SpotRadiusM is the 1/e^2 intensity radius w of the Gaussian spot, m.
	// Needed when RepetitionRateHz > 0 or to derive the fluence.
	SpotRadiusM float64
	// RepetitionRateHz is the pulse repetition rate, Hz. Zero: a single
	// shot, no steady-state heating.
	RepetitionRateHz float64

	// Geometry is Film or Bulk.
	Geometry Geometry
	// ThicknessM is the film thickness d, m (Film only).
	ThicknessM float64
	// AbsorptionCoefficientPerM is the intensity absorption coefficient α,
	// 1/m (Bulk; give it or AbsorptionDepthM).
	AbsorptionCoefficientPerM float64
	// AbsorptionDepthM is the intensity absorption depth δ = 1/α, m (Bulk;
	// give it or AbsorptionCoefficientPerM).
	AbsorptionDepthM float64
	// HeatCapacity is the volumetric heat capacity model: Constant, *Table
	// or Debye.
	HeatCapacity HeatCapacity
	// ConductivityWPerMK is the thermal conductivity κ of the half-space
	// under the spot, W/(m K) (the substrate's, for a thin film). Needed
	// when RepetitionRateHz > 0.
	ConductivityWPerMK float64

	// BaseTemperatureK is the cryostat or ambient temperature, K (> 0).
	BaseTemperatureK float64
	// TransitionTemperatureK is Tc, K. Zero: no transition is assessed.
	TransitionTemperatureK float64
	// ZNu is the dynamic-scaling exponent product z·ν (> 0). Zero:
	// DefaultZNu. See ZNuMeanField, ZNuIsing3DModelA, ZNuIsing2DModelA.
	ZNu float64
	// MarginFraction is the fraction of Tc below which SmallMargin is
	// raised, 0 < f < 1. Zero: DefaultMarginFraction.
	MarginFraction float64
	// LargeRiseFraction is the rise, as a fraction of the base temperature,
	// above which HeatingLarge is raised (> 0). Zero:
	// DefaultLargeRiseFraction.
	LargeRiseFraction float64
	// DamageClass selects the optical damage rule of thumb.
	DamageClass MaterialClass
	// DamageThresholdJPerM2 overrides DamageClass with the caller's own
	// single-shot damage fluence, J/m^2. Zero: from DamageClass.
	DamageThresholdJPerM2 float64
}

// Budget is the heating estimate and transition budget. Temperatures in K,
// energies in J, energy densities in J/m^3, fluences in J/m^2, power in W.
type Budget struct {
	// Inputs echoes the inputs used, with defaults and the derived incident
	// fluence filled in.
	Inputs Inputs

	// IncidentFluenceJPerM2 is the incident on-axis fluence; zero when only
	// the absorbed fluence was given.
	IncidentFluenceJPerM2 float64
	// AbsorbedFluenceJPerM2 is F·A, or as given.
	AbsorbedFluenceJPerM2 float64
	// AbsorbedPulseEnergyJ is W·A (or, without W, the Gaussian spot's
	// absorbed energy F_abs π w^2/2); zero when there is no spot radius.
	AbsorbedPulseEnergyJ float64
	// AbsorptionDepthM is 1/α for Bulk; zero for Film.
	AbsorptionDepthM float64
	// PeakEnergyDensityJPerM3 is the energy density one pulse deposits at
	// the hottest point: F_abs/d (Film) or F_abs α at the surface (Bulk).
	PeakEnergyDensityJPerM3 float64
	// AbsorbedPowerW is the average absorbed power W·A·f_rep.
	AbsorbedPowerW float64

	// SteadyStateRiseK is the Lax (1977) rise at the spot centre.
	SteadyStateRiseK float64
	// SteadyStateTemperatureK is base + steady-state rise.
	SteadyStateTemperatureK float64
	// SinglePulseRiseK is PeakTemperatureK - SteadyStateTemperatureK.
	SinglePulseRiseK float64
	// PeakTemperatureK is the temperature right after one pulse, starting
	// from the steady state: ∫_{T_ss}^{T_peak} C dT = PeakEnergyDensityJPerM3.
	PeakTemperatureK float64

	// HasTransition reports whether a Tc was given; the fields below it
	// are zero otherwise.
	HasTransition bool
	// MarginK is Tc - PeakTemperatureK (negative once Tc is passed).
	MarginK float64
	// MarginFractionOfTc is MarginK/Tc.
	MarginFractionOfTc float64
	// ReducedBase, ReducedSteadyState and ReducedPeak are t = (T - Tc)/Tc
	// at the base, steady-state and peak temperatures.
	ReducedBase        float64
	ReducedSteadyState float64
	ReducedPeak        float64
	// RelaxationFactorSteadyState and RelaxationFactorPeak are
	// τ(T)/τ(T_base) under dynamic scaling with the resolved ZNu. A factor
	// is defined (its flag true) unless one of the two temperatures is
	// exactly Tc or the factor is beyond float64; undefined factors are 0.
	RelaxationFactorSteadyState  float64
	RelaxationSteadyStateDefined bool
	RelaxationFactorPeak         float64
	RelaxationPeakDefined        bool

	// DamageThresholdJPerM2 is the damage fluence the check used.
	DamageThresholdJPerM2 float64
	// Cautions are the structured warnings, in a fixed order: damage,
	// transition, margin, large heating, then any others.
	Cautions []caution.Caution
}

// Violation names one offending input field and why.
type Violation struct {
	Field  string // the Inputs field name, e.g. "FluenceJPerM2"
	Reason string
}

// InputError lists every problem Estimate found with its Inputs. Test for it
// with errors.As, or errors.Is(err, ErrInvalidInput).
type InputError struct {
	Violations []Violation
}

// ErrInvalidInput matches every *InputError under errors.Is.
var ErrInvalidInput = errors.New("thermal: invalid input")

func (e *InputError) Error() string {
	parts := make([]string, len(e.Violations))
	for i, v := range e.Violations {
		parts[i] = v.Field + ": " + v.Reason
	}
	return "thermal: invalid input: " + strings.Join(parts, "; ")
}

// Is reports whether target is ErrInvalidInput.
func (e *InputError) Is(target error) bool { return target == ErrInvalidInput }

type validator struct{ v []Violation }

func (c *validator) add(field, format string, args ...any) {
	c.v = append(c.v, Violation{Field: field, Reason: fmt.Sprintf(format, args...)})
}

// nonNegative checks that a field is finite and >= 0 and reports whether it is.
func (c *validator) nonNegative(field string, x float64) bool {
	if math.IsNaN(x) || math.IsInf(x, 0) || x < 0 {
		c.add(field, "must be finite and >= 0 (got %g)", x)
		return false
	}
	return true
}

// Estimate computes the heating of the pumped spot and its transition
// budget. It is the package's one entry point for a server; the steps are
// the exported functions of the package:
//
//  1. Absorbed fluence F_abs = F·A (or as given); peak energy density
//     u = F_abs/d for a Film, u = F_abs α at the surface of Bulk
//     (FilmEnergyDensityJPerM3, BulkEnergyDensityJPerM3).
//  2. Steady state: average absorbed power P = W·A·f_rep, rise at the spot
//     centre P/(2√π κ a) with a = w/√2 (SteadyStateRiseK, after Lax 1977);
//     T_ss = T_base + ΔT_ss.
//  3. Single pulse: T_peak solves ∫_{T_ss}^{T_peak} C dT = u
//     (FinalTemperatureK). Convention: each pulse starts from the
//     steady-state temperature, the time average of the train. Just before
//     a pulse the spot is somewhat cooler than that average, so T_peak errs
//     high, on the safe side for a budget.
//  4. Transition budget when Tc is given: margin Tc - T_peak, reduced
//     temperatures, relaxation-time factors (RelaxationFactor).
//  5. Cautions (package caution), described below.
//
// Which side of Tc matters: heating only raises the temperature, and between
// pulses the spot relaxes to T_ss >= T_base, never below. With the base below
// Tc (the ordered phase, for most transitions) the pump can carry the spot to
// Tc and past: CrossesTransition when T_peak >= Tc, SmallMargin when T_peak
// is within MarginFraction·Tc below it. With the base at or above Tc, the
// sample is already in the high-temperature phase and heating moves it away
// from Tc: nothing is crossed, no margin shrinks, and the relaxation factors
// (below 1) say how much faster the heated spot relaxes.
//
// Cautions:
//   - OpticalDamage: the incident fluence (or, if only the absorbed fluence
//     was given, that lower bound of it) exceeds DamageThresholdJPerM2, or
//     the rule of thumb of DamageClass (DamageThresholdJPerM2 function).
//   - CrossesTransition: base below Tc and T_peak >= Tc; the message says
//     whether the steady state alone already reaches Tc.
//   - SmallMargin: base below Tc, T_peak below Tc by less than
//     MarginFraction·Tc (default 5 %).
//   - HeatingLarge: T_peak - T_base > LargeRiseFraction·T_base (default 10 %).
//
// Errors: *InputError, naming every offending field, for NaN, Inf, negative
// or missing values, contradictory fields (both or neither of two
// alternatives, a field the geometry does not use), a base temperature
// outside the heat-capacity model's range, and computations that leave that
// range or float64 (reported against HeatCapacity, FluenceJPerM2 or
// RepetitionRateHz). Estimate never panics, and a nil error guarantees that
// every number in the Budget is finite.
func Estimate(in Inputs) (Budget, error) {
	var c validator
	res := in

	// Every number: finite and >= 0.
	for _, f := range []struct {
		name string
		x    float64
	}{
		{"FluenceJPerM2", in.FluenceJPerM2},
		{"AbsorbedFraction", in.AbsorbedFraction},
		{"AbsorbedFluenceJPerM2", in.AbsorbedFluenceJPerM2},
		{"PulseEnergyJ", in.PulseEnergyJ},
		{"SpotRadiusM", in.SpotRadiusM},
		{"RepetitionRateHz", in.RepetitionRateHz},
		{"ThicknessM", in.ThicknessM},
		{"AbsorptionCoefficientPerM", in.AbsorptionCoefficientPerM},
		{"AbsorptionDepthM", in.AbsorptionDepthM},
		{"ConductivityWPerMK", in.ConductivityWPerMK},
		{"BaseTemperatureK", in.BaseTemperatureK},
		{"TransitionTemperatureK", in.TransitionTemperatureK},
		{"ZNu", in.ZNu},
		{"MarginFraction", in.MarginFraction},
		{"LargeRiseFraction", in.LargeRiseFraction},
		{"DamageThresholdJPerM2", in.DamageThresholdJPerM2},
	} {
		c.nonNegative(f.name, f.x)
	}
	if len(c.v) > 0 {
		return Budget{}, &InputError{Violations: c.v}
	}

	// Pump: absorbed fraction or absorbed fluence, exactly one.
	switch {
	case in.AbsorbedFraction > 0 && in.AbsorbedFluenceJPerM2 > 0:
		c.add("AbsorbedFluenceJPerM2", "give AbsorbedFraction or AbsorbedFluenceJPerM2, not both")
	case in.AbsorbedFraction == 0 && in.AbsorbedFluenceJPerM2 == 0:
		c.add("AbsorbedFraction", "required: give AbsorbedFraction (0 < A <= 1) or AbsorbedFluenceJPerM2 (> 0)")
	case in.AbsorbedFraction > 1:
		c.add("AbsorbedFraction", "must be <= 1 (got %g)", in.AbsorbedFraction)
	}
	incident := in.FluenceJPerM2
	if incident == 0 && in.PulseEnergyJ > 0 {
		if in.SpotRadiusM > 0 {
			var err error
			if incident, err = GaussianPeakFluenceJPerM2(in.PulseEnergyJ, in.SpotRadiusM); err != nil {
				c.add("PulseEnergyJ", "%v", err)
			}
		} else {
			c.add("SpotRadiusM", "required to derive the fluence from PulseEnergyJ")
		}
	}
	if incident == 0 && in.AbsorbedFraction > 0 {
		c.add("FluenceJPerM2", "required with AbsorbedFraction: give FluenceJPerM2, or PulseEnergyJ and SpotRadiusM")
	}
	if in.AbsorbedFluenceJPerM2 > 0 && incident > 0 && in.AbsorbedFluenceJPerM2 > incident {
		c.add("AbsorbedFluenceJPerM2", "%g J/m^2 exceeds the incident fluence %g J/m^2", in.AbsorbedFluenceJPerM2, incident)
	}
	res.FluenceJPerM2 = incident

	// Geometry.
	switch in.Geometry {
	case Film:
		if in.ThicknessM == 0 {
			c.add("ThicknessM", "required (> 0) for a film")
		}
		if in.AbsorptionCoefficientPerM != 0 {
			c.add("AbsorptionCoefficientPerM", "not used for a film (energy is taken as uniform over the thickness); leave it zero")
		}
		if in.AbsorptionDepthM != 0 {
			c.add("AbsorptionDepthM", "not used for a film (energy is taken as uniform over the thickness); leave it zero")
		}
	case Bulk:
		if in.ThicknessM != 0 {
			c.add("ThicknessM", "not used for a bulk sample; leave it zero")
		}
		switch {
		case in.AbsorptionCoefficientPerM > 0 && in.AbsorptionDepthM > 0:
			c.add("AbsorptionDepthM", "give AbsorptionCoefficientPerM or AbsorptionDepthM, not both")
		case in.AbsorptionCoefficientPerM == 0 && in.AbsorptionDepthM == 0:
			c.add("AbsorptionCoefficientPerM", "required for a bulk sample: give AbsorptionCoefficientPerM or AbsorptionDepthM (> 0)")
		case in.AbsorptionCoefficientPerM > 0 && math.IsInf(1/in.AbsorptionCoefficientPerM, 0):
			c.add("AbsorptionCoefficientPerM", "%g 1/m is too small: its depth 1/α overflows float64", in.AbsorptionCoefficientPerM)
		case in.AbsorptionDepthM > 0 && math.IsInf(1/in.AbsorptionDepthM, 0):
			c.add("AbsorptionDepthM", "%g m is too small: 1/δ overflows float64", in.AbsorptionDepthM)
		}
	default:
		c.add("Geometry", "must be Film or Bulk (got %v)", in.Geometry)
	}

	// Sample and budget.
	if in.HeatCapacity == nil {
		c.add("HeatCapacity", "required")
	}
	if in.BaseTemperatureK == 0 {
		c.add("BaseTemperatureK", "required (> 0 K)")
	} else if in.HeatCapacity != nil {
		if _, err := in.HeatCapacity.CapacityJPerM3K(in.BaseTemperatureK); err != nil {
			c.add("BaseTemperatureK", "%v", err)
		}
	}
	if in.RepetitionRateHz > 0 {
		if in.SpotRadiusM == 0 {
			c.add("SpotRadiusM", "required (> 0) when RepetitionRateHz > 0")
		}
		if in.ConductivityWPerMK == 0 {
			c.add("ConductivityWPerMK", "required (> 0) when RepetitionRateHz > 0")
		}
	}
	if res.ZNu == 0 {
		res.ZNu = DefaultZNu
	}
	if res.MarginFraction == 0 {
		res.MarginFraction = DefaultMarginFraction
	} else if res.MarginFraction >= 1 {
		c.add("MarginFraction", "must be < 1 (got %g)", res.MarginFraction)
	}
	if res.LargeRiseFraction == 0 {
		res.LargeRiseFraction = DefaultLargeRiseFraction
	}
	if res.DamageThresholdJPerM2 == 0 {
		t, err := DamageThresholdJPerM2(in.DamageClass)
		if err != nil {
			c.add("DamageClass", "%v", err)
		}
		res.DamageThresholdJPerM2 = t
	}
	if len(c.v) > 0 {
		return Budget{}, &InputError{Violations: c.v}
	}

	b := Budget{Inputs: res, IncidentFluenceJPerM2: incident, DamageThresholdJPerM2: res.DamageThresholdJPerM2}

	// 1. Absorbed energy.
	absorbed := in.AbsorbedFluenceJPerM2
	effFraction := in.AbsorbedFraction
	if absorbed == 0 {
		absorbed = incident * in.AbsorbedFraction
	} else if incident > 0 {
		effFraction = absorbed / incident
	}
	b.AbsorbedFluenceJPerM2 = absorbed
	var err error
	switch in.Geometry {
	case Film:
		b.PeakEnergyDensityJPerM3, err = FilmEnergyDensityJPerM3(absorbed, in.ThicknessM)
	case Bulk:
		alpha := in.AbsorptionCoefficientPerM
		if alpha == 0 {
			alpha = 1 / in.AbsorptionDepthM
		}
		b.AbsorptionDepthM = 1 / alpha
		b.PeakEnergyDensityJPerM3, err = BulkEnergyDensityJPerM3(absorbed, alpha, 0)
	}
	if err != nil {
		return Budget{}, inputError("FluenceJPerM2", err)
	}

	// 2. Steady state.
	switch {
	case in.PulseEnergyJ > 0:
		b.AbsorbedPulseEnergyJ = in.PulseEnergyJ * effFraction
	case in.SpotRadiusM > 0:
		if b.AbsorbedPulseEnergyJ, err = GaussianPulseEnergyJ(absorbed, in.SpotRadiusM); err != nil {
			return Budget{}, inputError("SpotRadiusM", err)
		}
	}
	b.SteadyStateTemperatureK = in.BaseTemperatureK
	if in.RepetitionRateHz > 0 {
		b.AbsorbedPowerW = b.AbsorbedPulseEnergyJ * in.RepetitionRateHz
		if b.SteadyStateRiseK, err = SteadyStateRiseK(b.AbsorbedPowerW, in.SpotRadiusM, in.ConductivityWPerMK); err != nil {
			return Budget{}, inputError("RepetitionRateHz", err)
		}
		b.SteadyStateTemperatureK = in.BaseTemperatureK + b.SteadyStateRiseK
	}

	// 3. Single pulse from the steady state.
	if b.PeakTemperatureK, err = FinalTemperatureK(in.HeatCapacity, b.SteadyStateTemperatureK, b.PeakEnergyDensityJPerM3); err != nil {
		if errors.Is(err, ErrOutOfRange) {
			return Budget{}, inputError("HeatCapacity", err)
		}
		return Budget{}, inputError("FluenceJPerM2", err)
	}
	b.SinglePulseRiseK = b.PeakTemperatureK - b.SteadyStateTemperatureK

	// 4. Transition budget.
	if tc := in.TransitionTemperatureK; tc > 0 {
		b.HasTransition = true
		b.MarginK = tc - b.PeakTemperatureK
		b.MarginFractionOfTc = b.MarginK / tc
		b.ReducedBase = (in.BaseTemperatureK - tc) / tc
		b.ReducedSteadyState = (b.SteadyStateTemperatureK - tc) / tc
		b.ReducedPeak = (b.PeakTemperatureK - tc) / tc
		if f, err := RelaxationFactor(b.ReducedBase, b.ReducedSteadyState, res.ZNu); err == nil {
			b.RelaxationFactorSteadyState, b.RelaxationSteadyStateDefined = f, true
		}
		if f, err := RelaxationFactor(b.ReducedBase, b.ReducedPeak, res.ZNu); err == nil {
			b.RelaxationFactorPeak, b.RelaxationPeakDefined = f, true
		}
	}

	// 5. Cautions.
	b.Cautions = cautions(&b, res, in.DamageThresholdJPerM2 > 0)

	if name, ok := firstNonFinite(&b); !ok {
		return Budget{}, inputError("FluenceJPerM2", fmt.Errorf("thermal: %s is beyond float64 for these inputs", name))
	}
	return b, nil
}

func inputError(field string, err error) error {
	return &InputError{Violations: []Violation{{Field: field, Reason: err.Error()}}}
}

// cautions builds the cautions from a computed budget and the resolved
// inputs; callerThreshold says whether the damage threshold was the caller's.
func cautions(b *Budget, in Inputs, callerThreshold bool) []caution.Caution {
	var out []caution.Caution
	base, tss, tpk := in.BaseTemperatureK, b.SteadyStateTemperatureK, b.PeakTemperatureK

	// Optical damage.
	fluence, which := b.IncidentFluenceJPerM2, "incident"
	if fluence == 0 {
		fluence, which = b.AbsorbedFluenceJPerM2, "absorbed (a lower bound of the incident)"
	}
	if fluence > b.DamageThresholdJPerM2 {
		rule := "the caller's damage threshold"
		if !callerThreshold {
			rule = "the femtosecond damage rule of thumb for " + in.DamageClass.String()
		}
		out = append(out, caution.New(caution.OpticalDamage,
			fmt.Sprintf("The %s fluence %.3g J/cm^2 exceeds %s, %.3g J/cm^2; many shots damage at lower fluence still (incubation).",
				which, fluence/units.JPerCm2, rule, b.DamageThresholdJPerM2/units.JPerCm2),
			caution.V("fluence_j_per_cm2", fluence/units.JPerCm2),
			caution.V("damage_threshold_j_per_cm2", b.DamageThresholdJPerM2/units.JPerCm2)))
	}

	if tc := in.TransitionTemperatureK; tc > 0 && base < tc {
		switch {
		case tss >= tc:
			out = append(out, caution.New(caution.CrossesTransition,
				fmt.Sprintf("The average heating alone brings the spot to %.4g K, at or above Tc = %.4g K: the spot stays in the high-temperature phase between pulses.", tss, tc),
				caution.V("base_temperature_k", base),
				caution.V("steady_state_temperature_k", tss),
				caution.V("peak_temperature_k", tpk),
				caution.V("transition_temperature_k", tc)))
		case tpk >= tc:
			out = append(out, caution.New(caution.CrossesTransition,
				fmt.Sprintf("Each pulse heats the spot from %.4g K to %.4g K, at or above Tc = %.4g K: the transition is crossed thermally.", tss, tpk, tc),
				caution.V("base_temperature_k", base),
				caution.V("steady_state_temperature_k", tss),
				caution.V("peak_temperature_k", tpk),
				caution.V("transition_temperature_k", tc)))
		case b.MarginK < in.MarginFraction*tc:
			out = append(out, caution.New(caution.SmallMargin,
				fmt.Sprintf("The heated spot peaks at %.4g K, %.3g K (%.2g %% of Tc) below Tc = %.4g K, inside the %.2g %% margin.",
					tpk, b.MarginK, 100*b.MarginFractionOfTc, tc, 100*in.MarginFraction),
				caution.V("peak_temperature_k", tpk),
				caution.V("transition_temperature_k", tc),
				caution.V("margin_k", b.MarginK),
				caution.V("margin_fraction", b.MarginFractionOfTc),
				caution.V("margin_threshold_fraction", in.MarginFraction)))
		}
	}

	if rise := tpk - base; rise > in.LargeRiseFraction*base {
		out = append(out, caution.New(caution.HeatingLarge,
			fmt.Sprintf("The spot heats by %.3g K (steady state %.3g K, one pulse %.3g K) from a %.4g K base, more than %.3g %% of it: the sample is not at its base temperature.",
				rise, b.SteadyStateRiseK, b.SinglePulseRiseK, base, 100*in.LargeRiseFraction),
			caution.V("base_temperature_k", base),
			caution.V("steady_state_rise_k", b.SteadyStateRiseK),
			caution.V("single_pulse_rise_k", b.SinglePulseRiseK),
			caution.V("peak_temperature_k", tpk),
			caution.V("rise_fraction", rise/base),
			caution.V("rise_threshold_fraction", in.LargeRiseFraction)))
	}
	return out
}

// firstNonFinite returns the name of the first NaN or Inf number in b.
func firstNonFinite(b *Budget) (string, bool) {
	for _, f := range []struct {
		name string
		x    float64
	}{
		{"IncidentFluenceJPerM2", b.IncidentFluenceJPerM2},
		{"AbsorbedFluenceJPerM2", b.AbsorbedFluenceJPerM2},
		{"AbsorbedPulseEnergyJ", b.AbsorbedPulseEnergyJ},
		{"AbsorptionDepthM", b.AbsorptionDepthM},
		{"PeakEnergyDensityJPerM3", b.PeakEnergyDensityJPerM3},
		{"AbsorbedPowerW", b.AbsorbedPowerW},
		{"SteadyStateRiseK", b.SteadyStateRiseK},
		{"SteadyStateTemperatureK", b.SteadyStateTemperatureK},
		{"SinglePulseRiseK", b.SinglePulseRiseK},
		{"PeakTemperatureK", b.PeakTemperatureK},
		{"MarginK", b.MarginK},
		{"MarginFractionOfTc", b.MarginFractionOfTc},
		{"ReducedBase", b.ReducedBase},
		{"ReducedSteadyState", b.ReducedSteadyState},
		{"ReducedPeak", b.ReducedPeak},
		{"RelaxationFactorSteadyState", b.RelaxationFactorSteadyState},
		{"RelaxationFactorPeak", b.RelaxationFactorPeak},
		{"DamageThresholdJPerM2", b.DamageThresholdJPerM2},
	} {
		if !isFinite(f.x) {
			return f.name, false
		}
	}
	for _, c := range b.Cautions {
		for _, v := range c.Values {
			if !isFinite(v.Number) {
				return "caution value " + v.Name, false
			}
		}
	}
	return "", true
}
