package phononmode_test

import (
	"fmt"
	"math"

	"thzdrive/phononmode"
	"thzdrive/units"
)

// The GaAs transverse-optical mode under a static 1 MV/cm inside the
// crystal (physics.md §5, derived from published GaAs parameters of Hass &
// Henvis (1962)): with Born charge 2.16, reduced mass 36.114 amu
// and W_TO = 268 cm⁻¹ the sublattices shift by Z_B·e·E/(μW²) = 0.2264 pm.
// Z* = 2.16/√36.114 e/√amu, and Born–Huang gives Δε = 1.960 (2.01 needs
// Z_B = 2.19).
func ExampleDiatomicZStar() {
	mu := 36.114 * units.Amu
	z, err := phononmode.DiatomicZStar(2.16, mu)
	if err != nil {
		panic(err)
	}
	m := phononmode.Mode{FreqHz: 268 * units.InvCm, ZStarCPerSqrtKg: z, CellVolumeM3: 45.168 * units.CubicAngstrom}
	x := m.StaticQMSqrtKg(units.MVPerCm) / math.Sqrt(mu)
	fmt.Printf("Z* = %.4f e/√amu, Δε = %.3f, x = %.4f pm\n", z/units.ESqrtAmu, m.OscillatorStrength(), x/units.Pm)
	// Output: Z* = 0.3594 e/√amu, Δε = 1.960, x = 0.2264 pm
}

// A single-cycle pulse peaking at the GaAs TO frequency (8.03 THz), 1 MV/cm
// inside the crystal, drives the mode; the Lindemann ratio uses the Ga–As
// bond length a·√3/4 (lattice constant of physics.md §5, a published GaAs
// value). The numbers printed are the package's own output,
// shown for orientation; the physics checks are in the tests.
func ExampleDrive() {
	a := 5.65325 * units.Angstrom
	m, err := phononmode.FromOscillatorStrength(12.9-10.89, 268*units.InvCm, 2.5*units.InvCm, a*a*a/4)
	if err != nil {
		panic(err)
	}
	m.EffectiveMassKg = 36.114 * units.Amu
	m.BondLengthM = a * math.Sqrt(3) / 4

	tau := 1 / m.OmegaRadPerS() // spectral peak of the pulse at the mode
	const n, step = 4096, 10e-15
	field := phononmode.Field{StepS: step, VPerM: make([]float64, n)}
	for i := range field.VPerM {
		x := (float64(i)*step - 1e-12) / tau
		field.VPerM[i] = units.MVPerCm * math.Sqrt(math.E) * x * math.Exp(-x*x/2)
	}
	r, err := phononmode.Drive(m, field, phononmode.Options{})
	if err != nil {
		panic(err)
	}
	fmt.Printf("method %v\n", r.Method)
	fmt.Printf("max|Q| = %.4f Å√amu, displacement %.3f pm, Lindemann %.5f\n",
		r.MaxAbsQMSqrtKg/units.AngstromSqrtAmu, r.DisplacementM/units.Pm, r.LindemannRatio)
	fmt.Printf("%.4f quanta per cell, absorbed %.3g J/cm³, overlap %.4f\n",
		r.Quanta, r.AbsorbedJPerM3/units.JPerCm3, r.Overlap)
	fmt.Println("cautions:", len(r.Cautions))
	// Output:
	// method exact
	// max|Q| = 0.0341 Å√amu, displacement 0.567 pm, Lindemann 0.00232
	// 0.0046 quanta per cell, absorbed 0.555 J/cm³, overlap 0.0121
	// cautions: 0
}
