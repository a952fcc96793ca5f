package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/version"
	"github.com/galley-econ/galley/resultsfile"
	"github.com/galley-econ/galley/revision"
)

type compareCmd struct {
	Old      string   `arg:"" help:"The earlier results file (.results.json), or the manuscript when --vintages is given."`
	New      string   `arg:"" optional:"" help:"The later results file."`
	Vintages []string `help:"Build the manuscript with each of two data vintages and compare them (e.g. --vintages old,new)." sep:","`
	Tol      float64  `help:"Relative change below which a number has not moved." default:"1e-9"`
	Report   string   `help:"Also write a revision report: .md, .html or .tex by extension." type:"path"`
}

func (c *compareCmd) Run() error {
	var old, new *resultsfile.File
	var err error
	switch {
	case len(c.Vintages) > 0:
		if len(c.Vintages) != 2 || c.New != "" {
			return &exitError{code: 2, err: fmt.Errorf("compare --vintages OLD,NEW MANUSCRIPT.md: give two vintage names and one manuscript")}
		}
		if old, err = buildVintage(c.Old, c.Vintages[0]); err != nil {
			return err
		}
		if new, err = buildVintage(c.Old, c.Vintages[1]); err != nil {
			return err
		}
	case c.New == "":
		return &exitError{code: 2, err: fmt.Errorf("compare OLD.results.json NEW.results.json (or compare MANUSCRIPT.md --vintages OLD,NEW)")}
	default:
		if old, err = resultsfile.Load(c.Old); err != nil {
			return err
		}
		if new, err = resultsfile.Load(c.New); err != nil {
			return err
		}
	}
	rep := revision.Compare(old, new, revision.Options{Tol: c.Tol})
	fmt.Fprint(os.Stdout, rep.Summary())
	if c.Report != "" {
		if err := writeReport(rep, c.Report); err != nil {
			return err
		}
	}
	if rep.HasFlips() {
		return &exitError{code: 3}
	}
	return nil
}

// writeReport writes the revision report in the format its extension names.
func writeReport(rep *revision.Report, path string) error {
	var b []byte
	switch strings.ToLower(filepath.Ext(path)) {
	case ".md", ".markdown":
		b = rep.Markdown()
	case ".html", ".htm":
		b = rep.HTML()
	case ".tex":
		b = rep.LaTeX()
	default:
		return &exitError{code: 2, err: fmt.Errorf("--report %s: use a .md, .html or .tex file name", path)}
	}
	return atomicfile.Write(path, b, 0o644)
}

// buildVintage runs the manuscript on one data vintage (using the cache)
// and returns its results as a results file.
func buildVintage(manuscript, vintage string) (*resultsfile.File, error) {
	doc, err := engine.Parse(manuscript, engine.Options{Vintage: vintage, Cache: cacheFor(manuscript, false)})
	if err != nil {
		return nil, err
	}
	if err := doc.Run(); err != nil {
		return nil, err
	}
	return resultsOf(doc, fmt.Sprintf("%s [vintage %s]", manuscript, vintage))
}

func resultsOf(doc *engine.Document, label string) (*resultsfile.File, error) {
	return doc.ResultsFile(version.Version, label)
}

// cacheFor is the result cache beside a manuscript.
func cacheFor(manuscript string, fresh bool) *engine.Cache {
	dir := filepath.Join(filepath.Dir(manuscript), ".galley-cache")
	return &engine.Cache{Dir: dir, Version: version.BuildID(dir), Fresh: fresh}
}
