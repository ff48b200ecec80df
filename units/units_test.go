package units

import (
	"math"
	"strings"
	"testing"
)

// Conversions of physics.md §0 (CODATA 2018 via h, kB, c): 1 THz =
// 33.35641 cm⁻¹ = 4.135668 meV = 47.9924 K, and Z0 = µ0·c.
func TestConstantsAgainstCODATA(t *testing.T) {
	cases := []struct {
		name      string
		got, want float64
		rel       float64
	}{
		{"1 THz in cm^-1", THz / InvCm, 33.35641, 1e-7},
		{"1 THz in meV", THz / MeV, 4.135668, 1e-7},
		{"1 THz in K (h f / kB)", THz / KelvinFreq, 47.9924, 1e-6},
		{"Z0 = mu0 c", VacuumPermeab * SpeedOfLight, VacuumImpedance, 1e-11},
		{"eps0 mu0 c^2 = 1", VacuumPermittiv * VacuumPermeab * SpeedOfLight * SpeedOfLight, 1, 1e-9},
	}
	for _, tc := range cases {
		if math.Abs(tc.got-tc.want) > tc.rel*math.Abs(tc.want) {
			t.Errorf("%s = %.10g, want %.10g (CODATA 2018, physics.md §0)", tc.name, tc.got, tc.want)
		}
	}
}

// Parse: units written by a person, converted by the one table; the
// expected values follow from the definitions of the units (derived).
func TestParse(t *testing.T) {
	cases := []struct {
		in      string
		kind    Kind
		def     string
		want    float64
		errPart string // non-empty: an error containing this is wanted
	}{
		{"1.2 MV/cm", Field, "kV/cm", 1.2e8, ""},
		{"250", Field, "kV/cm", 2.5e7, ""},
		{"80 cm-1", Frequency, "THz", 80 * 100 * SpeedOfLight, ""},
		{"2.4THz", Frequency, "THz", 2.4e12, ""},
		{"450 uJ/cm2", Fluence, "uJ/cm2", 4.5, ""},
		{"2e-3 mm", Length, "um", 2e-6, ""},
		{"3 pm", Length, "pm", 3e-12, ""},
		{"1 kHz", Rate, "kHz", 1e3, ""},
		{"150 Å3", Volume, "Å^3", 150e-30, ""},
		{"36 amu", Mass, "amu", 36 * Dalton, ""},
		{"10 1/cm", Absorption, "1/cm", 1000, ""},     // the same spelling as a wavenumber,
		{"10 1/cm", Frequency, "THz", 10 * InvCm, ""}, // told apart by the kind asked for
		{"1.5 J/(cm3 K)", HeatCapacity, "J/(cm3 K)", 1.5e6, ""},
		{"2 W/(cm K)", Conductivity, "W/(m K)", 200, ""},
		{"50 1/nm3", NumberDensity, "1/nm3", 5e28, ""},
		{"1 THz", Field, "kV/cm", 0, "is a frequency, not a field"},
		{"3 parsecs", Length, "um", 0, "unknown unit"},
		{"x kV/cm", Field, "kV/cm", 0, "not a number"},
	}
	for _, tc := range cases {
		got, err := Parse(tc.in, tc.kind, tc.def)
		if tc.errPart != "" {
			if err == nil || !strings.Contains(err.Error(), tc.errPart) {
				t.Errorf("Parse(%q, %v): error %v, want one containing %q", tc.in, tc.kind, err, tc.errPart)
			}
			continue
		}
		if err != nil {
			t.Errorf("Parse(%q, %v): %v", tc.in, tc.kind, err)
			continue
		}
		if math.Abs(got-tc.want) > 1e-12*math.Abs(tc.want) {
			t.Errorf("Parse(%q, %v) = %.12g, want %.12g", tc.in, tc.kind, got, tc.want)
		}
	}
}

// Every kind has units, and every default unit the code passes must be one
// of them: an empty or mistyped table entry would make Parse refuse a bare
// number.
func TestEveryKindHasUnits(t *testing.T) {
	for k, name := range kindNames {
		if len(Accepted(k)) == 0 || name == "" {
			t.Errorf("kind %d (%q) has no units", k, name)
		}
	}
}
