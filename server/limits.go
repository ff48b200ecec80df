package server

import (
	"context"
	"fmt"
	"strings"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
)

// limiter enforces MaxConcurrentCalls and MaxCallDuration. Beyond the call
// limit a call is refused at once (RESOURCE_EXHAUSTED): queueing it would let
// a flood of calls hold memory and time out anyway.
type limiter struct {
	slots       chan struct{}
	maxDuration time.Duration
}

func newLimiter(l Limits) *limiter {
	lim := &limiter{maxDuration: l.MaxCallDuration}
	if l.MaxConcurrentCalls > 0 {
		lim.slots = make(chan struct{}, l.MaxConcurrentCalls)
	}
	return lim
}

// enter takes a slot and bounds the call's deadline; the returned function
// gives both back.
func (l *limiter) enter(ctx context.Context, method string) (context.Context, func(), error) {
	if strings.HasPrefix(method, healthPrefix) {
		return ctx, func() {}, nil
	}
	if l.slots != nil {
		select {
		case l.slots <- struct{}{}:
		default:
			return ctx, nil, status.Error(codes.ResourceExhausted,
				fmt.Sprintf("the server is computing %d calls, its limit (--max-concurrent-calls); retry shortly or add a replica", cap(l.slots)))
		}
	}
	cancel := func() {}
	if l.maxDuration > 0 {
		if dl, ok := ctx.Deadline(); !ok || time.Until(dl) > l.maxDuration {
			ctx, cancel = context.WithTimeout(ctx, l.maxDuration)
		}
	}
	return ctx, func() {
		cancel()
		if l.slots != nil {
			<-l.slots
		}
	}, nil
}

func (l *limiter) unary() grpc.UnaryServerInterceptor {
	return func(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (any, error) {
		ctx, done, err := l.enter(ctx, info.FullMethod)
		if err != nil {
			return nil, err
		}
		defer done()
		return handler(ctx, req)
	}
}

func (l *limiter) stream() grpc.StreamServerInterceptor {
	return func(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) error {
		ctx, done, err := l.enter(ss.Context(), info.FullMethod)
		if err != nil {
			return err
		}
		defer done()
		return handler(srv, &boundedStream{ServerStream: ss, ctx: ctx})
	}
}

// boundedStream carries the bounded context into a stream handler.
type boundedStream struct {
	grpc.ServerStream
	ctx context.Context
}

func (b *boundedStream) Context() context.Context { return b.ctx }
