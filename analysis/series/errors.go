package series

import (
	"strconv"
	"strings"
)

// DataError is a problem in the data or in its use, located as
// precisely as is known: the source file, the line (for spreadsheets,
// the row) and the column. It reads
//
//	FILE:LINE: column X: msg
//
// with the unknown parts left out ("FILE: msg", "line 7: column X: msg").
type DataError struct {
	Source string // file name as given by the caller; "" if unknown
	Line   int    // 1-based source line or sheet row; 0 if unknown
	Column string // column name; "" if unknown or not applicable
	Msg    string
}

func (e *DataError) Error() string {
	var b strings.Builder
	switch {
	case e.Source != "" && e.Line > 0:
		b.WriteString(e.Source)
		b.WriteByte(':')
		b.WriteString(strconv.Itoa(e.Line))
		b.WriteString(": ")
	case e.Source != "":
		b.WriteString(e.Source)
		b.WriteString(": ")
	case e.Line > 0:
		b.WriteString("line ")
		b.WriteString(strconv.Itoa(e.Line))
		b.WriteString(": ")
	}
	if e.Column != "" {
		b.WriteString("column ")
		b.WriteString(e.Column)
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}
