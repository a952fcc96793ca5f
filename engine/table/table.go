package table

import "strings"

// Table is a formatted result table, independent of output format. All
// text is literal Unicode; each writer escapes and translates it.
type Table struct {
	Caption string
	Head    [][]Cell // header rows
	Body    []Row
	Notes   []string // one paragraph each, shown under the table
	// Stub is the number of leading text columns (row labels); the
	// remaining columns hold numbers and are aligned on the decimal point.
	Stub int
}

// Row is one body row.
type Row struct {
	Cells     []Cell
	RuleAbove bool // a light rule before this row (a new block)
}

// Cell is one table cell: literal text or a formatted number.
type Cell struct {
	Text   string  // literal text (used when !IsNum)
	Num    float64 // the value
	IsNum  bool
	Dec    int    // decimals
	Stars  int    // significance stars after the number
	Paren  bool   // wrap in parentheses (standard errors)
	Suffix string // literal text after the number, e.g. " [3]" for lags
	Span   int    // columns spanned (0 or 1: one)
	// Sub is a subscript after Text (a time index such as "t−1", for a
	// lagged term): HTML sets it with <sub>, LaTeX in math mode, Markdown
	// with Unicode subscript characters.
	Sub string
}

// T is a text cell.
func T(s string) Cell { return Cell{Text: s} }

// N is a number cell with dec decimals.
func N(v float64, dec int) Cell { return Cell{Num: v, IsNum: true, Dec: dec} }

// I is an integer cell.
func I(v int) Cell { return Cell{Num: float64(v), IsNum: true, Dec: 0} }

// Starred is a number with stars.
func Starred(v float64, dec, stars int) Cell {
	return Cell{Num: v, IsNum: true, Dec: dec, Stars: stars}
}

// SECell is a standard error in parentheses.
func SECell(v float64, dec int) Cell { return Cell{Num: v, IsNum: true, Dec: dec, Paren: true} }

// Label is a text cell with a subscript: Label("Δlog(north)", "t−1").
func Label(text, sub string) Cell { return Cell{Text: text, Sub: sub} }

// Plain is the cell's text with its subscript in Unicode subscript
// characters, for places without typesetting (plain-text reports).
func (c Cell) Plain() string { return c.Text + UnicodeSub(c.Sub) }

// UnicodeSub writes s (letters t, digits, + and the minus signs) in
// Unicode subscript characters, leaving other characters as they are.
func UnicodeSub(s string) string { return subReplacer.Replace(s) }

var subReplacer = strings.NewReplacer("t", "ₜ", "−", "₋", "-", "₋", "+", "₊",
	"0", "₀", "1", "₁", "2", "₂", "3", "₃", "4", "₄", "5", "₅", "6", "₆", "7", "₇", "8", "₈", "9", "₉")

// Span is a text cell spanning n columns.
func Span(s string, n int) Cell { return Cell{Text: s, Span: n} }

// Empty is an empty cell.
var Empty = Cell{}

// Width is the number of columns a row covers.
func rowWidth(cells []Cell) int {
	w := 0
	for _, c := range cells {
		if c.Span > 1 {
			w += c.Span
		} else {
			w++
		}
	}
	return w
}

// Cols is the table's column count.
func (t *Table) Cols() int {
	w := 0
	for _, r := range t.Head {
		w = max(w, rowWidth(r))
	}
	for _, r := range t.Body {
		w = max(w, rowWidth(r.Cells))
	}
	return w
}
