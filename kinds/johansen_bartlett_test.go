package kinds

import (
	"fmt"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/engine"
)

// TestJohansenBartlett: rank_bootstrap: {bartlett: true} puts the
// bootstrap Bartlett-corrected trace statistics of
// analysis/johansen.BartlettTrace (checked there against numpy, with the
// asymptotic means checked against Doornik 1998 and galley's simulation)
// in a column, a note and the values, from the same replications as the
// bootstrap p-values; the key's conflicts are errors.
func TestJohansenBartlett(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}
	doc := sysDKFront + "\n" + fence("johansen", "id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nsmall_sample: true\nrank_bootstrap: {replications: 99, seed: 5, bartlett: true}\n") +
		"\nCorrected, the statistic for rank 0 is {{dk.bartlett.trace.0 %.2f}}.\n"
	vals := sysBuild(t, doc, files)["dk"]
	y := sysDenmark(t)
	res, err := johansen.Test(y, johansen.RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	b, err := res.WildBootstrapRank(y, johansen.Extra{}, johansen.RankBootSpec{Reps: 99, Seed: 5})
	if err != nil {
		t.Fatal(err)
	}
	bt, err := johansen.BartlettTrace(res.Trace, b.Mean, johansen.RC)
	if err != nil {
		t.Fatal(err)
	}
	for r := 0; r < 4; r++ {
		if got := sysAt(t, vals, "bartlett", "trace", r); got != bt.Trace[r] {
			t.Errorf("trace %d = %g, analysis %g", r, got, bt.Trace[r])
		}
		if got := sysAt(t, vals, "bartlett", "boot_mean", r); got != b.Mean[r] {
			t.Errorf("boot_mean %d = %g, analysis %g", r, got, b.Mean[r])
		}
		m, _ := johansen.AsymptoticTraceMean(johansen.RC, 4-r)
		if got := sysAt(t, vals, "bartlett", "asymptotic_mean", r); got != m {
			t.Errorf("asymptotic_mean %d = %g, analysis %g", r, got, m)
		}
		// The bootstrap p-values are those of rank_bootstrap without bartlett.
		if got := sysAt(t, vals, "rank_bootstrap", "pvalue", r); got != b.PValue[r] {
			t.Errorf("pvalue %d = %g, analysis %g", r, got, b.PValue[r])
		}
	}
	cv, err := res.Critical(johansen.TraceStat)
	if err != nil {
		t.Fatal(err)
	}
	if got := sysAt(t, vals, "bartlett", "rank"); got != float64(bt.Rank(cv, 1)) {
		t.Errorf("Bartlett rank %g, analysis %d", got, bt.Rank(cv, 1))
	}

	d, err := engine.Parse(writeProject(t, doc, files), engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	var tab string
	for _, r := range d.Results() {
		if r.Table != nil {
			tab = fmt.Sprint(r.Table.Head, r.Table.Body, r.Table.Notes)
		}
	}
	for _, want := range []string{"Bartlett-corrected", "Doornik", "Rocke 1989", fmt.Sprintf("%.2f", bt.Trace[0])} {
		if !strings.Contains(tab, want) {
			t.Errorf("table lacks %q: %s", want, tab)
		}
	}

	for _, bad := range []struct{ keys, want string }{
		{"rank_bootstrap: {replications: 99, bartlett: true}\ncrit: simulate\n", "crit: simulate"},
		{"rank_bootstrap: {replications: 99, bartlett: true}\nshift: 1983Q1\n", "step dummies"},
		{"rank_bootstrap: {replications: 99, bartlet: true}\n", "bartlet"},
	} {
		doc := sysDKFront + "\n" + fence("johansen", "id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\n"+bad.keys)
		err := runErr(t, doc, files)
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%q: error %v, want %q", bad.keys, err, bad.want)
		}
	}
}
