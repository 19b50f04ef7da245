package seep

import (
	"math"
	"strings"

	"github.com/rimfield/rimfield/geom"
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

// Creep is Lane's weighted creep check along the contact of the
// structures with the soil: Lw = sum of the contact steeper than 45
// degrees + 1/3 of the contact flatter than 45 degrees, compared with the
// head H across the structures (Lane 1935). It is an empirical cross-check
// of the computed exit gradient, not a substitute for it.
type Creep struct {
	// Structures names the bodies whose contact is counted: those that
	// touch a fixed-head boundary.
	Structures []string
	// Vertical and Horizontal are the lengths of contact steeper and
	// flatter than 45 degrees (m); Weighted is Lw = Vertical +
	// Horizontal/3 (m).
	Vertical, Horizontal, Weighted float64
	// Head is H, the largest difference between fixed heads (m), and Ratio
	// Lw / H.
	Head, Ratio float64
	// Required is the safe ratio of Options.Soil (0 when none is named);
	// SafeFor lists the soils of LaneRatios whose safe ratio Ratio
	// reaches.
	Required float64
	SafeFor  []string
}

// creep sums the contact of the bodies that touch a fixed-head boundary.
func (a *analysis) creep() *Creep {
	m := a.m
	lo, hi := math.Inf(1), math.Inf(-1)
	fixedAt := map[[2]float64]bool{}
	for _, p := range m.Panels {
		if p.Interface() || p.Cond.Kind != geom.Potential {
			continue
		}
		lo, hi = math.Min(lo, p.Cond.Value), math.Max(hi, p.Cond.Value)
		fixedAt[[2]float64{p.A.X, p.A.Y}] = true
		fixedAt[[2]float64{p.B.X, p.B.Y}] = true
	}
	if !(hi > lo) {
		return nil
	}
	touching := map[int]bool{}
	for _, p := range m.Panels {
		if p.Interface() || p.Owner < 0 || a.lay.Owners[p.Owner].Part != geom.PartBody || p.Cond.Kind == geom.Potential {
			continue
		}
		if fixedAt[[2]float64{p.A.X, p.A.Y}] || fixedAt[[2]float64{p.B.X, p.B.Y}] {
			touching[p.Owner] = true
		}
	}
	if len(touching) == 0 {
		return nil
	}
	c := &Creep{Head: hi - lo}
	for o, own := range a.lay.Owners {
		if touching[o] {
			c.Structures = append(c.Structures, own.Name)
		}
	}
	for _, p := range m.Panels {
		if p.Interface() || !touching[p.Owner] {
			continue
		}
		t := p.Tangent()
		if math.Abs(t.Y) >= math.Abs(t.X) {
			c.Vertical += p.Length()
		} else {
			c.Horizontal += p.Length()
		}
	}
	c.Weighted = c.Vertical + c.Horizontal/3
	c.Ratio = c.Weighted / c.Head
	if a.o.Soil != "" {
		c.Required, _ = laneRatio(a.o.Soil)
	}
	for _, r := range LaneRatios {
		if c.Ratio >= r.Ratio {
			c.SafeFor = append(c.SafeFor, r.Soil)
		}
	}
	return c
}
