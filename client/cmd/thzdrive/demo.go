package main

import (
	_ "embed"
	"flag"
	"fmt"
)

// demoScenario is the built-in INVENTED scenario. examples/demo-scenario.yaml
// at the top of the repository is the same file (a test keeps them equal):
// go:embed cannot reach outside this directory.
//
//go:embed demo-scenario.yaml
var demoScenario []byte

// demoNotice says plainly that the demo's numbers are made up.
const demoNotice = `This demo is an INVENTED scenario. The "Quillfire" bench source, the
"Frostwick" cryostat and the crystal "Vexlorite" do not exist; the numbers
are made up to show what thzdrive computes and describe no real instrument
or material measurement. Only the window material (silicon-hr) is real
catalogue data.`

// demoGuide says what to read in the report; it names no result, which the
// service computes.
const demoGuide = `Read it stage by stage:
  1. the bench source, calibrated from its pulse energy and focal spot;
  2. what is left of that field just inside the crystal after the cryostat
     window, the attenuator and the crystal's own screening near its 2 THz
     phonon (the reststrahlen band);
  3. how hard that field drives the same phonon, in displacement, energy and
     quanta per cell;
  4. how far each pulse and the 1 kHz train heat the 10 K spot toward the
     invented 25 K transition.
Cautions are shown under the stage that raised them.`

// demoNext suggests what to try after the demo.
const demoNext = `Try next (save the scenario first: thzdrive demo --show-scenario > demo.yaml):
  thzdrive sweep demo.yaml --axis calibration.pulse_energy_uj=0.25:8:12:log
  thzdrive size --scenario demo.yaml --target-quanta 0.001
  thzdrive drive --scenario demo.yaml --csv q.csv`

func runDemo(a *app, args []string) error {
	fs := flag.NewFlagSet("demo", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	show := fs.Bool("show-scenario", false, "print the built-in scenario file (YAML) instead of running it")
	demoPlot := fs.String("plot", "", "also write the plan's figures (PNG and SVG) into DIR")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive demo [flags]

Runs 'thzdrive plan' on the built-in INVENTED scenario (a made-up source,
cryostat and sample; examples/demo-scenario.yaml is the same file): every
stage from the source to the heating, in-process, with no server needed.

Examples:
  thzdrive demo
  thzdrive demo --show-scenario > my-scenario.yaml

Flags:
`)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	if *show {
		_, err := a.stdout.Write(demoScenario)
		return err
	}
	req, err := decodeScenario(demoScenario, "demo-scenario.yaml")
	if err != nil {
		return fmt.Errorf("built-in scenario: %w", err)
	}
	notes := a.stdout
	if a.asJSON {
		notes = a.stderr // keep standard output valid JSON
	}
	fmt.Fprintf(notes, "%s\n\n%s\n\n$ thzdrive plan demo-scenario.yaml\n\n", demoNotice, demoGuide)
	if err := a.plan(req, "", "", *demoPlot); err != nil {
		return err
	}
	fmt.Fprintf(notes, "\n%s\n", demoNext)
	return nil
}
