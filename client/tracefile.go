package client

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// ReadTrace reads a two-column trace as labs export it: time in ps, then
// field, one sample per line, separated by spaces, tabs, commas or
// semicolons. Lines starting with '#', '%' or '//' and blank lines are
// skipped, as are non-numeric header lines before the first sample. Further
// columns are ignored. The result has explicit times, so the server checks
// that they increase and resamples them if they are not uniform.
func ReadTrace(r io.Reader, unit thzdrivev1.FieldUnit) (*thzdrivev1.SampledTrace, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<16), 1<<24)
	tr := &thzdrivev1.SampledTrace{FieldUnit: unit}
	line := 0
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") || strings.HasPrefix(text, "%") || strings.HasPrefix(text, "//") {
			continue
		}
		cols := strings.FieldsFunc(text, func(r rune) bool {
			return r == ' ' || r == '\t' || r == ',' || r == ';'
		})
		if len(cols) < 2 {
			return nil, fmt.Errorf("line %d: want two columns (time in ps, field), got %q", line, text)
		}
		t, errT := strconv.ParseFloat(cols[0], 64)
		e, errE := strconv.ParseFloat(cols[1], 64)
		if errT != nil || errE != nil {
			if len(tr.TimePs) == 0 {
				continue // a header line before the data
			}
			return nil, fmt.Errorf("line %d: not two numbers: %q", line, text)
		}
		if math.IsNaN(t) || math.IsInf(t, 0) || math.IsNaN(e) || math.IsInf(e, 0) {
			return nil, fmt.Errorf("line %d: non-finite value in %q", line, text)
		}
		tr.TimePs = append(tr.TimePs, t)
		tr.Field = append(tr.Field, e)
	}
	if err := sc.Err(); err != nil {
		return nil, err
	}
	if len(tr.TimePs) == 0 {
		return nil, fmt.Errorf("no samples found")
	}
	return tr, nil
}
