package main

import (
	"math"
	"sort"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/electro"
	"github.com/rimfield/rimfield/geom"
)

func init() {
	chartHooks[geom.Electrostatic] = electroCharts
}

// electroCharts adds to boundary.png the field strength at the surface of
// every conductor (fixed or floating potential) against the arc length along
// it: where the field peaks along each conductor, and how sharply.
func electroCharts(j *job) ([]*draw.Chart, error) {
	if j.sol == nil {
		return nil, nil
	}
	f := electro.PanelFields(j.sol)
	m := j.mesh
	byOwner := make([][]int, len(m.Layout.Owners))
	for i, p := range m.Panels {
		if p.Owner < 0 || p.Interface() {
			continue
		}
		if k := p.Cond.Kind; k == geom.Potential || k == geom.Floating {
			byOwner[p.Owner] = append(byOwner[p.Owner], i)
		}
	}
	var series []draw.Series
	for o, idx := range byOwner {
		if len(idx) == 0 {
			continue
		}
		sort.SliceStable(idx, func(a, b int) bool { return m.Panels[idx[a]].S < m.Panels[idx[b]].S })
		s := draw.Series{Name: m.Layout.Owners[o].Name}
		for k, i := range idx {
			p := m.Panels[i]
			if k > 0 {
				q := m.Panels[idx[k-1]]
				if p.S-q.S > 0.75*(p.Length()+q.Length()) { // a gap between pieces: break the line
					s.X, s.Y = append(s.X, math.NaN()), append(s.Y, math.NaN())
				}
			}
			s.X = append(s.X, p.S)
			s.Y = append(s.Y, f.Magnitude(i, p.Left))
		}
		series = append(series, s)
	}
	if len(series) == 0 {
		return nil, nil
	}
	xLabel, xScale := arcLengthAxis(j.scene, series)
	for k := range series {
		for i := range series[k].X {
			series[k].X[i] /= xScale
		}
	}
	return []*draw.Chart{{
		Title:  "Field strength at the conductors' surfaces (infinite in theory at sharp corners)",
		XLabel: xLabel, YLabel: "field strength |E|", YUnit: "V/m", Series: series, Clip: 0.98,
	}}, nil
}
