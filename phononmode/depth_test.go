package phononmode

import (
	"encoding/json"
	"errors"
	"math"
	"math/cmplx"
	"os"
	"strconv"
	"testing"

	"thzdrive/units"
)

// The Gauss–Laguerre rules against SciPy's scipy.special.roots_laguerre
// (testdata/make_laguerre_reference.py, Debian python3-scipy 1.10): nodes
// to 1e-12 relative, weights to 1e-9 relative where they exceed 1e-200 of
// the first (the far weights of the 48-point rule reach 1e-70 and are only
// as accurate as the polynomial values behind them).
func TestGaussLaguerreAgainstSciPy(t *testing.T) {
	b, err := os.ReadFile("testdata/laguerre_reference.json")
	if err != nil {
		t.Fatal(err)
	}
	var ref struct {
		Generator string `json:"generator"`
		Rules     map[string]struct {
			X []float64 `json:"x"`
			W []float64 `json:"w"`
		} `json:"rules"`
	}
	if err := json.Unmarshal(b, &ref); err != nil {
		t.Fatal(err)
	}
	for i, n := range laguerreOrders {
		want, ok := ref.Rules[strconv.Itoa(n)]
		if !ok {
			t.Fatalf("no %d-point rule in the reference", n)
		}
		got, err := laguerreRuleFor(i)
		if err != nil {
			t.Fatal(err)
		}
		for j := range want.X {
			if math.Abs(got.x[j]/want.X[j]-1) > 1e-12 {
				t.Errorf("n = %d node %d: %.17g, %s %.17g", n, j, got.x[j], ref.Generator, want.X[j])
			}
			if want.W[j] > 1e-200*want.W[0] && math.Abs(got.w[j]/want.W[j]-1) > 1e-9 {
				t.Errorf("n = %d weight %d: %.17g, %s %.17g", n, j, got.w[j], ref.Generator, want.W[j])
			}
		}
	}
}

// Gaussian quadrature is exact for polynomials of degree < 2n (Gauss's
// theorem): Σ w_j x_j^k = ∫_0^∞ x^k e^{−x} dx = k!. Checked to 1e-11
// relative for the rules up to 16 points (the sums of large terms lose a
// few digits beyond). The 2-point rule has the closed form x = 2 ∓ √2,
// w = (2 ± √2)/4 (derived from L_2 = 1 − 2x + x²/2).
func TestGaussLaguerreExactness(t *testing.T) {
	r2, err := gaussLaguerre(2)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r2.x[0]-(2-math.Sqrt2)) > 1e-15 || math.Abs(r2.x[1]-(2+math.Sqrt2)) > 1e-15 ||
		math.Abs(r2.w[0]-(2+math.Sqrt2)/4) > 1e-15 || math.Abs(r2.w[1]-(2-math.Sqrt2)/4) > 1e-15 {
		t.Errorf("2-point rule %v %v", r2.x, r2.w)
	}
	for i, n := range laguerreOrders[:3] {
		r, err := laguerreRuleFor(i)
		if err != nil {
			t.Fatal(err)
		}
		fact := 1.0
		for k := 0; k < 2*n; k++ {
			if k > 0 {
				fact *= float64(k)
			}
			var s float64
			for j, x := range r.x {
				s += r.w[j] * math.Pow(x, float64(k))
			}
			if math.Abs(s/fact-1) > 1e-11 {
				t.Errorf("n = %d: Σ w x^%d = %.15g, want %d! = %.15g", n, k, s, k, fact)
			}
		}
	}
}

// A nonlinear mode with a probe depth of many wavelengths in a transparent
// sample cannot be depth-averaged by the quadrature: ErrDepthQuadrature,
// not a silently wrong average. A linear mode is averaged exactly at any
// depth (Auto picks Exact).
func TestDepthQuadratureLimit(t *testing.T) {
	m := Mode{FreqHz: 2 * units.THz, LinewidthHz: 0.1 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu,
		CellVolumeM3: 1e-28, A4PerM2KgS2: 1e70}
	f := singleCycle(units.MVPerCm, 1/m.OmegaRadPerS(), 1e-12, 0, 10e-15, 800)
	deep := &Depth{ProbeDepthM: 300e-6, Index: func(float64) complex128 { return complex(3.42, 1e-4) }}
	if _, err := Drive(m, f, Options{Depth: deep}); !errors.Is(err, ErrDepthQuadrature) {
		t.Errorf("nonlinear, 300 µm probe: err = %v, want ErrDepthQuadrature", err)
	}
	lin := m
	lin.A4PerM2KgS2 = 0
	r, err := Drive(lin, f, Options{Depth: deep})
	if err != nil {
		t.Fatalf("linear, 300 µm probe: %v", err)
	}
	// In a transparent, non-dispersive sample the depth average of the
	// field at ω is 1/(1 − iωnd/c): for ωnd/c >> 1 the average is far below
	// the surface value (derived), here by more than 10×.
	if r.DepthAvgMaxAbsQMSqrtKg > 0.1*r.MaxAbsQMSqrtKg {
		t.Errorf("deep average %g vs surface %g", r.DepthAvgMaxAbsQMSqrtKg, r.MaxAbsQMSqrtKg)
	}
	// And |1/(1 − iωñd/c)| <= 1 for a passive ñ (derived).
	for _, f := range []float64{0.1e12, 1e12, 10e12} {
		if a := cmplx.Abs(depthKernel(2*math.Pi*f, complex(3.42, 0.5), 1e-6)); a > 1 {
			t.Errorf("|kernel| = %g > 1", a)
		}
	}
}
