package seep

import (
	"math"
	"slices"
	"strings"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// LaneRatio is the least safe weighted creep ratio Lw/H for a soil.
type LaneRatio struct {
	Soil  string
	Ratio float64
}

// LaneRatios are the least safe weighted creep ratios by soil (Lane,
// Security from under-seepage: masonry dams on earth foundations, Trans.
// ASCE 100, 1935; values from memory, as commonly tabulated).
var LaneRatios = []LaneRatio{
	{"very fine sand or silt", 8.5},
	{"fine sand", 7.0},
	{"medium sand", 6.0},
	{"coarse sand", 5.0},
	{"fine gravel", 4.0},
	{"medium gravel", 3.5},
	{"coarse gravel including cobbles", 3.0},
	{"boulders with some cobbles and gravel", 2.5},
	{"soft clay", 3.0},
	{"medium clay", 2.0},
	{"hard clay", 1.8},
	{"very hard clay or hardpan", 1.6},
}

func laneRatio(soil string) (float64, bool) {
	for _, r := range LaneRatios {
		if strings.EqualFold(r.Soil, soil) {
			return r.Ratio, true
		}
	}
	return 0, false
}

func laneNames() string {
	var b strings.Builder
	for i, r := range LaneRatios {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString("\"" + r.Soil + "\"")
	}
	return b.String()
}

// Creep is Lane's weighted creep check along the contact of one
// structure with the soil: Lw = sum of the contact steeper than 45
// degrees + 1/3 of the contact flatter than 45 degrees, compared with the
// head H across the structure (Lane 1935). It is an empirical cross-check
// of the computed exit gradient, not a substitute for it.
type Creep struct {
	// Structures names the bodies of the structure: those that touch one
	// another (a floor and its cutoffs), at least one of them a bed.
	Structures []string
	// Vertical and Horizontal are the lengths of contact steeper and
	// flatter than 45 degrees (m); Weighted is Lw = Vertical +
	// Horizontal/3 (m).
	Vertical, Horizontal, Weighted float64
	// Head is H, the difference between the largest and the smallest
	// fixed head the structure touches (m), and Ratio Lw / H.
	Head, Ratio float64
	// Required is the safe ratio of Options.Soil (0 when none is named);
	// SafeFor lists the soils of LaneRatios whose safe ratio Ratio
	// reaches.
	Required float64
	SafeFor  []string
}

// creep checks every structure (bodies that touch one another) that
// touches fixed heads that differ.
func (a *analysis) creep() []Creep {
	m := a.m
	type key [2]float64
	at := func(v r2.Vec) key { return key{v.X, v.Y} }
	// Fixed heads by vertex.
	heads := map[key][]float64{}
	for _, p := range m.Panels {
		if p.Interface() || p.Cond.Kind != geom.Potential {
			continue
		}
		heads[at(p.A)] = append(heads[at(p.A)], p.Cond.Value)
		heads[at(p.B)] = append(heads[at(p.B)], p.Cond.Value)
	}
	// Bodies that touch one another form one structure (union-find over
	// owners through shared panel ends).
	parent := make([]int, len(a.lay.Owners))
	for i := range parent {
		parent[i] = i
	}
	var root func(int) int
	root = func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	isBody := func(p mesh.Panel) bool {
		return !p.Interface() && p.Owner >= 0 && a.lay.Owners[p.Owner].Part == geom.PartBody && p.Cond.Kind != geom.Potential
	}
	ownerAt := map[key]int{}
	for _, p := range m.Panels {
		if !isBody(p) {
			continue
		}
		for _, v := range [2]r2.Vec{p.A, p.B} {
			if o, ok := ownerAt[at(v)]; ok {
				parent[root(o)] = root(p.Owner)
			} else {
				ownerAt[at(v)] = p.Owner
			}
		}
	}
	type group struct {
		c      Creep
		lo, hi float64
	}
	groups := map[int]*group{}
	var order []int
	for _, p := range m.Panels {
		if !isBody(p) {
			continue
		}
		r := root(p.Owner)
		g, ok := groups[r]
		if !ok {
			g = &group{lo: math.Inf(1), hi: math.Inf(-1)}
			groups[r] = g
			order = append(order, r)
		}
		t := p.Tangent()
		if math.Abs(t.Y) >= math.Abs(t.X) {
			g.c.Vertical += p.Length()
		} else {
			g.c.Horizontal += p.Length()
		}
		for _, v := range [2]r2.Vec{p.A, p.B} {
			for _, h := range heads[at(v)] {
				g.lo, g.hi = math.Min(g.lo, h), math.Max(g.hi, h)
			}
		}
	}
	slices.Sort(order)
	var out []Creep
	for _, r := range order {
		g := groups[r]
		if !(g.hi > g.lo) {
			continue
		}
		c := g.c
		for o, own := range a.lay.Owners {
			if own.Part == geom.PartBody && root(o) == r {
				c.Structures = append(c.Structures, own.Name)
			}
		}
		c.Head = g.hi - g.lo
		c.Weighted = c.Vertical + c.Horizontal/3
		c.Ratio = c.Weighted / c.Head
		if a.o.Soil != "" {
			c.Required, _ = laneRatio(a.o.Soil)
		}
		for _, lr := range LaneRatios {
			if c.Ratio >= lr.Ratio {
				c.SafeFor = append(c.SafeFor, lr.Soil)
			}
		}
		out = append(out, c)
	}
	return out
}
