package geom

import (
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// The expected numbers in these tests are exact lengths and areas of the
// polygons drawn (elementary geometry: the shoelace formula for the area of a
// simple polygon, Gauss's area formula, common practice). The tolerances
// cover floating-point rounding in sums of a few dozen products of numbers of
// order 1-100, which is about 1e-14 relative; 1e-9 leaves room for the
// vertex snapping (CoincidenceTol = 1e-9 of the diagonal) without hiding a
// missing or doubled piece, which would be off by O(1).
const tolExact = 1e-9

// ring builds a Ring from x, y pairs.
func ring(xy ...float64) Ring {
	r := make(Ring, len(xy)/2)
	for i := range r {
		r[i] = r2.Vec{X: xy[2*i], Y: xy[2*i+1]}
	}
	return r
}

// rect is the counter-clockwise rectangle [x0,x1]x[y0,y1].
func rect(x0, y0, x1, y1 float64) Ring { return ring(x0, y0, x1, y0, x1, y1, x0, y1) }

// reversed is r clockwise (a hole).
func reversed(r Ring) Ring {
	out := slices.Clone(r)
	slices.Reverse(out)
	return out
}

func body(feat int, name string, cond Condition, pgs ...Polygon) Body {
	return Body{Feature: feat, Name: name, Polygons: pgs, Cond: cond}
}

func region(feat int, name string, pgs ...Polygon) Region {
	return Region{Feature: feat, Name: name, Polygons: pgs, Material: Material{Kx: 1, Ky: 1}}
}

func pot(v float64) Condition { return Condition{Kind: Potential, Value: v} }

func pieceLen(p Piece) float64 { return r2.Norm(r2.Sub(p.B, p.A)) }

func cross2(p Piece) float64 { return p.A.X*p.B.Y - p.A.Y*p.B.X }

// boundaryArea is the shoelace sum over the boundary pieces, domain on the
// left: the domain's area for a closed scene, minus the area of the bodies'
// union (cavities excluded) for an open scene.
func boundaryArea(l *Layout) float64 {
	s := 0.0
	for _, p := range l.Pieces {
		if !p.Interface() {
			s += cross2(p) / 2
		}
	}
	return s
}

// regionArea is the shoelace sum over the pieces that bound region r, each
// taken with r on its left: the area of that part of the domain (minus the
// area of its complement for the unbounded background).
func regionArea(l *Layout, r int) float64 {
	s := 0.0
	for _, p := range l.Pieces {
		if p.Left == r {
			s += cross2(p) / 2
		}
		if p.Right == r {
			s -= cross2(p) / 2
		}
	}
	return s
}

func lengthWhere(l *Layout, keep func(Piece) bool) float64 {
	s := 0.0
	for _, p := range l.Pieces {
		if keep(p) {
			s += pieceLen(p)
		}
	}
	return s
}

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Max(1, math.Abs(want))
}

// insideRing is the even-odd crossing test, written independently of the
// arrangement (points are never on a ring in these tests).
func insideRing(r Ring, p r2.Vec) bool {
	in := false
	for i := range r {
		a, b := r[i], r[(i+1)%len(r)]
		if (a.Y > p.Y) != (b.Y > p.Y) && p.X < a.X+(p.Y-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}

func insidePolygon(pg Polygon, p r2.Vec) bool {
	in := false
	for _, r := range pg {
		if insideRing(r, p) {
			in = !in
		}
	}
	return in
}

// domainAt is an independent oracle: the Layout.Regions index of the domain
// at p, or Outside.
func domainAt(sc *Scene, p r2.Vec) int {
	for _, b := range sc.Bodies {
		for _, pg := range b.Polygons {
			if insidePolygon(pg, p) {
				return Outside
			}
		}
	}
	for i, rg := range sc.Regions {
		for _, pg := range rg.Polygons {
			if insidePolygon(pg, p) {
				return i
			}
		}
	}
	if sc.Problem.Open {
		return len(sc.Regions)
	}
	return Outside
}

// checkSides checks every piece against the oracle: just left of its
// midpoint lies region Left, just right lies region Right (or no domain).
func checkSides(t *testing.T, sc *Scene, l *Layout) {
	t.Helper()
	for i, p := range l.Pieces {
		L := pieceLen(p)
		if !(L > 0) {
			t.Fatalf("piece %d has length %g", i, L)
		}
		d := r2.Scale(1/L, r2.Sub(p.B, p.A))
		n := r2.Vec{X: -d.Y, Y: d.X} // left normal
		m := r2.Scale(0.5, r2.Add(p.A, p.B))
		h := 1e-7 * L // well below the thinnest feature of the tests
		if got := domainAt(sc, r2.Add(m, r2.Scale(h, n))); got != p.Left {
			t.Errorf("piece %d %v->%v: left side is %d, piece says %d", i, p.A, p.B, got, p.Left)
		}
		if got := domainAt(sc, r2.Sub(m, r2.Scale(h, n))); got != p.Right {
			t.Errorf("piece %d %v->%v: right side is %d, piece says %d", i, p.A, p.B, got, p.Right)
		}
	}
}

// chains counts the chains in the layout's order: a piece starts a chain
// when it has another owner, kind or pair of regions than the one before, or
// does not start where the one before ends.
func chains(l *Layout) int {
	n := 0
	for i, p := range l.Pieces {
		if i == 0 {
			n++
			continue
		}
		q := l.Pieces[i-1]
		if p.Owner != q.Owner || p.Left != q.Left || p.Right != q.Right || p.A != q.B {
			n++
		}
	}
	return n
}

func mustLayout(t *testing.T, sc *Scene) *Layout {
	t.Helper()
	l, err := sc.Layout()
	if err != nil {
		t.Fatalf("Layout: %v", err)
	}
	checkSides(t, sc, l)
	return l
}

func geomError(t *testing.T, err error) *Error {
	t.Helper()
	if err == nil {
		t.Fatal("Layout succeeded, want an error")
	}
	var ge *Error
	if !errors.As(err, &ge) {
		t.Fatalf("error %v is a %T, want *geom.Error", err, err)
	}
	if !strings.HasPrefix(err.Error(), "geom: ") {
		t.Errorf("error %q does not start with the package name", err)
	}
	return ge
}

// notched is scene (a): the square [0,10]^2 as a closed region, with a body
// [4,6]x[8,12] at potential 1 over its top edge. The region's top edge has a
// vertex at (3,10) and the body a vertex at (5,12): the two rings share no
// vertex.
func notched() *Scene {
	return &Scene{
		Problem: Problem{Physics: Laplace},
		Regions: []Region{region(0, "block", Polygon{ring(0, 0, 10, 0, 10, 10, 3, 10, 0, 10)})},
		Bodies:  []Body{body(1, "plug", pot(1), Polygon{ring(4, 8, 6, 8, 6, 12, 5, 12, 4, 12)})},
	}
}

func TestLayoutNotch(t *testing.T) {
	sc := notched()
	l := mustLayout(t, sc)
	// Notched square: perimeter 3*10 + (4 + 4) on top + 2+2+2 around the
	// notch = 44; area 100 - 2*2 = 96.
	if got := lengthWhere(l, func(Piece) bool { return true }); !near(got, 44, tolExact) {
		t.Errorf("boundary length %.15g, want 44", got)
	}
	if got := boundaryArea(l); !near(got, 96, tolExact) {
		t.Errorf("enclosed area %.15g, want 96", got)
	}
	under := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Cond == pot(1) })
	if !near(under, 6, tolExact) {
		t.Errorf("length carrying the body's potential %.15g, want 6", under)
	}
	walls := lengthWhere(l, func(p Piece) bool { return p.Owner == -1 && p.Cond == Insulated })
	if !near(walls, 38, tolExact) {
		t.Errorf("insulated length %.15g, want 38", walls)
	}
	for _, p := range l.Pieces {
		if p.Owner == 0 && (p.A.Y < 8-1e-12 || p.B.Y < 8-1e-12 || p.A.X < 4-1e-12 || p.A.X > 6+1e-12) {
			t.Errorf("body piece %v->%v is not on the notch", p.A, p.B)
		}
	}
	// Two groups, each one connected chain: the notch (3 pieces) and the
	// rest of the outline.
	if got := chains(l); got != 2 {
		t.Errorf("pieces form %d chains in layout order, want 2", got)
	}
	if len(l.Owners) != 1 || l.Owners[0].Name != "plug" || l.Owners[0].Part != PartBody || l.Owners[0].Feature != 1 {
		t.Errorf("owners %+v", l.Owners)
	}
	if len(l.Regions) != 1 || l.Regions[0].Name != "block" || l.Open {
		t.Errorf("regions %+v, open %v", l.Regions, l.Open)
	}
	if want := math.Hypot(10, 12); !near(l.Diagonal, want, 1e-15) {
		t.Errorf("diagonal %g, want %g", l.Diagonal, want)
	}
	l2, err := sc.Layout()
	if err != nil || !reflect.DeepEqual(l, l2) {
		t.Errorf("a second Layout differs (err %v)", err)
	}
}

// A body resting on the region's top edge from outside, sharing part of
// it: the shared stretch carries the body's condition, nothing is cut out.
func TestLayoutBodyOnEdge(t *testing.T) {
	sc := notched()
	sc.Bodies[0].Polygons[0][0] = ring(4, 10, 6, 10, 6, 12, 5, 12, 4, 12)
	sc.Bodies[0].Cond = Condition{Kind: Flux, Value: 2.5}
	l := mustLayout(t, sc)
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Cond == sc.Bodies[0].Cond }); !near(got, 2, tolExact) {
		t.Errorf("length under the body %.15g, want 2", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == -1 }); !near(got, 38, tolExact) {
		t.Errorf("insulated length %.15g, want 38", got)
	}
	if got := boundaryArea(l); !near(got, 100, tolExact) {
		t.Errorf("area %.15g, want 100", got)
	}
	// Resting on it from inside: the body is a hole in the block with a
	// wall on the block's outline.
	sc.Bodies[0].Polygons[0][0] = ring(4, 8, 6, 8, 6, 10, 5, 10, 4, 10)
	l = mustLayout(t, sc)
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 }); !near(got, 6, tolExact) {
		t.Errorf("inside: body length %.15g, want 6", got)
	}
	if got := boundaryArea(l); !near(got, 96, tolExact) {
		t.Errorf("inside: area %.15g, want 96", got)
	}
}

// transform moves every point of the scene by p -> s*R(theta)*p + off.
func transform(sc *Scene, s, theta float64, off r2.Vec) {
	c, sn := math.Cos(theta), math.Sin(theta)
	f := func(p r2.Vec) r2.Vec {
		return r2.Vec{X: s*(c*p.X-sn*p.Y) + off.X, Y: s*(sn*p.X+c*p.Y) + off.Y}
	}
	for _, b := range sc.Bodies {
		for _, pg := range b.Polygons {
			for _, r := range pg {
				for i := range r {
					r[i] = f(r[i])
				}
			}
		}
	}
	for _, rg := range sc.Regions {
		for _, pg := range rg.Polygons {
			for _, r := range pg {
				for i := range r {
					r[i] = f(r[i])
				}
			}
		}
	}
	for _, e := range sc.Edges {
		for _, l := range e.Lines {
			for i := range l {
				l[i] = f(l[i])
			}
		}
	}
}

// Lengths scale by s and areas by s^2 under a similarity; a rotation by a
// random angle takes the collinear overlaps off the axes.
func TestLayoutNotchMoved(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	for k := 0; k < 20; k++ {
		s := math.Pow(10, 6*rng.Float64()-3)
		theta := 2 * math.Pi * rng.Float64()
		off := r2.Vec{X: 1e3 * s * (rng.Float64() - 0.5), Y: 1e3 * s * (rng.Float64() - 0.5)}
		sc := notched()
		transform(sc, s, theta, off)
		l := mustLayout(t, sc)
		if got := lengthWhere(l, func(Piece) bool { return true }); !near(got/s, 44, tolExact) {
			t.Errorf("s=%g theta=%g: boundary length %.15g, want %.15g", s, theta, got, 44*s)
		}
		if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 }); !near(got/s, 6, tolExact) {
			t.Errorf("s=%g theta=%g: body length %.15g, want %.15g", s, theta, got, 6*s)
		}
		// Relative to the area, rounding grows with the offset: |off|^2 /
		// s^2 is up to 2.5e5, times 1e-16.
		if got := boundaryArea(l); !near(got/(s*s), 96, 1e-8) {
			t.Errorf("s=%g theta=%g: area %.15g, want %.15g", s, theta, got, 96*s*s)
		}
	}
}

func TestLayoutSharedEdge(t *testing.T) {
	// Region A = [0,4]x[0,2] with extra vertices on its right side; region
	// B = [4,8]x[-1,3] with a vertex at (4,0.9) on its left side. They share
	// x = 4, 0 <= y <= 2 with no common vertex.
	sc := &Scene{
		Problem: Problem{Physics: Seepage},
		Regions: []Region{
			region(0, "sand", Polygon{ring(0, 0, 4, 0, 4, 0.5, 4, 1.3, 4, 2, 0, 2)}),
			region(1, "clay", Polygon{ring(4, -1, 8, -1, 8, 3, 4, 3, 4, 0.9)}),
		},
	}
	l := mustLayout(t, sc)
	iface := lengthWhere(l, Piece.Interface)
	if !near(iface, 2, tolExact) {
		t.Errorf("interface length %.15g, want 2", iface)
	}
	for _, p := range l.Pieces {
		if p.Interface() && (p.Left != 0 || p.Right != 1 || p.A.X != 4 || p.B.X != 4 || p.B.Y <= p.A.Y) {
			t.Errorf("interface piece %+v: want sand (0) on the left, walking up x = 4", p)
		}
	}
	// Outline of the union: 12 + 16 - 2*2.
	if got := lengthWhere(l, func(p Piece) bool { return !p.Interface() }); !near(got, 24, tolExact) {
		t.Errorf("outer wall length %.15g, want 24", got)
	}
	if got := regionArea(l, 0); !near(got, 8, tolExact) {
		t.Errorf("sand area %.15g, want 8", got)
	}
	if got := regionArea(l, 1); !near(got, 16, tolExact) {
		t.Errorf("clay area %.15g, want 16", got)
	}
	if got := boundaryArea(l); !near(got, 24, tolExact) {
		t.Errorf("domain area %.15g, want 24", got)
	}
}

// Vertices of one region moved by less than the coincidence tolerance still
// meet the other region's edge exactly: no sliver, no overlap error.
func TestLayoutSnap(t *testing.T) {
	d := 1e-11 // diagonal 10: tolerance 1e-8
	sc := &Scene{
		Problem: Problem{Physics: Laplace},
		Regions: []Region{
			region(0, "left", Polygon{rect(0, 0, 4, 5)}),
			region(1, "right", Polygon{ring(4+d, -d, 8, 0, 8, 5, 4-d, 5+d, 4+d, 2.5)}),
		},
	}
	l := mustLayout(t, sc)
	if got := lengthWhere(l, Piece.Interface); !near(got, 5, 1e-9) {
		t.Errorf("interface length %.15g, want 5", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return !p.Interface() }); !near(got, 26, 1e-9) {
		t.Errorf("outer wall length %.15g, want 26", got)
	}
}

func TestLayoutCavity(t *testing.T) {
	// Open scene, a square frame [0,4]^2 with the hole [1,3]^2: the hole is
	// a cavity, part of the domain.
	frame := Polygon{rect(0, 0, 4, 4), reversed(rect(1, 1, 3, 3))}
	sc := &Scene{
		Problem: Problem{Physics: Electrostatic, Open: true, Background: Material{Kx: Eps0, Ky: Eps0}},
		Bodies:  []Body{body(0, "frame", pot(1), frame)},
	}
	l := mustLayout(t, sc)
	if len(l.Regions) != 1 || !l.Regions[0].Background || l.Regions[0].Feature != -1 || l.Regions[0].Material.Kx != Eps0 {
		t.Fatalf("regions %+v, want the background alone", l.Regions)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Left == 0 }); !near(got, 24, tolExact) {
		t.Errorf("frame length %.15g, want 16 + 8", got)
	}
	// Open scene: the sum is minus the body's area, 16 - 4.
	if got := boundaryArea(l); !near(got, -12, tolExact) {
		t.Errorf("enclosed area %.15g, want -12", got)
	}
	inner := 0.0
	for _, p := range l.Pieces {
		if m := r2.Scale(0.5, r2.Add(p.A, p.B)); m.X > 0.5 && m.X < 3.5 && m.Y > 0.5 && m.Y < 3.5 {
			inner += cross2(p) / 2
		}
	}
	if !near(inner, 4, tolExact) {
		t.Errorf("cavity walls enclose %.15g, want +4 (domain inside)", inner)
	}
	if got := chains(l); got != 2 {
		t.Errorf("%d chains, want 2 (outer ring, cavity)", got)
	}

	// The cavity filled by a second body at the same potential: no domain
	// inside, and the shared walls vanish.
	sc.Bodies = append(sc.Bodies, body(1, "core", pot(1), Polygon{rect(1, 1, 3, 3)}))
	l = mustLayout(t, sc)
	if got := lengthWhere(l, func(Piece) bool { return true }); !near(got, 16, tolExact) {
		t.Errorf("filled: boundary length %.15g, want 16", got)
	}
	if got := boundaryArea(l); !near(got, -16, tolExact) {
		t.Errorf("filled: enclosed area %.15g, want -16", got)
	}
}

func TestLayoutDielectric(t *testing.T) {
	// Open scene: dielectric slab [0,2]x[0,1], a conductor [1.5,2.5]x
	// [0.25,0.75] sticking out of its right side.
	sc := &Scene{
		Problem: Problem{Physics: Electrostatic, Open: true, Background: Material{Kx: Eps0, Ky: Eps0}},
		Regions: []Region{region(0, "slab", Polygon{rect(0, 0, 2, 1)})},
		Bodies:  []Body{body(1, "wire", pot(5), Polygon{rect(1.5, 0.25, 2.5, 0.75)})},
	}
	l := mustLayout(t, sc)
	if len(l.Regions) != 2 || l.Regions[0].Name != "slab" || !l.Regions[1].Background {
		t.Fatalf("regions %+v", l.Regions)
	}
	// Slab outline 6 minus the 0.5 the conductor covers.
	if got := lengthWhere(l, func(p Piece) bool { return p.Interface() && p.Left == 0 && p.Right == 1 }); !near(got, 5.5, tolExact) {
		t.Errorf("slab/background interface %.15g, want 5.5", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Left == 0 }); !near(got, 1.5, tolExact) {
		t.Errorf("conductor facing the slab %.15g, want 1.5", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Left == 1 }); !near(got, 1.5, tolExact) {
		t.Errorf("conductor facing the background %.15g, want 1.5", got)
	}
	if got := regionArea(l, 0); !near(got, 2-0.25, tolExact) {
		t.Errorf("slab area %.15g, want 1.75", got)
	}
	// The background is unbounded: its sum is minus the area of slab and
	// conductor together, 2 + 0.5*0.5.
	if got := regionArea(l, 1); !near(got, -2.25, tolExact) {
		t.Errorf("background sum %.15g, want -2.25", got)
	}
}

func TestLayoutSheetPile(t *testing.T) {
	// A 10 mm sheet pile driven 20 m into a 100 m x 30 m section, sticking
	// 1 m out of the top: diagonal about 104 m, tolerance about 1e-7 m.
	for _, th := range []float64{0.01, 1e-5} {
		x0, x1 := 50-th/2, 50+th/2
		sc := &Scene{
			Problem: Problem{Physics: Seepage},
			Regions: []Region{region(0, "soil", Polygon{rect(0, 0, 100, 30)})},
			Bodies:  []Body{body(1, "pile", Insulated, Polygon{rect(x0, 10, x1, 31)})},
		}
		l := mustLayout(t, sc)
		if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 }); !near(got, 40+th, tolExact) {
			t.Errorf("thickness %g: pile length %.15g, want %.15g", th, got, 40+th)
		}
		if got := boundaryArea(l); !near(got, 3000-20*th, tolExact) {
			t.Errorf("thickness %g: area %.15g, want %.15g", th, got, 3000-20*th)
		}
		faces := 0
		for _, p := range l.Pieces {
			if p.Owner == 0 && p.A.X == p.B.X {
				if p.A.X != x0 && p.A.X != x1 {
					t.Errorf("thickness %g: pile face at x = %.15g", th, p.A.X)
				}
				faces++
			}
		}
		if faces < 2 {
			t.Errorf("thickness %g: %d pile faces", th, faces)
		}
		if got := lengthWhere(l, func(p Piece) bool { return p.Owner == -1 && p.A.Y == 30 && p.B.Y == 30 }); !near(got, 100-th, tolExact) {
			t.Errorf("thickness %g: top wall %.15g, want %.15g", th, got, 100-th)
		}
	}
}

func TestLayoutEdges(t *testing.T) {
	blk := Polygon{rect(0, 0, 10, 5)}
	newScene := func(lines ...Line) *Scene {
		return &Scene{
			Problem: Problem{Physics: Seepage},
			Regions: []Region{region(0, "soil", blk)},
			Edges:   []Edge{{Feature: 1, Name: "bed", Lines: lines, Cond: pot(3)}},
		}
	}
	l := mustLayout(t, newScene(Line{{X: 2}, {X: 4.5}, {X: 7}}))
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Cond == pot(3) }); !near(got, 5, tolExact) {
		t.Errorf("edge length %.15g, want 5", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == -1 && p.Cond == Insulated }); !near(got, 25, tolExact) {
		t.Errorf("insulated length %.15g, want 25", got)
	}
	if len(l.Owners) != 1 || l.Owners[0].Part != PartEdge || l.Owners[0].Index != 0 || l.Owners[0].Cond != pot(3) {
		t.Errorf("owners %+v", l.Owners)
	}
	if got := chains(l); got != 2 {
		t.Errorf("%d chains, want 2", got)
	}

	// Inside the domain: an error naming the edge.
	ge := geomError(t, layoutErr(newScene(Line{{X: 1, Y: 2.5}, {X: 9, Y: 2.5}})))
	if ge.Feature != 1 || ge.Name != "bed" || !strings.Contains(ge.Msg, "inside") {
		t.Errorf("edge inside the domain: %v", ge)
	}
	// Crossing into the domain from the boundary: also an error.
	ge = geomError(t, layoutErr(newScene(Line{{X: 0, Y: 5}, {X: 5, Y: 5}, {X: 5, Y: 4}})))
	if ge.Feature != 1 {
		t.Errorf("edge half inside: %v", ge)
	}
	// Nowhere on the boundary.
	ge = geomError(t, layoutErr(newScene(Line{{X: 20}, {X: 30}})))
	if ge.Feature != 1 || !strings.Contains(ge.Msg, "no boundary") {
		t.Errorf("edge off the domain: %v", ge)
	}

	// Partly on the boundary, partly under a body, partly outside the
	// region: only the 6..8 stretch remains.
	sc := newScene(Line{{X: 6}, {X: 11}})
	sc.Bodies = []Body{body(2, "block", Insulated, Polygon{rect(8, -1, 12, 1)})}
	l = mustLayout(t, sc)
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 1 }); !near(got, 2, tolExact) {
		t.Errorf("edge under a body: edge length %.15g, want 2", got)
	}
	if got := boundaryArea(l); !near(got, 50-2, tolExact) {
		t.Errorf("edge under a body: area %.15g, want 48", got)
	}

	// An edge along part of a body's face overrides the body there.
	sc = newScene(Line{{X: 4.5, Y: 3}, {X: 6, Y: 3}})
	sc.Bodies = []Body{body(2, "drain", Insulated, Polygon{rect(4, 2, 6, 3)})}
	l = mustLayout(t, sc)
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 1 && p.Cond == pot(3) }); !near(got, 1.5, tolExact) {
		t.Errorf("edge on a body: edge length %.15g, want 1.5", got)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 && p.Cond == Insulated }); !near(got, 6-1.5, tolExact) {
		t.Errorf("edge on a body: body length %.15g, want 4.5", got)
	}

	// Two edges over the same stretch.
	sc = newScene(Line{{X: 2}, {X: 7}})
	sc.Edges = append(sc.Edges, Edge{Feature: 2, Name: "toe", Lines: []Line{{{X: 6}, {X: 8}}}, Cond: pot(1)})
	ge = geomError(t, layoutErr(sc))
	if ge.Feature != 1 || !strings.Contains(ge.Msg, `"toe"`) {
		t.Errorf("overlapping edges: %v", ge)
	}
}

// layoutErr returns only Layout's error.
func layoutErr(s *Scene) error {
	_, err := s.Layout()
	return err
}

func TestLayoutShortCircuit(t *testing.T) {
	open := Problem{Physics: Electrostatic, Open: true, Background: Material{Kx: Eps0, Ky: Eps0}}
	two := func(c0, c1 Condition, r1 Ring) *Scene {
		return &Scene{Problem: open, Bodies: []Body{
			body(0, "anode", c0, Polygon{rect(0, 0, 1, 1)}),
			body(1, "cathode", c1, Polygon{r1}),
		}}
	}
	floating := Condition{Kind: Floating}
	for _, tc := range []struct {
		name   string
		sc     *Scene
		substr string
	}{
		{"side", two(pot(1), pot(0), rect(1, 0.2, 2, 0.5)), "short circuit"},
		{"corner", two(pot(1), pot(0), rect(1, 1, 2, 2)), "short circuit"},
		{"overlap", two(pot(1), pot(0), rect(0.5, 0.5, 2, 2)), "short circuit"},
		{"inside", two(pot(1), pot(0), rect(0.25, 0.25, 0.75, 0.75)), "short circuit"},
		{"floating on fixed", two(floating, pot(0), rect(1, 0.2, 2, 0.5)), "floating"},
		{"fixed on floating", two(pot(2), floating, rect(1, 0.2, 2, 0.5)), "floating"},
		{"two floating", two(floating, floating, rect(1, 1, 2, 2)), "floating"},
	} {
		ge := geomError(t, layoutErr(tc.sc))
		if ge.Feature != 0 || !strings.Contains(ge.Msg, `"cathode"`) || !strings.Contains(ge.Msg, tc.substr) {
			t.Errorf("%s: %v", tc.name, ge)
		}
	}
	// Same potential, or an insulated body: allowed. Touching bodies lose
	// their common wall: the outline of the union is left.
	for _, c1 := range []Condition{pot(1), Insulated} {
		sc := two(pot(1), c1, rect(1, 0.2, 2, 0.5))
		l := mustLayout(t, sc)
		if got := lengthWhere(l, func(Piece) bool { return true }); !near(got, 4+2.6-0.6, tolExact) {
			t.Errorf("%v: outline %.15g, want 6", c1, got)
		}
		if got := boundaryArea(l); !near(got, -1.3, tolExact) {
			t.Errorf("%v: area %.15g, want -1.3", c1, got)
		}
	}
}

// A conductor that an edge at another potential runs along, crosses or
// touches at one vertex is a short circuit: the inflow through the point
// where two fixed potentials meet grows like the logarithm of the panel
// size and has no limit (a jump of potential along a boundary; common
// practice). One error names both features and the point. A conductor at
// the edge's own potential, or an edge over an insulated body, is fine.
func TestLayoutEdgeShortCircuit(t *testing.T) {
	floating := Condition{Kind: Floating}
	newScene := func(bc, ec Condition, b Ring, e Line) *Scene {
		return &Scene{
			Problem: Problem{Physics: Electrostatic, Unit: "mm", Scale: 1e-3},
			Regions: []Region{region(0, "air", Polygon{rect(0, 0, 10, 5)})},
			Bodies:  []Body{body(1, "strip", bc, Polygon{b})},
			Edges:   []Edge{{Feature: 2, Name: "case", Lines: []Line{e}, Cond: ec}},
		}
	}
	bottom := Line{{X: 0, Y: 0}, {X: 10, Y: 0}}
	for _, tc := range []struct {
		name   string
		sc     *Scene
		substr string
	}{
		{"along a side", newScene(pot(100), pot(0), rect(3, 0, 6, 1), bottom), "short circuit"},
		{"through it", newScene(pot(100), pot(0), rect(3, -1, 6, 1), bottom), "short circuit"},
		{"at one vertex", newScene(pot(100), pot(0), Ring{{X: 4, Y: 0}, {X: 6, Y: 1}, {X: 3, Y: 1}}, bottom), "short circuit"},
		{"edge ends on it", newScene(pot(100), pot(0), rect(3, 2, 6, 3), Line{{X: 0, Y: 5}, {X: 0, Y: 2.5}, {X: 3, Y: 2.5}}), "short circuit"},
		{"floating body", newScene(floating, pot(0), rect(3, 0, 6, 1), bottom), "floating"},
		{"floating edge", newScene(pot(1), floating, rect(3, 0, 6, 1), bottom), "floating"},
	} {
		err := layoutErr(tc.sc)
		if err == nil {
			t.Errorf("%s: accepted", tc.name)
			continue
		}
		ge := geomError(t, err)
		if ge.Feature != 1 || ge.Name != "strip" || !strings.Contains(ge.Msg, `edge 2 ("case")`) || !strings.Contains(ge.Msg, tc.substr) || !strings.Contains(ge.Msg, "mm") {
			t.Errorf("%s: %v", tc.name, ge)
		}
	}
	for _, tc := range []struct {
		name string
		sc   *Scene
	}{
		{"same potential", newScene(pot(0), pot(0), rect(3, 0, 6, 1), bottom)},
		{"insulated body", newScene(Insulated, pot(0), rect(3, 0, 6, 1), bottom)},
		{"apart", newScene(pot(100), pot(0), rect(3, 1, 6, 2), bottom)},
	} {
		if err := layoutErr(tc.sc); err != nil {
			t.Errorf("%s: %v", tc.name, err)
		}
	}
}

// A region's hole that nothing fills is outside a closed scene's domain: a
// warning says so and how to fill it; a hole filled by a region or a body,
// or any hole in an open scene (the background fills it), gives none.
func TestLayoutEmptyHoleWarning(t *testing.T) {
	newScene := func(open bool) *Scene {
		return &Scene{
			Problem: Problem{Physics: Seepage, Open: open, Background: Material{Kx: 1, Ky: 1}},
			Regions: []Region{region(0, "sand", Polygon{rect(0, 0, 10, 5), reversed(rect(4, 1, 6, 3))})},
		}
	}
	l := mustLayout(t, newScene(false))
	if len(l.Warnings) != 1 || !strings.Contains(l.Warnings[0], `region 0 ("sand") has a hole`) || !strings.Contains(l.Warnings[0], "zero-flux") {
		t.Errorf("empty hole: warnings %q", l.Warnings)
	}
	if l := mustLayout(t, newScene(true)); len(l.Warnings) != 0 {
		t.Errorf("open scene: warnings %q", l.Warnings)
	}
	sc := newScene(false)
	sc.Regions = append(sc.Regions, region(1, "clay", Polygon{rect(4, 1, 6, 3)}))
	if l := mustLayout(t, sc); len(l.Warnings) != 0 {
		t.Errorf("hole filled by a region: warnings %q", l.Warnings)
	}
	sc = newScene(false)
	sc.Bodies = []Body{body(1, "culvert", Insulated, Polygon{rect(3.5, 0.5, 6.5, 3.5)})}
	if l := mustLayout(t, sc); len(l.Warnings) != 0 {
		t.Errorf("hole under a body: warnings %q", l.Warnings)
	}
}

func TestLayoutOverlappingRegions(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Seepage},
		Regions: []Region{
			region(0, "sand", Polygon{rect(0, 0, 4, 2)}),
			region(3, "clay", Polygon{rect(3, 1, 8, 3)}),
		},
	}
	ge := geomError(t, layoutErr(sc))
	if ge.Feature != 0 || ge.Name != "sand" || !strings.Contains(ge.Msg, `region 3 ("clay")`) || !strings.Contains(ge.Msg, "overlap") {
		t.Errorf("overlap: %v", ge)
	}
	// A region drawn inside another without a hole for it.
	sc.Regions[1] = region(3, "clay", Polygon{rect(1, 0.5, 2, 1.5)})
	ge = geomError(t, layoutErr(sc))
	if ge.Feature != 0 || !strings.Contains(ge.Msg, "clay") {
		t.Errorf("nested: %v", ge)
	}
	// With the hole cut it is an inclusion: interface all round.
	sc.Regions[0].Polygons[0] = append(sc.Regions[0].Polygons[0], reversed(rect(1, 0.5, 2, 1.5)))
	l := mustLayout(t, sc)
	if got := lengthWhere(l, Piece.Interface); !near(got, 4, tolExact) {
		t.Errorf("inclusion interface %.15g, want 4", got)
	}
}

func TestLayoutEmpty(t *testing.T) {
	for name, sc := range map[string]*Scene{
		"no region": {Problem: Problem{Physics: Laplace}, Bodies: []Body{body(0, "b", pot(1), Polygon{rect(0, 0, 1, 1)})}},
		"covered": {Problem: Problem{Physics: Laplace},
			Regions: []Region{region(0, "r", Polygon{rect(0, 0, 1, 1)})},
			Bodies:  []Body{body(1, "b", Insulated, Polygon{rect(-1, -1, 2, 2)})}},
		"nothing": {Problem: Problem{Physics: Laplace, Open: true}},
	} {
		ge := geomError(t, layoutErr(sc))
		if ge.Feature != -1 {
			t.Errorf("%s: %v", name, ge)
		}
	}
	// A conductor outside every region of a closed scene.
	sc := &Scene{Problem: Problem{Physics: Laplace},
		Regions: []Region{region(0, "r", Polygon{rect(0, 0, 1, 1)})},
		Bodies:  []Body{body(1, "stray", pot(1), Polygon{rect(3, 3, 4, 4)})}}
	if ge := geomError(t, layoutErr(sc)); ge.Feature != 1 {
		t.Errorf("stray conductor: %v", ge)
	}
}

func TestLayoutGround(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Electrostatic, Open: true, Ground: &Ground{Y: 0}},
		Bodies:  []Body{body(4, "trace", pot(1), Polygon{rect(0, -0.5, 1, 1)})},
	}
	if ge := geomError(t, layoutErr(sc)); ge.Feature != 4 || !strings.Contains(ge.Msg, "ground") {
		t.Errorf("below ground: %v", ge)
	}
	// Resting on the grounded plane: only at potential 0.
	sc.Bodies[0].Polygons[0][0] = rect(0, 0, 1, 1)
	if ge := geomError(t, layoutErr(sc)); ge.Feature != 4 || !strings.Contains(ge.Msg, "short circuit") {
		t.Errorf("on the ground at 1 V: %v", ge)
	}
	sc.Bodies[0].Cond = Condition{Kind: Floating}
	if ge := geomError(t, layoutErr(sc)); ge.Feature != 4 || !strings.Contains(ge.Msg, "floating") {
		t.Errorf("floating on the ground: %v", ge)
	}
	sc.Bodies[0].Cond = pot(0)
	mustLayout(t, sc)
	sc.Bodies[0].Cond = pot(1)
	sc.Bodies[0].Polygons[0][0] = rect(0, 0.5, 1, 1)
	l := mustLayout(t, sc)
	if l.Ground == nil || l.Ground.Y != 0 {
		t.Errorf("ground %+v", l.Ground)
	}
}

// Random rectangles with integer corners (many shared lines, vertices and
// collinear overlaps), with extra vertices along their sides, rotated by a
// random angle, and every other case with each vertex moved at random by up
// to a third of the coincidence tolerance, against an exact count on the
// grid of all corner coordinates: the domain's area and the length of its
// boundary.
func TestLayoutRandomRects(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 3))
	// sides is the rectangle with a vertex added at random points of its
	// sides.
	sides := func(x0, y0, x1, y1 float64) Ring {
		var r Ring
		for _, c := range rect(x0, y0, x1, y1) {
			if len(r) > 0 {
				p := r[len(r)-1]
				for range rng.IntN(3) {
					f := float64(1+rng.IntN(7)) / 8
					r = append(r, r2.Vec{X: p.X + f*(c.X-p.X), Y: p.Y + f*(c.Y-p.Y)})
				}
			}
			r = append(r, c)
		}
		return r
	}
	for k := 0; k < 60; k++ {
		sc := &Scene{Problem: Problem{Physics: Laplace}, Regions: []Region{region(0, "r", Polygon{rect(0, 0, 12, 12)})}}
		xs, ys := []float64{0, 12}, []float64{0, 12}
		var boxes [][4]float64
		for b := 0; b < 2+rng.IntN(7); b++ {
			x0, y0 := float64(rng.IntN(14)-1), float64(rng.IntN(14)-1)
			x1, y1 := x0+float64(1+rng.IntN(5)), y0+float64(1+rng.IntN(5))
			boxes = append(boxes, [4]float64{x0, y0, x1, y1})
			xs, ys = append(xs, x0, x1), append(ys, y0, y1)
			sc.Bodies = append(sc.Bodies, body(b+1, "", Insulated, Polygon{sides(x0, y0, x1, y1)}))
		}
		slices.Sort(xs)
		slices.Sort(ys)
		xs, ys = slices.Compact(xs), slices.Compact(ys)
		in := func(i, j int) bool { // cell (i,j) of the grid is domain
			if i < 0 || j < 0 || i >= len(xs)-1 || j >= len(ys)-1 {
				return false
			}
			cx, cy := (xs[i]+xs[i+1])/2, (ys[j]+ys[j+1])/2
			if cx < 0 || cx > 12 || cy < 0 || cy > 12 {
				return false
			}
			for _, b := range boxes {
				if cx > b[0] && cx < b[2] && cy > b[1] && cy < b[3] {
					return false
				}
			}
			return true
		}
		area, perim := 0.0, 0.0
		for i := -1; i < len(xs); i++ {
			for j := -1; j < len(ys); j++ {
				if in(i, j) {
					area += (xs[i+1] - xs[i]) * (ys[j+1] - ys[j])
				}
				if i >= 0 && i < len(xs)-1 && in(i, j) != in(i, j+1) {
					perim += xs[i+1] - xs[i] // face y = ys[j+1]
				}
				if j >= 0 && j < len(ys)-1 && in(i, j) != in(i+1, j) {
					perim += ys[j+1] - ys[j] // face x = xs[i+1]
				}
			}
		}
		theta := 2 * math.Pi * rng.Float64()
		transform(sc, 1, theta, r2.Vec{X: 3, Y: -7})
		// The diagonal is at least 12*sqrt(2): the jitter stays below a
		// third of the tolerance. Lengths then move by up to 2*jitter per
		// piece, areas by jitter times the perimeter: 1e-7 relative covers
		// a hundred pieces.
		tol := tolExact
		if k%2 == 1 {
			tol = 1e-7
			j := CoincidenceTol * 12 * math.Sqrt2 / 3
			for _, b := range sc.Bodies {
				for _, r := range b.Polygons[0] {
					for i := range r {
						r[i].X += j * (2*rng.Float64() - 1) / math.Sqrt2
						r[i].Y += j * (2*rng.Float64() - 1) / math.Sqrt2
					}
				}
			}
		}
		l, err := sc.Layout()
		if area == 0 {
			if ge := geomError(t, err); ge.Feature != -1 {
				t.Errorf("case %d: %v", k, ge)
			}
			continue
		}
		if err != nil {
			t.Fatalf("case %d: %v", k, err)
		}
		checkSides(t, sc, l)
		checkCycles(t, l)
		if got := boundaryArea(l); !near(got, area, tol) {
			t.Errorf("case %d: area %.15g, want %g", k, got, area)
		}
		if got := lengthWhere(l, func(Piece) bool { return true }); !near(got, perim, tol) {
			t.Errorf("case %d: boundary %.15g, want %g", k, got, perim)
		}
	}
}

// circleScene is a square region with an n-gon body inscribed in the
// circle of radius 1 around the origin.
func circleScene(n int) *Scene {
	r := make(Ring, n)
	for i := range r {
		a := 2 * math.Pi * float64(i) / float64(n)
		r[i] = r2.Vec{X: math.Cos(a), Y: math.Sin(a)}
	}
	return &Scene{
		Problem: Problem{Physics: Electrostatic},
		Regions: []Region{region(0, "box", Polygon{rect(-3, -3, 3, 3)})},
		Bodies:  []Body{body(1, "core", pot(1), Polygon{r})},
		Edges:   []Edge{{Feature: 2, Name: "shield", Lines: []Line{{{X: -3, Y: -3}, {X: 3, Y: -3}, {X: 3, Y: 3}, {X: -3, Y: 3}, {X: -3, Y: -3}}}, Cond: pot(0)}},
	}
}

func TestLayoutCircle(t *testing.T) {
	const n = 1000
	l := mustLayout(t, circleScene(n))
	// Regular n-gon in the unit circle: perimeter 2n sin(pi/n), area
	// (n/2) sin(2pi/n).
	if got, want := lengthWhere(l, func(p Piece) bool { return p.Owner == 0 }), 2*n*math.Sin(math.Pi/n); !near(got, want, tolExact) {
		t.Errorf("n-gon perimeter %.15g, want %.15g", got, want)
	}
	if got, want := boundaryArea(l), 36-n/2*math.Sin(2*math.Pi/n); !near(got, want, tolExact) {
		t.Errorf("area %.15g, want %.15g", got, want)
	}
	if got := lengthWhere(l, func(p Piece) bool { return p.Owner == 1 }); !near(got, 24, tolExact) {
		t.Errorf("shield %.15g, want 24", got)
	}
	if got := chains(l); got != 2 {
		t.Errorf("%d chains, want 2", got)
	}
}

// layersScene is two regions sharing the straight line y = 0 over 100 m,
// each with n vertices on it, staggered so that no vertex is shared.
func layersScene(n int) *Scene {
	lower := Ring{{X: 100, Y: -20}}
	upper := Ring{{X: 0, Y: 20}}
	for i := n; i >= 0; i-- {
		lower = append(lower, r2.Vec{X: 100 * float64(i) / float64(n)})
	}
	lower = append(lower, r2.Vec{X: 0, Y: -20})
	upper = append(upper, r2.Vec{})
	for i := 0; i < n; i++ {
		upper = append(upper, r2.Vec{X: 100 * (float64(i) + 0.5) / float64(n)})
	}
	upper = append(upper, r2.Vec{X: 100}, r2.Vec{X: 100, Y: 20})
	return &Scene{
		Problem: Problem{Physics: Seepage},
		Regions: []Region{region(0, "clay", Polygon{lower}), region(1, "sand", Polygon{upper})},
	}
}

func TestLayoutLayers(t *testing.T) {
	l := mustLayout(t, layersScene(50))
	if got := lengthWhere(l, Piece.Interface); !near(got, 100, tolExact) {
		t.Errorf("interface %.15g, want 100", got)
	}
	if got := regionArea(l, 0) + regionArea(l, 1); !near(got, 4000, tolExact) {
		t.Errorf("areas %.15g, want 4000", got)
	}
	checkCycles(t, l)
}

var layoutSink *Layout

// BenchmarkLayout times the arrangement of a circle of n vertices in a box
// (the box edged by a line) and of two layers sharing an edge with n
// staggered vertices on each side (collinear overlaps).
func BenchmarkLayout(b *testing.B) {
	for _, tc := range []struct {
		name  string
		scene func(int) *Scene
	}{{"circle", circleScene}, {"layers", layersScene}} {
		for _, n := range []int{1000, 5000, 20000} {
			b.Run(tc.name+"/vertices="+strconv.Itoa(n), func(b *testing.B) {
				sc := tc.scene(n)
				b.ReportAllocs()
				for b.Loop() {
					l, err := sc.Layout()
					if err != nil {
						b.Fatal(err)
					}
					layoutSink = l
				}
			})
		}
	}
}

// lineCover returns the sorted x-intervals where the polygon covers the
// horizontal line at height y (even-odd rule); y is never a vertex height.
func lineCover(pg Polygon, y float64) [][2]float64 {
	var xs []float64
	for _, r := range pg {
		for i := range r {
			a, b := r[i], r[(i+1)%len(r)]
			if (a.Y > y) != (b.Y > y) {
				xs = append(xs, a.X+(y-a.Y)*(b.X-a.X)/(b.Y-a.Y))
			}
		}
	}
	slices.Sort(xs)
	var out [][2]float64
	for i := 0; i+1 < len(xs); i += 2 {
		out = append(out, [2]float64{xs[i], xs[i+1]})
	}
	return out
}

// exactArea is an independent oracle for the shoelace sums: the area of the
// domain of a closed scene, or of the union of the bodies of an open one
// (cavities excluded). Across each band between consecutive heights of
// vertices and crossings the covered length varies linearly with y, so the
// midpoint rule is exact (Cavalieri's principle, common practice).
func exactArea(sc *Scene) float64 {
	var ys []float64
	var bodies, regions []Polygon
	for _, b := range sc.Bodies {
		bodies = append(bodies, b.Polygons...)
	}
	for _, r := range sc.Regions {
		regions = append(regions, r.Polygons...)
	}
	for _, pg := range append(slices.Clone(bodies), regions...) {
		for _, r := range pg {
			for _, p := range r {
				ys = append(ys, p.Y)
			}
		}
	}
	// Crossings of edges from different polygons are kinks too.
	var segs [][2]r2.Vec
	for _, pg := range append(slices.Clone(bodies), regions...) {
		for _, r := range pg {
			for i := range r {
				segs = append(segs, [2]r2.Vec{r[i], r[(i+1)%len(r)]})
			}
		}
	}
	for i, s := range segs {
		for _, q := range segs[i+1:] {
			d1, d2 := r2.Sub(s[1], s[0]), r2.Sub(q[1], q[0])
			den := d1.X*d2.Y - d1.Y*d2.X
			if den == 0 {
				continue
			}
			w := r2.Sub(q[0], s[0])
			u, v := (w.X*d2.Y-w.Y*d2.X)/den, (w.X*d1.Y-w.Y*d1.X)/den
			if u > 0 && u < 1 && v > 0 && v < 1 {
				ys = append(ys, s[0].Y+u*d1.Y)
			}
		}
	}
	slices.Sort(ys)
	ys = slices.Compact(ys)
	in := func(ivs [][2]float64, x float64) bool {
		for _, iv := range ivs {
			if x > iv[0] && x < iv[1] {
				return true
			}
		}
		return false
	}
	area := 0.0
	for k := 0; k+1 < len(ys); k++ {
		y := (ys[k] + ys[k+1]) / 2
		var bi, ri [][2]float64
		var xs []float64
		for _, pg := range bodies {
			for _, iv := range lineCover(pg, y) {
				bi = append(bi, iv)
				xs = append(xs, iv[0], iv[1])
			}
		}
		for _, pg := range regions {
			for _, iv := range lineCover(pg, y) {
				ri = append(ri, iv)
				xs = append(xs, iv[0], iv[1])
			}
		}
		slices.Sort(xs)
		length := 0.0
		for i := 0; i+1 < len(xs); i++ {
			x := (xs[i] + xs[i+1]) / 2
			inB := in(bi, x)
			if sc.Problem.Open && inB || !sc.Problem.Open && !inB && in(ri, x) {
				length += xs[i+1] - xs[i]
			}
		}
		area += (ys[k+1] - ys[k]) * length
	}
	return area
}

// checkCycles checks that, for every region, the pieces with that region on
// their left (interfaces with it on the right taken backwards) close up: as
// many leave each vertex as arrive.
func checkCycles(t *testing.T, l *Layout) {
	t.Helper()
	for r := range l.Regions {
		bal := map[r2.Vec]int{}
		for _, p := range l.Pieces {
			if p.Left == r {
				bal[p.A]++
				bal[p.B]--
			}
			if p.Right == r {
				bal[p.B]++
				bal[p.A]--
			}
		}
		for v, n := range bal {
			if n != 0 {
				t.Errorf("region %d: %d more pieces leave %v than arrive", r, n, v)
			}
		}
	}
}

// star is a random star-shaped counter-clockwise polygon around c: n >= 4
// vertices at stratified random angles, so that no angular gap reaches pi
// and the polygon is simple.
func star(rng *rand.Rand, c r2.Vec, rmin, rmax float64, n int) Ring {
	r := make(Ring, n)
	for i := range r {
		a := 2 * math.Pi * (float64(i) + 0.8*rng.Float64()) / float64(n)
		rad := rmin + (rmax-rmin)*rng.Float64()
		r[i] = r2.Vec{X: c.X + rad*math.Cos(a), Y: c.Y + rad*math.Sin(a)}
	}
	return r
}

// Random non-convex bodies over a random region, some sticking out, some
// overlapping each other: every piece has the right sides (independent
// point test), the pieces close up around every region, and the shoelace
// sum matches the exact area of the oracle.
func TestLayoutRandomStars(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for k := 0; k < 60; k++ {
		open := k%3 == 2
		sc := &Scene{Problem: Problem{Physics: Laplace, Open: open}}
		sc.Regions = []Region{region(0, "ground", Polygon{star(rng, r2.Vec{}, 6, 10, 8+rng.IntN(40))})}
		for b := 0; b < 1+rng.IntN(5); b++ {
			c := r2.Vec{X: 16 * (rng.Float64() - 0.5), Y: 16 * (rng.Float64() - 0.5)}
			sc.Bodies = append(sc.Bodies, body(b+1, "", Insulated, Polygon{star(rng, c, 0.5, 3, 4+rng.IntN(30))}))
		}
		want := exactArea(sc)
		l, err := sc.Layout()
		if err != nil {
			if ge := geomError(t, err); want != 0 || ge.Feature != -1 {
				t.Fatalf("case %d: %v", k, err)
			}
			continue
		}
		checkSides(t, sc, l)
		checkCycles(t, l)
		got := boundaryArea(l)
		if open {
			got = -got
		}
		if !near(got, want, tolExact) {
			t.Errorf("case %d (open %v): area %.15g, want %.15g", k, open, got, want)
		}
	}
}

func TestLayoutBadRings(t *testing.T) {
	blk := func(pg Polygon) *Scene {
		return &Scene{
			Problem: Problem{Physics: Laplace},
			Regions: []Region{region(0, "r", Polygon{rect(-5, -5, 5, 5)})},
			Bodies:  []Body{body(7, "b", Insulated, pg)},
		}
	}
	for name, pg := range map[string]Polygon{
		"bow tie":         {ring(0, 0, 1, 1, 1, 0, 0, 1)},
		"clockwise":       {reversed(rect(0, 0, 1, 1))},
		"hole sticks out": {rect(0, 0, 2, 2), reversed(rect(1, 1, 3, 3))},
		"two points":      {ring(0, 0, 1, 1)},
		"flat":            {ring(0, 0, 1, 1, 2, 2)},
		"folded":          {ring(0, 0, 2, 0, 1, 0)},
		"not a number":    {ring(0, 0, 1, 0, math.NaN(), 1)},
	} {
		if ge := geomError(t, layoutErr(blk(pg))); ge.Feature != 7 || ge.Member != "geometry" {
			t.Errorf("%s: %v", name, ge)
		}
	}
	// Touching itself at a vertex, or a hole touching its outer ring, is
	// fine.
	l := mustLayout(t, blk(Polygon{ring(0, 0, 1, 0, 1, 1, 2, 1, 2, 2, 1, 2, 1, 1, 0, 1)}))
	if got := boundaryArea(l); !near(got, 98, tolExact) {
		t.Errorf("figure eight: area %.15g, want 98", got)
	}
	l = mustLayout(t, blk(Polygon{rect(0, 0, 3, 3), reversed(rect(0, 1, 1, 2))}))
	if got := boundaryArea(l); !near(got, 92, tolExact) {
		t.Errorf("hole on the outer ring: area %.15g, want 92", got)
	}
}

// Every piece of a body or edge knows its arc length along the owner as
// drawn: an edge drawn from right to left along the bottom of a region
// (against the domain's orientation) starts at its first coordinate, and a
// body's arc runs from the first vertex of its ring counter-clockwise;
// walls have none.
func TestLayoutArcs(t *testing.T) {
	sc := &Scene{
		Problem: Problem{Physics: Laplace},
		Regions: []Region{region(0, "plate", Polygon{rect(0, 0, 10, 5)})},
		Edges:   []Edge{{Feature: 1, Name: "bottom", Lines: []Line{{{X: 8, Y: 0}, {X: 2, Y: 0}}}, Cond: pot(1)}},
		Bodies:  []Body{body(2, "hole", Insulated, Polygon{Ring{{X: 4, Y: 2}, {X: 6, Y: 2}, {X: 6, Y: 3}, {X: 4, Y: 3}}})},
	}
	l := mustLayout(t, sc)
	for _, p := range l.Pieces {
		switch {
		case p.Owner == 1: // the edge: s = 8 - x
			if !p.Drawn || !near(p.SA, 8-p.A.X, 1e-12) || !near(p.SB, 8-p.B.X, 1e-12) {
				t.Errorf("edge piece %+v: want s = 8 - x", p)
			}
		case p.Owner == 0: // the body's ring from (4, 2) counter-clockwise
			s := func(v r2.Vec) float64 {
				switch {
				case v.Y == 2:
					return v.X - 4
				case v.X == 6:
					return 2 + v.Y - 2
				case v.Y == 3:
					return 3 + 6 - v.X
				}
				return 5 + 3 - v.Y
			}
			mid := r2.Scale(0.5, r2.Add(p.A, p.B))
			if !p.Drawn || !near(0.5*(p.SA+p.SB), s(mid), 1e-12) || !near(math.Abs(p.SB-p.SA), r2.Norm(r2.Sub(p.B, p.A)), 1e-12) {
				t.Errorf("body piece %+v: want s(mid) = %g", p, s(mid))
			}
		default:
			if p.Drawn {
				t.Errorf("wall piece %+v has an arc", p)
			}
		}
	}
}
