package main

import (
	"math"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/spatial/r2"
)

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

	res   *results
	drawn []picture
	net   *grid.FlowNet
	lines [][]r2.Vec // the lines drawn over the potential: the flow net's, or the job's
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

// addPictureFlags defines the flags of the pictures and the report on fs.
func addPictureFlags(fs *pflag.FlagSet) *pictureJob {
	p := &pictureJob{}
	fs.StringVar(&p.atText, "at", "", "explicit equipotential `LEVELS`, comma-separated in the potential's unit (e.g. 0.1,0.5,0.9), instead of --levels; for contours and pictures")
	fs.StringVar(&p.sizeText, "image-size", "", "picture size `WxH` in pixels (e.g. 1600x900); default 1400 wide, height from the scene's proportions")
	fs.StringVar(&p.winText, "window", "", "area `X0,Y0,X1,Y1` (scene units: lower left and upper right corners) that contours and pictures cover; default: the whole scene, 1.5 times the bodies' extent in an open scene, the structures of a long seepage section and twice the soil's depth on either side")
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
