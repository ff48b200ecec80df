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

// Property: for exact data the Newton iteration returns the index that
// made them, to 1e-9 relative (it stops at a step of 1e-10·|ñ| and
// converges quadratically before that): from the thick-slab start for the
// first pass of a slab that delays by at least 0.1 rad (thinner ones have
// the ambiguity t(n) = t(1/n) of 4n/(1+n)², derived) and for all echoes
// (where the Fabry–Pérot sum of a thin slab tends to the thin-film limit
// and the start is good); for a finite number of echoes, whose roots are not
// unique (see ExtractSlab), from a start within a hundredth of the fringe
// period π/(ωd/c) in n and κ, as continuation from a neighbouring frequency
// provides.
func TestSolveIndexProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	checked := 0
	for i := range 4000 {
		n := complex(1.1+5*rng.Float64(), 0.3*rng.Float64()*rng.Float64())
		f := (0.1 + 4*rng.Float64()) * units.THz
		d := math.Exp(math.Log(5e-6) + rng.Float64()*math.Log(3e-3/5e-6))
		e := []Echoes{NoEchoes, AllEchoes, 1, 3}[i%4]
		k0d := 2 * math.Pi * f * d / units.SpeedOfLight
		lnT, _ := slabLog(n, k0d, e)
		if real(lnT) < -30 || (e == NoEchoes && (real(n)-1)*k0d < 0.1) {
			continue // opaque (nothing would be measured), or too thin
		}
		start := complex128(0)
		if e > 0 {
			start = n + cmplx.Rect(math.Pi/k0d/100*rng.Float64(), 2*math.Pi*rng.Float64())
			start = complex(real(start), math.Max(0, imag(start)))
		}
		got, it, err := SolveIndex(lnT, f, d, e, start, 0)
		if err != nil {
			t.Fatalf("ñ=%v f=%g d=%g echoes=%v: %v", n, f, d, e, err)
		}
		if cmplx.Abs(got-n) > 1e-9*cmplx.Abs(n) {
			t.Fatalf("ñ=%v f=%g d=%g echoes=%v start %v: got %v after %d iterations", n, f, d, e, start, got, it)
		}
		checked++
	}
	if checked < 3000 {
		t.Errorf("only %d cases checked", checked)
	}
}

// checkIndex compares an extraction with the true medium: |Δn| and |Δκ|
// within tol at every frequency of the reported band, and returns the RMS
// of the deviations in units of StdIndex.
func checkIndex(t *testing.T, ex Extraction, truth optics.Medium, tol float64) float64 {
	t.Helper()
	var s float64
	for i, f := range ex.FreqHz {
		want := truth.Index(f)
		dn, dk := real(ex.Index[i])-real(want), imag(ex.Index[i])-imag(want)
		if math.Abs(dn) > tol || math.Abs(dk) > tol {
			t.Errorf("%.3f THz: ñ = %.5f%+.5fi, true %.5f%+.5fi (σ %.2g), beyond %g", f/units.THz, real(ex.Index[i]), imag(ex.Index[i]), real(want), imag(want), ex.StdIndex[i], tol)
		}
		s += (dn*dn + dk*dk) / (ex.StdIndex[i] * ex.StdIndex[i])
	}
	return math.Sqrt(s / float64(2*len(ex.FreqHz)))
}

// Round trip through the forward model of package optics: 500 um of silicon,
// n = 3.4175 (Grischkowsky et al., JOSA B 7, 2006 (1990), from memory),
// measured with seeded noise at 1e-4 of the peak (a peak dynamic range of
// about 70 dB): with the window closing before the first echo (first pass,
// NoEchoes), with a window that holds the first echo but not the second
// (Echoes = 1), and with a 164 ps window holding twelve echoes (AllEchoes). Inside the reported band, trimmed to StdIndex <= 2e-4,
// n and κ must be recovered to 1e-3 (5σ), and the deviations must scatter
// as StdIndex says (RMS of deviation/σ between 0.7 and 1.3: about 150
// to 300 independent bins give an RMS good to ±6 %, and first-order
// propagation is good to a few per cent at σ ≈ 1e-2 rad).
func TestExtractSiliconRoundTrip(t *testing.T) {
	si := optics.Constant{N: 3.4175}
	const d = 500 * units.Um
	for _, c := range []struct {
		name       string
		incoherent bool
		echoes     Echoes
		n          int
		startS     float64
	}{
		// The sample pulse peaks near 4 ps, its first echo 2nd/c = 11.4 ps
		// later (physics.md §4): a window to 13 ps holds no echo.
		{"first pass", true, NoEchoes, 800, -3 * units.Ps},
		{"one echo", false, 1, 1200, -3 * units.Ps},
		{"all echoes", false, AllEchoes, 8192, -15 * units.Ps},
	} {
		t.Run(c.name, func(t *testing.T) {
			ref, sam := synth(t, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: c.n, startS: c.startS,
				slab:  optics.Slab{Medium: si, ThicknessM: d, Incoherent: c.incoherent},
				noise: 1e-4, seed: 31})
			ex, err := ExtractFromTraces(ref, sam, TransmissionOptions{}, ExtractOptions{ThicknessM: d, Echoes: c.echoes, MaxStdIndex: 2e-4})
			if err != nil {
				t.Fatal(err)
			}
			if ex.Band.LoHz > 1*units.THz || ex.Band.HiHz < 2*units.THz {
				t.Errorf("band %.3f–%.3f THz narrower than 1–2 THz", ex.Band.LoHz/units.THz, ex.Band.HiHz/units.THz)
			}
			rms := checkIndex(t, ex, si, 1e-3)
			if rms < 0.7 || rms > 1.3 {
				t.Errorf("RMS deviation %.3f σ, want ≈ 1", rms)
			}
			for _, cc := range ex.Cautions {
				t.Errorf("unexpected caution %v", cc)
			}
			t.Logf("band %.3f–%.3f THz (%d bins), RMS deviation %.2f σ", ex.Band.LoHz/units.THz, ex.Band.HiHz/units.THz, ex.Band.Len(), rms)
		})
	}
}

// Round trip through a Lorentz crystal: 20 um of ZnTe from the optics
// catalogue (ε∞ = 7.44, Δε = 2.58, TO 5.32 THz, width 25 GHz: Gallot et
// al., APL 74, 3450 (1999), from memory), thin enough to transmit up to
// 5.27 THz, 1.5 linewidths below the TO phonon; all echoes (they overlap
// the pulse), a 2 THz pulse, a 150 ps window for the phonon's ring-down
// (e^{-γt/2} = 1e-5 at its end) and seeded noise at 1e-5 of the peak.
// The extraction must recover n and κ to 1e-3 where StdIndex <= 2e-4; the
// fit of ε∞ + one Lorentz oscillator to the whole band, from a start 5–100 %
// off, must recover every parameter within 3σ of its reported uncertainty,
// with a reduced χ² near 1 (the noise model holds), and close to truth:
// f_TO to 1e-4, γ to 2 %, Δε and ε∞ to 1e-3 relative.
func TestExtractZnTeRoundTripAndFit(t *testing.T) {
	znte, err := optics.Lookup("znte")
	if err != nil {
		t.Fatal(err)
	}
	truth, _ := optics.DielectricOf(znte)
	const d = 20 * units.Um
	ref, sam := synth(t, synthSpec{
		model: pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 2 * units.THz, PeakFieldVPerM: 1},
		stepS: 10 * units.Fs, n: 15000, startS: -10 * units.Ps,
		slab: optics.Slab{Medium: znte, ThicknessM: d}, noise: 1e-5, seed: 41})
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ex, err := ExtractSlab(tr, ExtractOptions{ThicknessM: d, Echoes: AllEchoes, MaxStdIndex: 2e-4})
	if err != nil {
		t.Fatal(err)
	}
	if ex.Band.Len() < 200 {
		t.Errorf("band %.3f–%.3f THz: only %d bins", ex.Band.LoHz/units.THz, ex.Band.HiHz/units.THz, ex.Band.Len())
	}
	rms := checkIndex(t, ex, znte, 1e-3)
	t.Logf("trimmed band %.3f–%.3f THz, RMS deviation %.2f σ", ex.Band.LoHz/units.THz, ex.Band.HiHz/units.THz, rms)

	all, err := ExtractSlab(tr, ExtractOptions{ThicknessM: d, Echoes: AllEchoes})
	if err != nil {
		t.Fatal(err)
	}
	if all.Band.HiHz < 5.2*units.THz {
		t.Errorf("full band ends at %.3f THz, want it to reach near the TO phonon", all.Band.HiHz/units.THz)
	}
	fit, err := FitExtraction(all, FitOptions{Initial: optics.Dielectric{EpsInf: 7, Oscillators: []optics.Oscillator{{FreqHz: 5.1 * units.THz, WidthHz: 50 * units.GHz, DeltaEps: 2}}}})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range fit.Cautions {
		t.Errorf("unexpected caution %v", c)
	}
	if fit.ReducedChiSquare < 0.8 || fit.ReducedChiSquare > 1.25 {
		t.Errorf("reduced χ² %.3f, want ≈ 1 for a model that fits to within the noise", fit.ReducedChiSquare)
	}
	got, sd, want := fit.Model.Oscillators[0], fit.Std.Oscillators[0], truth.Oscillators[0]
	for _, c := range []struct {
		name               string
		got, sd, want, rel float64
	}{
		{"eps_inf", fit.Model.EpsInf, fit.Std.EpsInf, truth.EpsInf, 1e-3},
		{"f_TO", got.FreqHz, sd.FreqHz, want.FreqHz, 1e-4},
		{"width", got.WidthHz, sd.WidthHz, want.WidthHz, 2e-2},
		{"delta_eps", got.DeltaEps, sd.DeltaEps, want.DeltaEps, 1e-3},
	} {
		if math.Abs(c.got-c.want) > 3*c.sd || relErr(c.got, c.want) > c.rel {
			t.Errorf("%s = %.6g ± %.2g, true %.6g (3σ, and %g relative)", c.name, c.got, c.sd, c.want, c.rel)
		}
		t.Logf("%s = %.6g ± %.2g (true %.6g, %.2f σ)", c.name, c.got, c.sd, c.want, (c.got-c.want)/c.sd)
	}
}

// A thickness error δd biases the extracted index: for a lossless slab
// without echoes the phase (n-1)ωd/c is all there is to n, so using d' gives
// n' = 1 + (n-1)·d/d' (derived), the bias ExtractOptions.ThicknessM warns of.
func TestExtractThicknessBias(t *testing.T) {
	si := optics.Constant{N: 3.4175}
	const d = 500 * units.Um
	ref, sam := synth(t, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: 800, startS: -3 * units.Ps,
		slab: optics.Slab{Medium: si, ThicknessM: d, Incoherent: true}, noise: 1e-4, seed: 51})
	for _, dd := range []float64{490 * units.Um, 505 * units.Um} {
		ex, err := ExtractFromTraces(ref, sam, TransmissionOptions{}, ExtractOptions{ThicknessM: dd, MaxStdIndex: 2e-4})
		if err != nil {
			t.Fatal(err)
		}
		want := 1 + (si.N-1)*d/dd
		for i, n := range ex.Index {
			if math.Abs(real(n)-want) > 1e-3 {
				t.Fatalf("d' = %g um, %.3f THz: n = %.5f, want %.5f", dd/units.Um, ex.FreqHz[i]/units.THz, real(n), want)
			}
		}
	}
}

// With NoEchoes the extraction cautions when the sample window holds the
// first echo (2nd/c = 11.4 ps after the pulse, physics.md §4), and not when
// the window closes before it or the model keeps all echoes.
func TestExtractEchoCaution(t *testing.T) {
	si := optics.Constant{N: 3.4175}
	const d = 500 * units.Um
	for _, c := range []struct {
		name   string
		n      int
		echoes Echoes
		want   bool
	}{
		{"window before echo", 800, NoEchoes, false},
		{"window holds echo", 1200, NoEchoes, true},
		{"window holds two echoes, one modelled", 1800, 1, true},
		{"window holds echoes, all modelled", 8192, AllEchoes, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			ref, sam := synth(t, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: c.n, startS: -3 * units.Ps,
				slab: optics.Slab{Medium: si, ThicknessM: d}, noise: 1e-4, seed: 61})
			ex, err := ExtractFromTraces(ref, sam, TransmissionOptions{}, ExtractOptions{ThicknessM: d, Echoes: c.echoes})
			if err != nil {
				t.Fatal(err)
			}
			got := false
			for _, cc := range ex.Cautions {
				if cc.Code == caution.EchoInWindow {
					got = true
				}
			}
			if got != c.want {
				t.Errorf("EchoInWindow %v, want %v (%v)", got, c.want, ex.Cautions)
			}
		})
	}
}

func TestExtractErrors(t *testing.T) {
	si := optics.Constant{N: 3.4175}
	ref, sam := synth(t, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: 800, startS: -3 * units.Ps,
		slab: optics.Slab{Medium: si, ThicknessM: 500 * units.Um, Incoherent: true}, noise: 1e-4, seed: 71})
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	good := ExtractOptions{ThicknessM: 500 * units.Um}
	broken := tr
	broken.PhaseRad = broken.PhaseRad[:3]
	nanT := tr
	nanT.T = append([]complex128(nil), tr.T...)
	nanT.T[tr.Band.Lo+1] = cmplx.NaN()
	for _, c := range []struct {
		name   string
		tr     Transmission
		o      ExtractOptions
		field  string
		noBand bool
	}{
		{"zero thickness", tr, ExtractOptions{}, "ExtractOptions.ThicknessM", false},
		{"negative thickness", tr, ExtractOptions{ThicknessM: -1e-3}, "ExtractOptions.ThicknessM", false},
		{"NaN thickness", tr, ExtractOptions{ThicknessM: math.NaN()}, "ExtractOptions.ThicknessM", false},
		{"huge thickness", tr, ExtractOptions{ThicknessM: 2}, "ExtractOptions.ThicknessM", false},
		{"bad echoes", tr, ExtractOptions{ThicknessM: 1e-3, Echoes: -2}, "ExtractOptions.Echoes", false},
		{"negative std limit", tr, ExtractOptions{ThicknessM: 1e-3, MaxStdIndex: -1}, "ExtractOptions.MaxStdIndex", false},
		{"negative iterations", tr, ExtractOptions{ThicknessM: 1e-3, MaxIterations: -1}, "ExtractOptions.MaxIterations", false},
		{"malformed transmission", broken, good, "Transmission", false},
		{"NaN in band", nanT, good, "Transmission", false},
		{"empty transmission", Transmission{}, good, "Transmission", false},
		{"impossible std limit", tr, ExtractOptions{ThicknessM: 500 * units.Um, MaxStdIndex: 1e-12}, "ExtractOptions", true},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := ExtractSlab(c.tr, c.o)
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v, want *InputError", err)
			}
			if ie.Field != c.field || errors.Is(err, ErrNoBand) != c.noBand {
				t.Errorf("field %q (ErrNoBand %v), want %q (%v): %v", ie.Field, errors.Is(err, ErrNoBand), c.field, c.noBand, err)
			}
		})
	}
	// SolveIndex refuses bad arguments and reports non-convergence.
	for _, c := range []struct {
		name              string
		lnT               complex128
		f, d              float64
		e                 Echoes
		start             complex128
		iters             int
		field             string
		wantNotConverging bool
	}{
		{"NaN lnT", cmplx.NaN(), 1e12, 1e-3, NoEchoes, 0, 0, "lnT", false},
		{"zero frequency", -0.3, 0, 1e-3, NoEchoes, 0, 0, "freqHz", false},
		{"zero thickness", -0.3, 1e12, 0, NoEchoes, 0, 0, "thicknessM", false},
		{"bad start", -0.3, 1e12, 1e-3, NoEchoes, complex(-1, 0), 0, "start", false},
		{"bad echoes", -0.3, 1e12, 1e-3, -5, 0, 0, "echoes", false},
		{"negative iterations", -0.3, 1e12, 1e-3, NoEchoes, 0, -1, "maxIterations", false},
		{"one iteration", complex(-0.4, 30), 1e12, 1e-3, AllEchoes, 0, 1, "lnT", true},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, _, err := SolveIndex(c.lnT, c.f, c.d, c.e, c.start, c.iters)
			var ie *InputError
			if !errors.As(err, &ie) || ie.Field != c.field || errors.Is(err, ErrNotConverged) != c.wantNotConverging {
				t.Errorf("error %v, want field %q (not converged %v)", err, c.field, c.wantNotConverging)
			}
		})
	}
}

// Property: with a finite number of echoes the roots at one frequency are
// ambiguous once r² > 1/3 (n > 3.7 for one echo: dlnT/dñ ∝ (1+3x)/(1+x)
// vanishes at x = -1/3, derived), yet the branch ExtractSlab selects is the
// physical one. Synthetic transmissions of the exact model for random slabs
// (n 1.5–5.5, κ up to 0.05, 20 um–2 mm), on the frequency grid of a window
// that holds the echoes (bins 1/((m + 1/2)·2nd/c) apart, windows of at least
// 10 ps), with seeded noise of σ = 1e-4 on ln|T| and on the phase: every
// frequency within 6 StdIndex of the truth (a wrong branch is off by a
// sizeable fraction of a fringe period, ~π/(2ωd/c)).
func TestExtractSlabBranches(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 55))
	const sigma = 1e-4
	for _, e := range []Echoes{1, 3, AllEchoes, NoEchoes} {
		checked := 0
		for range 100 {
			n := complex(1.5+4*rng.Float64(), 0.05*rng.Float64()*rng.Float64())
			d := math.Exp(math.Log(20e-6) + rng.Float64()*math.Log(2e-3/20e-6))
			win := 2 * real(n) * d / units.SpeedOfLight * (float64(max(int(e), 1)) + 0.5)
			stepHz := 1 / math.Max(win, 10*units.Ps)
			nb := int(3*units.THz/stepHz) + 1
			if nb < 8 || nb > 3000 {
				continue
			}
			tr := Transmission{StepHz: stepHz, FreqHz: make([]float64, nb), T: make([]complex128, nb),
				PhaseRad: make([]float64, nb), SigmaLog: make([]float64, nb), Band: bandOf(1, nb-1, stepHz)}
			for k := 1; k < nb; k++ {
				f := float64(k) * stepHz
				lnT, _ := slabLog(n, 2*math.Pi*f*d/units.SpeedOfLight, e)
				lnT += complex(sigma*rng.NormFloat64(), sigma*rng.NormFloat64())
				tr.FreqHz[k], tr.T[k], tr.PhaseRad[k], tr.SigmaLog[k] = f, cmplx.Exp(lnT), imag(lnT), sigma
			}
			ex, err := ExtractSlab(tr, ExtractOptions{ThicknessM: d, Echoes: e})
			if err != nil {
				t.Fatalf("echoes %v, ñ=%v, d=%g: %v", e, n, d, err)
			}
			if ex.Unconverged > 0 || ex.Band.Len() != nb-1 {
				t.Fatalf("echoes %v, ñ=%v, d=%g: %d unconverged, band %+v", e, n, d, ex.Unconverged, ex.Band)
			}
			for i, v := range ex.Index {
				if dd := v - n; math.Abs(real(dd)) > 6*ex.StdIndex[i] || math.Abs(imag(dd)) > 6*ex.StdIndex[i] {
					t.Fatalf("echoes %v, ñ=%v, d=%g: at %.3f THz ñ = %v (σ %.2g)", e, n, d, ex.FreqHz[i]/units.THz, v, ex.StdIndex[i])
				}
			}
			checked++
		}
		if checked < 50 {
			t.Errorf("echoes %v: only %d slabs checked", e, checked)
		}
	}
}
