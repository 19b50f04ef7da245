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
// # Reading scene files
//
// Read decodes a scene file with orb/geojson and checks each feature on its
// own: the geometry type for its part; closed rings (the first position
// repeated at the end, within the coincidence tolerance) with at least
// three distinct vertices, some area and no crossing or touching sides;
// holes strictly inside their outer ring and apart from each other;
// positions within 1e7 m of the origin after the unit conversion; at most
// one condition on a body or edge; positive materials on regions; keys that
// fit the part and the physics. It then checks the scene as a whole where no
// arrangement is needed: a region in a closed scene, a fixed potential
// somewhere in a closed scene, a stream in an open flow scene, every feature
// strictly above a grounded plane. Checks between features that need the
// planar arrangement (overlapping regions, edges off every boundary) are
// Layout's.
//
// The coincidence tolerance is CoincidenceTol times the diagonal of the
// bounding box of every position. Repeated consecutive vertices within it
// are dropped; rings lose their closing vertex and are turned to run
// counter-clockwise (outer) or clockwise (holes); edge lines keep their
// vertices and direction as given.
//
// A body drawn as a LineString or MultiLineString is a sheet of zero
// thickness (Body.Lines) whose two faces both carry its condition. Its
// lines are checked like an edge's, and besides refused with a zero-length
// segment, a segment doubling back over the one before, or a stretch run
// over twice.
//
// The first problem found is returned as an *Error naming the feature
// (index and name), the member and the fix. Property keys Read does not know
// give a warning in Scene.Warnings, since GIS tools add their own, unless
// they are a near miss of a known key ("potental", "Potential", "net-inflow":
// equal up to case and separators, or an edit distance of 1 for keys of 2 to
// 4 letters, 2 from 5 letters on), which is an error suggesting the key.
//
// Write writes a Scene back as a scene file, every default spelled out.
//
// # Data flow
//
//	sc, err := geom.Read(r)   // bad input: *geom.Error naming feature and member
//	lay, err := sc.Layout()   // planar arrangement: pieces, owners, regions
package geom
