package main

import (
	"fmt"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// FuzzSolve drives small scenes of every physics from bytes through the
// whole chain the command line runs: read, lay out, mesh (at most 3000
// panels), the job's check and solve, results.json and boundary.csv. Bad
// geometry must give an error, never a panic; the fuzzer reports panics.
// The bytes choose the physics, the parts (regions, bodies, sheets drawn
// as lines, edges) and coordinates on a 16 x 16 grid.
func FuzzSolve(f *testing.F) {
	f.Add([]byte{1, 0, 0, 8, 0, 8, 8, 0, 8, 0xfe, 2, 2, 4, 2, 4, 4, 2, 4})
	f.Add([]byte{2, 0, 0, 10, 0, 10, 10, 0, 10, 0xfe, 2, 2, 5, 2, 5, 5, 0xfe, 0, 10, 10, 10})
	f.Add([]byte{3, 3, 3, 9, 4, 3, 5, 0xfd, 10, 4, 13, 2})
	f.Add([]byte{6, 0, 0, 15, 0, 15, 8, 0, 8, 0xfe, 7, 8, 7, 4, 0xfd, 0, 8, 6, 8, 0xfe, 8, 8, 15, 8})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) < 5 || len(data) > 80 {
			return
		}
		mode := data[0]
		type feat struct {
			pts   [][2]int
			sheet bool
		}
		var feats []feat
		cur := feat{}
		for i := 1; i < len(data); i++ {
			if data[i] == 0xfe || data[i] == 0xfd {
				feats = append(feats, cur)
				cur = feat{sheet: data[i] == 0xfd}
				continue
			}
			if i+1 < len(data) {
				cur.pts = append(cur.pts, [2]int{int(data[i] % 16), int(data[i+1] % 16)})
				i++
			}
		}
		feats = append(feats, cur)
		if len(feats) > 4 {
			return
		}
		physics := []string{"laplace", "electrostatic", "seepage", "flow"}[mode%4]
		closed := physics == "seepage" || (mode/4)%2 == 1 && physics != "flow"
		var b strings.Builder
		stream := ""
		if physics == "flow" {
			stream = `, "stream": {"speed": 1, "angle_deg": 5}`
		}
		fmt.Fprintf(&b, `{"type": "FeatureCollection", "problem": {"physics": %q, "open": %v%s}, "features": [`, physics, !closed, stream)
		for fi, ft := range feats {
			if fi > 0 {
				b.WriteString(",")
			}
			var pts []string
			for _, v := range ft.pts {
				pts = append(pts, fmt.Sprintf("[%d, %d]", v[0], v[1]))
			}
			ring := `{"type": "Polygon", "coordinates": [[` + strings.Join(append(append([]string{}, pts...), pts[:min(1, len(pts))]...), ",") + `]]}`
			line := `{"type": "LineString", "coordinates": [` + strings.Join(pts, ",") + `]}`
			cond := fmt.Sprintf(`, "potential": %d`, fi%2)
			if physics == "flow" {
				cond = ""
				if fi == 0 {
					cond = `, "kutta": true`
				}
			}
			var props, g string
			switch {
			case closed && fi == 0:
				props, g = `{"part": "region", "k": 2}`, ring
				if physics == "electrostatic" {
					props = `{"part": "region", "permittivity": 2}`
				}
			case closed && fi == len(feats)-1:
				props, g = fmt.Sprintf(`{"part": "edge", "potential": %d}`, fi), line
			case ft.sheet:
				props, g = `{"part": "body"`+cond+`}`, line
			default:
				props, g = `{"part": "body"`+cond+`}`, ring
			}
			fmt.Fprintf(&b, `{"type": "Feature", "properties": %s, "geometry": %s}`, props, g)
		}
		b.WriteString("]}")
		sc, err := geom.Read(strings.NewReader(b.String()))
		if err != nil {
			return
		}
		lay, err := sc.Layout()
		if err != nil {
			return
		}
		mo := mesh.Options{MaxPanels: 3000}
		m, err := mesh.Build(lay, mo)
		if err != nil || len(m.Panels) > 3000 {
			return
		}
		j, refusal := newJobs().forScene(sc.Problem.Physics)
		s := &job.Setup{Scene: sc, Mesh: m, MeshOptions: mo}
		if c, err := j.Check(s); err != nil || c.Refusal != nil || refusal != nil {
			return
		}
		tk := &task{scenePath: "fuzz.geojson", scene: sc, mesh: m, job: j, words: j.Words(), levels: 3}
		if tk.out, err = j.Solve(s); err != nil {
			return
		}
		if _, err := newBoundaryTable(tk); err != nil {
			t.Fatalf("boundary.csv of a solved scene: %v\n%s", err, b.String())
		}
		res, err := buildResults(tk)
		if err != nil {
			t.Fatalf("results.json of a solved scene: %v\n%s", err, b.String())
		}
		if _, err := res.marshal(); err != nil {
			t.Fatalf("results.json does not marshal: %v\n%s", err, b.String())
		}
	})
}
