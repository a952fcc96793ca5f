package rules

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

// bandwidthFixture is testdata/fixtures/rules_bandwidth.json, written by
// testdata/scripts/rules_bandwidth.py (statsmodels 0.13.5 and numpy 1.24.2
// from Debian; the library line of the file names the versions).
type bandwidthFixture struct {
	Library string `json:"library"`
	Series  []struct {
		Name             string    `json:"name"`
		E                []float64 `json:"e"`
		HFOPrelim        int       `json:"hfo_prelim"`
		HFOLag           int       `json:"hfo_lag"`
		HFOB             float64   `json:"hfo_b"`
		NWBartlettPrelim int       `json:"nw_bartlett_prelim"`
		NWQSPrelim       int       `json:"nw_qs_prelim"`
		NWBartlett       float64   `json:"nw_bartlett"`
		NWQS             float64   `json:"nw_qs"`
		AndrewsBartlett  float64   `json:"andrews_bartlett"`
		AndrewsQS        float64   `json:"andrews_qs"`
	} `json:"series"`
	AndrewsMulti struct {
		W        [][]float64 `json:"w"`
		Bartlett float64     `json:"bartlett"`
		QS       float64     `json:"qs"`
	} `json:"andrews_multi"`
	Power map[string][]int `json:"power"`
	OLSIC []struct {
		Model    string  `json:"model"`
		NObs     int     `json:"nobs"`
		K        int     `json:"k"`
		SSR      float64 `json:"ssr"`
		AIC, BIC float64
	} `json:"ols_ic"`
	VARIC []struct {
		Trend  string  `json:"trend"`
		Lags   int     `json:"lags"`
		NObs   int     `json:"nobs"`
		Params int     `json:"params"`
		LogDet float64 `json:"logdet"`
		AIC    float64 `json:"aic"`
		BIC    float64 `json:"bic"`
		HQIC   float64 `json:"hqic"`
	} `json:"var_ic"`
}

func loadFixture(t *testing.T) *bandwidthFixture {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/rules_bandwidth.json")
	if err != nil {
		t.Fatal(err)
	}
	var f bandwidthFixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.Series) == 0 || len(f.Power) != 4 || len(f.OLSIC) == 0 || len(f.VARIC) == 0 || len(f.AndrewsMulti.W) == 0 {
		t.Fatal("incomplete fixture rules_bandwidth.json")
	}
	return &f
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}
