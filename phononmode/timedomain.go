package phononmode

import (
	"fmt"
	"math"

	"thzdrive/pulse"
	"thzdrive/units"
)

// oscillator is the equation of motion in the form the integrator steps:
// Q″ = F(t) − γQ' − W²Q − a3Q² − a4Q³, with the work ∫F·Q' dt carried as a
// third component.
type oscillator struct {
	w2, gamma, a3, a4 float64
}

func newOscillator(m Mode) oscillator {
	w := m.OmegaRadPerS()
	return oscillator{w2: w * w, gamma: m.GammaRadPerS(), a3: m.A3PerMSqrtKgS2, a4: m.A4PerM2KgS2}
}

func (o *oscillator) accel(q, p, f float64) float64 {
	return f - o.gamma*p - q*(o.w2+q*(o.a3+q*o.a4))
}

// step advances (q, p, work) by h with the classical fourth-order
// Runge–Kutta method (Kutta 1901; e.g. Hairer, Nørsett & Wanner, Solving
// Ordinary Differential Equations I, §II.1), given the force at the start,
// middle and end of the step.
func (o *oscillator) step(q, p, work, h, f0, fm, f1 float64) (float64, float64, float64) {
	k1q, k1p, k1w := p, o.accel(q, p, f0), f0*p
	q2, p2 := q+0.5*h*k1q, p+0.5*h*k1p
	k2q, k2p, k2w := p2, o.accel(q2, p2, fm), fm*p2
	q3, p3 := q+0.5*h*k2q, p+0.5*h*k2p
	k3q, k3p, k3w := p3, o.accel(q3, p3, fm), fm*p3
	q4, p4 := q+h*k3q, p+h*k3p
	k4q, k4p, k4w := p4, o.accel(q4, p4, f1), f1*p4
	return q + h/6*(k1q+2*k2q+2*k3q+k4q),
		p + h/6*(k1p+2*k2p+2*k3p+k4p),
		work + h/6*(k1w+2*k2w+2*k3w+k4w)
}

// subSteps chooses the number of RK4 steps per field sample.
//
// RK4 applied to an oscillation of angular frequency ω with step h errs in
// phase by (ωh)⁵/120 per step (its amplification factor is
// e^{iωh}·(1 + O((ωh)⁵)); Hairer, Nørsett & Wanner §II.1), so over Φ
// radians the error relative to the amplitude is Φ·(ωh)⁴/120. Errors
// committed more than ~1/γ ago have decayed, so Φ = ω·min(T, 1/γ) (at least
// one period), and h = (120·tol/Φ)^{1/4}/ω meets the target tol. The step
// is further kept below a quarter of the sample step (the E² drive reaches
// twice the field's band) and below 1/(40 f).
func subSteps(omega, gamma, windowS, stepS, tol float64) float64 {
	t := windowS
	if gamma > 0 {
		t = math.Min(t, 1/gamma)
	}
	phi := math.Max(omega*t, 2*math.Pi)
	h := math.Pow(120*tol/phi, 0.25) / omega
	h = math.Min(h, stepS/4)
	h = math.Min(h, 2*math.Pi/(40*omega))
	return math.Ceil(stepS / h)
}

// trajectory is what one integration over the trace reports.
type trajectory struct {
	maxAbs, tMax float64 // peak |Q| (Hermite-refined) and its time after the start
	qEnd, pEnd   float64 // state at the pulse-end sample
	work         float64
}

// integrate steps the mode from rest at the first sample through the force
// given on the half-step grid (force[j] at j·h/2 from the start, h = dt/sub)
// and writes Q at every field sample into out.
func (o *oscillator) integrate(force []float64, sub, iEnd int, dt float64, out []float64) (trajectory, error) {
	h := dt / float64(sub)
	var tj trajectory
	var q, p, work float64
	out[0] = 0
	for i := 1; i < len(out); i++ {
		base := 2 * (i - 1) * sub
		for j := 0; j < sub; j++ {
			k := base + 2*j
			qn, pn, wn := o.step(q, p, work, h, force[k], force[k+1], force[k+2])
			if a := math.Abs(qn); a > tj.maxAbs {
				tj.maxAbs = a
				tj.tMax = float64((i-1)*sub+j+1) * h
			}
			if (p > 0) != (pn > 0) {
				// Q' changes sign inside the step: the extremum of the
				// cubic Hermite interpolant of (q, p) there.
				if a, th := hermiteExtremum(q, qn, h*p, h*pn); a > tj.maxAbs {
					tj.maxAbs = a
					tj.tMax = (float64((i-1)*sub+j) + th) * h
				}
			}
			q, p, work = qn, pn, wn
		}
		if !finite(q) || !finite(p) || !finite(work) {
			return tj, fmt.Errorf("%w: Q left every finite range at sample %d (the mode escaped its anharmonic well or overflowed)", ErrDiverged, i)
		}
		out[i] = q
		if i == iEnd {
			tj.qEnd, tj.pEnd = q, p
		}
	}
	tj.work = work
	return tj, nil
}

// hermiteExtremum returns |Q| and the fractional position θ in [0, 1] of the
// extremum of the cubic Hermite interpolant with end values q0, q1 and end
// slopes (times h) m0, m1, where its derivative vanishes.
func hermiteExtremum(q0, q1, m0, m1 float64) (float64, float64) {
	// dH/dθ = aθ² + bθ + c.
	a := 6*q0 + 3*m0 - 6*q1 + 3*m1
	b := -6*q0 - 4*m0 + 6*q1 - 2*m1
	c := m0
	best, bth := 0.0, 0.0
	try := func(th float64) {
		if th < 0 || th > 1 || !finite(th) {
			return
		}
		t2, t3 := th*th, th*th*th
		v := (2*t3-3*t2+1)*q0 + (t3-2*t2+th)*m0 + (-2*t3+3*t2)*q1 + (t3-t2)*m1
		if math.Abs(v) > best {
			best, bth = math.Abs(v), th
		}
	}
	if a == 0 {
		if b != 0 {
			try(-c / b)
		}
		return best, bth
	}
	disc := b*b - 4*a*c
	if disc < 0 {
		return best, bth
	}
	sd := math.Sqrt(disc)
	// The numerically stable pair of roots.
	qq := -0.5 * (b + math.Copysign(sd, b))
	try(qq / a)
	if qq != 0 {
		try(c / qq)
	}
	return best, bth
}

// timeDomain integrates the full equation of motion
//
//	Q″ + γQ' + W²Q + a3Q² + a4Q³ = Z*·cosθ·E(t) + ½·ε0·V_cell·(∂ε/∂Q)·E(t)²
//
// from rest at the first sample with fixed-step RK4. The field between
// samples is the band-limited interpolant of the trace, evaluated on the
// half-step grid from its spectrum (fillForce), so the integrator sees
// exactly the field the exact solution sees and the two differ only by the
// integrator's truncation error (subSteps). After a first pass the step is
// checked against the stiffest curvature the anharmonic potential reached,
// W_eff² = W² + 2|a3|·max|Q| + 3|a4|·max|Q|², and the integration repeated
// once with a finer step if that needs one.
func (s *Solver) timeDomain(m Mode, f Field, opt Options, maxN, iEnd int, r *Result) (endState, error) {
	n := len(f.VPerM)
	dt := f.StepS
	tol := opt.TimeDomainTol
	if tol == 0 {
		tol = DefaultTimeDomainTol
	}
	nU := niceSize(n + max(32, n/16))
	if nU > maxN {
		return endState{}, fmt.Errorf("%w: %d samples need a transform of %d, limit %d", ErrTooLarge, n, nU, maxN)
	}
	tr := s.transform(&s.trU, nU)
	s.buf = resize(s.buf, nU)
	copy(s.buf, f.VPerM)
	clear(s.buf[n:])
	// The coarse spectrum lives in qspec: s.spec belongs to the caller.
	s.qspec = resizeC(s.qspec, tr.Bins())
	tr.Forward(s.qspec, s.buf, dt)

	o := newOscillator(m)
	omega := m.OmegaRadPerS()
	window := float64(n-1) * dt
	subF := subSteps(omega, o.gamma, window, dt, tol)
	var tj trajectory
	var sub int
	for pass := 0; pass < 2; pass++ {
		var err error
		sub, err = fineSize(subF, nU, maxN)
		if err != nil {
			return endState{}, err
		}
		if err := s.fillForce(m, tr, nU, sub, dt, nil, 0); err != nil {
			return endState{}, err
		}
		tj, err = o.integrate(s.fine, sub, iEnd, dt, r.QMSqrtKg)
		if err != nil {
			return endState{}, err
		}
		a := tj.maxAbs
		wEff := math.Sqrt(o.w2 + 2*math.Abs(o.a3)*a + 3*math.Abs(o.a4)*a*a)
		need := subSteps(wEff, o.gamma, window, dt, tol)
		if !(need > float64(sub)) {
			break
		}
		subF = need
	}
	r.SubSteps = sub
	r.MaxAbsQMSqrtKg = tj.maxAbs
	r.MaxAbsQTimeS = f.StartS + tj.tMax

	if opt.Depth != nil {
		if err := s.depthAverage(m, f, opt.Depth, o, maxN, sub, iEnd, r); err != nil {
			return endState{}, err
		}
	}
	return endState{qEnd: tj.qEnd, pEnd: tj.pEnd, absorbed: tj.work}, nil
}

// fineSize turns the wanted number of sub-steps into an integer, within the
// limit on the half-step grid's length nU·2·sub.
func fineSize(subF float64, nU, maxN int) (int, error) {
	if !(subF*2*float64(nU) <= float64(maxN)) {
		return 0, fmt.Errorf("%w: %.3g RK4 sub-steps per sample over %d padded samples exceed the limit %d", ErrTooLarge, subF, nU, maxN)
	}
	return int(subF), nil
}

// fillForce writes the force Z*·cosθ·E + ½·ε0·V·(∂ε/∂Q)·E² on the half-step
// grid into s.fine, from the coarse spectrum in s.qspec, optionally
// propagated to depth x·d by the factor e^{ζ_k·x}, ζ_k = iω_k·ñ_k·d/c
// (zeta nil: the surface).
//
// The band-limited field at t_n + δ, δ = j·dt/M (M = 2·sub), is the inverse
// transform of the coarse spectrum times e^{−iω_kδ}: one transform of the
// trace's own length per phase j, interleaved. This is the same function as
// zero-padding the spectrum to M times the length, at a fraction of the
// cost (transforms of the short length stay in cache). The Nyquist bin
// carries the real cosine Re(X_N)·cos(ω_N·t), so at t_n + δ it contributes
// Re(X_N)·cos(ω_N·δ)·(−1)^n.
func (s *Solver) fillForce(m Mode, tr *pulse.Transform, nU, sub int, dt float64, zeta []complex128, x float64) error {
	mf := 2 * sub
	nb := tr.Bins()
	s.fineSpec = resizeC(s.fineSpec, 2*nb)
	base, phased := s.fineSpec[:nb], s.fineSpec[nb:]
	for k := 0; k < nb; k++ {
		c := s.qspec[k]
		if zeta != nil && k > 0 {
			c *= cmplxExp(zeta[k] * complex(x, 0))
		}
		base[k] = c
	}
	base[nb-1] = complex(real(base[nb-1]), 0)
	s.fine = resize(s.fine, nU*mf)
	s.tmpPhase = resize(s.tmpPhase, nU)
	dw := 2 * math.Pi / (float64(nU) * dt)
	zc := m.ZStarCPerSqrtKg * math.Cos(m.PolarAngleRad)
	raman := 0.5 * units.VacuumPermittiv * m.CellVolumeM3 * m.DEpsDQPerMSqrtKg
	for j := 0; j < mf; j++ {
		delta := float64(j) * dt / float64(mf)
		ci, cr := math.Sincos(-dw * delta)
		var sr, si float64
		for k, c := range base {
			if k%64 == 0 {
				si, sr = math.Sincos(-dw * delta * float64(k))
			} else {
				sr, si = sr*cr-si*ci, sr*ci+si*cr
			}
			phased[k] = c * complex(sr, si)
		}
		phased[nb-1] = complex(real(base[nb-1])*math.Cos(dw*float64(nb-1)*delta), 0)
		tr.Inverse(s.tmpPhase, phased, dt)
		for i, e := range s.tmpPhase {
			s.fine[i*mf+j] = zc*e + raman*e*e
		}
	}
	return nil
}

func cmplxExp(z complex128) complex128 {
	s, c := math.Sincos(imag(z))
	e := math.Exp(real(z))
	return complex(e*c, e*s)
}
