package pulse

import "math"

// This file holds the transform's own paths (the rest goes to gonum's port
// of FFTPACK, which is accurate for factors 2, 3, 4 and 5 but slow, and for
// larger prime factors both slow, O(N·p), and less accurate):
//
//   - a complex FFT for lengths with no prime factor above 5: self-sorting
//     (Stockham) mixed radix 4/2/3/5 in the form of Swarztrauber's FFTPACK
//     cfftf (butterfly, then twiddle; Swarztrauber, "Vectorizing the FFTs",
//     in Parallel Computations (1982)), with every twiddle computed directly;
//   - the real FFT of an even length N as that complex FFT of length N/2
//     (even samples as real parts, odd ones as imaginary parts, then one
//     pass that separates the two; Press et al., Numerical Recipes, 3rd ed.,
//     §12.3);
//   - any other length by Bluestein's chirp z-transform (Bluestein, IEEE
//     Trans. Audio Electroacoust. 18, 451 (1970)): the DFT as a convolution
//     with the chirp e^{-πi n²/N}, computed by complex FFTs of a 5-smooth
//     length >= 2N-1, so O(N log N) and accurate for prime lengths too.
//
// All sums here use the engineering sign e^{-2πi jk/N}; Transform converts
// to the convention of physics.md §1 by complex conjugation. The tests check
// every path against numpy.fft and against the DFT's definition.

// cplan is a complex FFT of length m (5-smooth): Σ_j a_j e^{-2πi jk/m}.
type cplan struct {
	m      int
	stages []stage
	a, b   []complex128 // input and second buffer, length m
}

// halfPlan is a plan for the real FFT of length n = 2m with m 5-smooth.
type halfPlan struct {
	n, m int
	c    *cplan
	post []complex128 // e^{-2πi k/n}, k = 0 … m
}

// stage is one pass of the mixed-radix FFT: radix p, l1 = product of the
// radices before it, ido = m/(l1·p), and the twiddles w^{iq} (q = 1 … p-1,
// i = 0 … ido-1, w = e^{-2πi/(ido·p)}) stored as tw[(q-1)·ido + i].
type stage struct {
	p, l1, ido int
	tw         []complex128
}

// radices returns the factors of m in the order the passes use them (4s,
// then a 2, then 3s and 5s), or nil if m has another prime factor.
func radices(m int) []int {
	var out []int
	for m%4 == 0 {
		out = append(out, 4)
		m /= 4
	}
	for _, p := range [...]int{2, 3, 5} {
		for m%p == 0 {
			out = append(out, p)
			m /= p
		}
	}
	if m != 1 {
		return nil
	}
	return out
}

// newCPlan returns a complex plan of length m, or nil if m has a prime
// factor above 5.
func newCPlan(m int) *cplan {
	rs := radices(m)
	if rs == nil {
		return nil
	}
	cp := &cplan{m: m, a: make([]complex128, m), b: make([]complex128, m)}
	l1 := 1
	for _, p := range rs {
		ido := m / (l1 * p)
		st := stage{p: p, l1: l1, ido: ido, tw: make([]complex128, (p-1)*ido)}
		for q := 1; q < p; q++ {
			for i := range ido {
				// The angle is reduced to an exact integer fraction first so
				// that each twiddle is correctly rounded.
				s, c := math.Sincos(-2 * math.Pi * float64((i*q)%(ido*p)) / float64(ido*p))
				st.tw[(q-1)*ido+i] = complex(c, s)
			}
		}
		cp.stages = append(cp.stages, st)
		l1 *= p
	}
	return cp
}

// run transforms cp.a (overwriting both buffers) and returns the slice that
// holds the result (cp.a or cp.b).
func (cp *cplan) run() []complex128 {
	in, out := cp.a, cp.b
	for _, st := range cp.stages {
		switch st.p {
		case 4:
			pass4(in, out, st)
		case 2:
			pass2(in, out, st)
		case 3:
			pass3(in, out, st)
		case 5:
			pass5(in, out, st)
		}
		in, out = out, in
	}
	return in
}

// newHalfPlan returns a plan for real length n, or nil if this path does not
// serve n (odd, or n/2 not 5-smooth).
func newHalfPlan(n int) *halfPlan {
	if n < 2 || n%2 != 0 {
		return nil
	}
	c := newCPlan(n / 2)
	if c == nil {
		return nil
	}
	hp := &halfPlan{n: n, m: n / 2, c: c, post: make([]complex128, n/2+1)}
	for k := range hp.post {
		s, c := math.Sincos(-2 * math.Pi * float64(k) / float64(n))
		hp.post[k] = complex(c, s)
	}
	return hp
}

// In each pass the input is read as cc[i + ido·(j + p·k)] and the output
// written as ch[i + ido·(k + l1·q)], for i < ido, j, q < p, k < l1.

func pass2(cc, ch []complex128, st stage) {
	ido, l1 := st.ido, st.l1
	tw := st.tw[:ido]
	for k := range l1 {
		in := cc[ido*2*k : ido*2*k+2*ido]
		o0 := ch[ido*k : ido*k+ido]
		o1 := ch[ido*(k+l1) : ido*(k+l1)+ido]
		a0, a1 := in[:ido], in[ido:2*ido]
		for i := range ido {
			x0, x1 := a0[i], a1[i]
			o0[i] = x0 + x1
			o1[i] = (x0 - x1) * tw[i]
		}
	}
}

func pass4(cc, ch []complex128, st stage) {
	ido, l1 := st.ido, st.l1
	tw1, tw2, tw3 := st.tw[:ido], st.tw[ido:2*ido], st.tw[2*ido:3*ido]
	for k := range l1 {
		in := cc[ido*4*k : ido*4*k+4*ido]
		a0, a1, a2, a3 := in[:ido], in[ido:2*ido], in[2*ido:3*ido], in[3*ido:4*ido]
		o0 := ch[ido*k : ido*k+ido]
		o1 := ch[ido*(k+l1) : ido*(k+l1)+ido]
		o2 := ch[ido*(k+2*l1) : ido*(k+2*l1)+ido]
		o3 := ch[ido*(k+3*l1) : ido*(k+3*l1)+ido]
		if ido == 1 {
			x0, x1, x2, x3 := a0[0], a1[0], a2[0], a3[0]
			t0, t1 := x0+x2, x0-x2
			t2, d := x1+x3, x1-x3
			t3 := complex(imag(d), -real(d)) // -i·(x1 - x3)
			o0[0], o1[0], o2[0], o3[0] = t0+t2, t1+t3, t0-t2, t1-t3
			continue
		}
		for i := range ido {
			x0, x1, x2, x3 := a0[i], a1[i], a2[i], a3[i]
			t0, t1 := x0+x2, x0-x2
			t2, d := x1+x3, x1-x3
			t3 := complex(imag(d), -real(d))
			o0[i] = t0 + t2
			o1[i] = (t1 + t3) * tw1[i]
			o2[i] = (t0 - t2) * tw2[i]
			o3[i] = (t1 - t3) * tw3[i]
		}
	}
}

func pass3(cc, ch []complex128, st stage) {
	const s3 = 0.86602540378443864676 // sin(2π/3)
	ido, l1 := st.ido, st.l1
	tw1, tw2 := st.tw[:ido], st.tw[ido:2*ido]
	for k := range l1 {
		in := cc[ido*3*k : ido*3*k+3*ido]
		a0, a1, a2 := in[:ido], in[ido:2*ido], in[2*ido:3*ido]
		o0 := ch[ido*k : ido*k+ido]
		o1 := ch[ido*(k+l1) : ido*(k+l1)+ido]
		o2 := ch[ido*(k+2*l1) : ido*(k+2*l1)+ido]
		for i := range ido {
			x0, x1, x2 := a0[i], a1[i], a2[i]
			s, d := x1+x2, x1-x2
			m := x0 - 0.5*s
			// -i·sin(2π/3)·(x1 - x2)
			r := complex(s3*imag(d), -s3*real(d))
			o0[i] = x0 + s
			o1[i] = (m + r) * tw1[i]
			o2[i] = (m - r) * tw2[i]
		}
	}
}

func pass5(cc, ch []complex128, st stage) {
	// cos and sin of 2π/5 and 4π/5.
	const (
		c1 = 0.30901699437494742410
		s1 = 0.95105651629515357212
		c2 = -0.80901699437494742410
		s2 = 0.58778525229247312917
	)
	ido, l1 := st.ido, st.l1
	tw1, tw2, tw3, tw4 := st.tw[:ido], st.tw[ido:2*ido], st.tw[2*ido:3*ido], st.tw[3*ido:4*ido]
	for k := range l1 {
		in := cc[ido*5*k : ido*5*k+5*ido]
		a0, a1, a2, a3, a4 := in[:ido], in[ido:2*ido], in[2*ido:3*ido], in[3*ido:4*ido], in[4*ido:5*ido]
		o0 := ch[ido*k : ido*k+ido]
		o1 := ch[ido*(k+l1) : ido*(k+l1)+ido]
		o2 := ch[ido*(k+2*l1) : ido*(k+2*l1)+ido]
		o3 := ch[ido*(k+3*l1) : ido*(k+3*l1)+ido]
		o4 := ch[ido*(k+4*l1) : ido*(k+4*l1)+ido]
		for i := range ido {
			x0, x1, x2, x3, x4 := a0[i], a1[i], a2[i], a3[i], a4[i]
			sa, da := x1+x4, x1-x4
			sb, db := x2+x3, x2-x3
			ma := x0 + complex(c1, 0)*sa + complex(c2, 0)*sb
			mb := x0 + complex(c2, 0)*sa + complex(c1, 0)*sb
			// -i·(s1·da + s2·db) and -i·(s2·da - s1·db)
			ra := s1*da + s2*db
			rb := s2*da - s1*db
			ra = complex(imag(ra), -real(ra))
			rb = complex(imag(rb), -real(rb))
			o0[i] = x0 + sa + sb
			o1[i] = (ma + ra) * tw1[i]
			o2[i] = (mb + rb) * tw2[i]
			o3[i] = (mb - rb) * tw3[i]
			o4[i] = (ma - ra) * tw4[i]
		}
	}
}

// forward writes X_k = Σ_n x_n e^{-2πi kn/N}, k = 0 … m, scaled by scale
// and complex-conjugated when conj is set, into dst (len m+1).
func (hp *halfPlan) forward(dst []complex128, x []float64, scale float64, conj bool) {
	m := hp.m
	a := hp.c.a[:m]
	for j := range a {
		a[j] = complex(x[2*j], x[2*j+1])
	}
	z := hp.c.run()[:m]
	// Separate the transforms of the even (F) and odd (G) samples:
	// F_k = (Z_k + conj Z_{m-k})/2, G_k = (Z_k - conj Z_{m-k})/(2i), and
	// X_k = F_k + e^{-2πi k/N}·G_k (Numerical Recipes §12.3).
	z0 := z[0]
	dst[0] = complex(scale*(real(z0)+imag(z0)), 0)
	dst[m] = complex(scale*(real(z0)-imag(z0)), 0)
	post := hp.post[:m+1]
	sgn := 1.0
	if conj {
		sgn = -1
	}
	for k := 1; k < m; k++ {
		zk, zr := z[k], z[m-k]
		zc := complex(real(zr), -imag(zr))
		f := 0.5 * (zk + zc)
		d := 0.5 * (zk - zc)
		g := complex(imag(d), -real(d)) // d/i
		v := f + post[k]*g
		dst[k] = complex(scale*real(v), sgn*scale*imag(v))
	}
}

// inverse writes x_n = scale·Σ_k X_k e^{+2πi kn/N} over the full two-sided
// spectrum implied by the one-sided src (len m+1, X_{N-k} = conj X_k) into
// dst (len n). With conj set, src holds conj X_k instead. The imaginary
// parts of X_0 and X_m are ignored.
func (hp *halfPlan) inverse(dst []float64, src []complex128, scale float64, conj bool) {
	m := hp.m
	sgn := 1.0
	if conj {
		sgn = -1
	}
	at := func(k int) complex128 {
		c := src[k]
		return complex(real(c), sgn*imag(c))
	}
	// F_k = (X_k + conj X_{m-k})/2, G_k = (X_k - conj X_{m-k})·e^{+2πi k/N}/2,
	// Z_k = F_k + i·G_k; then z = inverse DFT of Z, computed as the
	// conjugate of the forward DFT of conj Z.
	a := hp.c.a[:m]
	x0, xm := real(src[0]), real(src[m])
	f, g := 0.5*(x0+xm), 0.5*(x0-xm)
	a[0] = complex(f, -g) // conj(F + iG) with F, G real
	post := hp.post[:m+1]
	for k := 1; k < m; k++ {
		xk, xr := at(k), at(m-k)
		xc := complex(real(xr), -imag(xr))
		fk := 0.5 * (xk + xc)
		w := post[k]
		gk := 0.5 * (xk - xc) * complex(real(w), -imag(w))
		zk := fk + complex(-imag(gk), real(gk)) // F + i·G
		a[k] = complex(real(zk), -imag(zk))
	}
	z := hp.c.run()[:m]
	for j, c := range z {
		dst[2*j] = scale * real(c)
		dst[2*j+1] = -scale * imag(c)
	}
}

// bluePlan computes the DFT of any length n by Bluestein's algorithm:
// with the chirp w_j = e^{-πi j²/n} and 2jk = j² + k² - (k-j)²,
//
//	X_k = Σ_j u_j e^{-2πi jk/n} = w_k · Σ_j (u_j w_j) · conj(w_{k-j}),
//
// a convolution, done cyclically at a 5-smooth length M >= 2n-1 where it
// equals the linear one.
type bluePlan struct {
	n    int
	c    *cplan       // length M
	w    []complex128 // chirp w_j, j < n
	bhat []complex128 // FFT of conj(w) placed at ±j, divided by M
	u    []complex128 // input, length n
}

func newBluePlan(n int) *bluePlan {
	m := NextFastLength(2*n - 1)
	bp := &bluePlan{n: n, c: newCPlan(m), w: make([]complex128, n), bhat: make([]complex128, m), u: make([]complex128, n)}
	for j := range bp.w {
		// j² mod 2n keeps the angle exact for long chirps.
		r := (int64(j) * int64(j)) % int64(2*n)
		s, c := math.Sincos(-math.Pi * float64(r) / float64(n))
		bp.w[j] = complex(c, s)
	}
	a := bp.c.a
	clear(a)
	a[0] = 1
	for j := 1; j < n; j++ {
		cw := complex(real(bp.w[j]), -imag(bp.w[j]))
		a[j], a[m-j] = cw, cw
	}
	copy(bp.bhat, bp.c.run())
	inv := complex(1/float64(m), 0)
	for k := range bp.bhat {
		bp.bhat[k] *= inv
	}
	return bp
}

// dft transforms bp.u and returns the first count bins of X (a slice of a
// work buffer, valid until the next call).
func (bp *bluePlan) dft(count int) []complex128 {
	m := bp.c.m
	a := bp.c.a[:m]
	for j, v := range bp.u {
		a[j] = v * bp.w[j]
	}
	clear(a[bp.n:])
	spec := bp.c.run()
	// Inverse FFT of spec·bhat as the conjugate of the forward FFT of its
	// conjugate; bhat already holds the 1/M.
	a = bp.c.a[:m]
	for k, v := range spec[:m] {
		p := v * bp.bhat[k]
		a[k] = complex(real(p), -imag(p))
	}
	conv := bp.c.run()[:count]
	for k, v := range conv {
		conv[k] = complex(real(v), -imag(v)) * bp.w[k]
	}
	return conv
}

// forward writes the one-sided spectrum of real x (bins 0 … n/2) into dst,
// scaled and optionally conjugated as halfPlan.forward.
func (bp *bluePlan) forward(dst []complex128, x []float64, scale float64, conj bool) {
	for j, v := range x {
		bp.u[j] = complex(v, 0)
	}
	sgn := 1.0
	if conj {
		sgn = -1
	}
	for k, v := range bp.dft(bp.n/2 + 1) {
		dst[k] = complex(scale*real(v), sgn*scale*imag(v))
	}
}

// inverse is halfPlan.inverse for any n: x_j = scale·Σ_k X_k e^{+2πi jk/n}
// over the two-sided spectrum, computed as the conjugate of the forward
// DFT of conj X.
func (bp *bluePlan) inverse(dst []float64, src []complex128, scale float64, conj bool) {
	n := bp.n
	sgn := -1.0 // conj X from X
	if conj {
		sgn = 1
	}
	for k, c := range src {
		bp.u[k] = complex(real(c), sgn*imag(c))
	}
	bp.u[0] = complex(real(src[0]), 0)
	if n%2 == 0 {
		bp.u[n/2] = complex(real(src[n/2]), 0)
	}
	for k := len(src); k < n; k++ {
		v := bp.u[n-k]
		bp.u[k] = complex(real(v), -imag(v))
	}
	for j, v := range bp.dft(n) {
		dst[j] = scale * real(v)
	}
}
