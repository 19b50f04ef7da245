package main

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
)

// Picture files solve writes (the SVGs with --svg).
const (
	potentialPicture = "potential" // potential map with equipotentials and the flow net
	fieldPicture     = "field"     // field strength |grad u| with its peak marked
	boundaryPicture  = "boundary"  // potential and inflow density along every boundary
)

func init() {
	artifacts = append(artifacts,
		artifact{name: "flow net", files: flowNetFiles},
		artifact{name: "pictures", image: true, files: pictureFiles})
}

// flowNetFiles traces the flux lines (kept for the pictures) and puts the
// flow net's numbers into results.json; it writes no file.
func flowNetFiles(t *task) ([]outputFile, error) {
	pj, err := t.pictureJob()
	if err != nil {
		return nil, err
	}
	if f := t.out.FluxLines; f != nil {
		pj.net = &grid.FlowNet{}
		pj.lines = f(t.window(), t.levels)
		return nil, nil
	}
	pj.net = grid.Trace(t.sol(), t.window(), t.levels+1, grid.TraceOptions{})
	for _, l := range pj.net.Lines {
		pj.lines = append(pj.lines, l.Points)
	}
	if n := pj.net; pj.res != nil && n.Channels > 0 && t.words.Net != "" {
		pj.res.FlowNet = &flowNetInfo{Channels: number(n.Channels), Drops: n.Drops, ShapeFactor: number(n.ShapeFactor),
			Inflow: number(n.Inflow), Head: number(n.Head), Conductivity: number(n.Conductivity)}
	}
	return nil, nil
}

// pictures are the pictures of a task before they are drawn, so that the
// words on them can be read back.
type pictures struct {
	potential, field *draw.Map
	charts           draw.Charts
	// captions of the three pictures, for the report.
	potentialCaption, fieldCaption, chartsCaption string
}

// pictureSpecs lays out potential.png, field.png and boundary.png in the
// job's words.
func pictureSpecs(t *task) (*pictures, error) {
	pj, err := t.pictureJob()
	if err != nil {
		return nil, err
	}
	g := t.sampled()
	sc, w, out, sol := t.scene, t.words, t.out, t.sol()
	lo, hi := grid.BoundaryRange(sol)
	levels := t.contourLevels()
	contours := grid.Contours(g, levels, w.Units.Potential)
	if pj.net == nil {
		if _, err := flowNetFiles(t); err != nil {
			return nil, err
		}
	}
	net, lines := pj.net, pj.lines
	// Title: the scene and its main result; below, the job's lines and the
	// flow net.
	title := sceneName(t.scenePath)
	if out.Headline != "" {
		title += ": " + out.Headline
	}
	var potSub []string
	for _, l := range out.Lines {
		potSub = append(potSub, job.Capitalise(l))
	}
	if fn := flowNetText(net, w, pj.at != nil); fn != "" {
		potSub = append(potSub, fn)
	}
	ps := &pictures{}
	ps.potential = &draw.Map{Grid: g, Values: g.U, Label: w.Potential, Unit: w.Units.Potential, Title: title,
		Subtitle: strings.Join(potSub, "\n"), Contours: contours, Lines: lines, PlainLines: w.Unoriented, Scene: sc, Ground: w.Ground}
	if hi > lo && out.Levels == nil {
		// The colours span the boundary's potentials, as the levels do; a
		// job that chooses its levels from the sampled range gets the
		// colours of that range.
		ps.potential.Lo, ps.potential.Hi = lo, hi
	}
	ps.potentialCaption = fmt.Sprintf("%s with %s (dark lines) and %s (white, arrows in the direction of flux).", job.Capitalise(w.Potential), w.ContourName(), w.FluxLines)
	if w.Unoriented {
		ps.potentialCaption = fmt.Sprintf("%s with the %s (dark lines) and %s (white).", job.Capitalise(w.Potential), w.ContourName(), w.FluxLines)
	}

	mag := g.Magnitude()
	peak, at := grid.Peak(mag)
	sub := "Colours stop at the 99th percentile of the samples (arrow on the colour bar)."
	if slices.ContainsFunc(out.Cautions, func(c job.Caution) bool { return c.Topic == "singular_corners" }) {
		sub += fmt.Sprintf(" At sharp corners and changes of condition the %s is infinite in theory: see the cautions.", w.Field)
	}
	fld := &draw.Map{Grid: g, Values: mag, FromZero: true, Clip: 0.99, Label: w.Field, Unit: w.FieldUnit,
		Title:    fmt.Sprintf("%s: largest on the %d x %d sampling grid %s", job.Capitalise(w.Field), g.NX, g.NY, draw.FormatSI(peak, w.FieldUnit)),
		Subtitle: sub, Scene: sc, Ground: w.Ground}
	ps.fieldCaption = job.Capitalise(w.Field) + "; the circle marks the largest value on the sampling grid."
	if mk := out.Peak; mk != nil && job.IsFinite(mk.Value) {
		// The job found the peak on the boundary, which the grid, stopping
		// short of the boundary, cannot see: mark that one. Both numbers in
		// the peak's unit, so that they compare at a glance.
		d := draw.DisplayFor(mk.Unit, mk.Value)
		name := mk.Title
		if name == "" {
			name = fmt.Sprintf("peak %s on %q", d.Format(mk.Value), mk.Boundary)
		}
		fld.Title = fmt.Sprintf("%s: %s (largest on the sampling grid %s)", job.Capitalise(w.Field), name, d.Format(peak))
		text := mk.Text
		if text == "" {
			text = "peak " + d.Format(mk.Value)
		}
		fld.Marker = &draw.Marker{At: mk.At, Text: text}
		if mk.Caption != "" {
			ps.fieldCaption = job.Capitalise(w.Field) + "; " + mk.Caption + "."
		}
	} else if at >= 0 {
		fld.Marker = &draw.Marker{At: g.Point(at%g.NX, at/g.NX), Text: "largest " + draw.FormatSI(peak, w.FieldUnit)}
	} else {
		t.warnings = append(t.warnings, "field.png has no peak: no grid sample lies in the domain; give a larger --image-size or check the scene")
	}
	if w.ContoursOnField {
		fld.Contours, fld.OtherContours = contours, true
	}
	ps.field = fld
	ps.potential.Overlays, ps.field.Overlays = out.Overlays, out.Overlays
	for _, mk := range out.Marks {
		m := draw.Marker{At: mk.At, Text: mk.Text}
		ps.potential.Marks = append(ps.potential.Marks, m)
		ps.field.Marks = append(ps.field.Marks, m)
	}

	potSeries, inSeries := draw.BoundarySeries(sol)
	ps.charts = draw.Charts{
		{Title: job.Capitalise(w.Potential) + " along each boundary", YLabel: w.Potential, YUnit: w.Units.Potential, Series: potSeries},
		{Title: job.Capitalise(w.InflowDensity) + " (flux entering the domain positive)", YLabel: w.InflowDensity, YUnit: w.Units.InflowDensity, Series: inSeries, Clip: 0.98},
	}
	for _, c := range out.Charts {
		// A copy, scaled below; the job's chart stays in metres.
		cc := *c
		cc.Series = make([]draw.Series, len(c.Series))
		for k, sr := range c.Series {
			cc.Series[k] = draw.Series{Name: sr.Name, X: slices.Clone(sr.X), Y: sr.Y}
		}
		ps.charts = append(ps.charts, &cc)
	}
	var all []draw.Series
	for _, c := range ps.charts {
		all = append(all, c.Series...)
	}
	xLabel, xScale := arcLengthAxis(sc, all)
	for _, c := range ps.charts {
		c.XLabel = xLabel
		for k := range c.Series {
			for i := range c.Series[k].X {
				c.Series[k].X[i] /= xScale
			}
		}
	}
	ps.chartsCaption = fmt.Sprintf("%s and %s at each panel's midpoint against the arc length along each body and edge.", job.Capitalise(w.Potential), w.InflowDensity)
	return ps, nil
}

// pictureFiles draws potential.png, field.png and boundary.png (and their
// SVGs with --svg).
func pictureFiles(t *task) ([]outputFile, error) {
	pj, err := t.pictureJob()
	if err != nil {
		return nil, err
	}
	ps, err := pictureSpecs(t)
	if err != nil {
		return nil, err
	}
	width, height := pj.width, pj.height
	if height == 0 {
		height = autoHeight(ps.potential.Grid.Window, width)
	}
	charts := ps.charts
	chartH := chartHeight(len(charts), width)
	renders := []render{
		{potentialPicture, ps.potentialCaption,
			func(w io.Writer) error { return ps.potential.PNG(w, width, height) }, func(w io.Writer) error { return ps.potential.SVG(w, width, height) }},
		{fieldPicture, ps.fieldCaption,
			func(w io.Writer) error { return ps.field.PNG(w, width, height) }, func(w io.Writer) error { return ps.field.SVG(w, width, height) }},
		{boundaryPicture, ps.chartsCaption,
			func(w io.Writer) error { return charts.PNG(w, width, chartH) }, func(w io.Writer) error { return charts.SVG(w, width, chartH) }},
	}
	for _, pl := range t.out.Plots {
		cs := pl.Charts
		h := chartHeight(len(cs), width)
		renders = append(renders, render{pl.Name, pl.Caption, func(w io.Writer) error { return cs.PNG(w, width, h) }, func(w io.Writer) error { return cs.SVG(w, width, h) }})
	}
	drawn := renderAll(renders, pj.svg)
	var files []outputFile
	for i, r := range renders {
		d := drawn[i]
		if d.err != nil {
			return nil, d.err
		}
		pj.drawn = append(pj.drawn, picture{name: r.name + ".png", caption: r.caption, png: d.png})
		files = append(files, bytesFile(r.name+".png", d.png))
		if pj.svg {
			files = append(files, bytesFile(r.name+".svg", d.svg))
		}
	}
	return files, nil
}

// chartHeight returns the height of a picture of n charts stacked at the
// given width: 0.375 of the width each, within 350 to 550 pixels.
func chartHeight(n, width int) int {
	k := float64(n)
	return int(math.Min(550*k, math.Max(350*k, 0.375*k*float64(width))))
}

// render is one picture to draw: its file name without extension, its
// caption in the report, and its drawing as PNG and as SVG.
type render struct {
	name, caption string
	png, svg      func(io.Writer) error
}

// drawnPicture is a rendered picture's bytes, or the error that stopped it.
type drawnPicture struct {
	png, svg []byte
	err      error
}

// renderAll draws the pictures (and their SVG twins when svg is set) on
// all cores at once: they are independent, and drawing and compressing
// them is most of the wait of a small solve. The results are in the order
// of rs.
func renderAll(rs []render, svg bool) []drawnPicture {
	out := make([]drawnPicture, len(rs))
	slots := make(chan struct{}, runtime.GOMAXPROCS(0))
	var wg sync.WaitGroup
	for i, r := range rs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			slots <- struct{}{}
			defer func() { <-slots }()
			d := &out[i]
			var buf bytes.Buffer
			if err := r.png(&buf); err != nil {
				d.err = fmt.Errorf("%s.png: %w", r.name, err)
				return
			}
			d.png = buf.Bytes()
			if svg {
				var sb bytes.Buffer
				if err := r.svg(&sb); err != nil {
					d.err = fmt.Errorf("%s.svg: %w", r.name, err)
					return
				}
				d.svg = sb.Bytes()
			}
		}()
	}
	wg.Wait()
	return out
}

// arcLengthAxis returns the label of the charts' arc length axis and the
// metres per unit of its values: the scene's unit when the scene is drawn
// in one other than metres and the longest boundary is at most 10 000 of
// it (700 mm rather than 0.7 m), metres otherwise.
func arcLengthAxis(sc *geom.Scene, series []draw.Series) (label string, scale float64) {
	unit, s := sceneUnit(sc), sc.Problem.Scale
	longest := 0.0
	for _, sr := range series {
		for _, x := range sr.X {
			if !math.IsNaN(x) {
				longest = math.Max(longest, x)
			}
		}
	}
	if unit == "m" || !(s > 0) || longest/s > 1e4 {
		unit, s = "m", 1
	}
	return "arc length along each boundary from its first point as drawn (" + unit + ")", s
}

// autoHeight returns a picture height that fits the window's proportions
// at the given width, within [500, 1600] pixels.
func autoHeight(w grid.Window, width int) int {
	s := w.Size()
	// Room the map keeps around the plot: about 330 pixels across (axes,
	// colour bar) and 180 down (title, axes) at a 1400-pixel width.
	k := float64(width) / defaultPictureWidth
	plotW := float64(width) - 330*k
	h := plotW*s.Y/s.X + 180*k
	return int(math.Min(maxPictureHeight, math.Max(minPictureHeight, math.Round(h))))
}

// headline returns the scene and its main result in one line, for the
// report: "coaxial/scene.geojson: C = 96.99 pF/m between "core" and
// "shield"; peak field 1.234 kV/mm on "core"".
func headline(t *task) string {
	parts := []string{}
	if t.out.Headline != "" {
		parts = append(parts, t.out.Headline)
	}
	parts = append(parts, t.out.Lines...)
	name := sceneName(t.scenePath)
	if len(parts) == 0 {
		return name
	}
	return name + ": " + strings.Join(parts, "; ")
}

// sceneName shortens a scene path for a title: its file name, with the
// folder when the file is a generic scene.geojson.
func sceneName(path string) string {
	parts := strings.FieldsFunc(path, func(r rune) bool { return r == '/' || r == '\\' })
	switch {
	case len(parts) == 0:
		return path
	case len(parts) >= 2 && parts[len(parts)-1] == "scene.geojson":
		return parts[len(parts)-2] + "/" + parts[len(parts)-1]
	}
	return parts[len(parts)-1]
}

// flowNetText describes the flow net for the subtitle, in the job's words.
func flowNetText(net *grid.FlowNet, w *job.Words, explicit bool) string {
	if len(net.Lines) == 0 || !(net.Channels > 0) || w.Net == "" {
		return ""
	}
	s := fmt.Sprintf("%s: %.3g %s, %d %s, shape factor %.4g = %s", job.Capitalise(w.Net), net.Channels, w.Channels, net.Drops, w.Drops, net.ShapeFactor, w.ShapeFactor)
	if !net.Square {
		s += fmt.Sprintf("; %s drawn every %s of flux", w.FluxLines, draw.FormatSI(net.Step, w.Units.Inflow))
	}
	if explicit {
		s += "; the drops are those of --levels, not the --at equipotentials drawn"
	}
	return s
}
