package draw

import (
	"image/color"
	"math"
)

// Colormap maps a value in [0, 1] to a colour.
type Colormap interface {
	At(t float64) color.RGBA
}

// Table is a colour map given by equally spaced colours, interpolated
// linearly between them; values outside [0, 1] take the end colours.
type Table []color.RGBA

// At returns the colour at t.
func (tb Table) At(t float64) color.RGBA {
	n := len(tb)
	if math.IsNaN(t) || n == 0 {
		return color.RGBA{}
	}
	t = math.Min(1, math.Max(0, t)) * float64(n-1)
	i := int(t)
	if i >= n-1 {
		return tb[n-1]
	}
	f := t - float64(i)
	a, b := tb[i], tb[i+1]
	mix := func(x, y uint8) uint8 { return uint8(math.Round(float64(x) + f*(float64(y)-float64(x)))) }
	return color.RGBA{mix(a.R, b.R), mix(a.G, b.G), mix(a.B, b.B), 255}
}

// Sequential is the default colour map: a sequential map from dark blue
// through teal and green to light yellow, perceptually uniform and readable
// with the common colour-vision deficiencies.
//
// It is derived here rather than copied: a path in the OKLab colour space
// (Ottosson, "A perceptual color space for image processing", 2020), with
// lightness rising linearly from 0.30 to 0.93 and hue turning from blue
// (265 degrees) through cyan and green to yellow (105 degrees), chroma kept
// inside the sRGB gamut, then resampled at equal OKLab distances so that
// equal steps of the value look equally large. Lightness rises
// monotonically, so the order survives grey-scale printing; the hue path
// runs along the blue-yellow axis that red-green deficient viewers keep
// (the design principle of the perceptually uniform maps of van der Walt &
// Smith, matplotlib's default maps, SciPy 2015 talk). TestSequential checks
// uniformity, monotonic lightness and the simulated deuteranope and
// protanope views.
var Sequential = deriveSequential(256)

// Path of the derived map in OKLCh.
const (
	seqL0, seqL1 = 0.30, 0.93 // lightness at the ends
	seqH0, seqH1 = 265.0, 105 // hue at the ends, degrees
	seqCmax      = 0.16       // chroma aimed at (reduced where sRGB has less)
	seqCmin      = 0.085      // chroma at the ends' low point
	seqSteps     = 4096       // fine sampling before resampling by distance
)

// lab is a colour in OKLab.
type lab struct{ l, a, b float64 }

func deriveSequential(n int) Table {
	path := sequentialPath(n)
	out := make(Table, n)
	for i, p := range path {
		r, g, b := oklabToLinear(p.l, p.a, p.b)
		out[i] = color.RGBA{toSRGB8(r), toSRGB8(g), toSRGB8(b), 255}
	}
	return out
}

// sequentialPath returns n points of the map's path in OKLab at equal
// distances along it.
func sequentialPath(n int) []lab {
	// Fine path, with its cumulative OKLab length.
	fine := make([]lab, seqSteps)
	cum := make([]float64, seqSteps)
	for i := range fine {
		t := float64(i) / float64(seqSteps-1)
		l := seqL0 + (seqL1-seqL0)*t
		h := (seqH0 + (seqH1-seqH0)*t) * math.Pi / 180
		// Chroma: lower at the dark end and in the middle (cyan, where sRGB
		// is narrow), highest toward yellow.
		c := seqCmin + (seqCmax-seqCmin)*(0.35+0.65*t)*(1-0.45*math.Sin(math.Pi*t))
		c = maxChroma(l, h, c)
		fine[i] = lab{l, c * math.Cos(h), c * math.Sin(h)}
		if i > 0 {
			p := fine[i-1]
			cum[i] = cum[i-1] + math.Sqrt((fine[i].l-p.l)*(fine[i].l-p.l)+(fine[i].a-p.a)*(fine[i].a-p.a)+(fine[i].b-p.b)*(fine[i].b-p.b))
		}
	}
	out := make([]lab, n)
	k := 0
	for i := range out {
		s := cum[seqSteps-1] * float64(i) / float64(n-1)
		for k < seqSteps-2 && cum[k+1] < s {
			k++
		}
		f := (s - cum[k]) / (cum[k+1] - cum[k])
		f = math.Min(1, math.Max(0, f))
		p, q := fine[k], fine[k+1]
		out[i] = lab{p.l + f*(q.l-p.l), p.a + f*(q.a-p.a), p.b + f*(q.b-p.b)}
	}
	return out
}

// maxChroma returns the largest chroma up to c at lightness l and hue h
// (radians) whose colour lies inside the sRGB gamut, by bisection.
func maxChroma(l, h, c float64) float64 {
	in := func(c float64) bool {
		r, g, b := oklabToLinear(l, c*math.Cos(h), c*math.Sin(h))
		const e = 1e-9
		return r >= -e && r <= 1+e && g >= -e && g <= 1+e && b >= -e && b <= 1+e
	}
	if in(c) {
		return c
	}
	lo, hi := 0.0, c
	for range 40 {
		m := 0.5 * (lo + hi)
		if in(m) {
			lo = m
		} else {
			hi = m
		}
	}
	return lo
}

// OKLab conversion (Ottosson 2020; matrices from memory, checked by the
// round trip and the white point in the tests).
func linearToOKLab(r, g, b float64) (l, a, bb float64) {
	lc := math.Cbrt(0.4122214708*r + 0.5363325363*g + 0.0514459929*b)
	mc := math.Cbrt(0.2119034982*r + 0.6806995451*g + 0.1073969566*b)
	sc := math.Cbrt(0.0883024619*r + 0.2817188376*g + 0.6299787005*b)
	return 0.2104542553*lc + 0.7936177850*mc - 0.0040720468*sc,
		1.9779984951*lc - 2.4285922050*mc + 0.4505937099*sc,
		0.0259040371*lc + 0.7827717662*mc - 0.8086757660*sc
}

func oklabToLinear(l, a, b float64) (r, g, bl float64) {
	lc := l + 0.3963377774*a + 0.2158037573*b
	mc := l - 0.1055613458*a - 0.0638541728*b
	sc := l - 0.0894841775*a - 1.2914855480*b
	lc, mc, sc = lc*lc*lc, mc*mc*mc, sc*sc*sc
	return 4.0767416621*lc - 3.3077115913*mc + 0.2309699292*sc,
		-1.2684380046*lc + 2.6097574011*mc - 0.3413193965*sc,
		-0.0041960863*lc - 0.7034186147*mc + 1.7076147010*sc
}

// sRGB transfer function (IEC 61966-2-1:1999).
func toSRGB(x float64) float64 {
	x = math.Min(1, math.Max(0, x))
	if x <= 0.0031308 {
		return 12.92 * x
	}
	return 1.055*math.Pow(x, 1/2.4) - 0.055
}

func fromSRGB(v float64) float64 {
	if v <= 0.04045 {
		return v / 12.92
	}
	return math.Pow((v+0.055)/1.055, 2.4)
}

func toSRGB8(x float64) uint8 { return uint8(math.Round(255 * toSRGB(x))) }
