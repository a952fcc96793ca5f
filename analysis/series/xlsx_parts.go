package series

import (
	"archive/zip"
	"encoding/xml"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// This file reads the parts of an Office Open XML workbook (ECMA-376,
// an open standard) that ReadXLSX needs: the sheet list, the shared
// strings and the cell number formats. Only the standard library is
// used, as the analysis packages depend on nothing else but gonum.

// maxPart bounds the decompressed size of one workbook part.
const maxPart = 1 << 30

type workbook struct {
	zr       *zip.Reader
	files    map[string]*zip.File
	sheets   []sheetRef
	strings  []string
	dateFmt  []bool // by cell style index: the style shows a date
	date1904 bool
}

type sheetRef struct {
	name, part string
}

func (wb *workbook) open(name string) (io.ReadCloser, error) {
	f, ok := wb.files[name]
	if !ok {
		return nil, fmt.Errorf("the workbook has no part %s", name)
	}
	rc, err := f.Open()
	if err != nil {
		return nil, err
	}
	return struct {
		io.Reader
		io.Closer
	}{io.LimitReader(rc, maxPart), rc}, nil
}

func (wb *workbook) decode(name string, v any) error {
	rc, err := wb.open(name)
	if err != nil {
		return err
	}
	defer rc.Close()
	if err := xml.NewDecoder(rc).Decode(v); err != nil {
		return fmt.Errorf("part %s: %v", name, err)
	}
	return nil
}

type relsXML struct {
	Rels []struct {
		ID     string `xml:"Id,attr"`
		Type   string `xml:"Type,attr"`
		Target string `xml:"Target,attr"`
	} `xml:"Relationship"`
}

// relsFor reads the relationships of part (dir/_rels/name.rels) and
// maps their ids to part names.
func (wb *workbook) relsFor(part string) (map[string]string, map[string]string, error) {
	dir, name := path.Split(part)
	var rx relsXML
	if err := wb.decode(dir+"_rels/"+name+".rels", &rx); err != nil {
		return nil, nil, err
	}
	byID, byType := map[string]string{}, map[string]string{}
	for _, r := range rx.Rels {
		t := r.Target
		if strings.HasPrefix(t, "/") {
			t = strings.TrimPrefix(t, "/")
		} else {
			t = path.Join(dir, t)
		}
		byID[r.ID] = t
		byType[path.Base(r.Type)] = t
	}
	return byID, byType, nil
}

func openWorkbook(zr *zip.Reader) (*workbook, error) {
	wb := &workbook{zr: zr, files: map[string]*zip.File{}}
	for _, f := range zr.File {
		wb.files[strings.TrimPrefix(f.Name, "/")] = f
	}
	main := "xl/workbook.xml"
	if _, types, err := wb.relsFor(""); err == nil && types["officeDocument"] != "" {
		main = types["officeDocument"]
	}
	var wx struct {
		Pr struct {
			Date1904 string `xml:"date1904,attr"`
		} `xml:"workbookPr"`
		Sheets []struct {
			Name  string     `xml:"name,attr"`
			Attrs []xml.Attr `xml:",any,attr"`
		} `xml:"sheets>sheet"`
	}
	if err := wb.decode(main, &wx); err != nil {
		return nil, err
	}
	wb.date1904 = wx.Pr.Date1904 == "1" || wx.Pr.Date1904 == "true"
	ids, types, err := wb.relsFor(main)
	if err != nil {
		return nil, err
	}
	for _, s := range wx.Sheets {
		id := ""
		for _, a := range s.Attrs {
			if a.Name.Local == "id" && a.Name.Space != "" {
				id = a.Value
			}
		}
		wb.sheets = append(wb.sheets, sheetRef{name: s.Name, part: ids[id]})
	}
	if p := types["sharedStrings"]; p != "" {
		if err := wb.readStrings(p); err != nil {
			return nil, err
		}
	}
	if p := types["styles"]; p != "" {
		if err := wb.readStyles(p); err != nil {
			return nil, err
		}
	}
	return wb, nil
}

// readStrings streams the shared-string table: each <si> is the
// concatenation of its <t> texts, leaving out phonetic runs (<rPh>).
func (wb *workbook) readStrings(part string) error {
	rc, err := wb.open(part)
	if err != nil {
		return err
	}
	defer rc.Close()
	dec := xml.NewDecoder(rc)
	var cur strings.Builder
	inT, skip := false, 0
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return nil
		}
		if err != nil {
			return fmt.Errorf("part %s: %v", part, err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			switch t.Name.Local {
			case "si":
				cur.Reset()
			case "t":
				inT = true
			case "rPh":
				skip++
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "si":
				wb.strings = append(wb.strings, cur.String())
			case "t":
				inT = false
			case "rPh":
				skip--
			}
		case xml.CharData:
			if inT && skip == 0 {
				cur.Write(t)
			}
		}
	}
}

// readStyles finds which cell styles show their number as a date.
func (wb *workbook) readStyles(part string) error {
	var sx struct {
		NumFmts []struct {
			ID   int    `xml:"numFmtId,attr"`
			Code string `xml:"formatCode,attr"`
		} `xml:"numFmts>numFmt"`
		Xfs []struct {
			NumFmt int `xml:"numFmtId,attr"`
		} `xml:"cellXfs>xf"`
	}
	if err := wb.decode(part, &sx); err != nil {
		return err
	}
	custom := map[int]bool{}
	for _, f := range sx.NumFmts {
		custom[f.ID] = dateFormatCode(f.Code)
	}
	wb.dateFmt = make([]bool, len(sx.Xfs))
	for i, x := range sx.Xfs {
		if d, ok := custom[x.NumFmt]; ok {
			wb.dateFmt[i] = d
		} else {
			wb.dateFmt[i] = builtinDateFmt(x.NumFmt)
		}
	}
	return nil
}

// builtinDateFmt reports whether a built-in number format (ECMA-376
// part 1, 18.8.30) shows a calendar date: ids 14–17 and 22, and the
// East Asian date formats 27–36 and 50–58. Pure time formats are not
// dates.
func builtinDateFmt(id int) bool {
	return (id >= 14 && id <= 17) || id == 22 || (id >= 27 && id <= 36) || (id >= 50 && id <= 58)
}

// dateFormatCode reports whether a custom format code shows a date: it
// has a year or day part (y, d) outside quoted text, escapes and
// [...] sections, or a month part (m) without hours or seconds.
func dateFormatCode(code string) bool {
	var y, d, m, hs bool
	for i := 0; i < len(code); i++ {
		switch c := code[i] | 0x20; {
		case code[i] == '"':
			j := strings.IndexByte(code[i+1:], '"')
			if j < 0 {
				return false
			}
			i += j + 1
		case code[i] == '\\' || code[i] == '_' || code[i] == '*':
			i++
		case code[i] == '[':
			j := strings.IndexByte(code[i:], ']')
			if j < 0 {
				return false
			}
			i += j
		case code[i] == ';':
			return y || d || (m && !hs) // first section decides
		case c == 'y':
			y = true
		case c == 'd':
			d = true
		case c == 'm':
			m = true
		case c == 'h' || c == 's':
			hs = true
		}
	}
	return y || d || (m && !hs)
}

// cellRef splits a cell reference such as "AB12" into a 0-based column
// and a 1-based row.
func cellRef(ref string) (col, row int, ok bool) {
	i := 0
	for i < len(ref) && ref[i] >= 'A' && ref[i] <= 'Z' {
		col = col*26 + int(ref[i]-'A'+1)
		i++
		if col > 1<<14 {
			return 0, 0, false
		}
	}
	if i == 0 {
		return 0, 0, false
	}
	row, err := strconv.Atoi(ref[i:])
	if err != nil || row < 1 {
		return 0, 0, false
	}
	return col - 1, row, true
}
