package main

import (
	"flag"
	"fmt"
	"os"
	"strconv"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
	"thzdrive/units"
)

// quantity is a flag holding a number with a unit, converted to the unit of
// the wire field it feeds (its name's suffix). A bare number is taken in that
// unit; units.Parse (the one unit table) reads the rest.
type quantity struct {
	kind     units.Kind
	wireUnit string  // the unit of the wire field, e.g. "kV/cm"
	wireSI   float64 // SI value of one wireUnit
	set      bool
	value    float64 // in wireUnit
	text     string
}

func (q *quantity) String() string { return q.text }

func (q *quantity) Set(s string) error {
	si, err := units.Parse(s, q.kind, q.wireUnit)
	if err != nil {
		return err
	}
	// Rounded to 15 digits so that "2 mm" becomes exactly 2000 um rather
	// than 1999.9999999999998.
	q.value, _ = strconv.ParseFloat(strconv.FormatFloat(si/q.wireSI, 'g', 15, 64), 64)
	q.set, q.text = true, s
	return nil
}

func newQuantity(fs *flag.FlagSet, name string, kind units.Kind, wireUnit string, wireSI float64, usage string) *quantity {
	q := &quantity{kind: kind, wireUnit: wireUnit, wireSI: wireSI}
	fs.Var(q, name, fmt.Sprintf("%s (bare number: %s)", usage, wireUnit))
	return q
}

// waveformFlags are the flags that describe a waveform: a model pulse or a
// trace file.
type waveformFlags struct {
	traceFile     *string
	traceUnit     *string
	shape         *string
	peakFrequency *quantity
	carrier       *quantity
	envelopeFWHM  *quantity
	phaseRad      *float64
	peakField     *quantity
	step          *quantity
	span          *quantity
}

func addWaveformFlags(fs *flag.FlagSet) *waveformFlags {
	return &waveformFlags{
		traceFile:     fs.String("trace", "", "two-column trace file (time in ps, field); '-' reads standard input"),
		traceUnit:     fs.String("trace-unit", "arb", "field unit of the trace file: kV/cm or arb"),
		shape:         fs.String("shape", "single-cycle", "model pulse: single-cycle, central-lobe or carrier"),
		peakFrequency: newQuantity(fs, "peak-frequency", units.Frequency, "THz", units.THz, "spectral peak of a single-cycle or central-lobe model"),
		carrier:       newQuantity(fs, "carrier-frequency", units.Frequency, "THz", units.THz, "carrier frequency of a carrier model"),
		envelopeFWHM:  newQuantity(fs, "envelope-fwhm", units.Time, "ps", units.Ps, "FWHM of |E|^2 of a carrier model"),
		phaseRad:      fs.Float64("carrier-phase", 0, "carrier-envelope phase of a carrier model, rad"),
		peakField:     newQuantity(fs, "peak-field", units.Field, "kV/cm", units.KVPerCm, "peak field E0 of the model"),
		step:          newQuantity(fs, "step", units.Time, "fs", units.Fs, "sample step of the model"),
		span:          newQuantity(fs, "span", units.Time, "ps", units.Ps, "time window of the model"),
	}
}

var shapeNames = map[string]thzdrivev1.PulseShape{
	"single-cycle": thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE,
	"central-lobe": thzdrivev1.PulseShape_PULSE_SHAPE_CENTRAL_LOBE,
	"carrier":      thzdrivev1.PulseShape_PULSE_SHAPE_CARRIER,
}

func (f *waveformFlags) waveform() (*thzdrivev1.Waveform, error) {
	if *f.traceFile != "" {
		tr, err := readTraceFile(*f.traceFile, *f.traceUnit)
		if err != nil {
			return nil, err
		}
		return &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: tr}}, nil
	}
	shape, ok := shapeNames[*f.shape]
	if !ok {
		return nil, usagef("--shape %q: use single-cycle, central-lobe or carrier", *f.shape)
	}
	return &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
		Shape:               shape,
		PeakFrequencyThz:    f.peakFrequency.value,
		CarrierFrequencyThz: f.carrier.value,
		EnvelopeFwhmPs:      f.envelopeFWHM.value,
		CarrierPhaseRad:     *f.phaseRad,
		PeakFieldKvPerCm:    f.peakField.value,
		StepFs:              f.step.value,
		SpanPs:              f.span.value,
	}}}, nil
}

func readTraceFile(path, unit string) (*thzdrivev1.SampledTrace, error) {
	var fu thzdrivev1.FieldUnit
	switch strings.ToLower(unit) {
	case "kv/cm":
		fu = thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM
	case "arb", "a.u.", "au":
		fu = thzdrivev1.FieldUnit_FIELD_UNIT_ARBITRARY
	default:
		return nil, usagef("--trace-unit %q: use kV/cm or arb", unit)
	}
	in := os.Stdin
	if path != "-" {
		f, err := os.Open(path)
		if err != nil {
			return nil, usagef("%v", err)
		}
		defer f.Close()
		in = f
	}
	tr, err := client.ReadTrace(in, fu)
	if err != nil {
		return nil, usagef("%s: %v", path, err)
	}
	return tr, nil
}
