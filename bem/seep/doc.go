// Package seep turns a solved seepage problem (confined, steady flow under
// and around structures in a cross-section) into what the engineer who
// signs the check needs: the discharge, the head and pore pressure on
// every panel, the uplift on every structure and its line of action, the
// exit gradient on every face where water leaves the soil with the safety
// against piping, Terzaghi's heave check beside sheet piles and cutoffs,
// Lane's weighted creep ratio as a cross-check, and a study of how much
// the answers depend on where the section's outer walls were drawn.
//
// # Symbols and conventions
//
// Everything is SI and per metre of length of the cross-section. The
// potential u of package bem is the total head h (m); y is the elevation
// (m, up). A soil region has the conductivity K = diag(kx, ky) (m/s) and
// kbar = sqrt(kx ky). The inflow density F = n.K grad h (m/s) has n the
// outward normal of the soil: positive where water enters the soil (a
// riverbed upstream), negative where it leaves (the tailwater bed). The
// unit weight of water gw (kN/m^3) and the critical gradient i_c come from
// the scene's problem (defaults 9.81 and 1).
//
//	pore pressure      p = gw (h - y)                                 kPa
//	discharge          q = sum over boundary panels of max(F, 0) L    m^2/s
//	hydraulic gradient across a boundary  i_n = F / (n.K.n)           1
//	exit gradient      i = -F / (n.K.n) on a fixed-head face, F < 0   1
//	piping safety      FS = i_c / i
//	uplift             U = sum over a structure's panels of p n_y L   kN/m, up
//	line of action     x_U = sum p n_y L x / U                        m
//
// (p acts on a structure along n, into it; on its underside n_y > 0.)
// Discharge is the water entering the soil; Report.Outflow, the water
// leaving it, agrees to rounding (the formulation holds each region's net
// inflow to zero). Heads, pressures and normal gradients are given for
// every panel, indexed like the mesh's panels.
//
// # Exit gradient
//
// On a fixed-head face the head is constant, so the hydraulic gradient is
// normal to it and its size is |F| / (n.K.n). Along the face, away from
// its ends, the panel values are accurate (1e-4 at default settings). At
// a vertex where the face meets an impervious face, another fixed head or
// an interface, the separable solutions of Laplace's equation in a wedge
// (e.g. Jackson, Classical Electrodynamics, 3rd ed., 1999, sec. 2.11;
// Harr, Groundwater and Seepage, 1962, ch. 4, from memory) give
//
//	h - h_face = sum_k c_k r^(lambda_k) sin(lambda_k theta)
//
// with theta measured from the fixed-head face into the soil, and
// lambda_k = (2k+1) pi / (2 beta) against an impervious face, k pi / beta
// against a face at the same head, beta the soil-side opening (in the
// soil's isotropic frame, the transformed section x' = x (ky/kx)^(1/4),
// y' = y (kx/ky)^(1/4), where it is isotropic with kbar). With interfaces
// between soils at the vertex, the wedge is split into sectors, head and
// normal flux continuous across them, and lambda is the smallest root of
// the resulting condition. The gradient at the vertex goes like
// r^(lambda_0 - 1):
//
//   - lambda_0 < 1 (CornerSingular): infinite. The toe of a floor without
//     a cutoff (a fixed head meeting an impervious face on a straight
//     line, beta = pi, r^-1/2), a structure overhanging its downstream bed.
//     The gradient is then averaged over a stated length of the exit face
//     from the vertex: Options.ExitLength, by default a tenth of the
//     seepage path of the structure there (its length of contact with the
//     soil), else of the exit face. A mean over a length is what a
//     practitioner can use; a peak at a singular point is the mesh's.
//   - lambda_0 = 1 (CornerFinite): finite and not zero. A bed meeting a
//     vertical pile or cutoff, or the side wall of the section, at 90
//     degrees: lambda_k = 1, 3, 5, ..., the gradient is smooth (c_0 + 3 c_1
//     r^2 + ...), and the corner is not singular.
//   - lambda_0 > 1 (CornerVanishing): zero at the vertex.
//
// A finite corner must not be read from its panels. Constant elements
// near a vertex carry a relative error that is the same at every scale of
// a geometrically graded mesh: on the bed next to a pile it is about -7 %
// on the panel at the vertex, -1 % some ten panels out and +1e-3 where the
// grading meets the nominal size, whatever the panel count or the smallest
// panel, so that a corner panel's value drifts as panels are added. The
// corner value is therefore projected from the head inside the soil, where
// the boundary integral representation (bem.Solution.Eval) is accurate: on
// an arc of radius rho about the vertex (in the isotropic frame), the
// sines and the cosines of the expansion are orthogonal on [0, beta], so
//
//	c_0 lambda_0 rho^(lambda_0 - 1) = (2/beta) int_0^beta dh/dr sin(lambda_0 theta) dtheta
//	                                = (2/beta) int_0^beta (1/r) dh/dtheta cos(lambda_0 theta) dtheta
//
// exactly, whatever the higher terms. A localized error of the discrete
// solution near the vertex that respects the face conditions looks, seen
// from the arc, like the dual term r^(-lambda_0) sin(lambda_0 theta),
// which enters the two integrals with opposite signs: the value is their
// mean (24 Gauss-Legendre points) and their difference is reported as
// Spread, an estimate of its uncertainty. rho is 4 local panel sizes (the
// longest panel of the two faces within 8 nominal sizes of the vertex),
// but at most a third of the free radius of the wedge (the distance to the
// nearest other boundary inside it, such as the tip of the pile). The
// largest exit gradient of a face is the largest of its finite corner
// values, its singular means and its panel values farther than 6 local
// panel sizes from every graded vertex.
//
// Measured at default settings (package tests): sheet pile in a layer,
// d/T = 0.25, 0.5, 0.75, exact zero-thickness references: exit gradient
// within 1.2e-4; thick piles 0.5 m and 1 m wide: within 5.1e-4 of a run
// with 6278 panels, and within a band of 7.6e-4 over a refinement sequence
// in which the corner panel's own value moves by 26 to 36 %; Khosla, Bose
// and Taylor's floor with a downstream cutoff: 1.8e-4; two soils in series:
// 3e-4 (the flux everywhere on the face, corners included); the sheet pile
// drawn as a line (a sheet, both faces in the soil): discharge within
// 7.4e-5, exit gradient within 4e-4, the water's thrust on the pile within
// 1.6e-5.
//
// # Structures
//
// Every body in contact with the soil is a structure: its uplift is the
// vertical resultant of the pore pressure on the contact (buoyancy of the
// part below the beds included), with its line of action, the horizontal
// resultant, and the head and pressure on every contact panel in order of
// arc length for the uplift diagram (Structure.Profile; Base marks the
// underside, flatter than 45 degrees).
//
// Terzaghi's heave check (Terzaghi, Theoretical Soil Mechanics, 1943,
// from memory): beside a structure that reaches a depth d below an exit
// face at its edge, the soil prism d/2 wide and d deep heaves when the
// excess head at its base lifts more than its submerged weight,
//
//	FS = gamma' d / (gw h_a) = i_c d / h_a      (gamma'/gw = i_c)
//
// with h_a the mean head above the exit face's head along the prism's base
// (16 Gauss-Legendre points of Eval). On deep soil beside a single sheet
// pile h_a = 0.353961 H. The usual minimum is 1.5 to 2 (common practice,
// from memory); Analyse warns below Options.HeaveSafety (default 1.5).
//
// Piping: FS = i_c / i with i the largest exit gradient; 3 to 4 are the
// usual minimums against the exit gradient in sands (common practice, from
// memory); Analyse warns below Options.PipingSafety (default 4). Where the
// exit gradient is singular, i is the stated mean.
//
// Lane's weighted creep ratio (Lane, Security from under-seepage: masonry
// dams on earth foundations, Trans. ASCE 100, 1935; from memory): along the
// contact of each structure (the bodies that touch one another, such as a
// floor and its cutoffs) that touches beds at different heads, Lw =
// (contact steeper than 45 degrees) + (contact flatter than 45 degrees)/3,
// over H, the difference of the heads it touches; LaneRatios lists the
// safe ratios by soil. It is an empirical cross-check, not a substitute
// for the exit gradient.
//
// # Truncated sections
//
// Real foundations are deep and wide; a section ends at insulated walls
// somewhere. Truncation re-solves a copy of the scene with its sides and
// bottom moved out (Truncate: the distances from the core of the section
// to each insulated outer wall multiplied by a factor, beds extended, the
// deepest layer deepened) at the same nominal panel size and reports how
// much the discharge and the exit gradient moved, with a warning above a
// few per cent. The discharge of a structure on a deep foundation grows
// without bound as the section deepens (logarithmically); the exit
// gradient converges.
//
// # Example
//
//	sys, _ := bem.Assemble(m, nil)
//	sol, _ := sys.Solve(nil)
//	rep, _ := seep.Analyse(sc, sys, sol, seep.Options{})
//	fmt.Println(rep.Discharge, rep.ExitGradient.Value, rep.PipingSafety)
//	st, _ := seep.Truncation(sc, rep, seep.TruncationOptions{})
//	fmt.Println(st.ExitGradientChange)
package seep
