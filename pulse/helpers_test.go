package pulse

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"bufio"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"thzdrive/caution"
)

// readRows reads a comma-separated reference file from testdata, skipping
// comment lines that start with '#'.
func readRows(t *testing.T, name string) [][]string {
	t.Helper()
	f, err := os.Open("testdata/" + name)
	if err != nil {
		t.Fatalf("reference file: %v", err)
	}
	defer f.Close()
	var rows [][]string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		rows = append(rows, strings.Split(line, ","))
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows
}

func atof(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}

func atoi(t *testing.T, s string) int {
	t.Helper()
	v, err := strconv.Atoi(s)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}

// within reports |got - want| <= tol.
func within(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

func hasCaution(cs []caution.Caution, code caution.Code) (caution.Caution, bool) {
	for _, c := range cs {
		if c.Code == code {
			return c, true
		}
	}
	return caution.Caution{}, false
}

func cautionValue(c caution.Caution, name string) (float64, bool) {
	for _, v := range c.Values {
		if v.Name == name {
			return v.Number, true
		}
	}
	return 0, false
}

func isInputError(err error) bool {
	var ie *InputError
	return errors.As(err, &ie)
}

// singleCycle1THz is the worked check of physics.md §2: first-derivative
// pulse, spectral peak 1 THz, E0 = 100 kV/cm.
var singleCycle1THz = Model{Shape: SingleCycle, PeakFrequencyHz: 1e12, PeakFieldVPerM: 1e7}
