package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/rimfield/rimfield/bem"
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
	fs.StringVar(&o.solver, "solver", "auto", "linear `SOLVER`: dense (direct LU, exact to rounding; memory 16 bytes per unknown squared, at most 16000 unknowns), fast (fast multipole product with GMRES to a relative residual of 1e-12; memory and time per solve growing as the panel count), or auto (dense for small systems, fast above about 1300 unknowns times the square root of the number of solves, and above the dense limit)")
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
	method, err := solverKind(o.solver)
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
	tm := &stageTimes{}
	start := time.Now()
	t.scene, t.mesh, mo, err = prepare(pos[0], o.panels)
	if err != nil {
		return err
	}
	tm.prepare = time.Since(start)
	t.job, err = js.forScene(t.scene.Problem.Physics)
	if err != nil {
		return fmt.Errorf("solve: %w", err)
	}
	t.words = t.job.Words()
	n := len(t.mesh.Panels)
	settings := progressSettings(stderr, n, o.quiet)
	if settings == nil {
		settings = &bem.Settings{}
	}
	settings.Method = method
	setup := &job.Setup{Scene: t.scene, Mesh: t.mesh, MeshOptions: mo, Settings: settings}
	start = time.Now()
	t.out, err = t.job.Solve(setup)
	endProgress(stderr, n, o.quiet)
	if err != nil {
		return err
	}
	tm.solve = time.Since(start)
	if t.sol() != nil && t.sol().Method != bem.Auto {
		t.out.Solver = t.sol().Method.String() // the solver that ran
	}

	start = time.Now()
	res, files, err := resultFilesTimed(t, !o.noImages, tm, start)
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

// solverKind checks the --solver flag and returns the method asked for.
func solverKind(s string) (bem.Method, error) {
	m, err := bem.ParseMethod(s)
	if err != nil {
		return bem.Auto, usagef("solve: --solver %q unknown; available: dense, fast, auto", s)
	}
	return m, nil
}

// stageTimes are the wall-clock times of a solve's stages.
type stageTimes struct {
	prepare, solve time.Duration
}

// resultFiles builds every output file of a solved job, in memory, with
// results.json last so that it can list them all.
func resultFiles(t *task, images bool) (*results, []outputFile, error) {
	return resultFilesTimed(t, images, nil, time.Now())
}

// resultFilesTimed is resultFiles with the times of the stages before it
// (nil: none) and the start of this one, for results.json.
func resultFilesTimed(t *task, images bool, tm *stageTimes, start time.Time) (*results, []outputFile, error) {
	table, err := newBoundaryTable(t)
	if err != nil {
		return nil, nil, err
	}
	res, err := buildResults(t)
	if err != nil {
		return nil, nil, err
	}
	addSolverFacts(res, t)
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
	if tm != nil {
		st := &res.Solver.Timings
		st.Prepare = number(tm.prepare.Seconds())
		st.Solve = number(tm.solve.Seconds())
		st.Outputs = number(time.Since(start).Seconds())
		st.Total = st.Prepare + st.Solve + st.Outputs
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

// addSolverFacts fills the solver keys of results.json that the job's
// outcome does not carry: iterations, residual, solves and the system's own
// times.
func addSolverFacts(res *results, t *task) {
	sol := t.sol()
	if sol == nil {
		return
	}
	res.Solver.Iterations = sol.Iterations
	res.Solver.Residual = number(sol.Residual)
	if sys := t.out.System; sys != nil {
		tm := sys.Timing()
		res.Solver.Solves = tm.Count
		res.Solver.Timings.Setup = number(tm.Setup.Seconds())
		res.Solver.Timings.Solves = number(tm.Solves.Seconds())
		res.Solver.Bytes = sys.Bytes()
	}
}

// printSolveSummary prints what was solved and written for a person, and
// the warnings to stderr.
func printSolveSummary(w, stderr io.Writer, t *task, r *results, dir string) {
	how := fmt.Sprintf("condition estimate %.3g", float64(r.Solver.ConditionEstimate))
	if r.Solver.Kind == bem.Fast.String() {
		how = fmt.Sprintf("%d iterations, relative residual %.2g", r.Solver.Iterations, float64(r.Solver.Residual))
	}
	fmt.Fprintf(w, "solved %s: %s, %d panels, %d unknowns, %s solver (%s)\n",
		t.scenePath, r.Physics, r.Panels, r.Solver.Unknowns, r.Solver.Kind, how)
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
