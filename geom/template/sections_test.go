package template_test

import (
	"bytes"
	"errors"
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/geom/template"
	"gonum.org/v1/gonum/spatial/r2"
)

// readFlow reads a section template's scene and checks what every one
// shares: a flow scene in the unit asked for, read back without warnings.
func readFlow(t *testing.T, b interface{ Bytes() ([]byte, error) }, unit string) *geom.Scene {
	t.Helper()
	data, err := b.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	sc, err := geom.Read(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	if p := sc.Problem; p.Physics != geom.Flow || p.Unit != unit || p.Stream == nil || len(sc.Warnings) != 0 {
		t.Errorf("problem %+v, warnings %q", p, sc.Warnings)
	}
	if _, err := sc.Layout(); err != nil {
		t.Error(err)
	}
	return sc
}

// halfThickness returns half the vertical extent of the outline at x (in
// metres), interpolated between the vertices of each surface.
func halfThickness(ring geom.Ring, x float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := range ring {
		a, b := ring[i], ring[(i+1)%len(ring)]
		if (a.X-x)*(b.X-x) <= 0 && a.X != b.X {
			y := a.Y + (x-a.X)*(b.Y-a.Y)/(b.X-a.X)
			lo, hi = math.Min(lo, y), math.Max(hi, y)
		}
	}
	return lo, hi
}

// NACA 4-digit sections against the published equations: NACA 0012 is
// 12 % thick at 30 % of the chord, where y_t = 0.06002 c with the
// published (open) trailing edge (0.060007 c closed) (Abbott & von
// Doenhoff, Theory of Wing Sections, 1959, eq. 6.2 and Appendix I, 0012
// ordinates [from memory]); the open trailing edge is 0.252 % thick
// (2 y_t(1) = 10 t (0.2969 - 0.1260 - 0.3516 + 0.2843 - 0.1015) = 0.00252
// at t = 0.12), the closed one a single vertex; NACA 2412's camber line
// peaks at 2 % of the chord at 40 % (the mean of the two surfaces there is
// that to 1e-4 c: the thickness is laid perpendicular to the camber line,
// which is level at its peak). Cosine spacing puts 2 n (closed) or
// 2 n + 1 (open) vertices on the outline. Tolerances: 1e-5 c on the
// ordinates interpolated between vertices (2000 points per surface for
// the thickness, where the outline between vertices sags by 4e-8 c; it is
// 1.7e-5 c at 100 points).
func TestNACA4(t *testing.T) {
	const c = 150.0 // mm
	fl := template.Flow{Unit: "mm", Speed: 8, AngleDeg: 3}
	closed := readFlow(t, template.NACA4{Flow: fl, Code: "0012", Chord: c, ClosedTE: true, Points: 100}, "mm")
	b := closed.Bodies[0]
	if b.Kutta == nil || !b.Kutta.Auto || len(b.Polygons[0][0]) != 200 {
		t.Errorf("closed NACA 0012: Kutta %+v, %d vertices, want automatic and 200", b.Kutta, len(b.Polygons[0][0]))
	}
	if p := closed.Problem; p.Stream.Speed != 8 || p.Stream.AngleDeg != 3 || p.Ground != nil || p.Density != 1.225 {
		t.Errorf("problem %+v, stream %+v", p, p.Stream)
	}
	fine := readFlow(t, template.NACA4{Flow: fl, Code: "0012", Chord: c, Points: 2000}, "mm") // the published, open trailing edge
	lo, hi := halfThickness(fine.Bodies[0].Polygons[0][0], 0.3*c*1e-3)
	if th := (hi - lo) / 2 / (c * 1e-3); math.Abs(th-0.06002) > 1e-5 || math.Abs(hi+lo) > 1e-12 {
		t.Errorf("NACA 0012 half thickness at 30 %%: %.6f c (centre %g), want 0.06002", th, (hi+lo)/2)
	}
	open := readFlow(t, template.NACA4{Flow: fl, Code: "0012", Chord: c, Points: 100}, "mm")
	ob := open.Bodies[0]
	ring := ob.Polygons[0][0]
	if ob.Kutta == nil || !ob.Kutta.Auto || len(ring) != 201 {
		t.Fatalf("open NACA 0012: Kutta %+v, %d vertices, want automatic and 201", ob.Kutta, len(ring))
	}
	lo, hi = halfThickness(ring, c*1e-3*(1-1e-9))
	if th := (hi - lo) / (c * 1e-3); math.Abs(th-0.00252) > 1e-5 {
		t.Errorf("open trailing edge %.6f c thick, want 0.00252", th)
	}
	cambered := readFlow(t, template.NACA4{Flow: fl, Code: "2412", Chord: c, ClosedTE: true}, "mm")
	lo, hi = halfThickness(cambered.Bodies[0].Polygons[0][0], 0.4*c*1e-3)
	if yc := (hi + lo) / 2 / (c * 1e-3); math.Abs(yc-0.02) > 1e-4 {
		t.Errorf("NACA 2412 camber at 40 %%: %.6f c, want 0.02", yc)
	}
	for _, bad := range []struct {
		n     template.NACA4
		param string
	}{
		{template.NACA4{Code: "241", Chord: 1}, "Code"},
		{template.NACA4{Code: "2400", Chord: 1}, "Code"},
		{template.NACA4{Code: "2012", Chord: 1}, "Code"},
		{template.NACA4{Code: "0012", Chord: -1}, "Chord"},
		{template.NACA4{Code: "0012", Chord: 1, Points: 5}, "Points"},
		{template.NACA4{Flow: template.Flow{Speed: -3}, Code: "0012", Chord: 1}, "Speed"},
		{template.NACA4{Flow: template.Flow{AngleDeg: 120}, Code: "0012", Chord: 1}, "AngleDeg"},
		{template.NACA4{Flow: template.Flow{Unit: "yd"}, Code: "0012", Chord: 1}, "Unit"},
		{template.NACA4{Flow: template.Flow{GroundHeight: 0.01}, Code: "0012", Chord: 1, ClosedTE: true}, "GroundHeight"},
	} {
		_, err := bad.n.Bytes()
		var te *template.Error
		if !errors.As(err, &te) || te.Param != bad.param {
			t.Errorf("%+v: error %v, want one on %s", bad.n, err, bad.param)
		}
	}
}

// Joukowski and Karman-Trefftz sections: the chord (trailing edge to the
// farthest vertex) is the one asked for, the leading edge at the origin,
// the trailing edge a single vertex with the Kutta condition, and the
// outline the published map's (MappedOutline) scaled: for the circle of
// centre (-0.1, 0.1) the map's chord is 4.0336087 (Joukowski) and 3.9262732
// (10 degrees), the distances to the farthest point of the exact curve
// computed by the flow tests (the x-extents 4.0336042 and 3.9262671 of
// shared/REFERENCES.md are 1e-6 shorter). The Karman-Trefftz trailing
// edge's angle is tau within the polygon's last segments (0.15 degrees at
// 512 vertices).
func TestMappedSections(t *testing.T) {
	for _, c := range []struct {
		b        interface{ Bytes() ([]byte, error) }
		tau      float64
		mapChord float64
	}{
		{template.Joukowski{Flow: template.Flow{Unit: "cm"}, CentreX: -0.1, CentreY: 0.1, Chord: 20}, 0, 4.0336087},
		{template.KarmanTrefftz{Flow: template.Flow{Unit: "cm"}, CentreX: -0.1, CentreY: 0.1, TrailingEdgeAngle: 10, Chord: 20}, 10, 3.9262732},
	} {
		sc := readFlow(t, c.b, "cm")
		ring := sc.Bodies[0].Polygons[0][0]
		var te r2.Vec
		for _, v := range ring {
			if v.X > te.X {
				te = v
			}
		}
		far := 0.0
		for _, v := range ring {
			far = math.Max(far, r2.Norm(r2.Sub(v, te)))
		}
		if math.Abs(far-0.2) > 1e-12 || sc.Bodies[0].Kutta == nil || !sc.Bodies[0].Kutta.Auto {
			t.Errorf("tau=%g: chord %v m, Kutta %+v", c.tau, far, sc.Bodies[0].Kutta)
		}
		m := template.MappedOutline(c.tau, complex(-0.1, 0.1), 4096)
		mf := 0.0
		for _, v := range m {
			mf = math.Max(mf, r2.Norm(r2.Sub(v, m[0])))
		}
		if math.Abs(mf-c.mapChord) > 1e-6 {
			t.Errorf("tau=%g: map chord %.7f, want %.7f", c.tau, mf, c.mapChord)
		}
		// The trailing-edge angle between the outline's last segments.
		n := len(ring)
		i := 0
		for k, v := range ring {
			if v == te {
				i = k
			}
		}
		d1, d2 := r2.Sub(ring[(i+n-1)%n], te), r2.Sub(ring[(i+1)%n], te)
		angle := math.Acos(r2.Dot(d1, d2)/(r2.Norm(d1)*r2.Norm(d2))) * 180 / math.Pi
		if math.Abs(angle-c.tau) > 0.2 {
			t.Errorf("tau=%g: trailing-edge angle %.3f degrees", c.tau, angle)
		}
	}
	if _, err := (template.KarmanTrefftz{CentreX: -0.1, Chord: 1}).Bytes(); err == nil {
		t.Errorf("Karman-Trefftz without a trailing-edge angle: no error")
	}
	if _, err := (template.Joukowski{CentreX: 0.1, Chord: 1}).Bytes(); err == nil {
		t.Errorf("Joukowski circle not enclosing -1: no error")
	}
}

// Circle and ellipse: the vertices lie on the curve, a vertex at each end
// of the axes, no Kutta condition unless asked for, and then at the
// downstream end of the x axis.
func TestRoundBodies(t *testing.T) {
	sc := readFlow(t, template.Ellipse{Flow: template.Flow{Unit: "m"}, SemiX: 2, SemiY: 0.5, Points: 64, Kutta: true}, "m")
	ring := sc.Bodies[0].Polygons[0][0]
	if len(ring) != 64 {
		t.Fatalf("%d vertices", len(ring))
	}
	for _, v := range ring {
		if d := v.X*v.X/4 + v.Y*v.Y/0.25 - 1; math.Abs(d) > 1e-10 { // 12 digits written
			t.Errorf("vertex %v off the ellipse by %g", v, d)
		}
	}
	if k := sc.Bodies[0].Kutta; k == nil || k.Auto || k.Point != (r2.Vec{X: 2}) {
		t.Errorf("Kutta %+v, want the point (2, 0)", k)
	}
	c := readFlow(t, template.Circle{Flow: template.Flow{Unit: "mm", Density: 998}, Radius: 10}, "mm")
	if c.Bodies[0].Kutta != nil || c.Problem.Density != 998 || len(c.Bodies[0].Polygons[0][0]) != template.DefaultSides {
		t.Errorf("circle: Kutta %+v, density %v", c.Bodies[0].Kutta, c.Problem.Density)
	}
}

// The two-element section: the flap's nose where asked for (Overlap ahead
// of and Gap below the main trailing edge), its chord line turned
// trailing edge down by the deflection; over a ground plane the pair is
// pitched about the main element's quarter chord and the stream runs along
// the plane; a flap cutting into the main element is refused.
func TestTwoElement(t *testing.T) {
	const c, cf = 1.0, 0.3
	tw := template.TwoElement{Flow: template.Flow{Unit: "m", AngleDeg: 4}, Main: "4412", Flap: "0012", Chord: c, FlapChord: cf, Gap: 0.02, Overlap: 0.01, Deflection: 25}
	sc := readFlow(t, tw, "m")
	if len(sc.Bodies) != 2 || sc.Bodies[0].Name != "main" || sc.Bodies[1].Name != "flap" {
		t.Fatalf("bodies %+v", sc.Bodies)
	}
	flap := sc.Bodies[1].Polygons[0][0]
	nose := r2.Vec{X: c - 0.01, Y: -0.02}
	tail := nose
	found := false
	for _, v := range flap {
		if r2.Norm(r2.Sub(v, nose)) < 1e-12 {
			found = true
		}
		if r2.Norm(r2.Sub(v, nose)) > r2.Norm(r2.Sub(tail, nose)) {
			tail = v
		}
	}
	d := r2.Sub(tail, nose)
	if !found || math.Abs(r2.Norm(d)-cf) > 1e-12 || math.Abs(math.Atan2(-d.Y, d.X)*180/math.Pi-25) > 1e-9 {
		t.Errorf("flap nose found %v, chord %v, deflection %v degrees", found, r2.Norm(d), math.Atan2(-d.Y, d.X)*180/math.Pi)
	}
	for _, k := range []*geom.Kutta{sc.Bodies[0].Kutta, sc.Bodies[1].Kutta} {
		if k == nil || !k.Auto {
			t.Errorf("Kutta %+v, want automatic", k)
		}
	}
	tw.GroundHeight = 0.5
	g := readFlow(t, tw, "m")
	if g.Problem.Ground == nil || g.Problem.Stream.AngleDeg != 0 {
		t.Fatalf("over the ground: problem %+v", g.Problem)
	}
	// The main element's quarter chord stays where it was, the ground
	// 0.5 below it; the trailing edge drops by (3/4) c sin(4 degrees).
	main := g.Bodies[0].Polygons[0][0]
	var te r2.Vec
	for _, v := range main {
		if v.X > te.X {
			te = v
		}
	}
	if math.Abs(g.Problem.Ground.Y+0.5) > 1e-12 || math.Abs(te.Y+0.75*c*math.Sin(4*math.Pi/180)) > 1e-9 {
		t.Errorf("ground at %v, main trailing edge at %v", g.Problem.Ground.Y, te)
	}
	tw.GroundHeight = 0
	tw.Overlap, tw.Gap = 0.2, 0.005
	if _, err := tw.Bytes(); err == nil {
		t.Errorf("flap cutting into the main element: no error")
	}
}
