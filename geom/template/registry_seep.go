package template

import "math"

// The seepage sections of rimfield new. Every one takes the coordinate
// unit (m by default), the heads, and the water's unit weight and the
// soil's critical gradient.

// seepParams are the parameters every seepage section takes.
func seepParams(s *Seep, up, down float64, downUsage string) []Param {
	s.Unit = DefaultSeepUnit
	return []Param{
		{"unit", "coordinate unit of the scene file and of the lengths below: m, cm, mm, um, km, in or ft", &s.Unit},
		number("upstream-head", &s.UpstreamHead, up, "total head on the upstream bed in metres: the water level above the bed (y = 0)"),
		number("downstream-head", &s.DownstreamHead, down, downUsage),
		number("unit-weight", &s.UnitWeight, 9.81, "unit weight of water in kN/m^3"),
		number("critical-gradient", &s.CriticalGradient, 1, "critical hydraulic gradient of the soil, (Gs - 1)/(1 + e): about 1 for sands"),
		{"impervious-base", "the bottom of the section is a real impervious stratum (rock, clay): drawn as an edge of zero flux that rimfield solve --truncation-check does not move; without it the bottom is a wall that may cut a deeper soil short", &s.ImperviousBase},
	}
}

func init() {
	register(Entry{
		Name:    "weir",
		Summary: "weir floor with upstream and downstream cutoffs on two soil layers (seepage)",
		About: `
A weir floor resting on the bed, with cutoffs flush with its upstream and
downstream ends, on two soil layers: the section checked for discharge,
uplift, exit gradient, piping and heave. The bed is y = 0; heads are total
heads in metres (water levels above the bed). The outer walls of the section
are impervious: keep --upstream and --downstream long (several times the
layers' depth) or check with rimfield solve --truncation-check. Lengths are
in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var w Weir
			ps := seepParams(&w.Seep, 4, 0, "total head on the downstream bed in metres (tailwater level above the bed)")
			ps = append(ps,
				length("width", &w.Width, 12, "width of the floor"),
				length("thickness", &w.Thickness, 1, "thickness of the floor above the bed"),
				length("upstream-cutoff", &w.UpstreamCutoff, 3, "depth of the upstream cutoff below the bed (0: none)"),
				length("downstream-cutoff", &w.DownstreamCutoff, 4, "depth of the downstream cutoff below the bed (0: none)"),
				length("cutoff-thickness", &w.CutoffThickness, 0.5, "thickness of the cutoffs"),
				length("layer1", &w.Layer1, 6, "thickness of the top soil layer"),
				number("k1", &w.K1, 1e-5, "hydraulic conductivity of the top layer in m/s"),
				length("layer2", &w.Layer2, 10, "thickness of the bottom soil layer (0: one layer)"),
				number("k2", &w.K2, 1e-4, "hydraulic conductivity of the bottom layer in m/s"),
				length("upstream", &w.Upstream, 50, "length of bed modelled upstream of the floor"),
				length("downstream", &w.Downstream, 50, "length of bed modelled downstream of the floor"),
			)
			return ps, func() ([]byte, error) { return w.Bytes() }
		},
	})
	register(Entry{
		Name:    "sheet-pile",
		Summary: "single sheet-pile wall in a soil layer (seepage: exit gradient and heave)",
		About: `
A sheet-pile wall driven into a soil layer with the upstream bed on its left
and the downstream bed on its right: the check of exit gradient, piping and
Terzaghi's heave beside a wall. --thickness 0 makes the pile a sheet of zero
thickness. The bed is y = 0; heads are total heads in metres. Lengths are in
--unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var s SheetPile
			ps := seepParams(&s.Seep, 5, 0, "total head on the downstream bed in metres")
			ps = append(ps,
				length("depth", &s.Depth, 6, "depth of the pile below the bed"),
				length("thickness", &s.Thickness, 0, "thickness of the pile (0: a sheet of zero thickness)"),
				length("layer", &s.Layer, 18, "thickness of the soil layer below the bed"),
				number("k", &s.K, 1e-5, "hydraulic conductivity of the soil in m/s"),
				length("upstream", &s.Upstream, 60, "length of bed modelled upstream of the pile"),
				length("downstream", &s.Downstream, 60, "length of bed modelled downstream of the pile"),
			)
			return ps, func() ([]byte, error) { return s.Bytes() }
		},
	})
	register(Entry{
		Name:    "cofferdam",
		Summary: "double-wall cofferdam with a dewatered excavation (seepage: exit gradient and heave)",
		About: `
Two sheet-pile walls --width apart in a river bed, the soil between them
excavated --excavation deep and kept dewatered, the walls reaching
--embedment below the excavation, in a soil layer of --layer below the bed.
The river stands at --upstream-head outside both walls; the excavation's
floor is held at --inside-head (default: its own level, -excavation). Water
enters through the river bed and leaves through the excavation's floor: the
check is the exit gradient and heave of the floor beside the walls.
--thickness 0 makes the walls sheets. Heads are total heads in metres above
the bed (y = 0). Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var c Cofferdam
			ps := seepParams(&c.Seep, 4, 0, "not used (the excavation's head is --inside-head)")
			// The downstream head is set from the inside head.
			ps = append(ps[:2], ps[3:]...)
			c.InsideHead = math.NaN()
			ps = append(ps,
				Param{"inside-head", "total head held in the excavation in metres (default: the excavation's floor, -excavation)", &c.InsideHead},
				length("width", &c.Width, 10, "distance between the walls"),
				length("excavation", &c.Excavation, 3, "depth of the excavation below the bed"),
				length("embedment", &c.Embedment, 4, "depth of the walls below the excavation's floor"),
				length("thickness", &c.Thickness, 0, "thickness of the walls (0: sheets of zero thickness)"),
				length("layer", &c.Layer, 20, "thickness of the soil layer below the bed"),
				number("k", &c.K, 1e-5, "hydraulic conductivity of the soil in m/s"),
				length("extent", &c.Extent, 60, "length of bed modelled outside each wall"),
			)
			return ps, func() ([]byte, error) { return c.Bytes() }
		},
	})
}
