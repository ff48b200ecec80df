package optics

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"thzdrive/units"
)

// Medium is a linear, isotropic, non-magnetic material described by its
// complex refractive index ñ(f) = n + iκ at the frequency freqHz.
//
// With the time dependence e^{-iωt} used throughout the project a plane wave
// travelling in +z is e^{i(ñωz/c - ωt)}, so a passive (absorbing) medium has
// κ >= 0 and its amplitude decays as e^{-κωz/c}. Index is called in the inner
// loop of every spectral computation: it must not allocate, and it must be
// safe to call from several goroutines at once if the medium is shared.
//
// Index is defined for freqHz > 0. The evaluators of this package never call
// it at zero or negative frequency.
type Medium interface {
	Index(freqHz float64) complex128
}

// Ranged is implemented by media whose data are valid only over a frequency
// range (tabulated measurements, catalogue entries). Outside the range their
// Index still returns a finite value (see each type), but the value is an
// extrapolation: callers check with Covers and raise
// caution.MaterialExtrapolate, which Evaluator.Extrapolations does for a
// whole optical train.
type Ranged interface {
	ValidRangeHz() (minHz, maxHz float64)
}

// Covers reports whether the data of m are valid over the whole interval
// [loHz, hiHz], and the valid range itself. A medium that does not implement
// Ranged (a constant index, a dielectric model) covers every frequency and
// reports the range [0, +Inf).
func Covers(m Medium, loHz, hiHz float64) (ok bool, minHz, maxHz float64) {
	r, isRanged := m.(Ranged)
	if !isRanged {
		return true, 0, math.Inf(1)
	}
	minHz, maxHz = r.ValidRangeHz()
	return loHz >= minHz && hiHz <= maxHz, minHz, maxHz
}

// IndexFromEpsilon returns the complex refractive index ñ = sqrt(ε) on the
// branch with κ = Im ñ >= 0, the branch of a passive medium in the e^{-iωt}
// convention. It is the one conversion from relative permittivity to index in
// the package; the other way is simply ε = ñ².
//
// For Im ε >= 0 the branch also has n = Re ñ >= 0. A negative real ε (an
// undamped metal, or a phonon's reststrahlen band) gives ñ = i·sqrt(|ε|):
// n = 0, the wave is evanescent. The same function picks the branch of the
// normal component of the wave vector in a layer, q = sqrt(ε - β²), where
// Im q >= 0 makes an evanescent or absorbed wave decay in the direction it
// travels.
func IndexFromEpsilon(eps complex128) complex128 {
	// n² - κ² = Re ε and 2nκ = Im ε (Born & Wolf §14.1): the larger of n,
	// |κ| from the square root of (|ε| ± Re ε)/2, the other from 2nκ = Im ε,
	// which avoids cancellation. Of the two roots ±(n + iκ) the one with
	// κ >= 0 is returned; n < 0 only for gain (Im ε < 0).
	a, b := real(eps), imag(eps)
	r := math.Sqrt(a*a + b*b)
	if r == 0 || math.IsInf(r, 0) || math.IsNaN(r) {
		return cmplx.Sqrt(eps) // 0, or out of the range met in optics
	}
	if a >= 0 {
		n := math.Sqrt((r + a) / 2)
		s := complex(n, b/(2*n))
		if imag(s) < 0 {
			s = -s
		}
		return s
	}
	k := math.Sqrt((r - a) / 2)
	return complex(b/(2*k), k)
}

// AbsorptionCoefficient returns the power absorption coefficient
// α = 2ωκ/c in 1/m of a medium of index ñ at freqHz: the intensity of a
// plane wave decays as e^{-αz} (Born & Wolf, Principles of Optics, §14.1).
// Divide by units.PerCm for the trade's cm^-1.
func AbsorptionCoefficient(freqHz float64, index complex128) float64 {
	return 2 * units.AngularFrequency(freqHz) * imag(index) / units.SpeedOfLight
}

// Constant is a medium with a frequency-independent index N + iKappa. It
// is the right model for a transparent window over a band far from its
// resonances; note that a constant κ means α = 2ωκ/c grows linearly with
// frequency.
type Constant struct {
	N, Kappa float64
}

// Index returns N + iKappa at every frequency.
func (c Constant) Index(float64) complex128 { return complex(c.N, c.Kappa) }

// Validate refuses a non-finite index, N < 0, κ < 0 (gain) and ñ = 0.
func (c Constant) Validate() error {
	switch {
	case !finite(c.N) || !finite(c.Kappa):
		return fmt.Errorf("index %g%+gi is not finite", c.N, c.Kappa)
	case c.N < 0:
		return fmt.Errorf("n = %g is negative", c.N)
	case c.Kappa < 0:
		return fmt.Errorf("κ = %g is negative: a passive medium has κ >= 0 (time dependence e^{-iωt})", c.Kappa)
	case c.N == 0 && c.Kappa == 0:
		return fmt.Errorf("index 0 (ε = 0) cannot carry a wave")
	}
	return nil
}

// Tabulated is a medium given by measured n and κ at a set of frequencies,
// interpolated linearly in both between the points. The data are valid on
// the closed range from the first to the last frequency. Outside it Index
// holds the value at the nearest end (it never extrapolates a trend), and
// ValidRangeHz reports the range so that the caller can say the data were
// stretched (caution.MaterialExtrapolate); Covers does the test.
//
// Linear interpolation is exact at the points and its error between points
// is at most (Δf)²/8 times the second derivative of the data: tabulate
// densely where the index bends. A Tabulated is immutable and safe for
// concurrent use.
type Tabulated struct {
	freqHz, n, kappa []float64
}

// NewTabulated builds a tabulated medium from its points. freqHz must be
// strictly increasing, non-negative and finite; n >= 0 and κ >= 0 finite;
// at least two points; all three slices of equal length. The slices are
// copied.
func NewTabulated(freqHz, n, kappa []float64) (*Tabulated, error) {
	if len(freqHz) != len(n) || len(freqHz) != len(kappa) {
		return nil, fmt.Errorf("optics: tabulated medium: %d frequencies, %d n values, %d κ values: lengths differ", len(freqHz), len(n), len(kappa))
	}
	if len(freqHz) < 2 {
		return nil, fmt.Errorf("optics: tabulated medium: %d points; at least 2 are needed", len(freqHz))
	}
	for i := range freqHz {
		switch {
		case !finite(freqHz[i]) || freqHz[i] < 0:
			return nil, fmt.Errorf("optics: tabulated medium: point %d: frequency %g Hz is not a finite non-negative number", i, freqHz[i])
		case i > 0 && !(freqHz[i] > freqHz[i-1]):
			return nil, fmt.Errorf("optics: tabulated medium: point %d: frequency %g Hz does not increase (previous %g Hz)", i, freqHz[i], freqHz[i-1])
		case !finite(n[i]) || n[i] < 0:
			return nil, fmt.Errorf("optics: tabulated medium: point %d: n = %g is not a finite non-negative number", i, n[i])
		case !finite(kappa[i]) || kappa[i] < 0:
			return nil, fmt.Errorf("optics: tabulated medium: point %d: κ = %g must be finite and >= 0 (passive medium)", i, kappa[i])
		case n[i] == 0 && kappa[i] == 0:
			return nil, fmt.Errorf("optics: tabulated medium: point %d: index 0 cannot carry a wave", i)
		}
	}
	t := &Tabulated{
		freqHz: append([]float64(nil), freqHz...),
		n:      append([]float64(nil), n...),
		kappa:  append([]float64(nil), kappa...),
	}
	return t, nil
}

// Index interpolates linearly in n and κ; outside the table it returns the
// value at the nearest end (see the type's documentation).
func (t *Tabulated) Index(freqHz float64) complex128 {
	f := t.freqHz
	last := len(f) - 1
	switch {
	case !(freqHz > f[0]): // also catches NaN
		if math.IsNaN(freqHz) {
			return complex(math.NaN(), math.NaN())
		}
		return complex(t.n[0], t.kappa[0])
	case freqHz >= f[last]:
		return complex(t.n[last], t.kappa[last])
	}
	// f[i-1] < freqHz <= f[i]
	i := sort.SearchFloat64s(f, freqHz)
	w := (freqHz - f[i-1]) / (f[i] - f[i-1])
	return complex(t.n[i-1]+w*(t.n[i]-t.n[i-1]), t.kappa[i-1]+w*(t.kappa[i]-t.kappa[i-1]))
}

// ValidRangeHz returns the first and last tabulated frequency.
func (t *Tabulated) ValidRangeHz() (minHz, maxHz float64) {
	return t.freqHz[0], t.freqHz[len(t.freqHz)-1]
}

// Points returns copies of the tabulated frequencies (Hz), n and κ.
func (t *Tabulated) Points() (freqHz, n, kappa []float64) {
	return append([]float64(nil), t.freqHz...), append([]float64(nil), t.n...), append([]float64(nil), t.kappa...)
}

// validator is implemented by media that can check their own parameters.
type validator interface{ Validate() error }

// checkMedium validates a medium once, before any frequency is computed.
func checkMedium(field, name string, m Medium) error {
	if m == nil {
		return inputErrN(field, name, "no medium given")
	}
	if v, ok := m.(validator); ok {
		if err := v.Validate(); err != nil {
			return inputErrN(field, name, "%v", err)
		}
	}
	return nil
}

// goodIndex is the allocation-free test behind checkIndex, for hot loops.
func goodIndex(n complex128) bool {
	return finiteC(n) && imag(n) >= 0 && n != 0
}

// checkIndex refuses, per frequency, an index that a medium returned and that
// cannot be computed with: not finite (a NaN parameter, an undamped
// oscillator hit exactly at resonance) or κ < 0 (gain).
func checkIndex(field, name string, freqHz float64, n complex128) error {
	if goodIndex(n) {
		return nil
	}
	if !finiteC(n) {
		return inputErrN(field, name, "index is %v at %g Hz (not finite)", n, freqHz)
	}
	if imag(n) < 0 {
		return inputErrN(field, name, "κ = %g < 0 at %g Hz: a passive medium has κ >= 0 (time dependence e^{-iωt})", imag(n), freqHz)
	}
	return inputErrN(field, name, "index is 0 at %g Hz (ε = 0 cannot carry a wave)", freqHz)
}
