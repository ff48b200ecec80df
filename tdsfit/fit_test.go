package tdsfit

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/units"
)

type fitRef struct {
	FreqHz  []float64 `json:"freq_hz"`
	EpsRe   []float64 `json:"eps_re"`
	EpsIm   []float64 `json:"eps_im"`
	Sigma   []float64 `json:"sigma"`
	Initial []float64 `json:"initial"`
	Truth   []float64 `json:"truth"`
	Popt    []float64 `json:"popt"`
	Perr    []float64 `json:"perr"`
	Chi2    float64   `json:"chi2"`
	DOF     int       `json:"dof"`
}

func dielectricFrom(p []float64) optics.Dielectric {
	return optics.Dielectric{EpsInf: p[0], Oscillators: []optics.Oscillator{
		{FreqHz: p[1], WidthHz: p[2], DeltaEps: p[3]}, {FreqHz: p[4], WidthHz: p[5], DeltaEps: p[6]}},
		PlasmaHz: p[7], ScatteringHz: p[8]}
}

// Against scipy.optimize.curve_fit (MINPACK Levenberg–Marquardt, analytic
// Jacobian, pcov = s²(JᵀJ)⁻¹ with absolute_sigma=False) on the same seeded
// noisy data of two Lorentz oscillators and a Drude term
// (testdata/make_references.py): both must find the same minimum, to
// 1e-4 of each parameter's uncertainty, the same χ² to 1e-9 relative, and
// the same uncertainties to 1e-6 relative (both invert the same JᵀJ).
func TestFitScipy(t *testing.T) {
	var ref fitRef
	loadJSON(t, "fit_reference.json", &ref)
	eps := make([]complex128, len(ref.FreqHz))
	for i := range eps {
		eps[i] = complex(ref.EpsRe[i], ref.EpsIm[i])
	}
	fit, err := FitDielectric(ref.FreqHz, eps, ref.Sigma, FitOptions{Initial: dielectricFrom(ref.Initial)})
	if err != nil {
		t.Fatal(err)
	}
	if fit.DOF != ref.DOF || relErr(fit.ChiSquare, ref.Chi2) > 1e-9 {
		t.Errorf("χ² = %.12g with %d DOF, scipy %.12g with %d", fit.ChiSquare, fit.DOF, ref.Chi2, ref.DOF)
	}
	for i, name := range fit.Names {
		if math.Abs(fit.Params[i]-ref.Popt[i]) > 1e-4*ref.Perr[i] {
			t.Errorf("%s = %.12g, scipy %.12g (σ %.3g)", name, fit.Params[i], ref.Popt[i], ref.Perr[i])
		}
		if sd := math.Sqrt(fit.Covariance[i][i]); relErr(sd, ref.Perr[i]) > 1e-6 {
			t.Errorf("σ(%s) = %.10g, scipy %.10g", name, sd, ref.Perr[i])
		}
	}
	// Std mirrors the covariance's diagonal in the model's layout.
	if fit.Std.Oscillators[1].WidthHz != math.Sqrt(fit.Covariance[5][5]) || fit.Std.ScatteringHz != math.Sqrt(fit.Covariance[8][8]) {
		t.Error("Std does not mirror the covariance")
	}
	t.Logf("%d iterations, reduced χ² %.4f", fit.Iterations, fit.ReducedChiSquare)
}

// The analytic Jacobian of the weighted residuals against central
// differences in the scaled parameters (derived: the truncation is h²/6
// times the third derivative, about 1e-11 relative for h = 1e-6; the
// round-off ~1e-16/1e-6).
func TestFitJacobian(t *testing.T) {
	var ref fitRef
	loadJSON(t, "fit_reference.json", &ref)
	eps := make([]complex128, len(ref.FreqHz))
	for i := range eps {
		eps[i] = complex(ref.EpsRe[i], ref.EpsIm[i])
	}
	model := dielectricFrom(ref.Truth)
	lay := newLayout(model)
	p := lay.pack(model)
	scale := make([]float64, lay.n)
	q := make([]float64, lay.n)
	for j := range p {
		scale[j] = 1.3 * p[j]
		q[j] = p[j] / scale[j]
	}
	m := 2 * len(eps)
	ev := fitEval{freqHz: ref.FreqHz, eps: eps, sigma: ref.Sigma, lay: lay, scale: scale, r: make([]float64, m), jac: mat.NewDense(m, lay.n, nil)}
	ev.residuals(q, true)
	jac := mat.DenseCopyOf(ev.jac)
	const h = 1e-6
	rp, rm := make([]float64, m), make([]float64, m)
	for j := range q {
		qq := append([]float64(nil), q...)
		qq[j] = q[j] + h
		ev.residuals(qq, false)
		copy(rp, ev.r)
		qq[j] = q[j] - h
		ev.residuals(qq, false)
		copy(rm, ev.r)
		for i := range m {
			num := (rp[i] - rm[i]) / (2 * h)
			if math.Abs(num-jac.At(i, j)) > 1e-6*(math.Abs(num)+1) {
				t.Fatalf("∂r[%d]/∂%s = %.10g, central difference %.10g", i, lay.names[j], jac.At(i, j), num)
			}
		}
	}
}

// Property: noise-free data from random models (one or two oscillators,
// with or without Drude) are fitted exactly, to 1e-7 relative, from a
// start up to 15 % off in every parameter. The model must describe the
// data well enough to fix every parameter: oscillators inside the band,
// widths of a few per cent of their frequency.
func TestFitExactProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(91, 92))
	freq := make([]float64, 200)
	for i := range freq {
		freq[i] = (0.2 + 7.8*float64(i)/float64(len(freq)-1)) * units.THz
	}
	for trial := range 30 {
		truth := optics.Dielectric{EpsInf: 2 + 8*rng.Float64()}
		nosc := 1 + trial%2
		for j := range nosc {
			f0 := (1 + 2.5*rng.Float64() + 3.5*float64(j)) * units.THz
			truth.Oscillators = append(truth.Oscillators, optics.Oscillator{FreqHz: f0, WidthHz: f0 * (0.02 + 0.08*rng.Float64()), DeltaEps: 0.2 + 2*rng.Float64()})
		}
		if trial%3 == 0 {
			truth.PlasmaHz, truth.ScatteringHz = (1+3*rng.Float64())*units.THz, (0.5+2*rng.Float64())*units.THz
		}
		eps := make([]complex128, len(freq))
		for i, f := range freq {
			eps[i] = truth.Epsilon(f)
		}
		lay := newLayout(truth)
		p := lay.pack(truth)
		start := make([]float64, len(p))
		for j := range p {
			start[j] = p[j] * (1 + 0.3*(rng.Float64()-0.5))
		}
		fit, err := FitDielectric(freq, eps, nil, FitOptions{Initial: lay.unpack(start)})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		for j := range p {
			if relErr(fit.Params[j], p[j]) > 1e-7 {
				t.Fatalf("trial %d: %s = %.10g, true %.10g (start %.4g)", trial, fit.Names[j], fit.Params[j], p[j], start[j])
			}
		}
	}
}

// A model with too few oscillators misses the data beyond their noise: the
// fit cautions FitPoor with a reduced χ² far above 1, and the same data
// fitted with the right model do not.
func TestFitPoorCaution(t *testing.T) {
	var ref fitRef
	loadJSON(t, "fit_reference.json", &ref)
	eps := make([]complex128, len(ref.FreqHz))
	for i := range eps {
		eps[i] = complex(ref.EpsRe[i], ref.EpsIm[i])
	}
	right := dielectricFrom(ref.Initial)
	wrong := right
	wrong.Oscillators = wrong.Oscillators[:1]
	for _, c := range []struct {
		name string
		init optics.Dielectric
		poor bool
	}{{"right model", right, false}, {"one oscillator missing", wrong, true}} {
		fit, err := FitDielectric(ref.FreqHz, eps, ref.Sigma, FitOptions{Initial: c.init})
		if err != nil {
			t.Fatal(err)
		}
		poor := false
		for _, cc := range fit.Cautions {
			poor = poor || cc.Code == caution.FitPoor
		}
		if poor != c.poor {
			t.Errorf("%s: FitPoor %v (reduced χ² %.3g), want %v: %v", c.name, poor, fit.ReducedChiSquare, c.poor, fit.Cautions)
		}
	}
}

func TestFitErrors(t *testing.T) {
	freq := []float64{1e12, 2e12, 3e12, 4e12}
	eps := []complex128{10, 11, 12 + 1i, 5 + 3i}
	good := optics.Dielectric{EpsInf: 5, Oscillators: []optics.Oscillator{{FreqHz: 3e12, WidthHz: 1e11, DeltaEps: 1}}}
	twin := optics.Dielectric{EpsInf: 5, Oscillators: []optics.Oscillator{{FreqHz: 3e12, WidthHz: 1e11, DeltaEps: 1}, {FreqHz: 3e12, WidthHz: 1e11, DeltaEps: 1}}}
	twinFreq := make([]float64, 50)
	twinEps := make([]complex128, 50)
	for i := range twinFreq {
		twinFreq[i] = float64(i+1) * 0.1e12
		twinEps[i] = twin.Epsilon(twinFreq[i])
	}
	for _, c := range []struct {
		name          string
		freq          []float64
		eps           []complex128
		sigma         []float64
		o             FitOptions
		field         string
		notDetermined bool
	}{
		{"length mismatch", freq, eps[:3], nil, FitOptions{Initial: good}, "eps", false},
		{"sigma length", freq, eps, []float64{1}, FitOptions{Initial: good}, "eps", false},
		{"NaN eps", freq, []complex128{10, complex(math.NaN(), 0), 1, 1}, nil, FitOptions{Initial: good}, "eps[1]", false},
		{"zero frequency", []float64{0, 2e12, 3e12, 4e12}, eps, nil, FitOptions{Initial: good}, "freqHz[0]", false},
		{"zero sigma", freq, eps, []float64{1, 1, 0, 1}, FitOptions{Initial: good}, "sigma[2]", false},
		{"invalid initial", freq, eps, nil, FitOptions{Initial: optics.Dielectric{EpsInf: -1}}, "FitOptions.Initial", false},
		{"oscillator at 0 Hz", freq, eps, nil, FitOptions{Initial: optics.Dielectric{EpsInf: 5, Oscillators: []optics.Oscillator{{DeltaEps: 1}}}}, "FitOptions.Initial", false},
		{"negative iterations", freq, eps, nil, FitOptions{Initial: good, MaxIterations: -1}, "FitOptions.MaxIterations", false},
		{"too few points", freq[:2], eps[:2], nil, FitOptions{Initial: good}, "freqHz", true},
		{"twin oscillators", twinFreq, twinEps, nil, FitOptions{Initial: twin}, "eps", true},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := FitDielectric(c.freq, c.eps, c.sigma, c.o)
			var ie *InputError
			if !errors.As(err, &ie) || ie.Field != c.field || errors.Is(err, ErrNotDetermined) != c.notDetermined {
				t.Errorf("error %v, want field %q (not determined %v)", err, c.field, c.notDetermined)
			}
		})
	}
}
