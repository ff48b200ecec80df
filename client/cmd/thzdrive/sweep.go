package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"os/signal"
	"sort"
	"strconv"
	"strings"
	"time"

	"google.golang.org/protobuf/encoding/protojson"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
	"thzdrive/units"
)

// pathUnits maps the unit suffix of a wire field name to the unit its
// values are in, so that sweep values may be written with a unit.
var pathUnits = []struct {
	suffix string
	kind   units.Kind
	unit   string
	si     float64
}{
	{"_kv_per_cm", units.Field, "kV/cm", units.KVPerCm},
	{"_uj_per_cm2", units.Fluence, "uJ/cm2", units.UJPerCm2},
	{"_mj_per_cm2", units.Fluence, "mJ/cm2", units.MJPerCm2},
	{"_thz", units.Frequency, "THz", units.THz},
	{"_khz", units.Rate, "kHz", 1e3},
	{"_uj", units.Energy, "uJ", units.UJ},
	{"_mw", units.Power, "mW", units.MW},
	{"_um", units.Length, "um", units.Um},
	{"_nm", units.Length, "nm", units.Nm},
	{"_mm", units.Length, "mm", units.Mm},
	{"_a", units.Length, "Å", units.Angstrom},
	{"_ps", units.Time, "ps", units.Ps},
	{"_fs", units.Time, "fs", units.Fs},
	{"_k", units.Temperature, "K", 1},
	{"_deg", units.Angle, "deg", 0.017453292519943295},
	{"_rad", units.Angle, "rad", 1},
}

// headerUnits name the units of path suffixes whose values take no unit on
// the command line (the units package has no such kind).
var headerUnits = []struct{ suffix, unit string }{
	{"_a3", "Å^3"}, {"_amu", "amu"}, {"_w_per_m_k", "W/(m K)"}, {"_per_nm3", "1/nm^3"},
	{"_j_per_cm3_k", "J/(cm^3 K)"}, {"_per_cm", "1/cm"}, {"_e_per_sqrt_amu", "e/sqrt(amu)"},
}

// columnName is a path with its unit, for a CSV header.
func columnName(path string) string {
	if q := unitOfPath(path); q != nil {
		return path + " (" + q.wireUnit + ")"
	}
	for _, u := range headerUnits {
		if strings.HasSuffix(path, u.suffix) {
			return path + " (" + u.unit + ")"
		}
	}
	return path
}

// unitOfPath returns the quantity a field path's values are in, or nil when
// its name carries no unit this tool knows.
func unitOfPath(path string) *quantity {
	for _, u := range pathUnits {
		if strings.HasSuffix(path, u.suffix) {
			return &quantity{kind: u.kind, wireUnit: u.unit, wireSI: u.si}
		}
	}
	return nil
}

// parseAxis reads PATH=START:STOP:COUNT[:log] or PATH=V1,V2,...; values may
// carry a unit when the field's name says which (mode.frequency_thz=6THz).
func parseAxis(spec string) (*thzdrivev1.SweepAxis, error) {
	path, vals, ok := strings.Cut(spec, "=")
	path = strings.TrimSpace(path)
	if !ok || path == "" || strings.TrimSpace(vals) == "" {
		return nil, usagef("--axis %q: write PATH=START:STOP:COUNT[:log] or PATH=V1,V2,..., e.g. calibration.pulse_energy_uj=0.5:4:8", spec)
	}
	ax := &thzdrivev1.SweepAxis{Parameter: path}
	value := func(s string) (float64, error) {
		num, unit := units.Split(s)
		if unit == "" {
			x, err := strconv.ParseFloat(num, 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return 0, usagef("--axis %q: %q is not a number", spec, s)
			}
			return x, nil
		}
		q := unitOfPath(path)
		if q == nil {
			return 0, usagef("--axis %q: %s carries no unit in its name; give bare numbers", spec, path)
		}
		if err := q.Set(s); err != nil {
			return 0, usagef("--axis %q: %v", spec, err)
		}
		return q.value, nil
	}
	if strings.Contains(vals, ":") {
		parts := strings.Split(vals, ":")
		if len(parts) < 3 || len(parts) > 4 {
			return nil, usagef("--axis %q: a range is START:STOP:COUNT[:log]", spec)
		}
		var err error
		if ax.Start, err = value(parts[0]); err != nil {
			return nil, err
		}
		if ax.Stop, err = value(parts[1]); err != nil {
			return nil, err
		}
		n, err := strconv.Atoi(strings.TrimSpace(parts[2]))
		if err != nil || n < 2 {
			return nil, usagef("--axis %q: COUNT must be a whole number >= 2, got %q", spec, parts[2])
		}
		ax.Count = int32(min(n, math.MaxInt32))
		if len(parts) == 4 {
			if strings.TrimSpace(strings.ToLower(parts[3])) != "log" {
				return nil, usagef("--axis %q: the fourth part may only be log", spec)
			}
			ax.Logarithmic = true
		}
		return ax, nil
	}
	for _, s := range strings.Split(vals, ",") {
		x, err := value(s)
		if err != nil {
			return nil, err
		}
		ax.Values = append(ax.Values, x)
	}
	return ax, nil
}

// axisCount is the number of points of an axis.
func axisCount(ax *thzdrivev1.SweepAxis) int64 {
	if len(ax.Values) > 0 {
		return int64(len(ax.Values))
	}
	return int64(ax.Count)
}

// headlineColumns are the CSV columns after the coordinates.
var headlineColumns = []string{
	"incident peak |E| (kV/cm)", "pulse energy (uJ)", "peak |E| inside (kV/cm)",
	"max |Q| (Å·sqrt(amu))", "ion displacement (pm)", "mode energy (quanta)", "overlap",
	"absorbed fraction", "peak temperature (K)", "steady-state temperature (K)",
	"cautions", "error",
}

func runSweep(a *app, args []string) error {
	fs := flag.NewFlagSet("sweep", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	var axes multiFlag
	fs.Var(&axes, "axis", "PATH=START:STOP:COUNT[:log] or PATH=V1,V2,... (once or twice)")
	csvPath := fs.String("csv", "-", "write the table to FILE; '-' is standard output")
	plotDir := fs.String("plot", "", "also write figures (PNG and SVG) of the sweep into DIR: a line per quantity for one axis, a colour map for two")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive sweep [flags] SCENARIO --axis PATH=... [--axis PATH=...]

Runs the scenario's plan over a grid of one or two parameters and writes
one CSV row per grid point: the coordinates, then the headline numbers
(incident and inside peak field, pulse energy, max|Q|, displacement, quanta,
overlap, absorbed fraction, peak and steady-state temperature), the codes of
the cautions raised there, and the error of a point that failed (the sweep
goes on). Rows come in grid order, the last axis fastest. With --json each
point is printed as one JSON line (a SweepResponse with its index) as it
arrives, instead. Progress goes to standard error when it is a terminal.

PATH is a number field of the scenario in proto field names, e.g.
  calibration.pulse_energy_uj     mode.frequency_thz    mode.linewidth_thz
  train[1].attenuator.angle_deg   heating.base_temperature_k
  sample.layers[0].thickness_um   calibration.spot_x.fwhm_um
Values are in the unit the field's name ends with; they may also carry a
unit of the same kind: mode.frequency_thz=200cm-1:300cm-1:51.

%s
Examples:
  thzdrive sweep examples/demo-scenario.yaml --axis calibration.pulse_energy_uj=0.25:4:16:log
  thzdrive sweep examples/demo-scenario.yaml --csv map.csv \
      --axis train[1].attenuator.angle_deg=0,15,30,45 --axis heating.base_temperature_k=5:20:4

Flags:
`, scenarioHelp)
		fs.PrintDefaults()
	}
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("sweep needs one scenario file (got %d arguments); see 'thzdrive help sweep'", len(pos))
	}
	if len(axes) < 1 || len(axes) > 2 {
		return usagef("give one or two --axis PATH=START:STOP:COUNT[:log] (or PATH=V1,V2,...)")
	}
	req := &thzdrivev1.SweepRequest{}
	for _, spec := range axes {
		ax, err := parseAxis(spec)
		if err != nil {
			return err
		}
		req.Axes = append(req.Axes, ax)
	}
	if req.Plan, err = loadScenario(pos[0]); err != nil {
		return err
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	if a.timeoutSet {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, a.timeout)
		defer cancel()
	}
	stream, err := c.Sweep(ctx, req)
	if err != nil {
		return err
	}

	var out io.Writer = a.stdout
	if *csvPath != "-" && !a.asJSON {
		f, err := os.Create(*csvPath)
		if err != nil {
			return usagef("--csv: %v", err)
		}
		defer f.Close()
		out = f
	}
	sw := &sweepWriter{out: out, json: a.asJSON, pending: map[int64]*thzdrivev1.SweepResponse{}, cautions: map[string]int{}}
	if !a.asJSON {
		// Written with the first point, so that a sweep the service refuses
		// as a whole leaves no table behind on standard output.
		sw.header = make([]string, 0, len(req.Axes)+len(headlineColumns))
		for _, ax := range req.Axes {
			sw.header = append(sw.header, columnName(ax.Parameter))
		}
		sw.header = append(sw.header, headlineColumns...)
	}
	prog := newProgress(a.stderr)
	var kept []*thzdrivev1.SweepResponse
	for {
		p, err := stream.Recv()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			prog.done()
			return err
		}
		if err := sw.add(p); err != nil {
			prog.done()
			return err
		}
		if *plotDir != "" {
			kept = append(kept, p)
		}
		prog.show(sw.received, p.Total)
	}
	prog.done()
	if err := sw.writeHeader(); err != nil {
		return err
	}
	if err := sw.flushAll(); err != nil {
		return err
	}
	if *plotDir != "" {
		if err := a.plotSweep(*plotDir, req, kept); err != nil {
			return err
		}
	}
	if a.asJSON {
		return nil
	}
	summary := a.stdout
	if *csvPath == "-" {
		summary = a.stderr
	}
	sw.summary(summary, req, *csvPath)
	return nil
}

// sweepWriter writes the points in grid order as they arrive.
type sweepWriter struct {
	out      io.Writer
	header   []string // CSV header, nil once written (or with JSON)
	json     bool
	next     int64
	pending  map[int64]*thzdrivev1.SweepResponse
	received int64
	total    int64
	failed   int64
	cautions map[string]int // points per caution code
}

// writeHeader writes the CSV header if it is still due.
func (sw *sweepWriter) writeHeader() error {
	if sw.header == nil {
		return nil
	}
	_, err := fmt.Fprintln(sw.out, strings.Join(csvQuote(sw.header), ","))
	sw.header = nil
	return err
}

func (sw *sweepWriter) add(p *thzdrivev1.SweepResponse) error {
	if err := sw.writeHeader(); err != nil {
		return err
	}
	sw.received++
	sw.total = p.Total
	if p.Error != nil {
		sw.failed++
	}
	for _, code := range p.GetHeadline().GetCautionCodes() {
		sw.cautions[shortCode(code)]++
	}
	if sw.json {
		b, err := protojson.Marshal(p)
		if err != nil {
			return err
		}
		_, err = fmt.Fprintln(sw.out, string(b))
		return err
	}
	sw.pending[p.Index] = p
	for {
		q, ok := sw.pending[sw.next]
		if !ok {
			return nil
		}
		delete(sw.pending, sw.next)
		sw.next++
		if err := sw.row(q); err != nil {
			return err
		}
	}
}

// flushAll writes what is left (points after a gap the server never filled).
func (sw *sweepWriter) flushAll() error {
	idx := make([]int64, 0, len(sw.pending))
	for i := range sw.pending {
		idx = append(idx, i)
	}
	sort.Slice(idx, func(i, j int) bool { return idx[i] < idx[j] })
	for _, i := range idx {
		if err := sw.row(sw.pending[i]); err != nil {
			return err
		}
	}
	return nil
}

func (sw *sweepWriter) row(p *thzdrivev1.SweepResponse) error {
	cells := make([]string, 0, len(p.Coordinates)+len(headlineColumns))
	for _, x := range p.Coordinates {
		cells = append(cells, fmtFloat(x))
	}
	if h := p.Headline; h != nil {
		for _, x := range []float64{h.IncidentPeakFieldKvPerCm, h.PulseEnergyUj, h.PeakFieldInsideKvPerCm,
			h.MaxQASqrtAmu, h.DisplacementPm, h.Quanta, h.Overlap, h.AbsorbedFraction,
			h.PeakTemperatureK, h.SteadyStateTemperatureK} {
			cells = append(cells, fmtFloat(x))
		}
		var codes []string
		for _, c := range h.CautionCodes {
			codes = append(codes, shortCode(c))
		}
		cells = append(cells, strings.Join(codes, " "))
	} else {
		for range len(headlineColumns) - 2 {
			cells = append(cells, "")
		}
	}
	e := ""
	if p.Error != nil {
		e = p.Error.Code + ": " + p.Error.Message
		if len(p.Error.Fields) > 0 {
			e += " (" + strings.Join(p.Error.Fields, ", ") + ")"
		}
	}
	cells = append(cells, e)
	_, err := fmt.Fprintln(sw.out, strings.Join(csvQuote(cells), ","))
	return err
}

// fmtFloat writes a number for a CSV table: 12 significant digits, more
// than any input deserves and free of round-off tails.
func fmtFloat(x float64) string { return strconv.FormatFloat(x, 'g', 12, 64) }

func shortCode(c thzdrivev1.CautionCode) string {
	return strings.TrimPrefix(c.String(), "CAUTION_CODE_")
}

// summary tells a person what the sweep did.
func (sw *sweepWriter) summary(w io.Writer, req *thzdrivev1.SweepRequest, csvPath string) {
	r := &report{title: "thzdrive: sweep"}
	s := r.section("Grid")
	for i, ax := range req.Axes {
		unit := ""
		if q := unitOfPath(ax.Parameter); q != nil {
			unit = " " + q.wireUnit
		}
		var d string
		if len(ax.Values) > 0 {
			var vs []string
			for _, v := range ax.Values {
				vs = append(vs, num(v))
			}
			d = strings.Join(vs, ", ") + unit
		} else {
			spacing := "linear"
			if ax.Logarithmic {
				spacing = "log"
			}
			d = fmt.Sprintf("%s to %s%s, %d points, %s", num(ax.Start), num(ax.Stop), unit, ax.Count, spacing)
		}
		s.text(fmt.Sprintf("axis %d: %s", i+1, ax.Parameter), d)
	}
	s.add("points received", float64(sw.received), "")
	s.add("points that failed", float64(sw.failed), "")
	if csvPath != "-" {
		s.text("table written to", csvPath)
	}
	if len(sw.cautions) > 0 {
		s = r.section("Cautions raised (points)")
		codes := make([]string, 0, len(sw.cautions))
		for c := range sw.cautions {
			codes = append(codes, c)
		}
		sort.Strings(codes)
		for _, c := range codes {
			s.add(c, float64(sw.cautions[c]), "")
		}
	}
	fmt.Fprintf(w, "%s\n%s\n", r.title, strings.Repeat("=", len([]rune(r.title))))
	r.printTable(w)
	fmt.Fprintf(w, "\n%s\n", safetyLine)
}

// progress shows "\r  412/1000 points" on a terminal, at most ten times a
// second, and nothing when standard error is not a terminal.
type progress struct {
	w    io.Writer
	last time.Time
	on   bool
}

func newProgress(w io.Writer) *progress {
	return &progress{w: w, on: isTerminal(w)}
}

func (p *progress) show(n, total int64) {
	if !p.on || (time.Since(p.last) < 100*time.Millisecond && n != total) {
		return
	}
	p.last = time.Now()
	fmt.Fprintf(p.w, "\r  %d/%d points", n, total)
}

func (p *progress) done() {
	if p.on && !p.last.IsZero() {
		fmt.Fprint(p.w, "\r\033[K")
	}
}

// isTerminal reports whether w is a character device (a terminal).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

// plotSweep writes the sweep's figures; points may arrive in any order.
func (a *app) plotSweep(dir string, req *thzdrivev1.SweepRequest, points []*thzdrivev1.SweepResponse) error {
	sort.Slice(points, func(i, j int) bool { return points[i].Index < points[j].Index })
	names := make([]string, len(req.Axes))
	values := make([][]float64, len(req.Axes))
	for i, ax := range req.Axes {
		names[i] = columnName(ax.Parameter)
	}
	if len(req.Axes) == 1 {
		for _, p := range points {
			values[0] = append(values[0], p.Coordinates[0])
		}
	} else {
		inner := int(client.GridSize(&thzdrivev1.SweepRequest{Axes: req.Axes[1:]}))
		if inner == 0 || len(points)%inner != 0 {
			return fmt.Errorf("plot: %d points do not fill a grid of rows of %d", len(points), inner)
		}
		for i := 0; i < len(points); i += inner {
			values[0] = append(values[0], points[i].Coordinates[0])
		}
		for _, p := range points[:inner] {
			values[1] = append(values[1], p.Coordinates[1])
		}
	}
	paths, err := writeSweepPlots(dir, names, values, points)
	if err != nil {
		return err
	}
	fmt.Fprintf(a.stderr, "figures: %s\n", strings.Join(paths, ", "))
	return nil
}
