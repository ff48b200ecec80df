package client

import (
	"context"
	"errors"
	"fmt"
	"io"
	"sort"
	"sync"
	"time"

	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// GridSize is the number of points of a sweep's grid: the product of its
// axes' lengths (len(values), or count for a range).
func GridSize(req *thzdrivev1.SweepRequest) int64 {
	total := int64(1)
	for _, a := range req.GetAxes() {
		if len(a.Values) > 0 {
			total *= int64(len(a.Values))
		} else {
			total *= int64(a.Count)
		}
	}
	return total
}

// SplitOptions tune SweepSplit.
type SplitOptions struct {
	// ChunkPoints is the most grid points one Sweep call computes
	// (default 256).
	ChunkPoints int64
	// Parallel is how many chunks run at once (default 4): with a
	// connection balanced over replicas they land on different ones.
	Parallel int
	// Attempts is how often the points of one chunk are asked for before
	// the sweep fails (default 5).
	Attempts int
}

// SweepSplit runs one sweep as several Sweep calls over index ranges of the
// grid (SweepRequest.first_index, point_count). Over a connection balanced
// round-robin across replicas the chunks spread over them; when a chunk's
// stream breaks (a replica killed or drained: UNAVAILABLE), the points it
// had not yet sent are asked for again, on whichever replica the balancer
// picks. fn receives every point exactly once, from one goroutine at a time,
// in no particular order; an error from fn stops the sweep.
func (c *Client) SweepSplit(ctx context.Context, req *thzdrivev1.SweepRequest, opt SplitOptions, fn func(*thzdrivev1.SweepResponse) error) error {
	if opt.ChunkPoints <= 0 {
		opt.ChunkPoints = 256
	}
	if opt.Parallel <= 0 {
		opt.Parallel = 4
	}
	if opt.Attempts <= 0 {
		opt.Attempts = 5
	}
	first, end := req.FirstIndex, GridSize(req)
	if req.PointCount > 0 {
		end = first + req.PointCount
	}
	if end <= first {
		return fmt.Errorf("client: empty sweep grid")
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()

	var (
		mu       sync.Mutex
		seen     = map[int64]bool{}
		firstErr error
	)
	deliver := func(p *thzdrivev1.SweepResponse) error {
		mu.Lock()
		defer mu.Unlock()
		if seen[p.Index] {
			return nil // a retried range may resend a point; deliver it once
		}
		seen[p.Index] = true
		return fn(p)
	}
	chunks := make(chan [2]int64)
	var wg sync.WaitGroup
	for range opt.Parallel {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for ch := range chunks {
				if err := c.runChunk(ctx, req, ch[0], ch[1], opt.Attempts, deliver); err != nil {
					mu.Lock()
					if firstErr == nil {
						firstErr = err
					}
					mu.Unlock()
					cancel()
				}
			}
		}()
	}
feed:
	for lo := first; lo < end; lo += opt.ChunkPoints {
		select {
		case chunks <- [2]int64{lo, min(lo+opt.ChunkPoints, end)}:
		case <-ctx.Done():
			break feed
		}
	}
	close(chunks)
	wg.Wait()
	if firstErr != nil {
		return firstErr
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	if n := int64(len(seen)); n != end-first {
		return fmt.Errorf("client: sweep ended with %d of %d points", n, end-first)
	}
	return nil
}

// runChunk computes the points [lo, hi), asking again for the missing ones
// when a stream breaks with UNAVAILABLE.
func (c *Client) runChunk(ctx context.Context, req *thzdrivev1.SweepRequest, lo, hi int64, attempts int, deliver func(*thzdrivev1.SweepResponse) error) error {
	missing := [][2]int64{{lo, hi}}
	backoff := 50 * time.Millisecond
	for attempt := 1; ; attempt++ {
		got := map[int64]bool{}
		var streamErr error
		for _, r := range missing {
			sub := proto.Clone(req).(*thzdrivev1.SweepRequest)
			sub.FirstIndex, sub.PointCount = r[0], r[1]-r[0]
			stream, err := c.Sweep(ctx, sub)
			if err != nil {
				streamErr = err
				break
			}
			for {
				p, err := stream.Recv()
				if errors.Is(err, io.EOF) {
					break
				}
				if err != nil {
					streamErr = err
					break
				}
				got[p.Index] = true
				if err := deliver(p); err != nil {
					return err
				}
			}
			if streamErr != nil {
				break
			}
		}
		if streamErr == nil {
			return nil
		}
		if status.Code(streamErr) != codes.Unavailable || attempt >= attempts {
			return fmt.Errorf("client: sweep points %d..%d: %w", lo, hi-1, streamErr)
		}
		missing = missingRanges(missing, got)
		if len(missing) == 0 {
			return nil
		}
		select {
		case <-time.After(backoff):
		case <-ctx.Done():
			return ctx.Err()
		}
		backoff *= 2
	}
}

// missingRanges returns the parts of ranges whose indices are not in got, as
// sorted half-open ranges of consecutive indices.
func missingRanges(ranges [][2]int64, got map[int64]bool) [][2]int64 {
	var idx []int64
	for _, r := range ranges {
		for i := r[0]; i < r[1]; i++ {
			if !got[i] {
				idx = append(idx, i)
			}
		}
	}
	sort.Slice(idx, func(a, b int) bool { return idx[a] < idx[b] })
	var out [][2]int64
	for _, i := range idx {
		if n := len(out); n > 0 && out[n-1][1] == i {
			out[n-1][1]++
		} else {
			out = append(out, [2]int64{i, i + 1})
		}
	}
	return out
}
