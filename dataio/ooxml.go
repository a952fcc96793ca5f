package dataio

import (
	"archive/zip"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// The parts of an Office Open XML spreadsheet package (ECMA-376 part 1,
// §18, and the package conventions of part 2) that galley reads: the
// package relationships (_rels/.rels) lead to the workbook part, whose
// relationships lead to the worksheets, the shared-string table and the
// style sheet. Only what a data table needs is read: sheet names and
// order, the date system, the cells' values and types, shared and
// inline strings, and each cell style's number format.

// Relationship types, matched by their last path segment so that the
// strict (ISO) and transitional namespaces both work.
const (
	relOfficeDocument = "officeDocument"
	relSharedStrings  = "sharedStrings"
	relStyles         = "styles"
)

// pkg is an opened workbook package.
type pkg struct {
	parts map[string]*zip.File // by part name, without a leading '/'
}

func openPackage(zr *zip.Reader) *pkg {
	p := &pkg{parts: make(map[string]*zip.File, len(zr.File))}
	for _, f := range zr.File {
		p.parts[strings.TrimPrefix(f.Name, "/")] = f
	}
	return p
}

// open returns a reader of the part name, or nil if there is none.
func (p *pkg) open(name string) (io.ReadCloser, error) {
	f, ok := p.parts[name]
	if !ok {
		return nil, nil
	}
	return f.Open()
}

type relationship struct {
	ID     string `xml:"Id,attr"`
	Type   string `xml:"Type,attr"`
	Target string `xml:"Target,attr"`
	Mode   string `xml:"TargetMode,attr"`
}

// rels reads the relationships of the part name (from
// dir/_rels/base.rels), with targets resolved to part names.
func (p *pkg) rels(name string) ([]relationship, error) {
	dir, base := path.Split(name)
	rc, err := p.open(dir + "_rels/" + base + ".rels")
	if err != nil || rc == nil {
		return nil, err
	}
	defer rc.Close()
	var doc struct {
		Rels []relationship `xml:"Relationship"`
	}
	if err := xml.NewDecoder(rc).Decode(&doc); err != nil {
		return nil, err
	}
	for i := range doc.Rels {
		t := doc.Rels[i].Target
		if strings.HasPrefix(t, "/") {
			t = t[1:]
		} else {
			t = path.Join(dir, t)
		}
		doc.Rels[i].Target = t
	}
	return doc.Rels, nil
}

func relType(t string) string { return t[strings.LastIndexByte(t, '/')+1:] }

// book is what ReadXLSX needs of a workbook: its sheets in order, their
// parts, the date system, the shared strings and the number format of
// each cell style.
type book struct {
	pkg      *pkg
	names    []string
	sheets   map[string]string // sheet name → part name
	date1904 bool
	strings  []string
	xfFormat []int          // cell style index → number format id
	formats  map[int]string // custom number formats by id
}

func loadBook(p *pkg) (*book, error) {
	wbName := "xl/workbook.xml"
	rels, err := p.rels("")
	if err != nil {
		return nil, err
	}
	for _, r := range rels {
		if relType(r.Type) == relOfficeDocument {
			wbName = r.Target
			break
		}
	}
	rc, err := p.open(wbName)
	if err != nil {
		return nil, err
	}
	if rc == nil {
		return nil, errors.New("the package has no workbook part")
	}
	var wb struct {
		Pr struct {
			Date1904 string `xml:"date1904,attr"`
		} `xml:"workbookPr"`
		Sheets []struct {
			Name string     `xml:"name,attr"`
			Attr []xml.Attr `xml:",any,attr"`
		} `xml:"sheets>sheet"`
	}
	err = xml.NewDecoder(rc).Decode(&wb)
	rc.Close()
	if err != nil {
		return nil, err
	}
	b := &book{pkg: p, sheets: map[string]string{}, formats: map[int]string{}}
	b.date1904 = wb.Pr.Date1904 == "1" || wb.Pr.Date1904 == "true"
	wbRels, err := p.rels(wbName)
	if err != nil {
		return nil, err
	}
	byID := map[string]string{}
	var ssName, stName string
	for _, r := range wbRels {
		byID[r.ID] = r.Target
		switch relType(r.Type) {
		case relSharedStrings:
			ssName = r.Target
		case relStyles:
			stName = r.Target
		}
	}
	for _, s := range wb.Sheets {
		id := ""
		for _, a := range s.Attr {
			if a.Name.Local == "id" && a.Name.Space != "" { // r:id
				id = a.Value
			}
		}
		b.names = append(b.names, s.Name)
		b.sheets[s.Name] = byID[id]
	}
	if ssName != "" {
		if b.strings, err = p.sharedStrings(ssName); err != nil {
			return nil, fmt.Errorf("shared strings: %v", err)
		}
	}
	if stName != "" {
		if err := b.readStyles(stName); err != nil {
			return nil, fmt.Errorf("styles: %v", err)
		}
	}
	return b, nil
}

// sharedStrings reads the shared-string table: each item's text is the
// text of its runs, phonetic runs (rPh) left out.
func (p *pkg) sharedStrings(name string) ([]string, error) {
	rc, err := p.open(name)
	if err != nil || rc == nil {
		return nil, err
	}
	defer rc.Close()
	d := xml.NewDecoder(rc)
	var out []string
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return nil, err
		}
		if se, ok := tok.(xml.StartElement); ok && se.Name.Local == "si" {
			s, err := richText(d)
			if err != nil {
				return nil, err
			}
			out = append(out, s)
		}
	}
}

// richText reads the content of a string item (si or is, its start
// already read) up to its end: the text of its t elements outside
// phonetic runs.
func richText(d *xml.Decoder) (string, error) {
	var sb strings.Builder
	depth, inT, rph := 1, 0, 0
	for depth > 0 {
		tok, err := d.Token()
		if err != nil {
			if err == io.EOF {
				err = io.ErrUnexpectedEOF
			}
			return "", err
		}
		switch x := tok.(type) {
		case xml.StartElement:
			depth++
			switch x.Name.Local {
			case "t":
				inT = depth
			case "rPh":
				rph++
			}
		case xml.EndElement:
			switch x.Name.Local {
			case "t":
				inT = 0
			case "rPh":
				rph--
			}
			depth--
		case xml.CharData:
			if inT > 0 && rph == 0 {
				sb.Write(x)
			}
		}
	}
	return sb.String(), nil
}

// readStyles reads the number format of each cell style (cellXfs) and
// the custom number formats.
func (b *book) readStyles(name string) error {
	rc, err := b.pkg.open(name)
	if err != nil || rc == nil {
		return err
	}
	defer rc.Close()
	var st struct {
		NumFmts []struct {
			ID   int    `xml:"numFmtId,attr"`
			Code string `xml:"formatCode,attr"`
		} `xml:"numFmts>numFmt"`
		Xfs []struct {
			NumFmt int `xml:"numFmtId,attr"`
		} `xml:"cellXfs>xf"`
	}
	if err := xml.NewDecoder(rc).Decode(&st); err != nil {
		return err
	}
	for _, f := range st.NumFmts {
		b.formats[f.ID] = f.Code
	}
	for _, x := range st.Xfs {
		b.xfFormat = append(b.xfFormat, x.NumFmt)
	}
	return nil
}

// isDate reports whether cell style s shows its number as a date: a
// custom format code is read by dateFormatCode, a built-in id by
// builtinDateFmt. A style the workbook does not define is an error.
func (b *book) isDate(s int) (bool, error) {
	if s < 0 || s >= len(b.xfFormat) {
		return false, fmt.Errorf("cell style %d is not defined in the workbook", s)
	}
	id := b.xfFormat[s]
	if code, ok := b.formats[id]; ok {
		return dateFormatCode(code), nil
	}
	return builtinDateFmt(id), nil
}

// rawCell is one cell of a worksheet as stored.
type rawCell struct {
	col   int    // 0-based
	typ   string // the t attribute: "" and "n" number, "s" shared string, "inlineStr", "str", "b", "e", "d"
	style int    // the s attribute
	value string // the text of v, or of is for an inline string
}

// sheetRows streams the worksheet part name and calls row for each row
// that has cells, with its 1-based number (the r attribute, or one more
// than the row before).
func (b *book) sheetRows(name string, row func(n int, cells []rawCell) error) error {
	rc, err := b.pkg.open(name)
	if err != nil {
		return err
	}
	if rc == nil {
		return errors.New("the workbook names the sheet but has no part for it")
	}
	defer rc.Close()
	d := xml.NewDecoder(rc)
	n := 0
	var cells []rawCell
	var cur *rawCell
	inV := false
	var vtext strings.Builder
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return nil
		}
		if err != nil {
			return err
		}
		switch x := tok.(type) {
		case xml.StartElement:
			switch x.Name.Local {
			case "row":
				n++
				if v, ok := attr(x, "r"); ok {
					if k, ok := digitsOnly(v); ok && k > 0 {
						n = k
					} else {
						return fmt.Errorf("row %q: not a row number", v)
					}
				}
				cells = cells[:0]
			case "c":
				col := 0
				if len(cells) > 0 {
					col = cells[len(cells)-1].col + 1
				}
				c := rawCell{col: col}
				if v, ok := attr(x, "r"); ok {
					k, ok := columnOf(v)
					if !ok || k > 16384 {
						return fmt.Errorf("cell %q: not a cell reference", v)
					}
					c.col = k - 1
				}
				c.typ, _ = attr(x, "t")
				if v, ok := attr(x, "s"); ok {
					k, err := strconv.Atoi(v)
					if err != nil {
						return fmt.Errorf("cell %s: style %q is not a number", colName(c.col)+strconv.Itoa(n), v)
					}
					c.style = k
				}
				cells = append(cells, c)
				cur = &cells[len(cells)-1]
			case "v":
				inV = cur != nil
				vtext.Reset()
			case "is":
				if cur != nil {
					s, err := richText(d)
					if err != nil {
						return err
					}
					cur.value = s
				}
			}
		case xml.CharData:
			if inV {
				vtext.Write(x)
			}
		case xml.EndElement:
			switch x.Name.Local {
			case "v":
				if inV {
					cur.value = vtext.String()
					inV = false
				}
			case "c":
				cur = nil
			case "row":
				if len(cells) > 0 {
					if err := row(n, cells); err != nil {
						return err
					}
				}
				cells = cells[:0]
			}
		}
	}
}

// attr returns the value of the attribute name (any namespace) of se.
func attr(se xml.StartElement, name string) (string, bool) {
	for _, a := range se.Attr {
		if a.Name.Local == name {
			return a.Value, true
		}
	}
	return "", false
}
