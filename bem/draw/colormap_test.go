package draw

import (
	"image/color"
	"math"
	"testing"
)

func okOf(c color.RGBA) (l, a, b float64) {
	return linearToOKLab(fromSRGB(float64(c.R)/255), fromSRGB(float64(c.G)/255), fromSRGB(float64(c.B)/255))
}

// OKLab (Ottosson 2020): white has L = 1, a = b = 0, and the two
// conversions invert each other.
func TestOKLab(t *testing.T) {
	l, a, b := linearToOKLab(1, 1, 1)
	if math.Abs(l-1) > 1e-4 || math.Abs(a) > 1e-4 || math.Abs(b) > 1e-4 {
		t.Errorf("white is (%v, %v, %v), want (1, 0, 0)", l, a, b)
	}
	for _, c := range [][3]float64{{0.2, 0.5, 0.9}, {1, 0, 0}, {0.01, 0.3, 0.02}} {
		r, g, bb := oklabToLinear(linearToOKLab(c[0], c[1], c[2]))
		if math.Abs(r-c[0]) > 1e-6 || math.Abs(g-c[1]) > 1e-6 || math.Abs(bb-c[2]) > 1e-6 {
			t.Errorf("round trip of %v gives (%v, %v, %v)", c, r, g, bb)
		}
	}
}

// simulate applies a colour-vision-deficiency matrix of Machado, Oliveira
// & Fernandes, "A physiologically-based model for simulation of color
// vision deficiency", IEEE TVCG 15(6), 2009, severity 1.0 (from memory), in
// linear RGB.
func simulate(m [3][3]float64, c color.RGBA) (l, a, b float64) {
	x := [3]float64{fromSRGB(float64(c.R) / 255), fromSRGB(float64(c.G) / 255), fromSRGB(float64(c.B) / 255)}
	var y [3]float64
	for i := range 3 {
		for j := range 3 {
			y[i] += m[i][j] * x[j]
		}
		y[i] = math.Min(1, math.Max(0, y[i]))
	}
	return linearToOKLab(y[0], y[1], y[2])
}

var (
	deuteranopia = [3][3]float64{{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}}
	protanopia   = [3][3]float64{{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}}
)

// The default map must be perceptually uniform (equal OKLab steps between
// neighbouring entries of its path within 5%: the path is resampled at
// equal arc length, and only where it bends onto the sRGB gamut's edge does
// one step's chord fall short, by 3% observed; its
// 8-bit colours within half a unit of that path), rise monotonically in
// lightness, and keep its
// order for deuteranopes and protanopes: simulated lightness still rising
// over every 8 entries (a few rounding wiggles between neighbours allowed),
// and ends at least 0.5 apart in lightness (common practice for a
// sequential map: a wide lightness range).
func TestSequential(t *testing.T) {
	tb := Sequential
	if len(tb) != 256 {
		t.Fatalf("%d entries", len(tb))
	}
	for i := 1; i < len(tb); i++ {
		l0, _, _ := okOf(tb[i-1])
		l1, _, _ := okOf(tb[i])
		if l1 < l0-1e-3 {
			t.Errorf("lightness falls from entry %d to %d: %.4f -> %.4f", i-1, i, l0, l1)
		}
	}
	path := sequentialPath(len(tb))
	var steps []float64
	mean := 0.0
	for i := 1; i < len(path); i++ {
		p, q := path[i-1], path[i]
		d := math.Sqrt((q.l-p.l)*(q.l-p.l) + (q.a-p.a)*(q.a-p.a) + (q.b-p.b)*(q.b-p.b))
		steps = append(steps, d)
		mean += d
		r, g, b := oklabToLinear(q.l, q.a, q.b)
		c := tb[i]
		for k, v := range [3]float64{r, g, b} {
			got := [3]uint8{c.R, c.G, c.B}[k]
			if math.Abs(255*toSRGB(v)-float64(got)) > 0.5+1e-9 || v < -1e-6 || v > 1+1e-6 {
				t.Errorf("entry %d channel %d: %d for %.4f (out of gamut or misrounded)", i, k, got, 255*toSRGB(v))
			}
		}
	}
	mean /= float64(len(steps))
	for i, d := range steps {
		if math.Abs(d-mean) > 0.05*mean {
			t.Errorf("step %d is %.4g, mean %.4g: not uniform", i, d, mean)
		}
	}
	for name, m := range map[string][3][3]float64{"deuteranopia": deuteranopia, "protanopia": protanopia} {
		for i := 8; i < len(tb); i += 8 {
			l0, _, _ := simulate(m, tb[i-8])
			l1, _, _ := simulate(m, tb[i])
			if l1 <= l0 {
				t.Errorf("%s: simulated lightness falls between entries %d and %d", name, i-8, i)
			}
		}
		lo, _, _ := simulate(m, tb[0])
		hi, _, _ := simulate(m, tb[255])
		if hi-lo < 0.5 {
			t.Errorf("%s: lightness range %.3f, want >= 0.5", name, hi-lo)
		}
	}
	if c := tb.At(0.5); c.A != 255 {
		t.Errorf("At(0.5) = %v, not opaque", c)
	}
}
