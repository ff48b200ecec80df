package optics

import (
	_ "embed"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
	"sync"

	"thzdrive/units"
)

// Material is an entry of the embedded catalogue: a medium with its name,
// provenance and the frequency range over which its data hold. It
// implements Medium (through Model) and Ranged (through MinHz, MaxHz), so it
// can be used directly as a layer or a window.
type Material struct {
	// Name is the stable lowercase key, such as "silicon-hr" or "quartz-o".
	Name        string
	Description string
	// Source cites where the values come from; "from memory" marks values
	// recalled from the cited literature and not re-checked against it.
	Source       string
	TemperatureK float64
	// MinHz and MaxHz bound the range in which the data are valid.
	MinHz, MaxHz float64
	// Model is a Constant, a *Tabulated or a Dielectric.
	Model Medium
}

// Index returns the index of the material's model.
func (m Material) Index(freqHz float64) complex128 { return m.Model.Index(freqHz) }

// ValidRangeHz returns the catalogue's validity range.
func (m Material) ValidRangeHz() (minHz, maxHz float64) { return m.MinHz, m.MaxHz }

// Validate checks the model (a user may build a Material of their own).
func (m Material) Validate() error {
	if m.Model == nil {
		return fmt.Errorf("material %q has no model", m.Name)
	}
	if v, ok := m.Model.(validator); ok {
		if err := v.Validate(); err != nil {
			return fmt.Errorf("material %q: %w", m.Name, err)
		}
	}
	if !finite(m.MinHz) || math.IsNaN(m.MaxHz) || m.MinHz < 0 || m.MaxHz < m.MinHz {
		return fmt.Errorf("material %q: validity range [%g, %g] Hz is not an interval of non-negative frequencies", m.Name, m.MinHz, m.MaxHz)
	}
	return nil
}

//go:embed materials.json
var catalogueJSON []byte

type catalogueFile struct {
	Comment   string `json:"_comment"`
	Materials []struct {
		Name         string  `json:"name"`
		Description  string  `json:"description"`
		Source       string  `json:"source"`
		TemperatureK float64 `json:"temperature_k"`
		ValidMinTHz  float64 `json:"valid_min_thz"`
		ValidMaxTHz  float64 `json:"valid_max_thz"`
		Constant     *struct {
			N     float64 `json:"n"`
			Kappa float64 `json:"kappa"`
		} `json:"constant"`
		Table *struct {
			FreqTHz    []float64 `json:"freq_thz"`
			N          []float64 `json:"n"`
			AlphaPerCm []float64 `json:"alpha_per_cm"`
		} `json:"table"`
		Lorentz *struct {
			EpsInf      float64 `json:"eps_inf"`
			Oscillators []struct {
				FreqTHz  float64 `json:"freq_thz"`
				WidthTHz float64 `json:"width_thz"`
				DeltaEps float64 `json:"delta_eps"`
			} `json:"oscillators"`
			PlasmaTHz     float64 `json:"plasma_thz"`
			ScatteringTHz float64 `json:"scattering_thz"`
		} `json:"lorentz"`
	} `json:"materials"`
}

var loadCatalogue = sync.OnceValues(func() ([]Material, error) {
	return parseCatalogue(catalogueJSON)
})

func parseCatalogue(data []byte) ([]Material, error) {
	var f catalogueFile
	dec := json.NewDecoder(strings.NewReader(string(data)))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&f); err != nil {
		return nil, fmt.Errorf("optics: material catalogue: %w", err)
	}
	out := make([]Material, 0, len(f.Materials))
	seen := map[string]bool{}
	for _, e := range f.Materials {
		if e.Name == "" || e.Name != strings.ToLower(e.Name) || seen[e.Name] {
			return nil, fmt.Errorf("optics: material catalogue: bad or duplicate name %q", e.Name)
		}
		seen[e.Name] = true
		m := Material{
			Name: e.Name, Description: e.Description, Source: e.Source,
			TemperatureK: e.TemperatureK,
			MinHz:        e.ValidMinTHz * units.THz, MaxHz: e.ValidMaxTHz * units.THz,
		}
		models := 0
		if c := e.Constant; c != nil {
			models++
			m.Model = Constant{N: c.N, Kappa: c.Kappa}
		}
		if t := e.Table; t != nil {
			models++
			if len(t.AlphaPerCm) != len(t.FreqTHz) {
				return nil, fmt.Errorf("optics: material catalogue: %q: %d frequencies, %d absorption values", e.Name, len(t.FreqTHz), len(t.AlphaPerCm))
			}
			fHz := make([]float64, len(t.FreqTHz))
			kappa := make([]float64, len(t.FreqTHz))
			for i, fT := range t.FreqTHz {
				fHz[i] = fT * units.THz
				// κ = αc/(2ω), α = 2ωκ/c inverted.
				kappa[i] = t.AlphaPerCm[i] * units.PerCm * units.SpeedOfLight / (2 * units.AngularFrequency(fHz[i]))
			}
			tab, err := NewTabulated(fHz, t.N, kappa)
			if err != nil {
				return nil, fmt.Errorf("optics: material catalogue: %q: %w", e.Name, err)
			}
			m.Model = tab
		}
		if l := e.Lorentz; l != nil {
			models++
			d := Dielectric{EpsInf: l.EpsInf, PlasmaHz: l.PlasmaTHz * units.THz, ScatteringHz: l.ScatteringTHz * units.THz}
			for _, o := range l.Oscillators {
				d.Oscillators = append(d.Oscillators, Oscillator{FreqHz: o.FreqTHz * units.THz, WidthHz: o.WidthTHz * units.THz, DeltaEps: o.DeltaEps})
			}
			m.Model = d
		}
		if models != 1 {
			return nil, fmt.Errorf("optics: material catalogue: %q: %d models given, exactly one of constant, table, lorentz expected", e.Name, models)
		}
		if err := m.Validate(); err != nil {
			return nil, fmt.Errorf("optics: material catalogue: %w", err)
		}
		out = append(out, m)
	}
	return out, nil
}

// copyMaterial returns a copy that shares nothing mutable with the catalogue
// (a Tabulated is immutable; a Dielectric's oscillator slice is copied).
func copyMaterial(m Material) Material {
	if d, ok := m.Model.(Dielectric); ok {
		d.Oscillators = append([]Oscillator(nil), d.Oscillators...)
		m.Model = d
	}
	return m
}

// Catalogue returns the embedded, read-only material catalogue, in a fixed
// order, as copies that the caller may modify freely. Each entry names its
// source and its validity range.
func Catalogue() []Material {
	ms, err := loadCatalogue()
	if err != nil {
		return nil // cannot happen for the embedded file; TestCatalogueParses guards it
	}
	out := make([]Material, len(ms))
	for i, m := range ms {
		out[i] = copyMaterial(m)
	}
	return out
}

// ErrUnknownMaterial is wrapped by the error Lookup returns for a name that
// is not in the catalogue.
var ErrUnknownMaterial = errors.New("unknown material")

// Lookup returns the catalogue entry with the given name (case and
// surrounding space ignored). For an unknown name the error names it and
// lists the closest catalogue names (by edit distance, or containing the
// name); it wraps ErrUnknownMaterial.
func Lookup(name string) (Material, error) {
	ms, err := loadCatalogue()
	if err != nil {
		return Material{}, err
	}
	key := strings.ToLower(strings.TrimSpace(name))
	for _, m := range ms {
		if m.Name == key {
			return copyMaterial(m), nil
		}
	}
	type cand struct {
		name string
		dist int
	}
	var cs []cand
	for _, m := range ms {
		d := editDistance(key, m.Name)
		if key != "" && (strings.Contains(m.Name, key) || strings.Contains(key, m.Name)) {
			d = 0
		}
		if d <= max(2, len(key)/3) {
			cs = append(cs, cand{m.Name, d})
		}
	}
	sort.SliceStable(cs, func(i, j int) bool { return cs[i].dist < cs[j].dist })
	var names []string
	for i, c := range cs {
		if i == 5 {
			break
		}
		names = append(names, c.name)
	}
	if len(names) == 0 {
		for _, m := range ms {
			names = append(names, m.Name)
		}
		return Material{}, fmt.Errorf("optics: %w %q; the catalogue has: %s", ErrUnknownMaterial, name, strings.Join(names, ", "))
	}
	return Material{}, fmt.Errorf("optics: %w %q; close names: %s", ErrUnknownMaterial, name, strings.Join(names, ", "))
}

// editDistance is the Levenshtein distance between a and b.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
