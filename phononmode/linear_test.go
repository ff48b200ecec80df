package phononmode

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"thzdrive/units"
)

// The impulse response of the damped oscillator (Landau & Lifshitz,
// Mechanics §§25–26): a force p·δ(t−t0) leaves
// Q(t) = (p/W_d)·e^{−γ(t−t0)/2}·sin(W_d(t−t0)), W_d = √(W² − γ²/4).
//
// A sampled δ is not band-limited, so the test drives with a Gaussian force
// of area p and width σ, well sampled (σ = 5 steps, its spectrum at Nyquist
// is e^{−(5π)²/2} ≈ 1e-54), and compares with the impulse response
// convolved with that Gaussian, in closed form (derived: the Green's function
// is Im[e^{λt}]/W_d with λ = −γ/2 + iW_d, and ∫e^{−λs}g(s)ds = e^{λ²σ²/2} for
// a unit Gaussian g):
//
//	Q(t) = (p/W_d)·Im[e^{λ(t−t0) + λ²σ²/2}],   t − t0 >> σ,
//
// which is the impulse response itself up to the factor e^{λ²σ²/2}. The
// second case makes that factor small (Wσ = 0.01) and compares with the bare
// impulse response, to the O(W²σ²) = 1e-4 the finite width leaves.
// Tolerance 1e-6 of max|Q| for the exact formula: the exact solution is
// exact up to wrap-around (1e-15) and round-off; the time-domain one is set
// to 1e-7.
func TestImpulseResponse(t *testing.T) {
	cases := []struct {
		name       string
		fHz, gHz   float64
		sigma      float64
		bare       bool    // compare with the bare impulse response
		tol        float64 // relative to max|Q|
		n          int
		methods    []Method
		tolComment string
	}{
		{"Gaussian-convolved, 2 THz", 2 * units.THz, 0.2 * units.THz, 20e-15, false, 1e-6, 2500,
			[]Method{Exact, TimeDomain}, "exact formula"},
		{"Gaussian-convolved, overdamped", 1 * units.THz, 2.5 * units.THz, 20e-15, false, 1e-6, 2500,
			[]Method{Exact, TimeDomain}, "exact formula, W_d imaginary"},
		{"bare impulse, Wσ = 0.01", 1 * units.THz, 0.5 * units.THz, 0.01 / (2 * math.Pi * units.THz), true, 1e-4, 30000,
			[]Method{Exact}, "O(W²σ²)"},
	}
	for _, c := range cases {
		m := Mode{FreqHz: c.fHz, LinewidthHz: c.gHz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
		w, g := m.OmegaRadPerS(), m.GammaRadPerS()
		p := 1e-22 // impulse, m·√kg/s
		step := c.sigma / 5
		t0 := 200 * step
		v := make([]float64, c.n)
		for i := range v {
			x := (float64(i)*step - t0) / c.sigma
			v[i] = p / m.ZStarCPerSqrtKg * math.Exp(-x*x/2) / (math.Sqrt(2*math.Pi) * c.sigma)
		}
		f := Field{StepS: step, VPerM: v}
		wd := cmplx.Sqrt(complex(w*w-g*g/4, 0))
		lam := complex(-g/2, 0) + 1i*wd
		wantQ := func(tt float64) float64 {
			ex := lam * complex(tt-t0, 0)
			if !c.bare {
				ex += lam * lam * complex(c.sigma*c.sigma/2, 0)
			}
			// (p/W_d)·Im[e^{ex}] written as (p/2i W_d)(e^{ex} − e^{ex̄}),
			// which stays real when W_d is imaginary (overdamped).
			lamBar := complex(-g/2, 0) - 1i*wd
			exBar := lamBar * complex(tt-t0, 0)
			if !c.bare {
				exBar += lamBar * lamBar * complex(c.sigma*c.sigma/2, 0)
			}
			return real(complex(p, 0) * (cmplx.Exp(ex) - cmplx.Exp(exBar)) / (2i * wd))
		}
		for _, meth := range c.methods {
			r := mustDrive(t, m, f, Options{Method: meth})
			var worst, peak float64
			for i, q := range r.QMSqrtKg {
				tt := float64(i) * step
				if tt < t0+12*c.sigma {
					continue
				}
				e := wantQ(tt)
				worst = math.Max(worst, math.Abs(q-e))
				peak = math.Max(peak, math.Abs(e))
			}
			if worst > c.tol*peak {
				t.Errorf("%s, %v: max deviation %.3g of max|Q| from the %s, tolerance %g", c.name, meth, worst/peak, c.tolComment, c.tol)
			}
		}
	}
}

// Steady resonant amplitude (Landau & Lifshitz, Mechanics §26): a drive
// E0·cos(Wt) settles to Q = Z*E0/|W² − W² − iγW| = Z*·E0/(γW), in phase
// quadrature: Q_ss(t) = (Z*E0/(γW))·sin(Wt). The drive is switched on and
// off with smooth erf ramps; 30/γ after the switch-on the transient has
// decayed by e^{−15} ≈ 3e-7, so the comparison window (the next 40 ps)
// meets 1e-6 of the steady amplitude, the tolerance used.
func TestSteadyResonantAmplitude(t *testing.T) {
	m := Mode{FreqHz: units.THz, LinewidthHz: 0.1 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
	w, g := m.OmegaRadPerS(), m.GammaRadPerS()
	e0 := 10 * units.KVPerCm
	const step = 20e-15
	ramp := 1e-12
	on, off := 3e-12, 3e-12+30/g+60e-12
	n := int((off + 6e-12) / step)
	v := make([]float64, n)
	for i := range v {
		tt := float64(i) * step
		env := 0.25 * (1 + math.Erf((tt-on)/ramp)) * (1 - math.Erf((tt-off)/ramp))
		v[i] = e0 * env * math.Cos(w*tt)
	}
	f := Field{StepS: step, VPerM: v}
	amp := m.ZStarCPerSqrtKg * e0 / (g * w)
	for _, meth := range []Method{Exact, TimeDomain} {
		r := mustDrive(t, m, f, Options{Method: meth})
		var worst float64
		for i, q := range r.QMSqrtKg {
			tt := float64(i) * step
			if tt < on+3*ramp+30/g || tt > on+3*ramp+30/g+40e-12 {
				continue
			}
			worst = math.Max(worst, math.Abs(q-amp*math.Sin(w*tt)))
		}
		if worst > 1e-6*amp {
			t.Errorf("%v: deviation from Z*E/(γW)·sin(Wt) is %.3g of the amplitude, tolerance 1e-6", meth, worst/amp)
		}
	}
}

// Causality (physics.md §1): the response is zero before the drive. Random
// pulses at random times; before the pulse's Gaussian envelope has risen
// above e^{−49} ≈ 5e-22 the response must be at round-off, 1e-12 of max|Q| (common
// practice for double precision after transforms of ~1e5 points). Both
// methods; the exact one also shows the padding keeps the ring-down from
// wrapping onto the start.
func TestCausality(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := range 12 {
		fHz := (0.5 + 5*rng.Float64()) * units.THz
		m := Mode{FreqHz: fHz, LinewidthHz: (0.01 + 0.5*rng.Float64()) * fHz,
			ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
		step := 1 / (fHz * (10 + 20*rng.Float64()))
		n := 1000 + rng.IntN(2000)
		t0 := (0.3 + 0.5*rng.Float64()) * float64(n) * step
		fwhm := (2 + 10*rng.Float64()) * step * 3
		f := fewCycle(units.MVPerCm, fwhm, fHz*(0.5+rng.Float64()), 2*math.Pi*rng.Float64(), t0, 0, step, n)
		// |E| envelope exp(−2 ln2 t²/T²) < e^{−49} before t0 − 6·T.
		quiet := t0 - 6*fwhm
		for _, meth := range []Method{Exact, TimeDomain} {
			r := mustDrive(t, m, f, Options{Method: meth})
			var early float64
			for i, q := range r.QMSqrtKg {
				if f.TimeS(i) < quiet {
					early = math.Max(early, math.Abs(q))
				}
			}
			if early > 1e-12*r.MaxAbsQMSqrtKg {
				t.Errorf("trial %d %v: |Q| before the pulse = %.3g of max|Q|", trial, meth, early/r.MaxAbsQMSqrtKg)
			}
		}
	}
}

// Linearity and time invariance (properties of the linear equation of
// motion from rest): Q[a·E1 + b·E2] = a·Q[E1] + b·Q[E2], and delaying the
// field by k samples delays Q by k samples. Round-off tolerance 1e-12 of
// max|Q| (common practice).
func TestLinearityAndShift(t *testing.T) {
	m := gaasMode(t)
	tau := 1 / (2 * math.Pi * 7 * units.THz)
	f1 := singleCycle(units.MVPerCm, tau, 2e-12, 0, 10e-15, 2048)
	f2 := fewCycle(0.3*units.MVPerCm, 0.5e-12, 8*units.THz, 1, 4e-12, 0, 10e-15, 2048)
	sum := Field{StepS: f1.StepS, VPerM: make([]float64, 2048)}
	for i := range sum.VPerM {
		sum.VPerM[i] = 2*f1.VPerM[i] - 3*f2.VPerM[i]
	}
	r1 := mustDrive(t, m, f1, Options{})
	r2 := mustDrive(t, m, f2, Options{})
	rs := mustDrive(t, m, sum, Options{})
	comb := make([]float64, 2048)
	for i := range comb {
		comb[i] = 2*r1.QMSqrtKg[i] - 3*r2.QMSqrtKg[i]
	}
	if d := relMaxDiff(rs.QMSqrtKg, comb); d > 1e-12 {
		t.Errorf("superposition violated by %.3g of max|Q|", d)
	}
	const k = 137
	shifted := Field{StepS: f1.StepS, VPerM: make([]float64, 2048)}
	copy(shifted.VPerM[k:], f1.VPerM)
	rk := mustDrive(t, m, shifted, Options{})
	if d := relMaxDiff(rk.QMSqrtKg[k:], r1.QMSqrtKg[:2048-k]); d > 1e-12 {
		t.Errorf("time invariance violated by %.3g of max|Q|", d)
	}
}

// The depth kernel ∫_0^∞ e^{iωñz/c}·e^{−z/d} dz/d = 1/(1 − iωñd/c)
// (derived) against gonum's Gauss–Legendre quadrature of the integral
// (independent library), to 1e-10 (the quadrature's accuracy on [0, 60d]
// with 2000 nodes; the truncation at 60d leaves e^{−60}).
func TestDepthKernelFormula(t *testing.T) {
	d := 2e-6
	for _, c := range []struct {
		name string
		f    float64
		idx  complex128
	}{
		{"transparent", 1 * units.THz, 3.42},
		{"absorbing", 2 * units.THz, complex(3.6, 0.4)},
		{"reststrahlen-like", 8 * units.THz, complex(0.3, 5)},
		{"many wavelengths", 10 * units.THz, 3.42},
	} {
		w := 2 * math.Pi * c.f
		k := complex(0, w/units.SpeedOfLight) * c.idx
		re := quad.Fixed(func(z float64) float64 { return real(cmplx.Exp(k*complex(z, 0))) * math.Exp(-z/d) / d }, 0, 60*d, 2000, quad.Legendre{}, 0)
		im := quad.Fixed(func(z float64) float64 { return imag(cmplx.Exp(k*complex(z, 0))) * math.Exp(-z/d) / d }, 0, 60*d, 2000, quad.Legendre{}, 0)
		got := depthKernel(w, c.idx, d)
		if cmplx.Abs(got-complex(re, im)) > 1e-10 {
			t.Errorf("%s: kernel %v, quadrature %v", c.name, got, complex(re, im))
		}
	}
}

// The depth average two independent ways: the exact kernel applied in the
// frequency domain, and Gauss–Laguerre quadrature over depth of
// time-domain solutions driven by the propagated field. For a linear mode
// they solve the same problem, so they agree to the time-domain tolerance
// (1e-6 of the average's maximum). The sample is GaAs with its own TO
// mode in ñ = √(ε∞ + Lorentz term), probed over 1 µm (an optical probe).
func TestDepthAverageTwoWays(t *testing.T) {
	m := gaasMode(t)
	idx := func(f float64) complex128 {
		n := cmplx.Sqrt(10.89 + m.DielectricTerm(f))
		if imag(n) < 0 {
			n = -n
		}
		return n
	}
	tau := 1 / (2 * math.Pi * 6 * units.THz)
	f := singleCycle(units.MVPerCm, tau, 1e-12, 0, 10e-15, 1500)
	for _, d := range []float64{0.1e-6, 0.5e-6, 1e-6} {
		opt := Options{Depth: &Depth{ProbeDepthM: d, Index: idx}}
		opt.Method = Exact
		ex := mustDrive(t, m, f, opt)
		opt.Method = TimeDomain
		td := mustDrive(t, m, f, opt)
		if dd := relMaxDiff(td.DepthAvgQMSqrtKg, ex.DepthAvgQMSqrtKg); dd > 1e-6 {
			t.Errorf("d = %g m: exact and quadrature depth averages differ by %.3g", d, dd)
		}
		t.Logf("d = %g m: exact vs quadrature %.2g", d, relMaxDiff(td.DepthAvgQMSqrtKg, ex.DepthAvgQMSqrtKg))
		// The surface is not the average: the field decays into GaAs.
		if ex.DepthAvgMaxAbsQMSqrtKg >= ex.MaxAbsQMSqrtKg {
			t.Errorf("d = %g m: depth average %g not below the surface %g", d, ex.DepthAvgMaxAbsQMSqrtKg, ex.MaxAbsQMSqrtKg)
		}
	}
}
