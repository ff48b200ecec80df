package phononmode

import (
	"fmt"
	"math"
	"sync"

	"thzdrive/caution"
	"thzdrive/pulse"
	"thzdrive/units"
)

// Method selects how the equation of motion is solved.
type Method int

const (
	// Auto uses Exact for a linear mode whose ring-down fits under
	// Options.MaxSamples and TimeDomain otherwise.
	Auto Method = iota
	// Exact is the frequency-domain solution of the linear mode,
	// Q(ω) = Z*·cosθ·E(ω)/(W² − ω² − iγω), transformed back with
	// pulse.Transform. It refuses a mode with nonlinear terms.
	Exact
	// TimeDomain integrates the full equation of motion with fixed-step
	// classical Runge–Kutta (RK4).
	TimeDomain
)

func (m Method) String() string {
	switch m {
	case Auto:
		return "auto"
	case Exact:
		return "exact"
	case TimeDomain:
		return "time-domain"
	}
	return fmt.Sprintf("Method(%d)", int(m))
}

// Thresholds behind the cautions and the definitions of the outputs.
const (
	// UndersampledFraction: a mode above this fraction of the trace's
	// Nyquist frequency is cautioned as undersampled (physics.md §7).
	UndersampledFraction = 0.4
	// LindemannWarnRatio and LindemannDamageRatio: ion displacement over
	// bond length past which a warning, then a damage caution, is given.
	// Melting sets in at ~0.1–0.15 (Lindemann, Phys. Z. 11, 609 (1910));
	// a rule of thumb, not a criterion for a transient displacement.
	LindemannWarnRatio   = 0.05
	LindemannDamageRatio = 0.1
	// NonlinearQuanta: mode energy per cell, in quanta ħW, past which the
	// regime is cautioned as nonlinear (physics.md §7).
	NonlinearQuanta = 0.1
	// OutsideBandLevel: when the field's spectral amplitude at the mode,
	// relative to its maximum, is below this level (−20 dB, the band edge
	// physics.md §2 uses) the mode is cautioned as outside the band.
	OutsideBandLevel = 0.1
	// PulseEndFraction: the pulse is over at the first sample by which this
	// fraction of ∫E² dt has arrived; the mode energy is taken there.
	PulseEndFraction = 0.999
	// DefaultMaxSamples caps the length of every internal array (padded
	// transform, sub-step grid) when Options.MaxSamples is zero.
	DefaultMaxSamples = 1 << 22
	// DefaultTimeDomainTol is the default target for the time-domain
	// integrator's global error relative to max|Q|.
	DefaultTimeDomainTol = 1e-7
	// wrapResidual is the amplitude, relative to its value at the end of
	// the trace, to which the exact solution must have rung down before
	// the periodic transform wraps it onto the start: e^{-γT/2} <= 1e-15,
	// i.e. T >= 69/γ of zero padding, so that wrap-around stays at
	// round-off.
	wrapResidual = 1e-15
)

// Depth asks for the average of the response over the depth a probe sees.
type Depth struct {
	// ProbeDepthM is the probe's penetration depth d, m (> 0); the average
	// is weighted by exp(−z/d)/d.
	ProbeDepthM float64
	// Index is the sample's complex refractive index ñ = n + iκ at
	// frequency f > 0, on the branch κ >= 0 (e^{-iωt} convention). It must
	// return a value for every frequency up to the trace's Nyquist
	// frequency; where the field has no spectral weight the value hardly
	// matters (hold the edge value rather than extrapolate).
	Index func(freqHz float64) complex128
}

// Options tune Drive. The zero value is ready to use.
type Options struct {
	Method Method
	// Depth, when not nil, adds the probe-depth average of Q.
	Depth *Depth
	// MaxSamples caps every internal array length; 0 means
	// DefaultMaxSamples. Work beyond it is refused with ErrTooLarge (the
	// time-domain path) or done with a shortened ring-down and a
	// MODE_NOT_DECAYED caution (the exact path).
	MaxSamples int
	// TimeDomainTol is the target global error of the integrator relative
	// to max|Q|; 0 means DefaultTimeDomainTol. It sets the sub-step.
	TimeDomainTol float64
}

// Result is the response of a mode to one field trace. Q and its average
// are on the field's time grid; every energy is per unit cell unless its
// name says otherwise.
type Result struct {
	Method   Method // the method used (never Auto)
	StartS   float64
	StepS    float64
	SubSteps int // RK4 steps per field sample (TimeDomain), 0 for Exact
	// PaddedLen is the transform length of the exact solution and of the
	// spectral analysis: the trace plus zero padding for the ring-down.
	PaddedLen int

	// QMSqrtKg is Q(t) at the surface, m·√kg, one value per field sample.
	QMSqrtKg []float64
	// DepthAvgQMSqrtKg is the exp(−z/d)/d-weighted average of Q over depth
	// (nil without Options.Depth).
	DepthAvgQMSqrtKg []float64

	// MaxAbsQMSqrtKg is max|Q(t)| at the surface over the trace window,
	// refined between samples; MaxAbsQTimeS is when it occurs.
	MaxAbsQMSqrtKg float64
	MaxAbsQTimeS   float64
	// DepthAvgMaxAbsQMSqrtKg is max|Q| of the depth average, on the samples.
	DepthAvgMaxAbsQMSqrtKg float64
	// DisplacementM is the peak ion displacement max|Q|/√M_eff, m (0 when
	// Mode.EffectiveMassKg is not given).
	DisplacementM float64
	// LindemannRatio is DisplacementM over Mode.BondLengthM (0 when either
	// is not given).
	LindemannRatio float64

	// PulseEndS is when the pulse is over (PulseEndFraction of ∫E² dt).
	PulseEndS float64
	// ModeEnergyJ is the mode's energy per cell at PulseEndS, J: the
	// envelope energy ½W²·[Q² + ((Q' + γQ/2)/W_d)²], W_d = √(W² − γ²/4),
	// which for free motion of the linear mode decays exactly as e^{−γt}
	// without the ripple of ½Q'² + ½W²Q², plus the anharmonic potential
	// a3·Q³/3 + a4·Q⁴/4. For an overdamped mode (γ >= 2W) it is
	// ½Q'² + ½W²Q² + anharmonic terms. The field is not quite zero at
	// PulseEndS, so the part of Q that follows it adiabatically
	// (≈ Z*E/W² below the mode) is counted too: negligible for a mode in
	// the pulse's band, dominant for one far outside it (MODE_OUTSIDE_BAND).
	ModeEnergyJ float64
	// Quanta is ModeEnergyJ in units of ħW.
	Quanta float64
	// AbsorbedJPerCell is the work the field does on the mode over the
	// whole response, ∫F·Q' dt, J per cell; all of it ends up as heat.
	AbsorbedJPerCell float64
	// AbsorbedJPerM3 is AbsorbedJPerCell / V_cell, J/m³.
	AbsorbedJPerM3 float64

	// Overlap is η = ∫|E(ω)|²·ωε″(ω)dω / (max_ω[ωε″(ω)]·∫|E(ω)|²dω) over
	// ω > 0 with ε″ of this mode's Lorentz term, in [0, 1]: the absorbed
	// energy relative to all spectral energy sitting on resonance. 0 for an
	// undamped mode (the limit γ → 0).
	Overlap float64
	// RelAmplitudeAtMode is |E(W)|/max_f|E(f)|, the field's spectral
	// amplitude at the mode relative to its peak.
	RelAmplitudeAtMode float64
	// AnharmonicShiftHz is the perturbative frequency shift at amplitude
	// MaxAbsQMSqrtKg (Mode.AnharmonicShiftHz).
	AnharmonicShiftHz float64

	Cautions []caution.Caution
}

// Solver holds the buffers of Drive so that repeated calls allocate
// nothing. A Solver is not safe for concurrent use; use one per goroutine.
// The zero value is ready to use.
type Solver struct {
	buf      []float64    // real work array, padded length
	spec     []complex128 // spectrum of the field, padded length
	qspec    []complex128 // spectrum of the response
	fine     []float64    // force on the sub-step grid
	fineSpec []complex128
	tmpQ     []float64 // Q at one depth node
	tmpPhase []float64 // one phase of the sub-step grid
	zeta     []complex128

	// Transforms kept between calls (pulse.Acquire shares their plans);
	// for the padded spectrum, the time-domain trace, the depth average.
	trPad, trU, trD *pulse.Transform
}

// transform returns *slot if it has length n, else swaps it for one that has.
func (s *Solver) transform(slot **pulse.Transform, n int) *pulse.Transform {
	if *slot == nil || (*slot).Len() != n {
		pulse.Release(*slot)
		*slot = pulse.Acquire(n)
	}
	return *slot
}

// release hands the transforms back to the shared pool.
func (s *Solver) release() {
	pulse.Release(s.trPad)
	pulse.Release(s.trU)
	pulse.Release(s.trD)
	s.trPad, s.trU, s.trD = nil, nil, nil
}

// solvers keeps the work buffers of Drive between calls (a plan of 32 768
// samples pads to ~70 000, so they weigh ~2 MB): reusing them spares the
// allocation, the zeroing and the garbage collections it would cause.
var solvers = sync.Pool{New: func() any { return new(Solver) }}

// Drive computes the response of mode m to the field f with a Solver from
// a pool (its buffers are reused; the result is the caller's).
func Drive(m Mode, f Field, opt Options) (*Result, error) {
	s := solvers.Get().(*Solver)
	defer func() {
		s.release()
		solvers.Put(s)
	}()
	r := new(Result)
	if err := s.Drive(m, f, opt, r); err != nil {
		return nil, err
	}
	return r, nil
}

// Drive computes the response of mode m to the field f into r, reusing r's
// slices. On error r is left in an unspecified state.
func (s *Solver) Drive(m Mode, f Field, opt Options, r *Result) error {
	if err := m.Validate(); err != nil {
		return err
	}
	if err := f.Validate(); err != nil {
		return err
	}
	if err := opt.validate(); err != nil {
		return err
	}
	maxN := opt.MaxSamples
	if maxN == 0 {
		maxN = DefaultMaxSamples
	}
	n := len(f.VPerM)
	dt := f.StepS
	gamma := m.GammaRadPerS()

	depthPad := 0
	if opt.Depth != nil {
		p, err := depthPadding(opt.Depth, f)
		if err != nil {
			return err
		}
		if float64(n)+p > float64(maxN)/2 {
			return fmt.Errorf("%w: the probe depth delays the field by %.3g samples; limit %d", ErrTooLarge, p, maxN)
		}
		depthPad = int(p)
	}

	// Padding for the exact solution: the ring-down over 2·ln(1/ε)/γ.
	ring := math.Inf(1)
	if gamma > 0 {
		ring = math.Ceil(2 * math.Log(1/wrapResidual) / (gamma * dt))
	}
	need := float64(n+depthPad) + ring
	capped := false
	if need < float64(2*n) {
		need = float64(2 * n)
	}
	var nPad int
	if need > float64(maxN) {
		capped = true
		nPad = niceSizeBelow(maxN)
		if nPad < n+depthPad+2 {
			return fmt.Errorf("%w: %d samples need a transform above the limit %d", ErrTooLarge, n, maxN)
		}
	} else {
		nPad = niceSize(int(need))
		if nPad > maxN {
			nPad = niceSizeBelow(maxN)
		}
	}

	method := opt.Method
	if method == Auto {
		method = Exact
		if !m.Linear() || capped {
			method = TimeDomain
		}
	}
	if method == Exact && !m.Linear() {
		return inputErr("Options.Method", "the exact solution needs a linear mode (a3 = a4 = ∂ε/∂Q = 0)")
	}
	if method == TimeDomain && capped {
		// The spectrum then serves only the overlap and the band metrics;
		// a fourfold padding resolves the pulse's spectrum, and the overlap
		// of a mode narrower than 1/(4·n·dt) is approximate.
		nPad = min(nPad, niceSize(4*(n+depthPad)))
	}

	*r = Result{
		Method:           method,
		StartS:           f.StartS,
		StepS:            dt,
		PaddedLen:        nPad,
		QMSqrtKg:         resize(r.QMSqrtKg, n),
		DepthAvgQMSqrtKg: r.DepthAvgQMSqrtKg[:0],
		Cautions:         r.Cautions[:0],
	}
	if opt.Depth != nil {
		r.DepthAvgQMSqrtKg = resize(r.DepthAvgQMSqrtKg, n)
	} else {
		r.DepthAvgQMSqrtKg = nil
	}
	iEnd, _ := f.pulseEnd(PulseEndFraction)
	r.PulseEndS = f.TimeS(iEnd)

	// Spectrum of the field on the padded grid: overlap, band, and the
	// exact solution.
	tr := s.transform(&s.trPad, nPad)
	s.buf = resize(s.buf, nPad)
	copy(s.buf, f.VPerM)
	clear(s.buf[n:])
	s.spec = resizeC(s.spec, tr.Bins())
	tr.Forward(s.spec, s.buf, dt)
	s.spectralMetrics(m, f, nPad, r)

	var st endState
	var err error
	if method == Exact {
		st, err = s.exact(m, f, opt.Depth, tr, iEnd, r)
		if err == nil && capped {
			res := math.Exp(-gamma * float64(nPad-n-depthPad) * dt / 2)
			r.Cautions = append(r.Cautions, caution.New(caution.ModeNotDecayed,
				"The mode rings longer than the sample limit allows to pad; the exact solution wraps its ring-down onto the start of the window.",
				caution.V("residual_amplitude", res),
				caution.V("linewidth_thz", m.LinewidthHz/units.THz)))
		}
	} else {
		st, err = s.timeDomain(m, f, opt, maxN, iEnd, r)
	}
	if err != nil {
		return err
	}
	s.finish(m, f, st, r)
	return r.checkFinite()
}

// endState is what the solvers hand to finish.
type endState struct {
	qEnd, pEnd float64 // Q and Q' at the pulse end
	absorbed   float64 // work per cell, J
}

func (o Options) validate() error {
	switch {
	case o.Method < Auto || o.Method > TimeDomain:
		return inputErr("Options.Method", "unknown method %d", int(o.Method))
	case o.MaxSamples < 0:
		return inputErr("Options.MaxSamples", "%d: must be >= 0", o.MaxSamples)
	case o.MaxSamples > 0 && o.MaxSamples < 64:
		return inputErr("Options.MaxSamples", "%d: must be 0 (default) or >= 64", o.MaxSamples)
	case !finite(o.TimeDomainTol) || o.TimeDomainTol < 0 || o.TimeDomainTol >= 1:
		return inputErr("Options.TimeDomainTol", "%g: must be in [0, 1)", o.TimeDomainTol)
	}
	if d := o.Depth; d != nil {
		switch {
		case !finite(d.ProbeDepthM) || d.ProbeDepthM <= 0:
			return inputErr("Options.Depth.ProbeDepthM", "%g: must be finite and > 0", d.ProbeDepthM)
		case d.Index == nil:
			return inputErr("Options.Depth.Index", "a refractive index function is required")
		}
	}
	return nil
}

// spectralMetrics fills the overlap and the relative amplitude at the mode
// from the padded spectrum s.spec.
//
// The integrals over ω are trapezoid sums over the bins; with the padding
// of the exact solution (T >= 69/γ) the sum over the Lorentzian is exact to
// the wrap residual, since the trapezoid error of an integrand analytic in a
// strip of half-width γ/2 falls as e^{−γT/2}.
func (s *Solver) spectralMetrics(m Mode, f Field, nPad int, r *Result) {
	w0 := m.OmegaRadPerS()
	g := m.GammaRadPerS()
	dw := 2 * math.Pi / (float64(nPad) * f.StepS)
	last := len(s.spec) - 1
	var num, den, peak float64
	kp := 0
	for k, e := range s.spec {
		p := real(e)*real(e) + imag(e)*imag(e)
		if p > peak {
			peak, kp = p, k
		}
		c := 1.0
		if k == 0 || (k == last && nPad%2 == 0) {
			c = 0.5
		}
		den += c * p
		if g > 0 {
			w := float64(k) * dw
			// ωε″/max(ωε″) = γ²ω²/((W²−ω²)² + γ²ω²); max at ω = W.
			d := w0*w0 - w*w
			num += c * p * g * g * w * w / (d*d + g*g*w*w)
		}
	}
	if den > 0 {
		r.Overlap = num / den
	}
	if peak > 0 {
		// max_f|E(f)|: the largest bin kp, refined by the vertex of the
		// parabola through |E| at it and its two neighbours, where the
		// spectrum is evaluated directly (dtft) in the same pass as at the
		// mode.
		best := cmplxAbs(s.spec[kp])
		if wv, ok := s.peakVertex(dw, kp); ok {
			atMode, atVertex := dtft2(f.VPerM, f.StepS, w0, wv)
			r.RelAmplitudeAtMode = cmplxAbs(atMode) / math.Max(best, cmplxAbs(atVertex))
		} else {
			r.RelAmplitudeAtMode = cmplxAbs(dtft(f.VPerM, f.StepS, w0)) / best
		}
	}
}

// peakVertex returns the frequency of the vertex of the parabola through
// |E| at the largest bin kp and its two neighbours, and false when there is
// none (kp at an end of the spectrum, or |E| not concave there).
func (s *Solver) peakVertex(dw float64, kp int) (float64, bool) {
	if kp == 0 || kp == len(s.spec)-1 {
		return 0, false
	}
	a, b, c := cmplxAbs(s.spec[kp-1]), cmplxAbs(s.spec[kp]), cmplxAbs(s.spec[kp+1])
	den := a - 2*b + c
	if den >= 0 {
		return 0, false
	}
	delta := 0.5 * (a - c) / den
	return (float64(kp) + delta) * dw, true
}

// finish derives the outputs common to both methods and the cautions.
func (s *Solver) finish(m Mode, f Field, st endState, r *Result) {
	w0 := m.OmegaRadPerS()
	g := m.GammaRadPerS()
	q, p := st.qEnd, st.pEnd
	anh := m.A3PerMSqrtKgS2*q*q*q/3 + m.A4PerM2KgS2*q*q*q*q/4
	if g < 2*w0 {
		wd := math.Sqrt(w0*w0 - g*g/4)
		v := (p + g*q/2) / wd
		r.ModeEnergyJ = 0.5*w0*w0*(q*q+v*v) + anh
	} else {
		r.ModeEnergyJ = 0.5*p*p + 0.5*w0*w0*q*q + anh
	}
	r.Quanta = r.ModeEnergyJ / m.QuantumJ()
	r.AbsorbedJPerCell = st.absorbed
	r.AbsorbedJPerM3 = st.absorbed / m.CellVolumeM3
	if m.EffectiveMassKg > 0 {
		r.DisplacementM = r.MaxAbsQMSqrtKg / math.Sqrt(m.EffectiveMassKg)
		if m.BondLengthM > 0 {
			r.LindemannRatio = r.DisplacementM / m.BondLengthM
		}
	}
	r.AnharmonicShiftHz = m.AnharmonicShiftHz(r.MaxAbsQMSqrtKg)

	nyq := f.NyquistHz()
	if m.FreqHz > UndersampledFraction*nyq {
		r.Cautions = append(r.Cautions, caution.New(caution.Undersampled,
			"The mode lies above 0.4 of the trace's Nyquist frequency; the field near the mode and the response are poorly sampled.",
			caution.V("mode_frequency_thz", m.FreqHz/units.THz),
			caution.V("nyquist_frequency_thz", nyq/units.THz)))
	}
	switch {
	case r.LindemannRatio > LindemannDamageRatio:
		r.Cautions = append(r.Cautions, caution.New(caution.LindemannDamage,
			"The peak ion displacement exceeds 0.1 of the bond length; by the Lindemann rule of thumb ~0.1–0.15 melts the lattice.",
			caution.V("lindemann_ratio", r.LindemannRatio),
			caution.V("displacement_pm", r.DisplacementM/units.Pm),
			caution.V("bond_length_angstrom", m.BondLengthM/units.Angstrom)))
	case r.LindemannRatio > LindemannWarnRatio:
		r.Cautions = append(r.Cautions, caution.New(caution.LindemannWarning,
			"The peak ion displacement exceeds 0.05 of the bond length, half-way to the Lindemann melting rule of thumb.",
			caution.V("lindemann_ratio", r.LindemannRatio),
			caution.V("displacement_pm", r.DisplacementM/units.Pm),
			caution.V("bond_length_angstrom", m.BondLengthM/units.Angstrom)))
	}
	shift := math.Abs(r.AnharmonicShiftHz)
	if r.Quanta > NonlinearQuanta || (shift > m.LinewidthHz && shift > 0) {
		r.Cautions = append(r.Cautions, caution.New(caution.NonlinearRegime,
			"The mode is driven into the nonlinear regime: more than ~0.1 quanta per cell, or an anharmonic frequency shift larger than the linewidth.",
			caution.V("quanta_per_cell", r.Quanta),
			caution.V("anharmonic_shift_thz", r.AnharmonicShiftHz/units.THz),
			caution.V("linewidth_thz", m.LinewidthHz/units.THz)))
	}
	if r.RelAmplitudeAtMode < OutsideBandLevel {
		r.Cautions = append(r.Cautions, caution.New(caution.ModeOutsideBand,
			"The pulse carries little spectral amplitude at the mode (below −20 dB of its peak); the drive is weak and off-resonant.",
			caution.V("relative_amplitude_at_mode", r.RelAmplitudeAtMode),
			caution.V("threshold", OutsideBandLevel)))
	}
}

// checkFinite refuses a result that overflowed anywhere.
func (r *Result) checkFinite() error {
	scalars := [...]float64{r.MaxAbsQMSqrtKg, r.MaxAbsQTimeS, r.DepthAvgMaxAbsQMSqrtKg,
		r.DisplacementM, r.LindemannRatio, r.PulseEndS, r.ModeEnergyJ, r.Quanta,
		r.AbsorbedJPerCell, r.AbsorbedJPerM3, r.Overlap, r.RelAmplitudeAtMode, r.AnharmonicShiftHz}
	for _, v := range scalars {
		if !finite(v) {
			return fmt.Errorf("%w: a result is not finite (float64 overflow)", ErrDiverged)
		}
	}
	for _, xs := range [][]float64{r.QMSqrtKg, r.DepthAvgQMSqrtKg} {
		for _, v := range xs {
			if !finite(v) {
				return fmt.Errorf("%w: Q(t) is not finite (float64 overflow)", ErrDiverged)
			}
		}
	}
	for _, c := range r.Cautions {
		for _, v := range c.Values {
			if !finite(v.Number) {
				return fmt.Errorf("%w: caution value %s is not finite", ErrDiverged, v.Name)
			}
		}
	}
	return nil
}

// depthPadding is the number of samples by which the probe depth delays the
// field: 40 decay lengths of the depth kernel, 40·|ñ|max·d/c, with |ñ|max
// sampled at 64 frequencies up to Nyquist. It also checks that Index is
// passive (Re ñ >= 0, Im ñ >= 0) and finite there.
func depthPadding(d *Depth, f Field) (float64, error) {
	nyq := f.NyquistHz()
	nmax := 1.0
	for j := 1; j <= 64; j++ {
		fr := nyq * float64(j) / 64
		idx := d.Index(fr)
		if err := checkIndex(idx, fr); err != nil {
			return 0, err
		}
		if a := cmplxAbs(idx); a > nmax {
			nmax = a
		}
	}
	p := math.Ceil(40 * nmax * d.ProbeDepthM / (units.SpeedOfLight * f.StepS))
	if !finite(p) {
		return 0, inputErr("Options.Depth.ProbeDepthM", "the depth delay is not representable")
	}
	return p, nil
}

func checkIndex(idx complex128, freqHz float64) error {
	if !finite(real(idx)) || !finite(imag(idx)) || real(idx) < 0 || imag(idx) < 0 {
		return inputErr("Options.Depth.Index", "ñ(%g Hz) = %v: must be finite with n >= 0 and κ >= 0 (passive, e^{-iωt})", freqHz, idx)
	}
	return nil
}

// dtft is ∫E(t)e^{iωt}dt over the samples, dt·Σ E_n e^{iω n dt}, relative
// to the first sample's time (the phase does not matter to its modulus). The
// phase advances by rotation, re-anchored every 64 samples.
func dtft(x []float64, dt, omega float64) complex128 {
	ci, cr := math.Sincos(omega * dt)
	var accR, accI float64
	for b := 0; b < len(x); b += 64 {
		si, sr := math.Sincos(omega * dt * float64(b))
		for j, v := range x[b:min(b+64, len(x))] {
			if j > 0 {
				sr, si = sr*cr-si*ci, sr*ci+si*cr
			}
			accR += v * sr
			accI += v * si
		}
	}
	return complex(accR*dt, accI*dt)
}

// dtft2 is dtft at two frequencies in one pass, each computed exactly as
// dtft computes it: the two rotations do not wait on each other, so the
// pass costs little more than one.
func dtft2(x []float64, dt, w1, w2 float64) (complex128, complex128) {
	ci1, cr1 := math.Sincos(w1 * dt)
	ci2, cr2 := math.Sincos(w2 * dt)
	var r1, i1, r2, i2 float64
	for b := 0; b < len(x); b += 64 {
		si1, sr1 := math.Sincos(w1 * dt * float64(b))
		si2, sr2 := math.Sincos(w2 * dt * float64(b))
		for j, v := range x[b:min(b+64, len(x))] {
			if j > 0 {
				sr1, si1 = sr1*cr1-si1*ci1, sr1*ci1+si1*cr1
				sr2, si2 = sr2*cr2-si2*ci2, sr2*ci2+si2*cr2
			}
			r1 += v * sr1
			i1 += v * si1
			r2 += v * sr2
			i2 += v * si2
		}
	}
	return complex(r1*dt, i1*dt), complex(r2*dt, i2*dt)
}

func cmplxAbs(z complex128) float64 { return math.Hypot(real(z), imag(z)) }

func resize(x []float64, n int) []float64 {
	if cap(x) < n {
		return make([]float64, n)
	}
	return x[:n]
}

func resizeC(x []complex128, n int) []complex128 {
	if cap(x) < n {
		return make([]complex128, n)
	}
	return x[:n]
}

// niceSize is the smallest even 2^a·3^b·5^c (a >= 1) >= n: lengths the FFT
// handles fast.
func niceSize(n int) int {
	best := math.MaxInt
	for p5 := 1; ; p5 *= 5 {
		for p35 := p5; ; p35 *= 3 {
			v := 2 * p35
			for v < n {
				v *= 2
			}
			if v < best {
				best = v
			}
			if p35 > n {
				break
			}
		}
		if p5 > n {
			break
		}
	}
	return best
}

// niceSizeBelow is the largest even 2^a·3^b·5^c <= n (n >= 2).
func niceSizeBelow(n int) int {
	best := 2
	for p5 := 1; 2*p5 <= n; p5 *= 5 {
		for p35 := p5; 2*p35 <= n; p35 *= 3 {
			v := 2 * p35
			for 2*v <= n {
				v *= 2
			}
			if v > best {
				best = v
			}
		}
	}
	return best
}
