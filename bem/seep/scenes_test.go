package seep

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/spatial/r2"
)

// Test scenes are built as geom.Scene values (outer rings
// counter-clockwise, as geom.Read leaves them) and go through the real
// arrangement, mesher and solver, with default options unless said.

// rect returns the corners of an axis-aligned rectangle, counter-clockwise.
func rect(x0, y0, x1, y1 float64) geom.Ring {
	return geom.Ring{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
}

func head(h float64) geom.Condition { return geom.Condition{Kind: geom.Potential, Value: h} }

func line(pts ...float64) geom.Line {
	l := make(geom.Line, len(pts)/2)
	for i := range l {
		l[i] = r2.Vec{X: pts[2*i], Y: pts[2*i+1]}
	}
	return l
}

// section collects the features of a test scene.
type section struct{ sc geom.Scene }

func newTestSection() *section {
	return &section{sc: geom.Scene{Problem: geom.Problem{
		Physics: geom.Seepage, Unit: "m", Scale: 1, UnitWeightWater: 9.81, CriticalGradient: 1,
	}}}
}

func (s *section) feature() int { return len(s.sc.Bodies) + len(s.sc.Regions) + len(s.sc.Edges) }

// soil adds a region of conductivity kx, ky (m/s).
func (s *section) soil(name string, kx, ky float64, rings ...geom.Ring) *section {
	s.sc.Regions = append(s.sc.Regions, geom.Region{Feature: s.feature(), Name: name,
		Polygons: []geom.Polygon{rings}, Material: geom.Material{Kx: kx, Ky: ky}})
	return s
}

// body adds an impervious structure.
func (s *section) body(name string, rings ...geom.Ring) *section {
	s.sc.Bodies = append(s.sc.Bodies, geom.Body{Feature: s.feature(), Name: name,
		Polygons: []geom.Polygon{rings}, Cond: geom.Insulated})
	return s
}

// bed adds an edge at a fixed head.
func (s *section) bed(name string, h float64, l geom.Line) *section {
	s.sc.Edges = append(s.sc.Edges, geom.Edge{Feature: s.feature(), Name: name, Lines: []geom.Line{l}, Cond: head(h)})
	return s
}

// solved is a meshed, solved and analysed test scene.
type solved struct {
	sc  *geom.Scene
	sys *bem.System
	sol *bem.Solution
	rep *Report
	mo  mesh.Options
}

func (s *section) solve(t testing.TB, o mesh.Options) *solved {
	t.Helper()
	return solveScene(t, &s.sc, o)
}

func solveScene(t testing.TB, sc *geom.Scene, o mesh.Options) *solved {
	t.Helper()
	lay, err := sc.Layout()
	if err != nil {
		t.Fatal(err)
	}
	m, err := mesh.Build(lay, o)
	if err != nil {
		t.Fatal(err)
	}
	sys, err := bem.Assemble(m, nil)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := sys.Solve(nil)
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Analyse(sc, sys, sol, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return &solved{sc: sc, sys: sys, sol: sol, rep: rep, mo: o}
}

func (s *solved) exit(t testing.TB, name string) *Exit {
	t.Helper()
	for i := range s.rep.Exits {
		if s.rep.Exits[i].Boundary == name {
			return &s.rep.Exits[i]
		}
	}
	t.Fatalf("no exit %q in %+v", name, s.rep.Exits)
	return nil
}

func (s *solved) structure(t testing.TB, name string) *Structure {
	t.Helper()
	for i := range s.rep.Structures {
		if s.rep.Structures[i].Name == name {
			return &s.rep.Structures[i]
		}
	}
	t.Fatalf("no structure %q", name)
	return nil
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// pileLayer is a sheet pile of width w (m) driven d into a layer of depth
// T, the section 2 W wide, head H upstream and 0 downstream; k = 1e-5 m/s.
func pileLayer(W, T, d, w, H float64) *section {
	return newTestSection().
		soil("sand", 1e-5, 1e-5, rect(-W, -T, W, 0)).
		body("pile", rect(-w/2, -d, w/2, 1)).
		bed("upstream bed", H, line(-W, 0, -w/2, 0)).
		bed("downstream bed", 0, line(w/2, 0, W, 0))
}

// halfPile is the downstream half of a sheet pile of zero thickness in a
// layer of depth T: by antisymmetry the head is H/2 on the pile's line
// below its tip. The pile is a body drawn beside the section, so that its
// face is the soil's left wall from the bed to the tip. Its discharge is
// that of the whole section; k = 1e-5 m/s unless kx, ky say otherwise.
func halfPile(W, T, d, H, kx, ky float64) *section {
	return newTestSection().
		soil("sand", kx, ky, rect(0, -T, W, 0)).
		body("pile", rect(-1, -d, 0, 1)).
		bed("below the tip", H/2, line(0, -d, 0, -T)).
		bed("downstream bed", 0, line(0, 0, W, 0))
}

// Sheet pile of zero thickness, depth d, in a layer of depth T (head H):
// q/(kH) = K(k)/(2 K(k')) with modulus k = cos(pi d/2T), k' = sin(pi d/2T),
// and the exit gradient at the pile pi H/(4 T k' K(k')), K the complete
// elliptic integral of the first kind (here of parameter m = modulus^2).
// The exit gradient along the bed at a distance x from the pile is
// pi H / (4 T K(k')) / sqrt(sinh^2(pi x / 2T) + k'^2). Source:
// Polubarinova-Kochina, Theory of Ground Water Movement, 1962; Harr,
// Groundwater and Seepage, 1962 (both from memory); verified in
// shared/REFERENCES.md (d/T = 0.25: 0.734609, 1.256343; 0.5: 0.5,
// 0.599070; 0.75: 0.340317, 0.354198).
func pileRef(dT float64) (qkH, iTH float64) {
	k := math.Cos(math.Pi * dT / 2)
	kp := math.Sin(math.Pi * dT / 2)
	return mathext.CompleteK(k*k) / (2 * mathext.CompleteK(kp*kp)), math.Pi / (4 * kp * mathext.CompleteK(kp*kp))
}

// Flat floor of width b on a layer of depth T: q/(kH) = K(m)/K(1-m) with
// parameter m = exp(-pi b/T) (conformal mapping; verified in
// shared/REFERENCES.md: b/T = 0.5: 0.742797; 1: 0.533180; 2: 0.346952; 4:
// 0.204811).
func floorRef(bT float64) float64 {
	m := math.Exp(-math.Pi * bT)
	return mathext.CompleteK(m) / mathext.CompleteK(1-m)
}
