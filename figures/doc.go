// Package figures draws the figures of a galley paper with gonum/plot in
// one house style: a sans font, thin axes, a light horizontal grid, and a
// palette in which every series differs from the others both in shade
// and in dash pattern, so that figures stay legible when printed in black
// and white. Sizes are in inches; the default width suits one column of a
// two-column page.
//
// The builders (Lines, Panels, Residuals, ActualFitted, Correlogram,
// RecursiveCoef, CUSUM, CUSUMSquares) are pure functions of their data and
// options. They return a *Figure, which renders to SVG, PDF or PNG (at a
// stated resolution) through gonum/plot's vg back ends. Captions and
// numbering belong to the document pipeline; a title inside the figure is
// optional and off by default.
package figures
