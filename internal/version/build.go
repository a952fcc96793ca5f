package version

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
)

// BuildID identifies this exact program: the version and a hash of the
// running executable. The result cache is keyed by it, so that results
// computed by other code (another release, or a rebuilt development
// binary) are never reused. Hashing the executable takes tens of
// milliseconds, so the hash is remembered in memoDir (if not "") under
// the executable's path, size and modification time. If the executable
// cannot be read, the version alone is used.
func BuildID(memoDir string) string {
	exe, err := os.Executable()
	if err != nil {
		return Version
	}
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
