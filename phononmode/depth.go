package phononmode

import (
	"fmt"
	"math"
	"sync"

	"gonum.org/v1/gonum/mat"

	"thzdrive/caution"
	"thzdrive/units"
)

// depthTol is the largest relative error, over the field's spectrum, that
// the Gauss–Laguerre rule of the nonlinear depth average may make on the
// linear depth kernel 1/(1 − iωñd/c) (see depthAverage).
const depthTol = 1e-7

// laguerreOrders are the rules tried, smallest first.
var laguerreOrders = [...]int{4, 8, 16, 32, 48}

var (
	laguerreOnce  sync.Once
	laguerreRules [len(laguerreOrders)]laguerreRule
)

// laguerreRule holds the nodes x_j and weights w_j of Gauss–Laguerre
// quadrature, Σ w_j·g(x_j) ≈ ∫_0^∞ e^{−x}·g(x) dx, exact for polynomials of
// degree < 2n.
type laguerreRule struct {
	x, w []float64
}

// gaussLaguerre computes the n-point rule by the Golub–Welsch algorithm
// (Golub & Welsch, Math. Comp. 23, 221 (1969)): the nodes are the
// eigenvalues of the symmetric tridiagonal Jacobi matrix of the Laguerre
// recurrence, diagonal 2i+1 and off-diagonal i (i = 1 … n−1), and the
// weights are the squared first components of the normalised eigenvectors
// (times ∫e^{−x}dx = 1). Each node is then polished by Newton's method on
// L_n(x) and its weight recomputed as x_j/((n+1)²·L_{n+1}(x_j)²)
// (Abramowitz & Stegun 25.4.45), which keeps the relative accuracy of the
// tiny weights of the far nodes.
func gaussLaguerre(n int) (laguerreRule, error) {
	j := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		j.SetSym(i, i, float64(2*i+1))
		if i > 0 {
			j.SetSym(i, i-1, float64(i))
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(j, false) {
		return laguerreRule{}, fmt.Errorf("phononmode: Golub–Welsch eigen-decomposition failed for n = %d", n)
	}
	x := eig.Values(nil)
	w := make([]float64, n)
	for i, xi := range x {
		for range 10 {
			ln, lnm1 := laguerre(n, xi)
			// L_n'(x) = n·(L_n − L_{n−1})/x.
			d := float64(n) * (ln - lnm1) / xi
			dx := ln / d
			xi -= dx
			if math.Abs(dx) <= 1e-16*xi {
				break
			}
		}
		x[i] = xi
		lnp1, _ := laguerre(n+1, xi)
		w[i] = xi / (float64((n+1)*(n+1)) * lnp1 * lnp1)
	}
	return laguerreRule{x: x, w: w}, nil
}

// laguerre returns L_n(x) and L_{n−1}(x) by the three-term recurrence
// (k+1)·L_{k+1} = (2k+1−x)·L_k − k·L_{k−1}.
func laguerre(n int, x float64) (float64, float64) {
	l0, l1 := 1.0, 1-x
	if n == 0 {
		return l0, 0
	}
	for k := 1; k < n; k++ {
		l0, l1 = l1, ((float64(2*k+1)-x)*l1-float64(k)*l0)/float64(k+1)
	}
	return l1, l0
}

func laguerreRuleFor(i int) (laguerreRule, error) {
	var err error
	laguerreOnce.Do(func() {
		for k, n := range laguerreOrders {
			var r laguerreRule
			r, err = gaussLaguerre(n)
			if err != nil {
				return
			}
			laguerreRules[k] = r
		}
	})
	if err != nil {
		return laguerreRule{}, err
	}
	return laguerreRules[i], nil
}

// depthAverage fills the probe-depth average for the time-domain solution.
//
// The field at depth z is E(z, ω) = E(0, ω)·e^{iωñz/c}; the mode at each
// depth responds to its local field, so the average over the weight
// e^{−z/d}/d is ∫_0^∞ e^{−x}·Q(x·d, t) dx with x = z/d, which Gauss–Laguerre
// quadrature evaluates from the solutions at the nodes x_j. The rule is
// chosen as the smallest that reproduces the linear depth kernel
// Σ_j w_j·e^{ζx_j} = 1/(1 − ζ), ζ = iωñd/c, to depthTol relative to the
// field's spectral amplitude; when even 48 nodes do not (a probe depth of
// many terahertz wavelengths) the average is refused with
// ErrDepthQuadrature. For a nonlinear mode this check is necessary, not
// sufficient: it bounds the quadrature error of the field, on which Q
// depends smoothly.
//
// A field that crossed a dispersive sample rings for as long as the
// sample's sharpest resonance in the band (here at least this mode, 1/γ),
// and arrives late by up to 40·|ñ|·d/c; the propagated fields are therefore
// built on a transform padded by both, as in the exact solution, and the
// tail of each is checked: if it has not decayed to 1e-9 of its peak at the
// end of the padding, a MODE_NOT_DECAYED caution says that it wraps.
func (s *Solver) depthAverage(m Mode, f Field, depth *Depth, o oscillator, maxN, sub, iEnd int, r *Result) error {
	n := len(f.VPerM)
	dt := f.StepS
	p, err := depthPadding(depth, f)
	if err != nil {
		return err
	}
	need := float64(n) + p + float64(max(32, n/16))
	if g := m.GammaRadPerS(); g > 0 {
		need += math.Ceil(2 * math.Log(1/wrapResidual) / (g * dt))
	} else {
		need = math.Inf(1)
	}
	limit := maxN / (2 * sub)
	nD := niceSizeBelow(limit)
	if need <= float64(limit) {
		nD = min(nD, niceSize(int(need)))
	}
	if nD < n+int(p)+2 {
		return fmt.Errorf("%w: the depth average needs a transform beyond %d samples", ErrTooLarge, limit)
	}
	tr := s.transform(&s.trD, nD)
	s.buf = resize(s.buf, nD)
	copy(s.buf, f.VPerM)
	clear(s.buf[n:])
	nb := tr.Bins()
	s.qspec = resizeC(s.qspec, nb)
	tr.Forward(s.qspec, s.buf, dt)

	s.zeta = resizeC(s.zeta, nb)
	dw := 2 * math.Pi / (float64(nD) * dt)
	s.zeta[0] = 0
	for k := 1; k < nb; k++ {
		fr := float64(k) / (float64(nD) * dt)
		idx := depth.Index(fr)
		if err := checkIndex(idx, fr); err != nil {
			return err
		}
		s.zeta[k] = complex(0, float64(k)*dw*depth.ProbeDepthM/units.SpeedOfLight) * idx
	}
	rule, err := s.chooseLaguerre(m, nb, dw)
	if err != nil {
		return err
	}
	avg := r.DepthAvgQMSqrtKg
	clear(avg)
	s.tmpQ = resize(s.tmpQ, len(avg))
	worstTail := 0.0
	for j, x := range rule.x {
		if err := s.fillForce(m, tr, nD, sub, dt, s.zeta, x); err != nil {
			return err
		}
		// Phase 0 of the grid is the propagated force at the samples: its
		// last quarter of padding shows whether it wraps.
		var peak, tail float64
		mf := 2 * sub
		for i := 0; i < nD; i++ {
			a := math.Abs(s.fine[i*mf])
			peak = math.Max(peak, a)
			if i >= nD-(nD-n)/4 {
				tail = math.Max(tail, a)
			}
		}
		if peak > 0 && rule.w[j] > 1e-12 {
			worstTail = math.Max(worstTail, tail/peak)
		}
		if _, err := o.integrate(s.fine, sub, iEnd, dt, s.tmpQ); err != nil {
			return err
		}
		for i, q := range s.tmpQ {
			avg[i] += rule.w[j] * q
		}
	}
	if worstTail > 1e-9 {
		r.Cautions = append(r.Cautions, caution.New(caution.ModeNotDecayed,
			"The field propagated into the sample still rings at the end of the padded window; the depth average wraps part of it onto the start.",
			caution.V("residual_amplitude", worstTail)))
	}
	r.DepthAvgMaxAbsQMSqrtKg = maxAbs(avg)
	return nil
}

// chooseLaguerre returns the smallest rule whose relative error on the
// linear depth kernel is below depthTol under two weightings of the bins:
// the field's spectral amplitude |E_k| (in s.qspec), which is what the E²
// drive and a far-off-resonance mode see, and the linear response
// |E_k·χ_k|, χ = 1/(W² − ω² − iγω), which is what Q of the linear mode is
// made of. For a linear mode the second is the relative error of the
// averaged Q(ω) itself.
func (s *Solver) chooseLaguerre(m Mode, nb int, dw float64) (laguerreRule, error) {
	worst := math.Inf(1)
	for i := range laguerreOrders {
		rule, err := laguerreRuleFor(i)
		if err != nil {
			return laguerreRule{}, err
		}
		var numE, denE, numQ, denQ float64
		for k := 0; k < nb; k++ {
			a := cmplxAbs(s.qspec[k])
			if a == 0 {
				continue
			}
			aq := a * cmplxAbs(m.denomInv(float64(k)*dw))
			z := s.zeta[k]
			exact := 1 / (1 - z)
			var q complex128
			for j, x := range rule.x {
				q += complex(rule.w[j], 0) * cmplxExp(z*complex(x, 0))
			}
			e := cmplxAbs(q - exact)
			numE += a * e
			denE += a * cmplxAbs(exact)
			numQ += aq * e
			denQ += aq * cmplxAbs(exact)
		}
		errE, errQ := 0.0, 0.0
		if denE > 0 {
			errE = numE / denE
		}
		if denQ > 0 {
			errQ = numQ / denQ
		}
		worst = math.Max(errE, errQ)
		if worst <= depthTol {
			return rule, nil
		}
	}
	return laguerreRule{}, fmt.Errorf("%w: the 48-point Gauss–Laguerre rule errs by %.2g on the depth kernel; the probe depth spans too many terahertz wavelengths or absorption lengths for a nonlinear depth average (a linear mode is averaged exactly)", ErrDepthQuadrature, worst)
}
