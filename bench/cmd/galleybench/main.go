// Command galleybench times galley's benchmark workloads (package bench)
// and prints one line per workload: its name, the best and the median
// wall-clock time in seconds over -runs runs. bench/compare.sh runs it
// beside bench/statsmodels_bench.py on the same data (written with -data)
// and prints the ratios.
//
//	go run ./bench/cmd/galleybench -data /tmp/gb -runs 10 [-demo examples/gridlink] [-galley ./galley]
//
// With -galley, the `galley build` command itself is also timed on a copy
// of the demo, cold (no .galley-cache) and warm (after one build), so the
// figures include starting the process.
package main

import (
	"flag"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"runtime/pprof"
	"slices"
	"time"

	"github.com/galley-econ/galley/bench"
)

func main() {
	dataDir := flag.String("data", "", "write the benchmark data as CSV into this folder (for statsmodels_bench.py)")
	runs := flag.Int("runs", 10, "runs of each workload; the best and the median are printed")
	demo := flag.String("demo", "examples/gridlink", "the demo project")
	galley := flag.String("galley", "", "a galley executable to time `galley build` with (optional)")
	firstBuild := flag.String("first-build-profile", "", "only build a copy of the demo once, cold, in this fresh process, and write its CPU profile here (what `galley build` pays on a first run)")
	flag.Parse()
	if *firstBuild != "" {
		if err := profileFirstBuild(*demo, *firstBuild); err != nil {
			fmt.Fprintln(os.Stderr, "galleybench:", err)
			os.Exit(1)
		}
		return
	}
	if err := run(*dataDir, *runs, *demo, *galley); err != nil {
		fmt.Fprintln(os.Stderr, "galleybench:", err)
		os.Exit(1)
	}
}

// profileFirstBuild builds a copy of the demo once with an empty cache
// under the CPU profiler.
func profileFirstBuild(demo, out string) error {
	tmp, p, err := demoCopy(demo)
	if err != nil {
		return err
	}
	defer os.RemoveAll(tmp)
	f, err := os.Create(out)
	if err != nil {
		return err
	}
	defer f.Close()
	if err := pprof.StartCPUProfile(f); err != nil {
		return err
	}
	t0 := time.Now()
	_, ph, err := bench.Build(p, true)
	pprof.StopCPUProfile()
	fmt.Printf("first build %v: parse %v, run %v, render %v, write %v\n", time.Since(t0), ph.Parse, ph.Run, ph.Render, ph.Write)
	return err
}

// demoCopy copies the demo into a new temporary folder and returns the
// folder (for the caller to remove) and the copied manuscript.
func demoCopy(demo string) (tmp, manuscript string, err error) {
	if tmp, err = os.MkdirTemp("", "galleybench-"); err != nil {
		return "", "", err
	}
	if manuscript, err = bench.CopyDemo(demo, tmp); err != nil {
		os.RemoveAll(tmp)
		return "", "", err
	}
	return tmp, manuscript, nil
}

// timeIt runs f n times and returns the best and the median time.
func timeIt(n int, f func() error) (best, median time.Duration, err error) {
	ts := make([]time.Duration, 0, n)
	for i := 0; i < n; i++ {
		t0 := time.Now()
		if err := f(); err != nil {
			return 0, 0, err
		}
		ts = append(ts, time.Since(t0))
	}
	slices.Sort(ts)
	return ts[0], ts[len(ts)/2], nil
}

func report(name string, n int, f func() error) error {
	best, med, err := timeIt(n, f)
	if err != nil {
		return fmt.Errorf("%s: %w", name, err)
	}
	fmt.Printf("%s\t%.6f\t%.6f\n", name, best.Seconds(), med.Seconds())
	return nil
}

func run(dataDir string, runs int, demo, galley string) error {
	d := bench.Generate()
	if dataDir != "" {
		if err := os.MkdirAll(dataDir, 0o755); err != nil {
			return err
		}
		if err := d.WriteCSV(dataDir); err != nil {
			return err
		}
	}
	y := d.JohMatrix()
	// The statistics once, to compare with statsmodels_bench.py's.
	if a, err := bench.ADF(d); err == nil {
		fmt.Fprintf(os.Stderr, "galley adf: stat %.6f p %.4f lags %d nobs %d\n", a.Stat, a.PValue, a.Lags, a.NObs)
	}
	if e, err := bench.EngleGranger(d); err == nil {
		fmt.Fprintf(os.Stderr, "galley engle-granger: stat %.6f p %.4g lags %d\n", e.Stat, e.PValue, e.Lags)
	}
	if j, err := bench.Johansen(y); err == nil {
		tr, _ := j.Statistics(false)
		fmt.Fprintf(os.Stderr, "galley johansen: trace %.3f\n", tr)
	}
	for _, w := range []struct {
		name string
		f    func() error
	}{
		{"adf_aic12_T100000", func() error { _, err := bench.ADF(d); return err }},
		{"engle_granger_N3_T1000", func() error { _, err := bench.EngleGranger(d); return err }},
		{"johansen_K6_T10000", func() error { _, err := bench.Johansen(y); return err }},
		{"ecm_T1000", func() error { _, err := bench.ECM(d); return err }},
	} {
		if err := report(w.name, runs, w.f); err != nil {
			return err
		}
	}
	tmp, p, err := demoCopy(demo)
	if err != nil {
		return err
	}
	defer os.RemoveAll(tmp)
	cache := filepath.Join(tmp, ".galley-cache")
	var last bench.Phases
	if err := report("demo_cold", runs, func() error {
		os.RemoveAll(cache)
		_, ph, err := bench.Build(p, true)
		last = ph
		return err
	}); err != nil {
		return err
	}
	fmt.Fprintf(os.Stderr, "demo_cold phases (last run): parse %v, run %v, render %v, write %v\n", last.Parse, last.Run, last.Render, last.Write)
	if err := report("demo_nocache", runs, func() error { _, _, err := bench.Build(p, false); return err }); err != nil {
		return err
	}
	if _, _, err := bench.Build(p, true); err != nil {
		return err
	}
	if err := report("demo_warm", runs, func() error {
		doc, ph, err := bench.Build(p, true)
		last = ph
		if err == nil {
			if ran := doc.Ran(); len(ran) != 0 {
				err = fmt.Errorf("directives %v ran on a warm build", ran)
			}
		}
		return err
	}); err != nil {
		return err
	}
	fmt.Fprintf(os.Stderr, "demo_warm phases (last run): parse %v, run %v, render %v, write %v\n", last.Parse, last.Run, last.Render, last.Write)
	if galley == "" {
		return nil
	}
	build := func() error {
		cmd := exec.Command(galley, "build", p)
		cmd.Stderr = nil
		out, err := cmd.CombinedOutput()
		if err != nil {
			return fmt.Errorf("%v: %s", err, out)
		}
		return nil
	}
	if err := report("cli_build_cold", runs, func() error { os.RemoveAll(cache); return build() }); err != nil {
		return err
	}
	if err := build(); err != nil {
		return err
	}
	return report("cli_build_warm", runs, build)
}
