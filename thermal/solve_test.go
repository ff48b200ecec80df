package thermal

import (
	"errors"
	"math"
	"testing"

	"thzdrive/units"
)

// Energy bookkeeping with a constant C: the rise is u/C (derived: ∫ C dT =
// C ΔT), to round-off: within 2 ulps of T1.
func TestFinalTemperatureConstantExact(t *testing.T) {
	for _, tc := range []struct{ c, t0, u float64 }{
		{2.5e6, 300, 5e7},
		{1.6e6, 4.2, 3.3e3},
		{3.4e6, 10, 1e10},
		{1e3, 1e-3, 1e-9},
	} {
		m := mustConstant(t, tc.c)
		got, err := FinalTemperatureK(m, tc.t0, tc.u)
		if err != nil {
			t.Fatal(err)
		}
		want := tc.t0 + tc.u/tc.c
		if math.Abs(got-want) > 2*ulp(want) {
			t.Errorf("%+v: T1 = %.17g, want %.17g", tc, got, want)
		}
	}
}

// The general solver on a model whose answer is known: a table of equal
// values is the constant C (derived), so T1 = T0 + u/C. The solver stops at
// |∫C dT - u| <= 1e-13 u or at float resolution, so the tolerance is
// 1e-13·ΔT plus 4 ulps of T1.
func TestFinalTemperatureGeneralSolverOnFlatTable(t *testing.T) {
	const c = 1.2e6
	tab, err := NewTable([]float64{1, 50, 400, 2000}, []float64{c, c, c, c})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ t0, u float64 }{{4, 1e3}, {300, 6e7}, {1.5, 2.3e9}, {77, 1}} {
		got, err := FinalTemperatureK(tab, tc.t0, tc.u)
		if err != nil {
			t.Fatal(err)
		}
		want := tc.t0 + tc.u/c
		if math.Abs(got-want) > 1e-13*(want-tc.t0)+4*ulp(want) {
			t.Errorf("%+v: T1 = %.17g, want %.17g", tc, got, want)
		}
	}
}

// Energy bookkeeping with Debye C: the solution T1 put back into the
// enthalpy returns u within 1e-9 relative (the brief's round-trip
// tolerance; the solver aims at 1e-13), plus C(T1)·ulp(T1)/u: T1 is a
// float64, and for a rise of a few µK at 2000 K its spacing alone moves the
// enthalpy by more than 1e-9 of u (derived).
func TestFinalTemperatureDebyeRoundTrip(t *testing.T) {
	d := mustDebye(t, 343, 8.5e28)
	for _, t0 := range []float64{0, 0.3, 4, 20, 77, 300, 2000} {
		for _, u := range []float64{1e2, 1e4, 1e6, 1e8, 1e10} {
			t1, err := FinalTemperatureK(d, t0, u)
			if err != nil {
				t.Fatalf("T0 = %g, u = %g: %v", t0, u, err)
			}
			h, err := d.EnthalpyJPerM3(t0, t1)
			if err != nil {
				t.Fatal(err)
			}
			c1, _ := d.CapacityJPerM3K(t1)
			tol := 1e-9 + c1*ulp(t1)/u
			if e := relErr(h, u); e > tol {
				t.Errorf("T0 = %g K, u = %g J/m^3: T1 = %g K gives back %g (rel err %.2g > %.2g)", t0, u, t1, h, e, tol)
			}
		}
	}
}

// Deep in the T^3 regime the balance has a closed form: with C = b T^3,
// b = (12π^4/5) n kB/Θ^3, ∫ C dT = b (T1^4 - T0^4)/4, so
// T1 = (T0^4 + 4u/b)^(1/4) (derived from the T^3 law; Θ/T >= 100 here, where
// the law is exact to far below round-off). Tolerance 1e-12 relative.
func TestFinalTemperatureDebyeLowTemperatureClosedForm(t *testing.T) {
	const theta, n = 1000.0, 5e28
	d := mustDebye(t, theta, n)
	b := 12 * math.Pow(math.Pi, 4) / 5 * n * units.Boltzmann / (theta * theta * theta) // T^3 law
	for _, tc := range []struct{ t0, u float64 }{{1, 1e-2}, {2, 1}, {0.5, 3}} {
		want := math.Pow(math.Pow(tc.t0, 4)+4*tc.u/b, 0.25)
		if theta/want < 100 {
			t.Fatalf("case %+v leaves the T^3 regime (T1 = %g K)", tc, want)
		}
		got, err := FinalTemperatureK(d, tc.t0, tc.u)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(got, want); e > 1e-12 {
			t.Errorf("%+v: T1 = %.15g, want %.15g (rel err %.2g)", tc, got, want, e)
		}
	}
}

// Property: more energy, higher temperature; a warmer start, smaller rise for
// Debye C (C increases with T).
func TestFinalTemperatureMonotone(t *testing.T) {
	d := mustDebye(t, 250, 4e28)
	prev := 0.0
	for u := 1.0; u < 1e11; u *= 1.7 {
		t1, err := FinalTemperatureK(d, 10, u)
		if err != nil {
			t.Fatal(err)
		}
		if !(t1 > prev) {
			t.Fatalf("T1 not increasing with u at u = %g: %g <= %g", u, t1, prev)
		}
		prev = t1
	}
	prevRise := math.Inf(1)
	for t0 := 1.0; t0 < 3000; t0 *= 1.5 {
		t1, err := FinalTemperatureK(d, t0, 1e7)
		if err != nil {
			t.Fatal(err)
		}
		if rise := t1 - t0; !(rise < prevRise) {
			t.Fatalf("rise not decreasing with T0 at %g K: %g >= %g", t0, rise, prevRise)
		} else {
			prevRise = rise
		}
	}
}

func TestFinalTemperatureErrors(t *testing.T) {
	tab := loadReferenceTable(t)
	d := mustDebye(t, 300, 5e28)
	if _, err := FinalTemperatureK(nil, 10, 1); err == nil {
		t.Error("nil model: want an error")
	}
	for _, u := range []float64{-1, math.NaN(), math.Inf(1)} {
		if _, err := FinalTemperatureK(d, 10, u); err == nil {
			t.Errorf("u = %g: want an error", u)
		}
	}
	if _, err := FinalTemperatureK(tab, 1, 1); !errors.Is(err, ErrOutOfRange) {
		t.Errorf("start below the table: err = %v, want ErrOutOfRange", err)
	}
	// The whole table holds about 4.9e8 J/m^3 (testdata/pchip_reference.csv,
	// 5 → 600 K); 1e9 J/m^3 from 300 K must heat past its top.
	if _, err := FinalTemperatureK(tab, 300, 1e9); !errors.Is(err, ErrOutOfRange) {
		t.Errorf("heating past the table: err = %v, want ErrOutOfRange", err)
	}
	// Inside the table the root is found even when the bracket must be
	// clipped to the table's top.
	lo, hi := tab.RangeK()
	hTotal, _ := tab.EnthalpyJPerM3(lo, hi)
	t1, err := FinalTemperatureK(tab, lo, hTotal*(1-1e-9))
	if err != nil || !(t1 <= hi) {
		t.Errorf("u just below the table's content: T1 = %g, err = %v", t1, err)
	}
	if _, err := FinalTemperatureK(mustConstant(t, 1e-300), 1, 1e300); err == nil {
		t.Error("overflowing rise: want an error")
	}
	if got, err := FinalTemperatureK(d, 42, 0); err != nil || got != 42 {
		t.Errorf("u = 0: T1 = %g, err = %v; want the start temperature", got, err)
	}
}
