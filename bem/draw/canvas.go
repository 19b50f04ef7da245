package draw

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/draw"
	"image/png"
	"io"
	"math"
	"sync"

	"github.com/fogleman/gg"
	"github.com/golang/freetype/truetype"
	xfont "golang.org/x/image/font"
	"golang.org/x/image/font/gofont/goregular"
	"gonum.org/v1/gonum/spatial/r2"
	"gonum.org/v1/plot"
	pfont "gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// canvas is what a picture is drawn on: pixel coordinates, origin at the
// top left, y down. One implementation rasterises (PNG), one writes SVG.
type canvas interface {
	// fill fills the rings as one path with the non-zero winding rule.
	fill(c color.Color, rings ...[]r2.Vec)
	// stroke draws a polyline (closed: back to its first point).
	stroke(c color.Color, width float64, dash []float64, closed bool, pts []r2.Vec)
	// text draws s with its anchor (ax, ay) at (x, y): ax 0 left, 0.5
	// centre, 1 right; ay 0 baseline, 0.5 middle, 1 top of capitals.
	// angle rotates anticlockwise about the anchor, radians.
	text(s string, x, y, size float64, c color.Color, ax, ay, angle float64)
	// measure returns the width and the height of capitals of s.
	measure(s string, size float64) (w, h float64)
	// image draws img with its top left corner at (x, y), scaled to w x h.
	image(img image.Image, x, y, w, h float64)
}

// The raster canvas: fogleman/gg with the Go regular font.

var (
	goFontOnce sync.Once
	goFont     *truetype.Font
	goFontErr  error
)

func regularFont() (*truetype.Font, error) {
	goFontOnce.Do(func() { goFont, goFontErr = truetype.Parse(goregular.TTF) })
	return goFont, goFontErr
}

type rasterCanvas struct {
	dc    *gg.Context
	font  *truetype.Font
	faces map[float64]xfont.Face
}

func newRaster(w, h int) (*rasterCanvas, error) {
	f, err := regularFont()
	if err != nil {
		return nil, fmt.Errorf("draw: the built-in font does not load: %v", err)
	}
	dc := gg.NewContext(w, h)
	dc.SetRGB(1, 1, 1)
	dc.Clear()
	return &rasterCanvas{dc: dc, font: f, faces: map[float64]xfont.Face{}}, nil
}

func (c *rasterCanvas) face(size float64) xfont.Face {
	size = math.Round(size*4) / 4
	if f, ok := c.faces[size]; ok {
		return f
	}
	f := truetype.NewFace(c.font, &truetype.Options{Size: size, Hinting: xfont.HintingNone})
	c.faces[size] = f
	return f
}

func (c *rasterCanvas) path(rings [][]r2.Vec, closed bool) {
	dc := c.dc
	dc.ClearPath()
	for _, r := range rings {
		if len(r) == 0 {
			continue
		}
		dc.NewSubPath()
		dc.MoveTo(r[0].X, r[0].Y)
		for _, p := range r[1:] {
			dc.LineTo(p.X, p.Y)
		}
		if closed {
			dc.ClosePath()
		}
	}
}

func (c *rasterCanvas) fill(col color.Color, rings ...[]r2.Vec) {
	c.dc.SetFillRuleWinding()
	c.path(rings, true)
	c.dc.SetColor(col)
	c.dc.Fill()
}

func (c *rasterCanvas) stroke(col color.Color, width float64, dash []float64, closed bool, pts []r2.Vec) {
	c.path([][]r2.Vec{pts}, closed)
	c.dc.SetColor(col)
	c.dc.SetLineWidth(width)
	c.dc.SetLineJoinRound()
	c.dc.SetLineCapRound()
	c.dc.SetDash(dash...)
	c.dc.Stroke()
	c.dc.SetDash()
}

func (c *rasterCanvas) text(s string, x, y, size float64, col color.Color, ax, ay, angle float64) {
	dc := c.dc
	dc.SetFontFace(c.face(size))
	w, _ := dc.MeasureString(s)
	hcap := size * capHeight
	dc.Push()
	dc.RotateAbout(-angle, x, y)
	dc.SetColor(col)
	dc.DrawString(s, x-ax*w, y+ay*hcap)
	dc.Pop()
}

func (c *rasterCanvas) measure(s string, size float64) (w, h float64) {
	c.dc.SetFontFace(c.face(size))
	w, _ = c.dc.MeasureString(s)
	return w, size * capHeight
}

func (c *rasterCanvas) image(img image.Image, x, y, w, h float64) {
	b := img.Bounds()
	dc := c.dc
	if dst, ok := dc.Image().(*image.RGBA); ok && w == float64(b.Dx()) && h == float64(b.Dy()) && x == math.Trunc(x) && y == math.Trunc(y) {
		// Pixel for pixel: a plain copy, no resampling.
		r := image.Rect(int(x), int(y), int(x)+b.Dx(), int(y)+b.Dy())
		draw.Draw(dst, r, img, b.Min, draw.Over)
		return
	}
	dc.Push()
	dc.Translate(x, y)
	dc.Scale(w/float64(b.Dx()), h/float64(b.Dy()))
	dc.DrawImage(img, 0, 0)
	dc.Pop()
}

func (c *rasterCanvas) writePNG(w io.Writer) error { return encodePNG(w, c.dc.Image()) }

// encodePNG writes img as PNG at the fastest compression: the default
// level's compression was a third of the drawing time of a picture, and
// the files grow by a fifth (examples/flap's four pictures: 752 kB to
// 919 kB).
func encodePNG(w io.Writer, img image.Image) error {
	e := png.Encoder{CompressionLevel: png.BestSpeed}
	return e.Encode(w, img)
}

// capHeight is the height of capitals over the font size (Go fonts: 0.7).
const capHeight = 0.7

// The vector canvas: gonum's vg with its SVG back end and its default
// sans-serif font.

type vectorCanvas struct {
	c *vgsvg.Canvas
	h float64
}

func newVector(w, h int) *vectorCanvas {
	return &vectorCanvas{c: vgsvg.New(vg.Length(w), vg.Length(h)), h: float64(h)}
}

func (c *vectorCanvas) pt(p r2.Vec) vg.Point {
	return vg.Point{X: vg.Length(p.X), Y: vg.Length(c.h - p.Y)}
}

func (c *vectorCanvas) path(rings [][]r2.Vec, closed bool) vg.Path {
	var p vg.Path
	for _, r := range rings {
		if len(r) == 0 {
			continue
		}
		p.Move(c.pt(r[0]))
		for _, q := range r[1:] {
			p.Line(c.pt(q))
		}
		if closed {
			p.Close()
		}
	}
	return p
}

func (c *vectorCanvas) fill(col color.Color, rings ...[]r2.Vec) {
	c.c.SetColor(col)
	c.c.Fill(c.path(rings, true))
}

func (c *vectorCanvas) stroke(col color.Color, width float64, dash []float64, closed bool, pts []r2.Vec) {
	c.c.SetColor(col)
	c.c.SetLineWidth(vg.Length(width))
	d := make([]vg.Length, len(dash))
	for i, v := range dash {
		d[i] = vg.Length(v)
	}
	c.c.SetLineDash(d, 0)
	c.c.Stroke(c.path([][]r2.Vec{pts}, closed))
	c.c.SetLineDash(nil, 0)
}

var vgFontOnce sync.Once

// sansSerif is the font of SVG text: Liberation Sans, which package plot
// registers (its metrics match Arial and Helvetica, so viewers without it
// substitute a font of the same widths).
var sansSerif = pfont.Font{Typeface: "Liberation", Variant: "Sans"}

func vgFace(size float64) *pfont.Face {
	vgFontOnce.Do(func() { _ = plot.DefaultFont }) // package plot registers its fonts on init
	f := pfont.DefaultCache.Lookup(sansSerif, vg.Length(size))
	return &f
}

func (c *vectorCanvas) text(s string, x, y, size float64, col color.Color, ax, ay, angle float64) {
	f := vgFace(size)
	w := f.Width(s).Points()
	c.c.Push()
	c.c.Translate(c.pt(r2.Vec{X: x, Y: y}))
	c.c.Rotate(angle)
	c.c.SetColor(col)
	c.c.FillString(*f, vg.Point{X: vg.Length(-ax * w), Y: vg.Length(-ay * size * capHeight)}, s)
	c.c.Pop()
}

func (c *vectorCanvas) measure(s string, size float64) (w, h float64) {
	return vgFace(size).Width(s).Points(), size * capHeight
}

func (c *vectorCanvas) image(img image.Image, x, y, w, h float64) {
	c.c.DrawImage(vg.Rectangle{
		Min: vg.Point{X: vg.Length(x), Y: vg.Length(c.h - y - h)},
		Max: vg.Point{X: vg.Length(x + w), Y: vg.Length(c.h - y)},
	}, img)
}

func (c *vectorCanvas) writeSVG(w io.Writer) error {
	var buf bytes.Buffer
	if _, err := c.c.WriteTo(&buf); err != nil {
		return err
	}
	// vgsvg embeds images as PNG but labels them JPEG; strict viewers
	// refuse the mismatch.
	data := bytes.ReplaceAll(buf.Bytes(), []byte("data:image/jpg;base64,"), []byte("data:image/png;base64,"))
	_, err := w.Write(data)
	return err
}
