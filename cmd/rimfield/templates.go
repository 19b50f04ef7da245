package main

import (
	"errors"
	"strings"

	tpl "github.com/rimfield/rimfield/geom/template"
	"github.com/spf13/pflag"
)

// The electrostatic starter scenes of rimfield new, built by package
// geom/template. Every template has --unit (the coordinate unit of the
// scene file, in which its lengths are given) and --sides (vertices per
// circle).

func init() {
	registerTemplate("coaxial", template{
		summary: "round conductor in a round shield with one dielectric (closed)",
		about: `
A round inner conductor inside a round shield, the space between filled with
one dielectric: a closed scene with the filler as a region, the inner
conductor as a body at --voltage and the shield as an edge at 0 V. With
--offset the inner conductor moves off the axis along x. Lengths are in
--unit.`,
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			var c tpl.Coaxial
			unitFlag(fs, &c.Unit)
			fs.Float64Var(&c.Inner, "inner", 1.2, "radius of the inner conductor, in --unit")
			fs.Float64Var(&c.Outer, "outer", 4, "inner radius of the shield, in --unit")
			fs.Float64Var(&c.Offset, "offset", 0, "offset of the inner conductor's centre from the shield's along x, in --unit")
			fs.Float64Var(&c.Permittivity, "permittivity", 2.1, "relative permittivity of the filler (1 for air)")
			fs.Float64Var(&c.Voltage, "voltage", 1, "potential of the inner conductor in volts (the shield is at 0 V)")
			sidesFlag(fs, &c.Sides, "each circle")
			return func() ([]byte, error) { return templateBytes(c.Bytes()) }
		},
	})
	registerTemplate("two-wire", template{
		summary: "two parallel round wires in open space (balanced line)",
		about: `
Two parallel round wires of the same radius in open space, centres --spacing
apart on the x axis: the left wire at +voltage/2, the right one at
-voltage/2. Lengths are in --unit.`,
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			var w tpl.TwoWire
			unitFlag(fs, &w.Unit)
			fs.Float64Var(&w.Radius, "radius", 0.5, "radius of each wire, in --unit")
			fs.Float64Var(&w.Spacing, "spacing", 3, "distance between the wires' centres, in --unit")
			fs.Float64Var(&w.Permittivity, "permittivity", 1, "relative permittivity of the surrounding medium (1 for air)")
			fs.Float64Var(&w.Voltage, "voltage", 1, "potential difference between the wires in volts")
			sidesFlag(fs, &w.Sides, "each circle")
			return func() ([]byte, error) { return templateBytes(w.Bytes()) }
		},
	})
	registerTemplate("wire-over-ground", template{
		summary: "round wire above a grounded plane (open half-space)",
		about: `
A round wire above an infinite grounded plane y = 0, which the scene states
with the "ground" member of its problem rather than drawing it. The wire is
at --voltage, the plane at 0 V. Lengths are in --unit.`,
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			var w tpl.WireOverGround
			unitFlag(fs, &w.Unit)
			fs.Float64Var(&w.Radius, "radius", 0.5, "radius of the wire, in --unit")
			fs.Float64Var(&w.Height, "height", 5, "height of the wire's centre above the plane, in --unit")
			fs.Float64Var(&w.Permittivity, "permittivity", 1, "relative permittivity of the medium above the plane (1 for air)")
			fs.Float64Var(&w.Voltage, "voltage", 1, "potential of the wire in volts (the plane is at 0 V)")
			sidesFlag(fs, &w.Sides, "the circle")
			return func() ([]byte, error) { return templateBytes(w.Bytes()) }
		},
	})
	registerTemplate("shielded-pair", template{
		summary: "two round wires inside a round shield with one dielectric (closed)",
		about: `
Two round wires inside a round shield filled with one dielectric: a closed
scene. The wires sit on the x axis --spacing apart about the shield's
centre, the left one at +voltage/2 and the right one at -voltage/2; the
shield is an edge at 0 V. Lengths are in --unit.`,
		flags: func(fs *pflag.FlagSet) func() ([]byte, error) {
			var s tpl.ShieldedPair
			unitFlag(fs, &s.Unit)
			fs.Float64Var(&s.Radius, "radius", 0.5, "radius of each wire, in --unit")
			fs.Float64Var(&s.Spacing, "spacing", 2, "distance between the wires' centres, in --unit")
			fs.Float64Var(&s.Shield, "shield", 3, "inner radius of the shield, in --unit")
			fs.Float64Var(&s.Permittivity, "permittivity", 2.1, "relative permittivity of the filler (1 for air)")
			fs.Float64Var(&s.Voltage, "voltage", 1, "potential difference between the wires in volts (the shield is at 0 V)")
			sidesFlag(fs, &s.Sides, "each circle")
			return func() ([]byte, error) { return templateBytes(s.Bytes()) }
		},
	})
}

// templateBytes turns a template's complaint about a parameter into a usage
// error naming the flag: each parameter's flag is its name in lower case.
func templateBytes(data []byte, err error) ([]byte, error) {
	var te *tpl.Error
	if errors.As(err, &te) {
		return nil, usagef("--%s: %s", strings.ToLower(te.Param), te.Msg)
	}
	return data, err
}

// unitFlag defines --unit, the coordinate unit every template takes.
func unitFlag(fs *pflag.FlagSet, unit *string) {
	fs.StringVar(unit, "unit", tpl.DefaultUnit, "coordinate unit of the scene file and of the lengths below: m, cm, mm, um, km, in or ft")
}

// sidesFlag defines --sides, the polygon's vertex count for what (each
// circle, the circle).
func sidesFlag(fs *pflag.FlagSet, sides *int, what string) {
	fs.IntVar(sides, "sides", tpl.DefaultSides, "vertices of the polygon that stands for "+what+", a count (at least 16)")
}
