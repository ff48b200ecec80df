package tdsfit

import (
	"math"
	"math/cmplx"
	"slices"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/units"
)

// SheetConductance returns the complex sheet conductance σd, in siemens,
// of a thin conducting film on a substrate of index nSubstrate from the
// transmission of film plus substrate relative to the bare substrate,
// tFilm = E_film(ω)/E_substrate(ω) (Glover & Tinkham, Phys. Rev. 108, 243
// (1957); physics.md §4):
//
//	tFilm = (1 + n_s)/(1 + n_s + Z0·σd)   ⇔   σd = (1 + n_s)/Z0 · (1/tFilm - 1).
//
// The formula holds for a film much thinner than the wavelength and than
// its own skin depth. To first order in ωd/c (derived from the film's
// characteristic matrix) it misses Z0σd by -i(ωd/c)·[(1+n_s)(1 + Z0σd/2) +
// (Z0σd)²/6] for a film of background permittivity 1: 1.4e-4 relative for a
// 1 nm film of σd = 1/Z0 on n_s = 3.42 at 1 THz. With the e^{-iωt}
// convention a film that absorbs has Re σ >= 0, and a Drude metal
// σ(ω) = σ0/(1 - iωτ), Im σ >= 0.
//
// Errors: a tFilm that is zero or not finite, or an index that is not
// finite or has a negative real part.
func SheetConductance(tFilm, nSubstrate complex128) (complex128, error) {
	switch {
	case !finiteC(tFilm) || tFilm == 0:
		return 0, inputErr("tFilm", "%v is not a finite, non-zero transmission", tFilm)
	case !finiteC(nSubstrate) || real(nSubstrate) < 0:
		return 0, inputErr("nSubstrate", "%v is not a finite index with n >= 0", nSubstrate)
	}
	s := (1 + nSubstrate) / units.VacuumImpedance * (1/tFilm - 1)
	if !finiteC(s) {
		return 0, inputErr("tFilm", "%v gives no finite conductance", tFilm)
	}
	return s, nil
}

// Sheet is the sheet conductance of a thin film over a band.
type Sheet struct {
	// FreqHz holds the frequencies of Band, ConductanceS the complex sheet
	// conductance σd (siemens) there, StdS the one-sigma noise of its real
	// and, equally, of its imaginary part: |dσd/dlnT|·σ =
	// |1+n_s|/(Z0|tFilm|)·SigmaLog (first order).
	FreqHz       []float64
	ConductanceS []complex128
	StdS         []float64
	Band         Band
	Cautions     []caution.Caution
}

// ExtractSheet applies SheetConductance at every frequency of the band of a
// Transmission measured with the film on its substrate as the sample and the
// bare substrate as the reference. substrate gives n_s(f) (for example
// optics.Constant, or a catalogue material).
//
// mismatchM is the substrate under the film minus the reference substrate,
// in thickness (m): the extra substrate multiplies the measured ratio by
// exp(i(ñ_s - 1)ωΔd/c) (the first-pass transmission relative to air, as in
// SlabTransmission), which is divided out before the formula is applied. A
// mismatch of 1 um of n_s = 3.4 shifts the phase by 0.05 rad at 1 THz, so
// it matters: measure it.
//
// The bare-substrate reference and the film's trace must both keep or
// both drop the substrate's echoes; the formula concerns the first pass.
// Errors are *InputError: a nil substrate, a non-finite mismatch larger than
// MaxThicknessM, a malformed Transmission, or an index that SheetConductance
// refuses.
func ExtractSheet(tr Transmission, substrate optics.Medium, mismatchM float64) (Sheet, error) {
	if substrate == nil {
		return Sheet{}, inputErr("substrate", "no substrate medium")
	}
	if !finite(mismatchM) || math.Abs(mismatchM) > MaxThicknessM {
		return Sheet{}, inputErr("mismatchM", "%g m is not a finite thickness difference within ±%g m", mismatchM, MaxThicknessM)
	}
	if err := tr.validate(); err != nil {
		return Sheet{}, err
	}
	b := tr.Band
	out := Sheet{
		FreqHz:       slices.Clone(tr.FreqHz[b.Lo : b.Hi+1]),
		ConductanceS: make([]complex128, b.Len()),
		StdS:         make([]float64, b.Len()),
		Band:         b,
		Cautions:     slices.Clone(tr.Cautions),
	}
	for i := range out.FreqHz {
		k := b.Lo + i
		f := tr.FreqHz[k]
		ns := substrate.Index(f)
		t := tr.T[k]
		if mismatchM != 0 {
			k0 := 2 * math.Pi * f / units.SpeedOfLight
			t *= cmplx.Exp(complex(0, -k0*mismatchM) * (ns - 1))
		}
		s, err := SheetConductance(t, ns)
		if err != nil {
			return Sheet{}, inputErr("Transmission", "at %g Hz: %v", f, err)
		}
		out.ConductanceS[i] = s
		out.StdS[i] = cabs(1+ns) / (units.VacuumImpedance * cabs(t)) * tr.SigmaLog[k]
	}
	return out, nil
}
