package main

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"hash"
	"io"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"time"
	"unsafe"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/checksum"
	"github.com/galley-econ/galley/internal/parallel"
)

// A build record lets a build that would change nothing stop before it
// starts. After each build, galley writes into the result cache, for
// that manuscript and output folder, what the build depended on and
// what it wrote:
//
//   - its settings: galley's build identity (cache.Version, which changes
//     with any change of the program, templates included), the
//     manuscript's and the output folder's absolute paths, the formats,
//     the PNG resolution, the vintage and --allow-outside;
//   - every file it read, with the SHA-256 of its bytes (the manuscript,
//     its preamble and bibliography, every data file, every file a
//     directive depends on; engine.Document.FilesRead), or that it
//     looked for and did not find;
//   - every output file, with its size and CRC-32C (outputs are written
//     by galley, so the check is against accident and hand edits, not
//     forgery; the CRC runs in hardware at several GB/s where SHA-256
//     cost a build of the demo 3 ms), and, for an output the build left
//     in place because it already held those bytes, its identity on
//     disk: its inode number and status-change time (ctime). An output
//     the build replaced gets none; the next build that finds it intact
//     by reading it records its identity then (current renews the
//     record).
//
// The next build with the same settings reads the record, hashes every
// input it lists, and stops if each input has the same bytes and each
// output is still on disk with the bytes written: a build is a function
// of those inputs and settings (it reads nothing else: no clock, no
// environment, no network), so it would write exactly those outputs
// again. Any difference (an edited manuscript, a revised data file, an
// output edited by hand or deleted, another galley) means a full build.
//
// Inputs are always compared by content. An output is known to hold the
// recorded bytes without reading it when it is the same inode with the
// same size and ctime as recorded: the kernel sets ctime at every write
// or rename and it cannot be set back, so an equal ctime means nobody
// has touched the file since (the rule git's index uses, with the same
// guard against "racy" files: a file whose ctime is within racyWindow of
// the moment its identity was taken is compared by content, since a
// write in the same clock tick would not have moved its ctime). A full
// build uses the same knowledge to skip comparing unchanged outputs with
// the files they would replace (atomicfile.Set.StageAll).
//
// No record is kept for a PDF build (pdflatex, outside galley, is part
// of its output) or without a cache; --fresh builds without looking at
// the record (and writes a new one).

const recordMagic = "galley-build-record-3"

// racyWindow: an output whose ctime is this close to the time it was
// recorded is compared by content (see above): longer than the
// kernel's clock tick (at most 10 ms) for a file system with nanosecond
// times; racyCoarse for one whose times have whole seconds.
var (
	racyWindow = int64(50 * time.Millisecond)
	racyCoarse = int64(2 * time.Second)
)

// racy reports whether an output of identity id, recorded at at, must
// be compared by content.
func racy(id fileID, at int64) bool {
	w := racyWindow
	if id.ctime%int64(time.Second) == 0 {
		w = racyCoarse
	}
	return !id.known || id.ctime >= at-w
}

// recordFor is the record slot of this build, or nil when the build
// keeps none.
func (b *buildCmd) recordFor(cache *engine.Cache) *buildRecord {
	if cache == nil || cache.Dir == "" {
		return nil
	}
	formats := map[string]bool{}
	for _, f := range b.To {
		switch f {
		case "pdf":
			return nil
		case "md":
			f = "markdown"
		case "tex":
			f = "latex"
		}
		formats[f] = true
	}
	man, err1 := filepath.Abs(b.Manuscript)
	out, err2 := filepath.Abs(b.outDir())
	if err1 != nil || err2 != nil {
		return nil
	}
	names := make([]string, 0, len(formats))
	for f := range formats {
		names = append(names, f)
	}
	sort.Strings(names)
	settings := []string{recordMagic, cache.Version, man, out, strings.Join(names, ","),
		strconv.Itoa(b.PNG), b.Vintage, strconv.FormatBool(b.AllowOutside)}
	for _, s := range settings {
		if strings.ContainsAny(s, "\x00\n") {
			return nil
		}
	}
	slot := sha256.Sum256([]byte(man + "\x00" + out))
	key := sha256.Sum256([]byte(strings.Join(settings, "\x00")))
	r := &buildRecord{
		path: filepath.Join(cache.Dir, "builds", hex.EncodeToString(slot[:16])),
		key:  hex.EncodeToString(key[:]),
		out:  out,
		man:  man,
	}
	r.load()
	return r
}

type buildRecord struct {
	path string // the record file
	key  string // the hash of the settings
	out  string // the output folder (absolute)
	man  string // the manuscript (absolute), listed first

	// what the last build recorded (load): every file, inputs first,
	// and the outputs by path; nil without a usable record
	prev    []recordFile
	outputs map[string]recordFile
	at      int64 // when the last build's outputs were looked at (Unix ns)

	mu   sync.Mutex
	sums map[any]string // checksums of this build's outputs (sum)
}

// recordFile is one line of a record: an input (size −1) or an output.
type recordFile struct {
	path string
	sum  string // SHA-256 (input) or CRC-32C (output), hex; "" for an input looked for and absent
	size int64  // −1 for an input
	id   fileID // an output's inode and ctime (known false if not recorded)
}

// load reads the last build's record; a missing, foreign or corrupt
// one leaves prev nil.
func (r *buildRecord) load() {
	raw, err := os.ReadFile(r.path)
	if err != nil {
		return
	}
	files, at, ok := r.parse(raw)
	if !ok || len(files) == 0 {
		return
	}
	r.prev, r.at = files, at
	r.outputs = map[string]recordFile{}
	for _, f := range files {
		if f.size >= 0 {
			r.outputs[f.path] = f
		}
	}
}

// current reports whether the record says this build would write
// exactly what is on disk now. Any doubt (no record, a corrupt one, a
// file that cannot be read) is a no.
func (r *buildRecord) current() bool {
	files := r.prev
	if len(files) == 0 {
		return false
	}
	start := time.Now().UnixNano()
	// The manuscript (listed first) is what changes most often: check it
	// alone, then the rest on both cores; the first mismatch stops them.
	seen := make([]fileID, len(files))
	var read atomic.Bool // an output was read: its record can be renewed
	check := func(i int) bool {
		ok, id, byContent := r.matches(files[i])
		seen[i] = id
		if byContent && files[i].size >= 0 {
			read.Store(true)
		}
		return ok
	}
	if !check(0) || !parallel.For(len(files)-1, 2, func(i int) bool { return check(i + 1) }) {
		return false
	}
	if read.Load() {
		// Every output was found to hold its bytes, some by reading
		// them: record their identities as seen now (taken before the
		// read, at or after start), so that the next build can trust
		// them. An identity taken after start is safe to trust if its
		// ctime is racyWindow before start: a write after it would have
		// moved the ctime.
		renewed := slices.Clone(files)
		for i := range renewed {
			if renewed[i].size >= 0 {
				renewed[i].id = seen[i]
			}
		}
		r.write(start, renewed)
	}
	return true
}

// untouched reports whether the output f is, by its identity on disk,
// the file the last build recorded (and so holds f's bytes).
func (r *buildRecord) untouched(f recordFile) bool {
	if racy(f.id, r.at) {
		return false
	}
	st, err := os.Lstat(f.path)
	if err != nil || !st.Mode().IsRegular() || st.Size() != f.size {
		return false
	}
	id := identity(st)
	return id.known && id == f.id
}

// matches reports whether the file on disk is the one recorded, with
// the identity of the output seen (taken before it was read) and whether
// it had to be read.
func (r *buildRecord) matches(f recordFile) (ok bool, id fileID, read bool) {
	if f.size >= 0 && r.untouched(f) {
		return true, f.id, false
	}
	fh, err := os.Open(f.path)
	if f.sum == "" {
		if err == nil {
			fh.Close()
		}
		return os.IsNotExist(err), id, true
	}
	if err != nil {
		return false, id, true
	}
	defer fh.Close()
	st, err := fh.Stat()
	if err != nil || !st.Mode().IsRegular() || (f.size >= 0 && st.Size() != f.size) {
		return false, id, true
	}
	var h hash.Hash = checksum.New()
	if f.size < 0 {
		h = sha256.New()
	}
	if _, err := io.Copy(h, fh); err != nil {
		return false, id, true
	}
	return hex.EncodeToString(h.Sum(nil)) == f.sum, identity(st), true
}

// holds reports, without reading it, whether the file at path (in the
// output folder) already holds data: it is the last build's output,
// untouched since, and that output had data's size and checksum. It is
// atomicfile.Set.StageAll's shortcut; false means "compare".
func (r *buildRecord) holds(path string, data []byte) bool {
	f, ok := r.outputs[path]
	if !ok || f.size != int64(len(data)) || !r.untouched(f) {
		return false
	}
	return r.sum(path, data) == f.sum
}

// sum is the checksum of an output's new bytes, made once for both
// holds and save (the same bytes: the same slice of memory).
func (r *buildRecord) sum(path string, data []byte) string {
	type key struct {
		path string
		at   *byte
		n    int
	}
	k := key{path, unsafe.SliceData(data), len(data)}
	r.mu.Lock()
	s, ok := r.sums[k]
	r.mu.Unlock()
	if ok {
		return s
	}
	s = checksum.Hex(data)
	r.mu.Lock()
	if r.sums == nil {
		r.sums = map[any]string{}
	}
	r.sums[k] = s
	r.mu.Unlock()
	return s
}

// parse reads a record written by save for these settings.
func (r *buildRecord) parse(raw []byte) ([]recordFile, int64, bool) {
	sc := bufio.NewScanner(bytes.NewReader(raw))
	sc.Buffer(make([]byte, 0, 4096), 1<<20)
	if !sc.Scan() || sc.Text() != recordMagic || !sc.Scan() || sc.Text() != r.key || !sc.Scan() {
		return nil, 0, false
	}
	at, err := strconv.ParseInt(strings.TrimPrefix(sc.Text(), "at "), 10, 64)
	if err != nil || !strings.HasPrefix(sc.Text(), "at ") {
		return nil, 0, false
	}
	var files []recordFile
	for sc.Scan() {
		// "in SUM PATH" or "out SUM SIZE INO CTIME PATH" (SUM "-" for
		// absent, INO and CTIME "-" when not known)
		fields := strings.SplitN(sc.Text(), " ", 6)
		var f recordFile
		switch {
		case len(fields) >= 3 && fields[0] == "in":
			f = recordFile{sum: fields[1], size: -1, path: strings.Join(fields[2:], " ")}
		case len(fields) == 6 && fields[0] == "out":
			n, err := strconv.ParseInt(fields[2], 10, 64)
			if err != nil || n < 0 {
				return nil, 0, false
			}
			f = recordFile{sum: fields[1], size: n, path: fields[5]}
			if fields[3] != "-" {
				ino, err1 := strconv.ParseUint(fields[3], 10, 64)
				ct, err2 := strconv.ParseInt(fields[4], 10, 64)
				if err1 != nil || err2 != nil {
					return nil, 0, false
				}
				f.id = fileID{ino: ino, ctime: ct, known: true}
			}
		default:
			return nil, 0, false
		}
		if f.sum == "-" {
			if f.size >= 0 {
				return nil, 0, false
			}
			f.sum = ""
		} else if f.size < 0 && len(f.sum) != 2*sha256.Size || f.size >= 0 && len(f.sum) != checksum.Size {
			return nil, 0, false
		}
		if !filepath.IsAbs(f.path) {
			return nil, 0, false
		}
		files = append(files, f)
	}
	return files, at, sc.Err() == nil
}

// save writes the record of a build that read reads and wrote files
// (paths relative to the output folder); replaced holds the outputs the
// build replaces, whose identity is not recorded. A failure only costs a
// full build next time.
func (r *buildRecord) save(reads []engine.FileRead, files map[string][]byte, replaced map[string]bool) {
	first := -1
	for i, in := range reads {
		if in.Path == r.man {
			first = i
		}
	}
	if first < 0 {
		r.remove() // not the build of this manuscript
		return
	}
	reads = append([]engine.FileRead{reads[first]}, append(reads[:first:first], reads[first+1:]...)...)
	names := make([]string, 0, len(files))
	for n := range files {
		names = append(names, n)
	}
	sort.Strings(names)
	outs := make([]string, len(names))
	ids := make([]fileID, len(names))
	for i, n := range names {
		outs[i] = filepath.Join(r.out, n)
		if replaced[outs[i]] {
			continue
		}
		if st, err := os.Lstat(outs[i]); err == nil && st.Mode().IsRegular() && st.Size() == int64(len(files[n])) {
			ids[i] = identity(st)
		}
	}
	at := time.Now().UnixNano()
	all := make([]recordFile, 0, len(reads)+len(names))
	for _, in := range reads {
		all = append(all, recordFile{path: in.Path, sum: in.SHA256, size: -1})
	}
	for i, n := range names {
		all = append(all, recordFile{path: outs[i], sum: r.sum(outs[i], files[n]), size: int64(len(files[n])), id: ids[i]})
	}
	r.write(at, all)
}

// write writes the record of files, their outputs' identities seen at
// or after at. A failure only costs a full build next time.
func (r *buildRecord) write(at int64, files []recordFile) {
	var b strings.Builder
	b.WriteString(recordMagic + "\n" + r.key + "\nat " + strconv.FormatInt(at, 10) + "\n")
	for _, f := range files {
		if strings.ContainsAny(f.path, "\x00\n\r") {
			r.remove()
			return
		}
		sum := f.sum
		if sum == "" {
			sum = "-"
		}
		if f.size < 0 {
			b.WriteString("in " + sum + " " + f.path + "\n")
			continue
		}
		id := "- -"
		if f.id.known {
			id = strconv.FormatUint(f.id.ino, 10) + " " + strconv.FormatInt(f.id.ctime, 10)
		}
		b.WriteString("out " + sum + " " + strconv.FormatInt(f.size, 10) + " " + id + " " + f.path + "\n")
	}
	if atomicfile.WriteUnsynced(r.path, []byte(b.String()), 0o644) != nil {
		r.remove()
	}
}

// remove deletes the record.
func (r *buildRecord) remove() { _ = os.Remove(r.path) }
