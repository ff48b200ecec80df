package main

import (
	"bytes"
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// runCLI runs the command line in-process (no --server: the service runs
// in-process too) and returns the exit code and both outputs.
func runCLI(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var stdout, stderr bytes.Buffer
	code := run(args, &stdout, &stderr)
	return code, stdout.String(), stderr.String()
}

// demoFile writes the built-in scenario to a temporary file.
func demoFile(t *testing.T) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "demo.yaml")
	if err := os.WriteFile(p, demoScenario, 0o600); err != nil {
		t.Fatal(err)
	}
	return p
}

// Simple inputs for every subcommand; {demo} stands for the scenario file,
// {ref} and {sam} for a reference and a sample trace (see tdsFiles).
var simpleArgs = map[string][]string{
	"analyze":   {"analyze", "--peak-frequency", "1 THz", "--peak-field", "100 kV/cm"},
	"calibrate": {"calibrate", "--peak-frequency", "1 THz", "--energy", "1 uJ", "--spot-radius", "500 um"},
	"propagate": {"propagate", "--peak-field", "300 kV/cm", "--peak-frequency", "1 THz", "--window", "silicon-hr:1mm", "--sample", "znte"},
	"drive": {"drive", "--peak-field", "1 MV/cm", "--peak-frequency", "5 THz", "--mode-frequency", "8 THz",
		"--linewidth", "0.3 THz", "--delta-eps", "0.5", "--cell-volume", "45 A3", "--effective-mass", "40 amu", "--bond-length", "2.4 A"},
	"size": {"size", "--target-displacement", "1 pm", "--spot-fwhm", "400 um", "--source-limit", "3 uJ", "--peak-frequency", "5 THz",
		"--mode-frequency", "8 THz", "--linewidth", "0.3 THz", "--delta-eps", "0.5", "--cell-volume", "45", "--effective-mass", "40"},
	"heat": {"heat", "--fluence", "150 uJ/cm2", "--absorbed-fraction", "0.3", "--absorption-depth", "20 um",
		"--debye-temperature", "300 K", "--atoms-per-nm3", "50", "--base-temperature", "10 K", "--tc", "25 K",
		"--rep-rate", "1 kHz", "--spot-radius", "340 um", "--conductivity", "5 W/(m K)"},
	"materials": {"materials"},
	"plan":      {"plan", "{demo}"},
	"sweep":     {"sweep", "{demo}", "--axis", "calibration.pulse_energy_uj=1:2:2"},
	"demo":      {"demo"},
	"extract":   {"extract", "{ref}", "{sam}", "--thickness", "500 um"},
	"fit":       {"fit", "{ref}", "{sam}", "--thickness", "500 um", "--eps-inf", "11"},
	"correct":   {"correct", "{ref}", "--crystal-thickness", "1 mm"},
}

func withDemo(t *testing.T, args []string) []string {
	out := make([]string, len(args))
	for i, a := range args {
		switch a {
		case "{demo}":
			a = demoFile(t)
		case "{ref}":
			a, _ = tdsFiles(t)
		case "{sam}":
			_, a = tdsFiles(t)
		}
		out[i] = a
	}
	return out
}

func TestEveryCommandHasSimpleInputs(t *testing.T) {
	for _, c := range commands {
		if _, ok := simpleArgs[c.name]; !ok {
			t.Errorf("command %q has no simple inputs in this test", c.name)
		}
	}
}

func TestSubcommandsReport(t *testing.T) {
	tests := []struct {
		name string
		want []string // in the report besides the safety line
	}{
		{"analyze", []string{"spectral peak", "THz"}},
		{"calibrate", []string{"peak |E|", "kV/cm"}},
		{"propagate", []string{"peak |E| at the target", "silicon-hr", "bulk znte"}},
		{"drive", []string{"max |Q|", "Å·sqrt(amu)", "displacement / bond length"}},
		{"size", []string{"What it takes", "pulse energy", "source margin"}},
		{"heat", []string{"peak temperature", "Transition budget", "margin Tc - peak"}},
		{"materials", []string{"silicon-hr", "valid (THz)", "Source:"}},
		{"plan", []string{"1. Source", "2. Optics", "3. Mode", "4. Heating", "[optics]", "INVENTED"}},
		{"sweep", []string{"calibration.pulse_energy_uj (uJ),", "points received"}},
		{"demo", []string{"INVENTED", "1. Source", "4. Heating"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := runCLI(t, withDemo(t, simpleArgs[tc.name])...)
			if code != exitOK {
				t.Fatalf("exit %d, stderr:\n%s", code, stderr)
			}
			all := stdout + stderr // sweep's summary goes to stderr when its CSV goes to stdout
			if !strings.Contains(all, safetyLine) {
				t.Errorf("no laser-safety line in:\n%s", all)
			}
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("report lacks %q:\n%s", w, all)
				}
			}
		})
	}
}

func TestHelp(t *testing.T) {
	code, stdout, _ := runCLI(t, "help")
	if code != exitOK {
		t.Fatalf("help: exit %d", code)
	}
	for _, c := range commands {
		if !strings.Contains(stdout, "  "+c.name+" ") {
			t.Errorf("help does not list %q:\n%s", c.name, stdout)
		}
	}
	if !strings.Contains(stdout, safetyLine) {
		t.Error("help lacks the laser-safety line")
	}
	// Each command's own help teaches: what it computes and an example.
	for _, c := range commands {
		for _, args := range [][]string{{"help", c.name}, {c.name, "-h"}} {
			code, stdout, stderr := runCLI(t, args...)
			if code != exitOK {
				t.Errorf("%v: exit %d, stderr %s", args, code, stderr)
			}
			if !strings.Contains(stdout, "Usage: thzdrive "+c.name) || !strings.Contains(stdout, "Example") {
				t.Errorf("%v: help lacks usage or an example:\n%s", args, stdout)
			}
		}
	}
}

// reportAndJSON runs a command twice, with and without --json, and decodes
// the JSON into m.
func reportAndJSON(t *testing.T, args []string, m proto.Message) string {
	t.Helper()
	code, report, stderr := runCLI(t, args...)
	if code != exitOK {
		t.Fatalf("%v: exit %d\n%s", args, code, stderr)
	}
	code, js, stderr := runCLI(t, append([]string{"--json"}, args...)...)
	if code != exitOK {
		t.Fatalf("--json %v: exit %d\n%s", args, code, stderr)
	}
	if err := protojson.Unmarshal([]byte(js), m); err != nil {
		t.Fatalf("--json %v: not a %T: %v\n%s", args, m, err, js)
	}
	return report
}

// reportRow returns the value column of the report row with this label.
func reportRow(report, label string) string {
	for _, line := range strings.Split(report, "\n") {
		rest, ok := strings.CutPrefix(line, "  "+label+"  ")
		if !ok {
			continue
		}
		f := strings.Fields(rest)
		if len(f) > 0 {
			return f[0]
		}
	}
	return ""
}

// TestJSONMatchesReport checks that --json is the response message and that
// the report shows the same numbers (consistency, no physics values).
func TestJSONMatchesReport(t *testing.T) {
	demo := demoFile(t)
	tests := []struct {
		name  string
		args  []string
		msg   proto.Message
		check func(m proto.Message) map[string]float64 // report label -> JSON value
	}{
		{"propagate", simpleArgs["propagate"], &thzdrivev1.PropagateResponse{}, func(m proto.Message) map[string]float64 {
			r := m.(*thzdrivev1.PropagateResponse)
			return map[string]float64{"peak |E| at the target": r.TargetPeakFieldKvPerCm, "absorbed in the target layer": r.AbsorbedFraction}
		}},
		{"drive", simpleArgs["drive"], &thzdrivev1.DriveModeResponse{}, func(m proto.Message) map[string]float64 {
			d := m.(*thzdrivev1.DriveModeResponse).Drive
			return map[string]float64{"max |Q|": d.MaxQASqrtAmu, "peak ion displacement": d.DisplacementPm, "field-to-mode overlap": d.Overlap}
		}},
		{"size", simpleArgs["size"], &thzdrivev1.SizeFieldResponse{}, func(m proto.Message) map[string]float64 {
			r := m.(*thzdrivev1.SizeFieldResponse)
			return map[string]float64{"incident peak |E|": r.IncidentPeakFieldKvPerCm, "pulse energy": r.PulseEnergyUj}
		}},
		{"heat", simpleArgs["heat"], &thzdrivev1.EstimateHeatingResponse{}, func(m proto.Message) map[string]float64 {
			b := m.(*thzdrivev1.EstimateHeatingResponse).Budget
			return map[string]float64{"peak temperature": b.PeakTemperatureK, "steady-state temperature": b.SteadyStateTemperatureK}
		}},
		{"plan", []string{"plan", demo}, &thzdrivev1.PlanExperimentResponse{}, func(m proto.Message) map[string]float64 {
			r := m.(*thzdrivev1.PlanExperimentResponse)
			return map[string]float64{"incident peak |E|": r.Source.PeakFieldKvPerCm, "peak |E| at the target": r.Optics.TargetPeakFieldKvPerCm,
				"max |Q|": r.Mode.MaxQASqrtAmu, "peak temperature": r.Heating.PeakTemperatureK}
		}},
		{"materials", simpleArgs["materials"], &thzdrivev1.ListMaterialsResponse{}, nil},
		{"analyze", simpleArgs["analyze"], &thzdrivev1.AnalyzePulseResponse{}, func(m proto.Message) map[string]float64 {
			return map[string]float64{"spectral peak": m.(*thzdrivev1.AnalyzePulseResponse).Metrics.SpectralPeakThz}
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			report := reportAndJSON(t, tc.args, tc.msg)
			if tc.check == nil {
				return
			}
			for label, x := range tc.check(tc.msg) {
				if got, want := reportRow(report, label), num(x); got != want {
					t.Errorf("report row %q shows %q, JSON has %v (%s)", label, got, x, want)
				}
			}
		})
	}
}

func TestDemoJSONKeepsStdoutClean(t *testing.T) {
	code, stdout, stderr := runCLI(t, "--json", "demo")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var resp thzdrivev1.PlanExperimentResponse
	if err := protojson.Unmarshal([]byte(stdout), &resp); err != nil {
		t.Fatalf("demo --json is not a PlanExperimentResponse: %v", err)
	}
	if !strings.Contains(stderr, "INVENTED") {
		t.Error("the invented-scenario notice should still reach the person (stderr)")
	}
}

func TestWrongUnitIsUsageError(t *testing.T) {
	tests := []struct {
		args     []string
		accepted string // one of the accepted units the message must name
	}{
		{[]string{"propagate", "--peak-field", "1 cm"}, "kv/cm"},
		{[]string{"analyze", "--peak-frequency", "2 K"}, "cm-1"},
		{[]string{"heat", "--base-temperature", "10 uJ"}, "k"},
		{[]string{"heat", "--conductivity", "5 W"}, "w/(m k)"},
		{[]string{"drive", "--cell-volume", "45 kg"}, "å3"},
		{[]string{"size", "--target-displacement", "1 THz"}, "pm"},
		{[]string{"propagate", "--window", "silicon-hr:1 kV/cm"}, "um"},
		{[]string{"sweep", "x.yaml", "--axis", "heating.base_temperature_k=5 K,1 cm"}, "k"},
	}
	for _, tc := range tests {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			code, _, stderr := runCLI(t, tc.args...)
			if code != exitUsage {
				t.Fatalf("exit %d, want %d; stderr:\n%s", code, exitUsage, stderr)
			}
			if !strings.Contains(stderr, tc.accepted) {
				t.Errorf("message does not name the accepted unit %q:\n%s", tc.accepted, stderr)
			}
			if strings.Contains(stderr, "Flags:") {
				t.Errorf("a usage error should not print the whole help:\n%s", stderr)
			}
		})
	}
}

func TestUnknownMaterialNamesFieldPath(t *testing.T) {
	badScenario := filepath.Join(t.TempDir(), "bad.yaml")
	bad := strings.Replace(string(demoScenario), "material: silicon-hr", "material: unobtainium", 1)
	if err := os.WriteFile(badScenario, []byte(bad), 0o600); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		args []string
		path string
	}{
		{[]string{"propagate", "--window", "unobtainium:1mm"}, "train[0].slab.medium.material"},
		{[]string{"propagate", "--sample", "unobtainium"}, "sample.exit_medium.material"},
		{[]string{"drive", "--scenario", badScenario}, "train[0].slab.medium.material"},
		{[]string{"plan", badScenario}, "train[0].slab.medium.material"},
	}
	for _, tc := range tests {
		t.Run(strings.Join(tc.args[:2], " "), func(t *testing.T) {
			code, _, stderr := runCLI(t, tc.args...)
			if code != exitRefused {
				t.Fatalf("exit %d, want %d; stderr:\n%s", code, exitRefused, stderr)
			}
			if !strings.Contains(stderr, tc.path) || !strings.Contains(stderr, "unobtainium") {
				t.Errorf("message lacks the field path %q:\n%s", tc.path, stderr)
			}
		})
	}
}

func TestUsageErrors(t *testing.T) {
	tests := []struct {
		args []string
		want string
	}{
		{[]string{"plan"}, "one scenario file"},
		{[]string{"plan", "no-such-file.yaml"}, "no-such-file.yaml"},
		{[]string{"sweep", "x.yaml"}, "--axis"},
		{[]string{"sweep", "x.yaml", "--axis", "mode.frequency_thz"}, "PATH=START:STOP:COUNT"},
		{[]string{"size", "--spot-radius", "300um", "--mode-frequency", "2THz"}, "one target"},
		{[]string{"drive", "--peak-field", "1 MV/cm"}, "describe the mode"},
		{[]string{"propagate", "--energy", "2 uJ"}, "focal spot"},
		{[]string{"propagate", "--window", "silicon-hr"}, "MATERIAL:THICKNESS"},
		{[]string{"heat", "--film-thickness", "50 nm", "--absorption-depth", "1 um"}, "not both"},
		{[]string{"materials", "extra"}, "takes no arguments"},
		{[]string{"drive", "--scenario", "{demo}", "--mode-frequency", "3 THz"}, "--oscillator -1"},
	}
	for _, tc := range tests {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			code, _, stderr := runCLI(t, withDemo(t, tc.args)...)
			if code != exitUsage {
				t.Fatalf("exit %d, want %d; stderr:\n%s", code, exitUsage, stderr)
			}
			if !strings.Contains(stderr, tc.want) {
				t.Errorf("stderr lacks %q:\n%s", tc.want, stderr)
			}
		})
	}
}

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.FieldsPerRecord = -1
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatalf("%s is not CSV: %v", path, err)
	}
	return rows
}

// TestCSV checks that each --csv table has a header naming its columns with
// units and as many rows as the response has samples.
func TestCSV(t *testing.T) {
	dir := t.TempDir()
	demo := demoFile(t)
	out := func(name string) string { return filepath.Join(dir, name) }
	tests := []struct {
		name   string
		args   []string
		file   string
		header []string
		rows   func(t *testing.T) int // data rows expected, from the --json response
	}{
		{"propagate", append(append([]string{}, simpleArgs["propagate"]...), "--csv", out("p.csv")), "p.csv",
			[]string{"time (ps)", "field at target (kV/cm)"}, func(t *testing.T) int {
				var r thzdrivev1.PropagateResponse
				reportAndJSON(t, simpleArgs["propagate"], &r)
				return len(r.FieldAtTarget.Field)
			}},
		{"propagate transfer", append(append([]string{}, simpleArgs["propagate"]...), "--transfer-csv", out("t.csv")), "t.csv",
			[]string{"frequency (THz)", "|t|", "arg t (rad)", "absorbed fraction"}, func(t *testing.T) int {
				var r thzdrivev1.PropagateResponse
				reportAndJSON(t, simpleArgs["propagate"], &r)
				return len(r.Transfer.FrequencyThz)
			}},
		{"drive", append(append([]string{}, simpleArgs["drive"]...), "--csv", out("d.csv")), "d.csv",
			[]string{"time (ps)", "field inside (kV/cm)", "Q (Å·sqrt(amu))"}, func(t *testing.T) int {
				var r thzdrivev1.DriveModeResponse
				reportAndJSON(t, simpleArgs["drive"], &r)
				return len(r.Drive.Q.QASqrtAmu)
			}},
		{"plan", []string{"plan", demo, "--csv", out("plan.csv")}, "plan.csv",
			[]string{"time (ps)", "field inside (kV/cm)", "Q (Å·sqrt(amu))"}, func(t *testing.T) int {
				var r thzdrivev1.PlanExperimentResponse
				reportAndJSON(t, []string{"plan", demo}, &r)
				return len(r.Mode.Q.QASqrtAmu)
			}},
		{"sweep", []string{"sweep", demo, "--csv", out("s.csv"), "--axis", "calibration.pulse_energy_uj=0.5:4:4:log", "--axis", "heating.base_temperature_k=5,10"}, "s.csv",
			append([]string{"calibration.pulse_energy_uj (uJ)", "heating.base_temperature_k (K)"}, headlineColumns...),
			func(*testing.T) int { return 8 }},
		{"materials", []string{"materials", "--csv", out("m.csv")}, "m.csv",
			[]string{"name", "n at 1 THz"}, func(t *testing.T) int {
				var r thzdrivev1.ListMaterialsResponse
				reportAndJSON(t, []string{"materials"}, &r)
				return len(r.Materials)
			}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := runCLI(t, tc.args...)
			if code != exitOK {
				t.Fatalf("exit %d:\n%s", code, stderr)
			}
			if !strings.Contains(stdout, safetyLine) {
				t.Error("with the table in a file, the report still goes to stdout with the safety line")
			}
			rows := readCSV(t, out(tc.file))
			if len(rows) == 0 {
				t.Fatal("empty table")
			}
			for i, h := range tc.header {
				if i >= len(rows[0]) || rows[0][i] != h {
					t.Fatalf("header %q, want it to start with %q", rows[0], tc.header)
				}
			}
			if got, want := len(rows)-1, tc.rows(t); got != want {
				t.Errorf("%d data rows, the response has %d", got, want)
			}
		})
	}
}

// With the table on standard output, the report moves to standard error so
// that the table stays clean.
func TestCSVOnStdout(t *testing.T) {
	for _, args := range [][]string{
		append(append([]string{}, simpleArgs["propagate"]...), "--csv", "-"),
		append(append([]string{}, simpleArgs["drive"]...), "--csv", "-"),
		{"materials", "--csv", "-"},
	} {
		code, stdout, stderr := runCLI(t, args...)
		if code != exitOK {
			t.Fatalf("%v: exit %d: %s", args, code, stderr)
		}
		rows, err := csv.NewReader(strings.NewReader(stdout)).ReadAll()
		if err != nil || len(rows) < 2 {
			t.Errorf("%v: stdout is not a CSV table (%v):\n%.300s", args, err, stdout)
		}
		if strings.Contains(stdout, safetyLine) || !strings.Contains(stderr, safetyLine) {
			t.Errorf("%v: the report (with the safety line) belongs on stderr", args)
		}
	}
}

// TestSweepQuietWhenNotATerminal: no progress when stderr is not a terminal
// (a buffer here); the table goes to the file and the summary to stdout.
func TestSweepQuietWhenNotATerminal(t *testing.T) {
	csvPath := filepath.Join(t.TempDir(), "s.csv")
	code, stdout, stderr := runCLI(t, "sweep", demoFile(t), "--axis", "calibration.pulse_energy_uj=1,2,3", "--csv", csvPath)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if stderr != "" {
		t.Errorf("stderr should be empty, got %q", stderr)
	}
	if !strings.Contains(stdout, "points received") {
		t.Errorf("no summary on stdout:\n%s", stdout)
	}
	rows := readCSV(t, csvPath)
	for i, row := range rows[1:] {
		if want := []string{"1", "2", "3"}[i]; row[0] != want {
			t.Errorf("row %d starts with %q, want %q (grid order)", i, row[0], want)
		}
	}
}

func TestSweepJSONLines(t *testing.T) {
	code, stdout, stderr := runCLI(t, "--json", "sweep", demoFile(t), "--axis", "calibration.pulse_energy_uj=1,2")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	lines := strings.Split(strings.TrimSpace(stdout), "\n")
	if len(lines) != 2 {
		t.Fatalf("%d lines, want one per point:\n%s", len(lines), stdout)
	}
	for _, l := range lines {
		var p thzdrivev1.SweepResponse
		if err := protojson.Unmarshal([]byte(l), &p); err != nil {
			t.Errorf("not a SweepResponse: %v: %s", err, l)
		}
	}
}

func TestDemo(t *testing.T) {
	code, stdout, stderr := runCLI(t, "demo")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, want := range []string{"INVENTED", "Vexlorite", "1. Source", "2. Optics", "3. Mode", "4. Heating", safetyLine} {
		if !strings.Contains(stdout, want) {
			t.Errorf("demo lacks %q", want)
		}
	}
	code, stdout, _ = runCLI(t, "demo", "--show-scenario")
	if code != exitOK || stdout != string(demoScenario) {
		t.Errorf("--show-scenario: exit %d, printed %d bytes, want the %d of the built-in file", code, len(stdout), len(demoScenario))
	}
}

// The examples/ copy is the file people read; the embedded copy is the one
// the demo runs. They must not drift.
func TestDemoScenarioMatchesExamples(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "..", "..", "examples", "demo-scenario.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(b, demoScenario) {
		t.Error("examples/demo-scenario.yaml and client/cmd/thzdrive/demo-scenario.yaml differ: copy one onto the other")
	}
}

// Every scenario in examples/ decodes, plans, and says it is invented.
func TestExampleScenarios(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("..", "..", "..", "examples", "*"))
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, f := range files {
		if ext := filepath.Ext(f); ext != ".yaml" && ext != ".yml" && ext != ".json" {
			continue
		}
		n++
		t.Run(filepath.Base(f), func(t *testing.T) {
			var resp thzdrivev1.PlanExperimentResponse
			report := reportAndJSON(t, []string{"plan", f}, &resp)
			if !strings.Contains(resp.GetResolved().GetLabel(), "INVENTED") || !strings.Contains(report, "INVENTED") {
				t.Error("an example scenario must say it is invented in its label")
			}
			for _, stage := range []string{"1. Source", "2. Optics", "3. Mode", "4. Heating"} {
				if !strings.Contains(report, stage) {
					t.Errorf("report lacks %q", stage)
				}
			}
		})
	}
	if n < 2 {
		t.Errorf("found %d example scenarios, want at least 2", n)
	}
}

// propagate and drive on a scenario (CalibrateField, then Propagate or
// DriveMode) must agree with plan on it (PlanExperiment): one chain.
func TestScenarioCommandsAgreeWithPlan(t *testing.T) {
	demo := demoFile(t)
	var plan thzdrivev1.PlanExperimentResponse
	var prop thzdrivev1.PropagateResponse
	var drive thzdrivev1.DriveModeResponse
	reportAndJSON(t, []string{"plan", demo}, &plan)
	reportAndJSON(t, []string{"propagate", "--scenario", demo}, &prop)
	reportAndJSON(t, []string{"drive", "--scenario", demo}, &drive)
	near := func(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b)) }
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"incident peak field", prop.IncidentPeakFieldKvPerCm, plan.Source.PeakFieldKvPerCm},
		{"target peak field", prop.TargetPeakFieldKvPerCm, plan.Optics.TargetPeakFieldKvPerCm},
		{"absorbed fraction", prop.AbsorbedFraction, plan.Optics.AbsorbedFraction},
		{"max |Q|", drive.Drive.MaxQASqrtAmu, plan.Mode.MaxQASqrtAmu},
		{"quanta", drive.Drive.Quanta, plan.Mode.Quanta},
	} {
		if !near(c.got, c.want) {
			t.Errorf("%s: %v from the single command, %v from plan", c.name, c.got, c.want)
		}
	}
}

func TestFlagsReplaceScenarioParts(t *testing.T) {
	demo := demoFile(t)
	tests := []struct {
		name  string
		args  []string
		check func(*thzdrivev1.PropagateResponse) string
	}{
		{"window replaces the train", []string{"--window", "diamond:500um"}, func(r *thzdrivev1.PropagateResponse) string {
			tr := r.Resolved.Train
			if len(tr) != 1 || tr[0].GetSlab().GetMedium().GetMaterial() != "diamond" || tr[0].GetSlab().ThicknessUm != 500 {
				return "train is not the one diamond window"
			}
			return ""
		}},
		{"sample replaces the sample", []string{"--sample", "gap"}, func(r *thzdrivev1.PropagateResponse) string {
			if r.Resolved.Sample.GetExitMedium().GetMaterial() != "gap" || len(r.Resolved.Train) != 2 {
				return "sample not replaced, or train lost"
			}
			return ""
		}},
		{"scenario alone", nil, func(r *thzdrivev1.PropagateResponse) string {
			if len(r.Resolved.Train) != 2 || r.Resolved.Sample.GetExitMedium().GetDielectric() == nil {
				return "scenario train or sample missing"
			}
			if r.Resolved.Waveform.GetTrace() == nil {
				return "the calibrated waveform should reach Propagate as a trace"
			}
			return ""
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var r thzdrivev1.PropagateResponse
			reportAndJSON(t, append([]string{"propagate", "--scenario", demo}, tc.args...), &r)
			if msg := tc.check(&r); msg != "" {
				t.Error(msg)
			}
		})
	}
}
