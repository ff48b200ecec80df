package thermal

import (
	"fmt"
	"math"
)

// Products z·ν of the dynamic exponent z and the correlation-length exponent
// ν, for RelaxationFactor (Hohenberg & Halperin, Rev. Mod. Phys. 49, 435
// (1977) for the dynamic classes; the numbers are from memory of the
// literature since, and uncertain in the last digit).
const (
	// ZNuMeanField is van Hove's conventional theory: z = 2, ν = 1/2.
	ZNuMeanField = 1.0
	// ZNuIsing3DModelA is the 3D Ising class with non-conserved order
	// parameter (model A): z ≈ 2.03, ν ≈ 0.630, z·ν ≈ 1.28.
	ZNuIsing3DModelA = 2.03 * 0.630
	// ZNuIsing2DModelA is the 2D Ising class, model A: z ≈ 2.17, ν = 1
	// (Onsager), z·ν ≈ 2.17.
	ZNuIsing2DModelA = 2.17
)

// ReducedTemperature returns t = (T - Tc)/Tc: negative below the transition
// temperature, positive above.
func ReducedTemperature(temperatureK, transitionK float64) (float64, error) {
	if !(temperatureK >= 0) || math.IsInf(temperatureK, 0) {
		return 0, fmt.Errorf("thermal: temperature must be finite and >= 0 K (got %g)", temperatureK)
	}
	if !(transitionK > 0) || math.IsInf(transitionK, 0) {
		return 0, fmt.Errorf("thermal: transition temperature must be finite and > 0 K (got %g)", transitionK)
	}
	return (temperatureK - transitionK) / transitionK, nil
}

// RelaxationFactor returns τ(to)/τ(from), the factor by which the order
// parameter's relaxation time changes between reduced temperatures
// reducedFrom and reducedTo under dynamic scaling, τ ∝ ξ^z ∝ |t|^(-zν)
// (Hohenberg & Halperin 1977):
//
//	τ(to)/τ(from) = (|t_from| / |t_to|)^(zν).
//
// Moving toward Tc the factor exceeds 1 (critical slowing down); halving |t|
// with zν = 1 doubles τ. The law is asymptotic: trust it for |t| ≲ 0.1, and
// only as a trend beyond. Across Tc the two sides have different amplitudes
// (a universal ratio of order one), so a factor between a temperature below
// and one above Tc is an order of magnitude only.
//
// Errors: zNu not finite and > 0; a reduced temperature that is not finite,
// or is zero (τ diverges at Tc and the ratio has no value); a factor beyond
// float64.
func RelaxationFactor(reducedFrom, reducedTo, zNu float64) (float64, error) {
	if !(zNu > 0) || math.IsInf(zNu, 0) {
		return 0, fmt.Errorf("thermal: z·ν must be finite and > 0 (got %g)", zNu)
	}
	if !isFinite(reducedFrom) || !isFinite(reducedTo) {
		return 0, fmt.Errorf("thermal: reduced temperatures must be finite (got %g, %g)", reducedFrom, reducedTo)
	}
	if reducedFrom == 0 || reducedTo == 0 {
		return 0, fmt.Errorf("thermal: reduced temperature 0: the relaxation time diverges at Tc, the ratio is undefined")
	}
	// In logarithms, so that tiny |t| do not overflow an intermediate power.
	f := math.Exp(zNu * (math.Log(math.Abs(reducedFrom)) - math.Log(math.Abs(reducedTo))))
	if !isFinite(f) || f == 0 {
		return 0, fmt.Errorf("thermal: relaxation factor beyond float64 (t from %g to %g, zν = %g)", reducedFrom, reducedTo, zNu)
	}
	return f, nil
}
