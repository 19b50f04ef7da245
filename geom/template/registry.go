package template

import (
	"slices"
	"strings"
)

// Param is one parameter of a registered template as a command line shows
// it: its flag name, a usage text with its unit, and Value, a pointer to
// the parameter (*float64, *int, *string or *bool) holding its default.
type Param struct {
	Name  string
	Usage string
	Value any
}

// Entry is a registered template: what rimfield new lists and builds.
type Entry struct {
	Name    string // "coaxial"
	Summary string // one line for the list of templates
	About   string // explains the configuration and its parameters
	// New returns fresh parameters with their defaults in place and the
	// builder that reads them once they are set; the builder's errors are
	// *Error naming the parameter by its struct field (the flag in lower
	// case).
	New func() (params []Param, build func() ([]byte, error))
}

// registry holds the templates by name; files of this package add theirs
// in an init function with register.
var registry = map[string]Entry{}

// register adds a template. It panics on a duplicate name, a programming
// error found by any run.
func register(e Entry) {
	if _, dup := registry[e.Name]; dup {
		panic("template: " + e.Name + " registered twice")
	}
	registry[e.Name] = e
}

// Entries returns the registered templates in the order of their names.
func Entries() []Entry {
	out := make([]Entry, 0, len(registry))
	for _, e := range registry {
		out = append(out, e)
	}
	slices.SortFunc(out, func(a, b Entry) int { return strings.Compare(a.Name, b.Name) })
	return out
}

// Lookup returns the template of that name.
func Lookup(name string) (Entry, bool) {
	e, ok := registry[name]
	return e, ok
}

// unitParam is --unit, the coordinate unit every template takes.
func unitParam(unit *string) Param {
	*unit = DefaultUnit
	return Param{"unit", "coordinate unit of the scene file and of the lengths below: m, cm, mm, um, km, in or ft", unit}
}

// sidesParam is --sides, the polygon's vertex count for what ("each
// circle", "the circle").
func sidesParam(sides *int, what string) Param {
	*sides = DefaultSides
	return Param{"sides", "vertices of the polygon that stands for " + what + ", a count (at least 16)", sides}
}

// length and number are the other kinds of parameter: a length in --unit
// and a plain number.
func length(name string, v *float64, def float64, usage string) Param {
	*v = def
	return Param{name, usage + ", in --unit", v}
}

func number(name string, v *float64, def float64, usage string) Param {
	*v = def
	return Param{name, usage, v}
}

func init() {
	register(Entry{
		Name:    "coaxial",
		Summary: "round conductor in a round shield with one dielectric (closed)",
		About: `
A round inner conductor inside a round shield, the space between filled with
one dielectric: a closed scene with the filler as a region, the inner
conductor as a body at --voltage and the shield as an edge at 0 V. With
--offset the inner conductor moves off the axis along x. Lengths are in
--unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var c Coaxial
			return []Param{
				unitParam(&c.Unit),
				length("inner", &c.Inner, 1.2, "radius of the inner conductor"),
				length("outer", &c.Outer, 4, "inner radius of the shield"),
				length("offset", &c.Offset, 0, "offset of the inner conductor's centre from the shield's along x"),
				number("permittivity", &c.Permittivity, 2.1, "relative permittivity of the filler (1 for air)"),
				number("voltage", &c.Voltage, 1, "potential of the inner conductor in volts (the shield is at 0 V)"),
				sidesParam(&c.Sides, "each circle"),
			}, func() ([]byte, error) { return c.Bytes() }
		},
	})
	register(Entry{
		Name:    "two-wire",
		Summary: "two parallel round wires in open space (balanced line)",
		About: `
Two parallel round wires of the same radius in open space, centres --spacing
apart on the x axis: the left wire at +voltage/2, the right one at
-voltage/2. Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var w TwoWire
			return []Param{
				unitParam(&w.Unit),
				length("radius", &w.Radius, 0.5, "radius of each wire"),
				length("spacing", &w.Spacing, 3, "distance between the wires' centres"),
				number("permittivity", &w.Permittivity, 1, "relative permittivity of the surrounding medium (1 for air)"),
				number("voltage", &w.Voltage, 1, "potential difference between the wires in volts"),
				sidesParam(&w.Sides, "each circle"),
			}, func() ([]byte, error) { return w.Bytes() }
		},
	})
	register(Entry{
		Name:    "wire-over-ground",
		Summary: "round wire above a grounded plane (open half-space)",
		About: `
A round wire above an infinite grounded plane y = 0, which the scene states
with the "ground" member of its problem rather than drawing it. The wire is
at --voltage, the plane at 0 V. Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var w WireOverGround
			return []Param{
				unitParam(&w.Unit),
				length("radius", &w.Radius, 0.5, "radius of the wire"),
				length("height", &w.Height, 5, "height of the wire's centre above the plane"),
				number("permittivity", &w.Permittivity, 1, "relative permittivity of the medium above the plane (1 for air)"),
				number("voltage", &w.Voltage, 1, "potential of the wire in volts (the plane is at 0 V)"),
				sidesParam(&w.Sides, "the circle"),
			}, func() ([]byte, error) { return w.Bytes() }
		},
	})
	register(Entry{
		Name:    "shielded-pair",
		Summary: "two round wires inside a round shield with one dielectric (closed)",
		About: `
Two round wires inside a round shield filled with one dielectric: a closed
scene. The wires sit on the x axis --spacing apart about the shield's
centre, the left one at +voltage/2 and the right one at -voltage/2; the
shield is an edge at 0 V. Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var s ShieldedPair
			return []Param{
				unitParam(&s.Unit),
				length("radius", &s.Radius, 0.5, "radius of each wire"),
				length("spacing", &s.Spacing, 2, "distance between the wires' centres"),
				length("shield", &s.Shield, 3, "inner radius of the shield"),
				number("permittivity", &s.Permittivity, 2.1, "relative permittivity of the filler (1 for air)"),
				number("voltage", &s.Voltage, 1, "potential difference between the wires in volts (the shield is at 0 V)"),
				sidesParam(&s.Sides, "each circle"),
			}, func() ([]byte, error) { return s.Bytes() }
		},
	})
}
