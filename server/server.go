// Package server is the gRPC face of thzdrive: it translates PumpPlanner
// wire messages into the physics packages' types (pulse, optics, phononmode,
// thermal), calls them, and translates the results back. It holds no physics
// of its own. Beside the translators (one file per method family) live the
// shared pieces: validation, limits, the interceptors, and the wiring of
// health, reflection and logging.
package server

import (
	"context"
	"crypto/rand"
	"encoding/hex"
	"log/slog"
	"math"
	"reflect"
	"runtime/debug"
	"sync"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/health"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/metadata"
	"google.golang.org/grpc/reflection"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"
	"google.golang.org/protobuf/reflect/protoreflect"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// Limits bound the work one request may ask for. Each has a flag in
// thzdrived; a request beyond a limit is refused with a message naming it.
type Limits struct {
	// MaxSamples bounds the samples of a trace, after resampling and padding.
	MaxSamples int
	// MaxLayers bounds the layers of a sample stack plus train elements.
	MaxLayers int
	// MaxSweepPoints bounds the grid points of one sweep.
	MaxSweepPoints int
	// MaxMessageBytes bounds a received message.
	MaxMessageBytes int
	// MaxConcurrentStreams bounds concurrent calls on one connection (HTTP/2
	// SETTINGS; a client queues beyond it). Kept below MaxConcurrentCalls so
	// that one connection cannot take every slot.
	MaxConcurrentStreams uint32
	// MaxConcurrentCalls bounds the calls being computed at once over all
	// connections; one more is refused at once with RESOURCE_EXHAUSTED
	// (health is exempt), rather than queued where it would hold memory.
	MaxConcurrentCalls int
	// MaxCallDuration is the deadline given to a call that brings none, and
	// the longest one a call may ask for.
	MaxCallDuration time.Duration
}

// DefaultLimits are the limits of service.md.
func DefaultLimits() Limits {
	return Limits{
		MaxSamples:           1 << 20,
		MaxLayers:            64,
		MaxSweepPoints:       1_000_000,
		MaxMessageBytes:      64 << 20,
		MaxConcurrentStreams: 64,
		MaxConcurrentCalls:   256,
		MaxCallDuration:      10 * time.Minute,
	}
}

// Config configures a Server. The zero value is usable: default limits and
// the default slog logger.
type Config struct {
	Limits Limits
	Logger *slog.Logger
	// Tokens, when not nil, are the bearer tokens every call but health
	// must carry.
	Tokens *Tokens
	// ServerOptions are appended to the gRPC server's options (transport
	// credentials for TLS, say).
	ServerOptions []grpc.ServerOption
}

// Service implements thzdrivev1.PumpPlannerServer.
type Service struct {
	thzdrivev1.UnimplementedPumpPlannerServer
	limits Limits
	log    *slog.Logger
}

// Server is a ready gRPC server: PumpPlanner, the standard health service and
// server reflection, behind the request-id, logging, recovery and
// finite-response interceptors. thzdrived and the command-line tool's
// in-process mode both build theirs with New.
type Server struct {
	GRPC    *grpc.Server
	Health  *health.Server
	Service *Service
	log     *slog.Logger
	metrics *metrics
	// loop serves the HTTP/JSON gateway over an in-memory connection: the
	// same service and interceptors as GRPC, without its transport
	// credentials (see http.go).
	loop *grpc.Server
}

// New builds a Server from cfg.
func New(cfg Config) *Server {
	if cfg.Limits == (Limits{}) {
		cfg.Limits = DefaultLimits()
	}
	if cfg.Logger == nil {
		cfg.Logger = slog.Default()
	}
	svc := &Service{limits: cfg.Limits, log: cfg.Logger}
	lim := newLimiter(cfg.Limits)
	m := newMetrics()
	opts := []grpc.ServerOption{
		grpc.MaxRecvMsgSize(cfg.Limits.MaxMessageBytes),
		grpc.MaxSendMsgSize(math.MaxInt32),
		grpc.MaxConcurrentStreams(cfg.Limits.MaxConcurrentStreams),
		grpc.ChainUnaryInterceptor(m.unary(), unaryInterceptor(cfg.Logger), cfg.Tokens.unary(), lim.unary()),
		grpc.ChainStreamInterceptor(m.stream(), streamInterceptor(cfg.Logger), cfg.Tokens.stream(), lim.stream()),
	}
	g := grpc.NewServer(append(opts, cfg.ServerOptions...)...)
	thzdrivev1.RegisterPumpPlannerServer(g, svc)
	h := health.NewServer()
	h.SetServingStatus("", healthpb.HealthCheckResponse_SERVING)
	h.SetServingStatus(thzdrivev1.PumpPlanner_ServiceDesc.ServiceName, healthpb.HealthCheckResponse_SERVING)
	healthpb.RegisterHealthServer(g, h)
	reflection.Register(g)
	// The gateway multiplexes every HTTP caller over one connection: no
	// per-connection stream bound there; the call limiter still applies.
	loop := grpc.NewServer(append(opts[:len(opts):len(opts)], grpc.MaxConcurrentStreams(math.MaxUint32))...)
	thzdrivev1.RegisterPumpPlannerServer(loop, svc)
	return &Server{GRPC: g, Health: h, Service: svc, log: cfg.Logger, metrics: m, loop: loop}
}

// Drain marks the server NOT_SERVING, keeps serving for delay (so that load
// balancers and probes notice and stop sending), then refuses new calls and
// lets in-flight calls finish for at most timeout before stopping hard.
func (s *Server) Drain(delay, timeout time.Duration) {
	s.Health.Shutdown()
	time.Sleep(delay)
	done := make(chan struct{})
	go func() {
		loopDone := make(chan struct{})
		go func() { s.loop.GracefulStop(); close(loopDone) }() // HTTP/JSON calls
		s.GRPC.GracefulStop()
		<-loopDone
		close(done)
	}()
	select {
	case <-done:
	case <-time.After(timeout):
		s.log.Warn("drain timed out; stopping in-flight calls", "timeout", timeout)
		s.GRPC.Stop()
		s.loop.Stop()
	}
}

// RequestIDHeader is the metadata key of the request id: taken from the
// caller when it sends one, made up otherwise, and returned in the response
// header so a lab can match its log to the server's.
const RequestIDHeader = "x-request-id"

func requestID(ctx context.Context) string {
	if md, ok := metadata.FromIncomingContext(ctx); ok {
		if ids := md.Get(RequestIDHeader); len(ids) > 0 && len(ids[0]) > 0 && len(ids[0]) <= 64 {
			return ids[0]
		}
	}
	var b [8]byte
	_, _ = rand.Read(b[:])
	return hex.EncodeToString(b[:])
}

func unaryInterceptor(log *slog.Logger) grpc.UnaryServerInterceptor {
	return func(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (resp any, err error) {
		id := requestID(ctx)
		_ = grpc.SetHeader(ctx, metadata.Pairs(RequestIDHeader, id))
		start := time.Now()
		defer func() {
			if r := recover(); r != nil {
				log.Error("panic in handler", "request_id", id, "method", info.FullMethod, "panic", r, "stack", string(debug.Stack()))
				resp, err = nil, status.Errorf(codes.Internal, "internal error (request id %s)", id)
			}
			if err == nil {
				if m, ok := resp.(proto.Message); ok && !allFinite(m.ProtoReflect()) {
					log.Error("response held NaN or Inf", "request_id", id, "method", info.FullMethod)
					resp, err = nil, status.Errorf(codes.Internal, "internal error: result not finite (request id %s)", id)
				}
			}
			log.Info("call", "request_id", id, "method", info.FullMethod, "code", status.Code(err).String(), "duration_ms", float64(time.Since(start).Microseconds())/1000)
		}()
		return handler(ctx, req)
	}
}

func streamInterceptor(log *slog.Logger) grpc.StreamServerInterceptor {
	return func(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) (err error) {
		id := requestID(ss.Context())
		_ = ss.SetHeader(metadata.Pairs(RequestIDHeader, id))
		start := time.Now()
		defer func() {
			if r := recover(); r != nil {
				log.Error("panic in stream handler", "request_id", id, "method", info.FullMethod, "panic", r, "stack", string(debug.Stack()))
				err = status.Errorf(codes.Internal, "internal error (request id %s)", id)
			}
			log.Info("stream", "request_id", id, "method", info.FullMethod, "code", status.Code(err).String(), "duration_ms", float64(time.Since(start).Microseconds())/1000)
		}()
		return handler(srv, ss)
	}
}

// allFinite walks a message and reports whether every float field is finite:
// the last guard behind the promise that no response carries NaN or Inf.
// Generated messages are walked as Go structs (finiteGo), where a repeated
// double is a []float64 checked in a tight loop: through protoreflect every
// element costs an interface call, which made this guard a fifth of a sweep
// point's time. Other messages (dynamic ones) go through protoreflect.
func allFinite(m protoreflect.Message) bool {
	if !m.IsValid() {
		return true
	}
	v := reflect.ValueOf(m.Interface())
	if v.Kind() == reflect.Pointer && v.Elem().Kind() == reflect.Struct &&
		(structOf(v.Elem().Type()).generated || m.Descriptor().Fields().Len() == 0) {
		return finiteGo(v)
	}
	return allFiniteReflect(m)
}

// finiteGo reports whether every float reachable from v (a generated
// message, or a field of one) is finite: the proto fields of a message
// struct that can hold a float (structOf), pointers, oneof interfaces (the
// wrapper struct of a oneof case has one tagged field), slices and map
// values.
func finiteGo(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Float64, reflect.Float32:
		x := v.Float()
		return !math.IsNaN(x) && !math.IsInf(x, 0)
	case reflect.Pointer, reflect.Interface:
		return v.IsNil() || finiteGo(v.Elem())
	case reflect.Struct:
		for _, i := range structOf(v.Type()).withFloats {
			if !finiteGo(v.Field(i)) {
				return false
			}
		}
	case reflect.Slice:
		switch v.Type().Elem().Kind() {
		case reflect.Float64:
			for _, x := range v.Interface().([]float64) {
				if math.IsNaN(x) || math.IsInf(x, 0) {
					return false
				}
			}
		case reflect.Float32, reflect.Pointer, reflect.Interface, reflect.Struct, reflect.Slice, reflect.Map:
			for i := range v.Len() {
				if !finiteGo(v.Index(i)) {
					return false
				}
			}
		}
	case reflect.Map:
		for it := v.MapRange(); it.Next(); {
			if !finiteGo(it.Value()) {
				return false
			}
		}
	}
	return true
}

// goStruct is what finiteGo needs of a message's Go struct.
type goStruct struct {
	// withFloats are the indexes of its proto fields (exported, tagged
	// "protobuf" or "protobuf_oneof"; the unexported bookkeeping of
	// generated code is skipped) whose type can hold a float.
	withFloats []int
	// generated is true if it has proto fields: a generated message (a
	// dynamic one keeps its fields elsewhere).
	generated bool
}

var goStructs sync.Map // reflect.Type (struct) -> goStruct

// structOf describes struct type t, computed once per type.
func structOf(t reflect.Type) goStruct {
	if g, ok := goStructs.Load(t); ok {
		return g.(goStruct)
	}
	var g goStruct
	for i := range t.NumField() {
		f := t.Field(i)
		_, tagged := f.Tag.Lookup("protobuf")
		_, oneof := f.Tag.Lookup("protobuf_oneof")
		if !f.IsExported() || !(tagged || oneof) {
			continue
		}
		g.generated = true
		if mayHoldFloat(f.Type) {
			g.withFloats = append(g.withFloats, i)
		}
	}
	goStructs.Store(t, g)
	return g
}

func mayHoldFloat(t reflect.Type) bool {
	switch t.Kind() {
	case reflect.Float64, reflect.Float32, reflect.Interface, reflect.Struct, reflect.Map:
		return true
	case reflect.Pointer, reflect.Slice:
		return mayHoldFloat(t.Elem())
	}
	return false
}

// allFiniteReflect is allFinite through protoreflect, for any message.
func allFiniteReflect(m protoreflect.Message) bool {
	ok := true
	m.Range(func(fd protoreflect.FieldDescriptor, v protoreflect.Value) bool {
		switch {
		case fd.IsList():
			l := v.List()
			for i := 0; i < l.Len() && ok; i++ {
				ok = finiteValue(fd, l.Get(i))
			}
		case fd.IsMap():
			v.Map().Range(func(_ protoreflect.MapKey, mv protoreflect.Value) bool {
				ok = finiteValue(fd.MapValue(), mv)
				return ok
			})
		default:
			ok = finiteValue(fd, v)
		}
		return ok
	})
	return ok
}

func finiteValue(fd protoreflect.FieldDescriptor, v protoreflect.Value) bool {
	switch fd.Kind() {
	case protoreflect.DoubleKind, protoreflect.FloatKind:
		x := v.Float()
		return !math.IsNaN(x) && !math.IsInf(x, 0)
	case protoreflect.MessageKind, protoreflect.GroupKind:
		return allFiniteReflect(v.Message())
	}
	return true
}
