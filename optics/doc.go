// Package optics computes how much of an incident terahertz field reaches a
// point inside a sample: through the windows, filters and attenuators of an
// optical train, across the sample's surface and layers, with every
// reflection the calculation is asked to keep. It also gives the fraction of
// the incident power that each layer absorbs, and what a caller needs to
// warn about echoes, extrapolated material data and reststrahlen bands.
//
// # Conventions
//
// Everything is SI (Hz, m, s, V/m); package units converts at the edges.
// Time dependence is e^{-iωt}, fixed project-wide by pulse.Transform, so a
// plane wave travelling in +z is e^{i(ñωz/c - ωt)} and a passive medium has
// a complex refractive index ñ = n + iκ with κ >= 0 and a relative
// permittivity ε = ñ² with Im ε >= 0. IndexFromEpsilon is the one
// conversion from ε to ñ (the κ >= 0 branch). The power absorption
// coefficient is α = 2ωκ/c (AbsorptionCoefficient). All media are linear,
// isotropic (give the index for the polarisation that is used, as the
// catalogue does for quartz and sapphire) and non-magnetic.
//
// # Media
//
// A Medium returns ñ at a frequency. The package provides a Constant index;
// a Tabulated one, linearly interpolated between measured points and never
// extrapolated (outside its data it holds the end value and reports its
// range through Ranged, so callers can say so); and a Dielectric model
//
//	ε(ω) = ε∞ + Σ_j Δε_j·Ω_j²/(Ω_j² - ω² - iγ_j·ω) - ω_p²/(ω² + iΓω)
//
// of Lorentz oscillators (infrared-active phonons) and free carriers
// (Drude), whose Oscillators slice is exported so that another package can
// drive "oscillator j of layer L" as the mode of interest. Catalogue and
// Lookup give an embedded, read-only table of common THz materials (window
// crystals and polymers, electro-optic crystals), each with its source and
// validity range.
//
// # Interfaces and stacks
//
// Interface gives the Fresnel coefficients of one boundary for s and p
// light at any angle, with complex Snell's law. For p, amplitudes are those
// of the whole electric field, with the reference directions chosen so that
// r_p = r_s at normal incidence; Born & Wolf's r_p is the negative of ours.
//
// A Stack is a multilayer between an ambient half-space (lossless) and an
// exit half-space (the substrate, or the bulk of a thick sample). A Solver
// computes it one frequency at a time with 2×2 characteristic matrices of
// the tangential fields (Born & Wolf, Principles of Optics, §1.6): the
// complex amplitudes r and t, the power fractions R, T and A, the
// absorptance of each layer, the forward and backward amplitudes in each
// layer, the field (tangential and normal components) at any depth and its
// average over a layer. Layers marked Incoherent (thick windows and
// substrates whose echoes fall after the time window) are crossed once: the
// stack is split at them into coherent runs, and only the first pass
// through each incoherent layer is kept. Stack.Echoes gives the delay of
// each layer's first echo so that the caller can check that assumption.
//
// # Optical train
//
// A Train lists the elements between the source and the sample (Slab
// windows and filters, a wire-grid Attenuator, a fixed FieldFactor, a Gap),
// then the sample Stack and a Target in it (a layer or the exit medium; the
// front surface, a depth, or the average over the layer; the tangential or
// normal field component). An Evaluator computes, for a caller-given
// frequency grid and into caller-given buffers, the complex transmission
// from the incident field (in air before the first element) to the target,
// and the fraction of the incident power absorbed in the target layer.
// Multiply an incident spectrum (pulse.Transform's convention) by it and
// transform back for the waveform at the target. Evaluate allocates
// nothing: build the Evaluator once and reuse it for each grid.
//
// At zero frequency the outputs are zero: a radiated pulse has no DC
// component, and optical constants have none either.
//
// # Screening by the sample
//
// The field inside a sample is never the bare incident field: at normal
// incidence on a bulk sample it is 2/(1+ñ(ω)) times it, computed here from
// the sample's own dielectric function. Near a strong infrared phonon ñ
// varies fast: as ω approaches Ω_TO, |ñ| grows without bound and the field
// inside collapses; between Ω_TO and Ω_LO (where Re ε = 0, the
// Lyddane–Sachs–Teller frequency) the sample reflects almost everything and
// the field decays within c/(ωκ) of the surface. ReststrahlenBands returns
// these bands, and Evaluator.Cautions raises caution.Reststrahlen for them.
//
// # Cautions and errors
//
// Input that cannot be computed (NaN, infinities, negative thicknesses,
// angles at or beyond grazing, κ < 0, an unknown material) is an error, an
// *InputError naming the offending field ("Sample.Layers[2].ThicknessM").
// Input that can be computed but makes the result doubtful is a caution:
// Evaluator.Cautions returns caution.MaterialExtrapolate,
// caution.EchoInWindow and caution.Reststrahlen with the numbers behind
// them. Nothing panics on bad input, and no NaN or infinity is returned.
//
// # Accuracy
//
// The calculation is exact for the model (plane waves, plane parallel
// interfaces, local linear media) up to floating-point round-off: energy
// is conserved to ~1e-15 per layer, checked in the tests to 1e-12 against
// R + T + A = 1, against the Joule heating integral ∫(ωε0·Im ε/2)|E|²dz, and
// against an independent numpy implementation. Opaque layers (e^{-k0κd}
// below the smallest float) are handled without overflow. The errors that
// matter are those of the model: the material data (many catalogue values
// are recalled from the literature and say so), the incoherent-layer
// approximation, and tabulated data interpolated linearly.
package optics
