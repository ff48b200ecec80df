package optics

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"thzdrive/units"
)

// TestIndexFromEpsilon: the κ >= 0 branch of sqrt(ε), checked on exact
// squares and against Born & Wolf's closed form for a passive medium
// (Principles of Optics, 7th ed., §14.1, eqs. 10-11): n² - κ² = Re ε,
// 2nκ = Im ε, so n = sqrt((|ε| + Re ε)/2), κ = sqrt((|ε| - Re ε)/2).
func TestIndexFromEpsilon(t *testing.T) {
	cases := []struct {
		name string
		eps  complex128
		want complex128
	}{
		{"dielectric, 2² = 4", 4, 2},
		{"metal, (1+2i)² = -3+4i", -3 + 4i, 1 + 2i},
		{"absorber, (2+i)² = 3+4i", 3 + 4i, 2 + 1i},
		{"negative real ε: evanescent, n = 0, κ = 1", -1, 1i},
		{"negative real ε with a negative-zero imaginary part", complex(-4, math.Copysign(0, -1)), 2i},
		{"gain (Im ε < 0): κ >= 0 forces n < 0, (-2+i)² = 3-4i", 3 - 4i, -2 + 1i},
		{"zero", 0, 0},
	}
	for _, c := range cases {
		got := IndexFromEpsilon(c.eps)
		if got != c.want {
			t.Errorf("%s: IndexFromEpsilon(%v) = %v, want %v", c.name, c.eps, got, c.want)
		}
	}
	rng := rand.New(rand.NewPCG(7, 8))
	for range 10000 {
		eps := complex(200*rng.Float64()-100, 100*rng.Float64()*rng.Float64())
		n := IndexFromEpsilon(eps)
		// The closed form, with the smaller root taken from 2nκ = Im ε
		// (Born & Wolf §14.1, eq. 10) to avoid cancellation.
		a := cmplx.Abs(eps)
		var wn, wk float64
		if real(eps) >= 0 {
			wn = math.Sqrt((a + real(eps)) / 2)
			wk = imag(eps) / (2 * wn)
		} else {
			wk = math.Sqrt((a - real(eps)) / 2)
			wn = imag(eps) / (2 * wk)
		}
		if !near(real(n), wn, 1e-13*(1+wn)) || !near(imag(n), wk, 1e-13*(1+wk)) {
			t.Fatalf("ε = %v: ñ = %v, Born & Wolf %g + %gi", eps, n, wn, wk)
		}
	}
}

// TestAbsorptionCoefficient: α = 4πκ/λ0 (Born & Wolf §14.1; Hecht §4.8):
// κ = 0.01 at 1 THz (λ0 = 299.79 µm) gives 4.192 cm^-1.
func TestAbsorptionCoefficient(t *testing.T) {
	alpha := AbsorptionCoefficient(1e12, complex(3, 0.01))
	lambda := units.SpeedOfLight / 1e12
	if relErr(alpha, 4*math.Pi*0.01/lambda) > 1e-15 || !near(alpha/units.PerCm, 4.192, 5e-4) {
		t.Errorf("α = %g cm^-1, want 4πκ/λ0 = 4.192", alpha/units.PerCm)
	}
}

// TestTabulated: linear interpolation (exact at the points, the chord in
// between), the end values held outside, the range reported, and bad tables
// refused (common practice).
func TestTabulated(t *testing.T) {
	tab, err := NewTabulated([]float64{1e12, 2e12, 4e12}, []float64{2, 3, 3.5}, []float64{0, 0.1, 0.3})
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		f    float64
		want complex128
	}{
		{1e12, 2}, {2e12, 3 + 0.1i}, {4e12, 3.5 + 0.3i},
		{1.5e12, 2.5 + 0.05i}, {3e12, 3.25 + 0.2i},
		{0.5e12, 2}, {9e12, 3.5 + 0.3i}, // held, not extrapolated
	}
	for _, c := range cases {
		if got := tab.Index(c.f); !nearC(got, c.want, 1e-15) {
			t.Errorf("Index(%g) = %v, want %v", c.f, got, c.want)
		}
	}
	lo, hi := tab.ValidRangeHz()
	if lo != 1e12 || hi != 4e12 {
		t.Errorf("range %g-%g", lo, hi)
	}
	if ok, _, _ := Covers(tab, 1e12, 4e12); !ok {
		t.Error("range not covered by itself")
	}
	if ok, mn, mx := Covers(tab, 0.5e12, 3e12); ok || mn != 1e12 || mx != 4e12 {
		t.Errorf("Covers below the table: %v %g %g", ok, mn, mx)
	}
	if ok, _, mx := Covers(Constant{N: 2}, 0, 1e20); !ok || !math.IsInf(mx, 1) {
		t.Error("a constant index should cover everything")
	}
	bad := []struct {
		name     string
		f, n, k  []float64
		contains string
	}{
		{"one point", []float64{1}, []float64{1}, []float64{0}, "at least 2"},
		{"lengths", []float64{1, 2}, []float64{1}, []float64{0, 0}, "lengths"},
		{"not increasing", []float64{2, 1}, []float64{1, 1}, []float64{0, 0}, "increase"},
		{"NaN n", []float64{1, 2}, []float64{1, math.NaN()}, []float64{0, 0}, "point 1"},
		{"kappa < 0", []float64{1, 2}, []float64{1, 1}, []float64{0, -1}, "κ"},
		{"negative frequency", []float64{-1, 2}, []float64{1, 1}, []float64{0, 0}, "point 0"},
	}
	for _, c := range bad {
		_, err := NewTabulated(c.f, c.n, c.k)
		if err == nil || !strings.Contains(err.Error(), c.contains) {
			t.Errorf("%s: error %v, want one mentioning %q", c.name, err, c.contains)
		}
	}
}

// TestDielectricPassive: with γ >= 0, Δε >= 0, Γ >= 0 the model has
// Im ε >= 0 and κ >= 0 at every frequency: the e^{-iωt} convention of
// physics.md §1. A property test on random models.
func TestDielectricPassive(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for range 2000 {
		d := Dielectric{EpsInf: 1 + 10*rng.Float64()}
		for range rng.IntN(4) {
			d.Oscillators = append(d.Oscillators, Oscillator{FreqHz: 1e12 + 20e12*rng.Float64(), WidthHz: 1e12 * rng.Float64(), DeltaEps: 5 * rng.Float64()})
		}
		if rng.IntN(2) == 0 {
			d.PlasmaHz, d.ScatteringHz = 50e12*rng.Float64(), 5e12*rng.Float64()
		}
		if err := d.Validate(); err != nil {
			t.Fatal(err)
		}
		f := 30e12 * rng.Float64()
		e, n := d.Epsilon(f), d.Index(f)
		if imag(e) < 0 || imag(n) < 0 || !finiteC(n) {
			t.Fatalf("%+v at %g Hz: ε = %v, ñ = %v", d, f, e, n)
		}
	}
}

// TestDrude compares the Drude term with the Drude conductivity
// σ(ω) = σ0/(1 - iωτ), σ0 = ε0ωp²τ, τ = 1/Γ (Ashcroft & Mermin, Solid State
// Physics (1976), eq. 1.29, time dependence e^{-iωt}) through
// ε = ε∞ + iσ/(ε0ω). Tolerance 1e-12 relative.
func TestDrude(t *testing.T) {
	d := Dielectric{EpsInf: 11.7, PlasmaHz: 3e12, ScatteringHz: 0.7e12}
	wp, g := units.AngularFrequency(d.PlasmaHz), units.AngularFrequency(d.ScatteringHz)
	sigma0 := units.VacuumPermittiv * wp * wp / g
	for _, f := range []float64{0.01e12, 0.3e12, 1e12, 5e12, 40e12} {
		w := units.AngularFrequency(f)
		sigma := complex(sigma0, 0) / complex(1, -w/g)
		want := complex(d.EpsInf, 0) + 1i*sigma/complex(units.VacuumPermittiv*w, 0)
		if got := d.Epsilon(f); cmplx.Abs(got-want) > 1e-12*cmplx.Abs(want) {
			t.Errorf("%g THz: ε = %v, Drude conductivity gives %v", f/1e12, got, want)
		}
	}
	// Reststrahlen of free carriers: ε = ε∞ - ωp²/ω² < 0 below the screened
	// plasma frequency ωp/sqrt(ε∞) (Ashcroft & Mermin, ch. 1).
	b := d.ReststrahlenBands()
	if len(b) != 1 || b[0].LoHz != 0 || relErr(b[0].HiHz, d.PlasmaHz/math.Sqrt(d.EpsInf)) > 1e-12 {
		t.Errorf("Drude band %v, want [0, %g]", b, d.PlasmaHz/math.Sqrt(d.EpsInf))
	}
}

// TestOscillatorWidth: WidthHz is the FWHM of the peak of Im ε(f) for a
// narrow oscillator: Im ε = ΔεΩ²γω/((Ω²-ω²)² + γ²ω²) falls to half its peak
// at ω ≈ Ω ± γ/2 (derived from the Lorentz form), to O((γ/Ω)²).
func TestOscillatorWidth(t *testing.T) {
	o := Oscillator{FreqHz: 5e12, WidthHz: 5e9, DeltaEps: 2}
	peak := imag(o.Epsilon(o.FreqHz))
	half := func(lo, hi float64) float64 { // bisection on Im ε - peak/2
		for range 200 {
			mid := (lo + hi) / 2
			if (imag(o.Epsilon(mid)) > peak/2) == (imag(o.Epsilon(lo)) > peak/2) {
				lo = mid
			} else {
				hi = mid
			}
		}
		return lo
	}
	fwhm := half(o.FreqHz, 6e12) - half(4e12, o.FreqHz)
	if relErr(fwhm, o.WidthHz) > 1e-5 {
		t.Errorf("FWHM %g Hz, want %g (relative error %g)", fwhm, o.WidthHz, relErr(fwhm, o.WidthHz))
	}
}

// TestGeneralizedLST: for several undamped oscillators the zeros of ε (the
// LO frequencies) interlace the TO frequencies, and
// Π_j (ω_LO,j/ω_TO,j)² = ε(0)/ε∞ (generalised Lyddane-Sachs-Teller relation,
// Cochran & Cowley, J. Phys. Chem. Solids 23, 447 (1962)). Tolerance 1e-12.
func TestGeneralizedLST(t *testing.T) {
	d := Dielectric{EpsInf: 4.2, Oscillators: []Oscillator{
		{FreqHz: 7e12, DeltaEps: 0.8}, {FreqHz: 2e12, DeltaEps: 3}, {FreqHz: 12e12, DeltaEps: 0.3}, {FreqHz: 0.9e12, WidthHz: 0, DeltaEps: 0}, // no strength, no band
	}}
	b := d.ReststrahlenBands()
	if len(b) != 3 {
		t.Fatalf("bands %v", b)
	}
	prod := 1.0
	for i, band := range b {
		if i > 0 && !(band.LoHz > b[i-1].HiHz) {
			t.Errorf("bands do not interlace: %v", b)
		}
		if e := real(d.Epsilon(band.HiHz)); math.Abs(e) > 1e-9 {
			t.Errorf("Re ε(LO %d) = %g", i, e)
		}
		prod *= band.HiHz * band.HiHz / (band.LoHz * band.LoHz)
	}
	if relErr(prod, real(d.Epsilon(0))/d.EpsInf) > 1e-12 {
		t.Errorf("Π(LO/TO)² = %.15g, ε(0)/ε∞ = %.15g", prod, real(d.Epsilon(0))/d.EpsInf)
	}
}

// TestMediumValidation: parameters that are not a passive medium are
// refused with a message naming them (common practice).
func TestMediumValidation(t *testing.T) {
	bad := []struct {
		name string
		m    validator
		sub  string
	}{
		{"NaN n", Constant{N: math.NaN()}, "finite"},
		{"kappa < 0", Constant{N: 1, Kappa: -0.1}, "κ"},
		{"zero index", Constant{}, "0"},
		{"eps_inf 0", Dielectric{}, "EpsInf"},
		{"negative width", Dielectric{EpsInf: 1, Oscillators: []Oscillator{{FreqHz: 1, WidthHz: -1}}}, "Oscillators[0].WidthHz"},
		{"negative strength", Dielectric{EpsInf: 1, Oscillators: []Oscillator{{FreqHz: 1}, {FreqHz: 1, DeltaEps: -1}}}, "Oscillators[1].DeltaEps"},
		{"zero frequency", Dielectric{EpsInf: 1, Oscillators: []Oscillator{{FreqHz: 0}}}, "Oscillators[0].FreqHz"},
		{"NaN plasma", Dielectric{EpsInf: 1, PlasmaHz: math.NaN()}, "PlasmaHz"},
		{"material without model", Material{Name: "x"}, "no model"},
	}
	for _, c := range bad {
		err := c.m.Validate()
		if err == nil || !strings.Contains(err.Error(), c.sub) {
			t.Errorf("%s: %v, want an error mentioning %q", c.name, err, c.sub)
		}
	}
}
