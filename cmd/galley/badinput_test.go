package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"github.com/galley-econ/galley/internal/longtest"
)

// captureStderr runs f with os.Stderr redirected and returns what it wrote.
func captureStderr(t *testing.T, f func()) string {
	t.Helper()
	r, w, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	old := os.Stderr
	os.Stderr = w
	done := make(chan []byte)
	go func() { b, _ := io.ReadAll(r); done <- b }()
	f()
	os.Stderr = old
	w.Close()
	return string(<-done)
}

// TestBadInputCorpus runs every case under testdata/bad/ (made by
// testdata/bad/make_corpus.py): the exit code must match the first line
// of want.txt, and the error (or, for a build that succeeds, the Markdown
// output) must contain the remaining lines in order. A failing case must
// name a file and line, leave an earlier build's output exactly as it
// was and add nothing beside it; no case may panic or print fmt's error
// text (%!verb).
func TestBadInputCorpus(t *testing.T) {
	root := filepath.Join("..", "..", "testdata", "bad")
	dirs, _ := os.ReadDir(root)
	n := 0
	for _, d := range dirs {
		if !d.IsDir() {
			continue
		}
		n++
		t.Run(d.Name(), func(t *testing.T) {
			dir := filepath.Join(root, d.Name())
			want, err := os.ReadFile(filepath.Join(dir, "want.txt"))
			if err != nil {
				t.Fatal(err)
			}
			lines := strings.Split(strings.TrimRight(string(want), "\n"), "\n")
			code, _ := strconv.Atoi(strings.TrimPrefix(lines[0], "exit "))
			// An earlier build's output, which a failed build must leave
			// exactly as it was.
			out := filepath.Join(t.TempDir(), "out")
			earlier := []byte("EARLIER BUILD\n")
			if err := os.MkdirAll(out, 0o755); err != nil {
				t.Fatal(err)
			}
			os.WriteFile(filepath.Join(out, "paper.md"), earlier, 0o644)
			var got int
			msg := captureStderr(t, func() {
				got = run([]string{"build", filepath.Join(dir, "paper.md"), "--to", "markdown", "--out", out, "--no-cache"})
			})
			if got != code {
				t.Fatalf("exit %d, want %d; stderr:\n%s", got, code, msg)
			}
			text := msg
			if code == 0 {
				md, err := os.ReadFile(filepath.Join(out, "paper.md"))
				if err != nil {
					t.Fatal(err)
				}
				text = string(md)
			} else {
				if md, _ := os.ReadFile(filepath.Join(out, "paper.md")); !bytes.Equal(md, earlier) {
					t.Errorf("a failed build changed the earlier output")
				}
				if ents, _ := os.ReadDir(out); len(ents) != 1 {
					t.Errorf("a failed build left files behind in %s: %v", out, ents)
				}
				if !fileLine.MatchString(msg) {
					t.Errorf("the error names no file and line:\n%s", msg)
				}
			}
			if strings.Contains(text, "%!") {
				t.Errorf("fmt's error text reached the output:\n%s", text)
			}
			at := 0
			for _, w := range lines[1:] {
				i := strings.Index(text[at:], w)
				if i < 0 {
					t.Fatalf("output lacks %q (in order):\n%s", w, text)
				}
				at += i + len(w)
			}
			if strings.Contains(msg, "panic") || strings.Contains(msg, "goroutine ") {
				t.Fatalf("the tool panicked:\n%s", msg)
			}
		})
	}
	if n < 80 {
		t.Fatalf("only %d cases in the corpus", n)
	}
}

// fileLine matches a position "FILE:LINE:" in a message.
var fileLine = regexp.MustCompile(`\.(md|csv|xlsx):[0-9]+:`)

// TestMillionRows: a data file of a million rows is loaded and analysed
// in bounded memory (the heap grows by well under the size of a
// row-by-row copy of the text).
func TestMillionRows(t *testing.T) {
	longtest.Skip(t, "a million rows")
	dir := t.TempDir()
	f, _ := os.Create(filepath.Join(dir, "big.csv"))
	w := bufio.NewWriter(f)
	w.WriteString("y,x\n")
	for i := 0; i < 1_000_000; i++ {
		fmt.Fprintf(w, "%d.%03d,%d.%03d\n", i%997, i%1000, i%991, (i*7)%1000)
	}
	w.Flush()
	f.Close()
	os.WriteFile(filepath.Join(dir, "paper.md"), []byte("---\ndata:\n  d: big.csv\n---\n\n```galley ols\nid: m\ndata: d\ny: y\nx: [x]\n```\n\nN = {{m.nobs}}.\n"), 0o644)
	runtime.GC()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	if code := run([]string{"build", filepath.Join(dir, "paper.md"), "--to", "markdown", "--out", filepath.Join(dir, "out"), "--no-cache"}); code != 0 {
		t.Fatalf("exit %d", code)
	}
	runtime.ReadMemStats(&after)
	md, _ := os.ReadFile(filepath.Join(dir, "out", "paper.md"))
	if !bytes.Contains(md, []byte("N = 1000000.")) {
		t.Fatalf("the regression did not use a million rows:\n%s", md)
	}
	// The CSV is about 16 MB; the columns, the design matrix and the
	// residuals are about 8 MB each. A budget of 1 GB of total
	// allocation rules out anything quadratic or any per-row structure.
	if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 1<<30 {
		t.Errorf("allocated %d MB for a million rows", alloc>>20)
	}
}

// TestKilledBuildKeepsOutput: a build killed while it runs leaves the
// previous good output intact: outputs are staged beside their targets
// and renamed into place only when all of them are written.
func TestKilledBuildKeepsOutput(t *testing.T) {
	t.Parallel()
	bin := galleyBinary(t)
	dir := demoCopy(t)
	paper := filepath.Join(dir, "paper.md")
	out := filepath.Join(dir, "out")
	if b, err := exec.Command(bin, "build", paper, "--out", out, "--to", "html", "--no-cache").CombinedOutput(); err != nil {
		t.Fatalf("first build: %v\n%s", err, b)
	}
	good, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	goodRes, _ := os.ReadFile(filepath.Join(out, "paper.results.json"))
	// Kill builds at increasing delays; whatever point each reached, the
	// outputs are the old ones or complete new ones, never a mixture or a
	// truncated file.
	src, _ := os.ReadFile(paper)
	os.WriteFile(paper, bytes.Replace(src, []byte("## Data"), []byte("## Data, revised"), 1), 0o644)
	for _, delay := range []time.Duration{0, 2 * time.Millisecond, 5 * time.Millisecond, 10 * time.Millisecond, 20 * time.Millisecond, 40 * time.Millisecond} {
		cmd := exec.Command(bin, "build", paper, "--out", out, "--to", "html", "--no-cache")
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(delay)
		cmd.Process.Signal(syscall.SIGKILL)
		cmd.Wait()
		html, _ := os.ReadFile(filepath.Join(out, "paper.html"))
		res, _ := os.ReadFile(filepath.Join(out, "paper.results.json"))
		newHTML := bytes.Contains(html, []byte("Data, revised"))
		if !newHTML && !bytes.Equal(html, good) {
			t.Fatalf("after a kill at %v the HTML is neither the old nor a complete new page", delay)
		}
		if !bytes.HasSuffix(bytes.TrimSpace(html), []byte("</html>")) {
			t.Fatalf("after a kill at %v the HTML is truncated", delay)
		}
		if !newHTML && !bytes.Equal(res, goodRes) && len(res) > 0 && !bytes.HasSuffix(bytes.TrimSpace(res), []byte("}")) {
			t.Fatalf("after a kill at %v the results file is truncated", delay)
		}
	}
}

var (
	binOnce sync.Once
	binPath string
	binErr  error
)

// galleyBinary returns a command that runs galley as its own process, for
// the tests that need one (to kill it, or to let it block): a two-line
// script that re-executes this test binary with GALLEY_TEST_AS_MAIN=1, so
// that TestMain hands it to galley's run as main does (without a second
// build and link of the command).
func galleyBinary(t *testing.T) string {
	t.Helper()
	binOnce.Do(func() {
		self, err := os.Executable()
		if err != nil {
			binErr = err
			return
		}
		dir, err := os.MkdirTemp("", "galley-bin")
		if err != nil {
			binErr = err
			return
		}
		binPath = filepath.Join(dir, "galley")
		script := "#!/bin/sh\nGALLEY_TEST_AS_MAIN=1 exec '" + strings.ReplaceAll(self, "'", `'\''`) + "' \"$@\"\n"
		binErr = os.WriteFile(binPath, []byte(script), 0o755)
	})
	if binErr != nil {
		t.Fatal(binErr)
	}
	return binPath
}

func TestMain(m *testing.M) {
	if os.Getenv("GALLEY_TEST_AS_MAIN") == "1" { // galleyBinary's script
		os.Exit(run(os.Args[1:]))
	}
	code := m.Run()
	if binPath != "" {
		os.RemoveAll(filepath.Dir(binPath))
	}
	if sharedDir != "" {
		os.RemoveAll(sharedDir)
	}
	os.Exit(code)
}

// runBounded is run with a guard against a hang: a command that blocks
// (on a named pipe, say) fails the test instead of stalling the suite.
func runBounded(t *testing.T, args ...string) (int, string) {
	t.Helper()
	type res struct {
		code int
		msg  string
	}
	done := make(chan res, 1)
	go func() {
		var code int
		msg := captureStderr(t, func() { code = run(args) })
		done <- res{code, msg}
	}()
	select {
	case r := <-done:
		return r.code, r.msg
	case <-time.After(30 * time.Second):
		t.Fatalf("galley %s blocked", strings.Join(args, " "))
	}
	return 0, ""
}

// TestSpecialFiles: a named pipe or a device named as the manuscript, a
// data file or a results file is refused at once with exit 1 and a
// message that says what it is; nothing blocks and nothing is read
// without bound (issue 14, items 6 and 7).
func TestSpecialFiles(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.csv")
	if err := mkfifo(fifo); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
	pipeMD := filepath.Join(dir, "pipe.md")
	mkfifo(pipeMD)
	paper := func(name, data string) string {
		p := filepath.Join(dir, name)
		os.WriteFile(p, []byte("---\ndata:\n  d: "+data+"\n---\n\n```galley ols\nid: m\ndata: d\ny: y\nx: [x]\n```\n"), 0o644)
		return p
	}
	viaPipe := paper("viapipe.md", "pipe.csv")
	viaZero := paper("viazero.md", "/dev/zero")
	os.Symlink("/dev/zero", filepath.Join(dir, "zero.csv"))
	viaLink := paper("vialink.md", "zero.csv")
	out := filepath.Join(dir, "out")
	cases := []struct {
		args []string
		want []string
	}{
		{[]string{"inspect", fifo}, []string{"pipe.csv is a named pipe (FIFO)"}},
		{[]string{"inspect", "/dev/zero"}, []string{"/dev/zero is a device, not a regular file"}},
		{[]string{"build", pipeMD, "--out", out}, []string{"pipe.md is a named pipe (FIFO)"}},
		{[]string{"check", pipeMD}, []string{"pipe.md is a named pipe (FIFO)"}},
		{[]string{"check", "/dev/zero"}, []string{"/dev/zero is a device"}},
		{[]string{"build", viaPipe, "--out", out, "--no-cache"}, []string{"viapipe.md:8:", "pipe.csv is a named pipe (FIFO)"}},
		{[]string{"check", viaPipe}, []string{"viapipe.md:8:", "named pipe (FIFO)"}},
		{[]string{"build", viaZero, "--allow-outside", "--out", out, "--no-cache"}, []string{"viazero.md:8:", "/dev/zero is a device"}},
		{[]string{"build", viaLink, "--allow-outside", "--out", out, "--no-cache"}, []string{"vialink.md:8:", "zero.csv is a device"}},
		{[]string{"build", viaLink, "--out", out, "--no-cache"}, []string{"vialink.md:8:", "leads outside"}},
		{[]string{"compare", fifo, "/dev/zero"}, []string{"named pipe (FIFO)"}},
		{[]string{"build", viaZero, "--against", fifo, "--allow-outside", "--out", out}, []string{"named pipe (FIFO)"}},
	}
	for _, c := range cases {
		code, msg := runBounded(t, c.args...)
		if code != 1 {
			t.Errorf("galley %v: exit %d, want 1; %s", c.args, code, msg)
			continue
		}
		at := 0
		for _, w := range c.want {
			i := strings.Index(msg[at:], w)
			if i < 0 {
				t.Errorf("galley %v: message lacks %q (in order):\n%s", c.args, w, msg)
				break
			}
			at += i + len(w)
		}
		if strings.Contains(msg, "goroutine ") || strings.Contains(msg, "panic") {
			t.Errorf("galley %v panicked:\n%s", c.args, msg)
		}
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Error("a refused build left output behind")
	}
}

// TestWatchStopsOnSIGTERM: under watch, a data alias that names a named
// pipe fails the build (it does not block it), and SIGTERM then stops
// the process with exit 0 (issue 14, item 7). Before, the build blocked
// on the pipe and the signal was never acted on.
func TestWatchStopsOnSIGTERM(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	if err := mkfifo(filepath.Join(dir, "pipe.csv")); err != nil {
		t.Skipf("no named pipes here: %v", err)
	}
	p := filepath.Join(dir, "paper.md")
	os.WriteFile(p, []byte("---\ndata:\n  d: pipe.csv\n---\n\n```galley ols\nid: m\ndata: d\ny: y\nx: [x]\n```\n"), 0o644)
	cmd := exec.Command(galleyBinary(t), "watch", p, "--no-cache")
	stderr, _ := cmd.StderrPipe()
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	failed := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(stderr)
		var log strings.Builder
		sent := false
		for sc.Scan() {
			log.WriteString(sc.Text() + "\n")
			if !sent && strings.Contains(sc.Text(), "named pipe (FIFO)") {
				failed <- log.String()
				sent = true
			}
		}
		if !sent {
			failed <- log.String()
		}
	}()
	select {
	case log := <-failed:
		if !strings.Contains(log, "paper.md:8:") || !strings.Contains(log, "named pipe (FIFO)") {
			cmd.Process.Kill()
			cmd.Wait()
			t.Fatalf("the first build did not fail on the pipe:\n%s", log)
		}
	case <-time.After(30 * time.Second):
		cmd.Process.Kill()
		cmd.Wait()
		t.Fatal("the first build blocked on the named pipe")
	}
	cmd.Process.Signal(syscall.SIGTERM)
	exited := make(chan error, 1)
	go func() { exited <- cmd.Wait() }()
	select {
	case err := <-exited:
		if err != nil {
			t.Errorf("watch ended with %v after SIGTERM, want exit 0", err)
		}
	case <-time.After(30 * time.Second):
		cmd.Process.Kill()
		<-exited
		t.Fatal("watch did not stop on SIGTERM")
	}
}
