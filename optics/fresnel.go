package optics

import (
	"fmt"
	"math"
)

// Polarization selects the linear polarization of a plane wave relative to
// its plane of incidence.
type Polarization int

const (
	// PolS (TE): the electric field is perpendicular to the plane of
	// incidence and parallel to every interface.
	PolS Polarization = iota
	// PolP (TM): the electric field lies in the plane of incidence; it has a
	// tangential component (along the interfaces) and, at oblique incidence,
	// a normal one.
	PolP
)

func (p Polarization) String() string {
	switch p {
	case PolS:
		return "s"
	case PolP:
		return "p"
	}
	return fmt.Sprintf("Polarization(%d)", int(p))
}

// Interface returns the Fresnel amplitude reflection and transmission
// coefficients for a plane wave in medium a (index nA) meeting the plane
// boundary with medium b (index nB) at the angle of incidence angleRad,
// measured in medium a from the normal.
//
// The angle in medium b follows from the complex Snell's law
// nA·sinθa = nB·sinθb, written through the conserved tangential index
// β = nA·sinθa and the normal components q = ñ·cosθ = sqrt(ñ² - β²) on the
// branch Im q >= 0 (IndexFromEpsilon), which makes the refracted wave decay
// away from the boundary in an absorbing medium and beyond the critical
// angle. With these (Born & Wolf, Principles of Optics, 7th ed., §1.5.2 and
// §13.2; Hecht, Optics, §4.6):
//
//	s:  r = (qa - qb)/(qa + qb),                t = 2qa/(qa + qb)
//	p:  r = (nA²qb - nB²qa)/(nA²qb + nB²qa),    t = 2nA·nB·qa/(nA²qb + nB²qa)
//
// Sign convention for p. Every amplitude, incident, reflected or
// transmitted, is that of the whole electric-field vector, and the reference
// direction of each p wave is chosen so that its tangential component is
// +cosθ times its amplitude, for the reflected wave as for the others. Then
// r_p = r_s at normal incidence, both equal to (nA - nB)/(nA + nB), and the
// tangential field just in front of the interface is cosθa·(1 + r). Born &
// Wolf's r_p has the opposite sign (their reflected reference vector has
// the opposite tangential component); t_p is the same in both. r_p
// vanishes at Brewster's angle, tanθa = nB/nA, and changes sign there.
//
// Medium a must be lossless (nA real and positive) unless angleRad = 0: the
// angle of a wave in an absorbing medium is not a real number. angleRad must
// lie in [0, π/2). For s and for p the quantity t/(nA·cosθa) is the same in
// both directions (reciprocity, see Solver).
func Interface(pol Polarization, nA, nB complex128, angleRad float64) (r, t complex128, err error) {
	if err := checkAngle("angleRad", angleRad); err != nil {
		return 0, 0, err
	}
	if err := checkIndex("nA", "", 1, nA); err != nil {
		return 0, 0, err
	}
	if err := checkIndex("nB", "", 1, nB); err != nil {
		return 0, 0, err
	}
	if angleRad != 0 && (imag(nA) != 0 || !(real(nA) > 0)) {
		return 0, 0, inputErr("nA", "oblique incidence needs a lossless medium a with real n > 0, got %v", nA)
	}
	if pol != PolS && pol != PolP {
		return 0, 0, inputErr("pol", "unknown polarization %d", int(pol))
	}
	beta := real(nA) * math.Sin(angleRad)
	a := newWave(pol, nA, beta)
	b := newWave(pol, nB, beta)
	den := a.gV*b.gU + a.gU*b.gV
	r = (a.gV*b.gU - a.gU*b.gV) / den
	t = 2 * a.gU * a.gV / den
	if !finiteC(r) || !finiteC(t) {
		return 0, 0, inputErr("nB", "the interface is singular for these indices (ε = 0 at oblique p incidence)")
	}
	return r, t, nil
}

// wave holds, for one medium at one frequency and tangential index β, the
// fields of a plane wave of unit amplitude travelling in +z:
//
//	U = gU (the tangential electric field) and V = gV (Z0 times the
//	tangential magnetic field, with the sign that makes the z-component of
//	the time-averaged Poynting vector Re(U·V*)/(2Z0)).
//
// A wave of amplitude b travelling in -z has U = gU·b, V = -gV·b. From
// Maxwell's equations with fields ∝ e^{i(k0βx + k0qz - ωt)}:
//
//	s: gU = 1,   gV = q     (E = E_y, V = -Z0·H_x)
//	p: gU = q/ñ, gV = ñ     (E = amplitude·(cosθ, 0, -sinθ), V = Z0·H_y)
//
// and the layer admittance is η = gV/gU: q for s, ε/q for p.
type wave struct {
	n, eps, q, gU, gV complex128
}

// newWave fills a wave for medium index n at tangential index beta. At
// normal incidence p is computed as s: the two are identical there in our
// convention, and this avoids dividing by ñ.
func newWave(pol Polarization, n complex128, beta float64) wave {
	var w wave
	w.set(pol, n, beta)
	return w
}

// set is newWave in place (the inner loops of Solver write the wave of a
// layer where it lives rather than copy five complex numbers).
func (w *wave) set(pol Polarization, n complex128, beta float64) {
	w.n, w.eps = n, n*n
	if beta == 0 {
		w.q = n
	} else {
		w.q = IndexFromEpsilon(w.eps - complex(beta*beta, 0))
	}
	if pol == PolP && beta != 0 {
		w.gU = cdiv(w.q, n)
		w.gV = n
	} else {
		w.gU = 1
		w.gV = w.q
	}
}

func checkAngle(field string, angleRad float64) error {
	if !finite(angleRad) || angleRad < 0 || angleRad >= math.Pi/2 {
		return inputErr(field, "angle of incidence %g rad (%g°) must be finite and in [0, 90°)", angleRad, angleRad*180/math.Pi)
	}
	return nil
}
