package main

import (
	"flag"
	"fmt"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/units"
)

// modeHelp explains the mode flags; drive and size share it.
const modeHelp = `The mode is a damped Lorentz oscillator: --mode-frequency, --linewidth,
its strength (--delta-eps, or --effective-charge Z* in e/sqrt(amu)) and
--cell-volume; add --effective-mass and --bond-length for the ion
displacement and the Lindemann ratio. When the sample has a dielectric model
(a scenario file), drive one of its own oscillators with --oscillator N (or
mode.target_oscillator in the file) so the screening of the field and the
drive of the mode are one description. Each mode flag replaces one field of
the scenario's mode.
`

func runDrive(a *app, args []string) error {
	fs := flag.NewFlagSet("drive", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	cf := addChainFlags(fs)
	mf := addModeFlags(fs)
	csvPath := fs.String("csv", "", "write Q(t) to FILE as CSV: time (ps), field inside (kV/cm), Q (Å·sqrt(amu)) [, depth-averaged Q]; '-' is standard output")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive drive [flags]

How hard the pulse drives a phonon mode: the field inside the sample (after
the beam path and the sample's own screening), the mode's peak amplitude
max|Q|, the peak ion displacement and its ratio to the bond length, the
energy left in the mode (meV and quanta per cell), and how well the pulse's
spectrum overlaps the mode. Without a sample the waveform is taken as the
field inside.

%s
%s
Examples:
  thzdrive drive --peak-field "1 MV/cm" --peak-frequency "5 THz" \
      --mode-frequency "8 THz" --linewidth "0.3 THz" --delta-eps 0.5 \
      --cell-volume 45 --effective-mass 40 --bond-length "2.4 A"
  thzdrive drive --scenario examples/demo-scenario.yaml --csv q.csv

Flags:
`, chainHelp, modeHelp)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	req, err := cf.request()
	if err != nil {
		return err
	}
	if err := mf.apply(req); err != nil {
		return err
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	w, cal, err := absoluteWaveform(ctx, c, req)
	if err != nil {
		return err
	}
	resp, err := c.DriveMode(ctx, driveRequest(req, w))
	if err != nil {
		return err
	}
	if *csvPath != "" {
		if err := a.writeModeCSV(*csvPath, resp.Drive); err != nil {
			return err
		}
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	r := &report{title: "thzdrive: mode drive", cautions: append(cal.GetCautions(), resp.Cautions...)}
	sourceSection(r, cal, req)
	if resp.Resolved.GetSample() != nil {
		s := r.section("Optics")
		trainRows(s, resp.Resolved.GetTrain())
		s.text("sample", describeSample(resp.Resolved.GetSample()))
	}
	modeSection(r, "Mode", resp.Drive)
	r.print(a.reportWriter(*csvPath))
	return nil
}

// modeSection reports a mode's response.
func modeSection(r *report, title string, d *thzdrivev1.ModeDrive) {
	s := r.section(title)
	s.add("peak |E| driving the mode", d.PeakFieldInsideKvPerCm, "kV/cm")
	s.add("max |Q|", d.MaxQASqrtAmu, "Å·sqrt(amu)")
	s.add("  at", d.MaxQTimePs, "ps")
	if d.DepthAverageMaxQASqrtAmu > 0 {
		s.add("max |Q|, probe-depth average", d.DepthAverageMaxQASqrtAmu, "Å·sqrt(amu)")
	}
	if d.DisplacementPm > 0 {
		s.add("peak ion displacement", d.DisplacementPm, "pm")
	}
	if d.LindemannRatio > 0 {
		s.add("displacement / bond length", d.LindemannRatio, "")
	}
	s.add("mode energy per cell", d.ModeEnergyMev, "meV")
	s.add("  in quanta", d.Quanta, "")
	s.add("absorbed by the mode", d.AbsorbedEnergyDensityJPerCm3, "J/cm3")
	s.add("field-to-mode overlap", d.Overlap, "")
	s.add("|E(mode)| / max |E(f)|", d.RelativeAmplitudeAtMode, "")
	if d.AnharmonicShiftThz != 0 {
		s.add("anharmonic shift", d.AnharmonicShiftThz, "THz")
	}
	s.add("oscillator strength", d.DeltaEps, "")
	s.add("effective charge Z*", d.EffectiveChargeEPerSqrtAmu, "e/sqrt(amu)")
	s.text("solved by", strings.ToLower(strings.TrimPrefix(d.Method.String(), "DRIVE_METHOD_")))
}

// writeModeCSV writes the field inside and Q(t).
func (a *app) writeModeCSV(path string, d *thzdrivev1.ModeDrive) error {
	header := []string{"time (ps)", "field inside (kV/cm)", "Q (Å·sqrt(amu))"}
	times := traceTimes(d.GetFieldInside())
	if len(times) == 0 {
		q := d.GetQ()
		times = traceTimes(&thzdrivev1.SampledTrace{StartPs: q.GetStartPs(), StepFs: q.GetStepFs(), Field: q.GetQASqrtAmu()})
	}
	cols := [][]float64{times, d.GetFieldInside().GetField(), d.GetQ().GetQASqrtAmu()}
	if avg := d.GetQ().GetDepthAverageQASqrtAmu(); len(avg) > 0 {
		header = append(header, "depth-averaged Q (Å·sqrt(amu))")
		cols = append(cols, avg)
	}
	return a.writeColumns(path, header, cols)
}

func runSize(a *app, args []string) error {
	fs := flag.NewFlagSet("size", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	cf := addChainFlags(fs)
	mf := addModeFlags(fs)
	targetQ := newQuantity(fs, "target-q", units.NormalCoordinate, "Å·sqrt(amu)", units.AngstromSqrtAmu, "target max |Q|")
	targetU := newQuantity(fs, "target-displacement", units.Length, "pm", units.Pm, "target peak ion displacement, e.g. \"1 pm\" (needs --effective-mass)")
	targetN := fs.Float64("target-quanta", 0, "target mode energy in quanta per cell")
	limit := newQuantity(fs, "source-limit", units.Energy, "uJ", units.UJ, "the most pulse energy the source gives (default: the scenario's pulse energy)")
	maxField := newQuantity(fs, "max-field", units.Field, "kV/cm", units.KVPerCm, "stop the search at this incident peak field (default 50 MV/cm)")
	csvPath := fs.String("csv", "", "write Q(t) at the sized field to FILE as CSV (as drive --csv); '-' is standard output")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive size [flags]

The inverse of drive: the incident peak field, pulse energy and peak fluence
that bring the mode to a target amplitude (--target-q, --target-displacement
or --target-quanta), and the margin against what the source can give
(--source-limit). Only the waveform's shape matters; the focal spot
(--spot-radius or --spot-fwhm, or the scenario's) turns field into energy.

%s
%s
Examples:
  thzdrive size --target-displacement "1 pm" --spot-fwhm "400 um" --source-limit "3 uJ" \
      --peak-frequency "5 THz" --mode-frequency "8 THz" --linewidth "0.3 THz" \
      --delta-eps 0.5 --cell-volume 45 --effective-mass 40
  thzdrive size --scenario examples/demo-scenario.yaml --target-quanta 0.1

Flags:
`, chainHelp, modeHelp)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	set := setFlags(fs)
	req, err := cf.request()
	if err != nil {
		return err
	}
	if err := mf.apply(req); err != nil {
		return err
	}
	sreq := &thzdrivev1.SizeFieldRequest{Drive: driveRequest(req, req.Waveform)}
	given := 0
	if targetQ.set {
		sreq.Target, given = &thzdrivev1.SizeFieldRequest_MaxQASqrtAmu{MaxQASqrtAmu: targetQ.value}, given+1
	}
	if targetU.set {
		sreq.Target, given = &thzdrivev1.SizeFieldRequest_DisplacementPm{DisplacementPm: targetU.value}, given+1
	}
	if set["target-quanta"] {
		sreq.Target, given = &thzdrivev1.SizeFieldRequest_Quanta{Quanta: *targetN}, given+1
	}
	if given != 1 {
		return usagef("give one target: --target-q, --target-displacement or --target-quanta")
	}
	if cal := req.GetCalibration(); cal != nil {
		sreq.SpotX, sreq.SpotY = cal.SpotX, cal.SpotY
	}
	if sreq.SpotX == nil {
		return usagef("give the focal spot: --spot-radius or --spot-fwhm (or a scenario with a calibration spot)")
	}
	switch {
	case limit.set:
		sreq.SourceLimitUj = limit.value
	case hasEnergy(req.Calibration):
		sreq.SourceLimitUj = req.Calibration.GetPulseEnergyUj()
	}
	if maxField.set {
		sreq.MaxPeakFieldKvPerCm = maxField.value
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.SizeField(ctx, sreq)
	if err != nil {
		return err
	}
	if *csvPath != "" && resp.Drive != nil {
		if err := a.writeModeCSV(*csvPath, resp.Drive); err != nil {
			return err
		}
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	r := &report{title: "thzdrive: field sizing", cautions: resp.Cautions}
	s := r.section("Target")
	switch t := sreq.Target.(type) {
	case *thzdrivev1.SizeFieldRequest_MaxQASqrtAmu:
		s.add("max |Q|", t.MaxQASqrtAmu, "Å·sqrt(amu)")
		s.add("  reached", resp.Achieved, "Å·sqrt(amu)")
	case *thzdrivev1.SizeFieldRequest_DisplacementPm:
		s.add("peak ion displacement", t.DisplacementPm, "pm")
		s.add("  reached", resp.Achieved, "pm")
	case *thzdrivev1.SizeFieldRequest_Quanta:
		s.add("mode energy in quanta", t.Quanta, "")
		s.add("  reached", resp.Achieved, "")
	}
	s = r.section("What it takes")
	if resp.Reachable {
		s.text("reachable", "yes")
	} else {
		s.text("reachable", "NO: not below the search limit")
	}
	s.add("incident peak |E|", resp.IncidentPeakFieldKvPerCm, "kV/cm")
	s.add("pulse energy", resp.PulseEnergyUj, "uJ")
	s.add("peak fluence", resp.PeakFluenceUjPerCm2, "uJ/cm2")
	if sreq.SourceLimitUj > 0 {
		s.add("source limit", sreq.SourceLimitUj, "uJ")
		s.add("source margin (limit / needed)", resp.SourceMargin, "")
	}
	if resp.Drive != nil {
		modeSection(r, "Mode at that field", resp.Drive)
	}
	r.print(a.reportWriter(*csvPath))
	return nil
}
