package main

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/status"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// safetyLine closes every report for a person.
const safetyLine = `LASER SAFETY: the pump lasers behind table-top THz sources are class 4, and
THz and near-infrared beams are invisible. These numbers plan an experiment;
they do not make it safe. Your local laser safety officer, your facility's
rules and IEC 60825-1 / ANSI Z136.1 govern.`

// report is a table for a person: titled sections of label, value, unit rows.
type report struct {
	title    string
	sections []section
	cautions []*thzdrivev1.Caution
}

type section struct {
	title string
	rows  [][3]string
}

func (r *report) section(title string) *section {
	r.sections = append(r.sections, section{title: title})
	return &r.sections[len(r.sections)-1]
}

// add appends a row with a number printed to 4 significant digits.
func (s *section) add(label string, x float64, unit string) {
	s.rows = append(s.rows, [3]string{label, num(x), unit})
}

// text appends a row with a value that is not a number.
func (s *section) text(label, value string) {
	s.rows = append(s.rows, [3]string{label, value, ""})
}

func num(x float64) string {
	if x == 0 || math.IsNaN(x) {
		return fmt.Sprint(x)
	}
	return fmt.Sprintf("%.4g", x)
}

func (r *report) print(w io.Writer) {
	fmt.Fprintf(w, "%s\n%s\n", r.title, strings.Repeat("=", len([]rune(r.title))))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	for _, s := range r.sections {
		fmt.Fprintf(tw, "\n%s\t\t\t\n", s.title)
		for _, row := range s.rows {
			fmt.Fprintf(tw, "  %s\t%s\t %s\t\n", row[0], row[1], row[2])
		}
	}
	tw.Flush()
	fmt.Fprintln(w)
	printCautions(w, r.cautions)
	fmt.Fprintf(w, "\n%s\n", safetyLine)
}

func printCautions(w io.Writer, cs []*thzdrivev1.Caution) {
	if len(cs) == 0 {
		fmt.Fprintln(w, "Cautions: none")
		return
	}
	fmt.Fprintf(w, "Cautions (%d):\n", len(cs))
	for _, c := range cs {
		code := strings.TrimPrefix(c.Code.String(), "CAUTION_CODE_")
		stage := ""
		if c.Stage != "" {
			stage = "[" + c.Stage + "] "
		}
		fmt.Fprintf(w, "  ! %s%s: %s\n", stage, code, c.Message)
		if len(c.Values) > 0 {
			var parts []string
			for _, v := range c.Values {
				parts = append(parts, fmt.Sprintf("%s=%s", v.Name, num(v.Value)))
			}
			fmt.Fprintf(w, "      %s\n", strings.Join(parts, "  "))
		}
	}
}

// printViolations lists the field paths of an INVALID_ARGUMENT error.
func printViolations(w io.Writer, st *status.Status) {
	for _, d := range st.Details() {
		br, ok := d.(*errdetails.BadRequest)
		if !ok {
			continue
		}
		for _, fv := range br.FieldViolations {
			fmt.Fprintf(w, "  %s: %s\n", fv.Field, fv.Description)
		}
	}
}
