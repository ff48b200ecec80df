package main

import (
	"flag"
	"fmt"
)

// demoNotice says plainly that the demo's numbers are made up.
const demoNotice = `This demo is an INVENTED scenario: the source, the optics and the sample
below are made up to show what thzdrive computes. They describe no real
instrument or material measurement.`

// demoArgs is the invented scenario, written as the command lines a person
// would type, so the demo exercises exactly the public interface.
var demoArgs = [][]string{
	// An invented table-top source: a single-cycle pulse peaking at 0.8 THz.
	{"analyze", "--shape", "single-cycle", "--peak-frequency", "0.8 THz", "--peak-field", "1 kV/cm", "--step", "10 fs", "--span", "30 ps"},
	// Its pulse energy and focal spot, as the invented lab measured them.
	{"calibrate", "--shape", "single-cycle", "--peak-frequency", "0.8 THz", "--step", "10 fs", "--span", "30 ps",
		"--energy", "2 uJ", "--spot-fwhm", "700 um", "--focus"},
}

func runDemo(a *app, args []string) error {
	fs := flag.NewFlagSet("demo", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), "Usage: thzdrive demo\n\nRuns the built-in invented scenario end to end (in-process unless --server is given).\n")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return usageIfNotHelp(err)
	}
	fmt.Fprintf(a.stdout, "%s\n\n", demoNotice)
	for _, step := range demoArgs {
		fmt.Fprintf(a.stdout, "$ thzdrive %s\n\n", quoteArgs(step))
		for _, c := range commands {
			if c.name == step[0] {
				if err := c.run(a, step[1:]); err != nil {
					return err
				}
			}
		}
		fmt.Fprintln(a.stdout)
	}
	return nil
}

func quoteArgs(args []string) string {
	out := ""
	for i, s := range args {
		if i > 0 {
			out += " "
		}
		if containsSpace(s) {
			out += fmt.Sprintf("%q", s)
		} else {
			out += s
		}
	}
	return out
}

func containsSpace(s string) bool {
	for _, r := range s {
		if r == ' ' {
			return true
		}
	}
	return false
}
