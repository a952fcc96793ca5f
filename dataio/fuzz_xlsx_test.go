package series

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// FuzzReadXLSX: any bytes give a frame or an error, never a panic. The
// seeds are the committed workbooks under testdata/series.
func FuzzReadXLSX(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "series", "*.xlsx"))
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
		if fr.Len() != len(fr.Lines) || len(fr.cols) != len(fr.Names) {
			t.Fatalf("inconsistent frame: %d rows, %d lines", fr.Len(), len(fr.Lines))
		}
	})
}
