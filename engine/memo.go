package engine

import (
	"encoding/binary"
	"os"
	"path/filepath"
	"sort"
	"sync"

	"github.com/galley-econ/galley/internal/atomicfile"
)

// A memo keeps strings a writer derives from the manuscript's text alone
// (the MathML of a formula) between builds, so that a rebuild after an
// edit converts only what changed. One file per manuscript and name
// space under the cache folder, stamped with galley's build identity
// (the conversion is galley's code, so another galley starts afresh).
// It holds the entries the last build used; a damaged, foreign or stale
// file is ignored.
type memo struct {
	mu      sync.Mutex
	path    string
	version string
	old     map[string]string // as read
	used    map[string]string // looked up or made in this build
	changed bool              // an entry was made (an unused one of old shows in the lengths)
}

const memoMagic = "galley-memo-1\n"

// Memo returns the string stored under key in the name space ns,
// computing and storing it if it is not there (or just computing it
// without a cache). compute must be a function of key alone and of
// galley's code. The memo is written by Wait.
func (d *Document) Memo(ns, key string, compute func() string) string {
	m := d.memo(ns)
	if m == nil {
		return compute()
	}
	m.mu.Lock()
	v, ok := m.used[key]
	if !ok {
		v, ok = m.old[key]
		if ok {
			m.used[key] = v
		}
	}
	m.mu.Unlock()
	if ok {
		return v
	}
	v = compute()
	m.mu.Lock()
	m.used[key], m.changed = v, true
	m.mu.Unlock()
	return v
}

// memo returns the memo of ns for this document (read on first use), or
// nil without a cache.
func (d *Document) memo(ns string) *memo {
	c := d.opts.Cache
	if c == nil || c.Dir == "" || d.opts.nested {
		return nil
	}
	d.memoMu.Lock()
	defer d.memoMu.Unlock()
	if m, ok := d.memos[ns]; ok {
		return m
	}
	slot, ok := d.cacheSlot()
	if !ok {
		return nil
	}
	m := &memo{path: filepath.Join(c.Dir, "memo", slot+"-"+ns), version: c.Version, used: map[string]string{}}
	if !c.Fresh {
		if raw, err := os.ReadFile(m.path); err == nil {
			m.old = decodeMemo(raw, c.Version)
		}
	}
	if d.memos == nil {
		d.memos = map[string]*memo{}
	}
	d.memos[ns] = m
	return m
}

// flushMemos writes every memo whose entries changed; a failure costs
// conversions next time.
func (d *Document) flushMemos() {
	d.memoMu.Lock()
	defer d.memoMu.Unlock()
	for _, m := range d.memos {
		m.mu.Lock()
		if m.changed || len(m.old) != len(m.used) {
			_ = atomicfile.WriteUnsynced(m.path, encodeMemo(m.used, m.version), 0o644)
			m.old, m.changed = m.used, false // what is on disk now
		}
		m.mu.Unlock()
	}
}

// encodeMemo writes the magic, the version and the entries (sorted by
// key): a count, then each key and value, in the tree codec's string
// form (treecodec.go).
func encodeMemo(entries map[string]string, version string) []byte {
	keys := make([]string, 0, len(entries))
	n := len(memoMagic) + len(version) + 16
	for k, v := range entries {
		keys = append(keys, k)
		n += len(k) + len(v) + 8
	}
	sort.Strings(keys)
	b := append(make([]byte, 0, n), memoMagic...)
	b = appendStr(b, version)
	b = binary.AppendUvarint(b, uint64(len(keys)))
	for _, k := range keys {
		b = appendStr(appendStr(b, k), entries[k])
	}
	return b
}

// decodeMemo reads what encodeMemo wrote for version; nil if raw is
// damaged, foreign or of another version.
func decodeMemo(raw []byte, version string) map[string]string {
	if len(raw) < len(memoMagic) || string(raw[:len(memoMagic)]) != memoMagic {
		return nil
	}
	r := treeReader{b: raw[len(memoMagic):]}
	if r.str() != version || r.err != nil {
		return nil
	}
	count := r.count(2) // a key and a value take a byte each at least
	out := make(map[string]string, count)
	for i := 0; i < count && r.err == nil; i++ {
		k := r.str()
		out[k] = r.str()
	}
	if r.err != nil || len(r.b) != 0 {
		return nil
	}
	return out
}
