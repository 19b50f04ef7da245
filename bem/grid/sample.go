package grid

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Options tunes Sample. The zero value means the defaults given with each
// field.
type Options struct {
	// Workers is not used: Sample's multipole trees run on every
	// processor, and results do not depend on their number. It is kept so
	// that callers that set it still compile.
	Workers int
	// Near is the distance from the boundary, as a fraction of the scene's
	// bounding-box diagonal (Layout.Diagonal), within which a sample counts
	// as on the boundary and is masked; 0 means 1e-9, the scene's own
	// coincidence tolerance.
	Near float64
}

// Grid is the potential and its gradient sampled on a regular grid.
type Grid struct {
	Window Window
	NX, NY int
	// U holds the potential at each sample, row by row (index j*NX + i);
	// NaN outside the domain and on the boundary.
	U []float64
	// Grad holds the gradient of the potential (NaN where U is).
	Grad []r2.Vec
	// Region holds the region of each sample (index into Layout.Regions),
	// or geom.Outside where masked.
	Region []int
}

// Index returns the storage index of sample (i, j).
func (g *Grid) Index(i, j int) int { return j*g.NX + i }

// Spacing returns the distance between neighbouring samples along x and y.
func (g *Grid) Spacing() r2.Vec {
	s := g.Window.Size()
	return r2.Vec{X: s.X / float64(g.NX-1), Y: s.Y / float64(g.NY-1)}
}

// Point returns the position of sample (i, j).
func (g *Grid) Point(i, j int) r2.Vec {
	h := g.Spacing()
	return r2.Vec{X: g.Window.Min.X + float64(i)*h.X, Y: g.Window.Min.Y + float64(j)*h.Y}
}

// Magnitude returns |grad u| at every sample (NaN where masked).
func (g *Grid) Magnitude() []float64 {
	out := make([]float64, len(g.Grad))
	for k, v := range g.Grad {
		out[k] = math.Hypot(v.X, v.Y)
	}
	return out
}

// Peak returns the largest finite value of v and its sample index, or
// (NaN, -1) when there is none.
func Peak(v []float64) (float64, int) {
	best, at := math.NaN(), -1
	for k, x := range v {
		if !math.IsNaN(x) && !math.IsInf(x, 0) && (at < 0 || x > best) {
			best, at = x, k
		}
	}
	return best, at
}

// Sample evaluates sol on an nx by ny grid spanning the window w (use Auto
// for the default) through fast multipole trees over the grid's points
// (bem.Solution.EvalMany): Eval's values, the near-boundary reconstruction
// included, at a cost per point nearly independent of the panel count.
// Samples outside the domain, or within Options.Near of a panel, are masked
// (NaN, Region geom.Outside). It panics if nx or ny is below 2 or the window
// is empty: a caller bug.
func Sample(sol *bem.Solution, w Window, nx, ny int, o Options) *Grid {
	if nx < 2 || ny < 2 {
		panic(fmt.Sprintf("grid: %d x %d samples; need at least 2 x 2", nx, ny))
	}
	if w.Empty() {
		panic(fmt.Sprintf("grid: empty window %v", w))
	}
	g := &Grid{Window: w, NX: nx, NY: ny,
		U: make([]float64, nx*ny), Grad: make([]r2.Vec, nx*ny), Region: make([]int, nx*ny)}
	near := nearDistance(sol, o.Near)
	pts := make([]r2.Vec, nx*ny)
	for j := range ny {
		for i := range nx {
			pts[g.Index(i, j)] = g.Point(i, j)
		}
	}
	for k, pt := range sol.EvalMany(pts, near) {
		if pt.Region == geom.Outside || math.IsNaN(pt.U) {
			pt = masked()
		}
		g.U[k], g.Grad[k], g.Region[k] = pt.U, pt.Grad, pt.Region
	}
	return g
}

// nearDistance returns the masking distance in metres.
func nearDistance(sol *bem.Solution, frac float64) float64 {
	if frac <= 0 {
		frac = 1e-9
	}
	d := 0.0
	if sol.Mesh.Layout != nil {
		d = sol.Mesh.Layout.Diagonal
	}
	if !(d > 0) {
		lo, hi := sol.Mesh.Bounds()
		d = r2.Norm(r2.Sub(hi, lo))
	}
	return frac * d
}

// masked is the value of a sample outside the domain.
func masked() bem.Point {
	nan := math.NaN()
	return bem.Point{U: nan, Grad: r2.Vec{X: nan, Y: nan}, Region: geom.Outside}
}

// segments is the boundary as a list of segments, for distance queries.
type segments struct {
	a, d []r2.Vec // start and direction (b - a)
	l2   []float64
}

func newSegments(sol *bem.Solution) *segments {
	ps := sol.Mesh.Panels
	s := &segments{a: make([]r2.Vec, len(ps)), d: make([]r2.Vec, len(ps)), l2: make([]float64, len(ps))}
	for k, p := range ps {
		s.a[k] = p.A
		s.d[k] = r2.Sub(p.B, p.A)
		s.l2[k] = r2.Dot(s.d[k], s.d[k])
	}
	return s
}

// dist2 returns the squared distance from p to segment k.
func (s *segments) dist2(k int, p r2.Vec) float64 {
	q := r2.Sub(p, s.a[k])
	t := 0.0
	if s.l2[k] > 0 {
		t = math.Min(1, math.Max(0, r2.Dot(q, s.d[k])/s.l2[k]))
	}
	e := r2.Sub(q, r2.Scale(t, s.d[k]))
	return r2.Dot(e, e)
}

// within reports whether p lies within distance r of some segment.
func (s *segments) within(p r2.Vec, r float64) bool {
	r2lim := r * r
	for k := range s.a {
		if s.dist2(k, p) <= r2lim {
			return true
		}
	}
	return false
}

// nearest returns the index of the segment nearest to p and the distance.
func (s *segments) nearest(p r2.Vec) (int, float64) {
	best, at := math.Inf(1), -1
	for k := range s.a {
		if d := s.dist2(k, p); d < best {
			best, at = d, k
		}
	}
	return at, math.Sqrt(best)
}
