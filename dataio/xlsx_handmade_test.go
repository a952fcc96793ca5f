package dataio

import (
	"archive/zip"
	"bytes"
	"math"
	"slices"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// makeBook writes a minimal workbook by hand (ECMA-376 part names), to
// reach cases the excelize-written fixtures do not: inline strings,
// rich-text shared strings with phonetic runs, error cells, the 1904
// date system and absolute relationship targets.
func makeBook(t *testing.T, date1904 bool, sheet string) []byte {
	t.Helper()
	pr := ""
	if date1904 {
		pr = `<workbookPr date1904="1"/>`
	}
	parts := map[string]string{
		"_rels/.rels": `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
			`<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
		"xl/workbook.xml": `<?xml version="1.0"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships">` +
			pr + `<sheets><sheet name="Series" sheetId="1" r:id="rId1"/></sheets></workbook>`,
		"xl/_rels/workbook.xml.rels": `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
			`<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="/xl/worksheets/s1.xml"/>` +
			`<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/>` +
			`<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles" Target="styles.xml"/></Relationships>`,
		"xl/sharedStrings.xml": `<?xml version="1.0"?><sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">` +
			`<si><t>date</t></si><si><r><t>out</t></r><r><t>put</t></r><rPh><t>x</t></rPh></si></sst>`,
		"xl/styles.xml": `<?xml version="1.0"?><styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">` +
			`<numFmts><numFmt numFmtId="164" formatCode="[$-409]d\-mmm\-yyyy;@"/><numFmt numFmtId="165" formatCode="0.00E+00"/></numFmts>` +
			`<cellXfs><xf numFmtId="0"/><xf numFmtId="164"/><xf numFmtId="165"/></cellXfs></styleSheet>`,
		"xl/worksheets/s1.xml": sheet,
	}
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	for name, body := range parts {
		w, err := zw.Create(name)
		if err != nil {
			t.Fatal(err)
		}
		w.Write([]byte(body))
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

const sheetHead = `<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>`
const sheetTail = `</sheetData></worksheet>`

func TestReadXLSXHandMade(t *testing.T) {
	// Rows 3…5: serials 36526…36528 in the 1900 system are
	// 2000-01-01…03 (common practice: serial 1 = 1900-01-01, with the
	// phantom 1900-02-29 as serial 60); in the 1904 system serial 0 is
	// 1904-01-01, so the same serials are 2004-01-02…04.
	// Row 1 is blank; row 2 is the header; B4 is #N/A; the value column
	// uses a scientific format, which is not a date.
	sheet := sheetHead +
		`<row r="2"><c r="A2" t="s"><v>0</v></c><c r="B2" t="s"><v>1</v></c></row>` +
		`<row r="3"><c r="A3" s="1"><v>36526</v></c><c r="B3" s="2"><v>1.5E+2</v></c></row>` +
		`<row r="4"><c r="A4" s="1"><v>36527</v></c><c r="B4" t="e"><v>#N/A</v></c></row>` +
		`<row r="5"><c r="A5" s="1"><v>36528</v></c><c r="B5" t="inlineStr"><is><t>7</t></is></c></row>` +
		sheetTail
	f, err := ReadXLSX(bytes.NewReader(makeBook(t, false, sheet)), "h.xlsx", "")
	if err != nil {
		t.Fatal(err)
	}
	v, _ := f.Column("output")
	if f.Freq != series.Daily || f.Dates[0].String() != "2000-01-01" || f.Dates[2].String() != "2000-01-03" ||
		len(v) != 3 || v[0] != 150 || !math.IsNaN(v[1]) || v[2] != 7 || !slices.Equal(f.Lines, []int{3, 4, 5}) || f.Sheet != "Series" {
		t.Errorf("1900 system: %v %v %v %v", f.Freq, f.Dates, v, f.Lines)
	}
	f, err = ReadXLSX(bytes.NewReader(makeBook(t, true, sheet)), "h.xlsx", "Series")
	if err != nil {
		t.Fatal(err)
	}
	// 1904 system: day 0 = 1904-01-01, so 36526 = 2004-01-02
	if f.Dates[0].String() != "2004-01-02" {
		t.Errorf("1904 system: %v", f.Dates)
	}

	bad := []struct{ name, sheet, want string }{
		{"gap", sheetHead +
			`<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c><c r="B1" t="inlineStr"><is><t>x</t></is></c></row>` +
			`<row r="2"><c r="A2" t="inlineStr"><is><t>1990Q1</t></is></c><c r="B2"><v>1</v></c></row>` +
			`<row r="3"><c r="A3" t="inlineStr"><is><t>1990Q3</t></is></c><c r="B3"><v>1</v></c></row>` + sheetTail,
			"h.xlsx:3: column date: date 1990Q3 follows 1990Q1 (line 2): 1990Q2 is missing"},
		{"stray cell", sheetHead +
			`<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c></row>` +
			`<row r="2"><c r="A2"><v>1990</v></c><c r="C2"><v>1</v></c></row>` + sheetTail,
			"h.xlsx:2: cell C2 has a value but its column has no header"},
		{"division error", sheetHead +
			`<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c><c r="B1" t="inlineStr"><is><t>x</t></is></c></row>` +
			`<row r="2"><c r="A2"><v>1990</v></c><c r="B2" t="e"><v>#DIV/0!</v></c></row>` + sheetTail,
			`h.xlsx:2: column x: not a number: "#DIV/0!"`},
		{"empty sheet", sheetHead + sheetTail, `h.xlsx: sheet "Series" is empty: expected a header row naming the columns`},
		{"bad xml", sheetHead + `<row>`, `h.xlsx: sheet "Series": XML syntax error on line 1: unexpected EOF`},
	}
	for _, tc := range bad {
		_, err := ReadXLSX(bytes.NewReader(makeBook(t, false, tc.sheet)), "h.xlsx", "")
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s:\n got %v\nwant %s", tc.name, err, tc.want)
		}
	}
}

func TestDateFormatCode(t *testing.T) {
	// Format codes from the number-format grammar of ECMA-376 part 1,
	// 18.8.31; which show dates is read off the codes by hand.
	tests := []struct {
		code string
		want bool
	}{
		{"yyyy-mm-dd", true}, {"mmm yyyy", true}, {"d/m/yy", true}, {"[$-409]mmmm\\ yyyy;@", true},
		{"mm", true}, {"h:mm", false}, {"mm:ss", false}, {"[h]:mm:ss", false},
		{"0.00", false}, {"0.00E+00", false}, {"General", false}, {`"day "0`, false}, {"#,##0;[Red]-#,##0", false},
	}
	for _, tc := range tests {
		if got := dateFormatCode(tc.code); got != tc.want {
			t.Errorf("dateFormatCode(%q) = %v", tc.code, got)
		}
	}
	for id, want := range map[int]bool{0: false, 1: false, 14: true, 17: true, 18: false, 21: false, 22: true, 45: false, 49: false} {
		if builtinDateFmt(id) != want {
			t.Errorf("builtinDateFmt(%d) = %v", id, !want)
		}
	}
}
