package tdsfit

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/units"
)

func catalogueDetector(t testing.TB, name string, thicknessM, groupIndex float64) Detector {
	t.Helper()
	m, err := optics.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return Detector{Name: name, Crystal: m, ThicknessM: thicknessM, ProbeGroupIndex: groupIndex}
}

// Response against the response integral (1/L)∫exp(iΔk z)dz done by
// scipy.integrate.quad, with the index from numpy and the catalogue's Lorentz
// parameters (testdata/make_references.py), for ZnTe and GaP, below, at and
// above their TO phonons.
func TestResponseScipy(t *testing.T) {
	var ref struct {
		Cases []struct {
			Material   string  `json:"material"`
			ThicknessM float64 `json:"thickness_m"`
			GroupIndex float64 `json:"group_index"`
			FreqHz     float64 `json:"freq_hz"`
			Re         float64 `json:"re"`
			Im         float64 `json:"im"`
		}
	}
	loadJSON(t, "eo_reference.json", &ref)
	if len(ref.Cases) < 30 {
		t.Fatalf("only %d reference cases", len(ref.Cases))
	}
	for _, c := range ref.Cases {
		d := catalogueDetector(t, c.Material, c.ThicknessM, c.GroupIndex)
		got, want := d.Response(c.FreqHz), complex(c.Re, c.Im)
		// quad is asked for 1e-13 relative; 1e-9 of |G| (and 1e-15
		// absolute where the phonon has made |G| tiny) is met with room.
		if dd := cmplx.Abs(got - want); dd > 1e-9*cmplx.Abs(want)+1e-15 {
			t.Errorf("%s L=%g f=%g THz: G = %v, scipy %v (|Δ| %.2g)", c.Material, c.ThicknessM, c.FreqHz/units.THz, got, want, dd)
		}
	}
}

// The coherence-length dip (derived): for a lossless crystal the mismatch
// factor |(e^{iΔkL}-1)/(iΔkL)| first vanishes where ΔkL = 2π, that is
// where L = 2·l_c with l_c = c/(2f|n_g - n_THz(f)|). The first minimum of
// the computed factor above lo (a fine scan, then golden-section search)
// must fall there (the root of L = 2·CoherenceLengthM(f), by bisection), to
// 1e-3 relative: the crystal's small absorption shifts the minimum by about
// b²/(2π) in ΔkL, b = κωL/c (derived), 1e-4 relative or less here. The
// minimum itself is not zero but |1 - e^{-b}|/|2π + ib| (derived from the
// same expansion), which it must match to 5 %. GaP is velocity matched near
// 7.25 THz, where n_THz rises through n_g = 3.56; a 300 um crystal has no
// zero below that, and lo starts above it.
func TestCoherenceLengthZero(t *testing.T) {
	for _, c := range []struct {
		name string
		d    Detector
		lo   float64 // below the first zero, where |ΔkL| still rises
	}{
		{"ZnTe 1 mm", catalogueDetector(t, "znte", 1*units.Mm, ZnTeGroupIndex800nm), 0.5 * units.THz},
		{"ZnTe 2 mm", catalogueDetector(t, "znte", 2*units.Mm, ZnTeGroupIndex800nm), 0.3 * units.THz},
		{"GaP 1 mm", catalogueDetector(t, "gap", 1*units.Mm, GaPGroupIndex800nm), 0.3 * units.THz},
		{"GaP 300 um", catalogueDetector(t, "gap", 300*units.Um, GaPGroupIndex800nm), 7.5 * units.THz},
	} {
		t.Run(c.name, func(t *testing.T) {
			L := c.d.ThicknessM
			g := func(f float64) float64 { return 2*c.d.CoherenceLengthM(f) - L }
			// Bisection for the first f above lo where 2 l_c = L.
			a, b := c.lo, c.lo
			for g(b) > 0 {
				a, b = b, b*1.01
			}
			for range 200 {
				m := (a + b) / 2
				if g(m) > 0 {
					a = m
				} else {
					b = m
				}
			}
			fz := (a + b) / 2
			x := func(f float64) complex128 {
				return complex(2*math.Pi*f*L/units.SpeedOfLight, 0) * (c.d.Crystal.Index(f) - complex(c.d.ProbeGroupIndex, 0))
			}
			mis := func(f float64) float64 { return cmplx.Abs(mismatch(x(f))) }
			// The first local minimum above lo: scan in steps of 1e-4, then
			// golden-section search between the neighbours of the lowest
			// sample.
			f := c.lo
			for mis(f*1.0001) < mis(f) {
				f *= 1.0001
			}
			x0, x1 := f/1.0001, f*1.0001
			phi := (math.Sqrt(5) - 1) / 2
			for range 100 {
				m1, m2 := x1-phi*(x1-x0), x0+phi*(x1-x0)
				if mis(m1) < mis(m2) {
					x1 = m2
				} else {
					x0 = m1
				}
			}
			fmin := (x0 + x1) / 2
			if relErr(fmin, fz) > 1e-3 {
				t.Errorf("first minimum at %.5f THz, L = 2·l_c at %.5f THz", fmin/units.THz, fz/units.THz)
			}
			bb := imag(x(fmin))
			want := (1 - math.Exp(-bb)) / cmplx.Abs(complex(2*math.Pi, bb))
			if v := mis(fmin); relErr(v, want) > 0.05 {
				t.Errorf("factor %.4g at its minimum, want |1-e^{-b}|/|2π+ib| = %.4g", v, want)
			}
			t.Logf("zero at %.4f THz (l_c = %.1f um), first minimum %.2g, %.2g away (relative)", fz/units.THz, c.d.CoherenceLengthM(fz)/units.Um, mis(fmin), relErr(fmin, fz))
		})
	}
}

// The phonon: at Ω_TO a weakly damped oscillator has ε = ε∞ + iΔεΩ/γ, so
// |ñ| → sqrt(ΔεΩ/γ) and t_THz = 2/(1+ñ) falls to zero as γ → 0 (derived):
// |t_THz|·sqrt(ΔεΩ/γ)/2 = |ñ|/|1+ñ| up to (ε∞γ/ΔεΩ)², within 1/|ñ| of 1
// (triangle inequality). The response of a crystal thin enough that
// |Δk|L << 1/|ñ| (L = 1 pm) is t_THz itself. With the catalogue's ZnTe
// (TO 5.32 THz, width 25 GHz) and L = 1 mm, |G(f_TO)| is below the bound
// 2/|1+ñ|·2/(|ñ - n_g|ωL/c) (derived: |(e^{ix}-1)/(ix)| <= 2/|x| for
// Im x >= 0) and below 1e-3 of its value at 0.1 THz.
func TestResponsePhonon(t *testing.T) {
	const fTO, deps, epsInf = 5.32 * units.THz, 2.58, 7.44
	for _, w := range []float64{25 * units.GHz, 2.5 * units.GHz, 0.25 * units.GHz, 0.025 * units.GHz} {
		d := Detector{Crystal: optics.Dielectric{EpsInf: epsInf, Oscillators: []optics.Oscillator{{FreqHz: fTO, WidthHz: w, DeltaEps: deps}}},
			ThicknessM: 1 * units.Pm, ProbeGroupIndex: ZnTeGroupIndex800nm}
		big := math.Sqrt(deps * fTO / w)
		tt := cmplx.Abs(d.Response(fTO))
		if r := tt * big / 2; math.Abs(r-1) > 1/big {
			t.Errorf("width %g GHz: |t_THz(f_TO)| = %.4g, times sqrt(ΔεΩ/γ)/2 = %.5f, want within %.2g of 1", w/units.GHz, tt, r, 1/big)
		}
	}
	d := catalogueDetector(t, "znte", 1*units.Mm, ZnTeGroupIndex800nm)
	n := d.Crystal.Index(fTO)
	k0L := 2 * math.Pi * fTO * d.ThicknessM / units.SpeedOfLight
	bound := 2 / cmplx.Abs(1+n) * 2 / (cmplx.Abs(n-complex(d.ProbeGroupIndex, 0)) * k0L)
	gTO, gLow := cmplx.Abs(d.Response(fTO)), cmplx.Abs(d.Response(0.1*units.THz))
	if gTO > bound || gTO > 1e-3*gLow {
		t.Errorf("|G(f_TO)| = %.3g, bound %.3g, |G(0.1 THz)| = %.3g", gTO, bound, gLow)
	}
}

// Zero frequency: the mismatch factor is 1 and G = t_THz = 2/(1 + sqrt(ε(0)))
// with ε(0) = ε∞ + Δε = 10.02 for the catalogue's ZnTe (derived): 0.48014.
// At 1 MHz the mismatch (ΔkL ~ 7e-7) and the dispersion ((f/f_TO)² ~ 4e-14)
// change it by less than 1e-6.
func TestResponseLowFrequency(t *testing.T) {
	d := catalogueDetector(t, "znte", 1*units.Mm, ZnTeGroupIndex800nm)
	want := 2 / (1 + math.Sqrt(7.44+2.58))
	for _, f := range []float64{0, 1e6} {
		if g := d.Response(f); cmplx.Abs(g-complex(want, 0)) > 1e-6 {
			t.Errorf("G(%g Hz) = %v, want %.6f", f, g, want)
		}
	}
	// The Faust–Henry factor leaves zero frequency alone and multiplies
	// the response by (1 + C·Ω²/(Ω² - ω² - iγω))/(1 + C) (its definition).
	fh := d
	fh.FaustHenryC = ZnTeFaustHenryC
	if g := fh.Response(0); cmplx.Abs(g-complex(want, 0)) > 1e-6 {
		t.Errorf("Faust–Henry G(0) = %v, want %.6f", g, want)
	}
	f := 2 * units.THz
	W, gm, w := 2*math.Pi*5.32*units.THz, 2*math.Pi*25*units.GHz, 2*math.Pi*f
	factor := (1 + complex(ZnTeFaustHenryC, 0)*complex(W*W, 0)/complex(W*W-w*w, -gm*w)) / complex(1+ZnTeFaustHenryC, 0)
	if r := fh.Response(f) / d.Response(f); cmplx.Abs(r-factor) > 1e-12 {
		t.Errorf("Faust–Henry ratio %v, want %v", r, factor)
	}
	if !cmplx.IsNaN(d.Response(math.NaN())) || !cmplx.IsNaN(Detector{}.Response(1e12)) {
		t.Error("NaN frequency or invalid detector must give NaN")
	}
}

// convolve returns the trace whose spectrum is G(f)·E(f) on the trace's own
// grid: what the detector reports for the incident field E.
func convolve(d Detector, e pulse.Trace) pulse.Trace {
	n := e.Len()
	tf := pulse.NewTransform(n)
	spec := tf.Forward(nil, e.Field, e.StepS)
	for k := range spec {
		spec[k] *= d.Response(tf.FrequencyHz(k, e.StepS))
	}
	return pulse.Trace{StartS: e.StartS, StepS: e.StepS, Field: tf.Inverse(nil, spec, e.StepS)}
}

// Deconvolution round trip: a 1 THz single-cycle field seen through 500 um
// of ZnTe (convolved with G) and deconvolved must return the field within
// the trust band, bin by bin, to within the Wiener bias λ/(|G|² + λ)
// (derived: E_est = E·|G|²/(|G|² + λ) without noise) plus, with noise, the
// noise amplified by |G|/(|G|² + λ), at most 4.5 times its RMS per bin
// dt·σ·sqrt(N) (a complex Gaussian exceeds 4.5 RMS with probability
// e^{-20.25}). The bias is below the bound stated for TrustBand.
func TestDeconvolveRoundTrip(t *testing.T) {
	d := catalogueDetector(t, "znte", 500*units.Um, ZnTeGroupIndex800nm)
	const n, dt = 2048, 20 * units.Fs
	truth := delayed(onePulse, 0, -10*units.Ps, dt, n, 0, nil)
	clean := convolve(d, truth)
	for _, c := range []struct {
		name  string
		noise float64
	}{{"noise-free", 0}, {"noise 1e-4", 1e-4}} {
		t.Run(c.name, func(t *testing.T) {
			meas := pulse.Trace{StartS: clean.StartS, StepS: dt, Field: append([]float64(nil), clean.Field...)}
			rng := rand.New(rand.NewPCG(101, 102))
			for i := range meas.Field {
				meas.Field[i] += c.noise * rng.NormFloat64()
			}
			out, err := Deconvolve(meas, d, DeconvolveOptions{})
			if err != nil {
				t.Fatal(err)
			}
			tf := pulse.NewTransform(n)
			X := tf.Forward(nil, out.Field.Field, dt)
			E := tf.Forward(nil, truth.Field, dt)
			peak := 0.0
			for _, v := range E {
				peak = math.Max(peak, cmplx.Abs(v))
			}
			rms := dt * c.noise * math.Sqrt(n)
			lam := out.LambdaReg
			gmax := 0.0
			for k := 1; k < len(out.Response); k++ {
				gmax = math.Max(gmax, cmplx.Abs(out.Response[k]))
			}
			stated := lam / (DefaultTrustFraction*DefaultTrustFraction*gmax*gmax + lam)
			if out.TrustBand.Len() < 50 {
				t.Fatalf("trust band %+v too narrow", out.TrustBand)
			}
			worst := 0.0
			for k := out.TrustBand.Lo; k <= out.TrustBand.Hi; k++ {
				g := cmplx.Abs(out.Response[k])
				bias := lam / (g*g + lam)
				if bias > stated*(1+1e-12) {
					t.Fatalf("bin %d: bias %.3g above the stated bound %.3g", k, bias, stated)
				}
				tol := bias*cmplx.Abs(E[k]) + 4.5*rms*g/(g*g+lam) + 1e-12*peak
				if e := cmplx.Abs(X[k] - E[k]); e > tol {
					t.Fatalf("%.3f THz: |ΔE| = %.3g, bound %.3g", out.FreqHz[k]/units.THz, e, tol)
				}
				if cmplx.Abs(E[k]) > 0.1*peak {
					worst = math.Max(worst, cmplx.Abs(X[k]-E[k])/cmplx.Abs(E[k]))
				}
			}
			t.Logf("λ = %.3g, trust band to %.2f THz, stated bias bound %.2g, worst relative error where |E| > 0.1 peak: %.2g", lam, out.TrustBand.HiHz/units.THz, stated, worst)
		})
	}
}

// DetectorBandLimit when the trace's spectrum reaches beyond the trust
// band: a 3 THz pulse through 1 mm of ZnTe (first coherence zero near
// 2.3 THz, see TestCoherenceLengthZero), not a 0.5 THz pulse through
// 100 um.
func TestDeconvolveCaution(t *testing.T) {
	for _, c := range []struct {
		name  string
		peak  float64
		thick float64
		want  bool
	}{
		{"broadband, thick", 3 * units.THz, 1 * units.Mm, true},
		{"narrowband, thin", 0.5 * units.THz, 100 * units.Um, false},
	} {
		d := catalogueDetector(t, "znte", c.thick, ZnTeGroupIndex800nm)
		m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: c.peak, PeakFieldVPerM: 1}
		rng := rand.New(rand.NewPCG(5, 5))
		meas := convolve(d, delayed(m, 0, -10*units.Ps, 10*units.Fs, 4000, 0, nil))
		for i := range meas.Field {
			meas.Field[i] += 1e-4 * rng.NormFloat64()
		}
		out, err := Deconvolve(meas, d, DeconvolveOptions{})
		if err != nil {
			t.Fatal(err)
		}
		got := false
		for _, cc := range out.Cautions {
			got = got || cc.Code == caution.DetectorBandLimit
		}
		if got != c.want {
			t.Errorf("%s: DetectorBandLimit %v, want %v (trust to %.2f THz, signal to %.2f THz)", c.name, got, c.want, out.TrustBand.HiHz/units.THz, out.SignalBand.HiHz/units.THz)
		}
	}
}

// NewDetector maps a pulse.EOSetup on the catalogue; CalibrationIndex
// divides out the flat response pulse.CalibrateEO assumed, so that a trace
// calibrated with it and deconvolved equals the one deconvolved from the
// raw G⊗E (derived: the two differ by the constant t_cal).
func TestNewDetector(t *testing.T) {
	s := pulse.EOSetup{Crystal: pulse.ZnTe, ThicknessM: 1 * units.Mm, ProbeWavelengthM: 800 * units.Nm}
	d, err := NewDetector(s, 0)
	if err != nil {
		t.Fatal(err)
	}
	if d.ProbeGroupIndex != ZnTeGroupIndex800nm || d.ThicknessM != 1*units.Mm {
		t.Errorf("detector %+v", d)
	}
	if m, ok := d.Crystal.(optics.Material); !ok || m.Name != "znte" {
		t.Errorf("crystal %v, want the catalogue's znte", d.Crystal)
	}
	g, err := NewDetector(pulse.EOSetup{Crystal: pulse.GaP, ThicknessM: 300 * units.Um, ProbeWavelengthM: 1550 * units.Nm}, 3.3)
	if err != nil || g.ProbeGroupIndex != 3.3 {
		t.Errorf("GaP at 1550 nm with a group index: %v, %+v", err, g)
	}
	for _, c := range []struct {
		name string
		s    pulse.EOSetup
		ng   float64
	}{
		{"default index at 1550 nm", pulse.EOSetup{Crystal: pulse.GaP, ThicknessM: 300 * units.Um, ProbeWavelengthM: 1550 * units.Nm}, 0},
		{"unknown crystal", pulse.EOSetup{Crystal: pulse.Crystal{Name: "LiNbO3", NProbe: 2.2, R41MPerV: 30e-12, NTHz: 5, TOPhononHz: 7e12}, ThicknessM: 1e-3, ProbeWavelengthM: 800e-9}, 0},
		{"invalid setup", pulse.EOSetup{Crystal: pulse.ZnTe}, 0},
		{"negative group index", s, -1},
	} {
		var ie *InputError
		if _, err := NewDetector(c.s, c.ng); !errors.As(err, &ie) {
			t.Errorf("%s: error %v, want *InputError", c.name, err)
		}
	}
	truth := delayed(onePulse, 0, -10*units.Ps, 20*units.Fs, 1024, 0, nil)
	raw := convolve(d, truth)
	tcal := 2 / (1 + pulse.ZnTe.NTHz)
	cal := pulse.Trace{StartS: raw.StartS, StepS: raw.StepS, Field: make([]float64, raw.Len())}
	for i, v := range raw.Field {
		cal.Field[i] = v / tcal
	}
	a, err := Deconvolve(raw, d, DeconvolveOptions{LambdaReg: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Deconvolve(cal, d, DeconvolveOptions{LambdaReg: 1e-6 / (tcal * tcal), CalibrationIndex: pulse.ZnTe.NTHz})
	if err != nil {
		t.Fatal(err)
	}
	for i := range a.Field.Field {
		if math.Abs(a.Field.Field[i]-b.Field.Field[i]) > 1e-12 {
			t.Fatalf("sample %d: %g from the raw trace, %g from the calibrated one", i, a.Field.Field[i], b.Field.Field[i])
		}
	}
}

func TestDeconvolveErrors(t *testing.T) {
	d := catalogueDetector(t, "znte", 1*units.Mm, ZnTeGroupIndex800nm)
	tr := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 500, 0, nil)
	bad := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 500, 0, nil)
	bad.Field[3] = math.Inf(1)
	for _, c := range []struct {
		name  string
		tr    pulse.Trace
		d     Detector
		o     DeconvolveOptions
		field string
	}{
		{"Inf sample", bad, d, DeconvolveOptions{}, "Trace.Field[3]"},
		{"no crystal", tr, Detector{ThicknessM: 1e-3, ProbeGroupIndex: 3}, DeconvolveOptions{}, "Detector.Crystal"},
		{"zero thickness", tr, Detector{Crystal: d.Crystal, ProbeGroupIndex: 3}, DeconvolveOptions{}, "Detector.ThicknessM"},
		{"NaN group index", tr, Detector{Crystal: d.Crystal, ThicknessM: 1e-3, ProbeGroupIndex: math.NaN()}, DeconvolveOptions{}, "Detector.ProbeGroupIndex"},
		{"Faust–Henry without model", tr, Detector{Crystal: optics.Constant{N: 3}, ThicknessM: 1e-3, ProbeGroupIndex: 3, FaustHenryC: -0.1}, DeconvolveOptions{}, "Detector.FaustHenryC"},
		{"Faust–Henry -1", tr, Detector{Crystal: d.Crystal, ThicknessM: 1e-3, ProbeGroupIndex: 3, FaustHenryC: -1}, DeconvolveOptions{}, "Detector.FaustHenryC"},
		{"negative lambda", tr, d, DeconvolveOptions{LambdaReg: -1}, "DeconvolveOptions.LambdaReg"},
		{"trust fraction 1", tr, d, DeconvolveOptions{TrustFraction: 1}, "DeconvolveOptions.TrustFraction"},
		{"negative padding", tr, d, DeconvolveOptions{PadToSamples: -1}, "DeconvolveOptions.PadToSamples"},
		{"NaN calibration", tr, d, DeconvolveOptions{CalibrationIndex: math.NaN()}, "DeconvolveOptions.CalibrationIndex"},
		{"negative margin", tr, d, DeconvolveOptions{MarginDB: -1}, "DeconvolveOptions.MarginDB"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Deconvolve(c.tr, c.d, c.o)
			var ie *InputError
			if !errors.As(err, &ie) || ie.Field != c.field {
				t.Errorf("error %v, want field %q", err, c.field)
			}
		})
	}
}
