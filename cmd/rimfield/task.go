package main

import (
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// task is one solved scene with everything the writers of results need.
type task struct {
	scenePath string
	scene     *geom.Scene
	mesh      *mesh.Mesh // mesh.Layout is the scene's layout
	job       job.Job    // the job of the scene's physics
	words     *job.Words // its words and units
	out       *job.Outcome
	levels    int // number of equipotentials for contours and pictures
	// warnings collects what the writers of outputs noticed; they go into
	// results.json.
	warnings []string
	grid     *grid.Grid  // the solution on the default grid, once sampled
	pics     *pictureJob // picture and report flags, results and pictures (images.go)
}

// sol returns the solution the outputs show.
func (t *task) sol() *bem.Solution { return t.out.Solution }

// artifact is an optional group of output files (contours, pictures),
// registered by its own file in an init function.
type artifact struct {
	name  string // for messages: "contours", "pictures"
	image bool   // skipped with --no-images
	files func(t *task) ([]outputFile, error)
}

// artifacts lists the registered artifacts in the order they are written.
var artifacts []artifact

// pictureJob returns the task's picture state, with the defaults when the
// task came without picture flags (tests, library use).
func (t *task) pictureJob() (*pictureJob, error) {
	if t.pics == nil {
		pj := &pictureJob{}
		if err := pj.check(); err != nil {
			return nil, err
		}
		t.pics = pj
	}
	return t.pics, nil
}

// window returns the area that contours and pictures cover, in metres:
// --window, or grid.Auto.
func (t *task) window() grid.Window {
	if t.pics != nil && t.pics.win != nil {
		s := t.scene.Problem.Scale
		if !(s > 0) {
			s = 1
		}
		w := t.pics.win
		return grid.Window{Min: r2.Vec{X: w[0] * s, Y: w[1] * s}, Max: r2.Vec{X: w[2] * s, Y: w[3] * s}}
	}
	w := grid.Auto(t.mesh)
	if t.out != nil && t.out.Window != nil {
		w = *t.out.Window
	}
	if t.out != nil && len(t.out.Extent) > 0 {
		// Take in the job's points with the margin Auto keeps.
		lo, hi := w.Min, w.Max
		for _, p := range t.out.Extent {
			lo = r2.Vec{X: math.Min(lo.X, p.X), Y: math.Min(lo.Y, p.Y)}
			hi = r2.Vec{X: math.Max(hi.X, p.X), Y: math.Max(hi.Y, p.Y)}
		}
		if lo != w.Min || hi != w.Max {
			m := 0.04 * math.Max(hi.X-lo.X, hi.Y-lo.Y)
			if hi.Y > w.Max.Y {
				hi.Y += m
			}
			if lo.Y < w.Min.Y {
				lo.Y -= m
			}
			w = grid.Window{Min: lo, Max: hi}
		}
	}
	return w
}

// levelRange returns the range of potential the equipotentials are drawn
// from: the lowest and highest potential on the boundary, or, for a job
// that chooses its levels (Outcome.Levels), the range of the sampled grid.
func (t *task) levelRange() (lo, hi float64) {
	if t.out.Levels == nil {
		return grid.BoundaryRange(t.sol())
	}
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range t.sampled().U {
		if !math.IsNaN(v) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	return lo, hi
}

// contourLevels returns the equipotential levels of the task: --at as
// given, the job's choice, or --levels K evenly spaced between the lowest
// and highest boundary potential (nil when they are equal).
func (t *task) contourLevels() []float64 {
	if t.pics != nil && t.pics.at != nil {
		return t.pics.at
	}
	lo, hi := t.levelRange()
	if t.out.Levels != nil {
		if !(hi > lo) {
			return nil
		}
		return t.out.Levels(lo, hi, t.levels)
	}
	return grid.Levels(lo, hi, t.levels)
}

// sampled returns the solution sampled on the default grid over the default
// window, computed once per task and shared by contours and pictures.
func (t *task) sampled() *grid.Grid {
	if t.grid == nil {
		w := t.window()
		nx, ny := w.Shape(grid.DefaultPoints(len(t.mesh.Panels)))
		t.grid = grid.Sample(t.sol(), w, nx, ny, grid.Options{})
	}
	return t.grid
}
