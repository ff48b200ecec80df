package thermal

import (
	"fmt"
	"math"
)

// FilmEnergyDensityJPerM3 returns the energy density (J/m^3) that an
// absorbed fluence absorbedFluenceJPerM2 (J/m^2) deposits in a film of
// thickness thicknessM (m), taken as uniform over the thickness:
//
//	u = F_abs / d = F A / d.
//
// F_abs = F·A with A the film's absorptance from the optics of the whole
// stack (multiple reflections included), so energy is conserved: u d = F_abs.
// Uniformity holds when the film is thin against the absorption depth
// (α d ≪ 1, often the case for THz pumps on thin films), or when heat
// spreads across it before the time of interest (d^2/D ≪ t, D the
// diffusivity). Otherwise the front of the film is hotter by up to a factor
// α d / (1 - e^{-α d}) (derived from Beer–Lambert, back reflection ignored).
func FilmEnergyDensityJPerM3(absorbedFluenceJPerM2, thicknessM float64) (float64, error) {
	if err := checkAbsorbedFluence(absorbedFluenceJPerM2); err != nil {
		return 0, err
	}
	if !(thicknessM > 0) || math.IsInf(thicknessM, 0) {
		return 0, fmt.Errorf("thermal: film thickness must be finite and > 0 m (got %g)", thicknessM)
	}
	u := absorbedFluenceJPerM2 / thicknessM
	if !isFinite(u) {
		return 0, fmt.Errorf("thermal: energy density overflows float64 (F_abs = %g J/m^2, d = %g m)", absorbedFluenceJPerM2, thicknessM)
	}
	return u, nil
}

// BulkEnergyDensityJPerM3 returns the energy density (J/m^3) at depth depthM
// (m) below the surface of a thick sample into which absorbedFluenceJPerM2
// (J/m^2) enters, with intensity absorption coefficient
// absorptionCoefficientPerM (1/m), by the Beer–Lambert law:
//
//	u(z) = F_in α e^{-α z},   peak u(0) = F_in α = F_in / δ,   δ = 1/α.
//
// Relation to the absorbed fraction: in a sample much thicker than 1/α all
// that enters is absorbed, so F_in = F·A with A = 1 - R the absorbed fraction
// (R the surface reflectance), and ∫_0^∞ u dz = F_in: energy is conserved.
//
// α is the decay constant of the intensity (power), α = 4π k/λ = 2 ω k/c
// with k the extinction coefficient (imaginary part of the refractive
// index). The field amplitude decays half as fast; a field attenuation
// coefficient must be doubled before it is given here. For an
// optical pump, δ = 1/α is the optical absorption (penetration) depth of the
// intensity.
func BulkEnergyDensityJPerM3(absorbedFluenceJPerM2, absorptionCoefficientPerM, depthM float64) (float64, error) {
	if err := checkAbsorbedFluence(absorbedFluenceJPerM2); err != nil {
		return 0, err
	}
	if !(absorptionCoefficientPerM > 0) || math.IsInf(absorptionCoefficientPerM, 0) {
		return 0, fmt.Errorf("thermal: absorption coefficient must be finite and > 0 1/m (got %g)", absorptionCoefficientPerM)
	}
	if !(depthM >= 0) || math.IsInf(depthM, 0) {
		return 0, fmt.Errorf("thermal: depth must be finite and >= 0 m (got %g)", depthM)
	}
	u := absorbedFluenceJPerM2 * absorptionCoefficientPerM * math.Exp(-absorptionCoefficientPerM*depthM)
	if !isFinite(u) {
		return 0, fmt.Errorf("thermal: energy density overflows float64 (F_in = %g J/m^2, α = %g 1/m)", absorbedFluenceJPerM2, absorptionCoefficientPerM)
	}
	return u, nil
}

func checkAbsorbedFluence(f float64) error {
	if !(f >= 0) || math.IsInf(f, 0) {
		return fmt.Errorf("thermal: absorbed fluence must be finite and >= 0 J/m^2 (got %g)", f)
	}
	return nil
}

// GaussianPeakFluenceJPerM2 returns the on-axis fluence (J/m^2) of a pulse of
// energy pulseEnergyJ (J) in a Gaussian spot of 1/e^2 intensity radius
// spotRadiusM = w (m): F0 = 2 W / (π w^2), since ∫ F0 exp(-2 r^2/w^2) dA =
// F0 π w^2 / 2 (Siegman, Lasers (1986), on Gaussian beams). The mean fluence
// inside w is lower, (1 - e^{-2}) W/(π w^2).
func GaussianPeakFluenceJPerM2(pulseEnergyJ, spotRadiusM float64) (float64, error) {
	if !(pulseEnergyJ >= 0) || math.IsInf(pulseEnergyJ, 0) {
		return 0, fmt.Errorf("thermal: pulse energy must be finite and >= 0 J (got %g)", pulseEnergyJ)
	}
	if !(spotRadiusM > 0) || math.IsInf(spotRadiusM, 0) {
		return 0, fmt.Errorf("thermal: spot radius must be finite and > 0 m (got %g)", spotRadiusM)
	}
	f := 2 * pulseEnergyJ / (math.Pi * spotRadiusM * spotRadiusM)
	if !isFinite(f) {
		return 0, fmt.Errorf("thermal: fluence overflows float64 (W = %g J, w = %g m)", pulseEnergyJ, spotRadiusM)
	}
	return f, nil
}

// GaussianPulseEnergyJ is the inverse of GaussianPeakFluenceJPerM2: the
// energy (J) of a Gaussian spot of 1/e^2 radius spotRadiusM (m) whose on-axis
// fluence is peakFluenceJPerM2 (J/m^2), W = F0 π w^2 / 2.
func GaussianPulseEnergyJ(peakFluenceJPerM2, spotRadiusM float64) (float64, error) {
	if !(peakFluenceJPerM2 >= 0) || math.IsInf(peakFluenceJPerM2, 0) {
		return 0, fmt.Errorf("thermal: fluence must be finite and >= 0 J/m^2 (got %g)", peakFluenceJPerM2)
	}
	if !(spotRadiusM > 0) || math.IsInf(spotRadiusM, 0) {
		return 0, fmt.Errorf("thermal: spot radius must be finite and > 0 m (got %g)", spotRadiusM)
	}
	w := peakFluenceJPerM2 * math.Pi * spotRadiusM * spotRadiusM / 2
	if !isFinite(w) {
		return 0, fmt.Errorf("thermal: pulse energy overflows float64 (F0 = %g J/m^2, w = %g m)", peakFluenceJPerM2, spotRadiusM)
	}
	return w, nil
}
