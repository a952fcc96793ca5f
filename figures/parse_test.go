package figures

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"image/color"
	"io"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg/draw"
)

// svgDoc is what the tests read back from an SVG: every path with its
// style and vertex count, every text with its position attribute.
type svgDoc struct {
	paths []svgPath
	texts []svgText
}

type svgPath struct {
	style    string
	vertices int
}

type svgText struct {
	x, y, transform, text string
}

func parseSVG(t *testing.T, b []byte) svgDoc {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(b))
	var doc svgDoc
	var cur *svgText
	var groups []bool // per open <g>: does it rotate?
	rotated := func() bool { return slices.Contains(groups, true) }
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("svg does not parse: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range e.Attr {
				attr[a.Name.Local] = a.Value
			}
			switch e.Name.Local {
			case "g":
				groups = append(groups, strings.Contains(attr["transform"], "rotate"))
			case "path":
				d := attr["d"]
				doc.paths = append(doc.paths, svgPath{style: attr["style"],
					vertices: strings.Count(d, "M") + strings.Count(d, "L")})
			case "text":
				cur = &svgText{x: attr["x"], y: attr["y"], transform: attr["transform"]}
				if rotated() {
					cur.transform += " rotate(inherited)"
				}
			}
		case xml.CharData:
			if cur != nil {
				cur.text += string(e)
			}
		case xml.EndElement:
			if e.Name.Local == "g" && len(groups) > 0 {
				groups = groups[:len(groups)-1]
			}
			if e.Name.Local == "text" && cur != nil {
				cur.text = strings.TrimSpace(cur.text)
				doc.texts = append(doc.texts, *cur)
				cur = nil
			}
		}
	}
	return doc
}

func hex(c color.Color) string {
	r, g, b, _ := c.RGBA()
	return fmt.Sprintf("#%02X%02X%02X", r>>8, g>>8, b>>8)
}

// strokes counts stroked paths of the given colour, dash state and width
// with at least minVertices vertices.
func (d svgDoc) strokes(ls draw.LineStyle, minVertices int) int {
	n := 0
	want := "stroke:" + hex(ls.Color)
	w := "stroke-width:" + strconv.FormatFloat(ls.Width.Points(), 'g', 5, 64)
	for _, p := range d.paths {
		if !strings.Contains(p.style, want+";") && !strings.HasSuffix(p.style, want) {
			continue
		}
		if ls.Width.Points() != 1 && !strings.Contains(p.style, w) {
			continue
		}
		if strings.Contains(p.style, "stroke-dasharray") != (len(ls.Dashes) > 0) {
			continue
		}
		if p.vertices >= minVertices {
			n++
		}
	}
	return n
}

// fills counts filled paths of the given colour.
func (d svgDoc) fills(c color.Color) int {
	n := 0
	for _, p := range d.paths {
		if strings.HasPrefix(p.style, "fill:"+hex(c)) {
			n++
		}
	}
	return n
}

// xLabels returns the texts on the lowest row of unrotated texts that
// holds at least two labels: the tick labels of the bottom horizontal
// axis.
func (d svgDoc) xLabels() []string {
	rows := map[string][]string{}
	for _, t := range d.texts {
		if strings.Contains(t.transform, "rotate") {
			continue
		}
		rows[t.y] = append(rows[t.y], t.text)
	}
	best, bestY := []string(nil), 1e300
	for y, ts := range rows {
		v, err := strconv.ParseFloat(y, 64) // y is negated by the flip
		if err != nil || len(ts) < 2 {
			continue
		}
		if -v < bestY {
			best, bestY = ts, -v
		}
	}
	return best
}

// numbers parses the labels that are numbers (typographic minus allowed).
func numbers(labels []string) []float64 {
	var out []float64
	for _, l := range labels {
		if v, err := strconv.ParseFloat(strings.ReplaceAll(l, minus, "-"), 64); err == nil {
			out = append(out, v)
		}
	}
	return out
}
