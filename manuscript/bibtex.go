package manuscript

import (
	"bytes"
	"fmt"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"sync"
	"unicode"

	"github.com/nickng/bibtex"
)

// BibEntry is one work of a bibliography: its BibTeX fields as written
// (after @string expansion and crossref inheritance), with the names
// and the text galley shows made from them.
type BibEntry struct {
	Key, Type string
	Fields    map[string]string // lower-case field name → value as written
	File      string
	Line      int
	Authors   []Person // from author, else editor
	EtAl      bool     // the list ended in "and others"
	Suffix    string   // "a", "b" when one author-year pair names several works
}

// Person is a name split the BibTeX way.
type Person struct{ First, Von, Last, Jr string }

// Library is a parsed bibliography.
type Library struct {
	Entries map[string]*BibEntry
	Keys    []string // in file order
}

// the reader keeps its state in package variables, so one parse at a time
var bibMu sync.Mutex

var (
	parsePosRE = regexp.MustCompile(`at (\d+):(\d+)`)
	citeKeyRE  = regexp.MustCompile(`^[A-Za-z0-9:_.+/-]+$`)
)

// ParseBib reads a BibTeX file with github.com/nickng/bibtex and
// resolves crossref. Errors name the file and line.
func ParseBib(file string, src []byte) (*Library, error) {
	if !Utf8Valid(src) {
		return nil, ErrAt(file, FirstBadUTF8Line(src), "the bibliography is not valid UTF-8")
	}
	if line, r := FirstControlChar(src); line > 0 {
		return nil, ErrAt(file, line, "the bibliography contains the control character U+%04X", r)
	}
	lines := map[string]int{}
	var order []string
	for _, m := range entryStarts(src) {
		typ := strings.ToLower(string(src[m[2]:m[3]]))
		if typ == "string" || typ == "comment" || typ == "preamble" {
			continue
		}
		key := string(src[m[4]:m[5]])
		line := 1 + bytes.Count(src[:m[0]], []byte("\n"))
		if !citeKeyRE.MatchString(key) {
			return nil, ErrAt(file, line, "the key %q: use letters, digits and : _ - . + / only (it reaches LaTeX as written)", key)
		}
		if prev, dup := lines[key]; dup {
			return nil, ErrAt(file, line, "the key %q is used twice (first on line %d)", key, prev)
		}
		lines[key] = line
		order = append(order, key)
	}
	// BibTeX ignores text outside entries; the reader does not always, so
	// comment lines are blanked (keeping the line count).
	clean := blankComments(src)
	bibMu.Lock()
	parsed, err := parseBibSafely(clean)
	bibMu.Unlock()
	if err != nil {
		line := 0
		if m := parsePosRE.FindStringSubmatch(err.Error()); m != nil {
			line, _ = strconv.Atoi(m[1])
		}
		msg := parsePosRE.ReplaceAllString(err.Error(), "")
		msg = strings.TrimSpace(strings.TrimPrefix(msg, "parse failed :"))
		if key := entryBefore(src, line, order, lines); key != "" {
			msg = fmt.Sprintf("malformed entry %q: %s", key, msg)
		}
		return nil, ErrAt(file, line, "%s", msg)
	}
	lib := &Library{Entries: map[string]*BibEntry{}}
	for _, e := range parsed.Entries {
		be := &BibEntry{Key: e.CiteName, Type: e.Type, Fields: map[string]string{}, File: file, Line: lines[e.CiteName]}
		for k, v := range e.Fields {
			be.Fields[strings.ToLower(k)] = v.String()
		}
		lib.Entries[be.Key] = be
	}
	for _, k := range order {
		if _, ok := lib.Entries[k]; !ok {
			return nil, ErrAt(file, lines[k], "the entry %q could not be read (check its braces, commas and the text before it)", k)
		}
		lib.Keys = append(lib.Keys, k)
	}
	for _, k := range lib.Keys {
		e := lib.Entries[k]
		if ref := e.Fields["crossref"]; ref != "" {
			parent, ok := lib.Entries[ref]
			if !ok {
				return nil, ErrAt(file, e.Line, "entry %q: crossref %q names no entry of this file%s", k, ref, DidYouMean(ref, lib.Keys))
			}
			for f, v := range parent.Fields {
				if _, has := e.Fields[f]; !has && f != "crossref" {
					e.Fields[f] = v
				}
			}
			if _, has := e.Fields["booktitle"]; !has && parent.Fields["title"] != "" {
				e.Fields["booktitle"] = parent.Fields["title"]
			}
		}
		if err := e.finish(); err != nil {
			return nil, ErrAt(file, e.Line, "entry %q: %v", k, err)
		}
	}
	return lib, nil
}

func parseBibSafely(src []byte) (b *bibtex.BibTex, err error) {
	defer func() {
		if p := recover(); p != nil {
			b, err = nil, fmt.Errorf("the BibTeX reader failed: %v", p)
		}
	}()
	// The reader keeps a flag in a package variable that an earlier
	// failed parse can leave set, which makes every later parse fail; a
	// lone comma resets it (its own parse error is expected).
	_, _ = bibtex.Parse(strings.NewReader(","))
	return bibtex.Parse(bytes.NewReader(src))
}

// entryBefore is the key of the last entry that starts at or before line.
func entryBefore(src []byte, line int, order []string, lines map[string]int) string {
	best := ""
	for _, k := range order {
		if lines[k] <= line {
			best = k
		}
	}
	return best
}

func (e *BibEntry) finish() error {
	names := e.Fields["author"]
	if names == "" {
		names = e.Fields["editor"]
	}
	if strings.TrimSpace(names) == "" {
		return fmt.Errorf("it has neither author nor editor, so it cannot be cited by author and year")
	}
	if e.Fields["year"] == "" {
		return fmt.Errorf("it has no year")
	}
	e.Authors, e.EtAl = ParseNames(names)
	return nil
}

// entryStarts finds the entry openings "@type{key," that start a line
// (after spaces and tabs), what the expression
// `(?m)^[ \t]*@([A-Za-z]+)[ \t]*[{(][ \t]*([^,\s]+)[ \t]*,` finds: for
// each, the offsets of the match and of its two groups, as
// FindAllSubmatchIndex gives them.
func entryStarts(src []byte) [][6]int {
	var out [][6]int
	blank := func(i int) int {
		for i < len(src) && (src[i] == ' ' || src[i] == '\t') {
			i++
		}
		return i
	}
	for start := 0; start < len(src); {
		end := bytes.IndexByte(src[start:], '\n')
		if end < 0 {
			end = len(src)
		} else {
			end += start
		}
		i := blank(start)
		if i < end && src[i] == '@' {
			t0 := i + 1
			t1 := t0
			for t1 < end && ('a' <= src[t1]|0x20 && src[t1]|0x20 <= 'z') {
				t1++
			}
			j := blank(t1)
			if t1 > t0 && j < end && (src[j] == '{' || src[j] == '(') {
				k0 := blank(j + 1)
				k1 := k0
				for k1 < end && src[k1] != ',' && !isRESpace(src[k1]) {
					k1++
				}
				c := blank(k1)
				if k1 > k0 && c < end && src[c] == ',' {
					out = append(out, [6]int{start, c + 1, t0, t1, k0, k1})
				}
			}
		}
		start = end + 1
	}
	return out
}

// andAt returns the length of the name separator (the match of
// `\s+and\s+`, RE2's \s being [\t\n\f\r ]) that starts at s[i], or 0.
func andAt(s string, i int) int {
	j := i
	for j < len(s) && isRESpace(s[j]) {
		j++
	}
	if j == i || !strings.HasPrefix(s[j:], "and") {
		return 0
	}
	k := j + 3
	for k < len(s) && isRESpace(s[k]) {
		k++
	}
	if k == j+3 {
		return 0
	}
	return k - i
}

func isRESpace(c byte) bool {
	return c == ' ' || c == '\t' || c == '\n' || c == '\f' || c == '\r'
}

// blankComments removes the text of every line whose first character
// after spaces and tabs is '%' (keeping its line feed, so that line
// numbers stay), what `(?m)^[ \t]*%.*$` replaced by "" removes.
func blankComments(src []byte) []byte {
	out := make([]byte, 0, len(src))
	for len(src) > 0 {
		line := src
		rest := []byte(nil)
		if k := bytes.IndexByte(src, '\n'); k >= 0 {
			line, rest = src[:k], src[k:]
		}
		t := bytes.TrimLeft(line, " \t")
		if len(t) == 0 || t[0] != '%' {
			out = append(out, line...)
		}
		if rest == nil {
			break
		}
		out = append(out, '\n')
		src = rest[1:]
	}
	return out
}

// ParseNames splits a BibTeX name list at "and" (outside braces); a
// last name "others" is the "et al." mark.
func ParseNames(s string) ([]Person, bool) {
	var out []Person
	etAl := false
	for _, part := range splitTopLevel(s) {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		if part == "others" {
			etAl = true
			continue
		}
		out = append(out, parseName(part))
	}
	return out, etAl
}

// splitTopLevel splits at " and " outside braces.
func splitTopLevel(s string) []string {
	var parts []string
	depth, start := 0, 0
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '{':
			depth++
		case '}':
			depth--
		}
		if depth == 0 {
			if n := andAt(s, i); n > 0 {
				parts = append(parts, s[start:i])
				i += n - 1
				start = i + 1
			}
		}
	}
	return append(parts, s[start:])
}

func parseName(s string) Person {
	commas := splitCommas(s)
	switch len(commas) {
	case 1: // First von Last
		words := strings.Fields(s)
		if len(words) == 1 {
			return Person{Last: words[0]}
		}
		// von part: the first lower-case word after the first names
		i := 0
		for i < len(words)-1 && !isLowerWord(words[i]) {
			i++
		}
		if i == len(words)-1 {
			return Person{First: strings.Join(words[:i], " "), Last: words[i]}
		}
		j := i
		for j < len(words)-1 && isLowerWord(words[j]) {
			j++
		}
		return Person{First: strings.Join(words[:i], " "), Von: strings.Join(words[i:j], " "), Last: strings.Join(words[j:], " ")}
	case 2: // von Last, First
		von, last := splitVon(commas[0])
		return Person{First: strings.TrimSpace(commas[1]), Von: von, Last: last}
	default: // von Last, Jr, First
		von, last := splitVon(commas[0])
		return Person{First: strings.TrimSpace(commas[2]), Von: von, Last: last, Jr: strings.TrimSpace(commas[1])}
	}
}

func splitCommas(s string) []string {
	var parts []string
	depth, start := 0, 0
	for i, r := range s {
		switch r {
		case '{':
			depth++
		case '}':
			depth--
		case ',':
			if depth == 0 {
				parts = append(parts, s[start:i])
				start = i + 1
			}
		}
	}
	return append(parts, s[start:])
}

func splitVon(s string) (string, string) {
	words := strings.Fields(s)
	i := 0
	for i < len(words)-1 && isLowerWord(words[i]) {
		i++
	}
	return strings.Join(words[:i], " "), strings.Join(words[i:], " ")
}

func isLowerWord(w string) bool {
	for _, r := range w {
		if r == '{' || r == '\\' {
			return false
		}
		return unicode.IsLower(r)
	}
	return false
}

// Surname is the name a citation shows: von and last, as text.
func (p Person) Surname() string {
	s := p.Last
	if p.Von != "" {
		s = p.Von + " " + s
	}
	return Detex(s)
}

// AuthorText is the author part of a citation: "Johansen", "Engle and
// Granger", "Kwiatkowski et al." (three or more, or an "and others" list).
func (e *BibEntry) AuthorText() string {
	a := e.Authors
	switch {
	case len(a) == 1 && !e.EtAl:
		return a[0].Surname()
	case len(a) == 2 && !e.EtAl:
		return a[0].Surname() + " and " + a[1].Surname()
	}
	return a[0].Surname() + " et al."
}

// YearText is the year with its suffix ("1987", "1991a").
func (e *BibEntry) YearText() string { return Detex(e.Fields["year"]) + e.Suffix }

// Field is a field as plain text (braces, accents and TeX's dashes and
// ties turned into Unicode).
func (e *BibEntry) Field(name string) string { return Detex(e.Fields[name]) }

// AssignSuffixes gives works that share an author text and year the
// suffixes a, b, … in the order of entries (sorted as the reference list).
func AssignSuffixes(entries []*BibEntry) {
	groups := map[string][]*BibEntry{}
	for _, e := range entries {
		e.Suffix = ""
		k := e.AuthorText() + "|" + e.Fields["year"]
		groups[k] = append(groups[k], e)
	}
	for _, g := range groups {
		if len(g) > 1 {
			for i, e := range g {
				e.Suffix = string(rune('a' + i))
			}
		}
	}
}

// SortReferences orders works as an author-year reference list: by the
// first author's surname, the other authors, then year and title.
func SortReferences(entries []*BibEntry) {
	key := func(e *BibEntry) string {
		var b strings.Builder
		for _, a := range e.Authors {
			b.WriteString(strings.ToLower(a.Surname() + " " + Detex(a.First) + "|"))
		}
		return b.String() + "\x00" + e.Fields["year"] + "\x00" + strings.ToLower(e.Field("title"))
	}
	// each key once, not once per comparison (it detexes every name)
	type keyed struct {
		key string
		e   *BibEntry
	}
	ks := make([]keyed, len(entries))
	for i, e := range entries {
		ks[i] = keyed{key(e), e}
	}
	sort.SliceStable(ks, func(i, j int) bool { return ks[i].key < ks[j].key })
	for i := range ks {
		entries[i] = ks[i].e
	}
}

var accentCommands = map[string]rune{
	"'": '\u0301', "`": '\u0300', "^": '\u0302', "\"": '\u0308', "~": '\u0303', "=": '\u0304',
	".": '\u0307', "u": '\u0306', "v": '\u030c', "H": '\u030b', "c": '\u0327', "k": '\u0328', "r": '\u030a',
}

var letterCommands = map[string]string{
	"ss": "ß", "o": "ø", "O": "Ø", "ae": "æ", "AE": "Æ", "oe": "œ", "OE": "Œ", "aa": "å", "AA": "Å",
	"l": "ł", "L": "Ł", "i": "ı", "j": "ȷ", "&": "&", "%": "%", "$": "$", "#": "#", "_": "_",
	"textendash": "–", "textemdash": "—", "ldots": "…", "dots": "…", "S": "§",
}

// Detex turns BibTeX field text into plain Unicode text: accents
// ({\"o}, \'e, \v{s}) become letters, braces go, -- and --- become dashes,
// ~ a no-break space; any other command is dropped, keeping its argument.
func Detex(s string) string {
	var b strings.Builder
	rs := []rune(s)
	for i := 0; i < len(rs); i++ {
		r := rs[i]
		switch {
		case r == '{' || r == '}':
		case r == '~':
			b.WriteRune('\u00a0')
		case r == '-' && i+2 < len(rs) && rs[i+1] == '-' && rs[i+2] == '-':
			b.WriteRune('—')
			i += 2
		case r == '-' && i+1 < len(rs) && rs[i+1] == '-':
			b.WriteRune('–')
			i++
		case r == '$':
		case r == '\\' && i+1 < len(rs):
			j := i + 1
			if unicode.IsLetter(rs[j]) {
				for j < len(rs) && unicode.IsLetter(rs[j]) {
					j++
				}
			} else {
				j++
			}
			name := string(rs[i+1 : j])
			for j < len(rs) && rs[j] == ' ' && unicode.IsLetter(rs[i+1]) {
				j++
			}
			if acc, ok := accentCommands[name]; ok {
				// the accented letter: next rune, or the first rune of a {group}
				k := j
				for k < len(rs) && (rs[k] == '{' || rs[k] == ' ') {
					k++
				}
				if k < len(rs) {
					base := rs[k]
					if base == '\\' && k+1 < len(rs) && (rs[k+1] == 'i' || rs[k+1] == 'j') {
						base = rs[k+1]
						k++
					}
					b.WriteString(composeAccent(base, acc))
					i = k
					continue
				}
			}
			if l, ok := letterCommands[name]; ok {
				b.WriteString(l)
			}
			i = j - 1
		default:
			b.WriteRune(r)
		}
	}
	return collapseSpace(b.String())
}

// collapseSpace turns runs of ASCII white space into one space (a
// no-break space stays).
func collapseSpace(s string) string {
	return strings.Join(strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == '\t' || r == '\n' || r == '\r' }), " ")
}

// composeAccent returns the precomposed letter where Unicode has one.
func composeAccent(base, mark rune) string {
	if c, ok := precomposed[[2]rune{base, mark}]; ok {
		return string(c)
	}
	return string(base) + string(mark)
}

var precomposed = func() map[[2]rune]rune {
	m := map[[2]rune]rune{}
	add := func(mark rune, pairs string) {
		rs := []rune(pairs)
		for i := 0; i+1 < len(rs); i += 2 {
			m[[2]rune{rs[i], mark}] = rs[i+1]
		}
	}
	add('\u0301', "aáeéiíoóuúyýAÁEÉIÍOÓUÚYÝcćnńsśzźCĆNŃSŚZŹ")
	add('\u0300', "aàeèiìoòuùAÀEÈIÌOÒUÙ")
	add('\u0302', "aâeêiîoôuûAÂEÊIÎOÔUÛ")
	add('\u0308', "aäeëiïoöuüyÿAÄEËIÏOÖUÜ")
	add('\u0303', "aãnñoõAÃNÑOÕ")
	add('\u030c', "cčsšzžrřeěCČSŠZŽRŘEĚ")
	add('\u0327', "cçsşCÇSŞ")
	add('\u030a', "aåAÅuů")
	add('\u030b', "oőuűOŐUŰ")
	add('\u0306', "aăgğAĂGĞ")
	add('\u0328', "aąeęAĄEĘ")
	add('\u0307', "zżZŻ")
	add('\u0304', "aāeēoōuūAĀEĒOŌUŪ")
	return m
}()
