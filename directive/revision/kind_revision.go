package revision

import (
	"fmt"
	"slices"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/revision"
)

// revision: a report of what changes when the paper is built on another
// vintage of its data — the conclusions that flipped, the samples that
// changed, and the numbers that moved most. The earlier vintage is
// `against`; the current build is the later one.
type revisionSpec struct {
	engine.Common `yaml:",inline"`
	// Against names the vintage to compare with (the earlier data).
	Against string   `yaml:"against"`
	Show    []string `yaml:"show"`
	// Only limits the report to the results with these ids.
	Only []string `yaml:"only"`
	Max  int      `yaml:"max"`
	Tol  float64  `yaml:"tol"`
}

var revisionShows = []string{"specs", "conclusions", "samples", "numbers"}

func init() {
	engine.Register(engine.Kind{
		Name:    "revision",
		Summary: "what changes when the paper is built on another vintage of its data",
		New:     func() engine.Directive { return &revisionSpec{} },
		Fields:  []string{"against", "flips", "flipped", "moved", "samples", "inputs", "unchanged", "specs"},
	})
}

func (s *revisionSpec) Check(c *engine.Context) error {
	if err := c.Require("against", s.Against == ""); err != nil {
		return err
	}
	if !c.HasVintage(s.Against) {
		return c.Errorf("against", "no data alias has a vintage %q (name vintages in the front matter: data: ALIAS: {path: …, vintage: {%s: …}})", s.Against, s.Against)
	}
	for _, sh := range s.Show {
		if !slices.Contains(revisionShows, sh) {
			return c.Errorf("show", "unknown part %q%s; parts: %s", sh, manuscript.DidYouMean(sh, revisionShows), strings.Join(revisionShows, ", "))
		}
	}
	for i, id := range s.Only {
		if c.RefKind(id) == "" || id == c.ID() {
			return c.ItemErrorf("only", i, "no other directive has id %q%s", id, manuscript.DidYouMean(id, otherIDs(c)))
		}
	}
	if s.Max < 0 || s.Tol < 0 {
		return c.Errorf("max", "max and tol must not be negative")
	}
	return nil
}

func (s *revisionSpec) shows(part string) bool {
	return len(s.Show) == 0 || slices.Contains(s.Show, part)
}

func (s *revisionSpec) Run(c *engine.Context) (*engine.Result, error) {
	if c.Nested() {
		// Inside the build of the other vintage: a placeholder, never shown.
		return &engine.Result{Values: map[string]any{"against": s.Against, "flips": 0, "flipped": nil, "moved": 0, "samples": nil, "inputs": nil, "unchanged": 0, "specs": nil}, Hidden: reportKeys}, nil
	}
	// Everything else in this build first: the report compares it. The
	// report depends on every other result and on the other vintage's
	// files, which the cache records so that it can reuse the report.
	if err := c.RunAllExcept("revision"); err != nil {
		return nil, err
	}
	d := c.Document()
	other, err := c.ParseVintage(s.Against)
	if err != nil {
		return nil, c.Wrap("against", err)
	}
	if err := other.Run(); err != nil {
		return nil, c.Errorf("against", "building vintage %q failed: %v", s.Against, err)
	}
	oldF, err := other.ResultsFile("build", "vintage "+s.Against)
	if err != nil {
		return nil, err
	}
	cur := "this build"
	if d.Vintage() != "" {
		cur = "vintage " + d.Vintage()
	}
	newF, err := d.ResultsFile("build", cur)
	if err != nil {
		return nil, err
	}
	rep := revision.Compare(oldF, newF, revision.Options{Tol: s.Tol, Stars: c.Stars(), Only: s.Only})
	return s.table(c, rep), nil
}

func (s *revisionSpec) table(c *engine.Context, rep *revision.Report) *engine.Result {
	t := &table.Table{Stub: 2, Head: [][]table.Cell{{table.T("Result"), table.T("What"), table.T("Before"), table.T("After")}}}
	var specs, flipped, samples []map[string]any
	if s.shows("specs") {
		specs = changes(t, rep, "Specifications that changed", func(it *revision.Item) []revision.Change { return it.Specs })
	}
	if s.shows("conclusions") {
		flipped = changes(t, rep, "Conclusions that changed", func(it *revision.Item) []revision.Change { return it.Flips })
	}
	if s.shows("samples") {
		samples = s.samples(t, rep)
	}
	moved := s.moved(t, rep)
	var inputs []string
	var inputText []string
	for _, in := range rep.InputsChanged {
		inputs = append(inputs, in.Name())
		inputText = append(inputText, in.Name()+" ("+in.What()+")")
	}
	scope := ""
	if len(s.Only) > 0 {
		scope = fmt.Sprintf(" The report covers %d chosen results.", len(s.Only))
	}
	note := fmt.Sprintf("Before: the paper built on the data vintage %q; after: %s.%s %d results are unchanged and %d changed; %d conclusions changed.",
		s.Against, afterName(rep), scope, rep.Unchanged, len(rep.Items), rep.Flips())
	if len(inputText) > 0 {
		note += " Data that differ: " + strings.Join(inputText, "; ") + "."
	}
	hidden := 0
	for _, it := range rep.Items {
		hidden += len(it.Hidden)
	}
	notes := []string{note, "A conclusion is a test's rejection at 5%, a coefficient's star count, an order-of-integration verdict, a cointegrating rank, or the sign of an adjustment coefficient, among the numbers the paper's tables show or its text quotes. " + revision.MovedNote}
	if hidden > 0 {
		notes = append(notes, fmt.Sprintf("%d changes among values no table shows (such as the coefficients of DOLS's leads and lags) are left out.", hidden))
	}
	t.Notes = notes
	vals := map[string]any{
		"against": s.Against, "flips": rep.Flips(), "flipped": flipped, "moved": moved,
		"samples": samples, "inputs": inputs, "unchanged": rep.Unchanged, "specs": specs,
	}
	return &engine.Result{Table: t, Values: vals, Hidden: reportKeys}
}

// reportKeys are the values of a revision report: a report about other
// results, which a comparison of two builds does not compare again.
var reportKeys = []string{"against", "flips", "flipped", "moved", "samples", "inputs", "unchanged", "specs"}

// afterName names the current build.
func afterName(rep *revision.Report) string {
	if v := rep.New.Vintage; v != "" {
		return fmt.Sprintf("the data vintage %q", v)
	}
	return "this build"
}

// otherIDs lists the document's directive ids other than this one.
func otherIDs(c *engine.Context) []string {
	var out []string
	for _, r := range c.Document().IDs() {
		if r != c.ID() {
			out = append(out, r)
		}
	}
	return out
}

// block starts a titled block of the report table.
func block(t *table.Table, title string) {
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.Span(title, 4)}, RuleAbove: len(t.Body) > 0})
}

// none marks an empty block.
func none(t *table.Table) {
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.Span("none", 4)}})
}

// changes lists, under title, the changes pick takes from each result
// (its spec keys or its conclusions), one row and one value each.
func changes(t *table.Table, rep *revision.Report, title string, pick func(*revision.Item) []revision.Change) []map[string]any {
	block(t, title)
	var out []map[string]any
	for i := range rep.Items {
		it := &rep.Items[i]
		for _, ch := range pick(it) {
			t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(it.Short), table.T(ch.What), table.T(ch.Old), table.T(ch.New)}})
			out = append(out, map[string]any{"id": it.ID, "label": it.Short, "what": ch.What, "old": ch.Old, "new": ch.New})
		}
	}
	if len(out) == 0 {
		none(t)
	}
	return out
}

// samples lists the results whose samples changed.
func (s *revisionSpec) samples(t *table.Table, rep *revision.Report) []map[string]any {
	block(t, "Samples that changed")
	var samples []map[string]any
	n := 0
	for _, it := range rep.Items {
		if len(it.Samples) == 0 {
			continue
		}
		before, after := sampleText(it.Samples)
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(it.Short), table.T("sample"), table.T(before), table.T(after)}})
		for _, ch := range it.Samples {
			samples = append(samples, map[string]any{"id": it.ID, "label": it.Short, "what": ch.What, "old": ch.Old, "new": ch.New})
		}
		n++
	}
	if n == 0 {
		none(t)
	}
	return samples
}

// moved lists the numbers that moved most (when shown), ranked on their
// own scale (revision.Report.Ranked), and returns how many moved.
func (s *revisionSpec) moved(t *table.Table, rep *revision.Report) int {
	max := s.Max
	if max == 0 {
		max = 12
	}
	n := 0
	for _, it := range rep.Items {
		n += len(it.Moved)
	}
	ranked := rep.Ranked()
	if s.shows("numbers") {
		block(t, fmt.Sprintf("Numbers that moved most (%d of %d that moved; p-values aside)", min(max, len(ranked)), n))
		for _, m := range ranked[:min(max, len(ranked))] {
			t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(m.Item.Short), table.T(fmt.Sprintf("%s (%s)", m.What, m.MoveText())), table.T(m.Old), table.T(m.New)}})
		}
		if n == 0 {
			none(t)
		}
	}
	return n
}

// sampleText summarises a result's sample changes as "FROM–TO, N = n"
// before and after, from its top-level sample values where it has them.
func sampleText(chs []revision.Change) (string, string) {
	get := func(what string) (string, string, bool) {
		for _, ch := range chs {
			if ch.What == what {
				return ch.Old, ch.New, true
			}
		}
		return "", "", false
	}
	var before, after []string
	fo, fn, okf := get("sample from")
	to, tn, okt := get("sample to")
	switch {
	case okf && okt:
		before, after = append(before, fo+"–"+to), append(after, fn+"–"+tn)
	case okt:
		before, after = append(before, "to "+to), append(after, "to "+tn)
	case okf:
		before, after = append(before, "from "+fo), append(after, "from "+fn)
	}
	if no, nn, ok := get("nobs"); ok {
		before, after = append(before, "N = "+no), append(after, "N = "+nn)
	} else if no, nn, ok := get("sample n"); ok {
		before, after = append(before, "N = "+no), append(after, "N = "+nn)
	}
	if len(before) == 0 {
		return fmt.Sprintf("%d sample values", len(chs)), "changed"
	}
	return strings.Join(before, ", "), strings.Join(after, ", ")
}
