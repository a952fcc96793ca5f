package engine

import (
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"github.com/galley-econ/galley/analysis/series"
)

func sumsDoc(t *testing.T, dir string) *Document {
	t.Helper()
	src := "---\ntitle: t\ndata:\n  d:\n    path: data.csv\n---\n\nText.\n"
	d, err := ParseBytes(filepath.Join(dir, "paper.md"), []byte(src), Options{Cache: &Cache{Dir: filepath.Join(dir, ".galley-cache"), Version: "test"}})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// The column names and hashes a warm build reads come from the stored
// sums of the same file, without parsing it, and equal those computed
// from the parsed frame; a changed file is parsed again.
func TestColumnSumsStoredAndReused(t *testing.T) {
	dir := t.TempDir()
	csv := filepath.Join(dir, "data.csv")
	if err := os.WriteFile(csv, []byte("date,x,y\n2001Q1,1,2\n2001Q2,1.5,NA\n2001Q3,2,3\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	cold := sumsDoc(t, dir)
	a, err := cold.data.columnSums("d")
	if err != nil {
		t.Fatal(err)
	}
	if len(cold.data.frames) != 1 {
		t.Fatal("the first build did not parse the file")
	}
	warm := sumsDoc(t, dir)
	b, err := warm.data.columnSums("d")
	if err != nil {
		t.Fatal(err)
	}
	if len(warm.data.frames) != 0 {
		t.Error("a build with stored sums parsed the file")
	}
	if !reflect.DeepEqual(a, b) || !reflect.DeepEqual(b.Names, []string{"x", "y"}) || len(b.Hashes) != 3 {
		t.Errorf("stored sums %+v, computed %+v", b, a)
	}
	if warm.Inputs()[0].SHA256 == "" {
		t.Error("the results file lost the input's hash")
	}
	// the same hashes as from the frame itself
	f, err := warm.data.frame("d")
	if err != nil {
		t.Fatal(err)
	}
	x, _ := f.Column("x")
	if b.Hashes["x"] != hashValues(x) || b.Hashes[""] != hashDates(f) {
		t.Error("stored hashes differ from the frame's")
	}
	if err := os.WriteFile(csv, []byte("date,x,y\n2001Q1,1,2\n2001Q2,1.5,NA\n2001Q3,2,4\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	changed := sumsDoc(t, dir)
	c, err := changed.data.columnSums("d")
	if err != nil {
		t.Fatal(err)
	}
	if len(changed.data.frames) != 1 || c.Hashes["y"] == a.Hashes["y"] || c.Hashes["x"] != a.Hashes["x"] || c.Hashes[""] != a.Hashes[""] {
		t.Errorf("after an edit of y: parsed %d, sums %+v (before %+v)", len(changed.data.frames), c, a)
	}
}

// BenchmarkHashColumns: the hashes a build records for the cache — the
// date axis and every column — of a file of 100,000 rows × 3 columns.
func BenchmarkHashColumns(b *testing.B) {
	var s strings.Builder
	s.WriteString("date,x,y,z\n")
	d := series.DailyDate(time.Date(1800, 1, 1, 0, 0, 0, 0, time.UTC))
	for i := 0; i < 100_000; i++ {
		fmt.Fprintf(&s, "%s,%d.25,%d,%g\n", d.Add(i), i, -i, float64(i)/7)
	}
	f, err := series.ReadCSVBytes([]byte(s.String()), "h.csv")
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		hashDates(f)
		for _, n := range f.Names {
			v, _ := f.Column(n)
			hashValues(v)
		}
	}
}
