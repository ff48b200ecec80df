// Command thzdrive is the command-line face of the thzdrive service: it
// analyses THz waveforms and calibrates them to absolute field, carries them
// through the beam path into the sample, drives a phonon mode, sizes the
// field a target amplitude needs, estimates the heating, and plans or sweeps
// a whole experiment described by a scenario file (a PlanExperimentRequest
// in YAML or JSON); and it takes measured traces apart: the sample's optical
// constants and dielectric model, and the field behind the detector. It
// prints a report for a person, JSON (--json) or CSV tables (--csv) for a
// program.
//
// With --server (or THZDRIVE_SERVER) it calls a running thzdrived; several
// comma-separated addresses are balanced round-robin with retries. Without
// one it runs the service in-process, so it works with no setup.
//
// Exit codes: 0 success; 1 the service refused the request or failed; 2 bad
// command line (unknown flag, wrong unit, unreadable file); 3 the server
// could not be reached.
//
// Laser safety: the pump lasers behind table-top THz sources are class 4 and
// THz and near-infrared beams are invisible. This tool plans; it does not make
// an experiment safe. The local laser safety officer, the facility's rules
// and IEC 60825-1 / ANSI Z136.1 govern.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"net"
	"os"
	"strings"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	"google.golang.org/grpc/status"
	"google.golang.org/grpc/test/bufconn"
	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/proto"

	"thzdrive/client"
	"thzdrive/server"
)

// Exit codes.
const (
	exitOK          = 0
	exitRefused     = 1
	exitUsage       = 2
	exitUnreachable = 3
)

// usageError marks a mistake on the command line (exit code 2).
type usageError struct{ error }

func usagef(format string, args ...any) error {
	return usageError{fmt.Errorf(format, args...)}
}

type command struct {
	name    string
	summary string
	run     func(a *app, args []string) error
}

var commands []command

func init() {
	commands = []command{
		{"analyze", "spectrum and metrics of a model pulse or a measured trace", runAnalyze},
		{"calibrate", "absolute field from pulse energy and spot, or from an electro-optic signal", runCalibrate},
		{"propagate", "the field inside the sample after windows, attenuators and its surface", runPropagate},
		{"drive", "how hard the field drives a phonon mode: amplitude, displacement, energy", runDrive},
		{"size", "the field and pulse energy a target mode amplitude needs", runSize},
		{"heat", "single-pulse and steady-state heating, margin to the transition", runHeat},
		{"materials", "the embedded material catalogue", runMaterials},
		{"plan", "the whole chain for a scenario file, stage by stage", runPlan},
		{"sweep", "a scenario's plan over a grid of one or two parameters, as CSV", runSweep},
		{"extract", "n, κ, ε and α of a slab (or a film's sheet conductance) from two measured traces", runExtract},
		{"fit", "a dielectric model (ε∞, Lorentz oscillators, Drude) fitted to a measured permittivity", runFit},
		{"correct", "the field behind an electro-optic detector, its response divided out", runCorrect},
		{"demo", "run the built-in invented scenario (needs no server)", runDemo},
	}
}

// app holds what every subcommand shares.
type app struct {
	stdout, stderr io.Writer
	servers        []string
	asJSON         bool
	timeout        time.Duration
	timeoutSet     bool // --timeout given: a sweep honours it too
	client         *client.Client
	closeFn        func()
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	a := &app{stdout: stdout, stderr: stderr}
	fs := flag.NewFlagSet("thzdrive", flag.ContinueOnError)
	fs.SetOutput(stderr)
	server := fs.String("server", os.Getenv("THZDRIVE_SERVER"), "thzdrived address(es), comma-separated HOST:PORT; empty runs the service in-process (env THZDRIVE_SERVER)")
	fs.BoolVar(&a.asJSON, "json", false, "print the response as JSON (proto JSON mapping) instead of a report")
	fs.DurationVar(&a.timeout, "timeout", 60*time.Second, "deadline of each call (a sweep has none unless this is given)")
	fs.Usage = func() { printUsage(stderr, fs) }
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return exitOK
		}
		return exitUsage
	}
	fs.Visit(func(f *flag.Flag) { a.timeoutSet = a.timeoutSet || f.Name == "timeout" })
	rest := fs.Args()
	if len(rest) == 0 {
		printUsage(stderr, fs)
		return exitUsage
	}
	if rest[0] == "help" {
		if len(rest) > 1 {
			rest = []string{rest[1], "-h"}
		} else {
			printUsage(stdout, fs)
			return exitOK
		}
	}
	var cmd *command
	for i := range commands {
		if commands[i].name == rest[0] {
			cmd = &commands[i]
		}
	}
	if cmd == nil {
		fmt.Fprintf(stderr, "thzdrive: unknown command %q (try 'thzdrive help')\n", rest[0])
		return exitUsage
	}
	if *server != "" {
		for _, s := range strings.Split(*server, ",") {
			if s = strings.TrimSpace(s); s != "" {
				a.servers = append(a.servers, s)
			}
		}
	}
	defer func() {
		if a.closeFn != nil {
			a.closeFn()
		}
	}()
	err := cmd.run(a, rest[1:])
	return exitCode(stderr, err)
}

func exitCode(stderr io.Writer, err error) int {
	if err == nil {
		return exitOK
	}
	if errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	var ue usageError
	if errors.As(err, &ue) {
		fmt.Fprintln(stderr, "thzdrive:", ue.error)
		return exitUsage
	}
	st, ok := status.FromError(err)
	if !ok {
		fmt.Fprintln(stderr, "thzdrive:", err)
		return exitRefused
	}
	if violations(st) > 0 {
		// The message repeats the violations; list them once, one a line.
		fmt.Fprintf(stderr, "thzdrive: the service refused the request (%s):\n", st.Code())
		printViolations(stderr, st)
	} else {
		fmt.Fprintf(stderr, "thzdrive: %s: %s\n", st.Code(), st.Message())
	}
	if st.Code() == codes.Unavailable || st.Code() == codes.DeadlineExceeded {
		return exitUnreachable
	}
	return exitRefused
}

func printUsage(w io.Writer, fs *flag.FlagSet) {
	fmt.Fprintf(w, `thzdrive plans terahertz pump experiments: the field a THz pulse puts into
a sample, how hard it drives a phonon mode, and how far it heats the spot.

Usage: thzdrive [global flags] <command> [flags]

Commands:
`)
	for _, c := range commands {
		fmt.Fprintf(w, "  %-10s %s\n", c.name, c.summary)
	}
	fmt.Fprintf(w, `  %-10s show a command's flags

Quantities may carry their unit: --peak-field "1.2 MV/cm", --peak-frequency
"80 cm-1", --energy "2 uJ"; a bare number is taken in the unit the flag's
help names. A whole experiment is a scenario file (YAML or JSON, the API's
PlanExperimentRequest): 'thzdrive demo --show-scenario' prints one to start
from, and 'thzdrive help plan' explains its parts.

Global flags:
`, "help CMD")
	fs.SetOutput(w)
	fs.PrintDefaults()
	fmt.Fprintf(w, "\n%s\n", safetyLine)
}

// connect returns the client, dialling the servers or starting the service
// in-process on first use.
func (a *app) connect() (*client.Client, error) {
	if a.client != nil {
		return a.client, nil
	}
	if len(a.servers) > 0 {
		c, err := client.Dial(a.servers)
		if err != nil {
			return nil, err
		}
		a.client, a.closeFn = c, func() { c.Close() }
		return c, nil
	}
	c, stop, err := inProcess()
	if err != nil {
		return nil, err
	}
	a.client, a.closeFn = c, stop
	return c, nil
}

// inProcess runs the same server thzdrived runs (server.New), over an
// in-memory connection.
func inProcess() (*client.Client, func(), error) {
	lis := bufconn.Listen(1 << 20)
	srv := server.New(server.Config{Logger: slog.New(slog.NewTextHandler(io.Discard, nil))})
	go func() { _ = srv.GRPC.Serve(lis) }()
	conn, err := grpc.NewClient("passthrough:///in-process",
		grpc.WithContextDialer(func(ctx context.Context, _ string) (net.Conn, error) { return lis.DialContext(ctx) }),
		grpc.WithTransportCredentials(insecure.NewCredentials()),
		grpc.WithDefaultCallOptions(grpc.MaxCallRecvMsgSize(256<<20)),
	)
	if err != nil {
		srv.GRPC.Stop()
		return nil, nil, err
	}
	return client.New(conn), func() { conn.Close(); srv.GRPC.Stop() }, nil
}

func (a *app) context() (context.Context, context.CancelFunc) {
	return context.WithTimeout(context.Background(), a.timeout)
}

// printJSON writes a message in the proto JSON mapping.
func (a *app) printJSON(m proto.Message) error {
	b, err := protojson.MarshalOptions{Multiline: true, Indent: "  ", UseProtoNames: false}.Marshal(m)
	if err != nil {
		return err
	}
	_, err = fmt.Fprintln(a.stdout, string(b))
	return err
}
