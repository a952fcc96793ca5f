// Command galley turns a Markdown manuscript whose fenced directives run
// unit-root and cointegration analyses into a finished paper in HTML,
// LaTeX or Markdown, plus a results file for comparing builds.
//
// Exit codes: 0 success, 1 an input or analysis error, 2 a usage error,
// 3 (compare) conclusions flipped between two builds.
package main

import (
	"errors"
	"fmt"
	"os"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"runtime/pprof"
	"strings"

	"github.com/alecthomas/kong"

	"github.com/galley-econ/galley/dataio"
	"github.com/galley-econ/galley/internal/version"
)

type cli struct {
	Build   buildCmd         `cmd:"" help:"Run every directive and write the paper and its results file."`
	Check   checkCmd         `cmd:"" help:"Validate directives, data aliases, columns and inline values without running analyses."`
	Inspect inspectCmd       `cmd:"" help:"Describe a data file: columns, frequency, date range, missing values."`
	Compare compareCmd       `cmd:"" help:"Compare two builds' results: moved numbers, changed samples, flipped conclusions (exit 3 if any flipped)."`
	Watch   watchCmd         `cmd:"" help:"Rebuild on every save of the manuscript or its data and serve a live preview on 127.0.0.1."`
	Version kong.VersionFlag `help:"Print the version and exit."`
}

// exitError carries an exit code through kong's Run.
type exitError struct {
	code int
	err  error
}

func (e *exitError) Error() string { return e.err.Error() }

func main() {
	tuneGC()
	// GALLEY_CPUPROFILE=FILE writes a CPU profile of the whole command
	// (bench/README.md: where a build's time goes).
	if p := os.Getenv("GALLEY_CPUPROFILE"); p != "" {
		if f, err := os.Create(p); err == nil && pprof.StartCPUProfile(f) == nil {
			code := run(os.Args[1:])
			pprof.StopCPUProfile()
			f.Close()
			os.Exit(code)
		}
	}
	os.Exit(run(os.Args[1:]))
}

func run(args []string) int {
	var c cli
	parser, err := kong.New(&c,
		kong.Name("galley"),
		kong.Description("Build reproducible time-series econometrics papers from Markdown manuscripts."),
		kong.Vars{"version": "galley " + version.Version},
		kong.UsageOnError(),
		kong.Exit(func(code int) { panic(exitCode(code)) }),
	)
	if err != nil {
		fmt.Fprintln(os.Stderr, "galley:", err)
		return 2
	}
	code := 0
	func() {
		defer func() {
			if p := recover(); p != nil {
				if ec, ok := p.(exitCode); ok {
					code = int(ec)
					return
				}
				panic(p)
			}
		}()
		ctx, err := parser.Parse(args)
		if err != nil {
			fmt.Fprintln(os.Stderr, "galley:", err)
			code = 2
			return
		}
		if err := c.checkInputs(ctx.Command()); err != nil {
			code = report(err)
			return
		}
		if err := ctx.Run(); err != nil {
			code = report(err)
		}
	}()
	return code
}

type exitCode int

// Garbage collection for a short-lived process: a build allocates a
// few tens of megabytes and exits, so collecting at every doubling of a
// small heap is wasted work (a cold build of the demo ran 16 cycles).
// Unless GOGC is set, the collector lets the heap grow to five times
// what survived the last cycle (GOGC = 400) while that is small, and
// returns to the default (100) once more than gcSmallHeap survives one,
// so that a large data set still peaks at about twice its live size.
const (
	gcPercentSmall = 400
	gcSmallHeap    = 32 << 20
)

func tuneGC() {
	if os.Getenv("GOGC") != "" {
		return
	}
	debug.SetGCPercent(gcPercentSmall)
	sample := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	// A finaliser runs after each cycle that finds its object
	// unreachable; re-arming it gives a hook after every cycle.
	var arm func()
	arm = func() {
		s := new([16]byte)
		runtime.SetFinalizer(s, func(*[16]byte) {
			metrics.Read(sample)
			if sample[0].Value.Kind() == metrics.KindUint64 && sample[0].Value.Uint64() > gcSmallHeap {
				debug.SetGCPercent(100)
				return
			}
			arm()
		})
	}
	arm()
}

// checkInputs refuses, before a command opens them, the files named on
// the command line that are not regular files of bounded size: a named
// pipe would block the read forever and a device such as /dev/zero
// would be read without end. Data files are checked where they are
// opened (dataio.OpenRegular), so the same rule holds for the files a
// manuscript names.
func (c *cli) checkInputs(command string) error {
	var files []string
	switch strings.Fields(command + " ")[0] {
	case "build":
		files = []string{c.Build.Manuscript, c.Build.Against}
	case "check":
		files = []string{c.Check.Manuscript}
	case "watch":
		files = []string{c.Watch.Manuscript}
	case "compare":
		files = []string{c.Compare.Old, c.Compare.New}
	}
	for _, f := range files {
		if f == "" {
			continue
		}
		if err := dataio.CheckRegular(f, dataio.MaxTextBytes); err != nil {
			return err
		}
	}
	return nil
}

// report prints an error (one line per joined error) and returns the
// exit code.
func report(err error) int {
	code := 1
	var ee *exitError
	if errors.As(err, &ee) {
		code = ee.code
		err = ee.err
	}
	if err == nil {
		return code
	}
	for _, line := range splitErrors(err) {
		fmt.Fprintln(os.Stderr, "galley: "+line)
	}
	return code
}

func splitErrors(err error) []string {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		var out []string
		for _, e := range j.Unwrap() {
			out = append(out, splitErrors(e)...)
		}
		return out
	}
	return strings.Split(err.Error(), "\n")
}
