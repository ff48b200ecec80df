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
)

var kindNames = map[Kind]string{
	Frequency: "frequency", Field: "field", Time: "time", Length: "length",
	Energy: "energy", Fluence: "fluence", Power: "power", Temperature: "temperature",
	Rate: "repetition rate", Angle: "angle",
}

func (k Kind) String() string { return kindNames[k] }

// table maps each accepted unit spelling to its kind and SI factor. It is the
// only place where a unit written by a person is turned into SI.
var table = map[string]struct {
	kind   Kind
	factor float64
}{
	"hz": {Frequency, Hz}, "ghz": {Frequency, GHz}, "thz": {Frequency, THz},
	"cm-1": {Frequency, InvCm}, "cm^-1": {Frequency, InvCm}, "1/cm": {Frequency, InvCm},
	"mev": {Frequency, MeV},

	"v/m": {Field, VPerM}, "v/cm": {Field, 1 / Cm}, "kv/cm": {Field, KVPerCm}, "mv/cm": {Field, MVPerCm},

	"s": {Time, Second}, "ns": {Time, 1e-9}, "ps": {Time, Ps}, "fs": {Time, Fs},

	"m": {Length, Metre}, "cm": {Length, Cm}, "mm": {Length, Mm}, "um": {Length, Um},
	"µm": {Length, Um}, "nm": {Length, Nm}, "a": {Length, Angstrom}, "å": {Length, Angstrom},

	"j": {Energy, Joule}, "mj": {Energy, MJ}, "uj": {Energy, UJ}, "µj": {Energy, UJ}, "nj": {Energy, NJ},

	"j/m2": {Fluence, JPerM2}, "j/cm2": {Fluence, JPerCm2}, "mj/cm2": {Fluence, MJPerCm2},
	"uj/cm2": {Fluence, UJPerCm2}, "µj/cm2": {Fluence, UJPerCm2},

	"w": {Power, Watt}, "mw": {Power, MW}, "uw": {Power, 1e-6}, "µw": {Power, 1e-6},

	"k": {Temperature, 1},

	"khz": {Rate, 1e3}, "mhz": {Rate, 1e6},

	"rad": {Angle, 1}, "deg": {Angle, 0.017453292519943295}, "°": {Angle, 0.017453292519943295},
}

// lookup finds a unit of the wanted kind; Hz and MHz also serve as repetition rates.
func lookup(unit string, kind Kind) (float64, bool) {
	u, ok := table[unit]
	if ok && u.kind == kind {
		return u.factor, true
	}
	if kind == Rate && ok && u.kind == Frequency && unit == "hz" {
		return 1, true
	}
	if kind == Rate && unit == "mhz" {
		return 1e6, true
	}
	return 0, false
}

// Parse reads a quantity such as "1.2 MV/cm", "80 cm-1", "9.9 meV" or
// "450 uJ/cm2" and returns it in SI. A bare number is taken in defaultUnit
// (a spelling from the table, for example "kV/cm"). Units are matched without
// regard to case, except that "MV/cm" and "mV/cm" are both mega (no field
// is written in millivolts per centimetre) and "mJ" is milli. A unit of the
// wrong kind, or an unknown one, is an error that lists the accepted units.
func Parse(s string, kind Kind, defaultUnit string) (float64, error) {
	s = strings.TrimSpace(s)
	i := 0
	for i < len(s) && (unicode.IsDigit(rune(s[i])) || strings.ContainsRune("+-.eE", rune(s[i]))) {
		// stop at an 'e' that begins a unit rather than an exponent
		if (s[i] == 'e' || s[i] == 'E') && (i+1 >= len(s) || !strings.ContainsRune("+-0123456789", rune(s[i+1]))) {
			break
		}
		i++
	}
	num, unit := s[:i], strings.TrimSpace(s[i:])
	x, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number with a unit (like %q)", s, "1.5 "+defaultUnit)
	}
	if unit == "" {
		unit = defaultUnit
	}
	key := strings.ToLower(unit)
	factor, ok := lookup(key, kind)
	if !ok {
		if u, known := table[key]; known {
			return 0, fmt.Errorf("%q is a %s, not a %s; use one of %s", unit, u.kind, kind, strings.Join(Accepted(kind), ", "))
		}
		return 0, fmt.Errorf("unknown unit %q for a %s; use one of %s", unit, kind, strings.Join(Accepted(kind), ", "))
	}
	return x * factor, nil
}

// Accepted lists the unit spellings Parse accepts for kind.
func Accepted(kind Kind) []string {
	var out []string
	for k, u := range table {
		if u.kind == kind {
			out = append(out, k)
		}
	}
	sort.Strings(out)
	return out
}
