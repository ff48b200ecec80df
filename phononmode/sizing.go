package phononmode

import (
	"fmt"
	"math"
)

// Quantity is what a sizing target is expressed in.
type Quantity int

const (
	// MaxQ is max|Q| at the surface, m·√kg.
	MaxQ Quantity = iota + 1
	// IonDisplacement is the peak ion displacement max|Q|/√M_eff, m.
	IonDisplacement
	// QuantaPerCell is the mode energy after the pulse in quanta ħW.
	QuantaPerCell
)

// LinearPower is the power p with which the quantity grows with the field
// scale s for a linear mode: Q(s·E) = s·Q(E) because the equation of motion
// is linear and starts from rest, so max|Q| and the displacement go as s¹
// and the energy, quadratic in Q and Q', as s².
func (q Quantity) LinearPower() float64 {
	if q == QuantaPerCell {
		return 2
	}
	return 1
}

// Of reads the quantity from a result.
func (q Quantity) Of(r *Result) float64 {
	switch q {
	case MaxQ:
		return r.MaxAbsQMSqrtKg
	case IonDisplacement:
		return r.DisplacementM
	case QuantaPerCell:
		return r.Quanta
	}
	return math.NaN()
}

// Achieved maps a field scale (the caller's choice: incident peak field in
// V/m, pulse energy, …) to the value of the target quantity it reaches. The
// caller composes the chain source → optics → field inside → Drive.
type Achieved func(scale float64) (float64, error)

// Sizing is the answer of a sizing search.
type Sizing struct {
	// Scale is the smallest field scale found that reaches the target.
	// With ErrUnreachable it is the caller's maximum.
	Scale float64
	// Achieved is the value at Scale: the target for SizeLinear (exact by
	// linearity), the evaluated value for SizeNonlinear, and with
	// ErrUnreachable the best value within the maximum.
	Achieved float64
	// Evaluations counts the calls of the Achieved function.
	Evaluations int
}

// SizeLinear finds the scale that reaches target for a chain that is
// homogeneous of degree power in the scale (Quantity.LinearPower: the optics
// are linear in the field, and so is a mode without a3, a4 and ∂ε/∂Q). One
// evaluation at maxScale fixes it exactly:
//
//	s = maxScale · (target / a(maxScale))^{1/power}.
//
// It returns ErrUnreachable, with Scale = maxScale and the value reached
// there, when s would exceed maxScale or the chain does not respond at all.
// Homogeneity is the caller's claim; SizeNonlinear makes none.
func SizeLinear(achieved Achieved, target, power, maxScale float64) (Sizing, error) {
	if err := checkSizing(achieved, target, maxScale); err != nil {
		return Sizing{}, err
	}
	if !finite(power) || power <= 0 {
		return Sizing{}, inputErr("power", "%g: must be finite and > 0", power)
	}
	a, err := achieved(maxScale)
	if err != nil {
		return Sizing{}, err
	}
	if !finite(a) || a < 0 {
		return Sizing{}, fmt.Errorf("phononmode: the achieved value at the maximum scale is %g", a)
	}
	if a < target {
		return Sizing{Scale: maxScale, Achieved: a, Evaluations: 1},
			fmt.Errorf("%w: the maximum scale %g reaches %g of the target %g", ErrUnreachable, maxScale, a, target)
	}
	return Sizing{Scale: maxScale * math.Pow(target/a, 1/power), Achieved: target, Evaluations: 1}, nil
}

// SizeNonlinear finds the smallest scale in (0, maxScale] at which the
// achieved value reaches target, for a chain of unknown form.
//
// Bracketing: the scale is doubled from maxScale/1024 (halved first while
// that already reaches the target) until the value crosses the target or
// maxScale is passed; a crossing between grid points closer than a factor 2
// can be missed when the response is not monotonic there. The crossing is
// then located by Brent's method to |a(s) − target| <= relTol·target
// (relTol = 0 means 1e-6), or to a bracket of relative width 1e-13 when a(s)
// jumps. ErrUnreachable, with the best value found, when no scale up to
// maxScale reaches the target.
func SizeNonlinear(achieved Achieved, target, maxScale, relTol float64) (Sizing, error) {
	if err := checkSizing(achieved, target, maxScale); err != nil {
		return Sizing{}, err
	}
	if relTol == 0 {
		relTol = 1e-6
	}
	if !finite(relTol) || relTol < 0 || relTol >= 1 {
		return Sizing{}, inputErr("relTol", "%g: must be in [0, 1)", relTol)
	}
	evals := 0
	g := func(s float64) (float64, error) {
		evals++
		a, err := achieved(s)
		if err != nil {
			return 0, err
		}
		if !finite(a) {
			return 0, fmt.Errorf("phononmode: the achieved value at scale %g is %g", s, a)
		}
		return a - target, nil
	}

	lo := maxScale / 1024
	flo, err := g(lo)
	if err != nil {
		return Sizing{}, err
	}
	for i := 0; flo >= 0; i++ {
		if i == 60 {
			return Sizing{Scale: lo, Achieved: flo + target, Evaluations: evals},
				fmt.Errorf("phononmode: the target %g is reached already at scale %g; the achieved value does not vanish with the field", target, lo)
		}
		lo /= 2
		if flo, err = g(lo); err != nil {
			return Sizing{}, err
		}
	}
	best := flo
	for {
		hi := math.Min(2*lo, maxScale)
		fhi, err := g(hi)
		if err != nil {
			return Sizing{}, err
		}
		best = math.Max(best, fhi)
		if fhi >= 0 {
			root, froot, err := brent(g, lo, hi, flo, fhi, relTol*target, 1e-13, 200)
			if err != nil {
				return Sizing{}, err
			}
			return Sizing{Scale: root, Achieved: froot + target, Evaluations: evals}, nil
		}
		if hi >= maxScale {
			return Sizing{Scale: maxScale, Achieved: best + target, Evaluations: evals},
				fmt.Errorf("%w: no scale up to %g reaches the target %g (best %g)", ErrUnreachable, maxScale, target, best+target)
		}
		lo, flo = hi, fhi
	}
}

func checkSizing(achieved Achieved, target, maxScale float64) error {
	switch {
	case achieved == nil:
		return inputErr("achieved", "a function is required")
	case !finite(target) || target <= 0:
		return inputErr("target", "%g: must be finite and > 0", target)
	case !finite(maxScale) || maxScale <= 0:
		return inputErr("maxScale", "%g: must be finite and > 0", maxScale)
	}
	return nil
}

// brent finds a zero of f in [a, b], where f(a) = fa and f(b) = fb have
// opposite signs (or one is zero), by Brent's method (R. P. Brent,
// Algorithms for Minimization without Derivatives (1973), ch. 4): inverse
// quadratic interpolation or the secant step when they stay inside the
// bracket and shrink it fast enough, bisection otherwise, so it converges
// at least as surely as bisection. It stops when |f| <= fTol or the bracket
// is narrower than 2·(4ε|b| + xRelTol·|b|), and returns the best point and
// its f.
func brent(f func(float64) (float64, error), a, b, fa, fb, fTol, xRelTol float64, maxIter int) (float64, float64, error) {
	if (fa > 0) == (fb > 0) && fa != 0 && fb != 0 {
		return 0, 0, fmt.Errorf("phononmode: brent: f(%g) = %g and f(%g) = %g do not bracket a root", a, fa, b, fb)
	}
	const eps = 0x1p-52
	c, fc := a, fa
	d := b - a
	e := d
	for range maxIter {
		if (fb > 0) == (fc > 0) {
			// Keep the root between b and c.
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol := 4*eps*math.Abs(b) + xRelTol*math.Abs(b)
		m := 0.5 * (c - b)
		if math.Abs(fb) <= fTol || math.Abs(m) <= tol {
			return b, fb, nil
		}
		if math.Abs(e) >= tol && math.Abs(fa) > math.Abs(fb) {
			// Interpolate: secant when a == c, inverse quadratic otherwise.
			var p, q float64
			sb := fb / fa
			if a == c {
				p = 2 * m * sb
				q = 1 - sb
			} else {
				qa := fa / fc
				rb := fb / fc
				p = sb * (2*m*qa*(qa-rb) - (b-a)*(rb-1))
				q = (qa - 1) * (rb - 1) * (sb - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d, e = m, m
			}
		} else {
			d, e = m, m
		}
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else {
			b += math.Copysign(tol, m)
		}
		var err error
		if fb, err = f(b); err != nil {
			return 0, 0, err
		}
	}
	return b, fb, fmt.Errorf("phononmode: brent: no convergence in %d iterations", maxIter)
}
