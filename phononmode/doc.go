// Package phononmode computes how hard a terahertz field drives one lattice
// vibration (a phonon mode) of a sample: its displacement in time, the peak
// ion displacement against the bond length, the energy left in the mode and
// the energy absorbed, how well the pulse's spectrum overlaps the mode, and
// the inverse, the field that reaches a chosen amplitude.
//
// # The model
//
// A mode is a damped Lorentz oscillator in its normal coordinate Q, the
// mass-weighted displacement pattern of one unit cell (SI unit m·√kg; the
// trade quotes Å·√amu, units.AngstromSqrtAmu). For a crystal with two atoms
// per cell Q = √μ·x, with x the displacement of one sublattice against the
// other and μ the reduced mass. In these coordinates the kinetic energy per
// cell is ½Q'², the potential ½W²Q² (+ a3·Q³/3 + a4·Q⁴/4), and the equation
// of motion is
//
//	Q″ + γ·Q' + W²·Q + a3·Q² + a4·Q³ = Z*·cosθ·E(t) + ½·ε0·V_cell·(∂ε/∂Q)·E(t)²
//
// (Landau & Lifshitz, Mechanics §§25–26, 28). The right-hand side is the
// generalised force per cell on Q, which is directly an acceleration
// because Q is mass-weighted:
//
//   - Z*·cosθ·E is the force on the cell's dipole Z*·Q (Z* in C/√kg, the
//     mode effective charge; θ the angle between the field's polarisation
//     and the dipole). Z* fixes the oscillator strength by the Born–Huang
//     relation Δε = Z*²/(ε0·V_cell·W²) (Born & Huang, Dynamical Theory of
//     Crystal Lattices (1954)); for a diatomic Z* = Z_B·e/√μ with Z_B the
//     Born charge.
//   - ½·ε0·V_cell·(∂ε/∂Q)·E² is the Raman-type (sum- and difference-
//     frequency) drive: the cell's field energy −½·ε0·V_cell·χ(Q)·E² depends
//     on Q through the electronic polarisability, and minus its derivative
//     is the force, in J/(m·√kg) = √kg·m/s² like Q″. It moves modes that
//     are not infrared active (impulsive stimulated Raman scattering; Yan,
//     Gamble & Nelson, J. Chem. Phys. 83, 5391 (1985), from memory).
//
// E(t) is the macroscopic field inside the sample (Field): the optics of
// the sample, including the screening by this very mode, are already in it,
// and nothing here screens it again.
//
// # Conventions
//
// Everything is SI; field names carry their unit (FreqHz, StepS, QMSqrtKg,
// ZStarCPerSqrtKg). Frequencies are given as ordinary frequencies f = ω/2π,
// also the linewidth γ/2π, which is exactly the full width at half maximum
// of ω·ε″(ω). The Fourier transform is the project's one,
// pulse.Transform: time dependence e^{−iωt}, E(ω) = ∫E(t)e^{+iωt}dt, so the
// oscillator responds as 1/(W² − ω² − iγω) and ε″ >= 0.
//
// # Two solutions of one equation
//
// A linear mode (no a3, a4, ∂ε/∂Q) is solved exactly in the frequency
// domain (Method Exact): Q(ω) = Z*·cosθ·E(ω)/(W² − ω² − iγω), transformed
// back. The transform is periodic, so the trace is zero-padded by 69/γ, the
// time in which the ring-down falls to 1e-15 of its amplitude, before its
// end can wrap onto its start. A mode so narrow that the padding would pass
// Options.MaxSamples is solved in the time domain instead (Auto), or, if
// Exact is forced, padded as far as allowed with a MODE_NOT_DECAYED
// caution giving the residual amplitude e^{−γT/2}.
//
// The full equation is integrated in time (Method TimeDomain) with the
// classical fourth-order Runge–Kutta method at a fixed sub-step chosen so
// that the integrator's phase error, Φ·(ωh)⁴/120 over Φ radians, stays below
// Options.TimeDomainTol (default 1e-7 of max|Q|), and in any case below a
// quarter of the sample step and 1/(40·f_mode). Between samples the field
// is the band-limited interpolant of the samples, the very function the
// exact solution responds to; with the nonlinear terms set to zero the two
// solutions therefore agree to the integrator's error (tested to 1e-6 of
// max|Q|). A field that does not vanish at the trace's edges makes both
// ring (Gibbs) alike.
//
// # Depth
//
// In a bulk sample the field decays into the depth as e^{iωñz/c}. With
// Options.Depth (probe depth d and the sample's index ñ(f)), the response
// is also averaged over the probe's weight e^{−z/d}/d: exactly for a linear
// mode, as Q(ω)/(1 − iωñd/c) (derived), and by Gauss–Laguerre quadrature
// over depth of time-domain solutions for a nonlinear one.
//
// # Outputs and cautions
//
// Result carries Q(t) at the surface (and its depth average) on the
// field's grid, max|Q| refined between samples, the ion displacement
// max|Q|/√M_eff and the Lindemann ratio to the bond length, the mode energy
// per cell when the pulse is over (PulseEndFraction of ∫E²dt) and in quanta
// ħW, the absorbed energy per cell and per m³, the field-to-mode overlap η
// and the field's relative spectral amplitude at the mode. Cautions
// (package caution) flag an undersampled mode (above 0.4 of Nyquist), a
// Lindemann ratio past 0.05 and 0.1, the nonlinear regime (more than 0.1
// quanta per cell, or a perturbative anharmonic shift larger than the
// linewidth), a mode outside the pulse's band (below −20 dB) and a ring-down
// that wraps around.
//
// # Sizing
//
// SizeLinear and SizeNonlinear invert a chain the caller composes (field
// scale → optics → Drive → a Quantity): exactly from one evaluation when
// the chain is homogeneous in the scale, by bracketing and Brent's method
// otherwise, with ErrUnreachable when the caller's maximum falls short.
//
// Errors are values: bad input is an *InputError (errors.Is ErrInvalidInput),
// too much work is ErrTooLarge, a solution that escapes every finite range is
// ErrDiverged; nothing panics on bad input. A Solver reuses its buffers, so
// repeated drives allocate nothing.
package phononmode
