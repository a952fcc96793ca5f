package kinds

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// The dynamics family through whole manuscripts, against statsmodels
// 0.13.5 and the numpy implementations in
// testdata/fixtures/vardyn_statsmodels.json (script:
// testdata/scripts/vardyn_statsmodels.py), to 1e-6 relative.
type dynFixture struct {
	VAR struct {
		OrthIrfs  [][][]float64 `json:"orth_irfs"`
		Fevd      [][][]float64
		Causality []struct {
			Caused, Causing int
			Wald            float64
			WaldP           float64 `json:"wald_p"`
			FP              float64 `json:"f_p"`
		}
	} `json:"var"`
	TY struct {
		Tests []struct {
			Caused, Causing int
			Wald, P         float64
		}
	} `json:"ty"`
	VECM []struct {
		Deterministic string
		OrthIrfs      [][][]float64 `json:"orth_irfs"`
		Girf          [][][]float64
	} `json:"vecm"`
	VECMCausality []struct {
		Deterministic string
		Tests         []struct {
			Caused, Causing int
			Kind            string
			Wald, P         float64
		}
	} `json:"vecm_causality"`
}

func TestDynamicsAgainstStatsmodels(t *testing.T) {
	t.Parallel()
	var fx dynFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/vardyn_statsmodels.json")), &fx); err != nil {
		t.Fatal(err)
	}
	front := "---\ntitle: T\ndata:\n  dk: dk.csv\n  us: us.csv\n---\n"
	doc := front +
		"\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("responses", "id: irf\nfrom: sys\nhorizon: 10\nreplications: 100\nseed: 3\n") +
		"\n" + fence("responses", "id: gi\nfrom: sys\nhorizon: 10\nidentify: generalised\nresponses: [LRM]\nshocks: [IBO, IDE]\n") +
		"\n" + fence("causality", "id: vc\nfrom: sys\n") +
		"\n" + fence("causality", "id: gc\ndata: us\nseries: [100*dlog(realgdp), 100*dlog(realcons), 100*dlog(realinv)]\nlags: 2\n") +
		"\n" + fence("causality", "id: ty\ndata: us\nseries: [log(realgdp), log(realcons), log(realinv)]\nlags: 2\ntest: toda-yamamoto\n") +
		"\n" + fence("variance-shares", "id: fe\ndata: us\nseries: [100*dlog(realgdp), 100*dlog(realcons), 100*dlog(realinv)]\nlags: 2\nhorizons: [1, 2, 5, 10]\n") +
		"\n" + fence("responses", "id: virf\ndata: us\nseries: [100*dlog(realgdp), 100*dlog(realcons), 100*dlog(realinv)]\nlags: 2\nhorizon: 10\n")
	all := sysBuild(t, doc, map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv"), "us.csv": sysRead(t, "../testdata/data/macrodata.csv")})
	dk := []string{"LRM", "LRY", "IBO", "IDE"}
	us := []string{"100*dlog(realgdp)", "100*dlog(realcons)", "100*dlog(realinv)"}
	usl := []string{"log(realgdp)", "log(realcons)", "log(realinv)"}
	n := 0
	check := func(what string, got, want float64) {
		t.Helper()
		n++
		if !sysNear(got, want, 1e-6) {
			t.Errorf("%s = %.12g, reference %.12g", what, got, want)
		}
	}
	ci := fx.VECM[0]
	if ci.Deterministic != "ci" {
		t.Fatal("fixture order")
	}
	for h := range ci.OrthIrfs {
		for i := range dk {
			for j := range dk {
				check("VECM orth irf", sysAt(t, all["irf"], "irf", dk[i], dk[j], h), ci.OrthIrfs[h][i][j])
			}
		}
		check("VECM girf LRM←IBO", sysAt(t, all["gi"], "irf", "LRM", "IBO", h), ci.Girf[h][0][2])
		for i := range us {
			for j := range us {
				check("VAR orth irf", sysAt(t, all["virf"], "irf", us[i], us[j], h), fx.VAR.OrthIrfs[h][i][j])
			}
		}
	}
	// Bands bracket nothing in particular, but exist for every horizon.
	if lo := sysAt(t, all["irf"], "lower", "LRM", "LRM", 10); lo > sysAt(t, all["irf"], "upper", "LRM", "LRM", 10) {
		t.Error("lower band above upper band")
	}
	for a, h := range []int{1, 2, 5, 10} {
		for i := range us {
			for j := range us {
				check("fevd", sysAt(t, all["fe"], "shares", us[i], us[j], a), fx.VAR.Fevd[i][h-1][j])
			}
		}
	}
	pair := func(id string, caused, causing string) map[string]any {
		for _, p := range all[id]["pairs"].([]any) {
			e := p.(map[string]any)
			if e["caused"] == caused && e["causing"] == causing {
				return e
			}
		}
		t.Fatalf("%s: no pair %s → %s", id, causing, caused)
		return nil
	}
	for _, c := range fx.VAR.Causality {
		e := pair("gc", us[c.Caused], us[c.Causing])
		check("granger stat", sysAt(t, e, "stat"), c.Wald)
		check("granger p", sysAt(t, e, "p"), c.WaldP)
		check("granger pF", sysAt(t, e, "pf"), c.FP)
	}
	for _, c := range fx.TY.Tests {
		e := pair("ty", usl[c.Caused], usl[c.Causing])
		check("TY stat", sysAt(t, e, "stat"), c.Wald)
		check("TY p", sysAt(t, e, "p"), c.P)
	}
	for _, fc := range fx.VECMCausality {
		if fc.Deterministic != "ci" {
			continue
		}
		for _, c := range fc.Tests {
			e := pair("vc", dk[c.Caused], dk[c.Causing])
			check("VECM "+c.Kind+" stat", sysAt(t, e, c.Kind, "stat"), c.Wald)
			check("VECM "+c.Kind+" p", sysAt(t, e, c.Kind, "p"), c.P)
		}
	}
	if n != 11*16+11+11*9+4*9+6*3+6*2+36*2 {
		t.Errorf("checked %d values", n)
	}
}

func TestDynamicsErrors(t *testing.T) {
	t.Parallel()
	files := map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")}
	front := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n"
	jo := "\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n")
	for _, tc := range []struct{ name, doc, want string }{
		{"from and series", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\nseries: [LRM]\n"), "cannot be set here"},
		{"neither", front + "\n" + fence("causality", "id: r\n"), "give from:"},
		{"no lags", front + "\n" + fence("causality", "id: r\ndata: dk\nseries: [LRM, LRY]\n"), `"lags" is required`},
		{"bad identify", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\nidentify: sign\n"), "identify:"},
		{"order partial", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\norder: [LRY]\n"), "name all 4 series"},
		{"order unknown", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\norder: [LRY, LRM, IBO, XX]\n"), `"XX" is not one of the series`},
		{"few reps", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\nreplications: 5\n"), "100–100,000"},
		{"seed without reps", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\nseed: 4\n"), "no bands"},
		{"ty from vecm", front + jo + "\n" + fence("causality", "id: r\nfrom: sys\ntest: toda-yamamoto\n"), "toda-yamamoto fits a VAR"},
		{"horizons decreasing", front + jo + "\n" + fence("variance-shares", "id: r\nfrom: sys\nhorizons: [4, 2]\n"), "increasing"},
		{"from a var-lags", front + "\n" + fence("var-lags", "id: v\ndata: dk\nseries: [LRM, LRY]\n") + "\n" + fence("causality", "id: r\nfrom: v\n"), "johansen"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			doc, err := engine.Parse(writeProject(t, tc.doc, files), engine.Options{})
			if err == nil {
				err = doc.Check()
			}
			if err == nil {
				err = doc.Run()
			}
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("err = %v, want %q", err, tc.want)
			}
		})
	}
}

// TestDynamicsFromCachedSystem: a causality table built on a johansen
// result that was reused from the cache (so that directive did not run)
// gets the same numbers: the engine runs the upstream once more for its
// estimated system (engine.Context.Live).
func TestDynamicsFromCachedSystem(t *testing.T) {
	t.Parallel()
	head := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n" +
		"\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n")
	doc := head + "\n" + fence("causality", "id: vc\nfrom: sys\n")
	p := writeProject(t, doc, map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")})
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	_, first := runCached(t, p, c)
	// Build the johansen directive alone on a fresh cache, then add the
	// causality table: that build reuses the johansen result and runs
	// the table.
	if err := os.RemoveAll(c.Dir); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(head), 0o644); err != nil {
		t.Fatal(err)
	}
	runCached(t, p, c)
	if err := os.WriteFile(p, []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	d, again := runCached(t, p, c)
	if !slices.Contains(d.Reused(), "sys") || slices.Contains(d.Reused(), "vc") {
		t.Fatalf("reused %v; want sys reused and vc run", d.Reused())
	}
	if !bytes.Equal(first, again) {
		t.Error("the causality table on a cached system differs from the fresh one")
	}
}
