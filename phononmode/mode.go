package phononmode

import (
	"math"

	"thzdrive/units"
)

// Mode is one damped Lorentz oscillator in its mass-weighted normal
// coordinate Q (m·√kg), one per unit cell. Its equation of motion is
//
//	Q″ + γ·Q' + W²·Q + a3·Q² + a4·Q³ = Z*·cosθ·E(t) + ½·ε0·V_cell·(∂ε/∂Q)·E(t)²
//
// with W = 2π·FreqHz and γ = 2π·LinewidthHz. Because Q is mass-weighted
// (for a diatomic, Q = √μ·x with x the relative sublattice displacement and
// μ the reduced mass), the kinetic energy per cell is ½Q'² and a generalised
// force on Q, in J/(m·√kg) = √kg·m/s², is directly the acceleration Q″.
//
// The zero value is not a valid mode: FreqHz and CellVolumeM3 must be set.
// A mode with neither Z* nor ∂ε/∂Q is valid but not driven. Use FromOscillatorStrength when
// the mode comes from a fit to spectra (Δε, W, γ) rather than from first
// principles (Z*, V_cell, W, γ).
type Mode struct {
	// FreqHz is the transverse-optical frequency W/2π, Hz. Must be > 0.
	FreqHz float64
	// LinewidthHz is γ/2π, Hz, >= 0. γ is exactly the full width at half
	// maximum of ω·ε″(ω) (the real part of the mode's optical
	// conductivity), and of ε″(ω) itself when γ << W.
	LinewidthHz float64
	// ZStarCPerSqrtKg is the mode effective charge Z*, C/√kg: the dipole
	// per cell is Z*·Q. Z* = Z_B·e/√μ for a diatomic (DiatomicZStar).
	ZStarCPerSqrtKg float64
	// CellVolumeM3 is the volume of the unit cell the mode lives in, m³.
	// Must be > 0: it links Z* and the oscillator strength and turns
	// energy per cell into energy density.
	CellVolumeM3 float64

	// EffectiveMassKg, optional (0 = not given), is the mass M_eff that
	// turns the normal coordinate into an ion displacement u = Q/√M_eff.
	// For a diatomic (masses m1, m2, centre of mass at rest) the relative
	// displacement x of the sublattices has M_eff = μ, and ion 1 alone
	// moves by u1 = m2·x/(m1+m2), so M_eff = m1·(m1+m2)/m2 (derived). The
	// Lindemann rule of thumb concerns the displacement of an atom from its
	// site: the relative x overstates it by (m1+m2)/m2.
	EffectiveMassKg float64
	// BondLengthM, optional (0 = not given), is the interatomic distance
	// the displacement is compared with for the Lindemann ratio.
	BondLengthM float64

	// A3PerMSqrtKgS2 is a3, the coefficient of Q² in the equation of
	// motion, 1/(m·√kg·s²): the potential per cell carries a3·Q³/3.
	A3PerMSqrtKgS2 float64
	// A4PerM2KgS2 is a4, the coefficient of Q³ in the equation of motion,
	// 1/(m²·kg·s²): the potential per cell carries a4·Q⁴/4.
	A4PerM2KgS2 float64
	// DEpsDQPerMSqrtKg is the Raman-type coupling ∂ε/∂Q, 1/(m·√kg): the
	// component ê·(∂ε/∂Q)·ê of the Raman tensor already projected on the
	// field's polarisation ê (the angle PolarAngleRad does not act on it).
	DEpsDQPerMSqrtKg float64
	// PolarAngleRad is the angle θ between the field's polarisation and the
	// mode's dipole; the dipole drive and the absorption scale as cosθ and
	// cos²θ.
	PolarAngleRad float64
}

// Validate reports the first parameter that is not finite or is outside its
// domain, as an *InputError.
func (m Mode) Validate() error {
	switch {
	case !finite(m.FreqHz) || m.FreqHz <= 0:
		return inputErr("Mode.FreqHz", "%g: must be finite and > 0", m.FreqHz)
	case !finite(sq(2*math.Pi*m.FreqHz)) || sq(2*math.Pi*m.FreqHz) == 0:
		return inputErr("Mode.FreqHz", "%g: W² is not representable", m.FreqHz)
	case !finite(m.LinewidthHz) || m.LinewidthHz < 0:
		return inputErr("Mode.LinewidthHz", "%g: must be finite and >= 0", m.LinewidthHz)
	case !finite(sq(2 * math.Pi * m.LinewidthHz)):
		return inputErr("Mode.LinewidthHz", "%g: γ² is not representable", m.LinewidthHz)
	case !finite(m.ZStarCPerSqrtKg):
		return inputErr("Mode.ZStarCPerSqrtKg", "%g: must be finite", m.ZStarCPerSqrtKg)
	case !finite(m.CellVolumeM3) || m.CellVolumeM3 <= 0:
		return inputErr("Mode.CellVolumeM3", "%g: must be finite and > 0", m.CellVolumeM3)
	case !finite(m.EffectiveMassKg) || m.EffectiveMassKg < 0:
		return inputErr("Mode.EffectiveMassKg", "%g: must be finite and >= 0 (0 = not given)", m.EffectiveMassKg)
	case !finite(m.BondLengthM) || m.BondLengthM < 0:
		return inputErr("Mode.BondLengthM", "%g: must be finite and >= 0 (0 = not given)", m.BondLengthM)
	case !finite(m.A3PerMSqrtKgS2):
		return inputErr("Mode.A3PerMSqrtKgS2", "%g: must be finite", m.A3PerMSqrtKgS2)
	case !finite(m.A4PerM2KgS2):
		return inputErr("Mode.A4PerM2KgS2", "%g: must be finite", m.A4PerM2KgS2)
	case !finite(m.DEpsDQPerMSqrtKg):
		return inputErr("Mode.DEpsDQPerMSqrtKg", "%g: must be finite", m.DEpsDQPerMSqrtKg)
	case !finite(m.PolarAngleRad):
		return inputErr("Mode.PolarAngleRad", "%g: must be finite", m.PolarAngleRad)
	case !finite(m.OscillatorStrength()):
		return inputErr("Mode.ZStarCPerSqrtKg", "oscillator strength Z*²/(ε0·V·W²) is not representable")
	}
	return nil
}

// OmegaRadPerS is W = 2π·FreqHz.
func (m Mode) OmegaRadPerS() float64 { return units.AngularFrequency(m.FreqHz) }

// GammaRadPerS is the damping rate γ = 2π·LinewidthHz.
func (m Mode) GammaRadPerS() float64 { return units.AngularFrequency(m.LinewidthHz) }

// QuantumJ is one vibrational quantum ħW, J.
func (m Mode) QuantumJ() float64 { return units.ReducedPlanck * m.OmegaRadPerS() }

// Linear reports whether the equation of motion is linear in the field:
// no anharmonic terms and no E² drive.
func (m Mode) Linear() bool {
	return m.A3PerMSqrtKgS2 == 0 && m.A4PerM2KgS2 == 0 && m.DEpsDQPerMSqrtKg == 0
}

// OscillatorStrength is the mode's contribution Δε = ε(0) − ε(∞) to the
// static permittivity for a field along its dipole (Born & Huang, Dynamical
// Theory of Crystal Lattices (1954)):
//
//	Δε = Z*² / (ε0 · V_cell · W²).
func (m Mode) OscillatorStrength() float64 {
	w := m.OmegaRadPerS()
	return m.ZStarCPerSqrtKg * m.ZStarCPerSqrtKg / (units.VacuumPermittiv * m.CellVolumeM3 * w * w)
}

// OscillatorStrength returns Δε = Z*²/(ε0·V_cell·W²) (Born & Huang 1954)
// for an effective charge in C/√kg, a cell volume in m³ and a frequency
// W/2π in Hz.
func OscillatorStrength(zStarCPerSqrtKg, cellVolumeM3, freqHz float64) (float64, error) {
	m := Mode{FreqHz: freqHz, ZStarCPerSqrtKg: zStarCPerSqrtKg, CellVolumeM3: cellVolumeM3}
	if err := m.Validate(); err != nil {
		return 0, err
	}
	return m.OscillatorStrength(), nil
}

// ZStarFromOscillatorStrength inverts the Born–Huang relation:
// Z* = W·√(ε0·V_cell·Δε), C/√kg, taken positive (the sign of Z* is a
// convention for the direction of Q). dEps must be >= 0.
func ZStarFromOscillatorStrength(dEps, cellVolumeM3, freqHz float64) (float64, error) {
	switch {
	case !finite(dEps) || dEps < 0:
		return 0, inputErr("dEps", "%g: must be finite and >= 0", dEps)
	case !finite(cellVolumeM3) || cellVolumeM3 <= 0:
		return 0, inputErr("cellVolumeM3", "%g: must be finite and > 0", cellVolumeM3)
	case !finite(freqHz) || freqHz <= 0:
		return 0, inputErr("freqHz", "%g: must be finite and > 0", freqHz)
	}
	z := units.AngularFrequency(freqHz) * math.Sqrt(units.VacuumPermittiv*cellVolumeM3*dEps)
	if !finite(z) {
		return 0, inputErr("dEps", "Z* = W·√(ε0·V·Δε) is not representable")
	}
	return z, nil
}

// FromOscillatorStrength builds a mode from a fit to spectra: oscillator
// strength Δε (dimensionless), frequency W/2π and linewidth γ/2π in Hz, and
// the cell volume in m³, with Z* from ZStarFromOscillatorStrength. The
// optional fields (mass, bond length, anharmonicity, angle) are left zero.
func FromOscillatorStrength(dEps, freqHz, linewidthHz, cellVolumeM3 float64) (Mode, error) {
	z, err := ZStarFromOscillatorStrength(dEps, cellVolumeM3, freqHz)
	if err != nil {
		return Mode{}, err
	}
	m := Mode{FreqHz: freqHz, LinewidthHz: linewidthHz, ZStarCPerSqrtKg: z, CellVolumeM3: cellVolumeM3}
	return m, m.Validate()
}

// DiatomicZStar is the mode effective charge of a diatomic crystal's optical
// mode, Z* = Z_B·e/√μ in C/√kg, from the Born (transverse) charge Z_B in units
// of e and the reduced mass μ in kg; the normal coordinate is Q = √μ·x with x
// the relative displacement of the two sublattices (Born & Huang 1954).
func DiatomicZStar(bornChargeE, reducedMassKg float64) (float64, error) {
	switch {
	case !finite(bornChargeE):
		return 0, inputErr("bornChargeE", "%g: must be finite", bornChargeE)
	case !finite(reducedMassKg) || reducedMassKg <= 0:
		return 0, inputErr("reducedMassKg", "%g: must be finite and > 0", reducedMassKg)
	}
	return bornChargeE * units.ElementaryCharge / math.Sqrt(reducedMassKg), nil
}

// DiatomicBornCharge inverts DiatomicZStar: Z_B = Z*·√μ/e, in units of e.
func DiatomicBornCharge(zStarCPerSqrtKg, reducedMassKg float64) (float64, error) {
	switch {
	case !finite(zStarCPerSqrtKg):
		return 0, inputErr("zStarCPerSqrtKg", "%g: must be finite", zStarCPerSqrtKg)
	case !finite(reducedMassKg) || reducedMassKg <= 0:
		return 0, inputErr("reducedMassKg", "%g: must be finite and > 0", reducedMassKg)
	}
	return zStarCPerSqrtKg * math.Sqrt(reducedMassKg) / units.ElementaryCharge, nil
}

// DielectricTerm is the mode's Lorentz term in the permittivity seen by a
// field polarised at PolarAngleRad to the dipole, at frequency f = ω/2π:
//
//	Δε·cos²θ · W² / (W² − ω² − iγω)
//
// in the convention of time dependence e^{-iωt}, so that its imaginary part
// ε″ is >= 0 for ω > 0 (a passive medium). It is the term the optics
// package's Lorentz model carries for this oscillator.
func (m Mode) DielectricTerm(freqHz float64) complex128 {
	w0 := m.OmegaRadPerS()
	c := math.Cos(m.PolarAngleRad)
	return complex(m.OscillatorStrength()*c*c*w0*w0, 0) * m.denomInv(units.AngularFrequency(freqHz))
}

// ResponseMSqrtKgPerVPerM is the linear response Q(ω)/E(ω) of the normal
// coordinate to the field inside the sample, m·√kg per V/m:
//
//	Z*·cosθ / (W² − ω² − iγω)
//
// (the damped, driven oscillator; Landau & Lifshitz, Mechanics §26).
func (m Mode) ResponseMSqrtKgPerVPerM(freqHz float64) complex128 {
	return complex(m.ZStarCPerSqrtKg*math.Cos(m.PolarAngleRad), 0) * m.denomInv(units.AngularFrequency(freqHz))
}

// StaticQMSqrtKg is the displacement of the normal coordinate under a static
// field inside the sample, Z*·cosθ·E/W², m·√kg (harmonic mode). For a
// diatomic, dividing by √μ gives the sublattice displacement
// x = Z_B·e·E/(μ·W²).
func (m Mode) StaticQMSqrtKg(fieldVPerM float64) float64 {
	w := m.OmegaRadPerS()
	return m.ZStarCPerSqrtKg * math.Cos(m.PolarAngleRad) * fieldVPerM / (w * w)
}

// AnharmonicShiftHz estimates the shift of the oscillation frequency, in Hz,
// when the mode oscillates with amplitude amplitudeMSqrtKg, from second-order
// perturbation theory (Landau & Lifshitz, Mechanics §28, eq. 28.13, with
// their α = a3 and β = a4):
//
//	Δω = (3·a4/(8W) − 5·a3²/(12·W³)) · A²,    Δf = Δω/2π.
//
// The estimate is the leading term in the small quantities a3·A/W² and
// a4·A²/W²; a quartic term (a4 > 0) stiffens the mode, a cubic one softens it
// whatever its sign.
func (m Mode) AnharmonicShiftHz(amplitudeMSqrtKg float64) float64 {
	w := m.OmegaRadPerS()
	a2 := amplitudeMSqrtKg * amplitudeMSqrtKg
	dw := (3*m.A4PerM2KgS2/(8*w) - 5*m.A3PerMSqrtKgS2*m.A3PerMSqrtKgS2/(12*w*w*w)) * a2
	return dw / (2 * math.Pi)
}

// denomInv is 1/(W² − ω² − iγω).
func (m Mode) denomInv(omega float64) complex128 {
	w0 := m.OmegaRadPerS()
	return 1 / complex(w0*w0-omega*omega, -m.GammaRadPerS()*omega)
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func sq(x float64) float64 { return x * x }
