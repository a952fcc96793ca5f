package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/version"
	_ "github.com/galley-econ/galley/kinds"
	"github.com/galley-econ/galley/resultsfile"
	"github.com/galley-econ/galley/revision"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

type buildCmd struct {
	Manuscript   string   `arg:"" help:"The manuscript (.md)." type:"existingfile"`
	To           []string `short:"t" help:"Output format: html, latex, markdown or pdf (repeatable; pdf runs pdflatex)." enum:"html,latex,markdown,md,tex,pdf" default:"html"`
	Out          string   `short:"o" help:"Output folder (default: out/ beside the manuscript)." type:"path"`
	AllowOutside bool     `help:"Allow data paths that leave the manuscript's folder."`
	Vintage      string   `help:"Use this vintage of every data alias that names vintages."`
	PNG          int      `help:"Also write each figure as PNG at this resolution (dots per inch)." placeholder:"DPI"`
	Fresh        bool     `help:"Ignore the result cache and run every directive."`
	NoCache      bool     `help:"Neither read nor write the result cache."`
	Against      string   `help:"Compare the new results with an earlier results file; exit 3 if a conclusion flipped." type:"existingfile" placeholder:"OLD.results.json"`
	Verbose      bool     `short:"v" help:"Say how many results were reused from the cache, or that nothing changed since the last build (a build is otherwise silent when it succeeds)."`
}

func (b *buildCmd) Run() error {
	opts := engine.Options{AllowOutside: b.AllowOutside, Vintage: b.Vintage, PNG: b.PNG}
	if !b.NoCache {
		opts.Cache = cacheFor(b.Manuscript, b.Fresh)
		opts.Cache.Map = true   // one build, then the process ends
		opts.Cache.Async = true // build waits for the cache's files below
	}
	out := b.outDir()
	rec := b.recordFor(opts.Cache)
	if rec != nil && !b.Fresh && rec.current() {
		if b.Verbose {
			fmt.Fprintln(os.Stderr, "galley: nothing changed since the last build; the outputs are current")
		}
	} else if err := b.build(opts, out, rec); err != nil {
		return err
	}
	if b.Against != "" {
		old, err := resultsfile.Load(b.Against)
		if err != nil {
			return err
		}
		base := strings.TrimSuffix(filepath.Base(b.Manuscript), filepath.Ext(b.Manuscript))
		now, err := resultsfile.Load(filepath.Join(out, base+".results.json"))
		if err != nil {
			return err
		}
		rep := revision.Compare(old, now, revision.Options{})
		fmt.Fprint(os.Stderr, rep.Summary())
		if rep.HasFlips() {
			return &exitError{code: 3}
		}
	}
	return nil
}

// outDir is the output folder: --out, or out/ beside the manuscript.
func (b *buildCmd) outDir() string {
	if b.Out != "" {
		return b.Out
	}
	return filepath.Join(filepath.Dir(b.Manuscript), "out")
}

// build runs the manuscript and writes every output (all or none), then
// its build record (record.go) if rec is not nil.
func (b *buildCmd) build(opts engine.Options, out string, rec *buildRecord) error {
	doc, err := engine.Parse(b.Manuscript, opts)
	if err != nil {
		return err
	}
	defer doc.Wait() // the cache's files, written beside the outputs
	if err := doc.Run(); err != nil {
		return err
	}
	if n := len(doc.Reused()); n > 0 && b.Verbose {
		fmt.Fprintf(os.Stderr, "galley: %d of %d results reused from the cache\n", n, doc.Directives())
	}
	files, err := outputs(doc, b.To, b.PNG)
	if err != nil {
		return err
	}
	var holds func(string, []byte) bool
	if rec != nil {
		holds = rec.holds
	}
	var set atomicfile.Set
	if err := set.StageAll(out, files, holds); err != nil {
		return err
	}
	if rec != nil {
		// The record is written beside the commit: it takes the identity
		// of the outputs the commit leaves alone, and none of those it
		// replaces (they are compared by content next time, as files
		// just written would be anyway). One that lands without the
		// commit vouches for nothing: the replaced outputs' checksums
		// would not match the files left in place.
		done := make(chan struct{})
		replaced := set.Staged()
		go func() {
			defer close(done)
			rec.save(doc.FilesRead(), files, replaced)
		}()
		defer func() { <-done }()
	}
	return set.Commit()
}

// outputs renders every requested format in memory, keyed by path
// relative to the output folder. Nothing touches the disk until all of
// them have rendered.
func outputs(doc *engine.Document, formats []string, pngDPI int) (map[string][]byte, error) {
	base := strings.TrimSuffix(filepath.Base(doc.File), filepath.Ext(doc.File))
	files := map[string][]byte{}
	results, err := doc.ResultsJSON(version.Version)
	if err != nil {
		return nil, err
	}
	files[base+".results.json"] = results
	for _, f := range formats {
		switch f {
		case "html":
			b, err := html.Write(doc, html.Options{Version: version.Version})
			if err != nil {
				return nil, err
			}
			files[base+".html"] = b
		case "latex", "tex":
			b, err := latex.Write(doc, latex.Options{Version: version.Version, FigureDir: engine.FigureFolder})
			if err != nil {
				return nil, err
			}
			files[base+".tex"] = b
			for _, r := range doc.Results() {
				if r.Table != nil {
					files[filepath.Join("tables", r.ID+".tex")] = latex.Fragment(r)
				}
			}
		case "pdf":
			tex, err := latex.Write(doc, latex.Options{Version: version.Version, FigureDir: engine.FigureFolder})
			if err != nil {
				return nil, err
			}
			pdf, err := compilePDF(doc, tex)
			if err != nil {
				return nil, err
			}
			files[base+".pdf"] = pdf
		case "markdown", "md":
			b, err := markdown.Write(doc, markdown.Options{FigureDir: engine.FigureFolder})
			if err != nil {
				return nil, err
			}
			files[base+".md"] = b
		default:
			return nil, fmt.Errorf("unknown output format %q", f)
		}
	}
	// Every build writes each figure as SVG and PDF (the results file
	// names both), whatever the formats asked for.
	for _, r := range doc.Results() {
		if r.Figure != nil {
			files[filepath.Join(engine.FigureFolder, r.ID+".svg")] = r.Figure.SVG
			files[filepath.Join(engine.FigureFolder, r.ID+".pdf")] = r.Figure.PDF
		}
	}
	if pngDPI > 0 {
		for _, r := range doc.Results() {
			if r.Figure != nil {
				png, err := r.Figure.RenderPNG(pngDPI)
				if err != nil {
					return nil, err
				}
				files[filepath.Join(engine.FigureFolder, r.ID+".png")] = png
			}
		}
	}
	return files, nil
}

type checkCmd struct {
	Manuscript   string `arg:"" help:"The manuscript (.md)." type:"existingfile"`
	AllowOutside bool   `help:"Allow data paths that leave the manuscript's folder."`
	Vintage      string `help:"Check this vintage of the data."`
}

func (c *checkCmd) Run() error {
	doc, err := engine.Parse(c.Manuscript, engine.Options{AllowOutside: c.AllowOutside, Vintage: c.Vintage})
	if err != nil {
		return err
	}
	// Quiet on success, as every command: the exit code says it.
	return doc.Check()
}
