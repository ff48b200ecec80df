package server

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"net"
	"net/http"
	"net/textproto"
	"strings"

	"github.com/grpc-ecosystem/grpc-gateway/v2/runtime"
	"github.com/prometheus/client_golang/prometheus/promhttp"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/test/bufconn"
	"google.golang.org/protobuf/encoding/protojson"

	"thzdrive/api/openapi"
	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// HTTP routes besides the PumpPlanner methods (whose paths are declared in
// proto/thzdrive/v1/http.yaml and listed in the OpenAPI description).
const (
	OpenAPIPath = "/openapi.json" // GET: the OpenAPI (Swagger 2.0) description
	MetricsPath = "/metrics"      // GET: Prometheus metrics
	HealthPath  = "/healthz"      // GET: 200 while serving, 503 once draining
)

// HTTPHandler returns the HTTP side of the server: every PumpPlanner method
// as JSON over HTTP (POST, proto JSON mapping) by the grpc-gateway code
// generated into api/thzdrive/v1, plus OpenAPIPath, MetricsPath and
// HealthPath.
//
// The gateway does not call the Service directly: it calls it over gRPC on
// an in-memory connection to a second grpc.Server that shares the Service,
// the interceptors and the limits with s.GRPC (only the transport credentials
// differ; none are needed in memory). So request ids, logging, panic
// recovery, the NaN guard, bearer tokens (the HTTP Authorization header),
// the call limiter and the metrics apply to HTTP callers exactly as to gRPC
// callers, and the streamed Sweep works (as newline-delimited JSON, one
// {"result": SweepResponse} object per line) -- which grpc-gateway's
// direct, connection-less registration does not support.
//
// Request ids: an X-Request-Id request header is passed on, and the id used
// comes back in the X-Request-Id response header. Errors are JSON
// google.rpc.Status objects with the HTTP status of their gRPC code (bad
// input: 400 with a google.rpc.BadRequest detail naming each field path).
// Unknown JSON fields are refused, not ignored. A body over four times
// Limits.MaxMessageBytes is refused (413) before it is read.
//
// The in-memory connection lives until ctx is done or the server is drained.
func (s *Server) HTTPHandler(ctx context.Context) (http.Handler, error) {
	lis := bufconn.Listen(1 << 20)
	go func() { _ = s.loop.Serve(lis) }()
	conn, err := grpc.NewClient("passthrough:///thzdrive-in-memory",
		grpc.WithContextDialer(func(ctx context.Context, _ string) (net.Conn, error) { return lis.DialContext(ctx) }),
		grpc.WithTransportCredentials(insecure.NewCredentials()),
		grpc.WithDefaultCallOptions(grpc.MaxCallRecvMsgSize(math.MaxInt32), grpc.MaxCallSendMsgSize(math.MaxInt32)),
	)
	if err != nil {
		lis.Close()
		return nil, fmt.Errorf("server: in-memory connection for HTTP: %w", err)
	}
	go func() {
		<-ctx.Done()
		conn.Close()
		lis.Close()
	}()

	gw := runtime.NewServeMux(
		runtime.WithMarshalerOption(runtime.MIMEWildcard, &runtime.JSONPb{
			// The proto JSON mapping, every field present (zeros too) so
			// that a caller parsing into a fixed structure finds each key.
			MarshalOptions:   protojson.MarshalOptions{EmitUnpopulated: true},
			UnmarshalOptions: protojson.UnmarshalOptions{DiscardUnknown: false},
		}),
		runtime.WithIncomingHeaderMatcher(incomingHeader),
		runtime.WithOutgoingHeaderMatcher(outgoingHeader),
	)
	if err := thzdrivev1.RegisterPumpPlannerHandler(ctx, gw, conn); err != nil {
		conn.Close()
		return nil, fmt.Errorf("server: HTTP gateway: %w", err)
	}

	// JSON spells a double in up to ~25 bytes where the wire uses 8: allow
	// a JSON body four times the gRPC message limit, no more.
	maxBody := 4 * int64(s.Service.limits.MaxMessageBytes)
	mux := http.NewServeMux()
	mux.Handle("/", http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if r.ContentLength > maxBody {
			// Refused before reading; a longer body without a declared
			// length is cut at maxBody and refused by the JSON decoder (400).
			w.Header().Set("Content-Type", "application/json")
			w.WriteHeader(http.StatusRequestEntityTooLarge)
			msg := fmt.Sprintf("request body of %d bytes is over the limit of %d bytes (4 x --max-message-bytes)", r.ContentLength, maxBody)
			_ = json.NewEncoder(w).Encode(map[string]any{"code": codes.ResourceExhausted, "message": msg})
			return
		}
		r.Body = http.MaxBytesReader(w, r.Body, maxBody)
		gw.ServeHTTP(w, r)
	}))
	mux.HandleFunc("GET "+OpenAPIPath, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "application/json")
		_, _ = w.Write(openapi.JSON)
	})
	mux.Handle("GET "+MetricsPath, promhttp.HandlerFor(s.metrics.registry, promhttp.HandlerOpts{Registry: s.metrics.registry}))
	mux.HandleFunc("GET "+HealthPath, func(w http.ResponseWriter, r *http.Request) {
		resp, err := s.Health.Check(r.Context(), &healthpb.HealthCheckRequest{})
		w.Header().Set("Content-Type", "text/plain; charset=utf-8")
		if err != nil || resp.GetStatus() != healthpb.HealthCheckResponse_SERVING {
			w.WriteHeader(http.StatusServiceUnavailable)
			fmt.Fprintln(w, "NOT_SERVING")
			return
		}
		fmt.Fprintln(w, "SERVING")
	})
	return mux, nil
}

// incomingHeader passes the request id on under its gRPC metadata key,
// and everything else as grpc-gateway does by default (the Authorization
// header reaches the token check as "authorization" either way).
func incomingHeader(key string) (string, bool) {
	if textproto.CanonicalMIMEHeaderKey(key) == textproto.CanonicalMIMEHeaderKey(RequestIDHeader) {
		return RequestIDHeader, true
	}
	return runtime.DefaultHeaderMatcher(key)
}

// outgoingHeader returns the request id as a plain X-Request-Id header,
// drops the gRPC transport's content-type, and passes other response
// metadata under grpc-gateway's usual Grpc-Metadata- prefix.
func outgoingHeader(key string) (string, bool) {
	switch strings.ToLower(key) {
	case RequestIDHeader:
		return textproto.CanonicalMIMEHeaderKey(RequestIDHeader), true
	case "content-type":
		return "", false
	}
	return runtime.MetadataHeaderPrefix + key, true
}
