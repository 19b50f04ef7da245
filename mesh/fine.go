package mesh

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// defaultMaxPanels is the most panels an automatic mesh makes (Options
// MaxPanels): about what the dense solver takes (16 000 unknowns) with a
// margin for the second unknown of interface panels.
const defaultMaxPanels = 20000

// samplesPerPanel: the gap sampling takes about this many samples per
// panel the gaps ask for (gapSampling 0.25 of the distance), so a piece
// with more samples than this times the limit cannot be meshed within it.
const samplesPerPanel = 4

// TooFineError reports a feature so thin or a gap so narrow, compared with
// the scene, that panels no longer than it would number more than the mesh
// may make.
type TooFineError struct {
	// Feature names the body, edge or region wall concerned; Across names
	// the feature across a gap ("" when it is the body's own thickness).
	Feature, Across string
	// Size is the thickness or the gap in metres, Scene the scene's
	// bounding-box diagonal, At where it is.
	Size, Scene float64
	At          r2.Vec
	// Panels estimates the panels it would take, Max the limit.
	Panels, Max int
	// Thickness tells a body's own thickness from a gap across the domain.
	Thickness bool
}

func (e *TooFineError) Error() string {
	what := fmt.Sprintf("%s is %.3g m thick near (%.6g, %.6g) m, %.2g of the scene's size", e.Feature, e.Size, e.At.X, e.At.Y, e.Size/e.Scene)
	fix := "draw it as a line (a body of zero thickness, a sheet) or make it thicker"
	if !e.Thickness {
		what = fmt.Sprintf("the gap of %.3g m between %s and %s near (%.6g, %.6g) m is %.2g of the scene's size", e.Size, e.Feature, e.Across, e.At.X, e.At.Y, e.Size/e.Scene)
		fix = "widen the gap, or let the two touch if they are meant to"
	}
	return fmt.Sprintf("mesh: %s: panels no longer than it would number some %.1g, more than the %d an automatic mesh makes; %s",
		what, float64(e.Panels), e.Max, fix)
}

// limit returns the most panels the mesh may make.
func (o Options) limit() int {
	switch {
	case o.MaxPanels > 0:
		return o.MaxPanels
	case o.Panels > 0:
		return max(4*o.Panels, defaultMaxPanels)
	case o.Size > 0:
		return maxPanels
	}
	return defaultMaxPanels
}

// ownerName names the boundary a piece belongs to, for messages: its body
// or edge as `body "pin"`, else the region's wall or the interface.
func ownerName(l *geom.Layout, p geom.Piece) string {
	region := func(i int) string {
		if i >= 0 && i < len(l.Regions) {
			return fmt.Sprintf("%q", l.Regions[i].Name)
		}
		return "the domain"
	}
	switch {
	case p.Owner >= 0 && p.Owner < len(l.Owners):
		o := l.Owners[p.Owner]
		return fmt.Sprintf("%s %q", o.Part, o.Name)
	case p.Interface():
		return "the interface between " + region(p.Left) + " and " + region(p.Right)
	}
	return "the outer wall of region " + region(p.Left)
}

// tooFine builds the error for piece i, whose narrowest gap found is size
// at t along it, across a body when body is set; panels estimates what it
// would take.
func (b *builder) tooFine(i int, t, size float64, body bool, panels int) *TooFineError {
	pc := b.l.Pieces[i]
	at := r2.Add(pc.A, r2.Scale(t/b.lens[i], r2.Sub(pc.B, pc.A)))
	e := &TooFineError{Feature: ownerName(b.l, pc), Size: size, Scene: b.diag, At: at, Panels: panels, Max: b.o.limit(), Thickness: body}
	// The feature across: the nearest piece that does not touch piece i.
	best := math.Inf(1)
	for j, q := range b.l.Pieces {
		if j == i || b.vA[j] == b.vA[i] || b.vA[j] == b.vB[i] || b.vB[j] == b.vA[i] || b.vB[j] == b.vB[i] {
			continue
		}
		if d := segmentDistance(at, q.A, q.B); d < best {
			best, e.Across = d, ownerName(b.l, q)
		}
	}
	if body && e.Across == e.Feature {
		e.Across = ""
	} else if body {
		// Across a body that is not the piece's own: a gap after all.
		e.Thickness = false
	}
	return e
}

// segmentDistance returns the distance from p to the segment ab.
func segmentDistance(p, a, b r2.Vec) float64 {
	d := r2.Sub(b, a)
	L2 := r2.Dot(d, d)
	if L2 == 0 {
		return r2.Norm(r2.Sub(p, a))
	}
	t := math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, a), d)/L2))
	return r2.Norm(r2.Sub(p, r2.Add(a, r2.Scale(t, d))))
}

// tooMany builds the error for an automatic mesh of n panels, more than
// the limit: it names the piece with the most panels and its narrowest
// gap.
func (b *builder) tooMany(h0 float64, scale []float64, n int) *TooFineError {
	nodes, _ := b.place(h0, scale, true)
	worst, most := 0, -1
	for i, ts := range nodes {
		if c := len(ts) - 1; c > most {
			worst, most = i, c
		}
	}
	narrow, at, body := math.Inf(1), 0.0, false
	for k, t := range b.gapT[worst] {
		if g := b.gapH[worst][k] / b.o.GapFactor; g < narrow {
			narrow, at, body = g, t, false
		}
		if g := b.gapB[worst][k] / b.o.GapFactor; g < narrow {
			narrow, at, body = g, t, true
		}
	}
	if math.IsInf(narrow, 1) {
		narrow = b.lens[worst] / float64(max(most, 1))
	}
	return b.tooFine(worst, at, narrow, body, n)
}
