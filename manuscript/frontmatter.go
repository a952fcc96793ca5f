package manuscript

import (
	"bytes"
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/series"
)

// Meta is the manuscript's front matter.
type Meta struct {
	Title    string             `yaml:"title"`
	Author   Authors            `yaml:"author"`
	Authors  Authors            `yaml:"authors"`
	Date     string             `yaml:"date"`
	Abstract string             `yaml:"abstract"`
	Data     map[string]DataRef `yaml:"data"`
	Stars    []float64          `yaml:"stars"`
	Decimals *int               `yaml:"decimals"`
	Keywords []string           `yaml:"keywords"`
	// JEL are Journal of Economic Literature classification codes.
	JEL []string `yaml:"jel"`
	// Thanks is the acknowledgement note on the title.
	Thanks string `yaml:"thanks"`
	// Version is a version or draft line under the date ("Draft; comments welcome").
	Version string `yaml:"version"`
	// Bibliography is the BibTeX file citations are looked up in.
	Bibliography string `yaml:"bibliography"`
	// CiteMethods adds the works behind each directive's method and
	// critical values to the reference list.
	CiteMethods bool `yaml:"cite-methods"`
	// Labels map a series or expression ("log(north)") to the name a
	// reader sees in tables, headers, notes and figure legends ("North
	// price (log)"); differences and lags of it are typeset around it.
	Labels map[string]string `yaml:"labels"`
	// LaTeX tunes the LaTeX output: the document class and its options,
	// and a preamble file of the author's own.
	LaTeX LaTeXMeta `yaml:"latex"`
	// Lines are the file lines of the top-level keys.
	Lines map[string]int `yaml:"-"`
}

// LaTeXMeta is the front matter's latex: block.
type LaTeXMeta struct {
	Class    string   `yaml:"class"`
	Options  []string `yaml:"options"`
	Preamble string   `yaml:"preamble"`
	// Floats says where tables and figures are set: FloatsSection
	// (default), FloatsFree or FloatsEnd.
	Floats string `yaml:"floats"`
}

// The values of latex: floats:.
const (
	// FloatsSection: LaTeX places each float near its first reference,
	// and every float of a section is set before the next section starts.
	FloatsSection = "section"
	// FloatsFree: LaTeX places the floats; only the reference list and
	// the appendix hold them back.
	FloatsFree = "free"
	// FloatsEnd: the body's tables and figures follow the reference
	// list, as journals often ask of a submission.
	FloatsEnd = "end"
)

// FloatMode is latex: floats:, FloatsSection when unset; an unknown
// value is an error.
func (l LaTeXMeta) FloatMode() (string, error) {
	switch l.Floats {
	case "":
		return FloatsSection, nil
	case FloatsSection, FloatsFree, FloatsEnd:
		return l.Floats, nil
	}
	return "", fmt.Errorf("latex: floats: write %s (the default: near the first reference, within its section), %s (wherever LaTeX finds room) or %s (after the references), not %q", FloatsSection, FloatsFree, FloatsEnd, l.Floats)
}

// AllAuthors lists the authors' names (author and authors together).
func (m *Meta) AllAuthors() []string {
	var out []string
	for _, a := range m.People() {
		out = append(out, a.Name)
	}
	return out
}

// People lists the authors with their affiliations and e-mail.
func (m *Meta) People() []Author { return append(append([]Author{}, m.Author...), m.Authors...) }

// Author is one author: a name, or a name with an affiliation and e-mail.
type Author struct {
	Name        string `yaml:"name"`
	Affiliation string `yaml:"affiliation"`
	Email       string `yaml:"email"`
}

// Authors accepts one author or a list; each is a name or a mapping
// with name, affiliation and email.
type Authors []Author

func (l *Authors) UnmarshalYAML(n *yaml.Node) error {
	one := func(n *yaml.Node) (Author, error) {
		if n.Kind == yaml.ScalarNode {
			return Author{Name: n.Value}, nil
		}
		var a Author
		if err := CheckKeys(n, &a); err != nil {
			return a, err
		}
		if err := n.Decode(&a); err != nil {
			return a, err
		}
		if a.Name == "" {
			return a, fmt.Errorf("line %d: an author needs a name", n.Line)
		}
		return a, nil
	}
	if n.Kind == yaml.SequenceNode {
		for _, c := range n.Content {
			a, err := one(c)
			if err != nil {
				return err
			}
			*l = append(*l, a)
		}
		return nil
	}
	a, err := one(n)
	if err != nil {
		return err
	}
	*l = Authors{a}
	return nil
}

// DataRef names a data file, with an optional sheet (XLSX), the
// frequency of its dates when the reader should not infer it, and
// vintages.
type DataRef struct {
	Path      string            `yaml:"path"`
	Sheet     string            `yaml:"sheet"`
	Frequency string            `yaml:"frequency"`
	Vintage   map[string]string `yaml:"vintage"`
	Line      int               `yaml:"-"`
}

// Freq is the declared frequency, or series.Undated when none is
// declared (the reader infers it). Frequency was checked when the
// front matter was read.
func (d DataRef) Freq() series.Freq {
	if d.Frequency == "" {
		return series.Undated
	}
	f, _ := series.ParseFreq(d.Frequency)
	return f
}

func (d *DataRef) UnmarshalYAML(n *yaml.Node) error {
	d.Line = n.Line
	if n.Kind == yaml.ScalarNode {
		d.Path = n.Value
		return nil
	}
	type plain DataRef
	var p plain
	if err := CheckKeys(n, &p); err != nil {
		return err
	}
	if err := n.Decode(&p); err != nil {
		return err
	}
	p.Line = n.Line
	*d = DataRef(p)
	if d.Path == "" && len(d.Vintage) == 0 {
		return fmt.Errorf("line %d: a data entry needs a path", n.Line)
	}
	if d.Frequency != "" {
		if _, err := series.ParseFreq(d.Frequency); err != nil {
			line := n.Line
			for i := 0; i+1 < len(n.Content); i += 2 {
				if n.Content[i].Value == "frequency" {
					line = n.Content[i].Line
				}
			}
			return fmt.Errorf("line %d: %v", line, err)
		}
	}
	return nil
}

// SplitFrontMatter separates a leading YAML block delimited by lines of
// "---" from the body. bodyLine is the 1-based line of the body's first
// line in the file.
func SplitFrontMatter(src []byte) (front []byte, body []byte, bodyLine int, ok bool) {
	s := src
	s = bytes.TrimPrefix(s, []byte("\xef\xbb\xbf"))
	if !bytes.HasPrefix(s, []byte("---\n")) && !bytes.HasPrefix(s, []byte("---\r\n")) {
		return nil, s, 1, false
	}
	lines := bytes.SplitAfter(s, []byte("\n"))
	for i := 1; i < len(lines); i++ {
		l := strings.TrimRight(string(lines[i]), "\r\n")
		if l == "---" || l == "..." {
			front = bytes.Join(lines[1:i], nil)
			body = bytes.Join(lines[i+1:], nil)
			return front, body, i + 2, true
		}
	}
	return nil, s, 1, false
}

// ParseMeta decodes front matter strictly. Line numbers in errors are
// file lines (the front matter starts on line 2).
func ParseMeta(file string, front []byte) (*Meta, error) {
	m := &Meta{}
	if len(bytes.TrimSpace(front)) == 0 {
		return m, nil
	}
	var root yaml.Node
	if err := yaml.Unmarshal(front, &root); err != nil {
		return nil, YamlError(file, 2, err)
	}
	if len(root.Content) == 0 {
		return m, nil
	}
	doc := root.Content[0]
	if doc.Kind != yaml.MappingNode {
		return nil, ErrAt(file, 2, "front matter must be a mapping of keys to values")
	}
	if err := CheckKeys(doc, m); err != nil {
		return nil, YamlError(file, 2, err)
	}
	if err := doc.Decode(m); err != nil {
		return nil, YamlError(file, 2, err)
	}
	m.Lines = map[string]int{}
	for i := 0; i+1 < len(doc.Content); i += 2 {
		m.Lines[doc.Content[i].Value] = doc.Content[i].Line + 1
	}
	for _, p := range m.Stars {
		if !(p > 0 && p < 1) {
			return nil, ErrAt(file, 2, "stars: each threshold must be a probability between 0 and 1, got %g", p)
		}
	}
	if m.Decimals != nil && (*m.Decimals < 0 || *m.Decimals > 10) {
		return nil, ErrAt(file, 2, "decimals must be between 0 and 10")
	}
	return m, nil
}
