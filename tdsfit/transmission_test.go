package tdsfit

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"thzdrive/caution"
	"thzdrive/pulse"
	"thzdrive/units"
)

var onePulse = pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: units.THz, PeakFieldVPerM: 1}

// delayed samples m(t - delay) on n samples of step from start, with
// seeded noise.
func delayed(m pulse.Model, delayS, startS, stepS float64, n int, noise float64, rng *rand.Rand) pulse.Trace {
	tr := pulse.Trace{StartS: startS, StepS: stepS, Field: make([]float64, n)}
	for i := range tr.Field {
		tr.Field[i] = m.At(tr.TimeS(i) - delayS)
		if noise > 0 {
			tr.Field[i] += noise * rng.NormFloat64()
		}
	}
	return tr
}

// A pure delay t0 has T = e^{+iωt0} (Fourier shift theorem, e.g. Bracewell,
// The Fourier Transform and Its Applications, from memory, in the e^{-iωt}
// convention of physics.md §1): |T| = 1 and an unwrapped phase of exactly
// 2πf·t0, with no 2π offset at zero frequency, for delays that wrap the
// phase many times and sample traces whose windows start elsewhere. The
// pulse is band-limited far below Nyquist (|E(f)| ∝ e^{-(f/f0)²/2}, 1e-136
// at 25 THz) so sampling adds nothing beyond round-off.
func TestTransmissionDelay(t *testing.T) {
	for _, c := range []struct {
		name              string
		delayS, samStartS float64
	}{
		{"0.5 ps", 0.5 * units.Ps, -5 * units.Ps},
		{"7.3456 ps", 7.3456 * units.Ps, -5 * units.Ps},
		{"-2.2 ps", -2.2 * units.Ps, -5 * units.Ps},
		{"12 ps, shifted window", 12 * units.Ps, 3 * units.Ps},
	} {
		t.Run(c.name, func(t *testing.T) {
			ref := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 2000, 0, nil)
			sam := delayed(onePulse, c.delayS, c.samStartS, 20*units.Fs, 2000, 0, nil)
			tr, err := NewTransmission(ref, sam, TransmissionOptions{MarginDB: 60})
			if err != nil {
				t.Fatal(err)
			}
			if tr.Band.Len() < 100 {
				t.Fatalf("band %+v too narrow", tr.Band)
			}
			// Near the band's edges the spectra are only 60 dB above the
			// round-off floor; where both exceed 1e-5 of their peak the ratio
			// is good to ~1e-16·N/1e-5 ~ 1e-11, so 1e-9 leaves a margin.
			peak := 0.0
			for _, v := range tr.Reference {
				peak = math.Max(peak, cmplx.Abs(v))
			}
			checked := 0
			for k := tr.Band.Lo; k <= tr.Band.Hi; k++ {
				if cmplx.Abs(tr.Reference[k]) < 1e-5*peak || cmplx.Abs(tr.Sample[k]) < 1e-5*peak {
					continue
				}
				checked++
				want := 2 * math.Pi * tr.FreqHz[k] * c.delayS
				if math.Abs(cmplx.Abs(tr.T[k])-1) > 1e-9 || math.Abs(tr.PhaseRad[k]-want) > 1e-9*math.Max(1, math.Abs(want)) {
					t.Fatalf("bin %d (%g THz): |T| = %.12f, phase %.12f, want 1 and %.12f", k, tr.FreqHz[k]/units.THz, cmplx.Abs(tr.T[k]), tr.PhaseRad[k], want)
				}
			}
			if checked < 100 {
				t.Errorf("only %d bins checked", checked)
			}
		})
	}
}

// Anchoring: a phase ωt0 + (small dispersion) whose band starts after many
// wraps is unwrapped from the band's low edge and loses exactly the
// multiple of 2π that makes its extrapolation to zero frequency vanish (the
// convention of NewTransmission; a causal passive sample has zero phase at
// zero frequency). Below the band the values are noise-free here too, so the
// phase must be ωt0 + a(ω) at every bin.
func TestUnwrapAnchored(t *testing.T) {
	const nb, stepHz = 400, 10 * units.GHz
	for _, c := range []struct {
		t0S, curvature float64 // phase = ωt0 + curvature·(f/THz)³
		lo             int
	}{
		{5 * units.Ps, 0, 30},
		{5 * units.Ps, 0, 1},
		{40 * units.Ps, 0.3, 80},
		{-15 * units.Ps, -0.2, 50},
		{0.1 * units.Ps, 0, 200},
	} {
		freq := make([]float64, nb)
		T := make([]complex128, nb)
		want := make([]float64, nb)
		for k := range freq {
			freq[k] = float64(k) * stepHz
			want[k] = 2*math.Pi*freq[k]*c.t0S + c.curvature*math.Pow(freq[k]/units.THz, 3)
			T[k] = cmplx.Rect(0.5, want[k])
		}
		phase := make([]float64, nb)
		off := unwrapAnchored(phase, T, freq, bandOf(c.lo, nb-1, stepHz))
		for k := 1; k < nb; k++ {
			if math.Abs(phase[k]-want[k]) > 1e-9*math.Max(1, math.Abs(want[k])) {
				t.Fatalf("t0 %g, lo %d: bin %d phase %.12f, want %.12f", c.t0S, c.lo, k, phase[k], want[k])
			}
		}
		// The offset removed is the number of wraps at the band's edge.
		if w := math.Round((cmplx.Phase(T[c.lo]) - want[c.lo]) / (2 * math.Pi)); math.Abs(off/(2*math.Pi)-w) > 1e-9 {
			t.Errorf("t0 %g, lo %d: offset %g·2π, want %g·2π", c.t0S, c.lo, off/(2*math.Pi), w)
		}
	}
}

// The noise floor of white noise of standard deviation σ per sample is
// dt·σ·sqrt(N) per bin (derived: E_k = dt·Σ n_j e^{2πijk/N} has variance
// dt²·N·σ²), and SigmaLog is the true scatter of ln|T| and of the phase:
// for a sample identical to the reference up to noise, the normalised
// deviations (ln|T|)/σ and φ/σ have unit RMS (first-order propagation,
// derived in NewTransmission).
func TestTransmissionNoise(t *testing.T) {
	const n, dt, sigma = 16000, 20 * units.Fs, 1e-3
	rng := rand.New(rand.NewPCG(7, 8))
	ref := delayed(onePulse, 0, -20*units.Ps, dt, n, sigma, rng)
	sam := delayed(onePulse, 0, -20*units.Ps, dt, n, sigma, rng)
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := dt * sigma * math.Sqrt(n)
	// The floor is the RMS over 800 bins of |z|² exponential: its relative
	// standard deviation is 1/(2·sqrt(800)) = 1.8 %; 6 % is 3.4σ.
	for _, f := range []float64{tr.NoiseFloorRef, tr.NoiseFloorSam} {
		if relErr(f, want) > 0.06 {
			t.Errorf("noise floor %.4g, want dt·σ·sqrt(N) = %.4g", f, want)
		}
	}
	var sa, sp float64
	m := 0
	for k := tr.Band.Lo; k <= tr.Band.Hi; k++ {
		a := math.Log(cmplx.Abs(tr.T[k])) / tr.SigmaLog[k]
		p := tr.PhaseRad[k] / tr.SigmaLog[k]
		sa += a * a
		sp += p * p
		m++
	}
	ra, rp := math.Sqrt(sa/float64(m)), math.Sqrt(sp/float64(m))
	// m ≈ 90 bins: the RMS of m unit normals has relative sd 1/sqrt(2m) ≈
	// 7.5 %; 25 % is over 3σ, and first-order propagation is good to
	// σ ≈ 0.1 at the band edge.
	if m < 50 || math.Abs(ra-1) > 0.25 || math.Abs(rp-1) > 0.25 {
		t.Errorf("over %d bins the RMS of ln|T|/σ is %.3f and of φ/σ %.3f, want 1", m, ra, rp)
	}
	if tr.PhaseOffsetRad != 0 {
		t.Errorf("phase offset %g for an identical sample", tr.PhaseOffsetRad)
	}
}

// The band is where both spectra exceed their floors by the margin: raising
// the margin narrows it, and its edges obey the definition.
func TestTransmissionBand(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	ref := delayed(onePulse, 0, -10*units.Ps, 20*units.Fs, 2000, 1e-3, rng)
	sam := delayed(onePulse, 3*units.Ps, -10*units.Ps, 20*units.Fs, 2000, 1e-3, rng)
	prev := math.Inf(1)
	for _, margin := range []float64{10, 20, 30, 40} {
		tr, err := NewTransmission(ref, sam, TransmissionOptions{MarginDB: margin})
		if err != nil {
			t.Fatal(err)
		}
		level := math.Pow(10, margin/20)
		for k := tr.Band.Lo; k <= tr.Band.Hi; k++ {
			if cmplx.Abs(tr.Reference[k]) < level*tr.NoiseFloorRef || cmplx.Abs(tr.Sample[k]) < level*tr.NoiseFloorSam {
				t.Fatalf("margin %g: bin %d in the band is below the margin", margin, k)
			}
		}
		for _, k := range []int{tr.Band.Lo - 1, tr.Band.Hi + 1} {
			if k >= 1 && k < len(tr.T) && cmplx.Abs(tr.Reference[k]) >= level*tr.NoiseFloorRef && cmplx.Abs(tr.Sample[k]) >= level*tr.NoiseFloorSam {
				t.Fatalf("margin %g: bin %d next to the band qualifies", margin, k)
			}
		}
		if w := tr.Band.HiHz - tr.Band.LoHz; w >= prev {
			t.Errorf("margin %g: band %g Hz not narrower than %g", margin, w, prev)
		} else {
			prev = w
		}
	}
}

func TestTransmissionErrors(t *testing.T) {
	ok := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 500, 0, nil)
	rng := rand.New(rand.NewPCG(11, 12))
	noise := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 500, 0, nil)
	for i := range noise.Field {
		noise.Field[i] = rng.NormFloat64()
	}
	withNaN := delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 500, 0, nil)
	withNaN.Field[17] = math.NaN()
	otherStep := delayed(onePulse, 0, -5*units.Ps, 20.001*units.Fs, 500, 0, nil)
	short := pulse.Trace{StepS: 20 * units.Fs, Field: []float64{0, 1, -1, 0}}
	for _, c := range []struct {
		name     string
		ref, sam pulse.Trace
		o        TransmissionOptions
		field    string
		noBand   bool
	}{
		{"mismatched steps", ok, otherStep, TransmissionOptions{}, "Sample.StepS", false},
		{"mismatched lengths", ok, delayed(onePulse, 0, -5*units.Ps, 20*units.Fs, 499, 0, nil), TransmissionOptions{}, "Sample.Field", false},
		{"too short", short, short, TransmissionOptions{}, "Reference.Field", false},
		{"NaN sample", ok, withNaN, TransmissionOptions{}, "Sample.Field[17]", false},
		{"zero step", pulse.Trace{Field: ok.Field}, ok, TransmissionOptions{}, "Reference.StepS", false},
		{"negative margin", ok, ok, TransmissionOptions{MarginDB: -3}, "TransmissionOptions.MarginDB", false},
		{"NaN margin", ok, ok, TransmissionOptions{MarginDB: math.NaN()}, "TransmissionOptions.MarginDB", false},
		{"bad window", ok, ok, TransmissionOptions{Processing: pulse.Processing{Window: 99}}, "Processing.Window", false},
		{"pure noise", ok, noise, TransmissionOptions{}, "Sample", true},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := NewTransmission(c.ref, c.sam, c.o)
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v, want *InputError", err)
			}
			if ie.Field != c.field {
				t.Errorf("field %q, want %q (%v)", ie.Field, c.field, err)
			}
			if errors.Is(err, ErrNoBand) != c.noBand {
				t.Errorf("errors.Is(ErrNoBand) = %v, want %v", !c.noBand, c.noBand)
			}
		})
	}
}

func TestLongestRun(t *testing.T) {
	for _, c := range []struct {
		pattern string
		lo, hi  int
	}{
		{"", 0, -1},
		{"....", 0, -1},
		{"xxxx", 0, 3},
		{"x.xx.xxx", 5, 7},
		{"xxx.xxx", 0, 2},
		{".xx.", 1, 2},
	} {
		lo, hi := longestRun(0, len(c.pattern)-1, func(k int) bool { return c.pattern[k] == 'x' })
		if (hi < lo) != (c.hi < c.lo) || (hi >= lo && (lo != c.lo || hi != c.hi)) {
			t.Errorf("%q: [%d, %d], want [%d, %d]", c.pattern, lo, hi, c.lo, c.hi)
		}
	}
}

// The cautions of pulse.Analyze reach the caller, marked with the trace
// they concern: a reference whose pulse sits at the start of the window has
// not decayed there (pulse.EdgeRatioLimit).
func TestTransmissionCautions(t *testing.T) {
	ref := delayed(onePulse, 0, -0.2*units.Ps, 20*units.Fs, 1000, 0, nil)
	sam := delayed(onePulse, 5*units.Ps, -0.2*units.Ps, 20*units.Fs, 1000, 0, nil)
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, c := range tr.Cautions {
		if c.Code == caution.NotDecayed {
			found = true
			if !strings.HasPrefix(c.Message, "reference trace: ") {
				t.Errorf("message %q does not name the trace", c.Message)
			}
		}
	}
	if !found {
		t.Errorf("no NotDecayed caution: %v", tr.Cautions)
	}
}
