package optics

import (
	"fmt"
	"math"
	"sort"
)

// Oscillator is one Lorentz term of a dielectric model, an infrared-active
// (polar) phonon or any other damped resonance:
//
//	Δε·Ω²/(Ω² - ω² - iγω),   Ω = 2π·FreqHz,  γ = 2π·WidthHz.
//
// FreqHz is the transverse-optical (TO) resonance frequency. WidthHz is the
// damping rate expressed as a frequency, γ/2π; for γ << Ω it is the full
// width at half maximum of the peak of Im ε(f) (and of the mode's power
// spectrum) in Hz. DeltaEps is the oscillator strength, the step the term
// adds to the static permittivity: ε(0) - ε(∞) for a single mode. In the
// e^{-iωt} convention the term has Im ε >= 0 for DeltaEps >= 0 and WidthHz >=
// 0 (Born & Huang, Dynamical Theory of Crystal Lattices (1954), §10).
type Oscillator struct {
	FreqHz   float64
	WidthHz  float64
	DeltaEps float64
}

// Epsilon returns the oscillator's contribution to the relative permittivity
// at freqHz (at freqHz = 0 it is DeltaEps).
func (o Oscillator) Epsilon(freqHz float64) complex128 {
	// Ratios of frequencies are used rather than ω² ~ 1e26 so that the
	// result does not depend on the scale; the arithmetic is real so that
	// the sign of ε'' is exact.
	x := freqHz / o.FreqHz // ω/Ω
	g := o.WidthHz / o.FreqHz
	re := 1 - x*x
	im := g * x
	d := re*re + im*im
	return complex(o.DeltaEps*re/d, o.DeltaEps*im/d)
}

// Dielectric is a medium described by a model of its relative permittivity
//
//	ε(ω) = ε∞ + Σ_j Δε_j·Ω_j²/(Ω_j² - ω² - iγ_j·ω) - ω_p²/(ω² + iΓω),
//
// the Lorentz oscillators of Oscillators plus, when PlasmaHz > 0, a Drude
// term for free carriers with plasma frequency ω_p = 2π·PlasmaHz and
// scattering rate Γ = 2π·ScatteringHz; its DC conductivity is ε0·ω_p²/Γ
// (Ashcroft & Mermin, Solid State Physics (1976), ch. 1). The index is
// ñ = IndexFromEpsilon(ε), the κ >= 0 branch.
//
// Oscillators is exported so that other packages can refer to one of them,
// "oscillator j of layer L", as the mode that a pulse drives: the screening
// of the field (this package) and the drive of the mode then come from one
// description and cannot disagree. Treat the slice as read-only while the
// medium is in use.
//
// At freqHz <= 0 Epsilon returns the static permittivity of the lattice,
// ε∞ + ΣΔε_j, without the Drude term: a conductor has no finite static
// permittivity (its Im ε diverges as σ/(ε0ω)). The evaluators never ask for
// zero frequency.
type Dielectric struct {
	EpsInf       float64
	Oscillators  []Oscillator
	PlasmaHz     float64
	ScatteringHz float64
}

// Epsilon returns the relative permittivity ε(freqHz).
func (d Dielectric) Epsilon(freqHz float64) complex128 {
	if freqHz <= 0 {
		s := d.EpsInf
		for _, o := range d.Oscillators {
			s += o.DeltaEps
		}
		return complex(s, 0)
	}
	eps := complex(d.EpsInf, 0)
	for _, o := range d.Oscillators {
		eps += o.Epsilon(freqHz)
	}
	if d.PlasmaHz > 0 {
		// -ωp²/(ω² + iΓω) = -(ωp/ω)²·(1 - iΓ/ω)/(1 + (Γ/ω)²)
		p := d.PlasmaHz / freqHz
		g := d.ScatteringHz / freqHz
		den := 1 + g*g
		eps += complex(-p*p/den, p*p*g/den)
	}
	return eps
}

// Index returns IndexFromEpsilon(Epsilon(freqHz)).
func (d Dielectric) Index(freqHz float64) complex128 {
	return IndexFromEpsilon(d.Epsilon(freqHz))
}

// Validate checks the parameters: all finite, ε∞ > 0, every oscillator with
// FreqHz > 0, WidthHz >= 0 and DeltaEps >= 0 (a negative strength or width
// is gain), PlasmaHz >= 0 and ScatteringHz >= 0. Errors name the oscillator.
func (d Dielectric) Validate() error {
	if !finite(d.EpsInf) || !(d.EpsInf > 0) {
		return fmt.Errorf("EpsInf = %g must be finite and > 0", d.EpsInf)
	}
	for j, o := range d.Oscillators {
		switch {
		case !finite(o.FreqHz) || !(o.FreqHz > 0):
			return fmt.Errorf("Oscillators[%d].FreqHz = %g must be finite and > 0", j, o.FreqHz)
		case !finite(o.WidthHz) || o.WidthHz < 0:
			return fmt.Errorf("Oscillators[%d].WidthHz = %g must be finite and >= 0 (a negative width is gain)", j, o.WidthHz)
		case !finite(o.DeltaEps) || o.DeltaEps < 0:
			return fmt.Errorf("Oscillators[%d].DeltaEps = %g must be finite and >= 0 (a negative strength is gain)", j, o.DeltaEps)
		}
	}
	if !finite(d.PlasmaHz) || d.PlasmaHz < 0 {
		return fmt.Errorf("PlasmaHz = %g must be finite and >= 0", d.PlasmaHz)
	}
	if !finite(d.ScatteringHz) || d.ScatteringHz < 0 {
		return fmt.Errorf("ScatteringHz = %g must be finite and >= 0", d.ScatteringHz)
	}
	return nil
}

// Band is a frequency interval [LoHz, HiHz].
type Band struct {
	LoHz, HiHz float64
}

// ReststrahlenBands returns the frequency bands in which Re ε < 0 for the
// model with its damping removed (γ_j = Γ = 0), in increasing order. Each
// begins at a TO frequency Ω_j (or at 0 for the Drude term) and ends at the
// next zero of ε, the LO frequency (or the screened plasma frequency). In
// such a band a thick sample reflects almost everything, transmits no power,
// and the field inside decays within a depth c/(ωκ) of the surface; the
// field just inside the surface, 2/(1+ñ) times the incident one at normal
// incidence, falls to zero as ω -> Ω_TO (|ε| -> ∞) but rises towards 2 as
// ω -> ω_LO (ε -> 0). These are the frequencies at which a caller raises
// caution.Reststrahlen for a pulse whose spectrum reaches them. Damping
// narrows the band where Re ε < 0 and, if strong, closes it; the undamped
// band is the conventional one.
//
// Method: without damping ε is a real function of x = ω² that increases
// strictly between its poles (each term Δε·Ω²/(Ω² - x) and -ω_p²/x has a
// positive derivative), running from -∞ just above a pole to +∞ just below
// the next and to ε∞ > 0 at infinity; so each interval holds exactly one
// zero, found by bisection to a relative precision of 1e-14. For a single
// mode the zero is the Lyddane–Sachs–Teller frequency
// ω_LO = Ω·sqrt(ε(0)/ε∞) (Lyddane, Sachs & Teller, Phys. Rev. 59, 673 (1941)).
// Oscillators with DeltaEps = 0 have no pole and no band. The model is assumed
// valid (see Validate).
func (d Dielectric) ReststrahlenBands() []Band {
	type pole struct{ x, strength float64 } // x = (Ω/2π)², Hz²
	var poles []pole
	for _, o := range d.Oscillators {
		if o.DeltaEps > 0 {
			poles = append(poles, pole{o.FreqHz * o.FreqHz, o.DeltaEps * o.FreqHz * o.FreqHz})
		}
	}
	p2 := d.PlasmaHz * d.PlasmaHz
	if p2 > 0 {
		poles = append(poles, pole{0, 0})
	}
	if len(poles) == 0 {
		return nil
	}
	sort.Slice(poles, func(i, j int) bool { return poles[i].x < poles[j].x })
	// Undamped ε as a function of x = f² (Hz²).
	eps := func(x float64) float64 {
		e := d.EpsInf - p2/x
		for _, o := range d.Oscillators {
			if o.DeltaEps > 0 {
				e += o.DeltaEps * o.FreqHz * o.FreqHz / (o.FreqHz*o.FreqHz - x)
			}
		}
		return e
	}
	bands := make([]Band, 0, len(poles))
	for k, p := range poles {
		if k > 0 && p.x == poles[k-1].x {
			continue // two oscillators at one frequency share a pole
		}
		lo := p.x
		var hi float64
		next := -1
		for m := k + 1; m < len(poles); m++ {
			if poles[m].x > p.x {
				next = m
				break
			}
		}
		if next >= 0 {
			hi = poles[next].x
		} else {
			// Above the last pole ε >= ε∞ - Σ strength_j/(x - x_j) - p2/x,
			// positive once x - x_last exceeds (Σ strength + p2)/ε∞.
			sum := p2
			for _, q := range poles {
				sum += q.strength
			}
			hi = p.x + 2*sum/d.EpsInf + 1
			for eps(hi) <= 0 { // guard; the bound above already suffices
				hi = 2*hi + 1
			}
		}
		for range 400 {
			mid := lo + (hi-lo)/2
			if mid <= lo || mid >= hi || hi-lo <= 1e-14*hi {
				break
			}
			if eps(mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		bands = append(bands, Band{LoHz: math.Sqrt(p.x), HiHz: math.Sqrt(lo + (hi-lo)/2)})
	}
	return bands
}

// ReststrahlenBands returns the undamped reststrahlen bands of a medium that
// is, or wraps, a Dielectric (see Dielectric.ReststrahlenBands), and nil for
// any other medium.
func ReststrahlenBands(m Medium) []Band {
	if d, ok := DielectricOf(m); ok {
		return d.ReststrahlenBands()
	}
	return nil
}

// DielectricOf returns the dielectric model behind m, if there is one: m
// itself if it is a Dielectric or *Dielectric, or the model of a catalogue
// Material. The returned value shares m's Oscillators slice.
func DielectricOf(m Medium) (Dielectric, bool) {
	switch v := m.(type) {
	case Dielectric:
		return v, true
	case *Dielectric:
		if v != nil {
			return *v, true
		}
	case Material:
		return DielectricOf(v.Model)
	case *Material:
		if v != nil {
			return DielectricOf(v.Model)
		}
	}
	return Dielectric{}, false
}
