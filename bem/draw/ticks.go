package draw

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
)

// niceStep returns a step of 1, 2 or 5 times a power of ten close to
// span/n.
func niceStep(span float64, n int) float64 {
	if !(span > 0) || math.IsInf(span, 0) {
		return 1
	}
	raw := span / float64(max(n, 1))
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, m := range []float64{1, 2, 5, 10} {
		if m*p >= raw*0.999 {
			return m * p
		}
	}
	return 10 * p
}

// ticks returns the multiples of a nice step within [lo, hi].
func ticks(lo, hi float64, n int) (vals []float64, step float64) {
	step = niceStep(hi-lo, n)
	return multiples(lo, hi, step), step
}

// multiples returns the multiples of step within [lo, hi] (with a margin of
// 1e-9 steps for rounding), an exact 0 among them.
func multiples(lo, hi, step float64) []float64 {
	var vals []float64
	first := math.Ceil(lo/step - 1e-9)
	for i := 0.0; ; i++ {
		v := (first + i) * step
		if v > hi+1e-9*step {
			break
		}
		if math.Abs(v) < 1e-9*step {
			v = 0
		}
		vals = append(vals, v)
	}
	return vals
}

// niceBelow returns the largest 1, 2 or 5 times a power of ten not above x.
func niceBelow(x float64) float64 {
	if !(x > 0) {
		return 0
	}
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, m := range []float64{5, 2, 1} {
		if m*p <= x*(1+1e-9) {
			return m * p
		}
	}
	return p
}

// formatTick formats v, one of the ticks spaced step apart, with as many
// digits as the spacing needs: plain decimals between 1e-3 and 1e5, and
// mantissa-exponent form ("2.5e6") outside.
func formatTick(v, step float64) string {
	if v == 0 {
		return "0"
	}
	a := math.Max(math.Abs(v), step)
	if a >= 1e-3 && a < 1e5 {
		dec := max(0, int(-math.Floor(math.Log10(step)+1e-9)))
		return strconv.FormatFloat(v, 'f', dec, 64)
	}
	e := math.Floor(math.Log10(math.Abs(v)))
	digits := max(0, int(e-math.Floor(math.Log10(step)+1e-9)))
	return compactExp(strconv.FormatFloat(v, 'e', min(digits, 6), 64))
}

// formatValue formats a single value with 4 significant digits.
func formatValue(v float64) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return strconv.FormatFloat(v, 'g', -1, 64)
	}
	a := math.Abs(v)
	if a >= 1e-3 && a < 1e5 {
		return strconv.FormatFloat(v, 'g', 4, 64)
	}
	return compactExp(strconv.FormatFloat(v, 'e', 3, 64))
}

// compactExp turns "2.50e+06" into "2.5e6".
func compactExp(s string) string {
	m, e, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	if strings.Contains(m, ".") {
		m = strings.TrimRight(strings.TrimRight(m, "0"), ".")
	}
	neg := strings.HasPrefix(e, "-")
	e = strings.TrimLeft(strings.TrimLeft(e, "+-"), "0")
	if e == "" {
		return m
	}
	if neg {
		e = "-" + e
	}
	return m + "e" + e
}

// niceTicker places ticks of gonum's plots at multiples of a 1, 2 or 5
// step (about n of them: the step nearest span/n on a log scale) labelled
// with as many digits as the step needs, and unlabelled minor ticks
// between them.
type niceTicker struct{ n int }

// Ticks implements plot.Ticker.
func (t niceTicker) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || math.IsInf(hi-lo, 0) {
		return nil
	}
	raw := (hi - lo) / float64(max(t.n, 1))
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	step := p
	for _, m := range []float64{2, 5, 10} {
		if math.Abs(math.Log(m*p/raw)) < math.Abs(math.Log(step/raw)) {
			step = m * p
		}
	}
	vals := multiples(lo, hi, step)
	var out []plot.Tick
	for _, v := range vals {
		out = append(out, plot.Tick{Value: v, Label: formatTick(v, step)})
	}
	// Minor ticks: fifths of a step of 5, halves of a step of 1 or 2.
	minor := step / 2
	if m := step / math.Pow(10, math.Floor(math.Log10(step)+1e-9)); m > 4 {
		minor = step / 5
	}
	for _, v := range multiples(lo, hi, minor) {
		if r := math.Remainder(v, step); math.Abs(r) > 1e-6*step {
			out = append(out, plot.Tick{Value: v})
		}
	}
	return out
}
