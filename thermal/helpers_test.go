package thermal

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"
)

// readCSV returns the rows of a reference file in testdata (made by
// testdata/make_reference.py), without the header, as strings.
func readCSV(t *testing.T, name string) [][]string {
	t.Helper()
	f, err := os.Open(filepath.Join("testdata", name))
	if err != nil {
		t.Fatalf("open reference %s: %v", name, err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatalf("read reference %s: %v", name, err)
	}
	if len(rows) < 2 {
		t.Fatalf("reference %s has no data rows", name)
	}
	return rows[1:]
}

func parse(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}

// relErr is |got - want| / |want|, or |got| when want is 0.
func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// ulp is the spacing of float64 numbers at x.
func ulp(x float64) float64 {
	x = math.Abs(x)
	return math.Nextafter(x, math.Inf(1)) - x
}

func mustDebye(t testing.TB, thetaK, atomsPerM3 float64) Debye {
	t.Helper()
	d, err := NewDebye(thetaK, atomsPerM3)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func mustConstant(t testing.TB, c float64) Constant {
	t.Helper()
	m, err := NewConstant(c)
	if err != nil {
		t.Fatal(err)
	}
	return m
}
