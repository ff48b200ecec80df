package pulse

import (
	"math"
	"sync"
)

// This file holds the transform's paths (gonum's port of FFTPACK, used
// before, is accurate for factors 2, 3, 4 and 5 but several times slower,
// and for larger prime factors both slow, O(N·p), and less accurate):
//
//   - a complex FFT for lengths with no prime factor above 5: self-sorting
//     (Stockham) mixed radix 4/2/3/5 in the form of Swarztrauber's FFTPACK
//     cfftf (butterfly, then twiddle; Swarztrauber, "Vectorizing the FFTs",
//     in Parallel Computations (1982)), with every twiddle computed directly
//     and stored per pass, so that the passes only load them;
//   - the real FFT of an even length N as that complex FFT of length N/2
//     (even samples as real parts, odd ones as imaginary parts, then one
//     pass that separates the two, bins k and N/2-k together; Press et al.,
//     Numerical Recipes, 3rd ed., §12.3);
//   - an odd length with no prime factor above 5 as that complex FFT of the
//     full length, the imaginary parts zero (twice the work of the half-
//     length path, which needs an even length);
//   - any other length by Bluestein's chirp z-transform (Bluestein, IEEE
//     Trans. Audio Electroacoust. 18, 451 (1970)): the DFT as a convolution
//     with the chirp e^{-πi n²/N}, computed by complex FFTs of a 5-smooth
//     length >= 2N-1, so O(N log N) and accurate for prime lengths too.
//
// All sums here use the engineering sign e^{-2πi jk/N}; Transform converts
// to the convention of physics.md §1 by complex conjugation. The tests check
// every path against numpy.fft and against the DFT's definition.
//
// Speed. The 2-power part of a length is done in radix-4 passes (after one
// radix-2 pass when the power is odd). Each pass picks the loop order that
// keeps its inner loop long: along the twiddle index i while the blocks are
// long (early passes), along the block index k once they are short (late
// passes, where the twiddles of one i are hoisted out of the loop); the
// last pass, whose twiddles are all 1, multiplies by none. Slices are cut
// to the loop's length before it, so that the compiler drops the bounds
// checks of the long-block loops. The real transform reads its input in
// the first pass and writes its output in the last, without copies. The
// butterflies are small functions the compiler inlines. The tables of a
// length (twiddles, and the chirp of Bluestein's path) are immutable and
// shared between transforms through a cache that outlives garbage
// collections (tableFor), so a transform rebuilt after its pool was
// emptied costs a few allocations, not thousands of sines and cosines.
// (Radix-8 passes, fewer of them, measured slower here: eight streams in
// and eight out at a power-of-two stride share cache sets.)

// cplan is the immutable table of a complex FFT of length m (5-smooth):
// Σ_j a_j e^{-2πi jk/m}. Its buffers live with its user.
type cplan struct {
	m      int
	stages []stage
}

// stage is one pass of the mixed-radix FFT: radix p, l1 = product of the
// radices before it, ido = m/(l1·p), and the twiddles w^{iq} (q = 1 … p-1,
// i = 0 … ido-1, w = e^{-2πi/(ido·p)}) stored as tw[(q-1)·ido + i].
type stage struct {
	p, l1, ido int
	tw         []complex128
}

// shortBlocks is the block length ido below which a pass runs its inner
// loop along k (the blocks) rather than i (inside a block).
const shortBlocks = 8

// radices returns the factors of m in the order the passes use them (one
// 2 if the power of 2 is odd, then 4s, then 3s and 5s), or nil if m has
// another prime factor.
func radices(m int) []int {
	if m < 1 {
		return nil
	}
	var out []int
	e := 0
	for m%2 == 0 {
		m /= 2
		e++
	}
	if e%2 == 1 {
		out = append(out, 2)
	}
	for range e / 2 {
		out = append(out, 4)
	}
	for _, p := range [...]int{3, 5} {
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

// newCPlan returns the tables of a complex FFT of length m, or nil if m has
// a prime factor above 5.
func newCPlan(m int) *cplan {
	rs := radices(m)
	if rs == nil {
		return nil
	}
	cp := &cplan{m: m}
	l1 := 1
	for _, p := range rs {
		ido := m / (l1 * p)
		st := stage{p: p, l1: l1, ido: ido}
		if ido > 1 {
			st.tw = make([]complex128, (p-1)*ido)
			for q := 1; q < p; q++ {
				for i := range ido {
					// The angle is reduced to an exact integer fraction first so
					// that each twiddle is correctly rounded.
					s, c := math.Sincos(-2 * math.Pi * float64((i*q)%(ido*p)) / float64(ido*p))
					st.tw[(q-1)*ido+i] = complex(c, s)
				}
			}
		}
		cp.stages = append(cp.stages, st)
		l1 *= p
	}
	return cp
}

// run transforms a (len m) using b (len m) as the second buffer, overwriting
// both, and returns the slice that holds the result (a or b).
func (cp *cplan) run(a, b []complex128) []complex128 {
	return cp.passes(0, len(cp.stages), a[:cp.m], b[:cp.m])
}

// passes runs stages [first, last) on in, with out as the second buffer,
// and returns the slice that holds the result.
func (cp *cplan) passes(first, last int, in, out []complex128) []complex128 {
	for i := first; i < last; i++ {
		st := &cp.stages[i]
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

// runPacked transforms the complex sequence a_j = x[2j] + i·x[2j+1]
// (len(x) = 2m) and returns the slice of a or b that holds the result. A
// first pass of radix 2 or 4 over long blocks reads x itself, which saves
// the copy into a.
func (cp *cplan) runPacked(x []float64, a, b []complex128) []complex128 {
	a, b = a[:cp.m], b[:cp.m]
	x = x[:2*cp.m]
	if st := &cp.stages[0]; st.ido >= shortBlocks && (st.p == 2 || st.p == 4) {
		if st.p == 2 {
			pass2Packed(x, b, st)
		} else {
			pass4Packed(x, b, st)
		}
		return cp.passes(1, len(cp.stages), b, a)
	}
	for j := range a {
		p := x[2*j : 2*j+2 : 2*j+2]
		a[j] = complex(p[0], p[1])
	}
	return cp.run(a, b)
}

// runToReal transforms a (b the second buffer) and writes the result z as
// dst[2j] = scale·Re z_j, dst[2j+1] = -scale·Im z_j (len(dst) = 2m): the
// conjugate, scaled and unpacked. A last pass of radix 2 or 4 (its blocks
// have length 1) writes dst itself.
func (cp *cplan) runToReal(a, b []complex128, dst []float64, scale float64) {
	a, b = a[:cp.m], b[:cp.m]
	dst = dst[:2*cp.m]
	last := len(cp.stages) - 1
	if st := &cp.stages[last]; st.ido == 1 && (st.p == 2 || st.p == 4) {
		z := cp.passes(0, last, a, b)
		if st.p == 2 {
			pass2Unpack(z, dst, st, scale)
		} else {
			pass4Unpack(z, dst, st, scale)
		}
		return
	}
	z := cp.run(a, b)
	for j, c := range z {
		p := dst[2*j : 2*j+2 : 2*j+2]
		p[0] = scale * real(c)
		p[1] = -scale * imag(c)
	}
}

// pass2Packed and pass4Packed are the first pass (l1 = 1) of pass2 and
// pass4 over long blocks, reading complex element c as x[2c], x[2c+1].
func pass2Packed(x []float64, ch []complex128, st *stage) {
	ido := st.ido
	a0, a1 := x[:2*ido], x[2*ido:4*ido]
	a1 = a1[:len(a0)]
	o0, o1 := ch[:ido], ch[ido:2*ido]
	o1 = o1[:len(o0)]
	tw := st.tw[:len(o0)]
	for i := range o0 {
		p0, p1 := a0[2*i:2*i+2:2*i+2], a1[2*i:2*i+2:2*i+2]
		x0, x1 := complex(p0[0], p0[1]), complex(p1[0], p1[1])
		o0[i] = x0 + x1
		o1[i] = cmul(x0-x1, tw[i])
	}
}

func pass4Packed(x []float64, ch []complex128, st *stage) {
	ido := st.ido
	a0, a1, a2, a3 := x[:2*ido], x[2*ido:4*ido], x[4*ido:6*ido], x[6*ido:8*ido]
	a1, a2, a3 = a1[:len(a0)], a2[:len(a0)], a3[:len(a0)]
	o0, o1, o2, o3 := ch[:ido], ch[ido:2*ido], ch[2*ido:3*ido], ch[3*ido:4*ido]
	o1, o2, o3 = o1[:len(o0)], o2[:len(o0)], o3[:len(o0)]
	w1, w2, w3 := st.tw[:len(o0)], st.tw[ido:2*ido], st.tw[2*ido:3*ido]
	w2, w3 = w2[:len(o0)], w3[:len(o0)]
	for i := range o0 {
		p0, p1, p2, p3 := a0[2*i:2*i+2:2*i+2], a1[2*i:2*i+2:2*i+2], a2[2*i:2*i+2:2*i+2], a3[2*i:2*i+2:2*i+2]
		x0, x1 := complex(p0[0], p0[1]), complex(p1[0], p1[1])
		x2, x3 := complex(p2[0], p2[1]), complex(p3[0], p3[1])
		t0, t1 := x0+x2, x0-x2
		t2, t3 := x1+x3, mulNegI(x1-x3)
		o0[i] = t0 + t2
		o1[i] = cmul(t1+t3, w1[i])
		o2[i] = cmul(t0-t2, w2[i])
		o3[i] = cmul(t1-t3, w3[i])
	}
}

// pass2Unpack and pass4Unpack are the last pass (ido = 1) of pass2 and
// pass4, writing output element c conjugated and scaled as dst[2c],
// dst[2c+1].
func pass2Unpack(cc []complex128, dst []float64, st *stage, scale float64) {
	n := st.l1
	cc = cc[:2*n]
	d0, d1 := dst[:2*n], dst[2*n:4*n]
	d1 = d1[:len(d0)]
	for k := range n {
		x0, x1 := cc[2*k], cc[2*k+1]
		y0, y1 := x0+x1, x0-x1
		p0, p1 := d0[2*k:2*k+2:2*k+2], d1[2*k:2*k+2:2*k+2]
		p0[0], p0[1] = scale*real(y0), -scale*imag(y0)
		p1[0], p1[1] = scale*real(y1), -scale*imag(y1)
	}
}

func pass4Unpack(cc []complex128, dst []float64, st *stage, scale float64) {
	n := st.l1
	cc = cc[:4*n]
	d0, d1, d2, d3 := dst[:2*n], dst[2*n:4*n], dst[4*n:6*n], dst[6*n:8*n]
	d1, d2, d3 = d1[:len(d0)], d2[:len(d0)], d3[:len(d0)]
	for k := range n {
		x := cc[4*k : 4*k+4 : 4*k+4]
		y0, y1, y2, y3 := bf4(x[0], x[1], x[2], x[3])
		p0, p1, p2, p3 := d0[2*k:2*k+2:2*k+2], d1[2*k:2*k+2:2*k+2], d2[2*k:2*k+2:2*k+2], d3[2*k:2*k+2:2*k+2]
		p0[0], p0[1] = scale*real(y0), -scale*imag(y0)
		p1[0], p1[1] = scale*real(y1), -scale*imag(y1)
		p2[0], p2[1] = scale*real(y2), -scale*imag(y2)
		p3[0], p3[1] = scale*real(y3), -scale*imag(y3)
	}
}

// In each pass the input is read as cc[i + ido·(j + p·k)] and the output
// written as ch[i + ido·(k + l1·q)], for i < ido, j, q < p, k < l1: output
// block q is the contiguous ch[q·l1·ido : (q+1)·l1·ido].

// mulNegI returns -i·z.
func mulNegI(z complex128) complex128 { return complex(imag(z), -real(z)) }

// cmul is a·b written out (the compiler's complex product does the same
// four products and two sums).
func cmul(a, b complex128) complex128 {
	return complex(real(a)*real(b)-imag(a)*imag(b), real(a)*imag(b)+imag(a)*real(b))
}

func pass2(cc, ch []complex128, st *stage) {
	ido, l1 := st.ido, st.l1
	n := ido * l1
	o0, o1 := ch[:n], ch[n:2*n]
	o1 = o1[:len(o0)]
	if ido == 1 {
		cc = cc[:2*n]
		for k := range o0 {
			x0, x1 := cc[2*k], cc[2*k+1]
			o0[k] = x0 + x1
			o1[k] = x0 - x1
		}
		return
	}
	tw := st.tw[:ido]
	for k := range l1 {
		in := cc[2*ido*k : 2*ido*k+2*ido]
		a0, a1 := in[:ido], in[ido:2*ido]
		a1 = a1[:len(a0)]
		b0, b1 := o0[ido*k:ido*k+ido], o1[ido*k:ido*k+ido]
		b0, b1 = b0[:len(a0)], b1[:len(a0)]
		t := tw[:len(a0)]
		for i := range a0 {
			x0, x1 := a0[i], a1[i]
			b0[i] = x0 + x1
			b1[i] = cmul(x0-x1, t[i])
		}
	}
}

func pass4(cc, ch []complex128, st *stage) {
	ido, l1 := st.ido, st.l1
	n := ido * l1
	o0, o1, o2, o3 := ch[:n], ch[n:2*n], ch[2*n:3*n], ch[3*n:4*n]
	o1, o2, o3 = o1[:len(o0)], o2[:len(o0)], o3[:len(o0)]
	if ido == 1 {
		cc = cc[:4*n]
		for k := range o0 {
			x := cc[4*k : 4*k+4 : 4*k+4]
			o0[k], o1[k], o2[k], o3[k] = bf4(x[0], x[1], x[2], x[3])
		}
		return
	}
	tw1, tw2, tw3 := st.tw[:ido], st.tw[ido:2*ido], st.tw[2*ido:3*ido]
	if ido < shortBlocks {
		// Short blocks: i outer (its twiddles hoisted), k inner.
		for i := range ido {
			w1, w2, w3 := tw1[i], tw2[i], tw3[i]
			for k := range l1 {
				b := i + 4*ido*k
				x0, x1, x2, x3 := cc[b], cc[b+ido], cc[b+2*ido], cc[b+3*ido]
				t0, t1 := x0+x2, x0-x2
				t2, t3 := x1+x3, mulNegI(x1-x3)
				o := i + ido*k
				o0[o] = t0 + t2
				o1[o] = cmul(t1+t3, w1)
				o2[o] = cmul(t0-t2, w2)
				o3[o] = cmul(t1-t3, w3)
			}
		}
		return
	}
	for k := range l1 {
		in := cc[4*ido*k : 4*ido*k+4*ido]
		a0, a1, a2, a3 := in[:ido], in[ido:2*ido], in[2*ido:3*ido], in[3*ido:4*ido]
		a1, a2, a3 = a1[:len(a0)], a2[:len(a0)], a3[:len(a0)]
		b0, b1, b2, b3 := o0[ido*k:ido*k+ido], o1[ido*k:ido*k+ido], o2[ido*k:ido*k+ido], o3[ido*k:ido*k+ido]
		b0, b1, b2, b3 = b0[:len(a0)], b1[:len(a0)], b2[:len(a0)], b3[:len(a0)]
		w1, w2, w3 := tw1[:len(a0)], tw2[:len(a0)], tw3[:len(a0)]
		for i := range a0 {
			x0, x1, x2, x3 := a0[i], a1[i], a2[i], a3[i]
			t0, t1 := x0+x2, x0-x2
			t2, t3 := x1+x3, mulNegI(x1-x3)
			b0[i] = t0 + t2
			b1[i] = cmul(t1+t3, w1[i])
			b2[i] = cmul(t0-t2, w2[i])
			b3[i] = cmul(t1-t3, w3[i])
		}
	}
}

// bf4 is the radix-4 butterfly y_q = Σ_j x_j e^{-2πi jq/4}.
func bf4(x0, x1, x2, x3 complex128) (y0, y1, y2, y3 complex128) {
	t0, t1 := x0+x2, x0-x2
	t2, t3 := x1+x3, mulNegI(x1-x3)
	return t0 + t2, t1 + t3, t0 - t2, t1 - t3
}

// bf3 is the radix-3 butterfly y_q = Σ_j x_j e^{-2πi jq/3}.
func bf3(x0, x1, x2 complex128) (y0, y1, y2 complex128) {
	const s3 = 0.86602540378443864676 // sin(2π/3)
	s, d := x1+x2, x1-x2
	m := x0 - 0.5*s
	r := complex(s3*imag(d), -s3*real(d)) // -i·sin(2π/3)·(x1 - x2)
	return x0 + s, m + r, m - r
}

func pass3(cc, ch []complex128, st *stage) {
	ido, l1 := st.ido, st.l1
	n := ido * l1
	o0, o1, o2 := ch[:n], ch[n:2*n], ch[2*n:3*n]
	o1, o2 = o1[:len(o0)], o2[:len(o0)]
	if ido == 1 {
		cc = cc[:3*n]
		for k := range o0 {
			x := cc[3*k : 3*k+3 : 3*k+3]
			o0[k], o1[k], o2[k] = bf3(x[0], x[1], x[2])
		}
		return
	}
	tw1, tw2 := st.tw[:ido], st.tw[ido:2*ido]
	if ido < shortBlocks {
		for i := range ido {
			w1, w2 := tw1[i], tw2[i]
			for k := range l1 {
				b := i + 3*ido*k
				y0, y1, y2 := bf3(cc[b], cc[b+ido], cc[b+2*ido])
				o := i + ido*k
				o0[o] = y0
				o1[o] = cmul(y1, w1)
				o2[o] = cmul(y2, w2)
			}
		}
		return
	}
	for k := range l1 {
		in := cc[3*ido*k : 3*ido*k+3*ido]
		a0, a1, a2 := in[:ido], in[ido:2*ido], in[2*ido:3*ido]
		a1, a2 = a1[:len(a0)], a2[:len(a0)]
		b0, b1, b2 := o0[ido*k:ido*k+ido], o1[ido*k:ido*k+ido], o2[ido*k:ido*k+ido]
		b0, b1, b2 = b0[:len(a0)], b1[:len(a0)], b2[:len(a0)]
		w1, w2 := tw1[:len(a0)], tw2[:len(a0)]
		for i := range a0 {
			y0, y1, y2 := bf3(a0[i], a1[i], a2[i])
			b0[i] = y0
			b1[i] = cmul(y1, w1[i])
			b2[i] = cmul(y2, w2[i])
		}
	}
}

// The radix-5 butterfly y_q = Σ_j x_j e^{-2πi jq/5} is written out in each
// loop of pass5 around bf5m and bf5r (a function of five complex values
// is not inlined): with sa = x1+x4, da = x1-x4, sb = x2+x3, db = x2-x3,
// y0 = x0 + sa + sb, y1 = ma + ra, y2 = mb + rb, y3 = mb - rb, y4 = ma - ra.

// cos and sin of 2π/5 and 4π/5.
const (
	c51 = 0.30901699437494742410
	s51 = 0.95105651629515357212
	c52 = -0.80901699437494742410
	s52 = 0.58778525229247312917
)

// bf5m returns ma = x0 + c1·sa + c2·sb and mb = x0 + c2·sa + c1·sb.
func bf5m(x0, sa, sb complex128) (ma, mb complex128) {
	return x0 + complex(c51, 0)*sa + complex(c52, 0)*sb, x0 + complex(c52, 0)*sa + complex(c51, 0)*sb
}

// bf5r returns ra = -i·(s1·da + s2·db) and rb = -i·(s2·da - s1·db).
func bf5r(da, db complex128) (ra, rb complex128) {
	return mulNegI(s51*da + s52*db), mulNegI(s52*da - s51*db)
}

func pass5(cc, ch []complex128, st *stage) {
	ido, l1 := st.ido, st.l1
	n := ido * l1
	o0, o1, o2, o3, o4 := ch[:n], ch[n:2*n], ch[2*n:3*n], ch[3*n:4*n], ch[4*n:5*n]
	o1, o2, o3, o4 = o1[:len(o0)], o2[:len(o0)], o3[:len(o0)], o4[:len(o0)]
	if ido == 1 {
		cc = cc[:5*n]
		for k := range o0 {
			x := cc[5*k : 5*k+5 : 5*k+5]
			x0 := x[0]
			sa, da := x[1]+x[4], x[1]-x[4]
			sb, db := x[2]+x[3], x[2]-x[3]
			ma, mb := bf5m(x0, sa, sb)
			ra, rb := bf5r(da, db)
			o0[k], o1[k], o2[k], o3[k], o4[k] = x0+sa+sb, ma+ra, mb+rb, mb-rb, ma-ra
		}
		return
	}
	tw1, tw2, tw3, tw4 := st.tw[:ido], st.tw[ido:2*ido], st.tw[2*ido:3*ido], st.tw[3*ido:4*ido]
	if ido < shortBlocks {
		for i := range ido {
			w1, w2, w3, w4 := tw1[i], tw2[i], tw3[i], tw4[i]
			for k := range l1 {
				b := i + 5*ido*k
				x := cc[b : b+4*ido+1]
				x0 := x[0]
				sa, da := x[ido]+x[4*ido], x[ido]-x[4*ido]
				sb, db := x[2*ido]+x[3*ido], x[2*ido]-x[3*ido]
				ma, mb := bf5m(x0, sa, sb)
				ra, rb := bf5r(da, db)
				o := i + ido*k
				o0[o] = x0 + sa + sb
				o1[o] = cmul(ma+ra, w1)
				o2[o] = cmul(mb+rb, w2)
				o3[o] = cmul(mb-rb, w3)
				o4[o] = cmul(ma-ra, w4)
			}
		}
		return
	}
	for k := range l1 {
		in := cc[5*ido*k : 5*ido*k+5*ido]
		a0, a1, a2, a3, a4 := in[:ido], in[ido:2*ido], in[2*ido:3*ido], in[3*ido:4*ido], in[4*ido:5*ido]
		a1, a2, a3, a4 = a1[:len(a0)], a2[:len(a0)], a3[:len(a0)], a4[:len(a0)]
		lo, hi := ido*k, ido*k+ido
		b0, b1, b2, b3, b4 := o0[lo:hi], o1[lo:hi], o2[lo:hi], o3[lo:hi], o4[lo:hi]
		b0, b1, b2, b3, b4 = b0[:len(a0)], b1[:len(a0)], b2[:len(a0)], b3[:len(a0)], b4[:len(a0)]
		w1, w2, w3, w4 := tw1[:len(a0)], tw2[:len(a0)], tw3[:len(a0)], tw4[:len(a0)]
		for i := range a0 {
			x0 := a0[i]
			sa, da := a1[i]+a4[i], a1[i]-a4[i]
			sb, db := a2[i]+a3[i], a2[i]-a3[i]
			ma, mb := bf5m(x0, sa, sb)
			ra, rb := bf5r(da, db)
			b0[i] = x0 + sa + sb
			b1[i] = cmul(ma+ra, w1[i])
			b2[i] = cmul(mb+rb, w2[i])
			b3[i] = cmul(mb-rb, w3[i])
			b4[i] = cmul(ma-ra, w4[i])
		}
	}
}

// halfTables are the immutable tables of the real FFT of length n = 2m
// with m 5-smooth: the complex plan of length m and post[k] = e^{-2πi k/n},
// k = 0 … m/2.
type halfTables struct {
	c    *cplan
	post []complex128
}

func newHalfTables(n int) *halfTables {
	c := newCPlan(n / 2)
	if c == nil {
		return nil
	}
	ht := &halfTables{c: c, post: make([]complex128, n/4+1)}
	for k := range ht.post {
		s, c := math.Sincos(-2 * math.Pi * float64(k) / float64(n))
		ht.post[k] = complex(c, s)
	}
	return ht
}

// halfPlan is the real FFT of length n = 2m with m 5-smooth: shared tables
// and its own buffers.
type halfPlan struct {
	n, m int
	*halfTables
	a, b []complex128
}

// newHalfPlan returns a plan for real length n, or nil if this path does not
// serve n (odd, or n/2 not 5-smooth).
func newHalfPlan(n int) *halfPlan {
	if n < 2 || n%2 != 0 || radices(n/2) == nil {
		return nil
	}
	ht := tableFor(tableKey{kind: halfKind, n: n}, func() (any, int) {
		t := newHalfTables(n)
		return t, tableBytes(t.c) + 16*len(t.post)
	}).(*halfTables)
	m := n / 2
	return &halfPlan{n: n, m: m, halfTables: ht, a: make([]complex128, m), b: make([]complex128, m)}
}

// forward writes X_k = Σ_n x_n e^{-2πi kn/N}, k = 0 … m, scaled by scale
// and complex-conjugated when conj is set, into dst (len m+1).
func (hp *halfPlan) forward(dst []complex128, x []float64, scale float64, conj bool) {
	m := hp.m
	z := hp.c.runPacked(x, hp.a, hp.b)[:m]
	dst = dst[:m+1]
	sgn := 1.0
	if conj {
		sgn = -1
	}
	// Separate the transforms of the even (F) and odd (G) samples:
	// F_k = (Z_k + conj Z_{m-k})/2, G_k = (Z_k - conj Z_{m-k})/(2i), and
	// X_k = F_k + w_k·G_k with w_k = e^{-2πi k/N} (Numerical Recipes
	// §12.3). F and G are spectra of real sequences (F_{m-k} = conj F_k)
	// and w_{m-k} = -conj w_k, so X_{m-k} = conj(F_k - w_k·G_k): one pass
	// over k <= m/2 gives both halves.
	z0 := z[0]
	dst[0] = complex(scale*(real(z0)+imag(z0)), 0)
	dst[m] = complex(scale*(real(z0)-imag(z0)), 0)
	h := 0.5 * scale
	post := hp.post[:m/2+1]
	for k := 1; k <= m/2; k++ {
		zk, zr := z[k], z[m-k]
		// 2F = zk + conj zr, 2G = -i·(zk - conj zr).
		fr, fi := real(zk)+real(zr), imag(zk)-imag(zr)
		gr, gi := imag(zk)+imag(zr), real(zr)-real(zk)
		w := post[k]
		wr, wi := real(w)*gr-imag(w)*gi, real(w)*gi+imag(w)*gr // w·2G
		dst[k] = complex(h*(fr+wr), sgn*h*(fi+wi))
		if k != m-k {
			// conj(F - w·G), conjugated again when conj is set.
			dst[m-k] = complex(h*(fr-wr), -sgn*h*(fi-wi))
		}
	}
}

// inverse writes x_n = scale·Σ_k X_k e^{+2πi kn/N} over the full two-sided
// spectrum implied by the one-sided src (len m+1, X_{N-k} = conj X_k) into
// dst (len n). With conj set, src holds conj X_k instead. The imaginary
// parts of X_0 and X_m are ignored.
func (hp *halfPlan) inverse(dst []float64, src []complex128, scale float64, conj bool) {
	m := hp.m
	src = src[:m+1]
	sgn := 1.0
	if conj {
		sgn = -1
	}
	// F_k = (X_k + conj X_{m-k})/2, G_k = (X_k - conj X_{m-k})·e^{+2πi k/N}/2,
	// Z_k = F_k + i·G_k; then z = inverse DFT of Z, computed as the
	// conjugate of the forward DFT of conj Z. Pairs k, m-k share their
	// sums: F_{m-k} = conj F_k, G_{m-k} = conj G_k.
	a := hp.a[:m]
	x0, xm := real(src[0]), real(src[m])
	f, g := 0.5*(x0+xm), 0.5*(x0-xm)
	a[0] = complex(f, -g) // conj(F + iG) with F, G real
	post := hp.post[:m/2+1]
	for k := 1; k <= m/2; k++ {
		xk, xr := src[k], src[m-k]
		// X_k and X_{m-k} (undo the conjugation of the input).
		kr, ki := real(xk), sgn*imag(xk)
		rr, ri := real(xr), sgn*imag(xr)
		fr, fi := 0.5*(kr+rr), 0.5*(ki-ri) // F_k
		dr, di := 0.5*(kr-rr), 0.5*(ki+ri) // (X_k - conj X_{m-k})/2
		w := post[k]                       // e^{-2πi k/N}; G_k = d·conj(w)
		gr, gi := dr*real(w)+di*imag(w), di*real(w)-dr*imag(w)
		// conj Z_k = conj(F + iG) = (fr - gi) - i(fi + gr).
		a[k] = complex(fr-gi, -(fi + gr))
		if k != m-k {
			// Z_{m-k} = conj F_k + i·conj G_k = (fr + gi) + i(gr - fi);
			// stored conjugated.
			a[m-k] = complex(fr+gi, fi-gr)
		}
	}
	hp.c.runToReal(a, hp.b, dst, scale)
}

// oddPlan is the real FFT of an odd 5-smooth length n as a complex FFT of
// length n: shared tables and its own buffers.
type oddPlan struct {
	n    int
	c    *cplan
	a, b []complex128
}

func newOddPlan(n int) *oddPlan {
	if n%2 == 0 || radices(n) == nil {
		return nil
	}
	c := tableFor(tableKey{kind: fullKind, n: n}, func() (any, int) {
		c := newCPlan(n)
		return c, tableBytes(c)
	}).(*cplan)
	return &oddPlan{n: n, c: c, a: make([]complex128, n), b: make([]complex128, n)}
}

// forward is halfPlan.forward for odd n: bins 0 … (n-1)/2.
func (op *oddPlan) forward(dst []complex128, x []float64, scale float64, conj bool) {
	a := op.a[:op.n]
	x = x[:len(a)]
	for j, v := range x {
		a[j] = complex(v, 0)
	}
	z := op.c.run(a, op.b)
	sgn := scale
	if conj {
		sgn = -scale
	}
	dst = dst[:op.n/2+1]
	for k := range dst {
		dst[k] = complex(scale*real(z[k]), sgn*imag(z[k]))
	}
}

// inverse is halfPlan.inverse for odd n, as the conjugate of the forward
// DFT of conj X over the two-sided spectrum (X_{n-k} = conj X_k).
func (op *oddPlan) inverse(dst []float64, src []complex128, scale float64, conj bool) {
	n := op.n
	a := op.a[:n]
	sgn := -1.0 // conj X from X
	if conj {
		sgn = 1
	}
	a[0] = complex(real(src[0]), 0)
	for k := 1; k <= n/2; k++ {
		c := complex(real(src[k]), sgn*imag(src[k])) // conj X_k
		a[k], a[n-k] = c, complex(real(c), -imag(c))
	}
	z := op.c.run(a, op.b)
	dst = dst[:len(z)]
	for j, v := range z {
		dst[j] = scale * real(v)
	}
}

// blueTables are the immutable tables of Bluestein's algorithm for length
// n: with the chirp w_j = e^{-πi j²/n} and 2jk = j² + k² - (k-j)²,
//
//	X_k = Σ_j u_j e^{-2πi jk/n} = w_k · Σ_j (u_j w_j) · conj(w_{k-j}),
//
// a convolution, done cyclically at a 5-smooth length M >= 2n-1 where it
// equals the linear one.
type blueTables struct {
	c    *cplan       // length M
	w    []complex128 // chirp w_j, j < n
	bhat []complex128 // FFT of conj(w) placed at ±j, divided by M
}

func newBlueTables(n int) *blueTables {
	m := NextFastLength(2*n - 1)
	bt := &blueTables{c: newCPlan(m), w: make([]complex128, n), bhat: make([]complex128, m)}
	for j := range bt.w {
		// j² mod 2n keeps the angle exact for long chirps.
		r := (int64(j) * int64(j)) % int64(2*n)
		s, c := math.Sincos(-math.Pi * float64(r) / float64(n))
		bt.w[j] = complex(c, s)
	}
	a, b := make([]complex128, m), make([]complex128, m)
	a[0] = 1
	for j := 1; j < n; j++ {
		cw := complex(real(bt.w[j]), -imag(bt.w[j]))
		a[j], a[m-j] = cw, cw
	}
	copy(bt.bhat, bt.c.run(a, b))
	inv := complex(1/float64(m), 0)
	for k := range bt.bhat {
		bt.bhat[k] *= inv
	}
	return bt
}

// bluePlan computes the DFT of any length n by Bluestein's algorithm
// (blueTables), with its own buffers.
type bluePlan struct {
	n int
	*blueTables
	u    []complex128 // input, length n
	a, b []complex128 // length M
}

func newBluePlan(n int) *bluePlan {
	bt := tableFor(tableKey{kind: blueKind, n: n}, func() (any, int) {
		t := newBlueTables(n)
		return t, tableBytes(t.c) + 16*(len(t.w)+len(t.bhat))
	}).(*blueTables)
	m := bt.c.m
	return &bluePlan{n: n, blueTables: bt, u: make([]complex128, n), a: make([]complex128, m), b: make([]complex128, m)}
}

// dft transforms bp.u and returns the first count bins of X (a slice of a
// work buffer, valid until the next call).
func (bp *bluePlan) dft(count int) []complex128 {
	m := bp.c.m
	a := bp.a[:m]
	for j, v := range bp.u {
		a[j] = v * bp.w[j]
	}
	clear(a[bp.n:])
	spec := bp.c.run(a, bp.b)[:m]
	// Inverse FFT of spec·bhat as the conjugate of the forward FFT of its
	// conjugate; bhat already holds the 1/M. (spec may be a itself: each
	// element is read before it is written.)
	for k, v := range spec {
		p := v * bp.bhat[k]
		a[k] = complex(real(p), -imag(p))
	}
	conv := bp.c.run(a, bp.b)
	conv = conv[:count]
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

// The table cache. Tables are immutable once built, so one copy serves
// every transform of a length; the cache keeps the most recently built
// ones up to tableCacheBytes (the transforms themselves, with their
// buffers, are pooled in transform.go and may be dropped by any garbage
// collection; their tables are not).

type tableKind int

const (
	halfKind tableKind = iota
	fullKind
	blueKind
)

type tableKey struct {
	kind tableKind
	n    int
}

// tableCacheBytes bounds the memory the cache holds: the tables of a few
// transforms of 2^20 samples, or hundreds of the lengths a lab uses.
const tableCacheBytes = 64 << 20

var tables struct {
	sync.Mutex
	m     map[tableKey]tableEntry
	order []tableKey // oldest first
	bytes int
}

type tableEntry struct {
	v     any
	bytes int
}

// tableFor returns the cached tables of key, building them with build
// (which returns them and their size in bytes) when they are missing. Two
// goroutines may build the same tables at once; both results are correct
// and one is kept.
func tableFor(key tableKey, build func() (any, int)) any {
	tables.Lock()
	e, ok := tables.m[key]
	tables.Unlock()
	if ok {
		return e.v
	}
	v, size := build()
	tables.Lock()
	defer tables.Unlock()
	if e, ok := tables.m[key]; ok {
		return e.v
	}
	if tables.m == nil {
		tables.m = map[tableKey]tableEntry{}
	}
	for tables.bytes+size > tableCacheBytes && len(tables.order) > 0 {
		old := tables.order[0]
		tables.order = tables.order[1:]
		tables.bytes -= tables.m[old].bytes
		delete(tables.m, old)
	}
	tables.m[key] = tableEntry{v: v, bytes: size}
	tables.order = append(tables.order, key)
	tables.bytes += size
	return v
}

// tableBytes is the size of a complex plan's twiddles.
func tableBytes(c *cplan) int {
	s := 0
	for _, st := range c.stages {
		s += 16 * len(st.tw)
	}
	return s
}
