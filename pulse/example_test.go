package pulse_test

import (
	"fmt"

	"thzdrive/pulse"
	"thzdrive/units"
)

// The worked checks of physics.md §2 and §3 (derived from the Gaussian
// integral and the calibration formula): a single-cycle pulse peaking at
// 1 THz with 100 kV/cm carries 10.18 uJ/cm²; 1 uJ of the same waveform in a
// 500 um (1/e²) spot reaches about 500 kV/cm.
func Example() {
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 100 * units.KVPerCm}
	tr, err := m.Sample(10*units.Fs, 20*units.Ps)
	if err != nil {
		panic(err)
	}
	a, err := pulse.Analyze(tr, pulse.Processing{Window: pulse.WindowNone})
	if err != nil {
		panic(err)
	}
	fmt.Printf("spectral peak %.3f THz, resolution %.0f GHz\n", a.Metrics.SpectralPeakHz/units.THz, a.Metrics.ResolutionHz/units.GHz)
	fmt.Printf("fluence %.2f uJ/cm^2, cautions %d\n", a.Metrics.FluenceJPerM2/units.UJPerCm2, len(a.Cautions))

	spot := pulse.Spot{RadiusXM: 500 * units.Um, RadiusYM: 500 * units.Um}
	cal, err := pulse.CalibrateByEnergy(tr, 1*units.UJ, spot, pulse.FocusOption{})
	if err != nil {
		panic(err)
	}
	fmt.Printf("peak fluence %.1f uJ/cm^2, peak field %.0f kV/cm\n", cal.PeakFluenceJPerM2/units.UJPerCm2, cal.PeakFieldVPerM/units.KVPerCm)
	// Output:
	// spectral peak 1.000 THz, resolution 50 GHz
	// fluence 10.18 uJ/cm^2, cautions 0
	// peak fluence 254.6 uJ/cm^2, peak field 500 kV/cm
}

// Electro-optic sampling in 1 mm of ZnTe probed at 800 nm (physics.md §3).
func ExampleEOSetup() {
	s := pulse.EOSetup{Crystal: pulse.ZnTe, ThicknessM: 1 * units.Mm, ProbeWavelengthM: 800 * units.Nm}
	fmt.Printf("%.1f kV/cm per unit dI/I, half-wave field %.1f kV/cm\n", s.FieldPerModulation()/units.KVPerCm, s.HalfWaveField()/units.KVPerCm)
	e, err := s.FieldFromModulation(0.02)
	if err != nil {
		panic(err)
	}
	fmt.Printf("dI/I = 0.02 -> %.3f kV/cm\n", e/units.KVPerCm)
	_, err = s.FieldFromModulation(1)
	fmt.Println(err)
	// Output:
	// 28.7 kV/cm per unit dI/I, half-wave field 43.2 kV/cm
	// dI/I = 0.02 -> 0.573 kV/cm
	// pulse: modulation: dI/I = 1; a balanced signal has |dI/I| < 1
}
