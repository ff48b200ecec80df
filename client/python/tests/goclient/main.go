// Command goclient is a test helper of the Python client's tests
// (client/python/tests/test_client.py): it sends one request with the Go
// client and prints the response, so the tests can require the Python and
// Go clients to get the same numbers from the same server.
//
//	goclient -server 127.0.0.1:50051 -method PlanExperiment < request.binpb
//
// The request is read from stdin in the protobuf binary encoding (exactly
// the bytes the Python side serialized); the response is written to stdout
// in the proto JSON mapping with proto field names, which spells every
// double so that it parses back to the same float64.
package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"
	"time"

	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/client"
)

func main() {
	if err := run(); err != nil {
		fmt.Fprintln(os.Stderr, "goclient:", err)
		os.Exit(1)
	}
}

func run() error {
	server := flag.String("server", "127.0.0.1:50051", "thzdrived gRPC address")
	method := flag.String("method", "", "AnalyzePulse or PlanExperiment")
	flag.Parse()
	in, err := io.ReadAll(os.Stdin)
	if err != nil {
		return err
	}
	c, err := client.Dial([]string{*server})
	if err != nil {
		return err
	}
	defer c.Close()
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()

	var resp proto.Message
	switch *method {
	case "AnalyzePulse":
		req := &thzdrivev1.AnalyzePulseRequest{}
		if err := proto.Unmarshal(in, req); err != nil {
			return err
		}
		resp, err = c.AnalyzePulse(ctx, req)
	case "PlanExperiment":
		req := &thzdrivev1.PlanExperimentRequest{}
		if err := proto.Unmarshal(in, req); err != nil {
			return err
		}
		resp, err = c.PlanExperiment(ctx, req)
	default:
		return fmt.Errorf("-method %q: want AnalyzePulse or PlanExperiment", *method)
	}
	if err != nil {
		return err
	}
	out, err := protojson.MarshalOptions{UseProtoNames: true}.Marshal(resp)
	if err != nil {
		return err
	}
	_, err = os.Stdout.Write(append(out, '\n'))
	return err
}
