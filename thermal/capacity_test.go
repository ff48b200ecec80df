package thermal

import (
	"errors"
	"math"
	"testing"
)

func loadReferenceTable(t *testing.T) *Table {
	t.Helper()
	var temps, caps []float64
	for _, row := range readCSV(t, "pchip_table.csv") {
		temps = append(temps, parse(t, row[0]))
		caps = append(caps, parse(t, row[1]))
	}
	tab, err := NewTable(temps, caps)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

// Against scipy.interpolate.PchipInterpolator and its exact integral
// (testdata/pchip_reference.csv, made by testdata/make_reference.py from the
// table in testdata/pchip_table.csv). Both evaluate the same cubic in
// different arithmetic; tolerance 1e-12 relative (1e-6 J/m^3 absolute for the
// zero-width integral).
func TestTableAgainstScipyPchip(t *testing.T) {
	tab := loadReferenceTable(t)
	for _, row := range readCSV(t, "pchip_reference.csv") {
		kind, a, want := row[0], parse(t, row[1]), parse(t, row[3])
		switch kind {
		case "capacity":
			got, err := tab.CapacityJPerM3K(a)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(got, want); e > 1e-12 {
				t.Errorf("C(%g K): got %.15g, scipy %.15g (rel err %.2g > 1e-12)", a, got, want, e)
			}
		case "enthalpy":
			b := parse(t, row[2])
			got, err := tab.EnthalpyJPerM3(a, b)
			if err != nil {
				t.Fatal(err)
			}
			if want == 0 {
				if math.Abs(got) > 1e-6 {
					t.Errorf("H(%g, %g): got %g, want 0", a, b, got)
				}
			} else if e := relErr(got, want); e > 1e-12 {
				t.Errorf("H(%g, %g K): got %.15g, scipy %.15g (rel err %.2g > 1e-12)", a, b, got, want, e)
			}
		default:
			t.Fatalf("unknown reference row kind %q", kind)
		}
	}
}

// Property: PCHIP keeps monotone data monotone and never overshoots
// (Fritsch & Carlson 1980), so on the increasing reference table C is
// non-decreasing on a fine grid and the enthalpy strictly increasing.
func TestTableMonotone(t *testing.T) {
	tab := loadReferenceTable(t)
	lo, hi := tab.RangeK()
	prevC, prevH := -1.0, -1.0
	for i := 0; i <= 20000; i++ {
		tK := lo + (hi-lo)*float64(i)/20000
		if i == 20000 {
			tK = hi
		}
		c, err := tab.CapacityJPerM3K(tK)
		if err != nil {
			t.Fatal(err)
		}
		h, err := tab.EnthalpyJPerM3(lo, tK)
		if err != nil {
			t.Fatal(err)
		}
		if c < prevC {
			t.Fatalf("C not monotone at %g K: %g < %g", tK, c, prevC)
		}
		if i > 0 && !(h > prevH) {
			t.Fatalf("H not increasing at %g K: %g <= %g", tK, h, prevH)
		}
		prevC, prevH = c, h
	}
}

// Property: on data with a peak (as near a transition) PCHIP stays within
// the data of each interval: no value above the peak, none below the
// smallest point (Fritsch & Carlson 1980).
func TestTableNoOvershootAtPeak(t *testing.T) {
	temps := []float64{100, 140, 150, 155, 160, 170, 200}
	caps := []float64{2e6, 2.3e6, 2.9e6, 4.5e6, 2.6e6, 2.4e6, 2.5e6}
	tab, err := NewTable(temps, caps)
	if err != nil {
		t.Fatal(err)
	}
	for tK := 100.0; tK <= 200; tK += 0.01 {
		c, err := tab.CapacityJPerM3K(tK)
		if err != nil {
			t.Fatal(err)
		}
		if c > 4.5e6*(1+1e-15) || c < 2e6*(1-1e-15) {
			t.Fatalf("C(%g K) = %g outside the data's range", tK, c)
		}
	}
}

// A table of equal values is a constant: PCHIP reproduces constants exactly
// (its slopes are the secants, zero), so C and the enthalpy are C·ΔT
// (derived; tolerance round-off, 1e-15 relative).
func TestTableReproducesConstant(t *testing.T) {
	const c = 1.7e6
	tab, err := NewTable([]float64{10, 20, 50, 300}, []float64{c, c, c, c})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ a, b float64 }{{10, 300}, {12.5, 47}, {60, 61}} {
		got, err := tab.EnthalpyJPerM3(tc.a, tc.b)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(got, c*(tc.b-tc.a)); e > 1e-14 {
			t.Errorf("H(%g, %g) = %g, want %g (rel err %.2g)", tc.a, tc.b, got, c*(tc.b-tc.a), e)
		}
	}
	// Two points: the straight line, whose integral is the trapezoid
	// (derived).
	line, err := NewTable([]float64{100, 200}, []float64{1e6, 3e6})
	if err != nil {
		t.Fatal(err)
	}
	mid, _ := line.CapacityJPerM3K(150)
	h, _ := line.EnthalpyJPerM3(100, 200)
	if relErr(mid, 2e6) > 1e-15 || relErr(h, 2e8) > 1e-15 {
		t.Errorf("two-point table: C(150) = %g (want 2e6), H = %g (want 2e8)", mid, h)
	}
}

func TestTableRefusesOutsideItsRange(t *testing.T) {
	tab := loadReferenceTable(t)
	lo, hi := tab.RangeK()
	for _, tK := range []float64{lo - 1e-9, hi + 1e-9, 0, 1e4, math.NaN(), math.Inf(1)} {
		if _, err := tab.CapacityJPerM3K(tK); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("C(%g K): err = %v, want ErrOutOfRange", tK, err)
		}
		if _, err := tab.EnthalpyJPerM3(lo, tK); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("H(%g, %g K): err = %v, want ErrOutOfRange", lo, tK, err)
		}
	}
	for _, tK := range []float64{lo, hi} {
		if _, err := tab.CapacityJPerM3K(tK); err != nil {
			t.Errorf("C at the table's end %g K: %v", tK, err)
		}
	}
}

func TestNewTableErrors(t *testing.T) {
	for _, tc := range []struct {
		name  string
		temps []float64
		caps  []float64
	}{
		{"length mismatch", []float64{1, 2}, []float64{1}},
		{"one point", []float64{1}, []float64{1}},
		{"empty", nil, nil},
		{"not increasing", []float64{1, 3, 2}, []float64{1, 1, 1}},
		{"repeated temperature", []float64{1, 2, 2}, []float64{1, 1, 1}},
		{"negative temperature", []float64{-1, 2}, []float64{1, 1}},
		{"NaN temperature", []float64{math.NaN(), 2}, []float64{1, 1}},
		{"Inf temperature", []float64{1, math.Inf(1)}, []float64{1, 1}},
		{"zero capacity", []float64{1, 2}, []float64{0, 1}},
		{"negative capacity", []float64{1, 2}, []float64{1, -1}},
		{"NaN capacity", []float64{1, 2}, []float64{1, math.NaN()}},
		{"Inf capacity", []float64{1, 2}, []float64{math.Inf(1), 1}},
		{"slope overflow", []float64{1, 1 + 1e-15}, []float64{1, 1e300}},
	} {
		if _, err := NewTable(tc.temps, tc.caps); err == nil {
			t.Errorf("%s: want an error", tc.name)
		}
	}
	var empty Table
	if _, err := empty.CapacityJPerM3K(10); err == nil {
		t.Error("empty table: want an error")
	}
	if _, err := empty.EnthalpyJPerM3(10, 20); err == nil {
		t.Error("empty table: want an error")
	}
}

// The table copies its input: changing the caller's slices afterwards does
// not change it (derived from the API contract).
func TestTableCopiesInput(t *testing.T) {
	temps := []float64{10, 20, 30}
	caps := []float64{1e6, 2e6, 3e6}
	tab, err := NewTable(temps, caps)
	if err != nil {
		t.Fatal(err)
	}
	before, _ := tab.CapacityJPerM3K(25)
	temps[1], caps[1] = 15, 9e6
	after, _ := tab.CapacityJPerM3K(25)
	if before != after {
		t.Errorf("table changed with its input: %g → %g", before, after)
	}
	pt, pc := tab.Points()
	if pt[1] != 20 || pc[1] != 2e6 {
		t.Errorf("Points = %v, %v", pt, pc)
	}
}

func TestConstant(t *testing.T) {
	c := mustConstant(t, 2.5e6)
	h, err := c.EnthalpyJPerM3(300, 320)
	if err != nil {
		t.Fatal(err)
	}
	if h != 2.5e6*20 { // derived: ∫ C dT = C ΔT, exact in float64 here
		t.Errorf("H = %g, want %g", h, 2.5e6*20)
	}
	for _, bad := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, err := NewConstant(bad); err == nil {
			t.Errorf("NewConstant(%g): want an error", bad)
		}
	}
	for _, tK := range []float64{-1, math.NaN(), math.Inf(1)} {
		if _, err := c.CapacityJPerM3K(tK); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("C(%g K): err = %v, want ErrOutOfRange", tK, err)
		}
	}
	var zero Constant
	if _, err := zero.CapacityJPerM3K(10); err == nil {
		t.Error("zero-value Constant: want an error")
	}
}
