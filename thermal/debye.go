package thermal

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/integrate/quad"

	"thzdrive/units"
)

// Debye is the Debye model of the lattice heat capacity of a solid with n
// atoms per unit volume and Debye temperature Θ (Debye, Ann. Phys. 344, 789
// (1912); any solid-state text, e.g. Kittel, Introduction to Solid State
// Physics, ch. 5):
//
//	C(T) = 9 n kB (T/Θ)^3 ∫_0^{Θ/T} x^4 e^x/(e^x - 1)^2 dx
//	     = 3 n kB [4 D3(Θ/T) - 3 (Θ/T)/(e^{Θ/T} - 1)],
//
// the second line by parts, with the Debye function of order three
//
//	D3(y) = (3/y^3) ∫_0^y x^3/(e^x - 1) dx.
//
// Its thermal energy (without the zero-point term, which cancels in every
// difference) is U(T) = 3 n kB T D3(Θ/T), so the enthalpy between two
// temperatures is the closed form U(T1) - U(T0).
//
// Limits: the T^3 law C = (12π^4/5) n kB (T/Θ)^3 for T ≪ Θ, and Dulong–Petit
// C = 3 n kB for T ≫ Θ. The model holds the lattice only: electrons (γT in
// metals) and magnetic or other ordering contributions are not in it; give a
// Table for those.
//
// The zero value is not usable; build one with NewDebye.
type Debye struct {
	debyeTemperatureK float64
	atomsPerM3        float64
}

// NewDebye returns the Debye model for Debye temperature debyeTemperatureK
// (K) and atomsPerM3 atoms (not formula units) per cubic metre. Both must be
// finite and positive.
func NewDebye(debyeTemperatureK, atomsPerM3 float64) (Debye, error) {
	if !(debyeTemperatureK > 0) || math.IsInf(debyeTemperatureK, 0) {
		return Debye{}, fmt.Errorf("thermal: Debye temperature must be finite and > 0 K (got %g)", debyeTemperatureK)
	}
	if !(atomsPerM3 > 0) || math.IsInf(atomsPerM3, 0) {
		return Debye{}, fmt.Errorf("thermal: atom density must be finite and > 0 per m^3 (got %g)", atomsPerM3)
	}
	return Debye{debyeTemperatureK: debyeTemperatureK, atomsPerM3: atomsPerM3}, nil
}

// DebyeTemperatureK is Θ in kelvin.
func (d Debye) DebyeTemperatureK() float64 { return d.debyeTemperatureK }

// AtomsPerM3 is the atom density n in 1/m^3.
func (d Debye) AtomsPerM3() float64 { return d.atomsPerM3 }

// DulongPetitJPerM3K is the high-temperature limit 3 n kB in J/(m^3 K).
func (d Debye) DulongPetitJPerM3K() float64 { return 3 * d.atomsPerM3 * units.Boltzmann }

func (d Debye) check(temperatureK float64) error {
	if d.debyeTemperatureK <= 0 {
		return fmt.Errorf("thermal: Debye model not initialised; build it with NewDebye")
	}
	if !(temperatureK >= 0) || math.IsInf(temperatureK, 0) {
		return fmt.Errorf("%w: temperature %g K; the Debye model needs a finite T >= 0", ErrOutOfRange, temperatureK)
	}
	return nil
}

// CapacityJPerM3K returns C(T) in J/(m^3 K); C(0) = 0.
func (d Debye) CapacityJPerM3K(temperatureK float64) (float64, error) {
	if err := d.check(temperatureK); err != nil {
		return 0, err
	}
	if temperatureK == 0 {
		return 0, nil
	}
	return d.DulongPetitJPerM3K() * DebyeCapacityRatio(d.debyeTemperatureK/temperatureK), nil
}

// EnthalpyJPerM3 returns ∫_{fromK}^{toK} C dT = U(toK) - U(fromK) in J/m^3.
//
// The difference of two energies loses relative accuracy on a short
// interval, about 1e-16·T/|toK - fromK|. So on intervals shorter than 5 % of
// the lower temperature the integral of C is taken directly instead, by
// 8-point Gauss–Legendre quadrature: C(T) is analytic in a neighbourhood of
// the interval that reaches 20 interval half-widths away (its singularities
// lie on the imaginary T axis), so the rule's error is far below round-off
// (Trefethen, SIAM Rev. 50, 67 (2008)). Either way the result
// is accurate to about 1e-14 relative.
func (d Debye) EnthalpyJPerM3(fromK, toK float64) (float64, error) {
	if err := d.check(fromK); err != nil {
		return 0, err
	}
	if err := d.check(toK); err != nil {
		return 0, err
	}
	if fromK == toK {
		return 0, nil
	}
	lo, hi := math.Min(fromK, toK), math.Max(fromK, toK)
	if hi-lo <= debyeShortInterval*lo {
		// A short interval: integrate C directly, no cancellation.
		var s float64
		for i, x := range debyeShortNodes {
			s += debyeShortWeights[i] * DebyeCapacityRatio(d.debyeTemperatureK/(lo+(hi-lo)*x))
		}
		h := d.DulongPetitJPerM3K() * (hi - lo) * s
		if toK < fromK {
			h = -h
		}
		return h, nil
	}
	return d.DulongPetitJPerM3K() * (d.energyOver3nkB(toK) - d.energyOver3nkB(fromK)), nil
}

// RangeK is [0, +Inf): the model is defined at every temperature.
func (d Debye) RangeK() (lowK, highK float64) { return 0, math.Inf(1) }

// energyOver3nkB is U(T)/(3 n kB) = T D3(Θ/T), in kelvin.
func (d Debye) energyOver3nkB(temperatureK float64) float64 {
	if temperatureK == 0 {
		return 0
	}
	theta := d.debyeTemperatureK
	y := theta / temperatureK
	if y <= debyeSplit {
		return temperatureK * DebyeFunction3(y)
	}
	// T D3 = 3 I3(y) T (T/Θ)^3, written so that neither y^3 nor T^4 overflows.
	r := temperatureK / theta
	return 3 * debyeIntegral3(y) * temperatureK * r * r * r
}

// DebyeCapacityRatio returns C/(3 n kB) of the Debye model at y = Θ/T:
//
//	(3/y^3) ∫_0^y x^4 e^x/(e^x - 1)^2 dx = 4 D3(y) - 3y/(e^y - 1).
//
// It is 1 at y = 0 (Dulong–Petit) and (4π^4/5)/y^3 for large y (T^3 law).
// Accuracy: relative error below 1e-13 for all y >= 0 (checked against
// QUADPACK through scipy in the tests). It returns NaN for negative or NaN y.
func DebyeCapacityRatio(y float64) float64 {
	switch {
	case !(y >= 0):
		return math.NaN()
	case y < debyeSeriesMax:
		// 1 - y^2/20 + y^4/560 - ...; the next term is O(y^6) < 1e-19 here.
		y2 := y * y
		return 1 - y2/20 + y2*y2/560
	case math.IsInf(y, 1):
		return 0
	}
	// 3y/(e^y - 1) as 3y e^-y/(1 - e^-y): no overflow for large y.
	return 4*DebyeFunction3(y) - 3*y*math.Exp(-y)/(-math.Expm1(-y))
}

// DebyeFunction3 returns the Debye function D3(y) = (3/y^3) ∫_0^y x^3/(e^x-1) dx
// (Abramowitz & Stegun, ch. 27.1). D3(0) = 1; D3(y) → π^4/(5 y^3) for large y.
// Accuracy: relative error below 1e-13 for all y >= 0 (checked against
// QUADPACK through scipy in the tests). It returns NaN for negative or NaN y.
func DebyeFunction3(y float64) float64 {
	switch {
	case !(y >= 0):
		return math.NaN()
	case y < debyeSeriesMax:
		// The Bernoulli series of the integrand (Abramowitz & Stegun,
		// ch. 27.1) with B2 = 1/6, B4 = -1/30:
		// 1 - 3y/8 + y^2/20 - y^4/1680 + O(y^6).
		y2 := y * y
		return 1 - 3*y/8 + y2/20 - y2*y2/1680
	case math.IsInf(y, 1):
		return 0
	}
	return 3 * debyeIntegral3(y) / (y * y * y)
}

const (
	// debyeSeriesMax bounds the argument below which the short series are
	// used; their truncation error there is below 1e-19.
	debyeSeriesMax = 1e-3
	// debyeSplit divides the Gauss–Legendre quadrature (below) from the
	// exponential series of the tail (above).
	debyeSplit = 3.0
	// debyeTailNegligible is where the tail ∫_y^∞ x^3/(e^x-1) dx, about
	// y^3 e^-y, falls below 1e-300 of π^4/15; beyond it I3 is π^4/15.
	debyeTailNegligible = 800.0
)

// debyeNodes and debyeWeights are the 24-point Gauss–Legendre rule on [0, 1].
// On [0, y] with y <= 3 the integrand x^3/(e^x-1) is analytic within
// |Im x| < 2π, so the rule converges geometrically, here far below round-off
// (Trefethen, SIAM Rev. 50, 67 (2008)).
var debyeNodes, debyeWeights = func() ([]float64, []float64) {
	x := make([]float64, 24)
	w := make([]float64, 24)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	return x, w
}()

// debyeShortInterval is the relative width below which EnthalpyJPerM3
// integrates C by quadrature rather than differencing energies.
const debyeShortInterval = 0.05

// debyeShortNodes and debyeShortWeights are the 8-point Gauss–Legendre rule
// on [0, 1], for the enthalpy over short intervals.
var debyeShortNodes, debyeShortWeights = func() ([]float64, []float64) {
	x := make([]float64, 8)
	w := make([]float64, 8)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	return x, w
}()

// debyeIntegral3 returns I3(y) = ∫_0^y x^3/(e^x-1) dx for y > 0.
//
// For y <= debyeSplit: Gauss–Legendre quadrature. Above: I3 = π^4/15 - tail,
// with ∫_0^∞ x^3/(e^x-1) dx = Γ(4)ζ(4) = π^4/15 and, expanding
// 1/(e^x-1) = Σ_k e^{-kx},
//
//	tail = ∫_y^∞ x^3/(e^x-1) dx = Σ_{k>=1} e^{-ky} (y^3/k + 3y^2/k^2 + 6y/k^3 + 6/k^4),
//
// whose terms fall by e^{-y} < 0.05 each.
func debyeIntegral3(y float64) float64 {
	if y <= debyeSplit {
		var s float64
		for i, x := range debyeNodes {
			xi := y * x
			s += debyeWeights[i] * xi * xi * xi / math.Expm1(xi)
		}
		return y * s
	}
	const full = math.Pi * math.Pi * math.Pi * math.Pi / 15
	if y >= debyeTailNegligible {
		return full
	}
	var tail float64
	e1 := math.Exp(-y)
	ek := 1.0
	for k := 1; k <= 64; k++ {
		ek *= e1
		q := 1 / float64(k)
		term := ek * q * (((y+3*q)*y+6*q*q)*y + 6*q*q*q)
		tail += term
		if term <= 1e-17*tail {
			break
		}
	}
	return full - tail
}
