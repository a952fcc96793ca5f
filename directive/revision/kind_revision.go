package revision

import (
	"fmt"
	"math"
	"slices"
	"sort"
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
	Max     int      `yaml:"max"`
	Tol     float64  `yaml:"tol"`
}

var revisionShows = []string{"conclusions", "samples", "numbers"}

func init() {
	engine.Register(engine.Kind{
		Name:    "revision",
		Summary: "what changes when the paper is built on another vintage of its data",
		New:     func() engine.Directive { return &revisionSpec{} },
		Fields:  []string{"against", "flips", "flipped", "moved", "samples", "inputs", "unchanged"},
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
		return &engine.Result{Values: map[string]any{"against": s.Against, "flips": 0, "flipped": nil, "moved": 0, "samples": nil, "inputs": nil, "unchanged": 0}}, nil
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
	rep := revision.Compare(oldF, newF, revision.Options{Tol: s.Tol, Stars: c.Stars()})
	return s.table(c, rep), nil
}

func (s *revisionSpec) table(c *engine.Context, rep *revision.Report) *engine.Result {
	t := &table.Table{Stub: 2, Head: [][]table.Cell{{table.T("Result"), table.T("What"), table.T("Before"), table.T("After")}}}
	var flipped, samples []map[string]any
	if s.shows("conclusions") {
		flipped = s.conclusions(t, rep)
	}
	if s.shows("samples") {
		samples = s.samples(t, rep)
	}
	moved := s.moved(t, rep)
	var inputs []string
	for _, in := range rep.InputsChanged {
		inputs = append(inputs, in.Path)
	}
	note := fmt.Sprintf("Before: the paper built on the data vintage %q; after: %s. %d results are unchanged and %d changed; %d conclusions changed.",
		s.Against, rep.New.Path, rep.Unchanged, len(rep.Items), rep.Flips())
	if len(inputs) > 0 {
		note += " Data files that differ: " + strings.Join(inputs, ", ") + "."
	}
	t.Notes = []string{note, "A conclusion is a test's rejection at 5%, a coefficient's star count, an order-of-integration verdict, a cointegrating rank, or the sign of an adjustment coefficient. Numbers are compared at full precision; the largest relative changes are listed."}
	vals := map[string]any{
		"against": s.Against, "flips": rep.Flips(), "flipped": flipped, "moved": moved,
		"samples": samples, "inputs": inputs, "unchanged": rep.Unchanged,
	}
	return &engine.Result{Table: t, Values: vals}
}

// block starts a titled block of the report table.
func block(t *table.Table, title string) {
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.Span(title, 4)}, RuleAbove: len(t.Body) > 0})
}

// none marks an empty block.
func none(t *table.Table) {
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.Span("none", 4)}})
}

// conclusions lists the conclusions that changed.
func (s *revisionSpec) conclusions(t *table.Table, rep *revision.Report) []map[string]any {
	block(t, "Conclusions that changed")
	var flipped []map[string]any
	for _, it := range rep.Items {
		for _, f := range it.Flips {
			t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(it.ID), table.T(f.What), table.T(f.Old), table.T(f.New)}})
			flipped = append(flipped, map[string]any{"id": it.ID, "what": f.What, "old": f.Old, "new": f.New})
		}
	}
	if len(flipped) == 0 {
		none(t)
	}
	return flipped
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
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(it.ID), table.T("sample"), table.T(before), table.T(after)}})
		for _, ch := range it.Samples {
			samples = append(samples, map[string]any{"id": it.ID, "what": ch.What, "old": ch.Old, "new": ch.New})
		}
		n++
	}
	if n == 0 {
		none(t)
	}
	return samples
}

// moved lists the numbers that moved most (when shown) and returns how
// many moved.
func (s *revisionSpec) moved(t *table.Table, rep *revision.Report) int {
	max := s.Max
	if max == 0 {
		max = 12
	}
	type mv struct {
		id string
		ch revision.Change
	}
	var moved, ranked []mv
	for _, it := range rep.Items {
		for _, ch := range it.Moved {
			moved = append(moved, mv{it.ID, ch})
			// p-values are left out of the ranking: their relative changes
			// near zero say little, and their conclusions are listed above.
			if !strings.HasSuffix(ch.What, " p") && !strings.HasSuffix(ch.What, "pvalue") {
				ranked = append(ranked, mv{it.ID, ch})
			}
		}
	}
	sort.SliceStable(ranked, func(i, j int) bool { return math.Abs(ranked[i].ch.Rel) > math.Abs(ranked[j].ch.Rel) })
	if s.shows("numbers") {
		block(t, fmt.Sprintf("Numbers that moved most (%d of %d that moved; p-values aside)", min(max, len(ranked)), len(moved)))
		for _, m := range ranked[:min(max, len(ranked))] {
			t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(m.id), table.T(fmt.Sprintf("%s (%+.1f%%)", m.ch.What, 100*m.ch.Rel)), table.T(m.ch.Old), table.T(m.ch.New)}})
		}
		if len(moved) == 0 {
			none(t)
		}
	}
	return len(moved)
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
