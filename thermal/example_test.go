package thermal_test

import (
	"fmt"

	"thzdrive/thermal"
	"thzdrive/units"
)

// A 100 nm film absorbs half of a 1 mJ/cm^2 pump. By hand (derived):
// u = F·A/d = 10 J/m^2 × 0.5 / 1e-7 m = 5e7 J/m^3, and with C = 2.5e6
// J/(m^3 K) the spot heats by u/C = 20 K, from 300 K to 320 K, which is
// 10 K (3 %) short of Tc = 330 K: inside the default 5 % margin.
func ExampleEstimate() {
	c, err := thermal.NewConstant(2.5e6)
	if err != nil {
		fmt.Println(err)
		return
	}
	b, err := thermal.Estimate(thermal.Inputs{
		FluenceJPerM2:          1 * units.MJPerCm2,
		AbsorbedFraction:       0.5,
		Geometry:               thermal.Film,
		ThicknessM:             100 * units.Nm,
		HeatCapacity:           c,
		BaseTemperatureK:       300,
		TransitionTemperatureK: 330,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("energy density %.3g J/m^3\n", b.PeakEnergyDensityJPerM3)
	fmt.Printf("peak %.1f K, margin %.1f K to Tc\n", b.PeakTemperatureK, b.MarginK)
	for _, c := range b.Cautions {
		fmt.Println(c.Code)
	}
	// Output:
	// energy density 5e+07 J/m^3
	// peak 320.0 K, margin 10.0 K to Tc
	// SMALL_MARGIN
}

// Incropera et al., Fundamentals of Heat and Mass Transfer, problem 4.16:
// 0.45 W absorbed in a Gaussian spot of 1/e radius 0.1 mm on a half-space
// with k = 27 W/(m K). The exact rise is 47.02 K; the textbook prints 47.1 K
// (72.1 °C from 25 °C) after rounding its shape factor to 354e-6 m.
func ExampleLaxCentreRiseK() {
	rise, err := thermal.LaxCentreRiseK(0.45, 0.1*units.Mm, 27)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f K\n", rise)
	// Output: 47.02 K
}

// At T = Θ the Debye heat capacity is 0.9517 of Dulong–Petit (physics.md §6,
// Debye-function table: 0.95173214).
func ExampleDebyeCapacityRatio() {
	fmt.Printf("%.4f\n", thermal.DebyeCapacityRatio(1))
	// Output: 0.9517
}
