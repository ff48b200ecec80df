package server

import (
	"context"
	"errors"
	"io"
	"log/slog"
	"math"
	"net"
	"testing"
	"time"

	"go.uber.org/goleak"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// testPlan is an invented test scenario (not a measurement): a single-cycle
// source calibrated by energy and spot, a silicon window, a bulk sample with
// one Lorentz oscillator driven as the mode, and heating. Numbers are
// inputs only; the tests compare paths through the service with each other.
func testPlan() *thzdrivev1.PlanExperimentRequest {
	one := int32(0)
	return &thzdrivev1.PlanExperimentRequest{
		Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
			PeakFrequencyThz: 1.5, StepFs: 20, SpanPs: 12}}},
		Calibration: &thzdrivev1.EnergyCalibration{
			Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 1},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: 400}},
		},
		Train: []*thzdrivev1.TrainElement{{Kind: &thzdrivev1.TrainElement_Slab{Slab: &thzdrivev1.Slab{
			Medium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "silicon-hr"}}, ThicknessUm: 1000, Incoherent: true}}}},
		Sample: &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Dielectric{Dielectric: &thzdrivev1.DielectricModel{
			EpsInf: 8, Oscillators: []*thzdrivev1.LorentzOscillator{{FrequencyThz: 2, LinewidthThz: 0.15, DeltaEps: 2}}}}}},
		Mode: &thzdrivev1.PhononMode{TargetOscillator: &one, CellVolumeA3: 150, EffectiveMassAmu: 30, BondLengthA: 2.5},
		Heating: &thzdrivev1.HeatingConditions{
			HeatCapacity:     &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_ConstantJPerCm3K{ConstantJPerCm3K: 1.5}},
			BaseTemperatureK: 10, TransitionTemperatureK: 30, RepetitionRateKhz: 1, ThermalConductivityWPerMK: 5,
		},
	}
}

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.Abs(got-want) > rel*math.Abs(want) {
		t.Errorf("%s: got %.12g, want %.12g (rel tol %g)", what, got, want, rel)
	}
}

// PlanExperiment must equal the composition of the single-stage methods on
// the same inputs (issue check: no drift between paths). The only
// difference allowed is the round trip of the calibrated trace through
// kV/cm on the wire, a few ulp.
func TestPlanEqualsComposition(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)
	req := testPlan()
	got, err := c.PlanExperiment(ctx, req)
	if err != nil {
		t.Fatal(err)
	}

	cal, err := c.CalibrateField(ctx, &thzdrivev1.CalibrateFieldRequest{Waveform: req.Waveform, Method: &thzdrivev1.CalibrateFieldRequest_Energy{Energy: req.Calibration}})
	if err != nil {
		t.Fatal(err)
	}
	drive, err := c.DriveMode(ctx, &thzdrivev1.DriveModeRequest{
		Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: cal.CalibratedTrace}},
		Train:    req.Train, Sample: req.Sample, Mode: req.Mode,
	})
	if err != nil {
		t.Fatal(err)
	}
	prop, err := c.Propagate(ctx, &thzdrivev1.PropagateRequest{
		Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: cal.CalibratedTrace}},
		Train:    req.Train, Sample: req.Sample,
	})
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-9
	near(t, "source peak field", got.Source.PeakFieldKvPerCm, cal.PeakFieldKvPerCm, tol)
	near(t, "peak fluence", got.Source.PeakFluenceUjPerCm2, cal.PeakFluenceUjPerCm2, tol)
	near(t, "target peak field", got.Optics.TargetPeakFieldKvPerCm, prop.TargetPeakFieldKvPerCm, tol)
	near(t, "absorbed fraction", got.Optics.AbsorbedFraction, prop.AbsorbedFraction, tol)
	near(t, "max Q", got.Mode.MaxQASqrtAmu, drive.Drive.MaxQASqrtAmu, tol)
	near(t, "quanta", got.Mode.Quanta, drive.Drive.Quanta, tol)
	near(t, "displacement", got.Mode.DisplacementPm, drive.Drive.DisplacementPm, tol)

	// Heating from the same fluence, absorbed fraction and bulk absorption:
	// the plan's thermal stage must equal EstimateHeating on those numbers.
	h := req.Heating
	heat, err := c.EstimateHeating(ctx, &thzdrivev1.EstimateHeatingRequest{
		IncidentFluenceUjPerCm2: cal.PeakFluenceUjPerCm2, AbsorbedFraction: prop.AbsorbedFraction,
		PulseEnergyUj: 1, SpotRadiusUm: 400, RepetitionRateKhz: h.RepetitionRateKhz,
		Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK, AbsorptionDepthUm: got.Heating.AbsorptionDepthUm,
		HeatCapacity: h.HeatCapacity, ThermalConductivityWPerMK: h.ThermalConductivityWPerMK,
		BaseTemperatureK: h.BaseTemperatureK, TransitionTemperatureK: h.TransitionTemperatureK,
	})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "peak temperature", got.Heating.PeakTemperatureK, heat.Budget.PeakTemperatureK, tol)
	near(t, "steady-state temperature", got.Heating.SteadyStateTemperatureK, heat.Budget.SteadyStateTemperatureK, tol)
	if got.Resolved.GetPadToSamples() == 0 || got.Resolved.GetTarget().Layer == nil {
		t.Errorf("resolved plan lacks defaults: pad %d target %v", got.Resolved.GetPadToSamples(), got.Resolved.GetTarget())
	}
	for _, cau := range got.Cautions {
		if cau.Stage == "" {
			t.Errorf("caution %v has no stage", cau.Code)
		}
	}
}

func TestPlanBadRequests(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)
	cases := []struct {
		name  string
		edit  func(*thzdrivev1.PlanExperimentRequest)
		field string
	}{
		{"no mode", func(r *thzdrivev1.PlanExperimentRequest) { r.Mode = nil }, "mode"},
		{"negative energy", func(r *thzdrivev1.PlanExperimentRequest) {
			r.Calibration.Energy = &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: -1}
		}, "calibration.pulse_energy_uj"},
		{"no spot", func(r *thzdrivev1.PlanExperimentRequest) { r.Calibration.SpotX = nil }, "calibration.spot_x"},
		{"oscillator out of range", func(r *thzdrivev1.PlanExperimentRequest) { j := int32(3); r.Mode.TargetOscillator = &j }, "mode.target_oscillator"},
		{"no base temperature", func(r *thzdrivev1.PlanExperimentRequest) { r.Heating.BaseTemperatureK = 0 }, "heating.base_temperature_k"},
		{"absorbed fraction with a sample", func(r *thzdrivev1.PlanExperimentRequest) { r.Heating.AbsorbedFraction = 0.5 }, "heating.absorbed_fraction"},
		{"no heat capacity", func(r *thzdrivev1.PlanExperimentRequest) { r.Heating.HeatCapacity = nil }, "heating.heat_capacity"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r := testPlan()
			tc.edit(r)
			_, err := c.PlanExperiment(ctx, r)
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
}

func collectSweep(t *testing.T, stream thzdrivev1.PumpPlanner_SweepClient) map[int64]*thzdrivev1.SweepResponse {
	t.Helper()
	out := map[int64]*thzdrivev1.SweepResponse{}
	for {
		p, err := stream.Recv()
		if errors.Is(err, io.EOF) {
			return out
		}
		if err != nil {
			t.Fatal(err)
		}
		if _, dup := out[p.Index]; dup {
			t.Fatalf("point %d sent twice", p.Index)
		}
		out[p.Index] = p
	}
}

// The streamed grid equals point-by-point PlanExperiment calls (issue check).
func TestSweepEqualsPointByPoint(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)
	req := &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Values: []float64{0.5, 1, 2}},
		{Parameter: "heating.base_temperature_k", Start: 5, Stop: 20, Count: 2},
	}}
	stream, err := c.Sweep(ctx, req)
	if err != nil {
		t.Fatal(err)
	}
	points := collectSweep(t, stream)
	if len(points) != 6 {
		t.Fatalf("%d points, want 6", len(points))
	}
	for idx, p := range points {
		if p.Total != 6 || p.Error != nil {
			t.Fatalf("point %d: total %d error %v", idx, p.Total, p.Error)
		}
		one := testPlan()
		one.Calibration.Energy = &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: p.Coordinates[0]}
		one.Heating.BaseTemperatureK = p.Coordinates[1]
		want, err := c.PlanExperiment(ctx, one)
		if err != nil {
			t.Fatal(err)
		}
		if !proto.Equal(p.Headline, headline(want)) {
			t.Errorf("point %d %v: sweep %v, one by one %v", idx, p.Coordinates, p.Headline, headline(want))
		}
	}
	// Row-major, last axis fastest.
	if c0 := points[3].Coordinates; c0[0] != 1 || c0[1] != 20 {
		t.Errorf("point 3 at %v, want [1 20]", c0)
	}
}

func TestSweepRefusals(t *testing.T) {
	conn := startServer(t, Config{Limits: Limits{MaxSamples: 1 << 20, MaxLayers: 64, MaxSweepPoints: 100, MaxMessageBytes: 4 << 20, MaxConcurrentStreams: 16}})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)
	cases := []struct {
		name  string
		axes  []*thzdrivev1.SweepAxis
		field string
	}{
		{"unknown parameter", []*thzdrivev1.SweepAxis{{Parameter: "calibration.pulse_energy_mj", Values: []float64{1}}}, "axes[0].parameter"},
		{"not a number", []*thzdrivev1.SweepAxis{{Parameter: "sample.exit_medium", Values: []float64{1}}}, "axes[0].parameter"},
		{"index out of range", []*thzdrivev1.SweepAxis{{Parameter: "train[3].slab.thickness_um", Values: []float64{1}}}, "axes[0].parameter"},
		{"count below 2", []*thzdrivev1.SweepAxis{{Parameter: "heating.base_temperature_k", Start: 1, Stop: 2, Count: 1}}, "axes[0].count"},
		{"over the point limit", []*thzdrivev1.SweepAxis{
			{Parameter: "heating.base_temperature_k", Start: 1, Stop: 2, Count: 20},
			{Parameter: "calibration.pulse_energy_uj", Start: 1, Stop: 2, Count: 20}}, "axes"},
		{"three axes", []*thzdrivev1.SweepAxis{{}, {}, {}}, "axes"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			stream, err := c.Sweep(ctx, &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: tc.axes})
			if err == nil {
				_, err = stream.Recv()
			}
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
	// A value that makes one point invalid fails that point only.
	stream, err := c.Sweep(ctx, &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Values: []float64{1, -1}}}})
	if err != nil {
		t.Fatal(err)
	}
	points := collectSweep(t, stream)
	if points[0].Error != nil || points[1].Error == nil || points[1].Error.Code != "INVALID_ARGUMENT" {
		t.Errorf("point errors: %v, %v", points[0].Error, points[1].Error)
	}
}

// A cancelled sweep stops within 50 ms and leaves no goroutine behind
// (issue check).
func TestSweepCancelStopsPromptly(t *testing.T) {
	ignore := goleak.IgnoreCurrent()
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	srv := New(Config{Logger: slog.New(slog.NewTextHandler(io.Discard, nil))})
	go func() { _ = srv.GRPC.Serve(lis) }()
	conn, err := grpc.NewClient(lis.Addr().String(), grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	stream, err := c.Sweep(ctx, &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Start: 0.1, Stop: 10, Count: 100000}}})
	if err != nil {
		t.Fatal(err)
	}
	for range 5 {
		if _, err := stream.Recv(); err != nil {
			t.Fatal(err)
		}
	}
	start := time.Now()
	cancel()
	for {
		if _, err := stream.Recv(); err != nil {
			if status.Code(err) != codes.Canceled {
				t.Errorf("after cancel: %v, want CANCELED", err)
			}
			break
		}
	}
	if d := time.Since(start); d > 50*time.Millisecond {
		t.Errorf("stream ended %v after cancel, want < 50 ms", d)
	}
	// GracefulStop returns only when every handler has returned, and the
	// sweep handler returns only after its workers have: then no goroutine
	// of the sweep may remain.
	conn.Close()
	stopped := make(chan struct{})
	go func() { srv.GRPC.GracefulStop(); close(stopped) }()
	select {
	case <-stopped:
	case <-time.After(5 * time.Second):
		t.Fatal("server did not stop: the cancelled sweep is still running")
	}
	goleak.VerifyNone(t, ignore)
}
