package engine

import (
	"bytes"
	"testing"
)

// TestLineOf: the line of every body offset (and past the end) is the
// front matter's length plus the line feeds before it.
func TestLineOf(t *testing.T) {
	src := "---\ntitle: t\n---\n\nFirst paragraph.\n\n\nSecond,\nthird line.\nno final line feed"
	d, err := ParseBytes("paper.md", []byte(src), Options{})
	if err != nil {
		t.Fatal(err)
	}
	for off := 0; off <= len(d.Body)+3; off++ {
		o := min(off, len(d.Body))
		if got, want := d.LineOf(off), d.BodyLine+bytes.Count(d.Body[:o], []byte("\n")); got != want {
			t.Fatalf("offset %d: line %d, want %d", off, got, want)
		}
	}
}
