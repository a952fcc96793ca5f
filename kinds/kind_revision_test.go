package kinds

import (
	"encoding/json"
	"reflect"
	"testing"

	"github.com/galley-econ/galley/directive/revision"
	"github.com/galley-econ/galley/engine"
)

// TestRevisionShapeMatchesResultsFile: the values the revision report
// compares are those a results file holds once read back.
func TestRevisionShapeMatchesResultsFile(t *testing.T) {
	p := copyDemo(t)
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	direct, err := revision.AsRevisionFile(doc, "x")
	if err != nil {
		t.Fatal(err)
	}
	b, _ := doc.ResultsJSON("build")
	var viaJSON struct {
		Results []struct {
			ID     string
			Values map[string]any
		}
	}
	json.Unmarshal(b, &viaJSON)
	if len(viaJSON.Results) != len(direct.Results) {
		t.Fatalf("%d results vs %d", len(direct.Results), len(viaJSON.Results))
	}
	for i, r := range viaJSON.Results {
		if !reflect.DeepEqual(r.Values, direct.Results[i].Values) {
			t.Errorf("%s: values differ from the results file's", r.ID)
		}
	}
}
