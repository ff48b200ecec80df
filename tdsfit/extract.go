package tdsfit

import (
	"errors"
	"math"
	"slices"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/units"
)

// Conventions of the Newton iteration.
const (
	// DefaultMaxIterations bounds the Newton iterations per frequency when
	// ExtractOptions.MaxIterations is 0. Newton's method converges
	// quadratically near a simple root, so a good start needs fewer than ten.
	DefaultMaxIterations = 50
	// NewtonTolerance is the relative size |Δñ|/|ñ| of the last Newton step
	// below which the iteration has converged: about 1e6 times the float64
	// round-off, far below any measurement's noise.
	NewtonTolerance = 1e-10
	// MaxThicknessM bounds the slab thickness (1 m), so that ωd/c stays a
	// number whose phase is meaningful.
	MaxThicknessM = 1.0
)

// ErrNotConverged is returned by SolveIndex when the Newton iteration does
// not converge.
var ErrNotConverged = errors.New("Newton iteration did not converge")

// ExtractOptions describes the slab and how its optical constants are
// extracted.
type ExtractOptions struct {
	// ThicknessM is the slab's thickness d, m (positive, at most
	// MaxThicknessM). An error δd in it biases n by about (n-1)·δd/d.
	ThicknessM float64
	// Echoes selects the Fabry–Pérot term of the model (see Echoes): match
	// it to what the sample trace's window holds.
	Echoes Echoes
	// MaxStdIndex, if positive, keeps only frequencies where the one-sigma
	// noise of n and κ (Extraction.StdIndex) is at most this: the band
	// becomes the longest contiguous run of such frequencies. 0 keeps every
	// converged frequency of the transmission's band.
	MaxStdIndex float64
	// MaxIterations bounds the Newton iterations per frequency; 0 selects
	// DefaultMaxIterations.
	MaxIterations int
}

// Extraction is the complex refractive index of a slab, frequency by
// frequency, over a band.
type Extraction struct {
	// FreqHz holds the frequencies of Band, Index the extracted ñ = n + iκ
	// there, StdIndex the one-sigma noise of n and, equally, of κ (from the
	// spectra's noise floors, first order), Iterations the Newton
	// iterations each took.
	FreqHz     []float64
	Index      []complex128
	StdIndex   []float64
	Iterations []int
	// Band is the reported band, in the bins of the Transmission: the
	// longest contiguous run, inside the transmission's band, of frequencies
	// where the iteration converged and StdIndex meets MaxStdIndex.
	Band       Band
	ThicknessM float64
	Echoes     Echoes
	// Unconverged counts the frequencies of the transmission's band where
	// the iteration failed (caution.ExtractionUnconverged).
	Unconverged int
	// Cautions: caution.EchoInWindow when the sample trace's window holds
	// an echo that the model leaves out, caution.ExtractionUnconverged,
	// and those of the Transmission.
	Cautions []caution.Caution
}

// Epsilon returns the relative permittivity ε = ñ² at each frequency.
func (e Extraction) Epsilon() []complex128 {
	out := make([]complex128, len(e.Index))
	for i, n := range e.Index {
		out[i] = n * n
	}
	return out
}

// StdEpsilon returns the one-sigma noise of Re ε and, equally, of Im ε at
// each frequency: |dε/dñ|·σ = 2|ñ|·StdIndex (first order; the noise of ñ is
// circular, so that of ε is too).
func (e Extraction) StdEpsilon() []float64 {
	out := make([]float64, len(e.Index))
	for i, n := range e.Index {
		out[i] = 2 * cabs(n) * e.StdIndex[i]
	}
	return out
}

// AbsorptionPerM returns the power absorption coefficient α = 2ωκ/c, 1/m,
// at each frequency (optics.AbsorptionCoefficient).
func (e Extraction) AbsorptionPerM() []float64 {
	out := make([]float64, len(e.Index))
	for i, n := range e.Index {
		out[i] = optics.AbsorptionCoefficient(e.FreqHz[i], n)
	}
	return out
}

// ThickSlabIndex returns the thick-slab estimate of the index from the
// logarithm of a measured transmission, lnT = ln|T| + iφ with φ the
// unwrapped phase (see NewTransmission), at freqHz for thickness
// thicknessM:
//
//	n ≈ 1 + c·φ/(ωd),   κ ≈ (c/(ωd))·ln(4n/((1+n)²·|T|))
//
// which neglects the echoes and the imaginary part of the interface
// transmission (Duvillaret, Garet & Coutaz (1996), their starting point).
// n is kept at 0.1 or above so that the model stays defined, and κ at 0 or
// above: a start in the passive half-plane, where the Fabry–Pérot series
// converges.
func ThickSlabIndex(lnT complex128, freqHz, thicknessM float64) complex128 {
	k0d := 2 * math.Pi * freqHz * thicknessM / units.SpeedOfLight
	return thickSlab(lnT, k0d)
}

func thickSlab(lnT complex128, k0d float64) complex128 {
	n := math.Max(0.1, 1+imag(lnT)/k0d)
	kappa := math.Max(0, (math.Log(4*n/((1+n)*(1+n)))-real(lnT))/k0d)
	return complex(n, kappa)
}

// SolveIndex solves SlabTransmission(ñ) = T for the complex index ñ at one
// frequency, given lnT = ln|T| + iφ with the unwrapped phase φ. It starts
// from start, or from ThickSlabIndex when start is 0, and iterates Newton's
// method on F(ñ) = ln T_model(ñ) - lnT (Duvillaret, Garet & Coutaz, IEEE J.
// Sel. Top. Quantum Electron. 2, 739 (1996)).
//
// F is holomorphic in ñ, so the 2-D Newton step on (n, κ), whose 2×2
// Jacobian has the Cauchy–Riemann form [[a, -b], [b, a]] with
// a + ib = dF/dñ, is the complex division Δñ = -F/F'. A step that does not
// reduce |F| is halved (at most 40 times); the iteration has converged when
// |Δñ| <= NewtonTolerance·|ñ|. It returns the iterations used, and an error
// wrapping ErrNotConverged when maxIterations (0: DefaultMaxIterations) are
// not enough or no step reduces |F|.
func SolveIndex(lnT complex128, freqHz, thicknessM float64, echoes Echoes, start complex128, maxIterations int) (index complex128, iterations int, err error) {
	k0d := 2 * math.Pi * freqHz * thicknessM / units.SpeedOfLight
	switch {
	case !finiteC(lnT):
		return 0, 0, inputErr("lnT", "%v is not finite", lnT)
	case !finite(freqHz) || freqHz <= 0:
		return 0, 0, inputErr("freqHz", "%g is not positive and finite", freqHz)
	case !finite(thicknessM) || thicknessM <= 0 || thicknessM > MaxThicknessM:
		return 0, 0, inputErr("thicknessM", "%g is not within (0, %g] m", thicknessM, MaxThicknessM)
	case !finite(k0d) || k0d <= 0:
		return 0, 0, inputErr("freqHz", "ωd/c = %g is not positive and finite", k0d)
	case echoes < AllEchoes:
		return 0, 0, inputErr("echoes", "%d is not NoEchoes, AllEchoes or a number of echoes", echoes)
	case !finiteC(start) || real(start) < 0 || (real(start) == 0 && start != 0):
		return 0, 0, inputErr("start", "%v is not a usable starting index", start)
	case maxIterations < 0:
		return 0, 0, inputErr("maxIterations", "%d is negative", maxIterations)
	}
	if maxIterations == 0 {
		maxIterations = DefaultMaxIterations
	}
	if start == 0 {
		start = thickSlab(lnT, k0d)
	}
	n, _, it, ok := newton(lnT, k0d, echoes, start, maxIterations)
	if !ok {
		return n, it, wrapErr(ErrNotConverged, "lnT", "no index reproduces %v at %g Hz within %d iterations", lnT, freqHz, maxIterations)
	}
	return n, it, nil
}

// newton iterates from n and returns the root, dlnT/dñ there, the
// iterations and whether it converged.
func newton(z complex128, k0d float64, echoes Echoes, n complex128, maxIter int) (complex128, complex128, int, bool) {
	f, d := slabLog(n, k0d, echoes)
	f -= z
	if !finiteC(f) || !finiteC(d) {
		return n, d, 0, false
	}
	for it := 1; it <= maxIter; it++ {
		if d == 0 {
			return n, d, it, false
		}
		step := -f / d
		if !finiteC(step) {
			return n, d, it, false
		}
		if cabs(step) <= NewtonTolerance*cabs(n) {
			nn := n + step
			if fn, dn := slabLog(nn, k0d, echoes); real(nn) > 0 && finiteC(fn) && finiteC(dn) {
				return nn, dn, it, true
			}
			return n, d, it, true
		}
		af := cabs(f)
		accepted := false
		t := 1.0
		for range 40 {
			nn := n + complex(t, 0)*step
			if real(nn) > 0 && fpConverges(nn, k0d, echoes) {
				fn, dn := slabLog(nn, k0d, echoes)
				fn -= z
				if finiteC(fn) && finiteC(dn) && cabs(fn) < af {
					n, f, d = nn, fn, dn
					accepted = true
					break
				}
			}
			t /= 2
		}
		if !accepted {
			return n, d, it, false
		}
	}
	return n, d, maxIter, false
}

// fpConverges reports whether the echoes of a slab of index n decay,
// |r²e^{2iñωd/c}| < 1: where they grow the Fabry–Pérot sum diverges and its
// logarithm leaves the branch that the unwrapped phase follows. Always true
// without echoes.
func fpConverges(n complex128, k0d float64, echoes Echoes) bool {
	if echoes == NoEchoes {
		return true
	}
	r := cabs((n - 1) / (n + 1))
	return math.Log(r*r)-2*imag(n)*k0d < 0
}

// ExtractSlab extracts the complex index ñ(f) = n + iκ of a plane-parallel
// slab of known thickness in air at normal incidence from its measured
// transmission, frequency by frequency over tr.Band: at each frequency
// the Newton iteration of SolveIndex inverts the exact transfer function
// SlabTransmission (with the Fabry–Pérot term o.Echoes).
//
// Branches. The equation T_model(ñ) = T may have more than one root. For
// the first pass of a slab that delays the pulse by at least 0.1 rad, and
// for all echoes, the thick-slab estimate (ThickSlabIndex) lies in the
// basin of the physical root (tested over n = 1.1–6, d = 30 um–3 mm,
// f = 0.1–4 THz): with all echoes dlnT/dñ ≈ (iωd/c)·(1+x)/(1-x),
// x = r²e^{2iñωd/c}, never vanishes for |x| < 1 (derived), so roots stay
// apart. With m echoes the factor is Σ(2j+1)x^j/Σx^j, which for one echo
// vanishes at x = -1/3: a slab with r² > 1/3 (n > 3.7) has roots close
// together (the Fabry–Pérot term lets a change of n be traded for one of
// κ; Duvillaret, Garet & Coutaz (1996) discuss the ambiguity). The true
// ñ(f) is smooth in frequency, so the extraction follows one branch by
// continuation. It solves first the anchor, the frequency where the index
// is best determined (the smallest σ/f, σ = SigmaLog, since the thick-slab
// noise is σ·c/(ωd); the highest such frequency on a tie), from the
// thick-slab estimate, and then each neighbour, outwards, from the root
// next to it (with the thick-slab estimate as the fallback). With a finite
// number of echoes it starts the anchor from ten points spread over ±π/(2ωd/c)
// in n, with and without loss, follows each distinct root across the band,
// and keeps the branch with the smallest roughness Σ|ñ_{i+1} - 2ñ_i +
// ñ_{i-1}|: a wrong branch jumps or bends where the physical one is smooth.
//
// Noise. A small error δ(lnT) in the measured log-transmission moves the
// root by δñ = δ(lnT)/F'(ñ) (first order). The noise of ln|T| and of the
// phase are independent with the same variance σ² (Transmission.SigmaLog),
// so δ(lnT) is circular and n and κ each have the standard deviation
// StdIndex = σ/|F'(ñ)|. For a thick slab F' ≈ iωd/c, so σ_n ≈ σ·c/(ωd):
// thin samples and low frequencies are noisy. MaxStdIndex trims the band
// to where this noise is small enough.
//
// Errors are *InputError: a thickness that is not positive and at most
// MaxThicknessM, an unknown Echoes, a negative MaxStdIndex or
// MaxIterations, a Transmission whose slices or band do not fit together,
// and ErrNoBand when fewer than MinBandBins frequencies are left.
func ExtractSlab(tr Transmission, o ExtractOptions) (Extraction, error) {
	if err := o.validate(); err != nil {
		return Extraction{}, err
	}
	if err := tr.validate(); err != nil {
		return Extraction{}, err
	}
	maxIter := o.MaxIterations
	if maxIter == 0 {
		maxIter = DefaultMaxIterations
	}
	b := tr.Band
	m := b.Len()
	c := newChain(tr, o.ThicknessM, o.Echoes, maxIter)
	// The anchor is the frequency where the index is best determined:
	// where the thick-slab noise σ·c/(ωd) is smallest.
	anchor := 0
	for i := range m {
		k, ka := b.Lo+i, b.Lo+anchor
		if tr.T[k] != 0 && (tr.T[ka] == 0 || tr.SigmaLog[k]/tr.FreqHz[k] <= tr.SigmaLog[ka]/tr.FreqHz[ka]) {
			anchor = i
		}
	}
	starts := []complex128{c.thick(anchor)}
	if o.Echoes > 0 {
		// A finite number of echoes makes the roots ambiguous: try starts
		// spread over a fringe period in n, with and without loss, and keep
		// the smoothest branch.
		th := starts[0]
		step := math.Pi / (2 * c.k0d(anchor))
		for _, dn := range []float64{0, -0.5, 0.5, -1, 1} {
			for _, kappa := range []float64{imag(th), 0} {
				if dn != 0 || kappa != imag(th) {
					starts = append(starts, complex(math.Max(0.1, real(th)+dn*step), kappa))
				}
			}
		}
	}
	var best *chainResult
	var tried []complex128
	for _, st := range starts {
		r := c.solve(anchor, st)
		if !r.conv[anchor] {
			if best == nil {
				best = r
			}
			continue
		}
		if slices.ContainsFunc(tried, func(z complex128) bool { return cabs(z-r.idx[anchor]) <= 1e-9*cabs(z) }) {
			continue
		}
		tried = append(tried, r.idx[anchor])
		if best == nil || !best.conv[anchor] || r.roughness < best.roughness {
			best = r
		}
	}
	idx, std, iters, conv := best.idx, best.std, best.iters, best.conv
	unconverged, firstBad := 0, 0.0
	for i := range m {
		if !conv[i] {
			if unconverged == 0 {
				firstBad = tr.FreqHz[b.Lo+i]
			}
			unconverged++
		}
	}
	lo, hi := longestRun(0, m-1, func(i int) bool {
		return conv[i] && (o.MaxStdIndex == 0 || std[i] <= o.MaxStdIndex)
	})
	if hi-lo+1 < MinBandBins {
		return Extraction{}, wrapErr(ErrNoBand, "ExtractOptions", "fewer than %d contiguous frequencies converged with a noise of n and κ below %g (%d of %d did not converge)", MinBandBins, o.MaxStdIndex, unconverged, m)
	}
	out := Extraction{
		FreqHz:      slices.Clone(tr.FreqHz[b.Lo+lo : b.Lo+hi+1]),
		Index:       idx[lo : hi+1],
		StdIndex:    std[lo : hi+1],
		Iterations:  iters[lo : hi+1],
		Band:        bandOf(b.Lo+lo, b.Lo+hi, tr.StepHz),
		ThicknessM:  o.ThicknessM,
		Echoes:      o.Echoes,
		Unconverged: unconverged,
	}
	if unconverged > 0 {
		out.Cautions = append(out.Cautions, caution.New(caution.ExtractionUnconverged,
			"the index could not be extracted at some frequencies of the band: the model (thickness, echoes) may not match the sample, or the data are too noisy there",
			caution.V("unconverged_bins", float64(unconverged)), caution.V("band_bins", float64(m)),
			caution.V("first_unconverged_thz", firstBad/units.THz)))
	}
	if c, ok := echoCaution(tr, out); ok {
		out.Cautions = append(out.Cautions, c)
	}
	out.Cautions = append(out.Cautions, tr.Cautions...)
	return out, nil
}

// chain solves the band of a Transmission frequency by frequency.
type chain struct {
	tr      Transmission
	d       float64
	echoes  Echoes
	maxIter int
}

// chainResult is one branch: the roots, their noise, the iterations, which
// bins converged, and the roughness Σ|ñ_{i+1} - 2ñ_i + ñ_{i-1}| over
// consecutive converged bins.
type chainResult struct {
	idx       []complex128
	std       []float64
	iters     []int
	conv      []bool
	roughness float64
}

func newChain(tr Transmission, d float64, e Echoes, maxIter int) chain {
	return chain{tr: tr, d: d, echoes: e, maxIter: maxIter}
}

func (c chain) k0d(i int) float64 {
	return 2 * math.Pi * c.tr.FreqHz[c.tr.Band.Lo+i] * c.d / units.SpeedOfLight
}

func (c chain) lnT(i int) complex128 {
	k := c.tr.Band.Lo + i
	return complex(math.Log(cabs(c.tr.T[k])), c.tr.PhaseRad[k])
}

func (c chain) thick(i int) complex128 { return thickSlab(c.lnT(i), c.k0d(i)) }

// solve starts bin anchor from start and continues the branch to both
// ends of the band: each bin starts from its neighbour's root towards the
// anchor, with the thick-slab estimate as the fallback (and as the start
// after a bin that failed).
func (c chain) solve(anchor int, start complex128) *chainResult {
	m := c.tr.Band.Len()
	r := &chainResult{idx: make([]complex128, m), std: make([]float64, m), iters: make([]int, m), conv: make([]bool, m)}
	at := func(i int, first complex128) {
		if c.tr.T[c.tr.Band.Lo+i] == 0 {
			return
		}
		z, k0d := c.lnT(i), c.k0d(i)
		other := thickSlab(z, k0d)
		if first == 0 || first == other {
			first, other = other, 0
		}
		n, d, it, ok := newton(z, k0d, c.echoes, first, c.maxIter)
		if !ok && other != 0 {
			var it2 int
			n, d, it2, ok = newton(z, k0d, c.echoes, other, c.maxIter)
			it += it2
		}
		r.iters[i] = it
		if ok {
			r.idx[i], r.conv[i] = n, true
			r.std[i] = c.tr.SigmaLog[c.tr.Band.Lo+i] / cabs(d)
		}
	}
	at(anchor, start)
	for i := anchor + 1; i < m; i++ {
		at(i, r.prev(i-1))
	}
	for i := anchor - 1; i >= 0; i-- {
		at(i, r.prev(i+1))
	}
	for i := 1; i+1 < m; i++ {
		if r.conv[i-1] && r.conv[i] && r.conv[i+1] {
			r.roughness += cabs(r.idx[i+1] - 2*r.idx[i] + r.idx[i-1])
		}
	}
	return r
}

// prev is the root of bin j if it converged, else 0 (no start).
func (r *chainResult) prev(j int) complex128 {
	if r.conv[j] {
		return r.idx[j]
	}
	return 0
}

// echoCaution returns caution.EchoInWindow when the first echo that the
// model leaves out arrives before the end of the sample trace. Its delay
// after the main pulse is j·2n̄d/c, with n̄ the median of n over the band
// standing in for the group index (exact for a non-dispersive slab).
func echoCaution(tr Transmission, ex Extraction) (caution.Caution, bool) {
	if ex.Echoes == AllEchoes {
		return caution.Caution{}, false
	}
	ns := make([]float64, len(ex.Index))
	for i, n := range ex.Index {
		ns[i] = real(n)
	}
	slices.Sort(ns)
	nbar := ns[len(ns)/2]
	j := float64(ex.Echoes) + 1
	delay := j * 2 * nbar * ex.ThicknessM / units.SpeedOfLight
	after := tr.WindowEndS - tr.SamplePeakTimeS
	if !(delay < after) {
		return caution.Caution{}, false
	}
	return caution.New(caution.EchoInWindow,
		"the sample trace's window holds an echo of the slab that the extraction's model leaves out: choose more echoes, or cut the traces before it",
		caution.V("echo_number", j), caution.V("echo_delay_ps", delay/units.Ps),
		caution.V("window_after_pulse_ps", after/units.Ps)), true
}

func (o ExtractOptions) validate() error {
	switch {
	case !finite(o.ThicknessM) || o.ThicknessM <= 0 || o.ThicknessM > MaxThicknessM:
		return inputErr("ExtractOptions.ThicknessM", "%g m is not within (0, %g]", o.ThicknessM, MaxThicknessM)
	case o.Echoes < AllEchoes:
		return inputErr("ExtractOptions.Echoes", "%d is not NoEchoes, AllEchoes or a number of echoes", o.Echoes)
	case !finite(o.MaxStdIndex) || o.MaxStdIndex < 0:
		return inputErr("ExtractOptions.MaxStdIndex", "%g is not a non-negative finite limit", o.MaxStdIndex)
	case o.MaxIterations < 0:
		return inputErr("ExtractOptions.MaxIterations", "%d is negative", o.MaxIterations)
	}
	return nil
}

// validate checks that a Transmission (possibly built by hand) holds
// together: equal slice lengths, a band of at least MinBandBins inside the
// grid, finite values in the band, positive frequencies there.
func (tr Transmission) validate() error {
	nb := len(tr.T)
	if nb == 0 || len(tr.FreqHz) != nb || len(tr.PhaseRad) != nb || len(tr.SigmaLog) != nb {
		return inputErr("Transmission", "slices of unequal or zero length (T %d, FreqHz %d, PhaseRad %d, SigmaLog %d)", nb, len(tr.FreqHz), len(tr.PhaseRad), len(tr.SigmaLog))
	}
	b := tr.Band
	if b.Lo < 1 || b.Hi >= nb || b.Len() < MinBandBins {
		return wrapErr(ErrNoBand, "Transmission.Band", "bins [%d, %d] are not a band of at least %d bins within [1, %d]", b.Lo, b.Hi, MinBandBins, nb-1)
	}
	if !finite(tr.StepHz) || tr.StepHz <= 0 {
		return inputErr("Transmission.StepHz", "%g is not positive and finite", tr.StepHz)
	}
	for k := b.Lo; k <= b.Hi; k++ {
		if !finiteC(tr.T[k]) || !finite(tr.PhaseRad[k]) || !finite(tr.SigmaLog[k]) || tr.SigmaLog[k] < 0 || !finite(tr.FreqHz[k]) || tr.FreqHz[k] <= 0 {
			return inputErr("Transmission", "bin %d holds a non-finite value or a non-positive frequency", k)
		}
	}
	if !finite(tr.WindowEndS) || !finite(tr.SamplePeakTimeS) {
		return inputErr("Transmission.WindowEndS", "times are not finite")
	}
	return nil
}

// ExtractFromTraces is NewTransmission followed by ExtractSlab: the optical
// constants of a slab from a reference and a sample trace.
func ExtractFromTraces(ref, sam pulse.Trace, to TransmissionOptions, eo ExtractOptions) (Extraction, error) {
	if err := eo.validate(); err != nil {
		return Extraction{}, err
	}
	tr, err := NewTransmission(ref, sam, to)
	if err != nil {
		return Extraction{}, err
	}
	return ExtractSlab(tr, eo)
}
