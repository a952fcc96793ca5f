package johansen

import (
	"fmt"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
)

// Dummies and conditioning regressors of a system (the keys seasonal,
// impulse, shift and extra), turned into the unrestricted and restricted
// columns of johansen.Extra.
//
//   - seasonal: true — s − 1 centred seasonal dummies (s = 4 for quarterly,
//     12 for monthly data), 1 − 1/s in season j and −1/s otherwise;
//     unrestricted. They sum to zero over a year, so they move no mean and
//     leave the constant's role (and the case) as it was.
//   - impulse: dates — 1 at the date, 0 elsewhere; unrestricted.
//   - shift: dates — a step, 0 before the date and 1 from it. Where the
//     constant lies in the relations (case rc) or the trend does (rt), a
//     level shift of the series lies there too: the step enters β lagged
//     once, as y does, and the impulses Δstep_t, …, Δstep_{t−k} (the date
//     and the k periods after it) enter unrestricted (Johansen, Mosconi and
//     Nielsen 2000, §2). Where the constant is unrestricted (c, ct) the step
//     is unrestricted as well, shifting the drift with the level. Case n
//     has no level to shift.
//   - extra: stationary series entering each equation at time t.

// shiftRestricted says whether step dummies lie in the relations.
func shiftRestricted(cs johansen.Case) bool { return cs == johansen.RC || cs == johansen.RT }

// checkDummies validates the dummy keys that need no data and adds the
// restricted steps to the coefficient names of β.
func (k *SystemKeys) checkDummies(c *engine.Context, st *sysSettings) error {
	for i, s := range k.Impulse {
		if _, err := series.ParseDate(s); err != nil {
			return c.ItemErrorf("impulse", i, "impulse: %q is not a date: %v", s, err)
		}
	}
	seen := map[string]bool{}
	for i, s := range k.Shift {
		d, err := series.ParseDate(s)
		if err != nil {
			return c.ItemErrorf("shift", i, "shift: %q is not a date: %v", s, err)
		}
		if seen[d.String()] {
			return c.ItemErrorf("shift", i, "shift: %s is named twice", d)
		}
		seen[d.String()] = true
		if st.Case == johansen.N {
			return c.Errorf("shift", "shift: case n has no deterministic terms, so there is no level to shift; use rc (the shift then lies in the relations) or c")
		}
		if shiftRestricted(st.Case) {
			st.Coefs = append(st.Coefs, "shift("+d.String()+")")
		}
	}
	for i, e := range k.Extra {
		for _, s := range k.Series {
			if normName(s) == normName(e) {
				return c.ItemErrorf("extra", i, "extra: %q is one of the series; an extra regressor conditions the system from outside it", e)
			}
		}
	}
	return nil
}

// sysExtra holds the columns built from the data, with the names the
// tables and values use.
type sysExtra struct {
	x          johansen.Extra
	labels     []string // unrestricted columns, for tables
	keys       []string // unrestricted columns, for values
	restricted []string // restricted columns (as in sysSettings.Coefs)
	notes      []string
	parts      []string // what the model includes, in words (dummyParts)
}

// simText says what the simulated systems of crit: simulate include
// beyond the case ("" when nothing).
func (x *sysExtra) simText() string { return strings.Join(x.parts, ", ") }

// buildExtra makes the dummy and extra columns over the rows of d (whose
// first len(k.Series) columns are the series and the rest the extra
// regressors) for a VECM with lags lagged differences.
func (k *SystemKeys) buildExtra(c *engine.Context, d *engine.Data, cs johansen.Case, lags int) (*sysExtra, error) {
	b := &extraBuilder{d: d, n: d.N(), first: lags + 1, out: &sysExtra{}}
	if err := k.addSeasonal(c, b); err != nil {
		return nil, err
	}
	for i, text := range k.Impulse {
		r, err := b.row(c, "impulse", i, text)
		if err != nil {
			return nil, err
		}
		b.addU("Impulse "+d.Dates[r].String(), "impulse:"+d.Dates[r].String(), b.unit(r))
	}
	if err := k.addShifts(c, b, cs, lags); err != nil {
		return nil, err
	}
	ks := len(k.Series)
	for j, e := range k.Extra {
		b.addU(e, e, d.Cols[ks+j])
	}
	out := b.out
	dup := map[string]bool{}
	for _, key := range out.keys {
		if dup[key] {
			return nil, c.Errorf("impulse", "the dummies include %s twice (an impulse named at a date that a shift's impulses already cover?)", key)
		}
		dup[key] = true
	}
	out.x = johansen.Extra{Unrestricted: b.dense(b.ucols), Restricted: b.dense(b.rcols)}
	out.parts = k.dummyParts(cs)
	out.notes = k.dummyNotes(cs, out.parts)
	return out, nil
}

// extraBuilder collects the unrestricted and restricted columns of the
// dummies and extra regressors over the n observations of d.
type extraBuilder struct {
	d            *engine.Data
	n            int
	first        int // first row of the estimation sample
	out          *sysExtra
	ucols, rcols [][]float64
}

// addU adds an unrestricted column with its label and short-run term.
func (b *extraBuilder) addU(label, key string, v []float64) {
	b.ucols = append(b.ucols, v)
	b.out.labels = append(b.out.labels, label)
	b.out.keys = append(b.out.keys, key)
}

// row returns the observation of the date text, item i of key, or an
// error when it is not in the sample or falls among the first
// observations, which only supply lags.
func (b *extraBuilder) row(c *engine.Context, key string, i int, text string) (int, error) {
	d, first := b.d, b.first
	dt, _ := series.ParseDate(text)
	for r, x := range d.Dates {
		if x.Equal(dt) {
			if r < first {
				return 0, c.ItemErrorf(key, i, "%s: %s falls in the first %d observations, which only supply lags (the estimation sample starts %s)", key, dt, first, d.Dates[first])
			}
			return r, nil
		}
	}
	return 0, c.ItemErrorf(key, i, "%s: %s is not a date of the sample %s (%s data)", key, text, d.Range(), d.Freq)
}

// unit returns the impulse column that is 1 at observation r.
func (b *extraBuilder) unit(r int) []float64 {
	v := make([]float64, b.n)
	if r < b.n {
		v[r] = 1
	}
	return v
}

// dense returns the columns as an n×len(cols) matrix, nil when there are
// none.
func (b *extraBuilder) dense(cols [][]float64) *mat.Dense {
	if len(cols) == 0 {
		return nil
	}
	m := mat.NewDense(b.n, len(cols), nil)
	for j, v := range cols {
		m.SetCol(j, v)
	}
	return m
}

// addSeasonal adds the s − 1 centred seasonal dummies of seasonal: true,
// or returns an error for data that are neither quarterly nor monthly.
func (k *SystemKeys) addSeasonal(c *engine.Context, b *extraBuilder) error {
	if !k.Seasonal {
		return nil
	}
	d, n := b.d, b.n
	s := d.Freq.PerYear()
	if s != 4 && s != 12 {
		return c.Errorf("seasonal", "seasonal: centred seasonal dummies need quarterly or monthly data; these are %s", d.Freq)
	}
	for j := 1; j < s; j++ {
		v := make([]float64, n)
		for i, dt := range d.Dates {
			v[i] = -1 / float64(s)
			if dt.Sub == j {
				v[i] += 1
			}
		}
		name := fmt.Sprintf("Q%d", j)
		if s == 12 {
			name = fmt.Sprintf("M%02d", j)
		}
		b.addU("Season "+name+" (centred)", "season:"+name, v)
	}
	return nil
}

// addShifts adds the step dummies of shift:: restricted, with impulses at
// the date and the lags periods after it, in cases rc and rt; otherwise
// unrestricted.
func (k *SystemKeys) addShifts(c *engine.Context, b *extraBuilder, cs johansen.Case, lags int) error {
	d, n := b.d, b.n
	for i, text := range k.Shift {
		r, err := b.row(c, "shift", i, text)
		if err != nil {
			return err
		}
		step := make([]float64, n)
		for j := r; j < n; j++ {
			step[j] = 1
		}
		ds := d.Dates[r].String()
		if shiftRestricted(cs) {
			b.rcols = append(b.rcols, step)
			b.out.restricted = append(b.out.restricted, "shift("+ds+")")
			for l := 0; l <= lags && r+l < n; l++ {
				b.addU("Impulse "+d.Dates[r+l].String()+" (shift)", "impulse:"+d.Dates[r+l].String(), b.unit(r+l))
			}
		} else {
			b.addU("Shift "+ds, "shift:"+ds, step)
		}
	}
	return nil
}

// dummyParts names the model's dummies and extra regressors in words.
func (k *SystemKeys) dummyParts(cs johansen.Case) []string {
	var parts []string
	if k.Seasonal {
		parts = append(parts, "centred seasonal dummies")
	}
	if len(k.Impulse) > 0 {
		parts = append(parts, "impulse dummies")
	}
	if len(k.Shift) > 0 {
		if shiftRestricted(cs) {
			parts = append(parts, "step dummies inside the relations (lagged once, with unrestricted impulses at the break and the k periods after it)")
		} else {
			parts = append(parts, "unrestricted step dummies")
		}
	}
	if len(k.Extra) > 0 {
		parts = append(parts, "stationary regressors ("+strings.Join(k.Extra, ", ")+")")
	}
	return parts
}

// dummyNotes say what the dummies do to the rank tests: with the tables,
// how far the tables hold; with crit: simulate, that the critical values
// are simulated for this design.
func (k *SystemKeys) dummyNotes(cs johansen.Case, parts []string) []string {
	if len(parts) == 0 {
		return nil
	}
	n := "The model includes " + strings.Join(parts, ", ") + ". "
	if strings.EqualFold(strings.TrimSpace(k.Crit), "simulate") {
		n += "The critical values are simulated for this design: the simulated systems carry the same dummies at the same observations, restricted or unrestricted as here"
		if len(k.Extra) > 0 {
			n += ", and the stationary regressors at their observed values, held fixed in every replication"
		}
		n += ", so they follow the model's null distribution at this sample size"
		if len(k.Shift) > 0 {
			n += ", including the shift that step dummies cause in it (Johansen, Mosconi and Nielsen 2000)"
			if !shiftRestricted(cs) {
				n += "; in the simulated walks the steps' effects are zero, so the drift has no break"
			}
		}
		return []string{n + "."}
	}
	if len(k.Shift) > 0 {
		n += "Step dummies change the asymptotic distribution of the rank statistics (it depends on where the breaks fall; Johansen, Mosconi and Nielsen 2000), so the tabulated critical values, which assume no breaks, are only a guide."
	} else {
		n += "Centred seasonal and impulse dummies and stationary regressors leave the asymptotic distribution of the rank statistics unchanged, but they shift it in finite samples, so the tabulated critical values hold only approximately."
	}
	return []string{n}
}

// extraRE finds the analysis package's "extra regressor N" in an error.
func nameExtra(err error, ex *sysExtra) error {
	msg := err.Error()
	for j := len(ex.labels) - 1; j >= 0; j-- {
		msg = strings.ReplaceAll(msg, fmt.Sprintf("unrestricted extra regressor %d", j), "the regressor "+ex.labels[j])
	}
	for j := len(ex.restricted) - 1; j >= 0; j-- {
		msg = strings.ReplaceAll(msg, fmt.Sprintf("restricted extra regressor %d", j), "the restricted "+ex.restricted[j])
	}
	return fmt.Errorf("%s", msg)
}
