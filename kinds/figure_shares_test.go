package kinds

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// The variance-shares figure (figure, plot: variance-shares) through whole
// manuscripts: the plotted shares at every horizon 1 … 24 against
// statsmodels 0.13.5 (Debian python3-statsmodels), VARResults.fevd(24).decomp
// for a VAR in the series' own Cholesky ordering and in another, and its
// FEVD class applied to a VECM: testdata/fixtures/vardyn_fevd_path.json,
// written by testdata/scripts/vardyn_fevd_path.py (which says what each
// entry is). Tolerance 1e-6 relative (an absolute floor of 1e-12 for the
// shares that are zero at h = 1 by the Cholesky ordering).
type feFixture struct {
	Library, Version string
	Horizon          int
	VAR              struct {
		Series []string
		Fevd   [][][]float64 // [series][h−1][shock]
	} `json:"var"`
	VAROrder struct {
		Order []string
		Fevd  [][][]float64
	} `json:"var_order"`
	VECM struct {
		Series []string
		Fevd   [][][]float64
	} `json:"vecm"`
}

const sharesFront = "---\ntitle: T\ndata:\n  dk: dk.csv\n  us: us.csv\nlabels:\n  LRM: Real money (log)\n---\n"

func sharesFiles(t *testing.T) map[string]string {
	return map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv"), "us.csv": sysRead(t, "../testdata/data/macrodata.csv")}
}

func TestVarianceSharesFigureAgainstStatsmodels(t *testing.T) {
	t.Parallel()
	var fx feFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/vardyn_fevd_path.json")), &fx); err != nil {
		t.Fatal(err)
	}
	if fx.Library != "statsmodels" || fx.Horizon != 24 || len(fx.VAR.Fevd) != 3 || len(fx.VAR.Fevd[0]) != 24 ||
		len(fx.VAROrder.Fevd) != 3 || len(fx.VECM.Fevd) != 4 || len(fx.VECM.Fevd[0]) != 24 {
		t.Fatal("fixture shape")
	}
	us := "[100*dlog(realgdp), 100*dlog(realcons), 100*dlog(realinv)]"
	doc := sharesFront +
		"\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("variance-shares", "id: fe\nfrom: sys\nhorizons: [1, 4, 12]\n") +
		"\n" + fence("figure", "id: fefig\nplot: variance-shares\nof: fe\nhorizon: 24\ncaption: VECM shares\n") +
		// the default horizon is the last of the table's
		"\n" + fence("variance-shares", "id: fv\ndata: us\nseries: "+us+"\nlags: 2\nhorizons: [1, 2, 5, 24]\n") +
		"\n" + fence("figure", "id: fvfig\nplot: variance-shares\nof: fv\n") +
		"\n" + fence("variance-shares", "id: fo\ndata: us\nseries: "+us+"\nlags: 2\norder: [100*dlog(realinv), 100*dlog(realgdp), 100*dlog(realcons)]\n") +
		"\n" + fence("figure", "id: fofig\nplot: variance-shares\nof: fo\nhorizon: 24\nseries: [100*dlog(realcons), 100 * dlog(realinv)]\nwidth: 4.5\n")
	files := sharesFiles(t)
	p := writeProject(t, doc, files)
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	all := sysBuild(t, doc, files)
	usn := []string{"100*dlog(realgdp)", "100*dlog(realcons)", "100*dlog(realinv)"}
	n := 0
	check := func(what string, got, want float64) {
		t.Helper()
		n++
		if math.Abs(got-want) > 1e-6*math.Abs(want)+1e-12 {
			t.Errorf("%s = %.12g, statsmodels %.12g", what, got, want)
		}
	}
	cases := []struct {
		id     string
		names  []string
		drawn  []int
		series []string
		ref    [][][]float64
	}{
		{"fefig", fx.VECM.Series, []int{0, 1, 2, 3}, fx.VECM.Series, fx.VECM.Fevd},
		{"fvfig", usn, []int{0, 1, 2}, fx.VAR.Series, fx.VAR.Fevd},
		{"fofig", usn, []int{1, 2}, fx.VAR.Series, fx.VAROrder.Fevd},
	}
	for _, tc := range cases {
		v := all[tc.id]
		if v["plot"] != "variance-shares" || v["horizon"] != float64(24) {
			t.Errorf("%s: plot %v, horizon %v", tc.id, v["plot"], v["horizon"])
		}
		shares := v["shares"].(map[string]any)
		if len(shares) != len(tc.drawn) {
			t.Errorf("%s: shares of %d series, drew %d", tc.id, len(shares), len(tc.drawn))
		}
		for _, i := range tc.drawn {
			if len(shares[tc.names[i]].(map[string]any)[tc.names[0]].([]any)) != 24 {
				t.Fatalf("%s: not 24 horizons", tc.id)
			}
			for h := 0; h < 24; h++ {
				sum := 0.0
				for j := range tc.names {
					got := sysAt(t, shares, tc.names[i], tc.names[j], h)
					sum += got
					check(fmt.Sprintf("%s share of %s due to %s at h = %d", tc.id, tc.series[i], tc.series[j], h+1), got, tc.ref[i][h][j])
				}
				if math.Abs(sum-1) > 1e-12 {
					t.Errorf("%s: the shares of %s at h = %d sum to %.15g", tc.id, tc.names[i], h+1, sum)
				}
			}
		}
	}
	if n != 4*24*4+3*24*3+2*24*3 {
		t.Errorf("checked %d values", n)
	}
	// The table and the figure are one computation: the table's horizons
	// (in percent, its values as fractions) are the figure's.
	for a, h := range []int{1, 4, 12} {
		for _, i := range fx.VECM.Series {
			for _, j := range fx.VECM.Series {
				if g, w := sysAt(t, all["fe"], "shares", i, j, a), sysAt(t, all["fefig"], "shares", i, j, h-1); g != w {
					t.Errorf("table %s←%s at h = %d: %.15g, figure %.15g", i, j, h, g, w)
				}
			}
		}
	}
	// The legend names the shocks with the document's labels; the panels
	// are the series drawn.
	res := map[string]*engine.Result{}
	for _, r := range d.Results() {
		res[r.ID] = r
	}
	svg := string(res["fefig"].Figure.SVG)
	for _, want := range []string{"Real money (log)", "LRY", "IBO", "IDE", "100%", "forecast horizon"} {
		if !strings.Contains(svg, ">"+want+"<") {
			t.Errorf("the VECM figure's SVG lacks the text %q", want)
		}
	}
	if f := res["fofig"].Figure; f.Width != 4.5 || len(res["fofig"].Figure.Notes) == 0 ||
		!strings.Contains(f.Notes[0], "Cholesky ordering 100*dlog(realinv), 100*dlog(realgdp), 100*dlog(realcons)") {
		t.Errorf("fofig: width %v, notes %q", f.Width, f.Notes)
	}
	if !bytes.HasPrefix(res["fofig"].Figure.PDF, []byte("%PDF")) {
		t.Error("fofig: no PDF")
	}
}

// TestVarianceSharesFigureCached: a figure drawn from a variance-shares
// result reused from the cache gets the same shares (the engine runs the
// upstream once more for its fitted system, engine.Context.Live).
func TestVarianceSharesFigureCached(t *testing.T) {
	t.Parallel()
	head := sharesFront + "\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("variance-shares", "id: fe\nfrom: sys\n")
	doc := head + "\n" + fence("figure", "id: fig\nplot: variance-shares\nof: fe\nhorizon: 30\nseries: [LRM]\n")
	p := writeProject(t, doc, sharesFiles(t))
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	_, first := runCached(t, p, c)
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
	if !slices.Contains(d.Reused(), "fe") || slices.Contains(d.Reused(), "fig") {
		t.Fatalf("reused %v; want fe reused and fig drawn", d.Reused())
	}
	if !bytes.Equal(first, again) {
		t.Error("the figure on a cached variance-shares result differs from the fresh one")
	}
}

// TestVarianceSharesFigureErrors: each mistake is reported at the line of
// the key at fault.
func TestVarianceSharesFigureErrors(t *testing.T) {
	t.Parallel()
	files := sharesFiles(t)
	up := "\n" + fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("variance-shares", "id: fe\nfrom: sys\n")
	for _, tc := range []struct {
		name, body, key, want string // key: the line of the error ("" the fence)
	}{
		{"of a system", "plot: variance-shares\nof: sys\n", "of", `"sys" is a johansen result; plot variance-shares needs the id of a variance-shares result`},
		{"of unknown", "plot: variance-shares\nof: fee\n", "of", `no directive has id "fee"`},
		{"no of", "plot: variance-shares\n", "", "needs of:"},
		{"horizon zero", "plot: variance-shares\nof: fe\nhorizon: 0\n", "horizon", "horizon: 0 is outside 1–200"},
		{"horizon too far", "plot: variance-shares\nof: fe\nhorizon: 201\n", "horizon", "horizon: 201 is outside 1–200"},
		{"horizon elsewhere", "plot: lines\ndata: dk\nseries: [LRM]\nhorizon: 4\n", "horizon", "horizon belongs to plot variance-shares"},
		{"unknown series", "plot: variance-shares\nof: fe\nseries:\n  - LRM\n  - LRX\n", "series.1", `"LRX" is not one of the series of the system`},
		{"series twice", "plot: variance-shares\nof: fe\nseries: [LRM, LRM]\n", "series", "named twice"},
		{"legend place", "plot: variance-shares\nof: fe\nlegend: top-left\n", "legend", "legend takes none"},
		{"foreign key", "plot: variance-shares\nof: fe\nsample: 1980Q1..1985Q4\n", "sample", "does not take sample"},
		{"names count", "plot: variance-shares\nof: fe\nnames: [a, b]\n", "names", "2 names for the 4 shocks"},
		{"ylabel on panels", "plot: variance-shares\nof: fe\nylabel: share\n", "ylabel", "takes ylabels"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			body := "id: f\n" + tc.body
			doc := sharesFront + up + "\n" + fence("figure", body)
			start := strings.Count(sharesFront+up+"\n", "\n") + 2 // the line of "id: f"
			line := start - 1                                     // the fence
			if tc.key != "" {
				key, item, _ := strings.Cut(tc.key, ".")
				lines := strings.Split(body, "\n")
				at := slices.IndexFunc(lines, func(l string) bool { return strings.HasPrefix(l, key+":") })
				if at < 0 {
					t.Fatalf("no key %s", key)
				}
				if item != "" {
					at += 2 // the second item of a block list
				}
				line = start + at
			}
			err := runErr(t, doc, files)
			if err == nil {
				t.Fatal("no error")
			}
			if msg := err.Error(); !strings.Contains(msg, fmt.Sprintf("paper.md:%d:", line)) || !strings.Contains(msg, tc.want) {
				t.Errorf("err = %v; want line %d and %q", err, line, tc.want)
			}
		})
	}
}

// TestVarianceSharesFigureManyShocks: past six shocks the last ones of the
// ordering share one band (the note says so), while the values keep every
// shock; names and ylabel reach the drawing.
func TestVarianceSharesFigureManyShocks(t *testing.T) {
	t.Parallel()
	series := []string{"dlog(realgdp)", "dlog(realcons)", "dlog(realinv)", "dlog(realgovt)", "dlog(realdpi)", "dlog(cpi)", "dlog(m1)"}
	doc := sharesFront + "\n" + fence("variance-shares", "id: f7\ndata: us\nseries: ["+strings.Join(series, ", ")+"]\nlags: 1\nhorizons: [1, 8]\n") +
		"\n" + fence("figure", "id: fig\nplot: variance-shares\nof: f7\nseries: [dlog(realinv)]\nnames: [GDP, C, I, G, DPI, P, M]\nylabel: Investment growth\n")
	p := writeProject(t, doc, sharesFiles(t))
	res := runDoc(t, p)
	f := res["fig"]
	svg := string(f.Figure.SVG)
	for _, want := range []string{">GDP<", ">DPI<", ">the other 2 shocks<", ">Investment growth<"} {
		if !strings.Contains(svg, want) {
			t.Errorf("the SVG lacks %q", want)
		}
	}
	for _, not := range []string{">P<", ">M<"} {
		if strings.Contains(svg, not) {
			t.Errorf("the SVG draws %q, which should be in the combined band", not)
		}
	}
	if len(f.Figure.Notes) < 2 || !strings.Contains(f.Figure.Notes[1], "The last 2 shocks of the ordering are drawn as one band") {
		t.Errorf("notes %q", f.Figure.Notes)
	}
	shares := f.Values["shares"].(map[string]any)
	if len(shares) != 1 {
		t.Fatalf("shares of %d series", len(shares))
	}
	by := shares["dlog(realinv)"].(map[string]any)
	if len(by) != 7 {
		t.Fatalf("shares of %d shocks", len(by))
	}
	for h := 0; h < 8; h++ {
		sum := 0.0
		for _, s := range series {
			sum += by[s].([]float64)[h]
		}
		if math.Abs(sum-1) > 1e-12 {
			t.Errorf("h = %d: the shares sum to %.15g", h+1, sum)
		}
	}
	// the table's last horizon is the figure's default
	if f.Values["horizon"] != 8 {
		t.Errorf("horizon %v", f.Values["horizon"])
	}
	tab := res["f7"].Values["shares"].(map[string]any)["dlog(realinv)"].(map[string]any)["dlog(m1)"].([]float64)
	if tab[1] != by["dlog(m1)"].([]float64)[7] {
		t.Errorf("the table's share at h = 8, %.15g, is not the figure's, %.15g", tab[1], by["dlog(m1)"].([]float64)[7])
	}
}
