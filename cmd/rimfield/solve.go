package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/mesh"
)

const solveAbout = `
Solves the scene and writes into DIR (created if needed):

  results.json   integrated results per body and edge, solver facts, warnings,
                 cautions and the physics section (keys and units: README.md)
  boundary.csv   one row per panel: boundary name, midpoint x_m and y_m,
                 arc length s_m, panel length_m, potential and inflow density
                 (units in the column names)
  contours.geojson  --levels equipotential lines (LineStrings with "level"
                 and "unit" properties) in the scene's coordinate unit, to
                 overlay the scene
  potential.png  the potential with equipotentials and the flow net,
  field.png      the field strength |grad u| with its peak marked and
  boundary.png   potential and inflow density along every boundary
                 (not with --no-images; also as SVG with --svg)
  report.html    with --report: inputs, results, pictures, warnings and
                 cautions in one self-contained page

Files an earlier run wrote into DIR are replaced all at once when every new
file is complete; other files in DIR are left alone. A scene with an error
writes nothing. All results are SI (metres, volts, metres of head, ...)
whatever the coordinate unit of the scene.`

// solveOptions are the flags of solve.
type solveOptions struct {
	out      string
	panels   int
	levels   int
	noImages bool
	solver   string
	quiet    bool
}

func runSolve(args []string, stdout, stderr io.Writer) error {
	cl := newCommandLine("solve", "rimfield solve SCENE -o DIR [flags]", solveAbout)
	var o solveOptions
	fs := cl.fs
	fs.StringVarP(&o.out, "output", "o", "", "output directory `DIR` for the results (created if needed; required)")
	fs.IntVar(&o.panels, "panels", 0, "approximate total number of boundary panels, a count `N` (0: chosen automatically for engineering accuracy)")
	fs.IntVar(&o.levels, "levels", 11, "number `K` of evenly spaced equipotentials between the lowest and highest boundary potential, for contours and pictures")
	fs.BoolVar(&o.noImages, "no-images", false, "do not draw the PNG pictures")
	fs.StringVar(&o.solver, "solver", "auto", "linear `SOLVER`: dense (direct LU, exact to rounding), fast (not available yet), or auto (dense)")
	fs.BoolVarP(&o.quiet, "quiet", "q", false, "print nothing on success (errors still go to stderr)")
	pics := addPictureFlags(fs)
	js := newJobs()
	js.addFlags(fs)
	if helped, err := cl.parse(args, stdout); helped || err != nil {
		return err
	}
	pos, err := cl.positional("SCENE")
	if err != nil {
		return err
	}
	if o.out == "" {
		return usagef("solve: no output directory; give one with -o DIR")
	}
	if o.panels < 0 {
		return usagef("solve: --panels %d is negative; give a panel count, or 0 for automatic", o.panels)
	}
	if o.levels < 1 {
		return usagef("solve: --levels %d: give at least 1 equipotential", o.levels)
	}
	kind, err := solverKind(o.solver)
	if err != nil {
		return err
	}
	if err := pics.check(); err != nil {
		return err
	}
	if err := checkOutputDir(o.out); err != nil {
		return fmt.Errorf("solve: %w", err)
	}

	t := &task{scenePath: pos[0], levels: o.levels, pics: pics}
	var mo mesh.Options
	t.scene, t.mesh, mo, err = prepare(pos[0], o.panels)
	if err != nil {
		return err
	}
	t.job, err = js.forScene(t.scene.Problem.Physics)
	if err != nil {
		return fmt.Errorf("solve: %w", err)
	}
	t.words = t.job.Words()
	n := len(t.mesh.Panels)
	setup := &job.Setup{Scene: t.scene, Mesh: t.mesh, MeshOptions: mo, Settings: progressSettings(stderr, n, o.quiet)}
	t.out, err = t.job.Solve(setup)
	endProgress(stderr, n, o.quiet)
	if err != nil {
		return err
	}
	if t.out.Solver == "" {
		t.out.Solver = kind
	}

	res, files, err := resultFiles(t, !o.noImages)
	if err != nil {
		return err
	}
	if err := writeOutputs(o.out, files); err != nil {
		return fmt.Errorf("solve: %w", err)
	}
	if !o.quiet {
		printSolveSummary(stdout, stderr, t, res, o.out)
	}
	return nil
}

// solverKind checks the --solver flag and returns the solver that runs.
func solverKind(s string) (string, error) {
	switch s {
	case "dense", "auto":
		return "dense", nil
	case "fast":
		return "", fmt.Errorf("solve: --solver fast is not available yet; use --solver dense (or auto, which picks dense)")
	}
	return "", usagef("solve: --solver %q unknown; available: dense, fast, auto", s)
}

// resultFiles builds every output file of a solved job, in memory, with
// results.json last so that it can list them all.
func resultFiles(t *task, images bool) (*results, []outputFile, error) {
	table, err := newBoundaryTable(t)
	if err != nil {
		return nil, nil, err
	}
	res, err := buildResults(t)
	if err != nil {
		return nil, nil, err
	}
	res.Warnings = append(res.Warnings, table.warnings()...)
	if t.pics != nil {
		t.pics.res = res
	}
	files := []outputFile{{boundaryName, table.write}}
	for _, f := range t.out.Files {
		files = append(files, bytesFile(f.Name, f.Data))
	}
	for _, a := range artifacts {
		if a.image && !images {
			continue
		}
		more, err := a.files(t)
		if err != nil {
			return nil, nil, fmt.Errorf("%s: %w", a.name, err)
		}
		files = append(files, more...)
	}
	res.Warnings = append(res.Warnings, t.warnings...)
	res.Files = []string{resultsName}
	for _, f := range files {
		res.Files = append(res.Files, f.name)
	}
	data, err := res.marshal()
	if err != nil {
		return nil, nil, fmt.Errorf("internal error: results.json: %w", err)
	}
	data = append(data, '\n')
	files = append(files, outputFile{resultsName, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}})
	return res, files, nil
}

// printSolveSummary prints what was solved and written for a person, and
// the warnings to stderr.
func printSolveSummary(w, stderr io.Writer, t *task, r *results, dir string) {
	fmt.Fprintf(w, "solved %s: %s, %d panels, %d unknowns, %s solver (condition estimate %.3g)\n",
		t.scenePath, r.Physics, r.Panels, r.Solver.Unknowns, r.Solver.Kind, float64(r.Solver.ConditionEstimate))
	if len(r.Boundaries) > 0 {
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintf(tw, "  boundary\t%s (%s)\t%s (%s)\tlength (m)\n", t.words.Potential, r.Units.Potential, t.words.Inflow, r.Units.Inflow)
		for _, b := range r.Boundaries {
			fmt.Fprintf(tw, "  %s\t%.6g\t%.6g\t%.6g\n", b.Name, float64(b.Potential), float64(b.Inflow), float64(b.Length))
		}
		tw.Flush()
	}
	if r.PotentialAtInfinity != nil {
		fmt.Fprintf(w, "  potential at infinity: %.6g %s\n", float64(*r.PotentialAtInfinity), r.Units.Potential)
	}
	for _, s := range r.Warnings {
		fmt.Fprintf(stderr, "rimfield: warning: %s\n", s)
	}
	var topics []string
	for _, c := range r.Cautions {
		topics = append(topics, c.Topic)
	}
	if len(topics) > 0 {
		fmt.Fprintf(w, "cautions: %s (details in results.json and CAUTIONS.md)\n", strings.Join(topics, ", "))
	}
	fmt.Fprintf(w, "wrote %s into %s\n", strings.Join(r.Files, ", "), dir)
}
