package tdsfit

import (
	"encoding/json"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"os"
	"testing"

	"thzdrive/optics"
	"thzdrive/units"
)

// loadJSON reads a reference file of testdata (made by
// testdata/make_references.py with Debian's numpy and scipy).
func loadJSON(t testing.TB, name string, v any) {
	t.Helper()
	b, err := os.ReadFile("testdata/" + name)
	if err != nil {
		t.Fatalf("reading reference: %v", err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatalf("parsing %s: %v", name, err)
	}
}

// SlabTransmission against the Fabry–Pérot sum added term by term in numpy
// (testdata/make_references.py, independent library and formulation).
func TestSlabTransmissionNumpy(t *testing.T) {
	var ref struct {
		Cases []struct {
			N          float64 `json:"n"`
			Kappa      float64 `json:"kappa"`
			FreqHz     float64 `json:"freq_hz"`
			ThicknessM float64 `json:"thickness_m"`
			Echoes     int     `json:"echoes"`
			Re         float64 `json:"re"`
			Im         float64 `json:"im"`
		}
	}
	loadJSON(t, "slab_reference.json", &ref)
	if len(ref.Cases) == 0 {
		t.Fatal("no reference cases")
	}
	for _, c := range ref.Cases {
		got := SlabTransmission(complex(c.N, c.Kappa), c.FreqHz, c.ThicknessM, Echoes(c.Echoes))
		want := complex(c.Re, c.Im)
		// Tolerance: the phase (n-1)ωd/c reaches ~100 rad, whose round-off
		// (~1e-14) dominates; 1e-12 of |T| leaves room for it.
		if d := cmplx.Abs(got - want); d > 1e-12*math.Max(cmplx.Abs(want), 1e-3) {
			t.Errorf("ñ=%g%+gi f=%g d=%g echoes=%v: T = %v, numpy %v (|Δ| %.2g)", c.N, c.Kappa, c.FreqHz, c.ThicknessM, c.Echoes, got, want, d)
		}
	}
}

// physics.md §4 (derived from the Airy formula): 500 um of n = 3.4175 has
// a power transmission between 0.29059 and 1, 0.31191 at 1 THz, and a
// fringe spacing of 87.72 GHz; also the first-pass t_as·t_sa = 0.7005
// (Grischkowsky et al., JOSA B 7, 2006 (1990), n from memory).
func TestSlabTransmissionAiry(t *testing.T) {
	const n, d = 3.4175, 500 * units.Um
	if got := cmplx.Abs(SlabTransmission(n, units.THz, d, AllEchoes)); math.Abs(got*got-0.31191) > 5e-6 {
		t.Errorf("|T|² at 1 THz = %.6f, physics.md 0.31191", got*got)
	}
	if got := cmplx.Abs(SlabTransmission(n, 0.123*units.THz, d, NoEchoes)); math.Abs(got-0.7005) > 5e-5 {
		t.Errorf("first pass |T| = %.5f, physics.md 0.7005", got)
	}
	spacing := units.SpeedOfLight / (2 * n * d)
	if math.Abs(spacing/units.GHz-87.72) > 0.005 {
		t.Errorf("fringe spacing %.3f GHz, physics.md 87.72", spacing/units.GHz)
	}
	// Over one fringe near 1 THz: maxima of 1 at f = m·c/(2nd), a minimum of
	// 0.29059 half-way between.
	m := math.Round(units.THz / spacing)
	lo, hi := math.Inf(1), 0.0
	for i := range 2001 {
		f := (m + float64(i)/2000) * spacing
		p := cmplx.Abs(SlabTransmission(n, f, d, AllEchoes))
		lo, hi = math.Min(lo, p*p), math.Max(hi, p*p)
	}
	if math.Abs(lo-0.29059) > 5e-6 || math.Abs(hi-1) > 1e-12 {
		t.Errorf("|T|² over a fringe in [%.6f, %.13f], physics.md [0.29059, 1]", lo, hi)
	}
}

// SlabTransmission against package optics's transfer matrices: a coherent
// slab (all echoes) and an incoherent one (first pass), quoted relative to
// air by multiplying the stack's t by e^{-iωd/c} (optics.Train's phase
// reference). Two independent formulations of the same physics.
func TestSlabTransmissionOptics(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for range 200 {
		idx := complex(1.05+5*rng.Float64(), 0.3*rng.Float64()*rng.Float64())
		f := (0.05 + 5*rng.Float64()) * units.THz
		d := math.Exp(math.Log(5e-6) + rng.Float64()*math.Log(2e-3/5e-6))
		for _, inc := range []bool{false, true} {
			sv, err := optics.NewSolver(optics.Stack{Layers: []optics.Layer{{Medium: optics.Constant{N: real(idx), Kappa: imag(idx)}, ThicknessM: d, Incoherent: inc}}})
			if err != nil {
				t.Fatal(err)
			}
			resp, err := sv.Solve(f)
			if err != nil {
				t.Fatal(err)
			}
			want := resp.Transmission * cmplx.Exp(complex(0, -2*math.Pi*f*d/units.SpeedOfLight))
			e := AllEchoes
			if inc {
				e = NoEchoes
			}
			got := SlabTransmission(idx, f, d, e)
			if dd := cmplx.Abs(got - want); dd > 1e-12*math.Max(cmplx.Abs(want), 1e-6) {
				t.Fatalf("ñ=%v f=%g d=%g incoherent=%v: T = %v, optics %v", idx, f, d, inc, got, want)
			}
		}
	}
}

// The analytic derivative d lnT/dñ against a central difference (derived:
// the truncation error of a central difference is h²/6 times the third
// derivative, and lnT varies on the scale 1/(2ωd/c) through the echoes'
// phase, so with h = 1e-4/(1 + 2ωd/c) the truncation is ~1e-8 relative and
// the round-off ~1e-10).
func TestSlabLogDerivative(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for range 300 {
		n := complex(1.05+6*rng.Float64(), 0.5*rng.Float64())
		k0d := math.Exp(math.Log(0.05) + rng.Float64()*math.Log(400/0.05))
		e := Echoes(rng.IntN(5) - 1)
		_, d := slabLog(n, k0d, e)
		hh := 1e-4 / (1 + 2*k0d)
		for _, h := range []complex128{complex(hh, 0), complex(0, hh)} {
			fp, _ := slabLog(n+h, k0d, e)
			fm, _ := slabLog(n-h, k0d, e)
			num := (fp - fm) / (2 * h)
			if dd := cmplx.Abs(num - d); dd > 1e-6*cmplx.Abs(d) {
				t.Fatalf("ñ=%v k0d=%g echoes=%v: dlnT/dñ = %v, central difference %v", n, k0d, e, d, num)
			}
		}
	}
}

// Echo counts are nested: 0 echoes is the first pass, many echoes approach
// the full sum geometrically (derived: the remainder of the geometric
// series after m terms is x^{m+1}/(1-x)).
func TestSlabEchoesNested(t *testing.T) {
	n, f, d := complex(3.4175, 0.001), 0.8*units.THz, 300*units.Um
	if a, b := SlabTransmission(n, f, d, 0), SlabTransmission(n, f, d, NoEchoes); a != b {
		t.Errorf("Echoes(0) %v != NoEchoes %v", a, b)
	}
	all := SlabTransmission(n, f, d, AllEchoes)
	r := (n - 1) / (n + 1)
	x := cmplx.Abs(r * r * cmplx.Exp(complex(0, 4*math.Pi*f*d/units.SpeedOfLight)*n))
	for _, m := range []Echoes{1, 2, 5, 20} {
		got := SlabTransmission(n, f, d, m)
		bound := math.Pow(x, float64(m)+1) / (1 - x) * cmplx.Abs(all) * (1 + x) / (1 - x)
		if dd := cmplx.Abs(got - all); dd > bound {
			t.Errorf("%d echoes differ from all by %.3g, more than the geometric remainder %.3g", m, dd, bound)
		}
	}
	if !cmplx.IsNaN(SlabTransmission(complex(-1, 0), f, d, AllEchoes)) || !cmplx.IsNaN(SlabTransmission(n, math.NaN(), d, AllEchoes)) || !cmplx.IsNaN(SlabTransmission(n, f, d, -2)) {
		t.Error("bad arguments must give NaN")
	}
}
