package bem

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// FuzzPipeline drives the whole chain, reader -> layout -> mesh -> solve ->
// evaluate, with scenes built from the fuzzer's bytes on a coarse integer
// grid (so that vertices coincide, edges overlap and bodies touch often):
// every stage must either return an error or a result with finite numbers,
// never panic. Byte 0 picks open/closed and the conditions; then runs of
// vertex pairs, 0xfe closing a feature.
func FuzzPipeline(f *testing.F) {
	f.Add([]byte{0, 0, 0, 8, 0, 8, 8, 0, 8, 0xfe, 2, 2, 4, 2, 4, 4, 2, 4})
	f.Add([]byte{1, 0, 0, 10, 0, 10, 10, 0, 10, 0xfe, 2, 2, 5, 2, 5, 5, 0xfe, 0, 0, 10, 0})
	f.Add([]byte{2, 0, 0, 4, 0, 4, 4, 0, 4, 0xfe, 4, 0, 8, 0, 8, 4, 4, 4})
	f.Add([]byte{3, 1, 1, 3, 1, 3, 3, 1, 3, 0xfe, 5, 1, 7, 1, 7, 3, 5, 3, 0xfe, 3, 6, 4, 8, 2, 8})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) < 7 || len(data) > 120 {
			return
		}
		mode := data[0]
		var feats [][][2]int
		cur := [][2]int{}
		for i := 1; i < len(data); i++ {
			if data[i] == 0xfe {
				feats = append(feats, cur)
				cur = nil
				continue
			}
			if i+1 < len(data) {
				cur = append(cur, [2]int{int(data[i] % 16), int(data[i+1] % 16)})
				i++
			}
		}
		feats = append(feats, cur)
		if len(feats) > 5 {
			return
		}
		open := mode%2 == 0
		var b strings.Builder
		fmt.Fprintf(&b, `{"type": "FeatureCollection", "problem": {"physics": "laplace", "open": %v}, "features": [`, open)
		for fi, ring := range feats {
			if fi > 0 {
				b.WriteString(",")
			}
			var pts []string
			for _, v := range ring {
				pts = append(pts, fmt.Sprintf("[%d, %d]", v[0], v[1]))
			}
			closed := append(append([]string{}, pts...), pts[0:min(1, len(pts))]...)
			var props, g string
			switch {
			case !open && fi == 0:
				props = `{"part": "region", "k": 2}`
				g = `{"type": "Polygon", "coordinates": [[` + strings.Join(closed, ",") + `]]}`
			case fi == len(feats)-1 && mode%4 >= 2:
				props = fmt.Sprintf(`{"part": "edge", "potential": %d}`, fi)
				g = `{"type": "LineString", "coordinates": [` + strings.Join(pts, ",") + `]}`
			case fi%3 == 2:
				props = `{"part": "body", "floating": true, "net_inflow": 1}`
				g = `{"type": "Polygon", "coordinates": [[` + strings.Join(closed, ",") + `]]}`
			default:
				props = fmt.Sprintf(`{"part": "body", "potential": %d}`, fi%2)
				g = `{"type": "Polygon", "coordinates": [[` + strings.Join(closed, ",") + `]]}`
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
		m, err := mesh.Build(lay, mesh.Options{Panels: 200})
		if err != nil {
			return
		}
		sol, err := Solve(m, nil)
		if err != nil {
			return
		}
		for j := range sol.F {
			if math.IsNaN(sol.F[j]) || math.IsInf(sol.F[j], 0) || math.IsNaN(sol.U[j]) {
				t.Fatalf("non-finite solution on panel %d: u %v, F %v\n%s", j, sol.U[j], sol.F[j], b.String())
			}
		}
		for _, p := range []r2.Vec{{X: 1.5, Y: 1.5}, {X: 7.5, Y: 3.5}, {X: 20, Y: 20}} {
			pt := sol.Eval(p)
			if pt.Region != geom.Outside && (math.IsNaN(pt.U) || math.IsInf(pt.U, 0)) {
				t.Fatalf("non-finite potential at %v\n%s", p, b.String())
			}
		}
	})
}
