package engine

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/text"
	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/diag"
	"github.com/galley-econ/galley/internal/parallel"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/resultsfile"
)

// Options control how a manuscript is read.
type Options struct {
	// AllowOutside lets data paths leave the manuscript's folder tree.
	AllowOutside bool
	// Vintage chooses among a data alias's vintages ("" = the default).
	Vintage string
	// Progress, if set, receives one line per directive as it runs.
	Progress func(msg string)
	// Cache, if set, stores results between builds and reuses those whose
	// inputs are unchanged.
	Cache *Cache
	// PNG is the resolution of PNG figures wanted (0: none).
	PNG int

	nested bool     // a build made by a revision directive for another vintage
	reads  *readLog // the files read (reads.go), shared with nested builds
	// pending counts the cache files being written in the background
	// (Cache.Async), shared with nested builds
	pending *sync.WaitGroup
}

// Document is a parsed manuscript: front matter, Markdown body, and its
// directives in order.
type Document struct {
	File     string // the manuscript path as given
	Dir      string // its folder, the root for data paths
	Meta     *manuscript.Meta
	Body     []byte // the Markdown after the front matter
	BodyLine int    // file line of Body's first line
	Root     ast.Node
	// Preamble is the author's LaTeX preamble file (front matter
	// latex: preamble:), read when the manuscript is parsed.
	Preamble []byte
	// Outline numbers the manuscript's sections and marks its appendix.
	Outline *manuscript.Outline

	anchors    map[string]*Anchor // equations and sections, by id
	bib        *manuscript.Library
	methods    methodCopies // this document's copies of galley's reference table's works (cite.go)
	references []*manuscript.BibEntry
	cites      []*manuscript.CiteNode
	eqNumbers  map[*manuscript.MathBlock]string

	src []byte // the manuscript as read (normalised line ends)

	newlinesOnce sync.Once               // newlines, made by the first LineOf
	newlines     []int                   // offsets of the line feeds in Body
	memoMu       sync.Mutex              // guards memos
	memos        map[string]*memo        // writers' memos by name space (memo.go)
	dwMemo       map[string]*diag.DWNull // Durbin–Watson null distributions by design
	hashes       map[[2]string]string    // data column hashes, by (alias, column)
	pack         *cachePack              // the result cache's entries for this manuscript (cache.go)
	blocks       []*block
	byID         map[string]*block
	refs         []*manuscript.RefNode
	atNode       map[ast.Node]*block
	opts         Options
	data         *dataStore
	ran          bool
}

// block is one directive in the manuscript.
type block struct {
	kind     *Kind
	id       string
	line     int // file line of the opening fence
	endLine  int // file line of the closing fence
	startOff int // body offset of the opening fence line
	endOff   int // body offset just past the closing fence line
	node     *yaml.Node
	raw      map[string]any
	dir      Directive
	result   *Result
	err      error
	running  bool

	yaml    []byte // the YAML body until decodeBlock has read it
	ordinal int    // its place among the blocks of its kind (default id)

	specKey string // what the block asks for (cache lookup)
	fullKey string // specKey and the hashes of everything it read
	deps    deps   // what it read while running
	reused  bool   // its result came from the cache
	live    bool   // it ran in this build after all (Context.Live)
}

// Parse reads and parses a manuscript, decodes every directive strictly,
// and checks ids. It does not load data or run anything.
func Parse(path string, opts Options) (*Document, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("reading manuscript: %w", err)
	}
	if opts.reads == nil {
		opts.reads = &readLog{}
	}
	if opts.pending == nil {
		opts.pending = &sync.WaitGroup{}
	}
	opts.reads.noteBytes(path, src)
	return ParseBytes(path, src, opts)
}

// ParseBytes is Parse on manuscript bytes already read from path.
func ParseBytes(path string, src []byte, opts Options) (*Document, error) {
	if !manuscript.Utf8Valid(src) {
		return nil, manuscript.ErrAt(path, manuscript.FirstBadUTF8Line(src), "manuscript is not valid UTF-8")
	}
	src = bytes.ReplaceAll(src, []byte("\r\n"), []byte("\n"))
	if line, r := manuscript.FirstControlChar(src); line > 0 {
		return nil, manuscript.ErrAt(path, line, "the manuscript contains the control character U+%04X; remove it", r)
	}
	front, body, bodyLine, ok := manuscript.SplitFrontMatter(src)
	if !ok && bytes.HasPrefix(bytes.TrimPrefix(src, []byte("\xef\xbb\xbf")), []byte("---\n")) {
		return nil, manuscript.ErrAt(path, 1, "the front matter that starts here is never closed: end it with a line of --- (a rule at the very top of the text is written *** instead)")
	}
	meta, err := manuscript.ParseMeta(path, front)
	if err != nil {
		return nil, err
	}
	d := &Document{
		src:  src,
		File: path, Dir: filepath.Dir(path), Meta: meta,
		Body: body, BodyLine: bodyLine, byID: map[string]*block{}, atNode: map[ast.Node]*block{}, opts: opts,
	}
	d.data = newDataStore(d)
	d.Root = manuscript.NewMarkdown().Parser().Parse(text.NewReader(body))
	var errs []error
	ordinal := map[string]int{}
	// The fenced blocks in order: each a directive to decode, or an
	// error found on the way (an unknown kind), or neither.
	type found struct {
		n   *ast.FencedCodeBlock
		b   *block
		err error
	}
	var blocks []found
	_ = ast.Walk(d.Root, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		switch n := n.(type) {
		case *ast.FencedCodeBlock:
			if b, err := d.discoverBlock(n, ordinal); err != nil || b != nil {
				blocks = append(blocks, found{n, b, err})
			}
		case *manuscript.RefNode:
			d.refs = append(d.refs, n)
		}
		return ast.WalkContinue, nil
	})
	// Decoding the directives' YAML is most of a parse: it is shared
	// between two workers, and its errors are reported in order.
	parallel.For(len(blocks), 2, func(i int) bool {
		if f := &blocks[i]; f.err == nil {
			f.err = d.decodeBlock(f.b)
		}
		return true // every block is decoded, for every error
	})
	for _, f := range blocks {
		if f.err != nil {
			errs = append(errs, f.err)
			continue
		}
		d.blocks = append(d.blocks, f.b)
		d.atNode[f.n] = f.b
	}
	for _, b := range d.blocks {
		if prev, dup := d.byID[b.id]; dup {
			errs = append(errs, manuscript.ErrAt(path, b.line, "duplicate id %q (first used on line %d)", b.id, prev.line))
			continue
		}
		d.byID[b.id] = b
	}
	errs = append(errs, d.scanText()...)
	errs = append(errs, d.loadBibliography()...)
	if p := meta.LaTeX.Preamble; p != "" {
		full, err := confine(d.Dir, p, opts.AllowOutside)
		if err == nil {
			d.Preamble, err = os.ReadFile(full)
		}
		if err == nil {
			opts.reads.noteBytes(full, d.Preamble)
		}
		if err != nil {
			errs = append(errs, manuscript.ErrAt(path, meta.Lines["latex"], "latex: preamble: %v", strings.Replace(err.Error(), "data file", "file", 1)))
		} else if line, r := manuscript.FirstControlChar(d.Preamble); line > 0 {
			errs = append(errs, manuscript.ErrAt(p, line, "the preamble contains the control character U+%04X", r))
		}
	}
	if _, err := meta.LaTeX.FloatMode(); err != nil {
		errs = append(errs, manuscript.ErrAt(path, meta.Lines["latex"], "%v", err))
	}
	d.placeReferences()
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	return d, nil
}

// LineOf converts a body offset to a file line.
func (d *Document) LineOf(off int) int {
	if off > len(d.Body) {
		off = len(d.Body)
	}
	d.newlinesOnce.Do(func() {
		// the offsets of the body's line feeds, found once: counting them
		// afresh for every directive, citation and reference was
		// quadratic in the manuscript's length
		for i, c := range d.Body {
			if c == '\n' {
				d.newlines = append(d.newlines, i)
			}
		}
	})
	n, _ := slices.BinarySearch(d.newlines, off) // line feeds before off
	return d.BodyLine + n
}

func (d *Document) discoverBlock(n *ast.FencedCodeBlock, ordinal map[string]int) (*block, error) {
	if n.Info == nil {
		return nil, nil
	}
	info := strings.Fields(string(n.Info.Segment.Value(d.Body)))
	if len(info) == 0 || info[0] != "galley" {
		return nil, nil
	}
	infoOff := n.Info.Segment.Start
	lineStart := bytes.LastIndexByte(d.Body[:infoOff], '\n') + 1
	line := d.LineOf(infoOff)
	if len(info) < 2 {
		return nil, manuscript.ErrAt(d.File, line, "a galley block needs a directive kind after \"galley\"; kinds: %s", strings.Join(kindNames(), ", "))
	}
	k, err := LookupKind(info[1])
	if err != nil {
		return nil, manuscript.WrapAt(d.File, line, err)
	}
	var body bytes.Buffer
	lines := n.Lines()
	for i := 0; i < lines.Len(); i++ {
		s := lines.At(i)
		body.Write(s.Value(d.Body))
	}
	b := &block{kind: k, line: line, startOff: lineStart, yaml: body.Bytes()}
	b.endOff, b.endLine = d.closingFence(n, line)
	ordinal[k.Name]++
	b.ordinal = ordinal[k.Name]
	return b, nil
}

// decodeBlock decodes a directive's YAML body into its kind's spec
// (strictly: unknown keys are errors) and sets its id. It touches only
// b, so that blocks can be decoded side by side.
func (d *Document) decodeBlock(b *block) error {
	k, bodyLine := b.kind, b.line+1
	dir := k.New()
	var root yaml.Node
	if err := yaml.Unmarshal(b.yaml, &root); err != nil {
		return manuscript.YamlError(d.File, bodyLine, err)
	}
	b.yaml = nil
	if len(root.Content) > 0 {
		doc := root.Content[0]
		if doc.Kind != yaml.MappingNode {
			return manuscript.ErrAt(d.File, bodyLine, "the body of a galley %s block must be YAML keys and values", k.Name)
		}
		manuscript.RejoinFlowLists(doc)
		if err := manuscript.CheckKeys(doc, dir); err != nil {
			return manuscript.YamlError(d.File, bodyLine, err)
		}
		if err := doc.Decode(dir); err != nil {
			return manuscript.YamlError(d.File, bodyLine, err)
		}
		if err := doc.Decode(&b.raw); err != nil {
			return manuscript.YamlError(d.File, bodyLine, err)
		}
		b.node = doc
	}
	b.dir = dir
	if m := dir.Base().Missing; m != "" && m != "error" && m != "drop" {
		return manuscript.ErrAt(d.File, d.keyLine(b, "missing"), "missing: %q is not a choice; write error (the default) or drop", m)
	}
	b.id = dir.Base().ID
	if b.id == "" {
		b.id = fmt.Sprintf("%s-%d", k.Name, b.ordinal)
	} else if !ValidID(b.id) {
		return manuscript.ErrAt(d.File, d.keyLine(b, "id"), "id %q: use letters, digits, '_' and '-', starting with a letter, at most %d characters", shorten(b.id), MaxIDLength)
	}
	return nil
}

// closingFence finds the closing fence of a fenced block: the body offset
// just past it and its file line.
func (d *Document) closingFence(n *ast.FencedCodeBlock, openLine int) (int, int) {
	off := bytes.IndexByte(d.Body[n.Info.Segment.Start:], '\n')
	if off < 0 {
		return len(d.Body), openLine
	}
	pos := n.Info.Segment.Start + off + 1
	lines := n.Lines()
	if lines.Len() > 0 {
		pos = lines.At(lines.Len() - 1).Stop
	}
	// The closing fence is the next line (if any) after the content.
	rest := d.Body[pos:]
	nl := bytes.IndexByte(rest, '\n')
	if nl < 0 {
		return len(d.Body), d.LineOf(len(d.Body))
	}
	return pos + nl + 1, d.LineOf(pos)
}

// keyLine is the file line of a top-level key in a block's YAML, or the
// fence line when the key is absent.
func (d *Document) keyLine(b *block, key string) int {
	if b.node != nil {
		for i := 0; i+1 < len(b.node.Content); i += 2 {
			if b.node.Content[i].Value == key {
				return b.line + b.node.Content[i].Line
			}
		}
	}
	return b.line
}

// MaxIDLength bounds an id: ids name figure and table files, which file
// systems limit to 255 bytes.
const MaxIDLength = 64

// ValidID reports whether s can be a directive's id: letters, digits, '_'
// and '-', starting with a letter, at most MaxIDLength characters.
func ValidID(s string) bool {
	if len(s) > MaxIDLength {
		return false
	}
	for i, r := range s {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z':
		case i > 0 && (r >= '0' && r <= '9' || r == '_' || r == '-'):
		default:
			return false
		}
	}
	return s != ""
}

// Check validates every directive and inline reference without running
// any analysis. Data files are read to check aliases and columns.
func (d *Document) Check() error {
	var errs []error
	for _, b := range d.blocks {
		c := &Context{doc: d, b: b}
		if err := b.dir.Check(c); err != nil {
			errs = append(errs, manuscript.WrapAt(d.File, b.line, err))
		}
	}
	for _, r := range d.refs {
		if _, err := d.checkRef(r); err != nil {
			errs = append(errs, err)
		}
	}
	return errors.Join(errs...)
}

// Run runs every directive (each once; references between directives run
// their target first) and numbers tables and figures in document order.
func (d *Document) Run() error {
	if err := d.Check(); err != nil {
		return err
	}
	var errs []error
	for _, b := range d.blocks {
		if _, err := d.run(b); err != nil && !errors.Is(err, errUpstream) {
			errs = append(errs, err)
		}
	}
	d.cacheFlush()
	if len(errs) > 0 {
		return errors.Join(errs...)
	}
	d.number()
	if err := d.collectReferences(); err != nil {
		return err
	}
	for _, r := range d.refs {
		if _, err := d.Inline(r); err != nil {
			errs = append(errs, err)
		}
	}
	d.ran = true
	return errors.Join(errs...)
}

var errUpstream = errors.New("an upstream directive failed")

func (d *Document) run(b *block) (*Result, error) {
	if b.result != nil || b.err != nil {
		return b.result, b.err
	}
	if b.running {
		return nil, manuscript.ErrAt(d.File, b.line, "directive %q depends on itself", b.id)
	}
	b.running = true
	defer func() { b.running = false }()
	version := ""
	if d.opts.Cache != nil {
		version = d.opts.Cache.Version
	}
	b.specKey = d.specKey(b, version)
	if res, key, ok := d.cacheLookup(b); ok {
		b.result, b.fullKey, b.reused = res, key, true
		return res, nil
	}
	if d.opts.Progress != nil {
		d.opts.Progress(fmt.Sprintf("%s %s (line %d)", b.kind.Name, b.id, b.line))
	}
	b.deps = deps{}
	c := &Context{doc: d, b: b}
	res, err := safeRun(b.dir, c)
	if err != nil {
		b.err = manuscript.WrapAt(d.File, b.line, err)
		return nil, b.err
	}
	res.ID, res.Kind, res.Line, res.Spec = b.id, b.kind.Name, b.line, b.raw
	if res.Values == nil {
		res.Values = map[string]any{}
	}
	if res.Table != nil && res.Table.Caption == "" {
		res.Table.Caption = b.dir.Base().Caption
	}
	if res.Figure != nil && res.Figure.Caption == "" {
		res.Figure.Caption = b.dir.Base().Caption
	}
	if note := b.dir.Base().Note; note != "" {
		if res.Table != nil {
			res.Table.Notes = append(res.Table.Notes, note)
		}
		if res.Figure != nil {
			res.Figure.Notes = append(res.Figure.Notes, note)
		}
	}
	if res.Figure != nil && d.opts.PNG > 0 {
		png, err := res.Figure.RenderPNG(d.opts.PNG)
		if err != nil {
			b.err = manuscript.WrapAt(d.File, b.line, err)
			return nil, b.err
		}
		res.Figure.PNG, res.Figure.PNGDPI = png, d.opts.PNG
	}
	b.result = res
	cols, ups, full := d.recordDeps(b)
	b.fullKey = full
	d.cacheStore(b, cols, ups)
	return res, nil
}

// Reused lists the ids of the results taken from the cache; Ran those
// computed in this build.
func (d *Document) Reused() []string { return d.idsWhere(func(b *block) bool { return b.reused }) }

// Ran lists the ids of the results computed in this build.
func (d *Document) Ran() []string {
	return d.idsWhere(func(b *block) bool { return b.result != nil && !b.reused })
}

func (d *Document) idsWhere(f func(*block) bool) []string {
	var out []string
	for _, b := range d.blocks {
		if f(b) {
			out = append(out, b.id)
		}
	}
	return out
}

// safeRun turns a panic inside an analysis into an error, so that a bug
// never leaves a half-written output behind.
func safeRun(dir Directive, c *Context) (res *Result, err error) {
	defer func() {
		if p := recover(); p != nil {
			res, err = nil, fmt.Errorf("internal error while running this directive: %v (please report it)", p)
		}
	}()
	res, err = dir.Run(c)
	if err == nil && res == nil {
		err = errors.New("internal error: the directive produced no result")
	}
	return res, err
}

// Results lists the results in document order (after Run).
func (d *Document) Results() []*Result {
	out := make([]*Result, 0, len(d.blocks))
	for _, b := range d.blocks {
		if b.result != nil {
			out = append(out, b.result)
		}
	}
	return out
}

// Inputs lists the data files read, with their SHA-256.
func (d *Document) Inputs() []resultsfile.Input { return d.data.inputs() }

// IDs lists the directives' ids in document order.
func (d *Document) IDs() []string { return d.ids() }

// Directives is the number of directive blocks.
func (d *Document) Directives() int { return len(d.blocks) }

// ResultAt is the result of the directive written as the fenced block n,
// or ok false when n is an ordinary code block. The error says a
// directive has not run.
func (d *Document) ResultAt(n ast.Node) (res *Result, ok bool, err error) {
	b, ok := d.atNode[n]
	if !ok {
		return nil, false, nil
	}
	if b.result == nil {
		return nil, true, fmt.Errorf("directive %q has not run", b.id)
	}
	return b.result, true, nil
}

// Span is where a directive stands in the body: the offsets of its
// opening fence line and just past its closing fence, and its result.
type Span struct {
	Start, End int
	Result     *Result
}

// Spans lists the directives in document order, for a writer that keeps
// the author's text and replaces each block.
func (d *Document) Spans() ([]Span, error) {
	out := make([]Span, 0, len(d.blocks))
	for _, b := range d.blocks {
		if b.result == nil {
			return nil, fmt.Errorf("directive %q has not run", b.id)
		}
		out = append(out, Span{b.startOff, b.endOff, b.result})
	}
	return out, nil
}

// InlineNodes lists the inline values of the body in document order.
func (d *Document) InlineNodes() []*manuscript.RefNode { return d.refs }

// shorten cuts a long text for a message.
func shorten(s string) string {
	if r := []rune(s); len(r) > 40 {
		return string(r[:40]) + "…"
	}
	return s
}
