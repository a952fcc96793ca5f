package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"

	"github.com/galley-econ/galley/bench"
)

// runPair times two galley executables, before and after, on the same
// workloads with their runs interleaved (each has its own copy of every
// project, so that their caches do not meet), and prints after/before
// for each: min/min and the median of the paired ratios.
func runPair(before, after, work string, runs int, demo string, big bool, only string) error {
	before, _ = filepath.Abs(before)
	after, _ = filepath.Abs(after)
	self, err := os.Executable()
	if err != nil {
		return err
	}
	type side struct {
		exe, dir string
		cmds     []*command
	}
	sides := []*side{{exe: before, dir: filepath.Join(work, "before")}, {exe: after, dir: filepath.Join(work, "after")}}
	for _, s := range sides {
		if out, err := exec.Command(self, "-write", s.dir).CombinedOutput(); err != nil {
			return fmt.Errorf("writing the projects: %v: %s", err, out)
		}
		projs := map[string]string{}
		for _, p := range bench.Projects(s.dir) {
			projs[p.Name] = p.Dir
		}
		build := func(name, proj string, flags ...string) *command {
			return &command{name: name, dir: projs[proj], argv: append(append([]string{s.exe, "build"}, flags...), "paper.md")}
		}
		s.cmds = append(s.cmds,
			build("adf T=100k --fresh", "adf_T100k", "--fresh"),
			build("adf T=100k warm", "adf_T100k"),
			build("adf T=1M --fresh", "adf_T1M", "--fresh"),
			build("eg T=100k --fresh", "eg_T100k", "--fresh"),
			build("eg T=1M --fresh", "eg_T1M", "--fresh"),
			build("johansen 6×10k --fresh", "joh_T10k", "--fresh"),
			build("johansen 6×100k --fresh", "joh_T100k", "--fresh"),
		)
		if big {
			s.cmds = append(s.cmds, build("johansen 6×1M --fresh", "joh_T1M", "--fresh"))
		}
		tmp := filepath.Join(s.dir, "demo")
		os.RemoveAll(tmp)
		manu, err := bench.CopyDemo(demo, tmp)
		if err != nil {
			return err
		}
		orig, err := os.ReadFile(manu)
		if err != nil {
			return err
		}
		restore := func() error { return os.WriteFile(manu, orig, 0o644) }
		edits := 0
		s.cmds = append(s.cmds,
			&command{name: "demo cold", dir: tmp, argv: []string{s.exe, "build", "paper.md"}, prep: func() error {
				if err := restore(); err != nil {
					return err
				}
				os.RemoveAll(filepath.Join(tmp, "out"))
				return os.RemoveAll(filepath.Join(tmp, ".galley-cache"))
			}},
			&command{name: "demo warm, nothing changed", dir: tmp, argv: []string{s.exe, "build", "paper.md"}, prep: restore},
			&command{name: "demo after a prose edit", dir: tmp, argv: []string{s.exe, "build", "paper.md"}, prep: func() error {
				edits++
				return os.WriteFile(manu, []byte(strings.Replace(string(orig), "The data are monthly", fmt.Sprintf("The data (edit %d) are monthly", edits), 1)), 0o644)
			}},
			&command{name: "galley --version", dir: tmp, argv: []string{s.exe, "--version"}},
		)
	}
	if only != "" {
		for _, s := range sides {
			var keep []*command
			for _, c := range s.cmds {
				if strings.Contains(c.name, only) {
					keep = append(keep, c)
				}
			}
			s.cmds = keep
		}
	}
	// one untimed round, then runs rounds: each command before, then after
	n := len(sides[0].cmds)
	for round := 0; round <= runs; round++ {
		for i := 0; i < n; i++ {
			for _, s := range sides {
				if err := s.cmds[i].run(); err != nil {
					return err
				}
			}
		}
		if round == 0 {
			for _, s := range sides {
				for _, c := range s.cmds {
					c.wall, c.rss = nil, 0
				}
			}
		}
	}
	fmt.Printf("%-28s %21s %21s %17s %11s\n", "workload", "before min / median", "after min / median", "after/before", "peak RSS")
	for i := 0; i < n; i++ {
		b, a := sides[0].cmds[i], sides[1].cmds[i]
		lo, med := ratio(a, b)
		fmt.Printf("%-28s %9.1f / %7.1f ms %9.1f / %7.1f ms %7.3f / %6.3f %4.0f→%4.0f MB\n", a.name,
			ms(b.min()), ms(b.median()), ms(a.min()), ms(a.median()), lo, med, float64(b.rss)/(1<<20), float64(a.rss)/(1<<20))
	}
	return nil
}
