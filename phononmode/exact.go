package phononmode

import (
	"math"

	"thzdrive/pulse"
	"thzdrive/units"
)

// exact is the frequency-domain solution of the linear mode:
//
//	Q(ω) = Z*·cosθ·E(ω) / (W² − ω² − iγω)
//
// on the padded one-sided spectrum s.spec, transformed back with tr. The
// padding (T >= 69/γ past the trace) lets the ring-down decay to round-off
// before the periodic transform wraps it onto the start, so the result is
// the causal response to the band-limited field with the mode at rest
// before the trace (Poisson summation: the periodic sum of the aperiodic
// response, whose wrapped terms are below e^{−γT/2}).
//
// The absorbed energy per cell is the frequency-domain integral
//
//	(1/π)·∫_0^∞ ω·ε0·ε″(ω)·|E(ω)|² dω · V_cell = (1/π)·∫_0^∞ Z*²cos²θ·γω²·|E(ω)|²/|D(ω)|² dω,
//
// with D = W² − ω² − iγω, as a trapezoid sum over the bins; by Parseval it
// equals the work ∫Z*·cosθ·E·Q' dt of the same band-limited solution.
func (s *Solver) exact(m Mode, f Field, depth *Depth, tr *pulse.Transform, iEnd int, r *Result) (endState, error) {
	n := len(f.VPerM)
	nPad := tr.Len()
	dt := f.StepS
	dw := 2 * math.Pi / (float64(nPad) * dt)
	w0 := m.OmegaRadPerS()
	g := m.GammaRadPerS()
	zc := m.ZStarCPerSqrtKg * math.Cos(m.PolarAngleRad)
	last := len(s.spec) - 1

	s.qspec = resizeC(s.qspec, len(s.spec))
	var absorbed float64
	qspec := s.qspec[:len(s.spec)]
	for k, e := range s.spec {
		w := float64(k) * dw
		dr, di := w0*w0-w*w, -g*w // D
		if dr == 0 && di == 0 {
			return endState{}, inputErr("Mode.LinewidthHz", "an undamped mode falls on a frequency bin; give a linewidth or use TimeDomain")
		}
		// Q = Z*·E/D = Z*·E·conj(D)/|D|², in real arithmetic (|D|² >= γ²ω²
		// is far from underflow for any mode Validate accepts).
		dd := dr*dr + di*di
		sc := zc / dd
		qspec[k] = complex(sc*(real(e)*dr+imag(e)*di), sc*(imag(e)*dr-real(e)*di))
		c := 2.0
		if k == 0 || (k == last && nPad%2 == 0) {
			c = 1
		}
		p := real(e)*real(e) + imag(e)*imag(e)
		absorbed += c * zc * zc * g * w * w * p / dd
	}
	absorbed /= float64(nPad) * dt // 2Δf·Σ (the factor 2 is in c)

	s.buf = resize(s.buf, nPad)
	tr.Inverse(s.buf, s.qspec, dt)
	copy(r.QMSqrtKg, s.buf[:n])

	// max|Q| on the samples, then refined on the band-limited Q(t) by
	// Newton's method on Q'(t) = 0 within one sample of the sampled peak.
	im := 0
	for i, v := range r.QMSqrtKg {
		if math.Abs(v) > math.Abs(r.QMSqrtKg[im]) {
			im = i
		}
	}
	tau, qmax := refinePeak(s.qspec, nPad, dt, im, n)
	r.MaxAbsQMSqrtKg = math.Abs(qmax)
	r.MaxAbsQTimeS = f.StartS + tau

	qEnd, pEnd, _ := evalAt(s.qspec, nPad, dt, float64(iEnd)*dt)

	if depth != nil {
		d := depth.ProbeDepthM
		for k := 1; k < len(s.qspec); k++ {
			fr := float64(k) / (float64(nPad) * dt)
			idx := depth.Index(fr)
			if err := checkIndex(idx, fr); err != nil {
				return endState{}, err
			}
			s.qspec[k] *= depthKernel(float64(k)*dw, idx, d)
		}
		tr.Inverse(s.buf, s.qspec, dt)
		copy(r.DepthAvgQMSqrtKg, s.buf[:n])
		r.DepthAvgMaxAbsQMSqrtKg = maxAbs(r.DepthAvgQMSqrtKg)
	}
	return endState{qEnd: qEnd, pEnd: pEnd, absorbed: absorbed}, nil
}

// evalAt evaluates, at time tau after the first sample, the band-limited
// function whose one-sided spectrum (transform length nPad, step dt, the
// convention of pulse.Transform) is spec, with its first and second
// derivatives: x(τ) = (1/(N·dt))·Σ_k c_k·Re(X_k·e^{−iω_kτ}), c_k = 2 except
// at DC and Nyquist. The phase advances by rotation, re-anchored every 64
// bins; the DC and Nyquist bins are summed apart, so the loop over the
// others has no branch.
func evalAt(spec []complex128, nPad int, dt, tau float64) (v, d1, d2 float64) {
	dw := 2 * math.Pi / (float64(nPad) * dt)
	ci, cr := math.Sincos(-dw * tau)
	end := len(spec)
	if nPad%2 == 0 {
		end-- // the Nyquist bin, below
	}
	// Bins 1 … end-1, c_k = 2 (applied at the end); the sums are of
	// Re(X·e^{−iωτ}), ω·Re(−iX·e^{−iωτ}) = ω·Im(X·e^{−iωτ}) and
	// ω²·Re(X·e^{−iωτ}).
	var sv, s1, s2 float64
	for b := 0; b < end; b += 64 {
		blk := spec[b:min(b+64, end)]
		si, sr := math.Sincos(-dw * tau * float64(b))
		first := 0
		if b == 0 {
			first = 1 // DC apart
			sr, si = sr*cr-si*ci, sr*ci+si*cr
		}
		for k := first; k < len(blk); k++ {
			x := blk[k]
			w := float64(b+k) * dw
			re := real(x)*sr - imag(x)*si
			im := real(x)*si + imag(x)*sr
			sv += re
			s1 += w * im
			s2 += w * w * re
			sr, si = sr*cr-si*ci, sr*ci+si*cr
		}
	}
	v, d1, d2 = real(spec[0])+2*sv, 2*s1, -2*s2
	if nPad%2 == 0 {
		// The Nyquist term is the real cosine Re(X)·cos(ω_Nτ).
		k := len(spec) - 1
		w := float64(k) * dw
		si, sr := math.Sincos(-dw * tau * float64(k))
		x := real(spec[k])
		v += x * sr
		d1 += w * x * si
		d2 -= w * w * x * sr
	}
	s := 1 / (float64(nPad) * dt)
	return v * s, d1 * s, d2 * s
}

// refinePeak maximises |x(τ)| of the band-limited function near sample im
// (of n) by Newton's method on x'(τ) = 0, kept within one sample, and
// returns the time (after the first sample) and the value there.
//
// Each evaluation of x is a sum over every bin, so none is repeated: the
// first serves both the sampled value x0 and the first step, and the value
// at the converged time t = t_last + h (|h| <= 1e-9·dt, h = −x'/x″ at
// t_last) is x(t_last) + x'h + x″h²/2, whose neglected term x‴h³/6 is of
// relative size (ωh)³ < 1e-25 for any frequency below Nyquist.
func refinePeak(spec []complex128, nPad int, dt float64, im, n int) (tau, x float64) {
	lo := float64(max(im-1, 0)) * dt
	hi := float64(min(im+1, n-1)) * dt
	t0 := float64(im) * dt
	x0, d1, d2 := evalAt(spec, nPad, dt, t0)
	t, v := t0, x0
	converged := false
	for it := range 20 {
		if it > 0 {
			v, d1, d2 = evalAt(spec, nPad, dt, t)
		}
		if d2 == 0 {
			break
		}
		step := -d1 / d2
		tn := math.Min(math.Max(t+step, lo), hi)
		if h := tn - t; math.Abs(h) <= 1e-9*dt {
			v += d1*h + d2*h*h/2
			t, converged = tn, true
			break
		}
		t = tn
	}
	if !converged {
		v, _, _ = evalAt(spec, nPad, dt, t)
	}
	if math.Abs(v) < math.Abs(x0) {
		return t0, x0
	}
	return t, v
}

func maxAbs(x []float64) float64 {
	m := 0.0
	for _, v := range x {
		m = math.Max(m, math.Abs(v))
	}
	return m
}

// depthKernel is the average of the field's depth dependence e^{iωñz/c}
// (a wave entering at z = 0 in the e^{−iωt} convention) over the probe's
// weight e^{−z/d}/d (derived):
//
//	∫_0^∞ e^{iωñz/c}·e^{−z/d} dz/d = 1/(1 − iωñd/c).
//
// For a passive ñ (κ >= 0) its modulus is at most 1.
func depthKernel(omega float64, idx complex128, depthM float64) complex128 {
	return 1 / (1 - complex(0, omega*depthM/units.SpeedOfLight)*idx)
}
