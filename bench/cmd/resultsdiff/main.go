// Command resultsdiff compares the numbers of two galley results files
// value by value (same JSON path): it counts the numbers that differ, and
// reports the largest relative difference |a − b|/max(|a|, |b|), and, for
// numbers inside an array of numbers (a series), the largest difference
// relative to the largest magnitude in that array. It exits with status 1
// when a number differs by more than -tol relative (by either measure: a
// number is within tolerance if it is within tol of its own size or, in an
// array, of the array's largest entry), or when the files differ in shape.
//
//	go run ./bench/cmd/resultsdiff [-tol 1e-12] BEFORE.json AFTER.json
package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"sort"
)

type stats struct {
	numbers, differ, over, shape int
	maxRel, maxArr               float64
	maxRelPath, maxArrPath       string
	tol                          float64
}

func load(path string) (any, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	var v any
	if err := json.Unmarshal(b, &v); err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return v, nil
}

func (s *stats) num(path string, a, b, arrMax float64) {
	s.numbers++
	if a == b || math.IsNaN(a) && math.IsNaN(b) {
		return
	}
	s.differ++
	d := math.Abs(a - b)
	rel := d / math.Max(math.Abs(a), math.Abs(b))
	if rel > s.maxRel {
		s.maxRel, s.maxRelPath = rel, fmt.Sprintf("%s (%.17g vs %.17g)", path, a, b)
	}
	ok := rel <= s.tol
	if arrMax > 0 {
		ra := d / arrMax
		if ra > s.maxArr {
			s.maxArr, s.maxArrPath = ra, fmt.Sprintf("%s (%.17g vs %.17g, array max %.3g)", path, a, b, arrMax)
		}
		ok = ok || ra <= s.tol
	}
	if !ok {
		s.over++
		if s.over <= 10 {
			fmt.Printf("over tolerance: %s: %.17g vs %.17g (relative %.3g)\n", path, a, b, rel)
		}
	}
}

func (s *stats) walk(path string, a, b any) {
	switch x := a.(type) {
	case map[string]any:
		y, ok := b.(map[string]any)
		if !ok || len(x) != len(y) {
			s.mismatch(path)
			return
		}
		keys := make([]string, 0, len(x))
		for k := range x {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			yv, ok := y[k]
			if !ok {
				s.mismatch(path + "." + k)
				continue
			}
			s.walk(path+"."+k, x[k], yv)
		}
	case []any:
		y, ok := b.([]any)
		if !ok || len(x) != len(y) {
			s.mismatch(path)
			return
		}
		arrMax := 0.0
		for _, e := range x {
			if f, ok := e.(float64); ok {
				arrMax = math.Max(arrMax, math.Abs(f))
			}
		}
		for i := range x {
			p := fmt.Sprintf("%s[%d]", path, i)
			if f, ok := x[i].(float64); ok {
				if g, ok := y[i].(float64); ok {
					s.num(p, f, g, arrMax)
					continue
				}
			}
			s.walk(p, x[i], y[i])
		}
	case float64:
		y, ok := b.(float64)
		if !ok {
			s.mismatch(path)
			return
		}
		s.num(path, x, y, 0)
	default:
		if fmt.Sprint(a) != fmt.Sprint(b) {
			s.mismatch(path)
		}
	}
}

func (s *stats) mismatch(path string) {
	s.shape++
	if s.shape <= 10 {
		fmt.Printf("differs in shape or text: %s\n", path)
	}
}

func main() {
	tol := flag.Float64("tol", 1e-12, "relative tolerance")
	flag.Parse()
	if flag.NArg() != 2 {
		fmt.Fprintln(os.Stderr, "usage: resultsdiff [-tol 1e-12] BEFORE.json AFTER.json")
		os.Exit(2)
	}
	a, err := load(flag.Arg(0))
	if err == nil {
		var b any
		if b, err = load(flag.Arg(1)); err == nil {
			s := &stats{tol: *tol}
			// the run's own metadata (version, times) is not a result
			if am, ok := a.(map[string]any); ok {
				if bm, ok := b.(map[string]any); ok {
					for _, k := range []string{"generated", "galley", "build"} {
						delete(am, k)
						delete(bm, k)
					}
				}
			}
			s.walk("", a, b)
			fmt.Printf("%d numbers, %d differ, %d over %.0e relative; largest relative difference %.3g at %s\n", s.numbers, s.differ, s.over, s.tol, s.maxRel, s.maxRelPath)
			if s.maxArr > 0 {
				fmt.Printf("largest difference relative to its series' largest entry: %.3g at %s\n", s.maxArr, s.maxArrPath)
			}
			if s.shape > 0 || s.over > 0 {
				os.Exit(1)
			}
			return
		}
	}
	fmt.Fprintln(os.Stderr, err)
	os.Exit(2)
}
