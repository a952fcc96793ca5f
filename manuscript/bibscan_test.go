package manuscript

import (
	"bytes"
	"math/rand/v2"
	"regexp"
	"testing"
)

// TestBibScannersMatchRegexps: andAt and blankComments do what the
// regular expressions `\s+and\s+` (matched at a position) and
// `(?m)^[ \t]*%.*$` (replaced by "") do, on random text made of the
// characters that matter.
func TestBibScannersMatchRegexps(t *testing.T) {
	andRE := regexp.MustCompile(`\s+and\s+`)
	commentRE := regexp.MustCompile(`(?m)^[ \t]*%.*$`)
	r := rand.New(rand.NewPCG(9, 10))
	pieces := []string{" ", "\t", "\n", "\r", "\f", "and", "And", "an", "d", "%", "x", "{", "}", " and ", "\n%", "  %c\n"}
	for n := 0; n < 5000; n++ {
		var b []byte
		for k := r.IntN(12); k > 0; k-- {
			b = append(b, pieces[r.IntN(len(pieces))]...)
		}
		s := string(b)
		for i := 0; i <= len(s); i++ {
			want := 0
			if loc := andRE.FindStringIndex(s[i:]); loc != nil && loc[0] == 0 {
				want = loc[1]
			}
			if got := andAt(s, i); got != want {
				t.Fatalf("andAt(%q, %d) = %d, the expression %d", s, i, got, want)
			}
		}
		if got, want := blankComments(b), commentRE.ReplaceAll(b, nil); !bytes.Equal(got, want) {
			t.Fatalf("blankComments(%q) = %q, the expression %q", s, got, want)
		}
	}
}

// TestEntryStartsMatchesRegexp: entryStarts finds what
// `(?m)^[ \t]*@([A-Za-z]+)[ \t]*[{(][ \t]*([^,\s]+)[ \t]*,` finds, on
// random text made of the characters that matter, and on galley's own
// reference table.
func TestEntryStartsMatchesRegexp(t *testing.T) {
	re := regexp.MustCompile(`(?m)^[ \t]*@([A-Za-z]+)[ \t]*[{(][ \t]*([^,\s]+)[ \t]*,`)
	r := rand.New(rand.NewPCG(11, 12))
	pieces := []string{" ", "\t", "\n", "\r", "@", "article", "Book", "{", "(", "key-1", "k", ",", "}", "\n@", "@misc{a,", "ü", "[", "1"}
	check := func(b []byte) {
		var want [][6]int
		for _, m := range re.FindAllSubmatchIndex(b, -1) {
			want = append(want, [6]int(m))
		}
		got := entryStarts(b)
		if len(got) != len(want) {
			t.Fatalf("entryStarts(%q) = %v, the expression %v", b, got, want)
		}
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("entryStarts(%q) = %v, the expression %v", b, got, want)
			}
		}
	}
	for n := 0; n < 20000; n++ {
		var b []byte
		for k := r.IntN(14); k > 0; k-- {
			b = append(b, pieces[r.IntN(len(pieces))]...)
		}
		check(b)
	}
	check([]byte(MethodBib))
	if len(entryStarts([]byte(MethodBib))) < 20 {
		t.Error("the reference table has too few entries")
	}
}
