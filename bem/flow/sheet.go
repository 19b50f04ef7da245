package flow

import (
	"fmt"
	"math"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r2"
)

// Sheets in ideal flow: a flat plate, a sail or a vane drawn as a line (a
// sheet body) is a wall of zero thickness, a floating boundary like any
// other body: psi is constant on both faces, and the sum of the faces'
// inflows, the jump of the tangential velocity across the sheet, is the
// strength of its vortex sheet. "kutta": true puts the Kutta condition at
// the sheet's free end farthest downstream (the trailing edge), "kutta":
// [x, y] at the free end named; bem holds the vortex sheet's strength to
// vanish there like r^1/2. The chord line runs from the trailing edge to
// the farthest point of the sheet (for a flat plate, its length).
//
// Round a free end without a Kutta condition (a plate's leading edge) the
// flow turns with a speed that grows as r^-1/2: the suction there is a
// concentrated force along the sheet, toward the edge, which the pressure
// on the faces of a sheet of zero thickness cannot hold (the leading-edge
// suction; e.g. Katz & Plotkin, Low-Speed Aerodynamics, 2001, sec. 5.3,
// and Milne-Thomson, Theoretical Hydrodynamics, 1968, sec. 7.42, from
// memory; with the complex velocity A / sqrt(z - z_e) near the edge, the
// Blasius integral round it is the force pi rho |A|^2 along the sheet,
// outward). edgeForce takes the force and moment on the sheet near each
// such end from the balance of momentum over a circle round it instead of
// the panels' pressure, so that the pressure lift and drag of a flat
// plate are those of Kutta-Joukowski and no drag. Without it a flat
// plate's pressure force would be normal to the plate: C_L cos^2 alpha
// lift and C_L sin alpha cos alpha drag.

// outline returns the vertices of body i: its outer ring, or the points of
// its sheet line.
func outline(sb *geom.Body) []r2.Vec {
	if sb.Sheet() {
		return sb.Lines[0]
	}
	return sb.Polygons[0][0]
}

// freeEnds returns the free ends of a sheet body (none for a closed line
// or a solid).
func freeEnds(sb *geom.Body) []r2.Vec {
	if !sb.Sheet() {
		return nil
	}
	l := sb.Lines[0]
	if l[0] == l[len(l)-1] {
		return nil
	}
	return []r2.Vec{l[0], l[len(l)-1]}
}

// nextPanel returns, of the panels of owner o starting at p's end, the one
// that keeps the fluid on the left (the first turning clockwise from the
// way back), or -1.
func nextPanel(m *mesh.Mesh, starts map[r2.Vec][]int, j int) int {
	p := m.Panels[j]
	back := r2.Scale(-1, p.Tangent())
	best, at := math.Inf(1), -1
	for _, k := range starts[p.B] {
		t := m.Panels[k].Tangent()
		cw := -math.Atan2(r2.Cross(back, t), r2.Dot(back, t))
		if cw <= 0 {
			cw += 2 * math.Pi
		}
		if cw < best {
			best, at = cw, k
		}
	}
	return at
}

// suctionRadius is the radius, as a fraction of the sheet's length, of
// the circle round a free end over which edgeForce balances momentum;
// suctionNodes the Gauss-Legendre nodes on it.
const (
	suctionRadius = 0.05
	suctionNodes  = 64
)

// edgeForce returns what the pressure on the panels near the free end e
// of body b's sheet misses: the force (N/m) and anticlockwise moment about
// ref (N m/m) on the stretch of sheet inside a circle of radius R about e,
// less the surface pressure of its panels. The force on that stretch is
// the momentum balance of the fluid inside the circle,
//
//	F = -int (p n + rho v (v.n)) ds,  M = -int (x - ref) x (p n + rho v (v.n)) ds,
//
// over the circle (n outward, p - p_inf = q Cp; e.g. Batchelor, An
// Introduction to Fluid Dynamics, 1967, sec. 3.3, from memory), with the
// velocity from Eval, whose integrals are exact for the discrete solution
// anywhere off the boundary: it holds the leading-edge suction that no
// panel can. R is about suctionRadius of the sheet's length, moved to the
// panel end on the sheet nearest to it (the circle then cuts the sheet
// between panels), and no more than half the distance to any other
// boundary.
func (fs *System) edgeForce(rep *Report, b Body, sb *geom.Body, e, ref r2.Vec) (r2.Vec, float64) {
	m := fs.Mesh
	sol := rep.Solution
	l := sheetLength(sb)
	clear := math.Inf(1) // the nearest other boundary
	for _, p := range m.Panels {
		if p.Owner != b.Owner {
			clear = math.Min(clear, segDistance(e, p.A, p.B))
		}
	}
	if fs.ground != nil {
		clear = math.Min(clear, e.Y-fs.ground.Y)
	}
	target := math.Min(suctionRadius*l, 0.5*clear)
	// The panel end of the sheet nearest to the target radius.
	R, cut := 0.0, r2.Vec{}
	for _, p := range m.Panels {
		if p.Owner != b.Owner {
			continue
		}
		for _, v := range [2]r2.Vec{p.A, p.B} {
			if d := r2.Norm(r2.Sub(v, e)); d > 0 && (R == 0 || math.Abs(d-target) < math.Abs(R-target)) {
				R, cut = d, v
			}
		}
	}
	if !(R > 0) {
		return r2.Vec{}, 0
	}
	// The panels' pressure inside the circle, which the balance replaces.
	var fIn r2.Vec
	var mIn float64
	for j, p := range m.Panels {
		if p.Owner != b.Owner || r2.Norm(r2.Sub(p.A, e)) > R*(1+1e-9) || r2.Norm(r2.Sub(p.B, e)) > R*(1+1e-9) {
			continue
		}
		f := r2.Scale(rep.Dynamic*rep.Panels[j].Cp*p.Length(), p.Normal())
		fIn = r2.Add(fIn, f)
		mIn += r2.Cross(r2.Sub(p.Mid(), ref), f)
	}
	// Round the circle from the cut to the cut.
	phi0 := math.Atan2(cut.Y-e.Y, cut.X-e.X)
	q, U, rho := rep.Dynamic, rep.Stream.Speed, fs.Density
	xs, ws := make([]float64, suctionNodes), make([]float64, suctionNodes)
	quad.Legendre{}.FixedLocations(xs, ws, phi0, phi0+2*math.Pi)
	var fc r2.Vec
	var mc float64
	for k, phi := range xs {
		n := r2.Vec{X: math.Cos(phi), Y: math.Sin(phi)}
		x := r2.Add(e, r2.Scale(R, n))
		v, ok := Velocity(sol, x)
		if !ok {
			continue
		}
		dp := q * (1 - r2.Norm2(v)/(U*U))
		t := r2.Add(r2.Scale(dp, n), r2.Scale(rho*r2.Dot(v, n), v))
		fc = r2.Sub(fc, r2.Scale(ws[k]*R, t))
		mc -= ws[k] * R * r2.Cross(r2.Sub(x, ref), t)
	}
	return r2.Sub(fc, fIn), mc - mIn
}

// segDistance returns the distance from p to the segment ab.
func segDistance(p, a, b r2.Vec) float64 {
	d := r2.Sub(b, a)
	t := math.Max(0, math.Min(1, r2.Dot(r2.Sub(p, a), d)/r2.Norm2(d)))
	return r2.Norm(r2.Sub(p, r2.Add(a, r2.Scale(t, d))))
}

// sheetBody finds a sheet's trailing edge (a free end) and chord line.
func sheetBody(sc *geom.Scene, b Body, sb *geom.Body, dir r2.Vec, ferr func(member, format string, args ...any) error) (Body, error) {
	pts := outline(sb)
	ends := freeEnds(sb)
	unit, scale := sc.Problem.Unit, sc.Problem.Scale
	if unit == "" || !(scale > 0) {
		unit, scale = "m", 1
	}
	var te r2.Vec
	switch k := sb.Kutta; {
	case k == nil:
		p, q := diameter(pts, dir)
		if r2.Dot(p, dir) > r2.Dot(q, dir) {
			p, q = q, p
		}
		c := sc.Problem.Chord
		if len(sc.Bodies) > 1 {
			c = 0
		}
		b.Chord = chordLine(p, q, c)
		return b, nil
	case len(ends) == 0:
		return b, ferr("kutta", "is on a closed sheet, which has no free end to be a trailing edge; remove \"kutta\" or open the line")
	case k.Auto:
		te = ends[0]
		if d0, d1 := r2.Dot(ends[0], dir), r2.Dot(ends[1], dir); d1 > d0 {
			te = ends[1]
		}
	default:
		lo, hi := bounds(pts)
		tol := kuttaPointTol * r2.Norm(r2.Sub(hi, lo))
		te = ends[0]
		if r2.Norm(r2.Sub(ends[1], k.Point)) < r2.Norm(r2.Sub(ends[0], k.Point)) {
			te = ends[1]
		}
		if d := r2.Norm(r2.Sub(te, k.Point)); d > tol {
			return b, ferr("kutta", "%s", fmt.Sprintf("the point (%.6g, %.6g) %s is %.3g %s from the nearer free end of the sheet, (%.6g, %.6g) %s; a sheet's trailing edge is one of its two free ends",
				k.Point.X/scale, k.Point.Y/scale, unit, d/scale, unit, te.X/scale, te.Y/scale, unit))
		}
	}
	b.Kutta, b.Angle, b.Base = true, 0, [2]r2.Vec{te, te}
	c := 0.0
	if len(sc.Bodies) == 1 {
		c = sc.Problem.Chord
	}
	b.Chord = chordFrom(te, [][]r2.Vec{pts}, c)
	return b, nil
}

// sheetLength returns the length of a sheet body's line.
func sheetLength(sb *geom.Body) float64 {
	l := 0.0
	for _, ln := range sb.Lines {
		for k := 1; k < len(ln); k++ {
			l += r2.Norm(r2.Sub(ln[k], ln[k-1]))
		}
	}
	return l
}
