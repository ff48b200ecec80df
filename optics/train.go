package optics

import (
	"fmt"
	"math"

	"thzdrive/caution"
	"thzdrive/units"
)

// Element is one element of an optical train: a Slab, Attenuator,
// FieldFactor or Gap, or a pointer to one.
type Element interface{ trainElement() }

// Slab is a window or filter: a plane-parallel plate of a medium in air, at
// normal incidence. A coherent slab keeps all its internal reflections
// (Airy's formula); an incoherent one only the first pass (see Stack).
type Slab struct {
	Name       string
	Medium     Medium
	ThicknessM float64
	Incoherent bool
}

// Attenuator is a pair of ideal wire-grid polarisers: the first rotated by
// AngleRad from the second, which is fixed and parallel to the incoming
// polarisation. Each grid passes the projection of the field on its
// transmission axis (Malus's law: the power through one grid goes as
// cos²θ), so the field after both is cos²θ times the input, with the input
// polarisation, and the power cos⁴θ. Real grids leak (finite extinction)
// and lose a little; add a FieldFactor for that.
type Attenuator struct {
	Name     string
	AngleRad float64
}

// FieldFactor multiplies the field by a fixed complex factor: a measured
// filter, grid losses, or the field gain of a focusing element (|Factor| may
// exceed 1; the absorbed fraction of the target then scales with
// |Factor|²).
type FieldFactor struct {
	Name   string
	Factor complex128
}

// Gap is free space of length LengthM. It changes nothing: the phase
// reference of the train is free propagation along the beam (see Train),
// so a gap only moves the time origin, which the reference absorbs. It is
// accepted so that a description of the set-up can be complete.
type Gap struct {
	Name    string
	LengthM float64
}

func (Slab) trainElement()        {}
func (Attenuator) trainElement()  {}
func (FieldFactor) trainElement() {}
func (Gap) trainElement()         {}

// Placement says where in the target layer the field is taken.
type Placement int

const (
	// FrontSurface: just inside the front surface of the target layer
	// (depth 0).
	FrontSurface Placement = iota
	// AtDepth: at Target.DepthM below the front surface.
	AtDepth
	// LayerAverage: averaged over the thickness of the target layer, the
	// field that drives a uniform excitation of a thin film. Not defined for
	// the exit half-space.
	LayerAverage
)

// Component selects the component of the electric field at the target.
type Component int

const (
	// Tangential: the component along the surfaces (E_y for s, E_x for p);
	// at normal incidence it is the whole field.
	Tangential Component = iota
	// Normal: the component along the stack normal, which exists only for
	// p polarisation at oblique incidence.
	Normal
)

// Target is the point where the field is wanted: a layer of the sample (an
// index into Sample.Layers, or ExitMedium for a semi-infinite sample or
// substrate), a placement in it, and a field component.
type Target struct {
	Layer     int
	Placement Placement
	DepthM    float64
	Component Component
}

// Train is an optical train: the elements between the source and the
// sample, in the order the beam meets them, then the sample stack and the
// target in it. The field is given in air before the first element; the
// elements sit in air, at normal incidence, and are separate: reflections
// between different elements are treated as echoes outside the window (or
// tilted away), so their field transmissions multiply. The sample's ambient
// medium is the same air (Sample.AmbientIndex must be 0 or 1), and its
// angle of incidence and polarisation apply to the sample only.
//
// Phase reference. A slab's transmission is quoted relative to the same
// thickness of air, t·exp(-iωd/c), so that inserting a window delays the
// pulse by its excess (n-1)d/c, as measured in a THz time-domain experiment;
// a Gap is then exactly 1. In the sample the phase is referred to the
// front surface: the field at the target is relative to the incident field
// arriving at the sample's front surface in the absence of the train's
// elements.
type Train struct {
	Elements []Element
	Sample   Stack
	Target   Target
}

// Evaluator computes the transfer function of a Train on a frequency grid.
// Build one with NewEvaluator and reuse it: Evaluate allocates nothing per
// call or per frequency. An Evaluator is not safe for concurrent use; build
// one per goroutine.
type Evaluator struct {
	train       Train
	slabs       []slabElem
	constFactor complex128
	solver      *Solver
}

type slabElem struct {
	field      string
	name       string
	medium     Medium
	thickM     float64
	incoherent bool
	fixed      bool
	n          complex128

	// A fixed slab: t01·t10 = 1 - r² and r², and on a uniform grid its two
	// exponentials e^{iωd(ñ-1)/c} and e^{2iωdñ/c} with their factors per
	// grid step (see gridPhases).
	oneMinusR2, r2 complex128
	e1, de1        complex128
	e2, de2        complex128

	// pre holds the index at the frequencies of Evaluate's current block
	// (not fixed media only), as Solver.prefetch.
	pre []complex128
}

// NewEvaluator validates the train and prepares an Evaluator. Errors are
// *InputError naming the offending element ("Elements[2].ThicknessM", with
// the element's Name if it has one), layer ("Sample.Layers[0].Medium") or
// target field.
func NewEvaluator(tr Train) (*Evaluator, error) {
	ev := &Evaluator{constFactor: 1}
	ev.train = Train{Elements: append([]Element(nil), tr.Elements...), Sample: tr.Sample, Target: tr.Target}
	ev.train.Sample.Layers = append([]Layer(nil), tr.Sample.Layers...)
	for i, el := range tr.Elements {
		f := fmt.Sprintf("Elements[%d]", i)
		// Pointers to elements are accepted as the elements they point to.
		switch p := el.(type) {
		case *Slab:
			if p != nil {
				el = *p
			}
		case *Attenuator:
			if p != nil {
				el = *p
			}
		case *FieldFactor:
			if p != nil {
				el = *p
			}
		case *Gap:
			if p != nil {
				el = *p
			}
		}
		switch e := el.(type) {
		case Slab:
			s, err := newSlabElem(f, e)
			if err != nil {
				return nil, err
			}
			ev.slabs = append(ev.slabs, s)
		case Attenuator:
			if !finite(e.AngleRad) {
				return nil, inputErrN(f+".AngleRad", e.Name, "%g is not finite", e.AngleRad)
			}
			c := math.Cos(e.AngleRad)
			ev.constFactor *= complex(c*c, 0)
		case FieldFactor:
			if !finiteC(e.Factor) {
				return nil, inputErrN(f+".Factor", e.Name, "%v is not finite", e.Factor)
			}
			ev.constFactor *= e.Factor
		case Gap:
			if !finite(e.LengthM) || e.LengthM < 0 {
				return nil, inputErrN(f+".LengthM", e.Name, "%g m must be finite and >= 0", e.LengthM)
			}
		case nil, *Slab, *Attenuator, *FieldFactor, *Gap:
			return nil, inputErr(f, "nil element")
		default:
			return nil, inputErr(f, "unknown element type %T", el)
		}
	}
	if a := tr.Sample.AmbientIndex; a != 0 && a != 1 {
		return nil, inputErr("Sample.AmbientIndex", "%g: the sample of a train sits in air (0 or 1)", a)
	}
	sv, err := newSolver("Sample.", tr.Sample)
	if err != nil {
		return nil, err
	}
	ev.solver = sv
	if err := checkTarget(tr.Target, tr.Sample); err != nil {
		return nil, err
	}
	return ev, nil
}

func newSlabElem(field string, s Slab) (slabElem, error) {
	if err := checkMedium(field+".Medium", s.Name, s.Medium); err != nil {
		return slabElem{}, err
	}
	if !finite(s.ThicknessM) || s.ThicknessM < 0 {
		return slabElem{}, inputErrN(field+".ThicknessM", s.Name, "%g m must be finite and >= 0", s.ThicknessM)
	}
	e := slabElem{field: field, name: s.Name, medium: s.Medium, thickM: s.ThicknessM, incoherent: s.Incoherent}
	if isFixed(s.Medium) {
		n := s.Medium.Index(1)
		if err := checkIndex(field+".Medium", s.Name, 1, n); err != nil {
			return slabElem{}, err
		}
		e.fixed, e.n = true, n
		r := cdiv(n-1, n+1)
		e.r2 = r * r
		e.oneMinusR2 = 1 - e.r2
	} else {
		e.pre = make([]complex128, prefetchBlock)
	}
	return e, nil
}

// gridPhases sets the exponentials of a fixed slab at freqHz on a uniform
// grid of step dfHz: directly when anchor is set (with their per-step
// factors), else by one step of the recurrence (see Solver.gridAnchor for
// the round-off).
func (s *slabElem) gridPhases(freqHz float64, anchor bool, dfHz float64) {
	if !anchor {
		s.e1 *= s.de1
		s.e2 *= s.de2
		return
	}
	k0d := complex(units.AngularFrequency(freqHz)/units.SpeedOfLight*s.thickM, 0)
	k1d := complex(units.AngularFrequency(dfHz)/units.SpeedOfLight*s.thickM, 0)
	s.e1, s.de1 = cexpi(k0d*(s.n-1)), cexpi(k1d*(s.n-1))
	if !s.incoherent {
		s.e2, s.de2 = cexpi(2*k0d*s.n), cexpi(2*k1d*s.n)
	}
}

// gridTransmission is transmission from the exponentials of gridPhases.
func (s *slabElem) gridTransmission() complex128 {
	t := s.oneMinusR2 * s.e1
	if !s.incoherent {
		t = cdiv(t, 1-s.r2*s.e2)
	}
	return t
}

func checkTarget(t Target, s Stack) error {
	switch {
	case t.Layer == ExitMedium:
		if t.Placement == LayerAverage {
			return inputErr("Target.Placement", "LayerAverage is not defined for the semi-infinite exit medium")
		}
	case t.Layer < 0 || t.Layer >= len(s.Layers):
		return inputErr("Target.Layer", "%d is not a layer of the sample (it has %d) nor ExitMedium", t.Layer, len(s.Layers))
	}
	switch t.Placement {
	case FrontSurface, LayerAverage:
	case AtDepth:
		limit := math.Inf(1)
		if t.Layer != ExitMedium {
			limit = s.Layers[t.Layer].ThicknessM
		}
		if !finite(t.DepthM) || t.DepthM < 0 || t.DepthM > limit {
			return inputErr("Target.DepthM", "%g m is outside the target layer [0, %g m]", t.DepthM, limit)
		}
	default:
		return inputErr("Target.Placement", "unknown placement %d", int(t.Placement))
	}
	switch t.Component {
	case Tangential:
	case Normal:
		if s.Pol != PolP || s.AngleRad == 0 {
			return inputErr("Target.Component", "the normal field component exists only for p polarisation at oblique incidence")
		}
	default:
		return inputErr("Target.Component", "unknown component %d", int(t.Component))
	}
	return nil
}

// transmission returns the slab's field transmission at freqHz relative to
// the same thickness of air: with r = (ñ-1)/(ñ+1), t01·t10 = 1 - r² =
// 4ñ/(1+ñ)² and φ = ωñd/c,
//
//	coherent:   (1 - r²)·e^{iφ}·e^{-iωd/c} / (1 - r²·e^{2iφ})   (Airy; Born & Wolf §7.6.1)
//	incoherent: (1 - r²)·e^{iφ}·e^{-iωd/c}                        (first pass)
func (s *slabElem) transmission(freqHz float64) (complex128, error) {
	return s.transmissionAt(freqHz, -1)
}

// transmissionAt is transmission with the index prefetched at position pos
// of the current block (pos >= 0), as Solver.index.
func (s *slabElem) transmissionAt(freqHz float64, pos int) (complex128, error) {
	n := s.n
	if !s.fixed {
		if pos >= 0 {
			n = s.pre[pos]
		} else {
			n = s.medium.Index(freqHz)
		}
		if !goodIndex(n) {
			return 0, checkIndex(s.field+".Medium", s.name, freqHz, n)
		}
	}
	k0d := complex(units.AngularFrequency(freqHz)/units.SpeedOfLight*s.thickM, 0)
	r := cdiv(n-1, n+1)
	t := (1 - r*r) * cexpi(k0d*(n-1))
	if !s.incoherent {
		t = cdiv(t, 1-r*r*cexpi(2*k0d*n))
	}
	return t, nil
}

// Evaluate writes, for each frequency freqHz[k] of a caller-given grid, the
// complex field transmission from the incident field (in air before the
// first element) to the target into field[k], and, if absorbed is not nil,
// the fraction of the incident power absorbed in the target layer into
// absorbed[k] (for ExitMedium: the fraction entering the exit half-space,
// which an absorbing half-space absorbs in full). Both slices must have the
// length of freqHz. The grid need not be uniform or sorted.
//
// Speed. On a uniform grid (uniformStep; the grids of package pulse are)
// the exponentials of fixed layers and slabs (constant index) advance from
// one frequency to the next by one complex product, re-anchored by an
// exact evaluation every gridAnchorEvery frequencies; Solver.gridAnchor
// bounds what this adds to the round-off (1.5e-14 relative). The indices of
// other media are computed for blocks of prefetchBlock frequencies ahead of
// the solution. Either way the results are those of Solver.Solve at each
// frequency, to round-off.
//
// The field at the target is the Target.Component of the electric field per
// unit amplitude of the incident wave, with the phase reference of Train.
// Multiply the incident spectrum E_inc(ω) by field to get the spectrum at
// the target, and inverse-transform it (package pulse) for the waveform.
//
// At freqHz = 0 both outputs are 0: a pulse radiated into free space has no
// zero-frequency component (its field integrates to zero), and optical
// constants have no meaning there (a conductor's ε diverges), so the DC bin
// is set to zero rather than to a limit that would put an offset into the
// waveform. Negative, NaN or infinite frequencies are errors.
//
// Errors are *InputError: a bad grid entry, mismatched lengths, a medium
// returning a non-finite index or κ < 0 at some frequency, or a stack that
// is singular there. On error the outputs are partly written.
func (e *Evaluator) Evaluate(freqHz []float64, field []complex128, absorbed []float64) error {
	if len(field) != len(freqHz) {
		return inputErr("field", "length %d differs from the %d frequencies", len(field), len(freqHz))
	}
	if absorbed != nil && len(absorbed) != len(freqHz) {
		return inputErr("absorbed", "length %d differs from the %d frequencies", len(absorbed), len(freqHz))
	}
	tg := e.train.Target
	grid, df := uniformStep(freqHz)
	sinceAnchor := gridAnchorEvery // the first positive frequency anchors
	sv := e.solver
	defer func() { sv.pos = -1 }()
	for k, f := range freqHz {
		if !finite(f) || f < 0 {
			return inputErr(fmt.Sprintf("freqHz[%d]", k), "%g must be finite and >= 0", f)
		}
		if k%prefetchBlock == 0 {
			block := freqHz[k:min(k+prefetchBlock, len(freqHz))]
			sv.prefetch(block)
			for i := range e.slabs {
				if s := &e.slabs[i]; !s.fixed {
					for j, fj := range block {
						if fj > 0 && fj <= math.MaxFloat64 {
							s.pre[j] = s.medium.Index(fj)
						}
					}
				}
			}
		}
		pos := k % prefetchBlock
		if f == 0 {
			field[k] = 0
			if absorbed != nil {
				absorbed[k] = 0
			}
			sinceAnchor = gridAnchorEvery
			continue
		}
		anchor := sinceAnchor >= gridAnchorEvery
		if anchor {
			sinceAnchor = 0
		}
		sinceAnchor++
		fac := e.constFactor
		for i := range e.slabs {
			s := &e.slabs[i]
			var t complex128
			if grid && s.fixed {
				s.gridPhases(f, anchor, df)
				t = s.gridTransmission()
			} else {
				var err error
				if t, err = s.transmissionAt(f, pos); err != nil {
					return err
				}
			}
			fac *= t
		}
		sv.pos = pos
		if _, err := sv.solve(f, grid, anchor, df); err != nil {
			return err
		}
		var fl Field
		switch tg.Placement {
		case FrontSurface:
			fl = e.solver.fieldAt(tg.Layer, 0)
		case AtDepth:
			fl = e.solver.fieldAt(tg.Layer, tg.DepthM)
		case LayerAverage:
			fl = e.solver.meanField(tg.Layer)
		}
		c := fl.Tangential
		if tg.Component == Normal {
			c = fl.Normal
		}
		out := fac * c
		if !finiteC(out) {
			return inputErr("Target", "the field at the target is not finite at %g Hz", f)
		}
		field[k] = out
		if absorbed != nil {
			absorbed[k] = sqAbs(fac) * e.solver.absorptance(tg.Layer)
		}
	}
	return nil
}

// gridAnchorEvery is how many steps of a uniform grid the recurrences of
// Evaluate take between exact evaluations (see Solver.gridAnchor).
const gridAnchorEvery = 32

// uniformStep reports whether the grid is uniform, f_k = f_0 + k·df with
// df > 0, to within 4 ulp of its largest frequency (the grids of package
// pulse, k/(N·dt), are, to one ulp), and returns df. Evaluate then steps
// the exponentials of fixed layers and slabs by recurrence.
func uniformStep(freqHz []float64) (bool, float64) {
	n := len(freqHz)
	if n < 3 {
		return false, 0
	}
	f0, fl := freqHz[0], freqHz[n-1]
	df := (fl - f0) / float64(n-1)
	if !finite(f0) || !finite(fl) || !(df > 0) {
		return false, 0
	}
	tol := 4 * 0x1p-52 * max(math.Abs(f0), math.Abs(fl))
	for k, f := range freqHz {
		if !(math.Abs(f-(f0+float64(k)*df)) <= tol) {
			return false, 0
		}
	}
	return true, df
}

// Echoes returns the first-echo delay of every slab element and every
// sample layer at refFreqHz (see Echo and Stack.Echoes). Slabs are at normal
// incidence.
func (e *Evaluator) Echoes(refFreqHz float64) ([]Echo, error) {
	var out []Echo
	for _, s := range e.slabs {
		d, err := roundTrip(s.field, s.name, s.medium, s.thickM, 0, refFreqHz)
		if err != nil {
			return nil, err
		}
		out = append(out, Echo{Field: s.field, Name: s.name, Incoherent: s.incoherent, DelayS: d})
	}
	st, err := e.train.Sample.Echoes(refFreqHz)
	if err != nil {
		return nil, err
	}
	for _, x := range st {
		x.Field = "Sample." + x.Field
		out = append(out, x)
	}
	return out, nil
}

// EchoCautions returns a caution.EchoInWindow for each incoherent echo that
// arrives less than windowAfterPulseS after the main pulse, that is, inside
// the part of the time window that follows the pulse: the calculation keeps
// only the first pass, so that echo is missing from its result.
func EchoCautions(echoes []Echo, windowAfterPulseS float64) []caution.Caution {
	var out []caution.Caution
	for _, x := range echoes {
		if x.Incoherent && x.DelayS < windowAfterPulseS {
			out = append(out, caution.New(caution.EchoInWindow,
				fmt.Sprintf("%s: the first internal echo arrives %.2f ps after the main pulse, inside the %.2f ps the time window extends after it; only the first pass is computed, so the echo is missing from the result (mark the layer coherent or shorten the window)",
					describe(x.Field, x.Name), x.DelayS/units.Ps, windowAfterPulseS/units.Ps),
				caution.V("echo_delay_ps", x.DelayS/units.Ps),
				caution.V("window_after_pulse_ps", windowAfterPulseS/units.Ps)))
		}
	}
	return out
}

// Extrapolation reports a medium used beyond the frequency range of its
// data.
type Extrapolation struct {
	// Field and Name identify the element or layer, as in InputError.
	Field, Name string
	// Material is the catalogue name, if the medium is a Material.
	Material string
	// MinHz, MaxHz: the medium's valid range; LoHz, HiHz: the positive
	// frequencies asked for.
	MinHz, MaxHz, LoHz, HiHz float64
}

// Caution returns the caution.MaterialExtrapolate for x.
func (x Extrapolation) Caution() caution.Caution {
	what := "the medium's data"
	if x.Material != "" {
		what = fmt.Sprintf("the data of material %q", x.Material)
	}
	return caution.New(caution.MaterialExtrapolate,
		fmt.Sprintf("%s: %s cover %.3g to %.3g THz only, but the band checked (where the pulse carries its energy) spans %.3g to %.3g THz; outside that range the index is held at the nearest tabulated value, or a model is used beyond its stated validity",
			describe(x.Field, x.Name), what, x.MinHz/units.THz, x.MaxHz/units.THz, x.LoHz/units.THz, x.HiHz/units.THz),
		caution.V("valid_min_thz", x.MinHz/units.THz),
		caution.V("valid_max_thz", x.MaxHz/units.THz),
		caution.V("grid_min_thz", x.LoHz/units.THz),
		caution.V("grid_max_thz", x.HiHz/units.THz))
}

// gridRange returns the smallest positive and the largest finite frequency
// of a grid (ok false if it has no positive frequency).
func gridRange(freqHz []float64) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), 0
	for _, f := range freqHz {
		if f > 0 && finite(f) {
			lo, hi = math.Min(lo, f), math.Max(hi, f)
		}
	}
	return lo, hi, hi > 0
}

// Extrapolations lists every medium of the train (slabs, sample layers,
// exit medium) whose valid range does not cover the positive frequencies of
// the grid. Zero frequency is ignored (Evaluate does not use the media
// there).
func (e *Evaluator) Extrapolations(freqHz []float64) []Extrapolation {
	lo, hi, ok := gridRange(freqHz)
	if !ok {
		return nil
	}
	var out []Extrapolation
	check := func(field, name string, m Medium) {
		if covered, minHz, maxHz := Covers(m, lo, hi); !covered {
			x := Extrapolation{Field: field, Name: name, MinHz: minHz, MaxHz: maxHz, LoHz: lo, HiHz: hi}
			switch v := m.(type) {
			case Material:
				x.Material = v.Name
			case *Material:
				x.Material = v.Name
			}
			out = append(out, x)
		}
	}
	for _, s := range e.slabs {
		check(s.field, s.name, s.medium)
	}
	for i := range e.solver.layers {
		l := &e.solver.layers[i]
		check(l.field, l.name, l.medium)
	}
	check(e.solver.exit.field, "", e.solver.exit.medium)
	return out
}

// Cautions collects the cautions this package can raise for the train on a
// grid: caution.MaterialExtrapolate for media used outside their data
// (Extrapolations), caution.EchoInWindow for incoherent echoes, with delays
// at refFreqHz, that fall less than windowAfterPulseS after the main pulse
// (EchoCautions), and caution.Reststrahlen when the target medium is a
// dielectric model with a reststrahlen band (ReststrahlenBands) that
// overlaps the grid.
func (e *Evaluator) Cautions(freqHz []float64, refFreqHz, windowAfterPulseS float64) ([]caution.Caution, error) {
	var out []caution.Caution
	for _, x := range e.Extrapolations(freqHz) {
		out = append(out, x.Caution())
	}
	echoes, err := e.Echoes(refFreqHz)
	if err != nil {
		return nil, err
	}
	out = append(out, EchoCautions(echoes, windowAfterPulseS)...)
	lo, hi, ok := gridRange(freqHz)
	if !ok {
		return out, nil
	}
	tg := e.train.Target
	m, field := e.solver.exit.medium, e.solver.exit.field
	if tg.Layer != ExitMedium {
		l := &e.solver.layers[tg.Layer]
		m, field = l.medium, describe(l.field, l.name)
	}
	for _, b := range ReststrahlenBands(m) {
		if b.HiHz >= lo && b.LoHz <= hi {
			out = append(out, caution.New(caution.Reststrahlen,
				fmt.Sprintf("%s: the target medium has a reststrahlen band from %.3g to %.3g THz (TO to LO frequency of its undamped model) inside the frequency grid: there it reflects nearly all the incident power, and the field inside is screened: it vanishes at the TO frequency and decays within c/(ωκ) of the surface",
					field, b.LoHz/units.THz, b.HiHz/units.THz),
				caution.V("to_thz", b.LoHz/units.THz),
				caution.V("lo_thz", b.HiHz/units.THz)))
		}
	}
	return out, nil
}

// Solver returns the Evaluator's solver for the sample stack, holding the
// state of the last frequency evaluated: after Evaluate it describes the
// last grid frequency (with a positive value), and Absorptance, Field,
// MeanField and Amplitudes give the rest of the sample's response there.
// Calls to Solve on it are allowed; the next Evaluate overwrites them.
func (e *Evaluator) Solver() *Solver { return e.solver }
