package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
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
// output) must contain the remaining lines in order. No failing case may
// leave an output behind.
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
			out := filepath.Join(t.TempDir(), "out")
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
			} else if _, err := os.Stat(out); !os.IsNotExist(err) {
				t.Errorf("a failed build left output behind in %s", out)
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
	if n < 15 {
		t.Fatalf("only %d cases in the corpus", n)
	}
}

// TestMillionRows: a data file of a million rows is loaded and analysed
// in bounded memory (the heap grows by well under the size of a
// row-by-row copy of the text).
func TestMillionRows(t *testing.T) {
	if testing.Short() {
		t.Skip("a million rows")
	}
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
	bin := filepath.Join(t.TempDir(), "galley")
	if b, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, b)
	}
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
