package optics

import (
	"math"
	"testing"

	"thzdrive/caution"
	"thzdrive/pulse"
	"thzdrive/units"
)

// modelTrace samples a model pulse of package pulse (centred on t = 0) or
// stops the test.
func modelTrace(t *testing.T, m pulse.Model, stepS, spanS float64) pulse.Trace {
	t.Helper()
	tr, err := m.Sample(stepS, spanS)
	if err != nil {
		t.Fatal(err)
	}
	return tr
}

func mustPropagate(t *testing.T, tr Train, in pulse.Trace, padTo int) Propagation {
	t.Helper()
	ev, err := NewEvaluator(tr)
	if err != nil {
		t.Fatal(err)
	}
	p, err := Propagate(ev, in, padTo)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func hasCode(cs []caution.Caution, code caution.Code) (caution.Caution, bool) {
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

// TestPropagateLosslessSlabIsDelayedCopy: an analytic single-cycle pulse
// through a lossless, non-dispersive slab kept to its first pass comes out as
// the same pulse, scaled by t12·t21 = 4n/(1+n)² (Fresnel, normal incidence)
// and delayed by (n-1)d/c relative to free propagation (both derived,
// physics.md §4). The reference is the analytic pulse evaluated at the
// delayed sample times, not the input samples, so the fractional delay is
// tested as well. Tolerance 1e-9·E0: the pulse's spectrum above the Nyquist
// frequency (100 THz at 5 fs) is below e^{-5000} of its peak and both tails
// are below 1e-300 at the window edges, so what is left is the round-off of
// two transforms of 16 384 points, ~1e-13·E0 (derived estimate); 1e-9
// leaves room without hiding a wrong delay (a 1 fs error gives ~4e-2·E0).
func TestPropagateLosslessSlabIsDelayedCopy(t *testing.T) {
	cases := []struct {
		name       string
		n          float64
		thicknessM float64
	}{
		// Grischkowsky et al., JOSA B 7, 2006 (1990), n = 3.4175 (from memory).
		{"silicon 1 mm", 3.4175, 1e-3},
		// Invented inputs: a low-index polymer-like window and a thin plate.
		{"n=1.53 2 mm", 1.53, 2e-3},
		{"n=2.1 0.3 mm", 2.1, 0.3e-3},
	}
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}
	in := modelTrace(t, m, 5*units.Fs, 40*units.Ps)
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tr := Train{Elements: []Element{Slab{Medium: Constant{N: tc.n}, ThicknessM: tc.thicknessM, Incoherent: true}},
				Target: Target{Layer: ExitMedium}}
			p := mustPropagate(t, tr, in, 0)
			factor := 4 * tc.n / ((1 + tc.n) * (1 + tc.n))           // Fresnel first pass (derived)
			delay := (tc.n - 1) * tc.thicknessM / units.SpeedOfLight // (n-1)d/c (derived)
			worst := 0.0
			for i, x := range p.Target.Field {
				want := factor * m.At(p.Target.TimeS(i)-delay)
				worst = math.Max(worst, math.Abs(x-want))
			}
			if worst > 1e-9 {
				t.Errorf("max |E_out - 4n/(1+n)²·E(t - (n-1)d/c)| = %.3g·E0, want <= 1e-9", worst)
			}
			// The absorbed fraction of a vacuum exit medium with a lossless
			// window in front is the power that enters it, (4n/(1+n)²)²
			// (derived: |t12 t21|² with real r; Optics.Evaluate documents
			// the exit medium's "absorbed" fraction as the power entering it).
			if e := relErr(p.AbsorbedFraction, factor*factor); e > 1e-12 {
				t.Errorf("absorbed (entering) fraction %.15g, want (4n/(1+n)²)² = %.15g", p.AbsorbedFraction, factor*factor)
			}
		})
	}
	// physics.md §4 quotes the silicon numbers: 0.7005 and 8.06 ps.
	if f := 4 * 3.4175 / (4.4175 * 4.4175); math.Abs(f-0.7005) > 0.00005 {
		t.Errorf("4n/(1+n)² = %.6f, physics.md §4 quotes 0.7005", f)
	}
	if d := 2.4175 * 1e-3 / units.SpeedOfLight / units.Ps; math.Abs(d-8.06) > 0.005 {
		t.Errorf("(n-1)d/c = %.4f ps, physics.md §4 quotes 8.06 ps", d)
	}
}

// TestPropagateAbsorbedFraction: a lossless target layer absorbs nothing at
// any frequency (energy conservation: flux in = flux out), so the pulse's
// absorbed fraction is 0; an absorbing bulk exit medium of constant
// ñ = n + iκ takes in everything it does not reflect, 1 - R with
// R = ((n-1)² + κ²)/((n+1)² + κ²) (Fresnel at normal incidence, Born & Wolf,
// Principles of Optics §14.2; derived), the same at every frequency so the
// power weighting cannot change it. A window in front multiplies by its
// first-pass power transmission (4n_w/(1+n_w)²)² (derived). Tolerance 1e-12:
// these are sums of identical numbers (constant media) divided by their
// weight sum.
func TestPropagateAbsorbedFraction(t *testing.T) {
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1e7}
	in := modelTrace(t, m, 10*units.Fs, 20*units.Ps)
	fresnelA := func(n, k float64) float64 {
		return 1 - ((n-1)*(n-1)+k*k)/((n+1)*(n+1)+k*k)
	}
	win := 4 * 2.0 / 9.0 // window n = 2: 4n/(1+n)² (derived)
	cases := []struct {
		name string
		tr   Train
		want float64
	}{
		{"lossless film on lossless substrate", Train{
			Sample: Stack{Layers: []Layer{{Medium: Constant{N: 2.5}, ThicknessM: 50e-6}}, Exit: Constant{N: 3.4}},
			Target: Target{Layer: 0}}, 0},
		{"lossless incoherent plate, target inside it", Train{
			Sample: Stack{Layers: []Layer{{Medium: Constant{N: 1.5}, ThicknessM: 1e-3, Incoherent: true}}, Exit: Constant{N: 2}},
			Target: Target{Layer: 0, Placement: LayerAverage}}, 0},
		{"lossless film behind a window", Train{
			Elements: []Element{Slab{Medium: Constant{N: 2}, ThicknessM: 1e-3, Incoherent: true}},
			Sample:   Stack{Layers: []Layer{{Medium: Constant{N: 2.5}, ThicknessM: 5e-6}}},
			Target:   Target{Layer: 0}}, 0},
		{"absorbing bulk n=3, kappa=0.2", Train{
			Sample: Stack{Exit: Constant{N: 3, Kappa: 0.2}}, Target: Target{Layer: ExitMedium}}, fresnelA(3, 0.2)},
		{"absorbing bulk n=1.8, kappa=1.1", Train{
			Sample: Stack{Exit: Constant{N: 1.8, Kappa: 1.1}}, Target: Target{Layer: ExitMedium}}, fresnelA(1.8, 1.1)},
		{"absorbing bulk behind a window", Train{
			Elements: []Element{Slab{Medium: Constant{N: 2}, ThicknessM: 1e-3, Incoherent: true}},
			Sample:   Stack{Exit: Constant{N: 3, Kappa: 0.2}}, Target: Target{Layer: ExitMedium}}, win * win * fresnelA(3, 0.2)},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p := mustPropagate(t, tc.tr, in, 0)
			if math.Abs(p.AbsorbedFraction-tc.want) > 1e-12 {
				t.Errorf("absorbed fraction %.15g, want %.15g", p.AbsorbedFraction, tc.want)
			}
			for k, a := range p.Absorbed {
				if k > 0 && math.Abs(a-tc.want) > 1e-12 {
					t.Fatalf("absorbed[%d] at %.3g THz = %.15g, want %.15g at every frequency", k, p.FreqHz[k]/units.THz, a, tc.want)
				}
			}
		})
	}
}

// TestPropagateExtrapolationBand: a catalogue material valid from 0.2 to
// 3 THz (hdpe, materials.json) raises MATERIAL_EXTRAPOLATED only when the
// band holding all but CautionEnergyFraction = 1 % of the incident energy
// (0.5 % cut at each end) leaves that range, not merely because the grid
// reaches a Nyquist frequency of 50 THz. The pulses are Gaussian-envelope
// carriers; their power spectrum exp(-(f-f0)²π²T²/ln 2) is a normal
// density of standard deviation σ = sqrt(ln2/2)/(πT) (derived from
// physics.md §2), whose 0.5 % tails start z = Φ⁻¹(0.995) = 2.5758σ from f0
// (normal-distribution quantile, computed with math.Erfinv), so the band is
// f0 ± 0.4827/T. The negative-frequency image of the spectrum, which the
// one-sided grid folds in, holds Φ(-f0/σ) of the energy: the edges are
// checked to 2 frequency bins only where that is below 1e-6 (f0 > 4.8σ);
// elsewhere only whether the caution is raised.
func TestPropagateExtrapolationBand(t *testing.T) {
	hdpe, err := Lookup("hdpe")
	if err != nil {
		t.Fatal(err)
	}
	if hdpe.MinHz != 0.2*units.THz || hdpe.MaxHz != 3*units.THz {
		t.Fatalf("hdpe valid %g–%g THz; this test assumes 0.2–3 THz (materials.json)", hdpe.MinHz/units.THz, hdpe.MaxHz/units.THz)
	}
	z := math.Sqrt2 * math.Erfinv(1-CautionEnergyFraction) // Φ⁻¹(1 - 0.005)
	cases := []struct {
		f0THz, fwhmPs float64
	}{
		{1.0, 2},   // band 0.76–1.24 THz: inside
		{1.5, 1},   // band 1.02–1.98 THz: inside
		{2.5, 2},   // band 2.26–2.74 THz: inside
		{2.8, 2},   // band 2.56–3.04 THz: leaves at the top
		{0.4, 2},   // band 0.16–0.64 THz: leaves at the bottom
		{1.0, 0.5}, // band 0.03–1.97 THz: leaves at the bottom
		{1.6, 0.3}, // band 0.00–3.21 THz: leaves at both ends
	}
	for _, tc := range cases {
		sigma := math.Sqrt(math.Ln2/2) / (math.Pi * tc.fwhmPs) // THz, derived above
		lo, hi := tc.f0THz-z*sigma, tc.f0THz+z*sigma
		want := lo < 0.2 || hi > 3
		m := pulse.Model{Shape: pulse.Carrier, CarrierFrequencyHz: tc.f0THz * units.THz, EnvelopeFWHMS: tc.fwhmPs * units.Ps, PeakFieldVPerM: 1e7}
		in := modelTrace(t, m, 10*units.Fs, 20*units.Ps)
		tr := Train{Elements: []Element{Slab{Medium: hdpe, ThicknessM: 2e-3}}, Target: Target{Layer: ExitMedium}}
		p := mustPropagate(t, tr, in, 4000)
		binTHz := p.FreqHz[1] / units.THz
		c, got := hasCode(p.Cautions, caution.MaterialExtrapolate)
		if got != want {
			t.Errorf("f0 %.2g THz, T %.2g ps (band %.3f–%.3f THz): MATERIAL_EXTRAPOLATED %v, want %v; cautions %v", tc.f0THz, tc.fwhmPs, lo, hi, got, want, p.Cautions)
			continue
		}
		if !got || tc.f0THz < 4.8*sigma {
			continue
		}
		gmin, ok1 := cautionValue(c, "grid_min_thz")
		gmax, ok2 := cautionValue(c, "grid_max_thz")
		if !ok1 || !ok2 {
			t.Errorf("caution without grid_min_thz/grid_max_thz: %v", c)
			continue
		}
		if math.Abs(gmax-hi) > 2*binTHz {
			t.Errorf("f0 %.2g THz: grid_max_thz %.4f, want the 99 %% band edge %.4f within 2 bins (%.3f THz)", tc.f0THz, gmax, hi, binTHz)
		}
		if math.Abs(gmin-lo) > 2*binTHz {
			t.Errorf("f0 %.2g THz: grid_min_thz %.4f, want the 99 %% band edge %.4f within 2 bins", tc.f0THz, gmin, lo)
		}
	}
}

// TestPropagateEchoCaution: the first echo of a 1 mm incoherent silicon
// window follows the main pulse by 2nd/c = 22.80 ps (physics.md §4,
// derived). The caution is raised when the padded window extends more than
// that after the incident peak, and not when it ends sooner.
func TestPropagateEchoCaution(t *testing.T) {
	m := pulse.Model{Shape: pulse.CentralLobe, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1e7}
	in := modelTrace(t, m, 10*units.Fs, 20*units.Ps) // 2000 samples, peak at t = 0, 10 ps before the end
	tr := Train{Elements: []Element{Slab{Medium: Constant{N: 3.4175}, ThicknessM: 1e-3, Incoherent: true}}, Target: Target{Layer: ExitMedium}}
	echo := 2 * 3.4175 * 1e-3 / units.SpeedOfLight / units.Ps // 2nd/c (derived)
	if math.Abs(echo-22.80) > 0.005 {
		t.Fatalf("2nd/c = %.4f ps, physics.md §4 quotes 22.80", echo)
	}
	for _, tc := range []struct {
		padTo int
		want  bool
	}{
		{2000, false}, // window ends 10 ps after the peak
		{4000, true},  // 30 ps after it
	} {
		p := mustPropagate(t, tr, in, tc.padTo)
		c, got := hasCode(p.Cautions, caution.EchoInWindow)
		after := p.Target.TimeS(p.Target.Len()) / units.Ps
		if got != tc.want {
			t.Errorf("pad %d (window ends %.1f ps after the peak): ECHO_IN_WINDOW %v, want %v", tc.padTo, after, got, tc.want)
			continue
		}
		if got {
			if d, _ := cautionValue(c, "echo_delay_ps"); math.Abs(d-echo) > 1e-6*echo {
				t.Errorf("echo_delay_ps %.6f, want 2nd/c = %.6f", d, echo)
			}
		}
	}
}
