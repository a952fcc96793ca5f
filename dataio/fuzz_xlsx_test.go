package dataio

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// FuzzReadXLSX: any bytes give a frame or an error, never a panic. The
// seeds are the committed workbooks under testdata/series.
func FuzzReadXLSX(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("..", "testdata", "series", "*.xlsx"))
	for _, p := range files {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	f.Add([]byte("PK\x03\x04"))
	f.Fuzz(func(t *testing.T, data []byte) {
		fr, err := ReadXLSX(bytes.NewReader(data), "f.xlsx", "")
		if err != nil {
			return
		}
		if fr.Len() == 0 || fr.Len() != len(fr.Lines) {
			t.Fatalf("inconsistent frame: %d rows, %d lines", fr.Len(), len(fr.Lines))
		}
		for _, name := range fr.Names {
			if v, ok := fr.Column(name); !ok || len(v) != fr.Len() {
				t.Fatalf("column %q: %d values for %d rows", name, len(v), fr.Len())
			}
		}
	})
}
