package thermal

import (
	"fmt"
	"math"
)

// solveRelTol is the relative tolerance on the energy balance at which
// FinalTemperatureK stops: |H(T0, T1) - u| <= solveRelTol·u.
const solveRelTol = 1e-13

// FinalTemperatureK returns the temperature T1 (K) that a sample at startK
// reaches when it absorbs energyDensityJPerM3 (J/m^3) with no time to lose
// any of it, that is the root of the energy balance
//
//	∫_{startK}^{T1} C(T) dT = u.
//
// This is the adiabatic single-pulse limit: the deposited energy stays where
// it was absorbed, which holds while the pulse and the electron–phonon
// equilibration (ps) are short compared with heat diffusion out of the
// heated volume (ns and longer for µm-scale depths). The answer is the
// lattice temperature once electrons and phonons have equilibrated; it is
// not the transient electron temperature.
//
// The enthalpy increases strictly with T1 (C > 0), so the root is unique. A
// Constant model is solved in closed form, T1 = startK + u/C. Any other model
// is bracketed, starting from startK + u/C(startK) and doubling the step,
// then solved by Newton's method on the enthalpy (its derivative is C)
// safeguarded by bisection whenever a step leaves the bracket or fails to
// halve the residual (Press et al., Numerical Recipes, 3rd ed., §9.4). It
// stops when |∫ C dT - u| <= 1e-13·u, or when the bracket has closed to
// adjacent floating-point numbers, returning the end with the smaller
// residual; the result is then as exact as the model's enthalpy allows.
//
// Errors: a nil model, a start outside the model's range, a negative or
// non-finite u, or a u that would heat past the top of the model's range
// (a Table) or past float64.
func FinalTemperatureK(model HeatCapacity, startK, energyDensityJPerM3 float64) (float64, error) {
	if model == nil {
		return 0, fmt.Errorf("thermal: no heat-capacity model")
	}
	u := energyDensityJPerM3
	if !(u >= 0) || math.IsInf(u, 0) {
		return 0, fmt.Errorf("thermal: energy density must be finite and >= 0 J/m^3 (got %g)", u)
	}
	c0, err := model.CapacityJPerM3K(startK)
	if err != nil {
		return 0, err
	}
	if u == 0 {
		return startK, nil
	}
	if c, ok := model.(Constant); ok {
		t1 := startK + u/c.capacityJPerM3K
		if !isFinite(t1) {
			return 0, fmt.Errorf("thermal: energy density %g J/m^3 heats beyond float64", u)
		}
		return t1, nil
	}

	residual := func(t float64) (float64, error) {
		h, err := model.EnthalpyJPerM3(startK, t)
		if err != nil {
			return 0, err
		}
		if !isFinite(h) {
			return 0, fmt.Errorf("thermal: enthalpy to %g K overflows float64", t)
		}
		return h - u, nil
	}

	// Bracket the root: lo below, hi at or above.
	_, topK := model.RangeK()
	step := u / c0
	if !(step > 0) || !isFinite(step) {
		step = math.Max(startK, 1)
	}
	lo, flo := startK, -u
	var hi, fhi float64
	for i := 0; ; i++ {
		if i > 4096 {
			return 0, fmt.Errorf("thermal: could not bracket the temperature for %g J/m^3", u)
		}
		hi = startK + step
		if !isFinite(hi) {
			return 0, fmt.Errorf("thermal: energy density %g J/m^3 heats beyond float64", u)
		}
		atTop := false
		if hi >= topK {
			hi, atTop = topK, true
		}
		fhi, err = residual(hi)
		if err != nil {
			return 0, err
		}
		if fhi >= 0 {
			break
		}
		if atTop {
			return 0, fmt.Errorf("%w: %g J/m^3 from %g K heats past %g K, the top of the heat-capacity model's range (%g J/m^3 short)",
				ErrOutOfRange, u, startK, topK, -fhi)
		}
		lo, flo = hi, fhi
		step *= 2
	}
	if fhi == 0 {
		return hi, nil
	}

	// Safeguarded Newton inside [lo, hi], started by false position.
	x := lo - flo*(hi-lo)/(fhi-flo)
	prev := math.Inf(1)
	for iter := 0; iter < 200; iter++ {
		if !(x > lo && x < hi) {
			x = lo + (hi-lo)/2
			if !(x > lo && x < hi) {
				break // the bracket is two adjacent floats
			}
		}
		fx, err := residual(x)
		if err != nil {
			return 0, err
		}
		if fx < 0 {
			lo, flo = x, fx
		} else {
			hi, fhi = x, fx
		}
		if math.Abs(fx) <= solveRelTol*u {
			return x, nil
		}
		cx, err := model.CapacityJPerM3K(x)
		if err != nil {
			return 0, err
		}
		next := math.NaN()
		if cx > 0 && math.Abs(fx) <= prev/2 {
			next = x - fx/cx
		}
		prev = math.Abs(fx)
		x = next // NaN falls through to bisection above
	}
	if -flo < fhi {
		return lo, nil
	}
	return hi, nil
}
