package plan_test

import (
	"testing"

	"thzdrive/optics"
	"thzdrive/phononmode"
	"thzdrive/plan"
	"thzdrive/pulse"
	"thzdrive/units"
)

// benchExperiment is the benchmark plan of server/bench_test.go and
// bench/numpy_plan.py (invented inputs): a 1 THz single cycle sampled every
// stepS over spanS, calibrated to 1 uJ in a 400 um spot, zero-padded to pad
// samples, through 1 mm of a lossless n = 3.4175 window (first pass) into a
// bulk crystal (eps_inf = 8, one oscillator at 2 THz, 0.15 THz wide,
// Δε = 2) whose oscillator is the driven mode.
func benchExperiment(tb testing.TB, stepS, spanS float64, pad int) plan.Experiment {
	tb.Helper()
	shape, err := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}.Sample(stepS, spanS)
	if err != nil {
		tb.Fatal(err)
	}
	train := optics.Train{
		Elements: []optics.Element{optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 1e-3, Incoherent: true}},
		Sample: optics.Stack{Exit: optics.Dielectric{EpsInf: 8, Oscillators: []optics.Oscillator{
			{FreqHz: 2 * units.THz, WidthHz: 0.15 * units.THz, DeltaEps: 2}}}},
		Target: optics.Target{Layer: optics.ExitMedium},
	}
	mode, err := plan.ModeFromTarget(&train, 0, 150*units.CubicAngstrom)
	if err != nil {
		tb.Fatal(err)
	}
	mode.EffectiveMassKg = 30 * units.Amu
	return plan.Experiment{
		Source: plan.Source{Waveform: shape, EnergyJ: 1 * units.UJ, Spot: pulse.Spot{RadiusXM: 400e-6, RadiusYM: 400e-6}},
		Chain:  plan.Chain{Train: &train, PadToSamples: pad, Mode: mode, Options: phononmode.Options{}},
	}
}

// BenchmarkRun is plan.Run in-process at two sizes: 2 000 samples of 10 fs
// padded to 4 096, and 20 000 samples of 2 fs (40 ps) padded to 32 768.
func BenchmarkRun(b *testing.B) {
	for _, c := range []struct {
		name         string
		stepS, spanS float64
		pad          int
	}{
		{"4096", 10 * units.Fs, 20 * units.Ps, 4096},
		{"32768", 2 * units.Fs, 40 * units.Ps, 32768},
	} {
		b.Run(c.name, func(b *testing.B) {
			e := benchExperiment(b, c.stepS, c.spanS, c.pad)
			r, err := plan.Run(e)
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				if _, err := plan.Run(e); err != nil {
					b.Fatal(err)
				}
			}
			// The headline numbers, to set beside bench/numpy_plan.py's.
			b.ReportMetric(r.Drive.Mode.MaxAbsQMSqrtKg/units.AngstromSqrtAmu, "maxQ-A.sqrt(amu)")
			b.ReportMetric(r.Drive.Propagation.TargetPeakVPerM/units.KVPerCm, "inside-kV/cm")
			b.ReportMetric(r.Drive.Propagation.AbsorbedFraction, "absorbed-fraction")
		})
	}
}

// BenchmarkRunStages times the stages of BenchmarkRun's plans one by one
// (the calls plan.Run makes, on the same inputs), to show where a plan's
// time goes: the calibration, the analysis of the incident pulse, the
// propagation (transform, Evaluate, inverse transform, cautions) and its
// Evaluate alone, and the mode (padded transform, exact solution, inverse
// transform, refined peak, energies).
func BenchmarkRunStages(b *testing.B) {
	for _, c := range []struct {
		name         string
		stepS, spanS float64
		pad          int
	}{
		{"4096", 10 * units.Fs, 20 * units.Ps, 4096},
		{"32768", 2 * units.Fs, 40 * units.Ps, 32768},
	} {
		e := benchExperiment(b, c.stepS, c.spanS, c.pad)
		src := e.Source
		cal, err := pulse.CalibrateByEnergy(src.Waveform, src.EnergyJ, src.Spot, pulse.FocusOption{})
		if err != nil {
			b.Fatal(err)
		}
		ev, err := optics.NewEvaluator(*e.Chain.Train)
		if err != nil {
			b.Fatal(err)
		}
		p, err := optics.Propagate(ev, cal.Trace, c.pad)
		if err != nil {
			b.Fatal(err)
		}
		inside := phononmode.Field{StartS: p.Target.StartS, StepS: p.Target.StepS, VPerM: p.Target.Field}
		stages := []struct {
			name string
			run  func() error
		}{
			{"calibrate", func() error {
				_, err := pulse.CalibrateByEnergy(src.Waveform, src.EnergyJ, src.Spot, pulse.FocusOption{})
				return err
			}},
			{"analyze", func() error { _, err := pulse.Analyze(cal.Trace, pulse.Processing{}); return err }},
			{"propagate", func() error { _, err := optics.Propagate(ev, cal.Trace, c.pad); return err }},
			{"evaluate", func() error { return ev.Evaluate(p.FreqHz, p.Transfer, p.Absorbed) }},
			{"drive", func() error { _, err := phononmode.Drive(e.Chain.Mode, inside, e.Chain.Options); return err }},
		}
		for _, st := range stages {
			b.Run(c.name+"/"+st.name, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if err := st.run(); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
