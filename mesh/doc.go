// Package mesh turns the boundary pieces of a geom.Layout into straight
// panels: size control, geometric grading toward singular corners, tips and
// changes of condition (nearly straight vertices are skipped), and panels no
// longer than the local gap between close boundaries. It knows panels'
// endpoints, normals and lengths and the boundary they came from, and
// nothing about kernels.
//
//	m, err := mesh.Build(lay, mesh.Options{}) // zero Options: automatic sizing
package mesh
