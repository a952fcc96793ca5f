package engine

import (
	"bytes"
	"crypto/sha256"
	"encoding/gob"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/galley-econ/galley/internal/atomicfile"
)

// Cache stores directive results between builds. An entry is found by
// the hash of what a directive says (its kind, id, spec and the
// document's defaults, and galley's version) and is reused only when
// every input it recorded when it ran is unchanged: the bytes of each
// data column it read, the dates of each data file, and the identity of
// each upstream result. A corrupt, foreign or stale entry is ignored and
// the directive runs again.
type Cache struct {
	Dir     string
	Version string
	// Fresh ignores existing entries (they are overwritten).
	Fresh bool
}

const cacheMagic = "galley-cache-1"

// cacheEntry is one stored result with the inputs it depended on.
type cacheEntry struct {
	Magic    string
	Version  string
	SpecKey  string
	Columns  []colDep
	Upstream []upDep
	FullKey  string
	Result   *Result
}

type colDep struct{ Alias, Column, Hash string }

type upDep struct{ ID, FullKey string }

// deps is what a directive read while it ran.
type deps struct {
	cols     map[[2]string]bool // (alias, column); column "" = the date axis
	upstream map[string]bool
}

func (d *deps) col(alias, col string) {
	if d.cols == nil {
		d.cols = map[[2]string]bool{}
	}
	d.cols[[2]string{alias, col}] = true
}

func (d *deps) up(id string) {
	if d.upstream == nil {
		d.upstream = map[string]bool{}
	}
	d.upstream[id] = true
}

func init() {
	for _, v := range []any{map[string]any{}, []any{}, []map[string]any{}, []float64{}, []string{}, []int{}, []bool{}, nilValue{}, [][]float64{}, map[string]float64{}} {
		gob.Register(v)
	}
}

// nilValue stands for a nil inside stored values (gob cannot carry nil
// interface values).
type nilValue struct{}

func toGob(v any) any {
	switch x := v.(type) {
	case nil:
		return nilValue{}
	case map[string]any:
		out := make(map[string]any, len(x))
		for k, e := range x {
			out[k] = toGob(e)
		}
		return out
	case []any:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = toGob(e)
		}
		return out
	case []map[string]any:
		out := make([]map[string]any, len(x))
		for i, e := range x {
			out[i] = toGob(e).(map[string]any)
		}
		return out
	}
	return v
}

func fromGob(v any) any {
	switch x := v.(type) {
	case nilValue:
		return nil
	case map[string]any:
		for k, e := range x {
			x[k] = fromGob(e)
		}
	case []any:
		for i, e := range x {
			x[i] = fromGob(e)
		}
	case []map[string]any:
		for _, e := range x {
			fromGob(e)
		}
	}
	return v
}

// specKey identifies what a block asks for.
func (d *Document) specKey(b *block, version string) string {
	h := sha256.New()
	spec, _ := json.Marshal(b.raw)
	stars, _ := json.Marshal(d.Meta.Stars)
	dec := -1
	if d.Meta.Decimals != nil {
		dec = *d.Meta.Decimals
	}
	for _, s := range []string{cacheMagic, version, b.kind.Name, b.id, string(spec), string(stars), itoa(dec), itoa(d.opts.PNG), d.opts.Vintage, fmt.Sprint(d.opts.nested)} {
		h.Write([]byte(s))
		h.Write([]byte{0})
	}
	return hex.EncodeToString(h.Sum(nil))
}

// columnHash hashes one data column (or, for col "", the date axis). An
// alias "file:PATH" stands for a whole data file (relative to the
// manuscript), which a revision report reads through another build.
// Hashes are remembered for the build: every block that read a column
// checks it against the same hash.
func (d *Document) columnHash(alias, col string) (string, bool) {
	key := [2]string{alias, col}
	if h, ok := d.hashes[key]; ok {
		return h, h != ""
	}
	h, ok := d.hashColumn(alias, col)
	if d.hashes == nil {
		d.hashes = map[[2]string]string{}
	}
	d.hashes[key] = h
	return h, ok
}

// directivesDep is the pseudo-input of a result that reads the whole
// build (a revision report): the list of the document's directives, so
// that adding or removing one invalidates it.
const directivesDep = "doc:directives"

func (d *Document) hashColumn(alias, col string) (string, bool) {
	if alias == directivesDep {
		h := sha256.New()
		for _, b := range d.blocks {
			fmt.Fprintf(h, "%s\x00%s\x00", b.id, b.kind.Name)
		}
		return hex.EncodeToString(h.Sum(nil)), true
	}
	if p, ok := strings.CutPrefix(alias, "file:"); ok {
		full, err := confine(d.Dir, p, d.opts.AllowOutside)
		if err != nil {
			return "", false
		}
		raw, err := os.ReadFile(full)
		if err != nil {
			return "", false
		}
		sum := sha256.Sum256(raw)
		return hex.EncodeToString(sum[:]), true
	}
	sums, err := d.data.columnSums(alias)
	if err != nil {
		return "", false
	}
	h, ok := sums.Hashes[col]
	return h, ok
}

func (c *Cache) path(specKey string) string { return filepath.Join(c.Dir, specKey[:2], specKey+".gob") }

// lookup returns a stored result for b if every recorded input is unchanged.
func (d *Document) cacheLookup(b *block) (*Result, string, bool) {
	c := d.opts.Cache
	if c == nil || c.Fresh {
		return nil, "", false
	}
	raw, err := os.ReadFile(c.path(b.specKey))
	if err != nil {
		return nil, "", false
	}
	var e cacheEntry
	if err := gob.NewDecoder(bytes.NewReader(raw)).Decode(&e); err != nil {
		return nil, "", false // corrupt: ignore
	}
	if e.Magic != cacheMagic || e.Version != c.Version || e.SpecKey != b.specKey || e.Result == nil {
		return nil, "", false // foreign or stale
	}
	for _, cd := range e.Columns {
		h, ok := d.columnHash(cd.Alias, cd.Column)
		if !ok || h != cd.Hash {
			return nil, "", false
		}
	}
	for _, u := range e.Upstream {
		ub, ok := d.byID[u.ID]
		if !ok {
			return nil, "", false
		}
		if _, err := d.run(ub); err != nil || ub.fullKey != u.FullKey {
			return nil, "", false
		}
	}
	if e.FullKey != d.fullKey(b.specKey, e.Columns, e.Upstream) {
		return nil, "", false
	}
	// the directive may have moved since the entry was stored (prose
	// added above it): its result is at its line in this build
	e.Result.Line = b.line
	e.Result.Values = fromGob(e.Result.Values).(map[string]any)
	if e.Result.Spec != nil {
		e.Result.Spec = fromGob(e.Result.Spec).(map[string]any)
	}
	return e.Result, e.FullKey, true
}

// fullKey combines a block's spec key with the hashes of its inputs.
func (d *Document) fullKey(specKey string, cols []colDep, ups []upDep) string {
	h := sha256.New()
	h.Write([]byte(specKey))
	for _, c := range cols {
		h.Write([]byte("\x00c" + c.Alias + "\x00" + c.Column + "\x00" + c.Hash))
	}
	for _, u := range ups {
		h.Write([]byte("\x00u" + u.ID + "\x00" + u.FullKey))
	}
	return hex.EncodeToString(h.Sum(nil))
}

// recordDeps turns what a block read into sorted dependency lists and its
// full key.
func (d *Document) recordDeps(b *block) ([]colDep, []upDep, string) {
	var cols []colDep
	for k := range b.deps.cols {
		h, _ := d.columnHash(k[0], k[1])
		cols = append(cols, colDep{Alias: k[0], Column: k[1], Hash: h})
	}
	sort.Slice(cols, func(i, j int) bool {
		if cols[i].Alias != cols[j].Alias {
			return cols[i].Alias < cols[j].Alias
		}
		return cols[i].Column < cols[j].Column
	})
	var ups []upDep
	for id := range b.deps.upstream {
		if ub, ok := d.byID[id]; ok {
			ups = append(ups, upDep{ID: id, FullKey: ub.fullKey})
		}
	}
	sort.Slice(ups, func(i, j int) bool { return ups[i].ID < ups[j].ID })
	return cols, ups, d.fullKey(b.specKey, cols, ups)
}

// cacheStore writes b's result; failures only cost a rerun next time.
func (d *Document) cacheStore(b *block, cols []colDep, ups []upDep) {
	c := d.opts.Cache
	if c == nil {
		return
	}
	r := *b.result
	r.Values = toGob(r.Values).(map[string]any)
	if r.Spec != nil {
		r.Spec = toGob(r.Spec).(map[string]any)
	}
	if r.Test != nil {
		t := *r.Test
		t.Extra = toGob(t.Extra).(map[string]any)
		r.Test = &t
	}
	e := cacheEntry{Magic: cacheMagic, Version: c.Version, SpecKey: b.specKey, Columns: cols, Upstream: ups, FullKey: b.fullKey, Result: &r}
	var buf bytes.Buffer
	if err := gob.NewEncoder(&buf).Encode(&e); err != nil {
		return
	}
	_ = atomicfile.WriteUnsynced(c.path(b.specKey), buf.Bytes(), 0o644)
}

// resultsSlot is where the cache keeps the last results file of this
// manuscript (one per manuscript, vintage and nesting, so that edits do
// not pile up copies), and resultsKey what it must match: galley's
// version, the inputs, and each result's full key, line and number.
// Every result with the same full key has the same values, so equal
// keys mean equal files.
func (d *Document) resultsSlot(version string) (path, key string, ok bool) {
	c := d.opts.Cache
	if c == nil || c.Dir == "" {
		return "", "", false
	}
	abs, err := filepath.Abs(d.File)
	if err != nil {
		return "", "", false
	}
	h := sha256.New()
	write := func(s string) {
		h.Write([]byte(s))
		h.Write([]byte{0})
	}
	for _, s := range []string{cacheMagic, abs, d.opts.Vintage, fmt.Sprint(d.opts.nested)} {
		write(s)
	}
	slot := hex.EncodeToString(h.Sum(nil))
	h.Reset()
	for _, s := range []string{cacheMagic, c.Version, version, filepath.Base(d.File), d.opts.Vintage} {
		write(s)
	}
	for _, in := range d.Inputs() {
		write(in.Path)
		write(in.SHA256)
	}
	for _, b := range d.blocks {
		if b.result == nil {
			continue
		}
		if b.fullKey == "" {
			return "", "", false
		}
		write(b.id)
		write(b.fullKey)
		write(itoa(b.result.Line))
		write(itoa(b.result.Number))
	}
	return filepath.Join(c.Dir, "results", slot+".json"), hex.EncodeToString(h.Sum(nil)), true
}

// cachedResults returns the results file stored for this build's
// results if there is one, else render()'s, storing it.
func (d *Document) cachedResults(version string, render func() ([]byte, error)) ([]byte, error) {
	path, key, ok := d.resultsSlot(version)
	if !ok {
		return render()
	}
	// stored as the key, the SHA-256 of the file, a line feed, the file
	head := []byte(key + " ")
	if !d.opts.Cache.Fresh {
		if b, err := os.ReadFile(path); err == nil && bytes.HasPrefix(b, head) {
			if sum, body, ok := bytes.Cut(b[len(head):], []byte("\n")); ok {
				got := sha256.Sum256(body)
				if hex.EncodeToString(got[:]) == string(sum) {
					return body, nil
				}
			}
		}
	}
	b, err := render()
	if err != nil {
		return nil, err
	}
	sum := sha256.Sum256(b)
	out := append(append(append(head, hex.EncodeToString(sum[:])...), '\n'), b...)
	_ = atomicfile.WriteUnsynced(path, out, 0o644) // a failure costs a render next time
	return b, nil
}
