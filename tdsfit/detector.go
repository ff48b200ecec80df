package tdsfit

import (
	"math"
	"math/cmplx"
	"strings"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/units"
)

// Probe group indices and Faust–Henry coefficients of the detection
// crystals. Every value can be overridden in a Detector.
const (
	// ZnTeGroupIndex800nm is the group index of ZnTe for an 800 nm probe,
	// ≈ 3.13 (from memory; consistent with the velocity matching of ZnTe
	// near 800 nm that makes it the common detector crystal).
	ZnTeGroupIndex800nm = 3.13
	// GaPGroupIndex800nm is the group index of GaP for an 800 nm probe,
	// ≈ 3.56 (from memory).
	GaPGroupIndex800nm = 3.56
	// ZnTeFaustHenryC is the Faust–Henry coefficient of ZnTe, -0.07 (Gallot &
	// Grischkowsky, JOSA B 16, 1204 (1999), from memory). Opt in through
	// Detector.FaustHenryC; NewDetector keeps r41 constant.
	ZnTeFaustHenryC = -0.07
	// GaPFaustHenryC is the Faust–Henry coefficient of GaP, -0.53
	// (Leitenstorfer et al., Appl. Phys. Lett. 74, 1516 (1999), from memory).
	GaPFaustHenryC = -0.53
	// DefaultTrustFraction is the fraction of max|G| above which the
	// deconvolution is trusted when DeconvolveOptions.TrustFraction is 0:
	// there the correction amplifies noise at most tenfold relative to the
	// best-responding frequency (a choice).
	DefaultTrustFraction = 0.1
	// dcIndexHz is the frequency at which Response takes the crystal's index
	// for its zero-frequency limit: 1 MHz, at which a phonon model's ε
	// differs from its static value by (f/f_TO)² ~ 1e-13.
	dcIndexHz = 1e6
)

// Detector is an electro-optic sampling detector: a <110> zinc-blende
// crystal of thickness ThicknessM, probed by a short pulse travelling at
// the group index ProbeGroupIndex.
type Detector struct {
	Name string
	// Crystal gives the crystal's THz index ñ_THz(f); a dielectric model
	// (optics.Lookup("znte"), "gap") holds its phonon, which the response
	// must see.
	Crystal optics.Medium
	// ThicknessM is the crystal thickness L, m.
	ThicknessM float64
	// ProbeGroupIndex is the probe's group index n_g at its wavelength.
	ProbeGroupIndex float64
	// FaustHenryC, if not 0, makes r41 disperse as r41(ω) ∝ 1 + C·Ω²/(Ω² -
	// ω² - iγω) with Ω, γ of the crystal's first oscillator (Faust & Henry,
	// Phys. Rev. Lett. 17, 1265 (1966)), normalised to 1 at zero frequency;
	// the crystal must then be a dielectric model with an oscillator. 0
	// keeps r41 constant.
	FaustHenryC float64
}

// NewDetector builds the Detector of a pulse.EOSetup whose crystal is
// ZnTe or GaP (by name, case ignored): the catalogue's dielectric model
// (optics.Lookup "znte" or "gap"), the setup's thickness, and the probe
// group index groupIndex, or for 0 the 800 nm value of the crystal
// (ZnTeGroupIndex800nm, GaPGroupIndex800nm), which is then refused for a
// probe wavelength more than 2 % from 800 nm. r41 is kept constant.
func NewDetector(s pulse.EOSetup, groupIndex float64) (Detector, error) {
	if err := s.Validate(); err != nil {
		return Detector{}, &InputError{Field: "EOSetup", Reason: err.Error(), cause: err}
	}
	var mat string
	var ng float64
	switch strings.ToLower(s.Crystal.Name) {
	case "znte":
		mat, ng = "znte", ZnTeGroupIndex800nm
	case "gap":
		mat, ng = "gap", GaPGroupIndex800nm
	default:
		return Detector{}, inputErr("EOSetup.Crystal.Name", "%q has no dielectric model here: build the Detector yourself", s.Crystal.Name)
	}
	if groupIndex == 0 && math.Abs(s.ProbeWavelengthM/(800*units.Nm)-1) > 0.02 {
		return Detector{}, inputErr("groupIndex", "the default group index holds at 800 nm, not %g nm: give one", s.ProbeWavelengthM/units.Nm)
	}
	if groupIndex != 0 {
		ng = groupIndex
	}
	m, err := optics.Lookup(mat)
	if err != nil {
		return Detector{}, inputErr("EOSetup.Crystal.Name", "%v", err)
	}
	d := Detector{Name: s.Crystal.Name, Crystal: m, ThicknessM: s.ThicknessM, ProbeGroupIndex: ng}
	return d, d.Validate()
}

// Validate checks the detector: a crystal, a positive finite thickness of
// at most MaxThicknessM, a positive finite group index, and a finite
// Faust–Henry coefficient above -1 with a dielectric model behind it.
func (d Detector) Validate() error {
	switch {
	case d.Crystal == nil:
		return inputErr("Detector.Crystal", "no crystal medium")
	case !finite(d.ThicknessM) || d.ThicknessM <= 0 || d.ThicknessM > MaxThicknessM:
		return inputErr("Detector.ThicknessM", "%g m is not within (0, %g]", d.ThicknessM, MaxThicknessM)
	case !finite(d.ProbeGroupIndex) || d.ProbeGroupIndex <= 0:
		return inputErr("Detector.ProbeGroupIndex", "%g is not positive and finite", d.ProbeGroupIndex)
	case !finite(d.FaustHenryC) || d.FaustHenryC <= -1:
		return inputErr("Detector.FaustHenryC", "%g is not a finite coefficient above -1", d.FaustHenryC)
	}
	if d.FaustHenryC != 0 {
		if de, ok := optics.DielectricOf(d.Crystal); !ok || len(de.Oscillators) == 0 {
			return inputErr("Detector.FaustHenryC", "needs a crystal described by a dielectric model with an oscillator")
		}
	}
	return nil
}

// Response returns the detector's response function G(f): the
// electro-optic signal per unit incident field at frequency freqHz,
// relative to an ideal thin detector with constant r41,
//
//	G(f) = t_THz(f) · (1/L)∫_0^L exp(iΔk z) dz · R(f),
//	t_THz = 2/(1 + ñ_THz),   Δk = (ω/c)(ñ_THz - n_g),
//	(1/L)∫_0^L exp(iΔk z) dz = (e^{iΔkL} - 1)/(iΔkL),
//
// with ñ_THz(f) = sqrt(ε(f)) of the crystal and R(f) the Faust–Henry factor
// (1 + C·D(ω))/(1 + C), D(ω) = Ω²/(Ω² - ω² - iγω), or 1 for C = 0
// (Gallot & Grischkowsky, JOSA B 16, 1204 (1999); Leitenstorfer et al.,
// Appl. Phys. Lett. 74, 1516 (1999); both from memory). The THz field enters
// the crystal with t_THz and, at the probe's speed, the probe sees it
// shifted by the phase Δk·z at depth z: the probe integrates over L.
// Complex Δk carries the absorption of the THz wave. Echoes in the crystal
// are not included. For a lossless crystal the mismatch factor vanishes
// where ΔkL = 2π, at L = 2·l_c with the coherence length
// l_c = c/(2f|n_g - n_THz|) (CoherenceLengthM).
//
// At freqHz <= 0 it returns the zero-frequency limit 2/(1 + ñ_THz(0)),
// with the index taken at 1 MHz. For NaN or an invalid detector it returns
// NaN.
func (d Detector) Response(freqHz float64) complex128 {
	if d.Validate() != nil || math.IsNaN(freqHz) {
		return cmplx.NaN()
	}
	return d.response(freqHz, d.faustHenry())
}

type fhModel struct {
	c, omega, gamma float64
}

func (d Detector) faustHenry() fhModel {
	if d.FaustHenryC == 0 {
		return fhModel{}
	}
	de, _ := optics.DielectricOf(d.Crystal)
	o := de.Oscillators[0]
	return fhModel{c: d.FaustHenryC, omega: 2 * math.Pi * o.FreqHz, gamma: 2 * math.Pi * o.WidthHz}
}

func (d Detector) response(freqHz float64, fh fhModel) complex128 {
	if freqHz <= 0 {
		n := d.Crystal.Index(dcIndexHz)
		return 2 / (1 + n)
	}
	n := d.Crystal.Index(freqHz)
	omega := 2 * math.Pi * freqHz
	x := complex(omega*d.ThicknessM/units.SpeedOfLight, 0) * (n - complex(d.ProbeGroupIndex, 0)) // ΔkL
	g := 2 / (1 + n) * mismatch(x)
	if fh.c != 0 {
		l := complex(fh.omega*fh.omega, 0) / complex(fh.omega*fh.omega-omega*omega, -fh.gamma*omega)
		g *= (1 + complex(fh.c, 0)*l) / complex(1+fh.c, 0)
	}
	return g
}

// mismatch returns (e^{ix} - 1)/(ix), by its series 1 + ix/2 - x²/6 for
// |x| < 1e-4 (truncation error below |x|³/24 < 1e-13).
func mismatch(x complex128) complex128 {
	if cabs(x) < 1e-4 {
		return 1 + x*complex(0, 0.5) - x*x/6
	}
	ix := complex(0, 1) * x
	return (cmplx.Exp(ix) - 1) / ix
}

// CoherenceLengthM returns the coherence length l_c = c/(2f|n_g -
// n_THz(f)|) of the detector at freqHz, m, with n_THz = Re ñ_THz: the depth
// over which the probe and the THz wave slip by half a THz period. +Inf
// where they are velocity matched; NaN for an invalid detector or a
// non-positive frequency.
func (d Detector) CoherenceLengthM(freqHz float64) float64 {
	if d.Validate() != nil || !(freqHz > 0) {
		return math.NaN()
	}
	dn := math.Abs(d.ProbeGroupIndex - real(d.Crystal.Index(freqHz)))
	if dn == 0 {
		return math.Inf(1)
	}
	return units.SpeedOfLight / (2 * freqHz * dn)
}

// DeconvolveOptions says how Deconvolve corrects a trace.
type DeconvolveOptions struct {
	// PadToSamples zero-pads the trace to at least this many samples
	// (rounded up by pulse.NextFastLength) before the transform; 0 pads
	// nothing. Padding keeps the correction of one end of the trace from
	// wrapping around to the other.
	PadToSamples int
	// LambdaReg, if positive, is the regularisation λ of the Wiener-type
	// inverse; 0 estimates it from the trace (see Deconvolve).
	LambdaReg float64
	// TrustFraction is the fraction of max|G| that bounds the trusted band;
	// 0 selects DefaultTrustFraction.
	TrustFraction float64
	// CalibrationIndex, if positive, says that the trace was calibrated with
	// a flat response t_cal = 2/(1 + CalibrationIndex) (pulse.CalibrateEO
	// with Crystal.NTHz): the response divided out is then G/t_cal. 0 takes
	// the trace as G⊗E itself.
	CalibrationIndex float64
	// MarginDB is the margin above the trace's noise floor that marks where
	// its spectrum carries signal, for the DetectorBandLimit caution; 0
	// selects DefaultMarginDB.
	MarginDB float64
}

// Deconvolution is a trace corrected for the detector's response.
type Deconvolution struct {
	// Field is the corrected trace on the input's time grid (its first
	// len(input) samples after the inverse transform).
	Field pulse.Trace
	// FreqHz and Response are the transform's frequencies and the response
	// divided out (G, or G/t_cal) there.
	FreqHz   []float64
	Response []complex128
	// LambdaReg is the regularisation used; NoiseFloor the RMS |Y(f)| of the
	// trace's top pulse.TailFraction of bins.
	LambdaReg, NoiseFloor float64
	// TrustBand is the band, from the lowest positive frequency up, where
	// |G| >= TrustFraction·max|G|: there the correction is trustworthy, its
	// relative bias λ/(|G|² + λ) is at most λ/(TrustFraction²·max|G|² + λ)
	// and the noise is amplified at most by 1/TrustFraction relative to the
	// best frequency. Empty when |G| is already too small at the first bin.
	TrustBand Band
	// SignalBand is the band where the trace's spectrum exceeds its noise
	// floor by MarginDB (as in NewTransmission).
	SignalBand Band
	Cautions   []caution.Caution
}

// Deconvolve corrects a measured electro-optic trace for the detector's
// response: the measured spectrum is Y(f) = G(f)·E(f) + noise, and the
// estimate of the incident field is
//
//	E_est(f) = H(f)·Y(f),   H = G*/(|G|² + λ)
//
// the Wiener-type (Tikhonov) inverse (Wiener, Extrapolation, Interpolation,
// and Smoothing of Stationary Time Series (1949)) with a constant
// noise-to-signal ratio: H → 1/G where |G|² >> λ, and H → 0 where the
// detector does not respond, instead of amplifying noise without bound. By
// default λ = (F/|Y(f_p)|)²·|G(f_p)|², with F the noise floor and f_p the
// peak of |Y|: the noise-to-signal power ratio of the incident field at the
// peak. The zero-frequency bin is set to 0 (a radiated pulse has no DC part,
// and the trace's offset is no field).
//
// Bias. Without noise E_est = E·|G|²/(|G|² + λ): the relative error at each
// frequency is λ/(|G|² + λ), bounded in TrustBand as stated there.
//
// Cautions: caution.DetectorBandLimit when the trace's SignalBand reaches
// above the TrustBand (the field there cannot be recovered faithfully), and
// caution.MaterialExtrapolate when frequencies that are in both bands lie
// above the crystal's validity range. Errors are *InputError: an invalid trace or detector,
// negative or non-finite options.
func Deconvolve(tr pulse.Trace, d Detector, o DeconvolveOptions) (Deconvolution, error) {
	if err := tr.Validate(); err != nil {
		return Deconvolution{}, traceErr("Trace", err)
	}
	if err := d.Validate(); err != nil {
		return Deconvolution{}, err
	}
	switch {
	case o.PadToSamples < 0 || o.PadToSamples > pulse.MaxSamples:
		return Deconvolution{}, inputErr("DeconvolveOptions.PadToSamples", "%d is not within [0, %d]", o.PadToSamples, pulse.MaxSamples)
	case !finite(o.LambdaReg) || o.LambdaReg < 0:
		return Deconvolution{}, inputErr("DeconvolveOptions.LambdaReg", "%g is not non-negative and finite", o.LambdaReg)
	case !finite(o.TrustFraction) || o.TrustFraction < 0 || o.TrustFraction >= 1:
		return Deconvolution{}, inputErr("DeconvolveOptions.TrustFraction", "%g is not within [0, 1)", o.TrustFraction)
	case !finite(o.CalibrationIndex) || o.CalibrationIndex < 0:
		return Deconvolution{}, inputErr("DeconvolveOptions.CalibrationIndex", "%g is not non-negative and finite", o.CalibrationIndex)
	case !finite(o.MarginDB) || o.MarginDB < 0:
		return Deconvolution{}, inputErr("DeconvolveOptions.MarginDB", "%g is not non-negative and finite", o.MarginDB)
	}
	trust := o.TrustFraction
	if trust == 0 {
		trust = DefaultTrustFraction
	}
	margin := o.MarginDB
	if margin == 0 {
		margin = DefaultMarginDB
	}
	n := pulse.NextFastLength(max(tr.Len(), o.PadToSamples))
	if n > pulse.MaxSamples {
		return Deconvolution{}, inputErr("DeconvolveOptions.PadToSamples", "the transform length %d exceeds %d", n, pulse.MaxSamples)
	}
	t := pulse.Acquire(n)
	defer pulse.Release(t)
	buf := make([]float64, n)
	copy(buf, tr.Field)
	Y := t.Forward(nil, buf, tr.StepS)
	nb := len(Y)
	out := Deconvolution{FreqHz: make([]float64, nb), Response: make([]complex128, nb)}
	fh := d.faustHenry()
	tcal := complex(1, 0)
	if o.CalibrationIndex > 0 {
		tcal = complex(2/(1+o.CalibrationIndex), 0)
	}
	gmax := 0.0
	for k := range Y {
		f := t.FrequencyHz(k, tr.StepS)
		out.FreqHz[k] = f
		g := d.response(f, fh) / tcal
		if !finiteC(g) {
			return Deconvolution{}, inputErr("Detector.Crystal", "the crystal gives no finite response at %g Hz", f)
		}
		out.Response[k] = g
		if k > 0 {
			gmax = math.Max(gmax, cabs(g))
		}
	}
	out.NoiseFloor = noiseFloor(Y)
	kp := 1
	for k := 1; k < nb; k++ {
		if cabs(Y[k]) > cabs(Y[kp]) {
			kp = k
		}
	}
	lambda := o.LambdaReg
	if lambda == 0 {
		if yp := cabs(Y[kp]); yp > 0 {
			r := out.NoiseFloor / yp * cabs(out.Response[kp])
			lambda = r * r
		}
		// A trace without noise in its tail (synthetic) would give λ = 0 and
		// an unregularised inverse; keep λ at the round-off of |G|².
		lambda = math.Max(lambda, 1e-30*gmax*gmax)
	}
	out.LambdaReg = lambda
	X := make([]complex128, nb)
	for k := 1; k < nb; k++ {
		g := out.Response[k]
		X[k] = cmplx.Conj(g) * Y[k] / complex(real(g)*real(g)+imag(g)*imag(g)+lambda, 0)
	}
	field := t.Inverse(nil, X, tr.StepS)
	out.Field = pulse.Trace{StartS: tr.StartS, StepS: tr.StepS, Field: field[:tr.Len()], Absolute: tr.Absolute}
	stepHz := 1 / (float64(n) * tr.StepS)
	hi := 0
	for k := 1; k < nb && cabs(out.Response[k]) >= trust*gmax; k++ {
		hi = k
	}
	out.TrustBand = bandOf(1, hi, stepHz)
	level := out.NoiseFloor * math.Pow(10, margin/20)
	slo, shi := longestRun(1, nb-1, func(k int) bool { return cabs(Y[k]) > 0 && cabs(Y[k]) >= level })
	out.SignalBand = bandOf(slo, shi, stepHz)
	if out.SignalBand.Len() > 0 && out.SignalBand.Hi > out.TrustBand.Hi {
		out.Cautions = append(out.Cautions, caution.New(caution.DetectorBandLimit,
			"the trace carries signal above the band where the detector's response can be corrected: the field there is not recovered",
			caution.V("trust_band_high_thz", out.TrustBand.HiHz/units.THz), caution.V("signal_band_high_thz", out.SignalBand.HiHz/units.THz),
			caution.V("trust_fraction", trust)))
	}
	// The model of a catalogue crystal holds towards zero frequency (its
	// limit is the static permittivity); only the upper edge of the data
	// matters.
	useHi := min(out.TrustBand.Hi, out.SignalBand.Hi)
	if r, ok := d.Crystal.(optics.Ranged); ok && useHi >= 1 {
		if _, maxHz := r.ValidRangeHz(); float64(useHi)*stepHz > maxHz {
			out.Cautions = append(out.Cautions, caution.New(caution.MaterialExtrapolate,
				"the detector crystal's data end below the frequencies where the trace is corrected",
				caution.V("valid_max_thz", maxHz/units.THz), caution.V("corrected_high_thz", float64(useHi)*stepHz/units.THz)))
		}
	}
	return out, nil
}
