package main

import (
	"flag"
	"fmt"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/units"
)

func runHeat(a *app, args []string) error {
	fs := flag.NewFlagSet("heat", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	fluence := newQuantity(fs, "fluence", units.Fluence, "uJ/cm2", units.UJPerCm2, "incident peak fluence (or --energy and --spot-radius)")
	energy := newQuantity(fs, "energy", units.Energy, "uJ", units.UJ, "incident pulse energy")
	spot := newQuantity(fs, "spot-radius", units.Length, "um", units.Um, "1/e^2 intensity radius of the spot (needed with --rep-rate)")
	absorbed := fs.Float64("absorbed-fraction", 0, "fraction of the incident energy absorbed in the sample, (0, 1]")
	absorbedFluence := newQuantity(fs, "absorbed-fluence", units.Fluence, "uJ/cm2", units.UJPerCm2, "absorbed peak fluence, instead of --absorbed-fraction")
	film := newQuantity(fs, "film-thickness", units.Length, "um", units.Um, "a thin film: the energy is spread evenly over this thickness")
	depth := newQuantity(fs, "absorption-depth", units.Length, "um", units.Um, "a bulk sample: absorption depth 1/alpha")
	alpha := newQuantity(fs, "absorption-coefficient", units.Absorption, "1/cm", units.PerCm, "a bulk sample: intensity absorption coefficient alpha")
	capacity := newQuantity(fs, "heat-capacity", units.HeatCapacity, "J/(cm3 K)", units.JPerCm3, "constant volumetric heat capacity (or the Debye model below)")
	debye := newQuantity(fs, "debye-temperature", units.Temperature, "K", 1, "Debye temperature Theta of the Debye heat capacity")
	atoms := newQuantity(fs, "atoms-per-nm3", units.NumberDensity, "1/nm3", 1/(units.Nm*units.Nm*units.Nm), "atoms per volume of the Debye heat capacity")
	base := newQuantity(fs, "base-temperature", units.Temperature, "K", 1, "base (cryostat) temperature")
	tc := newQuantity(fs, "tc", units.Temperature, "K", 1, "transition temperature Tc (omit: no transition budget)")
	rep := newQuantity(fs, "rep-rate", units.Rate, "kHz", 1e3, "repetition rate (omit: a single shot)")
	conductivity := newQuantity(fs, "conductivity", units.Conductivity, "W/(m K)", units.WPerMK, "thermal conductivity under the spot (needed with --rep-rate)")
	zNu := fs.Float64("z-nu", 0, "dynamic-scaling exponent z·nu for the slowing down near Tc (default 1, mean field)")
	damage := fs.String("damage-class", "", "damage rule of thumb: dielectric or semiconductor (metals and semiconductors)")
	damageThreshold := newQuantity(fs, "damage-threshold", units.Fluence, "mJ/cm2", units.MJPerCm2, "your own single-shot damage fluence (overrides --damage-class)")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive heat [flags]

How far the pump heats the spot: the temperature just after one pulse, the
steady state a pulse train settles to at the spot centre (a Gaussian spot on
a half-space, Lax 1977), the margin to a transition temperature Tc and how
much slower the relaxation becomes near it. The sample is a thin film
(--film-thickness) or bulk (--absorption-depth or --absorption-coefficient);
its heat capacity is a constant (--heat-capacity) or the Debye model
(--debye-temperature and --atoms-per-nm3).

Example:
  thzdrive heat --fluence "150 uJ/cm2" --absorbed-fraction 0.3 \
      --absorption-depth "20 um" --debye-temperature "300 K" --atoms-per-nm3 50 \
      --base-temperature "10 K" --tc "25 K" --rep-rate "1 kHz" \
      --spot-radius "340 um" --conductivity 5

Flags:
`)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	req := &thzdrivev1.EstimateHeatingRequest{
		IncidentFluenceUjPerCm2:    fluence.value,
		AbsorbedFraction:           *absorbed,
		AbsorbedFluenceUjPerCm2:    absorbedFluence.value,
		PulseEnergyUj:              energy.value,
		SpotRadiusUm:               spot.value,
		RepetitionRateKhz:          rep.value,
		ThermalConductivityWPerMK:  conductivity.value,
		BaseTemperatureK:           base.value,
		TransitionTemperatureK:     tc.value,
		ZNu:                        *zNu,
		DamageThresholdMjPerCm2:    damageThreshold.value,
		AbsorptionCoefficientPerCm: alpha.value,
		AbsorptionDepthUm:          depth.value,
		ThicknessUm:                film.value,
	}
	switch {
	case film.set && (depth.set || alpha.set):
		return usagef("a sample is a film (--film-thickness) or bulk (--absorption-depth or --absorption-coefficient), not both")
	case film.set:
		req.Geometry = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM
	case depth.set || alpha.set:
		req.Geometry = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK
	}
	switch {
	case capacity.set && (debye.set || atoms.set):
		return usagef("give --heat-capacity, or --debye-temperature with --atoms-per-nm3, not both")
	case capacity.set:
		req.HeatCapacity = &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_ConstantJPerCm3K{ConstantJPerCm3K: capacity.value}}
	case debye.set || atoms.set:
		req.HeatCapacity = &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Debye{Debye: &thzdrivev1.DebyeModel{DebyeTemperatureK: debye.value, AtomsPerNm3: atoms.value}}}
	}
	switch strings.ToLower(*damage) {
	case "":
	case "dielectric":
		req.DamageClass = thzdrivev1.DamageClass_DAMAGE_CLASS_DIELECTRIC
	case "semiconductor", "metal", "metal-or-semiconductor":
		req.DamageClass = thzdrivev1.DamageClass_DAMAGE_CLASS_METAL_OR_SEMICONDUCTOR
	default:
		return usagef("--damage-class %q: use dielectric or semiconductor", *damage)
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.EstimateHeating(ctx, req)
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	r := &report{title: "thzdrive: heating and transition budget", cautions: resp.Cautions}
	heatingSections(r, resp.Budget, resp.Resolved.GetTransitionTemperatureK(), resp.Resolved.GetRepetitionRateKhz())
	r.print(a.stdout)
	return nil
}

// heatingSections reports a heating budget; heat and plan share it.
func heatingSections(r *report, b *thzdrivev1.HeatingBudget, tc, repKHz float64) {
	s := r.section("Absorbed energy")
	s.add("incident peak fluence", b.IncidentFluenceUjPerCm2, "uJ/cm2")
	s.add("absorbed peak fluence", b.AbsorbedFluenceUjPerCm2, "uJ/cm2")
	if b.AbsorbedPulseEnergyUj > 0 {
		s.add("absorbed per pulse", b.AbsorbedPulseEnergyUj, "uJ")
	}
	if b.AbsorptionDepthUm > 0 {
		s.add("absorption depth", b.AbsorptionDepthUm, "um")
	}
	s.add("peak energy density", b.PeakEnergyDensityJPerCm3, "J/cm3")
	if b.DamageThresholdMjPerCm2 > 0 {
		s.add("damage fluence (rule of thumb)", b.DamageThresholdMjPerCm2, "mJ/cm2")
	}
	s = r.section("Temperatures at the spot centre")
	if repKHz > 0 {
		s.add("average absorbed power", b.AbsorbedPowerMw, "mW")
		s.add("steady-state rise", b.SteadyStateRiseK, "K")
		s.add("steady-state temperature", b.SteadyStateTemperatureK, "K")
	}
	s.add("rise of one pulse", b.SinglePulseRiseK, "K")
	s.add("peak temperature", b.PeakTemperatureK, "K")
	if tc > 0 {
		s = r.section("Transition budget")
		s.add("Tc", tc, "K")
		s.add("margin Tc - peak", b.MarginK, "K")
		s.add("  as a fraction of Tc", b.MarginFractionOfTc, "")
		s.add("reduced temperature, base", b.ReducedTemperatureBase, "")
		if repKHz > 0 {
			s.add("  steady state", b.ReducedTemperatureSteadyState, "")
		}
		s.add("  peak", b.ReducedTemperaturePeak, "")
		if b.RelaxationFactorSteadyState > 0 && repKHz > 0 {
			s.add("relaxation slower by, steady state", b.RelaxationFactorSteadyState, "x")
		}
		if b.RelaxationFactorPeak > 0 {
			s.add("relaxation slower by, peak", b.RelaxationFactorPeak, "x")
		}
	}
}
