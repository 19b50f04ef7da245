// Package grid turns a boundary element solution into pictures' raw
// material: the potential and its gradient sampled on a regular grid,
// equipotential lines (marching squares) and flux lines traced from the
// sources so that neighbouring lines carry equal flux (a flow net).
//
// # Conventions
//
// Everything is in metres and SI units, like package bem. A Grid holds its
// samples row by row, y growing with the row index: sample (i, j) sits at
// x = Min.X + i*dx, y = Min.Y + j*dy and is stored at index j*NX + i.
// Samples outside the domain (inside bodies, outside the regions of a closed
// scene, below a grounded plane) and samples on the boundary itself are NaN.
//
// Flux lines follow the flux vector -K grad u (the field direction E = -grad u
// in an isotropic region), from where flux enters the domain to where it
// leaves or to the edge of the window.
//
// # Cost
//
// Sample evaluates bem.Solution.EvalMany, fast multipole trees over the
// grid's points: Eval's values (the near-boundary reconstruction included)
// at about 1 microsecond a point on two cores, nearly independent of the
// panel count (BenchmarkSample). Trace and TraceFrom evaluate a bem.Field,
// the solution's multipoles walked point by point, at a cost per point
// growing as the logarithm of the panel count. DefaultPoints is a fixed
// 60 000 samples.
//
// # Example
//
//	w := grid.Auto(sol.Mesh)
//	nx, ny := w.Shape(grid.DefaultPoints(len(sol.Mesh.Panels)))
//	g := grid.Sample(sol, w, nx, ny, grid.Options{})
//	lo, hi := grid.BoundaryRange(sol)
//	lines := grid.Contours(g, grid.Levels(lo, hi, 9), "V") // 9 levels, 10 drops
//	net := grid.Trace(sol, w, 10, grid.TraceOptions{})    // flux lines, flow-net numbers
package grid
