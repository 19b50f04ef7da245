// Package electro turns a solved electrostatic boundary element problem into
// the quantities an electrode or conductor layout is judged by: the
// capacitance matrix, the surface charge and field on every panel, the peak
// field on conductors and how much of it is the mesh's, the margin to
// breakdown per region, the stored energy and the force on each conductor.
//
// Job is the electrostatic job of the command line (package job): it solves
// a scene, runs Analyse, and presents the results in the words of electrical
// engineering: results.json's electrostatic section (Section), boundary.csv's
// charge and field columns, the headline capacitance, the report's tables
// and the surface-field chart.
//
// # Conventions
//
// Electrostatics is the generic problem with conductivity k = eps0 eps_r
// (geom.Material holds the absolute permittivity in F/m). Everything is per
// metre of length of the cross-section and SI.
//
// The panel normal n (mesh.Panel.Normal) is the outward normal of the
// domain; on a conductor it points into the conductor. The inflow density
// F = n.K grad u is D.(-n), the electric displacement leaving the conductor
// into the field: on a conductor F is the surface charge density sigma in
// C/m^2, and a conductor's total inflow is its charge per metre Q in C/m.
// The field on a conductor is normal to it, E = E_n (-n) with
// E_n = F / (n.K.n) (F / eps in a uniform dielectric), positive when it
// points away from the conductor.
//
// # Sheets
//
// A conductor drawn as a line (a trace, a thin electrode or shield: a
// sheet body) has two faces, each a conductor panel with its own charge
// density F (C/m^2) and field E_n = F / (n.K.n) on its own side; the
// conductor's charge is the sum over both faces. Its free edges are thin
// edges, |E| ~ r^-1/2 (an opening of 360 degrees); a trace lying on the
// surface of a substrate has one face in the substrate and one in the
// air, and its edges are junctions of the two with the same exponent.
//
// # Capacitance
//
// The Maxwell matrix C over the N conductors at a fixed potential relates
// their charges to their potentials, Q_i = sum_j C_ij V_j, with every
// floating conductor uncharged and every prescribed flux zero (the
// coefficients of capacitance and induction: Maxwell, A Treatise on
// Electricity and Magnetism, 1873, vol. 1, ch. 3; Smythe, Static and
// Dynamic Electricity, 1950, sec. 2.16 [section numbers from memory]).
// Column j is one solve with 1 V on conductor j and 0 V on the others; all
// N solves share one LU factorisation. C is symmetric in exact arithmetic
// (reciprocity); its measured asymmetry is reported, not removed. The
// partial capacitances are c_ij = -C_ij between conductors and
// c_i0 = sum_j C_ij to the rest (a ground plane, walls); in an open scene
// without a ground plane the total charge vanishes and so does every row
// sum.
//
// # Peak field and singular corners
//
// Near a corner of a conductor whose field-side opening is beta, the field
// behaves like |E| = A r^p with p = pi/beta - 1 (separable solutions of
// Laplace's equation in a wedge: Jackson, Classical Electrodynamics, 3rd
// ed., 1999, sec. 2.11). For beta > pi (an outer corner, p = -1/3 at a
// square corner, -1/2 at a thin edge) the field is infinite at the vertex
// and the computed peak grows as the mesh is refined. Where a conductor
// ends on an insulated boundary (an electrode on a symmetry line or an
// insulating wall) the same holds with p = pi/(2 beta) - 1: by mirroring
// in the insulated line the stretch becomes a corner of opening 2 beta.
// Where interfaces between dielectrics leave the vertex (a triple
// junction of conductor, solid dielectric and gas), the separable solution
// r^lambda f(theta) is pieced together across the sectors with f and
// eps f' continuous; lambda is the smallest root of the resulting
// condition, for two sectors of widths w1 (next to the conductor) and w2
//
//	eps1 sin(lambda w2) cos(lambda w1) + eps2 sin(lambda w1) cos(lambda w2) = 0,
//
// and p = lambda - 1 (a dielectric meeting a flat conductor at right
// angles gives lambda = 1, no singularity; at other angles the field is
// singular even on a smooth conductor, and rounding does not help).
//
// The coefficient A is fitted to the panels near the vertex and used to
// suggest a rounding radius. The map zeta = z^g, g = pi/beta, opens the
// wedge onto a half-plane; the potential u = a (Im zeta - b) then has an
// equipotential Im zeta = b, a rounded wedge, whose field far from the tip
// is the sharp wedge's, |E| = A r^p with A = a g, and at the tip, a distance
// r0 = b^(1/g) from the virtual vertex, |E| = A r0^p. The curvature of the
// image of a straight line under z = f(zeta) is Im(f2/f1) / |f1|, with f1
// and f2 the first and second derivatives of f, which at the tip gives a
// radius of curvature rho = r0 / (1 - g) = r0 / |p|. Hence a rounded edge
// of tip radius rho peaks at about
//
//	E_max = A (|p| rho)^p,  and to stay below E_t:  rho = (E_t / A)^(1/p) / |p|
//
// (for a thin edge, rho = 2 r0 and E_max = A sqrt(2/rho): the parabolic
// conductor, exact). A circular round-off of the same radius peaks about
// 20 % higher (measured at a square corner), so the suggested radius is
// the one for 1.25 A; it is a starting value to re-run with, not a design
// value.
//
// PeakStudy re-meshes with twice the panels and reports both peaks: near
// 1 the ratio says the peak is a property of the device, near 2^(-p) (1.26
// at a square corner) that it is a property of the mesh.
//
// # Breakdown
//
// The peak field of a region is the largest |E| over the panels bounding it
// (|grad u| is subharmonic, so its maximum over a region lies on the
// region's boundary); its ratio to the region's breakdown field flags a
// field above it. The default for air, 3 kV/mm, is common practice for dry
// air at standard conditions over centimetre gaps; real breakdown depends
// on gap, pressure, humidity and surface state. The ground plane of an open
// scene carries no panels and is not searched.
//
// # Energy and force
//
// The stored energy per metre is W = 1/2 sum_i V_i Q_i (J/m), summed as
// 1/2 of u F over the boundary panels. The force per metre on a conductor
// is the Maxwell stress integrated over its surface: the pull D.E/2 along
// the normal out of the conductor, f = -sum_j F_j^2 / (2 n_j.K.n_j) n_j L_j
// (N/m). At fixed potentials it equals +dW/dx for a rigid displacement
// (virtual work; Jackson sec. 4.7 [from memory]), which the tests check.
//
// # Example
//
//	sys, _ := bem.Assemble(m, nil)
//	cm, _ := electro.Capacitance(sys, m)   // cm.C[i][j] in F/m
//	sol, _ := sys.Solve(nil)
//	f := electro.PanelFields(sol)
//	pk, _ := f.Peak()                      // pk.Value in V/m, pk.Corner if singular
package electro
