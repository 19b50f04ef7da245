// Package krylov solves square linear systems A x = b by restarted GMRES
// over an abstract Operator, so that one solver serves a stored dense matrix
// (Dense), a fast multipole product (package bem/fmm) or any other
// matrix-free operator.
//
// GMRES (Saad & Schultz, SIAM J. Sci. Stat. Comput. 7, 1986) minimises the
// residual over a Krylov space of dimension Settings.Restart, then restarts
// from the current iterate. Convergence is judged on the true relative
// residual ||b - A x|| / ||b|| (Euclidean norm), recomputed from x at every
// restart, so the tolerance means the same with or without preconditioners.
// A run that cannot meet it (iteration limit, stagnation of a restart cycle,
// an operator singular on the Krylov space) returns a *NotConvergedError
// with the best iterate in x; it never loops.
//
// Second-kind integral equations (I/2 + a compact operator, the double
// layer of package bem) converge in a number of iterations that does not
// grow with the number of panels (9 for every size in the tests, 16-18 on
// rimfield's dense double-layer systems from 500 to 16000 panels); first-kind
// ones (the single layer) needed 40-270 there, growing with N, and call for
// a preconditioner.
//
//	res, err := krylov.GMRES(op, x, b, &krylov.Settings{Tol: 1e-10})
//	var nc *krylov.NotConvergedError
//	if errors.As(err, &nc) { ... nc.Residual, nc.Reason ... }
//
// The vector work of an iteration is O(n Restart) on one goroutine; the
// operator may use as many as it likes.
package krylov
