package grid

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine/contract"
)

// Readable headers: a varied key and its values as a reader of the table
// says them ("Deterministic terms", "constant and trend", "from 1959Q1"),
// and a shown value in words ("trace, r = 0"). Keys and values the grid
// has no words for are shown as written.

// keyWords are the headers of the keys most grids vary, by key.
var keyWords = map[string]string{
	"det":       "Deterministic terms",
	"lags":      "Lags",
	"sample":    "Sample",
	"se":        "Standard errors",
	"bandwidth": "Bandwidth",
	"x":         "Regressors",
	"y":         "Dependent variable",
	"series":    "Series",
	"rank":      "Rank",
	"break":     "Break in",
	"trim":      "Trimming",
}

// keyHeader is the header of a varied key.
func keyHeader(key string) string {
	if w, ok := keyWords[key]; ok {
		return w
	}
	return key
}

// keyPhrase is a varied key inside a sentence of the note: "the
// deterministic terms"; a key without words is given as written.
func keyPhrase(key string) string {
	w, ok := keyWords[key]
	if !ok {
		return key
	}
	return "the " + strings.ToLower(w[:1]) + w[1:]
}

// valueLabel is one value of a varied key as a header: the deterministic
// case in words, a sample as a span of dates, a standard-error type by
// its name; other values as written.
func valueLabel(key, written string) string {
	switch key {
	case "det":
		if w, ok := detWords(written); ok {
			return w
		}
	case "sample":
		if from, to, ok := strings.Cut(written, ".."); ok {
			from, to = strings.TrimSpace(from), strings.TrimSpace(to)
			switch {
			case from != "" && to != "":
				return from + "–" + to
			case from != "":
				return "from " + from
			case to != "":
				return "to " + to
			}
		}
	case "se":
		if cv, err := ols.ParseCov(written); err == nil {
			switch cv.Kind {
			case ols.HC1:
				return "HC1"
			case ols.HAC:
				return fmt.Sprintf("HAC, %d lags", cv.Lags)
			default:
				return "conventional"
			}
		}
	}
	return written
}

// detWords is a deterministic case of the single-equation kinds (n, c,
// ct, ctt) in the words of the tables' notes (contract.DetNames); false
// for a spelling of another family, which is then shown as written.
func detWords(s string) (string, bool) {
	cs, err := critical.ParseCase(s)
	if err != nil {
		return "", false
	}
	w, ok := contract.DetNames[cs]
	return w, ok
}

// valueWords name the values a grid may show, by their first part.
var valueWords = map[string]string{
	"trace":     "trace statistic",
	"maxeig":    "maximum-eigenvalue statistic",
	"eig":       "eigenvalue",
	"pvalue":    "p-value",
	"nobs":      "observations",
	"lags":      "lags",
	"bandwidth": "bandwidth",
	"r2":        "R²",
	"rank":      "rank",
	"pu":        "Pu statistic",
	"pz":        "Pz statistic",
	"lc":        "Hansen Lc statistic",
}

// rankIndexed are the values listed by the rank under the null, r = 0, 1, ….
var rankIndexed = []string{"trace", "maxeig"}

// showWords is a shown value in words: "trace statistic, r = 0",
// "eigenvalue 1", "Hansen Lc statistic" (lc.stat); a path without words is given as written.
func showWords(parts []string) string {
	if len(parts) == 0 {
		return ""
	}
	w, ok := valueWords[parts[0]]
	if !ok {
		return strings.Join(parts, ".")
	}
	if len(parts) == 2 {
		if i, err := strconv.Atoi(parts[1]); err == nil && i >= 0 {
			if slices.Contains(rankIndexed, parts[0]) {
				return fmt.Sprintf("%s, r = %d", w, i)
			}
			return fmt.Sprintf("%s %d", w, i+1)
		}
	}
	if len(parts) == 2 && parts[1] == "stat" {
		return w
	}
	if len(parts) > 1 {
		return w + " (" + strings.Join(parts[1:], ".") + ")"
	}
	return w
}
