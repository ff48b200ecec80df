package optics_test

import (
	"fmt"
	"math"
	"math/cmplx"

	"thzdrive/optics"
	"thzdrive/units"
)

// A 1 mm high-resistivity silicon window in front of the sample, its echoes
// outside the time window (incoherent): the field it passes is
// 4n/(1+n)² = 0.7005 of the incident one, and its first echo would follow
// the main pulse by 2nd/c = 22.80 ps (physics.md §4, for n = 3.4175 from
// Grischkowsky et al., JOSA B 7, 2006 (1990)). The attenuator's grids at 60°
// pass cos²60° = 0.25 of the field (Malus's law, twice).
func Example() {
	si, err := optics.Lookup("silicon-hr")
	if err != nil {
		fmt.Println(err)
		return
	}
	window := optics.Slab{Name: "window", Medium: si, ThicknessM: 1 * units.Mm, Incoherent: true}
	for _, elements := range [][]optics.Element{
		{window},
		{window, optics.Attenuator{AngleRad: 60 * math.Pi / 180}},
	} {
		ev, err := optics.NewEvaluator(optics.Train{
			Elements: elements,
			Target:   optics.Target{Layer: optics.ExitMedium}, // no sample: the field in air behind the train
		})
		if err != nil {
			fmt.Println(err)
			return
		}
		freqHz := []float64{0.5 * units.THz, 1 * units.THz, 2 * units.THz}
		field := make([]complex128, len(freqHz))
		if err := ev.Evaluate(freqHz, field, nil); err != nil {
			fmt.Println(err)
			return
		}
		for k, f := range freqHz {
			fmt.Printf("%d element(s), %.1f THz: |t| = %.4f\n", len(elements), f/units.THz, cmplx.Abs(field[k]))
		}
	}
	ev, _ := optics.NewEvaluator(optics.Train{Elements: []optics.Element{window}, Target: optics.Target{Layer: optics.ExitMedium}})
	echoes, _ := ev.Echoes(1 * units.THz)
	fmt.Printf("%s %q: first echo %.2f ps after the pulse\n", echoes[0].Field, echoes[0].Name, echoes[0].DelayS/units.Ps)
	// Output:
	// 1 element(s), 0.5 THz: |t| = 0.7005
	// 1 element(s), 1.0 THz: |t| = 0.7005
	// 1 element(s), 2.0 THz: |t| = 0.7005
	// 2 element(s), 0.5 THz: |t| = 0.1751
	// 2 element(s), 1.0 THz: |t| = 0.1751
	// 2 element(s), 2.0 THz: |t| = 0.1751
	// Elements[0] "window": first echo 22.80 ps after the pulse
}

// The field just inside a bulk GaAs crystal at normal incidence, 2/(1+ñ),
// from its Lorentz model (Hass & Henvis, J. Phys. Chem. Solids 23, 1099
// (1962): Ω_TO = 273.3 cm^-1, ε∞ = 10.89, Δε = 2.00, damping neglected),
// with its reststrahlen band from Ω_TO to Ω_LO = 297.3 cm^-1 (LST).
func ExampleReststrahlenBands() {
	gaas := optics.Dielectric{EpsInf: 10.89, Oscillators: []optics.Oscillator{{FreqHz: 273.3 * units.InvCm, DeltaEps: 2.00}}}
	for _, b := range optics.ReststrahlenBands(gaas) {
		fmt.Printf("reststrahlen band %.1f–%.1f cm^-1\n", b.LoHz/units.InvCm, b.HiHz/units.InvCm)
	}
	// Output:
	// reststrahlen band 273.3–297.3 cm^-1
}
