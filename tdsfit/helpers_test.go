package tdsfit

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"math"
	"math/rand/v2"
	"testing"

	"thzdrive/optics"
	"thzdrive/pulse"
)

// Test helpers shared by the test files.

// synthSpec describes a synthetic time-domain measurement: a model pulse
// (centred on t = 0) sampled from startS on n samples of stepS, and the
// same pulse after a slab, both computed by package optics's forward model
// and then given seeded Gaussian noise of standard deviation noise.
type synthSpec struct {
	model  pulse.Model
	stepS  float64
	n      int
	startS float64
	slab   optics.Slab
	noise  float64
	seed   uint64
}

// synth returns the reference and sample traces of s. The pulse is
// propagated through the slab (optics.Propagate: an optical train holding
// the slab, whose transmission is quoted relative to the same thickness of
// air, as measured in a THz time-domain experiment) on a grid four times
// longer than the window, so that the periodic transform does not wrap the
// delayed pulse, its echoes and its ringing back into the window; then both
// traces are cut to the window, as a measurement is.
func synth(t testing.TB, s synthSpec) (ref, sam pulse.Trace) {
	t.Helper()
	long := pulse.NextFastLength(4 * s.n)
	in := pulse.Trace{StartS: s.startS, StepS: s.stepS, Field: make([]float64, long)}
	for i := range in.Field {
		in.Field[i] = s.model.At(in.TimeS(i))
	}
	ev, err := optics.NewEvaluator(optics.Train{
		Elements: []optics.Element{s.slab},
		Target:   optics.Target{Layer: optics.ExitMedium},
	})
	if err != nil {
		t.Fatalf("NewEvaluator: %v", err)
	}
	prop, err := optics.Propagate(ev, in, 0)
	if err != nil {
		t.Fatalf("Propagate: %v", err)
	}
	rng := rand.New(rand.NewPCG(s.seed, s.seed^0x9e3779b97f4a7c15))
	ref = pulse.Trace{StartS: s.startS, StepS: s.stepS, Field: make([]float64, s.n)}
	sam = pulse.Trace{StartS: s.startS, StepS: s.stepS, Field: make([]float64, s.n)}
	for i := range s.n {
		ref.Field[i] = in.Field[i] + s.noise*rng.NormFloat64()
		sam.Field[i] = prop.Target.Field[i] + s.noise*rng.NormFloat64()
	}
	return ref, sam
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}
