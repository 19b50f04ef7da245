package template

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strconv"

	"github.com/rimfield/rimfield/geom"
)

// Error is a template's complaint about its parameters.
type Error struct {
	Template string // "coaxial"
	// Param is the parameter at fault, named as the template's struct
	// field ("Inner"), so that a caller can name its own flag or key.
	Param string
	Msg   string // what is wrong and the fix
}

// Error formats the error as "template: <template>: <Msg>".
func (e *Error) Error() string { return "template: " + e.Template + ": " + e.Msg }

// errorf returns an *Error.
func errorf(tpl, param, format string, args ...any) *Error {
	return &Error{Template: tpl, Param: param, Msg: fmt.Sprintf(format, args...)}
}

// DefaultSides is the number of polygon vertices per circle when a template
// does not say.
const DefaultSides = 512

// minSides is the fewest vertices accepted for a circle: below it a circle
// is a polygon with corners of its own.
const minSides = 16

// DefaultUnit is the coordinate unit of a template that does not say.
const DefaultUnit = "mm"

// coord is a coordinate written with 12 significant digits: plenty for a
// polygonal circle, short enough to read.
type coord float64

func (c coord) MarshalJSON() ([]byte, error) {
	f := float64(c)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return nil, fmt.Errorf("template: coordinate %v is not a finite number", f)
	}
	if f == 0 {
		f = 0 // no "-0"
	}
	return strconv.AppendFloat(nil, f, 'g', 12, 64), nil
}

type point [2]coord

// sceneFile is a scene file as written.
type sceneFile struct {
	Type     string    `json:"type"`
	Problem  problem   `json:"problem"`
	Features []feature `json:"features"`
}

type problem struct {
	Physics                string  `json:"physics"`
	Unit                   string  `json:"unit"`
	Open                   bool    `json:"open"`
	BackgroundPermittivity float64 `json:"background_permittivity,omitempty"`
	Ground                 *ground `json:"ground,omitempty"`
}

type ground struct {
	Y coord `json:"y"`
}

type feature struct {
	Type       string     `json:"type"`
	Properties properties `json:"properties"`
	Geometry   geometry   `json:"geometry"`
}

type properties struct {
	Part         string   `json:"part"`
	Name         string   `json:"name"`
	Potential    *float64 `json:"potential,omitempty"`
	Permittivity float64  `json:"permittivity,omitempty"`
}

// geometry holds either a polygon's rings or a line's points.
type geometry struct {
	Type  string
	Rings [][]point // Polygon
	Line  []point   // LineString
}

func (g geometry) MarshalJSON() ([]byte, error) {
	var coords any = g.Rings
	if g.Type == "LineString" {
		coords = g.Line
	}
	return json.Marshal(struct {
		Type        string `json:"type"`
		Coordinates any    `json:"coordinates"`
	}{g.Type, coords})
}

// circle returns the closed ring of the regular n-gon inscribed in the
// circle of radius r about (cx, cy), counter-clockwise, with a vertex at
// angle 0. Offsets below 1e-12 r from the centre (the rounding of the
// cosine at a quarter turn) are written as exact zeros.
func circle(cx, cy, r float64, n int) []point {
	snap := func(v float64) float64 {
		if math.Abs(v) < 1e-12*r {
			return 0
		}
		return v
	}
	out := make([]point, n+1)
	for k := range n {
		a := 2 * math.Pi * float64(k) / float64(n)
		out[k] = point{coord(cx + snap(r*math.Cos(a))), coord(cy + snap(r*math.Sin(a)))}
	}
	out[n] = out[0]
	return out
}

func potential(v float64) *float64 { return &v }

func region(name string, epsr float64, rings ...[]point) feature {
	return feature{"Feature", properties{Part: "region", Name: name, Permittivity: epsr}, geometry{Type: "Polygon", Rings: rings}}
}

func body(name string, v float64, rings ...[]point) feature {
	return feature{"Feature", properties{Part: "body", Name: name, Potential: potential(v)}, geometry{Type: "Polygon", Rings: rings}}
}

func edge(name string, v float64, line []point) feature {
	return feature{"Feature", properties{Part: "edge", Name: name, Potential: potential(v)}, geometry{Type: "LineString", Line: line}}
}

// common holds the settings every template shares.
type common struct {
	unit  string
	sides int
}

// resolve fills in the defaults of the unit and the circle vertex count and
// checks them and the relative permittivity.
func resolve(name, unit string, sides int, epsr *float64) (common, error) {
	c := common{unit: unit, sides: sides}
	if c.unit == "" {
		c.unit = DefaultUnit
	}
	if c.sides == 0 {
		c.sides = DefaultSides
	}
	if c.sides < minSides {
		return c, errorf(name, "Sides", "%d vertices per circle is too few: a circle needs at least %d (%d recommended)", sides, minSides, DefaultSides)
	}
	if *epsr == 0 {
		*epsr = 1
	}
	if !(*epsr >= 1) || math.IsInf(*epsr, 0) {
		return c, errorf(name, "Permittivity", "relative permittivity %g must be a finite number of at least 1", *epsr)
	}
	return c, nil
}

// quantity is a named number to check: a dimension or a potential, with
// the struct field it comes from.
type quantity struct {
	param string
	what  string
	v     float64
}

// positive checks that each dimension is a positive finite length.
func positive(name, unit string, dims ...quantity) error {
	for _, d := range dims {
		if !(d.v > 0) || math.IsInf(d.v, 0) {
			return errorf(name, d.param, "the %s must be a positive length in %s, got %g", d.what, unit, d.v)
		}
	}
	return nil
}

// finite checks that each potential is a finite number of volts.
func finite(name string, vs ...quantity) error {
	for _, v := range vs {
		if math.IsNaN(v.v) || math.IsInf(v.v, 0) {
			return errorf(name, v.param, "the %s must be a finite number of volts, got %g", v.what, v.v)
		}
	}
	return nil
}

// encode writes an electrostatic scene file and reads it back (see
// writeScene).
func encode(name string, f sceneFile) ([]byte, error) {
	f.Problem.Physics = geom.Electrostatic.String()
	features := make([]any, len(f.Features))
	for i, ft := range f.Features {
		features[i] = ft
	}
	return writeScene(name, f.Problem, features)
}

// writeScene writes a scene file with the given problem member, one
// feature per line, and reads it back with geom.Read and lays it out, so
// that what a template hands out is a valid scene. A complaint about the
// unit names the template's Unit.
func writeScene(name string, problem any, features []any) ([]byte, error) {
	var b bytes.Buffer
	head, err := json.Marshal(problem)
	if err != nil {
		return nil, fmt.Errorf("template: %s: %w", name, err)
	}
	fmt.Fprintf(&b, "{\"type\": \"FeatureCollection\",\n \"problem\": %s,\n \"features\": [", head)
	for i, ft := range features {
		line, err := json.Marshal(ft)
		if err != nil {
			return nil, fmt.Errorf("template: %s: %w", name, err)
		}
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString("\n  ")
		b.Write(line)
	}
	b.WriteString("\n ]}\n")
	sc, err := geom.Read(bytes.NewReader(b.Bytes()))
	if err != nil {
		var ge *geom.Error
		if errors.As(err, &ge) && ge.Member == "problem.unit" {
			return nil, errorf(name, "Unit", "%s", ge.Msg)
		}
		return nil, fmt.Errorf("template: %s: %w", name, err)
	}
	if _, err := sc.Layout(); err != nil {
		return nil, fmt.Errorf("template: %s: %w", name, err)
	}
	return b.Bytes(), nil
}
