package main

import (
	"bufio"
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"time"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/manuscript"
)

// pdfTimeout bounds one pdflatex run.
const pdfTimeout = 3 * time.Minute

var errNoPDFLaTeX = errors.New("--to pdf needs pdflatex on the PATH, and it is not there; install TeX Live (on Debian: apt-get install texlive-latex-recommended texlive-fonts-recommended lmodern) or build --to latex and compile paper.tex yourself")

// compilePDF runs pdflatex twice (the second run resolves cross-
// references) on the LaTeX of doc in a temporary folder, with its
// figures, and returns the PDF. A LaTeX error is reported at the
// manuscript line whose text produced it, where the .tex says.
func compilePDF(doc *engine.Document, tex []byte) ([]byte, error) {
	bin, err := exec.LookPath("pdflatex")
	if err != nil {
		return nil, errNoPDFLaTeX
	}
	dir, err := os.MkdirTemp("", "galley-pdf-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(dir)
	if err := os.WriteFile(filepath.Join(dir, "paper.tex"), tex, 0o600); err != nil {
		return nil, err
	}
	if err := os.MkdirAll(filepath.Join(dir, engine.FigureFolder), 0o700); err != nil {
		return nil, err
	}
	for _, r := range doc.Results() {
		if r.Figure != nil {
			if err := os.WriteFile(filepath.Join(dir, engine.FigureFolder, r.ID+".pdf"), r.Figure.PDF, 0o600); err != nil {
				return nil, err
			}
		}
	}
	for pass := 0; pass < 2; pass++ {
		ctx, cancel := context.WithTimeout(context.Background(), pdfTimeout)
		cmd := exec.CommandContext(ctx, bin, "-interaction=nonstopmode", "-halt-on-error", "-no-shell-escape", "-file-line-error", "paper.tex")
		cmd.Dir = dir
		cmd.Env = append(os.Environ(), "openout_any=p", "openin_any=p")
		if os.Getenv("SOURCE_DATE_EPOCH") == "" {
			// pdfTeX writes the time of the run into the PDF (its dates
			// and file ID) unless given one (the reproducible-builds
			// convention); a fixed date makes equal inputs equal files.
			cmd.Env = append(cmd.Env, "SOURCE_DATE_EPOCH=946684800", "FORCE_SOURCE_DATE=1")
		}
		out, runErr := cmd.CombinedOutput()
		cancel()
		if runErr != nil {
			log, _ := os.ReadFile(filepath.Join(dir, "paper.log"))
			if len(log) == 0 {
				log = out
			}
			return nil, texError(doc, tex, log, runErr)
		}
	}
	return os.ReadFile(filepath.Join(dir, "paper.pdf"))
}

var (
	texErrRE     = regexp.MustCompile(`(?m)^(?:\./paper\.tex:(\d+): |! )(.*)$`)
	texLineRE    = regexp.MustCompile(`(?m)^l\.(\d+)`)
	galleyLineRE = regexp.MustCompile(`^% galley:line (\d+)$`)
)

// texError turns pdflatex's log into an error at the manuscript line
// that produced the offending .tex line (the writer marks each block
// with "% galley:line N"), or at the .tex line when none does.
func texError(doc *engine.Document, tex, log []byte, runErr error) error {
	m := texErrRE.FindSubmatch(log)
	if m == nil {
		return fmt.Errorf("pdflatex failed (%v) and its log names no error", runErr)
	}
	msg := strings.TrimSpace(string(m[2]))
	texLine := 0
	if len(m[1]) > 0 {
		texLine, _ = strconv.Atoi(string(m[1]))
	} else if l := texLineRE.FindSubmatch(log[bytes.Index(log, m[0]):]); l != nil {
		texLine, _ = strconv.Atoi(string(l[1]))
	}
	line := manuscriptLine(tex, texLine)
	if line > 0 {
		return manuscript.ErrAt(doc.File, line, "LaTeX error (paper.tex line %d): %s", texLine, msg)
	}
	where := "the preamble"
	if doc.Meta.LaTeX.Preamble != "" {
		where = "the preamble (with " + doc.Meta.LaTeX.Preamble + ")"
	}
	return fmt.Errorf("%s: LaTeX error in %s, paper.tex line %d: %s", doc.File, where, texLine, msg)
}

// manuscriptLine is the manuscript line of the last block marker at or
// before .tex line n (0 when there is none).
func manuscriptLine(tex []byte, n int) int {
	sc := bufio.NewScanner(bytes.NewReader(tex))
	sc.Buffer(make([]byte, 1<<20), 1<<24)
	line, found := 0, 0
	for sc.Scan() {
		line++
		if line > n {
			break
		}
		if m := galleyLineRE.FindStringSubmatch(sc.Text()); m != nil {
			found, _ = strconv.Atoi(m[1])
		}
	}
	return found
}
