package template

import "math"

// Coaxial is a round conductor inside a round shield filled with one
// dielectric: a closed scene. The shield is an edge along the filler's
// outer ring, the conductor a body cut out of the filler. Lengths are in
// Unit; the conductor's centre sits Offset to the right of the shield's.
type Coaxial struct {
	Unit         string  // coordinate unit of the scene file; "" means mm
	Inner        float64 // radius of the inner conductor
	Outer        float64 // inner radius of the shield
	Offset       float64 // offset of the inner conductor along x (>= 0)
	Permittivity float64 // relative permittivity of the filler; 0 means 1
	Voltage      float64 // potential of the inner conductor in V; the shield is at 0 V
	Sides        int     // vertices per circle; 0 means DefaultSides
}

// Bytes returns the scene file.
func (c Coaxial) Bytes() ([]byte, error) {
	const name = "coaxial"
	cm, err := resolve(name, c.Unit, c.Sides, &c.Permittivity)
	if err != nil {
		return nil, err
	}
	if err := positive(name, cm.unit, quantity{"Inner", "inner radius", c.Inner}, quantity{"Outer", "outer radius", c.Outer}); err != nil {
		return nil, err
	}
	if !(c.Offset >= 0) || math.IsInf(c.Offset, 0) {
		return nil, errorf(name, "Offset", "the offset must be a length of 0 or more in %s, got %g", cm.unit, c.Offset)
	}
	if c.Inner+c.Offset >= c.Outer {
		return nil, errorf(name, "Outer", "the inner conductor (radius %g %s, offset %g %s) reaches the shield (radius %g %s); make the outer radius larger or the inner radius or offset smaller",
			c.Inner, cm.unit, c.Offset, cm.unit, c.Outer, cm.unit)
	}
	if err := finite(name, quantity{"Voltage", "voltage", c.Voltage}); err != nil {
		return nil, err
	}
	shield := circle(0, 0, c.Outer, cm.sides)
	return encode(name, sceneFile{
		Problem: problem{Unit: cm.unit},
		Features: []feature{
			region("filler", c.Permittivity, shield),
			body("inner", c.Voltage, circle(c.Offset, 0, c.Inner, cm.sides)),
			edge("shield", 0, shield),
		},
	})
}

// TwoWire is two parallel round wires of the same radius in open space, a
// balanced line: the left wire at +Voltage/2, the right one at
// -Voltage/2, centres Spacing apart on the x axis about the origin.
type TwoWire struct {
	Unit         string  // coordinate unit; "" means mm
	Radius       float64 // radius of each wire
	Spacing      float64 // distance between the wires' centres
	Permittivity float64 // relative permittivity of the surrounding medium; 0 means 1
	Voltage      float64 // potential difference between the wires in V
	Sides        int     // vertices per circle; 0 means DefaultSides
}

// Bytes returns the scene file.
func (t TwoWire) Bytes() ([]byte, error) {
	const name = "two-wire"
	cm, err := resolve(name, t.Unit, t.Sides, &t.Permittivity)
	if err != nil {
		return nil, err
	}
	if err := positive(name, cm.unit, quantity{"Radius", "radius", t.Radius}, quantity{"Spacing", "spacing", t.Spacing}); err != nil {
		return nil, err
	}
	if t.Spacing <= 2*t.Radius {
		return nil, errorf(name, "Spacing", "wires of radius %g %s touch at a spacing of %g %s; make the spacing more than twice the radius", t.Radius, cm.unit, t.Spacing, cm.unit)
	}
	if err := finite(name, quantity{"Voltage", "voltage", t.Voltage}); err != nil {
		return nil, err
	}
	return encode(name, sceneFile{
		Problem: problem{Unit: cm.unit, Open: true, BackgroundPermittivity: t.Permittivity},
		Features: []feature{
			body("left", t.Voltage/2, circle(-t.Spacing/2, 0, t.Radius, cm.sides)),
			body("right", -t.Voltage/2, circle(t.Spacing/2, 0, t.Radius, cm.sides)),
		},
	})
}

// WireOverGround is a round wire above a grounded plane y = 0 (the plane is
// the scene's ground member, not drawn), in an open half-space.
type WireOverGround struct {
	Unit         string  // coordinate unit; "" means mm
	Radius       float64 // radius of the wire
	Height       float64 // height of the wire's centre above the plane
	Permittivity float64 // relative permittivity of the medium above the plane; 0 means 1
	Voltage      float64 // potential of the wire in V; the plane is at 0 V
	Sides        int     // vertices per circle; 0 means DefaultSides
}

// Bytes returns the scene file.
func (w WireOverGround) Bytes() ([]byte, error) {
	const name = "wire-over-ground"
	cm, err := resolve(name, w.Unit, w.Sides, &w.Permittivity)
	if err != nil {
		return nil, err
	}
	if err := positive(name, cm.unit, quantity{"Radius", "radius", w.Radius}, quantity{"Height", "height", w.Height}); err != nil {
		return nil, err
	}
	if w.Height <= w.Radius {
		return nil, errorf(name, "Height", "a wire of radius %g %s at a height of %g %s touches the ground plane; make the height more than the radius", w.Radius, cm.unit, w.Height, cm.unit)
	}
	if err := finite(name, quantity{"Voltage", "voltage", w.Voltage}); err != nil {
		return nil, err
	}
	return encode(name, sceneFile{
		Problem:  problem{Unit: cm.unit, Open: true, BackgroundPermittivity: w.Permittivity, Ground: &ground{Y: 0}},
		Features: []feature{body("wire", w.Voltage, circle(0, w.Height, w.Radius, cm.sides))},
	})
}

// ShieldedPair is two round wires inside a round shield filled with one
// dielectric: a closed scene. The wires sit on the x axis at +-Spacing/2
// from the shield's centre, the left one at +Voltage/2 and the right one at
// -Voltage/2; the shield is an edge at 0 V.
type ShieldedPair struct {
	Unit         string  // coordinate unit; "" means mm
	Radius       float64 // radius of each wire
	Spacing      float64 // distance between the wires' centres
	Shield       float64 // inner radius of the shield
	Permittivity float64 // relative permittivity of the filler; 0 means 1
	Voltage      float64 // potential difference between the wires in V
	Sides        int     // vertices per circle; 0 means DefaultSides
}

// Bytes returns the scene file.
func (s ShieldedPair) Bytes() ([]byte, error) {
	const name = "shielded-pair"
	cm, err := resolve(name, s.Unit, s.Sides, &s.Permittivity)
	if err != nil {
		return nil, err
	}
	if err := positive(name, cm.unit, quantity{"Radius", "radius", s.Radius}, quantity{"Spacing", "spacing", s.Spacing}, quantity{"Shield", "shield radius", s.Shield}); err != nil {
		return nil, err
	}
	if s.Spacing <= 2*s.Radius {
		return nil, errorf(name, "Spacing", "wires of radius %g %s touch at a spacing of %g %s; make the spacing more than twice the radius", s.Radius, cm.unit, s.Spacing, cm.unit)
	}
	if s.Spacing/2+s.Radius >= s.Shield {
		return nil, errorf(name, "Shield", "the wires (radius %g %s, spacing %g %s) reach the shield (radius %g %s); make the shield radius larger than half the spacing plus the radius",
			s.Radius, cm.unit, s.Spacing, cm.unit, s.Shield, cm.unit)
	}
	if err := finite(name, quantity{"Voltage", "voltage", s.Voltage}); err != nil {
		return nil, err
	}
	shield := circle(0, 0, s.Shield, cm.sides)
	return encode(name, sceneFile{
		Problem: problem{Unit: cm.unit},
		Features: []feature{
			region("filler", s.Permittivity, shield),
			body("left", s.Voltage/2, circle(-s.Spacing/2, 0, s.Radius, cm.sides)),
			body("right", -s.Voltage/2, circle(s.Spacing/2, 0, s.Radius, cm.sides)),
			edge("shield", 0, shield),
		},
	})
}
