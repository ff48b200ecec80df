package optics

import (
	"errors"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"thzdrive/caution"
	"thzdrive/pulse"
	"thzdrive/units"
)

// gaussDeriv is the single-cycle pulse of physics.md §2, the first
// derivative of a Gaussian: E(t) = E0·sqrt(e)·(t/τ)·exp(-t²/(2τ²)), with
// extrema ±E0 at t = ±τ and spectral peak at 1/(2πτ).
func gaussDeriv(tS, tauS float64) float64 {
	x := tS / tauS
	return math.Sqrt(math.E) * x * math.Exp(-x*x/2)
}

// propagate sends the pulse gaussDeriv(t - t0) through the train on the FFT
// grid of pulse.Transform and returns the sampled input and output.
func propagate(t *testing.T, tr Train, n int, dt, t0, tau float64, conj bool) (in, out []float64) {
	t.Helper()
	ft := pulse.Acquire(n)
	defer pulse.Release(ft)
	in = make([]float64, n)
	for i := range in {
		in[i] = gaussDeriv(float64(i)*dt-t0, tau)
	}
	spec := ft.Forward(nil, in, dt)
	freq := make([]float64, len(spec))
	for k := range freq {
		freq[k] = ft.FrequencyHz(k, dt)
	}
	h := make([]complex128, len(spec))
	ev, err := NewEvaluator(tr)
	if err != nil {
		t.Fatal(err)
	}
	if err := ev.Evaluate(freq, h, nil); err != nil {
		t.Fatal(err)
	}
	for k := range spec {
		if conj {
			h[k] = cmplx.Conj(h[k])
		}
		spec[k] *= h[k]
	}
	return in, ft.Inverse(nil, spec, dt)
}

// TestSiliconWindowTimeDomain: a 1 mm silicon window, first pass only,
// delays the pulse by (n-1)d/c = 8.06 ps and scales it by 4n/(1+n)² = 0.7005
// without changing its shape (physics.md §4; n from Grischkowsky et al.
// (1990), from memory). The transmitted waveform, computed with
// pulse.Transform, must equal 0.7005·E(t - 8.06 ps) sample by sample, the
// analytic pulse evaluated at the delayed times. Tolerance 1e-12·E0:
// the pulse's spectrum at the Nyquist frequency (50 THz, ωτ = 50) is
// e^{-1250} and its tails at the window edges below 1e-100, so only FFT
// round-off remains (observed 4e-14).
func TestSiliconWindowTimeDomain(t *testing.T) {
	const d = 1e-3
	delay := (nSi - 1) * d / units.SpeedOfLight
	if !near(delay/units.Ps, 8.06, 0.005) {
		t.Fatalf("(n-1)d/c = %.4f ps, physics.md §4 says 8.06", delay/units.Ps)
	}
	factor := 4 * nSi / ((1 + nSi) * (1 + nSi))
	tau := 1 / (2 * math.Pi * 1e12)
	const n, dt, t0 = 1 << 14, 10e-15, 30e-12
	tr := Train{Elements: []Element{Slab{Name: "window", Medium: Constant{N: nSi}, ThicknessM: d, Incoherent: true}}, Target: Target{Layer: ExitMedium}}
	_, out := propagate(t, tr, n, dt, t0, tau, false)
	maxErr := 0.0
	for i, v := range out {
		want := factor * gaussDeriv(float64(i)*dt-t0-delay, tau)
		maxErr = math.Max(maxErr, math.Abs(v-want))
	}
	t.Logf("largest deviation %.3g·E0", maxErr)
	if maxErr > 1e-12 {
		t.Errorf("transmitted waveform differs from 0.7005·E(t - 8.06 ps) by %.3g·E0", maxErr)
	}
	// The positive extremum (at t0 + τ in the input) moves by 8.06 ps:
	// located by a parabola through the three largest samples.
	if p := peakTime(out, dt) - peakTime(gaussSamples(n, dt, t0, tau), dt); !near(p/units.Ps, 8.06, 0.005) {
		t.Errorf("peak moved by %.4f ps, want 8.06", p/units.Ps)
	}
}

func gaussSamples(n int, dt, t0, tau float64) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = gaussDeriv(float64(i)*dt-t0, tau)
	}
	return s
}

// peakTime returns the time of the largest sample, refined by a parabola.
func peakTime(x []float64, dt float64) float64 {
	return peakTimeIn(x, dt, 0, len(x))
}

func peakTimeIn(x []float64, dt float64, lo, hi int) float64 {
	k := lo
	for i := lo; i < hi; i++ {
		if x[i] > x[k] {
			k = i
		}
	}
	a, b, c := x[k-1], x[k], x[k+1]
	return (float64(k) + 0.5*(a-c)/(a-2*b+c)) * dt
}

// TestSiliconWindowEchoes: the same 1 mm window kept coherent transmits the
// main pulse and, every 2nd/c = 22.80 ps after it, an echo r² times the one
// before (physics.md §4; Airy's series, Born & Wolf §7.6.1). The waveform
// must equal Σ_k (1-r²)·r^{2k}·E(t - (n-1)d/c - k·2nd/c), wrapped into the
// periodic window of the FFT. Tolerance 1e-12·E0, as above. The first echo
// is also located in the waveform: 22.80 ps after the main pulse, with
// field amplitude ratio r² = ((n-1)/(n+1))² = 0.2995 (numerically equal to
// the power reflectance R of one surface).
func TestSiliconWindowEchoes(t *testing.T) {
	const d = 1e-3
	echo := 2 * nSi * d / units.SpeedOfLight
	if !near(echo/units.Ps, 22.80, 0.005) {
		t.Fatalf("2nd/c = %.4f ps, physics.md §4 says 22.80", echo/units.Ps)
	}
	r2 := math.Pow((nSi-1)/(nSi+1), 2)
	delay := (nSi - 1) * d / units.SpeedOfLight
	tau := 1 / (2 * math.Pi * 1e12)
	const n, dt, t0 = 1 << 15, 10e-15, 20e-12
	window := float64(n) * dt
	tr := Train{Elements: []Element{&Slab{Medium: Constant{N: nSi}, ThicknessM: d}}, Target: Target{Layer: ExitMedium}}
	_, out := propagate(t, tr, n, dt, t0, tau, false)
	maxErr := 0.0
	for i, v := range out {
		ti := float64(i) * dt
		want := 0.0
		for k := range 40 {
			arr := t0 + delay + float64(k)*echo
			x := math.Mod(ti-arr, window) // periodic wrap
			if x > window/2 {
				x -= window
			} else if x < -window/2 {
				x += window
			}
			want += (1 - r2) * math.Pow(r2, float64(k)) * gaussDeriv(x, tau)
		}
		maxErr = math.Max(maxErr, math.Abs(v-want))
	}
	t.Logf("largest deviation %.3g·E0", maxErr)
	if maxErr > 1e-12 {
		t.Errorf("coherent slab waveform differs from the Airy series by %.3g·E0", maxErr)
	}
	iMain := int((t0 + delay) / dt)
	iEcho := int((t0 + delay + echo) / dt)
	span := int(2e-12 / dt)
	tMain := peakTimeIn(out, dt, iMain-span, iMain+span)
	tEcho := peakTimeIn(out, dt, iEcho-span, iEcho+span)
	if !near((tEcho-tMain)/units.Ps, 22.80, 0.005) {
		t.Errorf("echo %.4f ps after the main pulse, want 22.80", (tEcho-tMain)/units.Ps)
	}
	ratio := peakValueIn(out, iEcho-span, iEcho+span) / peakValueIn(out, iMain-span, iMain+span)
	t.Logf("echo/main %.7f, r² %.7f", ratio, r2)
	// Parabolic peak values at 16 samples per τ are good to ~1e-5
	// (observed 2e-6).
	if !near(ratio, r2, 1e-5) || !near(r2, 0.2995, 5e-5) {
		t.Errorf("echo/main = %.6f, want r² = %.6f (0.2995)", ratio, r2)
	}
}

// peakValueIn returns the largest value in x[lo:hi], refined by a parabola
// through the three largest samples.
func peakValueIn(x []float64, lo, hi int) float64 {
	k := lo
	for i := lo; i < hi; i++ {
		if x[i] > x[k] {
			k = i
		}
	}
	a, b, c := x[k-1], x[k], x[k+1]
	return b - (a-c)*(a-c)/(8*(a-2*b+c))
}

// TestCausality: the field transmitted through a dispersive, absorbing ZnTe
// plate (Lorentz model of the catalogue) must vanish before the earliest
// arrival the model allows, (sqrt(ε∞)-1)d/c after the pulse would have
// arrived through air (the front travels at c/sqrt(ε∞) in the model, as
// ñ -> sqrt(ε∞) for ω -> ∞): causality of a passive medium in the e^{-iωt}
// convention (physics.md §1; Jackson, Classical Electrodynamics, §7.10).
// "Vanish" means below 1e-12 of the transmitted peak, for all samples more
// than 8τ before that arrival (the input's own tail there is
// 8·sqrt(e)·e^{-32} ≈ 2e-13; observed 3e-14). The same check
// applied to the complex-conjugate transfer function (the acausal,
// time-reversed response) must fail, which shows the check can fail.
func TestCausality(t *testing.T) {
	znte, err := Lookup("znte")
	if err != nil {
		t.Fatal(err)
	}
	d := 200e-6
	eInf, _ := DielectricOf(znte)
	front := (math.Sqrt(eInf.EpsInf) - 1) * d / units.SpeedOfLight
	tau := 1 / (2 * math.Pi * 3e12) // spectral peak at 3 THz, reaching the 5.3 THz phonon
	const n, dt, t0 = 1 << 17, 4e-15, 20e-12
	tr := Train{Elements: []Element{Slab{Medium: znte, ThicknessM: d}}, Target: Target{Layer: ExitMedium}}
	violation := func(out []float64) float64 {
		peak, early := 0.0, 0.0
		for i, v := range out {
			peak = math.Max(peak, math.Abs(v))
			if float64(i)*dt < t0+front-8*tau {
				early = math.Max(early, math.Abs(v))
			}
		}
		return early / peak
	}
	_, out := propagate(t, tr, n, dt, t0, tau, false)
	t.Logf("causal: %.3g of the peak before arrival; acausal check follows", violation(out))
	if v := violation(out); v > 1e-12 {
		t.Errorf("field before the earliest arrival: %.3g of the peak", v)
	}
	_, acausal := propagate(t, tr, n, dt, t0, tau, true)
	if v := violation(acausal); v < 1e-3 {
		t.Errorf("the acausal response passed the causality check (%.3g)", v)
	}
}

// TestZeroFrequency: at f = 0 the outputs are 0 (documented choice), never
// NaN; negative or NaN frequencies and mismatched buffers are errors.
func TestZeroFrequency(t *testing.T) {
	gaasDrude := Dielectric{EpsInf: 10.9, PlasmaHz: 2e12, ScatteringHz: 0.5e12}
	ev, err := NewEvaluator(Train{
		Elements: []Element{Slab{Medium: Constant{N: 2}, ThicknessM: 1e-3}},
		Sample:   Stack{Layers: []Layer{{Medium: gaasDrude, ThicknessM: 1e-6}}},
		Target:   Target{Layer: 0, Placement: LayerAverage},
	})
	if err != nil {
		t.Fatal(err)
	}
	freq := []float64{0, 1e9, 1e12}
	field := make([]complex128, 3)
	abs := make([]float64, 3)
	if err := ev.Evaluate(freq, field, abs); err != nil {
		t.Fatal(err)
	}
	if field[0] != 0 || abs[0] != 0 {
		t.Errorf("f = 0: %v, %g", field[0], abs[0])
	}
	for k := range freq {
		if !finiteC(field[k]) || !finite(abs[k]) {
			t.Errorf("f = %g: %v %g", freq[k], field[k], abs[k])
		}
	}
	for _, bad := range []float64{-1, math.NaN(), math.Inf(1)} {
		if err := ev.Evaluate([]float64{1e12, bad}, make([]complex128, 2), nil); err == nil || !strings.Contains(err.Error(), "freqHz[1]") {
			t.Errorf("frequency %g: %v", bad, err)
		}
	}
	if err := ev.Evaluate(freq, make([]complex128, 2), nil); err == nil {
		t.Error("short field buffer accepted")
	}
	if err := ev.Evaluate(freq, field, make([]float64, 1)); err == nil {
		t.Error("short absorbed buffer accepted")
	}
}

// TestAttenuatorAndFactors: two ideal wire grids pass cos²θ of the field
// (Malus's law applied twice: cos θ per grid; Hecht, Optics, §8.2); a
// FieldFactor multiplies; a Gap changes nothing; the absorbed fraction
// scales with the power factor |cos²θ·F|².
func TestAttenuatorAndFactors(t *testing.T) {
	cases := []struct {
		deg, want float64
	}{{0, 1}, {45, 0.5}, {60, 0.25}, {90, 0}, {-30, 0.75}}
	film := Stack{Layers: []Layer{{Medium: Constant{2, 0.5}, ThicknessM: 2e-6}}}
	base, err := NewEvaluator(Train{Sample: film, Target: Target{Layer: 0}})
	if err != nil {
		t.Fatal(err)
	}
	f := []float64{0.7e12}
	ref, refA := make([]complex128, 1), make([]float64, 1)
	if err := base.Evaluate(f, ref, refA); err != nil {
		t.Fatal(err)
	}
	for _, c := range cases {
		ev, err := NewEvaluator(Train{
			Elements: []Element{Gap{LengthM: 0.3}, Attenuator{AngleRad: c.deg * math.Pi / 180}, FieldFactor{Factor: 0.9i}, Gap{LengthM: 1}},
			Sample:   film, Target: Target{Layer: 0},
		})
		if err != nil {
			t.Fatal(err)
		}
		got, gotA := make([]complex128, 1), make([]float64, 1)
		if err := ev.Evaluate(f, got, gotA); err != nil {
			t.Fatal(err)
		}
		if !nearC(got[0], ref[0]*complex(c.want*0.9, 0)*1i, 1e-15) {
			t.Errorf("%g°: field %v, want %v", c.deg, got[0], ref[0]*complex(c.want*0.9, 0)*1i)
		}
		if !near(gotA[0], refA[0]*c.want*c.want*0.81, 1e-15) {
			t.Errorf("%g°: absorbed %g, want %g", c.deg, gotA[0], refA[0]*c.want*c.want*0.81)
		}
	}
}

// TestTrainMatchesSolver: the train's output is the product of its slab
// factors (Airy / first pass, written out here from Born & Wolf §7.6.1) and
// the sample's field at the target from the Solver, for each placement; the
// absorbed fraction is |slab factors|² times the layer's absorptance.
func TestTrainMatchesSolver(t *testing.T) {
	win := Constant{N: 2.38}
	filt := Constant{1.53, 0.002}
	sample := Stack{Layers: []Layer{{Medium: Constant{3, 0.1}, ThicknessM: 20e-6}, {Medium: Dielectric{EpsInf: 8, Oscillators: []Oscillator{{FreqHz: 3e12, WidthHz: 0.1e12, DeltaEps: 2}}}, ThicknessM: 5e-6}}, Exit: Constant{N: 3.4175}, AngleRad: 0.5, Pol: PolP}
	targets := []Target{
		{Layer: 1, Placement: FrontSurface}, {Layer: 1, Placement: AtDepth, DepthM: 2e-6}, {Layer: 1, Placement: LayerAverage},
		{Layer: 1, Placement: LayerAverage, Component: Normal}, {Layer: ExitMedium, Placement: AtDepth, DepthM: 1e-5},
	}
	freq := []float64{0.5e12, 1.1e12, 2.9e12}
	for _, tg := range targets {
		ev, err := NewEvaluator(Train{Elements: []Element{Slab{Medium: win, ThicknessM: 1e-3, Incoherent: true}, Slab{Medium: filt, ThicknessM: 2e-3}}, Sample: sample, Target: tg})
		if err != nil {
			t.Fatal(err)
		}
		field, abs := make([]complex128, len(freq)), make([]float64, len(freq))
		if err := ev.Evaluate(freq, field, abs); err != nil {
			t.Fatal(err)
		}
		sv := mustSolver(t, sample)
		for k, f := range freq {
			k0 := units.AngularFrequency(f) / units.SpeedOfLight
			slab := func(n complex128, d float64, coherent bool) complex128 {
				r := (n - 1) / (n + 1)
				tt := (1 - r*r) * cmplx.Exp(1i*complex(k0*d, 0)*(n-1))
				if coherent {
					tt /= 1 - r*r*cmplx.Exp(2i*complex(k0*d, 0)*n)
				}
				return tt
			}
			fac := slab(2.38, 1e-3, false) * slab(complex(1.53, 0.002), 2e-3, true)
			mustSolve(t, sv, f)
			var fl Field
			var err error
			switch tg.Placement {
			case FrontSurface:
				fl, err = sv.Field(tg.Layer, 0)
			case AtDepth:
				fl, err = sv.Field(tg.Layer, tg.DepthM)
			case LayerAverage:
				fl, err = sv.MeanField(tg.Layer)
			}
			if err != nil {
				t.Fatal(err)
			}
			want := fl.Tangential
			if tg.Component == Normal {
				want = fl.Normal
			}
			want *= fac
			a, _ := sv.Absorptance(tg.Layer)
			if !nearC(field[k], want, 1e-14) || !near(abs[k], sqAbs(fac)*a, 1e-14) {
				t.Errorf("%+v at %g THz: %v %g, want %v %g", tg, f/1e12, field[k], abs[k], want, sqAbs(fac)*a)
			}
		}
	}
}

// TestTrainCautions: extrapolated material data, an incoherent echo inside
// the window, and a reststrahlen band of the target are reported with the
// caution codes of package caution and the numbers behind them.
func TestTrainCautions(t *testing.T) {
	quartz, _ := Lookup("quartz-o")
	si, _ := Lookup("silicon-hr")
	gaas := Dielectric{EpsInf: 10.89, Oscillators: []Oscillator{{FreqHz: wavenumberHz(273.3), WidthHz: 0.02e12, DeltaEps: 2}}}
	ev, err := NewEvaluator(Train{
		Elements: []Element{Slab{Name: "filter", Medium: quartz, ThicknessM: 2e-3, Incoherent: true}, Slab{Name: "window", Medium: si, ThicknessM: 1e-3, Incoherent: true}},
		Sample:   Stack{Exit: gaas},
		Target:   Target{Layer: ExitMedium},
	})
	if err != nil {
		t.Fatal(err)
	}
	grid := []float64{0, 0.5e12, 4e12, 9e12}
	cs, err := ev.Cautions(grid, 1e12, 30e-12)
	if err != nil {
		t.Fatal(err)
	}
	codes := map[caution.Code][]caution.Caution{}
	for _, c := range cs {
		codes[c.Code] = append(codes[c.Code], c)
	}
	// quartz-o holds to 2.5 THz, silicon-hr to 3 THz: both extrapolated.
	if x := codes[caution.MaterialExtrapolate]; len(x) != 2 || !strings.Contains(x[0].Message, `Elements[0] ("filter")`) || !strings.Contains(x[0].Message, "quartz-o") {
		t.Errorf("extrapolation cautions %+v", x)
	}
	// 2n·d/c: silicon 22.80 ps (physics.md §4) inside 30 ps; quartz
	// 2·2.108·2 mm/c = 28.13 ps (derived) inside too.
	echoes := codes[caution.EchoInWindow]
	if len(echoes) != 2 {
		t.Fatalf("echo cautions %+v", echoes)
	}
	if v := echoes[1].Values[0]; v.Name != "echo_delay_ps" || !near(v.Number, 22.80, 0.005) {
		t.Errorf("silicon echo %+v, want 22.80 ps", v)
	}
	if v := echoes[0].Values[0]; !near(v.Number, 2*2.108*2e-3/units.SpeedOfLight/units.Ps, 1e-6) {
		t.Errorf("quartz echo %+v", v)
	}
	if cs2 := EchoCautions([]Echo{{Incoherent: true, DelayS: 22.8e-12}}, 20e-12); len(cs2) != 0 {
		t.Error("echo after the window reported")
	}
	// GaAs LO by LST: 297.3 cm^-1 = 8.91 THz (Hass & Henvis).
	rs := codes[caution.Reststrahlen]
	if len(rs) != 1 || !near(rs[0].Values[1].Number, wavenumberHz(297.3)/units.THz, 0.01) {
		t.Errorf("reststrahlen cautions %+v", rs)
	}
	// Inside the data ranges nothing is said.
	if x := ev.Extrapolations([]float64{0.5e12, 2e12}); len(x) != 0 {
		t.Errorf("spurious extrapolations %+v", x)
	}
}

// TestTrainValidation: errors name the offending element, layer or target
// field (common practice).
func TestTrainValidation(t *testing.T) {
	_, err := Lookup("unobtanium")
	if !errors.Is(err, ErrUnknownMaterial) {
		t.Errorf("unknown material: %v", err)
	}
	ok := Stack{Layers: []Layer{{Medium: Constant{N: 2}, ThicknessM: 1e-6}}}
	cases := []struct {
		name  string
		tr    Train
		field string
	}{
		{"negative slab thickness", Train{Elements: []Element{Gap{}, Slab{Name: "w", Medium: Constant{N: 2}, ThicknessM: -1}}, Sample: ok}, "Elements[1].ThicknessM"},
		{"NaN slab index", Train{Elements: []Element{Slab{Medium: Constant{N: math.NaN()}, ThicknessM: 1}}, Sample: ok}, "Elements[0].Medium"},
		{"nil slab medium", Train{Elements: []Element{&Slab{ThicknessM: 1}}, Sample: ok}, "Elements[0].Medium"},
		{"nil element", Train{Elements: []Element{nil}, Sample: ok}, "Elements[0]"},
		{"nil pointer element", Train{Elements: []Element{Gap{}, (*Attenuator)(nil)}, Sample: ok}, "Elements[1]"},
		{"pointer to a bad element", Train{Elements: []Element{&Gap{LengthM: math.NaN()}}, Sample: ok}, "Elements[0].LengthM"},
		{"NaN attenuator", Train{Elements: []Element{Attenuator{AngleRad: math.NaN()}}, Sample: ok}, "Elements[0].AngleRad"},
		{"infinite factor", Train{Elements: []Element{FieldFactor{Factor: cmplx.Inf()}}, Sample: ok}, "Elements[0].Factor"},
		{"negative gap", Train{Elements: []Element{Gap{LengthM: -1}}, Sample: ok}, "Elements[0].LengthM"},
		{"sample layer", Train{Sample: Stack{Layers: []Layer{{Medium: Constant{N: 2}, ThicknessM: math.NaN()}}}}, "Sample.Layers[0].ThicknessM"},
		{"sample angle", Train{Sample: Stack{AngleRad: math.Pi / 2}}, "Sample.AngleRad"},
		{"immersed sample", Train{Sample: Stack{AmbientIndex: 1.5}}, "Sample.AmbientIndex"},
		{"target layer", Train{Sample: ok, Target: Target{Layer: 1}}, "Target.Layer"},
		{"target depth", Train{Sample: ok, Target: Target{Layer: 0, Placement: AtDepth, DepthM: 2e-6}}, "Target.DepthM"},
		{"average of the exit medium", Train{Sample: ok, Target: Target{Layer: ExitMedium, Placement: LayerAverage}}, "Target.Placement"},
		{"normal component for s", Train{Sample: ok, Target: Target{Component: Normal}}, "Target.Component"},
	}
	for _, c := range cases {
		_, err := NewEvaluator(c.tr)
		var ie *InputError
		if !errors.As(err, &ie) || ie.Field != c.field {
			t.Errorf("%s: %v, want an *InputError for %q", c.name, err, c.field)
		}
	}
}

// TestEvaluateAllocs: after setup, Evaluate allocates nothing, whatever the
// grid length (the hot loop contract of the package).
func TestEvaluateAllocs(t *testing.T) {
	ev := benchEvaluator(t, 10)
	freq, field, abs := benchGrid(4096)
	allocs := testing.AllocsPerRun(5, func() {
		if err := ev.Evaluate(freq, field, abs); err != nil {
			t.Fatal(err)
		}
	})
	if allocs != 0 {
		t.Errorf("Evaluate allocates %g times per call", allocs)
	}
}
