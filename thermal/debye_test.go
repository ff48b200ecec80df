package thermal

import (
	"errors"
	"math"
	"testing"

	"thzdrive/units"
)

// The Debye-function table of physics.md §6: C/(3 n kB) at Θ/T, printed to
// 8 decimals; tolerance half a unit of the last printed digit, 5e-9.
func TestDebyeCapacityRatioPublishedTable(t *testing.T) {
	for _, tc := range []struct {
		thetaOverT, want float64
	}{
		{0.1, 0.99950018}, // physics.md §6, Debye-function table
		{0.5, 0.98761075}, // physics.md §6, Debye-function table
		{1, 0.95173214},   // physics.md §6, Debye-function table (0.952 at T = Θ)
		{5, 0.36863482},   // physics.md §6, Debye-function table
		{10, 0.07582100},  // physics.md §6, Debye-function table
	} {
		got := DebyeCapacityRatio(tc.thetaOverT)
		if math.Abs(got-tc.want) > 5e-9 {
			t.Errorf("C/(3nkB) at Θ/T = %g: got %.10f, want %.8f ± 5e-9", tc.thetaOverT, got, tc.want)
		}
	}
}

// Against QUADPACK (scipy.integrate.quad, epsrel 1e-13) in
// testdata/debye_reference.csv, made by testdata/make_reference.py. Tolerance
// 1e-12 relative: ten times the reference's own requested accuracy.
func TestDebyeAgainstScipyQuad(t *testing.T) {
	for _, row := range readCSV(t, "debye_reference.csv") {
		y, wantC, wantD3 := parse(t, row[0]), parse(t, row[1]), parse(t, row[2])
		if e := relErr(DebyeCapacityRatio(y), wantC); e > 1e-12 {
			t.Errorf("C/(3nkB) at Θ/T = %g: got %.17g, scipy %.17g (rel err %.2g > 1e-12)", y, DebyeCapacityRatio(y), wantC, e)
		}
		if e := relErr(DebyeFunction3(y), wantD3); e > 1e-12 {
			t.Errorf("D3(%g): got %.17g, scipy %.17g (rel err %.2g > 1e-12)", y, DebyeFunction3(y), wantD3, e)
		}
	}
}

// Limits of the Debye model (Kittel, Introduction to Solid State Physics,
// ch. 5; derived from the integral): the T^3 law and Dulong–Petit.
func TestDebyeLimits(t *testing.T) {
	const theta, n = 300.0, 6e28
	d := mustDebye(t, theta, n)
	threeNkB := 3 * n * units.Boltzmann

	// T^3 law C = (12π^4/5) n kB (T/Θ)^3. At Θ/T >= 50 the omitted tail
	// ∫_{Θ/T}^∞ is below 1e-15 of the whole (derived: ≈ y^4 e^-y), so the
	// law holds to round-off; tolerance 1e-13 relative.
	for _, y := range []float64{50, 100, 1e3, 1e6} {
		tK := theta / y
		got, err := d.CapacityJPerM3K(tK)
		if err != nil {
			t.Fatal(err)
		}
		r := tK / theta
		want := 12 * math.Pow(math.Pi, 4) / 5 * n * units.Boltzmann * r * r * r // T^3 law
		if e := relErr(got, want); e > 1e-13 {
			t.Errorf("T^3 law at Θ/T = %g: got %g, want %g (rel err %.2g > 1e-13)", y, got, want, e)
		}
	}

	// Dulong–Petit 3 n kB. The high-temperature series is
	// 1 - y^2/20 + y^4/560 - ... with y = Θ/T (derived from the Bernoulli
	// series of x/(e^x - 1)), so at y <= 0.01 C is within 5e-6 of 3 n kB:
	// tolerance 5.1e-6 relative; and the two-term series, whose next term
	// is O(y^6) < 1e-16 here, to 1e-12.
	for _, y := range []float64{1e-2, 1e-3, 1e-6} {
		got, err := d.CapacityJPerM3K(theta / y)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(got, threeNkB); e > 5.1e-6 {
			t.Errorf("Dulong–Petit at Θ/T = %g: got %g, want %g (rel err %.2g)", y, got, threeNkB, e)
		}
		series := threeNkB * (1 - y*y/20 + y*y*y*y/560)
		if e := relErr(got, series); e > 1e-12 {
			t.Errorf("high-T expansion at Θ/T = %g: got %g, want %g (rel err %.2g)", y, got, series, e)
		}
	}

	// In SI per mole: one mole of atoms has 3 N_A kB = 3R = 24.94 J/(mol K)
	// (Dulong–Petit; R = 8.314462618 J/(mol K), CODATA 2018, from memory).
	// Tolerance: R to its 10 printed digits and the 5e-8 high-T correction
	// at T = 1000 Θ, so 1e-7 relative.
	molar := mustDebye(t, 100, units.Avogadro) // one mole per m^3
	got, err := molar.CapacityJPerM3K(1e5)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(got, 3*8.314462618); e > 1e-7 { // 3R, CODATA 2018 R
		t.Errorf("Dulong–Petit per mole: got %.9g J/(mol K), want 3R = %.9g", got, 3*8.314462618)
	}

	// D3(y) → π^4/(5 y^3) for large y (derived: ∫_0^∞ x^3/(e^x-1) dx =
	// π^4/15; the dropped tail is below 1e-15 relative at y >= 50).
	for _, y := range []float64{50, 200, 1e4} {
		want := math.Pow(math.Pi, 4) / (5 * y * y * y)
		if e := relErr(DebyeFunction3(y), want); e > 1e-13 {
			t.Errorf("D3(%g): got %g, want %g (rel err %.2g)", y, DebyeFunction3(y), want, e)
		}
	}
	if DebyeFunction3(0) != 1 || DebyeCapacityRatio(0) != 1 { // definitions' limits at y = 0
		t.Errorf("y = 0: D3 = %g, C/(3nkB) = %g; want 1, 1", DebyeFunction3(0), DebyeCapacityRatio(0))
	}
	if DebyeFunction3(math.Inf(1)) != 0 || DebyeCapacityRatio(math.Inf(1)) != 0 { // T → 0
		t.Errorf("y = Inf: want 0, 0")
	}
	for _, y := range []float64{-1, math.NaN()} {
		if !math.IsNaN(DebyeFunction3(y)) || !math.IsNaN(DebyeCapacityRatio(y)) {
			t.Errorf("y = %g: want NaN", y)
		}
	}
}

// The method changes at Θ/T = 1e-3 (series) and 3 (quadrature to tail sum);
// the function is smooth there, so the two sides of each switch must agree
// to round-off (property; tolerance 1e-14 relative, a few ulps).
func TestDebyeContinuityAtMethodSwitches(t *testing.T) {
	for _, y := range []float64{debyeSeriesMax, debyeSplit} {
		below, above := math.Nextafter(y, 0), math.Nextafter(y, math.Inf(1))
		if e := relErr(DebyeCapacityRatio(below), DebyeCapacityRatio(above)); e > 1e-14 {
			t.Errorf("C/(3nkB) jumps by %.2g at y = %g", e, y)
		}
		if e := relErr(DebyeFunction3(below), DebyeFunction3(above)); e > 1e-14 {
			t.Errorf("D3 jumps by %.2g at y = %g", e, y)
		}
	}
}

// Property: the Debye heat capacity increases with temperature, strictly
// until it reaches 3 n kB in float64 (derived: the integrand is positive and
// y^-3 ∫_0^y grows as y falls).
func TestDebyeCapacityIncreasesWithTemperature(t *testing.T) {
	d := mustDebye(t, 420, 5e28)
	prev := -1.0
	for tK := 0.01; tK < 1e6; tK *= 1.05 {
		c, err := d.CapacityJPerM3K(tK)
		if err != nil {
			t.Fatal(err)
		}
		if c < prev {
			t.Fatalf("C decreases: C(%g K) = %g < %g", tK, c, prev)
		}
		prev = c
	}
}

// Enthalpy ∫ C dT of the Debye model against scipy: quad over T of the
// quad-evaluated C (testdata/debye_enthalpy.csv, epsrel 1e-12), long
// intervals (energy difference) and short ones (direct quadrature).
// Tolerance 1e-11 relative.
func TestDebyeEnthalpyAgainstScipyQuad(t *testing.T) {
	const n = 7e28
	for _, row := range readCSV(t, "debye_enthalpy.csv") {
		theta, t0, t1, want := parse(t, row[0]), parse(t, row[1]), parse(t, row[2]), parse(t, row[3])
		d := mustDebye(t, theta, n)
		got, err := d.EnthalpyJPerM3(t0, t1)
		if err != nil {
			t.Fatal(err)
		}
		want *= 3 * n * units.Boltzmann
		if e := relErr(got, want); e > 1e-11 {
			t.Errorf("Θ = %g K, %g → %g K: got %.12g J/m^3, scipy %.12g (rel err %.2g > 1e-11)", theta, t0, t1, got, want, e)
		}
	}
}

// Properties of the enthalpy: additive over adjacent intervals, odd under
// exchange of the ends, and with derivative C. The central difference of
// step h = 1e-4 T has truncation error h^2 C”/(6C); for C rising no faster
// than T^3 (the Debye model's steepest) that is at most (h/T)^2 = 1e-8
// (derived), so the tolerance is 2e-8.
func TestDebyeEnthalpyProperties(t *testing.T) {
	d := mustDebye(t, 343, 8.5e28)
	for _, tc := range []struct{ a, b, c float64 }{{1, 7, 40}, {20, 300, 301}, {150, 1000, 5000}} {
		hab, _ := d.EnthalpyJPerM3(tc.a, tc.b)
		hbc, _ := d.EnthalpyJPerM3(tc.b, tc.c)
		hac, _ := d.EnthalpyJPerM3(tc.a, tc.c)
		if e := relErr(hab+hbc, hac); e > 1e-12 {
			t.Errorf("additivity %v: %g + %g vs %g (rel err %.2g)", tc, hab, hbc, hac, e)
		}
		hba, _ := d.EnthalpyJPerM3(tc.b, tc.a)
		if hba != -hab {
			t.Errorf("H(%g,%g) = %g, H(%g,%g) = %g: want opposite", tc.a, tc.b, hab, tc.b, tc.a, hba)
		}
	}
	for _, tK := range []float64{3, 30, 100, 343, 900} {
		h := 1e-4 * tK
		dh, err := d.EnthalpyJPerM3(tK-h, tK+h)
		if err != nil {
			t.Fatal(err)
		}
		c, _ := d.CapacityJPerM3K(tK)
		if e := relErr(dh/(2*h), c); e > 2e-8 {
			t.Errorf("dH/dT at %g K: %g vs C = %g (rel err %.2g > 2e-8)", tK, dh/(2*h), c, e)
		}
	}
}

func TestDebyeErrors(t *testing.T) {
	for _, tc := range []struct {
		name        string
		theta, n    float64
		wantFailure bool
	}{
		{"ok", 300, 1e28, false},
		{"zero theta", 0, 1e28, true},
		{"negative theta", -5, 1e28, true},
		{"NaN theta", math.NaN(), 1e28, true},
		{"Inf theta", math.Inf(1), 1e28, true},
		{"zero density", 300, 0, true},
		{"NaN density", 300, math.NaN(), true},
		{"Inf density", 300, math.Inf(1), true},
	} {
		_, err := NewDebye(tc.theta, tc.n)
		if (err != nil) != tc.wantFailure {
			t.Errorf("%s: err = %v, want failure %v", tc.name, err, tc.wantFailure)
		}
	}
	d := mustDebye(t, 300, 1e28)
	for _, tK := range []float64{-1, math.NaN(), math.Inf(1)} {
		if _, err := d.CapacityJPerM3K(tK); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("C(%g K): err = %v, want ErrOutOfRange", tK, err)
		}
		if _, err := d.EnthalpyJPerM3(10, tK); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("H(10, %g K): err = %v, want ErrOutOfRange", tK, err)
		}
	}
	var zero Debye
	if _, err := zero.CapacityJPerM3K(10); err == nil {
		t.Error("zero-value Debye: want an error")
	}
	if _, err := zero.EnthalpyJPerM3(10, 20); err == nil {
		t.Error("zero-value Debye: want an error")
	}
}
