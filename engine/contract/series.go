package contract

import (
	"encoding/binary"
	"errors"
	"math"
	"time"

	"github.com/galley-econ/galley/analysis/series"
)

// Dated is a dated series a result carries for other directives and for
// figures: a regression's residuals, actual and fitted values, or an
// estimated cointegrating relation β'ỹ_t.
type Dated struct {
	Dates  []series.Date
	Values []float64
}

// ViewDated is a Dated over dates and values themselves, not copies:
// for slices nobody changes once made (a data set's dates, an estimator's
// residuals), where copying cost a million-row series 40 MB of new memory.
// Their capacity is cut to their length, so that an append to the
// series cannot write into what follows.
func ViewDated(dates []series.Date, values []float64) Dated {
	return Dated{Dates: dates[:len(dates):len(dates)], Values: values[:len(values):len(values)]}
}

// ResultsForm is the series as the results file holds it:
// {"dates": ["2004-01", …], "values": […]}, dates in the canonical text
// of series.Date.String.
func (d Dated) ResultsForm() map[string]any { return d.resultsForm(dateTexts(d.Dates)) }

// ResultsForms is ResultsForm of each series, the text of a date axis
// they share (the same dates in the same memory, as the relations of
// one system) made once and shared.
func ResultsForms(ds []Dated) []map[string]any {
	out := make([]map[string]any, len(ds))
	var last []series.Date
	var texts []string
	for i, d := range ds {
		if len(d.Dates) == 0 || len(last) != len(d.Dates) || &last[0] != &d.Dates[0] {
			texts, last = dateTexts(d.Dates), d.Dates
		}
		out[i] = d.resultsForm(texts)
	}
	return out
}

// resultsForm is ResultsForm with the dates' text given.
func (d Dated) resultsForm(texts []string) map[string]any {
	return map[string]any{"dates": texts, "values": append([]float64(nil), d.Values...)}
}

// dateTexts is the canonical text of each date.
func dateTexts(dates []series.Date) []string {
	out := make([]string, len(dates))
	for i, dt := range dates {
		out[i] = dt.String()
	}
	return out
}

// At maps each date's canonical text to its value.
func (d Dated) At() map[string]float64 {
	m := make(map[string]float64, len(d.Dates))
	for i, dt := range d.Dates {
		m[dt.String()] = d.Values[i]
	}
	return m
}

// GobEncode stores the series for the result cache: every date by its
// frequency and its year and period (a daily date by its day number,
// which gob could not see), the values by their bits; nil and empty
// kept apart.
func (d Dated) GobEncode() ([]byte, error) {
	b := make([]byte, 0, 16+len(d.Dates)*8+len(d.Values)*8) // a date takes at most 8 bytes but for far-off years
	b = appendLen(b, d.Dates == nil, len(d.Dates))
	for _, dt := range d.Dates {
		b = binary.AppendUvarint(b, uint64(dt.Freq))
		if dt.Freq == series.Daily {
			b = binary.AppendVarint(b, dt.Day().Unix()/86400)
			continue
		}
		b = binary.AppendVarint(binary.AppendVarint(b, int64(dt.Year)), int64(dt.Sub))
	}
	b = appendLen(b, d.Values == nil, len(d.Values))
	for _, v := range d.Values {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(v))
	}
	return b, nil
}

// GobDecode reads what GobEncode wrote.
func (d *Dated) GobDecode(b []byte) error {
	bad := errors.New("contract: malformed dated series")
	n, isNil, b, ok := readLen(b)
	if !ok || n > len(b) {
		return bad
	}
	if !isNil {
		d.Dates = make([]series.Date, n)
	}
	for i := 0; i < n; i++ {
		f, k := binary.Uvarint(b)
		if k <= 0 {
			return bad
		}
		b = b[k:]
		if series.Freq(f) == series.Daily {
			day, k := binary.Varint(b)
			if k <= 0 {
				return bad
			}
			b = b[k:]
			d.Dates[i] = series.DailyDate(time.Unix(day*86400, 0).UTC())
			continue
		}
		y, k := binary.Varint(b)
		if k <= 0 {
			return bad
		}
		b = b[k:]
		s, k := binary.Varint(b)
		if k <= 0 {
			return bad
		}
		b = b[k:]
		d.Dates[i] = series.Date{Freq: series.Freq(f), Year: int(y), Sub: int(s)}
	}
	n, isNil, b, ok = readLen(b)
	if !ok || n != len(b)/8 || len(b)%8 != 0 {
		return bad
	}
	if !isNil {
		d.Values = make([]float64, n)
	}
	for i := 0; i < n; i++ {
		d.Values[i] = math.Float64frombits(binary.LittleEndian.Uint64(b[8*i:]))
	}
	return nil
}

// appendLen writes a length, 0 standing for nil and n+1 for n.
func appendLen(b []byte, isNil bool, n int) []byte {
	if isNil {
		return append(b, 0)
	}
	return binary.AppendUvarint(b, uint64(n)+1)
}

func readLen(b []byte) (n int, isNil bool, rest []byte, ok bool) {
	v, k := binary.Uvarint(b)
	if k <= 0 || v > uint64(len(b)) {
		return 0, false, nil, false
	}
	if v == 0 {
		return 0, true, b[k:], true
	}
	return int(v - 1), false, b[k:], true
}
