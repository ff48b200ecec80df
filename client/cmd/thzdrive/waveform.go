package main

import (
	"flag"
	"fmt"
	"os"
	"sort"
	"strconv"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
	"thzdrive/units"
)

// quantity is a flag holding a number with a unit, converted to the unit of
// the wire field it feeds (its name's suffix). A bare number is taken in that
// unit. Units come from package units (kind), plus the extra spellings of a
// quantity that package does not know (a cell volume in Å³, a mass in amu).
type quantity struct {
	kind     units.Kind // 0: only the extra spellings are accepted
	wireUnit string     // the unit of the wire field, e.g. "kV/cm"
	wireSI   float64    // SI value of one wireUnit
	extra    map[string]float64
	set      bool
	value    float64 // in wireUnit
	text     string
}

func (q *quantity) String() string { return q.text }

func (q *quantity) Set(s string) error {
	num, unit := splitQuantity(s)
	x, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return fmt.Errorf("%q is not a number with a unit (like %q)", s, "1.5 "+q.wireUnit)
	}
	if f, ok := q.extra[strings.ToLower(unit)]; ok || unit == "" {
		if !ok {
			f = q.wireSI
		}
		q.value, q.set, q.text = x*f/q.wireSI, true, s
		return nil
	}
	if q.kind == 0 {
		return fmt.Errorf("unknown unit %q; use %s", unit, strings.Join(q.accepted(), ", "))
	}
	one, err := units.Parse("1 "+unit, q.kind, q.wireUnit)
	if err != nil {
		if len(q.extra) > 0 {
			return fmt.Errorf("%v (also %s)", err, strings.Join(q.accepted(), ", "))
		}
		return err
	}
	// The factor to the wire unit, rounded to 15 digits so that "2 mm"
	// becomes exactly 2000 um rather than 1999.9999999999998.
	ratio, _ := strconv.ParseFloat(strconv.FormatFloat(one/q.wireSI, 'g', 15, 64), 64)
	q.value, q.set, q.text = x*ratio, true, s
	return nil
}

// accepted lists the extra spellings (or the wire unit alone).
func (q *quantity) accepted() []string {
	var out []string
	for k := range q.extra {
		out = append(out, k)
	}
	if len(out) == 0 {
		out = append(out, q.wireUnit)
	}
	sort.Strings(out)
	return out
}

// splitQuantity splits "1.2 MV/cm" into "1.2" and "MV/cm" as units.Parse
// does: the number is the leading run of digits, signs, points and
// exponents.
func splitQuantity(s string) (num, unit string) {
	s = strings.TrimSpace(s)
	i := 0
	for i < len(s) && (s[i] >= '0' && s[i] <= '9' || strings.ContainsRune("+-.eE", rune(s[i]))) {
		if (s[i] == 'e' || s[i] == 'E') && (i+1 >= len(s) || !strings.ContainsRune("+-0123456789", rune(s[i+1]))) {
			break
		}
		i++
	}
	return s[:i], strings.TrimSpace(s[i:])
}

func newQuantity(fs *flag.FlagSet, name string, kind units.Kind, wireUnit string, wireSI float64, usage string) *quantity {
	q := &quantity{kind: kind, wireUnit: wireUnit, wireSI: wireSI}
	fs.Var(q, name, fmt.Sprintf("%s (bare number: %s)", usage, wireUnit))
	return q
}

// newOwnQuantity is a quantity in a unit package units does not list: only
// the given spellings (lower case, each with its value in wire units) and a
// bare number are accepted.
func newOwnQuantity(fs *flag.FlagSet, name, wireUnit string, spellings map[string]float64, usage string) *quantity {
	q := &quantity{wireUnit: wireUnit, wireSI: 1, extra: spellings}
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
