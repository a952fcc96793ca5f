package kinds

import (
	"fmt"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/engine"
)

// TestJohansenRankBootstrap: rank_bootstrap: puts the wild bootstrap
// p-values of analysis/johansen.WildBootstrapRank (checked there against
// numpy) in the table and the values, with the sequential bootstrap rank;
// its keys are checked.
func TestJohansenRankBootstrap(t *testing.T) {
	t.Parallel()
	doc := sysDKFront + "\n" + fence("johansen", "id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank_bootstrap: {replications: 99, seed: 5}\n") +
		"\nThe bootstrap p-value for rank 0 is {{dk.rank_bootstrap.pvalue.0 %.3f}}.\n"
	all := sysBuild(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
	vals := all["dk"]
	y := sysDenmark(t)
	res, err := johansen.Test(y, johansen.RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	b, err := res.WildBootstrapRank(y, johansen.Extra{}, johansen.RankBootSpec{Reps: 99, Seed: 5})
	if err != nil {
		t.Fatal(err)
	}
	for r := 0; r < 4; r++ {
		if got := sysAt(t, vals, "rank_bootstrap", "pvalue", r); got != b.PValue[r] {
			t.Errorf("pvalue %d = %g, analysis %g", r, got, b.PValue[r])
		}
		if got := sysAt(t, vals, "rank_bootstrap", "max_root", r); !sysNear(got, b.MaxRoot[r], 1e-12) {
			t.Errorf("max_root %d = %g, analysis %g", r, got, b.MaxRoot[r])
		}
	}
	if got := sysAt(t, vals, "rank_bootstrap", "rank"); got != float64(b.Rank(0.05)) {
		t.Errorf("bootstrap rank %g, analysis %d", got, b.Rank(0.05))
	}
	if got := sysAt(t, vals, "rank_bootstrap", "seed"); got != 5 {
		t.Errorf("seed %g", got)
	}

	d, err := engine.Parse(writeProject(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}), engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	var tab string
	for _, r := range d.Results() {
		if r.Table != nil {
			tab = fmt.Sprint(r.Table.Head, r.Table.Notes)
		}
	}
	if !strings.Contains(tab, "Bootstrap p") || !strings.Contains(tab, "Rademacher") {
		t.Errorf("table lacks the bootstrap column or note: %s", tab)
	}

	for _, bad := range []struct{ keys, want string }{
		{"rank_bootstrap: {replications: 10}\n", "99–100,000"},
		{"rank_bootstrap: {repz: 100}\n", "repz"},
	} {
		doc := sysDKFront + "\n" + fence("johansen", "id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\n"+bad.keys)
		err := runErr(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%q: error %v, want %q", bad.keys, err, bad.want)
		}
	}
}

// runErr parses, checks and runs a manuscript and returns the first error.
func runErr(t *testing.T, doc string, files map[string]string) error {
	t.Helper()
	d, err := engine.Parse(writeProject(t, doc, files), engine.Options{})
	if err != nil {
		return err
	}
	return d.Run()
}

// TestJohansenRoots: roots are the companion roots of the VECM's VAR form
// (analysis/johansen.CompanionRoots, checked against numpy there), the
// first K − r of them one.
func TestJohansenRoots(t *testing.T) {
	t.Parallel()
	doc := sysDKFront + "\n" + fence("johansen", "id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n")
	vals := sysBuild(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})["dk"]
	res, err := johansen.Test(sysDenmark(t), johansen.RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	v, err := res.Estimate(1, []int{0})
	if err != nil {
		t.Fatal(err)
	}
	roots, err := johansen.CompanionRoots(v.VARForm())
	if err != nil {
		t.Fatal(err)
	}
	if len(roots) != 8 || sysAt(t, vals, "unit_roots") != 3 {
		t.Fatalf("%d roots, unit_roots %v", len(roots), vals["unit_roots"])
	}
	for i, z := range roots {
		if got := sysAt(t, vals, "roots", i, "re"); got != real(z) {
			t.Errorf("root %d re %g, analysis %g", i, got, real(z))
		}
		m := sysAt(t, vals, "roots", i, "modulus")
		if i < 3 && !sysNear(m, 1, 1e-9) {
			t.Errorf("root %d has modulus %.12g, want a unit root", i, m)
		}
		if i >= 3 && m >= 1 {
			t.Errorf("root %d has modulus %g beyond the unit roots", i, m)
		}
	}
}
