package optics

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"testing"

	"thzdrive/pulse"
)

// benchEvaluator builds a train with a window, a filter and an attenuator
// and a sample of the given number of layers mixing the three kinds of
// media (constant, tabulated, Lorentz/Drude), at oblique p incidence, the
// target averaged over the middle layer: the expensive path.
func benchEvaluator(tb testing.TB, layers int) *Evaluator {
	tb.Helper()
	tab, err := NewTabulated([]float64{0.1e12, 1e12, 3e12, 10e12}, []float64{1.6, 1.55, 1.52, 1.5}, []float64{0.001, 0.004, 0.01, 0.03})
	if err != nil {
		tb.Fatal(err)
	}
	media := []Medium{
		Constant{3.4, 0.01},
		Dielectric{EpsInf: 10.9, Oscillators: []Oscillator{{FreqHz: 8.1e12, WidthHz: 0.07e12, DeltaEps: 2}}},
		tab,
		Dielectric{EpsInf: 1, PlasmaHz: 100e12, ScatteringHz: 10e12},
		Constant{N: 2.1},
	}
	st := Stack{AngleRad: 0.6, Pol: PolP, Exit: Constant{N: 3.4175}}
	for i := range layers {
		st.Layers = append(st.Layers, Layer{Medium: media[i%len(media)], ThicknessM: float64(1+i) * 3e-6})
	}
	if layers == 1 {
		st.Layers[0].Medium = media[1]
	}
	ev, err := NewEvaluator(Train{
		Elements: []Element{Slab{Medium: Constant{N: 2.38}, ThicknessM: 1e-3, Incoherent: true}, Attenuator{AngleRad: 0.3}, Slab{Medium: tab, ThicknessM: 2e-3}},
		Sample:   st,
		Target:   Target{Layer: layers / 2, Placement: LayerAverage},
	})
	if err != nil {
		tb.Fatal(err)
	}
	return ev
}

func benchGrid(n int) (freq []float64, field []complex128, abs []float64) {
	freq = make([]float64, n)
	for k := range freq {
		freq[k] = float64(k) * 10e12 / float64(n)
	}
	return freq, make([]complex128, n), make([]float64, n)
}

func benchmarkEvaluate(b *testing.B, layers int) {
	ev := benchEvaluator(b, layers)
	freq, field, abs := benchGrid(4096)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if err := ev.Evaluate(freq, field, abs); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkEvaluate1Layer: a 4096-point grid through the train and a
// 1-layer (Lorentz) sample.
func BenchmarkEvaluate1Layer(b *testing.B) { benchmarkEvaluate(b, 1) }

// BenchmarkEvaluate10Layers: a 4096-point grid through the train and a
// 10-layer mixed sample.
func BenchmarkEvaluate10Layers(b *testing.B) { benchmarkEvaluate(b, 10) }

// BenchmarkSolve10LayersConstant: one frequency of a 10-layer stack of
// constant media at normal incidence, the cheapest case per layer.
func BenchmarkSolve10LayersConstant(b *testing.B) {
	st := Stack{Exit: Constant{N: 3.4175}}
	for i := range 10 {
		st.Layers = append(st.Layers, Layer{Medium: Constant{1.5 + 0.2*float64(i), 0.01}, ThicknessM: 5e-6})
	}
	sv := mustSolver(b, st)
	b.ReportAllocs()
	f := 1e12
	for b.Loop() {
		if _, err := sv.Solve(f); err != nil {
			b.Fatal(err)
		}
		f += 1e6
	}
}

// benchmarkPlainStack: a 4096-point grid through a bare sample of constant
// lossy layers at normal incidence, field at the front of the last layer:
// the floor of the per-layer cost.
func benchmarkPlainStack(b *testing.B, layers int) {
	st := Stack{Exit: Constant{N: 3.4175}}
	for i := range layers {
		st.Layers = append(st.Layers, Layer{Medium: Constant{1.5 + 0.2*float64(i), 0.01}, ThicknessM: 5e-6})
	}
	ev, err := NewEvaluator(Train{Sample: st, Target: Target{Layer: layers - 1}})
	if err != nil {
		b.Fatal(err)
	}
	freq, field, abs := benchGrid(4096)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if err := ev.Evaluate(freq, field, abs); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPlainStack1Layer and BenchmarkPlainStack10Layers: see
// benchmarkPlainStack.
func BenchmarkPlainStack1Layer(b *testing.B)   { benchmarkPlainStack(b, 1) }
func BenchmarkPlainStack10Layers(b *testing.B) { benchmarkPlainStack(b, 10) }

// benchmarkPropagate carries a 4 096-sample single-cycle trace, zero-padded
// to 8 192 samples (4 097 frequencies), through a lossless window (first
// pass) and a sample of constant lossy layers on a substrate at normal
// incidence, target at the front of the last layer: the forward transform,
// Evaluate, the inverse transform and the cautions.
func benchmarkPropagate(b *testing.B, layers int) {
	st := Stack{Exit: Constant{N: 3.4175}}
	for i := range layers {
		st.Layers = append(st.Layers, Layer{Medium: Constant{1.5 + 0.2*float64(i), 0.01}, ThicknessM: 5e-6})
	}
	ev, err := NewEvaluator(Train{
		Elements: []Element{Slab{Medium: Constant{N: 3.4175}, ThicknessM: 1e-3, Incoherent: true}},
		Sample:   st, Target: Target{Layer: layers - 1},
	})
	if err != nil {
		b.Fatal(err)
	}
	const n, step = 4096, 10e-15
	in := pulse.Trace{StartS: -n * step / 2, StepS: step, Field: make([]float64, n), Absolute: true}
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1e12, PeakFieldVPerM: 1e7}
	for i := range in.Field {
		in.Field[i] = m.At(in.TimeS(i))
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if _, err := Propagate(ev, in, 2*n); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPropagate1Layer and BenchmarkPropagate10Layers: see
// benchmarkPropagate.
func BenchmarkPropagate1Layer(b *testing.B)   { benchmarkPropagate(b, 1) }
func BenchmarkPropagate10Layers(b *testing.B) { benchmarkPropagate(b, 10) }
