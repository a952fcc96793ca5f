package kinds

import (
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestParseErrorsInOrder: the directives' YAML is decoded by two
// workers, but the errors of a manuscript come out in the order of its
// lines, whatever kind of error each is.
func TestParseErrorsInOrder(t *testing.T) {
	var b strings.Builder
	b.WriteString("---\ntitle: t\ndata:\n  d: data.csv\n---\n\n")
	var want []string
	for i := 0; i < 12; i++ {
		switch i % 3 {
		case 0:
			b.WriteString("```galley nosuchkind\nid: a\n```\n\n")
			want = append(want, "nosuchkind")
		case 1:
			b.WriteString("```galley ols\nid: [unclosed\n```\n\n")
			want = append(want, "paper.md:")
		case 2:
			b.WriteString("```galley ols\nid: x" + string(rune('a'+i)) + "\ny: v\nx: [w]\nbogus_key: 1\n```\n\n")
			want = append(want, "bogus_key")
		}
	}
	_, err := engine.ParseBytes("paper.md", []byte(b.String()), engine.Options{})
	if err == nil {
		t.Fatal("no error")
	}
	lines := strings.Split(err.Error(), "\n")
	if len(lines) != len(want) {
		t.Fatalf("%d errors, want %d:\n%v", len(lines), len(want), err)
	}
	last, numbered := 0, 0
	for i, l := range lines {
		if !strings.Contains(l, want[i]) {
			t.Errorf("error %d = %q, want it to mention %q", i, l, want[i])
		}
		if n, ok := lineOf(l); ok {
			if n <= last {
				t.Errorf("error %d (line %d) comes after line %d", i, n, last)
			}
			last = n
			numbered++
		}
	}
	if numbered != len(want) {
		t.Errorf("%d of %d errors name their line:\n%v", numbered, len(want), err)
	}
}

// lineOf reads the line number of "paper.md:N: …".
func lineOf(s string) (int, bool) {
	rest, ok := strings.CutPrefix(s, "paper.md:")
	if !ok {
		return 0, false
	}
	num, _, ok := strings.Cut(rest, ":")
	n, err := strconv.Atoi(num)
	return n, ok && err == nil
}
