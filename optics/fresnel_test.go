package optics

import (
	"math"
	"math/cmplx"
	"testing"
)

// TestFresnelSilicon: normal incidence on n = 3.4175 (Grischkowsky et al.,
// JOSA B 7, 2006 (1990), from memory): R = 0.2995 per surface and the
// first-pass field factor of a slab t12·t21 = 4n/(1+n)² = 0.7005
// (physics.md §4). Tolerance: half a unit of the quoted last digit.
func TestFresnelSilicon(t *testing.T) {
	for _, pol := range []Polarization{PolS, PolP} {
		r, t12, err := Interface(pol, 1, nSi, 0)
		if err != nil {
			t.Fatal(err)
		}
		r2, t21, err := Interface(pol, nSi, 1, 0)
		if err != nil {
			t.Fatal(err)
		}
		if !near(sqAbs(r), 0.2995, 5e-5) || !near(sqAbs(r2), 0.2995, 5e-5) {
			t.Errorf("%s: R = %.5f, %.5f, want 0.2995", pol, sqAbs(r), sqAbs(r2))
		}
		if !near(real(t12*t21), 0.7005, 5e-5) || imag(t12*t21) != 0 {
			t.Errorf("%s: t12·t21 = %v, want 0.7005", pol, t12*t21)
		}
		// Normal incidence: r = (na - nb)/(na + nb) for s and, in our
		// convention, for p too (physics.md §4).
		if !nearC(r, complex((1-nSi)/(1+nSi), 0), 1e-16) {
			t.Errorf("%s: r = %v, want (1-n)/(1+n)", pol, r)
		}
	}
}

// TestFresnelAngles compares Interface with Fresnel's formulas in terms of
// the angles (Born & Wolf, Principles of Optics, 7th ed., §1.5.2, eqs. 20-21):
//
//	r_s = -sin(θi-θt)/sin(θi+θt),    t_s = 2 sinθt cosθi/sin(θi+θt),
//	r_p = tan(θi-θt)/tan(θi+θt),     t_p = 2 sinθt cosθi/(sin(θi+θt) cos(θi-θt)),
//
// with sin θt = (n1/n2) sin θi, for real indices below the critical angle.
// Our r_p is minus Born & Wolf's (see Interface). Tolerance 1e-14.
func TestFresnelAngles(t *testing.T) {
	cases := []struct{ n1, n2, deg float64 }{
		{1, 1.5, 10}, {1, 1.5, 45}, {1, 1.5, 80}, {1, nSi, 30}, {1, nSi, 73.6},
		{1.5, 1, 20}, {nSi, 1, 10}, {2.38, 1.46, 35}, {1.46, 2.38, 85},
	}
	for _, c := range cases {
		ti := c.deg * math.Pi / 180
		tt := math.Asin(c.n1 / c.n2 * math.Sin(ti))
		wantRs := -math.Sin(ti-tt) / math.Sin(ti+tt)
		wantTs := 2 * math.Sin(tt) * math.Cos(ti) / math.Sin(ti+tt)
		wantRpBW := math.Tan(ti-tt) / math.Tan(ti+tt)
		wantTp := 2 * math.Sin(tt) * math.Cos(ti) / (math.Sin(ti+tt) * math.Cos(ti-tt))
		rs, ts, err := Interface(PolS, complex(c.n1, 0), complex(c.n2, 0), ti)
		if err != nil {
			t.Fatal(err)
		}
		rp, tp, err := Interface(PolP, complex(c.n1, 0), complex(c.n2, 0), ti)
		if err != nil {
			t.Fatal(err)
		}
		if !nearC(rs, complex(wantRs, 0), 1e-14) || !nearC(ts, complex(wantTs, 0), 1e-14) {
			t.Errorf("%v s: r = %v t = %v, want %g %g", c, rs, ts, wantRs, wantTs)
		}
		if !nearC(rp, complex(-wantRpBW, 0), 1e-14) || !nearC(tp, complex(wantTp, 0), 1e-14) {
			t.Errorf("%v p: r = %v t = %v, want %g %g", c, rp, tp, -wantRpBW, wantTp)
		}
		// A stack without layers is the same interface.
		pol := PolS
		for _, want := range []complex128{rs, rp} {
			resp := mustSolve(t, mustSolver(t, Stack{AmbientIndex: c.n1, Exit: Constant{N: c.n2}, AngleRad: ti, Pol: pol}), 1e12)
			if !nearC(resp.Reflection, want, 1e-15) {
				t.Errorf("%v %s: stack r = %v, Interface %v", c, pol, resp.Reflection, want)
			}
			pol = PolP
		}
	}
}

// TestStokesRelations: for any pair of media r_ba = -r_ab and
// t_ab·t_ba - r_ab·r_ba = 1 (Stokes relations; Hecht, Optics, §4.10),
// including absorbing media (an algebraic identity of the Fresnel formulas).
func TestStokesRelations(t *testing.T) {
	for _, c := range []struct {
		na, nb complex128
		beta   float64
	}{
		{1, 1.5, 0.3}, {1, 3.4175, 0.9}, {1.2, complex(2, 0.5), 1.1}, {complex(2, 0.3), complex(1, 2), 0.5}, {1, complex(0.2, 5), 0.7},
	} {
		for _, pol := range []Polarization{PolS, PolP} {
			rab, tab, _ := interfaceFromQ(pol, c.na, c.nb, c.beta)
			rba, tba, _ := interfaceFromQ(pol, c.nb, c.na, c.beta)
			if !nearC(rba, -rab, 1e-15) || !nearC(tab*tba-rab*rba, 1, 1e-14) {
				t.Errorf("%v %s: r_ab %v r_ba %v, t_ab t_ba - r_ab r_ba = %v", c, pol, rab, rba, tab*tba-rab*rba)
			}
			if real(c.na) > c.beta && imag(c.na) == 0 {
				r, tt, err := Interface(pol, c.na, c.nb, math.Asin(c.beta/real(c.na)))
				if err != nil || !nearC(r, rab, 1e-15) || !nearC(tt, tab, 1e-15) {
					t.Errorf("%v %s: Interface %v %v %v, formula %v %v", c, pol, r, tt, err, rab, tab)
				}
			}
		}
	}
}

// TestBrewster: r_p = 0 at θ_B = arctan(n2/n1) and changes sign there (Born
// & Wolf §1.5.3); r_s does not vanish. Also for the internal Brewster angle.
func TestBrewster(t *testing.T) {
	for _, c := range []struct{ n1, n2 float64 }{{1, 1.5}, {1, nSi}, {nSi, 1}, {1.46, 2.38}} {
		tb := math.Atan(c.n2 / c.n1)
		rp, _, err := Interface(PolP, complex(c.n1, 0), complex(c.n2, 0), tb)
		if err != nil {
			t.Fatal(err)
		}
		if cmplx.Abs(rp) > 1e-15 {
			t.Errorf("%v: |r_p(θ_B)| = %g, want 0", c, cmplx.Abs(rp))
		}
		below, _, _ := Interface(PolP, complex(c.n1, 0), complex(c.n2, 0), tb-0.01)
		above, _, _ := Interface(PolP, complex(c.n1, 0), complex(c.n2, 0), tb+0.01)
		if real(below)*real(above) >= 0 {
			t.Errorf("%v: r_p does not change sign across θ_B: %v, %v", c, below, above)
		}
		rs, _, _ := Interface(PolS, complex(c.n1, 0), complex(c.n2, 0), tb)
		if cmplx.Abs(rs) < 0.1 {
			t.Errorf("%v: |r_s(θ_B)| = %g, should not vanish", c, cmplx.Abs(rs))
		}
	}
}

// TestTotalInternalReflection: from silicon into air beyond the critical
// angle arcsin(n2/n1) = 17.01°, |r| = 1 for s and p, with the phases of
// Born & Wolf §1.5.4, eq. 57: tan(φs/2) = sqrt(sin²θ - n²)/cosθ and
// tan(φp/2) = sqrt(sin²θ - n²)/(n²cosθ), n = n2/n1 (magnitudes compared: the
// signs depend on the reference directions; for p Born & Wolf's r is minus
// ours). Below the critical angle |r| < 1.
func TestTotalInternalReflection(t *testing.T) {
	n1, n2 := nSi, 1.0
	crit := math.Asin(n2 / n1)
	if !near(crit*180/math.Pi, 17.01, 0.005) {
		t.Fatalf("critical angle %.3f°", crit*180/math.Pi)
	}
	n := n2 / n1
	for _, deg := range []float64{17.02, 20, 45, 70, 89.9} {
		th := deg * math.Pi / 180
		rs, _, err := Interface(PolS, complex(n1, 0), complex(n2, 0), th)
		if err != nil {
			t.Fatal(err)
		}
		rp, _, _ := Interface(PolP, complex(n1, 0), complex(n2, 0), th)
		if !near(cmplx.Abs(rs), 1, 1e-15) || !near(cmplx.Abs(rp), 1, 1e-15) {
			t.Errorf("%g°: |r_s| = %.16f, |r_p| = %.16f, want 1", deg, cmplx.Abs(rs), cmplx.Abs(rp))
		}
		root := math.Sqrt(math.Sin(th)*math.Sin(th) - n*n)
		if !near(math.Abs(math.Tan(cmplx.Phase(rs)/2)), root/math.Cos(th), 1e-10*root/math.Cos(th)) {
			t.Errorf("%g°: s phase %g", deg, cmplx.Phase(rs))
		}
		if !near(math.Abs(math.Tan(cmplx.Phase(-rp)/2)), root/(n*n*math.Cos(th)), 1e-10*root/(n*n*math.Cos(th))) {
			t.Errorf("%g°: p phase %g", deg, cmplx.Phase(-rp))
		}
		// The same through a stack, with its energy balance: T = 0.
		resp := mustSolve(t, mustSolver(t, Stack{AmbientIndex: n1, AngleRad: th, Pol: PolP}), 1e12)
		if !near(resp.R, 1, 1e-14) || resp.T != 0 {
			t.Errorf("%g°: stack R = %.16f T = %g", deg, resp.R, resp.T)
		}
	}
	rs, _, _ := Interface(PolS, complex(n1, 0), complex(n2, 0), crit-0.01)
	if cmplx.Abs(rs) >= 1 {
		t.Errorf("below the critical angle |r_s| = %g", cmplx.Abs(rs))
	}
}

// TestInterfaceValidation: bad input is an error, not a panic or NaN
// (common practice).
func TestInterfaceValidation(t *testing.T) {
	cases := []struct {
		name   string
		na, nb complex128
		angle  float64
	}{
		{"angle 90°", 1, 1.5, math.Pi / 2},
		{"angle > 90°", 1, 1.5, 2},
		{"NaN angle", 1, 1.5, math.NaN()},
		{"NaN index", 1, complex(math.NaN(), 0), 0},
		{"kappa < 0", 1, complex(1.5, -0.1), 0},
		{"lossy incidence medium at oblique angle", complex(1.5, 0.1), 1, 0.3},
		{"zero index", 1, 0, 0},
	}
	for _, c := range cases {
		if _, _, err := Interface(PolS, c.na, c.nb, c.angle); err == nil {
			t.Errorf("%s: accepted", c.name)
		}
	}
	if _, _, err := Interface(Polarization(3), 1, 2, 0); err == nil {
		t.Error("unknown polarization accepted")
	}
}
