package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

func runMaterials(a *app, args []string) error {
	fs := flag.NewFlagSet("materials", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	csvPath := fs.String("csv", "", "write the catalogue to FILE as CSV; '-' is standard output")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive materials [flags]

The embedded catalogue of window, filter and detector materials: the name
to use in --window and --sample (and as medium.material in a scenario),
the index n + i·kappa at 1 THz as a reminder, the frequency range where the
data hold (outside it the service cautions), and where the values come
from.

Example:
  thzdrive materials
  thzdrive propagate --window silicon-hr:2mm --sample znte --peak-field "200 kV/cm"

Flags:
`)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.ListMaterials(ctx, &thzdrivev1.ListMaterialsRequest{})
	if err != nil {
		return err
	}
	if *csvPath != "" {
		if err := a.writeMaterialsCSV(*csvPath, resp.Materials); err != nil {
			return err
		}
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	w := a.reportWriter(*csvPath)
	title := "thzdrive: material catalogue"
	fmt.Fprintf(w, "%s\n%s\n\n", title, strings.Repeat("=", len(title)))
	rows := [][]string{{"name", "n (1 THz)", "kappa (1 THz)", "valid (THz)", "data at (K)"}}
	for _, m := range resp.Materials {
		rows = append(rows, []string{m.Name, fmt.Sprintf("%.4f", m.NAt_1Thz), num(m.KappaAt_1Thz),
			validRange(m), tempText(m.TemperatureK)})
	}
	printGrid(w, rows, []bool{false, true, true, true, true})
	fmt.Fprintf(w, "\nWhat each is, and where its numbers come from:\n")
	for _, m := range resp.Materials {
		fmt.Fprintf(w, "\n  %s\n    %s\n    Source: %s\n", m.Name, wrap(m.Description, 74, "    "), wrap(m.Source, 66, "    "))
	}
	fmt.Fprintf(w, "\n%s\n", safetyLine)
	return nil
}

func validRange(m *thzdrivev1.Material) string {
	if m.ValidToThz == 0 {
		return fmt.Sprintf("from %s", num(m.ValidFromThz))
	}
	return fmt.Sprintf("%s – %s", num(m.ValidFromThz), num(m.ValidToThz))
}

func tempText(t float64) string {
	if t == 0 {
		return "–"
	}
	return num(t)
}

// printGrid prints rows as columns: right-aligned where right[i], else left.
func printGrid(w io.Writer, rows [][]string, right []bool) {
	widths := make([]int, len(right))
	for _, r := range rows {
		for i, c := range r {
			widths[i] = max(widths[i], width(c))
		}
	}
	for _, r := range rows {
		var b strings.Builder
		b.WriteString("  ")
		for i, c := range r {
			if i > 0 {
				b.WriteString("  ")
			}
			switch {
			case right[i]:
				b.WriteString(pad(c, widths[i]))
			default:
				b.WriteString(c + strings.Repeat(" ", widths[i]-width(c)))
			}
		}
		fmt.Fprintln(w, b.String())
	}
}

func (a *app) writeMaterialsCSV(path string, ms []*thzdrivev1.Material) error {
	var w io.Writer = a.stdout
	if path != "-" {
		f, err := os.Create(path)
		if err != nil {
			return usagef("--csv: %v", err)
		}
		defer f.Close()
		w = f
	}
	var b strings.Builder
	b.WriteString("name,n at 1 THz,kappa at 1 THz,valid from (THz),valid to (THz; 0 unbounded),temperature (K; 0 not stated),description,source\n")
	for _, m := range ms {
		b.WriteString(strings.Join(csvQuote([]string{m.Name, fmtFloat(m.NAt_1Thz), fmtFloat(m.KappaAt_1Thz),
			fmtFloat(m.ValidFromThz), fmtFloat(m.ValidToThz), fmtFloat(m.TemperatureK), m.Description, m.Source}), ","))
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}
