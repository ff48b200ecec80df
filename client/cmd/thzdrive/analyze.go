package main

import (
	"errors"
	"flag"
	"fmt"
	"io"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

func runAnalyze(a *app, args []string) error {
	fs := flag.NewFlagSet("analyze", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	wf := addWaveformFlags(fs)
	window := fs.String("window", "none", "window before the transform: none, hann, tukey or blackman")
	tukey := fs.Float64("tukey-alpha", 0, "taper fraction of the Tukey window, (0, 1] (default 0.2)")
	baseline := fs.String("baseline", "", "offset removal: none, pre-pulse or linear (default: pre-pulse for traces, none for models)")
	pad := fs.Int("pad-to", 0, "zero-pad to at least this many samples")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), "Usage: thzdrive analyze [flags]\n\nSpectrum, metrics and cautions of a model pulse or of a measured trace\n(--trace FILE with two columns: time in ps, field).\n\nExample:\n  thzdrive analyze --shape single-cycle --peak-frequency 1THz --peak-field \"100 kV/cm\"\n\nFlags:\n")
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	w, err := wf.waveform()
	if err != nil {
		return err
	}
	proc := &thzdrivev1.Processing{TukeyAlpha: *tukey, PadToSamples: int32(*pad)}
	windows := map[string]thzdrivev1.TimeWindow{"none": thzdrivev1.TimeWindow_TIME_WINDOW_NONE, "hann": thzdrivev1.TimeWindow_TIME_WINDOW_HANN, "tukey": thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY, "blackman": thzdrivev1.TimeWindow_TIME_WINDOW_BLACKMAN}
	var ok bool
	if proc.Window, ok = windows[*window]; !ok {
		return usagef("--window %q: use none, hann, tukey or blackman", *window)
	}
	baselines := map[string]thzdrivev1.BaselineRemoval{"": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_UNSPECIFIED, "none": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_NONE, "pre-pulse": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_PRE_PULSE, "linear": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_LINEAR}
	if proc.Baseline, ok = baselines[*baseline]; !ok {
		return usagef("--baseline %q: use none, pre-pulse or linear", *baseline)
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.AnalyzePulse(ctx, &thzdrivev1.AnalyzePulseRequest{Waveform: w, Processing: proc})
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	m := resp.Metrics
	fieldUnit := "kV/cm"
	if resp.ProcessedTrace.GetFieldUnit() != thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM {
		fieldUnit = "arb. u."
	}
	r := &report{title: "thzdrive: pulse analysis", cautions: resp.Cautions}
	s := r.section("Time domain")
	s.add("peak |E|", m.PeakFieldKvPerCm, fieldUnit)
	s.add("at", m.PeakTimePs, "ps")
	s.add("sign at peak", float64(m.PeakSign), "")
	s.add("peak to peak", m.PeakToPeakKvPerCm, fieldUnit)
	s.add("DC area ratio", m.DcAreaRatio, "")
	s.add("edge ratio", m.EdgeRatio, "")
	if m.FluenceUjPerCm2 > 0 {
		s.add("plane-wave fluence", m.FluenceUjPerCm2, "uJ/cm2")
	}
	s = r.section("Spectrum")
	s.add("spectral peak", m.SpectralPeakThz, "THz")
	s.add("centroid", m.CentroidThz, "THz")
	s.add("FWHM of |E(f)|^2", m.BandwidthFwhmThz, "THz")
	s.add("20 dB band, low edge", m.BandLowThz, "THz")
	s.add("20 dB band, high edge", m.BandHighThz, "THz")
	s.add("dynamic range", m.DynamicRangeDb, "dB")
	s.add("resolution", m.ResolutionThz, "THz")
	s.add("Nyquist", m.NyquistThz, "THz")
	r.print(a.stdout)
	return nil
}

// parseFlags parses a command's flags, which may come before, between or
// after its positional arguments, and returns the positional arguments.
// -h prints the command's help on standard output (and returns
// flag.ErrHelp, exit 0); a bad flag is a usage error that names the help,
// without printing all of it.
func (a *app) parseFlags(fs *flag.FlagSet, args []string) ([]string, error) {
	fs.SetOutput(io.Discard)
	var pos []string
	for {
		err := fs.Parse(args)
		if errors.Is(err, flag.ErrHelp) {
			fs.SetOutput(a.stdout)
			fs.Usage()
			return nil, err
		}
		if err != nil {
			return nil, usagef("%v (see 'thzdrive help %s')", err, fs.Name())
		}
		if fs.NArg() == 0 {
			return pos, nil
		}
		if used := len(args) - fs.NArg(); used > 0 && args[used-1] == "--" {
			return append(pos, fs.Args()...), nil // all that follows "--" is an argument
		}
		pos = append(pos, fs.Arg(0))
		args = fs.Args()[1:]
	}
}

// parseNoArgs parses the flags of a command that takes no arguments.
func (a *app) parseNoArgs(fs *flag.FlagSet, args []string) error {
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if len(pos) > 0 {
		return usagef("%s takes no arguments, got %q (see 'thzdrive help %s')", fs.Name(), pos[0], fs.Name())
	}
	return nil
}
