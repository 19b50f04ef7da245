package fmm

import (
	"math"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// TestWorkersBitwise: the product does not depend on the number of workers,
// to the last bit (every output is computed by one fixed sequence of
// operations, whichever goroutine runs it).
func TestWorkersBitwise(t *testing.T) {
	for _, s := range testScenes()[:2] {
		var ref []float64
		var refG []r2.Vec
		for _, w := range []int{1, 2, 3} {
			tr, err := New(s.panels, s.points, s.targets, &Options{Tol: 1e-10, Workers: w})
			if err != nil {
				t.Fatal(err)
			}
			u := make([]float64, len(s.targets))
			g := make([]r2.Vec, len(s.targets))
			tr.Eval(u, g, s.dens, nearOf(s))
			if ref == nil {
				ref, refG = u, g
				continue
			}
			for i := range u {
				if math.Float64bits(u[i]) != math.Float64bits(ref[i]) || g[i] != refG[i] && !math.IsNaN(g[i].X) {
					t.Fatalf("%s, %d workers: target %d gives %v %v, 1 worker %v %v", s.name, w, i, u[i], g[i], ref[i], refG[i])
				}
			}
		}
	}
}

// TestConcurrentApply: products on one tree from several goroutines give
// what they give alone.
func TestConcurrentApply(t *testing.T) {
	s := testScenes()[0]
	tr, err := New(s.panels, s.points, s.targets, &Options{Tol: 1e-6, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(9, 9))
	dens := []Density{s.dens, randomDensity(rng, len(s.panels), len(s.points)), randomDensity(rng, len(s.panels), len(s.points))}
	want := make([][]float64, len(dens))
	for k, d := range dens {
		want[k] = make([]float64, len(s.targets))
		tr.Apply(want[k], nil, d)
	}
	var wg sync.WaitGroup
	got := make([][]float64, len(dens))
	for k, d := range dens {
		wg.Add(1)
		go func() {
			defer wg.Done()
			got[k] = make([]float64, len(s.targets))
			tr.Apply(got[k], nil, d)
		}()
	}
	wg.Wait()
	for k := range dens {
		for i := range got[k] {
			if got[k][i] != want[k][i] {
				t.Fatalf("density %d target %d: concurrent %v, alone %v", k, i, got[k][i], want[k][i])
			}
		}
	}
}

// TestBlockMatchesAddNear: the stored near block applies what AddNear
// computes pair by pair, with both layers or one.
func TestBlockMatchesAddNear(t *testing.T) {
	s := testScenes()[1]
	tr, err := New(s.panels, s.points, s.targets, &Options{Tol: 1e-10})
	if err != nil {
		t.Fatal(err)
	}
	coef := func(i int, panels []int32, single, double []float64) {
		for k, j := range panels {
			sl, dl, _, _ := exactPanel(s.targets[i], s.panels[j])
			if single != nil {
				single[k] = sl
			}
			if double != nil {
				double[k] = dl
			}
		}
	}
	for _, layers := range [][2]bool{{true, true}, {true, false}, {false, true}} {
		b := tr.NewBlock(layers[0], layers[1], coef)
		d := s.dens
		if !layers[0] {
			d.Single = nil
		}
		if !layers[1] {
			d.Double = nil
		}
		got := make([]float64, len(s.targets))
		b.AddTo(got, d)
		want := make([]float64, len(s.targets))
		tr.AddNear(want, nil, d, nearOf(s))
		for i := range got {
			// Same terms in the same order: observed equal to the bit;
			// 1e-14 relative allows a compiler's fused multiply-add.
			if math.Abs(got[i]-want[i]) > 1e-14*math.Max(1, math.Abs(want[i])) {
				t.Fatalf("layers %v target %d: block %v, pair by pair %v", layers, i, got[i], want[i])
			}
		}
		if n := tr.NearPairs(); b.Bytes() < 8*n {
			t.Errorf("block of %d bytes for %d pairs", b.Bytes(), n)
		}
	}
}

// TestNearCoversClosePanels: a far pair always has its target at least the
// source box radius (so at least half the panel's length) from the panel: the
// acceptance test gives d >= rs/rho + rt, so the distance from any target of
// the box to any point of the source box is at least rs (1/rho - 1) = rs.
// Every closer panel, the panel a collocation point lies on above all, must
// be in the target's near list, where the caller's exact forms take it.
func TestNearCoversClosePanels(t *testing.T) {
	for _, s := range testScenes() {
		tr, err := New(s.panels, s.points, s.targets, nil)
		if err != nil {
			t.Fatal(err)
		}
		for i, x := range s.targets {
			if i%3 != 0 {
				continue
			}
			near := map[int32]bool{}
			for _, j := range tr.NearPanels(i) {
				near[j] = true
			}
			for j, p := range s.panels {
				l := r2.Norm(r2.Sub(p.B, p.A))
				if segmentDistance(x, p) < 0.5*l && !near[int32(j)] {
					t.Fatalf("%s: target %d at %v is %.3g from panel %d of length %.3g but not in its near list",
						s.name, i, x, segmentDistance(x, p), j, l)
				}
			}
		}
	}
}

func segmentDistance(x r2.Vec, p Panel) float64 {
	d := r2.Sub(p.B, p.A)
	tt := r2.Dot(r2.Sub(x, p.A), d) / r2.Dot(d, d)
	tt = math.Max(0, math.Min(1, tt))
	return r2.Norm(r2.Sub(x, r2.Add(p.A, r2.Scale(tt, d))))
}

// TestEdgeCases: empty sets, lone sources, coincident targets and a target
// on a point source, against the direct sums.
func TestEdgeCases(t *testing.T) {
	p := Panel{A: r2.Vec{X: 0, Y: 0}, B: r2.Vec{X: 1, Y: 0}}
	x := r2.Vec{X: 0.3, Y: 2}
	one := Density{Single: []float64{1}, Double: []float64{0.5}}

	tr, err := New(nil, nil, []r2.Vec{x}, nil)
	if err != nil {
		t.Fatal(err)
	}
	u := []float64{7}
	g := []r2.Vec{{X: 7}}
	tr.Apply(u, g, Density{})
	if u[0] != 0 || g[0] != (r2.Vec{}) {
		t.Errorf("no sources: %v %v", u, g)
	}

	tr, err = New([]Panel{p}, nil, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	tr.Apply(nil, nil, one) // no targets: nothing to do

	// One panel and one target: a near pair (the lone leaves are not
	// separated from each other), so Eval is the exact value.
	tr, err = New([]Panel{p}, nil, []r2.Vec{x}, nil)
	if err != nil {
		t.Fatal(err)
	}
	f := func(i, j int, grad bool) (float64, float64, r2.Vec, r2.Vec) { return closedPanel(x, p) }
	tr.Eval(u, g, one, f)
	sl, dl, gsl, gdl := closedPanel(x, p)
	if math.Abs(u[0]-(sl+0.5*dl)) > 1e-15 || r2.Norm(r2.Sub(g[0], r2.Add(gsl, r2.Scale(0.5, gdl)))) > 1e-15 {
		t.Errorf("one panel: %v %v, exact %v", u[0], g[0], sl+0.5*dl)
	}

	// 2000 coincident targets and a target exactly on a point source
	// (which gives it nothing); point charges q ln r summed directly.
	rng := rand.New(rand.NewPCG(5, 5))
	var pts []r2.Vec
	var q []float64
	for range 500 {
		pts = append(pts, r2.Vec{X: rng.Float64(), Y: rng.Float64()})
		q = append(q, 2*rng.Float64()-1)
	}
	targets := []r2.Vec{pts[17]}
	for range 2000 {
		targets = append(targets, r2.Vec{X: 0.25, Y: 0.75})
	}
	tr, err = New(nil, pts, targets, &Options{Tol: 1e-12})
	if err != nil {
		t.Fatal(err)
	}
	u = make([]float64, len(targets))
	g = make([]r2.Vec, len(targets))
	tr.Apply(u, g, Density{Point: q})
	for _, i := range []int{0, 1, len(targets) - 1} {
		var wu float64
		var wg r2.Vec
		for k, y := range pts {
			d := r2.Sub(targets[i], y)
			r := r2.Norm(d)
			if r == 0 {
				continue
			}
			wu -= inv2Pi * q[k] * math.Log(r)
			wg = r2.Add(wg, r2.Scale(-inv2Pi*q[k]/(r*r), d))
		}
		// Observed 4.7e-15; 1e-12 is the requested precision.
		if math.Abs(u[i]-wu) > 1e-12 || r2.Norm(r2.Sub(g[i], wg)) > 1e-12*math.Max(1, r2.Norm(wg)) {
			t.Errorf("points, target %d: %v %v, direct %v %v", i, u[i], g[i], wu, wg)
		}
	}
}

// TestInputErrors: bad options and geometry get one clear error each.
func TestInputErrors(t *testing.T) {
	ok := []Panel{{A: r2.Vec{}, B: r2.Vec{X: 1}}}
	nan := math.NaN()
	cases := []struct {
		panels  []Panel
		points  []r2.Vec
		targets []r2.Vec
		o       *Options
		want    string
	}{
		{ok, nil, nil, &Options{Tol: 1e-13}, "Options.Tol"},
		{ok, nil, nil, &Options{Tol: 0.01}, "Options.Tol"},
		{ok, nil, nil, &Options{Tol: nan}, "Options.Tol"},
		{ok, nil, nil, &Options{LeafSize: -1}, "LeafSize"},
		{ok, nil, nil, &Options{Workers: -2}, "Workers"},
		{[]Panel{{A: r2.Vec{X: nan}, B: r2.Vec{}}}, nil, nil, nil, "panel 0"},
		{[]Panel{ok[0], {A: r2.Vec{X: 2}, B: r2.Vec{X: 2}}}, nil, nil, nil, "panel 1 has zero length"},
		{nil, []r2.Vec{{Y: math.Inf(1)}}, nil, nil, "point source 0"},
		{nil, nil, []r2.Vec{{}, {X: nan}}, nil, "target 1"},
	}
	for _, c := range cases {
		_, err := New(c.panels, c.points, c.targets, c.o)
		if err == nil || !strings.HasPrefix(err.Error(), "fmm: ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("want an error about %q, got %v", c.want, err)
		}
	}
}

// TestCallerBugsPanic: densities or outputs of the wrong length are caller
// bugs and panic with a message naming them.
func TestCallerBugsPanic(t *testing.T) {
	tr, err := New([]Panel{{A: r2.Vec{}, B: r2.Vec{X: 1}}}, nil, []r2.Vec{{Y: 1}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		f    func()
		want string
	}{
		{func() { tr.Apply(make([]float64, 1), nil, Density{Single: []float64{1, 2}}) }, "Density.Single"},
		{func() { tr.Apply(make([]float64, 2), nil, Density{}) }, "potential slice"},
		{func() { tr.Apply(nil, make([]r2.Vec, 3), Density{}) }, "gradient slice"},
	} {
		func() {
			defer func() {
				r := recover()
				if s, _ := r.(string); !strings.Contains(s, c.want) {
					t.Errorf("want a panic about %q, got %v", c.want, r)
				}
			}()
			c.f()
		}()
	}
}
