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
// bem.Solution.Eval is exact at any distance from the boundary and costs
// O(panels) per point, about 150 ns per panel on one core (BenchmarkSample
// reports it). DefaultPoints sizes a grid so that sampling stays within a few
// seconds on two cores whatever the panel count.
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
