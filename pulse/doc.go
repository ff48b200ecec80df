// Package pulse models terahertz waveforms, computes their spectra and
// metrics, and calibrates them to absolute field (physics.md §1–§3).
//
// # Units and conventions
//
// Internally every quantity is SI (V/m, s, Hz, J, m, J/m²); the trade's
// units (kV/cm, THz, uJ, uJ/cm²) appear only at the edges, through package
// units. Names carry their unit: stepS, fieldVPerM, energyJ.
//
// The Fourier convention is fixed once, in Transform: time dependence
// e^{-iωt}, so the forward transform is
//
//	E(ω) = ∫ E(t) e^{+iωt} dt,        discretised   E_k = dt·Σ_n E_n e^{+2πi kn/N},
//
// with the field's unit times seconds (V/m·s). In it a passive medium has
// n~ = n + iκ with κ >= 0, a damped oscillator responds as
// 1/(Ω² - ω² - iγω), and a pulse delayed by t0 has its spectrum multiplied
// by e^{+iωt0}. Only the one-sided half, bins k = 0 … N/2 at k/(N dt), is
// stored, since the input is real. Parseval then reads
// dt·Σ|E_n|² = (1/(N dt))·Σ_k |E_k|² over all N bins, the bins 1 … N/2-1
// counting twice in the one-sided half. The spectra that Analyze returns
// are referenced to t = 0 of the time axis (not to the first sample), so
// they compare directly with the closed forms of Model.ComplexSpectrum.
//
// # Waveforms
//
// A Model is an analytic pulse: the first derivative of a Gaussian
// (SingleCycle), the second derivative (CentralLobe) or a Gaussian envelope
// on a carrier (Carrier), each with its closed-form ∫E² dt and spectrum.
// Model.Sample turns it into a Trace: uniform samples, StartS + i·StepS,
// in V/m when Absolute and in arbitrary units otherwise. A measurement on
// non-uniform times becomes a Trace through Resample (median step, natural
// cubic spline).
//
// # Analysis
//
// Analyze prepares a trace as a lab would — baseline (pre-pulse mean or
// linear detrend), window (Hann, Tukey, Blackman), zero-padding — takes the
// spectrum and reports Metrics: peak field and its time and sign,
// peak-to-peak, spectral peak, centroid, FWHM and -20 dB band of |E(f)|²,
// dynamic range, DC area ratio, plane-wave fluence (1/Z0)∫E² dt, Nyquist
// frequency, resolution and how far the field has decayed at the window's
// edges. Time-domain metrics are taken before the window, spectral ones
// after it. Band edges are interpolated linearly between bins, so they are
// good to a fraction of ResolutionHz; pad to refine them.
//
// # Calibration
//
// CalibrateByEnergy scales a waveform of known shape to absolute field from
// the pulse energy and the Gaussian spot: F0 = 2W/(π wx wy) and
// E_peak = sqrt(Z0·F0/∫g² dt) for g normalised to max|g| = 1. With a
// FocusOption it also gives the on-axis waveform at a diffraction-limited
// broadband focus, where each frequency has its own spot, w(f) ∝ 1/f.
// CalibrateEO converts the balanced signal dI/I of electro-optic sampling
// in a <110> zinc-blende crystal (ZnTe, GaP or the caller's own constants)
// into the incident field through E = arcsin(dI/I)·λ/(2π n0³ r41 L t_THz)
// (Planken et al., JOSA B 18, 313 (2001)).
//
// # Errors and cautions
//
// Input that cannot be computed — NaN or Inf, too few samples (MinSamples),
// non-positive steps, energies or radii, unsorted times, |dI/I| >= 1 — is
// returned as an *InputError naming the offending field; nothing in the
// package panics on bad input (Transform's methods, which take lengths the
// caller controls, panic on a length mismatch, like gonum's). Input that
// can be computed but makes the result doubtful comes back as cautions
// (package caution) with a sentence and the numbers behind them: DCOffset,
// NotDecayed, LowDynamicRange, Undersampled, EOOverRotation,
// DetectorBandLimit, FieldBeyondTableTop and FieldImplausible. Every
// threshold is an exported constant with its source.
//
// # Accuracy and speed
//
// The transform agrees with numpy.fft and with the DFT's definition to
// about 1e-15 of the largest bin for every length, and costs O(N log N)
// for every length, primes included (see Transform). Analyze reuses
// transform plans and padding buffers through Acquire and Release, so a
// call allocates little beyond what it returns.
package pulse
