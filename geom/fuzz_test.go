package geom

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// FuzzRead feeds arbitrary bytes to Read: the answer is an *Error or a
// scene that keeps every promise of Read, never a panic.
func FuzzRead(f *testing.F) {
	for _, dir := range []string{readTestGood, readTestBad} {
		files, err := filepath.Glob(filepath.Join(dir, "*.geojson"))
		if err != nil || len(files) == 0 {
			f.Fatalf("no seeds in %s", dir)
		}
		for _, name := range files {
			data, err := os.ReadFile(name)
			if err != nil {
				f.Fatal(err)
			}
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		sc, err := Read(bytes.NewReader(data))
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v is %T, want *Error", err, err)
			}
			if !strings.HasPrefix(err.Error(), "geom: ") || e.Msg == "" || e.Feature < -1 {
				t.Fatalf("malformed error %#v", e)
			}
			return
		}
		readFuzzCheck(t, sc)
		var buf bytes.Buffer
		if err := Write(&buf, sc); err != nil {
			t.Fatalf("Write of a scene Read accepted: %v", err)
		}
	})
}

// readFuzzCheck checks the promises Read makes about a scene it returns.
func readFuzzCheck(t *testing.T, sc *Scene) {
	t.Helper()
	p := sc.Problem
	if p.Physics < Laplace || p.Physics > Flow {
		t.Fatalf("physics %v", p.Physics)
	}
	if p.Scale != readUnits[p.Unit] || p.Scale == 0 {
		t.Fatalf("unit %q scale %v", p.Unit, p.Scale)
	}
	positive := func(what string, x float64) {
		if !(x > 0) || math.IsInf(x, 0) {
			t.Fatalf("%s = %v, want positive and finite", what, x)
		}
	}
	positive("background kx", p.Background.Kx)
	positive("background ky", p.Background.Ky)
	if len(sc.Bodies)+len(sc.Regions)+len(sc.Edges) == 0 {
		t.Fatal("empty scene accepted")
	}
	if !p.Open && len(sc.Regions) == 0 {
		t.Fatal("closed scene without region accepted")
	}
	point := func(x, y float64) {
		if math.IsNaN(x) || math.IsNaN(y) || math.Abs(x) > readMaxCoord || math.Abs(y) > readMaxCoord {
			t.Fatalf("coordinate (%v, %v) out of range", x, y)
		}
	}
	polys := func(what string, ps []Polygon) {
		if len(ps) == 0 {
			t.Fatalf("%s has no polygon", what)
		}
		for _, poly := range ps {
			for ri, ring := range poly {
				if len(ring) < 3 {
					t.Fatalf("%s ring with %d vertices", what, len(ring))
				}
				for _, v := range ring {
					point(v.X, v.Y)
				}
				if a := readTestArea(ring); (ri == 0) != (a > 0) {
					t.Fatalf("%s ring %d has area %v: wrong orientation", what, ri, a)
				}
			}
		}
	}
	names := make(map[string]bool)
	owner := func(name string, c Condition) {
		if name == "" || names[name] {
			t.Fatalf("name %q empty or repeated", name)
		}
		names[name] = true
		if c.Kind < Potential || c.Kind > Floating || math.IsNaN(c.Value) || math.IsNaN(c.NetInflow) {
			t.Fatalf("%s: condition %+v", name, c)
		}
	}
	for _, b := range sc.Bodies {
		polys(b.Name, b.Polygons)
		owner(b.Name, b.Cond)
		if p.Physics == Flow && b.Cond != Insulated {
			t.Fatalf("flow body %s with condition %+v", b.Name, b.Cond)
		}
	}
	for _, r := range sc.Regions {
		polys(r.Name, r.Polygons)
		positive(r.Name+" kx", r.Material.Kx)
		positive(r.Name+" ky", r.Material.Ky)
	}
	for _, e := range sc.Edges {
		owner(e.Name, e.Cond)
		if len(e.Lines) == 0 {
			t.Fatalf("edge %s without lines", e.Name)
		}
		for _, l := range e.Lines {
			if len(l) < 2 {
				t.Fatalf("edge %s line of %d positions", e.Name, len(l))
			}
			for _, v := range l {
				point(v.X, v.Y)
			}
		}
	}
}
