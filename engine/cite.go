package engine

import (
	"fmt"
	"os"
	"slices"
	"strings"
	"sync"

	"github.com/yuin/goldmark/ast"

	"github.com/galley-econ/galley/manuscript"
)

// loadBibliography reads the BibTeX file the front matter names and
// checks every citation's keys (before anything runs).
func (d *Document) loadBibliography() []error {
	var errs []error
	if p := d.Meta.Bibliography; p != "" {
		line := d.Meta.Lines["bibliography"]
		full, err := confine(d.Dir, p, d.opts.AllowOutside)
		if err != nil {
			return []error{manuscript.ErrAt(d.File, line, "bibliography: %v", strings.Replace(err.Error(), "data file", "file", 1))}
		}
		src, err := os.ReadFile(full)
		if err != nil {
			return []error{manuscript.ErrAt(d.File, line, "bibliography: %v", err)}
		}
		d.opts.reads.noteBytes(full, src)
		lib, err := manuscript.ParseBib(p, src)
		if err != nil {
			return []error{err}
		}
		d.bib = lib
	}
	for _, n := range d.cites {
		for _, k := range n.Keys {
			if _, err := d.entry(k); err != nil {
				errs = append(errs, manuscript.ErrAt(d.File, d.LineOf(n.Offset), "\\%s{%s}: %v", n.Cmd, strings.Join(n.Keys, ","), err))
			}
		}
	}
	return errs
}

// placeReferences puts the reference list's node before the appendix
// (the first top-level block at or after its start) or at the end.
func (d *Document) placeReferences() {
	n := &manuscript.ReferencesNode{}
	if at := d.Outline.AppendixAt; at >= 0 {
		for c := d.Root.FirstChild(); c != nil; c = c.NextSibling() {
			if c.Type() == ast.TypeBlock && c.Lines().Len() > 0 && c.Lines().At(0).Start >= at {
				d.Root.InsertBefore(d.Root, c, n)
				return
			}
			if f, ok := c.(*ast.FencedCodeBlock); ok && f.Info != nil && f.Info.Segment.Start >= at {
				d.Root.InsertBefore(d.Root, c, n)
				return
			}
		}
	}
	d.Root.AppendChild(d.Root, n)
}

// entry finds a work by key: in the manuscript's bibliography, else in
// galley's reference table.
func (d *Document) entry(key string) (*manuscript.BibEntry, error) {
	if d.bib != nil {
		if e, ok := d.bib.Entries[key]; ok {
			return e, nil
		}
	}
	if e, ok := manuscript.MethodEntry(key); ok {
		return d.methods.of(key, e), nil
	}
	methods := manuscript.MethodLibrary()
	var keys []string
	if d.bib != nil {
		keys = append(keys, d.bib.Keys...)
	}
	keys = append(keys, methods.Keys...)
	if key == "" {
		return nil, fmt.Errorf("an empty citation key")
	}
	if d.bib == nil && d.Meta.Bibliography == "" {
		return nil, fmt.Errorf("no work has the key %q: name a BibTeX file in the front matter (bibliography: refs.bib)%s", key, manuscript.DidYouMean(key, keys))
	}
	return nil, fmt.Errorf("no work in %s has the key %q%s", d.Meta.Bibliography, key, manuscript.DidYouMean(key, keys))
}

// methodCopies holds a document's own copies of the works of galley's
// reference table, which every document in the process shares: the
// suffixes a build gives its references (manuscript.AssignSuffixes) are
// then its own, whatever another build in the process (a nested build
// of another vintage, a watched rebuild, a test) gives them.
type methodCopies struct {
	mu sync.Mutex
	m  map[string]*manuscript.BibEntry
}

func (c *methodCopies) of(key string, e *manuscript.BibEntry) *manuscript.BibEntry {
	c.mu.Lock()
	defer c.mu.Unlock()
	if own, ok := c.m[key]; ok {
		return own
	}
	if c.m == nil {
		c.m = map[string]*manuscript.BibEntry{}
	}
	own := *e // Fields and Authors are only read
	c.m[key] = &own
	return &own
}

// Cite is the works a citation names, in order (after Run).
func (d *Document) Cite(n *manuscript.CiteNode) ([]*manuscript.BibEntry, error) {
	var out []*manuscript.BibEntry
	for _, k := range n.Keys {
		e, err := d.entry(k)
		if err != nil {
			return nil, manuscript.ErrAt(d.File, d.LineOf(n.Offset), "%v", err)
		}
		out = append(out, e)
	}
	return out, nil
}

// References is the reference list (after Run): every work cited in the
// prose and, with cite-methods: true, the works behind the directives'
// methods, sorted by author and year.
func (d *Document) References() []*manuscript.BibEntry { return d.references }

// collectReferences builds the reference list and gives works that
// share author and year their a, b suffixes.
func (d *Document) collectReferences() error {
	seen := map[string]bool{}
	var list []*manuscript.BibEntry
	add := func(key string) error {
		if seen[key] {
			return nil
		}
		e, err := d.entry(key)
		if err != nil {
			return err
		}
		// the same work under another key (the author's .bib and galley's
		// table) is listed once
		id := workID(e)
		seen[key] = true
		if seen[id] {
			return nil
		}
		seen[id] = true
		list = append(list, e)
		return nil
	}
	for _, n := range d.cites {
		for _, k := range n.Keys {
			if err := add(k); err != nil {
				return manuscript.ErrAt(d.File, d.LineOf(n.Offset), "%v", err)
			}
		}
	}
	if d.Meta.CiteMethods {
		for _, b := range d.blocks {
			if b.result == nil {
				continue
			}
			for _, k := range b.result.Cites {
				if err := add(k); err != nil {
					return manuscript.ErrAt(d.File, b.line, "internal error: the %s directive names a work galley's reference table lacks: %v", b.kind.Name, err)
				}
			}
		}
	}
	manuscript.SortReferences(list)
	manuscript.AssignSuffixes(list)
	d.references = slices.Clip(list)
	return nil
}

// Cites lists the citations of the body in document order.
func (d *Document) Cites() []*manuscript.CiteNode { return d.cites }

// workID identifies a work across bibliographies: first author, year and
// the start of the title, as plain lower-case letters.
func workID(e *manuscript.BibEntry) string {
	norm := func(s string) string {
		var b strings.Builder
		for _, r := range strings.ToLower(s) {
			if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
				b.WriteRune(r)
			}
		}
		return b.String()
	}
	t := norm(e.Field("title"))
	if len(t) > 30 {
		t = t[:30]
	}
	return "\x00" + norm(e.Authors[0].Surname()) + "|" + e.Fields["year"] + "|" + t
}
