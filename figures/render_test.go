package figures

import (
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

func TestRenderExamples(t *testing.T) {
	ss := macro(t, "realgdp", "realcons", "realinv", "unemp", "infl")
	fig, err := Lines(ss[:3], Options{YLabel: "billions of 2005 dollars",
		Shade: []Window{{From: series.Date{Freq: series.Quarterly, Year: 1973, Sub: 4}, To: series.Date{Freq: series.Quarterly, Year: 1975, Sub: 1}},
			{From: series.Date{Freq: series.Quarterly, Year: 2007, Sub: 4}, To: series.Date{Freq: series.Quarterly, Year: 2009, Sub: 2}}}})
	if err != nil {
		t.Fatal(err)
	}
	save(t, fig, "lines")
	fig, err = Panels([]Panel{{Series: ss[3:4], YLabel: "percent"}, {Series: ss[4:5], YLabel: "percent a year"}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	save(t, fig, "panels")
}
