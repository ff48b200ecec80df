package thermal

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// ErrOutOfRange is wrapped by the errors a heat-capacity model returns for a
// temperature it does not cover (below 0 K, or outside a Table).
var ErrOutOfRange = errors.New("thermal: temperature outside the heat-capacity model's range")

// HeatCapacity is a volumetric heat capacity C(T) in J/(m^3 K) with its
// enthalpy integral. Constant, Table and Debye implement it; a caller may
// supply its own, provided C is positive inside RangeK (zero is allowed only
// at 0 K), so that the enthalpy increases strictly with temperature.
type HeatCapacity interface {
	// CapacityJPerM3K returns C(T) in J/(m^3 K).
	CapacityJPerM3K(temperatureK float64) (float64, error)
	// EnthalpyJPerM3 returns ∫_{fromK}^{toK} C(T) dT in J/m^3, negative
	// when toK < fromK.
	EnthalpyJPerM3(fromK, toK float64) (float64, error)
	// RangeK returns the closed interval of temperatures on which the model
	// is defined; highK may be +Inf.
	RangeK() (lowK, highK float64)
}

// Constant is a temperature-independent volumetric heat capacity: the
// enthalpy is C (T1 - T0) and a pulse of energy density u raises the
// temperature by exactly u/C. It is a fair model well above the Debye
// temperature (Dulong–Petit) or for small rises; near a phase transition,
// where C has a peak, it is not.
//
// The zero value is not usable; build one with NewConstant.
type Constant struct {
	capacityJPerM3K float64
}

// NewConstant returns the constant model C = capacityJPerM3K, which must be
// finite and positive (J/(m^3 K): specific heat in J/(kg K) times density in
// kg/m^3).
func NewConstant(capacityJPerM3K float64) (Constant, error) {
	if !(capacityJPerM3K > 0) || math.IsInf(capacityJPerM3K, 0) {
		return Constant{}, fmt.Errorf("thermal: heat capacity must be finite and > 0 J/(m^3 K) (got %g)", capacityJPerM3K)
	}
	return Constant{capacityJPerM3K: capacityJPerM3K}, nil
}

func (c Constant) check(temperatureK float64) error {
	if c.capacityJPerM3K <= 0 {
		return fmt.Errorf("thermal: constant heat capacity not initialised; build it with NewConstant")
	}
	if !(temperatureK >= 0) || math.IsInf(temperatureK, 0) {
		return fmt.Errorf("%w: temperature %g K; a heat capacity needs a finite T >= 0", ErrOutOfRange, temperatureK)
	}
	return nil
}

// CapacityJPerM3K returns C in J/(m^3 K), the same at every temperature.
func (c Constant) CapacityJPerM3K(temperatureK float64) (float64, error) {
	if err := c.check(temperatureK); err != nil {
		return 0, err
	}
	return c.capacityJPerM3K, nil
}

// EnthalpyJPerM3 returns C (toK - fromK) in J/m^3.
func (c Constant) EnthalpyJPerM3(fromK, toK float64) (float64, error) {
	if err := c.check(fromK); err != nil {
		return 0, err
	}
	if err := c.check(toK); err != nil {
		return 0, err
	}
	return c.capacityJPerM3K * (toK - fromK), nil
}

// RangeK is [0, +Inf).
func (c Constant) RangeK() (lowK, highK float64) { return 0, math.Inf(1) }

// Table is a measured or computed heat capacity C(T_i), interpolated between
// the points by the monotone piecewise-cubic Hermite interpolant (PCHIP) of
// Fritsch & Carlson (SIAM J. Numer. Anal. 17, 238 (1980)) with the slopes of
// Fritsch & Butland (SIAM J. Sci. Stat. Comput. 5, 300 (1984)): a weighted
// harmonic mean of the neighbouring secants inside, zero at a local extremum,
// and the three-point one-sided formula at the ends, limited to keep the
// shape. These are the slopes of Moler's pchip and of scipy's
// PchipInterpolator, which the tests use as reference. The interpolant is
// monotone wherever the data are, never overshoots them, so C stays positive
// between positive points, and its integral is exact, so the enthalpy is a
// closed form on each interval.
//
// Outside [T_0, T_last] a Table refuses: its methods return an error wrapping
// ErrOutOfRange that names the temperature and the table's range. It does
// not extrapolate, because the heat capacity of a real sample beyond its data
// (near a transition above the table, or at the T^3 tail below it) is exactly
// what a guess would get wrong. Extend the table instead, for instance to the
// Dulong–Petit value 3 n kB at high temperature.
//
// The zero value is an empty table whose methods return errors; build one
// with NewTable.
type Table struct {
	temperaturesK []float64
	capacities    []float64 // J/(m^3 K)
	slopes        []float64 // dC/dT at the points, J/(m^3 K^2)
	cumulative    []float64 // ∫_{T_0}^{T_i} C dT, J/m^3
}

// NewTable builds a Table from at least two points. temperaturesK must be
// finite, >= 0 and strictly increasing; capacitiesJPerM3K finite and > 0. The
// slices are copied.
func NewTable(temperaturesK, capacitiesJPerM3K []float64) (*Table, error) {
	n := len(temperaturesK)
	if n != len(capacitiesJPerM3K) {
		return nil, fmt.Errorf("thermal: table has %d temperatures but %d heat capacities", n, len(capacitiesJPerM3K))
	}
	if n < 2 {
		return nil, fmt.Errorf("thermal: table needs at least 2 points (got %d)", n)
	}
	for i, t := range temperaturesK {
		if !(t >= 0) || math.IsInf(t, 0) {
			return nil, fmt.Errorf("thermal: table temperature [%d] must be finite and >= 0 K (got %g)", i, t)
		}
		if i > 0 && !(t > temperaturesK[i-1]) {
			return nil, fmt.Errorf("thermal: table temperatures must increase strictly ([%d] = %g K after %g K)", i, t, temperaturesK[i-1])
		}
		c := capacitiesJPerM3K[i]
		if !(c > 0) || math.IsInf(c, 0) {
			return nil, fmt.Errorf("thermal: table heat capacity [%d] must be finite and > 0 J/(m^3 K) (got %g)", i, c)
		}
	}
	tab := &Table{
		temperaturesK: append([]float64(nil), temperaturesK...),
		capacities:    append([]float64(nil), capacitiesJPerM3K...),
	}
	tab.slopes = pchipSlopes(tab.temperaturesK, tab.capacities)
	for i, d := range tab.slopes {
		if !isFinite(d) {
			return nil, fmt.Errorf("thermal: table slope at [%d] (%g K) overflows float64; the points are too steep", i, tab.temperaturesK[i])
		}
	}
	tab.cumulative = make([]float64, n)
	for i := 0; i+1 < n; i++ {
		tab.cumulative[i+1] = tab.cumulative[i] + tab.partial(i, 1)
		if !isFinite(tab.cumulative[i+1]) {
			return nil, fmt.Errorf("thermal: table enthalpy overflows float64 by %g K", tab.temperaturesK[i+1])
		}
	}
	return tab, nil
}

// Points returns copies of the table's temperatures (K) and heat capacities
// (J/(m^3 K)).
func (t *Table) Points() (temperaturesK, capacitiesJPerM3K []float64) {
	return append([]float64(nil), t.temperaturesK...), append([]float64(nil), t.capacities...)
}

// RangeK is [T_0, T_last] of the table; for an empty table it is (0, 0).
func (t *Table) RangeK() (lowK, highK float64) {
	if len(t.temperaturesK) == 0 {
		return 0, 0
	}
	return t.temperaturesK[0], t.temperaturesK[len(t.temperaturesK)-1]
}

// locate returns the interval i (T_i <= T <= T_{i+1}) and the fraction s of
// the way across it.
func (t *Table) locate(temperatureK float64) (int, float64, error) {
	n := len(t.temperaturesK)
	if n < 2 {
		return 0, 0, fmt.Errorf("thermal: empty heat-capacity table; build it with NewTable")
	}
	lo, hi := t.temperaturesK[0], t.temperaturesK[n-1]
	if !(temperatureK >= lo && temperatureK <= hi) {
		return 0, 0, fmt.Errorf("%w: %g K is outside the table's %g K to %g K (extend the table)", ErrOutOfRange, temperatureK, lo, hi)
	}
	i := sort.SearchFloat64s(t.temperaturesK, temperatureK) - 1
	if i < 0 {
		i = 0
	}
	if i > n-2 {
		i = n - 2
	}
	h := t.temperaturesK[i+1] - t.temperaturesK[i]
	return i, (temperatureK - t.temperaturesK[i]) / h, nil
}

// CapacityJPerM3K returns the interpolated C(T) in J/(m^3 K).
func (t *Table) CapacityJPerM3K(temperatureK float64) (float64, error) {
	i, s, err := t.locate(temperatureK)
	if err != nil {
		return 0, err
	}
	// Cubic Hermite basis on [0, 1].
	h := t.temperaturesK[i+1] - t.temperaturesK[i]
	s2, s3 := s*s, s*s*s
	return (2*s3-3*s2+1)*t.capacities[i] + (s3-2*s2+s)*h*t.slopes[i] +
		(3*s2-2*s3)*t.capacities[i+1] + (s3-s2)*h*t.slopes[i+1], nil
}

// EnthalpyJPerM3 returns ∫_{fromK}^{toK} C dT of the interpolant in J/m^3,
// exact up to round-off.
func (t *Table) EnthalpyJPerM3(fromK, toK float64) (float64, error) {
	i0, s0, err := t.locate(fromK)
	if err != nil {
		return 0, err
	}
	i1, s1, err := t.locate(toK)
	if err != nil {
		return 0, err
	}
	if fromK == toK {
		return 0, nil
	}
	return (t.cumulative[i1] + t.partial(i1, s1)) - (t.cumulative[i0] + t.partial(i0, s0)), nil
}

// partial is the integral of the Hermite cubic of interval i from its left
// end over the fraction s of its width: the basis functions integrated from
// 0 to s, times the width h.
func (t *Table) partial(i int, s float64) float64 {
	h := t.temperaturesK[i+1] - t.temperaturesK[i]
	s2 := s * s
	s3 := s2 * s
	s4 := s2 * s2
	return h * (t.capacities[i]*(s-s3+s4/2) +
		h*t.slopes[i]*(s2/2-2*s3/3+s4/4) +
		t.capacities[i+1]*(s3-s4/2) +
		h*t.slopes[i+1]*(s4/4-s3/3))
}

// pchipSlopes returns the Fritsch–Butland slopes of the monotone Hermite
// interpolant through (x, y), len(x) >= 2.
func pchipSlopes(x, y []float64) []float64 {
	n := len(x)
	d := make([]float64, n)
	h := make([]float64, n-1)
	m := make([]float64, n-1)
	for i := range h {
		h[i] = x[i+1] - x[i]
		m[i] = (y[i+1] - y[i]) / h[i]
	}
	if n == 2 {
		d[0], d[1] = m[0], m[0]
		return d
	}
	for k := 1; k < n-1; k++ {
		a, b := m[k-1], m[k]
		if a == 0 || b == 0 || math.Signbit(a) != math.Signbit(b) {
			continue // local extremum or flat: zero slope keeps the shape
		}
		w1 := 2*h[k] + h[k-1]
		w2 := h[k] + 2*h[k-1]
		d[k] = (w1 + w2) / (w1/a + w2/b)
	}
	d[0] = pchipEnd(h[0], h[1], m[0], m[1])
	d[n-1] = pchipEnd(h[n-2], h[n-3], m[n-2], m[n-3])
	return d
}

// pchipEnd is the shape-preserving three-point end slope (Moler, Numerical
// Computing with MATLAB (2004), ch. 3).
func pchipEnd(h0, h1, m0, m1 float64) float64 {
	d := ((2*h0+h1)*m0 - h0*m1) / (h0 + h1)
	switch {
	case sign(d) != sign(m0):
		return 0
	case sign(m0) != sign(m1) && math.Abs(d) > 3*math.Abs(m0):
		return 3 * m0
	}
	return d
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

func sign(v float64) int {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}
