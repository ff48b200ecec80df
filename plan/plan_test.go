package plan_test

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"thzdrive/optics"
	"thzdrive/phononmode"
	"thzdrive/plan"
	"thzdrive/pulse"
	"thzdrive/thermal"
	"thzdrive/units"
)

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func sample(t testing.TB, m pulse.Model, stepS, spanS float64) pulse.Trace {
	t.Helper()
	tr, err := m.Sample(stepS, spanS)
	if err != nil {
		t.Fatal(err)
	}
	return tr
}

func constantC(t testing.TB, jPerM3K float64) thermal.Constant {
	t.Helper()
	c, err := thermal.NewConstant(jPerM3K)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// scenario is an invented plan (inputs only, no check values): a 1.5 THz
// single cycle, 1 uJ in a 400 um spot, through a 1 mm silicon window onto a
// sample whose target is either a 1 um film with one Lorentz oscillator
// (averaged over the film) on a constant-index substrate, or the bulk of an
// absorbing Lorentz crystal read with a probe depth.
type scenario struct {
	name  string
	train optics.Train
	probe float64
	film  bool
}

func scenarios(t testing.TB) []scenario {
	si, err := optics.Lookup("silicon-hr")
	if err != nil {
		t.Fatal(err)
	}
	window := []optics.Element{optics.Slab{Name: "window", Medium: si, ThicknessM: 1e-3, Incoherent: true}}
	film := optics.Dielectric{EpsInf: 6, Oscillators: []optics.Oscillator{{FreqHz: 1.8 * units.THz, WidthHz: 0.1 * units.THz, DeltaEps: 1.5}}}
	bulk := optics.Dielectric{EpsInf: 8, Oscillators: []optics.Oscillator{{FreqHz: 2 * units.THz, WidthHz: 0.15 * units.THz, DeltaEps: 2}}}
	return []scenario{
		{"film", optics.Train{Elements: window,
			Sample: optics.Stack{Layers: []optics.Layer{{Medium: film, ThicknessM: 1e-6}}, Exit: optics.Constant{N: 3.1}},
			Target: optics.Target{Layer: 0, Placement: optics.LayerAverage}}, 0, true},
		{"bulk with probe depth", optics.Train{Elements: window,
			Sample: optics.Stack{Exit: bulk}, Target: optics.Target{Layer: optics.ExitMedium}}, 200e-9, false},
	}
}

// TestRunEqualsComposition: plan.Run is the composition of the single
// stages on the same inputs: pulse.CalibrateByEnergy, optics.Propagate,
// phononmode.Drive on the field at the target, thermal.Estimate with the
// fluence, energy, spot, absorbed fraction and geometry the other stages
// give (as plan's documentation states them: a layer is a film of its
// thickness, the exit medium a bulk sample with BulkAbsorptionPerM, the spot
// the round one of equal area). The same numbers must come out, bit for bit:
// no drift between the paths (common practice for a composition).
func TestRunEqualsComposition(t *testing.T) {
	shape := sample(t, pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1.5 * units.THz, PeakFieldVPerM: 1}, 10*units.Fs, 16*units.Ps)
	const energyJ, wM = 1e-6, 400e-6
	spot := pulse.Spot{RadiusXM: wM, RadiusYM: wM}
	for _, sc := range scenarios(t) {
		t.Run(sc.name, func(t *testing.T) {
			mode, err := plan.ModeFromTarget(&sc.train, 0, 150*units.CubicAngstrom)
			if err != nil {
				t.Fatal(err)
			}
			mode.EffectiveMassKg = 30 * units.Amu
			heat := thermal.Inputs{HeatCapacity: constantC(t, 1.5e6), BaseTemperatureK: 10, TransitionTemperatureK: 30,
				RepetitionRateHz: 1e3, ConductivityWPerMK: 5}
			train := sc.train
			r, err := plan.Run(plan.Experiment{
				Source:  plan.Source{Waveform: shape, EnergyJ: energyJ, Spot: spot},
				Chain:   plan.Chain{Train: &train, Mode: mode, ProbeDepthM: sc.probe},
				Heating: &heat,
			})
			if err != nil {
				t.Fatal(err)
			}

			// The stages by hand.
			cal, err := pulse.CalibrateByEnergy(shape, energyJ, spot, pulse.FocusOption{})
			if err != nil {
				t.Fatal(err)
			}
			ev, err := optics.NewEvaluator(sc.train)
			if err != nil {
				t.Fatal(err)
			}
			p, err := optics.Propagate(ev, cal.Trace, 0)
			if err != nil {
				t.Fatal(err)
			}
			opt := phononmode.Options{}
			target, err := plan.TargetMedium(&sc.train)
			if err != nil {
				t.Fatal(err)
			}
			if sc.probe > 0 {
				opt.Depth = &phononmode.Depth{ProbeDepthM: sc.probe, Index: target.Index}
			}
			res, err := phononmode.Drive(mode, phononmode.Field{StartS: p.Target.StartS, StepS: p.Target.StepS, VPerM: p.Target.Field}, opt)
			if err != nil {
				t.Fatal(err)
			}
			in := heat
			in.FluenceJPerM2 = cal.PeakFluenceJPerM2
			in.PulseEnergyJ = energyJ
			in.SpotRadiusM = math.Sqrt(2 * energyJ / (math.Pi * cal.PeakFluenceJPerM2)) // round spot of area π wx wy, from F0 = 2W/(πw²)
			in.AbsorbedFraction = p.AbsorbedFraction
			if sc.film {
				in.Geometry, in.ThicknessM = thermal.Film, sc.train.Sample.Layers[0].ThicknessM
			} else {
				in.Geometry, in.AbsorptionCoefficientPerM = thermal.Bulk, plan.BulkAbsorptionPerM(&p, target)
			}
			b, err := thermal.Estimate(in)
			if err != nil {
				t.Fatal(err)
			}

			if r.Drive.Propagation == nil || r.Heating == nil || r.Calibration == nil {
				t.Fatalf("report lacks a stage: %+v", r)
			}
			for i, x := range r.Incident.Field {
				if x != cal.Trace.Field[i] {
					t.Fatalf("incident sample %d: %v vs %v", i, x, cal.Trace.Field[i])
				}
			}
			for i, x := range r.Drive.Inside.Field {
				if x != p.Target.Field[i] {
					t.Fatalf("field inside, sample %d: %v vs %v", i, x, p.Target.Field[i])
				}
			}
			rp, rm, rh := r.Drive.Propagation, r.Drive.Mode, r.Heating
			for _, c := range []struct {
				what      string
				run, comp float64
			}{
				{"incident peak field", r.Calibration.PeakFieldVPerM, cal.PeakFieldVPerM},
				{"peak fluence", r.PeakFluenceJPerM2, cal.PeakFluenceJPerM2},
				{"pulse energy", r.PulseEnergyJ, energyJ},
				{"target peak field", rp.TargetPeakVPerM, p.TargetPeakVPerM},
				{"absorbed fraction", rp.AbsorbedFraction, p.AbsorbedFraction},
				{"max |Q|", rm.MaxAbsQMSqrtKg, res.MaxAbsQMSqrtKg},
				{"depth-average max |Q|", rm.DepthAvgMaxAbsQMSqrtKg, res.DepthAvgMaxAbsQMSqrtKg},
				{"displacement", rm.DisplacementM, res.DisplacementM},
				{"quanta", rm.Quanta, res.Quanta},
				{"absorbed by the mode", rm.AbsorbedJPerM3, res.AbsorbedJPerM3},
				{"overlap", rm.Overlap, res.Overlap},
				{"absorbed power", rh.AbsorbedPowerW, b.AbsorbedPowerW},
				{"peak energy density", rh.PeakEnergyDensityJPerM3, b.PeakEnergyDensityJPerM3},
				{"steady-state temperature", rh.SteadyStateTemperatureK, b.SteadyStateTemperatureK},
				{"peak temperature", rh.PeakTemperatureK, b.PeakTemperatureK},
				{"margin", rh.MarginK, b.MarginK},
			} {
				if c.run != c.comp {
					t.Errorf("%s: Run %.17g, composition %.17g", c.what, c.run, c.comp)
				}
			}
			if sc.probe > 0 && !(res.DepthAvgMaxAbsQMSqrtKg > 0) {
				t.Errorf("no depth average with a probe depth")
			}
			stages := map[string]int{}
			for _, c := range r.Cautions {
				stages[c.Stage]++
			}
			if stages[plan.StageOptics] != len(p.Cautions) || stages[plan.StageMode] != len(res.Cautions) || stages[plan.StageHeating] != len(b.Cautions) {
				t.Errorf("cautions per stage %v; composition has optics %d, mode %d, heating %d", stages, len(p.Cautions), len(res.Cautions), len(b.Cautions))
			}
		})
	}
}

// unitScaled returns tr scaled so that max|sample| = peak, absolute.
func unitScaled(tr pulse.Trace, peak float64) pulse.Trace {
	m := 0.0
	for _, x := range tr.Field {
		m = math.Max(m, math.Abs(x))
	}
	out := pulse.Trace{StartS: tr.StartS, StepS: tr.StepS, Field: make([]float64, len(tr.Field)), Absolute: true}
	for i, x := range tr.Field {
		out.Field[i] = x * peak / m
	}
	return out
}

// TestSizeInvertsDriveMode: driving the chain with the incident peak field
// plan.Size returns reaches the goal (the definition of the inverse):
// within 1e-6 for a linear mode (one exact scaling, round-off left) and
// 1e-4 for a mode with a quartic term (Brent's search stops within 1e-6 of
// the target; the margin covers the integrator's 1e-7). The pulse energy is
// the one whose calibration gives that field (physics.md §3 both ways;
// 1e-12, a square and a square root).
func TestSizeInvertsDriveMode(t *testing.T) {
	shape := sample(t, pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1.5 * units.THz, PeakFieldVPerM: 3}, 10*units.Fs, 16*units.Ps)
	spot := pulse.Spot{RadiusXM: 400e-6, RadiusYM: 300e-6}
	for _, sc := range scenarios(t) {
		for _, tc := range []struct {
			name   string
			a4     float64 // 1/(m² kg s²)
			q      phononmode.Quantity
			target float64
			tol    float64
		}{
			{"linear max Q", 0, phononmode.MaxQ, 0.02 * units.AngstromSqrtAmu, 1e-6},
			{"linear quanta", 0, phononmode.QuantaPerCell, 0.05, 1e-6},
			{"quartic max Q", 100 / (units.Ps * units.Ps * units.AngstromSqrtAmu * units.AngstromSqrtAmu), phononmode.MaxQ, 0.3 * units.AngstromSqrtAmu, 1e-4},
		} {
			t.Run(sc.name+"/"+tc.name, func(t *testing.T) {
				mode, err := plan.ModeFromTarget(&sc.train, 0, 150*units.CubicAngstrom)
				if err != nil {
					t.Fatal(err)
				}
				mode.A4PerM2KgS2 = tc.a4
				train := sc.train
				chain := plan.Chain{Train: &train, Mode: mode, ProbeDepthM: sc.probe}
				sz, err := plan.Size(shape, chain, plan.Goal{Quantity: tc.q, Target: tc.target, MaxPeakFieldVPerM: 500 * units.MVPerCm, Spot: spot})
				if err != nil {
					t.Fatal(err)
				}
				if !sz.Reachable {
					t.Fatalf("unreachable: %+v", sz.Cautions)
				}
				d, err := plan.DriveMode(unitScaled(shape, sz.PeakFieldVPerM), chain)
				if err != nil {
					t.Fatal(err)
				}
				if e := relErr(tc.q.Of(d.Mode), tc.target); e > tc.tol {
					t.Errorf("DriveMode at %.6g kV/cm reaches %.9g, want %.9g within %g (rel err %.2g)", sz.PeakFieldVPerM/units.KVPerCm, tc.q.Of(d.Mode), tc.target, tc.tol, e)
				}
				cal, err := pulse.CalibrateByEnergy(shape, sz.PulseEnergyJ, spot, pulse.FocusOption{})
				if err != nil {
					t.Fatal(err)
				}
				if e := relErr(cal.PeakFieldVPerM, sz.PeakFieldVPerM); e > 1e-12 {
					t.Errorf("calibrating %.6g J gives %.12g V/m, Size said %.12g", sz.PulseEnergyJ, cal.PeakFieldVPerM, sz.PeakFieldVPerM)
				}
				if e := relErr(sz.PeakFluenceJPerM2, 2*sz.PulseEnergyJ/(math.Pi*spot.RadiusXM*spot.RadiusYM)); e > 1e-12 {
					t.Errorf("fluence %.12g, want F0 = 2W/(π wx wy)", sz.PeakFluenceJPerM2)
				}
			})
		}
	}
}

// powerSpectrum is |Σ_j x_j e^{+2πi jk/n}|² for k = 0..n/2 of x zero-padded
// to n, by the direct sum (an independent transform; the dt² factor that
// physics.md §1 puts in front cancels in every ratio below).
func powerSpectrum(x []float64, n int) []float64 {
	out := make([]float64, n/2+1)
	for k := range out {
		var s complex128
		for j, v := range x {
			s += complex(v, 0) * cmplx.Exp(complex(0, 2*math.Pi*float64(j*k%n)/float64(n)))
		}
		out[k] = real(s)*real(s) + imag(s)*imag(s)
	}
	return out
}

// TestBulkAbsorptionPerM: plan.BulkAbsorptionPerM is documented as the
// absorbed-power-weighted mean of α = 2ωκ/c, Σ A(f)P(f)α(f) / Σ A(f)P(f)
// over f > 0, with P the incident power spectrum and A the fraction entering
// the half-space. Checked against the same sum built here from an
// independent transform and Fresnel's A = 1 - |(1-ñ)/(1+ñ)|² (Born & Wolf
// §1.5; derived), to 1e-12. For a constant ñ, A cancels and α_eff =
// (4πκ/c)·f̄ with f̄ the power-weighted mean frequency; for the single-cycle
// pulse, |E|² ∝ ω²·exp(-ω²τ²), f̄ = 2f_peak/√π (derived from the Gaussian
// integrals of physics.md §2). That closed form is checked to 1e-8: the sum
// over bins of 25 GHz differs from the integral by the Euler–Maclaurin
// term Δf⁴·g‴(0)/720, ~1e-9 relative here (derived), and the window
// truncates nothing above 1e-100.
func TestBulkAbsorptionPerM(t *testing.T) {
	const fPeak = 1.5 * units.THz
	shape := sample(t, pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: fPeak, PeakFieldVPerM: 1e7}, 10*units.Fs, 10*units.Ps)
	tab, err := optics.NewTabulated([]float64{0.1 * units.THz, 2 * units.THz, 5 * units.THz}, []float64{3, 3.5, 4.2}, []float64{0.05, 0.2, 0.3})
	if err != nil {
		t.Fatal(err)
	}
	const kappa = 0.07
	for _, tc := range []struct {
		name   string
		medium optics.Medium
		padTo  int
		closed bool
	}{
		{"constant kappa", optics.Constant{N: 3.2, Kappa: kappa}, 4000, true},
		{"tabulated n and kappa", tab, 2000, false},
		{"tabulated behind a window", tab, 2000, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tr := optics.Train{Sample: optics.Stack{Exit: tc.medium}, Target: optics.Target{Layer: optics.ExitMedium}}
			if tc.name == "tabulated behind a window" {
				tr.Elements = []optics.Element{optics.Slab{Medium: optics.Constant{N: 2}, ThicknessM: 1e-3, Incoherent: true}}
			}
			ev, err := optics.NewEvaluator(tr)
			if err != nil {
				t.Fatal(err)
			}
			p, err := optics.Propagate(ev, shape, tc.padTo)
			if err != nil {
				t.Fatal(err)
			}
			n := 2 * (len(p.FreqHz) - 1)
			if got := p.FreqHz[1] * float64(n) * shape.StepS; math.Abs(got-1) > 1e-12 {
				t.Fatalf("grid of %d points is not the transform length I assume (%g)", n, got)
			}
			pw := powerSpectrum(shape.Field, n)
			var num, den float64
			for k := 1; k < len(pw); k++ {
				f := p.FreqHz[k]
				idx := tc.medium.Index(f)
				r := (1 - idx) / (1 + idx)
				a := 1 - real(r*cmplx.Conj(r))
				if len(tr.Elements) > 0 {
					w := 4 * 2.0 / 9.0 // window n = 2, first pass 4n/(1+n)² in field (derived)
					a *= w * w
				}
				alpha := 2 * (2 * math.Pi * f) * imag(idx) / units.SpeedOfLight
				num += a * pw[k] * alpha
				den += a * pw[k]
			}
			got := plan.BulkAbsorptionPerM(&p, tc.medium)
			if e := relErr(got, num/den); e > 1e-12 {
				t.Errorf("α_eff %.15g 1/m, want Σ A P α / Σ A P = %.15g (rel err %.2g)", got, num/den, e)
			}
			if tc.closed {
				want := 4 * math.Pi * kappa / units.SpeedOfLight * 2 * fPeak / math.Sqrt(math.Pi)
				if e := relErr(got, want); e > 1e-8 {
					t.Errorf("α_eff %.12g 1/m, want (4πκ/c)·2f_peak/√π = %.12g (rel err %.2g)", got, want, e)
				}
			}
		})
	}
}

// ExampleRun plans one experiment: a 1 THz single cycle of 1 uJ focused to
// w = 500 um (physics.md §3: F0 = 254.6 uJ/cm², E_peak ≈ 500 kV/cm, derived)
// through a 1 mm high-resistivity silicon window (physics.md §4: the first
// pass keeps 4n/(1+n)² = 0.70 of the field, derived; n from Grischkowsky et
// al. 1990, from memory) to an invented 1 THz mode in vacuum behind it.
func ExampleRun() {
	shape, _ := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}.Sample(10*units.Fs, 20*units.Ps)
	si, _ := optics.Lookup("silicon-hr")
	train := optics.Train{
		Elements: []optics.Element{optics.Slab{Name: "window", Medium: si, ThicknessM: 1e-3, Incoherent: true}},
		Target:   optics.Target{Layer: optics.ExitMedium},
	}
	mode, _ := phononmode.FromOscillatorStrength(0.5, 1*units.THz, 0.1*units.THz, 100*units.CubicAngstrom)
	r, err := plan.Run(plan.Experiment{
		Source: plan.Source{Waveform: shape, EnergyJ: 1 * units.UJ, Spot: pulse.Spot{RadiusXM: 500e-6, RadiusYM: 500e-6}},
		Chain:  plan.Chain{Train: &train, Mode: mode},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	p := r.Drive.Propagation
	fmt.Printf("peak fluence %.1f uJ/cm^2\n", r.PeakFluenceJPerM2/units.UJPerCm2)
	fmt.Printf("incident peak field %.0f kV/cm\n", p.IncidentPeakVPerM/units.KVPerCm)
	fmt.Printf("behind the window %.2f of it\n", p.TargetPeakVPerM/p.IncidentPeakVPerM)
	// Output:
	// peak fluence 254.6 uJ/cm^2
	// incident peak field 500 kV/cm
	// behind the window 0.70 of it
}
