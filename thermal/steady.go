package thermal

import (
	"fmt"
	"math"
)

// LaxCentreRiseK returns the steady-state temperature rise (K) at the centre
// of a Gaussian spot that deposits absorbedPowerW (W) on the surface of a
// half-space of thermal conductivity conductivityWPerMK (W/(m K)), the spot
// given by its 1/e intensity radius radiusOneOverEM (m):
//
//	ΔT = P / (2 √π κ a)
//
// (Lax, J. Appl. Phys. 48, 3919 (1977): the maximum rise for a Gaussian beam
// in the limit of negligible absorption depth; the same result is the shape
// factor
// S = 2√π a of Incropera et al., Fundamentals of Heat and Mass Transfer,
// problem 4.16).
//
// Derivation: a point source of power P on the surface of a half-space with
// an insulating surface raises the steady temperature at distance r by
// P/(2π κ r), twice the full-space value because all the heat flows into one
// half. The spot's intensity is I(r) = P/(π a^2) exp(-r^2/a^2); superposing
// point sources, the rise at the centre is
//
//	ΔT(0) = ∫_0^∞ I(r) / (2π κ r) · 2π r dr = (1/κ) ∫_0^∞ I(r) dr
//	      = P/(π a^2 κ) · (√π a / 2) = P / (2 √π κ a).
//
// Assumptions: a semi-infinite, homogeneous sample (thickness ≫ a); the
// absorption depth ≪ a (surface absorption; a deeper source gives less, per
// Lax's general result); constant κ (at cryogenic temperatures κ changes
// quickly with T: use κ at the heated temperature, or expect an error of
// order the relative change of κ across the rise); no loss from the surface;
// and steady state, reached after a time of order a^2/D (D the thermal
// diffusivity). For a thin film on a thick substrate, the film adds little
// resistance and κ is the substrate's.
func LaxCentreRiseK(absorbedPowerW, radiusOneOverEM, conductivityWPerMK float64) (float64, error) {
	if !(absorbedPowerW >= 0) || math.IsInf(absorbedPowerW, 0) {
		return 0, fmt.Errorf("thermal: absorbed power must be finite and >= 0 W (got %g)", absorbedPowerW)
	}
	if !(radiusOneOverEM > 0) || math.IsInf(radiusOneOverEM, 0) {
		return 0, fmt.Errorf("thermal: spot radius must be finite and > 0 m (got %g)", radiusOneOverEM)
	}
	if !(conductivityWPerMK > 0) || math.IsInf(conductivityWPerMK, 0) {
		return 0, fmt.Errorf("thermal: thermal conductivity must be finite and > 0 W/(m K) (got %g)", conductivityWPerMK)
	}
	rise := absorbedPowerW / (2 * math.Sqrt(math.Pi) * conductivityWPerMK * radiusOneOverEM)
	if !isFinite(rise) {
		return 0, fmt.Errorf("thermal: steady-state rise overflows float64 (P = %g W, a = %g m, κ = %g W/(m K))",
			absorbedPowerW, radiusOneOverEM, conductivityWPerMK)
	}
	return rise, nil
}

// SteadyStateRiseK is LaxCentreRiseK for a spot given, as everywhere else in
// this service, by its 1/e^2 intensity radius spotRadiusM = w. The 1/e radius
// is a = w/√2, so ΔT = P / (√(2π) κ w).
func SteadyStateRiseK(absorbedPowerW, spotRadiusM, conductivityWPerMK float64) (float64, error) {
	return LaxCentreRiseK(absorbedPowerW, spotRadiusM/math.Sqrt2, conductivityWPerMK)
}
