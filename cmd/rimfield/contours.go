package main

import (
	"bytes"
	"fmt"
	"io"

	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
)

// contoursName is the file of equipotential lines.
const contoursName = "contours.geojson"

func init() {
	artifacts = append(artifacts, artifact{name: "contours", files: contourFiles})
}

// sampled returns the solution sampled on the default grid over the default
// window, computed once per job and shared by contours and pictures.
func (j *job) sampled() *grid.Grid {
	if j.grid == nil {
		w := j.window()
		nx, ny := w.Shape(grid.DefaultPoints(len(j.mesh.Panels)))
		j.grid = grid.Sample(j.sol, w, nx, ny, grid.Options{})
	}
	return j.grid
}

// contourFiles writes contours.geojson: j.levels evenly spaced equipotentials
// between the lowest and highest boundary potential, as LineStrings with
// "level" and "unit" properties, in the scene's coordinate unit so that the
// file overlays the scene.
func contourFiles(j *job) ([]outputFile, error) {
	lo, hi := grid.BoundaryRange(j.sol)
	levels := j.contourLevels(lo, hi)
	var lines []geom.LevelLine
	if levels == nil {
		j.warnings = append(j.warnings, fmt.Sprintf("%s holds no lines: the boundary potential does not vary (from %g to %g)", contoursName, lo, hi))
	} else {
		lines = grid.Contours(j.sampled(), levels, unitsOf(j.scene.Problem.Physics).Potential)
	}
	var buf bytes.Buffer
	if err := geom.WriteLines(&buf, lines, j.scene.Problem.Scale); err != nil {
		return nil, err
	}
	data := buf.Bytes()
	return []outputFile{{contoursName, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}}}, nil
}
