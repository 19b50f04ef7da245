package geom

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"sort"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"
	"gonum.org/v1/gonum/spatial/r2"
)

// Write writes sc as a scene file (Contract 1) that Read reads back to the
// same scene, up to the rounding of the unit conversion: coordinates in
// sc.Problem.Unit, rings closed, features in the order of their Feature
// index, every setting written out (defaults included), one feature per
// line. It is meant for scenes made in code, such as starter templates.
//
// Write checks only what it needs to write: a known physics and unit,
// finite numbers and non-empty geometry. Read the result to validate it.
func Write(w io.Writer, sc *Scene) error {
	p := sc.Problem
	if p.Physics < Laplace || p.Physics > Flow {
		return fmt.Errorf("geom: write: the scene's physics is not set")
	}
	unit := p.Unit
	if unit == "" {
		unit = "m"
	}
	scale, ok := readUnits[unit]
	if !ok {
		return fmt.Errorf("geom: write: unknown unit %q; use one of %s", unit, readUnitList)
	}
	prob := map[string]any{"physics": p.Physics.String(), "unit": unit, "open": p.Open}
	switch p.Physics {
	case Electrostatic:
		eps := p.BackgroundPermittivity
		if eps == 0 {
			eps = p.Background.Kx / Eps0
		}
		if eps > 0 {
			prob["background_permittivity"] = eps
		}
		if p.Ground != nil {
			prob["ground"] = map[string]any{"y": p.Ground.Y / scale}
		}
	default:
		if p.Background.Kx > 0 {
			prob["background_k"] = p.Background.Kx
		}
	}
	if p.Physics == Seepage {
		if p.UnitWeightWater > 0 {
			prob["unit_weight_water"] = p.UnitWeightWater
		}
		if p.CriticalGradient > 0 {
			prob["critical_gradient"] = p.CriticalGradient
		}
	}
	if p.Physics == Flow {
		if p.Stream != nil {
			prob["stream"] = map[string]any{"speed": p.Stream.Speed, "angle_deg": p.Stream.AngleDeg}
		}
		if p.Chord > 0 {
			prob["chord"] = p.Chord / scale
		}
		if p.Density > 0 {
			prob["density"] = p.Density
		}
		if p.Ground != nil {
			prob["ground"] = map[string]any{"y": p.Ground.Y / scale}
		}
	}

	type entry struct {
		index int
		f     *geojson.Feature
	}
	var feats []entry
	add := func(index int, name string, g orb.Geometry, props geojson.Properties) error {
		if g == nil {
			return fmt.Errorf("geom: write: feature %d (%q) has no geometry", index, name)
		}
		f := geojson.NewFeature(g)
		f.Properties = props
		feats = append(feats, entry{index, f})
		return nil
	}
	pt := func(v r2.Vec) orb.Point { return orb.Point{v.X / scale, v.Y / scale} }
	polys := func(ps []Polygon) orb.Geometry {
		var mp orb.MultiPolygon
		for _, poly := range ps {
			var op orb.Polygon
			for _, ring := range poly {
				if len(ring) == 0 {
					continue
				}
				r := make(orb.Ring, 0, len(ring)+1)
				for _, v := range ring {
					r = append(r, pt(v))
				}
				op = append(op, append(r, r[0]))
			}
			if len(op) > 0 {
				mp = append(mp, op)
			}
		}
		switch len(mp) {
		case 0:
			return nil
		case 1:
			return mp[0]
		}
		return mp
	}
	lines := func(ls []Line) orb.Geometry {
		var ml orb.MultiLineString
		for _, l := range ls {
			if len(l) == 0 {
				continue
			}
			ol := make(orb.LineString, len(l))
			for i, v := range l {
				ol[i] = pt(v)
			}
			ml = append(ml, ol)
		}
		switch len(ml) {
		case 0:
			return nil
		case 1:
			return ml[0]
		}
		return ml
	}
	cond := func(props geojson.Properties, c Condition, part Part) {
		switch c.Kind {
		case Potential:
			props["potential"] = c.Value
		case Flux:
			if c != Insulated || part == PartEdge {
				props["flux"] = c.Value
			}
		case Floating:
			props["floating"] = true
			if c.NetInflow != 0 {
				props["net_inflow"] = c.NetInflow
			}
		}
	}
	for _, b := range sc.Bodies {
		props := geojson.Properties{"part": "body", "name": b.Name}
		if p.Physics != Flow {
			cond(props, b.Cond, PartBody)
		}
		if b.Kutta != nil {
			if b.Kutta.Auto {
				props["kutta"] = true
			} else {
				q := pt(b.Kutta.Point)
				props["kutta"] = []float64{q[0], q[1]}
			}
		}
		g := polys(b.Polygons)
		if b.Sheet() {
			g = lines(b.Lines)
		}
		if err := add(b.Feature, b.Name, g, props); err != nil {
			return err
		}
	}
	for _, r := range sc.Regions {
		props := geojson.Properties{"part": "region", "name": r.Name}
		m := r.Material
		switch {
		case p.Physics == Electrostatic:
			eps := r.Permittivity
			if eps == 0 {
				eps = m.Kx / Eps0
			}
			props["permittivity"] = eps
			if r.BreakdownField > 0 {
				props["breakdown_field"] = r.BreakdownField
			}
		case m.Isotropic():
			props["k"] = m.Kx
		default:
			props["kx"], props["ky"] = m.Kx, m.Ky
		}
		if err := add(r.Feature, r.Name, polys(r.Polygons), props); err != nil {
			return err
		}
	}
	for _, e := range sc.Edges {
		props := geojson.Properties{"part": "edge", "name": e.Name}
		cond(props, e.Cond, PartEdge)
		if err := add(e.Feature, e.Name, lines(e.Lines), props); err != nil {
			return err
		}
	}
	sort.SliceStable(feats, func(i, j int) bool { return feats[i].index < feats[j].index })

	bw := bufio.NewWriter(w)
	head, err := json.Marshal(prob)
	if err != nil {
		return fmt.Errorf("geom: write: problem: %w", err)
	}
	fmt.Fprintf(bw, "{\"type\": \"FeatureCollection\",\n \"problem\": %s,\n \"features\": [", head)
	for i, e := range feats {
		line, err := json.Marshal(e.f)
		if err != nil {
			return fmt.Errorf("geom: write: feature %d: %w", e.index, err)
		}
		if i > 0 {
			bw.WriteString(",")
		}
		bw.WriteString("\n  ")
		bw.Write(line)
	}
	bw.WriteString("\n ]}\n")
	return bw.Flush()
}
