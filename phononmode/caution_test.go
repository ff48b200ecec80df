package phononmode

import (
	"math"
	"testing"

	"thzdrive/caution"
	"thzdrive/units"
)

// value returns the named number of the first caution with code c.
func value(r *Result, c caution.Code, name string) (float64, bool) {
	for _, x := range r.Cautions {
		if x.Code != c {
			continue
		}
		for _, v := range x.Values {
			if v.Name == name {
				return v.Number, true
			}
		}
	}
	return 0, false
}

// Each caution fires on its documented threshold (physics.md §7) and carries
// its numbers; a well-behaved case carries none. The thresholds are the
// package's documented constants (common practice / physics.md), so the
// cases sit clearly on either side of them.
func TestCautions(t *testing.T) {
	gaas := gaasMode(t)
	res := 1 / gaas.OmegaRadPerS()
	at := func(e0 float64) Field { return singleCycle(e0, res, 1e-12, 0, 10e-15, 2048) }
	// The Lindemann ratio is linear in the field (linear mode): size the
	// fields for ratios 0.07 and 0.2 from one drive.
	r1 := mustDrive(t, gaas, at(units.MVPerCm), Options{})
	perField := r1.LindemannRatio / units.MVPerCm

	wideBand := Mode{FreqHz: 2 * units.THz, LinewidthHz: 0.3 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
	gentle := singleCycle(units.KVPerCm, 1/wideBand.OmegaRadPerS(), 1e-12, 0, 10e-15, 1024)
	stiff := wideBand
	stiff.A4PerM2KgS2 = 1e75
	cases := []struct {
		name   string
		m      Mode
		f      Field
		opt    Options
		want   caution.Code // Unspecified: no caution at all
		number string
		check  func(*Result, float64) bool
	}{
		{"quiet", wideBand, gentle, Options{}, caution.Unspecified, "", nil},
		{"undersampled: 2.2 THz mode, 100 fs step (0.44 of Nyquist)",
			Mode{FreqHz: 2.2 * units.THz, LinewidthHz: 0.3 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28},
			singleCycle(units.KVPerCm, 1/(2*math.Pi*2*units.THz), 3e-12, 0, 100e-15, 256), Options{},
			caution.Undersampled, "mode_frequency_thz", func(r *Result, v float64) bool { return v == 2.2 }},
		{"Lindemann warning at 0.07", gaas, at(0.07 / perField), Options{}, caution.LindemannWarning, "lindemann_ratio",
			func(r *Result, v float64) bool { return v == r.LindemannRatio && math.Abs(v-0.07) < 1e-9 }},
		{"Lindemann damage at 0.2", gaas, at(0.2 / perField), Options{}, caution.LindemannDamage, "lindemann_ratio",
			func(r *Result, v float64) bool { return v == r.LindemannRatio && !hasCode(r, caution.LindemannWarning) }},
		{"nonlinear by quanta", gaas, at(10 * units.MVPerCm), Options{}, caution.NonlinearRegime, "quanta_per_cell",
			func(r *Result, v float64) bool { return v == r.Quanta && v > NonlinearQuanta }},
		{"nonlinear by anharmonic shift", stiff, singleCycle(0.1*units.MVPerCm, 1/wideBand.OmegaRadPerS(), 1e-12, 0, 10e-15, 1024), Options{},
			caution.NonlinearRegime, "anharmonic_shift_thz",
			func(r *Result, v float64) bool { return v*units.THz > stiff.LinewidthHz && r.Quanta < NonlinearQuanta }},
		{"mode outside the band", gaas, singleCycle(units.MVPerCm, 1/(2*math.Pi*units.THz), 2e-12, 0, 10e-15, 2048), Options{},
			caution.ModeOutsideBand, "relative_amplitude_at_mode", func(r *Result, v float64) bool { return v < OutsideBandLevel }},
		{"ring-down wraps (exact, capped)", Mode{FreqHz: units.THz, LinewidthHz: 1 * units.GHz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28},
			singleCycle(units.KVPerCm, 0.16e-12, 1e-12, 0, 20e-15, 1000), Options{Method: Exact, MaxSamples: 1 << 14},
			caution.ModeNotDecayed, "residual_amplitude", func(r *Result, v float64) bool { return v > 1e-3 && v < 1 }},
	}
	for _, c := range cases {
		r := mustDrive(t, c.m, c.f, c.opt)
		if c.want == caution.Unspecified {
			if len(r.Cautions) != 0 {
				t.Errorf("%s: unexpected cautions %v", c.name, r.Cautions)
			}
			continue
		}
		v, ok := value(r, c.want, c.number)
		if !ok {
			t.Errorf("%s: no %v caution with %s; got %v", c.name, c.want, c.number, r.Cautions)
			continue
		}
		if !c.check(r, v) {
			t.Errorf("%s: %s = %g does not match the result", c.name, c.number, v)
		}
	}
	// Every caution has a sentence and only finite, named numbers.
	for _, e0 := range []float64{0.2 / perField, 10 * units.MVPerCm} {
		r := mustDrive(t, gaas, at(e0), Options{})
		for _, c := range r.Cautions {
			if c.Message == "" || len(c.Values) == 0 {
				t.Errorf("%v: empty message or no values", c.Code)
			}
			for _, v := range c.Values {
				if v.Name == "" || math.IsNaN(v.Number) || math.IsInf(v.Number, 0) {
					t.Errorf("%v: bad value %+v", c.Code, v)
				}
			}
		}
	}
}
