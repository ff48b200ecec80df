package server

import (
	"context"
	"strings"
	"time"

	"github.com/prometheus/client_golang/prometheus"
	"github.com/prometheus/client_golang/prometheus/collectors"
	"google.golang.org/grpc"
	"google.golang.org/grpc/status"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// metrics are the server's Prometheus metrics, served on the HTTP port at
// /metrics. Each Server has its own registry (not the global one), so that
// tests and the command-line tool's in-process mode can build several.
//
// They are gathered by the outermost gRPC interceptors, so every call is
// counted once whichever way it came: over gRPC or through the HTTP/JSON
// gateway (which calls the same server over an in-memory connection).
//
//	thzdrive_requests_total{service,method,code}         finished calls
//	thzdrive_request_duration_seconds{service,method}    latency histogram
//	thzdrive_requests_in_flight{service,method}          calls being computed
//	thzdrive_sweep_points_total{outcome}                 sweep points sent ("ok" or "error")
//
// plus the Go runtime and process collectors.
type metrics struct {
	registry    *prometheus.Registry
	requests    *prometheus.CounterVec
	duration    *prometheus.HistogramVec
	inFlight    *prometheus.GaugeVec
	sweepPoints *prometheus.CounterVec
}

// durationBuckets span a cached model pulse (well under a millisecond) to a
// large sweep (minutes), in seconds.
var durationBuckets = []float64{0.0005, 0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60, 120, 300}

func newMetrics() *metrics {
	m := &metrics{
		registry: prometheus.NewRegistry(),
		requests: prometheus.NewCounterVec(prometheus.CounterOpts{
			Name: "thzdrive_requests_total",
			Help: "Calls finished, by gRPC service, method and status code (HTTP/JSON calls included).",
		}, []string{"service", "method", "code"}),
		duration: prometheus.NewHistogramVec(prometheus.HistogramOpts{
			Name:    "thzdrive_request_duration_seconds",
			Help:    "Time from receiving a call to its last byte of response, by gRPC service and method.",
			Buckets: durationBuckets,
		}, []string{"service", "method"}),
		inFlight: prometheus.NewGaugeVec(prometheus.GaugeOpts{
			Name: "thzdrive_requests_in_flight",
			Help: "Calls being computed now, by gRPC service and method.",
		}, []string{"service", "method"}),
		sweepPoints: prometheus.NewCounterVec(prometheus.CounterOpts{
			Name: "thzdrive_sweep_points_total",
			Help: "Sweep grid points sent to callers, by outcome (ok, or error for a point that could not be computed).",
		}, []string{"outcome"}),
	}
	m.registry.MustRegister(m.requests, m.duration, m.inFlight, m.sweepPoints,
		collectors.NewGoCollector(), collectors.NewProcessCollector(collectors.ProcessCollectorOpts{}))
	// Start the PumpPlanner series at zero, so that dashboards and rate()
	// see every method before its first call.
	for _, md := range thzdrivev1.PumpPlanner_ServiceDesc.Methods {
		m.inFlight.WithLabelValues(thzdrivev1.PumpPlanner_ServiceDesc.ServiceName, md.MethodName)
	}
	for _, sd := range thzdrivev1.PumpPlanner_ServiceDesc.Streams {
		m.inFlight.WithLabelValues(thzdrivev1.PumpPlanner_ServiceDesc.ServiceName, sd.StreamName)
	}
	m.sweepPoints.WithLabelValues("ok")
	m.sweepPoints.WithLabelValues("error")
	return m
}

// splitMethod splits "/thzdrive.v1.PumpPlanner/AnalyzePulse" into its
// service and method names.
func splitMethod(full string) (service, method string) {
	full = strings.TrimPrefix(full, "/")
	if i := strings.LastIndexByte(full, '/'); i >= 0 {
		return full[:i], full[i+1:]
	}
	return "unknown", full
}

// begin counts a call in flight and returns the function that records its
// end.
func (m *metrics) begin(fullMethod string) func(error) {
	svc, meth := splitMethod(fullMethod)
	g := m.inFlight.WithLabelValues(svc, meth)
	g.Inc()
	start := time.Now()
	return func(err error) {
		g.Dec()
		m.duration.WithLabelValues(svc, meth).Observe(time.Since(start).Seconds())
		m.requests.WithLabelValues(svc, meth, status.Code(err).String()).Inc()
	}
}

func (m *metrics) unary() grpc.UnaryServerInterceptor {
	return func(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (resp any, err error) {
		end := m.begin(info.FullMethod)
		defer func() { end(err) }()
		return handler(ctx, req)
	}
}

func (m *metrics) stream() grpc.StreamServerInterceptor {
	return func(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) (err error) {
		end := m.begin(info.FullMethod)
		defer func() { end(err) }()
		return handler(srv, &countingStream{ServerStream: ss, m: m})
	}
}

// countingStream counts the sweep points a stream sends.
type countingStream struct {
	grpc.ServerStream
	m *metrics
}

func (s *countingStream) SendMsg(msg any) error {
	err := s.ServerStream.SendMsg(msg)
	if r, ok := msg.(*thzdrivev1.SweepResponse); ok && err == nil {
		if r.GetError() != nil {
			s.m.sweepPoints.WithLabelValues("error").Inc()
		} else {
			s.m.sweepPoints.WithLabelValues("ok").Inc()
		}
	}
	return err
}

// Registry is the server's Prometheus registry, served at /metrics by
// HTTPHandler; a program embedding the server may register its own
// collectors in it.
func (s *Server) Registry() *prometheus.Registry { return s.metrics.registry }
