package draw

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"

	"github.com/rimfield/rimfield/bem"
	"gonum.org/v1/plot"
	pfont "gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	vgdraw "gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Series is one named curve of a chart: Y against X. A NaN in X or Y
// breaks the curve (a boundary made of separate pieces).
type Series struct {
	Name string
	X, Y []float64
}

// Chart is a line chart of named series. Physics adapters add their own
// series (pore pressure, surface field, speed) next to the standard ones.
type Chart struct {
	Title          string
	XLabel, YLabel string
	// XUnit and YUnit, when set, are the SI units of the values: the axis
	// then shows them in the display unit that suits its range
	// (DisplayFor: 5e-6 C/m^2 as 5 µC/m²) and its label ends with that
	// unit in parentheses. Empty: the values as they are, the label as
	// given.
	XUnit, YUnit string
	Series       []Series
	// Clip, in (0.5, 1), limits the y axis to the range between the
	// 1-Clip and Clip quantiles of all values (widened by a tenth), so that
	// a few peaks at singular corners do not flatten the rest; the title
	// then says so. 0 shows every value.
	Clip float64
}

// Charts is a column of charts drawn one above the other in one picture,
// with their left edges aligned and the legends in a column at their
// right, outside the plots.
type Charts []*Chart

// series colours: the colour-blind-safe qualitative palette of Okabe & Ito,
// "Color Universal Design", 2008 (from memory), without its yellow, which
// does not show on white; past seven series the dash pattern changes.
var seriesColours = []color.RGBA{
	{0, 114, 178, 255},   // blue
	{213, 94, 0, 255},    // vermillion
	{0, 158, 115, 255},   // bluish green
	{204, 121, 167, 255}, // reddish purple
	{230, 159, 0, 255},   // orange
	{86, 180, 233, 255},  // sky blue
	{0, 0, 0, 255},       // black
}

var seriesDashes = [][]vg.Length{nil, {vg.Points(6), vg.Points(3)}, {vg.Points(2), vg.Points(2)}}

func sans(size float64) pfont.Font {
	f := sansSerif
	f.Size = vg.Length(size)
	return f
}

// dataRange returns the smallest and largest finite x and y of the series.
func (c *Chart) dataRange() (x0, x1, y0, y1 float64, ok bool) {
	x0, y0 = math.Inf(1), math.Inf(1)
	x1, y1 = math.Inf(-1), math.Inf(-1)
	for _, s := range c.Series {
		for _, pc := range pieces(s) {
			for _, p := range pc {
				x0, x1 = math.Min(x0, p.X), math.Max(x1, p.X)
				y0, y1 = math.Min(y0, p.Y), math.Max(y1, p.Y)
				ok = true
			}
		}
	}
	return x0, x1, y0, y1, ok
}

// plot builds the gonum plot of one chart, without a legend, and the
// legend to draw beside it.
func (c *Chart) plot(fontSize float64) (*plot.Plot, *plot.Legend, error) {
	for _, s := range c.Series {
		if len(s.X) != len(s.Y) {
			return nil, nil, fmt.Errorf("draw: series %q has %d x and %d y values", s.Name, len(s.X), len(s.Y))
		}
	}
	p := plot.New()
	p.Title.Text = c.Title
	p.Title.TextStyle.Font = sans(fontSize * 1.15)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font = sans(fontSize)
		a.Tick.Label.Font = sans(fontSize * 0.85)
	}
	p.X.Tick.Marker = niceTicker{n: 8}
	p.Y.Tick.Marker = niceTicker{n: 8}
	leg := plot.NewLegend()
	leg.TextStyle.Font = sans(fontSize * 0.9)
	leg.Top, leg.Left = true, true
	leg.ThumbnailWidth = vg.Length(fontSize * 2)
	leg.Padding = vg.Length(fontSize * 0.4) // room for descenders between the entries

	// The axes' ranges in SI, then the display units that suit them.
	x0, x1, y0, y1, ok := c.dataRange()
	if !ok {
		x0, x1, y0, y1 = 0, 1, 0, 1
	}
	clipped := false
	if lo, hi, ok := c.clipRange(); ok {
		y0, y1, clipped = lo, hi, true
	} else {
		// Some room above and below, so that a flat curve at the top or
		// the bottom does not merge with the frame.
		pad := 0.04 * (y1 - y0)
		if !(pad > 0) {
			pad = math.Abs(y0) * 0.1
		}
		if !(pad > 0) {
			pad = 1 // every value 0
		}
		y0, y1 = y0-pad, y1+pad
	}
	if x0 >= 0 && x0 < 0.05*(x1-x0) {
		x0 = 0 // arc lengths and the like start at 0
	}
	xd, yd := Display{Div: 1}, Display{Div: 1}
	p.X.Label.Text, p.Y.Label.Text = c.XLabel, c.YLabel
	if c.XUnit != "" {
		xd = DisplayFor(c.XUnit, math.Max(math.Abs(x0), math.Abs(x1)))
		p.X.Label.Text = xd.Label(c.XLabel)
	}
	if c.YUnit != "" {
		yd = DisplayFor(c.YUnit, math.Max(math.Abs(y0), math.Abs(y1)))
		p.Y.Label.Text = yd.Label(c.YLabel)
	}
	p.X.Min, p.X.Max = x0/xd.Div, x1/xd.Div
	p.Y.Min, p.Y.Max = y0/yd.Div, y1/yd.Div

	p.Add(plotter.NewGrid())
	for k, s := range c.Series {
		col := seriesColours[k%len(seriesColours)]
		dash := seriesDashes[(k/len(seriesColours))%len(seriesDashes)]
		first := true
		for _, piece := range pieces(s) {
			for i := range piece {
				piece[i].X /= xd.Div
				piece[i].Y /= yd.Div
			}
			l, err := plotter.NewLine(piece)
			if err != nil {
				return nil, nil, fmt.Errorf("draw: series %q: %v", s.Name, err)
			}
			l.Color = col
			l.Width = vg.Points(math.Max(1, fontSize/8))
			l.Dashes = dash
			p.Add(l)
			if first && s.Name != "" {
				leg.Add(s.Name, l)
				first = false
			}
		}
	}
	// Adding a plotter widens the axes to its data: set the ranges again.
	p.X.Min, p.X.Max = x0/xd.Div, x1/xd.Div
	p.Y.Min, p.Y.Max = y0/yd.Div, y1/yd.Div
	if clipped {
		p.Title.Text += fmt.Sprintf(" (axis cut at the %g%% and %g%% quantiles)", math.Round(1000*(1-c.Clip))/10, math.Round(1000*c.Clip)/10)
	}
	return p, &leg, nil
}

// clipRange returns the clipped y range, if clipping applies and cuts
// anything. Quantiles are weighted by the x spacing of the points, so that
// points crowded toward a corner (graded panels) count for the length they
// cover, not their number.
func (c *Chart) clipRange() (lo, hi float64, ok bool) {
	if !(c.Clip > 0.5 && c.Clip < 1) {
		return 0, 0, false
	}
	type wv struct{ v, w float64 }
	var all []wv
	total := 0.0
	for _, s := range c.Series {
		for _, pc := range pieces(s) {
			for i := range pc {
				w := 0.0
				if i > 0 {
					w += 0.5 * math.Abs(pc[i].X-pc[i-1].X)
				}
				if i+1 < len(pc) {
					w += 0.5 * math.Abs(pc[i+1].X-pc[i].X)
				}
				all = append(all, wv{pc[i].Y, w})
				total += w
			}
		}
	}
	if len(all) < 2 || !(total > 0) {
		return 0, 0, false
	}
	sort.Slice(all, func(i, j int) bool { return all[i].v < all[j].v })
	quantile := func(q float64) float64 {
		acc := 0.0
		for _, x := range all {
			acc += x.w
			if acc >= q*total {
				return x.v
			}
		}
		return all[len(all)-1].v
	}
	lo, hi = quantile(1-c.Clip), quantile(c.Clip)
	pad := 0.1 * (hi - lo)
	if !(pad > 0) {
		return 0, 0, false
	}
	lo, hi = lo-pad, hi+pad
	min, max := all[0].v, all[len(all)-1].v
	if lo <= min && hi >= max {
		return 0, 0, false
	}
	return math.Max(lo, min), math.Min(hi, max), true
}

// pieces splits a series at its NaN values (a single point becomes a
// vanishing segment so that it still shows).
func pieces(s Series) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	flush := func() {
		if len(cur) == 1 {
			cur = append(cur, cur[0])
		}
		if len(cur) > 0 {
			out = append(out, cur)
		}
		cur = nil
	}
	for i := range s.X {
		x, y := s.X[i], s.Y[i]
		if math.IsNaN(x) || math.IsNaN(y) || math.IsInf(x, 0) || math.IsInf(y, 0) {
			flush()
			continue
		}
		cur = append(cur, plotter.XY{X: x, Y: y})
	}
	flush()
	return out
}

// PNG draws the chart as a PNG image of width x height pixels.
func (c *Chart) PNG(w io.Writer, width, height int) error { return Charts{c}.PNG(w, width, height) }

// SVG draws the chart as an SVG document of width x height points.
func (c *Chart) SVG(w io.Writer, width, height int) error { return Charts{c}.SVG(w, width, height) }

func (cs Charts) draw(dc vgdraw.Canvas, width, height int) error {
	if len(cs) == 0 {
		return fmt.Errorf("draw: no charts to draw")
	}
	fs := clamp(math.Min(float64(width), float64(height)/float64(len(cs)))/40, 9, 18)
	plots := make([][]*plot.Plot, len(cs))
	legends := make([]*plot.Legend, len(cs))
	// The legends go in a column at the right, outside the plots, so that
	// they never hide a curve: as wide as the longest name.
	face := pfont.DefaultCache.Lookup(sans(fs*0.9), vg.Length(fs*0.9))
	legendW := 0.0
	for i, c := range cs {
		p, leg, err := c.plot(fs)
		if err != nil {
			return err
		}
		plots[i] = []*plot.Plot{p}
		legends[i] = leg
		for _, s := range c.Series {
			legendW = math.Max(legendW, face.Width(s.Name).Points())
		}
	}
	if legendW > 0 {
		legendW += fs * 3.5 // thumbnail and gaps
	}
	legendW = math.Min(legendW, 0.3*float64(width))
	pad := vg.Length(fs)
	t := vgdraw.Tiles{Rows: len(cs), Cols: 1, PadTop: pad, PadBottom: pad, PadLeft: pad, PadRight: pad * 1.5, PadY: pad * 1.5}
	plotArea := vgdraw.Crop(dc, 0, -vg.Length(legendW), 0, 0)
	canvases := plot.Align(plots, t, plotArea)
	for i := range plots {
		p := plots[i][0]
		p.Draw(canvases[i][0])
		if legendW == 0 {
			continue
		}
		// Beside the plot's data area, top-aligned with it.
		da := p.DataCanvas(canvases[i][0])
		lc := vgdraw.Canvas{Canvas: dc.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: dc.Max.X - vg.Length(legendW) + pad*0.2, Y: da.Min.Y},
			Max: vg.Point{X: dc.Max.X - pad*0.5, Y: da.Max.Y},
		}}
		legends[i].Draw(lc)
	}
	return nil
}

// PNG draws the charts as a PNG image of width x height pixels.
func (cs Charts) PNG(w io.Writer, width, height int) error {
	if width < minSide || height < minSide {
		return fmt.Errorf("draw: picture size %d x %d is too small; give at least %d x %d", width, height, minSide, minSide)
	}
	c := vgimg.NewWith(vgimg.UseWH(vg.Length(width), vg.Length(height)), vgimg.UseDPI(72))
	if err := cs.draw(vgdraw.New(c), width, height); err != nil {
		return err
	}
	return encodePNG(w, c.Image())
}

// SVG draws the charts as an SVG document of width x height points.
func (cs Charts) SVG(w io.Writer, width, height int) error {
	if width < minSide || height < minSide {
		return fmt.Errorf("draw: picture size %d x %d is too small; give at least %d x %d", width, height, minSide, minSide)
	}
	c := vgsvg.New(vg.Length(width), vg.Length(height))
	if err := cs.draw(vgdraw.New(c), width, height); err != nil {
		return err
	}
	_, err := c.WriteTo(w)
	return err
}

// BoundarySeries returns, for every body and edge of the solution, its
// potential and its inflow density (k du/dn, flux entering the domain
// positive) at each panel's midpoint against the arc length along it
// (mesh.Panel.S), in Layout.Owners order. Where the arc length jumps
// between consecutive panels (separate rings or lines) the curves break.
// Interfaces and walls without an owner are left out.
func BoundarySeries(sol *bem.Solution) (potential, inflow []Series) {
	m := sol.Mesh
	byOwner := make([][]int, len(m.Layout.Owners))
	for j, p := range m.Panels {
		if p.Owner >= 0 && !p.Interface() {
			byOwner[p.Owner] = append(byOwner[p.Owner], j)
		}
	}
	for o, idx := range byOwner {
		if len(idx) == 0 {
			continue
		}
		sort.SliceStable(idx, func(a, b int) bool { return m.Panels[idx[a]].S < m.Panels[idx[b]].S })
		name := m.Layout.Owners[o].Name
		ps := Series{Name: name}
		fs := Series{Name: name}
		for k, j := range idx {
			p := m.Panels[j]
			if k > 0 {
				q := m.Panels[idx[k-1]]
				if p.S-q.S > 0.75*(p.Length()+q.Length()) {
					ps.X, ps.Y = append(ps.X, math.NaN()), append(ps.Y, math.NaN())
					fs.X, fs.Y = append(fs.X, math.NaN()), append(fs.Y, math.NaN())
				}
			}
			ps.X, ps.Y = append(ps.X, p.S), append(ps.Y, sol.U[j])
			fs.X, fs.Y = append(fs.X, p.S), append(fs.Y, sol.F[j])
		}
		potential = append(potential, ps)
		inflow = append(inflow, fs)
	}
	return potential, inflow
}
