package server

// Server-level benchmarks (tools/bench runs them and prints the table of the
// README's "Performance" section):
//
//   - BenchmarkPlanInProcess: Service.PlanExperiment called directly, wire
//     messages in and out but no transport;
//   - BenchmarkPlanGRPC: the same call over gRPC on loopback TCP through
//     the full server (interceptors included), one caller;
//   - BenchmarkEchoGRPC: the floor for that call: a bare gRPC server whose
//     PlanExperiment returns a canned response of the same size, so the
//     request and response cross the same transport, marshalled the same,
//     and nothing is computed;
//   - BenchmarkSweep10k: a 10 000-point sweep over pulse energy streamed
//     from a real server on loopback, with GOMAXPROCS 1 and all cores (the
//     server starts GOMAXPROCS workers).
//
// The plan is the one bench/numpy_plan.py computes: a single-cycle source
// calibrated by pulse energy and spot, a lossless window, a bulk sample
// screened by its own Lorentz oscillator, and that oscillator driven as the
// mode (Q(t) on the wire).

import (
	"context"
	"fmt"
	"io"
	"log/slog"
	"net"
	"runtime"
	"syscall"
	"testing"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials/insecure"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// benchPlanCase is one size of the benchmark plan: a trace of span/step
// samples zero-padded to pad samples before propagation.
type benchPlanCase struct {
	name          string
	stepFs, spanP float64
	pad           int32
}

var benchPlanCases = []benchPlanCase{
	{"4096", 10, 20, 4096},  // 2 000 samples of 10 fs, padded to 4 096
	{"32768", 2, 40, 32768}, // 20 000 samples of 2 fs (40 ps), padded to 32 768
}

// benchPlanRequest is the benchmark plan (invented inputs, the same as
// bench/numpy_plan.py): 1 THz single cycle, 1 uJ in a 400 um spot, 1 mm of
// a lossless n = 3.4175 window (first pass only), a bulk crystal with
// eps_inf = 8 and one oscillator at 2 THz (0.15 THz wide, Δε = 2) whose
// mode is driven.
func benchPlanRequest(c benchPlanCase) *thzdrivev1.PlanExperimentRequest {
	zero := int32(0)
	return &thzdrivev1.PlanExperimentRequest{
		Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{
			Shape: thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE, PeakFrequencyThz: 1, StepFs: c.stepFs, SpanPs: c.spanP}}},
		Calibration: &thzdrivev1.EnergyCalibration{
			Energy: &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 1},
			SpotX:  &thzdrivev1.SpotSize{Size: &thzdrivev1.SpotSize_RadiusUm{RadiusUm: 400}},
		},
		Train: []*thzdrivev1.TrainElement{{Kind: &thzdrivev1.TrainElement_Slab{Slab: &thzdrivev1.Slab{
			Medium:      &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Constant{Constant: &thzdrivev1.ConstantIndex{N: 3.4175}}},
			ThicknessUm: 1000, Incoherent: true}}}},
		Sample: &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Dielectric{Dielectric: &thzdrivev1.DielectricModel{
			EpsInf: 8, Oscillators: []*thzdrivev1.LorentzOscillator{{FrequencyThz: 2, LinewidthThz: 0.15, DeltaEps: 2}}}}}},
		Mode:         &thzdrivev1.PhononMode{TargetOscillator: &zero, CellVolumeA3: 150, EffectiveMassAmu: 30, BondLengthA: 2.5},
		PadToSamples: c.pad,
	}
}

func quietConfig() Config {
	return Config{Logger: slog.New(slog.NewTextHandler(io.Discard, nil))}
}

func BenchmarkPlanInProcess(b *testing.B) {
	svc := New(quietConfig()).Service
	ctx := context.Background()
	for _, c := range benchPlanCases {
		b.Run(c.name, func(b *testing.B) {
			req := benchPlanRequest(c)
			resp, err := svc.PlanExperiment(ctx, req)
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				if _, err := svc.PlanExperiment(ctx, req); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(proto.Size(resp)), "resp-bytes")
		})
	}
}

func BenchmarkPlanGRPC(b *testing.B) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(b, quietConfig()))
	ctx := context.Background()
	for _, pc := range benchPlanCases {
		b.Run(pc.name, func(b *testing.B) {
			req := benchPlanRequest(pc)
			resp, err := c.PlanExperiment(ctx, req)
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				if _, err := c.PlanExperiment(ctx, req); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(proto.Size(resp)), "resp-bytes")
		})
	}
}

// echoPlanner answers PlanExperiment with a canned response and computes
// nothing: the transport floor of the call.
type echoPlanner struct {
	thzdrivev1.UnimplementedPumpPlannerServer
	resp *thzdrivev1.PlanExperimentResponse
}

func (e *echoPlanner) PlanExperiment(context.Context, *thzdrivev1.PlanExperimentRequest) (*thzdrivev1.PlanExperimentResponse, error) {
	return e.resp, nil
}

// startEcho serves an echoPlanner on loopback with the message limits of
// New and no interceptors, and returns a client with the options of
// startServer.
func startEcho(b *testing.B, resp *thzdrivev1.PlanExperimentResponse) thzdrivev1.PumpPlannerClient {
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		b.Fatal(err)
	}
	lim := DefaultLimits()
	g := grpc.NewServer(grpc.MaxRecvMsgSize(lim.MaxMessageBytes), grpc.MaxSendMsgSize(1<<31-1))
	thzdrivev1.RegisterPumpPlannerServer(g, &echoPlanner{resp: resp})
	go func() { _ = g.Serve(lis) }()
	conn, err := grpc.NewClient(lis.Addr().String(),
		grpc.WithTransportCredentials(insecure.NewCredentials()),
		grpc.WithDefaultCallOptions(grpc.MaxCallRecvMsgSize(256<<20)))
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() {
		conn.Close()
		g.Stop()
	})
	return thzdrivev1.NewPumpPlannerClient(conn)
}

func BenchmarkEchoGRPC(b *testing.B) {
	svc := New(quietConfig()).Service
	ctx := context.Background()
	for _, pc := range benchPlanCases {
		b.Run(pc.name, func(b *testing.B) {
			req := benchPlanRequest(pc)
			resp, err := svc.PlanExperiment(ctx, req)
			if err != nil {
				b.Fatal(err)
			}
			c := startEcho(b, resp)
			if _, err := c.PlanExperiment(ctx, req); err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				if _, err := c.PlanExperiment(ctx, req); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(proto.Size(resp)), "resp-bytes")
		})
	}
}

// benchSweepPoints is the size of BenchmarkSweep10k's grid.
const benchSweepPoints = 10000

// BenchmarkSweep10k streams a 10 000-point sweep over pulse energy (the
// plan of testPlan: 600 samples of 20 fs, a silicon window, a bulk Lorentz
// crystal, heating) from a real server on loopback, with GOMAXPROCS set to
// 1 and to the number of CPUs (sub-benchmarks procs=P; the server starts
// GOMAXPROCS workers). The ratio of the two throughputs is what the other
// cores add. GOMAXPROCS is set here rather than with -cpu: the testing
// package measures a b.Loop benchmark in its first call, before -cpu's
// first value takes effect.
func BenchmarkSweep10k(b *testing.B) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(b, quietConfig()))
	ctx := context.Background()
	req := &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Start: 0.1, Stop: 5, Count: benchSweepPoints}}}
	run := func(b *testing.B) {
		st, err := c.Sweep(ctx, req)
		if err != nil {
			b.Fatal(err)
		}
		n := 0
		for {
			p, err := st.Recv()
			if err == io.EOF {
				break
			}
			if err != nil {
				b.Fatal(err)
			}
			if p.Error != nil {
				b.Fatalf("point %d: %v", p.Index, p.Error)
			}
			n++
		}
		if n != benchSweepPoints {
			b.Fatalf("%d points arrived, want %d", n, benchSweepPoints)
		}
	}
	for _, procs := range []int{1, runtime.NumCPU()} {
		b.Run(fmt.Sprintf("procs=%d", procs), func(b *testing.B) {
			defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
			b.ReportAllocs()
			cpu0 := processCPU()
			for b.Loop() {
				run(b)
			}
			b.ReportMetric(float64(benchSweepPoints)*float64(b.N)/b.Elapsed().Seconds(), "points/s")
			// The cores the process actually had: its CPU time over the
			// wall time. On a shared machine this says whether a second
			// core was there to use.
			b.ReportMetric((processCPU()-cpu0).Seconds()/b.Elapsed().Seconds(), "cores-used")
			b.ReportMetric(float64(runtime.GOMAXPROCS(0)), "gomaxprocs")
		})
	}
}

// processCPU is the user plus system CPU time of this process so far.
func processCPU() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// TestBenchPlanRequest keeps the benchmark plan valid: it must succeed,
// drive the mode by the exact method and return Q(t) on the trace's grid.
func TestBenchPlanRequest(t *testing.T) {
	svc := New(quietConfig()).Service
	for _, c := range benchPlanCases {
		resp, err := svc.PlanExperiment(context.Background(), benchPlanRequest(c))
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		want := int(c.pad) // Q is on the propagated (padded) grid
		if got := len(resp.Mode.Q.QASqrtAmu); got != want {
			t.Errorf("%s: Q has %d samples, want %d", c.name, got, want)
		}
		if resp.Mode.Method != thzdrivev1.DriveMethod_DRIVE_METHOD_EXACT {
			t.Errorf("%s: method %v", c.name, resp.Mode.Method)
		}
		if n := len(resp.Optics.Transfer.FrequencyThz); n != int(c.pad)/2+1 {
			t.Errorf("%s: %d transfer bins, want %d", c.name, n, c.pad/2+1)
		}
		t.Log(fmt.Sprintf("%s: max Q %.6g A sqrt(amu), %d response bytes", c.name, resp.Mode.MaxQASqrtAmu, proto.Size(resp)))
	}
}
