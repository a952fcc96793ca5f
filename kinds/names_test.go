package kinds

import (
	"testing"
)

// TestFormerKindName: a kind's former name is an error at the fence's
// line naming the current one, in a block and as a grid's kind.
func TestFormerKindName(t *testing.T) {
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
