package thermal

import (
	"math"
	"testing"
)

// Incropera et al., Fundamentals of Heat and Mass Transfer, problem 4.16:
// 1 W at absorptivity 0.45 (0.45 W absorbed), Gaussian beam r_b = 0.1 mm, k =
// 27 W/(m K). The textbook's solution evaluates the shape factor
// S = 2√π r_b as 354e-6 m (three figures; exactly 354.49e-6 m) and prints
// T1,max = 72.1 °C from T2 = 25 °C, a 47.1 K rise. With the unrounded S the
// rise is 47.016 K. Tolerance against the printed 47.1 K: the textbook's
// rounding of S moves its answer by +0.065 K and its final rounding by up to
// 0.05 K, so 0.12 K; against the unrounded value, 1e-12 relative.
func TestLaxIncroperaProblem4_16(t *testing.T) {
	got, err := LaxCentreRiseK(0.45, 0.1e-3, 27)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(got-47.1) > 0.12 { // Incropera et al., problem 4.16, printed answer
		t.Errorf("Incropera 4.16: rise %g K, textbook 47.1 K ± 0.12 K", got)
	}
	want := 0.45 / (27 * 2 * math.Sqrt(math.Pi) * 0.1e-3) // Incropera 4.16 with S = 2√π r_b unrounded
	if e := relErr(got, want); e > 1e-12 {
		t.Errorf("Incropera 4.16 unrounded: rise %.15g K, want %.15g K", got, want)
	}
	// Same spot given by its 1/e^2 radius w = √2 a.
	gotW, err := SteadyStateRiseK(0.45, math.Sqrt2*0.1e-3, 27)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(gotW, got); e > 1e-15 {
		t.Errorf("SteadyStateRiseK(w = √2 a) = %g, LaxCentreRiseK(a) = %g", gotW, got)
	}
}

// Against an independent integration: scipy.integrate.quad of the surface
// point-source rise P/(2π κ r) over the Gaussian spot
// (testdata/lax_reference.csv, epsrel 1e-13). Tolerance 1e-11 relative.
func TestLaxAgainstGreensFunctionQuadrature(t *testing.T) {
	for _, row := range readCSV(t, "lax_reference.csv") {
		p, a, k, want := parse(t, row[0]), parse(t, row[1]), parse(t, row[2]), parse(t, row[3])
		got, err := LaxCentreRiseK(p, a, k)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(got, want); e > 1e-11 {
			t.Errorf("P = %g W, a = %g m, κ = %g: got %.15g K, quad %.15g K (rel err %.2g)", p, a, k, got, want, e)
		}
	}
}

// Property: the rise is linear in P and inversely proportional to κ and to
// the radius (derived from the formula's dimensions: the only length is a).
func TestLaxScaling(t *testing.T) {
	base, _ := LaxCentreRiseK(1, 1e-4, 10)
	for _, tc := range []struct {
		name    string
		p, a, k float64
		factor  float64
	}{
		{"double power", 2, 1e-4, 10, 2},
		{"double radius", 1, 2e-4, 10, 0.5},
		{"double conductivity", 1, 1e-4, 20, 0.5},
		{"zero power", 0, 1e-4, 10, 0},
	} {
		got, err := LaxCentreRiseK(tc.p, tc.a, tc.k)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(got, tc.factor*base); e > 1e-15 {
			t.Errorf("%s: %g, want %g", tc.name, got, tc.factor*base)
		}
	}
}

func TestLaxErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		name    string
		p, a, k float64
	}{
		{"negative power", -1, 1e-4, 10},
		{"NaN power", nan, 1e-4, 10},
		{"Inf power", inf, 1e-4, 10},
		{"zero radius", 1, 0, 10},
		{"negative radius", 1, -1e-4, 10},
		{"Inf radius", 1, inf, 10},
		{"zero conductivity", 1, 1e-4, 0},
		{"NaN conductivity", 1, 1e-4, nan},
		{"overflow", 1e300, 1e-300, 1e-10},
	} {
		if _, err := LaxCentreRiseK(tc.p, tc.a, tc.k); err == nil {
			t.Errorf("%s: want an error", tc.name)
		}
	}
}
