package main

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"hash"
	"hash/crc32"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
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
//     cost a build of the demo 3 ms).
//
// The next build with the same settings reads the record, hashes every
// file it lists, and stops if each input has the same bytes and each
// output is still on disk with the bytes written (the same size and
// checksum): a build is a function
// of those inputs and settings (it reads nothing else: no clock, no
// environment, no network), so it would write exactly those outputs
// again. Any difference (an edited manuscript, a revised data file, an
// output edited by hand or deleted, another galley) means a full build.
// Inputs are compared by content, not by modification time.
//
// No record is kept for a PDF build (pdflatex, outside galley, is part
// of its output) or without a cache; --fresh builds without looking at
// the record (and writes a new one).

const recordMagic = "galley-build-record-2"

// castagnoli is the CRC-32C table, made on first use.
var castagnoli = sync.OnceValue(func() *crc32.Table { return crc32.MakeTable(crc32.Castagnoli) })

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
	return &buildRecord{
		path: filepath.Join(cache.Dir, "builds", hex.EncodeToString(slot[:16])),
		key:  hex.EncodeToString(key[:]),
		out:  out,
		man:  man,
	}
}

type buildRecord struct {
	path string // the record file
	key  string // the hash of the settings
	out  string // the output folder (absolute)
	man  string // the manuscript (absolute), listed first
}

// recordFile is one line of a record: an input (size −1) or an output.
type recordFile struct {
	path string
	sum  string // SHA-256 (input) or CRC-32C (output), hex; "" for an input looked for and absent
	size int64  // −1 for an input
}

// current reports whether the record says this build would write
// exactly what is on disk now. Any doubt (no record, a corrupt one, a
// file that cannot be read) is a no.
func (r *buildRecord) current() bool {
	raw, err := os.ReadFile(r.path)
	if err != nil {
		return false
	}
	files, ok := r.parse(raw)
	if !ok || len(files) == 0 {
		return false
	}
	// The manuscript (listed first) is what changes most often: check it
	// alone, then the rest on both cores; the first mismatch stops them.
	if !files[0].matches() {
		return false
	}
	files = files[1:]
	var (
		next  atomic.Int64
		stale atomic.Bool
		wg    sync.WaitGroup
	)
	for w := 0; w < 2; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1) - 1); i < len(files) && !stale.Load(); i = int(next.Add(1) - 1) {
				if !files[i].matches() {
					stale.Store(true)
				}
			}
		}()
	}
	wg.Wait()
	return !stale.Load()
}

// matches reports whether the file on disk is the one recorded.
func (f recordFile) matches() bool {
	fh, err := os.Open(f.path)
	if f.sum == "" {
		if err == nil {
			fh.Close()
		}
		return os.IsNotExist(err)
	}
	if err != nil {
		return false
	}
	defer fh.Close()
	st, err := fh.Stat()
	if err != nil || !st.Mode().IsRegular() || (f.size >= 0 && st.Size() != f.size) {
		return false
	}
	var h hash.Hash = crc32.New(castagnoli())
	if f.size < 0 {
		h = sha256.New()
	}
	if _, err := io.Copy(h, fh); err != nil {
		return false
	}
	return hex.EncodeToString(h.Sum(nil)) == f.sum
}

// parse reads a record written by save for these settings.
func (r *buildRecord) parse(raw []byte) ([]recordFile, bool) {
	sc := bufio.NewScanner(bytes.NewReader(raw))
	sc.Buffer(make([]byte, 0, 4096), 1<<20)
	if !sc.Scan() || sc.Text() != recordMagic || !sc.Scan() || sc.Text() != r.key {
		return nil, false
	}
	var files []recordFile
	for sc.Scan() {
		// "in SUM PATH" or "out SUM SIZE PATH" (SUM "-" for absent)
		fields := strings.SplitN(sc.Text(), " ", 4)
		var f recordFile
		switch {
		case len(fields) >= 3 && fields[0] == "in":
			f = recordFile{sum: fields[1], size: -1, path: strings.Join(fields[2:], " ")}
		case len(fields) == 4 && fields[0] == "out":
			n, err := strconv.ParseInt(fields[2], 10, 64)
			if err != nil || n < 0 {
				return nil, false
			}
			f = recordFile{sum: fields[1], size: n, path: fields[3]}
		default:
			return nil, false
		}
		if f.sum == "-" {
			if f.size >= 0 {
				return nil, false
			}
			f.sum = ""
		} else if f.size < 0 && len(f.sum) != 2*sha256.Size || f.size >= 0 && len(f.sum) != 2*crc32.Size {
			return nil, false
		}
		if !filepath.IsAbs(f.path) {
			return nil, false
		}
		files = append(files, f)
	}
	return files, sc.Err() == nil
}

// save writes the record of a build that read reads and wrote files
// (paths relative to the output folder). A failure only costs a full
// build next time.
func (r *buildRecord) save(reads []engine.FileRead, files map[string][]byte) {
	var b strings.Builder
	b.WriteString(recordMagic + "\n" + r.key + "\n")
	line := func(s string) bool {
		if strings.ContainsAny(s, "\x00\n\r") {
			return false
		}
		b.WriteString(s)
		b.WriteByte('\n')
		return true
	}
	first := -1
	for i, in := range reads {
		if in.Path == r.man {
			first = i
		}
	}
	if first < 0 {
		return // not the build of this manuscript
	}
	reads = append([]engine.FileRead{reads[first]}, append(reads[:first:first], reads[first+1:]...)...)
	for _, in := range reads {
		sum := in.SHA256
		if sum == "" {
			sum = "-"
		}
		if !line("in " + sum + " " + in.Path) {
			r.remove()
			return
		}
	}
	names := make([]string, 0, len(files))
	for n := range files {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		s := binary.BigEndian.AppendUint32(nil, crc32.Checksum(files[n], castagnoli()))
		if !line("out " + hex.EncodeToString(s) + " " + strconv.Itoa(len(files[n])) + " " + filepath.Join(r.out, n)) {
			r.remove()
			return
		}
	}
	if atomicfile.WriteUnsynced(r.path, []byte(b.String()), 0o644) != nil {
		r.remove()
	}
}

// remove deletes the record (before a build, so that a build that
// fails half way leaves none that could vouch for the old outputs).
func (r *buildRecord) remove() { _ = os.Remove(r.path) }
