package version

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
)

// BuildID identifies this exact program: the version and the Go build
// ID the toolchain wrote into the executable (its last part is a hash of
// the linked program's content, so any change of the code changes it).
// The result cache is keyed by it, so that results computed by other
// code (another release, or a rebuilt development binary) are never
// reused. The build ID sits in the executable's first pages, so reading
// it costs one small read. An executable without one (linked with
// -buildid=) is hashed whole instead, the hash remembered in memoDir (if
// not "") under the executable's path, size and modification time. If
// the executable cannot be read, the version alone is used.
func BuildID(memoDir string) string {
	exe, err := os.Executable()
	if err != nil {
		return Version
	}
	if id := goBuildID(exe); id != "" {
		sum := sha256.Sum256([]byte(id))
		return Version + "+" + hex.EncodeToString(sum[:])[:16]
	}
	return hashedID(exe, memoDir)
}

// The Go linker writes the build ID near the start of every executable:
// in an ELF file as the note .note.go.buildid (name "Go", type 4), in
// other formats as a string between goBuildPrefix and goBuildEnd; the go
// command's own reader looks for either in the first 32 KB.
var (
	goBuildPrefix = []byte("\xff Go build ID: \"")
	goBuildEnd    = []byte("\"\n \xff")
	goNoteHead    = []byte("\x04\x00\x00\x00") // namesz = 4 ("Go\0\0")
	goNoteTail    = []byte("\x04\x00\x00\x00Go\x00\x00")
)

// goBuildID returns the Go build ID of the executable at path, or "".
func goBuildID(path string) string {
	f, err := os.Open(path)
	if err != nil {
		return ""
	}
	defer f.Close()
	buf := make([]byte, 32<<10)
	n, err := io.ReadFull(f, buf)
	if err != nil && err != io.ErrUnexpectedEOF {
		return ""
	}
	return findBuildID(buf[:n])
}

// findBuildID extracts the build ID from the start of an executable.
func findBuildID(b []byte) string {
	// ELF note: namesz, descsz, type (little-endian words), name, desc.
	for off := 0; off+16 <= len(b); {
		i := bytes.Index(b[off:], goNoteTail)
		if i < 0 {
			break
		}
		at := off + i // start of type
		off = at + 1
		if at < 8 || !bytes.Equal(b[at-8:at-4], goNoteHead) {
			continue
		}
		n := int(binary.LittleEndian.Uint32(b[at-4 : at]))
		desc := b[at+len(goNoteTail):]
		if n <= 0 || n > len(desc) {
			continue
		}
		return string(desc[:n])
	}
	i := bytes.Index(b, goBuildPrefix)
	if i < 0 {
		return ""
	}
	rest := b[i+len(goBuildPrefix):]
	j := bytes.Index(rest, goBuildEnd)
	if j <= 0 {
		return ""
	}
	return string(rest[:j])
}

// hashedID is the version and a hash of the whole executable, memoised
// in memoDir.
func hashedID(exe, memoDir string) string {
	st, err := os.Stat(exe)
	if err != nil {
		return Version
	}
	stamp := fmt.Sprintf("%s %d %d", exe, st.Size(), st.ModTime().UnixNano())
	memo := ""
	if memoDir != "" {
		memo = filepath.Join(memoDir, "executable.id")
		if b, err := os.ReadFile(memo); err == nil {
			if s, id, ok := strings.Cut(strings.TrimSpace(string(b)), "\n"); ok && s == stamp {
				return Version + "+" + id
			}
		}
	}
	f, err := os.Open(exe)
	if err != nil {
		return Version
	}
	defer f.Close()
	h := sha256.New()
	if _, err := io.Copy(h, f); err != nil {
		return Version
	}
	id := hex.EncodeToString(h.Sum(nil))[:16]
	if memo != "" {
		if err := os.MkdirAll(memoDir, 0o755); err == nil {
			tmp := memo + ".tmp"
			if os.WriteFile(tmp, []byte(stamp+"\n"+id+"\n"), 0o644) == nil {
				os.Rename(tmp, memo)
			}
		}
	}
	return Version + "+" + id
}
