package optics

import (
	"fmt"
	"math"
	"math/cmplx"

	"thzdrive/units"
)

// ExitMedium, used as a layer index, selects the semi-infinite exit medium of
// a stack (the substrate, or the bulk of a thick sample) rather than one of
// its layers.
const ExitMedium = -1

// Layer is one plane-parallel layer of a stack.
type Layer struct {
	// Name is an optional label used in messages.
	Name string
	// Medium gives the layer's index; it must not be nil.
	Medium Medium
	// ThicknessM is the thickness in metres, finite and >= 0. A layer of
	// zero thickness changes nothing.
	ThicknessM float64
	// Incoherent marks a thick layer (a window, a substrate) whose internal
	// echoes arrive after the caller's time window: only the first pass
	// through it is kept. See Stack.
	Incoherent bool
}

// Stack is a plane multilayer between two half-spaces: light arrives from
// the ambient half-space (index AmbientIndex, real) at the angle of
// incidence AngleRad, crosses Layers in order, and leaves into the Exit
// half-space.
//
// Coherent layers are treated exactly, with all their multiple reflections
// (transfer matrices; see Solver). Incoherent layers split the stack: the
// coherent runs between them are solved one after another, each as if the
// incoherent layers that bound it were half-spaces; the forward wave that a
// run sends into an incoherent layer of thickness d and normal index
// q = ñcosθ crosses it once, multiplied by exp(iωqd/c), and becomes the
// incident wave of the next run. What the incoherent layer reflects back,
// and what comes back to it, is dropped: in the time domain those are echoes
// delayed by at least the layer's round trip 2dRe(q)/c (see Stack.Echoes),
// which the caller has judged to fall after its window. So for one
// incoherent slab in air the transmission is t_in·exp(iωñd/c)·t_out, the
// first pass; and R + T + A < 1 by the energy of the dropped echoes. With
// no incoherent layer R + T + A = 1.
type Stack struct {
	// AmbientIndex is the real index of the incident half-space; 0 means 1
	// (air, taken as vacuum). It must be lossless so that the angle of
	// incidence and the incident power are defined.
	AmbientIndex float64
	Layers       []Layer
	// Exit is the medium of the exit half-space; nil means vacuum (n = 1).
	Exit Medium
	// AngleRad is the angle of incidence in the ambient medium, in [0, π/2).
	AngleRad float64
	Pol      Polarization
}

// Validate checks everything that can be checked before a frequency is
// chosen. Errors are *InputError naming the offending field.
func (s Stack) Validate() error { return validateStack("", s) }

func validateStack(prefix string, s Stack) error {
	if !finite(s.AmbientIndex) || s.AmbientIndex < 0 {
		return inputErr(prefix+"AmbientIndex", "%g must be finite and > 0 (0 means 1)", s.AmbientIndex)
	}
	if err := checkAngle(prefix+"AngleRad", s.AngleRad); err != nil {
		return err
	}
	if s.Pol != PolS && s.Pol != PolP {
		return inputErr(prefix+"Pol", "unknown polarization %d", int(s.Pol))
	}
	for i, l := range s.Layers {
		f := fmt.Sprintf("%sLayers[%d]", prefix, i)
		if err := checkMedium(f+".Medium", l.Name, l.Medium); err != nil {
			return err
		}
		if !finite(l.ThicknessM) || l.ThicknessM < 0 {
			return inputErrN(f+".ThicknessM", l.Name, "%g m must be finite and >= 0", l.ThicknessM)
		}
	}
	if s.Exit != nil {
		if err := checkMedium(prefix+"Exit", "", s.Exit); err != nil {
			return err
		}
	}
	return nil
}

// Oscillator returns oscillator j of the dielectric model of a layer (or of
// the exit medium, layer = ExitMedium): the way another package refers to
// "the mode that is driven" so that it and the screening computed here come
// from one description. It is an error if the layer's medium is not a
// Dielectric (or a Material built on one) or j is out of range.
func (s Stack) Oscillator(layer, j int) (Oscillator, error) {
	var m Medium
	field := "Exit"
	switch {
	case layer == ExitMedium:
		m = s.Exit
	case layer >= 0 && layer < len(s.Layers):
		m = s.Layers[layer].Medium
		field = fmt.Sprintf("Layers[%d].Medium", layer)
	default:
		return Oscillator{}, inputErr("layer", "index %d out of range [0, %d) (or ExitMedium)", layer, len(s.Layers))
	}
	d, ok := DielectricOf(m)
	if !ok {
		return Oscillator{}, inputErr(field, "is not a dielectric model with oscillators")
	}
	if j < 0 || j >= len(d.Oscillators) {
		return Oscillator{}, inputErr(field+".Oscillators", "index %d out of range [0, %d)", j, len(d.Oscillators))
	}
	return d.Oscillators[j], nil
}

// Response is the optical response of a stack at one frequency, per unit
// amplitude of the incident wave.
type Response struct {
	// Reflection is r, the amplitude of the reflected wave in the ambient
	// medium at the front surface (for p in the convention of Interface).
	Reflection complex128
	// Transmission is t, the amplitude of the transmitted wave in the exit
	// medium at the back surface (first pass through incoherent layers).
	Transmission complex128
	// R, T and A are the reflected, transmitted and absorbed fractions of
	// the incident power: R = |r|², T the power flux entering the exit
	// medium, A the sum of the layers' absorptances.
	R, T, A float64
}

// Solver computes the optical response of one Stack, one frequency at a
// time, with the characteristic (transfer) matrices of the coherent layers
// (Born & Wolf, Principles of Optics, 7th ed., §1.6; Macleod, Thin-Film
// Optical Filters, ch. 2).
//
// Method. In each layer the tangential fields U (electric) and V (Z0 times
// magnetic, see Interface) obey dU/dz = ik0·(q/η)·V and dV/dz = ik0·q·η·U
// (Maxwell's curl equations), so that across a layer of thickness d, with
// δ = k0·q·d and k0 = ω/c,
//
//	(U, V) at the entrance = M·(U, V) at the exit,
//	M = [[cos δ, -i·sin δ/η], [-i·η·sin δ, cos δ]],   det M = 1,
//
// η = q for s and ε/q for p. Starting from the transmitted wave in the exit
// medium, (U, V) = t·(gU, gV), the Solver steps back through the layers to
// the front surface, where matching to the incident and reflected waves
// gives t and r. The tangential fields at every interface are kept, so that
// the field at any depth, its average over a layer, and the power flux
// S = Re(U·V*)/(2Z0) at each interface (hence each layer's absorptance, as
// the flux in minus the flux out) follow without further matrix products.
//
// Numerics. Near δ = 0, sin δ/η and η·sin δ are written as k0·d·(sin δ/δ)
// times factors free of 1/q, so a layer exactly at its critical angle
// (q = 0) is handled. In a thick absorbing or evanescent layer cos δ grows
// as e^{Im δ}; each layer matrix is scaled by e^{-Im δ}, and the true
// fields are recovered with products of these factors, which can only
// underflow: nothing overflows, and the transmission of an opaque stack
// underflows gracefully to 0. The field at
// depth in a layer with |δ| >= 1 is rebuilt from the forward amplitude at
// its entrance and the backward amplitude at its exit, both well
// conditioned, so that its accuracy does not degrade with depth. Expected
// accuracy: R + T + A = 1 to a few units of 1e-16 per layer.
//
// A Solver is built once for a stack and reused: Solve allocates nothing.
// It is not safe for concurrent use; build one per goroutine.
type Solver struct {
	pol    Polarization
	beta   float64
	nAmb   float64
	amb    wave
	qAmb   float64
	prefix string

	layers []layerSlot
	exit   layerSlot

	runs  []run
	runOf []int // interface -> run that holds its fields

	vU, vV []complex128 // scaled tangential fields at interfaces, per unit t̃
	step   []float64    // per layer: scale of v at its exit over v at its entrance
	rel    []float64    // per interface: product of steps from its run's entrance

	freqHz float64
	k0     float64
	aExit  complex128
	resp   Response
	solved bool
	// grid is set while Evaluate steps along a uniform grid: fixed layers
	// then take e^{i·Re δ} and e^{-Im δ} from their recurrence (gridAnchor).
	grid bool
	// pos >= 0 is the position of the current frequency in the block that
	// prefetch filled; -1 outside Evaluate's blocks.
	pos int
}

type layerSlot struct {
	medium     Medium
	field      string
	name       string
	thickM     float64
	incoherent bool
	fixed      bool
	w          wave
	aF, bF     complex128 // sin δ/η = aF·k0d·sin δ/δ, η·sin δ = bF·k0d·sin δ/δ
	invQ       complex128 // 1/q (0 if q = 0)
	aQ, bQ     complex128 // aF/q and bF/q: sin δ/η = aQ·sin δ, η·sin δ = bQ·sin δ
	delta      complex128 // k0·q·d
	aEnt       complex128 // incoherent layer: forward amplitude at its entrance

	// On a uniform grid (Solver.grid) a fixed layer's phase factors at the
	// current frequency, rot = e^{i·Re δ}, att = e^{-2·Im δ} and
	// hatt = e^{-Im δ}, and their factors per grid step (see gridAnchor).
	rot, drot   complex128
	att, datt   float64
	hatt, dhatt float64

	// pre holds the medium's index at the frequencies of the current block
	// of Evaluate (not fixed media only; see Solver.prefetch).
	pre []complex128
}

// run is a coherent sub-stack: coherent layers [first, end), interfaces
// first..end. Its incident medium is the ambient (first = 0) or the
// incoherent layer first-1; its exit medium is the incoherent layer end or
// the exit half-space (end = len(layers)).
type run struct {
	first, end int
	aIn        complex128 // forward amplitude arriving at interface first
	amp        complex128 // aIn·t̃: true fields at interface i are v_i·amp·rel_i
	tTrue      complex128
	r          complex128
}

// NewSolver validates st and prepares a Solver for it. The stack's layers
// are copied; the media are shared (they must not change while in use).
func NewSolver(st Stack) (*Solver, error) { return newSolver("", st) }

func newSolver(prefix string, st Stack) (*Solver, error) {
	if err := validateStack(prefix, st); err != nil {
		return nil, err
	}
	nAmb := st.AmbientIndex
	if nAmb == 0 {
		nAmb = 1
	}
	sv := &Solver{pol: st.Pol, nAmb: nAmb, prefix: prefix}
	sv.beta = nAmb * math.Sin(st.AngleRad)
	sv.amb = newWave(st.Pol, complex(nAmb, 0), sv.beta)
	sv.qAmb = real(sv.amb.q)
	m := len(st.Layers)
	sv.layers = make([]layerSlot, m)
	for i, l := range st.Layers {
		f := fmt.Sprintf("%sLayers[%d]", prefix, i)
		sv.layers[i] = layerSlot{medium: l.Medium, field: f, name: l.Name, thickM: l.ThicknessM, incoherent: l.Incoherent}
	}
	exit := st.Exit
	if exit == nil {
		exit = Constant{N: 1}
	}
	sv.exit = layerSlot{medium: exit, field: prefix + "Exit"}
	for i := range sv.layers {
		if err := sv.prepareFixed(&sv.layers[i]); err != nil {
			return nil, err
		}
	}
	if err := sv.prepareFixed(&sv.exit); err != nil {
		return nil, err
	}
	sv.pos = -1
	for i := range sv.layers {
		if l := &sv.layers[i]; !l.fixed {
			l.pre = make([]complex128, prefetchBlock)
		}
	}
	if !sv.exit.fixed {
		sv.exit.pre = make([]complex128, prefetchBlock)
	}
	first := 0
	for i := 0; i <= m; i++ {
		if i == m || sv.layers[i].incoherent {
			sv.runs = append(sv.runs, run{first: first, end: i})
			first = i + 1
		}
	}
	sv.runOf = make([]int, m+1)
	for k, r := range sv.runs {
		for i := r.first; i <= r.end; i++ {
			sv.runOf[i] = k
		}
	}
	sv.vU = make([]complex128, m+1)
	sv.vV = make([]complex128, m+1)
	sv.step = make([]float64, m+1)
	sv.rel = make([]float64, m+1)
	return sv, nil
}

// isFixed reports whether a medium's index is known not to depend on
// frequency, so that its wave can be computed once.
func isFixed(m Medium) bool {
	switch v := m.(type) {
	case Constant, *Constant:
		return true
	case Material:
		return isFixed(v.Model)
	case *Material:
		return v != nil && isFixed(v.Model)
	}
	return false
}

func (sv *Solver) prepareFixed(l *layerSlot) error {
	if !isFixed(l.medium) {
		return nil
	}
	n := l.medium.Index(1)
	if err := checkIndex(l.field+".Medium", l.name, 1, n); err != nil {
		return err
	}
	sv.setWave(l, n)
	l.fixed = true
	return nil
}

func (sv *Solver) setWave(l *layerSlot, n complex128) {
	l.w.set(sv.pol, n, sv.beta)
	if sv.pol == PolP && sv.beta != 0 {
		q2 := l.w.eps - complex(sv.beta*sv.beta, 0)
		l.aF = cdiv(q2, l.w.eps)
		l.bF = l.w.eps
	} else {
		l.aF = 1
		l.bF = l.w.q * l.w.q
	}
	l.invQ = 0
	if l.w.q != 0 {
		l.invQ = cinv(l.w.q)
	}
	l.aQ, l.bQ = l.aF*l.invQ, l.bF*l.invQ
}

// Solve computes the response at freqHz > 0 and keeps the fields for
// Absorptance, Field, MeanField and Amplitudes. It returns an *InputError if
// the frequency is not positive and finite, if a medium returns an index
// that is not finite or has κ < 0 there, or if the stack is singular at that
// frequency (ε = 0 exactly in a layer at oblique p incidence).
func (sv *Solver) Solve(freqHz float64) (Response, error) {
	sv.pos = -1
	return sv.solve(freqHz, false, false, 0)
}

// prefetchBlock is the number of frequencies whose indices Evaluate asks
// for in one go (prefetch).
const prefetchBlock = 64

// prefetch evaluates the index of every medium that is not fixed at the
// positive frequencies of freqHz (at most prefetchBlock of them; others get
// 0 and are never used): one loop per medium whose iterations do not wait
// on each other, so the processor overlaps them, where interleaved with
// the solution they would each wait for the last. Evaluate then calls
// solve with pos set to the position in the block.
func (sv *Solver) prefetch(freqHz []float64) {
	fill := func(l *layerSlot) {
		if l.fixed {
			return
		}
		pre := l.pre[:len(freqHz)]
		for j, f := range freqHz {
			if f > 0 && f <= math.MaxFloat64 {
				pre[j] = l.medium.Index(f)
			} else {
				pre[j] = 0
			}
		}
	}
	for i := range sv.layers {
		fill(&sv.layers[i])
	}
	fill(&sv.exit)
}

// index returns the medium's index at the current frequency: prefetched
// inside a block of Evaluate, asked for otherwise.
func (sv *Solver) index(l *layerSlot) complex128 {
	if sv.pos >= 0 {
		return l.pre[sv.pos]
	}
	return l.medium.Index(sv.freqHz)
}

// gridAnchor sets rot = e^{i·Re δ}, att = e^{-2·Im δ} and hatt = e^{-Im δ}
// of fixed layer l from its δ = k0·q·d, and their factors for one step of
// a uniform grid, e^{i·Re δ1}, e^{-2·Im δ1} and e^{-Im δ1} with
// δ1 = (2π·df/c)·q·d. Between anchors solve multiplies by the factors.
//
// Round-off. Along the grid δ grows by δ1 per step, so the recurrence
// computes the same exponentials; it differs from the direct evaluation by
// the rounding of the factors (one ulp each) and of the products (√5 ulp
// for a complex product, Brent, Percival & Zimmermann, Math. Comp. 76,
// 1469 (2007); one ulp for a real one), which accumulate linearly: after j
// steps from an anchor the relative difference is at most (2 + 4.3·j)·u,
// u = 2^-53. To that adds the rounding of the angle itself, a few |Re δ|·u,
// which any evaluation in float64 carries but which the recurrence and the
// direct formula round differently (and the grid's deviation from
// uniformity, at most 4 ulp of its largest frequency, see uniformStep).
// With an anchor every gridAnchorEvery = 32 steps, j <= 31 and the
// recurrence's own share is at most 1.5e-14 relative
// (TestGridRecurrenceMatchesDirect compares with Solve).
func (sv *Solver) gridAnchor(l *layerSlot, dfHz float64) {
	re, im := real(l.delta), imag(l.delta)
	s, c := math.Sincos(re)
	l.rot = complex(c, s)
	l.att, l.hatt = 1, 1
	if im != 0 {
		l.att, l.hatt = math.Exp(-2*im), math.Exp(-im)
	}
	kd1 := units.AngularFrequency(dfHz) / units.SpeedOfLight * l.thickM
	re1, im1 := kd1*real(l.w.q), kd1*imag(l.w.q)
	s, c = math.Sincos(re1)
	l.drot = complex(c, s)
	l.datt, l.dhatt = math.Exp(-2*im1), math.Exp(-im1)
}

// solve is Solve; with grid set, at the frequencies of a uniform grid of
// step dfHz, called in order: the fixed layers' phase factors are then
// computed exactly when anchor is set and advanced by one step of the
// recurrence otherwise (gridAnchor).
func (sv *Solver) solve(freqHz float64, grid, anchor bool, dfHz float64) (Response, error) {
	sv.solved = false
	sv.grid = grid
	if !finite(freqHz) || !(freqHz > 0) {
		return Response{}, inputErr("freqHz", "%g must be finite and > 0", freqHz)
	}
	sv.freqHz = freqHz
	sv.k0 = units.AngularFrequency(freqHz) / units.SpeedOfLight
	for i := range sv.layers {
		l := &sv.layers[i]
		if !l.fixed {
			if err := sv.update(l); err != nil {
				return Response{}, err
			}
			continue
		}
		// update for a fixed layer: δ = k0·d·q (real k0·d, so two products).
		kd := sv.k0 * l.thickM
		l.delta = complex(kd*real(l.w.q), kd*imag(l.w.q))
		switch {
		case !grid:
		case anchor:
			sv.gridAnchor(l, dfHz)
		default:
			l.rot *= l.drot
			l.att *= l.datt
			l.hatt *= l.dhatt
		}
	}
	if ex := &sv.exit; !ex.fixed {
		// The exit half-space needs only its wave (no matrix, no depth).
		n := sv.index(ex)
		if !goodIndex(n) {
			return Response{}, checkIndex(ex.field+".Medium", ex.name, freqHz, n)
		}
		ex.w.set(sv.pol, n, sv.beta)
	}

	aIn := complex(1, 0)
	var absorbed float64
	for k := range sv.runs {
		rn := &sv.runs[k]
		rn.aIn = aIn
		sv.sweep(rn)
		// Flux absorbed in the run: in at its entrance, out at its exit.
		if rn.end > rn.first {
			absorbed += sv.flux(rn.first) - sv.flux(rn.end)
		}
		t := aIn * rn.tTrue
		if rn.end < len(sv.layers) {
			l := &sv.layers[rn.end]
			l.aEnt = t
			fwd := real(l.w.gU * cmplx.Conj(l.w.gV))
			absorbed += fwd * sqAbs(t) * -math.Expm1(-2*imag(l.delta)) / sv.qAmb
			if sv.grid && l.fixed {
				aIn = t * (l.rot * complex(l.hatt, 0)) // e^{iδ}
			} else {
				aIn = t * cexpi(l.delta)
			}
		} else {
			sv.aExit = t
		}
	}
	r := sv.runs[0].r
	resp := Response{
		Reflection:   r,
		Transmission: sv.aExit,
		R:            sqAbs(r),
		T:            real(sv.exit.w.gU*cmplx.Conj(sv.exit.w.gV)) * sqAbs(sv.aExit) / sv.qAmb,
		A:            absorbed,
	}
	if !finiteC(resp.Reflection) || !finiteC(resp.Transmission) || !finite(resp.A) || !finite(resp.T) {
		return Response{}, inputErr(sv.prefix+"Layers", "the stack is singular at %g Hz (ε = 0 in a layer or the exit medium at oblique p incidence, or an index at a pole)", freqHz)
	}
	sv.resp = resp
	sv.solved = true
	return resp, nil
}

func sqAbs(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }

// update evaluates a layer's medium at the current frequency.
func (sv *Solver) update(l *layerSlot) error {
	if !l.fixed {
		n := sv.index(l)
		if !goodIndex(n) {
			return checkIndex(l.field+".Medium", l.name, sv.freqHz, n)
		}
		sv.setWave(l, n)
	}
	l.delta = complex(sv.k0*l.thickM, 0) * l.w.q
	return nil
}

// sweep steps a run from its exit back to its entrance (see Solver).
func (sv *Solver) sweep(rn *run) {
	var out wave
	if rn.end < len(sv.layers) {
		out = sv.layers[rn.end].w
	} else {
		out = sv.exit.w
	}
	in := sv.amb
	if rn.first > 0 {
		in = sv.layers[rn.first-1].w
	}
	u, v := out.gU, out.gV
	sv.vU[rn.end], sv.vV[rn.end] = u, v
	for i := rn.end - 1; i >= rn.first; i-- {
		l := &sv.layers[i]
		c, sOverEta, etaS, step := sv.layerMatrix(l)
		u, v = c*u+mulNegI(sOverEta*v), c*v+mulNegI(etaS*u)
		// Keep the scaled fields in a comfortable range; the scale moves
		// into the step. Checked every 8 layers and at the run's entrance:
		// 8 layers change the scale by far less than the 1e200 of headroom
		// left below overflow of |v|².
		if (i-rn.first)%8 != 0 {
			sv.vU[i], sv.vV[i], sv.step[i] = u, v, step
			continue
		}
		if m := l1(u) + l1(v); m > 1e50 || (m < 1e-50 && m > 0) {
			u /= complex(m, 0)
			v /= complex(m, 0)
			step /= m
		}
		sv.vU[i], sv.vV[i], sv.step[i] = u, v, step
	}
	inv := cinv(in.gV*u + in.gU*v)
	tScaled := 2 * in.gU * in.gV * inv
	rn.r = (in.gV*u - in.gU*v) * inv
	// rel: the true fields at interface i relative to those at the run's
	// entrance are v_i·rel_i; the product of all steps turns t̃ into t.
	rel := 1.0
	sv.rel[rn.first] = 1
	for i := rn.first; i < rn.end; i++ {
		rel *= sv.step[i]
		sv.rel[i+1] = rel
	}
	rn.tTrue = tScaled * complex(rel, 0)
	rn.amp = rn.aIn * tScaled
}

// layerMatrix returns the entries of the characteristic matrix of a layer,
// scaled by e^{-D}, D = Im δ >= 0 (cos δ, sin δ/η and η·sin δ), and the
// factor e^{-D} itself. For |δ|₁ < 1e-2 the unscaled Taylor series are used
// (e^{-D} is then within 1e-2 of 1 and no scaling is needed).
func (sv *Solver) layerMatrix(l *layerSlot) (c, sOverEta, etaS complex128, step float64) {
	delta := l.delta
	if l1(delta) < 1e-2 {
		c, s1 := cosSincSeries(delta)
		kd := complex(sv.k0*l.thickM, 0)
		return c, l.aF * kd * s1, l.bF * kd * s1, 1
	}
	// e^{-D}·cos δ and e^{-D}·sin δ from e^{iδ}·e^{-D} = e^{i·Re δ}·x and
	// e^{-iδ}·e^{-D} = e^{-i·Re δ}, x = e^{-2D}. (For small D, 1 - x carries
	// an absolute error of ~1e-16, which is all that matters here.)
	var sr, cr, x float64
	if sv.grid && l.fixed {
		sr, cr, x, step = imag(l.rot), real(l.rot), l.att, l.hatt
	} else {
		sr, cr = math.Sincos(real(delta))
		x = 1
		if d := imag(delta); d != 0 {
			x = math.Exp(-2 * d)
		}
		step = math.Sqrt(x)
	}
	h1, h2 := 0.5*(1+x), 0.5*(x-1)
	c = complex(cr*h1, sr*h2)
	s := complex(sr*h1, -cr*h2)
	// sin δ/η = aF·k0d·sin δ/δ = (aF/q)·sin δ, since δ = k0·q·d.
	return c, l.aQ * s, l.bQ * s, step
}

// fields returns the true tangential fields at interface i.
func (sv *Solver) fields(i int) (u, v complex128) {
	rn := &sv.runs[sv.runOf[i]]
	scale := rn.amp * complex(sv.rel[i], 0)
	return sv.vU[i] * scale, sv.vV[i] * scale
}

// flux returns the power flux at interface i over the incident flux.
func (sv *Solver) flux(i int) float64 {
	u, v := sv.fields(i)
	return real(u*cmplx.Conj(v)) / sv.qAmb
}

func (sv *Solver) checkLayer(layer int, exitOK bool) error {
	if !sv.solved {
		return inputErr("Solver", "Solve has not succeeded yet")
	}
	if layer == ExitMedium && exitOK {
		return nil
	}
	if layer < 0 || layer >= len(sv.layers) {
		return inputErr("layer", "index %d out of range [0, %d) (or ExitMedium)", layer, len(sv.layers))
	}
	return nil
}

// Absorptance returns the fraction of the incident power absorbed in the
// layer at the last solved frequency: the power flux entering the layer
// minus the flux leaving it (first pass for an incoherent layer). For
// ExitMedium it returns the flux entering the exit half-space, T, all of
// which an absorbing half-space absorbs (with density ∝ α·e^{-αz}, α from
// AbsorptionCoefficient for normal incidence).
func (sv *Solver) Absorptance(layer int) (float64, error) {
	if err := sv.checkLayer(layer, true); err != nil {
		return 0, err
	}
	return sv.absorptance(layer), nil
}

func (sv *Solver) absorptance(layer int) float64 {
	if layer == ExitMedium {
		return sv.resp.T
	}
	l := &sv.layers[layer]
	if l.incoherent {
		fwd := real(l.w.gU * cmplx.Conj(l.w.gV))
		return fwd * sqAbs(l.aEnt) * -math.Expm1(-2*imag(l.delta)) / sv.qAmb
	}
	return sv.flux(layer) - sv.flux(layer+1)
}

// Field is the complex electric field at a point, per unit amplitude of the
// incident wave: Tangential is the component along the interfaces (E_y for
// s, E_x for p), Normal the component along the stack normal (zero for s and
// at normal incidence). Just inside a layer's front surface Tangential
// equals the field just outside it (it is continuous), while Normal jumps by
// the ratio of the permittivities.
type Field struct {
	Tangential, Normal complex128
}

// Field returns the field at depthM (0 <= depthM <= thickness, or any depth
// >= 0 in the exit medium) below the front surface of a layer at the last
// solved frequency. In an incoherent layer it is the first-pass forward
// wave.
func (sv *Solver) Field(layer int, depthM float64) (Field, error) {
	if err := sv.checkLayer(layer, true); err != nil {
		return Field{}, err
	}
	limit := math.Inf(1)
	if layer != ExitMedium {
		limit = sv.layers[layer].thickM
	}
	if !finite(depthM) || depthM < 0 || depthM > limit {
		return Field{}, inputErr("depthM", "%g m is outside the layer [0, %g m]", depthM, limit)
	}
	return sv.fieldAt(layer, depthM), nil
}

func (sv *Solver) fieldAt(layer int, z float64) Field {
	var l *layerSlot
	var u, v complex128
	switch {
	case layer == ExitMedium:
		l = &sv.exit
		u, v = l.w.gU*sv.aExit, l.w.gV*sv.aExit
		if z != 0 {
			e := cexpi(complex(sv.k0*z, 0) * l.w.q)
			u, v = u*e, v*e
		}
	case sv.layers[layer].incoherent:
		l = &sv.layers[layer]
		e := cexpi(complex(sv.k0*z, 0) * l.w.q)
		u, v = l.w.gU*l.aEnt*e, l.w.gV*l.aEnt*e
	default:
		l = &sv.layers[layer]
		u0, v0 := sv.fields(layer)
		if z == 0 {
			u, v = u0, v0
		} else if l1(l.delta) < 1 {
			// Propagate from the entrance; |δz| < 1, no growth to fear.
			dz := complex(sv.k0*z, 0) * l.w.q
			c, s1 := cosSinc(dz)
			kz := complex(sv.k0*z, 0)
			u = c*u0 + complex(0, 1)*l.aF*kz*s1*v0
			v = c*v0 + complex(0, 1)*l.bF*kz*s1*u0
		} else {
			a, b := sv.splitAmplitudes(layer)
			ea := cexpi(complex(sv.k0*z, 0) * l.w.q)
			eb := cexpi(complex(sv.k0*(l.thickM-z), 0) * l.w.q)
			u = l.w.gU * (a*ea + b*eb)
			v = l.w.gV * (a*ea - b*eb)
		}
	}
	return Field{Tangential: u, Normal: sv.normal(l, v)}
}

// normal returns E_z = -β·V/ε, from Maxwell's equations for p (zero for s).
func (sv *Solver) normal(l *layerSlot, v complex128) complex128 {
	if sv.pol != PolP || sv.beta == 0 {
		return 0
	}
	return -complex(sv.beta, 0) * cdiv(v, l.w.eps)
}

// splitAmplitudes returns the forward amplitude at the entrance and the
// backward amplitude at the exit of coherent layer i.
func (sv *Solver) splitAmplitudes(i int) (a, b complex128) {
	l := &sv.layers[i]
	u0, v0 := sv.fields(i)
	u1, v1 := sv.fields(i + 1)
	iU, iV := cinv(l.w.gU), cinv(l.w.gV)
	a = (u0*iU + v0*iV) * 0.5
	b = (u1*iU - v1*iV) * 0.5
	return a, b
}

// MeanField returns the field averaged over the thickness of a layer,
// (1/d)·∫_0^d E(z) dz, at the last solved frequency: the field that drives a
// uniform excitation of a thin film. For a layer of zero thickness it is the
// field at its surface. The exit half-space has no average.
func (sv *Solver) MeanField(layer int) (Field, error) {
	if err := sv.checkLayer(layer, false); err != nil {
		return Field{}, err
	}
	return sv.meanField(layer), nil
}

func (sv *Solver) meanField(layer int) Field {
	l := &sv.layers[layer]
	var u, v complex128
	if l.incoherent {
		e1 := expm1OverX(l.delta)
		u, v = l.w.gU*l.aEnt*e1, l.w.gV*l.aEnt*e1
	} else if l1(l.delta) < 1 {
		// (1/d)∫cos = sin δ/δ, (1/d)∫sin = (1 - cos δ)/δ.
		u0, v0 := sv.fields(layer)
		// sin δ/δ = sinc(δ/2)·cos(δ/2) and (1 - cos δ)/δ² = sinc(δ/2)²/2:
		// one evaluation, no cancellation.
		ch, sh := cosSinc(l.delta * 0.5)
		s1, c2 := sh*ch, sh*sh*0.5
		kd := complex(sv.k0*l.thickM, 0)
		u = u0*s1 + complex(0, 1)*l.aF*kd*c2*v0
		v = v0*s1 + complex(0, 1)*l.bF*kd*c2*u0
	} else {
		a, b := sv.splitAmplitudes(layer)
		e1 := expm1OverX(l.delta)
		u = l.w.gU * (a + b) * e1
		v = l.w.gV * (a - b) * e1
	}
	return Field{Tangential: u, Normal: sv.normal(l, v)}
}

// Amplitudes returns the complex amplitudes (of the whole electric-field
// vector, p convention as in Interface) of the two plane waves in a layer at
// the last solved frequency: forward is the wave travelling into the stack,
// taken at the layer's front surface (z = 0); backward the wave travelling
// back, taken at its back surface (z = d), where each is well conditioned.
// Inside, E_t(z) = gU·(forward·e^{iδz/d} + backward·e^{iδ(1-z/d)}) with gU = 1
// for s and cosθ = q/ñ for p. In an incoherent layer and in the exit medium
// backward is 0 (first pass). The split is undefined when q = 0 (a lossless
// layer exactly at its critical angle), which is reported as an error.
func (sv *Solver) Amplitudes(layer int) (forward, backward complex128, err error) {
	if err := sv.checkLayer(layer, true); err != nil {
		return 0, 0, err
	}
	if layer == ExitMedium {
		return sv.aExit, 0, nil
	}
	l := &sv.layers[layer]
	if l.incoherent {
		return l.aEnt, 0, nil
	}
	if l.w.q == 0 {
		return 0, 0, inputErrN(l.field, l.name, "q = 0 (exactly at the critical angle): forward and backward waves coincide")
	}
	a, b := sv.splitAmplitudes(layer)
	return a, b, nil
}

// Echo is the round trip of one layer: a pulse that crosses it once is
// followed, DelayS later, by its first internal echo (reflected at the back
// and then the front surface).
type Echo struct {
	// Field and Name identify the layer or element, as in InputError.
	Field, Name string
	// Incoherent is true when the echo is dropped by the calculation
	// (first pass only); for a coherent layer the echo is in the result.
	Incoherent bool
	// DelayS is 2d/c·d(f·Re q)/df at the reference frequency: the group
	// round-trip time, 2nd·cosθ/c for a non-dispersive medium, where
	// q = ñcosθ is the normal index in the layer.
	DelayS float64
}

// Echoes returns, for every layer of the stack, the delay of its first
// internal echo at refFreqHz (see Echo). The caller compares the delays of
// the incoherent layers with the time its window extends after the main
// pulse and raises caution.EchoInWindow (EchoCautions does this) when an
// echo that the calculation drops would in fact fall inside. A coherent
// layer whose echoes outlast the window makes a periodic (FFT) time trace
// wrap around.
func (s Stack) Echoes(refFreqHz float64) ([]Echo, error) {
	if err := validateStack("", s); err != nil {
		return nil, err
	}
	nAmb := s.AmbientIndex
	if nAmb == 0 {
		nAmb = 1
	}
	beta := nAmb * math.Sin(s.AngleRad)
	out := make([]Echo, 0, len(s.Layers))
	for i, l := range s.Layers {
		f := fmt.Sprintf("Layers[%d]", i)
		d, err := roundTrip(f, l.Name, l.Medium, l.ThicknessM, beta, refFreqHz)
		if err != nil {
			return nil, err
		}
		out = append(out, Echo{Field: f, Name: l.Name, Incoherent: l.Incoherent, DelayS: d})
	}
	return out, nil
}

// roundTrip returns 2d/c·d(f·Re q)/df by a central difference with a
// relative step of 1e-4 (truncation error ~1e-8 relative for smooth data;
// exact for a constant index).
func roundTrip(field, name string, m Medium, dM, beta, refHz float64) (float64, error) {
	if !finite(refHz) || !(refHz > 0) {
		return 0, inputErr("refFreqHz", "%g must be finite and > 0", refHz)
	}
	h := 1e-4 * refHz
	fq := func(f float64) (float64, error) {
		n := m.Index(f)
		if err := checkIndex(field+".Medium", name, f, n); err != nil {
			return 0, err
		}
		q := n
		if beta != 0 {
			q = IndexFromEpsilon(n*n - complex(beta*beta, 0))
		}
		return f * real(q), nil
	}
	hi, err := fq(refHz + h)
	if err != nil {
		return 0, err
	}
	lo, err := fq(refHz - h)
	if err != nil {
		return 0, err
	}
	return 2 * dM / units.SpeedOfLight * (hi - lo) / (2 * h), nil
}
