package units

import (
	"fmt"
	"sort"
	"strconv"
	"strings"
	"unicode"
)

// Kind is the physical dimension of a quantity written with a unit.
type Kind int

const (
	Frequency Kind = iota + 1
	Field
	Time
	Length
	Energy
	Fluence
	Power
	Temperature
	Rate
	Angle
	Volume
	Mass
	EffectiveCharge  // mode effective charge Z*
	NormalCoordinate // mode amplitude Q
	Absorption       // absorption coefficient
	HeatCapacity     // volumetric heat capacity
	Conductivity     // thermal conductivity
	NumberDensity
)

var kindNames = map[Kind]string{
	Frequency: "frequency", Field: "field", Time: "time", Length: "length",
	Energy: "energy", Fluence: "fluence", Power: "power", Temperature: "temperature",
	Rate: "repetition rate", Angle: "angle", Volume: "volume", Mass: "mass",
	EffectiveCharge: "effective charge", NormalCoordinate: "normal coordinate",
	Absorption: "absorption coefficient", HeatCapacity: "volumetric heat capacity",
	Conductivity: "thermal conductivity", NumberDensity: "number density",
}

func (k Kind) String() string { return kindNames[k] }

const degree = 0.017453292519943295 // π/180 rad

// table maps, for each kind, every accepted unit spelling (lower case) to
// its SI value. It is the only place where a unit written by a person is
// turned into SI. A spelling may mean different kinds ("1/cm" is a
// wavenumber or an absorption coefficient); the kind asked for decides.
var table = map[Kind]map[string]float64{
	Frequency: {"hz": Hz, "ghz": GHz, "thz": THz, "cm-1": InvCm, "cm^-1": InvCm, "1/cm": InvCm, "mev": MeV},
	Field:     {"v/m": VPerM, "v/cm": 1 / Cm, "kv/cm": KVPerCm, "mv/cm": MVPerCm},
	Time:      {"s": Second, "ns": 1e-9, "ps": Ps, "fs": Fs},
	Length: {"m": Metre, "cm": Cm, "mm": Mm, "um": Um, "µm": Um, "nm": Nm, "pm": Pm,
		"a": Angstrom, "å": Angstrom},
	Energy:      {"j": Joule, "mj": MJ, "uj": UJ, "µj": UJ, "nj": NJ},
	Fluence:     {"j/m2": JPerM2, "j/cm2": JPerCm2, "mj/cm2": MJPerCm2, "uj/cm2": UJPerCm2, "µj/cm2": UJPerCm2},
	Power:       {"w": Watt, "mw": MW, "uw": 1e-6, "µw": 1e-6},
	Temperature: {"k": 1},
	Rate:        {"hz": 1, "khz": 1e3, "mhz": 1e6},
	Angle:       {"rad": 1, "deg": degree, "°": degree},
	Volume: {"å^3": CubicAngstrom, "a^3": CubicAngstrom, "å3": CubicAngstrom, "a3": CubicAngstrom,
		"angstrom3": CubicAngstrom, "nm3": Nm * Nm * Nm, "nm^3": Nm * Nm * Nm},
	Mass:             {"amu": Amu, "u": Amu, "da": Amu, "kg": 1},
	EffectiveCharge:  {"e/sqrt(amu)": ESqrtAmu, "e/√amu": ESqrtAmu},
	NormalCoordinate: {"å·sqrt(amu)": AngstromSqrtAmu, "a*sqrt(amu)": AngstromSqrtAmu, "å*sqrt(amu)": AngstromSqrtAmu, "a sqrt(amu)": AngstromSqrtAmu},
	Absorption:       {"1/cm": PerCm, "/cm": PerCm, "cm-1": PerCm, "cm^-1": PerCm, "1/m": 1, "1/um": 1 / Um},
	HeatCapacity:     {"j/(cm3 k)": JPerCm3, "j/cm3/k": JPerCm3, "j/(cm^3 k)": JPerCm3, "j/(m3 k)": 1, "j/m3/k": 1},
	Conductivity:     {"w/(m k)": 1, "w/m/k": 1, "w/mk": 1, "w/(cm k)": 1 / Cm, "w/cm/k": 1 / Cm},
	NumberDensity:    {"1/nm3": 1 / (Nm * Nm * Nm), "/nm3": 1 / (Nm * Nm * Nm), "nm-3": 1 / (Nm * Nm * Nm), "1/nm^3": 1 / (Nm * Nm * Nm), "1/cm3": JPerCm3, "cm-3": JPerCm3, "1/m3": 1},
}

// kindsOf lists the kinds a spelling belongs to, for a helpful error.
func kindsOf(unit string) []string {
	var out []string
	for k, units := range table {
		if _, ok := units[unit]; ok {
			out = append(out, k.String())
		}
	}
	sort.Strings(out)
	return out
}

// Split splits "1.2 MV/cm" into the number "1.2" and the unit "MV/cm": the
// number is the leading run of digits, signs, points and exponents.
func Split(s string) (number, unit string) {
	s = strings.TrimSpace(s)
	i := 0
	for i < len(s) && (unicode.IsDigit(rune(s[i])) || strings.ContainsRune("+-.eE", rune(s[i]))) {
		// stop at an 'e' that begins a unit rather than an exponent
		if (s[i] == 'e' || s[i] == 'E') && (i+1 >= len(s) || !strings.ContainsRune("+-0123456789", rune(s[i+1]))) {
			break
		}
		i++
	}
	return s[:i], strings.TrimSpace(s[i:])
}

// Parse reads a quantity such as "1.2 MV/cm", "80 cm-1", "9.9 meV" or
// "450 uJ/cm2" and returns it in SI. A bare number is taken in defaultUnit
// (a spelling from the table, for example "kV/cm"). Units are matched without
// regard to case, except that "MV/cm" and "mV/cm" are both mega (no field
// is written in millivolts per centimetre) and "mJ" is milli. A unit of the
// wrong kind, or an unknown one, is an error that lists the accepted units.
func Parse(s string, kind Kind, defaultUnit string) (float64, error) {
	num, unit := Split(s)
	x, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number with a unit (like %q)", s, "1.5 "+defaultUnit)
	}
	if unit == "" {
		unit = defaultUnit
	}
	factor, ok := table[kind][strings.ToLower(unit)]
	if !ok {
		if other := kindsOf(strings.ToLower(unit)); len(other) > 0 {
			return 0, fmt.Errorf("%q is a %s, not a %s; use one of %s", unit, strings.Join(other, " or "), kind, strings.Join(Accepted(kind), ", "))
		}
		return 0, fmt.Errorf("unknown unit %q for a %s; use one of %s", unit, kind, strings.Join(Accepted(kind), ", "))
	}
	return x * factor, nil
}

// Accepted lists the unit spellings Parse accepts for kind.
func Accepted(kind Kind) []string {
	var out []string
	for k := range table[kind] {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
