package server

import (
	"context"
	"io"
	"log/slog"
	"math"
	"testing"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

func fuzzService() *Service {
	lim := DefaultLimits()
	lim.MaxSamples = 1 << 14 // keep each fuzz input cheap
	return &Service{limits: lim, log: slog.New(slog.NewTextHandler(io.Discard, nil))}
}

// checkOutcome is the contract every request validator keeps: either a
// response with only finite numbers, or INVALID_ARGUMENT naming a field.
func checkOutcome(t *testing.T, resp proto.Message, err error) {
	t.Helper()
	if err != nil {
		st, _ := status.FromError(err)
		if st.Code() != codes.InvalidArgument {
			t.Fatalf("rejection with %v, want INVALID_ARGUMENT: %v", st.Code(), err)
		}
		for _, d := range st.Details() {
			if br, ok := d.(*errdetails.BadRequest); ok && len(br.FieldViolations) > 0 && br.FieldViolations[0].Field != "" {
				return
			}
		}
		t.Fatalf("rejection without a field path: %v", err)
	}
	if !allFinite(resp.ProtoReflect()) {
		t.Fatalf("response holds NaN or Inf: %v", resp)
	}
}

// seedRequests are real requests, the seed corpus of the wire fuzzers.
func seedRequests() []proto.Message {
	tr := uniformTrace(256, 20)
	tr.FieldUnit = thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM
	return []proto.Message{
		&thzdrivev1.AnalyzePulseRequest{Waveform: singleCycle(1, 100)},
		&thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: tr}},
			Processing: &thzdrivev1.Processing{Window: thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY, PadToSamples: 1024}},
		&thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
			Shape: thzdrivev1.PulseShape_PULSE_SHAPE_CARRIER, CarrierFrequencyThz: 2, EnvelopeFwhmPs: 1, SpanPs: 10}}}},
	}
}

// FuzzAnalyzePulseWire feeds arbitrary wire bytes to AnalyzePulse.
func FuzzAnalyzePulseWire(f *testing.F) {
	for _, m := range seedRequests() {
		b, _ := proto.Marshal(m)
		f.Add(b)
	}
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.AnalyzePulseRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.AnalyzePulse(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

// FuzzTraceValidator builds sampled traces from fuzzed numbers, NaN, Inf and
// non-uniform times included.
func FuzzTraceValidator(f *testing.F) {
	f.Add(uint16(256), 10.0, 0.0, 1.0, 0.05, false, uint8(0))
	f.Add(uint16(9), -1.0, 3.0, math.NaN(), 1e300, true, uint8(3))
	f.Add(uint16(1000), 1e-9, -5.0, math.Inf(1), 0.0, true, uint8(2))
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, n uint16, stepFs, startPs, amp, jitter float64, explicit bool, window uint8) {
		tr := &thzdrivev1.SampledTrace{StartPs: startPs, StepFs: stepFs, Field: make([]float64, int(n)%2048), FieldUnit: thzdrivev1.FieldUnit(window % 3)}
		for i := range tr.Field {
			x := float64(i)/float64(len(tr.Field)+1)*8 - 4
			tr.Field[i] = amp * x * math.Exp(-x*x)
		}
		if explicit {
			tr.StepFs, tr.StartPs = 0, 0
			tr.TimePs = make([]float64, len(tr.Field))
			for i := range tr.TimePs {
				tr.TimePs[i] = startPs + float64(i)*stepFs*1e-3 + jitter*math.Sin(float64(i))
			}
		}
		req := &thzdrivev1.AnalyzePulseRequest{
			Waveform:   &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: tr}},
			Processing: &thzdrivev1.Processing{Window: thzdrivev1.TimeWindow(window % 5), Baseline: thzdrivev1.BaselineRemoval(window % 4)},
		}
		resp, err := svc.AnalyzePulse(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

// FuzzCalibrateFieldWire feeds arbitrary wire bytes to CalibrateField.
func FuzzCalibrateFieldWire(f *testing.F) {
	seeds := []proto.Message{
		&thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_Energy{Energy: &thzdrivev1.EnergyCalibration{
			Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 1},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_FwhmUm{FwhmUm: 600}}, FocusScaling: true}}},
		&thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{
			Crystal: thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP, ThicknessUm: 300, PeakModulation: 0.2}}},
		&thzdrivev1.CalibrateFieldRequest{Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{
			ThicknessUm: 500, ModulationTrace: uniformTrace(128, 20)}}},
	}
	for _, m := range seeds {
		b, _ := proto.Marshal(m)
		f.Add(b)
	}
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.CalibrateFieldRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.CalibrateField(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}
