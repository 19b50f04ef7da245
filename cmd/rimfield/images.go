package main

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/spatial/r2"
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

// flowNetInfo is the flow net of results.json: with equipotentials at
// equal potential drops and flux lines at equal flux k dH the net is made of
// curvilinear squares, and q = k H channels/drops.
type flowNetInfo struct {
	Channels     number `json:"channels"`     // 1: inflow over the flux per channel k dH
	Drops        int    `json:"drops"`        // potential drops: --levels + 1
	ShapeFactor  number `json:"shape_factor"` // 1: channels/drops = inflow/(k H)
	Inflow       number `json:"inflow"`       // units.inflow: through fixed-potential and flux boundaries
	Head         number `json:"head"`         // units.potential: highest minus lowest boundary potential
	Conductivity number `json:"conductivity"` // units.conductivity: sqrt(kx ky) of the net's region
}

// flowNetFiles traces the flux lines (kept for the pictures) and puts the
// flow net's numbers into results.json; it writes no file.
func flowNetFiles(j *job) ([]outputFile, error) {
	pj := j.pics
	if pj == nil {
		pj = &pictureJob{}
		if err := pj.check(); err != nil {
			return nil, err
		}
		j.pics = pj
	}
	pj.net = grid.Trace(j.sol, j.window(), j.levels+1, grid.TraceOptions{})
	if n := pj.net; pj.res != nil && n.Channels > 0 {
		pj.res.FlowNet = &flowNetInfo{Channels: number(n.Channels), Drops: n.Drops, ShapeFactor: number(n.ShapeFactor),
			Inflow: number(n.Inflow), Head: number(n.Head), Conductivity: number(n.Conductivity)}
	}
	return nil, nil
}

// pictureJob is what the pictures and the report share within one solve:
// their flags, the results (set by resultFiles before the artifacts run)
// and the pictures once drawn.
type pictureJob struct {
	at     []float64 // --at: explicit equipotential levels; nil for --levels
	svg    bool      // --svg
	report bool      // --report
	width  int       // picture width in pixels
	height int       // picture height in pixels; 0: from the scene's proportions

	win []float64 // --window: x0, y0, x1, y1 in the scene's unit; nil for automatic

	atText, sizeText, winText string // the flags as given

	res      *results
	pictures []picture
	net      *grid.FlowNet
}

// picture is one drawn picture, kept for the report.
type picture struct {
	name    string // file name
	caption string
	png     []byte
}

// Defaults of the picture flags.
const (
	defaultPictureWidth = 1400
	minPictureHeight    = 500
	maxPictureHeight    = 1600
)

// chartHooks add charts of a physics to boundary.png, below the potential
// and inflow density: a physics file registers one in its init, with series
// against the arc length along the boundaries (pore pressure under a
// structure, surface field on a conductor).
var chartHooks = map[geom.Physics]func(j *job) ([]*draw.Chart, error){}

// addPictureFlags defines the flags of the pictures and the report on fs.
func addPictureFlags(fs *pflag.FlagSet) *pictureJob {
	p := &pictureJob{}
	fs.StringVar(&p.atText, "at", "", "explicit equipotential `LEVELS`, comma-separated in the potential's unit (e.g. 0.1,0.5,0.9), instead of --levels; for contours and pictures")
	fs.StringVar(&p.sizeText, "image-size", "", "picture size `WxH` in pixels (e.g. 1600x900); default 1400 wide, height from the scene's proportions")
	fs.StringVar(&p.winText, "window", "", "area `X0,Y0,X1,Y1` (scene units: lower left and upper right corners) that contours and pictures cover; default: the whole scene, 1.5 times the bodies' extent in an open scene")
	fs.BoolVar(&p.svg, "svg", false, "also write each picture as SVG (vector) next to its PNG")
	fs.BoolVar(&p.report, "report", false, "also write report.html: inputs, results with units, pictures, warnings and cautions in one self-contained file")
	return p
}

// check parses the flags given as text.
func (p *pictureJob) check() error {
	if p.atText != "" {
		for _, f := range strings.Split(p.atText, ",") {
			v, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				return usagef("solve: --at %q: %q is not a number; give levels like 0.1,0.5,0.9", p.atText, strings.TrimSpace(f))
			}
			p.at = append(p.at, v)
		}
	}
	if p.winText != "" {
		for _, f := range strings.Split(p.winText, ",") {
			v, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				p.win = nil
				break
			}
			p.win = append(p.win, v)
		}
		if len(p.win) != 4 || !(p.win[2] > p.win[0]) || !(p.win[3] > p.win[1]) {
			return usagef("solve: --window %q: give four numbers X0,Y0,X1,Y1 in the scene's unit with X1 > X0 and Y1 > Y0 (e.g. -5,-3,5,1)", p.winText)
		}
	}
	p.width = defaultPictureWidth
	if p.sizeText != "" {
		ws, hs, ok := strings.Cut(strings.ToLower(p.sizeText), "x")
		w, err1 := strconv.Atoi(strings.TrimSpace(ws))
		h, err2 := strconv.Atoi(strings.TrimSpace(hs))
		if !ok || err1 != nil || err2 != nil || w < 400 || h < 300 || w > 10000 || h > 10000 {
			return usagef("solve: --image-size %q: give width x height in pixels, between 400x300 and 10000x10000 (e.g. 1600x900)", p.sizeText)
		}
		p.width, p.height = w, h
	}
	return nil
}

// window returns the area that contours and pictures cover, in metres:
// --window, or grid.Auto.
func (j *job) window() grid.Window {
	if j.pics != nil && j.pics.win != nil {
		s := j.scene.Problem.Scale
		if !(s > 0) {
			s = 1
		}
		w := j.pics.win
		return grid.Window{Min: r2.Vec{X: w[0] * s, Y: w[1] * s}, Max: r2.Vec{X: w[2] * s, Y: w[3] * s}}
	}
	return grid.Auto(j.mesh)
}

// contourLevels returns the equipotential levels of the job: --at as given,
// or --levels K evenly spaced between the lowest and highest boundary
// potential lo and hi (nil when they are equal).
func (j *job) contourLevels(lo, hi float64) []float64 {
	if j.pics != nil && j.pics.at != nil {
		return j.pics.at
	}
	return grid.Levels(lo, hi, j.levels)
}

// quantityNames names |grad u| and the potential for the pictures.
func quantityNames(p geom.Physics) (potential, field, fieldUnit string) {
	u := unitsOf(p)
	switch p {
	case geom.Electrostatic:
		return "potential (V)", "field strength |E|", "V/m"
	case geom.Seepage:
		return "total head (m)", "hydraulic gradient |i|", "1"
	case geom.Flow:
		return "potential (" + u.Potential + ")", "speed |grad u|", "m/s"
	}
	return "potential u", "|grad u|", "1/m"
}

// pictureFiles draws potential.png, field.png and boundary.png (and their
// SVGs with --svg).
func pictureFiles(j *job) ([]outputFile, error) {
	pj := j.pics
	if pj == nil {
		pj = &pictureJob{}
		if err := pj.check(); err != nil {
			return nil, err
		}
		j.pics = pj
	}
	g := j.sampled()
	sc := j.scene
	units := unitsOf(sc.Problem.Physics)
	potName, fieldName, fieldUnit := quantityNames(sc.Problem.Physics)
	width, height := pj.width, pj.height
	if height == 0 {
		height = autoHeight(g.Window, width)
	}

	lo, hi := grid.BoundaryRange(j.sol)
	levels := j.contourLevels(lo, hi)
	contours := grid.Contours(g, levels, units.Potential)
	net := pj.net
	if net == nil {
		net = grid.Trace(j.sol, g.Window, j.levels+1, grid.TraceOptions{})
		pj.net = net
	}
	var lines [][]r2.Vec
	for _, l := range net.Lines {
		lines = append(lines, l.Points)
	}
	pot := &draw.Map{Grid: g, Values: g.U, Label: potName, Title: headline(j),
		Subtitle: flowNetText(net, units.Inflow, pj.at != nil), Contours: contours, Lines: lines, Scene: sc}
	if hi > lo {
		pot.Lo, pot.Hi = lo, hi
	}

	mag := g.Magnitude()
	peak, at := grid.Peak(mag)
	sub := "Colours stop at the 99th percentile of the samples (arrow on the bar)."
	if len(j.mesh.Singular) > 0 {
		sub += " At sharp corners and changes of condition the field is infinite in theory: see the cautions."
	}
	unitText := " " + fieldUnit
	if fieldUnit == "1" {
		unitText = ""
	}
	fld := &draw.Map{Grid: g, Values: mag, FromZero: true, Clip: 0.99, Label: fieldName + " (" + fieldUnit + ")",
		Title:    fmt.Sprintf("%s: largest on the %d x %d sampling grid %s%s", capitalise(fieldName), g.NX, g.NY, fmtNum(peak), unitText),
		Subtitle: sub, Scene: sc}
	if sp := surfacePeak(j); sp != nil {
		// The physics found the peak on the conductors' surfaces, which the
		// grid, stopping short of the boundary, cannot see: mark that one.
		fld.Title = fmt.Sprintf("%s: peak %s%s on %q (grid maximum %s%s)", capitalise(fieldName),
			fmtNum(float64(sp.Value)), unitText, sp.Boundary, fmtNum(peak), unitText)
		fld.Marker = &draw.Marker{At: r2.Vec{X: float64(sp.X), Y: float64(sp.Y)}, Text: "peak " + fmtNum(float64(sp.Value)) + unitText}
	} else if at >= 0 {
		j.warnings = append(j.warnings, "field.png has no peak: no grid sample lies in the domain; give a larger --image-size or check the scene")
	}

	potSeries, inSeries := draw.BoundarySeries(j.sol)
	charts := draw.Charts{
		{Title: "Potential along each boundary", XLabel: "arc length along the boundary (m)", YLabel: potName, Series: potSeries},
		{Title: "Inflow density (flux entering the domain positive)", XLabel: "arc length along the boundary (m)",
			YLabel: "inflow density (" + units.InflowDensity + ")", Series: inSeries, Clip: 0.98},
	}

	if h, ok := chartHooks[sc.Problem.Physics]; ok {
		more, err := h(j)
		if err != nil {
			return nil, err
		}
		charts = append(charts, more...)
	}

	var files []outputFile
	add := func(name, caption string, png func(io.Writer) error, svg func(io.Writer) error) error {
		var buf bytes.Buffer
		if err := png(&buf); err != nil {
			return fmt.Errorf("%s.png: %w", name, err)
		}
		data := buf.Bytes()
		pj.pictures = append(pj.pictures, picture{name: name + ".png", caption: caption, png: data})
		files = append(files, bytesFile(name+".png", data))
		if pj.svg {
			var sb bytes.Buffer
			if err := svg(&sb); err != nil {
				return fmt.Errorf("%s.svg: %w", name, err)
			}
			files = append(files, bytesFile(name+".svg", sb.Bytes()))
		}
		return nil
	}
	chartH := int(math.Min(550*float64(len(charts)), math.Max(350*float64(len(charts)), 0.375*float64(len(charts))*float64(width))))
	for _, p := range []struct {
		name, caption string
		png, svg      func(io.Writer) error
	}{
		{potentialPicture, "Potential with equipotentials (dark lines) and flux lines (white, arrows in the direction of flux).",
			func(w io.Writer) error { return pot.PNG(w, width, height) }, func(w io.Writer) error { return pot.SVG(w, width, height) }},
		{fieldPicture, "Magnitude of the potential gradient; the circle marks the largest value on the sampling grid.",
			func(w io.Writer) error { return fld.PNG(w, width, height) }, func(w io.Writer) error { return fld.SVG(w, width, height) }},
		{boundaryPicture, "Potential and inflow density at each panel's midpoint against the arc length along each body and edge.",
			func(w io.Writer) error { return charts.PNG(w, width, chartH) }, func(w io.Writer) error { return charts.SVG(w, width, chartH) }},
	} {
		if err := add(p.name, p.caption, p.png, p.svg); err != nil {
			return nil, err
		}
	}
	return files, nil
}

// bytesFile is an output file with the given content.
func bytesFile(name string, data []byte) outputFile {
	return outputFile{name, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}}
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

// headline returns the first line of the potential picture: the scene and
// its main result.
func headline(j *job) string {
	sc := j.scene
	units := unitsOf(sc.Problem.Physics)
	name := sceneName(j.scenePath)
	if pj := j.pics; pj != nil && pj.res != nil {
		r := pj.res
		if sc.Problem.Physics == geom.Seepage && r.Seepage != nil {
			return fmt.Sprintf("%s: discharge %s m²/s per metre", name, fmtNum(float64(r.Seepage.Discharge)))
		}
		// Two fixed conductors: the capacitance between them, -C12 of the
		// Maxwell matrix.
		if e := r.Electrostatic; e != nil && e.Capacitance != nil && len(e.Capacitance.Conductors) == 2 && len(e.Capacitance.Matrix) == 2 && len(e.Capacitance.Matrix[0]) == 2 {
			c := e.Capacitance
			return fmt.Sprintf("%s: capacitance %s F/m between %q and %q", name, fmtNum(-float64(c.Matrix[0][1])), c.Conductors[0], c.Conductors[1])
		}
	}
	// The body or edge at the highest fixed potential and what flows in
	// through it.
	best, bestV := -1, math.Inf(-1)
	for i, o := range j.mesh.Layout.Owners {
		if o.Cond.Kind == geom.Potential && o.Cond.Value > bestV {
			best, bestV = i, o.Cond.Value
		}
	}
	owners := j.sol.Owners()
	if best < 0 {
		// No fixed potential: the floating body with the largest net inflow.
		f := -1
		for i, o := range j.mesh.Layout.Owners {
			if o.Cond.Kind == geom.Floating && (f < 0 || math.Abs(o.Cond.NetInflow) > math.Abs(j.mesh.Layout.Owners[f].Cond.NetInflow)) {
				f = i
			}
		}
		if f < 0 || f >= len(j.sol.Floating) {
			return name
		}
		what := "net inflow"
		if sc.Problem.Physics == geom.Electrostatic {
			what = "charge"
		}
		return fmt.Sprintf("%s: %s %s %s on %q, floating at %s %s", name, what, fmtNum(owners[f].Inflow), units.Inflow,
			owners[f].Name, fmtNum(j.sol.Floating[f]), units.Potential)
	}
	res := owners[best]
	switch sc.Problem.Physics {
	case geom.Electrostatic:
		return fmt.Sprintf("%s: charge %s %s on %q (%s V)", name, fmtNum(res.Inflow), units.Inflow, res.Name, fmtNum(bestV))
	case geom.Seepage:
		return fmt.Sprintf("%s: discharge %s %s per metre in through %q (head %s m)", name, fmtNum(res.Inflow), units.Inflow, res.Name, fmtNum(bestV))
	}
	return fmt.Sprintf("%s: inflow %s through %q (u = %s)", name, fmtNum(res.Inflow), res.Name, fmtNum(bestV))
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

// flowNetText describes the flow net for the subtitle.
func flowNetText(net *grid.FlowNet, inflowUnit string, explicit bool) string {
	if len(net.Lines) == 0 || !(net.Channels > 0) {
		return ""
	}
	s := fmt.Sprintf("Flow net: %.3g flow channels, %d potential drops, shape factor %.4g = q/(k H)", net.Channels, net.Drops, net.ShapeFactor)
	if !net.Square {
		unit := " " + inflowUnit
		if inflowUnit == "1" {
			unit = ""
		}
		s += fmt.Sprintf("; one flux line every %s%s of flux", fmtNum(net.Step), unit)
	}
	if explicit {
		s += "; the drops are those of --levels, not the --at equipotentials drawn"
	}
	return s
}

// fmtNum formats a number with 4 significant digits.
func fmtNum(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// surfacePeak returns the peak field on the boundary that the physics
// reported in results.json (electrostatics: on the conductors), or nil.
func surfacePeak(j *job) *peakField {
	if j.pics == nil || j.pics.res == nil || j.pics.res.Electrostatic == nil {
		return nil
	}
	pk := j.pics.res.Electrostatic.PeakField
	if pk == nil || math.IsNaN(float64(pk.Value)) || math.IsInf(float64(pk.Value), 0) {
		return nil
	}
	return pk
}
