package optics

import "fmt"

// InputError reports input that cannot be computed: a NaN, an infinity, a
// negative thickness, an unknown material, an angle at or beyond grazing, a
// medium that returns an index with κ < 0. Field is the path of the offending
// value in Go terms, for example "Sample.Layers[2].ThicknessM" or
// "Elements[0].Medium", so that a caller can map it to its own field names;
// Name is the caller's label of that layer or element (Layer.Name,
// Slab.Name, ...), if it gave one; Reason says what is wrong.
type InputError struct {
	Field  string
	Name   string
	Reason string
}

func (e *InputError) Error() string {
	return "optics: " + describe(e.Field, e.Name) + ": " + e.Reason
}

func inputErr(field, format string, args ...any) error {
	return &InputError{Field: field, Reason: fmt.Sprintf(format, args...)}
}

func inputErrN(field, name, format string, args ...any) error {
	return &InputError{Field: field, Name: name, Reason: fmt.Sprintf(format, args...)}
}

// describe joins a field path and the caller's label for messages.
func describe(field, name string) string {
	if name == "" {
		return field
	}
	return fmt.Sprintf("%s (%q)", field, name)
}

// finite reports whether x is neither NaN nor infinite: x - x is 0 for
// finite x and NaN otherwise.
func finite(x float64) bool { return x-x == 0 }

func finiteC(z complex128) bool { return finite(real(z)) && finite(imag(z)) }
