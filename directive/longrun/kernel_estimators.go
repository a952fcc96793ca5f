package longrun

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// kernelSpec is the spec of the two estimators that correct static least
// squares with kernel estimates of the long-run covariances: fmols
// (Phillips and Hansen 1990) and ccr (Park 1992). They share their keys,
// their table and their values; method says which one a block is.
type kernelSpec struct {
	RelationKeys `yaml:",inline"`
	Kernel       string `yaml:"kernel"`
	Bandwidth    string `yaml:"bandwidth"`

	method *kernelMethod
}

// kernelFit is what the table and values need of either estimate.
type kernelFit struct {
	Names     []string
	Coef      []float64
	Table     []ols.Coef
	LongRun   longrun.Coefs
	N, First  int
	Bandwidth float64
}

// kernelMethod is what differs between fmols and ccr: the estimate, the
// words of the first note, further rows, values and notes, and the works
// cited.
type kernelMethod struct {
	Name, Title string
	Summary     string
	Fields      []string
	Cites       []string
	// What is the opening of the first note: "Fully modified OLS of y on x, …".
	What func(y, x string) string
	// Estimate fits the relation; extra adds the method's own rows, note,
	// values and hidden value keys.
	Estimate func(y []float64, x [][]float64, names []string, det critical.Case, k longrun.Kernel, bw float64) (kernelFit, any, error)
	Extra    func(c *engine.Context, y []float64, x [][]float64, det critical.Case, raw any, dec int) ([]table.Row, string, map[string]any, []string, error)
}

// ccrFields adds to the shared values the bandwidth and kernel, the
// conditional long-run variance and the first-stage OLS coefficients.
var ccrFields = append([]string{"bandwidth", "kernel", "lrvar", "first_stage"}, longrunFields...)

var kernelMethods = []*kernelMethod{
	{Name: "fmols", Title: "FMOLS", Summary: "fully modified OLS estimate of a cointegrating relation, with Wald tests",
		Fields: fmolsFields, Cites: []string{"phillips-hansen-1990", "hansen-1992"},
		What: func(y, x string) string {
			return fmt.Sprintf("Fully modified OLS of %s on %s, correcting for endogeneity and serial correlation.", y, x)
		},
		Estimate: func(y []float64, x [][]float64, names []string, det critical.Case, k longrun.Kernel, bw float64) (kernelFit, any, error) {
			r, err := longrun.FMOLS(y, x, names, longrun.FMOLSSpec{Det: det, Kernel: k, Bandwidth: bw})
			if err != nil {
				return kernelFit{}, nil, err
			}
			return kernelFit{r.Names, r.Coef, r.Table, r.LongRun, r.N, r.First, r.Bandwidth}, r, nil
		},
		Extra: func(c *engine.Context, y []float64, x [][]float64, det critical.Case, raw any, dec int) ([]table.Row, string, map[string]any, []string, error) {
			rows, note, vals, err := lcBlock(c, y, x, det, raw.(*longrun.FMOLSResult), dec) // lc_rows.go
			return rows, note, map[string]any{"lc": vals}, nil, err
		}},
	{Name: "ccr", Title: "CCR", Summary: "canonical cointegrating regression (Park 1992) of a cointegrating relation, with Wald tests",
		Fields: ccrFields, Cites: []string{"park-1992"},
		What: func(y, x string) string {
			return fmt.Sprintf("Canonical cointegrating regression of %s on %s: least squares on data transformed with the estimated long-run covariances, so that the usual t-ratios and Wald statistics are valid.", y, x)
		},
		Estimate: func(y []float64, x [][]float64, names []string, det critical.Case, k longrun.Kernel, bw float64) (kernelFit, any, error) {
			r, err := longrun.CCR(y, x, names, longrun.CCRSpec{Det: det, Kernel: k, Bandwidth: bw})
			if err != nil {
				return kernelFit{}, nil, err
			}
			return kernelFit{r.Names, r.Coef, r.Table, r.LongRun, r.N, r.First, r.Bandwidth}, r, nil
		},
		Extra: func(c *engine.Context, y []float64, x [][]float64, det critical.Case, raw any, dec int) ([]table.Row, string, map[string]any, []string, error) {
			r := raw.(*longrun.CCRResult)
			var first []map[string]any
			for j, name := range r.Names {
				first = append(first, map[string]any{"term": name, "est": r.Static.Coef[j]})
			}
			// ω̂₁·₂ and the static first stage are working values no table shows.
			return nil, "", map[string]any{"lrvar": r.Omega11_2, "first_stage": first}, []string{"lrvar", "first_stage"}, nil
		}},
}

func init() {
	for _, m := range kernelMethods {
		engine.Register(engine.Kind{Name: m.Name, Summary: m.Summary, Fields: m.Fields, Model: true,
			New: func() engine.Directive { return &kernelSpec{method: m} }})
	}
}

func (s *kernelSpec) settings(c *engine.Context) (critical.Case, longrun.Kernel, float64, error) {
	det, err := engine.ParseDet(c, s.Det)
	if err != nil {
		return det, 0, 0, err
	}
	k, b, err := kernelBandwidth(c, s.Kernel, s.Bandwidth)
	return det, k, b, err
}

func (s *kernelSpec) Check(c *engine.Context) error {
	if err := s.checkRelation(c, s.method.Name); err != nil {
		return err
	}
	_, _, _, err := s.settings(c)
	return err
}

// Run estimates the relation and returns its table (the long-run
// coefficients, the deterministic terms, N, the bandwidth, the Wald
// tests and the method's own rows), values, relation residuals and model.
func (s *kernelSpec) Run(c *engine.Context) (*engine.Result, error) {
	det, kern, bw, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := s.data(c)
	if err != nil {
		return nil, err
	}
	restr, _ := parseRestrictions(c, s.Restrict, s.X)
	r, raw, err := s.method.Estimate(d.Cols[0], d.Cols[1:], s.X, det, kern, bw)
	if err != nil {
		return nil, relationError(c, s.method.Title, s.Y, s.X, err)
	}
	walds, err := runWald(c, restr, r.LongRun)
	if err != nil {
		return nil, err
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(s.Y)}}}
	t.Body = longRunRows(c, r.Names, r.Table, det.Deterministics(), dec)
	t.Body = append(t.Body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(r.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("Bandwidth"), table.N(r.Bandwidth, 2)}},
	)
	t.Body = append(t.Body, waldRows(walds, dec)...)
	rows, extraNote, extraVals, hidden, err := s.method.Extra(c, d.Cols[0], d.Cols[1:], det, raw, dec)
	if err != nil {
		return nil, err
	}
	t.Body = append(t.Body, rows...)
	sd := &engine.Data{Dates: d.Dates[r.First:]}
	kname := kernelName(kern)
	seDesc := fmt.Sprintf("%s, from the long-run variance of the equilibrium error given the regressors' innovations (%s kernel, %s)", s.method.Title, kname, bandwidthText(r.Bandwidth, bw))
	t.Notes = []string{
		fmt.Sprintf("%s Deterministic terms: %s. Standard errors in parentheses: %s; t-ratios and Wald statistics compared with the standard normal and χ² distributions.",
			s.method.What(s.Y, strings.Join(s.X, ", ")), contract.DetNames[det], seDesc),
	}
	if w := waldNote(walds); w != "" {
		t.Notes = append(t.Notes, w)
	}
	if extraNote != "" {
		t.Notes = append(t.Notes, extraNote)
	}
	t.Notes = append(t.Notes, c.StarNote()+" "+sd.SampleNote())
	vals := map[string]any{
		"coef": engine.CoefValues(r.Names, r.Table), "nobs": r.N, "wald": waldValues(walds),
		"bandwidth": r.Bandwidth, "kernel": strings.ToLower(kname), "cov": s.method.Name, "se_desc": seDesc, "det": det.String(),
		"y": s.Y, "x": append([]string(nil), s.X...),
		"sample": engine.SampleValues(sd),
	}
	for k, v := range extraVals {
		vals[k] = v
	}
	res := &engine.Result{Table: t, Values: vals, Hidden: hidden, Cites: s.method.Cites}
	res.SetSeries("resid", contract.ViewDated(d.Dates, longrun.RelationResid(d.Cols[0], d.Cols[1:], det, r.Coef)))
	res.Model = engine.ModelOf(s.method.Title, s.Y, r.Names, r.Table, vals, true, "")
	return res, nil
}
