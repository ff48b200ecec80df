package server

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"context"
	"math"
	"testing"

	"google.golang.org/protobuf/proto"
	"google.golang.org/protobuf/reflect/protoreflect"
	"google.golang.org/protobuf/types/dynamicpb"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// TestAllFiniteMatchesProtoreflect: the Go-struct walk of allFinite must
// give the answer of the protoreflect walk it replaced, on a real plan
// response and on copies with one NaN or Inf planted in each kind of
// place: a repeated double, a nested scalar, a field under a oneof of the
// echoed request, a repeated message; and dynamic messages (no Go struct
// to walk) must still be checked.
func TestAllFiniteMatchesProtoreflect(t *testing.T) {
	svc := New(quietConfig()).Service
	base, err := svc.PlanExperiment(context.Background(), benchPlanRequest(benchPlanCases[0]))
	if err != nil {
		t.Fatal(err)
	}
	plant := map[string]func(r *thzdrivev1.PlanExperimentResponse){
		"none":                      func(*thzdrivev1.PlanExperimentResponse) {},
		"transfer amplitude (list)": func(r *thzdrivev1.PlanExperimentResponse) { r.Optics.Transfer.Amplitude[7] = math.NaN() },
		"Q(t) (list, last)":         func(r *thzdrivev1.PlanExperimentResponse) { q := r.Mode.Q.QASqrtAmu; q[len(q)-1] = math.Inf(-1) },
		"mode quanta (scalar)":      func(r *thzdrivev1.PlanExperimentResponse) { r.Mode.Quanta = math.Inf(1) },
		"resolved model (oneof)": func(r *thzdrivev1.PlanExperimentResponse) {
			r.Resolved.Waveform.GetModel().PeakFieldKvPerCm = math.NaN()
		},
		"resolved oscillator (list)": func(r *thzdrivev1.PlanExperimentResponse) {
			r.Resolved.Sample.ExitMedium.GetDielectric().Oscillators[0].DeltaEps = math.NaN()
		},
		"resolved slab medium (deep)": func(r *thzdrivev1.PlanExperimentResponse) {
			r.Resolved.Train[0].GetSlab().Medium.GetConstant().N = math.Inf(1)
		},
	}
	for name, f := range plant {
		r := proto.Clone(base).(*thzdrivev1.PlanExperimentResponse)
		f(r)
		fast, slow := allFinite(r.ProtoReflect()), allFiniteReflect(r.ProtoReflect())
		if fast != slow || fast != (name == "none") {
			t.Errorf("%s: allFinite %v, protoreflect walk %v", name, fast, slow)
		}
		// The same message as a dynamic one (no generated struct).
		b, err := proto.Marshal(r)
		if err != nil {
			t.Fatal(err)
		}
		dyn := dynamicpb.NewMessage(r.ProtoReflect().Descriptor())
		if err := proto.Unmarshal(b, dyn); err != nil {
			t.Fatal(err)
		}
		if got := allFinite(dyn); got != slow {
			t.Errorf("%s, dynamic message: allFinite %v, want %v", name, got, slow)
		}
	}
	var empty protoreflect.Message = (&thzdrivev1.ListMaterialsRequest{}).ProtoReflect()
	if !allFinite(empty) {
		t.Error("an empty message is not finite")
	}
}

func BenchmarkAllFinite(b *testing.B) {
	svc := New(quietConfig()).Service
	for _, c := range benchPlanCases {
		resp, err := svc.PlanExperiment(context.Background(), benchPlanRequest(c))
		if err != nil {
			b.Fatal(err)
		}
		m := resp.ProtoReflect()
		b.Run(c.name+"/go-struct", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if !allFinite(m) {
					b.Fatal("not finite")
				}
			}
		})
		b.Run(c.name+"/protoreflect", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if !allFiniteReflect(m) {
					b.Fatal("not finite")
				}
			}
		})
	}
}
