package template

import (
	"math"

	"github.com/rimfield/rimfield/geom"
)

// DefaultSeepUnit is the coordinate unit of the seepage templates.
const DefaultSeepUnit = "m"

// Seep holds what every seepage template shares: the unit, the heads and
// the water's properties. Heads are total heads in metres: the water level
// above the datum y = 0, which is the ground surface (the bed) of the
// templates.
type Seep struct {
	Unit string // coordinate unit of the scene file; "" means m
	// UpstreamHead and DownstreamHead are the total heads on the beds on
	// either side, in metres.
	UpstreamHead, DownstreamHead float64
	// UnitWeight is the unit weight of water in kN/m^3 and
	// CriticalGradient the soil's critical gradient; 0: the scene defaults
	// (9.81 and 1).
	UnitWeight, CriticalGradient float64
	// ImperviousBase draws the bottom of the section as an edge of zero
	// flux named "impervious base": a real impervious stratum (rock, a
	// clay), which a truncation check does not move. Without it the bottom
	// is an insulated wall that may only cut a deeper soil short.
	ImperviousBase bool
}

// seepProblem is the problem member of a seepage scene as written.
type seepProblem struct {
	Physics          string  `json:"physics"`
	Unit             string  `json:"unit"`
	UnitWeight       float64 `json:"unit_weight_water,omitempty"`
	CriticalGradient float64 `json:"critical_gradient,omitempty"`
}

type seepFeature struct {
	Type       string    `json:"type"`
	Properties seepProps `json:"properties"`
	Geometry   geometry  `json:"geometry"`
}

type seepProps struct {
	Part      string   `json:"part"`
	Name      string   `json:"name"`
	Potential *float64 `json:"potential,omitempty"`
	Flux      *float64 `json:"flux,omitempty"`
	K         float64  `json:"k,omitempty"`
}

// base is the section's bottom from x0 to x1 at y as an impervious edge,
// when asked for.
func (s *Seep) base(features []any, x0, x1, y float64) []any {
	if !s.ImperviousBase {
		return features
	}
	zero := 0.0
	return append(features, seepFeature{"Feature", seepProps{Part: "edge", Name: "impervious base", Flux: &zero},
		geometry{Type: "LineString", Line: []point{{coord(x0), coord(y)}, {coord(x1), coord(y)}}}})
}

func (s *Seep) resolve(name string) (seepProblem, error) {
	if s.Unit == "" {
		s.Unit = DefaultSeepUnit
	}
	if math.IsNaN(s.UpstreamHead) || math.IsInf(s.UpstreamHead, 0) || math.IsNaN(s.DownstreamHead) || math.IsInf(s.DownstreamHead, 0) {
		return seepProblem{}, errorf(name, "UpstreamHead", "the heads must be finite numbers of metres, got %g and %g", s.UpstreamHead, s.DownstreamHead)
	}
	if s.UpstreamHead == s.DownstreamHead {
		return seepProblem{}, errorf(name, "UpstreamHead", "the upstream and downstream heads are both %g m: nothing flows; give them different values", s.UpstreamHead)
	}
	for _, q := range []quantity{{"UnitWeight", "unit weight of water", s.UnitWeight}, {"CriticalGradient", "critical gradient", s.CriticalGradient}} {
		if !(q.v >= 0) || math.IsInf(q.v, 0) {
			return seepProblem{}, errorf(name, q.param, "the %s must be a positive number (0 for the default), got %g", q.what, q.v)
		}
	}
	return seepProblem{Physics: geom.Seepage.String(), Unit: s.Unit, UnitWeight: s.UnitWeight, CriticalGradient: s.CriticalGradient}, nil
}

func soil(name string, k float64, x0, y0, x1, y1 float64) seepFeature {
	return seepFeature{"Feature", seepProps{Part: "region", Name: name, K: k}, geometry{Type: "Polygon", Rings: [][]point{rect(x0, y0, x1, y1)}}}
}

func bed(name string, head, x0, x1 float64) seepFeature {
	return seepFeature{"Feature", seepProps{Part: "edge", Name: name, Potential: potential(head)},
		geometry{Type: "LineString", Line: []point{{coord(x0), 0}, {coord(x1), 0}}}}
}

func structure(name string, ring []point) seepFeature {
	return seepFeature{"Feature", seepProps{Part: "body", Name: name}, geometry{Type: "Polygon", Rings: [][]point{ring}}}
}

// rect is the closed counter-clockwise ring of a rectangle.
func rect(x0, y0, x1, y1 float64) []point {
	return []point{{coord(x0), coord(y0)}, {coord(x1), coord(y0)}, {coord(x1), coord(y1)}, {coord(x0), coord(y1)}, {coord(x0), coord(y0)}}
}

// Weir is a weir floor on the bed with optional cutoffs at its upstream and
// downstream ends, on one or two soil layers: the structure a practitioner
// checks for discharge, uplift, exit gradient and heave. The floor, of
// Width and Thickness, rests on the bed between x = -Width/2 and Width/2;
// the cutoffs, CutoffThickness thick and flush with the floor's ends, reach
// UpstreamCutoff and DownstreamCutoff below the bed (0: none). The top
// layer is Layer1 thick with conductivity K1, the one below Layer2 thick
// with K2 (Layer2 0: one layer). Upstream and Downstream are the lengths of
// bed modelled on either side: the section's outer walls are impervious, so
// make them long (several times the layers' depth) or check with
// rimfield solve --truncation-check. Lengths are in Unit.
type Weir struct {
	Seep
	Width, Thickness                 float64
	UpstreamCutoff, DownstreamCutoff float64
	CutoffThickness                  float64
	Layer1, Layer2                   float64
	K1, K2                           float64 // m/s
	Upstream, Downstream             float64
}

// Bytes returns the scene file.
func (w Weir) Bytes() ([]byte, error) {
	const name = "weir"
	prob, err := w.Seep.resolve(name)
	if err != nil {
		return nil, err
	}
	u := w.Unit
	if err := positive(name, u, quantity{"Width", "floor width", w.Width}, quantity{"Thickness", "floor thickness", w.Thickness},
		quantity{"Layer1", "thickness of the top layer", w.Layer1}, quantity{"Upstream", "length of bed upstream", w.Upstream},
		quantity{"Downstream", "length of bed downstream", w.Downstream}); err != nil {
		return nil, err
	}
	for _, q := range []quantity{{"UpstreamCutoff", "upstream cutoff depth", w.UpstreamCutoff}, {"DownstreamCutoff", "downstream cutoff depth", w.DownstreamCutoff}, {"Layer2", "thickness of the bottom layer", w.Layer2}} {
		if !(q.v >= 0) || math.IsInf(q.v, 0) {
			return nil, errorf(name, q.param, "the %s must be a length of 0 or more in %s, got %g", q.what, u, q.v)
		}
	}
	if err := conductivity(name, quantity{"K1", "conductivity of the top layer", w.K1}); err != nil {
		return nil, err
	}
	depth := w.Layer1 + w.Layer2
	if w.Layer2 > 0 {
		if err := conductivity(name, quantity{"K2", "conductivity of the bottom layer", w.K2}); err != nil {
			return nil, err
		}
	}
	cut := w.UpstreamCutoff > 0 || w.DownstreamCutoff > 0
	if cut && (!(w.CutoffThickness > 0) || 2*w.CutoffThickness >= w.Width) {
		return nil, errorf(name, "CutoffThickness", "the cutoffs need a thickness above 0 and below half the floor's width (%g %s), got %g", w.Width, u, w.CutoffThickness)
	}
	if d := math.Max(w.UpstreamCutoff, w.DownstreamCutoff); d >= depth {
		return nil, errorf(name, "UpstreamCutoff", "a cutoff %g %s deep reaches the bottom of the soil (%g %s): the section would be cut in two; make it shorter or the layers deeper", d, u, depth, u)
	}
	l, r := -w.Width/2, w.Width/2
	ring := []point{{coord(l), coord(w.Thickness)}}
	if d := w.UpstreamCutoff; d > 0 {
		ring = append(ring, point{coord(l), coord(-d)}, point{coord(l + w.CutoffThickness), coord(-d)}, point{coord(l + w.CutoffThickness), 0})
	} else {
		ring = append(ring, point{coord(l), 0})
	}
	if d := w.DownstreamCutoff; d > 0 {
		ring = append(ring, point{coord(r - w.CutoffThickness), 0}, point{coord(r - w.CutoffThickness), coord(-d)}, point{coord(r), coord(-d)})
	} else {
		ring = append(ring, point{coord(r), 0})
	}
	ring = append(ring, point{coord(r), coord(w.Thickness)}, ring[0])
	x0, x1 := l-w.Upstream, r+w.Downstream
	features := []any{soil("top layer", w.K1, x0, -w.Layer1, x1, 0)}
	if w.Layer2 > 0 {
		features = append(features, soil("bottom layer", w.K2, x0, -depth, x1, -w.Layer1))
	}
	features = append(features,
		structure("weir", ring),
		bed("upstream bed", w.UpstreamHead, x0, l),
		bed("downstream bed", w.DownstreamHead, r, x1))
	return writeScene(name, prob, w.base(features, x0, x1, -depth))
}

// conductivity checks hydraulic conductivities in m/s.
func conductivity(name string, ks ...quantity) error {
	for _, k := range ks {
		if !(k.v > 0) || math.IsInf(k.v, 0) {
			return errorf(name, k.param, "the %s must be a positive number of m/s, got %g", k.what, k.v)
		}
	}
	return nil
}

// SheetPile is a single sheet-pile wall driven Depth into a soil layer of
// Layer thickness and conductivity K, the upstream bed on its left at
// UpstreamHead and the downstream one on its right: the classic check of
// exit gradient and heave beside a wall. Thickness 0 makes the pile a sheet
// of zero thickness (a line). Upstream and Downstream are the lengths of
// bed modelled on either side. Lengths are in Unit.
type SheetPile struct {
	Seep
	Depth, Thickness     float64
	Layer, K             float64
	Upstream, Downstream float64
}

// Bytes returns the scene file.
func (s SheetPile) Bytes() ([]byte, error) {
	const name = "sheet-pile"
	prob, err := s.Seep.resolve(name)
	if err != nil {
		return nil, err
	}
	u := s.Unit
	if err := positive(name, u, quantity{"Depth", "pile depth", s.Depth}, quantity{"Layer", "layer thickness", s.Layer},
		quantity{"Upstream", "length of bed upstream", s.Upstream}, quantity{"Downstream", "length of bed downstream", s.Downstream}); err != nil {
		return nil, err
	}
	if !(s.Thickness >= 0) || s.Thickness >= s.Upstream || s.Thickness >= s.Downstream {
		return nil, errorf(name, "Thickness", "the pile's thickness must be 0 (a sheet) or a small positive length in %s, got %g", u, s.Thickness)
	}
	if err := conductivity(name, quantity{"K", "conductivity of the soil", s.K}); err != nil {
		return nil, err
	}
	if s.Depth >= s.Layer {
		return nil, errorf(name, "Depth", "the pile %g %s deep reaches the bottom of the layer (%g %s); make it shorter or the layer deeper", s.Depth, u, s.Layer, u)
	}
	h := s.Thickness / 2
	return writeScene(name, prob, s.base([]any{
		soil("soil", s.K, -s.Upstream, -s.Layer, s.Downstream, 0),
		pileFrom("sheet pile", 0, 0, -s.Depth, s.Thickness),
		bed("upstream bed", s.UpstreamHead, -s.Upstream, -h),
		bed("downstream bed", s.DownstreamHead, h, s.Downstream),
	}, -s.Upstream, s.Downstream, -s.Layer))
}

// Cofferdam is a double-wall cofferdam in a river bed: two sheet-pile walls
// Width apart (centre to centre, about x = 0), the soil between them
// excavated Excavation below the bed and kept dewatered at InsideHead,
// the walls reaching Embedment below the excavation, in a layer of Layer
// thickness (below the bed) and conductivity K; the river stands at
// UpstreamHead outside both walls (DownstreamHead is not used). Extent is
// the length of bed modelled outside each wall. Water enters through the
// river bed and leaves through the excavation's floor: the check is the
// exit gradient and the heave of the floor next to the walls. Thickness 0
// makes the walls sheets of zero thickness. Lengths are in Unit.
type Cofferdam struct {
	Seep
	Width, Excavation, Embedment, Thickness float64
	Layer, K, Extent                        float64
	// InsideHead is the head held in the excavation (m); NaN means the
	// excavation's floor, -Excavation.
	InsideHead float64
}

// Bytes returns the scene file.
func (c Cofferdam) Bytes() ([]byte, error) {
	const name = "cofferdam"
	if math.IsNaN(c.InsideHead) {
		c.InsideHead = -c.Excavation
	}
	c.DownstreamHead = c.InsideHead
	prob, err := c.Seep.resolve(name)
	if err != nil {
		return nil, err
	}
	u := c.Unit
	if err := positive(name, u, quantity{"Width", "distance between the walls", c.Width}, quantity{"Excavation", "excavation depth", c.Excavation},
		quantity{"Embedment", "embedment below the excavation", c.Embedment}, quantity{"Layer", "layer thickness", c.Layer},
		quantity{"Extent", "length of bed outside each wall", c.Extent}); err != nil {
		return nil, err
	}
	if !(c.Thickness >= 0) || 2*c.Thickness >= c.Width {
		return nil, errorf(name, "Thickness", "the walls' thickness must be 0 (sheets) or a positive length well below their spacing, in %s, got %g", u, c.Thickness)
	}
	if err := conductivity(name, quantity{"K", "conductivity of the soil", c.K}); err != nil {
		return nil, err
	}
	d := c.Excavation + c.Embedment
	if d >= c.Layer {
		return nil, errorf(name, "Embedment", "the walls reach %g %s below the bed, through the layer (%g %s); make them shorter or the layer deeper", d, u, c.Layer, u)
	}
	l, r, h := -c.Width/2, c.Width/2, c.Thickness/2
	x0, x1 := l-c.Extent, r+c.Extent
	// The soil with the excavation cut out, counter-clockwise.
	ring := []point{{coord(x0), coord(-c.Layer)}, {coord(x1), coord(-c.Layer)}, {coord(x1), 0}, {coord(r), 0},
		{coord(r), coord(-c.Excavation)}, {coord(l), coord(-c.Excavation)}, {coord(l), 0}, {coord(x0), 0}, {coord(x0), coord(-c.Layer)}}
	return writeScene(name, prob, c.base([]any{
		seepFeature{"Feature", seepProps{Part: "region", Name: "soil", K: c.K}, geometry{Type: "Polygon", Rings: [][]point{ring}}},
		pileFrom("left wall", l, 0, -d, c.Thickness),
		pileFrom("right wall", r, 0, -d, c.Thickness),
		bed("left river bed", c.UpstreamHead, x0, l-h),
		bed("right river bed", c.UpstreamHead, r+h, x1),
		seepFeature{"Feature", seepProps{Part: "edge", Name: "excavation floor", Potential: potential(c.InsideHead)},
			geometry{Type: "LineString", Line: []point{{coord(l + h), coord(-c.Excavation)}, {coord(r - h), coord(-c.Excavation)}}}},
	}, x0, x1, -c.Layer))
}

// pileFrom is a wall from y0 down to y1 centred on x, of thickness t (0: a
// sheet).
func pileFrom(name string, x, y0, y1, t float64) seepFeature {
	if t == 0 {
		return seepFeature{"Feature", seepProps{Part: "body", Name: name}, geometry{Type: "LineString", Line: []point{{coord(x), coord(y0)}, {coord(x), coord(y1)}}}}
	}
	return structure(name, rect(x-t/2, y1, x+t/2, y0))
}
