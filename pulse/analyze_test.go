package pulse

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/stat"
	"thzdrive/caution"
	"thzdrive/units"
)

// bisect finds the root of f in [a, b] (f(a), f(b) of opposite signs), used
// to solve the transcendental band-edge equations independently of the code
// under test.
func bisect(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for range 200 {
		m := 0.5 * (a + b)
		if fm := f(m); (fm < 0) == (fa < 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return 0.5 * (a + b)
}

// interpErr is the error of linear interpolation between bins h Hz apart at
// a crossing at fHz of p(x) = e·x²·exp(-x²), x = f/1 THz: h²·|d²p/dx²|/(8·|dp/dx|)
// (derived from the remainder of linear interpolation).
func interpErr(fHz, h float64) float64 {
	x, hx := fHz/1e12, h/1e12
	d1 := 2*x - 2*x*x*x
	d2 := 2 - 10*x*x + 4*x*x*x*x
	return hx * hx * math.Abs(d2) / (8 * math.Abs(d1)) * 1e12
}

// TestAnalyzeWorkedCheck analyses the sampled worked-check pulse of
// physics.md §2 (first derivative of a Gaussian, 1 THz, 100 kV/cm) sampled
// every 10 fs over 20 ps, no window, no padding.
func TestAnalyzeWorkedCheck(t *testing.T) {
	const step = 10e-15
	m := singleCycle1THz
	tr, err := m.Sample(step, 20e-12)
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(tr, Processing{})
	if err != nil {
		t.Fatal(err)
	}
	got := a.Metrics
	tau := m.TauS()
	// Sampling error of the extremum: E(τ+δ) ≈ E0(1 - δ²/τ²) with |δ| <= step/2
	// (derived, Taylor expansion; E'' = -2E0/τ² at t = τ).
	dPeak := 1e7 * math.Pow(0.5*step/tau, 2) * 1.01
	// The resolution is 1/(N dt) = 50 GHz.
	res := 1 / (float64(tr.Len()) * step)
	// Band edges of |E(f)|² ∝ f² exp(-(f/f_peak)²) (derived from physics.md §2),
	// solved by bisection: p(x) = e·x²·exp(-x²) at the level.
	p := func(level float64) func(float64) float64 {
		return func(x float64) float64 { return math.E*x*x*math.Exp(-x*x) - level }
	}
	halfLo, halfHi := bisect(p(0.5), 1e-9, 1)*1e12, bisect(p(0.5), 1, 10)*1e12
	bandLo, bandHi := bisect(p(0.01), 1e-9, 1)*1e12, bisect(p(0.01), 1, 10)*1e12
	cases := []struct {
		name      string
		got, want float64
		tol       float64
		source    string
	}{
		{"spectral peak, Hz", got.SpectralPeakHz, 1e12, res, "physics.md §2: f_peak = 1/(2π τ); within the resolution"},
		{"fluence, uJ/cm²", got.FluenceJPerM2 / units.UJPerCm2, 10.18, 0.005 * 10.18, "physics.md §2 worked check, 0.5 %"},
		{"peak field, V/m", got.PeakFieldVPerM, 1e7, dPeak, "physics.md §2: extrema ±E0 at ±τ"},
		{"peak time, s", got.PeakTimeS, -tau, step / 2, "physics.md §2: the earlier extremum, -E0 at t = -τ"},
		{"peak sign", float64(got.PeakSign), -1, 0, "physics.md §2: E(-τ) = -E0"},
		{"peak to peak, V/m", got.PeakToPeakVPerM, 2e7, 2 * dPeak, "physics.md §2"},
		{"DC area ratio", got.DCAreaRatio, 0, 1e-12, "derived: the pulse is odd in t, its area is zero"},
		{"centroid, Hz", got.CentroidHz, 2 / math.SqrtPi * 1e12, 1e-6 * 1e12, "derived: ∫x³e^{-x²}/∫x²e^{-x²} = 2/sqrt(π); the bin sum errs below 1e-6 (Euler–Maclaurin)"},
		// Edges are interpolated linearly between bins, which errs by about
		// h²·|d²p/dx²|/(8·|dp/dx|) at the crossing (derived); the tolerance is 1.5
		// times that (0.1 bin at the low -20 dB edge, where |E|² ∝ f²).
		{"FWHM of |E|², Hz", got.BandwidthFWHMHz, halfHi - halfLo, 1.5 * (interpErr(halfLo, res) + interpErr(halfHi, res)), "derived (bisection)"},
		{"-20 dB low edge, Hz", got.BandLowHz, bandLo, 1.5 * interpErr(bandLo, res), "derived (bisection)"},
		{"-20 dB high edge, Hz", got.BandHighHz, bandHi, 1.5 * interpErr(bandHi, res), "derived (bisection)"},
		{"Nyquist, Hz", got.NyquistHz, 1 / (2 * step), 1, "physics.md §2: 1/(2 dt)"},
		{"resolution, Hz", got.ResolutionHz, res, 1e-3, "physics.md §2: 1/(N dt)"},
		{"edge ratio", got.EdgeRatio, 0, 1e-100, "derived: exp(-(t/τ)²/2) at 9 ps is e^{-1600}"},
	}
	for _, c := range cases {
		if !within(c.got, c.want, c.tol) {
			t.Errorf("%s = %.9g, want %.9g ± %.3g (%s)", c.name, c.got, c.want, c.tol, c.source)
		}
	}
	if got.DynamicRangeDB < 200 {
		t.Errorf("dynamic range %.1f dB for a noiseless pulse, want > 200 dB (round-off floor)", got.DynamicRangeDB)
	}
	if len(a.Cautions) != 0 {
		t.Errorf("a clean 100 kV/cm pulse drew cautions: %v", a.Cautions)
	}
	// The spectrum equals the analytic E(ω) (physics.md §2, in the convention
	// of §1, referenced to t = 0) at every bin. The brief asks for 1 % of the
	// peak over the band; aliasing and truncation are below e^{-1000} here, so
	// the honest tolerance is round-off: 1e-9 of the peak.
	peak := m.AmplitudeSpectrum(1e12)
	worst := 0.0
	for k, v := range a.Spectrum.Values {
		want := m.ComplexSpectrum(float64(k) * a.Spectrum.StepHz)
		worst = max(worst, cmplx.Abs(v-want)/peak)
	}
	if worst > 1e-9 {
		t.Errorf("numerical spectrum differs from the analytic one by %.3g of its peak, want <= 1e-9", worst)
	}
}

// TestAnalyzeDelayedPulse checks that Analyze references the spectrum's
// phase to t = 0 of the time axis: a pulse delayed by t0 on a grid that
// starts anywhere has E(ω)·e^{+iωt0} (shift theorem in the convention of
// physics.md §1, derived), with E(ω) the closed form. Tolerance 1e-9 of the
// peak (round-off, as above).
func TestAnalyzeDelayedPulse(t *testing.T) {
	m := Model{Shape: CentralLobe, PeakFrequencyHz: 0.8e12, PeakFieldVPerM: 3e6}
	const t0, step = 2.345e-12, 8e-15
	tr := Trace{StartS: -3.3e-12, StepS: step, Field: make([]float64, 3000), Absolute: true}
	for i := range tr.Field {
		tr.Field[i] = m.At(tr.TimeS(i) - t0)
	}
	a, err := Analyze(tr, Processing{PadToSamples: 4000})
	if err != nil {
		t.Fatal(err)
	}
	peak := m.AmplitudeSpectrum(0.8e12)
	worst := 0.0
	for k, v := range a.Spectrum.Values {
		f := float64(k) * a.Spectrum.StepHz
		want := m.ComplexSpectrum(f) * cmplx.Rect(1, 2*math.Pi*f*t0)
		worst = max(worst, cmplx.Abs(v-want)/peak)
	}
	if worst > 1e-9 {
		t.Errorf("delayed pulse: spectrum off by %.3g of the peak, want <= 1e-9", worst)
	}
	// Central lobe: spectral peak at 0.8 THz (physics.md §2: ω = sqrt(2)/τ).
	if !within(a.Metrics.SpectralPeakHz, 0.8e12, a.Metrics.ResolutionHz) {
		t.Errorf("central lobe spectral peak %.6g Hz, want 0.8 THz within %.3g", a.Metrics.SpectralPeakHz, a.Metrics.ResolutionHz)
	}
}

// TestAnalyzeCarrier checks the carrier model through Analyze: the spectral
// peak at f0 and the FWHM of |E(f)|² times the FWHM T of |E(t)|² equal the
// Gaussian time-bandwidth product 2 ln2/π = 0.4413 (Diels & Rudolph,
// Ultrashort Laser Pulse Phenomena (2006), Table 2.1, from memory). The
// trace is padded to 2^16 samples (1.5 GHz bins); linear interpolation
// between bins errs by well under 0.1 % of the 0.88 THz width (derived),
// so the tolerance is 0.2 %.
func TestAnalyzeCarrier(t *testing.T) {
	const fwhm = 0.5e-12
	m := Model{Shape: Carrier, CarrierFrequencyHz: 2e12, EnvelopeFWHMS: fwhm, CarrierPhaseRad: 0.4, PeakFieldVPerM: 1e7}
	tr, err := m.Sample(10e-15, 20e-12)
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(tr, Processing{PadToSamples: 1 << 16})
	if err != nil {
		t.Fatal(err)
	}
	if got := a.Metrics.BandwidthFWHMHz * fwhm; math.Abs(got/(2*math.Ln2/math.Pi)-1) > 0.002 {
		t.Errorf("time-bandwidth product %.5f, want 2 ln2/π = %.5f within 0.2 %%", got, 2*math.Ln2/math.Pi)
	}
	if !within(a.Metrics.SpectralPeakHz, 2e12, a.Metrics.ResolutionHz) {
		t.Errorf("spectral peak %.6g Hz, want 2 THz within %.3g", a.Metrics.SpectralPeakHz, a.Metrics.ResolutionHz)
	}
	// Fluence equals the closed form ∫E²/Z0 (derived; the sample sum of a
	// smooth decayed pulse is exact to round-off): 1e-9 relative.
	if want := m.SquareIntegral() / units.VacuumImpedance; math.Abs(a.Metrics.FluenceJPerM2/want-1) > 1e-9 {
		t.Errorf("fluence %.12g J/m², closed form %.12g", a.Metrics.FluenceJPerM2, want)
	}
}

// TestBaselinePrePulse adds an offset of 0.3 E0 to the worked-check pulse in
// an 8 ps window and checks that BaselinePrePulse removes it. The pre-pulse
// part ends where the pulse reaches 5 % of its peak, sqrt(e)·x·e^{-x²/2} =
// 0.05 at x = |t|/τ ≈ 3.03; the pulse's tail before it integrates to
// E0·sqrt(e)·τ·e^{-3.03²/2} ≈ 0.017·E0·τ, spread over the ≈ 22τ of
// pre-pulse samples, so the residual offset is about 7.6e-4·E0 (derived).
// Tolerance 1e-3·E0.
func TestBaselinePrePulse(t *testing.T) {
	tr, err := singleCycle1THz.Sample(10e-15, 8e-12)
	if err != nil {
		t.Fatal(err)
	}
	const offset = 0.3e7
	for i := range tr.Field {
		tr.Field[i] += offset
	}
	a, err := Analyze(tr, Processing{Baseline: BaselinePrePulse})
	if err != nil {
		t.Fatal(err)
	}
	residual := a.Processed.Field[0] - singleCycle1THz.At(tr.TimeS(0))
	if math.Abs(residual) > 1e-3*1e7 {
		t.Errorf("residual offset %.4g V/m, want below 1e-3 E0", residual)
	}
	if _, ok := hasCaution(a.Cautions, caution.DCOffset); ok {
		t.Errorf("DCOffset caution after the baseline was removed: %v", a.Cautions)
	}
	// Without a baseline the same trace is cautioned (offset area over the
	// window, DC area ratio ≈ 0.3·8 ps/(0.3·8 ps + pulse) ≫ 0.1, derived).
	b, err := Analyze(tr, Processing{})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := hasCaution(b.Cautions, caution.DCOffset); !ok {
		t.Errorf("no DCOffset caution for an offset of 0.3 E0 (ratio %.3g)", b.Metrics.DCAreaRatio)
	}
}

// TestBaselineLinear checks the least-squares detrend against gonum's
// stat.LinearRegression (an independent implementation of ordinary least
// squares) on the worked-check pulse plus a sloping offset. Tolerance 1e-9
// of E0 (round-off of the normal equations).
func TestBaselineLinear(t *testing.T) {
	tr, err := singleCycle1THz.Sample(10e-15, 8e-12)
	if err != nil {
		t.Fatal(err)
	}
	times := make([]float64, tr.Len())
	for i := range tr.Field {
		times[i] = tr.TimeS(i)
		tr.Field[i] += 2e5 + 4e16*times[i]
	}
	alpha, beta := stat.LinearRegression(times, tr.Field, nil, false)
	a, err := Analyze(tr, Processing{Baseline: BaselineLinear})
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for i, v := range a.Processed.Field {
		worst = max(worst, math.Abs(v-(tr.Field[i]-alpha-beta*times[i])))
	}
	if worst > 1e-9*1e7 {
		t.Errorf("detrended trace differs from gonum's regression residual by %.3g V/m", worst)
	}
}

// TestWindowsMatchScipy checks WindowWeights against the symmetric windows
// of scipy.signal.windows (testdata/make_window_spline_reference.py). The
// tolerance, 1e-14, is round-off of one cosine (derived).
func TestWindowsMatchScipy(t *testing.T) {
	kinds := map[string]Window{"hann": WindowHann, "blackman": WindowBlackman, "tukey": WindowTukey}
	cache := map[[3]float64][]float64{}
	count := 0
	for _, r := range readRows(t, "windows_reference.csv") {
		w, alpha, n, i, want := kinds[r[0]], atof(t, r[1]), atoi(t, r[2]), atoi(t, r[3]), atof(t, r[4])
		key := [3]float64{float64(w), alpha, float64(n)}
		if cache[key] == nil {
			ws, err := WindowWeights(w, alpha, n)
			if err != nil {
				t.Fatal(err)
			}
			cache[key] = ws
		}
		if got := cache[key][i]; !within(got, want, 1e-14) { // scipy.signal.windows, sym=True
			t.Errorf("%s α=%g N=%d n=%d: %.17g, scipy %.17g", r[0], alpha, n, i, got, want)
		}
		count++
	}
	if count != 300 {
		t.Fatalf("read %d window weights, want 300", count)
	}
}

// TestWindowApplied checks that Processed is the baseline-removed trace
// times the window, and that the time-domain metrics come from before the
// window (the peak of a pulse off the window's centre is not reduced).
func TestWindowApplied(t *testing.T) {
	tr := Trace{StartS: -2e-12, StepS: 10e-15, Field: make([]float64, 1000), Absolute: true}
	for i := range tr.Field {
		tr.Field[i] = singleCycle1THz.At(tr.TimeS(i) + 1e-12)
	}
	a, err := Analyze(tr, Processing{Window: WindowBlackman})
	if err != nil {
		t.Fatal(err)
	}
	w, _ := WindowWeights(WindowBlackman, 0, 1000)
	for i, v := range a.Processed.Field {
		if v != tr.Field[i]*w[i] {
			t.Fatalf("sample %d: processed %g, trace·window %g", i, v, tr.Field[i]*w[i])
		}
	}
	if !within(a.Metrics.PeakFieldVPerM, 1e7, 1e7*math.Pow(0.5*10e-15/singleCycle1THz.TauS(), 2)*1.01) {
		t.Errorf("peak %g V/m: the window leaked into the time-domain metrics", a.Metrics.PeakFieldVPerM)
	}
}

// TestPadding checks zero-padding: padding N to exactly 2N samples samples
// the same discrete-time Fourier transform on a grid twice as fine, so bin
// 2k of the padded spectrum equals bin k of the unpadded one (derived).
// Tolerance 1e-12 of the peak (round-off). It also checks the rounding up
// to a 5-smooth length.
func TestPadding(t *testing.T) {
	tr, err := singleCycle1THz.Sample(10e-15, 10e-12) // N = 1000
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(tr, Processing{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Analyze(tr, Processing{PadToSamples: 2000})
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Spectrum.Values) != 1001 || b.Metrics.ResolutionHz != 1/(2000*10e-15) {
		t.Fatalf("padded to 2000: %d bins, resolution %g", len(b.Spectrum.Values), b.Metrics.ResolutionHz)
	}
	peak := singleCycle1THz.AmplitudeSpectrum(1e12)
	for k, v := range a.Spectrum.Values {
		if d := cmplx.Abs(b.Spectrum.Values[2*k] - v); d > 1e-12*peak {
			t.Fatalf("bin %d: padded %v, unpadded %v", k, b.Spectrum.Values[2*k], v)
		}
	}
	c, err := Analyze(tr, Processing{PadToSamples: 1025})
	if err != nil {
		t.Fatal(err)
	}
	if n := 2 * (len(c.Spectrum.Values) - 1); n != 1080 { // 1080 = 2^3·3^3·5, OEIS A051037
		t.Errorf("padding to 1025 gave %d samples, want 1080", n)
	}
	if len(c.Processed.Field) != 1000 {
		t.Errorf("Processed has %d samples, want the unpadded 1000", len(c.Processed.Field))
	}
}

// TestNextFastLength checks against the 5-smooth (Hamming) numbers, OEIS
// A051037 (from memory): 1, 2, 3, 4, 5, 6, 8, 9, 10, 12, 15, 16, 18, 20, 24,
// 25, 27, 30, 32, 36, 40, 45, 48, 50, 54, 60, 64, 72, 75, 80, 81, 90, 96, 100.
func TestNextFastLength(t *testing.T) {
	for _, c := range [][2]int{{1, 1}, {7, 8}, {11, 12}, {13, 15}, {17, 18}, {19, 20}, {21, 24}, {26, 27},
		{28, 30}, {33, 36}, {37, 40}, {41, 45}, {49, 50}, {55, 60}, {61, 64}, {65, 72}, {73, 75}, {82, 90}, {91, 96}, {97, 100}, {4096, 4096}} {
		if got := NextFastLength(c[0]); got != c[1] {
			t.Errorf("NextFastLength(%d) = %d, want %d (OEIS A051037)", c[0], got, c[1])
		}
	}
}

// TestMetricDefinitions checks metrics and cautions on waveforms whose
// values follow from the definitions.
func TestMetricDefinitions(t *testing.T) {
	t.Run("unipolar pulse has DC area ratio 1", func(t *testing.T) {
		// derived: for a field of one sign |∫E| = ∫|E|.
		tr := Trace{StepS: 10e-15, Field: make([]float64, 512)}
		for i := range tr.Field {
			x := float64(i-256) / 20
			tr.Field[i] = math.Exp(-x * x / 2)
		}
		a, err := Analyze(tr, Processing{})
		if err != nil {
			t.Fatal(err)
		}
		if !within(a.Metrics.DCAreaRatio, 1, 1e-15) {
			t.Errorf("DC area ratio %.17g, want 1", a.Metrics.DCAreaRatio)
		}
		c, ok := hasCaution(a.Cautions, caution.DCOffset)
		if v, _ := cautionValue(c, "dc_area_ratio"); !ok || !within(v, 1, 1e-15) {
			t.Errorf("DCOffset caution %v, want one carrying dc_area_ratio = 1", c)
		}
		if a.Metrics.FluenceJPerM2 != 0 {
			t.Errorf("a trace in arbitrary units has fluence %g, want 0", a.Metrics.FluenceJPerM2)
		}
		if a.Metrics.SpectralPeakHz != 0 {
			t.Errorf("a unipolar pulse peaks at %g Hz, want DC", a.Metrics.SpectralPeakHz)
		}
	})
	t.Run("truncated pulse is not decayed", func(t *testing.T) {
		// A ±2τ window cuts the pulse: at t = -1.8τ, inside the outer 5 %,
		// |E|/E0 = 1.8·sqrt(e)·e^{-1.62} = 0.58 (physics.md §2, derived).
		tau := singleCycle1THz.TauS()
		tr, err := singleCycle1THz.Sample(2e-15, 4*tau)
		if err != nil {
			t.Fatal(err)
		}
		a, err := Analyze(tr, Processing{})
		if err != nil {
			t.Fatal(err)
		}
		if a.Metrics.EdgeRatio < 0.5 || a.Metrics.EdgeRatio > 0.7 {
			t.Errorf("edge ratio %.3f, want about 0.58", a.Metrics.EdgeRatio)
		}
		if _, ok := hasCaution(a.Cautions, caution.NotDecayed); !ok {
			t.Errorf("no NotDecayed caution at edge ratio %.3f", a.Metrics.EdgeRatio)
		}
	})
	t.Run("white noise has low dynamic range", func(t *testing.T) {
		// derived: the bins of white noise have exponentially distributed
		// power, and the largest of ~500 is about ln(500) ≈ 6 times the mean,
		// some 8 dB: far below 20 dB.
		rng := rand.New(rand.NewPCG(9, 10))
		tr := Trace{StepS: 10e-15, Field: make([]float64, 1000)}
		for i := range tr.Field {
			tr.Field[i] = rng.NormFloat64()
		}
		a, err := Analyze(tr, Processing{})
		if err != nil {
			t.Fatal(err)
		}
		if a.Metrics.DynamicRangeDB > 15 {
			t.Errorf("white noise dynamic range %.1f dB, want about 8", a.Metrics.DynamicRangeDB)
		}
		if _, ok := hasCaution(a.Cautions, caution.LowDynamicRange); !ok {
			t.Error("no LowDynamicRange caution for white noise")
		}
	})
	t.Run("coarse sampling is undersampled", func(t *testing.T) {
		// The -20 dB band of the 1 THz pulse reaches 2.76 THz (derived above);
		// sampling every 150 fs puts Nyquist at 3.33 THz: 2.76 > 0.4·3.33.
		tr, err := singleCycle1THz.Sample(150e-15, 30e-12)
		if err != nil {
			t.Fatal(err)
		}
		a, err := Analyze(tr, Processing{})
		if err != nil {
			t.Fatal(err)
		}
		if _, ok := hasCaution(a.Cautions, caution.Undersampled); !ok {
			t.Errorf("no Undersampled caution: band to %.3g THz, Nyquist %.3g THz, DR %.1f dB, cautions %v",
				a.Metrics.BandHighHz/1e12, a.Metrics.NyquistHz/1e12, a.Metrics.DynamicRangeDB, a.Cautions)
		}
	})
	t.Run("field levels", func(t *testing.T) {
		// physics.md §8: above ~10 MV/cm beyond table-top, above ~50 MV/cm ask.
		for _, c := range []struct {
			mvPerCm float64
			want    caution.Code
		}{{5, caution.Unspecified}, {20, caution.FieldBeyondTableTop}, {60, caution.FieldImplausible}} {
			m := singleCycle1THz
			m.PeakFieldVPerM = c.mvPerCm * units.MVPerCm
			tr, err := m.Sample(10e-15, 20e-12)
			if err != nil {
				t.Fatal(err)
			}
			a, err := Analyze(tr, Processing{})
			if err != nil {
				t.Fatal(err)
			}
			var codes []caution.Code
			for _, cc := range a.Cautions {
				codes = append(codes, cc.Code)
			}
			if c.want == caution.Unspecified && len(codes) != 0 || c.want != caution.Unspecified && (len(codes) != 1 || codes[0] != c.want) {
				t.Errorf("%g MV/cm: cautions %v, want %v", c.mvPerCm, codes, c.want)
			}
			if c.want != caution.Unspecified {
				if v, ok := cautionValue(a.Cautions[0], "peak_field_kv_per_cm"); !ok || !within(v, c.mvPerCm*1000, c.mvPerCm*1000*1e-3) {
					t.Errorf("%g MV/cm: caution carries peak_field_kv_per_cm = %g", c.mvPerCm, v)
				}
			}
		}
	})
}

// TestAnalyzeErrors checks that input that cannot be computed is an
// *InputError and never a panic.
func TestAnalyzeErrors(t *testing.T) {
	good := func() Trace {
		tr, _ := singleCycle1THz.Sample(10e-15, 4e-12)
		return tr
	}
	with := func(f func(*Trace)) Trace { tr := good(); f(&tr); return tr }
	edge := Trace{StepS: 1e-14, Field: []float64{1, 0, 0, 0, 0, 0, 0, 0, 0, 0}}
	cases := []struct {
		name string
		tr   Trace
		p    Processing
	}{
		{"empty", Trace{StepS: 1e-14}, Processing{}},
		{"seven samples", Trace{StepS: 1e-14, Field: make([]float64, 7)}, Processing{}},
		{"NaN sample", with(func(tr *Trace) { tr.Field[5] = math.NaN() }), Processing{}},
		{"Inf sample", with(func(tr *Trace) { tr.Field[5] = math.Inf(-1) }), Processing{}},
		{"huge sample", with(func(tr *Trace) { tr.Field[5] = 1e200 }), Processing{}},
		{"all zero", Trace{StepS: 1e-14, Field: make([]float64, 64)}, Processing{}},
		{"zero step", with(func(tr *Trace) { tr.StepS = 0 }), Processing{}},
		{"negative step", with(func(tr *Trace) { tr.StepS = -1e-14 }), Processing{}},
		{"NaN step", with(func(tr *Trace) { tr.StepS = math.NaN() }), Processing{}},
		{"NaN start", with(func(tr *Trace) { tr.StartS = math.NaN() }), Processing{}},
		{"unknown baseline", good(), Processing{Baseline: 7}},
		{"unknown window", good(), Processing{Window: -1}},
		{"Tukey alpha above 1", good(), Processing{Window: WindowTukey, TukeyAlpha: 1.5}},
		{"Tukey alpha negative", good(), Processing{Window: WindowTukey, TukeyAlpha: -0.5}},
		{"negative padding", good(), Processing{PadToSamples: -1}},
		{"padding too large", good(), Processing{PadToSamples: MaxSamples + 1}},
		{"no pre-pulse part", Trace{StepS: 1e-14, Field: []float64{5, 4, 3, 0, 0, 0, 0, 0, 0, 0}}, Processing{Baseline: BaselinePrePulse}},
		{"constant trace, pre-pulse baseline", Trace{StepS: 1e-14, Field: []float64{2, 2, 2, 2, 2, 2, 2, 2, 2, 2}}, Processing{Baseline: BaselinePrePulse}},
		{"straight line, linear baseline", Trace{StepS: 1e-14, Field: []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10}}, Processing{Baseline: BaselineLinear}},
		{"spike at the edge, Hann window", edge, Processing{Window: WindowHann}},
	}
	for _, c := range cases {
		if _, err := Analyze(c.tr, c.p); !isInputError(err) {
			t.Errorf("%s: error %v, want an *InputError", c.name, err)
		}
	}
}
