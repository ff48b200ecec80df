package server

import (
	"bufio"
	"bytes"
	"context"
	"crypto/sha256"
	"crypto/subtle"
	"fmt"
	"os"
	"strings"
	"sync"

	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/metadata"
	"google.golang.org/grpc/status"
)

// Tokens is the set of bearer tokens the server accepts, read from a file
// of one token per line (blank lines and lines starting with '#' ignored).
// Reload re-reads the file, so a token is revoked by deleting its line and
// sending thzdrived SIGHUP. Tokens are kept only as SHA-256 digests and
// compared in constant time, digest against digest, so neither a token's
// content nor its length leaks through timing.
type Tokens struct {
	path    string
	mu      sync.RWMutex
	digests [][sha256.Size]byte
}

// LoadTokens reads the token file at path. A file with no token is an
// error: it would lock everyone out, which is never what was meant.
func LoadTokens(path string) (*Tokens, error) {
	t := &Tokens{path: path}
	if err := t.Reload(); err != nil {
		return nil, err
	}
	return t, nil
}

// Reload re-reads the token file. On error the previous set stays in force.
func (t *Tokens) Reload() error {
	data, err := os.ReadFile(t.path)
	if err != nil {
		return fmt.Errorf("token file: %w", err)
	}
	var digests [][sha256.Size]byte
	sc := bufio.NewScanner(bytes.NewReader(data))
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		digests = append(digests, sha256.Sum256([]byte(line)))
	}
	if len(digests) == 0 {
		return fmt.Errorf("token file %s holds no token", t.path)
	}
	t.mu.Lock()
	t.digests = digests
	t.mu.Unlock()
	return nil
}

// Len is the number of tokens in force.
func (t *Tokens) Len() int {
	t.mu.RLock()
	defer t.mu.RUnlock()
	return len(t.digests)
}

// Valid reports whether token is one of the set. Every stored digest is
// compared, whatever the outcome, so the time taken does not depend on
// which token matched.
func (t *Tokens) Valid(token string) bool {
	d := sha256.Sum256([]byte(token))
	t.mu.RLock()
	defer t.mu.RUnlock()
	match := 0
	for i := range t.digests {
		match |= subtle.ConstantTimeCompare(d[:], t.digests[i][:])
	}
	return match == 1
}

// healthPrefix marks the methods exempt from authentication: orchestrators'
// probes carry no token.
const healthPrefix = "/grpc.health.v1.Health/"

// authorize checks the bearer token of a call. It runs before any request
// is decoded into work, so a refused call computes nothing.
func (t *Tokens) authorize(ctx context.Context, method string) error {
	if t == nil || strings.HasPrefix(method, healthPrefix) {
		return nil
	}
	md, _ := metadata.FromIncomingContext(ctx)
	for _, v := range md.Get("authorization") {
		if tok, ok := strings.CutPrefix(v, "Bearer "); ok && t.Valid(tok) {
			return nil
		}
	}
	return status.Error(codes.Unauthenticated, "a valid bearer token is required (metadata \"authorization: Bearer <token>\")")
}

func (t *Tokens) unary() grpc.UnaryServerInterceptor {
	return func(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (any, error) {
		if err := t.authorize(ctx, info.FullMethod); err != nil {
			return nil, err
		}
		return handler(ctx, req)
	}
}

func (t *Tokens) stream() grpc.StreamServerInterceptor {
	return func(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) error {
		if err := t.authorize(ss.Context(), info.FullMethod); err != nil {
			return err
		}
		return handler(srv, ss)
	}
}
