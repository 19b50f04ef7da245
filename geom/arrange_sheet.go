package geom

import "fmt"

// This file holds the sheets of the arrangement: bodies drawn as lines, of
// zero thickness. Their lines are split at every crossing like any other
// line; they enclose no area, so they change nothing on either side of a
// sub-segment, and each sub-segment a sheet runs along gives one boundary
// piece per face that has domain in front of it, carrying the sheet's
// condition. Where both faces do, the two pieces are twins: the same
// stretch, one from each side.

// sheetPieces returns the faces of the sub-segment sg that the sheets run
// along (sorted body indices; the first carries the condition), given
// which sides are domain. Two faces come as twins (Layout.Twin). An edge
// running along a sheet, and a sheet lying along the grounded plane, are
// refused.
func (a *arrangement) sheetPieces(sg *subSeg, sheets, edges []int, dl, dr bool) ([]rawPiece, error) {
	s := a.sc
	b := sheets[0]
	if len(edges) > 0 {
		return nil, s.featErr(srcBody, b, fmt.Sprintf("is a sheet, and %s runs along it near %s; a sheet carries its own condition on both faces: shorten the edge so that it stops at the sheet, or give the condition to the sheet itself", s.featRef(srcEdge, edges[0]), a.where(a.mid(sg))))
	}
	if _, ok := a.onGround(sg); ok {
		return nil, s.featErr(srcBody, b, fmt.Sprintf("is a sheet lying along the grounded plane y = %s m near %s; the plane is already a boundary at 0 (a slip wall in flow): remove that stretch of the sheet, or lift it off the plane", fmtNum(s.Problem.Ground.Y), a.where(a.mid(sg))))
	}
	cond := s.Bodies[b].Cond
	var out []rawPiece
	if dl {
		out = append(out, rawPiece{Piece{A: a.pos[sg.lo], B: a.pos[sg.hi], Left: a.regionOf(sg.sides[0]), Right: Outside, Owner: b, Cond: cond}, sg.lo, sg.hi, -1})
	}
	if dr {
		out = append(out, rawPiece{Piece{A: a.pos[sg.hi], B: a.pos[sg.lo], Left: a.regionOf(sg.sides[1]), Right: Outside, Owner: b, Cond: cond}, sg.hi, sg.lo, -1})
	}
	return out, nil
}
