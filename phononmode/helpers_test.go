package phononmode

import (
	"math"
	"testing"

	"thzdrive/caution"
	"thzdrive/units"
)

// singleCycle samples the first derivative of a Gaussian (physics.md §2):
// E(t) = E0·√e·((t−t0)/τ)·exp(−(t−t0)²/(2τ²)), extrema ±E0 at t0 ± τ,
// spectral peak at f = 1/(2πτ).
func singleCycle(e0, tau, t0, start, step float64, n int) Field {
	v := make([]float64, n)
	for i := range v {
		x := (start + float64(i)*step - t0) / tau
		v[i] = e0 * math.Sqrt(math.E) * x * math.Exp(-x*x/2)
	}
	return Field{StartS: start, StepS: step, VPerM: v}
}

// singleCycleSpectrum is |E(ω)| of singleCycle (physics.md §2, derived from
// the Gaussian integral): E0·√(2πe)·τ²·ω·exp(−ω²τ²/2).
func singleCycleSpectrum(e0, tau, omega float64) float64 {
	return e0 * math.Sqrt(2*math.Pi*math.E) * tau * tau * omega * math.Exp(-omega*omega*tau*tau/2)
}

// fewCycle samples a Gaussian-envelope carrier (physics.md §2):
// E0·exp(−2ln2·(t−t0)²/T²)·cos(2πf0(t−t0) + φ), T the FWHM of |E|².
func fewCycle(e0, fwhm, f0, phi, t0, start, step float64, n int) Field {
	v := make([]float64, n)
	for i := range v {
		t := start + float64(i)*step - t0
		v[i] = e0 * math.Exp(-2*math.Ln2*t*t/(fwhm*fwhm)) * math.Cos(2*math.Pi*f0*t+phi)
	}
	return Field{StartS: start, StepS: step, VPerM: v}
}

// gaasMode is the room-temperature GaAs TO mode as physics.md §5 states it:
// a = 5.65325 Å, V = a³/4, μ = 36.114 amu, W_TO = 268 cm⁻¹,
// Δε = 12.9 − 10.89 (Blakemore, J. Appl. Phys. 53, R123 (1982), from
// memory per physics.md); the linewidth 2.5 cm⁻¹ is a typical room-
// temperature value (common practice), not a check value.
func gaasMode(t testing.TB) Mode {
	t.Helper()
	a := 5.65325 * units.Angstrom
	m, err := FromOscillatorStrength(12.9-10.89, 268*units.InvCm, 2.5*units.InvCm, a*a*a/4)
	if err != nil {
		t.Fatal(err)
	}
	m.EffectiveMassKg = 36.114 * units.Amu
	// Ga–As nearest-neighbour distance a·√3/4 (zinc-blende geometry).
	m.BondLengthM = a * math.Sqrt(3) / 4
	return m
}

// relMaxDiff is max|a−b| over max|b|.
func relMaxDiff(a, b []float64) float64 {
	var d, s float64
	for i := range b {
		d = math.Max(d, math.Abs(a[i]-b[i]))
		s = math.Max(s, math.Abs(b[i]))
	}
	return d / s
}

func mustDrive(t testing.TB, m Mode, f Field, opt Options) *Result {
	t.Helper()
	r, err := Drive(m, f, opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

const cautionNonlinear = caution.NonlinearRegime

// hasCode reports whether r carries a caution with code c.
func hasCode(r *Result, c caution.Code) bool {
	for _, x := range r.Cautions {
		if x.Code == c {
			return true
		}
	}
	return false
}
