// Package laplace is the generic job of rimfield: Laplace's equation
// div(K grad u) = 0 with dimensionless u and k, solved and written with
// nothing beyond the potential and inflow on every boundary that every
// job reports. It is the simplest Job of package job and the pattern the
// physics packages follow.
package laplace
