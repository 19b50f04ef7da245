// Package job is the shape every physics of rimfield takes: what a solved
// scene hands to the writers of results, so that no writer knows which
// physics it writes.
//
// A physics (electrostatics in bem/electro, seepage, ideal flow, the
// generic Laplace problem in bem/laplace) is one package under bem/ that
// provides a Job. The command line keeps one table from geom.Physics to
// the constructor of each Job and writes whatever the Job returns:
//
//   - Words: the trade's names for the shared parts (the potential and its
//     gradient, the inflow, the material, the flow net's lines, channels
//     and drops) and the SI units of results.json and boundary.csv;
//   - Options: the job's own command-line flags, bound to fields of the
//     Job value, each with its unit in the usage text;
//   - Check: the job's lines for the summary of a meshed scene, its
//     cautions, and whether Solve would refuse the scene;
//   - Solve: an Outcome with the solution, its section of results.json,
//     warnings, cautions, extra boundary.csv columns, the headline and the
//     lines under it, report tables, extra charts and marks on the maps.
//
// Everything is SI, as in package bem. Text meant for people (headlines,
// table cells) is already formatted: 4 significant digits with the SI
// prefix that suits the value (draw.DisplayFor), lengths and locations in
// the scene's coordinate unit. Number is the float type of results.json
// sections: it writes NaN and infinities as null, and the writer warns
// about each such key.
//
// The package also holds what every job shares: the cautions that follow
// from the mesh alone (CommonCautions), the names of boundaries
// (BoundaryName), the generic headline (InflowHeadline), the standard
// solve (Solve) and number formatting for people.
//
// # Example
//
//	var j job.Job = laplace.New()
//	out, err := j.Solve(&job.Setup{Scene: sc, Mesh: m})
//	// out.Solution, out.Section, out.Headline, out.Tables ...
package job
