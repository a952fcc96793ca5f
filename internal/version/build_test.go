package version

import (
	"os"
	"os/exec"
	"strings"
	"testing"
)

// The build ID read from the test binary is the one `go tool buildid`
// reports for it.
func TestGoBuildIDMatchesToolchain(t *testing.T) {
	exe, err := os.Executable()
	if err != nil {
		t.Skip(err)
	}
	got := goBuildID(exe)
	if got == "" {
		t.Fatal("no build ID found in the test executable")
	}
	out, err := exec.Command("go", "tool", "buildid", exe).Output()
	if err != nil {
		t.Skipf("go tool buildid: %v", err)
	}
	if want := strings.TrimSpace(string(out)); got != want {
		t.Errorf("build ID %q, go tool buildid says %q", got, want)
	}
	if id := BuildID(""); !strings.HasPrefix(id, Version+"+") || len(id) != len(Version)+17 {
		t.Errorf("BuildID = %q", id)
	}
}

func TestFindBuildID(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"xx\xff Go build ID: \"a/b/c/d\"\n \xffyy", "a/b/c/d"},
		{"no id here", ""},
		{"\xff Go build ID: \"unterminated", ""},
		{"\xff Go build ID: \"\"\n \xff", ""},
		{"ELF\x04\x00\x00\x00\x07\x00\x00\x00\x04\x00\x00\x00Go\x00\x00a/b/c/dpad", "a/b/c/d"},
		{"\x04\x00\x00\x00\xff\x00\x00\x00\x04\x00\x00\x00Go\x00\x00short", ""},
	} {
		if got := findBuildID([]byte(tc.in)); got != tc.want {
			t.Errorf("findBuildID(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
