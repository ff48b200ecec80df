package server

import (
	"bufio"
	"context"
	"fmt"
	"io"
	"log/slog"
	"net"
	"os/exec"
	"path/filepath"
	"regexp"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"
	"syscall"
	"testing"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
)

// replica is one server on 127.0.0.1 at a random port.
type replica struct {
	addr string
	srv  *Server
}

func startReplica(t *testing.T, cfg Config) *replica {
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
	t.Cleanup(srv.GRPC.Stop)
	return &replica{addr: lis.Addr().String(), srv: srv}
}

func sweepOfSize(n int32) *thzdrivev1.SweepRequest {
	return &thzdrivev1.SweepRequest{Plan: testPlan(), Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Start: 0.1, Stop: 5, Count: n}}}
}

// Three replicas behind the client's round-robin balancer; one is killed
// mid-sweep. The sweep completes, every point arrives exactly once, and the
// results equal a single server's (issue check).
func TestScaleOutSurvivesKilledReplica(t *testing.T) {
	const points = 400
	var reps []*replica
	var addrs []string
	for range 3 {
		r := startReplica(t, Config{})
		reps = append(reps, r)
		addrs = append(addrs, r.addr)
	}
	c, err := client.Dial(addrs)
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	ctx := ctxTimeout(t)

	var mu sync.Mutex
	got := map[int64]*thzdrivev1.SweepResponse{}
	var once sync.Once
	err = c.SweepSplit(ctx, sweepOfSize(points), client.SplitOptions{ChunkPoints: 25, Parallel: 3}, func(p *thzdrivev1.SweepResponse) error {
		mu.Lock()
		defer mu.Unlock()
		if _, dup := got[p.Index]; dup {
			return fmt.Errorf("point %d delivered twice", p.Index)
		}
		got[p.Index] = p
		if len(got) == points/4 {
			once.Do(func() { go reps[1].srv.GRPC.Stop() }) // kill a replica mid-sweep
		}
		return nil
	})
	if err != nil {
		t.Fatalf("sweep across replicas: %v", err)
	}
	if len(got) != points {
		t.Fatalf("%d points, want %d", len(got), points)
	}

	// The same grid on one server.
	single := startReplica(t, Config{})
	conn, err := grpc.NewClient(single.addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	stream, err := thzdrivev1.NewPumpPlannerClient(conn).Sweep(ctx, sweepOfSize(points))
	if err != nil {
		t.Fatal(err)
	}
	want := collectSweep(t, stream)
	for i, p := range want {
		if !proto.Equal(p.Headline, got[i].Headline) || p.Error != nil || got[i].Error != nil {
			t.Fatalf("point %d differs: single %v / %v, replicas %v / %v", i, p.Headline, p.Error, got[i].Headline, got[i].Error)
		}
	}
}

// A bounded load at saturating concurrency: zero errors, latency and
// throughput reported, heap bounded, health answering throughout.
func TestLoadBoundedAndHealthy(t *testing.T) {
	if testing.Short() {
		t.Skip("load test")
	}
	const (
		callers  = 32
		duration = 2 * time.Second
		heapMiB  = 512 // bound on the heap in use during the run
	)
	rep := startReplica(t, Config{})
	conn, err := grpc.NewClient(rep.addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	c := thzdrivev1.NewPumpPlannerClient(conn)
	req := &thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Model{Model: &thzdrivev1.ModelPulse{StepFs: 10, SpanPs: 40.96}}}}

	ctx, cancel := context.WithTimeout(context.Background(), duration)
	defer cancel()
	var (
		mu        sync.Mutex
		latencies []time.Duration
		errs      atomic.Int64
		healthBad atomic.Int64
		maxHeap   atomic.Uint64
		wg        sync.WaitGroup
	)
	for range callers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var local []time.Duration
			for ctx.Err() == nil {
				start := time.Now()
				_, err := c.AnalyzePulse(context.Background(), req)
				if err != nil {
					errs.Add(1)
					continue
				}
				local = append(local, time.Since(start))
			}
			mu.Lock()
			latencies = append(latencies, local...)
			mu.Unlock()
		}()
	}
	wg.Add(1)
	go func() {
		defer wg.Done()
		h := healthpb.NewHealthClient(conn)
		var ms runtime.MemStats
		for ctx.Err() == nil {
			hctx, hcancel := context.WithTimeout(context.Background(), time.Second)
			if r, err := h.Check(hctx, &healthpb.HealthCheckRequest{}); err != nil || r.Status != healthpb.HealthCheckResponse_SERVING {
				healthBad.Add(1)
			}
			hcancel()
			runtime.ReadMemStats(&ms)
			if ms.HeapInuse > maxHeap.Load() {
				maxHeap.Store(ms.HeapInuse)
			}
			time.Sleep(20 * time.Millisecond)
		}
	}()
	wg.Wait()
	if n := errs.Load(); n != 0 {
		t.Errorf("%d calls failed under load", n)
	}
	if n := healthBad.Load(); n != 0 {
		t.Errorf("health failed %d times under load", n)
	}
	if len(latencies) == 0 {
		t.Fatal("no call completed")
	}
	sort.Slice(latencies, func(i, j int) bool { return latencies[i] < latencies[j] })
	p50, p99 := latencies[len(latencies)/2], latencies[len(latencies)*99/100]
	t.Logf("load: %d callers, %d calls in %v: %.0f calls/s, p50 %v, p99 %v, max heap in use %.1f MiB",
		callers, len(latencies), duration, float64(len(latencies))/duration.Seconds(), p50, p99, float64(maxHeap.Load())/(1<<20))
	if h := maxHeap.Load(); h > heapMiB<<20 {
		t.Errorf("heap in use reached %d MiB, bound %d MiB", h>>20, heapMiB)
	}
}

// Abuse is refused cleanly while the server stays healthy and normal calls
// go on (issue check).
func TestAbuseRefusedCleanly(t *testing.T) {
	lim := DefaultLimits()
	lim.MaxMessageBytes = 1 << 20
	lim.MaxConcurrentCalls = 8
	lim.MaxConcurrentStreams = 4
	lim.MaxSweepPoints = 1000
	rep := startReplica(t, Config{Limits: lim})
	dial := func() *grpc.ClientConn {
		conn, err := grpc.NewClient(rep.addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
		if err != nil {
			t.Fatal(err)
		}
		t.Cleanup(func() { conn.Close() })
		return conn
	}
	normal := thzdrivev1.NewPumpPlannerClient(dial())
	ctx := ctxTimeout(t)
	small := &thzdrivev1.AnalyzePulseRequest{Waveform: singleCycle(1, 100)}

	// An oversized message.
	big := uniformTrace(200_000, 10) // 1.6 MB of doubles
	_, err := normal.AnalyzePulse(ctx, &thzdrivev1.AnalyzePulseRequest{Waveform: &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: big}}})
	if status.Code(err) != codes.ResourceExhausted {
		t.Errorf("oversized message: %v, want RESOURCE_EXHAUSTED", err)
	}
	// A sweep of 10^6 points over the limit.
	stream, err := normal.Sweep(ctx, sweepOfSize(1_000_000))
	if err == nil {
		_, err = stream.Recv()
	}
	if status.Code(err) != codes.InvalidArgument {
		t.Errorf("10^6-point sweep: %v, want INVALID_ARGUMENT", err)
	}

	// flood opens streams sweeps on each of conns connections and counts
	// how they end.
	flood := func(ctx context.Context, conns, streams int) (refused, other *atomic.Int64, wait func()) {
		refused, other = new(atomic.Int64), new(atomic.Int64)
		var wg sync.WaitGroup
		for range conns {
			ab := thzdrivev1.NewPumpPlannerClient(dial())
			for range streams {
				wg.Add(1)
				go func() {
					defer wg.Done()
					s, err := ab.Sweep(ctx, sweepOfSize(1000))
					for err == nil {
						_, err = s.Recv()
					}
					switch status.Code(err) {
					case codes.ResourceExhausted:
						refused.Add(1)
					case codes.Canceled, codes.DeadlineExceeded:
					default:
						if err != io.EOF {
							other.Add(1)
							t.Errorf("abusive stream ended with %v", err)
						}
					}
				}()
			}
		}
		return refused, other, wg.Wait
	}

	// Thousands of streams on one connection: HTTP/2 admits
	// MaxConcurrentStreams of them at a time and the rest wait at the
	// client; a normal caller on its own connection keeps being served.
	abuseCtx, stopAbuse := context.WithCancel(ctx)
	_, _, wait := flood(abuseCtx, 1, 2000)
	time.Sleep(200 * time.Millisecond)
	for i := range 5 {
		if _, err := normal.AnalyzePulse(ctx, small); err != nil {
			t.Errorf("normal call %d during a one-connection flood: %v", i, err)
		}
	}
	if h, err := healthpb.NewHealthClient(dial()).Check(ctx, &healthpb.HealthCheckRequest{}); err != nil || h.Status != healthpb.HealthCheckResponse_SERVING {
		t.Errorf("health during abuse: %v %v", h, err)
	}
	stopAbuse()
	wait()

	// Streams from many connections beyond the server's call limit are
	// refused at once with RESOURCE_EXHAUSTED; nothing else fails, health
	// answers, and normal calls succeed again as soon as the flood ends.
	abuseCtx, stopAbuse = context.WithCancel(ctx)
	refused, other, wait := flood(abuseCtx, 20, 50)
	time.Sleep(300 * time.Millisecond)
	if h, err := healthpb.NewHealthClient(dial()).Check(ctx, &healthpb.HealthCheckRequest{}); err != nil || h.Status != healthpb.HealthCheckResponse_SERVING {
		t.Errorf("health during abuse: %v %v", h, err)
	}
	stopAbuse()
	wait()
	if refused.Load() == 0 {
		t.Error("no stream was refused beyond the call limit")
	}
	t.Logf("abuse: 1000 streams over 20 connections, %d refused with RESOURCE_EXHAUSTED, %d other failures", refused.Load(), other.Load())
	// The flood's last points finish within a point's time; then a normal
	// call must be served.
	deadline := time.Now().Add(2 * time.Second)
	for {
		_, err := normal.AnalyzePulse(ctx, small)
		if err == nil {
			break
		}
		if status.Code(err) != codes.ResourceExhausted || time.Now().After(deadline) {
			t.Fatalf("normal call after the flood: %v", err)
		}
		time.Sleep(20 * time.Millisecond)
	}
}

// SIGTERM during a load run loses no accepted call: every call either
// completes or is refused as UNAVAILABLE, and thzdrived exits 0 (issue
// check). It builds and runs the real daemon.
func TestDrainOnSIGTERM(t *testing.T) {
	if testing.Short() {
		t.Skip("builds and runs thzdrived")
	}
	bin := filepath.Join(t.TempDir(), "thzdrived")
	build := exec.Command("go", "build", "-o", bin, "./cmd/thzdrived")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	cmd := exec.Command(bin, "--grpc-listen", "127.0.0.1:0", "--drain-timeout", "10s")
	stderr, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	defer cmd.Process.Kill()
	addrRe := regexp.MustCompile(`grpc=(127\.0\.0\.1:\d+)`)
	sc := bufio.NewScanner(stderr)
	addr := ""
	for sc.Scan() {
		if m := addrRe.FindStringSubmatch(sc.Text()); m != nil {
			addr = m[1]
			break
		}
	}
	if addr == "" {
		t.Fatal("thzdrived did not report its address")
	}
	go io.Copy(io.Discard, stderr)

	conn, err := grpc.NewClient(addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	c := thzdrivev1.NewPumpPlannerClient(conn)
	// A call that takes a while, so that some are in flight at SIGTERM.
	req := testPlan()
	req.Waveform.GetModel().StepFs = 2
	req.Waveform.GetModel().SpanPs = 40
	var ok, unavailable, lost atomic.Int64
	stop := make(chan struct{})
	var wg sync.WaitGroup
	for range 8 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				select {
				case <-stop:
					return
				default:
				}
				ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
				_, err := c.PlanExperiment(ctx, req)
				cancel()
				switch status.Code(err) {
				case codes.OK:
					ok.Add(1)
				case codes.Unavailable:
					unavailable.Add(1)
					select {
					case <-stop:
					case <-time.After(10 * time.Millisecond):
					}
				default:
					lost.Add(1)
					t.Errorf("call lost during drain: %v", err)
				}
			}
		}()
	}
	time.Sleep(500 * time.Millisecond)
	if err := cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	err = cmd.Wait()
	close(stop)
	wg.Wait()
	if err != nil {
		t.Errorf("thzdrived exit after SIGTERM: %v, want status 0", err)
	}
	if ok.Load() == 0 {
		t.Error("no call completed before the drain")
	}
	t.Logf("drain: %d calls completed, %d refused as UNAVAILABLE, %d lost", ok.Load(), unavailable.Load(), lost.Load())
}

// Unary calls through the client's round-robin balancer keep succeeding
// when a replica dies: the balancer drops it and gRPC's retry policy
// (client.ServiceConfig) repeats a call that failed UNAVAILABLE.
func TestUnaryFailover(t *testing.T) {
	a, b := startReplica(t, Config{}), startReplica(t, Config{})
	c, err := client.Dial([]string{a.addr, b.addr})
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	ctx := ctxTimeout(t)
	req := &thzdrivev1.AnalyzePulseRequest{Waveform: singleCycle(1, 100)}
	for i := range 40 {
		if i == 10 {
			a.srv.GRPC.Stop()
		}
		if _, err := c.AnalyzePulse(ctx, req); err != nil {
			t.Fatalf("call %d (replica killed before call 10): %v", i, err)
		}
	}
}
