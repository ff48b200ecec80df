package phononmode

import (
	"errors"
	"math"
	"testing"

	"thzdrive/units"
)

// scaledDrive returns the chain scale → field (the pulse's peak field in
// V/m) → Drive → quantity, as a caller composes it.
func scaledDrive(t testing.TB, m Mode, shape Field, q Quantity) Achieved {
	var s Solver
	var r Result
	f := Field{StartS: shape.StartS, StepS: shape.StepS, VPerM: make([]float64, len(shape.VPerM))}
	peak := maxAbs(shape.VPerM)
	return func(scale float64) (float64, error) {
		for i, v := range shape.VPerM {
			f.VPerM[i] = v / peak * scale
		}
		if err := s.Drive(m, f, Options{}, &r); err != nil {
			return 0, err
		}
		return q.Of(&r), nil
	}
}

// Sizing inverts driving (requirement): driving at the returned scale
// reproduces the target within 1e-6 for a linear mode (exact scaling,
// Q ∝ E and energy ∝ E², Landau & Lifshitz §26: the equation is linear
// from rest) and within 1e-4 for a nonlinear one (Brent to 1e-6).
func TestSizingInvertsDriving(t *testing.T) {
	gaas := gaasMode(t)
	shape := singleCycle(1, 1/gaas.OmegaRadPerS(), 1e-12, 0, 10e-15, 2048)
	nl, nlField, _ := loadODEReference(t)
	cases := []struct {
		name    string
		m       Mode
		shape   Field
		q       Quantity
		target  float64
		linear  bool
		tol     float64
		maxFact float64
	}{
		{"GaAs max|Q|", gaas, shape, MaxQ, 0.01 * units.AngstromSqrtAmu, true, 1e-6, 1e10},
		{"GaAs displacement 1 pm", gaas, shape, IonDisplacement, 1 * units.Pm, true, 1e-6, 1e10},
		{"GaAs 0.1 quanta", gaas, shape, QuantaPerCell, 0.1, true, 1e-6, 1e10},
		{"nonlinear max|Q|", nl, nlField, MaxQ, 1.0e-23, false, 1e-4, 1e9},
		{"nonlinear quanta", nl, nlField, QuantaPerCell, 2, false, 1e-4, 1e9},
	}
	for _, c := range cases {
		ach := scaledDrive(t, c.m, c.shape, c.q)
		var sz Sizing
		var err error
		if c.linear {
			sz, err = SizeLinear(ach, c.target, c.q.LinearPower(), c.maxFact)
		} else {
			sz, err = SizeNonlinear(ach, c.target, c.maxFact, 0)
		}
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		got, err := ach(sz.Scale)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got/c.target-1) > c.tol {
			t.Errorf("%s: scale %.6g V/m reaches %.9g, target %.9g", c.name, sz.Scale, got, c.target)
		}
		t.Logf("%s: %.4g kV/cm, %d evaluations, error %.2g", c.name, sz.Scale/units.KVPerCm, sz.Evaluations, got/c.target-1)
	}
}

// No scale up to the maximum reaches the target: ErrUnreachable, with the
// maximum and the value it reaches (common practice).
func TestSizingUnreachable(t *testing.T) {
	gaas := gaasMode(t)
	shape := singleCycle(1, 1/gaas.OmegaRadPerS(), 1e-12, 0, 10e-15, 1024)
	ach := scaledDrive(t, gaas, shape, IonDisplacement)
	maxScale := 10 * units.KVPerCm
	atMax, err := ach(maxScale)
	if err != nil {
		t.Fatal(err)
	}
	for _, lin := range []bool{true, false} {
		var sz Sizing
		if lin {
			sz, err = SizeLinear(ach, 2*atMax, 1, maxScale)
		} else {
			sz, err = SizeNonlinear(ach, 2*atMax, maxScale, 0)
		}
		if !errors.Is(err, ErrUnreachable) {
			t.Errorf("linear=%v: err = %v, want ErrUnreachable", lin, err)
		}
		if sz.Scale != maxScale || math.Abs(sz.Achieved/atMax-1) > 1e-12 {
			t.Errorf("linear=%v: reported scale %g achieving %g, want %g achieving %g", lin, sz.Scale, sz.Achieved, maxScale, atMax)
		}
	}
	if _, err := SizeLinear(ach, math.NaN(), 1, maxScale); !errors.Is(err, ErrInvalidInput) {
		t.Errorf("NaN target: err = %v", err)
	}
	if _, err := SizeNonlinear(nil, 1, maxScale, 0); !errors.Is(err, ErrInvalidInput) {
		t.Errorf("nil function: err = %v", err)
	}
	if _, err := SizeNonlinear(ach, 1, -1, 0); !errors.Is(err, ErrInvalidInput) {
		t.Errorf("negative maximum: err = %v", err)
	}
}

// Brent's method on classic test equations: Wallis's x³ − 2x − 5 = 0, root
// 2.0945514815423265 (the example most numerical texts use; value from
// memory), and cos x = x, root 0.7390851332151607 (the Dottie number, from
// memory). With no x tolerance beyond round-off, Brent stops when the
// bracket is narrower than 8ε|x| (ε = 2⁻⁵²), the tolerance used. A
// discontinuous sign change (a step) converges to the jump.
func TestBrent(t *testing.T) {
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		root float64
		tol  float64
	}{
		{"Wallis cubic", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265, 8 * 0x1p-52 * 2.1},
		{"cos x = x", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607, 8 * 0x1p-52 * 0.74},
		{"step at 0.3", func(x float64) float64 {
			if x < 0.3 {
				return -1
			}
			return 1
		}, 0, 1, 0.3, 1e-12},
	}
	for _, c := range cases {
		n := 0
		g := func(x float64) (float64, error) { n++; return c.f(x), nil }
		x, _, err := brent(g, c.a, c.b, c.f(c.a), c.f(c.b), 0, 0, 200)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if math.Abs(x-c.root) > c.tol {
			t.Errorf("%s: root %.17g, want %.17g", c.name, x, c.root)
		}
		if n > 60 {
			t.Errorf("%s: %d evaluations", c.name, n)
		}
	}
	if _, _, err := brent(func(x float64) (float64, error) { return x*x + 1, nil }, -1, 1, 2, 2, 0, 1e-13, 50); err == nil {
		t.Error("no error for an interval that brackets no root")
	}
}
