// Package mesh turns the boundary pieces of a geom.Layout into straight
// panels: size control, geometric grading toward singular corners, tips and
// changes of condition (nearly straight vertices are skipped), and panels no
// longer than the local gap between close boundaries (a fraction of it
// across a thin body). It knows panels'
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
//	h(p) = min(h0, GapFactor*gap(p), body(GapFactor*bgap(p)),
//	           min over singular v of max(hmin, ln(Grading)*|p-v|))
//	body(g) = max(g/4, min(g, h0/16))
//
// with h0 the nominal size and hmin = Smallest*h0. The last term makes the
// panels toward a singular vertex a geometric series of ratio Grading. The
// gap is the distance across the domain to the nearest other boundary, and
// bgap the distance across a body or a slot outside the domain (the
// thickness of a sheet pile, or from a bed to the bed on the other side of
// the pile), each discounted when the boundary itself runs from p to that
// point nearly straight. Across a body the potential jumps from one face
// to the other, so its panels are held to a quarter of its thickness
// (panels as long as the thickness cost 5e-4 to 8e-4 in the discharge
// beside 0.2 m and 1 m sheet piles; a quarter, about 1e-4), but not below
// h0/16 unless the thickness itself is shorter, which keeps sheet piles a
// centimetre or two thick at panels as long as their thickness. A piece
// gets ceil(integral of 1/h) panels with nodes at equal steps of that
// integral; a piece next to a much shorter one is divided again to grade
// down to it.
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
//
// # Sheets
//
// The two faces of a sheet (geom.Layout.Twin) get the same nodes: those of
// the face that asks for more panels, mirrored onto the other, so that
// twin panels have identical end points, reversed (Mesh.Twin). A sheet's
// free end, where its faces meet turning back, is graded as a tip (r^-1/2);
// where it meets another boundary three or more pieces meet and it is
// graded too; a vertex where a straight sheet merely continues is not. At
// the automatic size each face of a sheet gets at least 32 panels of the
// nominal size (more where graded), whatever the size of the scene around
// it; a size or count asked for scales them with the rest.
// Behind a sheet's face there is no gap to size panels by: the face behind
// is the sheet's other face.
package mesh
