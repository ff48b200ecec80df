package main

import (
	"math"
	"strings"
	"testing"

	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/units"
)

func TestDecodeScenario(t *testing.T) {
	want := &thzdrivev1.PlanExperimentRequest{
		Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
			Shape: thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE, PeakFrequencyThz: 1.5}}},
		Sample: &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "znte"}}},
		Label:  "x",
	}
	tests := []struct {
		name, file, text string
	}{
		{"yaml, proto names", "a.yaml", "label: x\nwaveform:\n  model: {shape: PULSE_SHAPE_SINGLE_CYCLE, peak_frequency_thz: 1.5}\nsample: {exit_medium: {material: znte}}\n"},
		{"yml, JSON names", "a.yml", "label: x\nwaveform:\n  model: {shape: PULSE_SHAPE_SINGLE_CYCLE, peakFrequencyThz: 1.5}\nsample: {exitMedium: {material: znte}}\n"},
		{"json by extension", "a.json", `{"label": "x", "waveform": {"model": {"shape": "PULSE_SHAPE_SINGLE_CYCLE", "peak_frequency_thz": 1.5}}, "sample": {"exit_medium": {"material": "znte"}}}`},
		{"json by content", "-", ` {"label": "x", "waveform": {"model": {"shape": 1, "peak_frequency_thz": 1.5}}, "sample": {"exit_medium": {"material": "znte"}}}`},
		{"yaml by content", "scenario", "label: x\nsample:\n  exit_medium:\n    material: znte\nwaveform:\n  model:\n    shape: PULSE_SHAPE_SINGLE_CYCLE\n    peak_frequency_thz: 1.5\n"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := decodeScenario([]byte(tc.text), tc.file)
			if err != nil {
				t.Fatal(err)
			}
			if !proto.Equal(got, want) {
				t.Errorf("got %v\nwant %v", got, want)
			}
		})
	}
}

func TestDecodeScenarioErrors(t *testing.T) {
	tests := []struct {
		name, file, text string
		want             []string // all in the message
	}{
		{"empty", "a.yaml", "  \n", []string{"empty"}},
		{"not a mapping", "a.yaml", "- 1\n- 2\n", []string{"mapping", "waveform"}},
		{"bad yaml", "a.yaml", "a: [1, 2\n", []string{"not valid YAML"}},
		{"bad json", "a.json", `{"label": }`, []string{"not valid JSON"}},
		{"two json documents", "a.json", `{} {}`, []string{"more than one"}},
		{"unknown top field", "a.yaml", "waveforms: {}\n", []string{`waveforms: unknown field "waveforms"`, `did you mean "waveform"`}},
		{"unit suffix missing", "a.yaml", "sample:\n  layers:\n    - thickness: 3\n", []string{"sample.layers[0].thickness", `"thickness_um"`}},
		{"typo deep down", "a.yaml", "waveform: {model: {peak_frequncy_thz: 1}}\n", []string{"waveform.model.peak_frequncy_thz", "peak_frequency_thz"}},
		{"several at once", "a.yaml", "foo: 1\nmode: {bar: 2}\n", []string{"foo: unknown", "mode.bar: unknown"}},
		{"unknown enum", "a.yaml", "target: {placement: FRONT}\n", []string{"target.placement", "TARGET_PLACEMENT_FRONT_SURFACE"}},
		{"oneof twice", "a.yaml", "calibration: {pulse_energy_uj: 1, average_power: {average_power_mw: 1}}\n", []string{"calibration", "only one of"}},
		{"wrong type", "a.yaml", "train: {slab: {}}\n", []string{"train: expected a list"}},
		{"number expected", "a.yaml", "probe_depth_nm: [1]\n", []string{"probe_depth_nm: expected a number"}},
		{"message expected", "a.yaml", "mode: 3\n", []string{"mode: expected a mapping"}},
		{"bool expected", "a.yaml", "train: [{slab: {incoherent: 3}}]\n", []string{"train[0].slab.incoherent: expected true or false"}},
		{"value out of range for protojson", "a.json", `{"pad_to_samples": 1e12}`, []string{"a.json"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := decodeScenario([]byte(tc.text), tc.file)
			if err == nil {
				t.Fatalf("no error; decoded %v", got)
			}
			for _, w := range tc.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error lacks %q:\n%v", w, err)
				}
			}
		})
	}
}

// The demo scenario decodes, and survives a round trip through the proto
// JSON mapping unchanged: the file format is the API's.
func TestDemoScenarioRoundTrip(t *testing.T) {
	req, err := decodeScenario(demoScenario, "demo-scenario.yaml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := protojson.Marshal(req)
	if err != nil {
		t.Fatal(err)
	}
	again, err := decodeScenario(b, "demo.json")
	if err != nil {
		t.Fatal(err)
	}
	if !proto.Equal(req, again) {
		t.Error("JSON round trip changed the scenario")
	}
	if req.GetMode().TargetOscillator == nil || !strings.Contains(req.Label, "INVENTED") {
		t.Error("the demo drives an oscillator of its sample and says it is invented")
	}
}

func FuzzDecodeScenario(f *testing.F) {
	f.Add(demoScenario, "demo.yaml")
	f.Add([]byte(`{"waveform": {"model": {"shape": "PULSE_SHAPE_CARRIER"}}, "train": [{"gap": {"length_mm": 1}}]}`), "a.json")
	f.Add([]byte("mode: {target_oscillator: 0, effective_charge_e_per_sqrt_amu: 1}\n"), "a.yml")
	f.Add([]byte("a: &x [*x]\n"), "a.yaml")
	f.Add([]byte("{\"sample\": {\"layers\": [[], null, {\"medium\": 3}]}}"), "x")
	f.Add([]byte("\xff\xfe"), "")
	f.Fuzz(func(t *testing.T, data []byte, name string) {
		req, err := decodeScenario(data, name)
		if (err == nil) == (req == nil) {
			t.Fatalf("decodeScenario returned request %v and error %v", req, err)
		}
		if err == nil {
			if _, err := protojson.Marshal(req); err != nil {
				t.Fatalf("decoded request does not marshal: %v", err)
			}
		}
	})
}

func TestParseAxis(t *testing.T) {
	tests := []struct {
		spec string
		want *thzdrivev1.SweepAxis
	}{
		{"calibration.pulse_energy_uj=0.5:4:8", &thzdrivev1.SweepAxis{Parameter: "calibration.pulse_energy_uj", Start: 0.5, Stop: 4, Count: 8}},
		{"calibration.pulse_energy_uj=0.25:8:12:log", &thzdrivev1.SweepAxis{Parameter: "calibration.pulse_energy_uj", Start: 0.25, Stop: 8, Count: 12, Logarithmic: true}},
		{"train[1].attenuator.angle_deg=0,15,30", &thzdrivev1.SweepAxis{Parameter: "train[1].attenuator.angle_deg", Values: []float64{0, 15, 30}}},
		{"calibration.pulse_energy_uj=500nJ,1uJ", &thzdrivev1.SweepAxis{Parameter: "calibration.pulse_energy_uj", Values: []float64{0.5, 1}}},
		{"sample.layers[0].thickness_um=1mm:2mm:2", &thzdrivev1.SweepAxis{Parameter: "sample.layers[0].thickness_um", Start: 1000, Stop: 2000, Count: 2}},
		// 100 cm^-1 = c * 100 cm^-1 = 2.99792458 THz (derived from the exact c).
		{"mode.frequency_thz=100cm-1,3THz", &thzdrivev1.SweepAxis{Parameter: "mode.frequency_thz", Values: []float64{100 * units.InvCm / units.THz, 3}}},
		{"mode.cell_volume_a3=100,150", &thzdrivev1.SweepAxis{Parameter: "mode.cell_volume_a3", Values: []float64{100, 150}}},
	}
	for _, tc := range tests {
		t.Run(tc.spec, func(t *testing.T) {
			got, err := parseAxis(tc.spec)
			if err != nil {
				t.Fatal(err)
			}
			for i := range got.Values {
				if i < len(tc.want.Values) && math.Abs(got.Values[i]-tc.want.Values[i]) <= 1e-12*math.Abs(tc.want.Values[i]) {
					got.Values[i] = tc.want.Values[i]
				}
			}
			if math.Abs(got.Start-tc.want.Start) <= 1e-9 && math.Abs(got.Stop-tc.want.Stop) <= 1e-9 {
				got.Start, got.Stop = tc.want.Start, tc.want.Stop
			}
			if !proto.Equal(got, tc.want) {
				t.Errorf("got %v, want %v", got, tc.want)
			}
		})
	}
	for _, bad := range []string{"", "mode.frequency_thz", "=1,2", "mode.frequency_thz=1:2", "mode.frequency_thz=1:2:1",
		"mode.frequency_thz=1:2:3:lin", "mode.frequency_thz=a,b", "mode.cell_volume_a3=100A3,2", "mode.frequency_thz=1 cm,2", "mode.frequency_thz=NaN,1"} {
		if _, err := parseAxis(bad); err == nil {
			t.Errorf("parseAxis(%q): no error", bad)
		}
	}
}

func TestParseWindow(t *testing.T) {
	tests := []struct {
		spec       string
		material   string
		um         float64
		incoherent bool
	}{
		{"silicon-hr:1mm", "silicon-hr", 1000, true},
		{"diamond:500", "diamond", 500, true},
		{"quartz-o:2 mm:coherent", "quartz-o", 2000, false},
	}
	for _, tc := range tests {
		el, err := parseWindow(tc.spec, 0)
		if err != nil {
			t.Fatalf("%s: %v", tc.spec, err)
		}
		s := el.GetSlab()
		if s.GetMedium().GetMaterial() != tc.material || math.Abs(s.ThicknessUm-tc.um) > 1e-9 || s.Incoherent != tc.incoherent {
			t.Errorf("%s: got %v", tc.spec, s)
		}
	}
	for _, bad := range []string{"silicon-hr", ":1mm", "silicon-hr:1mm:maybe", "silicon-hr:1 THz", "a:b:c:d"} {
		if _, err := parseWindow(bad, 0); err == nil {
			t.Errorf("parseWindow(%q): no error", bad)
		}
	}
}

func TestQuantityFlag(t *testing.T) {
	tests := []struct {
		q    *quantity
		in   string
		want float64
		ok   bool
	}{
		{&quantity{kind: units.Field, wireUnit: "kV/cm", wireSI: units.KVPerCm}, "1.2 MV/cm", 1200, true},
		{&quantity{kind: units.Field, wireUnit: "kV/cm", wireSI: units.KVPerCm}, "250", 250, true},
		{&quantity{kind: units.Field, wireUnit: "kV/cm", wireSI: units.KVPerCm}, "1 THz", 0, false},
		{&quantity{kind: units.Length, wireUnit: "pm", wireSI: units.Pm}, "1 pm", 1, true},
		{&quantity{kind: units.Length, wireUnit: "pm", wireSI: units.Pm}, "0.01 nm", 10, true},
		{&quantity{kind: units.Volume, wireUnit: "Å^3", wireSI: units.CubicAngstrom}, "0.15 nm3", 150, true},
		{&quantity{kind: units.Volume, wireUnit: "Å^3", wireSI: units.CubicAngstrom}, "150 Å3", 150, true},
		{&quantity{kind: units.Volume, wireUnit: "Å^3", wireSI: units.CubicAngstrom}, "150 cm", 0, false},
		{&quantity{kind: units.Mass, wireUnit: "amu", wireSI: units.Amu}, "x", 0, false},
	}
	for _, tc := range tests {
		err := tc.q.Set(tc.in)
		if (err == nil) != tc.ok {
			t.Errorf("%q: error %v, want ok=%v", tc.in, err, tc.ok)
			continue
		}
		if tc.ok && math.Abs(tc.q.value-tc.want) > 1e-9*math.Abs(tc.want) {
			t.Errorf("%q: %v, want %v", tc.in, tc.q.value, tc.want)
		}
	}
}
