package server

import (
	"fmt"
	"math"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
)

// violations collects every problem of one request, so a caller learns all of
// them at once. It is the server's one validation layer: each translator
// checks the wire message it reads with these helpers and returns
// violations.err(), an INVALID_ARGUMENT status with a google.rpc.BadRequest
// detail naming each field path (proto field names, with [i] for elements).
type violations struct {
	list   *[]*errdetails.BadRequest_FieldViolation
	prefix string
}

// under returns a view of v that prefixes every field path it records, for
// a message nested in another (the drive of a SizeFieldRequest, say).
func (v *violations) under(prefix string) *violations {
	if v.list == nil {
		v.list = new([]*errdetails.BadRequest_FieldViolation)
	}
	return &violations{list: v.list, prefix: v.prefix + prefix}
}

// maxReported bounds the detail size when, say, every sample of a long trace
// is NaN; the message says how many more there were.
const maxReported = 20

func (v *violations) add(field, format string, args ...any) {
	if v.list == nil {
		v.list = new([]*errdetails.BadRequest_FieldViolation)
	}
	*v.list = append(*v.list, &errdetails.BadRequest_FieldViolation{
		Field:       v.prefix + field,
		Description: fmt.Sprintf(format, args...),
	})
}

func (v *violations) ok() bool { return v.list == nil || len(*v.list) == 0 }

// finite reports whether x is a finite number, recording a violation if not.
func (v *violations) finite(field string, x float64) bool {
	if math.IsNaN(x) {
		v.add(field, "must be a number, got NaN")
		return false
	}
	if math.IsInf(x, 0) {
		v.add(field, "must be finite, got %v", x)
		return false
	}
	return true
}

// positive requires a finite x > 0.
func (v *violations) positive(field string, x float64) bool {
	if !v.finite(field, x) {
		return false
	}
	if x <= 0 {
		v.add(field, "must be > 0, got %g", x)
		return false
	}
	return true
}

// nonNegative requires a finite x >= 0.
func (v *violations) nonNegative(field string, x float64) bool {
	if !v.finite(field, x) {
		return false
	}
	if x < 0 {
		v.add(field, "must be >= 0, got %g", x)
		return false
	}
	return true
}

// within requires a finite lo <= x <= hi.
func (v *violations) within(field string, x, lo, hi float64) bool {
	if !v.finite(field, x) {
		return false
	}
	if x < lo || x > hi {
		v.add(field, "must be in [%g, %g], got %g", lo, hi, x)
		return false
	}
	return true
}

// allFinite checks every element of xs, reporting at most maxReported.
func (v *violations) allFinite(field string, xs []float64) bool {
	bad := 0
	for i, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			if bad < maxReported {
				v.finite(fmt.Sprintf("%s[%d]", field, i), x)
			}
			bad++
		}
	}
	if bad > maxReported {
		v.add(field, "%d more non-finite values not listed", bad-maxReported)
	}
	return bad == 0
}

// err returns nil when no violation was recorded.
func (v *violations) err() error {
	if v.ok() {
		return nil
	}
	list := *v.list
	msg := fmt.Sprintf("invalid request: %s: %s", list[0].Field, list[0].Description)
	if n := len(list); n > 1 {
		msg += fmt.Sprintf(" (and %d more)", n-1)
	}
	st, err := status.New(codes.InvalidArgument, msg).WithDetails(&errdetails.BadRequest{FieldViolations: list})
	if err != nil {
		return status.Error(codes.InvalidArgument, msg)
	}
	return st.Err()
}

// invalid is a one-violation shortcut for errors found while computing (for
// example a physics package rejecting a combination of valid fields).
func invalid(field string, err error) error {
	var v violations
	v.add(field, "%v", err)
	return v.err()
}
