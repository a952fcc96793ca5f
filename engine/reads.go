package engine

import (
	"crypto/sha256"
	"encoding/hex"
	"path/filepath"
	"sort"
	"sync"
)

// FileRead is one file a build read, by the path it was opened with
// (made absolute), with the SHA-256 of its bytes; SHA256 is "" for a
// file the build looked for and did not find.
type FileRead struct {
	Path, SHA256 string
}

// readLog collects the files a build reads: the manuscript, its
// preamble and bibliography, every data file and every file a directive
// depends on. A nested build (another vintage) shares its parent's log.
// It is what a caller needs to tell, without building, that a build
// would read exactly the same bytes again (cmd/galley's build record).
type readLog struct {
	mu    sync.Mutex
	files map[string]string
}

func (l *readLog) note(path string, sum string) {
	if l == nil {
		return
	}
	if abs, err := filepath.Abs(path); err == nil {
		path = abs
	}
	l.mu.Lock()
	defer l.mu.Unlock()
	if l.files == nil {
		l.files = map[string]string{}
	}
	l.files[path] = sum
}

// noteBytes notes that the build read raw from path and returns the
// SHA-256 of raw in hexadecimal (made even without a log: callers that
// key a file by its content use it).
func (l *readLog) noteBytes(path string, raw []byte) string {
	s := sha256.Sum256(raw)
	sum := hex.EncodeToString(s[:])
	l.note(path, sum)
	return sum
}

// FilesRead lists the files this build (and any nested build it made)
// read so far, sorted by path.
func (d *Document) FilesRead() []FileRead {
	l := d.opts.reads
	if l == nil {
		return nil
	}
	l.mu.Lock()
	defer l.mu.Unlock()
	out := make([]FileRead, 0, len(l.files))
	for p, s := range l.files {
		out = append(out, FileRead{p, s})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Path < out[j].Path })
	return out
}
