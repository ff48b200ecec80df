package server

import (
	"context"
	"io"
	"log/slog"
	"math"
	"net"
	"testing"
	"time"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/metadata"
	"google.golang.org/grpc/status"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// startServer runs a real server on 127.0.0.1 at a random port and returns a
// connection to it; both are closed when the test ends.
func startServer(t testing.TB, cfg Config) *grpc.ClientConn {
	t.Helper()
	if cfg.Logger == nil {
		cfg.Logger = slog.New(slog.NewTextHandler(io.Discard, nil))
	}
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	srv := New(cfg)
	go func() { _ = srv.GRPC.Serve(lis) }()
	conn, err := grpc.NewClient(lis.Addr().String(),
		grpc.WithTransportCredentials(insecure.NewCredentials()),
		grpc.WithDefaultCallOptions(grpc.MaxCallRecvMsgSize(256<<20)))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		conn.Close()
		srv.GRPC.Stop()
	})
	return conn
}

func ctxTimeout(t testing.TB) context.Context {
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	t.Cleanup(cancel)
	return ctx
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func singleCycle(peakTHz, fieldKVPerCm float64) *thzdrivev1.Waveform {
	return &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
		Shape: thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE, PeakFrequencyThz: peakTHz, PeakFieldKvPerCm: fieldKVPerCm,
		StepFs: 5, SpanPs: 40,
	}}}
}

func TestAnalyzePulseOverGRPC(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	var header metadata.MD
	resp, err := c.AnalyzePulse(ctxTimeout(t), &thzdrivev1.AnalyzePulseRequest{Waveform: singleCycle(1, 100)}, grpc.Header(&header))
	if err != nil {
		t.Fatal(err)
	}
	m := resp.Metrics
	// physics.md §2 worked check (derived from the Gaussian integral):
	// E0 = 100 kV/cm, f_peak = 1 THz -> fluence 10.18 uJ/cm^2; peak at 1 THz.
	if d := math.Abs(m.SpectralPeakThz - 1); d > m.ResolutionThz {
		t.Errorf("spectral peak %.4f THz, want 1 THz within the resolution %.4f THz", m.SpectralPeakThz, m.ResolutionThz)
	}
	if e := relErr(m.FluenceUjPerCm2, 10.177); e > 0.005 {
		t.Errorf("fluence %.4f uJ/cm^2, want 10.18 within 0.5 %% (rel err %.2g)", m.FluenceUjPerCm2, e)
	}
	// Definition of the model: extrema ±E0 (physics.md §2).
	if e := relErr(m.PeakFieldKvPerCm, 100); e > 1e-3 {
		t.Errorf("peak field %.4f kV/cm, want 100", m.PeakFieldKvPerCm)
	}
	if n := len(resp.Spectrum.FrequencyThz); n == 0 || n != len(resp.Spectrum.AmplitudeKvPerCmPerThz) || n != len(resp.Spectrum.PhaseRad) {
		t.Errorf("spectrum arrays of unequal length or empty: %d", n)
	}
	if resp.Resolved.GetWaveform().GetModel().GetStepFs() != 5 || resp.Resolved.GetProcessing().GetWindow() != thzdrivev1.TimeWindow_TIME_WINDOW_NONE {
		t.Errorf("resolved request does not echo the defaults: %v", resp.Resolved)
	}
	if ids := header.Get(RequestIDHeader); len(ids) != 1 || ids[0] == "" {
		t.Errorf("no request id in the response header: %v", header)
	}
}

func TestCalibrateFieldOverGRPC(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)
	// physics.md §3 check (derived): W = 1 uJ, w = 500 um, 1 THz single cycle
	// -> F0 = 254.6 uJ/cm^2, E_peak ≈ 500 kV/cm.
	resp, err := c.CalibrateField(ctx, &thzdrivev1.CalibrateFieldRequest{
		Waveform: singleCycle(1, 1),
		Method: &thzdrivev1.CalibrateFieldRequest_Energy{Energy: &thzdrivev1.EnergyCalibration{
			Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 1},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: 500}},
		}},
	})
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(resp.PeakFluenceUjPerCm2, 254.65); e > 0.01 {
		t.Errorf("peak fluence %.2f uJ/cm^2, want 254.6 within 1 %%", resp.PeakFluenceUjPerCm2)
	}
	if e := relErr(resp.PeakFieldKvPerCm, 500); e > 0.01 {
		t.Errorf("peak field %.2f kV/cm, want 500 within 1 %%", resp.PeakFieldKvPerCm)
	}

	// Planken et al., JOSA B 18, 313 (2001) formula with ZnTe constants from
	// memory (physics.md §3): 1 mm at 800 nm -> 28.7 kV/cm per unit dI/I,
	// half-wave field 43.2 kV/cm.
	eo, err := c.CalibrateField(ctx, &thzdrivev1.CalibrateFieldRequest{
		Waveform: singleCycle(1, 1),
		Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{
			Crystal: thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE, ThicknessUm: 1000, PeakModulation: 0.01,
		}},
	})
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(eo.FieldPerUnitModulationKvPerCm, 28.7); e > 0.002 {
		t.Errorf("EO small-signal factor %.3f kV/cm, want 28.7", eo.FieldPerUnitModulationKvPerCm)
	}
	if e := relErr(eo.HalfWaveFieldKvPerCm, 43.2); e > 0.002 {
		t.Errorf("half-wave field %.3f kV/cm, want 43.2", eo.HalfWaveFieldKvPerCm)
	}
	// arcsin(0.01)·28.7 kV/cm (same formula).
	if e := relErr(eo.PeakFieldKvPerCm, math.Asin(0.01)*eo.FieldPerUnitModulationKvPerCm); e > 1e-9 {
		t.Errorf("EO peak field %.6f kV/cm, want arcsin(0.01) x factor", eo.PeakFieldKvPerCm)
	}
	if eo.Resolved.GetElectroOptic().GetProbeWavelengthNm() != 800 || eo.Resolved.GetElectroOptic().NProbe == nil {
		t.Errorf("resolved EO request lacks defaults: %v", eo.Resolved.GetElectroOptic())
	}
}

func TestHealthServing(t *testing.T) {
	conn := startServer(t, Config{})
	resp, err := healthpb.NewHealthClient(conn).Check(ctxTimeout(t), &healthpb.HealthCheckRequest{})
	if err != nil {
		t.Fatal(err)
	}
	if resp.Status != healthpb.HealthCheckResponse_SERVING {
		t.Errorf("health %v, want SERVING", resp.Status)
	}
}

// badRequestFields returns the field paths of an INVALID_ARGUMENT error.
func badRequestFields(t *testing.T, err error) []string {
	t.Helper()
	st, ok := status.FromError(err)
	if !ok || st.Code() != codes.InvalidArgument {
		t.Fatalf("want INVALID_ARGUMENT, got %v", err)
	}
	var fields []string
	for _, d := range st.Details() {
		if br, ok := d.(*errdetails.BadRequest); ok {
			for _, fv := range br.FieldViolations {
				fields = append(fields, fv.Field)
			}
		}
	}
	if len(fields) == 0 {
		t.Fatalf("INVALID_ARGUMENT without a BadRequest field path: %v", err)
	}
	return fields
}

func uniformTrace(n int, stepFs float64) *thzdrivev1.SampledTrace {
	tr := &thzdrivev1.SampledTrace{StepFs: stepFs, Field: make([]float64, n)}
	for i := range tr.Field {
		x := float64(i-n/2) / 20
		tr.Field[i] = x * math.Exp(-x*x/2)
	}
	return tr
}

func TestBadRequestsNameTheField(t *testing.T) {
	conn := startServer(t, Config{Limits: Limits{MaxSamples: 4096, MaxLayers: 64, MaxSweepPoints: 10, MaxMessageBytes: 4 << 20, MaxConcurrentStreams: 16}})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ctx := ctxTimeout(t)

	nan := uniformTrace(64, 10)
	nan.Field[7] = math.NaN()
	inf := uniformTrace(64, 10)
	inf.Field[3] = math.Inf(1)
	unsorted := uniformTrace(16, 0)
	unsorted.TimePs = []float64{0, 1, 2, 3, 4, 5, 6, 5.5, 8, 9, 10, 11, 12, 13, 14, 15}
	negStep := uniformTrace(64, -10)
	trace := func(tr *thzdrivev1.SampledTrace) *thzdrivev1.Waveform {
		return &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: tr}}
	}
	energy := func(uj, radiusUm float64) *thzdrivev1.CalibrateFieldRequest_Energy {
		return &thzdrivev1.CalibrateFieldRequest_Energy{Energy: &thzdrivev1.EnergyCalibration{
			Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: uj},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: radiusUm}},
		}}
	}
	analyze := []struct {
		name  string
		req   *thzdrivev1.AnalyzePulseRequest
		field string
	}{
		{"no waveform", &thzdrivev1.AnalyzePulseRequest{}, "waveform"},
		{"NaN sample", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(nan)}, "waveform.trace.field[7]"},
		{"Inf sample", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(inf)}, "waveform.trace.field[3]"},
		{"empty trace", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(&thzdrivev1.SampledTrace{StepFs: 10})}, "waveform.trace.field"},
		{"too long trace", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(uniformTrace(5000, 10))}, "waveform.trace.field"},
		{"unsorted times", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(unsorted)}, "waveform.trace.time_ps[7]"},
		{"negative step", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(negStep)}, "waveform.trace.step_fs"},
		{"NaN model frequency", &thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{PeakFrequencyThz: math.NaN()}}}}, "waveform.model.peak_frequency_thz"},
		{"model over the sample limit", &thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{StepFs: 1, SpanPs: 100}}}}, "waveform.model.span_ps"},
		{"carrier without frequency", &thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{Shape: thzdrivev1.PulseShape_PULSE_SHAPE_CARRIER, EnvelopeFwhmPs: 1}}}}, "waveform.model.carrier_frequency_thz"},
		{"Tukey alpha above 1", &thzdrivev1.AnalyzePulseRequest{Waveform: singleCycle(1, 100), Processing: &thzdrivev1.Processing{Window: thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY, TukeyAlpha: 2}}, "processing.tukey_alpha"},
		{"padding over the limit", &thzdrivev1.AnalyzePulseRequest{Waveform: trace(uniformTrace(64, 10)), Processing: &thzdrivev1.Processing{PadToSamples: 1 << 20}}, "processing.pad_to_samples"},
	}
	for _, tc := range analyze {
		t.Run("AnalyzePulse/"+tc.name, func(t *testing.T) {
			_, err := c.AnalyzePulse(ctx, tc.req)
			fields := badRequestFields(t, err)
			if !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
	calibrate := []struct {
		name  string
		req   *thzdrivev1.CalibrateFieldRequest
		field string
	}{
		{"no method", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1)}, "method"},
		{"zero energy", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: energy(0, 500)}, "energy.pulse_energy_uj"},
		{"negative spot", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: energy(1, -5)}, "energy.spot_x.radius_um"},
		{"no spot", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_Energy{Energy: &thzdrivev1.EnergyCalibration{Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 1}}}}, "energy.spot_x"},
		{"EO over-rotation >= 1", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{ThicknessUm: 1000, PeakModulation: 1.2}}}, "electro_optic.peak_modulation"},
		{"EO no thickness", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{PeakModulation: 0.1}}}, "electro_optic.thickness_um"},
		{"EO custom without constants", &thzdrivev1.CalibrateFieldRequest{Waveform: singleCycle(1, 1), Method: &thzdrivev1.CalibrateFieldRequest_ElectroOptic{ElectroOptic: &thzdrivev1.ElectroOpticCalibration{Crystal: thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM, ThicknessUm: 100, PeakModulation: 0.1}}}, "electro_optic.r41_pm_per_v"},
	}
	for _, tc := range calibrate {
		t.Run("CalibrateField/"+tc.name, func(t *testing.T) {
			_, err := c.CalibrateField(ctx, tc.req)
			fields := badRequestFields(t, err)
			if !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
}

func contains(xs []string, x string) bool {
	for _, s := range xs {
		if s == x {
			return true
		}
	}
	return false
}

func TestPanicBecomesInternal(t *testing.T) {
	log := slog.New(slog.NewTextHandler(io.Discard, nil))
	ic := unaryInterceptor(log)
	_, err := ic(context.Background(), nil, &grpc.UnaryServerInfo{FullMethod: "/test/Panic"}, func(context.Context, any) (any, error) {
		panic("boom")
	})
	if status.Code(err) != codes.Internal {
		t.Fatalf("panic gave %v, want INTERNAL", err)
	}
	_, err = ic(context.Background(), nil, &grpc.UnaryServerInfo{FullMethod: "/test/NaN"}, func(context.Context, any) (any, error) {
		return &thzdrivev1.PulseMetrics{CentroidThz: math.NaN()}, nil
	})
	if status.Code(err) != codes.Internal {
		t.Fatalf("a NaN response gave %v, want INTERNAL", err)
	}
}
