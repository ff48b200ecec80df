package main

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

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
	subtitle string // a line under the title (a scenario's label)
	sections []section
	cautions []*thzdrivev1.Caution
}

type section struct {
	title string
	rows  [][3]string
	// stages, when set, are the caution stages shown under this section
	// rather than at the end.
	stages []string
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

// print writes the report: labels left-aligned, numbers right-aligned in one
// column, units left-aligned after them, the same columns for every section;
// then the cautions and the laser-safety line.
func (r *report) print(w io.Writer) {
	fmt.Fprintf(w, "%s\n%s\n", r.title, strings.Repeat("=", len([]rune(r.title))))
	if r.subtitle != "" {
		fmt.Fprintln(w, r.subtitle)
	}
	shown := r.printTable(w)
	fmt.Fprintln(w)
	var rest []*thzdrivev1.Caution
	for i, c := range r.cautions {
		if !shown[i] {
			rest = append(rest, c)
		}
	}
	if len(rest) == 0 && len(r.cautions) > 0 {
		fmt.Fprintf(w, "Cautions: %d, each shown under its stage above\n", len(r.cautions))
	} else {
		printCautions(w, rest)
	}
	fmt.Fprintf(w, "\n%s\n", safetyLine)
}

// printTable writes the sections, each followed by the cautions of its
// stages, and returns which cautions it showed.
func (r *report) printTable(w io.Writer) (shown []bool) {
	shown = make([]bool, len(r.cautions))
	labelW, valueW := 0, 0
	for _, s := range r.sections {
		for _, row := range s.rows {
			labelW = max(labelW, width(row[0]))
			if !isTextRow(row) {
				valueW = max(valueW, width(row[1]))
			}
		}
	}
	for _, s := range r.sections {
		fmt.Fprintf(w, "\n%s\n", s.title)
		for _, row := range s.rows {
			label := row[0] + strings.Repeat(" ", labelW-width(row[0]))
			switch {
			case isTextRow(row) && width(row[1]) > valueW:
				// A long text value starts where the numbers start.
				fmt.Fprintf(w, "  %s  %s\n", label, row[1])
			case row[2] == "":
				fmt.Fprintf(w, "  %s  %s\n", label, pad(row[1], valueW))
			default:
				fmt.Fprintf(w, "  %s  %s %s\n", label, pad(row[1], valueW), row[2])
			}
		}
		for i, c := range r.cautions {
			if !shown[i] && slices.Contains(s.stages, c.Stage) {
				printCaution(w, c)
				shown[i] = true
			}
		}
	}
	return shown
}

// isTextRow tells a row added with text (no unit, value not a number).
func isTextRow(row [3]string) bool {
	if row[2] != "" {
		return false
	}
	_, err := strconv.ParseFloat(row[1], 64)
	return err != nil
}

func width(s string) int { return utf8.RuneCountInString(s) }

// pad right-aligns s in n columns.
func pad(s string, n int) string {
	if d := n - width(s); d > 0 {
		return strings.Repeat(" ", d) + s
	}
	return s
}

func printCautions(w io.Writer, cs []*thzdrivev1.Caution) {
	if len(cs) == 0 {
		fmt.Fprintln(w, "Cautions: none")
		return
	}
	fmt.Fprintf(w, "Cautions (%d):\n", len(cs))
	for _, c := range cs {
		printCaution(w, c)
	}
}

// printCaution writes one caution: its stage, code, sentence and the
// numbers behind it.
func printCaution(w io.Writer, c *thzdrivev1.Caution) {
	code := strings.TrimPrefix(c.Code.String(), "CAUTION_CODE_")
	stage := ""
	if c.Stage != "" {
		stage = "[" + c.Stage + "] "
	}
	fmt.Fprintf(w, "  ! %s\n", wrap(stage+code+": "+c.Message, 76, "      "))
	if len(c.Values) > 0 {
		var parts []string
		for _, v := range c.Values {
			parts = append(parts, fmt.Sprintf("%s=%s", v.Name, num(v.Value)))
		}
		fmt.Fprintf(w, "      %s\n", strings.Join(parts, "  "))
	}
}

// wrap breaks text into lines of at most width runes at spaces, each taken
// to start after an indent as wide as indent; lines after the first begin
// with indent (the caller writes the first line's own prefix).
func wrap(text string, width int, indent string) string {
	var b strings.Builder
	line := utf8.RuneCountInString(indent)
	for i, word := range strings.Fields(text) {
		n := utf8.RuneCountInString(word)
		if i > 0 {
			if line+1+n > width {
				b.WriteString("\n" + indent)
				line = utf8.RuneCountInString(indent)
			} else {
				b.WriteByte(' ')
				line++
			}
		}
		b.WriteString(word)
		line += n
	}
	return b.String()
}

// violations counts the field violations of an error status.
func violations(st *status.Status) int {
	n := 0
	for _, d := range st.Details() {
		if br, ok := d.(*errdetails.BadRequest); ok {
			n += len(br.FieldViolations)
		}
	}
	return n
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
