package pulse

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestResampleMatchesScipy checks Resample against scipy's natural cubic
// spline (scipy.interpolate.CubicSpline, bc_type="natural") and numpy's
// median spacing, both evaluated on the documented grid by
// testdata/make_window_spline_reference.py. Both solve the same tridiagonal
// system, so the tolerance is round-off: 1e-9 of the largest value.
func TestResampleMatchesScipy(t *testing.T) {
	var times, field, want []float64
	var start, step float64
	for _, r := range readRows(t, "spline_reference.csv") {
		switch r[0] {
		case "knot":
			times = append(times, atof(t, r[2]))
			field = append(field, atof(t, r[3]))
		case "grid":
			start, step = atof(t, r[1]), atof(t, r[2])
		case "value":
			want = append(want, atof(t, r[2]))
		}
	}
	tr, err := Resample(times, field, true)
	if err != nil {
		t.Fatal(err)
	}
	if tr.StartS != start || tr.StepS != step || tr.Len() != len(want) || !tr.Absolute {
		t.Fatalf("grid start %g step %g N %d; scipy/numpy %g %g %d", tr.StartS, tr.StepS, tr.Len(), start, step, len(want))
	}
	peak := 0.0
	for _, v := range want {
		peak = max(peak, math.Abs(v))
	}
	for i, v := range tr.Field {
		if !within(v, want[i], 1e-9*peak) {
			t.Errorf("sample %d: %.12g, scipy %.12g", i, v, want[i])
		}
	}
}

// TestResampleSmooth checks that resampling jittered samples of the
// worked-check pulse reproduces it within the cubic spline error bound
// (5/384)·h⁴·max|d⁴E/dt⁴| (Hall & Meyer, J. Approx. Theory 16, 105 (1976)),
// with h the largest spacing. For E = E0·sqrt(e)·x·e^{-x²/2}, x = t/τ, the
// fourth derivative is E0·sqrt(e)·He5(x)·e^{-x²/2}/τ⁴ with He5 = x⁵ - 10x³ +
// 15x (derived from Hermite polynomials), whose maximum is found by a scan.
// The pulse has decayed at both ends, so the natural end condition adds
// nothing measurable.
func TestResampleSmooth(t *testing.T) {
	m := singleCycle1THz
	tau := m.TauS()
	rng := rand.New(rand.NewPCG(11, 12))
	const n, h0 = 600, 20e-15
	times := make([]float64, n)
	field := make([]float64, n)
	for i := range times {
		times[i] = (float64(i)-n/2)*h0 + (rng.Float64()-0.5)*0.6*h0
		field[i] = m.At(times[i])
	}
	hMax := 0.0
	for i := 1; i < n; i++ {
		hMax = max(hMax, times[i]-times[i-1])
	}
	d4 := 0.0
	for x := -8.0; x <= 8; x += 1e-4 {
		he5 := x*x*x*x*x - 10*x*x*x + 15*x
		d4 = max(d4, math.Abs(he5*math.Exp(-x*x/2)))
	}
	d4 *= m.PeakFieldVPerM * math.Sqrt(math.E) / math.Pow(tau, 4)
	bound := 5.0 / 384 * math.Pow(hMax, 4) * d4
	tr, err := Resample(times, field, true)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for i, v := range tr.Field {
		worst = max(worst, math.Abs(v-m.At(tr.TimeS(i))))
	}
	if worst > bound {
		t.Errorf("largest deviation %.3g V/m exceeds the spline bound %.3g V/m", worst, bound)
	}
	t.Logf("largest deviation %.3g V/m (%.2g of E0), bound %.3g V/m", worst, worst/m.PeakFieldVPerM, bound)
	if tr.TimeS(tr.Len()-1) > times[n-1] || tr.StartS != times[0] {
		t.Errorf("grid [%g, %g] is not within the samples [%g, %g]", tr.StartS, tr.TimeS(tr.Len()-1), times[0], times[n-1])
	}
}

// TestResampleErrors checks that unsorted, duplicated or non-finite times,
// mismatched lengths and too few samples are *InputErrors.
func TestResampleErrors(t *testing.T) {
	ok := func() ([]float64, []float64) {
		ts := []float64{0, 1e-14, 2e-14, 3e-14, 4e-14, 5e-14, 6e-14, 7e-14, 8e-14, 9e-14}
		return ts, make([]float64, len(ts))
	}
	cases := []struct {
		name string
		mod  func(ts, f []float64) ([]float64, []float64)
	}{
		{"unsorted", func(ts, f []float64) ([]float64, []float64) { ts[3], ts[4] = ts[4], ts[3]; return ts, f }},
		{"duplicate", func(ts, f []float64) ([]float64, []float64) { ts[5] = ts[4]; return ts, f }},
		{"NaN time", func(ts, f []float64) ([]float64, []float64) { ts[2] = math.NaN(); return ts, f }},
		{"Inf time", func(ts, f []float64) ([]float64, []float64) { ts[9] = math.Inf(1); return ts, f }},
		{"NaN field", func(ts, f []float64) ([]float64, []float64) { f[1] = math.NaN(); return ts, f }},
		{"length mismatch", func(ts, f []float64) ([]float64, []float64) { return ts, f[:9] }},
		{"too few", func(ts, f []float64) ([]float64, []float64) { return ts[:7], f[:7] }},
		{"grid too long", func(ts, f []float64) ([]float64, []float64) {
			// Nine samples 1e-18 s apart and one 1 s later: the median step
			// would need 1e18 samples.
			for i := range 9 {
				ts[i] = float64(i) * 1e-18
			}
			ts[9] = 1
			return ts, f
		}},
	}
	for _, c := range cases {
		ts, f := c.mod(ok())
		if _, err := Resample(ts, f, false); !isInputError(err) {
			t.Errorf("%s: error %v, want an *InputError", c.name, err)
		}
	}
}
