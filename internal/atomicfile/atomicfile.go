// Package atomicfile writes files so that a reader sees either the old
// content or the complete new content, never a partial file.
package atomicfile

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"

	"github.com/galley-econ/galley/internal/parallel"
)

// Write writes data to path through a temporary file in the same
// directory, synced and then renamed over path.
func Write(path string, data []byte, perm os.FileMode) error {
	return write(path, data, perm, true)
}

// WriteUnsynced is Write without the sync: a reader still sees either the
// old or the whole new file, but after a power failure the file may be
// empty. For caches, whose entries are verified when read.
func WriteUnsynced(path string, data []byte, perm os.FileMode) error {
	return write(path, data, perm, false)
}

func write(path string, data []byte, perm os.FileMode, sync bool) error {
	name, err := stage(path, data, perm, sync)
	if err != nil {
		return err
	}
	if err := os.Rename(name, path); err != nil {
		os.Remove(name)
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}

// stage writes data with mode perm to a new temporary file beside path
// (synced when sync is set) and returns its name; on error nothing is
// left behind.
func stage(path string, data []byte, perm os.FileMode, sync bool) (string, error) {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return "", err
	}
	removeStale(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return "", err
	}
	_, err = tmp.Write(data)
	if err == nil && sync {
		err = tmp.Sync()
	}
	if err == nil {
		err = tmp.Chmod(perm)
	}
	if cerr := tmp.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(tmp.Name())
		return "", fmt.Errorf("writing %s: %w", path, err)
	}
	return tmp.Name(), nil
}

// Set is a group of files written together: all are staged as temporary
// files first, and only when every one is staged are they renamed into
// place. A failure while staging leaves every earlier file untouched.
type Set struct {
	files []staged
}

type staged struct{ path, tmp string }

// Stage writes data to a temporary file beside path. A file that already
// holds exactly data is left as it is (not rewritten, not synced), so a
// rebuild that changes nothing writes nothing.
func (s *Set) Stage(path string, data []byte) error {
	if sameContent(path, data) {
		return nil
	}
	name, err := stage(path, data, 0o644, false)
	if err != nil {
		return err
	}
	s.files = append(s.files, staged{path, name})
	return nil
}

// StageAll stages every file of files (keyed by its path within dir) as
// Stage does, the comparisons and writes shared among up to two workers
// (a build's outputs are many files, each compared with the file it
// replaces). On a failure every file staged in the set is removed (as
// Abort) and the error of the first failing path in sorted order is
// returned.
//
// holds, if not nil, may vouch that the file at a path (dir joined)
// already holds its data (known without reading it); such a file is
// treated as unchanged.
func (s *Set) StageAll(dir string, files map[string][]byte, holds func(path string, data []byte) bool) error {
	names := make([]string, 0, len(files))
	for n := range files {
		names = append(names, n)
	}
	sort.Strings(names)
	paths := make([]string, len(names))
	for i, n := range names {
		paths[i] = filepath.Join(dir, n)
	}
	tmps := make([]string, len(paths))
	errs := make([]error, len(paths))
	parallel.For(len(paths), 2, func(i int) bool {
		data := files[names[i]]
		if !(holds != nil && holds(paths[i], data) || sameContent(paths[i], data)) {
			tmps[i], errs[i] = stage(paths[i], data, 0o644, false)
		}
		return true // every file is staged or compared: the errors are reported in order below
	})
	var first error
	for i, err := range errs {
		if err != nil && first == nil {
			first = err
		}
		if tmps[i] != "" {
			s.files = append(s.files, staged{paths[i], tmps[i]})
		}
	}
	if first != nil {
		s.Abort()
	}
	return first
}

// Staged lists the paths staged (to be replaced by Commit); a file
// Stage found unchanged is not among them.
func (s *Set) Staged() map[string]bool {
	out := make(map[string]bool, len(s.files))
	for _, f := range s.files {
		out[f.path] = true
	}
	return out
}

// Commit syncs every staged file (all at once, so that the file system
// can batch them) and then puts each into place, all or nothing: every
// target is checked first (one that is a folder or another non-regular
// file stops the commit before anything is replaced), each earlier file
// is kept aside until every new one is in place, and if a rename fails
// the files already replaced get their earlier contents back.
func (s *Set) Commit() error {
	errs := make([]error, len(s.files))
	var wg sync.WaitGroup
	for i, f := range s.files {
		wg.Add(1)
		go func() {
			defer wg.Done()
			fh, err := os.OpenFile(f.tmp, os.O_RDWR, 0)
			if err == nil {
				err = fh.Sync()
				fh.Close()
			}
			errs[i] = err
		}()
	}
	wg.Wait()
	for i, err := range errs {
		if err != nil {
			path := s.files[i].path
			s.Abort()
			return fmt.Errorf("writing %s: %w", path, err)
		}
	}
	for _, f := range s.files {
		if fi, err := os.Lstat(f.path); err == nil && !fi.Mode().IsRegular() {
			s.Abort()
			return fmt.Errorf("writing %s: it exists and is not a regular file (%s); nothing was replaced", f.path, kind(fi.Mode()))
		}
	}
	// Keep each earlier file aside (a hard link beside it), then rename.
	kept := make([]string, len(s.files))
	for i, f := range s.files {
		if _, err := os.Lstat(f.path); err != nil {
			continue
		}
		k := filepath.Join(filepath.Dir(f.path), "."+filepath.Base(f.path)+".tmp-keep")
		os.Remove(k)
		if err := os.Link(f.path, k); err == nil {
			kept[i] = k
		}
	}
	for i, f := range s.files {
		if err := rename(f.tmp, f.path); err != nil {
			s.restore(kept, i)
			for _, g := range s.files[i:] {
				os.Remove(g.tmp)
			}
			s.files = nil
			return fmt.Errorf("writing %s: %w; the earlier outputs were kept", f.path, err)
		}
	}
	for _, k := range kept {
		if k != "" {
			os.Remove(k)
		}
	}
	s.files = nil
	return nil
}

// rename is os.Rename (a variable so that a test can make one fail).
var rename = os.Rename

// restore puts back the earlier contents of the first n targets (or
// removes a target that did not exist before).
func (s *Set) restore(kept []string, n int) {
	for j := 0; j < n; j++ {
		if kept[j] != "" {
			os.Rename(kept[j], s.files[j].path)
		} else {
			os.Remove(s.files[j].path)
		}
	}
	for _, k := range kept[n:] {
		if k != "" {
			os.Remove(k)
		}
	}
}

func kind(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&os.ModeSymlink != 0:
		return "a symbolic link"
	case m&os.ModeNamedPipe != 0:
		return "a named pipe"
	}
	return "a special file"
}

// Abort removes every staged temporary file.
func (s *Set) Abort() {
	for _, f := range s.files {
		os.Remove(f.tmp)
	}
	s.files = nil
}

// removeStale deletes temporary files that an earlier write of path left
// behind when its process was killed (".NAME.tmp-…" beside it).
func removeStale(path string) {
	old, _ := filepath.Glob(filepath.Join(filepath.Dir(path), "."+globEscape(filepath.Base(path))+".tmp-*"))
	for _, f := range old {
		if fi, err := os.Lstat(f); err == nil && fi.Mode().IsRegular() {
			os.Remove(f)
		}
	}
}

// globEscape quotes the pattern characters of a file name.
func globEscape(s string) string {
	r := strings.NewReplacer(`\`, `\\`, "*", `\*`, "?", `\?`, "[", `\[`)
	return r.Replace(s)
}

// sameContent reports whether the regular file at path holds exactly
// data: its size first, then its bytes read in blocks into one small
// buffer (a build compares every output with the file it would replace,
// and reading each whole file into new memory cost more than the
// comparison).
func sameContent(path string, data []byte) bool {
	f, err := os.Open(path)
	if err != nil {
		return false
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil || !st.Mode().IsRegular() || st.Size() != int64(len(data)) {
		return false
	}
	buf := make([]byte, min(len(data), 64<<10)+1)
	for {
		n, err := f.Read(buf)
		if n > len(data) || !bytes.Equal(buf[:n], data[:n]) {
			return false
		}
		data = data[n:]
		if err == io.EOF {
			return len(data) == 0
		}
		if err != nil {
			return false
		}
	}
}
