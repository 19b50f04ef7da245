// Package template writes starter scene files for common conductor
// configurations: a coaxial line, a two-wire line, a wire over a grounded
// plane and a shielded pair. Each template is a struct of dimensions in the
// scene's coordinate unit and potentials in volts; its Bytes method returns
// the scene file (Contract 1: a GeoJSON FeatureCollection with a "problem"
// member), which it has read back with geom.Read before returning it, so a
// template never hands out a scene rimfield would refuse.
//
// Circles are regular polygons with a vertex on the x axis (through the
// circle's centre), 512 vertices unless asked otherwise: the logarithmic
// capacity of an inscribed 512-gon is 1.25e-5 below the circle's, far below
// the 1e-3 the default mesh is meant to deliver.
//
//	data, err := template.Coaxial{Inner: 1.2, Outer: 4, Permittivity: 2.1, Voltage: 1}.Bytes()
//
// Every template is registered as an Entry (Entries, Lookup) with its
// parameters, so that a command line can offer each one as a flag.
//
// The package writes JSON with encoding/json: only package geom reads and
// writes GeoJSON through a GeoJSON library.
package template
