package main

import (
	"bytes"
	"context"
	"io"
	"net"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"
)

// syncBuffer is a log that the watcher writes while the test reads it.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

const watchCSV = "date,north,fuel\n" +
	"2004-01,60,100\n2004-02,61,101\n2004-03,59,99\n2004-04,62,102\n" +
	"2004-05,63,103\n2004-06,60,100\n2004-07,64,104\n2004-08,65,106\n"

func watchManuscript(text string) string {
	return "---\ntitle: Watched\ndata:\n  grid: data.csv\n---\n\n" + text + " The sample has {{m.nobs}} months.\n\n" +
		"```galley ols\nid: m\ny: north\nx: [fuel]\n```\n"
}

// startWatch lays out a project, starts a watcher on a loopback port and
// returns the manuscript path, the base URL, the watcher and its log.
func startWatch(t *testing.T, text string, out bool) (string, string, *watcher, *syncBuffer) {
	t.Helper()
	return startWatchWith(t, text, out, nil)
}

// startWatchWith is startWatch with setup(watcher, manuscript path)
// called, if not nil, before the watcher starts.
func startWatchWith(t *testing.T, text string, out bool, setup func(*watcher, string)) (string, string, *watcher, *syncBuffer) {
	t.Helper()
	dir := t.TempDir()
	p := filepath.Join(dir, "paper.md")
	if err := os.WriteFile(p, []byte(watchManuscript(text)), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "data.csv"), []byte(watchCSV), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := &watchCmd{Manuscript: p, To: []string{"html"}, NoCache: true}
	if out {
		cmd.Out = filepath.Join(dir, "out")
	}
	log := &syncBuffer{}
	w := cmd.watcher(log)
	w.interval = 20 * time.Millisecond
	if setup != nil {
		setup(w, p)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() { done <- w.run(ctx, ln) }()
	t.Cleanup(func() {
		cancel()
		select {
		case err := <-done:
			if err != nil {
				t.Errorf("watch returned %v", err)
			}
		case <-time.After(20 * time.Second):
			t.Error("watch did not stop after its context was cancelled")
		}
	})
	return p, "http://" + ln.Addr().String(), w, log
}

// eventually polls cond a bounded number of times.
func eventually(t *testing.T, what string, cond func() bool) {
	t.Helper()
	for i := 0; i < 1000; i++ {
		if cond() {
			return
		}
		time.Sleep(10 * time.Millisecond)
	}
	t.Fatalf("gave up waiting for %s", what)
}

func get(t *testing.T, url string) string {
	t.Helper()
	resp, err := http.Get(url)
	if err != nil {
		return ""
	}
	defer resp.Body.Close()
	b, _ := io.ReadAll(resp.Body)
	return string(b)
}

func writeFile(t *testing.T, p, s string) {
	t.Helper()
	if err := os.WriteFile(p, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestWatchRebuilds: the served page follows edits of the manuscript; a
// bad edit keeps the last good page under a banner and is reported on
// the log; --out files are rewritten only by good builds.
func TestWatchRebuilds(t *testing.T) {
	t.Parallel()
	p, url, _, log := startWatch(t, "First draft.", true)
	outFile := filepath.Join(filepath.Dir(p), "out", "paper.html")
	eventually(t, "the first page", func() bool { return strings.Contains(get(t, url+"/"), "First draft.") })
	page := get(t, url+"/")
	if !strings.Contains(page, "The sample has 8 months.") || !strings.Contains(page, versionPath) || strings.Contains(page, `class="build-error"`) {
		t.Fatalf("first page lacks its values or its reload hook, or shows an error:\n%s", page)
	}
	if v := strings.TrimSpace(get(t, url+versionPath)); v != "1" {
		t.Errorf("version %q after the first build, want 1", v)
	}

	writeFile(t, p, watchManuscript("Second draft, longer."))
	eventually(t, "the edited page", func() bool { return strings.Contains(get(t, url+"/"), "Second draft, longer.") })
	if v := strings.TrimSpace(get(t, url+versionPath)); v != "2" {
		t.Errorf("version %q after the edit, want 2", v)
	}
	eventually(t, "the output file", func() bool {
		b, _ := os.ReadFile(outFile)
		return bytes.Contains(b, []byte("Second draft, longer."))
	})

	writeFile(t, p, watchManuscript("Third draft.")+"\n```galley ols\nid: bad\ny: north\nx: [fule]\n```\n")
	eventually(t, "the error banner", func() bool { return strings.Contains(get(t, url+"/"), `class="build-error"`) })
	page = get(t, url+"/")
	if !strings.Contains(page, "Second draft, longer.") || strings.Contains(page, "Third draft.") {
		t.Errorf("an error page should keep the last good page:\n%s", page)
	}
	if !strings.Contains(page, `no column &#34;fule&#34;`) && !strings.Contains(page, `no column &quot;fule&quot;`) {
		t.Errorf("the banner lacks the error:\n%s", page)
	}
	eventually(t, "the error on the log", func() bool { return strings.Contains(log.String(), `paper.md:18: series "fule"`) })
	if b, _ := os.ReadFile(outFile); !bytes.Contains(b, []byte("Second draft, longer.")) {
		t.Error("a failed build replaced the output file")
	}

	writeFile(t, p, watchManuscript("Fourth draft."))
	eventually(t, "the repaired page", func() bool { return strings.Contains(get(t, url+"/"), "Fourth draft.") })
	if page := get(t, url+"/"); strings.Contains(page, `class="build-error"`) {
		t.Error("the banner stayed after a good build")
	}
}

// TestWatchDataFile: a data file that disappears is reported once and the
// last good page stays; when it returns, with new rows, the page is
// rebuilt from it.
func TestWatchDataFile(t *testing.T) {
	t.Parallel()
	p, url, w, log := startWatch(t, "Draft.", false)
	data := filepath.Join(filepath.Dir(p), "data.csv")
	eventually(t, "the first page", func() bool { return strings.Contains(get(t, url+"/"), "The sample has 8 months.") })
	v0, page0 := w.state()

	if err := os.Remove(data); err != nil {
		t.Fatal(err)
	}
	eventually(t, "the report of the missing file", func() bool { return strings.Contains(log.String(), "data.csv has disappeared") })
	// Let the watcher look at the files a good many more times.
	for i := 0; i < 20; i++ {
		time.Sleep(w.interval)
	}
	if n := strings.Count(log.String(), "data.csv has disappeared"); n != 1 {
		t.Errorf("the disappearance was reported %d times, want once:\n%s", n, log.String())
	}
	if v, page := w.state(); v != v0 || !bytes.Equal(page, page0) {
		t.Errorf("the page changed while the data file was missing (version %d → %d)", v0, v)
	}

	writeFile(t, data, watchCSV+"2004-09,66,107\n")
	eventually(t, "the rebuilt page", func() bool { return strings.Contains(get(t, url+"/"), "The sample has 9 months.") })
	if !strings.Contains(log.String(), "data.csv is back") {
		t.Errorf("the return was not reported:\n%s", log.String())
	}
}

// TestWatchFirstBuildFails: with no good build yet the page shows the
// error alone, and the first good build replaces it.
func TestWatchFirstBuildFails(t *testing.T) {
	t.Parallel()
	p, url, _, _ := startWatch(t, "Draft {{nosuch.value}}.", false)
	eventually(t, "the error page", func() bool { return strings.Contains(get(t, url+"/"), `class="build-error"`) })
	if page := get(t, url+"/"); !strings.Contains(page, "nosuch") || !strings.Contains(page, versionPath) {
		t.Errorf("error page:\n%s", page)
	}
	writeFile(t, p, watchManuscript("Now it builds."))
	eventually(t, "the first good page", func() bool { return strings.Contains(get(t, url+"/"), "Now it builds.") })
}

// TestWatchChromium loads the preview in headless Chromium, edits the
// manuscript, and checks that the browser reloaded by itself: the page's
// hook reports each version it shows (seenPath), and the page served for
// that version carries the edit. Skipped when Chromium is not installed.
func TestWatchChromium(t *testing.T) {
	t.Parallel()
	bin := "/usr/bin/chromium"
	if _, err := os.Stat(bin); err != nil {
		t.Skip("chromium is not installed")
	}
	if testing.Short() {
		t.Skip("starts a browser")
	}
	p, url, w, _ := startWatch(t, "Before the edit.", false)
	eventually(t, "the first page", func() bool { v, _ := w.state(); return v == 1 })

	cmd := exec.Command(bin, "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
		"--disable-component-update", "--disable-sync", "--no-first-run", "--no-default-browser-check",
		"--disable-dev-shm-usage", "--disable-extensions", "--user-data-dir="+t.TempDir(), url+"/")
	ownGroup(cmd)
	var errOut syncBuffer
	cmd.Stdout, cmd.Stderr = io.Discard, &errOut
	if err := cmd.Start(); err != nil {
		t.Skipf("cannot start chromium: %v", err)
	}
	exited := make(chan error, 1)
	go func() { exited <- cmd.Wait() }()
	t.Cleanup(func() {
		// The browser runs in its own process group: end that group.
		killGroup(cmd)
		select {
		case <-exited:
		case <-time.After(10 * time.Second):
		}
	})
	waitSeen := func(v int) {
		t.Helper()
		for i := 0; i < 600; i++ {
			if w.seenVersion() >= v {
				return
			}
			select {
			case err := <-exited:
				t.Fatalf("chromium exited (%v) before showing version %d:\n%s", err, v, errOut.String())
			case <-time.After(50 * time.Millisecond):
			}
		}
		t.Fatalf("the browser never reported version %d (saw %d):\n%s", v, w.seenVersion(), errOut.String())
	}
	waitSeen(1)

	writeFile(t, p, watchManuscript("After the edit, seen by the browser."))
	eventually(t, "the rebuild", func() bool { v, _ := w.state(); return v >= 2 })
	v, page := w.state()
	if !strings.Contains(string(page), "After the edit, seen by the browser.") {
		t.Fatalf("version %d page lacks the edit", v)
	}
	waitSeen(v)
	if got := w.seenVersion(); got != v {
		t.Errorf("the browser reports version %d, the server is at %d", got, v)
	}
}

// TestWatchBannerLayout lays out the last good page under an error
// banner in headless Chromium (a window of 1200 × 800 and one of 420 ×
// 800) and asks the browser where the title and the banner are: the
// banner must be inside the window and must not cover the title. Skipped
// when Chromium is not installed.
func TestWatchBannerLayout(t *testing.T) {
	t.Parallel()
	bin := "/usr/bin/chromium"
	if _, err := os.Stat(bin); err != nil {
		t.Skip("chromium is not installed")
	}
	if testing.Short() {
		t.Skip("starts a browser")
	}
	p, url, _, _ := startWatch(t, "A good draft.", false)
	eventually(t, "the first page", func() bool { return strings.Contains(get(t, url+"/"), "A good draft.") })
	writeFile(t, p, watchManuscript("A bad draft.")+"\n```galley ols\nid: bad\ny: north\nx: [fule]\n```\n")
	eventually(t, "the error banner", func() bool { return strings.Contains(get(t, url+"/"), `class="build-error"`) })
	page := get(t, url+"/")
	// The probe writes its finding into the page, which --dump-dom prints.
	probe := `<script>(function () {
  var t = document.querySelector("h1.title").getBoundingClientRect();
  var b = document.querySelector(".build-error").getBoundingClientRect();
  var covers = !(b.bottom <= t.top || b.top >= t.bottom || b.right <= t.left || b.left >= t.right);
  var inside = b.top >= 0 && b.bottom <= window.innerHeight + 1 && b.height > 0;
  document.body.setAttribute("data-probe", (covers ? "covers" : "clear") + "," + (inside ? "inside" : "outside"));
})();</script>`
	page = strings.Replace(page, "</body>", probe+"</body>", 1)
	file := filepath.Join(t.TempDir(), "page.html")
	if err := os.WriteFile(file, []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, size := range []string{"1200,800", "420,800"} {
		ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
		cmd := exec.CommandContext(ctx, bin, "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
			"--disable-component-update", "--disable-sync", "--no-first-run", "--no-default-browser-check",
			"--disable-dev-shm-usage", "--disable-extensions", "--user-data-dir="+t.TempDir(),
			"--window-size="+size, "--dump-dom", "file://"+file)
		var out, errOut syncBuffer
		cmd.Stdout, cmd.Stderr = &out, &errOut
		err := cmd.Run()
		cancel()
		if err != nil {
			t.Skipf("chromium failed: %v\n%s", err, errOut.String())
		}
		if dom := out.String(); !strings.Contains(dom, `data-probe="clear,inside"`) {
			i := strings.Index(dom, "data-probe=")
			if i < 0 {
				t.Fatalf("window %s: the probe did not run:\n%s", size, errOut.String())
			}
			t.Errorf("window %s: the banner %s", size, dom[i:i+40])
		}
	}
}

// TestWatchSaveDuringBuild: a save that lands while a build runs (here:
// just as the first build ends, before the watcher looks at the files
// again) is built next, not taken for the state that was built.
func TestWatchSaveDuringBuild(t *testing.T) {
	t.Parallel()
	var once sync.Once
	_, _, w, _ := startWatchWith(t, "Built first.", false, func(w *watcher, p string) {
		w.built = func() { once.Do(func() { writeFile(t, p, watchManuscript("Saved during the build, longer.")) }) }
	})
	eventually(t, "the save made during the first build", func() bool {
		_, page := w.state()
		return strings.Contains(string(page), "Saved during the build, longer.")
	})
}
