package optics

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"
)

// TestGridRecurrenceMatchesDirect: on a uniform grid Evaluate advances the
// exponentials of fixed layers and slabs by recurrence, re-anchored every
// gridAnchorEvery steps. Solver.gridAnchor states the (derived) bound: the
// recurrence adds at most (2 + 4.3·j)·u, u = 2^-53, j <= 31 steps from an
// anchor (1.5e-14), to the rounding of the phase θ = ωñd/c that any
// evaluation in float64 carries (a few |θ|·u; the recurrence and the
// direct formula round θ differently, so they may differ by that much).
//
// Checked against the direct per-frequency evaluation (Evaluate at one
// frequency at a time, which is not a grid) on the grid of an 8 192-sample
// transform of 10 fs (0 to 50 THz), for thick coherent and incoherent,
// lossless and lossy layers and slabs, at normal and oblique s and p
// incidence, with every placement of the target:
//
//   - "moderate": slabs and layers up to 100 um, |θ| <= 360 rad, so the
//     phase rounding stays below 5e-13 and the field must agree to 1e-12
//     relative (the tolerance);
//   - "thick": a 1 mm and a 2 mm slab (|θ| up to 6 400 rad): the field must
//     agree to 1e-12 + 8·|θ|max·u (5.8e-12 here), the stated bound.
//
// The absorbed fraction, a fraction of the incident power, must agree to
// 1e-12 absolute: for a nearly transparent target it is the difference of
// two fluxes of order 1, so its relative accuracy is limited by that
// cancellation in both evaluations alike.
func TestGridRecurrenceMatchesDirect(t *testing.T) {
	const n, dt = 8192, 10e-15
	freq := make([]float64, n/2+1)
	for k := range freq {
		freq[k] = float64(k) / (float64(n) * dt) // as pulse.Transform.FrequencyHz
	}
	if ok, _ := uniformStep(freq); !ok {
		t.Fatal("the transform's grid is not recognised as uniform")
	}
	const u = 0x1p-53
	lossy := Constant{N: 3.4, Kappa: 0.004}
	thin := Constant{N: 1.9, Kappa: 0.02}
	lorentz := Dielectric{EpsInf: 6, Oscillators: []Oscillator{{FreqHz: 4e12, WidthHz: 0.2e12, DeltaEps: 1.2}}}
	for _, set := range []struct {
		name     string
		elements []Element
		thick    float64 // thickness of the sample's thick layers
		thetaMax float64 // largest |θ| = ω·|ñ|·d/c (coherent slab: 2ωñd/c) at 50 THz
	}{
		{"moderate", []Element{
			Slab{Medium: Constant{N: 3.4175}, ThicknessM: 100e-6, Incoherent: true},
			Slab{Medium: Constant{N: 1.53, Kappa: 0.001}, ThicknessM: 100e-6},
			Attenuator{AngleRad: 0.4},
		}, 100e-6, 2 * math.Pi * 50e12 / 299792458 * 3.4 * 100e-6}, // the 100 um layers of n = 3.4
		{"thick", []Element{
			Slab{Medium: Constant{N: 3.4175}, ThicknessM: 1e-3, Incoherent: true},
			Slab{Medium: Constant{N: 1.53, Kappa: 0.001}, ThicknessM: 2e-3},
			Attenuator{AngleRad: 0.4},
		}, 300e-6, 2 * math.Pi * 50e12 / 299792458 * 2 * 1.53 * 2e-3},
	} {
		tol := 1e-12
		if set.name == "thick" {
			tol += 8 * set.thetaMax * u
		} else if 8*set.thetaMax*u > 5e-13 {
			t.Fatalf("the moderate set has phases up to %g rad", set.thetaMax)
		}
		stacks := map[string]Stack{
			"normal": {Layers: []Layer{
				{Medium: thin, ThicknessM: 3e-6},
				{Medium: lossy, ThicknessM: set.thick, Incoherent: true},
				{Medium: lorentz, ThicknessM: 2e-6},
				{Medium: lossy, ThicknessM: 40e-6},
				{Medium: Constant{N: 2.2}, ThicknessM: set.thick},
			}, Exit: Constant{N: 3.1, Kappa: 0.01}},
			"oblique s": {AngleRad: 0.5, Pol: PolS, Layers: []Layer{
				{Medium: lossy, ThicknessM: set.thick},
				{Medium: thin, ThicknessM: 1e-6},
				{Medium: lossy, ThicknessM: set.thick, Incoherent: true},
			}, Exit: lorentz},
			"oblique p": {AngleRad: 0.9, Pol: PolP, Layers: []Layer{
				{Medium: Constant{N: 1.2}, ThicknessM: 30e-6},
				{Medium: lossy, ThicknessM: 60e-6},
				{Medium: lorentz, ThicknessM: 5e-6},
			}, Exit: Constant{N: 1.1}}, // beyond the critical angle of the exit
		}
		for name, st := range stacks {
			for _, tg := range []Target{
				{Layer: 1},
				{Layer: 1, Placement: AtDepth, DepthM: 0.3e-6},
				{Layer: 0, Placement: LayerAverage},
				{Layer: len(st.Layers) - 1, Placement: LayerAverage},
				{Layer: ExitMedium, Placement: AtDepth, DepthM: 2e-6},
			} {
				t.Run(fmt.Sprintf("%s/%s/%+v", set.name, name, tg), func(t *testing.T) {
					ev, err := NewEvaluator(Train{Elements: set.elements, Sample: st, Target: tg})
					if err != nil {
						t.Fatal(err)
					}
					field := make([]complex128, len(freq))
					abs := make([]float64, len(freq))
					if err := ev.Evaluate(freq, field, abs); err != nil {
						t.Fatal(err)
					}
					worst, worstA := 0.0, 0.0
					for k := range freq {
						var f1 [1]complex128
						var a1 [1]float64
						if err := ev.Evaluate(freq[k:k+1], f1[:], a1[:]); err != nil {
							t.Fatal(err)
						}
						if d := cmplx.Abs(field[k] - f1[0]); d > 0 {
							worst = math.Max(worst, d/cmplx.Abs(f1[0]))
						}
						worstA = math.Max(worstA, math.Abs(abs[k]-a1[0]))
					}
					if worst > tol || worstA > 1e-12 {
						t.Errorf("recurrence differs from the direct evaluation by %.3g relative in the field (want <= %.3g) and %.3g in the absorbed fraction (want <= 1e-12)", worst, tol, worstA)
					}
					t.Logf("largest difference: field %.2g relative, absorbed fraction %.2g", worst, worstA)
				})
			}
		}
	}
}

// TestUniformStep: the grids Evaluate treats as uniform, and those it does
// not (too short, decreasing, uneven beyond 4 ulp, not finite).
func TestUniformStep(t *testing.T) {
	even := []float64{0, 1e9, 2e9, 3e9}
	if ok, df := uniformStep(even); !ok || df != 1e9 {
		t.Errorf("uniformStep(%v) = %v, %g", even, ok, df)
	}
	for _, g := range [][]float64{
		{0, 1e9},
		{3e9, 2e9, 1e9},
		{0, 1e9, 2.000001e9, 3e9},
		{0, 1e9, math.NaN(), 3e9},
		{1e9, 1e9, 1e9},
	} {
		if ok, _ := uniformStep(g); ok {
			t.Errorf("uniformStep(%v) accepted", g)
		}
	}
}
