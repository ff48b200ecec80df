// Package units holds the physical constants (CODATA 2018) and the one table
// of conversions between SI, which every physics package uses internally, and
// the units of the trade (kV/cm, THz, cm^-1, meV, ps, fs, um, uJ, uJ/cm^2, ...),
// which appear only at the edges: the wire format, the CLI and reports.
//
// A value in the trade's unit is converted to SI by multiplying with the
// constant named for that unit, and back by dividing:
//
//	fieldVPerM := 250 * units.KVPerCm
//	fmt.Println(fieldVPerM / units.MVPerCm) // 0.25
//
// Frequency units that are not proportional to hertz by a plain power of ten
// (cm^-1, meV, kelvin-equivalent) are still linear in frequency, so they are
// constants too.
package units

import "math"

// Constants, SI. Exact values are those fixed by the 2019 SI redefinition;
// the others are CODATA 2018 recommended values (Tiesinga et al., Rev. Mod.
// Phys. 93, 025010 (2021)).
const (
	SpeedOfLight     = 299792458.0       // c, m/s (exact)
	VacuumPermeab    = 1.25663706212e-6  // mu0, N/A^2
	VacuumPermittiv  = 8.8541878128e-12  // eps0, F/m
	VacuumImpedance  = 376.730313668     // Z0 = mu0 c, ohm
	ElementaryCharge = 1.602176634e-19   // e, C (exact)
	Planck           = 6.62607015e-34    // h, J s (exact)
	ReducedPlanck    = 1.054571817e-34   // hbar, J s
	Boltzmann        = 1.380649e-23      // kB, J/K (exact)
	Dalton           = 1.66053906660e-27 // u, kg
	FineStructure    = 7.2973525693e-3   // alpha, dimensionless
	Avogadro         = 6.02214076e23     // N_A, 1/mol (exact)
)

// Trade units expressed in SI. Multiply a value in the named unit by the
// constant to get SI; divide an SI value by it to get the named unit.
const (
	// Electric field, V/m.
	VPerM   = 1.0
	KVPerCm = 1e5
	MVPerCm = 1e8

	// Time, s.
	Second = 1.0
	Ps     = 1e-12
	Fs     = 1e-15

	// Frequency, Hz (and its linear equivalents).
	Hz  = 1.0
	GHz = 1e9
	THz = 1e12
	// InvCm is one wavenumber (cm^-1) as a frequency: c * 100 /m.
	InvCm = SpeedOfLight * 100
	// MeV is the frequency of a quantum of one milli-electronvolt: 1e-3 e / h.
	MeV = 1e-3 * ElementaryCharge / Planck
	// KelvinFreq is the frequency whose quantum equals kB * 1 K: kB / h.
	KelvinFreq = Boltzmann / Planck

	// Length, m.
	Metre    = 1.0
	Mm       = 1e-3
	Um       = 1e-6
	Nm       = 1e-9
	Pm       = 1e-12
	Angstrom = 1e-10
	Cm       = 1e-2

	// Energy, J.
	Joule = 1.0
	MJ    = 1e-3
	UJ    = 1e-6
	NJ    = 1e-9
	// MilliEV is one meV as an energy, J.
	MilliEV = 1e-3 * ElementaryCharge

	// Power, W.
	Watt = 1.0
	MW   = 1e-3

	// Fluence, J/m^2.
	JPerM2        = 1.0
	UJPerCm2      = UJ / (Cm * Cm)
	MJPerCm2      = MJ / (Cm * Cm)
	JPerCm2       = 1 / (Cm * Cm)
	WPerMK        = 1.0 // thermal conductivity, W/(m K)
	JPerM3K       = 1.0 // volumetric heat capacity, J/(m^3 K)
	JPerCm3       = 1 / (Cm * Cm * Cm)
	PerCm         = 1 / Cm // absorption coefficient, 1/m
	CubicAngstrom = Angstrom * Angstrom * Angstrom

	// Mass, kg.
	Amu = Dalton

	// Electro-optic coefficient, m/V.
	PmPerV = 1e-12
)

// Units that involve a square root of a mass cannot be Go constants.
var (
	// AngstromSqrtAmu is the unit of the normal coordinate Q used at the
	// edges, one angstrom times sqrt(amu), in m sqrt(kg).
	AngstromSqrtAmu = Angstrom * math.Sqrt(Dalton)
	// ESqrtAmu is the unit of the mode effective charge Z* used at the edges,
	// one elementary charge per sqrt(amu), in C/sqrt(kg).
	ESqrtAmu = ElementaryCharge / math.Sqrt(Dalton)
)

// AngularFrequency returns 2 pi f for a frequency f in Hz.
func AngularFrequency(fHz float64) float64 { return 2 * math.Pi * fHz }
