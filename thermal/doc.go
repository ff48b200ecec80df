// Package thermal estimates how far a pump heats the spot it hits, and how
// that heating sits against a phase transition of the sample.
//
// # The picture
//
// A pump pulse (THz, or optical) deposits energy in a thin layer of the
// sample in well under a nanosecond. Heat diffuses away much more slowly, so
// right after the pulse the energy is still where it was absorbed: the
// single-pulse heating is adiabatic and set by the heat capacity alone. A
// train of pulses at repetition rate f_rep also leaves a steady, time-averaged
// heating set by the average absorbed power and the thermal conductivity.
// The hottest the spot gets is the steady state plus one pulse.
//
// # Absorbed energy density
//
// The pump's incident on-axis fluence F (J/m^2) and the fraction A the sample
// absorbs give the absorbed fluence F_abs = F·A (an optical pump may give
// F_abs directly). Spread over depth:
//
//   - a film of thickness d, taken as uniform: u = F_abs/d;
//   - a bulk sample, Beer–Lambert: u(z) = F_abs α e^{-αz}, largest at the
//     surface, u(0) = F_abs α = F_abs/δ. For bulk, A = 1 - R: what enters is
//     all absorbed. α is the intensity absorption coefficient.
//
// # Heat capacity and the single pulse
//
// The temperature T1 after a pulse of energy density u that starts at T0
// solves the energy balance
//
//	∫_{T0}^{T1} C(T) dT = u,
//
// with C the volumetric heat capacity (J/(m^3 K)). Three models implement
// HeatCapacity, each with its enthalpy integral (in closed form, or by
// quadrature over intervals so short that a difference would cancel):
// Constant (T1 = T0 + u/C), Table (monotone cubic interpolation of data) and
// Debye (lattice heat capacity from the Debye temperature Θ and atom
// density n, 3 n kB at high temperature, ∝ T^3 at low temperature). Below Θ
// the heat capacity falls steeply, so a given pulse heats a cold sample far
// more than a warm one: this is why a constant C, fine at room temperature,
// badly underestimates heating in a cryostat. FinalTemperatureK solves the
// balance for any model.
//
// # The pulse train: steady state
//
// The average absorbed power P = W·A·f_rep (W the pulse energy) flows from a
// Gaussian spot of 1/e^2 radius w into the sample. On a half-space of
// conductivity κ its centre rises by ΔT = P/(2√π κ a) with a = w/√2
// (Lax, J. Appl. Phys. 48, 3919 (1977)); SteadyStateRiseK and LaxCentreRiseK
// derive it and state its assumptions.
//
// # The transition budget
//
// Near a continuous transition at Tc, relaxation slows as τ ∝ |t|^(-zν) with
// reduced temperature t = (T - Tc)/Tc (dynamic scaling, Hohenberg & Halperin,
// Rev. Mod. Phys. 49, 435 (1977)). Heating a sample that sits below Tc toward
// Tc both shrinks the margin and slows the dynamics one wants to measure.
// Estimate puts everything together: absorbed energy, steady state, single
// pulse from the steady state, margin to Tc, reduced temperatures,
// relaxation-time factors, and cautions (package caution) for crossing Tc,
// a small margin, large heating and optical damage.
//
// # Units and accuracy
//
// Everything is SI: K, J, m, W, Hz; fluence J/m^2, energy density J/m^3, heat
// capacity J/(m^3 K), conductivity W/(m K). Convert at the edges with package
// units (for example fluence in µJ/cm^2 times units.UJPerCm2).
//
// The Debye heat capacity and Debye function are accurate to about 1e-13
// relative, the enthalpies to about 1e-14, and the single-pulse solution
// satisfies the energy balance to 1e-13 of u (or to the float64 spacing of
// T1, for rises below about a millionth of T). The physics is far coarser
// than that: the models' own assumptions, stated with each function, set the
// real uncertainty.
//
// Errors are values: no function panics on bad input. Estimate reports every
// offending field at once in an *InputError.
package thermal
