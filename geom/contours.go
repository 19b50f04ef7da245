package geom

import (
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"
	"gonum.org/v1/gonum/spatial/r2"
)

// LevelLine is one connected piece of a level curve (an equipotential) in
// metres: open, or closed when its last point repeats its first.
type LevelLine struct {
	Level  float64  // the potential along the line
	Unit   string   // the potential's unit ("V", "m", ...), written as the "unit" property
	Points []r2.Vec // metres
}

// WriteLines writes lines as a GeoJSON FeatureCollection of LineStrings, one
// Feature per line with the properties "level" and "unit". Coordinates are
// divided by scale (metres per scene unit, Problem.Scale) so that the file
// overlays the scene it came from. Lines with fewer than two points are
// left out.
func WriteLines(w io.Writer, lines []LevelLine, scale float64) error {
	if !(scale > 0) || math.IsInf(scale, 0) {
		return fmt.Errorf("geom: contour scale %g is not a positive number of metres per scene unit", scale)
	}
	fc := geojson.NewFeatureCollection()
	for i, l := range lines {
		if len(l.Points) < 2 {
			continue
		}
		if math.IsNaN(l.Level) || math.IsInf(l.Level, 0) {
			return fmt.Errorf("geom: contour %d has the level %g; levels must be finite", i, l.Level)
		}
		ls := make(orb.LineString, len(l.Points))
		for k, p := range l.Points {
			if math.IsNaN(p.X) || math.IsNaN(p.Y) || math.IsInf(p.X, 0) || math.IsInf(p.Y, 0) {
				return fmt.Errorf("geom: contour %d (level %g) has a point that is not finite", i, l.Level)
			}
			ls[k] = orb.Point{p.X / scale, p.Y / scale}
		}
		f := geojson.NewFeature(ls)
		f.Properties["level"] = l.Level
		f.Properties["unit"] = l.Unit
		fc.Append(f)
	}
	data, err := json.Marshal(fc)
	if err != nil {
		return fmt.Errorf("geom: contours: %v", err)
	}
	data = append(data, '\n')
	_, err = w.Write(data)
	return err
}
