package geom

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r2"
)

// WriteLines converts metres back to the scene's unit: 2.5 mm written with
// scale 1e-3 (metres per millimetre) must read back as 2.5.
func TestWriteLines(t *testing.T) {
	lines := []LevelLine{
		{Level: 0.25, Unit: "V", Points: []r2.Vec{{X: 0.0025, Y: -0.001}, {X: 0.003, Y: 0}}},
		{Level: 0.5, Unit: "V", Points: []r2.Vec{{X: 0, Y: 0}}}, // too short: left out
	}
	var buf bytes.Buffer
	if err := WriteLines(&buf, lines, 1e-3); err != nil {
		t.Fatal(err)
	}
	var fc struct {
		Type     string `json:"type"`
		Features []struct {
			Geometry struct {
				Type        string       `json:"type"`
				Coordinates [][2]float64 `json:"coordinates"`
			} `json:"geometry"`
			Properties map[string]any `json:"properties"`
		} `json:"features"`
	}
	if err := json.Unmarshal(buf.Bytes(), &fc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, buf.String())
	}
	if fc.Type != "FeatureCollection" || len(fc.Features) != 1 {
		t.Fatalf("got %s with %d features, want a FeatureCollection with 1", fc.Type, len(fc.Features))
	}
	f := fc.Features[0]
	if f.Geometry.Type != "LineString" || f.Properties["level"] != 0.25 || f.Properties["unit"] != "V" {
		t.Errorf("feature %+v", f)
	}
	// Metres over 1e-3 m per mm; 1e-12 allows the rounding of one division.
	want := [][2]float64{{2.5, -1}, {3, 0}}
	for i, c := range f.Geometry.Coordinates {
		if math.Abs(c[0]-want[i][0]) > 1e-12 || math.Abs(c[1]-want[i][1]) > 1e-12 {
			t.Errorf("coordinate %d = %v, want %v", i, c, want[i])
		}
	}
}

func TestWriteLinesErrors(t *testing.T) {
	ok := []r2.Vec{{X: 0, Y: 0}, {X: 1, Y: 0}}
	for _, c := range []struct {
		lines []LevelLine
		scale float64
		want  string
	}{
		{[]LevelLine{{Level: 1, Points: ok}}, 0, "scale"},
		{[]LevelLine{{Level: math.NaN(), Points: ok}}, 1, "finite"},
		{[]LevelLine{{Level: 1, Points: []r2.Vec{{X: math.Inf(1)}, {}}}}, 1, "not finite"},
	} {
		err := WriteLines(&bytes.Buffer{}, c.lines, c.scale)
		if err == nil || !strings.HasPrefix(err.Error(), "geom: ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("got %v, want a geom error about %q", err, c.want)
		}
	}
}
