package tdsfit

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
)

// InputError reports input that cannot be computed. Field names the
// offending input the way a caller wrote it ("Sample.StepS",
// "ExtractOptions.ThicknessM", "eps[12]"), so that a server can turn it into
// a field violation; Reason says what is wrong.
type InputError struct {
	Field  string
	Reason string
	cause  error
}

func (e *InputError) Error() string { return "tdsfit: " + e.Field + ": " + e.Reason }

// Unwrap lets errors.Is find a sentinel (ErrNoBand, ErrNotDetermined) that
// the reason wraps.
func (e *InputError) Unwrap() error { return e.cause }

func inputErr(field, format string, args ...any) error {
	return &InputError{Field: field, Reason: fmt.Sprintf(format, args...)}
}

// wrapErr is inputErr with a sentinel that errors.Is finds.
func wrapErr(sentinel error, field, format string, args ...any) error {
	return &InputError{Field: field, Reason: fmt.Sprintf(format, args...), cause: sentinel}
}

var (
	// ErrNoBand is wrapped by the errors returned when no usable band is
	// left: the spectra do not rise above their noise floors by the margin,
	// or no frequency meets the accuracy asked for.
	ErrNoBand = errors.New("no usable band")
	// ErrNotDetermined is wrapped by the error FitDielectric returns when the
	// data do not determine the parameters (a singular normal matrix JᵀJ).
	ErrNotDetermined = errors.New("parameters not determined by the data")
)

// finite reports whether x is neither NaN nor ±Inf.
func finite(x float64) bool { return x-x == 0 }

// finiteC reports whether both parts of z are finite.
func finiteC(z complex128) bool { return finite(real(z)) && finite(imag(z)) }

// wrapPhase maps a phase difference into (-π, π].
func wrapPhase(d float64) float64 {
	d = math.Remainder(d, 2*math.Pi)
	if d <= -math.Pi {
		d += 2 * math.Pi
	}
	return d
}

// cabs is cmplx.Abs, named for brevity in formulas.
func cabs(z complex128) float64 { return cmplx.Abs(z) }
