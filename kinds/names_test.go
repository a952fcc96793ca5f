package kinds

import (
	"testing"
)

// TestFormerBandwidthSpellings: every kind with a bandwidth key, and a
// grid cell, refuses the former spellings short and long with an error
// at the key's line that names rule4 or rule12; the new spellings run.
func TestFormerBandwidthSpellings(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(120, -0.5))}
	cases := []struct {
		name, kind, body, line, now string
	}{
		{"pp", "pp", "id: a\nseries: y\nbandwidth: short\n", "paper.md:10:", "rule4"},
		{"kpss", "kpss", "id: a\nseries: y\ndet: c\nbandwidth: long\n", "paper.md:11:", "rule12"},
		{"po", "po", "id: a\ny: y\nx: [x]\nbandwidth: long\n", "paper.md:11:", "rule12"},
		{"gregory-hansen", "gregory-hansen", "id: a\ny: y\nx: [x]\nbandwidth: short\n", "paper.md:11:", "rule4"},
		{"unitroot-table", "unitroot-table", "id: a\nseries: [y, x]\ntests: [adf, pp]\nbandwidth: short\n", "paper.md:11:", "rule4"},
		{"grid cell", "grid", "id: a\nof: kpss\nseries: y\nover: {bandwidth: [rule4, long]}\n", "paper.md:11:", "rule12"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			runBad(t, front+"\n"+fence(c.kind, c.body), files, c.line, "now written "+c.now)
		})
	}
	// The new spellings run.
	p := writeProject(t, front+"\n"+fence("pp", "id: a\nseries: y\nbandwidth: rule12\n")+fence("po", "id: b\ny: y\nx: [x]\nbandwidth: rule4\n")+
		fence("grid", "id: g\nof: kpss\nseries: y\nover: {bandwidth: [rule4, rule12, auto-hfo]}\n"), files)
	res := runDoc(t, p)
	if res["a"].Values["bandwidth"] == nil || res["b"].Values["bandwidth"] == nil || res["g"].Table == nil {
		t.Errorf("new spellings: %v, %v", res["a"].Values["bandwidth"], res["b"].Values["bandwidth"])
	}
}

// TestFormerKindName: a kind's former name is an error at the fence's
// line naming the current one, in a block and as a grid's kind.
func TestFormerKindName(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": testCSV}
	runBad(t, front+"\n"+fence("descriptives", "id: d\nseries: [north]\n"), files,
		"paper.md:7:", `directive kind "descriptives" is now called "summary-stats"`)
	runBad(t, front+"\n"+fence("grid", "id: g\nof: descriptives\nseries: [north]\nover: {sample: [2004-01.., 2004-03..]}\n"), files,
		"paper.md:", `"descriptives" is now called "summary-stats"`)
	res := runDoc(t, writeProject(t, front+"\n"+fence("summary-stats", "id: d\nseries: [north]\n"), files))
	if res["d"].Kind != "summary-stats" || res["d"].Table == nil {
		t.Errorf("summary-stats: %+v", res["d"])
	}
}
