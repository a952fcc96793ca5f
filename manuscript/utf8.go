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

// FirstControlChar finds the first control character other than tab,
// line feed and carriage return (C0, DEL and C1): its 1-based line and
// the character, or line 0 when there is none.
func FirstControlChar(b []byte) (int, rune) {
	line := 1
	for _, r := range string(b) {
		switch {
		case r == '\n':
			line++
		case r == '\t' || r == '\r':
		case r < 0x20 || r == 0x7f || r >= 0x80 && r < 0xa0:
			return line, r
		}
	}
	return 0, 0
}
