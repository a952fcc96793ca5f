package figures

import (
	"bytes"
	"compress/zlib"
	"io"
	"regexp"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// TestPDFMinus: negative tick labels reach the PDF as a hyphen-minus,
// which its cp1252 fonts can show, never as the UTF-8 bytes of U+2212.
func TestPDFMinus(t *testing.T) {
	var s series.Series
	for i := 0; i < 24; i++ {
		s.Dates = append(s.Dates, series.Date{Freq: series.Monthly, Year: 2004 + i/12, Sub: i%12 + 1})
		s.Values = append(s.Values, float64(i%5)-2.5)
	}
	s.Name = "x"
	f, err := Lines([]series.Series{s}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := f.Render("pdf", 0)
	if err != nil {
		t.Fatal(err)
	}
	shown := regexp.MustCompile(`\(((?:[^()\\]|\\.)*)\)\s*Tj`).FindAllSubmatch(pdfText(t, b), -1)
	neg := 0
	for _, m := range shown {
		if bytes.Contains(m[1], []byte("\xe2\x88\x92")) {
			t.Fatalf("a label carries the UTF-8 minus, which the PDF's fonts cannot show: %q", m[1])
		}
		if bytes.HasPrefix(m[1], []byte("-")) {
			neg++
		}
	}
	if len(shown) == 0 || neg == 0 {
		t.Fatalf("no negative tick label drawn with a hyphen-minus among %d strings", len(shown))
	}
}

// pdfText inflates every content stream of a PDF.
func pdfText(t *testing.T, pdf []byte) []byte {
	var out bytes.Buffer
	re := regexp.MustCompile(`(?s)stream\r?\n(.*?)endstream`)
	for _, m := range re.FindAllSubmatch(pdf, -1) {
		r, err := zlib.NewReader(bytes.NewReader(m[1]))
		if err != nil {
			out.Write(m[1])
			continue
		}
		b, _ := io.ReadAll(r)
		out.Write(b)
	}
	return out.Bytes()
}

// TestPDFOneFontSize: every string of a PDF is set in the one size
// pdfFontSize (scaled by the page's transformation to the size asked
// for), so that vgpdf converts the font once per face, not once per size.
func TestPDFOneFontSize(t *testing.T) {
	var s series.Series
	for i := 0; i < 24; i++ {
		s.Dates = append(s.Dates, series.Date{Freq: series.Monthly, Year: 2004 + i/12, Sub: i%12 + 1})
		s.Values = append(s.Values, float64(i%5))
	}
	s.Name = "x"
	f, err := Lines([]series.Series{s}, Options{Title: "T", YLabel: "y"})
	if err != nil {
		t.Fatal(err)
	}
	b, err := f.Render("pdf", 0)
	if err != nil {
		t.Fatal(err)
	}
	sizes := map[string]bool{}
	for _, m := range regexp.MustCompile(`/F\S+ ([0-9.]+) Tf`).FindAllSubmatch(pdfText(t, b), -1) {
		sizes[string(m[1])] = true
	}
	if len(sizes) != 1 || !sizes["10.00"] {
		t.Errorf("font sizes in the PDF: %v, want only 10.00", sizes)
	}
}

// TestPDFDelta: a typeset difference (Δlog(x)) in a PDF axis label is
// drawn as the text after the Δ plus a stroked triangle, never as the
// UTF-8 bytes of U+0394, which the PDF's cp1252 fonts would show as two
// wrong glyphs; SVG keeps the Δ as text.
func TestPDFDelta(t *testing.T) {
	var s series.Series
	for i := 0; i < 24; i++ {
		s.Dates = append(s.Dates, series.Date{Freq: series.Monthly, Year: 2004 + i/12, Sub: i%12 + 1})
		s.Values = append(s.Values, float64(i%5))
	}
	s.Name = "x"
	f, err := Lines([]series.Series{s}, Options{YLabel: "Δlog(x)"})
	if err != nil {
		t.Fatal(err)
	}
	b, err := f.Render("pdf", 0)
	if err != nil {
		t.Fatal(err)
	}
	text := pdfText(t, b)
	for _, m := range regexp.MustCompile(`\(((?:[^()\\]|\\.)*)\)\s*Tj`).FindAllSubmatch(text, -1) {
		if bytes.Contains(m[1], []byte("\xce\x94")) {
			t.Fatalf("a label carries the UTF-8 bytes of Δ: %q", m[1])
		}
	}
	if !regexp.MustCompile(`\(log\\\(x\\\)\)\s*Tj`).Match(text) {
		t.Fatal("the text after the Δ is not drawn")
	}
	svg, err := f.Render("svg", 0)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(svg, []byte("Δlog(x)")) {
		t.Fatal("the SVG lost the Δ")
	}
}
