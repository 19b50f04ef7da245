// Package fmm is the fast multipole method for the two-dimensional Laplace
// kernels over straight panels: the potential and gradient, at N target
// points, of M panels carrying constant single- and double-layer densities
// (and of point sources), in O(N + M) work instead of O(N M).
//
// # Conventions
//
// G(x, y) = -(1/2 pi) ln|x - y|. A Panel runs from A to B; its normal n is
// the right normal of B - A (the outward normal of the domain on its left,
// as everywhere in rimfield). With densities s_j (single layer), d_j
// (double layer) per unit length and point strengths q_k, the product is
//
//	u(x) = sum_j s_j int_j G(x, y) ds_y + sum_j d_j int_j dG/dn_y ds_y + sum_k q_k G(x, y_k)
//
// and grad u(x) its gradient in x. Units are the caller's: lengths in any
// consistent unit, u per unit density.
//
// # Near and far
//
// The package computes no singular or near-singular panel integral; the
// solver has closed forms for those. Tree.Apply returns the far part only:
// every (target, panel) pair except those of NearPanels(target), the panels
// of the source leaves next to the target's leaf. A far pair always has its
// target at least the source box's radius, so at least half the panel's
// length, from the panel; a panel the target lies on, or any panel closer
// than half its own length, is always near. The caller
//
//  1. builds the tree once: tr, err := fmm.New(panels, nil, targets, nil);
//  2. stores the exact near coefficients once with its own closed forms:
//     blk := tr.NewBlock(true, true, coef), coef filling, for one target,
//     the single- and double-layer potentials of unit density of each of its
//     near panels;
//  3. applies both with every new density (inside GMRES):
//     tr.Apply(y, nil, d); blk.AddTo(y, d).
//
// Tree.AddNear and Tree.Eval do the same with a caller-supplied function per
// pair instead of a stored block, for evaluations that are not repeated
// (picture grids, probes) and for tests. Point sources need no closed form:
// Apply includes them in full (a target exactly at a point source gets
// nothing from it).
//
// Density.Linear adds double layers of linear density along the panels
// (a potential reconstructed linearly along each panel), in the far field
// only: their exact moments are in addPanel, their near field is the
// caller's. Tree.Field forms the multipoles of one density once and
// evaluates it at points given one at a time (a flux line traced step by
// step), each walking the source boxes from the root, with the same
// acceptance test and error bound as a target leaf's list 3.
//
// # Method
//
// Complex variables (Greengard & Rokhlin, A fast algorithm for particle
// simulations, J. Comput. Phys. 73, 1987): with z the target, u is
// -(1/2 pi) Re w and grad u is -(1/2 pi) conj(w') for the analytic
//
//	w(z) = sum_j s_j int log(z - zeta) ds - sum_j d_j nu_j int ds/(z - zeta) + sum_k q_k log(z - y_k),
//
// nu_j = -i e_j the normal of panel j as a complex number (e_j its unit
// tangent). Multipole expansions a0 log(z - c) + sum A_k (r/(z - c))^k and
// local expansions sum L_l ((z - c)/r)^l of order p, scaled by the radius r
// of their box, are translated by the formulas of that paper (Lemma 2.3
// multipole to multipole, 2.4 multipole to local, 2.5 local to local). A
// panel's moments are exact: int ((zeta - c)/r)^k ds = L S_k/(k+1) with
// S_k = sum_{i<=k} A^i B^(k-i), A, B its ends relative to c, summed by the
// recurrence S_k = B S_{k-1} + A^k, which has no cancellation for short
// panels; the double layer's moments are those of the derivative of log
// along nu.
//
// The sources and the targets each get an adaptive quadtree (Carrier,
// Greengard & Rokhlin, A fast adaptive multipole algorithm for particle
// simulations, SIAM J. Sci. Stat. Comput. 9, 1988): a box is split while it
// holds more than Options.LeafSize items, empty quadrants are dropped and a
// box whose items fall in one quadrant shrinks to it, so strongly graded
// clusters make no long chains of boxes. Each box's expansion
// centre is the middle of its contents' bounding box and its radius the
// farthest panel end from it, so a panel sticking out of its box is covered.
// The interaction lists (CGR's lists 1-3: near leaves, multipole to local,
// multipole evaluated at the targets of a small leaf) come from a dual walk
// of the two trees that splits the larger box until a pair is separated
// (Dehnen, A hierarchical O(N) force calculation algorithm, J. Comput. Phys.
// 179, 2002).
//
// # Precision
//
// A source box of radius rs and a target box of radius rt whose centres are
// d apart interact through expansions when rs <= rho (d - rt) and
// rt <= rho (d - rs), rho = 0.5, or, for the targets of a leaf one by one,
// when rs <= rho |z - cs|. Each such interaction then errs by at most
// B(p) times its own size, |q|/(2 pi) for a charge q (a point, or s L of a
// panel's single layer) and |mu|/(2 pi |z - zeta|) for a dipole (d ds nu of a
// double layer):
//
//	B(p) = max(rho^(p+1)/(1-rho) (2/(p+1) + rho/(1-rho)),  F rho^p (1+rho)/(1-rho)),  F = 1 + rho + 2 rho/(1-rho)
//
// (the truncation sums of both expansions in closed form; see bound in
// order.go). The order is the smallest p with B(p) <= Options.Tol: p = 14,
// 24, 37 and 44 for 1e-3, 1e-6, 1e-10 and 1e-12. So the error of u at a
// target is at most Tol times the sum of the magnitudes of its far-field
// interactions; the gradient obeys the same bound times a factor of order p
// in the worst case, and met Tol itself in every test. The bound is
// conservative: measured against direct summation (TestFarPlusNearMatchesDirect,
// 3000 panels, random, graded to 1e-6 at a corner, and a thin plate 1e-4
// thick), the largest error relative to the largest value was, for u and
// grad u, 3e-7 and 1.3e-6 at Tol 1e-3, 1.5e-10 and 1e-9 at 1e-6, 2.1e-14 and
// 7.3e-14 at 1e-10, 2.5e-15 and 3.7e-15 at 1e-12 (rounding).
//
// # Cost
//
// Measured by the benchmarks on a boundary mesh (16 closed curves, targets
// at the panel midpoints, 1e5 to 8e5 panels, one core): about 2e6 targets
// per second at Tol 1e-6 and 1e6 at 1e-10 for Apply, time growing as N
// (2.03 and 2.04 per doubling); set-up 250-400 ns per panel on two cores;
// memory about 260-310 bytes per panel for the tree and one workspace, plus
// 8 bytes per near pair and stored layer in a Block (about 50 pairs per
// target at the default LeafSize: 800 bytes per panel for both layers).
//
// # Parallelism
//
// New and every product run on Options.Workers goroutines (0 means
// GOMAXPROCS); results are identical to the last bit for any number of
// workers. A Tree is safe for concurrent use: each product takes its own
// workspace.
//
// # Not here
//
// Anisotropic regions and image kernels are the caller's: it maps each
// region to its isotropic plane before building that region's tree
// (x' = T x; the double layer is unchanged, the single layer's density
// scales with L/(L' kbar), see package bem), and for a grounded plane y = Y0
// (G(x,y) - G(x,y*)) it adds each panel's mirror image, from B* to A* so that
// its normal is the mirror of n, with densities -s and -d.
package fmm
