package main

import (
	"flag"
	"fmt"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/units"
)

func runCalibrate(a *app, args []string) error {
	fs := flag.NewFlagSet("calibrate", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	wf := addWaveformFlags(fs)
	energy := newQuantity(fs, "energy", units.Energy, "uJ", units.UJ, "pulse energy")
	power := newQuantity(fs, "average-power", units.Power, "mW", units.MW, "average power (with --rep-rate, instead of --energy)")
	rep := newQuantity(fs, "rep-rate", units.Rate, "kHz", 1e3, "repetition rate")
	radius := newQuantity(fs, "spot-radius", units.Length, "um", units.Um, "1/e^2 intensity radius of the focal spot")
	fwhm := newQuantity(fs, "spot-fwhm", units.Length, "um", units.Um, "intensity FWHM of the focal spot")
	knife := newQuantity(fs, "knife-edge", units.Length, "um", units.Um, "10-90 % knife-edge width of the focal spot")
	radiusY := newQuantity(fs, "spot-radius-y", units.Length, "um", units.Um, "1/e^2 radius along y, for an elliptical spot")
	focus := fs.Bool("focus", false, "also compute the diffraction-limited focus, w(f) ∝ 1/f")
	focusRef := newQuantity(fs, "focus-reference", units.Frequency, "THz", units.THz, "frequency at which the spot was measured (default: spectral peak)")
	crystal := fs.String("eo-crystal", "", "electro-optic calibration with this crystal: znte, gap or custom")
	eoThick := newQuantity(fs, "eo-thickness", units.Length, "um", units.Um, "electro-optic crystal thickness")
	probe := newQuantity(fs, "probe-wavelength", units.Length, "nm", units.Nm, "probe wavelength (default 800 nm)")
	modulation := fs.Float64("modulation", 0, "peak balanced signal dI/I, |dI/I| < 1")
	modTrace := fs.String("modulation-trace", "", "two-column file: time in ps, dI/I (instead of --modulation and a waveform)")
	nProbe := fs.Float64("n-probe", 0, "override: crystal index at the probe wavelength")
	r41 := fs.Float64("r41", 0, "override: electro-optic coefficient r41, pm/V")
	nTHz := fs.Float64("n-thz", 0, "override: crystal THz index")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive calibrate [flags]

Absolute field of a waveform, either from its pulse energy and focal spot
(F0 = 2W/(pi w^2), E = sqrt(Z0 F0 / integral of g^2)), or from an
electro-optic signal dI/I in a ZnTe or GaP crystal (Planken et al. 2001).

Examples:
  thzdrive calibrate --energy 1uJ --spot-radius 500um --peak-frequency 1THz
  thzdrive calibrate --eo-crystal znte --eo-thickness 1mm --modulation 0.05

Flags:
`)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	req := &thzdrivev1.CalibrateFieldRequest{}
	if *modTrace == "" {
		w, err := wf.waveform()
		if err != nil {
			return err
		}
		req.Waveform = w
	}
	if *crystal != "" {
		eo := &thzdrivev1.ElectroOpticCalibration{ThicknessUm: eoThick.value, ProbeWavelengthNm: probe.value, PeakModulation: *modulation}
		switch strings.ToLower(*crystal) {
		case "znte":
			eo.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE
		case "gap":
			eo.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP
		case "custom":
			eo.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM
		default:
			return usagef("--eo-crystal %q: use znte, gap or custom", *crystal)
		}
		if *nProbe != 0 {
			eo.NProbe = nProbe
		}
		if *r41 != 0 {
			eo.R41PmPerV = r41
		}
		if *nTHz != 0 {
			eo.NThz = nTHz
		}
		if *modTrace != "" {
			tr, err := readTraceFile(*modTrace, "arb")
			if err != nil {
				return err
			}
			eo.ModulationTrace = tr
		}
		req.Method = &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: eo}
	} else {
		e := &thzdrivev1.EnergyCalibration{FocusScaling: *focus, FocusReferenceFrequencyThz: focusRef.value}
		switch {
		case energy.set && power.set:
			return usagef("give --energy or --average-power with --rep-rate, not both")
		case energy.set:
			e.Energy = &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: energy.value}
		case power.set:
			e.Energy = &thzdrivev1.EnergyCalibration_AveragePower{AveragePower: &thzdrivev1.AveragePower{AveragePowerMw: power.value, RepetitionRateKhz: rep.value}}
		default:
			return usagef("give --energy (or --average-power and --rep-rate), or --eo-crystal for an electro-optic calibration")
		}
		switch {
		case radius.set:
			e.SpotX = &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: radius.value}}
		case fwhm.set:
			e.SpotX = &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_FwhmUm{FwhmUm: fwhm.value}}
		case knife.set:
			e.SpotX = &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_KnifeEdge_10_90Um{KnifeEdge_10_90Um: knife.value}}
		default:
			return usagef("give the focal spot: --spot-radius, --spot-fwhm or --knife-edge")
		}
		if radiusY.set {
			e.SpotY = &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: radiusY.value}}
		}
		req.Method = &thzdrivev1.CalibrateFieldRequest_Energy{Energy: e}
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.CalibrateField(ctx, req)
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	r := &report{title: "thzdrive: field calibration", cautions: resp.Cautions}
	s := r.section("Absolute field")
	s.add("peak |E|", resp.PeakFieldKvPerCm, "kV/cm")
	s.add("peak fluence", resp.PeakFluenceUjPerCm2, "uJ/cm2")
	if resp.FocusedTrace != nil {
		s.add("peak |E| at diffraction-limited focus", resp.FocusedPeakFieldKvPerCm, "kV/cm")
	}
	if resp.HalfWaveFieldKvPerCm > 0 {
		s = r.section("Electro-optic detector")
		s.add("field per unit dI/I (small signal)", resp.FieldPerUnitModulationKvPerCm, "kV/cm")
		s.add("half-wave field", resp.HalfWaveFieldKvPerCm, "kV/cm")
	}
	r.print(a.stdout)
	return nil
}
