// Command gen writes the invented data of the gridlink demo paper: two
// electricity price zones ("North" and "South") joined by an
// interconnector, and the cost index of the fuel that sets the marginal
// price in North. Monthly, 2004-01 to 2025-12 (T = 264). Nothing here is
// real; the process is chosen so that the paper's results can be judged
// against known truths.
//
// The generating process, in logs (f fuel, n North, s South):
//
//	f_t = f_{t−1} + 0.002 + e^f_t,                         e^f ~ N(0, 0.060²)
//	Δn_t = −0.25 (n_{t−1} − 0.40 − 0.80 f_{t−1}) + 0.50 Δf_t + e^n_t,  e^n ~ N(0, 0.025²)
//	Δs_t = −0.35 (s_{t−1} − n_{t−1} − 0.05) + e^s_t,       e^s ~ N(0, 0.030²)
//
// so every series is I(1), there is one common stochastic trend (fuel)
// and two cointegrating relations (rank 2 among the three series): North
// on fuel with long-run coefficient 0.80 and adjustment speed −0.25
// (half-life ln 0.5 / ln 0.75 ≈ 2.41 months), and South on North with
// coefficient 1 (arbitrage across the interconnector) and adjustment
// speed −0.35. The file holds levels: fuel is an index (2004-01 ≈ 100),
// north and south are prices per MWh.
//
// The seed pair (2, 2025) is the first of (1, 2025), (2, 2025), … whose draw
// gives no ADF rejection of a unit root in levels at the 10% level (constant,
// and constant and trend; lags by AIC) and a KPSS rejection of level
// stationarity at 5%: a typical draw. On roughly a third of seeds a random
// walk of 264 months happens to revert, and a test rejects the true unit
// root, as tests at their size do.
//
// Usage: go run ./examples/gridlink/gen (writes data/gridlink.csv and data/gridlink-first.csv)
package main

import (
	"bytes"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
)

// Parameters of the generating process (see the package comment).
const (
	seed1, seed2 = 2, 2025
	start        = 2004
	months       = 22 * 12
	burn         = 120 // discarded start-up months

	fuelDrift, fuelSD  = 0.002, 0.060
	northMu, northBeta = 0.40, 0.80
	northAlpha         = -0.25
	northGamma         = 0.50
	northSD            = 0.025
	southMu            = 0.05
	southAlpha         = -0.35
	southSD            = 0.030
)

// Generate returns the three log series over months observations.
func Generate(r *rand.Rand) (f, n, s []float64) {
	total := burn + months
	f, n, s = make([]float64, total), make([]float64, total), make([]float64, total)
	f[0] = math.Log(100)
	n[0] = northMu + northBeta*f[0]
	s[0] = n[0] + southMu
	for t := 1; t < total; t++ {
		ef, en, es := fuelSD*r.NormFloat64(), northSD*r.NormFloat64(), southSD*r.NormFloat64()
		f[t] = f[t-1] + fuelDrift + ef
		df := f[t] - f[t-1]
		n[t] = n[t-1] + northAlpha*(n[t-1]-northMu-northBeta*f[t-1]) + northGamma*df + en
		s[t] = s[t-1] + southAlpha*(s[t-1]-n[t-1]-southMu) + es
	}
	// Rebase so that fuel starts near 100 after the burn-in.
	shift := f[burn] - math.Log(100)
	for t := range f {
		f[t] -= shift
		n[t] -= northBeta * shift
		s[t] -= northBeta * shift
	}
	return f[burn:], n[burn:], s[burn:]
}

// The first release. The data file above is the revised vintage; the
// first release of the same data, published before the revision, ended in
// 2025-06 and carried provisional zone prices for 2023-01 to 2025-06,
// which the revision replaced:
//
//	provisional = revised · exp(u),   u ~ N(0, 0.02²), independent,
//
// drawn from their own seeded stream (seeds revSeed1, revSeed2). The fuel
// index was not revised.
const (
	revSeed1, revSeed2 = 7, 2026
	firstMonths        = months - 6
	provisionalFrom    = 19 * 12 // 2023-01
	revisionSD         = 0.02
)

func writeCSV(path string, f, n, s []float64, count int, noise func(t int) (float64, float64)) error {
	var b bytes.Buffer
	b.WriteString("date,north,south,fuel\n")
	for t := 0; t < count; t++ {
		un, us := noise(t)
		fmt.Fprintf(&b, "%d-%02d,%.4f,%.4f,%.4f\n", start+t/12, t%12+1, math.Exp(n[t]+un), math.Exp(s[t]+us), math.Exp(f[t]))
	}
	return os.WriteFile(path, b.Bytes(), 0o644)
}

func main() {
	out := flag.String("out", "examples/gridlink/data/gridlink.csv", "output CSV (the revised vintage)")
	first := flag.String("first", "examples/gridlink/data/gridlink-first.csv", "output CSV of the first release")
	flag.Parse()
	r := rand.New(rand.NewPCG(seed1, seed2))
	f, n, s := Generate(r)
	none := func(int) (float64, float64) { return 0, 0 }
	if err := writeCSV(*out, f, n, s, months, none); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	rr := rand.New(rand.NewPCG(revSeed1, revSeed2))
	provisional := func(t int) (float64, float64) {
		if t < provisionalFrom {
			return 0, 0
		}
		return revisionSD * rr.NormFloat64(), revisionSD * rr.NormFloat64()
	}
	if err := writeCSV(*first, f, n, s, firstMonths, provisional); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}
