package optics

import (
	"errors"
	"math"
	"strings"
	"testing"

	"thzdrive/units"
)

// TestCatalogueParses: the embedded file loads, holds the materials
// physics.md §4 asks for, each with a description, a source, a temperature
// and a validity range inside its data, and each passive and finite across
// that range (common practice).
func TestCatalogueParses(t *testing.T) {
	ms, err := loadCatalogue()
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"air", "silicon-hr", "quartz-o", "quartz-e", "fused-silica", "sapphire-o", "sapphire-e",
		"diamond", "hdpe", "tpx", "ptfe", "polypropylene", "znte", "gap"}
	have := map[string]Material{}
	for _, m := range ms {
		have[m.Name] = m
	}
	for _, name := range want {
		if _, ok := have[name]; !ok {
			t.Errorf("catalogue lacks %q", name)
		}
	}
	for _, m := range Catalogue() {
		if m.Name != strings.ToLower(m.Name) || m.Description == "" || m.Source == "" || !(m.TemperatureK > 0) {
			t.Errorf("%q: incomplete entry %+v", m.Name, m)
		}
		if !(m.MaxHz > m.MinHz) {
			t.Errorf("%q: range %g-%g", m.Name, m.MinHz, m.MaxHz)
		}
		if tab, ok := m.Model.(*Tabulated); ok {
			lo, hi := tab.ValidRangeHz()
			if m.MinHz < lo || m.MaxHz > hi {
				t.Errorf("%q: stated range %g-%g Hz exceeds its table %g-%g Hz", m.Name, m.MinHz, m.MaxHz, lo, hi)
			}
		}
		_, dispersive := DielectricOf(m)
		for i := range 200 {
			f := math.Max(m.MinHz, 1e9) + (m.MaxHz-math.Max(m.MinHz, 1e9))*float64(i)/199
			n := m.Index(f)
			// Away from resonances (all but the Lorentz entries) n >= 1.
			if err := checkIndex(m.Name, "", f, n); err != nil || (!dispersive && real(n) < 1) {
				t.Errorf("%q at %g THz: ñ = %v (%v)", m.Name, f/units.THz, n, err)
				break
			}
		}
	}
}

// TestCatalogueValues checks catalogue entries against values from outside
// the catalogue's own sources, or against their stated sources, with the
// tolerance each source allows.
func TestCatalogueValues(t *testing.T) {
	cases := []struct {
		name   string
		freqHz float64
		wantN  float64
		tol    float64
		source string
	}{
		{"silicon-hr", 1e12, 3.4175, 1e-12, "Grischkowsky et al., JOSA B 7, 2006 (1990), from memory"},
		// The two silicon sources differ by 1.3e-3; the catalogue follows
		// the first.
		{"silicon-hr", 1e12, 3.4162, 2e-3, "independent measurement 3.4162 ± 0.0002 quoted in physics.md §4"},
		// The Lorentz parameters of ZnTe and GaP are recalled; agreement to
		// better than 1 % (ZnTe) and 0.3 % (GaP) with these outside values
		// is what is asked of them.
		{"znte", 1e12, 3.17, 0.02, "n_THz ≈ 3.17, physics.md §3, from memory"},
		{"gap", 1e12, 3.342, 0.01, "Sellmeier fit, JOSA B 36, 3039 (2019), as quoted in physics.md §3"},
		{"quartz-o", 1e12, 2.108, 1e-12, "Grischkowsky et al. (1990), from memory"},
		{"sapphire-o", 1e12, 3.07, 1e-12, "Grischkowsky et al. (1990), from memory"},
		{"air", 1e12, 1, 0, "vacuum approximation, common practice"},
	}
	for _, c := range cases {
		m, err := Lookup(c.name)
		if err != nil {
			t.Fatal(err)
		}
		if n := real(m.Index(c.freqHz)); !near(n, c.wantN, c.tol) {
			t.Errorf("%s n(%g THz) = %.5f, want %.5f ± %g (%s)", c.name, c.freqHz/1e12, n, c.wantN, c.tol, c.source)
		}
	}
	// Phonons: TO as given, LO from the model's own zero of ε, against the
	// textbook frequencies (from memory): ZnTe LO 206 cm^-1 (6.18 THz),
	// GaP LO 403 cm^-1 (12.08 THz); within 1 %.
	for _, c := range []struct {
		name      string
		toTHz, lo float64
	}{{"znte", 5.3, wavenumberHz(206)}, {"gap", 11, wavenumberHz(403)}} {
		m, _ := Lookup(c.name)
		b := ReststrahlenBands(m)
		if len(b) != 1 || relErr(b[0].LoHz, c.toTHz*units.THz) > 0.01 || relErr(b[0].HiHz, c.lo) > 0.01 {
			t.Errorf("%s: band %v, want TO ≈ %g THz, LO ≈ %.2f THz", c.name, b, c.toTHz, c.lo/units.THz)
		}
		// Below a resonance the index rises with frequency (normal
		// dispersion, derived from the Lorentz form).
		if !(real(m.Index(2e12)) > real(m.Index(1e12))) {
			t.Errorf("%s: no normal dispersion between 1 and 2 THz", c.name)
		}
		if _, ok := DielectricOf(m); !ok {
			t.Errorf("%s is not a dielectric model", c.name)
		}
	}
	// Tabulated absorption: the stored κ reproduces the tabulated α through
	// α = 2ωκ/c (definition, Born & Wolf §14.1): HDPE 0.2 cm^-1 at 1 THz
	// (the catalogue's value, from memory).
	m, _ := Lookup("hdpe")
	if a := AbsorptionCoefficient(1e12, m.Index(1e12)) / units.PerCm; !near(a, 0.2, 1e-12) {
		t.Errorf("HDPE α(1 THz) = %g cm^-1, table says 0.2", a)
	}
}

// TestLookup: exact and case-insensitive hits, and errors for unknown names
// that name the material and list close names (common practice).
func TestLookup(t *testing.T) {
	if m, err := Lookup("  Silicon-HR "); err != nil || m.Name != "silicon-hr" {
		t.Errorf("Lookup(Silicon-HR) = %v, %v", m.Name, err)
	}
	cases := []struct {
		query string
		close []string
	}{
		{"silicon", []string{"silicon-hr"}},
		{"quartz", []string{"quartz-o", "quartz-e"}},
		{"saphire-o", []string{"sapphire-o"}},
		{"znse", []string{"znte"}},
		{"unobtainium", []string{"air", "gap", "polypropylene"}}, // nothing close: the whole list
	}
	for _, c := range cases {
		_, err := Lookup(c.query)
		if err == nil || !errors.Is(err, ErrUnknownMaterial) {
			t.Errorf("Lookup(%q) error %v", c.query, err)
			continue
		}
		if !strings.Contains(err.Error(), `"`+c.query+`"`) {
			t.Errorf("error %q does not name %q", err, c.query)
		}
		for _, n := range c.close {
			if !strings.Contains(err.Error(), n) {
				t.Errorf("Lookup(%q): error %q does not list %q", c.query, err, n)
			}
		}
	}
}

// TestCatalogueReadOnly: what Catalogue and Lookup return are copies.
func TestCatalogueReadOnly(t *testing.T) {
	m, err := Lookup("znte")
	if err != nil {
		t.Fatal(err)
	}
	d, _ := DielectricOf(m)
	d.Oscillators[0].FreqHz = 1
	for _, c := range Catalogue() {
		if c.Name == "znte" {
			d2, _ := DielectricOf(c)
			d2.Oscillators[0].DeltaEps = 99
		}
	}
	m2, _ := Lookup("znte")
	d3, _ := DielectricOf(m2)
	if d3.Oscillators[0].FreqHz != 5.32e12 || d3.Oscillators[0].DeltaEps != 2.58 {
		t.Errorf("catalogue modified through a copy: %+v", d3.Oscillators[0])
	}
}

// TestCatalogueFileErrors: a malformed catalogue is refused, not loaded
// half-way (common practice).
func TestCatalogueFileErrors(t *testing.T) {
	bad := []string{
		`{"materials": [{"name": "x", "constant": {"n": 1}, "table": {"freq_thz": [1, 2], "n": [1, 1], "alpha_per_cm": [0, 0]}}]}`,
		`{"materials": [{"name": "x"}]}`,
		`{"materials": [{"name": "X", "constant": {"n": 1}, "valid_max_thz": 1}]}`,
		`{"materials": [{"name": "x", "constant": {"n": 1, "kappa": -1}, "valid_max_thz": 1}]}`,
		`{"materials": [{"name": "x", "constant": {"n": 1}, "unknown_field": 3}]}`,
		`{"materials": [{"name": "x", "table": {"freq_thz": [1, 2], "n": [1, 1], "alpha_per_cm": [0]}}]}`,
	}
	for _, b := range bad {
		if _, err := parseCatalogue([]byte(b)); err == nil {
			t.Errorf("accepted %s", b)
		}
	}
}

// TestStackOscillator: a layer's oscillator is reachable by (layer, j), the
// reference another package uses for the driven mode (common practice).
func TestStackOscillator(t *testing.T) {
	znte, _ := Lookup("znte")
	st := Stack{Layers: []Layer{{Medium: Constant{N: 2}, ThicknessM: 1e-6}, {Medium: znte, ThicknessM: 1e-5}}, Exit: Dielectric{EpsInf: 2, Oscillators: []Oscillator{{FreqHz: 1e12, DeltaEps: 1}, {FreqHz: 2e12, DeltaEps: 0.5}}}}
	if o, err := st.Oscillator(1, 0); err != nil || o.FreqHz != 5.32e12 {
		t.Errorf("layer 1 oscillator 0: %+v, %v", o, err)
	}
	if o, err := st.Oscillator(ExitMedium, 1); err != nil || o.FreqHz != 2e12 {
		t.Errorf("exit oscillator 1: %+v, %v", o, err)
	}
	for _, c := range []struct{ layer, j int }{{0, 0}, {1, 1}, {2, 0}, {ExitMedium, 2}, {1, -1}} {
		if _, err := st.Oscillator(c.layer, c.j); err == nil {
			t.Errorf("Oscillator(%d, %d) accepted", c.layer, c.j)
		}
	}
}
