package tdsfit

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/units"
)

// Conventions of FitDielectric.
const (
	// DefaultFitIterations bounds the Levenberg–Marquardt iterations when
	// FitOptions.MaxIterations is 0.
	DefaultFitIterations = 200
	// FitTolerance ends the iteration when an accepted step changes every
	// (scaled) parameter by less than this, relative, or lowers χ² by less
	// than this, relative.
	FitTolerance = 1e-10
	// FitPoorReducedChiSquare is the reduced χ² above which a fit with
	// given noise is cautioned caution.FitPoor: the model leaves structure
	// in the residuals as large as the noise itself (a choice: for hundreds
	// of points the statistical spread of χ²/DOF is a few per cent).
	FitPoorReducedChiSquare = 2
	// FitPoorRelativeStd is the relative one-sigma uncertainty of a
	// parameter above which it is cautioned as undetermined.
	FitPoorRelativeStd = 0.5
	// FitOutsideFraction is how far, as a fraction of its frequency, a fitted
	// oscillator may lie outside the data's frequencies before it is
	// cautioned as extrapolated. A transmission measurement always stops
	// short of a strong phonon, where the slab turns opaque, by a few
	// linewidths; 5 % leaves room for that (a choice).
	FitOutsideFraction = 0.05
)

// FitOptions says which model FitDielectric fits and where it starts.
type FitOptions struct {
	// Initial is the starting point, and its shape is the model: ε∞, one
	// Lorentz term per oscillator, and a Drude term when PlasmaHz > 0. Every
	// parameter is free. It must pass optics.Dielectric.Validate (which
	// asks for positive oscillator frequencies); start widths and strengths near
	// the data's (a peak of Im ε of height h and width w at f has Δε ≈
	// h·w/f).
	Initial optics.Dielectric
	// MaxIterations bounds the iterations; 0 selects DefaultFitIterations.
	MaxIterations int
}

// Fit is a dielectric model fitted to ε(f).
type Fit struct {
	// Model is the fitted dielectric function, ready for package optics and,
	// oscillator by oscillator, as the mode a pulse drives.
	Model optics.Dielectric
	// Std holds the one-sigma uncertainty of each parameter of Model in the
	// same place (Std.Oscillators[j].FreqHz is that of
	// Model.Oscillators[j].FreqHz, and so on). It is not a medium.
	Std optics.Dielectric
	// Names and Params list the free parameters in the order of Covariance:
	// "eps_inf", then "osc[j].freq_hz", "osc[j].width_hz", "osc[j].delta_eps"
	// for each oscillator, then "plasma_hz", "scattering_hz" with Drude.
	Names  []string
	Params []float64
	// Covariance is s²·(JᵀJ)⁻¹ in SI units (Hz², Hz, 1), J the Jacobian of the
	// weighted residuals at the optimum, s² = ChiSquare/DOF.
	Covariance [][]float64
	// ChiSquare is Σ of the squared weighted residuals of Re ε and Im ε; DOF
	// the number of residuals (twice the frequencies) minus the number of
	// parameters; ReducedChiSquare their ratio, s², near 1 when the model
	// fits to within the given noise.
	ChiSquare        float64
	DOF              int
	ReducedChiSquare float64
	Iterations       int
	Cautions         []caution.Caution
}

// FitDielectric fits the model of o.Initial,
//
//	ε(ω) = ε∞ + Σ_j Δε_j·Ω_j²/(Ω_j² - ω² - iγ_j·ω) - ω_p²/(ω² + iΓω)
//
// (optics.Dielectric), to ε(f) measured at freqHz with the one-sigma noise
// sigma of Re ε and, equally, of Im ε at each frequency (nil: unit weights),
// by nonlinear least squares: it minimises χ² = Σ_f (|Re Δε|² + |Im Δε|²)/σ²
// with Levenberg–Marquardt (Marquardt, J. Soc. Ind. Appl. Math. 11, 431
// (1963): the step solves (JᵀJ + λ·diag JᵀJ)δ = -Jᵀr, λ divided by 10 after
// a step that lowers χ² and multiplied by 10 otherwise), with the analytic
// Jacobian and the parameters scaled by their starting values. A step that
// would make a frequency non-positive, or a width, strength, ε∞ or Drude
// parameter negative, is refused like one that raises χ².
//
// Uncertainties. The covariance of the parameters is s²·(JᵀJ)⁻¹ with
// s² = χ²/DOF, the residual variance (Press et al., Numerical Recipes, 3rd
// ed., §15.5; what scipy.optimize.curve_fit returns with
// absolute_sigma=False), so the uncertainties stay honest when the given
// noise is off by a constant factor; with correct noise s² ≈ 1. They assume
// independent residuals: bins of a spectrum taken without window or zero
// padding, and a model that fits.
//
// Cautions (caution.FitPoor): a reduced χ² above FitPoorReducedChiSquare
// when sigma is given, a parameter with relative uncertainty above
// FitPoorRelativeStd, an oscillator whose fitted frequency lies outside the
// data by more than FitOutsideFraction. Errors are *InputError: slices of unequal length, fewer residuals
// than parameters plus one, non-finite or non-positive frequencies,
// non-finite ε, non-positive or non-finite sigma, an invalid Initial, and
// ErrNotDetermined when JᵀJ is singular at the optimum.
func FitDielectric(freqHz []float64, eps []complex128, sigma []float64, o FitOptions) (Fit, error) {
	if err := validateFit(freqHz, eps, sigma, o); err != nil {
		return Fit{}, err
	}
	maxIter := o.MaxIterations
	if maxIter == 0 {
		maxIter = DefaultFitIterations
	}
	lay := newLayout(o.Initial)
	np := lay.n
	m := 2 * len(freqHz)
	p0 := lay.pack(o.Initial)
	scale := make([]float64, np)
	for j := range scale {
		scale[j] = math.Abs(p0[j])
		if scale[j] == 0 {
			scale[j] = lay.fallback[j]
		}
	}
	q := make([]float64, np)
	for j := range q {
		q[j] = p0[j] / scale[j]
	}
	ev := fitEval{freqHz: freqHz, eps: eps, sigma: sigma, lay: lay, scale: scale,
		r: make([]float64, m), jac: mat.NewDense(m, np, nil)}
	chi2, ok := ev.residuals(q, true)
	if !ok {
		return Fit{}, inputErr("FitOptions.Initial", "the starting model gives no finite ε at the data")
	}
	A := mat.NewSymDense(np, nil)
	g := mat.NewVecDense(np, nil)
	Ad := mat.NewSymDense(np, nil)
	delta := mat.NewVecDense(np, nil)
	qn := make([]float64, np)
	var chol mat.Cholesky
	lambda := 1e-3
	it := 0
	for it < maxIter {
		it++
		A.SymOuterK(1, ev.jac.T())
		g.MulVec(ev.jac.T(), mat.NewVecDense(m, ev.r))
		accepted, done := false, false
		for lambda <= 1e16 {
			Ad.CopySym(A)
			for j := range np {
				d := A.At(j, j)
				if d == 0 {
					d = 1
				}
				Ad.SetSym(j, j, d*(1+lambda))
			}
			if !chol.Factorize(Ad) {
				lambda *= 10
				continue
			}
			if err := chol.SolveVecTo(delta, g); err != nil {
				lambda *= 10
				continue
			}
			var rel float64
			for j := range np {
				qn[j] = q[j] - delta.AtVec(j)
				rel = math.Max(rel, math.Abs(delta.AtVec(j))/math.Max(math.Abs(q[j]), 1e-12))
			}
			if !lay.valid(qn, scale) {
				lambda *= 10
				continue
			}
			chi2n, ok := ev.residuals(qn, false)
			if !ok || !(chi2n < chi2) {
				lambda *= 10
				continue
			}
			done = rel <= FitTolerance || chi2-chi2n <= FitTolerance*chi2n
			copy(q, qn)
			chi2 = chi2n
			ev.residuals(q, true)
			lambda = math.Max(lambda/10, 1e-12)
			accepted = true
			break
		}
		// No step lowers χ²: the iteration sits at the minimum to
		// round-off.
		if !accepted || done {
			break
		}
	}
	// Covariance s²(JᵀJ)⁻¹ at the optimum, in scaled then SI units.
	A.SymOuterK(1, ev.jac.T())
	if !chol.Factorize(A) {
		return Fit{}, wrapErr(ErrNotDetermined, "eps", "JᵀJ is singular at the optimum: the data do not determine all %d parameters", np)
	}
	var inv mat.SymDense
	if err := chol.InverseTo(&inv); err != nil {
		return Fit{}, wrapErr(ErrNotDetermined, "eps", "JᵀJ cannot be inverted: %v", err)
	}
	dof := m - np
	s2 := chi2 / float64(dof)
	p := make([]float64, np)
	cov := make([][]float64, np)
	std := make([]float64, np)
	for i := range np {
		p[i] = q[i] * scale[i]
		cov[i] = make([]float64, np)
		for j := range np {
			cov[i][j] = s2 * inv.At(i, j) * scale[i] * scale[j]
		}
		std[i] = math.Sqrt(math.Max(cov[i][i], 0))
	}
	out := Fit{
		Model:            lay.unpack(p),
		Std:              lay.unpack(std),
		Names:            lay.names,
		Params:           p,
		Covariance:       cov,
		ChiSquare:        chi2,
		DOF:              dof,
		ReducedChiSquare: s2,
		Iterations:       it,
	}
	for i := range np {
		if !finite(std[i]) || !finite(p[i]) {
			return Fit{}, wrapErr(ErrNotDetermined, "eps", "parameter %s has no finite value or uncertainty", lay.names[i])
		}
	}
	out.Cautions = fitCautions(out, freqHz, sigma != nil)
	return out, nil
}

// FitExtraction fits a dielectric model to the permittivity ε = ñ² of an
// extraction, weighted by its noise (Extraction.StdEpsilon).
func FitExtraction(ex Extraction, o FitOptions) (Fit, error) {
	return FitDielectric(ex.FreqHz, ex.Epsilon(), ex.StdEpsilon(), o)
}

func validateFit(freqHz []float64, eps []complex128, sigma []float64, o FitOptions) error {
	if len(eps) != len(freqHz) || (sigma != nil && len(sigma) != len(freqHz)) {
		return inputErr("eps", "lengths differ: %d frequencies, %d values of ε, %d of sigma", len(freqHz), len(eps), len(sigma))
	}
	if err := o.Initial.Validate(); err != nil {
		return inputErr("FitOptions.Initial", "%v", err)
	}
	if o.MaxIterations < 0 {
		return inputErr("FitOptions.MaxIterations", "%d is negative", o.MaxIterations)
	}
	np := newLayout(o.Initial).n
	if 2*len(freqHz) <= np {
		return wrapErr(ErrNotDetermined, "freqHz", "%d frequencies give %d residuals, not more than the %d parameters", len(freqHz), 2*len(freqHz), np)
	}
	for i, f := range freqHz {
		if !finite(f) || f <= 0 {
			return inputErr(fmt.Sprintf("freqHz[%d]", i), "%g Hz is not positive and finite", f)
		}
		if !finiteC(eps[i]) {
			return inputErr(fmt.Sprintf("eps[%d]", i), "%v is not finite", eps[i])
		}
		if sigma != nil && (!finite(sigma[i]) || sigma[i] <= 0) {
			return inputErr(fmt.Sprintf("sigma[%d]", i), "%g is not positive and finite", sigma[i])
		}
	}
	return nil
}

// layout maps a Dielectric to the parameter vector and back.
type layout struct {
	nosc     int
	drude    bool
	n        int
	names    []string
	fallback []float64 // scale of a parameter that starts at 0
	kind     []int     // 0: ε∞ (> 0), 1: frequency (> 0), 2: non-negative
}

func newLayout(d optics.Dielectric) layout {
	l := layout{nosc: len(d.Oscillators), drude: d.PlasmaHz > 0}
	add := func(name string, fallback float64, kind int) {
		l.names = append(l.names, name)
		l.fallback = append(l.fallback, fallback)
		l.kind = append(l.kind, kind)
	}
	add("eps_inf", 1, 0)
	for j := range l.nosc {
		add(fmt.Sprintf("osc[%d].freq_hz", j), units.THz, 1)
		add(fmt.Sprintf("osc[%d].width_hz", j), 10*units.GHz, 2)
		add(fmt.Sprintf("osc[%d].delta_eps", j), 1, 2)
	}
	if l.drude {
		add("plasma_hz", units.THz, 1)
		add("scattering_hz", units.THz, 2)
	}
	l.n = len(l.names)
	return l
}

func (l layout) pack(d optics.Dielectric) []float64 {
	p := []float64{d.EpsInf}
	for _, o := range d.Oscillators {
		p = append(p, o.FreqHz, o.WidthHz, o.DeltaEps)
	}
	if l.drude {
		p = append(p, d.PlasmaHz, d.ScatteringHz)
	}
	return p
}

func (l layout) unpack(p []float64) optics.Dielectric {
	d := optics.Dielectric{EpsInf: p[0], Oscillators: make([]optics.Oscillator, l.nosc)}
	for j := range l.nosc {
		d.Oscillators[j] = optics.Oscillator{FreqHz: p[1+3*j], WidthHz: p[2+3*j], DeltaEps: p[3+3*j]}
	}
	if l.drude {
		d.PlasmaHz, d.ScatteringHz = p[1+3*l.nosc], p[2+3*l.nosc]
	}
	return d
}

// valid reports whether scaled parameters q describe a passive model.
func (l layout) valid(q, scale []float64) bool {
	for j, v := range q {
		v *= scale[j]
		if !finite(v) {
			return false
		}
		switch l.kind[j] {
		case 0, 1:
			if v <= 0 {
				return false
			}
		default:
			if v < 0 {
				return false
			}
		}
	}
	return true
}

// fitEval holds the data and the buffers of the weighted residuals and
// their Jacobian with respect to the scaled parameters.
type fitEval struct {
	freqHz []float64
	eps    []complex128
	sigma  []float64
	lay    layout
	scale  []float64
	r      []float64
	jac    *mat.Dense
	model  optics.Dielectric // scratch: the model at the last parameters
}

// residuals fills r (and, if withJac, the Jacobian) at scaled parameters q
// and returns χ².
//
// Derivatives (derived from the model; Ω = 2πf, γ = 2πw, D = Ω² - ω² - iγω,
// Q = ω² + iΓω):
//
//	∂ε/∂Δε = Ω²/D,   ∂ε/∂Ω = 2ΔεΩ(-ω² - iγω)/D²,   ∂ε/∂γ = iωΔεΩ²/D²,
//	∂ε/∂ω_p = -2ω_p/Q,   ∂ε/∂Γ = iωω_p²/Q²,   ∂ε/∂ε∞ = 1.
func (e *fitEval) residuals(q []float64, withJac bool) (float64, bool) {
	l := e.lay
	if e.model.Oscillators == nil {
		e.model.Oscillators = make([]optics.Oscillator, l.nosc)
	}
	model := &e.model
	model.EpsInf = q[0] * e.scale[0]
	for j := range model.Oscillators {
		model.Oscillators[j] = optics.Oscillator{FreqHz: q[1+3*j] * e.scale[1+3*j], WidthHz: q[2+3*j] * e.scale[2+3*j], DeltaEps: q[3+3*j] * e.scale[3+3*j]}
	}
	if l.drude {
		model.PlasmaHz, model.ScatteringHz = q[1+3*l.nosc]*e.scale[1+3*l.nosc], q[2+3*l.nosc]*e.scale[2+3*l.nosc]
	}
	var chi2 float64
	for i, f := range e.freqHz {
		w := 1.0
		if e.sigma != nil {
			w = 1 / e.sigma[i]
		}
		d := model.Epsilon(f) - e.eps[i]
		if !finiteC(d) {
			return 0, false
		}
		e.r[2*i], e.r[2*i+1] = real(d)*w, imag(d)*w
		chi2 += e.r[2*i]*e.r[2*i] + e.r[2*i+1]*e.r[2*i+1]
		if !withJac {
			continue
		}
		omega := 2 * math.Pi * f
		set := func(j int, de complex128) {
			de *= complex(e.scale[j]*w, 0)
			e.jac.Set(2*i, j, real(de))
			e.jac.Set(2*i+1, j, imag(de))
		}
		set(0, 1)
		for j, o := range model.Oscillators {
			W := 2 * math.Pi * o.FreqHz
			g := 2 * math.Pi * o.WidthHz
			D := complex(W*W-omega*omega, -g*omega)
			D2 := D * D
			set(1+3*j, complex(2*math.Pi*2*o.DeltaEps*W, 0)*complex(-omega*omega, -g*omega)/D2)
			set(2+3*j, complex(0, 2*math.Pi*omega*o.DeltaEps*W*W)/D2)
			set(3+3*j, complex(W*W, 0)/D)
		}
		if l.drude {
			wp := 2 * math.Pi * model.PlasmaHz
			G := 2 * math.Pi * model.ScatteringHz
			Q := complex(omega*omega, G*omega)
			set(1+3*l.nosc, complex(-2*math.Pi*2*wp, 0)/Q)
			set(2+3*l.nosc, complex(0, 2*math.Pi*omega*wp*wp)/(Q*Q))
		}
	}
	return chi2, finite(chi2)
}

func fitCautions(f Fit, freqHz []float64, weighted bool) []caution.Caution {
	var out []caution.Caution
	if weighted && f.ReducedChiSquare > FitPoorReducedChiSquare {
		out = append(out, caution.New(caution.FitPoor,
			"the fitted model misses the data by more than their noise: add an oscillator, or check the extraction",
			caution.V("reduced_chi_square", f.ReducedChiSquare), caution.V("dof", float64(f.DOF))))
	}
	for i, name := range f.Names {
		sd, v := math.Sqrt(f.Covariance[i][i]), math.Abs(f.Params[i])
		if v > 0 && sd > FitPoorRelativeStd*v {
			out = append(out, caution.New(caution.FitPoor,
				"a fitted parameter is not determined by the data ("+name+")",
				caution.V("parameter_index", float64(i)), caution.V("relative_std", sd/v)))
		}
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range freqHz {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	for j, o := range f.Model.Oscillators {
		if o.FreqHz < lo*(1-FitOutsideFraction) || o.FreqHz > hi*(1+FitOutsideFraction) {
			out = append(out, caution.New(caution.FitPoor,
				"a fitted oscillator lies outside the frequencies of the data: its frequency, width and strength are extrapolated",
				caution.V("oscillator", float64(j)), caution.V("freq_thz", o.FreqHz/units.THz),
				caution.V("data_min_thz", lo/units.THz), caution.V("data_max_thz", hi/units.THz)))
		}
	}
	return out
}
