package grid

import (
	"math"

	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Window is an axis-aligned rectangle of the plane, in metres.
type Window struct {
	Min, Max r2.Vec
}

// Empty reports whether the window has no area (or is not finite).
func (w Window) Empty() bool {
	s := w.Size()
	return !(s.X > 0 && s.Y > 0) || math.IsInf(s.X, 0) || math.IsInf(s.Y, 0)
}

// Size returns the width and height of the window.
func (w Window) Size() r2.Vec { return r2.Sub(w.Max, w.Min) }

// Diagonal returns the length of the window's diagonal.
func (w Window) Diagonal() float64 { return r2.Norm(w.Size()) }

// Contains reports whether p lies in the window (edges included).
func (w Window) Contains(p r2.Vec) bool {
	return p.X >= w.Min.X && p.X <= w.Max.X && p.Y >= w.Min.Y && p.Y <= w.Max.Y
}

// Window margins and proportions of Auto.
const (
	closedMargin = 0.04 // closed scenes: margin around the boundary, of the larger extent
	openFactor   = 1.5  // open scenes: window over the bodies' extent
	minAspect    = 0.3  // no side shorter than minAspect times the other
	// open scenes: the field spreads in every direction, so the window is
	// nearer square
	minAspectOpen = 0.75
)

// Auto returns the default window for a mesh: the bounding box of the
// boundary with a margin of 4% of its larger side in a closed scene; in an
// open scene a window 1.5 times the bodies' extent about their centre (down
// to the grounded plane, if any). Neither side is shorter than 0.3 times the
// other (0.75 in an open scene), so that a thin plate still gets a picture
// with room around it.
func Auto(m *mesh.Mesh) Window {
	lo, hi := m.Bounds()
	lay := m.Layout
	open := lay != nil && lay.Open
	var ground *float64
	if open && lay.Ground != nil {
		g := lay.Ground.Y
		ground = &g
		lo.Y = math.Min(lo.Y, g)
	}
	ext := r2.Sub(hi, lo)
	big := math.Max(ext.X, ext.Y)
	if !(big > 0) {
		big = 1
	}
	aspect := minAspect
	if open {
		aspect = minAspectOpen
	}
	ext.X = math.Max(ext.X, aspect*big)
	ext.Y = math.Max(ext.Y, aspect*big)
	c := r2.Scale(0.5, r2.Add(lo, hi))
	var half r2.Vec
	if open {
		half = r2.Scale(0.5*openFactor, ext)
	} else {
		half = r2.Add(r2.Scale(0.5, ext), r2.Vec{X: closedMargin * big, Y: closedMargin * big})
	}
	w := Window{Min: r2.Sub(c, half), Max: r2.Add(c, half)}
	if ground != nil {
		// The domain lies above the plane: show a thin strip below it.
		top := w.Max.Y
		w.Min.Y = *ground - closedMargin*(top-*ground)
	}
	return w
}

// defaultPoints is the grid size of DefaultPoints: about 290 x 200 samples,
// sampled in about 0.06 s on two cores whatever the panel count
// (BenchmarkSample: about 1 microsecond a point from 500 to 2000 panels,
// 2.3 at 32 000 where the trees' own work over the panels shows).
const defaultPoints = 60000

// DefaultPoints returns the number of grid points of a picture: 60 000,
// whatever the panel count, since Sample's cost per point barely depends
// on it. The argument is the panel count (kept for callers that size grids
// by it).
func DefaultPoints(panels int) int {
	_ = panels
	return defaultPoints
}

// Shape returns grid dimensions of about points samples in all whose
// spacing is (nearly) the same along x and y; each is at least 8.
func (w Window) Shape(points int) (nx, ny int) {
	s := w.Size()
	aspect := 1.0
	if s.X > 0 && s.Y > 0 {
		aspect = s.X / s.Y
	}
	nx = int(math.Round(math.Sqrt(float64(points) * aspect)))
	nx = max(nx, 8)
	ny = max(int(math.Round(float64(points)/float64(nx))), 8)
	return nx, ny
}
