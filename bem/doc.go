// Package bem is the numerical core of rimfield: a direct boundary element
// method for Laplace's equation div(K grad u) = 0 in a plane cross-section,
// with constant elements on straight panels and collocation at panel
// midpoints.
//
// # Symbols and conventions
//
// u is the potential (volts, metres of head, ...). K = diag(kx, ky) is a
// region's conductivity (absolute permittivity in electrostatics) and
// kbar = sqrt(kx ky). F = n.K grad u is the inflow density through a panel
// into its Left region, n the region's outward normal (the panel's right
// normal): positive where flux enters the domain. The fundamental solution
// of a region is
//
//	G(x, y) = -(1/(2 pi kbar)) ln |T (x - y)|,  T = diag(a, 1/a), a = (ky/kx)^(1/4),
//
// the anisotropic kernel -ln(r' K^-1 r)/(4 pi sqrt(det K)) up to a constant
// chosen so that an isotropic region reduces to -(1/(2 pi k)) ln r with r in
// metres. Because det T = 1, the double layer is the isotropic one in the
// mapped plane and the single layer gains the factor L/(L' kbar).
//
// # Formulation
//
// For every region and every panel bounding it (Green's third identity,
// e.g. Brebbia, Telles & Wrobel, Boundary Element Techniques, 1984, ch. 2):
//
//	u_i/2 + sum_j H_ij u_j - sum_j G_ij F_j - C = 0
//
// with H and G the closed-form integrals of kernel.go (exact for every
// target; the free term is 1/2 at a straight panel's midpoint) and C the
// region's constant. C is an extra unknown with the extra equation
// sum_j F_j L_j = 0 (no net inflow into a bounded region, or a bounded
// potential at infinity in an open one). For a closed region the exact
// solution has C = 0; the augmentation keeps the system regular at the
// degenerate scale of the log kernel (a boundary of logarithmic capacity 1),
// so every size is solved to the same accuracy. For the background of an
// open scene C is the potential at infinity when some potential is fixed;
// when none is, C = 0 fixes the gauge and the far field carries the log
// term of the given net inflow: u = -(Q/(2 pi k)) ln(|x|/1 m) + O(1/|x|).
//
// Each connected part of a region (a MultiPolygon region's pieces, a cavity
// inside a body, the unbounded outside) has its own equations and constant:
// its panels form closed loops, counter-clockwise loops bound a part from
// outside and clockwise loops are its holes.
//
// Floating boundaries share one unknown potential and add the equation
// sum F_j L_j = Q. An interface panel carries u and F (into its Left region;
// its Right region sees -F) and one equation per side. A grounded plane
// y = Y0 replaces the background's kernel by G(x,y) - G(x,y*), y* the mirror
// image, exact without panels on the plane.
//
// The system is assembled in parallel over rows (results do not depend on
// the number of workers), scaled so that every unknown is in volts, and
// factorised once by dense LU (gonum); one factorisation serves any number
// of right-hand sides (System.Solve with Data).
//
// # The fast solver
//
// Settings.Method Fast solves the same discrete system without storing it
// (fast.go): per connected part, a fast multipole tree (package bem/fmm)
// applies the far field of the part's single and double layers (and their
// images) to the rows' points in the part's isotropic frame, a stored near
// block holds the same closed forms as the dense rows, and the floating,
// Kutta and balance rows are sparse sums; known values go through the same
// product, so the right-hand side is the dense one's. GMRES (package
// bem/krylov) iterates on the rows paired with their unknowns, the two
// rows of each interface panel combined so that one is of the second kind,
// and the first-kind inflow columns preconditioned from the right by the
// hypersingular operator (Calderon preconditioning; precond.go): the
// iteration count then stays bounded as panels are refined (measured: 56-58
// for the example busbars and 80-85 for the example weir from 1000 to
// 130 000 panels), and memory and time per right-hand side grow as N.
// Auto (the default) takes the dense solver for small systems and the fast
// one above a crossover that grows with the number of right-hand sides.
//
// # Incident fields
//
// Data.Uniform applies a uniform incident field u0 = g.x (g (y - Y0) over a
// grounded plane) in the unbounded background: a uniform stream, an
// applied electric field. The unknowns are then the total u = u0 + w on
// the boundary, and only the background's collocation equations change:
//
//	u_i/2 + sum_j H_ij u_j - sum_j G_ij F_j - C = u0(x_i)
//
// which is the exterior identity for the disturbance w plus the interior
// identity for u0 over the bodies and inclusions, where u0 is harmonic
// (incident.go). No panel values of u0 enter, so a boundary held at one
// total potential stays exactly constant, and the right-hand side costs
// O(n): one factorisation serves every direction and size of the field.
//
// # Ideal flow and the Kutta condition
//
// Ideal flow is solved for the stream function psi, with the stream as the
// incident field psi_inf = U (y cos alpha - x sin alpha), rather than for a
// disturbance velocity potential with a wake cut. Every body is a floating
// boundary: a wall is a streamline, psi = C_k on body k with C_k unknown,
// and the body's total inflow sum F_j L_j is its anticlockwise circulation
// (the tangential velocity along a wall is -F, walking with the fluid on
// the left). A body without a Kutta condition keeps the equation "total
// inflow = 0": no circulation. A Kutta condition (Settings.Kutta) replaces
// that equation by F_a + F_b = 0 on the two panels meeting at the trailing
// edge (or on either side of a blunt one's base): equal speeds on both
// faces, so the flow leaves the edge smoothly.
// This fits the core as it is (floating boundaries, one extra row per
// body, one constant per body), needs no cut, no wake geometry and no
// jump conditions, gives the surface speed directly as |F| and the
// streamlines as contours of the solved potential, and stays regular at
// the degenerate scale (the body constants play the part of the
// augmentation). The velocity potential with a cut would need a cut
// geometry and a potential jump carried across it, and its
// solution would not show streamlines as contours. A grounded plane
// is a slip wall exactly: the image kernel holds psi = 0 on it, and the
// stream must run along it.
//
// # Sheets
//
// A sheet (a body of zero thickness; mesh.Mesh.Twin pairs the two faces
// of each of its panels) is two coincident sides of the part it lies in,
// each with its own u and F. The ordinary identity, collocated at the
// pair's midpoint, sees only the faces' mean potential (its free term)
// and, on every other boundary, the sum of their inflows (a single layer)
// and the jump of their potentials (a double layer); the pair's second
// equation is the conormal derivative of the representation on one face,
// a hypersingular equation whose finite-part integrals over straight
// panels are in closed form (the dual boundary element method: Portela,
// Aliabadi & Rooke, Int. J. Numer. Methods Eng. 33, 1992). A sheet with a
// fixed or floating potential has its two inflows for unknowns (the
// charge on each face), an impervious one its two potentials (the head on
// each face); see sheet.go for the equations, the collocation points that
// make the jump second order at free tips and along graded panels, and
// the treatment of a sheet's end on another boundary. A Kutta condition at
// a sheet's trailing tip holds the single-layer density to the r^1/2 of
// a smooth departure across the last two panels (kutta.go).
//
// # Evaluation
//
// Potential and gradient at a point come from the representation of the
// region that contains it (located by the winding number of its boundary),
// with the same closed forms. On flux boundaries and interfaces the
// potential varies along the boundary; there the evaluator adds the
// closed-form double layer of a linear reconstruction of the potential along
// each panel (slope from the neighbouring midpoints), which removes the 1/r
// artefacts that the jumps of a piecewise-constant potential would cause
// within a panel length of the boundary.
//
// # Accuracy
//
// Measured by the tests: integrated inflows converge as h^2 or faster on
// smooth boundaries (h^3 observed on the coaxial annulus) and on singular
// corners when panels are graded so that the smallest shrinks as h^2 (the
// square coaxial line); where potential data vary along both sides of a
// corner, constant elements carry an O(h_corner) term, which grading makes
// small.
//
//	sol, err := bem.Solve(m, nil)
//	pt := sol.Eval(r2.Vec{X: 0.5, Y: 0.5}) // potential and gradient, exact near the boundary
package bem
