// Command procbench times galley as a command — whole processes, as a
// user runs it — beside statsmodels scripts doing the same tests, with
// the runs of each group interleaved (one run of every command in turn,
// -runs times) so that the ratios compare runs taken under the same load
// on a shared machine. bench/compare.sh runs it; README.md has the
// figures.
//
//	go run ./bench/cmd/procbench -galley ./galley -work /tmp/pb -runs 10 [-demo examples/gridlink] [-python /usr/bin/python3] [-py1m]
//	go run ./bench/cmd/procbench -galley ./galley -before ./galley-old -work /tmp/pb -runs 10 [-big]
//
// The second form times two builds of galley side by side instead
// (after/before for each workload).
//
// For each command it prints the minimum and the median wall time and
// the largest peak resident memory; then the ratios of the targets in
// issue 17, each as min/min and as the median of the paired ratios.
package main

import (
	"flag"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/galley-econ/galley/bench"
)

type command struct {
	name string
	argv []string
	dir  string
	prep func() error // before each run, not timed
	wall []time.Duration
	rss  int64 // largest peak RSS over the runs, bytes
}

func (c *command) run() error {
	if c.prep != nil {
		if err := c.prep(); err != nil {
			return fmt.Errorf("%s: %w", c.name, err)
		}
	}
	cmd := exec.Command(c.argv[0], c.argv[1:]...)
	cmd.Dir = c.dir
	var out strings.Builder
	cmd.Stdout, cmd.Stderr = &out, &out
	t0 := time.Now()
	err := cmd.Run()
	d := time.Since(t0)
	if err != nil {
		return fmt.Errorf("%s: %v: %s", c.name, err, out.String())
	}
	c.wall = append(c.wall, d)
	c.rss = max(c.rss, peakRSS(cmd.ProcessState))
	return nil
}

func sorted(ts []time.Duration) []time.Duration {
	s := slices.Clone(ts)
	slices.Sort(s)
	return s
}

func (c *command) min() time.Duration    { return sorted(c.wall)[0] }
func (c *command) median() time.Duration { s := sorted(c.wall); return s[len(s)/2] }

// ratio is a/b as min/min and as the median of the paired ratios.
func ratio(a, b *command) (float64, float64) {
	var r []float64
	for i := range a.wall {
		r = append(r, a.wall[i].Seconds()/b.wall[i].Seconds())
	}
	slices.Sort(r)
	return a.min().Seconds() / b.min().Seconds(), r[len(r)/2]
}

// interleave runs every command once in turn, runs times (after one
// untimed warm-up round that fills caches).
func interleave(runs int, cmds ...*command) error {
	for _, c := range cmds {
		if err := c.run(); err != nil {
			return err
		}
		c.wall, c.rss = nil, 0
	}
	for i := 0; i < runs; i++ {
		for _, c := range cmds {
			if err := c.run(); err != nil {
				return err
			}
		}
	}
	for _, c := range cmds {
		fmt.Printf("%-28s min %9.1f ms  median %9.1f ms  peak RSS %7.1f MB\n", c.name, ms(c.min()), ms(c.median()), float64(c.rss)/(1<<20))
	}
	return nil
}

func ms(d time.Duration) float64 { return float64(d.Microseconds()) / 1000 }

func main() {
	galley := flag.String("galley", "", "the galley executable (required)")
	work := flag.String("work", "", "a scratch folder for the projects (required)")
	runs := flag.Int("runs", 10, "runs of each command")
	demo := flag.String("demo", "examples/gridlink", "the demo project")
	python := flag.String("python", "/usr/bin/python3", "a Python with statsmodels and pandas")
	script := flag.String("script", "bench/procs.py", "the statsmodels script")
	py1m := flag.Bool("py1m", false, "also time the statsmodels script on ADF at T = 1,000,000 (slow)")
	only := flag.String("only", "", "run only the groups whose name contains this (adf, eg, joh, demo)")
	write := flag.String("write", "", "only write the projects into this folder")
	base := flag.String("before", "", "another galley executable: time it and -galley side by side (before/after) instead of the targets")
	big := flag.Bool("big", false, "with -before: also Johansen at T = 1,000,000 (slow)")
	flag.Parse()
	if *write != "" {
		if _, err := bench.WriteProjects(*write); err != nil {
			fmt.Fprintln(os.Stderr, "procbench:", err)
			os.Exit(1)
		}
		return
	}
	if *galley == "" || *work == "" {
		fmt.Fprintln(os.Stderr, "procbench: -galley and -work are required")
		os.Exit(2)
	}
	if *base != "" {
		if err := runPair(*base, *galley, *work, *runs, *demo, *big, *only); err != nil {
			fmt.Fprintln(os.Stderr, "procbench:", err)
			os.Exit(1)
		}
		return
	}
	if err := run(*galley, *work, *runs, *demo, *python, *script, *py1m, *only); err != nil {
		fmt.Fprintln(os.Stderr, "procbench:", err)
		os.Exit(1)
	}
}

type target struct {
	what     string
	min, med float64
	limit    float64
	unit     string
}

func run(galley, work string, runs int, demo, python, script string, py1m bool, only string) error {
	galley, _ = filepath.Abs(galley)
	script, _ = filepath.Abs(script)
	// A child's peak RSS starts from this process's own high-water
	// mark (the child is forked from it), so the data are generated in
	// another process: this one stays small.
	self, err := os.Executable()
	if err != nil {
		return err
	}
	if out, err := exec.Command(self, "-write", work).CombinedOutput(); err != nil {
		return fmt.Errorf("writing the projects: %v: %s", err, out)
	}
	projs := bench.Projects(work)
	p := map[string]bench.Project{}
	for _, x := range projs {
		p[x.Name] = x
	}
	build := func(name, proj string, flags ...string) *command {
		return &command{name: name, dir: p[proj].Dir, argv: append(append([]string{galley, "build"}, flags...), "paper.md")}
	}
	py := func(name, proj string) *command {
		return &command{name: name, dir: p[proj].Dir, argv: append([]string{python, script}, p[proj].Python...)}
	}
	var targets []target
	add := func(what string, a, b *command, limit float64) {
		lo, med := ratio(a, b)
		targets = append(targets, target{what: what, min: lo, med: med, limit: limit})
	}
	want := func(g string) bool { return only == "" || strings.Contains(g, only) }

	if want("adf") {
		fmt.Println("== adf")
		fresh := build("adf T=100k --fresh", "adf_T100k", "--fresh")
		warm := build("adf T=100k warm", "adf_T100k")
		sm := py("statsmodels adf T=100k", "adf_T100k")
		big := build("adf T=1M --fresh", "adf_T1M", "--fresh")
		cmds := []*command{fresh, warm, sm, big}
		var sm1m *command
		if py1m {
			sm1m = &command{name: "statsmodels adf T=1M", dir: p["adf_T1M"].Dir, argv: []string{python, script, "adf", "data.csv"}}
			cmds = append(cmds, sm1m)
		}
		if err := interleave(runs, cmds...); err != nil {
			return err
		}
		add("ADF T=100k --fresh / statsmodels (≤ 0.035)", fresh, sm, 0.035)
		add("ADF T=100k warm / statsmodels (≤ 0.015)", warm, sm, 0.015)
		add("ADF T=1M / T=100k, --fresh (≤ 11)", big, fresh, 11)
		if sm1m != nil {
			add("ADF T=1M --fresh / statsmodels T=1M", big, sm1m, 0)
		}
		// parsed data (values and the date axis as stored) plus the
		// design (T rows × 14 columns, lags 0..12, constant, level)
		data := 1e6 * 8.0
		design := 1e6 * 14 * 8.0
		targets = append(targets, target{what: fmt.Sprintf("ADF T=1M peak RSS / (data %.0f MB + design %.0f MB) (≤ 2)", data/(1<<20), design/(1<<20)),
			min: float64(big.rss) / (data + design), med: float64(big.rss) / (data + design), limit: 2})
	}
	if want("eg") {
		fmt.Println("== engle-granger")
		a := build("eg T=100k --fresh", "eg_T100k", "--fresh")
		b := build("eg T=1M --fresh", "eg_T1M", "--fresh")
		if err := interleave(runs, a, b); err != nil {
			return err
		}
		add("Engle–Granger T=1M / T=100k (≤ 11)", b, a, 11)
	}
	if want("joh") {
		fmt.Println("== johansen")
		a := build("johansen 6×10k --fresh", "joh_T10k", "--fresh")
		sm := py("statsmodels johansen 6×10k", "joh_T10k")
		b := build("johansen 6×100k --fresh", "joh_T100k", "--fresh")
		c := build("johansen 6×1M --fresh", "joh_T1M", "--fresh")
		if err := interleave(runs, a, sm, b, c); err != nil {
			return err
		}
		add("Johansen 6×10k / statsmodels (≤ 0.05)", a, sm, 0.05)
		add("Johansen T=1M / T=100k (≤ 11)", c, b, 11)
	}
	if want("demo") {
		fmt.Println("== demo")
		tmp := filepath.Join(work, "demo")
		os.RemoveAll(tmp)
		manu, err := bench.CopyDemo(demo, tmp)
		if err != nil {
			return err
		}
		orig, err := os.ReadFile(manu)
		if err != nil {
			return err
		}
		cache := filepath.Join(tmp, ".galley-cache")
		warm := &command{name: "demo warm, nothing changed", dir: tmp, argv: []string{galley, "build", "paper.md"}}
		edits := 0
		prose := &command{name: "demo after a prose edit", dir: tmp, argv: []string{galley, "build", "paper.md"}, prep: func() error {
			edits++
			// one word of the first paragraph changes on every run
			s := strings.Replace(string(orig), "The data are monthly", fmt.Sprintf("The data (edit %d) are monthly", edits), 1)
			return os.WriteFile(manu, []byte(s), 0o644)
		}}
		restore := func() error { return os.WriteFile(manu, orig, 0o644) }
		warm.prep = restore
		cold := &command{name: "demo cold", dir: tmp, argv: []string{galley, "build", "paper.md"}, prep: func() error {
			if err := restore(); err != nil {
				return err
			}
			os.RemoveAll(filepath.Join(tmp, "out"))
			return os.RemoveAll(cache)
		}}
		// warm must follow a build of the same text: run order cold,
		// warm (after cold: the cache is full), prose, then cold again
		// restores the text.
		ver := &command{name: "galley --version", dir: tmp, argv: []string{galley, "--version"}}
		if err := interleave(runs, cold, warm, prose, ver); err != nil {
			return err
		}
		targets = append(targets,
			target{what: "demo warm, nothing changed (≤ 15 ms)", min: ms(warm.min()), med: ms(warm.median()), limit: 15, unit: "ms"},
			target{what: "demo after a prose edit (≤ 20 ms)", min: ms(prose.min()), med: ms(prose.median()), limit: 20, unit: "ms"},
			target{what: "demo cold (≤ 150 ms)", min: ms(cold.min()), med: ms(cold.median()), limit: 150, unit: "ms"},
			target{what: "galley --version (≤ 3 ms)", min: ms(ver.min()), med: ms(ver.median()), limit: 3, unit: "ms"},
		)
	}
	fmt.Println()
	fmt.Printf("%-62s %10s %10s %8s %s\n", "target", "min", "median", "limit", "met (median)")
	for _, t := range targets {
		met := "-"
		if t.limit > 0 {
			met = "no"
			if t.med <= t.limit {
				met = "yes"
			} else if t.min <= t.limit {
				met = "min only"
			}
		}
		fmt.Printf("%-62s %10.4g %10.4g %8g %s %s\n", t.what, t.min, t.med, t.limit, t.unit, met)
	}
	return nil
}
