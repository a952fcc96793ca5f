package bench

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strconv"
)

// Whole-process workloads: small projects (a manuscript with one
// directive and its data) that bench/cmd/procbench builds with the galley
// command, beside bench/procs.py running the same test in statsmodels
// as a script, so that both figures include starting the process and
// reading the file.

// ADFSeries is the random walk of the ADF workload at length t (seed 1,
// as Generate; its first ADFT values are Data.ADF).
func ADFSeries(t int) []float64 { return walk(gauss(1), t) }

// EGSeries are y, x1, x2 of the Engle–Granger workload at length t (seed
// 2, as Generate).
func EGSeries(t int) [][]float64 {
	r := gauss(2)
	x1, x2 := walk(r, t), walk(r, t)
	u := ar1(r, t, 0.5)
	y := make([]float64, t)
	for i := range y {
		y[i] = 1 + 0.5*x1[i] - 0.3*x2[i] + u[i]
	}
	return [][]float64{y, x1, x2}
}

// JohSeries are the six series of the Johansen workload at length t
// (seed 3, as Generate).
func JohSeries(t int) [][]float64 {
	r := gauss(3)
	w1, w2, w3 := walk(r, t), walk(r, t), walk(r, t)
	u4, u5, u6 := ar1(r, t, 0.5), ar1(r, t, 0.5), ar1(r, t, 0.5)
	y4, y5, y6 := make([]float64, t), make([]float64, t), make([]float64, t)
	for i := range y4 {
		y4[i], y5[i], y6[i] = w1[i]+w2[i]+u4[i], w2[i]-w3[i]+u5[i], w1[i]+w3[i]+u6[i]
	}
	return [][]float64{w1, w2, w3, y4, y5, y6}
}

// writeColumns writes cols under the header names as undated CSV with 17
// significant digits.
func writeColumns(path string, names []string, cols [][]float64) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f, 1<<20)
	var buf []byte
	for j, n := range names {
		if j > 0 {
			w.WriteByte(',')
		}
		w.WriteString(n)
	}
	w.WriteByte('\n')
	for i := range cols[0] {
		for j, c := range cols {
			if j > 0 {
				w.WriteByte(',')
			}
			buf = strconv.AppendFloat(buf[:0], c[i], 'g', 17, 64)
			w.Write(buf)
		}
		w.WriteByte('\n')
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// Project is one whole-process workload: a folder holding paper.md and
// data.csv, and the statsmodels script's arguments for the same test
// (Python is empty when the workload is timed for galley alone).
type Project struct {
	Name   string
	Dir    string
	Python []string // arguments of bench/procs.py after its path
}

const procFront = "---\ntitle: %s\ndata:\n  d:\n    path: data.csv\n---\n\n%s\n\n```galley %s\n%s```\n"

// WriteProjects writes the whole-process projects into dir: ADF (AIC
// over 0..12) at T = 100,000 and 1,000,000; Engle–Granger (y on x1, x2,
// AIC over 0..12) at the same lengths; Johansen (six series, case c, two
// lagged differences) at T = 10,000, 100,000 and 1,000,000.
func WriteProjects(dir string) ([]Project, error) {
	return writeProjects(dir, true)
}

// WriteProject writes only the project called name (as WriteProjects
// names them) into dir and returns its folder.
func WriteProject(dir, name string) (string, error) {
	_, err := writeProjects(dir, true, name)
	return filepath.Join(dir, name), err
}

// Projects lists the projects WriteProjects wrote into dir.
func Projects(dir string) []Project {
	p, _ := writeProjects(dir, false)
	return p
}

func writeProjects(dir string, write bool, only ...string) ([]Project, error) {
	type spec struct {
		name, kind, body string
		names            []string
		cols             func() [][]float64
		python           []string
	}
	adf := func(t int) func() [][]float64 { return func() [][]float64 { return [][]float64{ADFSeries(t)} } }
	eg := func(t int) func() [][]float64 { return func() [][]float64 { return EGSeries(t) } }
	joh := func(t int) func() [][]float64 { return func() [][]float64 { return JohSeries(t) } }
	adfBody := "id: t\nseries: y\ndet: c\nlags: {select: aic, max: 12}\n"
	egBody := "id: t\ny: y\nx: [x1, x2]\ndet: c\nlags: {select: aic, max: 12}\n"
	johBody := "id: t\nseries: [y1, y2, y3, y4, y5, y6]\ndet: constant\nlags: 2\n"
	jn := []string{"y1", "y2", "y3", "y4", "y5", "y6"}
	specs := []spec{
		{"adf_T100k", "adf", adfBody, []string{"y"}, adf(100_000), []string{"adf"}},
		{"adf_T1M", "adf", adfBody, []string{"y"}, adf(1_000_000), []string{"adf"}},
		{"eg_T100k", "engle-granger", egBody, []string{"y", "x1", "x2"}, eg(100_000), nil},
		{"eg_T1M", "engle-granger", egBody, []string{"y", "x1", "x2"}, eg(1_000_000), nil},
		{"joh_T10k", "johansen", johBody, jn, joh(10_000), []string{"johansen"}},
		{"joh_T100k", "johansen", johBody, jn, joh(100_000), nil},
		{"joh_T1M", "johansen", johBody, jn, joh(1_000_000), nil},
	}
	var out []Project
	for _, s := range specs {
		d := filepath.Join(dir, s.name)
		p := Project{Name: s.name, Dir: d}
		if s.python != nil {
			p.Python = append(append([]string(nil), s.python...), filepath.Join(d, "data.csv"))
		}
		out = append(out, p)
		if !write || len(only) > 0 && !slices.Contains(only, s.name) {
			continue
		}
		if err := os.MkdirAll(d, 0o755); err != nil {
			return nil, err
		}
		if err := writeColumns(filepath.Join(d, "data.csv"), s.names, s.cols()); err != nil {
			return nil, err
		}
		doc := fmt.Sprintf(procFront, s.name, "One test on generated data.", s.kind, s.body)
		if err := os.WriteFile(filepath.Join(d, "paper.md"), []byte(doc), 0o644); err != nil {
			return nil, err
		}
	}
	return out, nil
}
