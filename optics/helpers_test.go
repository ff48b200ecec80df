package optics

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"math"
	"math/cmplx"
	"testing"

	"thzdrive/units"
)

// Test helpers shared by the test files.

func near(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

func nearC(got, want complex128, tol float64) bool { return cmplx.Abs(got-want) <= tol }

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// mustSolver builds a Solver or stops the test.
func mustSolver(t testing.TB, st Stack) *Solver {
	t.Helper()
	sv, err := NewSolver(st)
	if err != nil {
		t.Fatalf("NewSolver: %v", err)
	}
	return sv
}

func mustSolve(t testing.TB, sv *Solver, freqHz float64) Response {
	t.Helper()
	r, err := sv.Solve(freqHz)
	if err != nil {
		t.Fatalf("Solve(%g): %v", freqHz, err)
	}
	return r
}

// wavenumberHz converts a wavenumber in cm^-1 to a frequency in Hz.
func wavenumberHz(perCm float64) float64 { return perCm * units.InvCm }
