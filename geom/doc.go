// Package geom owns the scene as the user states it: reading and writing
// scene files (GeoJSON FeatureCollections with a "problem" member), decoding
// feature properties once into typed values, validating them with errors
// that name the feature and the member, and the planar arrangement that
// turns bodies, regions and edges into oriented boundary and interface
// pieces. It knows nothing of boundary elements.
//
// # Conventions
//
// Coordinates are plane Cartesian x, y, y up, converted to metres on
// reading. Every value is SI: potentials in volts (metres of head in
// seepage), inflow densities k du/dn with n the outward normal of the domain.
// Outer rings run counter-clockwise and holes clockwise after reading, so a
// polygon's material lies on the left of every ring.
//
// # Data flow
//
//	sc, err := geom.Read(r)   // bad input: *geom.Error naming feature and member
//	lay, err := sc.Layout()   // planar arrangement: pieces, owners, regions
package geom
