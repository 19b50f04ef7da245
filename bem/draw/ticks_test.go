package draw

import "testing"

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
