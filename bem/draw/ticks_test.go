package draw

import (
	"fmt"
	"testing"
)

func TestFormat(t *testing.T) {
	for _, c := range []struct {
		v, step float64
		want    string
	}{
		{0.25, 0.05, "0.25"}, {2, 1, "2"}, {0, 0.1, "0"}, {2.5e6, 5e5, "2.5e6"}, {3e-5, 1e-5, "3e-5"}, {-40, 20, "-40"},
	} {
		if got := formatTick(c.v, c.step); got != c.want {
			t.Errorf("formatTick(%v, %v) = %q, want %q", c.v, c.step, got, c.want)
		}
	}
	if got := formatValue(1.23456e7); got != "1.235e7" {
		t.Errorf("formatValue = %q", got)
	}
	vals, step := ticks(0.03, 0.97, 5)
	if step != 0.2 || len(vals) != 4 || vals[0] != 0.2 {
		t.Errorf("ticks(0.03, 0.97, 5) = %v step %v", vals, step)
	}
	if niceBelow(0.37) != 0.2 || niceBelow(7) != 5 || niceBelow(1) != 1 {
		t.Error("niceBelow")
	}
}

// The charts' ticker: multiples of a 1, 2 or 5 step (common practice),
// labelled without stray digits, and unlabelled minor ticks between them.
func TestNiceTicker(t *testing.T) {
	var major []string
	minor := 0
	for _, tk := range (niceTicker{n: 8}).Ticks(0.006, 0.7) {
		if tk.Label == "" {
			minor++
			continue
		}
		major = append(major, tk.Label)
	}
	want := []string{"0.1", "0.2", "0.3", "0.4", "0.5", "0.6", "0.7"}
	if fmt.Sprint(major) != fmt.Sprint(want) {
		t.Errorf("major ticks over [0.006, 0.7]: %v, want %v", major, want)
	}
	if minor != 7 { // halves of the step of 0.1: 0.05, 0.15, ..., 0.65
		t.Errorf("%d minor ticks, want 7", minor)
	}
	var labels []string
	for _, tk := range (niceTicker{n: 8}).Ticks(-8.4, 8.4) {
		if tk.Label != "" {
			labels = append(labels, tk.Label)
		}
	}
	if fmt.Sprint(labels) != "[-8 -6 -4 -2 0 2 4 6 8]" {
		t.Errorf("ticks over [-8.4, 8.4]: %v", labels)
	}
}
