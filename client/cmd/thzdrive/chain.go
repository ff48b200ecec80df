package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
	"thzdrive/units"
)

// chainFlags describe the chain from the source into the sample for
// propagate, drive and size: a scenario file for anything (stacks, inline
// dielectric models, targets), and simple flags for the common case. A flag
// given on the command line replaces the matching part of the scenario:
// waveform flags the waveform, --energy and the spot flags the calibration,
// --window and --attenuator the train, --sample the sample, --depth the
// placement of the target.
type chainFlags struct {
	fs         *flag.FlagSet
	scenario   *string
	wf         *waveformFlags
	energy     *quantity
	spotRadius *quantity
	spotFWHM   *quantity
	windows    multiFlag
	attenuator *quantity
	sample     *string
	depth      *quantity
}

// multiFlag is a repeatable string flag.
type multiFlag []string

func (m *multiFlag) String() string     { return strings.Join(*m, " ") }
func (m *multiFlag) Set(s string) error { *m = append(*m, s); return nil }

func addChainFlags(fs *flag.FlagSet) *chainFlags {
	c := &chainFlags{fs: fs}
	c.scenario = fs.String("scenario", "", "scenario file (YAML or JSON, a PlanExperimentRequest); the flags below replace its parts")
	c.wf = addWaveformFlags(fs)
	c.energy = newQuantity(fs, "energy", units.Energy, "uJ", units.UJ, "pulse energy that calibrates the waveform (with a spot)")
	c.spotRadius = newQuantity(fs, "spot-radius", units.Length, "um", units.Um, "1/e^2 intensity radius of the focal spot")
	c.spotFWHM = newQuantity(fs, "spot-fwhm", units.Length, "um", units.Um, "intensity FWHM of the focal spot")
	fs.Var(&c.windows, "window", "a window or filter in the beam, MATERIAL:THICKNESS[:coherent], e.g. silicon-hr:1mm (repeatable, in beam order; first pass only unless :coherent)")
	c.attenuator = newQuantity(fs, "attenuator", units.Angle, "deg", 0.017453292519943295, "wire-grid attenuator: rotation of the first grid, field x cos^2")
	c.sample = fs.String("sample", "", "catalogue material of a bulk sample (the exit medium), e.g. znte")
	c.depth = newQuantity(fs, "depth", units.Length, "um", units.Um, "take the field at this depth below the target's front surface")
	return c
}

// waveformFlagNames are the flags that describe the waveform.
var waveformFlagNames = map[string]bool{
	"trace": true, "trace-unit": true, "shape": true, "peak-frequency": true, "carrier-frequency": true,
	"envelope-fwhm": true, "carrier-phase": true, "peak-field": true, "step": true, "span": true,
}

// setFlags returns the names of the flags given on the command line.
func setFlags(fs *flag.FlagSet) map[string]bool {
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	return set
}

// request returns the plan request the chain flags describe: the scenario
// file, if any, with the parts the flags replace.
func (c *chainFlags) request() (*thzdrivev1.PlanExperimentRequest, error) {
	set := setFlags(c.fs)
	req := &thzdrivev1.PlanExperimentRequest{}
	if *c.scenario != "" {
		r, err := loadScenario(*c.scenario)
		if err != nil {
			return nil, err
		}
		req = r
	}
	waveformGiven := false
	for name := range set {
		waveformGiven = waveformGiven || waveformFlagNames[name]
	}
	if waveformGiven || req.Waveform == nil {
		w, err := c.wf.waveform()
		if err != nil {
			return nil, err
		}
		req.Waveform = w
	}
	if set["peak-field"] {
		if c.energy.set {
			return nil, usagef("give --peak-field (an absolute field) or --energy (which calibrates the shape), not both")
		}
		req.Calibration = nil // the field is given absolute
	}
	if err := c.applyCalibration(req); err != nil {
		return nil, err
	}
	if len(c.windows) > 0 || c.attenuator.set {
		req.Train = nil
		for i, spec := range c.windows {
			el, err := parseWindow(spec, i)
			if err != nil {
				return nil, err
			}
			req.Train = append(req.Train, el)
		}
		if c.attenuator.set {
			req.Train = append(req.Train, &thzdrivev1.TrainElement{Name: "attenuator",
				Kind: &thzdrivev1.TrainElement_Attenuator{Attenuator: &thzdrivev1.WireGridAttenuator{AngleDeg: c.attenuator.value}}})
		}
	}
	if *c.sample != "" {
		req.Sample = &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: *c.sample}}}
		req.Target = nil
	}
	if c.depth.set {
		if req.Target == nil {
			req.Target = &thzdrivev1.Target{}
		}
		req.Target.Placement = thzdrivev1.TargetPlacement_TARGET_PLACEMENT_DEPTH
		req.Target.DepthUm = c.depth.value
	}
	return req, nil
}

// applyCalibration puts --energy and the spot flags into the calibration.
func (c *chainFlags) applyCalibration(req *thzdrivev1.PlanExperimentRequest) error {
	spot, err := spotFlags(c.spotRadius, c.spotFWHM)
	if err != nil {
		return err
	}
	if !c.energy.set && spot == nil {
		return nil
	}
	if req.Calibration == nil {
		req.Calibration = &thzdrivev1.EnergyCalibration{}
	}
	if c.energy.set {
		req.Calibration.Energy = &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: c.energy.value}
	}
	if spot != nil {
		req.Calibration.SpotX, req.Calibration.SpotY = spot, nil
	}
	if c.energy.set && req.Calibration.SpotX == nil {
		return usagef("--energy needs the focal spot: --spot-radius or --spot-fwhm")
	}
	return nil
}

// spotFlags returns the spot the flags give, or nil.
func spotFlags(radius, fwhm *quantity) (*thzdrivev1.SpotSize, error) {
	switch {
	case radius.set && fwhm.set:
		return nil, usagef("give --spot-radius or --spot-fwhm, not both")
	case radius.set:
		return &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: radius.value}}, nil
	case fwhm.set:
		return &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_FwhmUm{FwhmUm: fwhm.value}}, nil
	}
	return nil, nil
}

// parseWindow reads MATERIAL:THICKNESS[:coherent].
func parseWindow(spec string, i int) (*thzdrivev1.TrainElement, error) {
	parts := strings.Split(spec, ":")
	if len(parts) < 2 || len(parts) > 3 || parts[0] == "" {
		return nil, usagef("--window %q: write MATERIAL:THICKNESS[:coherent], e.g. silicon-hr:1mm", spec)
	}
	q := &quantity{kind: units.Length, wireUnit: "um", wireSI: units.Um}
	if err := q.Set(parts[1]); err != nil {
		return nil, usagef("--window %q: thickness: %v", spec, err)
	}
	slab := &thzdrivev1.Slab{Medium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: parts[0]}}, ThicknessUm: q.value, Incoherent: true}
	if len(parts) == 3 {
		switch strings.ToLower(parts[2]) {
		case "coherent":
			slab.Incoherent = false
		case "incoherent", "first-pass":
		default:
			return nil, usagef("--window %q: the third part may only be coherent or incoherent", spec)
		}
	}
	return &thzdrivev1.TrainElement{Name: fmt.Sprintf("%s %s", parts[0], strings.TrimSpace(parts[1])), Kind: &thzdrivev1.TrainElement_Slab{Slab: slab}}, nil
}

// hasEnergy tells whether the calibration scales the waveform.
func hasEnergy(cal *thzdrivev1.EnergyCalibration) bool {
	return cal != nil && cal.Energy != nil
}

// absoluteWaveform returns the incident waveform in kV/cm: the plan's
// waveform when it is absolute, or the waveform calibrated by pulse energy
// and spot (CalibrateField) when the plan carries a calibration. The
// calibration's cautions come back tagged "source".
func absoluteWaveform(ctx context.Context, c *client.Client, req *thzdrivev1.PlanExperimentRequest) (*thzdrivev1.Waveform, *thzdrivev1.CalibrateFieldResponse, error) {
	if !hasEnergy(req.Calibration) {
		return req.Waveform, nil, nil
	}
	cal := proto.Clone(req.Calibration).(*thzdrivev1.EnergyCalibration)
	cal.FocusScaling = false
	resp, err := c.CalibrateField(ctx, &thzdrivev1.CalibrateFieldRequest{
		Waveform: req.Waveform,
		Method:   &thzdrivev1.CalibrateFieldRequest_Energy{Energy: cal},
	})
	if err != nil {
		return nil, nil, err
	}
	for _, cau := range resp.Cautions {
		if cau.Stage == "" {
			cau.Stage = "source"
		}
	}
	return &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: resp.CalibratedTrace}}, resp, nil
}

// sourceSection reports the calibration of the source, when there was one.
func sourceSection(r *report, cal *thzdrivev1.CalibrateFieldResponse, req *thzdrivev1.PlanExperimentRequest) {
	if cal == nil {
		return
	}
	s := r.section("Source (calibrated by pulse energy and spot)")
	s.add("pulse energy", req.Calibration.GetPulseEnergyUj(), "uJ")
	s.add("peak fluence", cal.PeakFluenceUjPerCm2, "uJ/cm2")
	s.add("incident peak |E|", cal.PeakFieldKvPerCm, "kV/cm")
}

// modeFlags describe a phonon mode. Each flag given replaces one field of
// the scenario's mode.
type modeFlags struct {
	frequency, linewidth, charge       *quantity
	deltaEps                           *float64
	oscillator                         *int
	cellVolume, mass, bond, probeDepth *quantity
	fs                                 *flag.FlagSet
}

func addModeFlags(fs *flag.FlagSet) *modeFlags {
	return &modeFlags{
		fs:         fs,
		frequency:  newQuantity(fs, "mode-frequency", units.Frequency, "THz", units.THz, "TO frequency of the mode, e.g. \"8 THz\", \"265 cm-1\", \"33 meV\""),
		linewidth:  newQuantity(fs, "linewidth", units.Frequency, "THz", units.THz, "FWHM linewidth of the mode"),
		deltaEps:   fs.Float64("delta-eps", 0, "oscillator strength of the mode (its step in the static permittivity)"),
		charge:     newQuantity(fs, "effective-charge", units.EffectiveCharge, "e/sqrt(amu)", units.ESqrtAmu, "mode effective charge Z*, instead of --delta-eps"),
		oscillator: fs.Int("oscillator", -1, "drive oscillator N of the target layer's dielectric model (scenario samples with an inline model); -1 drops the scenario's reference to one"),
		cellVolume: newQuantity(fs, "cell-volume", units.Volume, "Å^3", units.CubicAngstrom, "unit-cell volume"),
		mass:       newQuantity(fs, "effective-mass", units.Mass, "amu", units.Amu, "effective mass for the ion displacement"),
		bond:       newQuantity(fs, "bond-length", units.Length, "Å", units.Angstrom, "bond length for the Lindemann ratio"),
		probeDepth: newQuantity(fs, "probe-depth", units.Length, "nm", units.Nm, "probe penetration depth for the depth-averaged response"),
	}
}

// apply changes the request's mode by the flags given.
func (m *modeFlags) apply(req *thzdrivev1.PlanExperimentRequest) error {
	set := setFlags(m.fs)
	if req.Mode == nil {
		req.Mode = &thzdrivev1.PhononMode{}
	}
	md := req.Mode
	if set["oscillator"] {
		if *m.oscillator < 0 {
			md.TargetOscillator = nil
		} else {
			md.TargetOscillator = proto.Int32(int32(*m.oscillator))
		}
	}
	if m.frequency.set {
		md.FrequencyThz = m.frequency.value
	}
	if m.linewidth.set {
		md.LinewidthThz = m.linewidth.value
	}
	switch {
	case set["delta-eps"] && m.charge.set:
		return usagef("give --delta-eps or --effective-charge, not both")
	case set["delta-eps"]:
		md.Strength = &thzdrivev1.PhononMode_DeltaEps{DeltaEps: *m.deltaEps}
	case m.charge.set:
		md.Strength = &thzdrivev1.PhononMode_EffectiveChargeEPerSqrtAmu{EffectiveChargeEPerSqrtAmu: m.charge.value}
	}
	if m.cellVolume.set {
		md.CellVolumeA3 = m.cellVolume.value
	}
	if m.mass.set {
		md.EffectiveMassAmu = m.mass.value
	}
	if m.bond.set {
		md.BondLengthA = m.bond.value
	}
	if m.probeDepth.set {
		req.ProbeDepthNm = m.probeDepth.value
	}
	if md.TargetOscillator != nil && !set["oscillator"] && (m.frequency.set || m.linewidth.set || set["delta-eps"] || m.charge.set) {
		return usagef("the scenario's mode drives oscillator %d of the sample, which gives its frequency, linewidth and strength: add --oscillator -1 to describe the mode by flags instead", *md.TargetOscillator)
	}
	if proto.Equal(md, &thzdrivev1.PhononMode{}) {
		return usagef("describe the mode: --mode-frequency, --linewidth, --delta-eps and --cell-volume (or --oscillator N with a scenario whose sample has a dielectric model), or a scenario with a mode")
	}
	return nil
}

// driveRequest is the DriveMode request of a plan, with the incident
// waveform already absolute.
func driveRequest(req *thzdrivev1.PlanExperimentRequest, w *thzdrivev1.Waveform) *thzdrivev1.DriveModeRequest {
	return &thzdrivev1.DriveModeRequest{
		Waveform:     w,
		Train:        req.Train,
		Sample:       req.Sample,
		Target:       req.Target,
		Mode:         req.Mode,
		ProbeDepthNm: req.ProbeDepthNm,
		Method:       req.Method,
		PadToSamples: req.PadToSamples,
	}
}

// traceTimes returns the sample times of a trace, ps.
func traceTimes(tr *thzdrivev1.SampledTrace) []float64 {
	if len(tr.GetTimePs()) > 0 {
		return tr.TimePs
	}
	out := make([]float64, len(tr.GetField()))
	for i := range out {
		out[i] = tr.GetStartPs() + float64(i)*tr.GetStepFs()/1000
	}
	return out
}

// writeColumns writes a CSV table: a header naming each column with its
// unit, then one row per index; a shorter column leaves its cells empty.
// path "-" is standard output.
func (a *app) writeColumns(path string, header []string, cols [][]float64) error {
	var w io.Writer = a.stdout
	if path != "-" {
		f, err := os.Create(path)
		if err != nil {
			return usagef("--csv: %v", err)
		}
		defer f.Close()
		w = f
	}
	var b strings.Builder
	b.WriteString(strings.Join(csvQuote(header), ","))
	b.WriteByte('\n')
	n := 0
	for _, c := range cols {
		n = max(n, len(c))
	}
	for i := 0; i < n; i++ {
		for j, c := range cols {
			if j > 0 {
				b.WriteByte(',')
			}
			if i < len(c) {
				b.WriteString(fmtFloat(c[i]))
			}
		}
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// reportWriter is where the report for a person goes: standard output,
// unless a CSV table already goes there ('-'), then standard error.
func (a *app) reportWriter(csvPaths ...string) io.Writer {
	for _, p := range csvPaths {
		if p == "-" {
			return a.stderr
		}
	}
	return a.stdout
}

// csvQuote quotes the cells that need it.
func csvQuote(cells []string) []string {
	out := make([]string, len(cells))
	for i, c := range cells {
		if strings.ContainsAny(c, ",\"\n") {
			c = `"` + strings.ReplaceAll(c, `"`, `""`) + `"`
		}
		out[i] = c
	}
	return out
}
