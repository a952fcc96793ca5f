// Package templates holds the page templates and style sheets that the
// writers embed into their output.
package templates

import _ "embed"

// PageHTML is the html/template for a complete HTML document.
//
//go:embed page.html
var PageHTML string

// StyleCSS is the style sheet inlined into every HTML document.
//
//go:embed style.css
var StyleCSS string

// PreambleTeX is the text/template for the LaTeX document preamble.
//
//go:embed preamble.tex
var PreambleTeX string
