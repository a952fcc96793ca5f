package manuscript

import (
	"unicode/utf8"
)

func Utf8Valid(b []byte) bool { return utf8.Valid(b) }

func FirstBadUTF8Line(b []byte) int {
	line := 1
	for len(b) > 0 {
		r, size := utf8.DecodeRune(b)
		if r == utf8.RuneError && size <= 1 {
			return line
		}
		if r == '\n' {
			line++
		}
		b = b[size:]
	}
	return line
}
