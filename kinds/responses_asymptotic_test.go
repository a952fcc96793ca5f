package kinds

import (
	"encoding/json"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/resultsfile"
)

// responses with bands: asymptotic, through whole manuscripts, against
// statsmodels 0.13.5 (VARResults.irf(10).stderr(orth=True) and
// .orth_irfs; VECMResults.irf(10).stderr for a VECM from a johansen
// directive) and, for generalised responses, a numpy complex-step
// Jacobian: testdata/fixtures/vardyn_irf_stderr.json (script
// testdata/scripts/vardyn_irf_stderr.py) and
// testdata/fixtures/vardyn_statsmodels.json (orth_irfs). The normal
// quantiles are scipy's (same fixture). Tolerance 1e-6 relative.
type irfSEKindsFixture struct {
	Version string
	Z       map[string]float64
	Cases   []struct {
		Name       string
		OrthStderr [][][]float64 `json:"orth_stderr"`
		Girf       [][][]float64
		GirfStderr [][][]float64 `json:"girf_stderr"`
	}
	Ordered struct {
		Order      []int
		OrthStderr [][][]float64 `json:"orth_stderr"`
	}
	VECM []struct {
		Name       string
		OrthStderr [][][]float64 `json:"orth_stderr"`
		Girf       [][][]float64
		GirfStderr [][][]float64 `json:"girf_stderr"`
	} `json:"vecm"`
}

func TestResponsesAsymptoticBands(t *testing.T) {
	t.Parallel()
	var fx irfSEKindsFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/vardyn_irf_stderr.json")), &fx); err != nil {
		t.Fatal(err)
	}
	var irfx dynFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/vardyn_statsmodels.json")), &irfx); err != nil {
		t.Fatal(err)
	}
	if len(fx.Cases) != 3 || fx.Cases[0].Name != "growth" || fx.Cases[1].Name != "levels" || fx.Cases[2].Name != "denmark" ||
		len(irfx.VAR.OrthIrfs) != 11 || len(fx.Ordered.OrthStderr) != 11 || !strings.HasPrefix(fx.Version, "0.13.5") ||
		len(fx.VECM) != 4 || fx.VECM[0].Name != "vecm-ci-1" || fx.VECM[3].Name != "vecm-co-2" || len(irfx.VECM) != 2 || irfx.VECM[0].Deterministic != "ci" {
		t.Fatal("fixture layout")
	}
	growth, levels, denmark := fx.Cases[0], fx.Cases[1], fx.Cases[2]
	ci1, co2 := fx.VECM[0], fx.VECM[3]
	us := []string{"100*dlog(realgdp)", "100*dlog(realcons)", "100*dlog(realinv)"}
	usl := []string{"log(realgdp)", "log(realcons)", "log(realinv)"}
	dk := []string{"LRM", "LRY", "IBO", "IDE"}
	list := func(s []string) string { return "[" + strings.Join(s, ", ") + "]" }
	front := "---\ntitle: T\ndata:\n  dk: dk.csv\n  us: us.csv\n---\n"
	doc := front +
		"\n" + fence("responses", "id: a\ndata: us\nseries: "+list(us)+"\nlags: 2\nhorizon: 10\nbands: asymptotic\n") +
		"\n" + fence("responses", "id: d\ndata: us\nseries: [100*log(realgdp), 100*log(realcons), 100*log(realinv)]\ndifferences: true\nlags: 2\nhorizon: 10\nbands: asymptotic\ncoverage: 0.68\n") +
		"\n" + fence("responses", "id: o\ndata: us\nseries: "+list(us)+"\nlags: 2\nhorizon: 10\nbands: asymptotic\norder: [100*dlog(realinv), 100*dlog(realgdp), 100*dlog(realcons)]\n") +
		"\n" + fence("responses", "id: g\ndata: us\nseries: "+list(usl)+"\nlags: 3\ndet: ct\nhorizon: 10\nidentify: generalised\nbands: asymptotic\ncoverage: 0.95\n") +
		"\n" + fence("responses", "id: k\ndata: dk\nseries: "+list(dk)+"\nlags: 2\ndet: n\nhorizon: 10\nbands: asymptotic\nresponses: [LRM]\n") +
		"\n" + fence("responses", "id: b\ndata: us\nseries: "+list(us)+"\nlags: 2\nhorizon: 10\n") +
		"\n" + fence("johansen", "id: rc\ndata: dk\nseries: "+list(dk)+"\ndet: restricted constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("responses", "id: v\nfrom: rc\nhorizon: 10\nbands: asymptotic\n") +
		"\n" + fence("johansen", "id: uc\ndata: dk\nseries: "+list(dk)+"\ndet: constant\nlags: 2\nrank: 1\n") +
		"\n" + fence("responses", "id: vg\nfrom: uc\nhorizon: 10\nbands: asymptotic\nidentify: generalised\ncoverage: 0.95\n")
	p := writeProject(t, doc, map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv"), "us.csv": sysRead(t, "../testdata/data/macrodata.csv")})
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	raw, err := d.ResultsJSON("test")
	if err != nil {
		t.Fatal(err)
	}
	var rf resultsfile.File
	if err := json.Unmarshal(raw, &rf); err != nil {
		t.Fatal(err)
	}
	all := map[string]map[string]any{}
	for _, r := range rf.Results {
		all[r.ID] = r.Values
	}
	n := 0
	check := func(what string, got, want float64) {
		t.Helper()
		n++
		if !sysNear(got, want, 1e-6) {
			t.Errorf("%s = %.12g, reference %.12g", what, got, want)
		}
	}
	// One VAR in growth rates, fitted to the growth rates (a) and to
	// 100·log differenced by the directive (d); c = 0.90 and 0.68.
	for h := 0; h <= 10; h++ {
		for i := range us {
			for j := range us {
				se, th := growth.OrthStderr[h][i][j], irfx.VAR.OrthIrfs[h][i][j]
				check("stderr", sysAt(t, all["a"], "stderr", us[i], us[j], h), se)
				check("lower", sysAt(t, all["a"], "lower", us[i], us[j], h), th-fx.Z["0.9"]*se)
				check("upper", sysAt(t, all["a"], "upper", us[i], us[j], h), th+fx.Z["0.9"]*se)
				dn := []string{"100*log(realgdp)", "100*log(realcons)", "100*log(realinv)"}
				check("differences stderr", sysAt(t, all["d"], "stderr", dn[i], dn[j], h), se)
				check("differences upper", sysAt(t, all["d"], "upper", dn[i], dn[j], h), th+fx.Z["0.68"]*se)
				// Another Cholesky ordering: statsmodels on reordered data.
				o := fx.Ordered.Order
				check("ordered stderr", sysAt(t, all["o"], "stderr", us[o[i]], us[o[j]], h), fx.Ordered.OrthStderr[h][i][j])
				// Generalised responses in a VAR(3) in log levels with a trend.
				gs, gi := levels.GirfStderr[h][i][j], levels.Girf[h][i][j]
				check("generalised irf", sysAt(t, all["g"], "irf", usl[i], usl[j], h), gi)
				check("generalised stderr", sysAt(t, all["g"], "stderr", usl[i], usl[j], h), gs)
				check("generalised lower", sysAt(t, all["g"], "lower", usl[i], usl[j], h), gi-fx.Z["0.95"]*gs)
			}
		}
		for i := range dk {
			for j := range dk {
				check("denmark stderr", sysAt(t, all["k"], "stderr", dk[i], dk[j], h), denmark.OrthStderr[h][i][j])
				// The VECM of a johansen directive in its VAR form.
				se := ci1.OrthStderr[h][i][j]
				check("VECM stderr", sysAt(t, all["v"], "stderr", dk[i], dk[j], h), se)
				check("VECM upper", sysAt(t, all["v"], "upper", dk[i], dk[j], h), irfx.VECM[0].OrthIrfs[h][i][j]+fx.Z["0.9"]*se)
				gs := co2.GirfStderr[h][i][j]
				check("VECM generalised stderr", sysAt(t, all["vg"], "stderr", dk[i], dk[j], h), gs)
				check("VECM generalised lower", sysAt(t, all["vg"], "lower", dk[i], dk[j], h), co2.Girf[h][i][j]-fx.Z["0.95"]*gs)
			}
		}
	}
	if n != 11*(9*9+16*5) {
		t.Errorf("checked %d values", n)
	}
	if c := sysAt(t, all["a"], "coverage"); c != 0.9 {
		t.Errorf("coverage %g", c)
	}
	for _, k := range []string{"reps", "seed", "interval", "failed"} {
		if _, ok := all["a"][k]; ok {
			t.Errorf("asymptotic bands report the bootstrap's %s", k)
		}
	}
	// Without bands: no bands, as before.
	for _, k := range []string{"stderr", "lower", "upper", "coverage"} {
		if _, ok := all["b"][k]; ok {
			t.Errorf("responses without bands report %s", k)
		}
	}
	var kind *engine.Kind
	for _, k := range engine.Kinds() {
		if k.Name == "responses" {
			kind = k
		}
	}
	for _, r := range d.Results() {
		if r.Kind != "responses" {
			continue
		}
		for key := range r.Values {
			if !slices.Contains(kind.Fields, key) && !slices.Contains(engine.CommonFields, key) {
				t.Errorf("%s produces %q, which the kind's Fields refuse", r.ID, key)
			}
		}
		if r.ID == "b" {
			if slices.Contains(r.Cites, "lutkepohl-2005") || strings.Contains(strings.Join(r.Figure.Notes, " "), "asymptotic") {
				t.Errorf("responses without bands: cites %v, notes %q", r.Cites, r.Figure.Notes)
			}
			continue
		}
		if !slices.Contains(r.Cites, "lutkepohl-2005") {
			t.Errorf("%s cites %v", r.ID, r.Cites)
		}
		note := strings.Join(r.Figure.Notes, " ")
		ws := []string{"asymptotic intervals", "delta method", "Lütkepohl 2005, Proposition 3.6", "T − Kp − d"}
		if r.ID == "v" || r.ID == "vg" {
			ws = []string{"asymptotic intervals", "delta method", "Lütkepohl 2005, Proposition 3.6", "β fixed at its estimate", "ML residual covariance"}
		}
		for _, w := range ws {
			if !strings.Contains(note, w) {
				t.Errorf("%s: the note lacks %q: %s", r.ID, w, note)
			}
		}
		want := map[string]string{"a": "pointwise 90% asymptotic intervals, the response ± 1.645 standard errors",
			"d": "pointwise 68% asymptotic intervals, the response ± 0.994 standard errors",
			"g": "pointwise 95% asymptotic intervals, the response ± 1.960 standard errors"}[r.ID]
		if want != "" && !strings.Contains(note, want) {
			t.Errorf("%s: the note lacks %q: %s", r.ID, want, note)
		}
		if r.ID == "g" && !slices.Contains(r.Cites, "pesaran-shin-1998") {
			t.Errorf("generalised responses cite %v", r.Cites)
		}
	}
}

func TestResponsesAsymptoticErrors(t *testing.T) {
	t.Parallel()
	files := map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")}
	front := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n"
	jo := "\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n")
	v := "id: r\ndata: dk\nseries: [LRM, LRY]\nlags: 2\n"
	for _, tc := range []struct{ name, doc, want string }{
		{"vecm with replications", front + jo + "\n" + fence("responses", "id: r\nfrom: sys\nbands: asymptotic\nreplications: 100\n"), "replications: belongs to bootstrap bands"},
		{"replications", front + "\n" + fence("responses", v+"bands: asymptotic\nreplications: 200\n"), "replications: belongs to bootstrap bands"},
		{"seed", front + "\n" + fence("responses", v+"bands: asymptotic\nseed: 3\n"), "seed: belongs to bootstrap bands"},
		{"interval", front + "\n" + fence("responses", v+"bands: asymptotic\ninterval: hall\n"), "interval: belongs to bootstrap bands"},
		{"coverage", front + "\n" + fence("responses", v+"bands: asymptotic\ncoverage: 1.2\n"), "coverage must be"},
		{"bootstrap without replications", front + "\n" + fence("responses", v+"bands: bootstrap\n"), "bands: bootstrap bands need replications:"},
		{"unknown", front + "\n" + fence("responses", v+"bands: delta\n"), `bands: write bootstrap`},
		{"coverage without bands", front + "\n" + fence("responses", v+"coverage: 0.8\n"), "no bands"},
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
