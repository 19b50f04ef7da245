// Package mesh turns the boundary pieces of a geom.Layout into straight
// panels: size control, geometric grading toward singular corners, tips and
// changes of condition (nearly straight vertices are skipped), and panels no
// longer than the local gap between close boundaries. It knows panels'
// endpoints, normals and lengths and the boundary they came from, and
// nothing about kernels.
//
//	m, err := mesh.Build(lay, mesh.Options{}) // zero Options: automatic sizing
//	fmt.Print(m.Summary())
//
// # Conventions
//
// Lengths are in metres. A panel keeps the orientation of its piece: the
// region Left lies on its left walking from A to B, and its outward normal
// (out of Left) is the tangent turned clockwise. Panels never span a vertex
// of the layout; they come grouped by piece in the layout's order, each
// piece's panels from A to B. Panel.S is the arc length at the midpoint
// along the owner's boundary (along the piece's own chain for pieces
// without an owner).
//
// # Panel sizes
//
// The target length at a point p of the boundary is
//
//	h(p) = min(h0, GapFactor*gap(p), min over singular v of max(hmin, ln(Grading)*|p-v|))
//
// with h0 the nominal size and hmin = Smallest*h0. The last term makes the
// panels toward a singular vertex a geometric series of ratio Grading. The
// gap is the distance across the domain or a body to the nearest other
// boundary (the thickness of a thin sheet), discounted when the boundary
// itself runs from p to that point nearly straight. A piece gets
// ceil(integral of 1/h) panels with nodes at equal steps of that integral;
// a piece next to a much shorter one is divided again to grade down to it.
//
// # Singular vertices
//
// The derivative of the solution is singular at a corner whose opening
// angle beta on the domain side exceeds pi (it grows like r^(pi/beta - 1))
// and where a fixed potential meets a fixed flux (r^(pi/(2 beta) - 1), r^-1/2
// on a straight line). Build grades toward vertices where beta exceeds
// pi + 10 degrees (on either side of an interface), where the condition
// changes between two boundary pieces, where three or more pieces meet and
// where a chain of pieces ends. Nearly straight vertices, as on a polygon
// standing for a circle, are not graded.
package mesh
