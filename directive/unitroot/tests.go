package unitroot

import (
	"fmt"
	"math"
	"slices"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// testDef is one unit-root or stationarity test this family offers. A new
// test is one analysis function and one registerTest call below: the
// directive of the same name, unitroot-table's tests: list, grid,
// model-table, figures and revision reports pick it up from here and
// from the contract.Outcome it returns.
type testDef struct {
	Name    string // the directive kind and the name in tests: lists
	Title   string // in table headings and notes: "ADF"
	Summary string // for the kind list and the docs
	// Bandwidth: the test uses a long-run variance (bandwidth:), not lags.
	Bandwidth bool
	// Stationarity: the null is stationarity (KPSS), not a unit root.
	Stationarity bool
	// Simulate: crit: simulate is offered (a simulation kernel exists).
	Simulate bool
	// Break: a one-break test (break:, trim:) whose terms are fixed by
	// its break model rather than det:.
	Break bool
	// Dets are the deterministic cases the test has (nil: all four), and
	// DetHelp the error when det: is not one of them.
	Dets    []critical.Case
	DetHelp string
	// Lags is the lag rule when lags: is not given (zero value: the
	// family's default, AIC with Schwert's maximum).
	Lags *unitroot.LagRule
	Run  func(y []float64, u urTest) (*contract.Outcome, error)
	// Cites are the works behind the test and its critical values, as
	// keys of galley's reference table (manuscript.MethodBib).
	Cites []string
	// Fields are the further values Run puts in Outcome.Extra, and Rows
	// those of them the single-test table shows under the statistic.
	Fields []string
	Rows   []extraRow
}

// extraRow is a further statistic in the single-test table: its label
// and the Outcome.Extra keys of its value and critical values.
type extraRow struct{ Label, Key, CritKey string }

var testDefs []*testDef

// registerTest adds a test and registers its directive kind.
func registerTest(d *testDef) {
	testDefs = append(testDefs, d)
	engine.Register(engine.Kind{Name: d.Name, Summary: d.Summary, Fields: append(slices.Clone(urFields), d.Fields...), Simulate: d.Simulate,
		New: func() engine.Directive { return &urSpec{test: d.Name} }})
}

// testNames lists the registered tests in registration order.
func testNames() []string {
	var out []string
	for _, d := range testDefs {
		out = append(out, d.Name)
	}
	return out
}

// testDef returns the registered test called name (nil if none).
func lookupTest(name string) *testDef {
	i := slices.IndexFunc(testDefs, func(d *testDef) bool { return d.Name == name })
	if i < 0 {
		return nil
	}
	return testDefs[i]
}

// title is the test's name in tables and notes.
func title(name string) string {
	if d := lookupTest(name); d != nil {
		return d.Title
	}
	return name
}

func (u urTest) run(y []float64) (*contract.Outcome, error) {
	d := lookupTest(u.Name)
	if d == nil {
		return nil, fmt.Errorf("unknown test %q", u.Name)
	}
	return d.Run(y, u)
}

var levelOrTrend = []critical.Case{critical.Const, critical.ConstTrend}

func init() {
	registerTest(&testDef{Name: "adf", Cites: []string{"dickey-fuller-1979", "said-dickey-1984", "mackinnon-2010", "mackinnon-1994"}, Title: "ADF", Summary: "augmented Dickey–Fuller unit-root test", Simulate: true,
		Fields: append([]string{"pvalue_source", "lags", "det"}, simFields...),
		Run: func(y []float64, u urTest) (*contract.Outcome, error) {
			r, err := unitroot.ADF(y, u.Det, u.Lags)
			if err != nil {
				return nil, err
			}
			return &contract.Outcome{Test: "ADF", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
				NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root"}, nil
		}})
	registerTest(&testDef{Name: "pp", Cites: []string{"phillips-perron-1988", "mackinnon-2010", "mackinnon-1994", "newey-west-1994"}, Title: "PP", Summary: "Phillips–Perron unit-root test", Bandwidth: true,
		Fields: []string{"pvalue_source", "bandwidth", "det", "stat_alpha", "crit_alpha", "crit_alpha_source"},
		Dets:   []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend}, DetHelp: "Phillips–Perron supports det n, c or ct",
		Run: func(y []float64, u urTest) (*contract.Outcome, error) {
			r, err := unitroot.PP(y, u.Det, u.Bandwidth)
			if err != nil {
				return nil, err
			}
			return &contract.Outcome{Test: "PP", StatName: "Z(t)", Stat: r.Stat, PValue: r.PValue, Lags: r.Bandwidth, IsBW: true,
				NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root",
				Extra: map[string]any{"stat_alpha": r.StatAlpha, "crit_alpha": contract.CritMap(r.CritAlpha), "crit_alpha_source": r.CritAlphaSource}}, nil
		}})
	registerTest(&testDef{Name: "kpss", Cites: []string{"kpss-1992", "newey-west-1994"}, Title: "KPSS", Summary: "KPSS test of level or trend stationarity", Bandwidth: true, Stationarity: true,
		Fields: []string{"pvalue_source", "pvalue_clipped", "bandwidth", "det"},
		Dets:   levelOrTrend, DetHelp: "KPSS tests level (c) or trend (ct) stationarity; det: %s is not one of them",
		Run: func(y []float64, u urTest) (*contract.Outcome, error) {
			r, err := unitroot.KPSS(y, u.Det, u.Bandwidth)
			if err != nil {
				return nil, err
			}
			return &contract.Outcome{Test: "KPSS", StatName: "η", Stat: r.Stat, PValue: r.PValue, PClipped: r.PClipped, Lags: r.Bandwidth, IsBW: true,
				NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "interpolated in KPSS (1992) Table 1", Upper: true, Null: kpssNull(u.Det)}, nil
		}})
	registerTest(&testDef{Name: "dfgls", Cites: []string{"ers-1996"}, Title: "DF-GLS", Summary: "DF-GLS unit-root test of Elliott, Rothenberg and Stock",
		Fields: []string{"pvalue_source", "lags", "det"},
		Dets:   levelOrTrend, DetHelp: "DF-GLS has a constant (c) or a constant and trend (ct) case; det: %s is not one of them",
		Run: func(y []float64, u urTest) (*contract.Outcome, error) {
			r, err := unitroot.DFGLS(y, u.Det, u.Lags)
			if err != nil {
				return nil, err
			}
			ps := "MacKinnon (1994), no-constant case"
			if u.Det == critical.ConstTrend {
				ps = ""
			}
			return &contract.Outcome{Test: "DF-GLS", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
				NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: ps, Null: "has a unit root"}, nil
		}})
	registerTest(&testDef{Name: "za", Cites: []string{"zivot-andrews-1992"}, Title: "ZA", Summary: "Zivot–Andrews unit-root test with one break at an unknown date", Break: true,
		Fields: []string{"lags", "break", "break_index", "break_model", "trim"},
		Run: func(y []float64, u urTest) (*contract.Outcome, error) {
			r, err := unitroot.ZA(y, u.Break, u.Trim, u.Lags)
			if err != nil {
				return nil, err
			}
			return &contract.Outcome{Test: "ZA", StatName: "min t", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
				NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, Null: "has a unit root (and no break)",
				Extra: map[string]any{"break_index": r.Break, "trim": r.Trim}}, nil
		}})
	registerTest(&testDef{Name: "ngperron", Cites: []string{"ng-perron-2001"}, Title: "Ng–Perron", Summary: "Ng–Perron M tests (MZα, MZt, MSB, MPT) on GLS-detrended data, lags by the modified AIC",
		Dets: levelOrTrend, DetHelp: "the Ng–Perron tests have a constant (c) or a constant and trend (ct) case; det: %s is not one of them",
		Lags: &unitroot.LagRule{Select: unitroot.MAIC, Max: -1}, Run: ngPerron,
		Fields: []string{"lags", "det", "mza", "mzt", "msb", "mpt", "crit_mza", "crit_msb", "crit_mpt", "s2ar"},
		Rows:   []extraRow{{"MZα", "mza", "crit_mza"}, {"MSB", "msb", "crit_msb"}, {"MPT", "mpt", "crit_mpt"}}})
}

// ngPerron reports MZt as the outcome's statistic (the t-type statistic
// readers compare with ADF's τ) and the other three, each with its
// critical values, as further values.
func ngPerron(y []float64, u urTest) (*contract.Outcome, error) {
	r, err := unitroot.NgPerron(y, u.Det, u.Lags)
	if err != nil {
		return nil, err
	}
	return &contract.Outcome{Test: "Ng–Perron", StatName: "MZt", Stat: r.MZt, PValue: math.NaN(), Lags: r.Lags, MaxLag: r.MaxLag,
		NObs: r.NObs, Crit: r.CritMZt, CritSource: r.CritSource, Null: "has a unit root",
		Extra: map[string]any{
			"mza": r.MZa, "mzt": r.MZt, "msb": r.MSB, "mpt": r.MPT,
			"crit_mza": contract.CritMap(r.CritMZa), "crit_msb": contract.CritMap(r.CritMSB), "crit_mpt": contract.CritMap(r.CritMPT),
			"s2ar": r.S2AR,
		}}, nil
}
