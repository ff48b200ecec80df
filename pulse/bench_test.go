package pulse

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// noisyPulse is the worked-check pulse in a window of n samples of 10 fs with
// seeded noise at 1 % of the peak and an offset, the kind of trace a lab
// sends.
func noisyPulse(n int) Trace {
	rng := rand.New(rand.NewPCG(13, 14))
	tr := Trace{StartS: -float64(n) * 5e-15, StepS: 10e-15, Field: make([]float64, n), Absolute: true}
	for i := range tr.Field {
		tr.Field[i] = singleCycle1THz.At(tr.TimeS(i)+2e-12) + 1e5*rng.NormFloat64() + 3e4
	}
	return tr
}

func BenchmarkAnalyze(b *testing.B) {
	for _, n := range []int{4096, 65536} {
		tr := noisyPulse(n)
		for _, c := range []struct {
			name string
			p    Processing
		}{
			{"plain", Processing{}},
			{"prepulse+hann+pad2x", Processing{Baseline: BaselinePrePulse, Window: WindowHann, PadToSamples: 2 * n}},
		} {
			b.Run(fmt.Sprintf("%d/%s", n, c.name), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Analyze(tr, c.p); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// TestAnalyzeAllocations checks that Analyze allocates only what it returns
// (the processed trace, the spectrum and the cautions) once the transform
// plan and padding buffer are pooled: at most a handful of allocations,
// whatever the length.
func TestAnalyzeAllocations(t *testing.T) {
	if testing.Short() {
		t.Skip("allocation count")
	}
	tr := noisyPulse(4096)
	p := Processing{Baseline: BaselinePrePulse, Window: WindowTukey, PadToSamples: 8192}
	if _, err := Analyze(tr, p); err != nil { // warm the pools
		t.Fatal(err)
	}
	allocs := testing.AllocsPerRun(20, func() {
		if _, err := Analyze(tr, p); err != nil {
			t.Fatal(err)
		}
	})
	if allocs > 6 {
		t.Errorf("Analyze makes %.0f allocations per call, want at most 6", allocs)
	}
}

// TestAnalyzeConcurrent runs Analyze from several goroutines on traces of
// shared lengths (so that they contend for pooled plans and buffers) and
// checks that every result equals the serial one bit for bit.
func TestAnalyzeConcurrent(t *testing.T) {
	traces := []Trace{noisyPulse(1000), noisyPulse(1024), noisyPulse(997)}
	p := Processing{Window: WindowHann, PadToSamples: 2048}
	want := make([]Analysis, len(traces))
	for i, tr := range traces {
		a, err := Analyze(tr, p)
		if err != nil {
			t.Fatal(err)
		}
		want[i] = a
	}
	errs := make(chan error, 8)
	for g := range 8 {
		go func() {
			for r := range 20 {
				i := (g + r) % len(traces)
				a, err := Analyze(traces[i], p)
				if err == nil && a.Metrics != want[i].Metrics {
					err = fmt.Errorf("trace %d: metrics %+v, serial %+v", i, a.Metrics, want[i].Metrics)
				}
				if err == nil {
					for k, v := range a.Spectrum.Values {
						if v != want[i].Spectrum.Values[k] {
							err = fmt.Errorf("trace %d bin %d: %v, serial %v", i, k, v, want[i].Spectrum.Values[k])
							break
						}
					}
				}
				if err != nil {
					errs <- err
					return
				}
			}
			errs <- nil
		}()
	}
	for range 8 {
		if err := <-errs; err != nil {
			t.Error(err)
		}
	}
}
