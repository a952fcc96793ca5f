// Package manuscript reads what an author writes: the YAML front matter
// (Meta), the Markdown body with galley's inline nodes ({{id.field}}
// references and $…$ math), strict YAML decoding of directive bodies with
// "did you mean" suggestions, and errors that carry a file and line
// (PosError). It knows nothing of directives, data or results.
package manuscript
