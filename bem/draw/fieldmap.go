package draw

import (
	"fmt"
	"image"
	"image/color"
	"io"
	"math"
	"sort"
	"strings"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"gonum.org/v1/gonum/spatial/r2"
)

// Map is a picture of a scalar field over the scene: the field in colour
// with a colour bar, equipotentials and flux lines over it, the bodies
// filled and named, the regions outlined and named where the name fits
// inside, the edges marked, axes and a scale bar in the scene's unit and a
// title.
type Map struct {
	// Grid gives the sample positions and Values one value per sample
	// (Grid.U for the potential, Grid.Magnitude() for the field strength);
	// NaN samples are not coloured.
	Grid   *grid.Grid
	Values []float64
	// Lo and Hi are the values at the ends of the colour map. When Hi <= Lo
	// they come from Values: the smallest value, and the Clip quantile of
	// the values (the largest when Clip is 0 or 1). Values beyond the ends
	// take the end colours; the colour bar then shows an arrow.
	Lo, Hi float64
	Clip   float64
	// FromZero starts the automatic colour range at 0 (for magnitudes).
	FromZero bool
	// Label names the quantity beside the colour bar: "potential". With
	// Unit empty it should carry its unit too: "potential (V)".
	Label string
	// Unit, when set, is the SI unit of Values: the colour bar then shows
	// them in the display unit that suits their range (DisplayFor: kV for
	// thousands of volts, kV/mm for strong fields) and the label ends with
	// it in parentheses.
	Unit string
	// Title is the first line, the headline result; Subtitle smaller lines
	// below it: "\n" starts a new line, and a line too long for the
	// picture is broken in two (three lines at most).
	Title, Subtitle string
	// Contours and Lines (flux lines) are drawn over the field, in metres.
	// The colour bar marks the contours' levels unless OtherContours says
	// that they are of another quantity (a flow's streamlines over its
	// speed).
	Contours      []geom.LevelLine
	OtherContours bool
	Lines         [][]r2.Vec
	// Marker, when not nil, circles a point and names it; Marks are more
	// points marked the same way (stagnation points, exit points).
	Marker *Marker
	Marks  []Marker
	// PlainLines draws the Lines without arrowheads: lines whose direction
	// means nothing (the equipotentials of a flow drawn over its stream
	// function).
	PlainLines bool
	// Overlays are lines of the physics drawn over everything (the water
	// levels of a seepage section above its beds), each named.
	Overlays []Overlay
	// Scene gives the bodies, regions and edges to draw (the scene's
	// medium, its only region or the one that holds all the others, is not
	// named), the coordinate
	// unit for the axes and the scale bar (Problem.Unit, Problem.Scale) and
	// whether the domain is open. Nil draws the field alone, in metres.
	Scene *geom.Scene
	// Ground labels the grounded plane of Scene, in the words of its
	// physics ("ground plane (0 V)"); "" means "ground plane".
	Ground string
	// Colors is the colour map; nil means Sequential.
	Colors Colormap
}

// Overlay is a named line to draw over a map, in metres: a water level
// (drawn in blue with the surveyor's triangle at its middle).
type Overlay struct {
	Points []r2.Vec
	Label  string
}

// Marker is a point to show on a map.
type Marker struct {
	At   r2.Vec // metres
	Text string
}

// PNG draws the map as a PNG image of width x height pixels.
func (m *Map) PNG(w io.Writer, width, height int) error {
	if err := m.check(width, height); err != nil {
		return err
	}
	c, err := newRaster(width, height)
	if err != nil {
		return err
	}
	m.draw(c, float64(width), float64(height))
	return c.writePNG(w)
}

// SVG draws the map as an SVG document of width x height points; the field
// itself is embedded as an image.
func (m *Map) SVG(w io.Writer, width, height int) error {
	if err := m.check(width, height); err != nil {
		return err
	}
	c := newVector(width, height)
	m.draw(c, float64(width), float64(height))
	return c.writeSVG(w)
}

// Smallest picture Map draws.
const minSide = 200

func (m *Map) check(width, height int) error {
	if width < minSide || height < minSide {
		return fmt.Errorf("draw: picture size %d x %d is too small; give at least %d x %d", width, height, minSide, minSide)
	}
	if m.Grid == nil || m.Grid.NX < 2 || m.Grid.NY < 2 || len(m.Values) != m.Grid.NX*m.Grid.NY || m.Grid.Window.Empty() {
		return fmt.Errorf("draw: the map needs a grid of at least 2 x 2 samples over a window with area, and one value per sample")
	}
	return nil
}

// Colours of the picture's furniture.
var (
	black     = color.RGBA{0, 0, 0, 255}
	white     = color.RGBA{255, 255, 255, 255}
	ink       = color.RGBA{40, 40, 40, 255}
	greyText  = color.RGBA{90, 90, 90, 255}
	bodyFill  = color.RGBA{168, 168, 168, 255}
	bodyEdge  = color.RGBA{55, 55, 55, 255}
	groundCol = color.RGBA{215, 215, 215, 255}
	contour   = color.NRGBA{20, 20, 20, 160}
	fluxLine  = color.NRGBA{255, 255, 255, 225}
	edgeCol   = color.RGBA{0, 0, 0, 255}
	halo      = color.NRGBA{255, 255, 255, 210}
	boxFill   = color.NRGBA{255, 255, 255, 215}
)

// frame maps world coordinates (metres) to pixels.
type frame struct {
	x0, y0, pw, ph float64 // plot rectangle in pixels
	win            grid.Window
	s              float64 // pixels per metre
}

func (f frame) px(p r2.Vec) r2.Vec {
	return r2.Vec{X: f.x0 + (p.X-f.win.Min.X)*f.s, Y: f.y0 + (f.win.Max.Y-p.Y)*f.s}
}

func (f frame) world(x, y float64) r2.Vec {
	return r2.Vec{X: f.win.Min.X + (x-f.x0)/f.s, Y: f.win.Max.Y - (y-f.y0)/f.s}
}

func (f frame) pxs(pts []r2.Vec) []r2.Vec {
	out := make([]r2.Vec, len(pts))
	for i, p := range pts {
		out[i] = f.px(p)
	}
	return out
}

// style holds the sizes of one picture, scaled with its size.
type style struct {
	font, small, title, line float64
}

func (m *Map) draw(c canvas, W, H float64) {
	u := math.Min(W, H)
	st := style{font: clamp(math.Sqrt(W*H)/60, 11, 22)}
	st.small = 0.85 * st.font
	st.title = 1.3 * st.font
	st.line = math.Max(1, u/700)

	lo, hi, over, under := m.colourRange()
	disp, label := Display{Div: 1}, m.Label
	if m.Unit != "" {
		disp = DisplayFor(m.Unit, math.Max(math.Abs(lo), math.Abs(hi)))
		label = disp.Label(m.Label)
	}
	unit, scale := "m", 1.0
	if m.Scene != nil && m.Scene.Problem.Scale > 0 {
		scale = m.Scene.Problem.Scale
		if m.Scene.Problem.Unit != "" {
			unit = m.Scene.Problem.Unit
		}
	}

	// Layout: title on top, axes left and bottom, colour bar right. The
	// subtitle's lines are broken to fit the width from the plot's left
	// edge, which moves with their number: lay out twice.
	left := st.font * 5.5
	bottom := st.font * 4
	barW := st.font * 1.2
	right := st.font*1.2 + barW + st.font*0.6 + maxLabelWidth(c, lo/disp.Div, hi/disp.Div, st.small) + st.font*2.4
	win := m.Grid.Window
	size := win.Size()
	layout := func(lines int) (f frame, top, shift float64) {
		top = 1.0*st.font + st.title*1.6 + float64(lines)*st.font*1.5
		aw, ah := W-left-right, H-top-bottom
		s := math.Min(aw/size.X, ah/size.Y)
		f = frame{pw: size.X * s, ph: size.Y * s, win: win, s: s}
		f.x0 = left + (aw-f.pw)/2
		shift = (ah - f.ph) / 2 // centre title and plot together
		f.y0 = top + shift
		return f, top, shift
	}
	sub := subtitleLines(c, m.Subtitle, st.font, W-left-st.font*0.5)
	f, _, shift := layout(len(sub))
	if again := subtitleLines(c, m.Subtitle, st.font, W-f.x0-st.font*0.5); len(again) == len(sub) {
		sub = again
	}

	m.drawField(c, f, lo, hi)
	geo := m.sceneIn(f.win)
	m.drawScene(c, f, st, geo)
	for _, l := range m.Contours {
		for _, piece := range clipLine(l.Points, f.win) {
			c.stroke(contour, st.line, nil, false, f.pxs(piece))
		}
	}
	var placed []box // what labels must not cover: arrowheads, the marker
	for _, l := range m.Lines {
		for _, piece := range clipLine(l, f.win) {
			if m.PlainLines {
				if len(piece) > 1 {
					c.stroke(fluxLine, 1.3*st.line, nil, false, f.pxs(piece))
				}
				continue
			}
			if b, ok := drawFluxLine(c, f, piece, st); ok {
				placed = append(placed, b)
			}
		}
	}
	if m.Marker != nil {
		placed = append(placed, drawMarker(c, f, *m.Marker, st, placed)...)
	}
	for _, mk := range m.Marks {
		if f.win.Contains(mk.At) {
			placed = append(placed, drawMarker(c, f, mk, st, placed)...)
		}
	}
	for _, ov := range m.Overlays {
		placed = append(placed, drawOverlay(c, f, ov, st, placed)...)
	}
	m.drawLabels(c, f, st, geo, placed)
	drawAxes(c, f, st, unit, scale)
	drawScaleBar(c, f, st, unit, scale)
	var levels []float64
	for _, l := range m.Contours {
		if !m.OtherContours {
			levels = append(levels, l.Level)
		}
	}
	drawColourBar(c, m.colors(), f.x0+f.pw+st.font*1.2, f.y0, barW, f.ph, lo, hi, disp.Div, over, under, levels, label, st)

	// Title and subtitle, left-aligned with the plot; all of them from the
	// picture's left edge when one would not fit otherwise, and shrunk to
	// fit the picture's width if they must.
	y := shift + st.font*0.8 + st.title
	x := f.x0
	fitsFrom := func(s string, size float64) bool { w, _ := c.measure(s, size); return x+w <= W-st.font*0.5 }
	ok := fitsFrom(m.Title, st.title)
	for _, l := range sub {
		ok = ok && fitsFrom(l, st.font)
	}
	if !ok {
		x = st.font * 0.5
	}
	line := func(s string, y, size float64, col color.Color) {
		c.text(s, x, y, fitSize(c, s, size, W-x-st.font*0.5), col, 0, 0, 0)
	}
	line(m.Title, y, st.title, black)
	for i, l := range sub {
		line(l, y+st.font*1.5*float64(i+1), st.font, greyText)
	}
}

// subtitleLines breaks a subtitle into lines that fit into width: each of
// its "\n"-separated paragraphs into at most two, three lines in all (the
// last one shrinks to fit when it must).
func subtitleLines(c canvas, s string, size, width float64) []string {
	var out []string
	for _, para := range strings.Split(s, "\n") {
		out = append(out, wrapText(c, para, size, width, 2)...)
	}
	if len(out) > 3 {
		out = append(out[:2], strings.Join(out[2:], " "))
	}
	return out
}

// wrapText breaks s at spaces into at most n lines that fit into width at
// the given size (the last line takes the rest); nil for an empty s.
func wrapText(c canvas, s string, size, width float64, n int) []string {
	if s == "" {
		return nil
	}
	if w, _ := c.measure(s, size); w <= width || n < 2 {
		return []string{s}
	}
	words := strings.Fields(s)
	var lines []string
	cur := ""
	for i, wd := range words {
		try := wd
		if cur != "" {
			try = cur + " " + wd
		}
		if w, _ := c.measure(try, size); w <= width || cur == "" {
			cur = try
			continue
		}
		lines = append(lines, cur)
		if len(lines) == n-1 {
			cur = strings.Join(words[i:], " ")
			break
		}
		cur = wd
	}
	return append(lines, cur)
}

// fitSize returns the font size, at most size and at least 6, at which s
// fits into width.
func fitSize(c canvas, s string, size, width float64) float64 {
	w, _ := c.measure(s, size)
	if w <= width || w == 0 {
		return size
	}
	return math.Max(6, size*width/w)
}

func clamp(x, lo, hi float64) float64 { return math.Min(hi, math.Max(lo, x)) }

func (m *Map) colors() Colormap {
	if m.Colors != nil {
		return m.Colors
	}
	return Sequential
}

// colourRange returns the ends of the colour map and whether values rise
// above the top end or fall below the bottom end.
func (m *Map) colourRange() (lo, hi float64, over, under bool) {
	var fin []float64
	for _, v := range m.Values {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			fin = append(fin, v)
		}
	}
	lo, hi = m.Lo, m.Hi
	if !(hi > lo) {
		if len(fin) == 0 {
			return 0, 1, false, false
		}
		sort.Float64s(fin)
		lo, hi = fin[0], fin[len(fin)-1]
		if m.FromZero {
			lo = math.Min(lo, 0)
		}
		if m.Clip > 0 && m.Clip < 1 {
			hi = fin[int(m.Clip*float64(len(fin)-1))]
		}
		if !(hi > lo) {
			hi = lo + math.Max(1, math.Abs(lo))*1e-6
		}
	}
	tol := 1e-12 * (hi - lo)
	for _, v := range fin {
		over = over || v > hi+tol
		under = under || v < lo-tol
	}
	return lo, hi, over, under
}

// drawField colours every pixel of the plot from the bilinear interpolant
// of the samples (finite corners only, their weights renormalised, so that
// colour reaches the edge of the domain; bodies are drawn over it).
func (m *Map) drawField(c canvas, f frame, lo, hi float64) {
	g := m.Grid
	// Whole pixels: the raster lands on the picture's own pixels, a copy
	// rather than a resampling.
	x0, y0 := math.Round(f.x0), math.Round(f.y0)
	w, h := int(math.Round(f.x0+f.pw)-x0), int(math.Round(f.y0+f.ph)-y0)
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	cm := m.colors()
	hs := g.Spacing()
	for py := range h {
		for px := range w {
			p := f.world(x0+float64(px)+0.5, y0+float64(py)+0.5)
			v := interpolate(g, m.Values, hs, p)
			if math.IsNaN(v) {
				continue
			}
			img.SetRGBA(px, py, cm.At((v-lo)/(hi-lo)))
		}
	}
	c.image(img, x0, y0, float64(w), float64(h))
}

func interpolate(g *grid.Grid, vals []float64, hs r2.Vec, p r2.Vec) float64 {
	fx := (p.X - g.Window.Min.X) / hs.X
	fy := (p.Y - g.Window.Min.Y) / hs.Y
	i := min(max(int(math.Floor(fx)), 0), g.NX-2)
	j := min(max(int(math.Floor(fy)), 0), g.NY-2)
	tx := clamp(fx-float64(i), 0, 1)
	ty := clamp(fy-float64(j), 0, 1)
	sum, wsum := 0.0, 0.0
	for _, c := range [4]struct {
		di, dj int
		w      float64
	}{{0, 0, (1 - tx) * (1 - ty)}, {1, 0, tx * (1 - ty)}, {0, 1, (1 - tx) * ty}, {1, 1, tx * ty}} {
		v := vals[g.Index(i+c.di, j+c.dj)]
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		sum += c.w * v
		wsum += c.w
	}
	if wsum < 1e-6 {
		// All weight on masked corners: use any finite corner.
		for _, k := range [4]int{g.Index(i, j), g.Index(i+1, j), g.Index(i, j+1), g.Index(i+1, j+1)} {
			if v := vals[k]; !math.IsNaN(v) && !math.IsInf(v, 0) {
				return v
			}
		}
		return math.NaN()
	}
	return sum / wsum
}

// oriented returns the ring running anticlockwise (ccw true) or clockwise
// in the plane (y up).
func oriented(r geom.Ring, ccw bool) []r2.Vec {
	a := 0.0
	for i := range r {
		p, q := r[i], r[(i+1)%len(r)]
		a += p.X*q.Y - q.X*p.Y
	}
	out := append([]r2.Vec(nil), r...)
	if (a > 0) != ccw {
		for i, j := 0, len(out)-1; i < j; i, j = i+1, j-1 {
			out[i], out[j] = out[j], out[i]
		}
	}
	return out
}

// polygonRings returns a polygon's rings in pixels, outer ring
// anticlockwise and holes clockwise in the plane, so that the non-zero rule
// leaves the holes empty.
func polygonRings(f frame, pg geom.Polygon) [][]r2.Vec {
	var out [][]r2.Vec
	for k, r := range pg {
		out = append(out, f.pxs(oriented(r, k == 0)))
	}
	return out
}

// named is a body or an edge clipped to the window.
type named struct {
	name     string
	polygons []geom.Polygon // bodies
	lines    [][]r2.Vec     // edges
}

// clippedScene is the scene's geometry within the window.
type clippedScene struct {
	regions []geom.Polygon
	named   []named // the regions to name: all but the background
	bodies  []named
	edges   []named
	sheets  []named // bodies drawn as lines (sheets of zero thickness)
}

// sceneIn clips the scene's regions, bodies and edges to the window, so
// that nothing is drawn outside the plot.
func (m *Map) sceneIn(w grid.Window) clippedScene {
	var out clippedScene
	if m.Scene == nil {
		return out
	}
	for k, rg := range m.Scene.Regions {
		nr := named{name: rg.Name}
		for _, pg := range rg.Polygons {
			if c := clipPolygon(pg, w); c != nil {
				out.regions = append(out.regions, c)
				nr.polygons = append(nr.polygons, c)
			}
		}
		if len(nr.polygons) > 0 && rg.Name != "" && !m.background(k) {
			out.named = append(out.named, nr)
		}
	}
	for _, b := range m.Scene.Bodies {
		nb := named{name: b.Name}
		for _, pg := range b.Polygons {
			if c := clipPolygon(pg, w); c != nil {
				nb.polygons = append(nb.polygons, c)
			}
		}
		if len(nb.polygons) > 0 {
			out.bodies = append(out.bodies, nb)
		}
		if b.Sheet() {
			for _, l := range b.Lines {
				nb.lines = append(nb.lines, clipLine(l, w)...)
			}
			if len(nb.lines) > 0 {
				out.sheets = append(out.sheets, nb)
			}
		}
	}
	for _, e := range m.Scene.Edges {
		ne := named{name: e.Name}
		for _, l := range e.Lines {
			ne.lines = append(ne.lines, clipLine(l, w)...)
		}
		if len(ne.lines) > 0 {
			out.edges = append(out.edges, ne)
		}
	}
	return out
}

// background reports whether region k is the scene's medium: its only
// region, or one whose extent holds every other region's. Its name is in
// the report's table of materials; on the map it would only add clutter.
func (m *Map) background(k int) bool {
	sc := m.Scene
	lo, hi := regionBounds(sc.Regions[k].Polygons)
	tol := 1e-9 * math.Max(hi.X-lo.X, hi.Y-lo.Y)
	for i, rg := range sc.Regions {
		if i == k {
			continue
		}
		a, b := regionBounds(rg.Polygons)
		if a.X < lo.X-tol || a.Y < lo.Y-tol || b.X > hi.X+tol || b.Y > hi.Y+tol {
			return false
		}
	}
	return true
}

// regionBounds returns the bounding box of the outer rings of polygons.
func regionBounds(ps []geom.Polygon) (lo, hi r2.Vec) {
	lo = r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi = r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, pg := range ps {
		if len(pg) == 0 {
			continue
		}
		a, b := ringBounds(pg[0])
		lo.X, lo.Y = math.Min(lo.X, a.X), math.Min(lo.Y, a.Y)
		hi.X, hi.Y = math.Max(hi.X, b.X), math.Max(hi.Y, b.Y)
	}
	return lo, hi
}

// drawScene masks what is not domain and draws bodies, regions and edges.
func (m *Map) drawScene(c canvas, f frame, st style, geo clippedScene) {
	sc := m.Scene
	if sc == nil {
		return
	}
	win := f.win
	// Outside a closed scene's regions: the window clockwise, the region
	// polygons anticlockwise (holes clockwise) on top of it.
	if !sc.Problem.Open && len(sc.Regions) > 0 {
		rect := []r2.Vec{win.Min, {X: win.Min.X, Y: win.Max.Y}, win.Max, {X: win.Max.X, Y: win.Min.Y}}
		rings := [][]r2.Vec{f.pxs(rect)}
		for _, pg := range geo.regions {
			rings = append(rings, polygonRings(f, pg)...)
		}
		c.fill(white, rings...)
	}
	if g := sc.Problem.Ground; g != nil && sc.Problem.Open && g.Y > win.Min.Y {
		y := math.Min(g.Y, win.Max.Y)
		below := []r2.Vec{{X: win.Min.X, Y: win.Min.Y}, {X: win.Max.X, Y: win.Min.Y}, {X: win.Max.X, Y: y}, {X: win.Min.X, Y: y}}
		c.fill(groundCol, f.pxs(below))
		c.stroke(bodyEdge, 2*st.line, nil, false, f.pxs([]r2.Vec{{X: win.Min.X, Y: y}, {X: win.Max.X, Y: y}}))
	}
	for _, pg := range geo.regions {
		for _, r := range pg {
			c.stroke(bodyEdge, st.line, nil, true, f.pxs(r))
		}
	}
	for _, b := range geo.bodies {
		for _, pg := range b.polygons {
			c.fill(bodyFill, polygonRings(f, pg)...)
			for _, r := range pg {
				c.stroke(bodyEdge, 1.5*st.line, nil, true, f.pxs(r))
			}
		}
	}
	for _, e := range geo.edges {
		for _, l := range e.lines {
			pts := f.pxs(l)
			c.stroke(white, 5*st.line, nil, false, pts)
			c.stroke(edgeCol, 3*st.line, nil, false, pts)
		}
	}
	for _, s := range geo.sheets {
		for _, l := range s.lines {
			c.stroke(bodyEdge, 3*st.line, nil, false, f.pxs(l))
		}
	}
}

// box is a rectangle on the picture, pixels: what a label covers.
type box struct{ x0, y0, x1, y1 float64 }

// textBox returns the box of text of width w and cap height h anchored at
// (x, y) as canvas.text anchors it, with a margin d all round.
func textBox(x, y, w, h, ax, ay, d float64) box {
	x0 := x - ax*w
	base := y + ay*h
	return box{x0 - d, base - h - d, x0 + w + d, base + 0.3*h + d}
}

func (b box) overlaps(o box) bool {
	return b.x0 < o.x1 && o.x0 < b.x1 && b.y0 < o.y1 && o.y0 < b.y1
}

func overlapsAny(b box, placed []box) bool {
	for _, o := range placed {
		if b.overlaps(o) {
			return true
		}
	}
	return false
}

// drawLabels names the bodies (inside when they are large enough, beside
// them otherwise), the edges, the ground plane and the regions other than
// the background (inside them, where the name fits and covers no body and
// no other label; otherwise not at all). placed holds the boxes already
// taken (the marker's).
func (m *Map) drawLabels(c canvas, f frame, st style, geo clippedScene, placed []box) {
	sc := m.Scene
	if sc == nil {
		return
	}
	pad := st.font * 0.2
	for _, b := range geo.bodies {
		if b.name == "" {
			continue
		}
		pg := largestPolygon(b.polygons)
		lo, hi := ringBounds(pg[0])
		p0, p1 := f.px(lo), f.px(hi)
		bw, bh := p1.X-p0.X, p0.Y-p1.Y
		tw, th := c.measure(b.name, st.font)
		at := f.px(labelPoint(pg))
		if tw+4 <= bw && th*1.6 <= bh && pg.Contains(f.world(at.X, at.Y)) && !overlapsAny(textBox(at.X, at.Y, tw, th, 0.5, 0.5, pad), placed) {
			haloText(c, b.name, at.X, at.Y, st.font, black, 0.5, 0.5)
			placed = append(placed, textBox(at.X, at.Y, tw, th, 0.5, 0.5, pad))
			continue
		}
		// Beside the body, at its right (left when that leaves the plot),
		// vertically at its middle; below it when that covers a marker.
		y := clamp((p0.Y+p1.Y)/2, f.y0+th, f.y0+f.ph-2)
		x, ax := p1.X+st.font*0.4, 0.0
		if x+tw > f.x0+f.pw {
			x, ax = p0.X-st.font*0.4, 1
		}
		if overlapsAny(textBox(x, y, tw, th, ax, 0.5, pad), placed) {
			x, ax = (p0.X+p1.X)/2, 0.5
			y = clamp(p0.Y+th, f.y0+th, f.y0+f.ph-2)
		}
		haloText(c, b.name, x, y, st.font, black, ax, 0.5)
		placed = append(placed, textBox(x, y, tw, th, ax, 0.5, pad))
	}
	// Edges and sheets are named beside their longest segment.
	for _, e := range append(append([]named(nil), geo.edges...), geo.sheets...) {
		if e.name == "" {
			continue
		}
		a, b, ok := longestSegment(e.lines)
		if !ok {
			continue
		}
		pa, pb := f.px(a), f.px(b)
		mid := r2.Scale(0.5, r2.Add(pa, pb))
		d := r2.Unit(r2.Sub(pb, pa))
		nrm := r2.Vec{X: d.Y, Y: -d.X} // left of the line on screen
		if nrm.Y > 0 {
			nrm = r2.Scale(-1, nrm) // prefer above
		}
		// Far enough along the normal that the text's box clears the line.
		tw, th := c.measure(e.name, st.small)
		off := 0.5*(tw*math.Abs(nrm.X)+th*1.3*math.Abs(nrm.Y)) + st.font*0.5
		at := r2.Add(mid, r2.Scale(off, nrm))
		if overlapsAny(textBox(at.X, at.Y, tw, th, 0.5, 0.5, pad), placed) {
			at = r2.Sub(mid, r2.Scale(off, nrm)) // the other side of the line
		}
		at.X = clamp(at.X, f.x0+tw/2+st.font*0.3, f.x0+f.pw-tw/2-st.font*0.3)
		at.Y = clamp(at.Y, f.y0+st.font, f.y0+f.ph-st.font*0.5)
		haloText(c, e.name, at.X, at.Y, st.small, black, 0.5, 0.5)
		placed = append(placed, textBox(at.X, at.Y, tw, th, 0.5, 0.5, pad))
	}
	if g := sc.Problem.Ground; g != nil && sc.Problem.Open && g.Y > f.win.Min.Y && g.Y < f.win.Max.Y {
		p := f.px(r2.Vec{X: f.win.Max.X, Y: g.Y})
		s := m.Ground
		if s == "" {
			s = "ground plane"
		}
		tw, th := c.measure(s, st.small)
		haloText(c, s, p.X-st.font*0.5, p.Y+st.font*0.9, st.small, ink, 1, 0.5)
		placed = append(placed, textBox(p.X-st.font*0.5, p.Y+st.font*0.9, tw, th, 1, 0.5, pad))
	}
	for _, rg := range geo.named {
		if b, ok := m.regionLabel(c, f, st, rg, geo.bodies, placed); ok {
			placed = append(placed, b)
		}
	}
}

// regionLabel writes a region's name inside it: at the middle of one of
// its longest horizontal chords, where the name's box lies inside the
// region and the plot and covers no body and no label already placed. It
// returns the box taken, or false when the name fits nowhere (no label).
func (m *Map) regionLabel(c canvas, f frame, st style, rg named, bodies []named, placed []box) (box, bool) {
	size := st.small
	tw, th := c.measure(rg.name, size)
	margin := math.Max(2, st.font*0.12) // the halo and a little air
	fits := func(at r2.Vec, pg geom.Polygon) (box, bool) {
		b := textBox(at.X, at.Y, tw, th, 0.5, 0.5, margin)
		if b.x0 < f.x0 || b.x1 > f.x0+f.pw || b.y0 < f.y0 || b.y1 > f.y0+f.ph || overlapsAny(b, placed) {
			return b, false
		}
		// The box's corners, edge midpoints and centre lie in the region
		// and outside every body.
		for _, fx := range []float64{0, 0.25, 0.5, 0.75, 1} {
			for _, fy := range []float64{0, 0.5, 1} {
				p := f.world(b.x0+fx*(b.x1-b.x0), b.y0+fy*(b.y1-b.y0))
				if !pg.Contains(p) {
					return b, false
				}
				for _, bd := range bodies {
					for _, bp := range bd.polygons {
						if bp.Contains(p) {
							return b, false
						}
					}
				}
			}
		}
		return b, true
	}
	polys := append([]geom.Polygon(nil), rg.polygons...)
	sort.SliceStable(polys, func(i, j int) bool { return polys[i][0].Area() > polys[j][0].Area() })
	for _, pg := range polys {
		for _, at := range labelPoints(pg) {
			p := f.px(at)
			if b, ok := fits(p, pg); ok {
				haloText(c, rg.name, p.X, p.Y, size, ink, 0.5, 0.5)
				return b, true
			}
		}
	}
	return box{}, false
}

// haloText draws text with a white halo so that it reads over any colour.
func haloText(c canvas, s string, x, y, size float64, col color.Color, ax, ay float64) {
	d := math.Max(1, size/12)
	for _, o := range [8][2]float64{{-1, 0}, {1, 0}, {0, -1}, {0, 1}, {-1, -1}, {1, 1}, {-1, 1}, {1, -1}} {
		c.text(s, x+o[0]*d, y+o[1]*d, size, halo, ax, ay, 0)
	}
	c.text(s, x, y, size, col, ax, ay, 0)
}

func ringBounds(r geom.Ring) (lo, hi r2.Vec) {
	lo = r2.Vec{X: math.Inf(1), Y: math.Inf(1)}
	hi = r2.Vec{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, p := range r {
		lo.X, lo.Y = math.Min(lo.X, p.X), math.Min(lo.Y, p.Y)
		hi.X, hi.Y = math.Max(hi.X, p.X), math.Max(hi.Y, p.Y)
	}
	return lo, hi
}

func largestPolygon(ps []geom.Polygon) geom.Polygon {
	best, at := -1.0, 0
	for i, pg := range ps {
		if len(pg) > 0 {
			if a := pg[0].Area(); a > best {
				best, at = a, i
			}
		}
	}
	return ps[at]
}

// labelPoint returns a point well inside the polygon: the middle of the
// longest horizontal chord through its bounding box's middle height (the
// centre of a convex shape, and still inside a ring or an L).
func labelPoint(pg geom.Polygon) r2.Vec {
	if pts := labelPoints(pg); len(pts) > 0 {
		return pts[0]
	}
	lo, hi := ringBounds(pg[0])
	return r2.Scale(0.5, r2.Add(lo, hi))
}

// labelPoints returns the middles of the horizontal chords of the polygon
// at several heights of its bounding box, from the middle outward, the
// longest first (a chord must be a fifth longer than another to pass it,
// so that the middle height wins near ties).
func labelPoints(pg geom.Polygon) []r2.Vec {
	lo, hi := ringBounds(pg[0])
	type chord struct {
		at  r2.Vec
		len float64
	}
	var chords []chord
	for _, fy := range []float64{0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8} {
		y := lo.Y + fy*(hi.Y-lo.Y)
		var xs []float64
		for _, r := range pg {
			for i := range r {
				a, b := r[i], r[(i+1)%len(r)]
				if (a.Y > y) != (b.Y > y) {
					xs = append(xs, a.X+(y-a.Y)*(b.X-a.X)/(b.Y-a.Y))
				}
			}
		}
		sort.Float64s(xs)
		for k := 0; k+1 < len(xs); k += 2 {
			chords = append(chords, chord{r2.Vec{X: 0.5 * (xs[k] + xs[k+1]), Y: y}, xs[k+1] - xs[k]})
		}
	}
	// Insertion by length with the fifth's margin: a later chord passes an
	// earlier one only when it is more than 1.2 times as long.
	var out []chord
	for _, ch := range chords {
		i := len(out)
		for i > 0 && ch.len > 1.2*out[i-1].len {
			i--
		}
		out = append(out, chord{})
		copy(out[i+1:], out[i:])
		out[i] = ch
	}
	pts := make([]r2.Vec, len(out))
	for i, ch := range out {
		pts[i] = ch.at
	}
	return pts
}

func longestSegment(lines [][]r2.Vec) (a, b r2.Vec, ok bool) {
	best := -1.0
	for _, l := range lines {
		for i := 0; i+1 < len(l); i++ {
			if d := r2.Norm(r2.Sub(l[i+1], l[i])); d > best {
				best, a, b, ok = d, l[i], l[i+1], true
			}
		}
	}
	return a, b, ok
}

// drawFluxLine draws a flux line with an arrowhead at its middle, and
// returns the arrowhead's box if it drew one.
func drawFluxLine(c canvas, f frame, l []r2.Vec, st style) (box, bool) {
	if len(l) < 2 {
		return box{}, false
	}
	pts := f.pxs(l)
	c.stroke(fluxLine, 1.3*st.line, nil, false, pts)
	total := 0.0
	for i := 1; i < len(pts); i++ {
		total += r2.Norm(r2.Sub(pts[i], pts[i-1]))
	}
	if total < 6*st.font {
		return box{}, false
	}
	acc := 0.0
	for i := 1; i < len(pts); i++ {
		d := r2.Norm(r2.Sub(pts[i], pts[i-1]))
		if acc+d >= total/2 && d > 0 {
			t := (total/2 - acc) / d
			p := r2.Add(pts[i-1], r2.Scale(t, r2.Sub(pts[i], pts[i-1])))
			dir := r2.Unit(r2.Sub(pts[i], pts[i-1]))
			n := r2.Vec{X: -dir.Y, Y: dir.X}
			s := st.font * 0.45
			tip := r2.Add(p, r2.Scale(s, dir))
			back := r2.Sub(p, r2.Scale(s, dir))
			c.fill(fluxLine, []r2.Vec{tip, r2.Add(back, r2.Scale(0.6*s, n)), r2.Sub(back, r2.Scale(0.6*s, n))})
			return box{p.X - s, p.Y - s, p.X + s, p.Y + s}, true
		}
		acc += d
	}
	return box{}, false
}

// water is the colour of water levels.
var water = color.RGBA{0, 90, 200, 255}

// drawOverlay draws a water level: the line, the surveyor's inverted
// triangle standing on it at its middle, and its label above its end.
func drawOverlay(c canvas, f frame, ov Overlay, st style, placed []box) []box {
	var out []box
	for _, piece := range clipLine(ov.Points, f.win) {
		if len(piece) < 2 {
			continue
		}
		pts := f.pxs(piece)
		c.stroke(white, 4*st.line, nil, false, pts)
		c.stroke(water, 2*st.line, nil, false, pts)
		a, b := pts[0], pts[len(pts)-1]
		mid := r2.Scale(0.5, r2.Add(a, b))
		s := st.font * 0.5
		c.fill(water, []r2.Vec{{X: mid.X - s, Y: mid.Y - 1.6*s}, {X: mid.X + s, Y: mid.Y - 1.6*s}, {X: mid.X, Y: mid.Y - 0.1*s}})
		out = append(out, box{mid.X - s, mid.Y - 1.6*s, mid.X + s, mid.Y})
		if ov.Label == "" {
			continue
		}
		tw, th := c.measure(ov.Label, st.small)
		right := b
		if a.X > b.X {
			right = a
		}
		x, ax := right.X, 1.0
		y := right.Y - st.font*0.8
		haloText(c, ov.Label, x, y, st.small, water, ax, 0.5)
		out = append(out, textBox(x, y, tw, th, ax, 0.5, st.font*0.2))
	}
	return out
}

// drawMarker circles a point and writes its text beside it, where it
// covers none of the boxes already placed if it can (above right, above
// left, below right, below left); it returns the boxes that the circle and
// the text take.
func drawMarker(c canvas, f frame, mk Marker, st style, placed []box) []box {
	p := f.px(mk.At)
	r := st.font * 0.6
	circ := make([]r2.Vec, 32)
	for i := range circ {
		t := 2 * math.Pi * float64(i) / 32
		circ[i] = r2.Vec{X: p.X + r*math.Cos(t), Y: p.Y + r*math.Sin(t)}
	}
	c.stroke(white, 4*st.line, nil, true, circ)
	c.stroke(black, 2*st.line, nil, true, circ)
	c.stroke(black, 1.5*st.line, nil, false, []r2.Vec{{X: p.X - 1.8*r, Y: p.Y}, {X: p.X - 1.1*r, Y: p.Y}})
	c.stroke(black, 1.5*st.line, nil, false, []r2.Vec{{X: p.X + 1.1*r, Y: p.Y}, {X: p.X + 1.8*r, Y: p.Y}})
	out := []box{{p.X - 1.8*r, p.Y - r, p.X + 1.8*r, p.Y + r}}
	if mk.Text == "" {
		return out
	}
	tw, th := c.measure(mk.Text, st.font)
	type spot struct{ x, y, ax float64 }
	var spots []spot
	for _, dy := range []float64{-1.6 * r, 2.2 * r} {
		for _, side := range []float64{1, -1} {
			x, ax := p.X+2.2*r, 0.0
			if side < 0 {
				x, ax = p.X-2.2*r, 1
			}
			spots = append(spots, spot{x, p.Y + dy, ax})
		}
	}
	inside := func(sp spot) bool {
		b := textBox(sp.x, sp.y, tw, th, sp.ax, 0.5, 0)
		return b.x0 >= f.x0 && b.x1 <= f.x0+f.pw && b.y0 >= f.y0 && b.y1 <= f.y0+f.ph
	}
	best := -1
	for i, sp := range spots {
		if !inside(sp) {
			continue
		}
		if best < 0 {
			best = i
		}
		if !overlapsAny(textBox(sp.x, sp.y, tw, th, sp.ax, 0.5, st.font*0.2), append(placed, out...)) {
			best = i
			break
		}
	}
	if best < 0 {
		best = 0
	}
	sp := spots[best]
	haloText(c, mk.Text, sp.x, sp.y, st.font, black, sp.ax, 0.5)
	return append(out, textBox(sp.x, sp.y, tw, th, sp.ax, 0.5, st.font*0.2))
}

// drawAxes draws the frame with ticks labelled in the scene's unit.
func drawAxes(c canvas, f frame, st style, unit string, scale float64) {
	rect := []r2.Vec{{X: f.x0, Y: f.y0}, {X: f.x0 + f.pw, Y: f.y0}, {X: f.x0 + f.pw, Y: f.y0 + f.ph}, {X: f.x0, Y: f.y0 + f.ph}}
	c.stroke(ink, st.line, nil, true, rect)
	tl := st.font * 0.4
	n := func(pix float64) int { return max(2, int(pix/(st.font*7))) }
	xs, xstep := ticks(f.win.Min.X/scale, f.win.Max.X/scale, n(f.pw))
	for _, v := range xs {
		p := f.px(r2.Vec{X: v * scale, Y: f.win.Min.Y})
		c.stroke(ink, st.line, nil, false, []r2.Vec{p, {X: p.X, Y: p.Y + tl}})
		c.text(formatTick(v, xstep), p.X, p.Y+tl+st.small*1.2, st.small, ink, 0.5, 0, 0)
	}
	ys, ystep := ticks(f.win.Min.Y/scale, f.win.Max.Y/scale, n(f.ph))
	for _, v := range ys {
		p := f.px(r2.Vec{X: f.win.Min.X, Y: v * scale})
		c.stroke(ink, st.line, nil, false, []r2.Vec{p, {X: p.X - tl, Y: p.Y}})
		c.text(formatTick(v, ystep), p.X-tl-st.small*0.3, p.Y, st.small, ink, 1, 0.5, 0)
	}
	c.text("x ("+unit+")", f.x0+f.pw/2, f.y0+f.ph+tl+st.small*1.2+st.font*1.6, st.font, ink, 0.5, 0, 0)
	c.text("y ("+unit+")", f.x0-st.font*4.3, f.y0+f.ph/2, st.font, ink, 0.5, 0.5, math.Pi/2)
}

// drawScaleBar draws a bar of a round length in the scene's unit below the
// plot's lower left corner, on the line of the x axis' label, so that it
// hides nothing of the map.
func drawScaleBar(c canvas, f frame, st style, unit string, scale float64) {
	length := niceBelow(0.2 * f.win.Size().X / scale)
	if !(length > 0) {
		return
	}
	pl := length * scale * f.s
	label := formatValue(length) + " " + unit
	tl := st.font * 0.4
	base := f.y0 + f.ph + tl + st.small*1.2 + st.font*1.6 // the x label's baseline
	bh := st.font * 0.45
	x := f.x0
	y := base // the bar's bottom
	half := []r2.Vec{{X: x, Y: y}, {X: x + pl/2, Y: y}, {X: x + pl/2, Y: y - bh}, {X: x, Y: y - bh}}
	c.fill(ink, half)
	c.stroke(ink, st.line, nil, true, []r2.Vec{{X: x, Y: y}, {X: x + pl, Y: y}, {X: x + pl, Y: y - bh}, {X: x, Y: y - bh}})
	c.text(label, x+pl+st.font*0.5, y, st.small, ink, 0, 0, 0)
}

// maxLabelWidth estimates the width of the colour bar's tick labels.
func maxLabelWidth(c canvas, lo, hi, size float64) float64 {
	vals, step := ticks(lo, hi, 6)
	w := 0.0
	for _, v := range vals {
		tw, _ := c.measure(formatTick(v, step), size)
		w = math.Max(w, tw)
	}
	return w
}

// drawColourBar draws the colour map from lo (bottom) to hi (top) with
// ticks labelled in values over div (the display unit's SI value), the
// contour levels as thin marks and the label, rotated, at its right; an
// arrow on top when values rise above hi, at the bottom when they fall
// below lo.
func drawColourBar(c canvas, cm Colormap, x, y, w, h, lo, hi, div float64, over, under bool, levels []float64, label string, st style) {
	if over {
		// Leave room for the arrow.
		y += w
		h -= w
	}
	if under {
		h -= w
	}
	n := max(int(h), 2)
	iw := max(int(w), 1) // several pixels wide: viewers smooth a 1-pixel strip into its transparent surround
	img := image.NewRGBA(image.Rect(0, 0, iw, n))
	for i := range n {
		col := cm.At(1 - (float64(i)+0.5)/float64(n))
		for k := range iw {
			img.SetRGBA(k, i, col)
		}
	}
	c.image(img, x, y, w, h)
	if over {
		c.fill(cm.At(1), []r2.Vec{{X: x, Y: y}, {X: x + w, Y: y}, {X: x + w/2, Y: y - w}})
		c.stroke(ink, st.line, nil, true, []r2.Vec{{X: x, Y: y}, {X: x + w, Y: y}, {X: x + w/2, Y: y - w}})
	}
	if under {
		b := y + h
		c.fill(cm.At(0), []r2.Vec{{X: x, Y: b}, {X: x + w, Y: b}, {X: x + w/2, Y: b + w}})
		c.stroke(ink, st.line, nil, true, []r2.Vec{{X: x, Y: b}, {X: x + w, Y: b}, {X: x + w/2, Y: b + w}})
	}
	c.stroke(ink, st.line, nil, true, []r2.Vec{{X: x, Y: y}, {X: x + w, Y: y}, {X: x + w, Y: y + h}, {X: x, Y: y + h}})
	at := func(v float64) float64 { return y + h - (v-lo)/(hi-lo)*h }
	for _, lv := range levels {
		if lv >= lo && lv <= hi {
			c.stroke(contour, st.line, nil, false, []r2.Vec{{X: x, Y: at(lv)}, {X: x + w, Y: at(lv)}})
		}
	}
	vals, step := ticks(lo/div, hi/div, max(2, int(h/(st.font*3.5))))
	lw := 0.0
	for _, v := range vals {
		py := at(v * div)
		c.stroke(ink, st.line, nil, false, []r2.Vec{{X: x + w, Y: py}, {X: x + w + st.font*0.35, Y: py}})
		s := formatTick(v, step)
		tw, _ := c.measure(s, st.small)
		lw = math.Max(lw, tw)
		c.text(s, x+w+st.font*0.6, py, st.small, ink, 0, 0.5, 0)
	}
	c.text(label, x+w+st.font*0.6+lw+st.font*1.1, y+h/2, st.font, ink, 0.5, 0.5, -math.Pi/2)
}
