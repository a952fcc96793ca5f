package dataio

import (
	"strings"

	"github.com/xuri/nfp"
)

// builtinDateFmt reports whether a built-in number format (ECMA-376
// part 1, 18.8.30) shows a calendar date: ids 14–17 and 22, and the
// East Asian date formats 27–36 and 50–58. Pure time formats are not
// dates.
func builtinDateFmt(id int) bool {
	return (id >= 14 && id <= 17) || id == 22 || (id >= 27 && id <= 36) || (id >= 50 && id <= 58)
}

// dateFormatCode reports whether a custom number format code shows a
// date. The code is split into tokens by github.com/xuri/nfp (the
// parser excelize itself uses), which sets quoted text, escapes and
// [...] sections apart; the first section decides. It shows a date if
// it has a year or day part (y, d), or a month part (m) without hours
// or seconds (else m is minutes).
func dateFormatCode(code string) bool {
	p := nfp.NumberFormatParser()
	secs := p.Parse(code)
	if len(secs) == 0 {
		return false
	}
	var y, d, m, hs bool
	for _, tk := range secs[0].Items {
		if tk.TType != nfp.TokenTypeDateTimes && tk.TType != nfp.TokenTypeElapsedDateTimes {
			continue
		}
		v := strings.ToLower(tk.TValue)
		y = y || strings.Contains(v, "y")
		d = d || strings.Contains(v, "d")
		m = m || strings.Contains(v, "m")
		hs = hs || strings.ContainsAny(v, "hs")
	}
	return y || d || (m && !hs)
}
