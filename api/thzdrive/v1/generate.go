// Package thzdrivev1 is the Go code generated from proto/thzdrive/v1: the
// messages and the PumpPlanner client and server interfaces. Everything but
// this file is generated; regenerate with `go generate ./api/...`.
package thzdrivev1

//go:generate ../../../tools/generate
