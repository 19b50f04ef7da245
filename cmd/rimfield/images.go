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

// pictureJob returns the job's picture state, with the defaults when the
// job came without picture flags (tests, library use).
func (j *job) pictureJob() (*pictureJob, error) {
	if j.pics == nil {
		pj := &pictureJob{}
		if err := pj.check(); err != nil {
			return nil, err
		}
		j.pics = pj
	}
	return j.pics, nil
}

// flowNetFiles traces the flux lines (kept for the pictures) and puts the
// flow net's numbers into results.json; it writes no file.
func flowNetFiles(j *job) ([]outputFile, error) {
	pj, err := j.pictureJob()
	if err != nil {
		return nil, err
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

// quantityNames names the potential and |grad u| for the pictures, with
// their SI units ("1": none).
func quantityNames(p geom.Physics) (potential, potUnit, field, fieldUnit string) {
	u := unitsOf(p)
	switch p {
	case geom.Electrostatic:
		return "potential", u.Potential, "field strength |E|", "V/m"
	case geom.Seepage:
		return "total head", u.Potential, "hydraulic gradient |i|", "1"
	case geom.Flow:
		return "potential", u.Potential, "speed |grad u|", "m/s"
	}
	return "potential u", "1", "|grad u|", "1/m"
}

// pictureFiles draws potential.png, field.png and boundary.png (and their
// SVGs with --svg).
func pictureFiles(j *job) ([]outputFile, error) {
	pj, err := j.pictureJob()
	if err != nil {
		return nil, err
	}
	g := j.sampled()
	sc := j.scene
	units := unitsOf(sc.Problem.Physics)
	potName, potUnit, fieldName, fieldUnit := quantityNames(sc.Problem.Physics)
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
	// Title: the scene and its main result; below, the peak field and the
	// flow net.
	title := sceneName(j.scenePath)
	main, peakText := mainResult(j)
	if main != "" {
		title += ": " + main
	}
	var potSub []string
	if peakText != "" {
		potSub = append(potSub, capitalise(peakText))
	}
	if fn := flowNetText(net, units.Inflow, pj.at != nil); fn != "" {
		potSub = append(potSub, fn)
	}
	pot := &draw.Map{Grid: g, Values: g.U, Label: potName, Unit: potUnit, Title: title,
		Subtitle: strings.Join(potSub, "\n"), Contours: contours, Lines: lines, Scene: sc}
	if hi > lo {
		pot.Lo, pot.Hi = lo, hi
	}

	mag := g.Magnitude()
	peak, at := grid.Peak(mag)
	sub := "Colours stop at the 99th percentile of the samples (arrow on the colour bar)."
	if len(j.mesh.Singular) > 0 {
		sub += " At sharp corners and changes of condition the field is infinite in theory: see the cautions."
	}
	fld := &draw.Map{Grid: g, Values: mag, FromZero: true, Clip: 0.99, Label: fieldName, Unit: fieldUnit,
		Title:    fmt.Sprintf("%s: largest on the %d x %d sampling grid %s", capitalise(fieldName), g.NX, g.NY, draw.FormatSI(peak, fieldUnit)),
		Subtitle: sub, Scene: sc}
	if sp := surfacePeak(j); sp != nil {
		// The physics found the peak on the conductors' surfaces, which the
		// grid, stopping short of the boundary, cannot see: mark that one.
		// Both numbers in the peak's unit, so that they compare at a glance.
		d := draw.DisplayFor(fieldUnit, float64(sp.Value))
		fld.Title = fmt.Sprintf("%s: peak %s on %q (largest on the sampling grid %s)", capitalise(fieldName),
			d.Format(float64(sp.Value)), sp.Boundary, d.Format(peak))
		fld.Marker = &draw.Marker{At: r2.Vec{X: float64(sp.X), Y: float64(sp.Y)}, Text: "peak " + d.Format(float64(sp.Value))}
	} else if at >= 0 {
		fld.Marker = &draw.Marker{At: g.Point(at%g.NX, at/g.NX), Text: "largest " + draw.FormatSI(peak, fieldUnit)}
	} else {
		j.warnings = append(j.warnings, "field.png has no peak: no grid sample lies in the domain; give a larger --image-size or check the scene")
	}

	potSeries, inSeries := draw.BoundarySeries(j.sol)
	xLabel, xScale := arcLengthAxis(sc, potSeries)
	for _, set := range [][]draw.Series{potSeries, inSeries} {
		for k := range set {
			for i := range set[k].X {
				set[k].X[i] /= xScale
			}
		}
	}
	inTitle, inLabel := "Inflow density (flux entering the domain positive)", "inflow density"
	if sc.Problem.Physics == geom.Electrostatic {
		// On a conductor the inflow density is the surface charge density.
		inTitle, inLabel = "Surface charge density (inflow density: flux entering the domain positive)", "charge density"
	}
	charts := draw.Charts{
		{Title: "Potential along each boundary", XLabel: xLabel, YLabel: potName, YUnit: potUnit, Series: potSeries},
		{Title: inTitle, XLabel: xLabel, YLabel: inLabel, YUnit: units.InflowDensity, Series: inSeries, Clip: 0.98},
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
		{fieldPicture, fieldCaption(j),
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
	return "arc length along the boundary (" + unit + ")", s
}

// fieldCaption describes field.png for the report.
func fieldCaption(j *job) string {
	if surfacePeak(j) != nil {
		return "Magnitude of the potential gradient; the circle marks the peak on the conductors' surfaces (results.json peak_field)."
	}
	return "Magnitude of the potential gradient; the circle marks the largest value on the sampling grid."
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
func headline(j *job) string {
	name := sceneName(j.scenePath)
	main, peak := mainResult(j)
	switch {
	case main != "" && peak != "":
		return name + ": " + main + "; " + peak
	case main != "" || peak != "":
		return name + ": " + main + peak
	}
	return name
}

// mainResult states the scene's main result for people, SI with the prefix
// that suits it, and in electrostatics the peak field on the conductors:
//
//   - electrostatics with two fixed conductors: the capacitance between
//     them, -C12 of the Maxwell matrix; with three, the three partial
//     capacitances between them; with more, the first conductor's
//     self-capacitance C11; with one, its capacitance to ground when it
//     has one (a ground plane).
//   - seepage: the discharge.
//   - otherwise: what flows in through the boundary at the highest fixed
//     potential (or the floating body with the largest net inflow).
func mainResult(j *job) (main, peak string) {
	sc := j.scene
	units := unitsOf(sc.Problem.Physics)
	var r *results
	if pj := j.pics; pj != nil {
		r = pj.res
	}
	if r != nil && sc.Problem.Physics == geom.Seepage && r.Seepage != nil {
		return fmt.Sprintf("discharge %s per metre", draw.FormatSI(float64(r.Seepage.Discharge), "m^2/s")), ""
	}
	var e *electrostaticSection
	if r != nil {
		e = r.Electrostatic
	}
	if e != nil && e.PeakField != nil && isFinite(float64(e.PeakField.Value)) {
		peak = fmt.Sprintf("peak field %s on %q", draw.FormatSI(float64(e.PeakField.Value), "V/m"), e.PeakField.Boundary)
		if peakMeshDependent(e, sceneSize(j)) {
			peak += " (mesh-dependent: see the warnings)"
		}
	}
	if c := capacitanceText(e); c != "" {
		return c, peak
	}
	return boundaryResult(j, units), peak
}

// capacitanceText states the capacitances of an electrostatic section's
// fixed conductors, or "" when there are none (or one with nothing to
// return its field to).
func capacitanceText(e *electrostaticSection) string {
	if e == nil || e.Capacitance == nil {
		return ""
	}
	c := e.Capacitance
	n := len(c.Conductors)
	if n < 1 || len(c.Matrix) != n {
		return ""
	}
	for _, row := range c.Matrix {
		if len(row) != n {
			return ""
		}
	}
	switch n {
	case 1:
		// One fixed conductor: its capacitance to ground (a ground plane,
		// a floating body's surroundings). Zero to rounding when nothing
		// takes its field lines back (an open scene without a ground):
		// C/eps0 is a shape factor of order 0.1 to 100 in two dimensions,
		// and 1e-6 would need a gap ratio of exp(2 pi 1e6).
		if v := float64(c.Matrix[0][0]); v > 1e-6*geom.Eps0 {
			return fmt.Sprintf("C = %s between %q and ground", draw.FormatSI(v, "F/m"), c.Conductors[0])
		}
		return ""
	case 2:
		return fmt.Sprintf("C = %s between %q and %q", draw.FormatSI(-float64(c.Matrix[0][1]), "F/m"), c.Conductors[0], c.Conductors[1])
	case 3:
		// The partial capacitances between the pairs, -C_ij, in one unit.
		var vals []float64
		var pairs []string
		for i := range 3 {
			for k := i + 1; k < 3; k++ {
				vals = append(vals, -float64(c.Matrix[i][k]))
				pairs = append(pairs, c.Conductors[i]+"–"+c.Conductors[k])
			}
		}
		d := draw.DisplayFor("F/m", maxAbs(vals))
		parts := make([]string, len(vals))
		for i, v := range vals {
			parts[i] = pairs[i] + " " + d.Number(denoise(v, vals))
		}
		return "capacitances " + strings.Join(parts, ", ") + " " + d.Unit
	}
	return fmt.Sprintf("self-capacitance C11 = %s of %q (%d conductors: matrix in the report)", draw.FormatSI(float64(c.Matrix[0][0]), "F/m"), c.Conductors[0], n)
}

// boundaryResult states what flows in through the body or edge at the
// highest fixed potential, or, with no fixed potential, the floating body
// with the largest net inflow.
func boundaryResult(j *job, units quantityUnits) string {
	sc := j.scene
	best, bestV := -1, math.Inf(-1)
	for i, o := range j.mesh.Layout.Owners {
		if o.Cond.Kind == geom.Potential && o.Cond.Value > bestV {
			best, bestV = i, o.Cond.Value
		}
	}
	owners := j.sol.Owners()
	if best < 0 {
		f := -1
		for i, o := range j.mesh.Layout.Owners {
			if o.Cond.Kind == geom.Floating && (f < 0 || math.Abs(o.Cond.NetInflow) > math.Abs(j.mesh.Layout.Owners[f].Cond.NetInflow)) {
				f = i
			}
		}
		if f < 0 || f >= len(j.sol.Floating) {
			return ""
		}
		what := "net inflow"
		if sc.Problem.Physics == geom.Electrostatic {
			what = "charge"
		}
		return fmt.Sprintf("%s %s on %q, floating at %s", what, draw.FormatSI(owners[f].Inflow, units.Inflow),
			owners[f].Name, draw.FormatSI(j.sol.Floating[f], units.Potential))
	}
	res := owners[best]
	switch sc.Problem.Physics {
	case geom.Electrostatic:
		return fmt.Sprintf("charge %s on %q (%s)", draw.FormatSI(res.Inflow, units.Inflow), res.Name, draw.FormatSI(bestV, units.Potential))
	case geom.Seepage:
		return fmt.Sprintf("discharge %s per metre in through %q (head %s)", draw.FormatSI(res.Inflow, units.Inflow), res.Name, draw.FormatSI(bestV, units.Potential))
	}
	return fmt.Sprintf("inflow %s through %q (u = %s)", fmtNum(res.Inflow), res.Name, fmtNum(bestV))
}

// peakMeshDependent reports whether the conductors' peak field depends on
// the mesh: it sits on a singular corner, or the refinement study moved it
// by more than 1 % (the electrostatic warnings' threshold). size is the
// scene's size in metres.
func peakMeshDependent(e *electrostaticSection, size float64) bool {
	if e.PeakField == nil || e.electroExtras == nil {
		return false
	}
	if rf := e.PeakRefinement; rf != nil && math.Abs(float64(rf.Ratio)-1) > 0.01 {
		return true
	}
	return peakCorner(e, size) != nil
}

// sceneSize returns the diagonal of the area the pictures cover, metres.
func sceneSize(j *job) float64 {
	s := grid.Auto(j.mesh).Size()
	return math.Hypot(s.X, s.Y)
}

// peakCorner returns the singular corner of the electrostatic section at
// which the peak field sits, or nil. size is the scene's size in metres.
func peakCorner(e *electrostaticSection, size float64) *singularCorner {
	if e.PeakField == nil || e.electroExtras == nil {
		return nil
	}
	px, py := float64(e.PeakField.X), float64(e.PeakField.Y)
	best, at := math.Inf(1), -1
	for i, c := range e.SingularCorners {
		if d := math.Hypot(float64(c.X)-px, float64(c.Y)-py); d < best {
			best, at = d, i
		}
	}
	// The peak is reported on the panel next to the corner, the corner at
	// the vertex: the same point to the first panel's size (observed 6e-6
	// of the scene's size in busbars), while distinct corners lie a
	// geometric feature apart (8 mm of 250 mm there): 1e-4 of the size
	// tells them apart.
	if at < 0 || best > 1e-4*size {
		return nil
	}
	return &e.SingularCorners[at]
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// maxAbs returns the largest finite magnitude of vs (0 for none).
func maxAbs(vs []float64) float64 {
	m := 0.0
	for _, v := range vs {
		if isFinite(v) {
			m = math.Max(m, math.Abs(v))
		}
	}
	return m
}

// noise is the magnitude, relative to the largest entry of its set, below
// which a computed value is taken as rounding noise and shown as 0: sums
// that cancel (the charge on an enclosing conductor's far side, a to-ground
// capacitance inside a closed box) come out near 1e-16 of the terms, and a
// genuine value a billion times smaller than its neighbours has no meaning
// at the default accuracy of 1e-3 (common practice).
const noise = 1e-9

// denoise returns v, or 0 when it is below noise times the largest of set.
func denoise(v float64, set []float64) float64 {
	if math.Abs(v) < noise*maxAbs(set) {
		return 0
	}
	return v
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
		s += fmt.Sprintf("; one flux line every %s of flux", draw.FormatSI(net.Step, inflowUnit))
	}
	if explicit {
		s += "; the drops are those of --levels, not the --at equipotentials drawn"
	}
	return s
}

// fmtNum formats a number with 4 significant digits, with a short exponent
// outside [1e-4, 1e4): "5.043e6", "2.361e-8".
func fmtNum(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	s := strconv.FormatFloat(v, 'g', 4, 64)
	m, e, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	sign := ""
	if strings.HasPrefix(e, "-") {
		sign = "-"
	}
	return m + "e" + sign + strings.TrimLeft(e, "+-0")
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
