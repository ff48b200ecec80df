package optics

import "math"

// Complex helpers for the inner loops. They avoid the general-purpose
// overflow scaling of Go's complex division and math/cmplx's separate
// exponentials for sinh and cosh; the magnitudes met here (indices up to
// ~1e6, fields renormalised below 1e100) are far from overflow. Each keeps
// full relative precision near zero, where the naive forms cancel.

// l1 is |Re z| + |Im z|, a cheap norm for choosing between series and
// closed forms.
func l1(z complex128) float64 { return math.Abs(real(z)) + math.Abs(imag(z)) }

// mulNegI returns -i·z.
func mulNegI(z complex128) complex128 { return complex(imag(z), -real(z)) }

// cinv returns 1/z.
func cinv(z complex128) complex128 {
	d := real(z)*real(z) + imag(z)*imag(z)
	return complex(real(z)/d, -imag(z)/d)
}

// cdiv returns a/b.
func cdiv(a, b complex128) complex128 { return a * cinv(b) }

// cexpi returns e^{iz} = e^{-Im z}·(cos Re z + i sin Re z).
func cexpi(z complex128) complex128 {
	s, c := math.Sincos(real(z))
	m := math.Exp(-imag(z))
	return complex(m*c, m*s)
}

// cosSinc returns cos d and sin d / d, by their Taylor series for
// |d|₁ < 1e-2 (first omitted terms below 1e-16) and otherwise from
// sin(x+iy) = sin x·cosh y + i·cos x·sinh y, cos(x+iy) = cos x·cosh y -
// i·sin x·sinh y, with sinh y from expm1 so that it is exact for small y.
func cosSinc(d complex128) (c, s1 complex128) {
	if l1(d) < 1e-2 {
		return cosSincSeries(d)
	}
	sx, cx := math.Sincos(real(d))
	em := math.Expm1(imag(d)) // e^y - 1
	ey := 1 + em
	sh := em * (1 + 1/ey) / 2 // sinh y
	ch := (ey + 1/ey) / 2
	c = complex(cx*ch, -sx*sh)
	return c, cdiv(complex(sx*ch, cx*sh), d)
}

// cosSincSeries returns cos d and sin d / d by their Taylor series, for
// |d|₁ < 1e-2 (the first omitted terms, d⁸/8! and d⁸/9!, are below 1e-20).
// Constants are multiplied, not divided: a complex division is a runtime call.
func cosSincSeries(d complex128) (c, s1 complex128) {
	d2 := d * d
	c = 1 - d2*0.5*(1-d2*(1.0/12)*(1-d2*(1.0/30)))
	s1 = 1 - d2*(1.0/6)*(1-d2*(1.0/20)*(1-d2*(1.0/42)))
	return c, s1
}

// sinc returns sin d / d.
func sinc(d complex128) complex128 {
	_, s1 := cosSinc(d)
	return s1
}

// expm1OverX returns (e^{id} - 1)/(id): as sinc(d/2)·e^{id/2} for
// |d|₁ < 1, free of cancellation, and directly otherwise (where it cannot
// cancel, and where e^{id} may underflow to 0 for a thick absorbing layer).
func expm1OverX(d complex128) complex128 {
	if l1(d) < 1 {
		h := d * 0.5
		return sinc(h) * cexpi(h)
	}
	return cdiv(cexpi(d)-1, complex(-imag(d), real(d)))
}
