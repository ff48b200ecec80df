// Command thzdrived serves the thzdrive PumpPlanner service over gRPC, and
// the same methods as JSON over HTTP.
//
// It starts with safe defaults and no configuration: gRPC on 127.0.0.1:50051,
// HTTP on 127.0.0.1:8080 (JSON at POST /v1/..., /openapi.json, /metrics,
// /healthz), loopback only. Every flag can also be set by an environment
// variable named THZDRIVE_ and the flag in upper case with underscores, for
// example THZDRIVE_GRPC_LISTEN=0.0.0.0:50051. A flag on the command line
// wins.
//
// SIGTERM or SIGINT drains the server: health turns NOT_SERVING, in-flight
// calls finish (for at most --drain-timeout), over gRPC and HTTP alike, and
// it exits 0.
//
// Laser safety: thzdrive plans experiments with class 4 lasers; it does not
// make them safe. The local laser safety officer, the facility's rules and
// IEC 60825-1 / ANSI Z136.1 govern.
package main

import (
	"context"
	"crypto/tls"
	"errors"
	"flag"
	"fmt"
	"log/slog"
	"net"
	"net/http"
	"os"
	"os/signal"
	"strings"
	"syscall"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"

	"thzdrive/server"
)

func main() {
	if err := run(os.Args[1:]); err != nil {
		fmt.Fprintln(os.Stderr, "thzdrived:", err)
		os.Exit(2)
	}
}

func run(args []string) error {
	fs := flag.NewFlagSet("thzdrived", flag.ContinueOnError)
	lim := server.DefaultLimits()
	grpcListen := fs.String("grpc-listen", "127.0.0.1:50051", "gRPC listen address HOST:PORT (port 0 picks a free one)")
	httpListen := fs.String("http-listen", "127.0.0.1:8080", "HTTP listen address HOST:PORT for JSON over HTTP (POST /v1/...), /openapi.json, /metrics and /healthz; empty: no HTTP")
	logFormat := fs.String("log-format", "text", "log format: text or json")
	drain := fs.Duration("drain-timeout", 20*time.Second, "longest wait for in-flight calls on shutdown")
	tlsCert := fs.String("tls-cert", "", "TLS certificate file (PEM); with --tls-key turns TLS on")
	tlsKey := fs.String("tls-key", "", "TLS private key file (PEM)")
	tlsClientCA := fs.String("tls-client-ca", "", "CA file (PEM) that client certificates must chain to: mutual TLS")
	healthListen := fs.String("health-listen", "", "extra plaintext listener serving only the gRPC health service (for probes that cannot speak TLS); empty: none")
	tokenFile := fs.String("token-file", "", "file of bearer tokens, one per line; every call but health must carry one (SIGHUP reloads it)")
	fs.IntVar(&lim.MaxSamples, "max-samples", lim.MaxSamples, "most samples in one trace (after resampling and padding)")
	fs.IntVar(&lim.MaxLayers, "max-layers", lim.MaxLayers, "most layers in one sample stack and optical train")
	fs.IntVar(&lim.MaxSweepPoints, "max-sweep-points", lim.MaxSweepPoints, "most grid points in one sweep")
	fs.IntVar(&lim.MaxMessageBytes, "max-message-bytes", lim.MaxMessageBytes, "largest request message, bytes")
	streams := fs.Uint("max-concurrent-streams", uint(lim.MaxConcurrentStreams), "most concurrent calls on one connection")
	fs.IntVar(&lim.MaxConcurrentCalls, "max-concurrent-calls", lim.MaxConcurrentCalls, "most calls computed at once; more are refused with RESOURCE_EXHAUSTED")
	fs.DurationVar(&lim.MaxCallDuration, "max-call-duration", lim.MaxCallDuration, "deadline of a call that brings none, and the longest allowed")
	drainDelay := fs.Duration("drain-delay", 0, "on shutdown, report NOT_SERVING for this long before refusing new calls (lets load balancers notice)")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), "Usage: thzdrived [flags]\n\nServes the thzdrive PumpPlanner gRPC service. Every flag may also be set\nas THZDRIVE_<FLAG> in the environment (dashes as underscores).\n\nFlags:\n")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return err
	}
	if err := fromEnvironment(fs); err != nil {
		return err
	}
	lim.MaxConcurrentStreams = uint32(*streams)
	if lim.MaxSamples < 8 || lim.MaxLayers < 1 || lim.MaxSweepPoints < 1 || lim.MaxMessageBytes < 1024 || lim.MaxConcurrentStreams < 1 {
		return fmt.Errorf("limits must be positive (max-samples >= 8, max-message-bytes >= 1024)")
	}

	var handler slog.Handler
	switch *logFormat {
	case "text":
		handler = slog.NewTextHandler(os.Stderr, nil)
	case "json":
		handler = slog.NewJSONHandler(os.Stderr, nil)
	default:
		return fmt.Errorf("--log-format must be text or json, not %q", *logFormat)
	}
	log := slog.New(handler)

	cfg := server.Config{Limits: lim, Logger: log}
	secure := false
	var httpTLS *tls.Config // the HTTP port uses the same certificate
	if *tlsCert != "" || *tlsKey != "" || *tlsClientCA != "" {
		tc, err := server.TLSConfig(*tlsCert, *tlsKey, *tlsClientCA)
		if err != nil {
			return err
		}
		httpTLS = tc
		cfg.ServerOptions = append(cfg.ServerOptions, grpc.Creds(credentials.NewTLS(tc)))
		secure = true
	}
	if *tokenFile != "" {
		tokens, err := server.LoadTokens(*tokenFile)
		if err != nil {
			return err
		}
		cfg.Tokens = tokens
		log.Info("bearer tokens loaded", "count", tokens.Len())
	}

	lis, err := net.Listen("tcp", *grpcListen)
	if err != nil {
		return err
	}
	if host, _, _ := net.SplitHostPort(lis.Addr().String()); !isLoopback(host) && (!secure || cfg.Tokens == nil) {
		log.Warn("LISTENING BEYOND LOOPBACK WITHOUT BOTH TLS AND TOKENS: anyone who can reach this address can use the service, and traffic may be read", "grpc", lis.Addr().String(), "tls", secure, "tokens", cfg.Tokens != nil)
	}
	srv := server.New(cfg)
	log.Info("thzdrived serving", "grpc", lis.Addr().String(), "max_samples", lim.MaxSamples, "max_layers", lim.MaxLayers, "max_sweep_points", lim.MaxSweepPoints)

	if *healthListen != "" {
		hl, err := net.Listen("tcp", *healthListen)
		if err != nil {
			return err
		}
		hs := grpc.NewServer()
		healthpb.RegisterHealthServer(hs, srv.Health)
		go func() { _ = hs.Serve(hl) }()
		defer hs.Stop()
		log.Info("health-only listener", "addr", hl.Addr().String())
	}

	errc := make(chan error, 2)
	var hs *http.Server
	if *httpListen != "" {
		ctx, cancel := context.WithCancel(context.Background())
		defer cancel()
		if hs, err = serveHTTP(ctx, srv, *httpListen, httpTLS, cfg.Tokens != nil, log, errc); err != nil {
			return err
		}
	}

	sig := make(chan os.Signal, 1)
	signal.Notify(sig, syscall.SIGTERM, syscall.SIGINT, syscall.SIGHUP)
	go func() { errc <- srv.GRPC.Serve(lis) }()
	for {
		select {
		case err := <-errc:
			return err
		case s := <-sig:
			if s == syscall.SIGHUP {
				if cfg.Tokens == nil {
					log.Info("SIGHUP: no token file to reload")
				} else if err := cfg.Tokens.Reload(); err != nil {
					log.Error("token reload failed; the previous tokens stay in force", "err", err)
				} else {
					log.Info("bearer tokens reloaded", "count", cfg.Tokens.Len())
				}
				continue
			}
			log.Info("draining", "signal", s.String(), "timeout", *drain)
			httpDone := drainHTTP(hs, *drainDelay, *drain)
			srv.Drain(*drainDelay, *drain)
			<-httpDone
			log.Info("stopped")
			return nil
		}
	}
}

// fromEnvironment sets each flag not given on the command line from
// THZDRIVE_<NAME>, if that variable is set.
func fromEnvironment(fs *flag.FlagSet) error {
	given := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { given[f.Name] = true })
	var err error
	fs.VisitAll(func(f *flag.Flag) {
		if given[f.Name] || err != nil {
			return
		}
		name := "THZDRIVE_" + strings.ToUpper(strings.ReplaceAll(f.Name, "-", "_"))
		if val, ok := os.LookupEnv(name); ok {
			if e := fs.Set(f.Name, val); e != nil {
				err = fmt.Errorf("%s=%q: %v", name, val, e)
			}
		}
	})
	return err
}

func isLoopback(host string) bool {
	if host == "localhost" {
		return true
	}
	ip := net.ParseIP(host)
	return ip != nil && ip.IsLoopback()
}

// serveHTTP starts the HTTP port: the JSON gateway, /openapi.json, /metrics
// and /healthz (server.HTTPHandler), over TLS when tc is not nil.
func serveHTTP(ctx context.Context, srv *server.Server, addr string, tc *tls.Config, tokens bool, log *slog.Logger, errc chan<- error) (*http.Server, error) {
	h, err := srv.HTTPHandler(ctx)
	if err != nil {
		return nil, err
	}
	lis, err := net.Listen("tcp", addr)
	if err != nil {
		return nil, err
	}
	if host, _, _ := net.SplitHostPort(lis.Addr().String()); !isLoopback(host) && (tc == nil || !tokens) {
		log.Warn("HTTP LISTENING BEYOND LOOPBACK WITHOUT BOTH TLS AND TOKENS: anyone who can reach this address can use the service, and traffic may be read", "http", lis.Addr().String(), "tls", tc != nil, "tokens", tokens)
	}
	hs := &http.Server{
		Handler:           h,
		TLSConfig:         tc,
		ReadHeaderTimeout: 10 * time.Second,
		IdleTimeout:       2 * time.Minute,
		ErrorLog:          slog.NewLogLogger(log.Handler(), slog.LevelWarn),
		// No write timeout: a sweep streams for as long as it computes
		// (bounded by --max-call-duration).
	}
	go func() {
		var err error
		if tc != nil {
			err = hs.ServeTLS(lis, "", "")
		} else {
			err = hs.Serve(lis)
		}
		if !errors.Is(err, http.ErrServerClosed) {
			errc <- err
		}
	}()
	log.Info("thzdrived serving HTTP", "http", lis.Addr().String(), "tls", tc != nil, "routes", "POST /v1/... (see /openapi.json), GET /openapi.json /metrics /healthz")
	return hs, nil
}

// drainHTTP keeps the HTTP port open for delay (as gRPC keeps serving while
// health reports NOT_SERVING), then stops taking connections and waits at
// most timeout for requests in flight. The returned channel closes when done.
func drainHTTP(hs *http.Server, delay, timeout time.Duration) <-chan struct{} {
	done := make(chan struct{})
	if hs == nil {
		close(done)
		return done
	}
	go func() {
		defer close(done)
		time.Sleep(delay)
		ctx, cancel := context.WithTimeout(context.Background(), timeout)
		defer cancel()
		if hs.Shutdown(ctx) != nil {
			hs.Close()
		}
	}()
	return done
}
