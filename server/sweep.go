package server

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"strings"
	"sync"
	"unicode"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// sweepAxis is a resolved axis: its parameter path and values.
type sweepAxis struct {
	path   string
	values []float64
}

// Sweep computes a plan over a grid of one or two parameters and streams
// each point as soon as it is ready, tagged with its grid index (points
// arrive in completion order, not grid order). Every point is exactly the
// PlanExperiment of the template with the axis values set, so a sweep and
// the same points called one by one cannot differ. The grid is spread over
// all cores; a cancelled or expired call stops handing out points at once
// and returns when the points in flight are done.
func (s *Service) Sweep(req *thzdrivev1.SweepRequest, stream thzdrivev1.PumpPlanner_SweepServer) error {
	axes, total, first, end, err := s.resolveSweep(req)
	if err != nil {
		return err
	}
	ctx, cancel := context.WithCancel(stream.Context())
	defer cancel()

	workers := int(min(int64(runtime.GOMAXPROCS(0)), end-first))
	jobs := make(chan int64)
	results := make(chan *thzdrivev1.SweepResponse, workers)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for idx := range jobs {
				point := s.sweepPoint(ctx, req, axes, idx, total)
				select {
				case results <- point:
				case <-ctx.Done():
					return
				}
			}
		}()
	}
	go func() {
		defer close(jobs)
		for i := first; i < end; i++ {
			select {
			case jobs <- i:
			case <-ctx.Done():
				return
			}
		}
	}()
	go func() {
		wg.Wait()
		close(results)
	}()

	var sendErr error
	for point := range results {
		if sendErr != nil {
			continue // drain, so the workers can exit
		}
		if err := stream.Send(point); err != nil {
			sendErr = err
			cancel()
		}
	}
	if sendErr != nil {
		return sendErr
	}
	if err := stream.Context().Err(); err != nil {
		return status.FromContextError(err).Err()
	}
	return nil
}

// resolveSweep validates the axes, the grid size and the index range, and
// returns the axes, the grid's size and the range [first, end) to compute.
func (s *Service) resolveSweep(req *thzdrivev1.SweepRequest) (axes []sweepAxis, total, first, end int64, err error) {
	var v violations
	if req.Plan == nil {
		v.add("plan", "the plan template is required")
	}
	if n := len(req.Axes); n < 1 || n > 2 {
		v.add("axes", "give one or two axes, got %d", n)
	}
	if !v.ok() {
		return nil, 0, 0, 0, v.err()
	}
	total = 1
	for i, a := range req.Axes {
		path := fmt.Sprintf("axes[%d].", i)
		vals := axisValues(v.under(path), a, s.limits.MaxSweepPoints)
		if len(vals) == 0 {
			continue
		}
		probe := proto.Clone(req.Plan)
		if err := setNumber(probe.ProtoReflect(), a.Parameter, vals[0]); err != nil {
			v.add(path+"parameter", "%v", err)
			continue
		}
		for j := range axes {
			if axes[j].path == a.Parameter {
				v.add(path+"parameter", "%q is already axis %d", a.Parameter, j)
			}
		}
		axes = append(axes, sweepAxis{path: a.Parameter, values: vals})
		total *= int64(len(vals))
	}
	if v.ok() && total > int64(s.limits.MaxSweepPoints) {
		v.add("axes", "the grid has %d points, over the limit of %d", total, s.limits.MaxSweepPoints)
	}
	first, end = req.FirstIndex, total
	if req.PointCount != 0 {
		end = first + req.PointCount
	}
	switch {
	case !v.ok():
	case first < 0 || first >= total:
		v.add("first_index", "must be in [0, %d), got %d", total, first)
	case req.PointCount < 0 || end > total:
		v.add("point_count", "%d points from index %d pass the end of the %d-point grid", req.PointCount, first, total)
	}
	if err := v.err(); err != nil {
		return nil, 0, 0, 0, err
	}
	return axes, total, first, end, nil
}

// axisValues returns the values of one axis: the explicit list, or count
// points from start to stop inclusive, evenly or logarithmically spaced.
func axisValues(v *violations, a *thzdrivev1.SweepAxis, limit int) []float64 {
	if len(a.Values) > 0 {
		if a.Count != 0 || a.Start != 0 || a.Stop != 0 {
			v.add("values", "give values or start/stop/count, not both")
			return nil
		}
		if len(a.Values) > limit {
			v.add("values", "%d values, over the limit of %d", len(a.Values), limit)
			return nil
		}
		if !v.allFinite("values", a.Values) {
			return nil
		}
		return append([]float64(nil), a.Values...)
	}
	okStart, okStop := v.finite("start", a.Start), v.finite("stop", a.Stop)
	if a.Count < 2 {
		v.add("count", "a range needs count >= 2, got %d", a.Count)
		return nil
	}
	if int(a.Count) > limit {
		v.add("count", "%d points, over the limit of %d", a.Count, limit)
		return nil
	}
	if !okStart || !okStop {
		return nil
	}
	if a.Logarithmic && (a.Start <= 0 || a.Stop <= 0) {
		v.add("start", "a logarithmic range needs start and stop > 0")
		return nil
	}
	out := make([]float64, a.Count)
	last := float64(a.Count - 1)
	for i := range out {
		f := float64(i) / last
		if a.Logarithmic {
			out[i] = a.Start * math.Pow(a.Stop/a.Start, f)
		} else {
			out[i] = a.Start + (a.Stop-a.Start)*f
		}
	}
	out[len(out)-1] = a.Stop
	return out
}

// sweepPoint computes grid point idx (row-major, the last axis fastest).
func (s *Service) sweepPoint(ctx context.Context, req *thzdrivev1.SweepRequest, axes []sweepAxis, idx, total int64) *thzdrivev1.SweepResponse {
	out := &thzdrivev1.SweepResponse{Index: idx, Total: total, Coordinates: make([]float64, len(axes))}
	p := proto.Clone(req.Plan).(*thzdrivev1.PlanExperimentRequest)
	rem := idx
	for i := len(axes) - 1; i >= 0; i-- {
		n := int64(len(axes[i].values))
		out.Coordinates[i] = axes[i].values[rem%n]
		rem /= n
	}
	for i, a := range axes {
		if err := setNumber(p.ProtoReflect(), a.path, out.Coordinates[i]); err != nil {
			out.Error = &thzdrivev1.SweepPointError{Code: codeName(codes.InvalidArgument), Message: err.Error(), Fields: []string{a.path}}
			return out
		}
	}
	resp, err := s.PlanExperiment(ctx, p)
	if err == nil && !allFinite(resp.ProtoReflect()) {
		err = status.Error(codes.Internal, "internal error: result not finite")
	}
	if err != nil {
		st := status.Convert(err)
		out.Error = &thzdrivev1.SweepPointError{Code: codeName(st.Code()), Message: st.Message()}
		for _, d := range st.Details() {
			if br, ok := d.(*errdetails.BadRequest); ok {
				for _, fv := range br.FieldViolations {
					out.Error.Fields = append(out.Error.Fields, fv.Field)
				}
			}
		}
		return out
	}
	out.Headline = headline(resp)
	if req.FullResults {
		out.Result = resp
	}
	return out
}

// codeName spells a status code as the gRPC specification does
// ("INVALID_ARGUMENT"), the form a program in any language recognises.
func codeName(c codes.Code) string {
	var b strings.Builder
	prevLower := false
	for _, r := range c.String() {
		if prevLower && unicode.IsUpper(r) {
			b.WriteByte('_')
		}
		prevLower = unicode.IsLower(r)
		b.WriteRune(unicode.ToUpper(r))
	}
	return b.String()
}
