package main

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"

	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
)

// contoursName is the file of equipotential lines.
const contoursName = "contours.geojson"

func init() {
	artifacts = append(artifacts, artifact{name: "contours", files: contourFiles})
}

// contourFiles writes contours.geojson: t.levels evenly spaced equipotentials
// between the lowest and highest boundary potential, as LineStrings with
// "level" and "unit" properties, in the scene's coordinate unit so that the
// file overlays the scene.
func contourFiles(t *task) ([]outputFile, error) {
	lo, hi := t.levelRange()
	levels := t.contourLevels()
	var lines []geom.LevelLine
	if t.pics != nil && t.pics.at != nil {
		var out []string
		for _, v := range t.pics.at {
			if v < lo || v > hi {
				out = append(out, strconv.FormatFloat(v, 'g', -1, 64))
			}
		}
		if len(out) > 0 {
			u := t.words.Units.Potential
			t.warnings = append(t.warnings, fmt.Sprintf("--at %s: outside the range of the boundary's %s (%s to %s), where no equipotential lies; give levels between them",
				strings.Join(out, ","), t.words.Potential, draw.FormatSI(lo, u), draw.FormatSI(hi, u)))
		}
	}
	if levels == nil {
		t.warnings = append(t.warnings, fmt.Sprintf("%s holds no lines: the boundary potential does not vary (from %g to %g)", contoursName, lo, hi))
	} else {
		lines = grid.Contours(t.sampled(), levels, t.words.Units.Potential)
	}
	var buf bytes.Buffer
	if err := geom.WriteLines(&buf, lines, t.scene.Problem.Scale); err != nil {
		return nil, err
	}
	return []outputFile{bytesFile(contoursName, buf.Bytes())}, nil
}
