package geom

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/spatial/r2"
)

// This file holds the reader's checks of sheets: bodies drawn as a
// LineString or MultiLineString, of zero thickness, whose two faces both
// carry the body's condition.

// Sheet reports whether the body is a sheet of zero thickness (drawn as
// lines) rather than a solid.
func (b *Body) Sheet() bool { return len(b.Lines) > 0 }

// sheetLines returns the shaped lines of a sheet body, nil for a solid.
func (rf *readFeature) sheetLines() []Line {
	if !rf.sheet {
		return nil
	}
	return rf.shaped
}

// sheetSegments refuses a sheet line with a zero-length segment (two
// successive positions within the coincidence tolerance, other than the
// closing repeat of a closed line) or one that doubles back on itself (a
// segment running back over the one before it). An edge drops repeated
// positions quietly; on a sheet they are refused, since a GIS tool that
// doubles a vertex often means a sheet drawn twice.
func (rd *sceneReader) sheetSegments(raw []r2.Vec, what string, ef func(string, ...any) error) error {
	tol := rd.tol
	n := len(raw)
	closed := n > 2 && r2.Norm(r2.Sub(raw[0], raw[n-1])) <= tol
	all := true
	for k := 1; k < n; k++ {
		if r2.Norm(r2.Sub(raw[k], raw[0])) > tol {
			all = false
		}
	}
	if all {
		return ef("%s has no length (all its positions coincide at %s); a sheet needs at least 2 distinct positions", what, rd.pointFmt(raw[0]))
	}
	for k := 0; k+1 < n; k++ {
		if r2.Norm(r2.Sub(raw[k], raw[k+1])) <= tol {
			return ef("%s has a zero-length segment: positions %d and %d coincide at %s; remove the repeated position", what, k, k+1, rd.pointFmt(raw[k]))
		}
	}
	// The vertices where two segments meet: every one of a closed line
	// (without its closing repeat), the inner ones of an open line.
	m, first, last := n, 1, n-2
	if closed {
		m, first, last = n-1, 0, n-2
	}
	for k := first; k <= last; k++ {
		prev, v, next := raw[(k-1+m)%m], raw[k], raw[(k+1)%m]
		if d, _ := readPointSeg(next, prev, v); d <= tol {
			return ef("%s doubles back on itself at %s (two successive segments overlap); remove the spike", what, rd.pointFmt(v))
		}
		if d, _ := readPointSeg(prev, v, next); d <= tol {
			return ef("%s doubles back on itself at %s (two successive segments overlap); remove the spike", what, rd.pointFmt(v))
		}
	}
	return nil
}

// sheetContact is a stretch where two segments of one sheet overlap.
type sheetContact struct {
	at   r2.Vec
	a, b string // the two lines' positions in words
}

// readSheetOverlap finds two segments of a sheet's lines that run over a
// common stretch longer than tol (collinear within tol). Crossing and
// touching are allowed: a sheet may branch or cross itself like two
// sheets. Segments are swept in order of their smallest x.
func readSheetOverlap(lines []Line, tol float64) (sheetContact, bool) {
	type seg struct {
		a, b       r2.Vec
		line, idx  int
		minX, maxX float64
	}
	var segs []seg
	for li, l := range lines {
		for k := 0; k+1 < len(l); k++ {
			a, b := l[k], l[k+1]
			segs = append(segs, seg{a: a, b: b, line: li, idx: k, minX: math.Min(a.X, b.X), maxX: math.Max(a.X, b.X)})
		}
	}
	sort.Slice(segs, func(i, j int) bool { return segs[i].minX < segs[j].minX })
	name := func(s seg) string {
		if len(lines) > 1 {
			return fmt.Sprintf("segment %d of line %d", s.idx, s.line)
		}
		return fmt.Sprintf("segment %d", s.idx)
	}
	for i := range segs {
		s := segs[i]
		for j := i + 1; j < len(segs) && segs[j].minX <= s.maxX+tol; j++ {
			t := segs[j]
			if at, ok := readCollinearOverlap(s.a, s.b, t.a, t.b, tol); ok {
				return sheetContact{at: at, a: name(s), b: name(t)}, true
			}
		}
	}
	return sheetContact{}, false
}

// readCollinearOverlap reports whether segments ab and cd lie on one line
// (within tol) and share a stretch longer than tol, and returns the
// middle of that stretch.
func readCollinearOverlap(a, b, c, d r2.Vec, tol float64) (r2.Vec, bool) {
	ab := r2.Sub(b, a)
	l := r2.Norm(ab)
	if l <= tol {
		return a, false
	}
	u := r2.Scale(1/l, ab)
	if math.Abs(r2.Cross(u, r2.Sub(c, a))) > tol || math.Abs(r2.Cross(u, r2.Sub(d, a))) > tol {
		return a, false
	}
	tc, td := r2.Dot(r2.Sub(c, a), u), r2.Dot(r2.Sub(d, a), u)
	lo, hi := math.Max(0, math.Min(tc, td)), math.Min(l, math.Max(tc, td))
	if hi-lo <= tol {
		return a, false
	}
	return r2.Add(a, r2.Scale(0.5*(lo+hi), u)), true
}
