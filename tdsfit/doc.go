// Package tdsfit turns terahertz time-domain traces into the optical
// constants of a sample and the mode a pump can drive: from a reference and
// a sample trace to the complex transmission, from the transmission of a
// slab to its complex refractive index n + iκ, from that to a fitted
// dielectric model (the phonon as a Lorentz oscillator, ready for packages
// optics and phononmode), and from the trace an electro-optic detector
// reports to the field that reached it.
//
// # Time-domain spectroscopy in four steps
//
// A THz time-domain spectrometer records the field of a single-cycle pulse
// twice on the same time grid: once without the sample (the reference) and
// once through it. In the e^{-iωt} convention of package pulse, where a
// delay t0 multiplies a spectrum by e^{+iωt0} and a passive medium has
// κ >= 0, the ratio of their spectra is the sample's transfer function
// relative to the same thickness of air,
//
//	T(ω) = E_sam(ω)/E_ref(ω) = t_as·t_sa·exp(i(ñ-1)ωd/c)·FP(ñ)
//
// for a slab of thickness d and index ñ at normal incidence, with the
// Fresnel transmissions t_as·t_sa = 4ñ/(1+ñ)² and the Fabry–Pérot term FP of
// the echoes that the time window holds (Duvillaret, Garet & Coutaz, IEEE
// J. Sel. Top. Quantum Electron. 2, 739 (1996)). A thick, weakly absorbing
// slab simply delays and attenuates the pulse: n ≈ 1 + cφ/(ωd) from the
// phase φ and κ ≈ (c/(ωd))·ln(4n/((1+n)²|T|)) from the amplitude.
//
//  1. NewTransmission computes T(f) and the usable band, where both
//     spectra stand above their noise floors by a margin; it unwraps the
//     phase from the band's low edge and removes the multiple of 2π that
//     its straight-line extrapolation to zero frequency leaves (a causal
//     passive sample has no phase at zero frequency).
//  2. ExtractSlab solves T_model(ñ) = T frequency by frequency with
//     Newton's method on the complex index, from the thick-slab estimate
//     and then by continuation along the band, with or without the echoes.
//     SheetConductance and ExtractSheet do the same for a thin conducting
//     film on a substrate with the Tinkham formula (Glover & Tinkham,
//     Phys. Rev. 108, 243 (1957)).
//  3. FitDielectric fits ε∞ + Lorentz oscillators (+ Drude) to ε = ñ² by
//     Levenberg–Marquardt and returns an optics.Dielectric with parameter
//     uncertainties s²(JᵀJ)⁻¹: the fitted oscillator is the mode.
//  4. Detector.Response is the electro-optic response G(f) of a <110>
//     ZnTe or GaP crystal (entrance transmission, velocity mismatch between
//     the THz wave and the probe, the crystal's phonon), and Deconvolve
//     divides it out of a measured trace with a regularised (Wiener-type)
//     inverse, reporting the band where the correction is trustworthy.
//
// # Noise and the band
//
// The noise floor of each spectrum is the RMS amplitude of its top tenth of
// bins, where a THz spectrum holds only noise (as pulse.Analyze takes it).
// For white noise the phase of T and ln|T| then scatter with the same
// standard deviation σ = sqrt((F_ref²/|E_ref|² + F_sam²/|E_sam|²)/2)
// (Transmission.SigmaLog), and the extracted n and κ each with σ/|dlnT/dñ|,
// about σ·c/(ωd) for a thick slab (Extraction.StdIndex): thin samples and
// low frequencies are noisy. ExtractOptions.MaxStdIndex trims the band to
// where the extraction meets an accuracy; FitExtraction weights ε by its
// noise, so that a reduced χ² near 1 says the model fits to within it. The
// first-order noise model holds when each bin is independent: no window and
// no zero padding for fits whose uncertainties matter.
//
// # Units and conventions
//
// Everything is SI (Hz, s, m, S); names carry their unit. Frequencies are
// cyclic (Hz); ω = 2πf. The spectra are those of package pulse, referenced
// to t = 0 of each trace, so the reference and the sample may start at
// different times. Widths of oscillators are γ/2π in Hz, as in package
// optics. Sheet conductances are in siemens; the film's σ follows from
// σd/d.
//
// # Errors and cautions
//
// Input that cannot be computed — mismatched steps or lengths, too short
// traces, NaN or Inf, a non-positive thickness, no usable band, a fit whose
// parameters the data do not determine — is an *InputError naming the
// offending field; ErrNoBand and ErrNotDetermined can be tested with
// errors.Is. Nothing panics on bad input. Input that can be computed but
// makes the result doubtful comes back as cautions (package caution):
// EchoInWindow (the window holds an echo that the model leaves out),
// ExtractionUnconverged, FitPoor, DetectorBandLimit, MaterialExtrapolate,
// and those of pulse.Analyze for either trace.
//
// # Accuracy
//
// The models are exact for plane waves at normal incidence on plane-parallel
// samples; the transfer function agrees with an independent numpy summation
// of the echoes and with package optics's transfer matrices to 1e-12. Round
// trips through package optics recover n and κ to 1e-3 within the band
// trimmed to a noise of 2e-4 (500 um of silicon, 20 um of ZnTe up to 1.5
// linewidths below its TO phonon), and the fit recovers the phonon's
// frequency, width and strength within 3σ of their stated uncertainties;
// the fit agrees with scipy's curve_fit to 1e-4 of the uncertainties. The
// Tinkham inversion recovers σd to 1e-4 where the formula itself holds that
// well, for films below a few tenths of a nanometre at THz frequencies; its
// own error grows as ωd/c (SheetConductance). The electro-optic response
// agrees with a numerical integration to 1e-9. The errors that matter are
// those of the inputs: the thickness (δn ≈ (n-1)δd/d), a thickness mismatch
// of the substrates, the echo model, and the material data behind the
// detector (from memory in part; see the catalogue and the constants).
package tdsfit
