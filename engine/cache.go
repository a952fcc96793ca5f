package engine

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/gob"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"maps"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"

	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/checksum"
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
	// Map reads the cache's files by mapping them into memory (mapFile),
	// which is never undone: for a process that ends after one build,
	// not for one that builds again and again.
	Map bool
	// Async writes the cache's files (the pack, the stored results file)
	// in the background, beside the rendering of the outputs; the caller
	// must then call Document.Wait before it exits.
	Async bool
}

// later runs write in the background if the cache is asynchronous (the
// build's Wait waits for it), else now.
func (d *Document) later(write func()) {
	if !d.opts.Cache.Async || d.opts.pending == nil {
		write()
		return
	}
	d.opts.pending.Add(1)
	go func() {
		defer d.opts.pending.Done()
		write()
	}()
}

// Wait writes the writers' memos (memo.go) and returns when every cache
// file this build (and any nested build it made) writes in the
// background is written. A caller that keeps a cache calls it once its
// outputs are rendered.
func (d *Document) Wait() {
	d.flushMemos()
	if d.opts.pending != nil {
		d.opts.pending.Wait()
	}
}

// read returns the bytes of one of the cache's files.
func (c *Cache) read(path string) ([]byte, error) {
	if c.Map {
		return mapFile(path)
	}
	return os.ReadFile(path)
}

const cacheMagic = "galley-cache-4"

// cacheEntry is one stored result with the inputs it depended on.
type cacheEntry struct {
	Magic    string
	Version  string
	SpecKey  string
	Columns  []colDep
	Upstream []upDep
	FullKey  string
	Result   *Result
	// Trees holds the result's Values, Spec and Test.Extra in the tree
	// codec (treecodec.go), which those fields are then empty of; nil
	// when a value has a type the codec does not know, and the fields
	// are stored by gob (toGob).
	Trees []byte
	// Blobs places the figure's SVG, PDF and PNG bytes, which the
	// Figure in Result is then empty of, in the pack's byte section
	// after the entries (offset and length each; length −1 for nil), so
	// that they are read in place rather than copied by gob; blobs holds
	// them while the entry is in memory.
	Blobs []int
	blobs [][]byte
	trees *entryTrees // Trees decoded (decodeTrees), nil until then
}

// entryTrees are an entry's decoded trees; ok false if they were damaged.
type entryTrees struct {
	values, spec, extra map[string]any
	ok                  bool
}

// decodeTrees decodes the entry's Trees (strs interns short strings).
func (e *cacheEntry) decodeTrees(strs map[string]string) {
	r := treeReader{b: e.Trees, strs: strs}
	t := &entryTrees{}
	var ok bool
	if t.values, ok = r.value().(map[string]any); ok {
		t.spec, _ = r.value().(map[string]any)
		t.extra, _ = r.value().(map[string]any)
		t.ok = r.err == nil && len(r.b) == 0
	}
	e.trees = t
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

// registerGob registers the types gob meets inside stored values, once,
// before the first pack is read or written (not at start-up: it cost
// every command, --version included, 0.3 ms).
var registerGob = sync.OnceFunc(func() {
	// []contract.Break: a test's break dates in Outcome.Extra (without it
	// gob refused a gregory-hansen result and no pack was written)
	for _, v := range []any{map[string]any{}, []any{}, []map[string]any{}, []float64{}, []string{}, []int{}, []bool{}, nilValue{}, [][]float64{}, map[string]float64{}, []contract.Break{}} {
		gob.Register(v)
	}
})

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
			d.opts.reads.note(full, "")
			return "", false
		}
		return d.opts.reads.noteBytes(full, raw), true
	}
	sums, err := d.data.columnSums(alias)
	if err != nil {
		return "", false
	}
	h, ok := sums.Hashes[col]
	return h, ok
}

// cachePack holds the result cache's entries for one manuscript (its
// path, vintage and nesting): one file, read with one gob decoder when
// the first directive looks for its result and written once at the end
// of a build in which anything ran, instead of one file and one decoder
// per entry (a decoder compiles the types of what it reads each time).
type cachePack struct {
	path    string
	entries map[string]*cacheEntry        // as stored (gob form), by spec key
	used    map[string]*cacheEntry        // reused in this build (values restored)
	stored  map[string]func() *cacheEntry // run in this build: its entry in gob form, made when the pack is written
	loaded  bool                          // the file was read and is current
}

// packHeader starts a pack file; N entries follow in the same stream.
// The file is the stream's length (8 bytes, little-endian), the stream,
// and the figures' bytes (cacheEntry.Blobs).
type packHeader struct {
	Magic, Version string
	N              int
}

// cacheSlot names the files the cache keeps for this manuscript.
func (d *Document) cacheSlot() (string, bool) {
	abs, err := filepath.Abs(d.File)
	if err != nil {
		return "", false
	}
	h := sha256.New()
	for _, s := range []string{cacheMagic, abs, d.opts.Vintage, fmt.Sprint(d.opts.nested)} {
		h.Write([]byte(s))
		h.Write([]byte{0})
	}
	return hex.EncodeToString(h.Sum(nil)), true
}

// cachePack loads this manuscript's pack (once); nil without a cache.
func (d *Document) cachePack() *cachePack {
	c := d.opts.Cache
	if c == nil || c.Dir == "" {
		return nil
	}
	if d.pack != nil {
		return d.pack
	}
	p := &cachePack{entries: map[string]*cacheEntry{}, used: map[string]*cacheEntry{}, stored: map[string]func() *cacheEntry{}}
	d.pack = p
	slot, ok := d.cacheSlot()
	if !ok {
		return p
	}
	p.path = filepath.Join(c.Dir, "pack", slot+".gob")
	if c.Fresh {
		return p // every result is computed again and the pack rewritten
	}
	raw, err := c.read(p.path)
	if err != nil || len(raw) < 8 {
		return p
	}
	n := binary.LittleEndian.Uint64(raw)
	if n > uint64(len(raw)-8) {
		return p // corrupt: rewritten at the end
	}
	blob := raw[8+n:]
	registerGob()
	dec := gob.NewDecoder(bytes.NewReader(raw[8 : 8+n]))
	var h packHeader
	if dec.Decode(&h) != nil || h.Magic != cacheMagic || h.Version != c.Version || h.N < 0 {
		return p // corrupt, foreign or stale: rewritten at the end
	}
	entries := make(map[string]*cacheEntry, h.N)
	// While gob decodes the entries one after another, a second worker
	// decodes each one's trees (its values), which took as long again.
	trees := make(chan *cacheEntry, 8)
	var worker sync.WaitGroup
	worker.Add(1)
	go func() {
		defer worker.Done()
		strs := map[string]string{}
		for e := range trees {
			e.decodeTrees(strs)
		}
	}()
	for i := 0; i < h.N; i++ {
		e := new(cacheEntry)
		if dec.Decode(e) != nil || !e.takeBlobs(blob) {
			close(trees)
			worker.Wait()
			return p // corrupt: ignore the whole pack
		}
		if e.Trees != nil {
			trees <- e
		}
		entries[e.SpecKey] = e
	}
	close(trees)
	worker.Wait()
	p.entries, p.loaded = entries, true
	return p
}

// lookup returns a stored result for b if every recorded input is unchanged.
func (d *Document) cacheLookup(b *block) (*Result, string, bool) {
	c := d.opts.Cache
	if c == nil || c.Fresh {
		return nil, "", false
	}
	p := d.cachePack()
	if p == nil {
		return nil, "", false
	}
	e, ok := p.entries[b.specKey]
	if !ok {
		return nil, "", false
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
	if e.Trees != nil && (e.trees == nil || !e.trees.ok) {
		return nil, "", false // damaged: run again
	}
	// the directive may have moved since the entry was stored (prose
	// added above it): its result is at its line in this build
	// The entry is handed out: its gob form is rebuilt if the pack is
	// written again (cacheFlush).
	delete(p.entries, b.specKey)
	p.used[b.specKey] = e
	e.Result.Line = b.line
	if f := e.Result.Figure; f != nil && e.blobs != nil {
		f.SVG, f.PDF, f.PNG = e.blobs[0], e.blobs[1], e.blobs[2]
		e.blobs = nil
	}
	if e.Trees != nil {
		t := e.trees
		e.Result.Values = t.values
		if t.spec != nil {
			e.Result.Spec = t.spec
		}
		if t.extra != nil && e.Result.Test != nil {
			e.Result.Test.Extra = t.extra
		}
		e.trees = nil
		e.Trees = nil
	} else {
		e.Result.Values = fromGob(e.Result.Values).(map[string]any)
		if e.Result.Spec != nil {
			e.Result.Spec = fromGob(e.Result.Spec).(map[string]any)
		}
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

// cacheStore keeps b's result for the pack written at the end of the
// build (cacheFlush).
func (d *Document) cacheStore(b *block, cols []colDep, ups []upDep) {
	p := d.cachePack()
	if p == nil {
		return
	}
	delete(p.entries, b.specKey)
	delete(p.used, b.specKey)
	p.stored[b.specKey] = laterEntry(d.opts.Cache.Version, b.specKey, b.fullKey, cols, ups, b.result)
}

// laterEntry returns what makes res's cache entry (gobEntry) when the
// pack is written — in the background under Cache.Async, beside the
// rendering. The values a directive returned are not changed once it
// has run; the copies keep the result's fields and its map of values as
// they are now (numbering, which follows, sets the fields and a
// figure's "number").
func laterEntry(version, specKey, fullKey string, cols []colDep, ups []upDep, res *Result) func() *cacheEntry {
	r := *res
	r.Values = maps.Clone(r.Values)
	return func() *cacheEntry { return gobEntry(version, specKey, fullKey, cols, ups, &r) }
}

// gobEntry is a cache entry for r in the form gob can carry: its
// free-form values in the tree codec, or else (a value of a type the
// codec does not know) as copies of its maps with nils replaced.
func gobEntry(version, specKey, fullKey string, cols []colDep, ups []upDep, res *Result) *cacheEntry {
	e := gobEntryValues(version, specKey, fullKey, cols, ups, res)
	if f := e.Result.Figure; f != nil {
		g := *f
		e.blobs = [][]byte{g.SVG, g.PDF, g.PNG}
		g.SVG, g.PDF, g.PNG = nil, nil, nil
		e.Result.Figure = &g
	}
	return e
}

// gobEntryValues is gobEntry with the figure's bytes still in place.
func gobEntryValues(version, specKey, fullKey string, cols []colDep, ups []upDep, res *Result) *cacheEntry {
	if trees, ok := encodeTrees(res); ok {
		r := *res
		r.Values, r.Spec = nil, nil
		if r.Test != nil {
			t := *r.Test
			t.Extra = nil
			r.Test = &t
		}
		return &cacheEntry{Magic: cacheMagic, Version: version, SpecKey: specKey, Columns: cols, Upstream: ups, FullKey: fullKey, Result: &r, Trees: trees}
	}
	r := *res
	r.Values = toGob(r.Values).(map[string]any)
	if r.Spec != nil {
		r.Spec = toGob(r.Spec).(map[string]any)
	}
	if r.Test != nil {
		t := *r.Test
		t.Extra = toGob(t.Extra).(map[string]any)
		r.Test = &t
	}
	return &cacheEntry{Magic: cacheMagic, Version: version, SpecKey: specKey, Columns: cols, Upstream: ups, FullKey: fullKey, Result: &r}
}

// maxIdleEntries bounds the entries a pack keeps for directives that are
// not in the current build (an edit undone finds its old result).
const maxIdleEntries = 64

// cacheFlush writes this manuscript's pack when the build stored a
// result or the pack on disk was missing or stale: the entries reused
// and stored in this build, and up to maxIdleEntries others it held. A
// failure to write only costs a rerun next time.
func (d *Document) cacheFlush() {
	p := d.pack
	if p == nil || p.path == "" || (p.loaded && len(p.stored) == 0) {
		return
	}
	c := d.opts.Cache
	var makers []func() *cacheEntry
	for _, b := range d.blocks { // document order
		if e, ok := p.stored[b.specKey]; ok {
			makers = append(makers, e)
		} else if e, ok := p.used[b.specKey]; ok {
			makers = append(makers, laterEntry(e.Version, e.SpecKey, e.FullKey, e.Columns, e.Upstream, e.Result))
		}
	}
	idle := make([]string, 0, len(p.entries))
	for k := range p.entries {
		idle = append(idle, k)
	}
	sort.Strings(idle)
	var kept []*cacheEntry
	for _, k := range idle[:min(len(idle), maxIdleEntries)] {
		kept = append(kept, p.entries[k])
	}
	d.later(func() {
		all := make([]*cacheEntry, 0, len(makers)+len(kept))
		for _, m := range makers {
			all = append(all, m())
		}
		all = append(all, kept...)
		// sizes up front: the pack of a large data set is hundreds of
		// MB, and growing it by doubling copied it several times
		nblob, est := 0, 4096
		for _, e := range all {
			for _, b := range e.blobs {
				nblob += len(b)
			}
			est += 1024 + len(e.Trees)
			if e.Result != nil {
				for _, d := range e.Result.Series {
					est += 16 * len(d.Values)
				}
				for _, d := range e.Result.Relations {
					est += 16 * len(d.Values)
				}
			}
		}
		writePack(p.path, c.Version, all, nblob, est)
	})
	p.loaded = true
}

// writePack encodes the entries and writes the pack file; a failure
// only costs a rerun next time.
func writePack(path, version string, all []*cacheEntry, nblob, est int) {
	blob := placeBlobs(all, nblob)
	// (a buffer from make: bytes.Buffer's Grow would clear it all first)
	buf := bytes.NewBuffer(make([]byte, 8, 8+est+nblob)) // the stream's length, below
	registerGob()
	enc := gob.NewEncoder(buf)
	if enc.Encode(packHeader{Magic: cacheMagic, Version: version, N: len(all)}) != nil {
		return
	}
	for _, e := range all {
		if enc.Encode(e) != nil {
			return
		}
	}
	out := buf.Bytes()
	binary.LittleEndian.PutUint64(out, uint64(len(out)-8))
	out = append(out, blob...)
	_ = atomicfile.WriteUnsynced(path, out, 0o644)
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
	slot, ok := d.cacheSlot()
	if !ok {
		return "", "", false
	}
	h := sha256.New()
	write := func(s string) {
		h.Write([]byte(s))
		h.Write([]byte{0})
	}
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
// results if there is one, else render()'s, storing it. render(h)
// returns the file after h bytes of room for the slot's header (so that
// the stored form is not a second copy of the file).
func (d *Document) cachedResults(version string, render func(headroom int) ([]byte, error)) ([]byte, error) {
	path, key, ok := d.resultsSlot(version)
	if !ok {
		return render(0)
	}
	// stored as the key, the CRC-32C of the file (against a torn or
	// damaged file; hardware-fast where SHA-256 cost 1 ms on the demo),
	// a line feed, the file
	head := []byte(key + " ")
	if !d.opts.Cache.Fresh {
		if b, err := d.opts.Cache.read(path); err == nil && bytes.HasPrefix(b, head) {
			if sum, body, ok := bytes.Cut(b[len(head):], []byte("\n")); ok && string(sum) == checksum.Hex(body) {
				return body, nil
			}
		}
	}
	room := len(head) + checksum.Size + 1
	b, err := render(room)
	if err != nil {
		return nil, err
	}
	body := b[room:]
	copy(b, head)
	copy(b[len(head):], checksum.Hex(body))
	b[room-1] = '\n'
	d.later(func() { _ = atomicfile.WriteUnsynced(path, b, 0o644) }) // a failure costs a render next time
	return body, nil
}

// encodeTrees encodes a result's Values, Spec and Test.Extra (in that
// order) in the tree codec; false if one holds a type it does not know.
func encodeTrees(res *Result) ([]byte, bool) {
	var extra map[string]any
	if res.Test != nil {
		extra = res.Test.Extra
	}
	b := make([]byte, 0, 1024)
	var err error
	for _, v := range []map[string]any{res.Values, res.Spec, extra} {
		if b, err = appendTree(b, v); err != nil {
			return nil, false
		}
	}
	return b, true
}

// placeBlobs lays the entries' figure bytes one after another in the
// pack's byte section (room for nblob bytes) and sets each entry's
// Blobs to their offsets and lengths (takeBlobs reads them back).
func placeBlobs(all []*cacheEntry, nblob int) []byte {
	blob := make([]byte, 0, nblob)
	for _, e := range all {
		e.Blobs = e.Blobs[:0]
		for _, b := range e.blobs {
			if b == nil {
				e.Blobs = append(e.Blobs, 0, -1)
				continue
			}
			e.Blobs = append(e.Blobs, len(blob), len(b))
			blob = append(blob, b...)
		}
	}
	return blob
}

// takeBlobs points the entry's figure bytes into blob, the pack's byte
// section (read in place, not copied); false if Blobs does not fit it.
func (e *cacheEntry) takeBlobs(blob []byte) bool {
	if len(e.Blobs) == 0 {
		return true
	}
	if len(e.Blobs) != 6 || e.Result == nil || e.Result.Figure == nil {
		return false
	}
	e.blobs = make([][]byte, 3)
	for i := range e.blobs {
		off, n := e.Blobs[2*i], e.Blobs[2*i+1]
		if n == -1 {
			continue
		}
		if off < 0 || n < 0 || off > len(blob) || n > len(blob)-off {
			return false
		}
		e.blobs[i] = blob[off : off+n : off+n]
	}
	return true
}
