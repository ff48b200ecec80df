package server

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"context"
	"errors"
	"io"
	"testing"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials/insecure"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// A 10 000-point sweep over a real server completes, every point once and
// without error, and its throughput is compared with the same points called
// one by one as PlanExperiment (issue check; the ratio is logged and kept
// in the README). The plan is the invented testPlan on a short trace, so
// the test stays within seconds.
func TestTenThousandPointSweep(t *testing.T) {
	if testing.Short() {
		t.Skip("10 000-point sweep")
	}
	rep := startReplica(t, Config{})
	conn, err := grpc.NewClient(rep.addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	c := thzdrivev1.NewPumpPlannerClient(conn)
	plan := testPlan()
	plan.Waveform.GetModel().StepFs, plan.Waveform.GetModel().SpanPs = 25, 10
	req := &thzdrivev1.SweepRequest{Plan: plan, Axes: []*thzdrivev1.SweepAxis{
		{Parameter: "calibration.pulse_energy_uj", Start: 0.1, Stop: 10, Count: 100},
		{Parameter: "heating.base_temperature_k", Start: 4, Stop: 29, Count: 100},
	}}
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()

	start := time.Now()
	stream, err := c.Sweep(ctx, req)
	if err != nil {
		t.Fatal(err)
	}
	seen := make([]bool, 10000)
	for {
		p, err := stream.Recv()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		if p.Error != nil {
			t.Fatalf("point %d failed: %v", p.Index, p.Error)
		}
		if seen[p.Index] {
			t.Fatalf("point %d twice", p.Index)
		}
		seen[p.Index] = true
	}
	sweep := time.Since(start)
	for i, ok := range seen {
		if !ok {
			t.Fatalf("point %d missing", i)
		}
	}

	// The same points one by one, on one connection, one call at a time;
	// a sample of 1000 of them, scaled to 10 000.
	const sample = 1000
	start = time.Now()
	for i := range sample {
		p := testPlan()
		p.Waveform.GetModel().StepFs, p.Waveform.GetModel().SpanPs = 25, 10
		p.Calibration.Energy = &thzdrivev1.EnergyCalibration_PulseEnergyUj{PulseEnergyUj: 0.1 + 9.9*float64(i%100)/99}
		if _, err := c.PlanExperiment(ctx, p); err != nil {
			t.Fatal(err)
		}
	}
	oneByOne := time.Since(start) * (10000 / sample)
	t.Logf("10 000-point sweep: %v (%.0f points/s); the same points one by one: %v (estimated from %d calls); ratio %.2f",
		sweep.Round(time.Millisecond), 10000/sweep.Seconds(), oneByOne.Round(time.Millisecond), sample, oneByOne.Seconds()/sweep.Seconds())
}
