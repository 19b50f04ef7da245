package electro

import (
	"math"
	"testing"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

func TestScratchCoax(t *testing.T) {
	for _, n := range []int{64, 512} {
		b := newScene(false).
			region("gap", 1, circle(r2.Vec{}, 2, n, 0)).
			body("core", fixed(1), circle(r2.Vec{}, 1, n, 0)).
			edge("shield", fixed(0), append(circle(r2.Vec{}, 2, n, 0), r2.Vec{X: 2})...)
		s := b.solve(t, mesh.Options{})
		o := s.sol.Owners()
		t.Logf("n=%d panels %d owners %+v C/eps=%.7f want %.7f", n, len(s.m.Panels), o, o[0].Inflow/geom.Eps0, 2*math.Pi/math.Log(2))
	}
}
