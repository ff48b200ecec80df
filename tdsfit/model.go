package tdsfit

import (
	"math"
	"math/cmplx"

	"thzdrive/units"
)

// Echoes says which internal reflections of a slab the transfer function
// keeps: the Fabry–Pérot term of Duvillaret, Garet & Coutaz (IEEE J. Sel.
// Top. Quantum Electron. 2, 739 (1996)).
type Echoes int

const (
	// NoEchoes keeps the first pass only, FP = 1: the echoes fall after the
	// end of the time window (or were windowed out of both traces).
	NoEchoes Echoes = 0
	// AllEchoes keeps every echo, the Fabry–Pérot sum
	// FP = 1/(1 - r²e^{2iñωd/c}): the window holds the echoes until they
	// have died away.
	AllEchoes Echoes = -1
)

// A positive Echoes value m keeps the main pulse and its first m echoes,
// FP = Σ_{j=0}^{m} (r²e^{2iñωd/c})^j, for a window that ends between the
// m-th and the (m+1)-th echo.

// SlabTransmission returns the transfer function, relative to the same
// thickness of air, of a plane-parallel slab of complex index ñ and
// thickness thicknessM in air at normal incidence, at freqHz:
//
//	T(ñ) = t_as·t_sa·exp(i(ñ-1)ωd/c)·FP(ñ),
//	t_as·t_sa = 4ñ/(1+ñ)²,   r = (ñ-1)/(ñ+1),   FP as selected by echoes
//
// (Duvillaret, Garet & Coutaz, IEEE J. Sel. Top. Quantum Electron. 2, 739
// (1996), in the e^{-iωt} convention of package pulse, where a passive slab
// has κ >= 0). It is what a time-domain spectrometer measures as
// E_sample(ω)/E_reference(ω), and the model that ExtractSlab inverts. It
// returns NaN for an index with Re ñ <= 0 or non-finite arguments.
func SlabTransmission(index complex128, freqHz, thicknessM float64, echoes Echoes) complex128 {
	k0d := 2 * math.Pi * freqHz * thicknessM / units.SpeedOfLight
	if !finiteC(index) || real(index) <= 0 || !finite(k0d) || echoes < AllEchoes {
		return cmplx.NaN()
	}
	lnT, _ := slabLog(index, k0d, echoes)
	return cmplx.Exp(lnT)
}

// slabLog returns ln T(ñ) and its derivative d lnT/dñ for k0d = ωd/c. Every
// logarithm is principal and continuous along a passive path: ln ñ and
// ln(1+ñ) for Re ñ > 0, and the Fabry–Pérot term as ln(1-x^{m+1}) - ln(1-x)
// with |x| = |r|²e^{-2κk0d} < 1, so that the phase of T is the sum of
// (n-1)k0d and small, continuous corrections and matches a phase unwrapped
// from zero frequency.
//
//	d lnT/dñ = 1/ñ - 2/(1+ñ) + i·k0d + d lnFP/dñ,
//	dx/dñ    = e^{2iñk0d}·(4(ñ-1)/(ñ+1)³ + 2i·k0d·r²)   (derived)
func slabLog(n complex128, k0d float64, echoes Echoes) (lnT, dlnT complex128) {
	lnT = complex(math.Ln2*2, 0) + cmplx.Log(n) - 2*cmplx.Log(1+n) + complex(0, k0d)*(n-1)
	dlnT = 1/n - 2/(1+n) + complex(0, k0d)
	if echoes == NoEchoes {
		return lnT, dlnT
	}
	r := (n - 1) / (n + 1)
	e := cmplx.Exp(complex(0, 2*k0d) * n)
	x := r * r * e
	dx := e * (4*(n-1)/((n+1)*(n+1)*(n+1)) + complex(0, 2*k0d)*r*r)
	lnT -= cmplx.Log(1 - x)
	dlnT += dx / (1 - x)
	if echoes > 0 {
		m := complex(float64(echoes), 0)
		xm := cmplx.Pow(x, m) // x^m
		xm1 := xm * x         // x^{m+1}
		lnT += cmplx.Log(1 - xm1)
		dlnT -= (m + 1) * xm * dx / (1 - xm1)
	}
	return lnT, dlnT
}
