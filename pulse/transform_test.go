package pulse

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"
)

// TestForwardMatchesNumpy checks Forward against numpy.fft.rfft on six
// fixed traces written by testdata/make_fft_reference.py, whose lengths
// cover the three paths of Transform and every radix of its own FFT:
// E_k = dt·conj(rfft(x))[k] for real x (physics.md §1). Tolerance 1e-9 of
// the largest bin: both are O(N log N) float64 algorithms whose round-off is
// near 1e-15.
func TestForwardMatchesNumpy(t *testing.T) {
	type ref struct {
		step  float64
		trace []float64
		spec  []complex128
	}
	cases := map[string]*ref{}
	get := func(name string) *ref {
		if cases[name] == nil {
			cases[name] = &ref{}
		}
		return cases[name]
	}
	for _, r := range readRows(t, "fft_reference.csv") {
		c := get(r[1])
		switch r[0] {
		case "step":
			c.step = atof(t, r[2])
		case "trace":
			if atoi(t, r[2]) != len(c.trace) {
				t.Fatalf("trace rows out of order at %v", r)
			}
			c.trace = append(c.trace, atof(t, r[3]))
		case "spectrum":
			if atoi(t, r[2]) != len(c.spec) {
				t.Fatalf("spectrum rows out of order at %v", r)
			}
			c.spec = append(c.spec, complex(atof(t, r[3]), atof(t, r[4])))
		}
	}
	if len(cases) != 6 {
		t.Fatalf("reference has %d cases, want 6", len(cases))
	}
	for name, c := range cases {
		tr := NewTransform(len(c.trace))
		if tr.Bins() != len(c.spec) {
			t.Fatalf("%s: %d bins, numpy has %d", name, tr.Bins(), len(c.spec))
		}
		got := tr.Forward(nil, c.trace, c.step)
		peak := 0.0
		for _, v := range c.spec {
			peak = max(peak, cmplx.Abs(v))
		}
		worst := 0.0
		for k := range got {
			worst = max(worst, cmplx.Abs(got[k]-c.spec[k])/peak)
		}
		if worst > 1e-9 { // numpy.fft.rfft, testdata/make_fft_reference.py
			t.Errorf("%s (N=%d): largest deviation from numpy %.3g of the peak bin, want <= 1e-9", name, len(c.trace), worst)
		}
		t.Logf("%s (N=%d, %s): largest deviation from numpy %.2g of the peak bin", name, len(c.trace), tr.path(), worst)
	}
}

// path names the algorithm a transform uses.
func (t *Transform) path() string {
	switch {
	case t.half != nil:
		return "half-length complex FFT"
	case t.odd != nil:
		return "full-length complex FFT"
	}
	return "Bluestein"
}

// naiveDFT is the DFT by its definition (physics.md §1), E_k = dt·Σ_n x_n
// e^{+2πi kn/N}, with each angle reduced exactly before the sine and cosine.
func naiveDFT(x []float64, dt float64) []complex128 {
	n := len(x)
	out := make([]complex128, n/2+1)
	for k := range out {
		var s complex128
		for j, v := range x {
			sn, cs := math.Sincos(2 * math.Pi * float64((k*j)%n) / float64(n))
			s += complex(v*cs, v*sn)
		}
		out[k] = complex(dt, 0) * s
	}
	return out
}

// TestTransformMatchesDefinition checks Forward and Inverse for every length
// from 2 to 400, both paths, against the DFT computed from its definition
// (physics.md §1). Tolerance 1e-12 of the largest bin (round-off of sums of
// up to 400 terms, derived).
func TestTransformMatchesDefinition(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	paths := map[string]int{}
	for n := 2; n <= 400; n++ {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		tr := NewTransform(n)
		paths[tr.path()]++
		want := naiveDFT(x, 0.5)
		got := tr.Forward(nil, x, 0.5)
		peak := 0.0
		for _, c := range want {
			peak = max(peak, cmplx.Abs(c))
		}
		for k := range want {
			if cmplx.Abs(got[k]-want[k]) > 1e-12*peak {
				t.Fatalf("N=%d (%s) bin %d: %v, definition %v", n, tr.path(), k, got[k], want[k])
			}
		}
		back := tr.Inverse(nil, want, 0.5)
		for i := range x {
			if math.Abs(back[i]-x[i]) > 1e-12*float64(n) {
				t.Fatalf("N=%d (%s) sample %d: inverse %v, original %v", n, tr.path(), i, back[i], x[i])
			}
		}
	}
	t.Logf("lengths per path: %v", paths)
	if len(paths) != 3 {
		t.Fatalf("lengths per path %v: all three paths must be exercised", paths)
	}
}

// twoSidedEnergy is Σ|E_k|² over all N bins of the two-sided spectrum, from
// the one-sided half: bins 1 … ceil(N/2)-1 stand for themselves and their
// mirror images; DC, and Nyquist for even N, once.
func twoSidedEnergy(spec []complex128, n int) float64 {
	s := 0.0
	for k, c := range spec {
		p := real(c)*real(c) + imag(c)*imag(c)
		if k == 0 || (n%2 == 0 && k == n/2) {
			s += p
		} else {
			s += 2 * p
		}
	}
	return s
}

// TestParseval checks dt·Σ|E_n|² = (1/(N dt))·Σ|E_k|² over the two-sided
// spectrum (physics.md §1; Parseval's theorem for the DFT) on seeded random
// traces of even, odd, power-of-two and awkward lengths. Tolerance 1e-12
// relative (derived: round-off of the sums, about N·ε at worst here).
func TestParseval(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{8, 9, 10, 1000, 1024, 4097, 5000} {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64()*3 + 0.5
		}
		const dt = 7e-15
		tr := NewTransform(n)
		spec := tr.Forward(nil, x, dt)
		timeSide := 0.0
		for _, v := range x {
			timeSide += v * v
		}
		timeSide *= dt
		freqSide := twoSidedEnergy(spec, n) / (float64(n) * dt)
		if rel := math.Abs(freqSide/timeSide - 1); rel > 1e-12 { // Parseval, physics.md §1
			t.Errorf("N=%d: time side %.17g, frequency side %.17g, relative difference %.3g > 1e-12", n, timeSide, freqSide, rel)
		}
	}
}

// TestShiftConvention checks the sign of the convention (physics.md §1): a
// pulse delayed by t0 has its spectrum multiplied by e^{+iωt0} (shift
// theorem with E(ω) = ∫E(t)e^{+iωt}dt). The delay is not a whole number of
// samples, so the check is on the physics, not on an index rotation. The
// pulse is sampled every 10 fs over 40 ps: aliasing (e^{-(ωτ)²/2} at Nyquist
// is e^{-1250}) and truncation (e^{-(t/τ)²/2} at the window's edge) are far
// below round-off, so the tolerance is 1e-10 of the peak bin (derived).
func TestShiftConvention(t *testing.T) {
	const step, span, t0 = 10e-15, 40e-12, 0.3737e-12
	early, err := singleCycle1THz.Sample(step, span)
	if err != nil {
		t.Fatal(err)
	}
	late := Trace{StartS: early.StartS, StepS: step, Field: make([]float64, early.Len())}
	for i := range late.Field {
		late.Field[i] = singleCycle1THz.At(late.TimeS(i) - t0)
	}
	tr := NewTransform(early.Len())
	a := tr.Forward(nil, early.Field, step)
	b := tr.Forward(nil, late.Field, step)
	peak := 0.0
	for _, v := range a {
		peak = max(peak, cmplx.Abs(v))
	}
	worst := 0.0
	for k := range a {
		w := 2 * math.Pi * tr.FrequencyHz(k, step)
		want := a[k] * cmplx.Rect(1, w*t0) // e^{+iωt0}: shift theorem, derived
		worst = max(worst, cmplx.Abs(b[k]-want)/peak)
	}
	if worst > 1e-10 {
		t.Errorf("delayed spectrum differs from e^{+iωt0}·spectrum by %.3g of the peak, want <= 1e-10", worst)
	}
	// The opposite sign must fail, or the test could not tell conventions apart.
	wrong := 0.0
	for k := range a {
		w := 2 * math.Pi * tr.FrequencyHz(k, step)
		wrong = max(wrong, cmplx.Abs(b[k]-a[k]*cmplx.Rect(1, -w*t0))/peak)
	}
	if wrong < 0.1 {
		t.Errorf("e^{-iωt0} also matches (%.3g): the test cannot distinguish the conventions", wrong)
	}
}

// TestCausality checks the other face of the convention (physics.md §1): a
// damped oscillator responds as 1/(W² - ω² - iγω) in it, and the response to
// a pulse must vanish before the pulse arrives. The drive is a Gaussian of
// 50 fs at t = 0 in a 60 ps window; the oscillator (2 THz, γ = 2π·0.5 THz)
// rings down to e^{-γ·30 ps/2} ≈ e^{-47} before it wraps around. Tolerance:
// before t = -0.5 ps (10 widths of the drive) the response stays below 1e-9
// of its peak (derived).
func TestCausality(t *testing.T) {
	const step, n = 5e-15, 12000
	const sigma = 50e-15
	field := make([]float64, n)
	start := -float64(n) * step / 2
	for i := range field {
		tt := start + float64(i)*step
		field[i] = math.Exp(-tt * tt / (2 * sigma * sigma))
	}
	tr := NewTransform(n)
	spec := tr.Forward(nil, field, step)
	w0, gamma := 2*math.Pi*2e12, 2*math.Pi*0.5e12
	respond := func(sign float64) (before, peak float64) {
		s := make([]complex128, len(spec))
		for k, c := range spec {
			w := 2 * math.Pi * tr.FrequencyHz(k, step)
			s[k] = c / complex(w0*w0-w*w, -sign*gamma*w)
		}
		q := tr.Inverse(nil, s, step)
		for i, v := range q {
			peak = max(peak, math.Abs(v))
			if start+float64(i)*step < -0.5e-12 {
				before = max(before, math.Abs(v))
			}
		}
		return before, peak
	}
	before, peak := respond(+1) // 1/(W² - ω² - iγω), physics.md §1
	if before > 1e-9*peak {
		t.Errorf("response before the pulse %.3g of its peak, want <= 1e-9 (causality)", before/peak)
	}
	before, peak = respond(-1) // the other sign is anti-causal in this convention
	if before < 0.1*peak {
		t.Errorf("the anti-causal response is also quiet before the pulse (%.3g): the test cannot fail", before/peak)
	}
}

// TestRoundTrip checks Inverse(Forward(x)) = x (the DFT pair of physics.md
// §1) for even and odd lengths on all three paths. Tolerance 1e-12 of max|x| (derived:
// round-off of two transforms).
func TestRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, n := range []int{8, 9, 1000, 1001, 1125, 4096, 4099, 65536} {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		tr := NewTransform(n)
		spec := tr.Forward(nil, x, 3e-14)
		// Imaginary parts of DC and (even N) Nyquist must vanish for a real
		// sequence; Inverse is documented to ignore them.
		spec[0] += complex(0, 1e-9)
		if n%2 == 0 {
			spec[n/2] += complex(0, -2e-9)
		}
		y := tr.Inverse(nil, spec, 3e-14)
		peak, worst := 0.0, 0.0
		for i := range x {
			peak = max(peak, math.Abs(x[i]))
			worst = max(worst, math.Abs(y[i]-x[i]))
		}
		if worst > 1e-12*peak {
			t.Errorf("N=%d: round trip off by %.3g of max|x|, want <= 1e-12", n, worst/peak)
		}
	}
}

// TestTableCacheBounded checks that the cache of immutable tables keeps at
// most tableCacheBytes, dropping the oldest entries first, and that a
// transform built after its tables were dropped still computes the same
// spectrum, bit for bit (the tables are rebuilt the same way).
func TestTableCacheBounded(t *testing.T) {
	x := make([]float64, 4096)
	rng := rand.New(rand.NewPCG(9, 10))
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	before := NewTransform(4096).Forward(nil, x, 1)
	const fake = tableKind(99)
	big := tableCacheBytes/2 + 1
	for i := range 3 {
		tableFor(tableKey{kind: fake, n: i}, func() (any, int) { return i, big })
		tables.Lock()
		bytes, kept := tables.bytes, len(tables.m)
		_, newest := tables.m[tableKey{kind: fake, n: i}]
		_, older := tables.m[tableKey{kind: fake, n: i - 1}]
		tables.Unlock()
		if bytes > tableCacheBytes || !newest || (i > 0 && older) {
			t.Fatalf("after entry %d: %d bytes in %d entries (limit %d), newest kept %v, previous kept %v", i, bytes, kept, tableCacheBytes, newest, older)
		}
	}
	after := NewTransform(4096).Forward(nil, x, 1)
	for k := range before {
		if before[k] != after[k] {
			t.Fatalf("bin %d: %v with rebuilt tables, %v before", k, after[k], before[k])
		}
	}
	tables.Lock()
	delete(tables.m, tableKey{kind: fake, n: 2})
	tables.bytes -= big
	tables.order = tables.order[:0]
	for k := range tables.m {
		tables.order = append(tables.order, k)
	}
	tables.Unlock()
}

// TestAcquireReuses checks that a released transform is handed out again for
// the same length (the pool is what keeps Analyze from rebuilding plans) and
// that lengths are not mixed.
func TestAcquireReuses(t *testing.T) {
	a := Acquire(777)
	Release(a)
	b := Acquire(777)
	defer Release(b)
	if b.Len() != 777 {
		t.Fatalf("Acquire(777) gave length %d", b.Len())
	}
	c := Acquire(778)
	defer Release(c)
	if c.Len() != 778 {
		t.Fatalf("Acquire(778) gave length %d", c.Len())
	}
}

// benchLengths are the lengths of the FFT benchmarks: powers of two from
// 1024 to 65536, a 5-smooth length that is not a power of two (5000) and a
// prime (4099, Bluestein's path). tools/bench times numpy.fft.rfft and
// FFTW's r2c at the same lengths.
var benchLengths = []int{1024, 2048, 4096, 8192, 16384, 32768, 65536, 5000, 4099}

// BenchmarkForward is the real-to-complex transform (one-sided spectrum) of
// random data, the operation numpy.fft.rfft performs.
func BenchmarkForward(b *testing.B) {
	for _, n := range benchLengths {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := make([]float64, n)
			rng := rand.New(rand.NewPCG(5, 6))
			for i := range x {
				x[i] = rng.NormFloat64()
			}
			tr := NewTransform(n)
			dst := make([]complex128, tr.Bins())
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				tr.Forward(dst, x, 1e-14)
			}
		})
	}
}

// BenchmarkInverse is the complex-to-real transform back (numpy.fft.irfft).
func BenchmarkInverse(b *testing.B) {
	for _, n := range benchLengths {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := make([]float64, n)
			rng := rand.New(rand.NewPCG(5, 6))
			for i := range x {
				x[i] = rng.NormFloat64()
			}
			tr := NewTransform(n)
			spec := tr.Forward(nil, x, 1e-14)
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				tr.Inverse(x, spec, 1e-14)
			}
		})
	}
}

// BenchmarkForwardGonum measures gonum's FFTPACK port alone (plus the
// conjugation and scaling into our convention), the transform every length
// used before the paths of fft.go, for comparison with BenchmarkForward.
func BenchmarkForwardGonum(b *testing.B) {
	for _, n := range []int{1024, 4096, 5000, 65536, 4099} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			x := make([]float64, n)
			rng := rand.New(rand.NewPCG(5, 6))
			for i := range x {
				x[i] = rng.NormFloat64()
			}
			plan := fourier.NewFFT(n)
			dst := make([]complex128, n/2+1)
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				plan.Coefficients(dst, x)
				for k, c := range dst {
					dst[k] = complex(1e-14*real(c), -1e-14*imag(c))
				}
			}
		})
	}
}
