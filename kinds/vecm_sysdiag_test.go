package kinds

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
)

// The vecm directive's diagnostics: rows through whole manuscripts, against
// testdata/fixtures/sysdiag_reference.json (script:
// testdata/scripts/sysdiag_reference.py): statsmodels 0.13.5's VECM of the
// Danish data (rank 1, one lagged difference, deterministic "co" and "ci",
// galley's cases constant and restricted constant), its
// VECMResults.test_normality (the joint Jarque–Bera statistic), and the
// numpy implementations of the published formulas in that script for the
// Jarque–Bera parts, the LM and Edgerton–Shukur tests (orders 1–4), the
// ARCH-LM test (order 1) and Doornik–Hansen, each computed on statsmodels'
// own VECM residuals. So this checks galley's estimation and the tests end
// to end, to 1e-6 relative.
type vecmDiagFixture struct {
	VECM []struct {
		Case   string
		JB     map[string]float64
		Serial []map[string]float64
		ARCH   []map[string]float64
		DH     struct {
			Stat, P float64
			Z1, Z2  []float64
		}
	}
}

func TestVECMDiagnosticsAgainstReference(t *testing.T) {
	t.Parallel()
	var fx vecmDiagFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/sysdiag_reference.json")), &fx); err != nil {
		t.Fatal(err)
	}
	if len(fx.VECM) != 2 {
		t.Fatalf("fixture has %d VECMs", len(fx.VECM))
	}
	doc := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n"
	for i, v := range fx.VECM {
		doc += "\n" + fence("johansen", fmt.Sprintf("id: sys%d\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: %s\nlags: 1\nrank: 1\n", i, v.Case))
		for h := 1; h <= 4; h++ {
			show := "relations"
			if h%2 == 0 {
				show = "short-run"
			}
			doc += "\n" + fence("vecm", fmt.Sprintf("id: v%d_%d\nfrom: sys%d\nshow: %s\ndiagnostics: [bg(%d), jb, dh, arch(1)]\n", i, h, i, show, h))
		}
	}
	all := sysBuild(t, doc, map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")})
	n := 0
	check := func(what string, got, want float64) {
		t.Helper()
		n++
		if math.Abs(got-want) > 1e-6*math.Abs(want) {
			t.Errorf("%s = %.12g, reference %.12g", what, got, want)
		}
	}
	for i, v := range fx.VECM {
		for h := 1; h <= 4; h++ {
			id := fmt.Sprintf("v%d_%d", i, h)
			d := all[id]
			what := func(s string) string { return v.Case + " " + id + " " + s }
			r := v.Serial[h-1]
			if int(r["h"]) != h {
				t.Fatal("fixture order")
			}
			check(what("bg stat"), sysAt(t, d, "diagnostics", "bg", "stat"), r["lm"])
			check(what("bg p"), sysAt(t, d, "diagnostics", "bg", "pvalue"), r["lm_p"])
			check(what("bg df"), sysAt(t, d, "diagnostics", "bg", "df"), r["lm_df"])
			check(what("bg_f stat"), sysAt(t, d, "diagnostics", "bg_f", "stat"), r["f"])
			check(what("bg_f p"), sysAt(t, d, "diagnostics", "bg_f", "pvalue"), r["f_p"])
			check(what("bg_f df2"), sysAt(t, d, "diagnostics", "bg_f", "df2"), r["f_df2"])
			check(what("jb (statsmodels test_normality)"), sysAt(t, d, "diagnostics", "jb", "stat"), v.JB["joint_statsmodels"])
			check(what("jb p"), sysAt(t, d, "diagnostics", "jb", "pvalue"), v.JB["joint_p"])
			check(what("jb_skew"), sysAt(t, d, "diagnostics", "jb_skew", "stat"), v.JB["skew"])
			check(what("jb_kurt"), sysAt(t, d, "diagnostics", "jb_kurt", "stat"), v.JB["kurt"])
			check(what("dh"), sysAt(t, d, "diagnostics", "dh", "stat"), v.DH.Stat)
			check(what("dh p"), sysAt(t, d, "diagnostics", "dh", "pvalue"), v.DH.P)
			check(what("dh z1 0"), sysAt(t, d, "diagnostics", "dh", "z1", 0), v.DH.Z1[0])
			check(what("dh z2 3"), sysAt(t, d, "diagnostics", "dh", "z2", 3), v.DH.Z2[3])
			check(what("arch"), sysAt(t, d, "diagnostics", "arch", "stat"), v.ARCH[0]["stat"])
			check(what("arch p"), sysAt(t, d, "diagnostics", "arch", "pvalue"), v.ARCH[0]["p"])
			if o := sysAt(t, d, "diagnostics", "arch", "order"); o != 1 {
				t.Errorf("%s: arch order %v", id, o)
			}
		}
	}
	if n != 2*4*16 {
		t.Errorf("checked %d values", n)
	}
}

// TestVECMDiagnosticsTableAndErrors: the rows sit in the lower block of
// either table, the default orders are 4, and bad lists are errors at the
// key's line before anything runs.
func TestVECMDiagnosticsTableAndErrors(t *testing.T) {
	t.Parallel()
	files := map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")}
	front := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n\n"
	sys := "data: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: constant\nlags: 1\nrank: 1\n"
	res := runDoc(t, writeProject(t, front+fence("vecm", "id: v\n"+sys+"show: short-run\ndiagnostics: [bg, arch(1), jb]\n")+
		"\n"+fence("vecm", "id: w\n"+sys), files))
	v := res["v"]
	if v.Values["diagnostics"].(map[string]any)["bg"].(map[string]any)["order"] != 4 {
		t.Errorf("default bg order: %v", v.Values["diagnostics"])
	}
	var labels []string
	for _, r := range v.Table.Body {
		if len(r.Cells) != 5 {
			t.Errorf("row %q has %d cells, the table 5 columns", r.Cells[0].Text, len(r.Cells))
		}
		labels = append(labels, r.Cells[0].Text+" "+r.Cells[1].Suffix)
	}
	joined := strings.Join(labels, "|")
	for _, want := range []string{"System Breusch–Godfrey LM(4)  [64]", "Edgerton–Shukur F(4)  [64, 111.9]", "System ARCH-LM(1)  [100]", "System Jarque–Bera, joint  [8]"} {
		if !strings.Contains(joined, want) {
			t.Errorf("no row %q in %s", want, joined)
		}
	}
	if !strings.Contains(strings.Join(v.Table.Notes, " "), "Edgerton and Shukur 1999") {
		t.Errorf("notes: %q", v.Table.Notes)
	}
	if _, ok := res["w"].Values["diagnostics"]; ok {
		t.Error("diagnostics without the key")
	}
	// With seasonal, impulse and restricted step dummies the regressors
	// include them (analysis/sysdiag checks them against johansen's own
	// residuals in every case); here the directive passes them through.
	dum := runDoc(t, writeProject(t, front+fence("vecm", "id: d\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n"+
		"seasonal: true\nimpulse: 1976Q1\nshift: 1983Q1\ndiagnostics: [bg(1), arch(1)]\n"), files))["d"]
	for _, name := range []string{"bg", "bg_f", "arch"} {
		e := dum.Values["diagnostics"].(map[string]any)[name].(map[string]any)
		if st, p := e["stat"].(float64), e["pvalue"].(float64); !(st > 0) || !(p > 0 && p < 1) {
			t.Errorf("with dummies, %s: stat %v, p %v", name, st, p)
		}
	}
	for _, c := range []struct{ list, want string }{
		{"[bg, lb(4)]", "single-equation test"},
		{"[bgg]", "did you mean"},
		{"[jb(2)]", "takes no order"},
		{"[bg(0)]", "whole number of 1 or more"},
		{"[dh, dh]", "listed twice"},
		{"[arch(4)]", "too few observations"},
	} {
		err := runErr(t, front+fence("vecm", "id: v\n"+sys+"diagnostics: "+c.list+"\n"), files)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), ":14:") {
			t.Errorf("diagnostics: %s: %v (want %q at line 14)", c.list, err, c.want)
		}
	}
}
