package tdsfit_test

import (
	"fmt"
	"math"

	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/tdsfit"
	"thzdrive/units"
)

// A time-domain measurement of 500 um of high-resistivity silicon
// (n = 3.4175, Grischkowsky et al. 1990, from memory), with the window
// closing before the first echo: the sample trace is the reference carried
// through the slab by package optics. The extraction gives the index back.
func Example() {
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}
	ref := pulse.Trace{StartS: -3 * units.Ps, StepS: 20 * units.Fs, Field: make([]float64, 800)}
	for i := range ref.Field {
		ref.Field[i] = m.At(ref.TimeS(i))
	}
	slab := optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 500 * units.Um, Incoherent: true}
	ev, err := optics.NewEvaluator(optics.Train{Elements: []optics.Element{slab}, Target: optics.Target{Layer: optics.ExitMedium}})
	if err != nil {
		panic(err)
	}
	p, err := optics.Propagate(ev, ref, 0)
	if err != nil {
		panic(err)
	}
	sam := p.Target

	ex, err := tdsfit.ExtractFromTraces(ref, sam, tdsfit.TransmissionOptions{},
		tdsfit.ExtractOptions{ThicknessM: 500 * units.Um, Echoes: tdsfit.NoEchoes})
	if err != nil {
		panic(err)
	}
	for i, f := range ex.FreqHz {
		if math.Abs(f-1*units.THz) < 1 {
			fmt.Printf("at %.2f THz: n = %.4f, kappa = %.4f\n", f/units.THz, real(ex.Index[i]), math.Abs(imag(ex.Index[i])))
		}
	}
	// Output:
	// at 1.00 THz: n = 3.4175, kappa = 0.0000
}

// The Tinkham formula with the worked values of physics.md §4: a film of
// sheet conductance 1/Z0 on a substrate of n = 3.42 transmits 0.8155 of the
// bare substrate's field, and the inversion gives the conductance back.
func ExampleSheetConductance() {
	ns := complex(3.42, 0)
	want := complex(1/units.VacuumImpedance, 0)
	tFilm := (1 + ns) / (1 + ns + complex(units.VacuumImpedance, 0)*want)
	s, err := tdsfit.SheetConductance(tFilm, ns)
	if err != nil {
		panic(err)
	}
	fmt.Printf("t_film/t_sub = %.4f, Z0·σd = %.6f\n", real(tFilm), units.VacuumImpedance*real(s))
	// Output:
	// t_film/t_sub = 0.8155, Z0·σd = 1.000000
}

// The response of a 1 mm ZnTe detector probed at 800 nm: flat at low
// frequency (t_THz = 2/(1+n)), zero where the crystal is two coherence
// lengths thick, and collapsed at the TO phonon.
func ExampleDetector_Response() {
	d, err := tdsfit.NewDetector(pulse.EOSetup{Crystal: pulse.ZnTe, ThicknessM: 1 * units.Mm, ProbeWavelengthM: 800 * units.Nm}, 0)
	if err != nil {
		panic(err)
	}
	for _, f := range []float64{0.1, 1, 2, 2.3167} {
		g := d.Response(f * units.THz)
		fmt.Printf("%.4f THz: |G| = %.3f, l_c = %.0f um\n", f, math.Hypot(real(g), imag(g)), d.CoherenceLengthM(f*units.THz)/units.Um)
	}
	g := d.Response(5.32 * units.THz)
	fmt.Printf("at the TO phonon: |G| = %.0e\n", math.Hypot(real(g), imag(g)))
	// Output:
	// 0.1000 THz: |G| = 0.480, l_c = 42127 um
	// 1.0000 THz: |G| = 0.455, l_c = 2978 um
	// 2.0000 THz: |G| = 0.184, l_c = 736 um
	// 2.3167 THz: |G| = 0.004, l_c = 500 um
	// at the TO phonon: |G| = 3e-05
}
