package mesh

import (
	"errors"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
)

// A body 1e-6 m thick in a 100 m box (1e-8 of the scene) would need some
// 2e7 panels no longer than its thickness: the automatic mesh stops at once
// with a TooFineError naming the body, its thickness and the ways out,
// instead of sampling its gap for a minute. So does a gap of 1e-6 m
// between two bodies. The thin sheet of TestThinSheet (10 mm in 100 m)
// meshes as before, and MaxPanels lowers the limit.
func TestTooFine(t *testing.T) {
	thin := func(w float64) *geom.Layout {
		ps := ring(rect(0, 0, 100, 100), 0, geom.Outside, -1, geom.Insulated)
		ps = append(ps, ring(reversed(rect(50, 40, 50+w, 50)), 0, geom.Outside, 0, geom.Insulated)...)
		return layout(ps, 1, 1, false)
	}
	_, err := Build(thin(1e-6), Options{})
	var te *TooFineError
	if !errors.As(err, &te) || !te.Thickness || te.Feature != `body "a"` || te.Size > 2e-6 || te.Max != defaultMaxPanels {
		t.Fatalf("1 um body: %v (%+v)", err, te)
	}
	for _, want := range []string{`body "a" is 1e-06 m thick`, "draw it as a line", "20000"} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("message %q lacks %q", err, want)
		}
	}

	gap := func(g float64) *geom.Layout {
		ps := ring(rect(0, 0, 1, 1), 0, geom.Outside, -1, geom.Insulated)
		ps = append(ps, ring(reversed(rect(0.2, 0.2, 0.5, 0.8)), 0, geom.Outside, 0, geom.Insulated)...)
		ps = append(ps, ring(reversed(rect(0.5+g, 0.2, 0.8, 0.8)), 0, geom.Outside, 1, geom.Insulated)...)
		return layout(ps, 2, 1, false)
	}
	_, err = Build(gap(1e-7), Options{})
	if !errors.As(err, &te) || te.Thickness || te.Across == "" || !strings.Contains(err.Error(), "the gap of") {
		t.Fatalf("1e-7 m gap: %v (%+v)", err, te)
	}
	if _, err := Build(gap(1e-3), Options{}); err != nil {
		t.Errorf("1 mm gap in a 1 m box: %v", err)
	}
	if _, err := Build(thinSheet(), Options{}); err != nil {
		t.Errorf("10 mm sheet in a 100 m box: %v", err)
	}
	if _, err := Build(thinSheet(), Options{MaxPanels: 1000}); !errors.As(err, &te) || te.Max != 1000 {
		t.Errorf("10 mm sheet with at most 1000 panels: %v", err)
	}
}
