package template

// The flow sections of rimfield new. Every one takes the parameters of
// Flow: the coordinate unit, the stream's speed and angle, the density
// and an optional ground plane.

// flowParams are the parameters every flow section takes; unit in mm.
func flowParams(f *Flow) []Param {
	return []Param{
		unitParam(&f.Unit),
		number("speed", &f.Speed, 1, "speed of the uniform stream in m/s"),
		number("angle", &f.AngleDeg, 4, "angle of attack in degrees: the stream's angle to the chord line, anticlockwise (positive lifts the section)"),
		number("density", &f.Density, 1.225, "density of the fluid in kg/m^3 (1.225: air at sea level; about 1000 for water)"),
		number("ground-height", &f.GroundHeight, 0, "height of the quarter-chord point above a ground plane (a slip wall), in --unit; 0 for none. With a ground plane the stream runs along it and the section is pitched by --angle"),
	}
}

// pointsParam is --points, the outline's resolution.
func pointsParam(points *int, what string) Param {
	*points = DefaultSectionPoints
	return Param{"points", "points " + what + ", a count (at least 16; cosine spaced toward the edges)", points}
}

func init() {
	register(Entry{
		Name:    "naca4",
		Summary: "NACA 4-digit wing section in a uniform stream (ideal flow, Kutta condition)",
		About: `
A NACA 4-digit section (--code MPTT: maximum camber M % of the chord at P
tenths of the chord, thickness TT %) from the published equations, with
cosine spacing toward the leading and trailing edges, in a uniform stream
at --angle. The trailing edge carries the Kutta condition: a sharp vertex
with --closed-te, else the published short base across which the flow
leaves with equal speeds on both surfaces. Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var n NACA4
			ps := flowParams(&n.Flow)
			n.Code = "2412"
			ps = append(ps,
				Param{"code", "the four digits MPTT of the section (e.g. 0012, 2412, 4415)", &n.Code},
				length("chord", &n.Chord, 100, "chord"),
				pointsParam(&n.Points, "per surface"),
				Param{"closed-te", "close the trailing edge to a sharp vertex (the modified thickness equation, -0.1036 instead of -0.1015)", &n.ClosedTE},
			)
			return ps, func() ([]byte, error) { return n.Bytes() }
		},
	})
	register(Entry{
		Name:    "joukowski",
		Summary: "Joukowski section (exact ideal-flow reference with a cusped trailing edge)",
		About: `
The image of a circle through zeta = 1 about (--centre-x, --centre-y) under
the Joukowski map z = zeta + 1/zeta: a cambered section with a cusped
trailing edge whose ideal flow is known exactly (Gamma = 4 pi U R
sin(alpha + beta)), a reference for checks. --centre-x sets the thickness
(more negative: thicker), --centre-y the camber. Scaled to --chord in
--unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var j Joukowski
			ps := flowParams(&j.Flow)
			ps = append(ps,
				number("centre-x", &j.CentreX, -0.1, "x of the circle's centre in the map's units (negative; -0.1 gives about 12 % thickness)"),
				number("centre-y", &j.CentreY, 0.1, "y of the circle's centre in the map's units (the camber; 0 for a symmetric section)"),
				length("chord", &j.Chord, 100, "chord"),
				pointsParam(&j.Points, "per half of the outline"),
			)
			return ps, func() ([]byte, error) { return j.Bytes() }
		},
	})
	register(Entry{
		Name:    "karman-trefftz",
		Summary: "Karman-Trefftz section (exact reference with a finite trailing-edge angle)",
		About: `
The Karman-Trefftz map of the circle through zeta = 1 about (--centre-x,
--centre-y): a Joukowski-like section whose trailing edge has the finite
angle --te-angle, with an exactly known ideal flow. Scaled to --chord in
--unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var k KarmanTrefftz
			ps := flowParams(&k.Flow)
			ps = append(ps,
				number("centre-x", &k.CentreX, -0.1, "x of the circle's centre in the map's units (negative)"),
				number("centre-y", &k.CentreY, 0.1, "y of the circle's centre in the map's units (the camber)"),
				number("te-angle", &k.TrailingEdgeAngle, 10, "trailing-edge angle tau in degrees, between 0 and 90"),
				length("chord", &k.Chord, 100, "chord"),
				pointsParam(&k.Points, "per half of the outline"),
			)
			return ps, func() ([]byte, error) { return k.Bytes() }
		},
	})
	register(Entry{
		Name:    "cylinder",
		Summary: "circular cylinder in a uniform stream (ideal flow)",
		About: `
A circular cylinder of --radius about the origin in a uniform stream: no
circulation, or with --kutta the rear stagnation point held at (radius, 0),
which gives Gamma = 4 pi U R sin(alpha). Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var c Circle
			ps := flowParams(&c.Flow)
			ps = append(ps,
				length("radius", &c.Radius, 50, "radius"),
				sidesParam(&c.Sides, "the circle"),
				Param{"kutta", "hold the rear stagnation point at (radius, 0): a circulation fixed by the Kutta condition at a smooth point", &c.Kutta},
			)
			return ps, func() ([]byte, error) { return c.Bytes() }
		},
	})
	register(Entry{
		Name:    "ellipse",
		Summary: "elliptic cylinder in a uniform stream (ideal flow)",
		About: `
An elliptic cylinder of semi-axes --semi-x (along the stream at zero angle)
and --semi-y about the origin in a uniform stream; with --kutta the rear
stagnation point is held at (semi-x, 0). Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var e Ellipse
			ps := flowParams(&e.Flow)
			ps = append(ps,
				length("semi-x", &e.SemiX, 100, "semi-axis along x"),
				length("semi-y", &e.SemiY, 50, "semi-axis along y"),
				sidesParam(&e.Points, "the ellipse"),
				Param{"kutta", "hold the rear stagnation point at (semi-x, 0) by the Kutta condition", &e.Kutta},
			)
			return ps, func() ([]byte, error) { return e.Bytes() }
		},
	})
	register(Entry{
		Name:    "two-element",
		Summary: "main element and slotted flap (NACA sections), each with its Kutta condition",
		About: `
A main element of --chord and a flap of --flap-chord, both NACA 4-digit
sections (--main, --flap), the flap deflected trailing edge down by
--deflection degrees about its nose, which sits --overlap ahead of the main
element's trailing edge and --gap below it. Each element carries its own
Kutta condition. Lengths are in --unit.`,
		New: func() ([]Param, func() ([]byte, error)) {
			var t TwoElement
			ps := flowParams(&t.Flow)
			t.Main, t.Flap = "2412", "0012"
			ps = append(ps,
				Param{"main", "NACA 4-digit code of the main element", &t.Main},
				Param{"flap", "NACA 4-digit code of the flap", &t.Flap},
				length("chord", &t.Chord, 100, "chord of the main element"),
				length("flap-chord", &t.FlapChord, 30, "chord of the flap"),
				length("gap", &t.Gap, 2, "vertical offset of the flap's nose below the main element's trailing edge"),
				length("overlap", &t.Overlap, 1, "how far the flap's nose lies ahead of the main element's trailing edge (negative: behind it)"),
				number("deflection", &t.Deflection, 20, "flap deflection in degrees, trailing edge down"),
				pointsParam(&t.Points, "per surface of each element"),
			)
			return ps, func() ([]byte, error) { return t.Bytes() }
		},
	})
}
