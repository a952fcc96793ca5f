package main

import (
	"context"
	"errors"
	"fmt"
	"html"
	"html/template"
	"io"
	"net"
	"net/url"
	"os"
	"os/signal"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"time"

	"github.com/galley-econ/galley/dataio"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/version"
	htmlout "github.com/galley-econ/galley/write/html"
)

type watchCmd struct {
	Manuscript   string   `arg:"" help:"The manuscript (.md)." type:"existingfile"`
	Port         int      `help:"Port on 127.0.0.1 for the live preview (0: any free port; the address is printed)." default:"0"`
	To           []string `short:"t" help:"Formats written to --out after each good build: html, latex or markdown (repeatable)." enum:"html,latex,markdown,md,tex" default:"html"`
	Out          string   `short:"o" help:"Also write the outputs to this folder after each good build (as build does)." type:"path"`
	AllowOutside bool     `help:"Allow data paths that leave the manuscript's folder."`
	Vintage      string   `help:"Use this vintage of every data alias that names vintages."`
	PNG          int      `help:"With --out, also write each figure as PNG at this resolution (dots per inch)." placeholder:"DPI"`
	NoCache      bool     `help:"Neither read nor write the result cache."`
}

// Run serves the preview until interrupted.
func (c *watchCmd) Run() error {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	ln, err := net.Listen("tcp", net.JoinHostPort("127.0.0.1", strconv.Itoa(c.Port)))
	if err != nil {
		return fmt.Errorf("watch: cannot listen on 127.0.0.1:%d: %w", c.Port, err)
	}
	w := c.watcher(os.Stderr)
	fmt.Fprintf(os.Stderr, "galley: watching %s; preview at http://%s/ (Ctrl-C to stop)\n", c.Manuscript, ln.Addr())
	return w.run(ctx, ln)
}

func (c *watchCmd) watcher(log io.Writer) *watcher {
	return &watcher{
		manuscript: c.Manuscript,
		options: func() engine.Options {
			o := engine.Options{AllowOutside: c.AllowOutside, Vintage: c.Vintage, PNG: c.PNG}
			if !c.NoCache {
				o.Cache = cacheFor(c.Manuscript, false)
			}
			return o
		},
		out:      c.Out,
		formats:  c.To,
		png:      c.PNG,
		interval: 250 * time.Millisecond,
		log:      log,
	}
}

// watcher rebuilds a manuscript whenever it or one of its data files
// changes, and serves the latest page on a loopback listener. The page
// asks the server for the build counter and reloads when it moves.
type watcher struct {
	manuscript string
	options    func() engine.Options
	out        string   // "" = no files written
	formats    []string // written to out
	png        int
	interval   time.Duration // between looks at the files
	log        io.Writer
	built      func() // called after each build (tests: a save that lands during a build)

	mu      sync.Mutex
	version int    // counts the pages served; the page reloads when it moves
	page    []byte // what / serves
	good    *engine.Document
	seen    int // the latest version a page reported as loaded
	files   []string
}

// fileState is what the watcher compares between looks at a file.
type fileState struct {
	exists bool
	size   int64
	mtime  time.Time
}

// run builds once, then watches and serves until ctx is cancelled.
func (w *watcher) run(ctx context.Context, ln net.Listener) error {
	srv := newPreviewServer(ln, w.route)
	served := make(chan error, 1)
	go func() { served <- srv.serve() }()

	// prev is the state of the files as they were before the build that
	// read them: a save that lands while a build runs differs from it and
	// is built next (a snapshot taken after the build would swallow it).
	prev := w.snapshot()
	if !w.buildOrStop(ctx) {
		return w.shutdown(srv, served)
	}
	prev = w.afterBuild(prev)
	var pending map[string]fileState
	missing := map[string]bool{}
	tick := time.NewTicker(w.interval)
	defer tick.Stop()
loop:
	for {
		select {
		case <-ctx.Done():
			break loop
		case err := <-served:
			return fmt.Errorf("watch: the preview server stopped: %w", err)
		case <-tick.C:
		}
		now := w.snapshot()
		gone := false
		for _, p := range w.watched() {
			st := now[p]
			switch {
			case !st.exists && !missing[p]:
				missing[p] = true
				w.logf("%s has disappeared; still serving the last good page, and rebuilding when it returns", w.rel(p))
			case st.exists && missing[p]:
				delete(missing, p)
				w.logf("%s is back", w.rel(p))
			}
			gone = gone || !st.exists
		}
		if gone {
			prev, pending = w.afterBuild(now), nil
			continue
		}
		if sameState(now, prev) {
			pending = nil
			continue
		}
		// Build once the files have stayed the same for one look, so that
		// a save written in pieces is read whole.
		if pending == nil || !sameState(now, pending) {
			pending = now
			continue
		}
		if !w.buildOrStop(ctx) {
			break loop
		}
		prev, pending = w.afterBuild(now), nil
	}
	return w.shutdown(srv, served)
}

// buildOrStop runs one build, and returns false without waiting for it
// when ctx is cancelled first: a signal stops the watcher even while a
// build is stuck (the build is abandoned; the process ends).
func (w *watcher) buildOrStop(ctx context.Context) bool {
	done := make(chan struct{})
	go func() {
		defer close(done)
		w.build()
	}()
	select {
	case <-done:
		return true
	case <-ctx.Done():
		return false
	}
}

// shutdown stops the preview server.
func (w *watcher) shutdown(srv *previewServer, served chan error) error {
	srv.close()
	if err := <-served; err != nil && !errors.Is(err, errPreviewClosed) {
		return err
	}
	return nil
}

func (w *watcher) logf(format string, args ...any) {
	fmt.Fprintf(w.log, "galley: "+format+"\n", args...)
}

func (w *watcher) rel(p string) string {
	if r, err := filepath.Rel(filepath.Dir(w.manuscript), p); err == nil && !strings.HasPrefix(r, "..") {
		return r
	}
	return p
}

// watched lists the files to look at: the manuscript and every data file
// its front matter names (all vintages), as of the last build that got as
// far as reading the front matter.
func (w *watcher) watched() []string {
	w.mu.Lock()
	defer w.mu.Unlock()
	return slices.Concat([]string{w.manuscript}, w.files)
}

func (w *watcher) snapshot() map[string]fileState {
	out := map[string]fileState{}
	for _, p := range w.watched() {
		fi, err := os.Stat(p)
		if err != nil {
			out[p] = fileState{}
			continue
		}
		out[p] = fileState{exists: true, size: fi.Size(), mtime: fi.ModTime()}
	}
	return out
}

// afterBuild is the state to compare later looks with after a build that
// read the files in state before: before itself for the files it covers,
// so that a save landing during the build is seen as a change, and the
// state now of the files the build has just named (new data files), which
// before could not cover.
func (w *watcher) afterBuild(before map[string]fileState) map[string]fileState {
	if w.built != nil {
		w.built()
	}
	out := w.snapshot()
	for p := range out {
		if st, ok := before[p]; ok {
			out[p] = st
		}
	}
	return out
}

func sameState(a, b map[string]fileState) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		u, ok := b[k]
		if !ok || u.exists != v.exists || u.size != v.size || !u.mtime.Equal(v.mtime) {
			return false
		}
	}
	return true
}

// dataFiles lists the data files a document's front matter names.
func dataFiles(doc *engine.Document) []string {
	var out []string
	add := func(p string) {
		if p == "" {
			return
		}
		if !filepath.IsAbs(p) {
			p = filepath.Join(doc.Dir, p)
		}
		if !slices.Contains(out, p) {
			out = append(out, p)
		}
	}
	if doc.Meta == nil {
		return nil
	}
	for _, ref := range doc.Meta.Data {
		add(ref.Path)
		for _, p := range ref.Vintage {
			add(p)
		}
	}
	slices.Sort(out)
	return out
}

// build runs the manuscript and updates the page: the new page when the
// build succeeds, else the last good page under an error banner. Errors
// also go to the log.
func (w *watcher) build() {
	start := time.Now()
	var doc *engine.Document
	err := dataio.CheckRegular(w.manuscript, dataio.MaxTextBytes)
	if err == nil {
		doc, err = engine.Parse(w.manuscript, w.options())
	}
	if doc != nil {
		w.mu.Lock()
		w.files = dataFiles(doc)
		w.mu.Unlock()
	}
	if err == nil {
		err = doc.Run()
	}
	w.mu.Lock()
	next := w.version + 1
	w.mu.Unlock()
	var page []byte
	if err == nil {
		page, err = htmlout.Write(doc, htmlout.Options{Version: version.Version, Script: reloadScript(next)})
	}
	if err == nil && w.out != "" {
		err = w.write(doc)
	}
	if err == nil {
		doc.Wait() // keeps the formulas' MathML for the next build (engine.Document.Memo)
	}
	if err != nil {
		lines := splitErrors(err)
		for _, l := range lines {
			w.logf("%s", l)
		}
		msg := "The last build failed; this is the last good page.\n" + strings.Join(lines, "\n")
		w.mu.Lock()
		good := w.good
		w.mu.Unlock()
		if good != nil {
			if page, err = htmlout.Write(good, htmlout.Options{Version: version.Version, Script: reloadScript(next), Error: msg}); err != nil {
				w.logf("%v", err)
				page = nil
			}
		}
		if page == nil {
			page = errorPage(strings.Join(lines, "\n"), next)
		}
		doc = nil
	} else {
		w.logf("built %s: %d directives (%d ms)", w.rel(w.manuscript), doc.Directives(), time.Since(start).Milliseconds())
	}
	w.mu.Lock()
	defer w.mu.Unlock()
	w.version = next
	w.page = page
	if doc != nil {
		w.good = doc
	}
}

// write stores the outputs of a good build in the output folder, all
// files together (see buildCmd.Run).
func (w *watcher) write(doc *engine.Document) error {
	files, err := outputs(doc, w.formats, w.png)
	if err != nil {
		return err
	}
	var set atomicfile.Set
	if err := set.StageAll(w.out, files, nil); err != nil {
		return err
	}
	return set.Commit()
}

// state returns the current version and page.
func (w *watcher) state() (int, []byte) {
	w.mu.Lock()
	defer w.mu.Unlock()
	return w.version, w.page
}

// seenVersion is the latest version a page reported as loaded.
func (w *watcher) seenVersion() int {
	w.mu.Lock()
	defer w.mu.Unlock()
	return w.seen
}

const (
	versionPath = "/_galley/version"
	seenPath    = "/_galley/seen"
)

// route answers the preview's requests: the page at /, its version
// (which the page polls) and the version a page reports as loaded.
func (w *watcher) route(path string, q url.Values) previewResponse {
	switch path {
	case "/":
		_, page := w.state()
		return previewResponse{status: 200, ctype: "text/html; charset=utf-8", body: page}
	case versionPath:
		v, _ := w.state()
		return previewResponse{status: 200, ctype: "text/plain; charset=utf-8", body: []byte(strconv.Itoa(v))}
	case seenPath:
		if v, err := strconv.Atoi(q.Get("v")); err == nil {
			w.mu.Lock()
			w.seen = max(w.seen, v)
			w.mu.Unlock()
		}
		return previewResponse{status: 204}
	}
	return previewResponse{status: 404, ctype: "text/plain; charset=utf-8", body: []byte("404 page not found\n")}
}

// reloadScript is the page's live-reload hook: it tells the server which
// version it shows, then asks for the current version every 300 ms and
// reloads when it differs. It talks only to the server that sent the page.
func reloadScript(v int) template.HTML {
	return template.HTML(fmt.Sprintf(`<script>
(function () {
  var shown = %d;
  fetch(%q + shown, {cache: "no-store"}).catch(function () {});
  function look() {
    fetch(%q, {cache: "no-store"})
      .then(function (r) { return r.text(); })
      .then(function (t) {
        if (parseInt(t, 10) !== shown) { location.reload(); return; }
        setTimeout(look, 300);
      })
      .catch(function () { setTimeout(look, 1000); });
  }
  setTimeout(look, 300);
})();
</script>
`, v, seenPath+"?v=", versionPath))
}

// errorPage is shown when no build has succeeded yet.
func errorPage(msg string, v int) []byte {
	return []byte(`<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>galley watch: build failed</title>
<style>body{font-family:sans-serif;margin:2em}.build-error{white-space:pre-wrap;border:2px solid #b00;padding:1em;color:#600}</style>
</head><body><div class="build-error">` + html.EscapeString("The build failed; the page appears when it succeeds.\n"+msg) + `</div>
` + string(reloadScript(v)) + `</body></html>
`)
}
