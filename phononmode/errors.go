package phononmode

import (
	"errors"
	"fmt"
)

// Sentinel errors. Every error the package returns wraps one of them, so a
// caller (the server) can map it with errors.Is: ErrInvalidInput to a bad
// request, ErrTooLarge to exhausted resources, the others to a failed
// precondition with the message for a person.
var (
	// ErrInvalidInput: a parameter is NaN, infinite, out of its domain, or
	// missing. The error is an *InputError naming the field.
	ErrInvalidInput = errors.New("phononmode: invalid input")
	// ErrTooLarge: the computation would need more samples or time steps
	// than Options.MaxSamples allows.
	ErrTooLarge = errors.New("phononmode: computation too large")
	// ErrDiverged: the time-domain solution left every finite range (the
	// anharmonic potential lets the mode escape its well, or a result
	// overflows float64).
	ErrDiverged = errors.New("phononmode: solution diverged")
	// ErrDepthQuadrature: the depth average of a nonlinear response cannot
	// be resolved with the quadrature rules available (the probe depth is
	// many terahertz wavelengths).
	ErrDepthQuadrature = errors.New("phononmode: depth average not resolvable")
	// ErrUnreachable: no field scale up to the caller's maximum reaches the
	// sizing target.
	ErrUnreachable = errors.New("phononmode: target unreachable")
)

// InputError names the offending input and why it was refused.
type InputError struct {
	Field  string // Go name of the offending field, e.g. "Mode.FreqHz"
	Reason string // why it was refused, for a person
}

func (e *InputError) Error() string {
	return fmt.Sprintf("phononmode: invalid %s: %s", e.Field, e.Reason)
}

// Is reports that an *InputError is an ErrInvalidInput.
func (e *InputError) Is(target error) bool { return target == ErrInvalidInput }

func inputErr(field, format string, args ...any) error {
	return &InputError{Field: field, Reason: fmt.Sprintf(format, args...)}
}
