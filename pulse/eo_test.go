package pulse

import (
	"math"
	"testing"

	"thzdrive/caution"
	"thzdrive/units"
)

var znte1mm = EOSetup{Crystal: ZnTe, ThicknessM: 1 * units.Mm, ProbeWavelengthM: 800 * units.Nm}

// TestEOConstants checks the electro-optic figures of physics.md §3 (Planken
// et al., JOSA B 18, 313 (2001) formula; ZnTe constants from memory): ZnTe,
// 1 mm, 800 nm gives 28.7 kV/cm per unit dI/I and a half-wave field of 43.2
// kV/cm. Both are quoted to 3 digits: tolerance ±0.05 kV/cm.
func TestEOConstants(t *testing.T) {
	if err := znte1mm.Validate(); err != nil {
		t.Fatal(err)
	}
	if got := znte1mm.FieldPerModulation() / units.KVPerCm; !within(got, 28.7, 0.05) {
		t.Errorf("ZnTe 1 mm: %.4f kV/cm per unit dI/I, want 28.7 (physics.md §3)", got)
	}
	if got := znte1mm.HalfWaveField() / units.KVPerCm; !within(got, 43.2, 0.05) {
		t.Errorf("ZnTe 1 mm: half-wave field %.4f kV/cm, want 43.2 (physics.md §3)", got)
	}
	// The two figures describe one retardation Γ = (2π/λ)n0³r41 L t E: the
	// incident field that gives Γ = π/2 is (π/2)·FieldPerModulation, and
	// inside the crystal (times t_THz) that is half the half-wave field
	// (derived). Round-off tolerance.
	tTHz := 2 / (1 + ZnTe.NTHz)
	if lhs, rhs := math.Pi/2*znte1mm.FieldPerModulation()*tTHz, znte1mm.HalfWaveField()/2; !within(lhs, rhs, 1e-12*rhs) {
		t.Errorf("(π/2)·E_per_mod·t_THz = %.12g, E_half-wave/2 = %.12g", lhs, rhs)
	}
	// Crystal constants as physics.md §3 states them.
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"ZnTe n0", ZnTe.NProbe, 2.85}, {"ZnTe r41", ZnTe.R41MPerV, 4.0e-12}, {"ZnTe n_THz", ZnTe.NTHz, 3.17}, {"ZnTe TO", ZnTe.TOPhononHz, 5.3e12},
		{"GaP n0", GaP.NProbe, 3.18}, {"GaP r41", GaP.R41MPerV, 0.97e-12}, {"GaP n_THz", GaP.NTHz, 3.342}, {"GaP TO", GaP.TOPhononHz, 11e12},
	} {
		if !within(c.got, c.want, 1e-12*c.want) {
			t.Errorf("%s = %g, physics.md §3 says %g", c.name, c.got, c.want)
		}
	}
}

// TestFieldFromModulation checks the arcsin form E = arcsin(dI/I)·λ/(2π n0³
// r41 L t_THz) (physics.md §3) and its limits.
func TestFieldFromModulation(t *testing.T) {
	k := znte1mm.FieldPerModulation()
	// A retardation Γ gives dI/I = sin Γ, so sin Γ must map back to Γ·k
	// (physics.md §3); round-off tolerance.
	for _, g := range []float64{-1.2, -0.3, 0, 0.01, 0.5, 1.5} {
		got, err := znte1mm.FieldFromModulation(math.Sin(g))
		if err != nil {
			t.Fatal(err)
		}
		if !within(got, g*k, 1e-12*k) {
			t.Errorf("Γ = %g: field %.12g, want %.12g", g, got, g*k)
		}
	}
	// Small signal: at dI/I = 0.1 the arcsin exceeds the linear reading by
	// arcsin(0.1)/0.1 - 1 = 0.167 % (Taylor series m + m³/6, derived).
	got, _ := znte1mm.FieldFromModulation(0.1)
	if r := got/(0.1*k) - 1; !within(r, 0.1*0.1/6, 2e-5) {
		t.Errorf("arcsin excess at 0.1: %.5f, want about 0.00167", r)
	}
	for _, m := range []float64{1, -1, 1.5, math.NaN(), math.Inf(1)} {
		if _, err := znte1mm.FieldFromModulation(m); !isInputError(err) {
			t.Errorf("dI/I = %g: error %v, want an *InputError", m, err)
		}
	}
	bad := znte1mm
	bad.ThicknessM = 0
	if _, err := bad.FieldFromModulation(0.01); !isInputError(err) {
		t.Errorf("zero thickness: error %v", err)
	}
}

// modulationTrace is the balanced signal sin(Γ(t)) of a single-cycle field
// at the given spectral peak whose peak retardation is gammaPeak, and the
// largest retardation among its samples.
func modulationTrace(t *testing.T, peakHz, gammaPeak float64) (Trace, float64) {
	t.Helper()
	m := Model{Shape: SingleCycle, PeakFrequencyHz: peakHz, PeakFieldVPerM: 1}
	tr, err := m.Sample(5e-15, 20e-12)
	if err != nil {
		t.Fatal(err)
	}
	sampled, _ := absMax(tr.Field)
	for i, v := range tr.Field {
		tr.Field[i] = math.Sin(gammaPeak * v)
	}
	tr.Absolute = false
	return tr, gammaPeak * sampled
}

// TestCalibrateEO checks the conversion of a whole trace and its cautions:
// over-rotation above |dI/I| = 0.1 (physics.md §3) and the detector band
// (TO phonon 5.3 THz in ZnTe, 11 THz in GaP, physics.md §3, from memory;
// the -20 dB band of a single-cycle pulse reaches 2.76 f_peak, derived in
// TestAnalyzeWorkedCheck).
func TestCalibrateEO(t *testing.T) {
	gap := EOSetup{Crystal: GaP, ThicknessM: 0.3e-3, ProbeWavelengthM: 800e-9}
	cases := []struct {
		name      string
		setup     EOSetup
		peakHz    float64
		gammaPeak float64
		want      []caution.Code
	}{
		{"small signal at 1 THz in ZnTe", znte1mm, 1e12, 0.05, nil},
		{"over-rotation", znte1mm, 1e12, 0.3, []caution.Code{caution.EOOverRotation}},
		{"3 THz pulse in ZnTe reaches the phonon", znte1mm, 3e12, 0.05, []caution.Code{caution.DetectorBandLimit}},
		{"3 THz pulse in GaP is within its band", gap, 3e12, 0.05, nil},
	}
	for _, c := range cases {
		mod, gMax := modulationTrace(t, c.peakHz, c.gammaPeak)
		cal, err := CalibrateEO(c.setup, mod)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		var got []caution.Code
		for _, cc := range cal.Cautions {
			got = append(got, cc.Code)
		}
		if len(got) != len(c.want) || (len(got) == 1 && got[0] != c.want[0]) {
			t.Errorf("%s: cautions %v, want %v", c.name, got, c.want)
		}
		// Every sample sin Γ maps back through the arcsin to Γ·k (physics.md
		// §3), so the peak is the largest sampled Γ times k; round-off.
		k := c.setup.FieldPerModulation()
		if !within(cal.PeakFieldVPerM, gMax*k, 1e-12*k) || !cal.Trace.Absolute {
			t.Errorf("%s: peak %.12g V/m, want %.12g", c.name, cal.PeakFieldVPerM, gMax*k)
		}
	}
	mod, _ := modulationTrace(t, 1e12, 0.05)
	mod.Field[100] = 1
	if _, err := CalibrateEO(znte1mm, mod); !isInputError(err) {
		t.Errorf("|dI/I| = 1: error %v, want an *InputError", err)
	}
	if _, err := CalibrateEO(znte1mm, Trace{StepS: 1e-14, Field: []float64{0.1}}); !isInputError(err) {
		t.Errorf("one sample: error %v, want an *InputError", err)
	}
	if _, err := CalibrateEO(EOSetup{}, mod); !isInputError(err) {
		t.Errorf("empty setup: error %v, want an *InputError", err)
	}
}
