package geom

import (
	"bytes"
	"errors"
	"fmt"
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
		back, err := Read(&buf)
		if err != nil {
			t.Fatalf("reading back what Write wrote: %v", err)
		}
		readTestSame(t, "round trip", sc, back)
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
	lines := func(what string, ls []Line) {
		if len(ls) == 0 {
			t.Fatalf("%s without lines", what)
		}
		for _, l := range ls {
			if len(l) < 2 {
				t.Fatalf("%s line of %d positions", what, len(l))
			}
			for _, v := range l {
				point(v.X, v.Y)
			}
		}
	}
	for _, b := range sc.Bodies {
		if b.Sheet() {
			if len(b.Polygons) > 0 {
				t.Fatalf("sheet %s has polygons too", b.Name)
			}
			lines("sheet "+b.Name, b.Lines)
		} else {
			polys(b.Name, b.Polygons)
		}
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
		lines("edge "+e.Name, e.Lines)
	}
}

// FuzzReadGeometry builds well-formed scene files from fuzzed bytes, so that
// the fuzzer spends its time on rings and lines (crossings, holes, repeated
// and collinear vertices, units) rather than on JSON syntax. Bytes 0-2 pick
// the physics, the unit and whether rings are closed; then each pair of
// bytes is a vertex (signed, quarter units), 0xff starts a new ring of the
// same polygon and 0xfe a new feature (body, region, edge in turn).
func FuzzReadGeometry(f *testing.F) {
	f.Add([]byte{0, 0, 0, 0, 0, 40, 0, 40, 40, 0, 40})
	f.Add([]byte{1, 2, 0, 0, 0, 40, 0, 40, 40, 0, 40, 0xff, 10, 10, 10, 20, 20, 20, 0xfe, 200, 200, 60, 200, 60, 60})
	f.Add([]byte{2, 6, 0, 0, 0, 40, 0, 40, 40, 0, 40, 0xfe, 10, 10, 30, 10, 30, 30, 10, 30, 0xfe, 0, 40, 40, 40})
	f.Add([]byte{3, 5, 1, 0, 0, 40, 0, 20, 40, 20, 40, 0xfe, 100, 100, 120, 100, 110, 120})
	f.Add([]byte{0, 1, 0, 0, 0, 40, 40, 40, 0, 0, 40})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) < 3 || len(data) > 2000 {
			return
		}
		physics := readPhysicsNames[int(data[0])%4]
		unit := []string{"m", "cm", "mm", "um", "km", "in", "ft"}[int(data[1])%7]
		closeRings := data[2]%4 != 3
		var feats [][][][2]float64 // feature -> ring -> vertex
		cur := [][][2]float64{{}}
		for i := 3; i < len(data); i++ {
			switch {
			case data[i] == 0xfe:
				feats = append(feats, cur)
				cur = [][][2]float64{{}}
			case data[i] == 0xff:
				cur = append(cur, [][2]float64{})
			case i+1 < len(data):
				v := [2]float64{float64(int8(data[i])) / 4, float64(int8(data[i+1])) / 4}
				cur[len(cur)-1] = append(cur[len(cur)-1], v)
				i++
			}
		}
		feats = append(feats, cur)
		var b strings.Builder
		fmt.Fprintf(&b, `{"type": "FeatureCollection", "problem": {"physics": %q, "unit": %q, "open": true`, physics, unit)
		if physics == "flow" {
			b.WriteString(`, "stream": {"speed": 1}`)
		}
		b.WriteString(`}, "features": [`)
		for fi, rings := range feats {
			if fi > 0 {
				b.WriteString(",")
			}
			pos := func(ring [][2]float64, closed bool) string {
				var s []string
				for _, v := range ring {
					s = append(s, fmt.Sprintf("[%g, %g]", v[0], v[1]))
				}
				if closed && len(ring) > 0 {
					s = append(s, fmt.Sprintf("[%g, %g]", ring[0][0], ring[0][1]))
				}
				return "[" + strings.Join(s, ", ") + "]"
			}
			var props, geom string
			switch fi % 3 {
			case 0, 1:
				props = `{"part": "body", "potential": 1}`
				if physics == "flow" {
					props = `{"part": "body", "kutta": true}`
				}
				if fi%3 == 1 {
					props = `{"part": "region"}`
					if physics == "seepage" {
						props = `{"part": "region", "k": 1e-5}`
					}
				}
				var rs []string
				for _, r := range rings {
					rs = append(rs, pos(r, closeRings))
				}
				geom = `{"type": "Polygon", "coordinates": [` + strings.Join(rs, ", ") + `]}`
			case 2:
				props = `{"part": "edge", "potential": 0}`
				var ls []string
				for _, r := range rings {
					ls = append(ls, pos(r, false))
				}
				geom = `{"type": "MultiLineString", "coordinates": [` + strings.Join(ls, ", ") + `]}`
			}
			fmt.Fprintf(&b, `{"type": "Feature", "properties": %s, "geometry": %s}`, props, geom)
		}
		b.WriteString("]}")
		sc, err := Read(strings.NewReader(b.String()))
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v is %T, want *Error", err, err)
			}
			return
		}
		readFuzzCheck(t, sc)
		var buf bytes.Buffer
		if err := Write(&buf, sc); err != nil {
			t.Fatalf("Write: %v", err)
		}
		back, err := Read(&buf)
		if err != nil {
			t.Fatalf("reading back what Write wrote: %v\n%s", err, b.String())
		}
		readTestSame(t, "round trip", sc, back)
	})
}
