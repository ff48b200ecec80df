// Package client is the Go client of the thzdrive service. It wraps the
// generated PumpPlanner stub with the dial options a lab needs: one or
// several server addresses balanced round-robin by gRPC itself, and gRPC's own
// retry policy for the service's methods, which are all idempotent.
//
//	c, err := client.Dial("127.0.0.1:50051")
//	if err != nil { ... }
//	defer c.Close()
//	resp, err := c.AnalyzePulse(ctx, &thzdrivev1.AnalyzePulseRequest{...})
//
// Nothing here computes physics: every answer comes from the server.
package client

import (
	"context"
	"crypto/tls"
	"crypto/x509"
	"fmt"
	"os"
	"strings"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials"
	"google.golang.org/grpc/credentials/insecure"
	"google.golang.org/grpc/resolver"
	"google.golang.org/grpc/resolver/manual"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// ServiceConfig is the gRPC service config the client dials with:
// round-robin over every resolved address, and retries of UNAVAILABLE calls
// (a replica going away) with exponential backoff. Every PumpPlanner method
// is stateless and idempotent, so a retry cannot do anything twice.
const ServiceConfig = `{
  "loadBalancingConfig": [{"round_robin": {}}],
  "methodConfig": [{
    "name": [{"service": "thzdrive.v1.PumpPlanner"}],
    "retryPolicy": {
      "maxAttempts": 5,
      "initialBackoff": "0.05s",
      "maxBackoff": "1s",
      "backoffMultiplier": 2,
      "retryableStatusCodes": ["UNAVAILABLE"]
    }
  }]
}`

// Client is a connection to one or more thzdrive servers.
type Client struct {
	thzdrivev1.PumpPlannerClient
	conn *grpc.ClientConn
}

// Dial connects to the servers at addrs (host:port each; a single
// "dns:///name:port" target is also accepted and resolved by gRPC's DNS
// resolver). Extra grpc.DialOptions are appended (WithTLS, WithToken, ...);
// without transport credentials among them the connection is plaintext.
func Dial(addrs []string, extra ...grpc.DialOption) (*Client, error) {
	if len(addrs) == 0 {
		return nil, fmt.Errorf("client: no server address")
	}
	opts := []grpc.DialOption{
		grpc.WithDefaultServiceConfig(ServiceConfig),
		grpc.WithTransportCredentials(insecure.NewCredentials()),
		grpc.WithDefaultCallOptions(grpc.MaxCallRecvMsgSize(256 << 20)),
	}
	opts = append(opts, extra...)
	target := addrs[0]
	if len(addrs) > 1 || !strings.Contains(target, ":///") {
		r := manual.NewBuilderWithScheme("thzdrive")
		state := resolver.State{}
		for _, a := range addrs {
			state.Addresses = append(state.Addresses, resolver.Address{Addr: a})
		}
		r.InitialState(state)
		opts = append(opts, grpc.WithResolvers(r))
		target = r.Scheme() + ":///servers"
	}
	conn, err := grpc.NewClient(target, opts...)
	if err != nil {
		return nil, fmt.Errorf("client: %w", err)
	}
	return New(conn), nil
}

// New wraps an existing connection.
func New(conn *grpc.ClientConn) *Client {
	return &Client{PumpPlannerClient: thzdrivev1.NewPumpPlannerClient(conn), conn: conn}
}

// Conn is the underlying connection (for the health client, say).
func (c *Client) Conn() *grpc.ClientConn { return c.conn }

// Close closes the connection.
func (c *Client) Close() error { return c.conn.Close() }

// bearer sends a bearer token with every call.
type bearer struct {
	token      string
	requireTLS bool
}

func (b bearer) GetRequestMetadata(context.Context, ...string) (map[string]string, error) {
	return map[string]string{"authorization": "Bearer " + b.token}, nil
}

func (b bearer) RequireTransportSecurity() bool { return b.requireTLS }

// WithToken sends token as "authorization: Bearer <token>" with every call.
// A token sent without TLS can be read on the wire: use it in the clear
// only on loopback or a network you trust.
func WithToken(token string) grpc.DialOption {
	return grpc.WithPerRPCCredentials(bearer{token: token})
}

// WithTLS dials with TLS, trusting the CAs in caFile (PEM; empty: the
// system's roots), and presenting the client certificate certFile/keyFile
// when both are given (mutual TLS).
func WithTLS(caFile, certFile, keyFile string) (grpc.DialOption, error) {
	cfg := &tls.Config{MinVersion: tls.VersionTLS12}
	if caFile != "" {
		pem, err := os.ReadFile(caFile)
		if err != nil {
			return nil, fmt.Errorf("client: CA file: %w", err)
		}
		pool := x509.NewCertPool()
		if !pool.AppendCertsFromPEM(pem) {
			return nil, fmt.Errorf("client: %s holds no PEM certificate", caFile)
		}
		cfg.RootCAs = pool
	}
	if certFile != "" || keyFile != "" {
		cert, err := tls.LoadX509KeyPair(certFile, keyFile)
		if err != nil {
			return nil, fmt.Errorf("client: certificate: %w", err)
		}
		cfg.Certificates = []tls.Certificate{cert}
	}
	return grpc.WithTransportCredentials(credentials.NewTLS(cfg)), nil
}
