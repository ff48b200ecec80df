package thermal

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Energy bookkeeping of the deposition profiles (derived: what is absorbed
// per area must equal the energy density integrated over depth).
func TestEnergyDensityConservesAbsorbedFluence(t *testing.T) {
	// Film: u·d = F_abs, to round-off (1e-15 relative).
	for _, tc := range []struct{ f, d float64 }{{10, 100e-9}, {3.7e-2, 2e-6}, {1e3, 1e-9}} {
		u, err := FilmEnergyDensityJPerM3(tc.f, tc.d)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(u*tc.d, tc.f); e > 1e-15 {
			t.Errorf("film %+v: u·d = %g, want %g", tc, u*tc.d, tc.f)
		}
	}
	// Bulk: ∫_0^∞ u(z) dz = F_in, by 100-point Gauss–Legendre (gonum) over
	// 60 absorption depths; the tail beyond is e^-60 ≈ 1e-26. Tolerance
	// 1e-13 relative.
	for _, tc := range []struct{ f, alpha float64 }{{10, 1e7}, {0.2, 5e4}, {150, 3e2}} {
		u := func(z float64) float64 {
			v, err := BulkEnergyDensityJPerM3(tc.f, tc.alpha, z)
			if err != nil {
				t.Fatal(err)
			}
			return v
		}
		got := quad.Fixed(u, 0, 60/tc.alpha, 100, quad.Legendre{}, 0)
		if e := relErr(got, tc.f); e > 1e-13 {
			t.Errorf("bulk %+v: ∫u dz = %.15g, want %g (rel err %.2g)", tc, got, tc.f, e)
		}
	}
}

// Beer–Lambert: one absorption depth down, the energy density falls by e
// (derived from u ∝ e^{-αz}); peak u(0) = F α. Tolerance 1e-15 relative.
func TestBulkEnergyDensityProfile(t *testing.T) {
	const f, alpha = 12.0, 2.5e6
	u0, _ := BulkEnergyDensityJPerM3(f, alpha, 0)
	uDelta, _ := BulkEnergyDensityJPerM3(f, alpha, 1/alpha)
	if e := relErr(u0, f*alpha); e > 1e-15 {
		t.Errorf("u(0) = %g, want F α = %g", u0, f*alpha)
	}
	if e := relErr(uDelta, u0/math.E); e > 1e-15 {
		t.Errorf("u(1/α) = %g, want u(0)/e = %g", uDelta, u0/math.E)
	}
}

// A Gaussian spot's peak fluence integrates back to its energy:
// ∫ F0 exp(-2r^2/w^2) 2πr dr = W (Siegman, Lasers (1986); checked here by
// 100-point Gauss–Legendre over 0..6w, tail e^-72). Tolerance 1e-13.
func TestGaussianFluenceEnergy(t *testing.T) {
	for _, tc := range []struct{ w, r float64 }{{1e-6, 50e-6}, {2.5e-3, 0.4e-3}} {
		f0, err := GaussianPeakFluenceJPerM2(tc.w, tc.r)
		if err != nil {
			t.Fatal(err)
		}
		got := quad.Fixed(func(r float64) float64 {
			return f0 * math.Exp(-2*r*r/(tc.r*tc.r)) * 2 * math.Pi * r
		}, 0, 6*tc.r, 100, quad.Legendre{}, 0)
		if e := relErr(got, tc.w); e > 1e-13 {
			t.Errorf("%+v: ∫F dA = %g, want %g", tc, got, tc.w)
		}
		back, err := GaussianPulseEnergyJ(f0, tc.r)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(back, tc.w); e > 1e-15 {
			t.Errorf("%+v: inverse gives %g", tc, back)
		}
	}
}

func TestAbsorbErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		name string
		f    func() error
	}{
		{"film negative fluence", func() error { _, err := FilmEnergyDensityJPerM3(-1, 1e-7); return err }},
		{"film NaN fluence", func() error { _, err := FilmEnergyDensityJPerM3(nan, 1e-7); return err }},
		{"film zero thickness", func() error { _, err := FilmEnergyDensityJPerM3(1, 0); return err }},
		{"film Inf thickness", func() error { _, err := FilmEnergyDensityJPerM3(1, inf); return err }},
		{"film overflow", func() error { _, err := FilmEnergyDensityJPerM3(1e300, 1e-300); return err }},
		{"bulk zero alpha", func() error { _, err := BulkEnergyDensityJPerM3(1, 0, 0); return err }},
		{"bulk negative depth", func() error { _, err := BulkEnergyDensityJPerM3(1, 1e6, -1); return err }},
		{"bulk Inf fluence", func() error { _, err := BulkEnergyDensityJPerM3(inf, 1e6, 0); return err }},
		{"gauss zero radius", func() error { _, err := GaussianPeakFluenceJPerM2(1, 0); return err }},
		{"gauss NaN energy", func() error { _, err := GaussianPeakFluenceJPerM2(nan, 1); return err }},
		{"gauss energy negative fluence", func() error { _, err := GaussianPulseEnergyJ(-1, 1); return err }},
		{"gauss energy Inf radius", func() error { _, err := GaussianPulseEnergyJ(1, inf); return err }},
	} {
		if err := tc.f(); err == nil {
			t.Errorf("%s: want an error", tc.name)
		}
	}
}
