package pulse

import (
	"fmt"
	"sync"
)

// Transform is the one Fourier transform of the project, in the convention
// of time dependence e^{-i w t}:
//
//	E(w) = ∫ E(t) e^{+i w t} dt,   discretised as   E_k = dt · Σ_n E_n e^{+2πi k n / N},
//	E_n  = (1/(N dt)) · Σ_k E_k e^{-2πi k n / N}.
//
// With it a passive medium has n~ = n + iκ with κ >= 0, and a damped
// oscillator responds as 1/(W^2 - w^2 - iγw). Most FFT libraries (gonum's
// among them) use e^{-2πi kn/N} forward; for real input their result is the
// complex conjugate of ours, which is how Forward computes it.
//
// A Transform holds a plan and a work buffer for one length N and is not safe
// for concurrent use; Acquire and Release share plans between goroutines.
// Only the one-sided half of the spectrum, bins k = 0 … N/2 at frequencies
// k/(N dt), is stored: the input is real, so the rest is its conjugate mirror.
//
// Three paths compute the same sums (fft.go; each is tested against numpy.fft
// and the DFT's definition): even lengths whose half has no prime factor
// above 5 (every power of two, and every even length NextFastLength returns)
// use a complex FFT of half the length; odd lengths with no prime factor
// above 5 a complex FFT of the full length; all others, primes included,
// Bluestein's algorithm, so that no length costs more than O(N log N).
type Transform struct {
	n    int
	half *halfPlan // even, half 5-smooth
	odd  *oddPlan  // odd 5-smooth
	blue *bluePlan // not 5-smooth
}

// NewTransform returns a transform for real sequences of length n >= 2.
func NewTransform(n int) *Transform {
	if n < 2 {
		panic(fmt.Sprintf("pulse: transform length %d < 2", n))
	}
	if hp := newHalfPlan(n); hp != nil {
		return &Transform{n: n, half: hp}
	}
	if op := newOddPlan(n); op != nil {
		return &Transform{n: n, odd: op}
	}
	return &Transform{n: n, blue: newBluePlan(n)}
}

// Len is the length N of the real sequences the transform takes.
func (t *Transform) Len() int { return t.n }

// Bins is the number of one-sided spectral bins, N/2 + 1.
func (t *Transform) Bins() int { return t.n/2 + 1 }

// Forward writes the one-sided spectrum of field (len N, sampled every stepS
// seconds) into dst (len N/2+1, or nil to allocate) and returns it. The unit
// of the result is the field's unit times seconds.
func (t *Transform) Forward(dst []complex128, field []float64, stepS float64) []complex128 {
	if len(field) != t.n {
		panic(fmt.Sprintf("pulse: Forward got %d samples, plan is for %d", len(field), t.n))
	}
	if dst == nil {
		dst = make([]complex128, t.Bins())
	}
	dst = dst[:t.Bins()]
	switch {
	case t.half != nil:
		t.half.forward(dst, field, stepS, true)
	case t.odd != nil:
		t.odd.forward(dst, field, stepS, true)
	default:
		t.blue.forward(dst, field, stepS, true)
	}
	return dst
}

// Inverse writes the real sequence (len N) whose one-sided spectrum is spec
// (len N/2+1, in the convention above) into dst (or nil to allocate) and
// returns it. The imaginary parts of the DC and, for even N, Nyquist bins are
// ignored, as they must vanish for a real sequence.
func (t *Transform) Inverse(dst []float64, spec []complex128, stepS float64) []float64 {
	if len(spec) != t.Bins() {
		panic(fmt.Sprintf("pulse: Inverse got %d bins, plan has %d", len(spec), t.Bins()))
	}
	if dst == nil {
		dst = make([]float64, t.n)
	}
	dst = dst[:t.n]
	switch {
	case t.half != nil:
		// spec holds dt·conj(X_k); the sum over it is m·dt times x.
		t.half.inverse(dst, spec, 1/(float64(t.half.m)*stepS), true)
	case t.odd != nil:
		t.odd.inverse(dst, spec, 1/(float64(t.n)*stepS), true)
	default:
		t.blue.inverse(dst, spec, 1/(float64(t.n)*stepS), true)
	}
	return dst
}

// FrequencyHz is the frequency of bin k for a sample step stepS.
func (t *Transform) FrequencyHz(k int, stepS float64) float64 {
	return float64(k) / (float64(t.n) * stepS)
}

var pools sync.Map // int -> *sync.Pool of *Transform

// Acquire returns a transform of length n from a shared pool, building its
// plan only the first time that length is seen (or after the pool dropped
// it). Give it back with Release.
func Acquire(n int) *Transform {
	if t, ok := poolFor(n).Get().(*Transform); ok {
		return t
	}
	return NewTransform(n)
}

// poolFor returns the pool of length n, creating it only when it is missing
// (a plain LoadOrStore would allocate a new pool on every call).
func poolFor(n int) *sync.Pool {
	if p, ok := pools.Load(n); ok {
		return p.(*sync.Pool)
	}
	p, _ := pools.LoadOrStore(n, &sync.Pool{})
	return p.(*sync.Pool)
}

// Release returns a transform obtained from Acquire to the pool.
func Release(t *Transform) {
	if t == nil {
		return
	}
	poolFor(t.n).Put(t)
}
