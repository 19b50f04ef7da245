// Package draw makes the pictures of a solution for reports: maps of the
// potential or the field strength over the scene (Map), with equipotentials,
// flux lines, bodies and regions named, edges, a colour bar in physical
// units, a scale bar in the scene's unit and a title, as PNG (rasterised
// with fogleman/gg and the Go fonts, no system fonts needed) or SVG
// (gonum's vg); and line charts of named series against arc length (Chart,
// or Charts stacked in one picture, legends beside them), such as the
// potential and the inflow density along every boundary (BoundarySeries),
// drawn with gonum.org/v1/plot. Physics adapters add series of their own
// to a Chart.
//
// Numbers are shown to people in a Display unit: SI with the prefix that
// suits the range (pF/m, nC/m, kV/mm for strong fields), or a power-of-ten
// factor for units that take no prefix. DisplayFor chooses it, FormatSI
// writes one value with it; the values themselves stay SI.
//
// It is the only importer of the raster library. Coordinates come in
// metres, as everywhere below cmd; only the axes and the scale bar are in
// the scene's unit (geom.Problem.Unit and Scale).
//
// The default colour map, Sequential, is derived in the OKLab colour space
// to be perceptually uniform, monotonic in lightness and readable with the
// common colour-vision deficiencies; see its documentation.
//
// # Example
//
//	g := grid.Sample(sol, w, nx, ny, grid.Options{})
//	m := &draw.Map{Grid: g, Values: g.U, Label: "potential", Unit: "V", Title: "C = 54.6 pF/m", Scene: sc}
//	err := m.PNG(f, 1200, 800)
package draw
