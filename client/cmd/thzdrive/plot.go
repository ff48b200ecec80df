package main

import (
	"fmt"
	"image/color"
	"math"
	"os"
	"path/filepath"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// Figures are written as PNG (for a quick look) and SVG (for papers and
// slides), 16 cm × 10 cm. Axis labels carry the trade's units.
const (
	figureWidth  = 16 * vg.Centimeter
	figureHeight = 10 * vg.Centimeter
)

var (
	colourIncident = color.RGBA{R: 0x1f, G: 0x4e, B: 0x9a, A: 0xff}
	colourInside   = color.RGBA{R: 0xc0, G: 0x39, B: 0x2b, A: 0xff}
	colourMode     = color.RGBA{R: 0x2e, G: 0x8b, B: 0x57, A: 0xff}
)

// saveFigure writes p as dir/name.png and dir/name.svg and returns the paths.
func saveFigure(p *plot.Plot, dir, name string) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var out []string
	for _, ext := range []string{".png", ".svg"} {
		path := filepath.Join(dir, name+ext)
		if err := p.Save(figureWidth, figureHeight, path); err != nil {
			return nil, fmt.Errorf("plot %s: %w", path, err)
		}
		out = append(out, path)
	}
	return out, nil
}

// traceXY turns a sampled trace into plot points (time in ps).
func traceXY(tr *thzdrivev1.SampledTrace) plotter.XYs {
	pts := make(plotter.XYs, len(tr.GetField()))
	for i, e := range tr.GetField() {
		pts[i].X = tr.StartPs + float64(i)*tr.StepFs*1e-3
		pts[i].Y = e
	}
	return pts
}

func addLine(p *plot.Plot, pts plotter.XYs, c color.Color, legend string) error {
	l, err := plotter.NewLine(pts)
	if err != nil {
		return err
	}
	l.Color = c
	l.Width = vg.Points(1.2)
	p.Add(l)
	if legend != "" {
		p.Legend.Add(legend, l)
	}
	return nil
}

// markFrequency draws a vertical dashed line at fTHz spanning [lo, hi].
func markFrequency(p *plot.Plot, fTHz, lo, hi float64, legend string) error {
	if fTHz <= 0 {
		return nil
	}
	l, err := plotter.NewLine(plotter.XYs{{X: fTHz, Y: lo}, {X: fTHz, Y: hi}})
	if err != nil {
		return err
	}
	l.Color = colourMode
	l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
	p.Add(l)
	p.Legend.Add(legend, l)
	return nil
}

// modeFrequencyTHz finds the driven mode's frequency in a resolved plan:
// given directly, or the oscillator of the target medium it refers to.
func modeFrequencyTHz(r *thzdrivev1.PlanExperimentRequest) float64 {
	m := r.GetMode()
	if m.GetFrequencyThz() > 0 {
		return m.GetFrequencyThz()
	}
	if m.TargetOscillator == nil {
		return 0
	}
	var med *thzdrivev1.Medium
	layers := r.GetSample().GetLayers()
	if l := r.GetTarget().GetLayer(); l >= 0 && int(l) < len(layers) {
		med = layers[l].GetMedium()
	} else {
		med = r.GetSample().GetExitMedium()
	}
	osc := med.GetDielectric().GetOscillators()
	if j := int(m.GetTargetOscillator()); j >= 0 && j < len(osc) {
		return osc[j].GetFrequencyThz()
	}
	return 0
}

// planFigures are the spectra the plan figures need besides the plan: the
// server's analysis of the incident field and of the field inside.
type planFigures struct {
	plan              *thzdrivev1.PlanExperimentResponse
	incident, insideS *thzdrivev1.Spectrum
}

// writePlanPlots renders a plan's figures into dir: the waveforms, their
// spectra with the mode marked, the transmission to the target, and Q(t).
func writePlanPlots(dir string, f planFigures) ([]string, error) {
	var paths []string
	resp := f.plan
	modeTHz := modeFrequencyTHz(resp.GetResolved())

	p := plot.New()
	p.Title.Text = "Field: incident and inside the sample"
	p.X.Label.Text = "time (ps)"
	p.Y.Label.Text = "field (kV/cm)"
	if err := addLine(p, traceXY(resp.GetSource().GetIncident()), colourIncident, "incident"); err != nil {
		return nil, err
	}
	if err := addLine(p, traceXY(resp.GetMode().GetFieldInside()), colourInside, "inside the sample"); err != nil {
		return nil, err
	}
	out, err := saveFigure(p, dir, "field")
	if err != nil {
		return nil, err
	}
	paths = append(paths, out...)

	if f.incident != nil && f.insideS != nil {
		p = plot.New()
		p.Title.Text = "Spectrum, with the driven mode"
		p.X.Label.Text = "frequency (THz)"
		p.Y.Label.Text = "|E(f)| (kV/cm per THz)"
		top := 0.0
		for _, s := range []struct {
			sp     *thzdrivev1.Spectrum
			c      color.Color
			legend string
		}{{f.incident, colourIncident, "incident"}, {f.insideS, colourInside, "inside the sample"}} {
			pts := make(plotter.XYs, 0, len(s.sp.FrequencyThz))
			for k, fr := range s.sp.FrequencyThz {
				if fr > 4*math.Max(resp.GetSource().GetSpectralPeakThz(), modeTHz) {
					break
				}
				pts = append(pts, plotter.XY{X: fr, Y: s.sp.AmplitudeKvPerCmPerThz[k]})
				top = math.Max(top, s.sp.AmplitudeKvPerCmPerThz[k])
			}
			if err := addLine(p, pts, s.c, s.legend); err != nil {
				return nil, err
			}
		}
		if err := markFrequency(p, modeTHz, 0, top, fmt.Sprintf("mode %.3g THz", modeTHz)); err != nil {
			return nil, err
		}
		if out, err = saveFigure(p, dir, "spectrum"); err != nil {
			return nil, err
		}
		paths = append(paths, out...)
	}

	if tf := resp.GetOptics().GetTransfer(); tf != nil {
		p = plot.New()
		p.Title.Text = "Field transmission to the target"
		p.X.Label.Text = "frequency (THz)"
		p.Y.Label.Text = "|t(f)|"
		pts := make(plotter.XYs, 0, len(tf.FrequencyThz))
		limit := 4 * math.Max(resp.GetSource().GetSpectralPeakThz(), modeTHz)
		top := 0.0
		for k, fr := range tf.FrequencyThz {
			if fr > limit {
				break
			}
			pts = append(pts, plotter.XY{X: fr, Y: tf.Amplitude[k]})
			top = math.Max(top, tf.Amplitude[k])
		}
		if err := addLine(p, pts, colourInside, "|t|"); err != nil {
			return nil, err
		}
		if err := markFrequency(p, modeTHz, 0, top, fmt.Sprintf("mode %.3g THz", modeTHz)); err != nil {
			return nil, err
		}
		if out, err = saveFigure(p, dir, "transmission"); err != nil {
			return nil, err
		}
		paths = append(paths, out...)
	}

	if q := resp.GetMode().GetQ(); q != nil && len(q.QASqrtAmu) > 0 {
		p = plot.New()
		p.Title.Text = "Mode coordinate Q(t)"
		p.X.Label.Text = "time (ps)"
		p.Y.Label.Text = "Q (Å·√amu)"
		pts := make(plotter.XYs, len(q.QASqrtAmu))
		for i, x := range q.QASqrtAmu {
			pts[i] = plotter.XY{X: q.StartPs + float64(i)*q.StepFs*1e-3, Y: x}
		}
		if err := addLine(p, pts, colourMode, "at the target"); err != nil {
			return nil, err
		}
		if len(q.DepthAverageQASqrtAmu) == len(q.QASqrtAmu) {
			for i, x := range q.DepthAverageQASqrtAmu {
				pts[i].Y = x
			}
			if err := addLine(p, pts, colourIncident, "probe-depth average"); err != nil {
				return nil, err
			}
		}
		if out, err = saveFigure(p, dir, "mode"); err != nil {
			return nil, err
		}
		paths = append(paths, out...)
	}
	return paths, nil
}

// sweepColumn is one headline quantity for the sweep figures.
type sweepColumn struct {
	name, label string
	get         func(*thzdrivev1.SweepHeadline) float64
}

var sweepColumns = []sweepColumn{
	{"max_q", "max |Q| (Å·√amu)", func(h *thzdrivev1.SweepHeadline) float64 { return h.MaxQASqrtAmu }},
	{"peak_field_inside", "peak field inside (kV/cm)", func(h *thzdrivev1.SweepHeadline) float64 { return h.PeakFieldInsideKvPerCm }},
	{"peak_temperature", "peak temperature (K)", func(h *thzdrivev1.SweepHeadline) float64 { return h.PeakTemperatureK }},
}

// grid is a two-axis sweep as a heat-map grid (plotter.GridXYZ).
type grid struct {
	xs, ys []float64
	z      [][]float64 // z[row][col], NaN where a point failed
}

func (g grid) Dims() (int, int)   { return len(g.xs), len(g.ys) }
func (g grid) Z(c, r int) float64 { return g.z[r][c] }
func (g grid) X(c int) float64    { return g.xs[c] }
func (g grid) Y(r int) float64    { return g.ys[r] }
func (g grid) Min() (lo float64)  { lo, _ = g.span(); return lo }
func (g grid) Max() (hi float64)  { _, hi = g.span(); return hi }
func (g grid) span() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, row := range g.z {
		for _, v := range row {
			if !math.IsNaN(v) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	if lo > hi {
		return 0, 1
	}
	if lo == hi {
		hi = lo + 1
	}
	return lo, hi
}

// writeSweepPlots renders a sweep: one line figure per headline quantity
// for one axis, one heat map per quantity for two. points are in grid order.
func writeSweepPlots(dir string, axes []string, values [][]float64, points []*thzdrivev1.SweepResponse) ([]string, error) {
	var paths []string
	for _, col := range sweepColumns {
		p := plot.New()
		p.X.Label.Text = axes[0]
		switch len(axes) {
		case 1:
			p.Title.Text = col.label + " over the sweep"
			p.Y.Label.Text = col.label
			var pts plotter.XYs
			for i, pt := range points {
				if pt.GetHeadline() != nil {
					pts = append(pts, plotter.XY{X: values[0][i], Y: col.get(pt.Headline)})
				}
			}
			if len(pts) == 0 {
				continue
			}
			if err := addLine(p, pts, colourInside, ""); err != nil {
				return nil, err
			}
			s, err := plotter.NewScatter(pts)
			if err != nil {
				return nil, err
			}
			s.Color = colourInside
			p.Add(s)
		case 2:
			p.Title.Text = col.label + " (colour) over the sweep"
			p.Y.Label.Text = axes[1]
			g := grid{xs: values[0], ys: values[1], z: make([][]float64, len(values[1]))}
			for r := range g.z {
				g.z[r] = make([]float64, len(values[0]))
				for c := range g.z[r] {
					idx := c*len(values[1]) + r // row-major, the last axis fastest
					g.z[r][c] = math.NaN()
					if h := points[idx].GetHeadline(); h != nil {
						g.z[r][c] = col.get(h)
					}
				}
			}
			hm := plotter.NewHeatMap(g, moreland.SmoothBlueRed().Palette(64))
			p.Add(hm)
			lo, hi := g.span()
			p.Legend.Add(fmt.Sprintf("%.3g … %.3g", lo, hi))
		default:
			return nil, fmt.Errorf("cannot plot %d axes", len(axes))
		}
		out, err := saveFigure(p, dir, "sweep-"+col.name)
		if err != nil {
			return nil, err
		}
		paths = append(paths, out...)
	}
	return paths, nil
}
