// Package flow solves ideal flow (inviscid, incompressible, irrotational,
// two-dimensional) around bodies in a uniform stream, optionally over a
// ground plane, and reports what a section is judged by: surface speed and
// pressure coefficient, lift, drag and moment coefficients, circulation,
// lift per metre and stagnation points, per body and for the whole, and an
// incidence sweep on one factorisation.
//
// # Formulation
//
// The unknown is the stream function psi (m^2/s), solved by package bem
// with the stream as an incident field (bem.Data.Uniform):
//
//	psi_inf = U (y cos alpha - x sin alpha)      (U (y - Y0) over a ground plane y = Y0)
//
// Every body is a floating boundary: psi = C_k on body k (a wall is a
// streamline) with C_k unknown. A body's total inflow sum F_j L_j, with
// F = d psi/dn and n the fluid's outward normal (into the body), is its
// anticlockwise circulation. A body without a Kutta condition carries
// none; a body with one has its circulation fixed by equal speeds on the
// two panels at its trailing edge (bem.Kutta). Why this formulation, and
// not a velocity potential with a wake cut, is in the package
// documentation of bem. Assemble turns the scene's walls (geom gives them
// as insulated, the velocity potential's condition) into floating
// boundaries on a copy of the mesh, System.Mesh, which the solutions refer
// to; one factorisation serves every stream speed and angle (Solve, Sweep).
//
// # Symbols and signs
//
// alpha is the stream's angle in degrees, anticlockwise from the x axis:
// for a section drawn with its leading edge on the left and its chord
// along x, the angle of attack. The velocity is v = (d psi/dy, -d psi/dx)
// (Velocity); on a wall it is tangential, v = -F t with t the panel's
// tangent (PanelResult.Tangential = -F), so the surface speed is |F|. The
// pressure coefficient is Cp = 1 - (|v|/U)^2 (Bernoulli's equation; any
// aerodynamics text, e.g. Anderson, Fundamentals of Aerodynamics, 2017,
// sec. 3.6 [from memory]) and the dynamic pressure q = rho U^2 / 2.
//
// The circulation Gamma (m^2/s) is positive clockwise, the aerodynamic
// convention, so that a lifting section has Gamma > 0: in the
// mathematical convention (anticlockwise positive, the line integral of
// v round the body) the circulation is -Gamma. Lift acts across the
// stream, along (-sin alpha, cos alpha), drag along it, (cos alpha,
// sin alpha). Kutta-Joukowski's theorem gives the lift per metre
// L' = rho U Gamma (Kutta 1902, Joukowski 1906; Anderson 2017, sec. 3.16
// [from memory]) and
//
//	C_L = 2 Gamma / (U c).
//
// The integrated surface pressure gives the force per metre
// F = q sum_j Cp_j n_j L_j on a body (n into the body; the free-stream
// pressure integrates to zero round a closed outline) and the
// anticlockwise moment M_z = sum_j (m_j - x_ref) x f_j about the
// quarter-chord point, m_j the panel midpoints, whence
//
//	C_L,p = F.(-sin alpha, cos alpha) / (q c),  C_D = F.(cos alpha, sin alpha) / (q c),
//	C_m = -M_z / (q c^2),
//
// positive nose-up (clockwise: the rotation that raises the angle of
// attack). The pressure drag is zero in theory (d'Alembert): C_D measures
// the discretisation.
//
// Kutta-Joukowski and the pressure agree for the whole in an open stream:
// its force depends only on the total circulation (Blasius' theorem; e.g.
// Milne-Thomson, Theoretical Hydrodynamics, 1968, sec. 6.41 [from
// memory]). They do not agree per body when there are several (each sits
// in the others' flow: a flap has pressure drag, the main element as much
// thrust), nor near a ground plane (the images act on the bodies): there
// the pressure is the force, and Report.Warnings says so.
//
// # Trailing edges and chords
//
// "kutta": true takes the body's sharpest convex corner: the vertex of its
// outline with the smallest body-side angle, which must be below
// MaxTrailingEdgeAngle (90 degrees); of equally sharp ones (within 1e-6
// rad), the one farthest downstream in the scene's stream. A blunt
// trailing edge counts too: a base (an edge at most MaxBase, 5 %, of the
// body's bounding-box diagonal long, between two corners sharper than 170
// degrees) whose corners' angles sum to less than 180 degrees plus the
// limit, its angle being that excess (an open NACA trailing edge: two
// corners of 98 degrees, 16; a plate's square end: 0); the Kutta
// condition then holds across the base (equal speeds on the panels before
// and after it) and the chord ends at the base's midpoint. "kutta": [x, y]
// takes the nearest vertex of the outline, or a base the point lies on,
// within 1e-3 of the body's bounding-box diagonal; a smooth point is
// allowed (the Kutta condition then holds the rear stagnation point
// there).
//
// The chord line of a body with a Kutta condition runs from its trailing
// edge to the farthest point of its outline, the leading edge; without
// one, between the two vertices farthest apart (of equal pairs, the one
// most nearly along the stream), the downstream end being the trailing
// end. The reference chord c is problem.chord when the scene gives one (for
// the whole, and for a body alone in its scene), else the chord line's
// length. The quarter-chord point lies on the chord line c/4 from the
// leading edge, and x/c is the position along it from the leading edge
// over c. The whole's chord line runs from the most downstream trailing
// edge of the bodies with a Kutta condition (of all bodies when none has
// one) to the farthest point of all the bodies. The upper surface is the
// outline from the leading edge to the trailing edge walking with the
// fluid on the left (on the left of the chord line seen from the leading
// edge), the lower surface the rest; a blunt trailing edge's base is Base,
// a cavity's panels are Inner.
//
// # Sheets
//
// A plate, sail or vane drawn as a line (a sheet body) is a wall of zero
// thickness: a floating boundary like the others, each face a panel side
// with its own speed and Cp (Upper from the leading edge, Lower back).
// "kutta": true puts the Kutta condition at its free end farthest
// downstream, "kutta": [x, y] at the free end nearest the point (within
// 1e-3 of the sheet's extent; a point elsewhere is refused), and the
// chord runs from that end to the farthest point of the sheet: for a flat
// plate, its length. Round a free end without a Kutta condition (a
// plate's leading edge) the suction is a force concentrated at the edge,
// which the pressure on the faces cannot hold; the force and moment on
// the sheet near such an end come from the momentum balance over a
// circle round it (sheet.go). Measured at the default mesh on the flat
// plate (2 pi sin alpha, and the Joukowski map's surface speed): C_L to
// 5e-7, the pressure's C_L to 2e-6 of it and C_D below 3.2e-6 of it, C_m
// about the quarter chord below 3e-6, the faces' speeds to 2.4e-4 U beyond
// 5 % of the chord.
//
// # Accuracy
//
// Measured by the tests at the default mesh (mesh.Options{}) against exact
// solutions by conformal mapping (Joukowski and Karman-Trefftz sections,
// the circle and ellipse with and without circulation): circulation and
// C_L within 4e-5 (1.3e-4 at a small C_L of 0.15), the pressure lift
// within 4e-5 of them, |C_D| below 2e-5, C_m within 1e-4, surface speed
// within 1.2e-3 U, Cp on the cylinder within 5e-5. The Kutta condition,
// holding half the smallest panel away from the edge, leaves an error of
// order hmin^(2 pi/beta) (beta the fluid-side opening of the trailing
// edge): C_L converges at first order in the smallest panel, 2-4e-5 at the
// default grading.
//
// Sharp convex corners other than a Kutta trailing edge (a sharp nose, the
// corners of a blunt base) are where the flow turns with infinite speed,
// v ~ r^(pi/beta - 1). The suction there is finite but the pressure
// integral converges with the smallest panel only as hmin^(2 pi/beta - 1):
// a diamond section's pressure drag stays at 0.03 whatever the mesh, while
// its Kutta-Joukowski lift is converged to 1e-5 and its C_m to 1e-4.
// Analyse warns when the whole's pressure drag exceeds DragWarning and
// names such corners.
//
// # Pictures
//
// psi is the solved potential: its contours are the streamlines, and
// Velocity returns v anywhere in the fluid from bem.Solution.Eval, whose
// gradient is grad psi; |v| = |grad psi| is the speed and 1 - (|v|/U)^2 the
// pressure coefficient of a map.
//
// # Example
//
//	fs, err := flow.Assemble(sc, m, nil)            // factorise once
//	sol, err := fs.Solve(*sc.Problem.Stream)        // psi for the scene's stream
//	rep, err := fs.Analyse(sol)                     // rep.Whole.CL, rep.Bodies[i].CM, rep.Panels[j].Cp
//	pts, err := fs.Sweep([]float64{-4, 0, 4, 8})    // C_L, C_m, Gamma per angle
//	v, ok := flow.Velocity(sol, r2.Vec{X: 1, Y: 0.2})
package flow
