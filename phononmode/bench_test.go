package phononmode

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"testing"
)

// Drives at 4096 samples with a reused Solver and Result: the steady state
// of a sweep. Run with -benchtime=200ms on the shared machines.
func BenchmarkDriveLinear4096(b *testing.B) {
	m := gaasMode(b)
	f := singleCycle(1e8, 1/m.OmegaRadPerS(), 1e-12, 0, 10e-15, 4096)
	benchDrive(b, m, f, Options{})
}

func BenchmarkDriveNonlinear4096(b *testing.B) {
	m, _, _ := loadODEReference(b)
	f := singleCycle(3e8, 1/m.OmegaRadPerS(), 1e-12, 0, 5e-15, 4096)
	benchDrive(b, m, f, Options{})
}

// The linear mode through the integrator, for comparison with the exact
// solution's cost.
func BenchmarkDriveTimeDomainLinear4096(b *testing.B) {
	m := gaasMode(b)
	f := singleCycle(1e8, 1/m.OmegaRadPerS(), 1e-12, 0, 10e-15, 4096)
	benchDrive(b, m, f, Options{Method: TimeDomain})
}

func benchDrive(b *testing.B, m Mode, f Field, opt Options) {
	var s Solver
	var r Result
	if err := s.Drive(m, f, opt, &r); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if err := s.Drive(m, f, opt, &r); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(r.SubSteps), "substeps")
}
