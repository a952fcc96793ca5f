package kinds

import (
	"reflect"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestECMActualFitted: an actual-vs-fitted figure of an ecm result draws
// the model's own dependent variable and fitted values.
func TestECMActualFitted(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	byID := map[string]*engine.Result{}
	for _, r := range doc.Results() {
		byID[r.ID] = r
	}
	fig, ecm := byID["ecmfit"], byID["ecm_north"]
	if fig == nil || fig.Figure == nil || ecm == nil {
		t.Fatal("the demo lacks the ecmfit figure or the ecm_north result")
	}
	ss, _ := fig.Values["series"].([]map[string]any)
	if len(ss) != 2 {
		t.Fatalf("series drawn: %v", fig.Values["series"])
	}
	n := ecm.Values["nobs"].(int)
	if ss[0]["n"] != n || ss[1]["n"] != n {
		t.Errorf("drawn %v and %v points, the model has %d", ss[0]["n"], ss[1]["n"], n)
	}
	fitted := ecm.Values["fitted"].(map[string]any)
	if !reflect.DeepEqual(fitted["dates"].([]string)[0], ss[1]["from"]) {
		t.Errorf("fitted series starts %v, the model %v", ss[1]["from"], fitted["dates"].([]string)[0])
	}
	// An ecm result cannot feed a stability plot, which needs the design.
	bad := writeProject(t, front+"\n"+fence("engle-granger", "id: eg\ndata: grid\ny: north\nx: [fuel]\nlags: 0\n")+
		fence("ecm", "id: e\nfrom: eg\nlags: 0\ndiagnostics: []\n")+fence("figure", "id: f\nplot: cusum\nof: e\n"),
		map[string]string{"data.csv": testCSV})
	d, err := engine.Parse(bad, engine.Options{})
	if err == nil {
		err = d.Check()
	}
	if err == nil {
		t.Fatal("a cusum of an ecm result was accepted")
	}
}
