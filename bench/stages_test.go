package bench

import (
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/version"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/write/html"
)

// Stage benchmarks: each step of a build on its own, so that a slowdown
// shows up in one place. The lag search's factorisation is benchmarked
// in analysis/householder (BenchmarkNestedTall, BenchmarkNestedFactor),
// the hashes of the data in engine (BenchmarkHashColumns), reading a
// workbook in dataio (BenchmarkReadXLSX), the pack's decoding within
// BenchmarkStageCacheLoad.
//
//	go test -run '^$' -bench Stage -benchtime 20x ./bench/

// project writes one of the whole-process projects (WriteProjects) into
// a temporary folder and returns the project's folder.
func project(b *testing.B, name string) string {
	d, err := WriteProject(b.TempDir(), name)
	if err != nil {
		b.Fatal(err)
	}
	return d
}

func readCSVBench(b *testing.B, proj string) {
	raw, err := os.ReadFile(filepath.Join(project(b, proj), "data.csv"))
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(len(raw)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := series.ReadCSVBytes(raw, "data.csv"); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageParseCSV: reading the ADF workload's file (one column,
// T = 100,000, 17 digits) into a Frame.
func BenchmarkStageParseCSV(b *testing.B) { readCSVBench(b, "adf_T100k") }

// BenchmarkStageParseCSVWide: the Johansen file, six columns × 100,000.
func BenchmarkStageParseCSVWide(b *testing.B) { readCSVBench(b, "joh_T100k") }

// BenchmarkStageRegression: the final Dickey–Fuller regression of the
// ADF workload (Δy on 1, y_{t−1} and 12 lagged differences, T ≈ 100,000)
// through ols.Regress.
func BenchmarkStageRegression(b *testing.B) {
	y := data.ADF
	p := ADFMaxLag
	n := len(y) - 1 - p
	x := mat.NewDense(n, p+2, nil)
	dy := make([]float64, n)
	for i := 0; i < n; i++ {
		t := p + 1 + i
		dy[i] = y[t] - y[t-1]
		x.Set(i, 0, 1)
		x.Set(i, 1, y[t-1])
		for l := 1; l <= p; l++ {
			x.Set(i, 1+l, y[t-l]-y[t-l-1])
		}
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := ols.Regress(dy, x); err != nil {
			b.Fatal(err)
		}
	}
}

func procBuild(b *testing.B, proj string, fresh bool) {
	p := filepath.Join(project(b, proj), "paper.md")
	if _, _, err := BuildFresh(p, true, true); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, _, err := BuildFresh(p, true, fresh); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageADFFresh: the whole ADF project (T = 100,000) built in
// process with --fresh: read and parse the file, hash it for the cache,
// select the lag, regress, store, render, write.
func BenchmarkStageADFFresh(b *testing.B) { procBuild(b, "adf_T100k", true) }

// BenchmarkStageADFWarm: the same project rebuilt from the cache.
func BenchmarkStageADFWarm(b *testing.B) { procBuild(b, "adf_T100k", false) }

// BenchmarkStageResultsFile: writing the demo's results file from a
// built document.
func BenchmarkStageResultsFile(b *testing.B) {
	p := demoCopy(b)
	doc, _, err := Build(p, true)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := doc.ResultsJSON(version.Version); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageStartup: `galley --version` as a new process (the
// executable is built once, through the Go build cache).
func BenchmarkStageStartup(b *testing.B) {
	exe := filepath.Join(b.TempDir(), "galley")
	build := exec.Command("go", "build", "-o", exe, "../cmd/galley")
	build.Env = append(os.Environ(), "CGO_ENABLED=0") // as installed (README): static
	if out, err := build.CombinedOutput(); err != nil {
		b.Fatalf("%v: %s", err, out)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if out, err := exec.Command(exe, "--version").CombinedOutput(); err != nil {
			b.Fatalf("%v: %s", err, out)
		}
	}
}

// BenchmarkStageCacheLoad: parsing the demo and running every directive
// from the result cache (the pack read and decoded, the data's stored
// sums checked), without rendering or writing.
func BenchmarkStageCacheLoad(b *testing.B) {
	p := demoCopy(b)
	if _, _, err := Build(p, true); err != nil {
		b.Fatal(err)
	}
	cd := filepath.Join(filepath.Dir(p), ".galley-cache")
	opts := engine.Options{Cache: &engine.Cache{Dir: cd, Version: version.BuildID(cd)}}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		doc, err := engine.Parse(p, opts)
		if err != nil {
			b.Fatal(err)
		}
		if err := doc.Run(); err != nil {
			b.Fatal(err)
		}
		if len(doc.Ran()) != 0 {
			b.Fatalf("ran %v", doc.Ran())
		}
	}
}

// BenchmarkStageADF1M: the ADF test of the T = 1,000,000 workload in
// process (lag search over 0..12 and the final regression). B/op is the
// memory the test allocates: the lag search reads y and Δy in place
// (householder.NestedTallScaled), so it no longer stores the 15-column
// comparison design (120 MB).
func BenchmarkStageADF1M(b *testing.B) {
	y := ADFSeries(1_000_000)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := unitroot.ADF(y, critical.Const, unitroot.LagRule{Select: unitroot.AIC, Max: ADFMaxLag}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageJohansenVECM: the rank tests and the VECM of rank 2 on
// the six Johansen series at T = 100,000: the reduced-rank regression
// and the short-run equations (one factorisation for all six,
// ols.RegressEach).
func BenchmarkStageJohansenVECM(b *testing.B) {
	cols := JohSeries(100_000)
	y := mat.NewDense(len(cols[0]), len(cols), nil)
	for j, c := range cols {
		y.SetCol(j, c)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		r, err := johansen.Test(y, johansen.C, JohLags)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := r.Estimate(2, []int{0, 1}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageResultsFileResiduals: writing the results file of the
// Johansen project at T = 10,000 (60,000 residuals and the relations),
// the results writer on number-heavy values.
func BenchmarkStageResultsFileResiduals(b *testing.B) {
	p := filepath.Join(project(b, "joh_T10k"), "paper.md")
	doc, _, err := BuildFresh(p, false, true)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := doc.ResultsJSON(version.Version); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageHTML: rendering the demo's HTML page from a built
// document (Markdown, tables, MathML, references).
func BenchmarkStageHTML(b *testing.B) {
	p := demoCopy(b)
	doc, _, err := Build(p, true)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := html.Write(doc, html.Options{Version: version.Version}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStageBibliography: the BibTeX reader on galley's reference
// table, 37 works (a manuscript's own bibliography is read so at every
// build; the reference table itself is compiled in since the fourth
// round, methodrefs_table.go).
func BenchmarkStageBibliography(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := manuscript.ParseBib("methods", []byte(manuscript.MethodBib)); err != nil {
			b.Fatal(err)
		}
	}
}
