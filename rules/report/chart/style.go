package chart

import (
	"image/color"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The look of phgate's charts. Colours are muted and dark enough to print;
// every series also has its own dash pattern and marker shape, so no
// meaning rests on colour alone.

func rgb(v uint32) color.RGBA {
	return color.RGBA{R: uint8(v >> 16), G: uint8(v >> 8), B: uint8(v), A: 255}
}

var (
	inkColor     = rgb(0x22262b) // titles, axes
	mutedColor   = rgb(0x5d6670) // subtitles, tick labels
	gridColor    = rgb(0xe7e9ec)
	bandFill     = rgb(0xe3efe5) // target window
	bandEdge     = rgb(0x5f9468)
	guideColor   = rgb(0x8a8f96) // pKa lines
	limitColor   = rgb(0xa8322d) // rule thresholds
	markerColor  = rgb(0x33393f) // the recipe's own value
	markFill     = rgb(0xf0b43c) // the recipe point
	seriesColors = []color.RGBA{
		rgb(0x1f5f7a), // lake
		rgb(0xbf5b24), // rust
		rgb(0x4d7a2a), // moss
		rgb(0x7d3f8c), // heather
		rgb(0x9a7a10), // mustard
		rgb(0x2c3a4d), // ink blue
		rgb(0xa8385a), // raspberry
	}
	seriesDashes = [][]vg.Length{
		nil,
		{vg.Points(6), vg.Points(3)},
		{vg.Points(1.4), vg.Points(2.2)},
		{vg.Points(7), vg.Points(2.5), vg.Points(1.4), vg.Points(2.5)},
		{vg.Points(11), vg.Points(3.5)},
		{vg.Points(3.5), vg.Points(2), vg.Points(1.4), vg.Points(2), vg.Points(1.4), vg.Points(2)},
		{vg.Points(3), vg.Points(3)},
	}
	seriesGlyphs = []draw.GlyphDrawer{
		draw.CircleGlyph{},
		draw.TriangleGlyph{},
		draw.BoxGlyph{},
		diamondGlyph{},
		draw.CrossGlyph{},
		draw.PyramidGlyph{},
		draw.RingGlyph{},
		draw.PlusGlyph{},
	}
)

// Typography: Liberation Sans (shipped with gonum/plot, so PNG output
// needs no system fonts; SVG output names it with metric-compatible
// fallbacks, see svgFonts).
var (
	sansFont = font.Font{Typeface: "Liberation", Variant: "Sans"}
	boldFont = font.Font{Typeface: "Liberation", Variant: "Sans", Weight: xfont.WeightBold}
)

// Font sizes in points, chosen to stay legible when a 16 × 10 cm chart
// is shown at half a page's width.
const (
	titleSize  = 12
	subSize    = 8
	panelSize  = 8.5
	labelSize  = 9
	tickSize   = 8
	legendSize = 8.5
	noteSize   = 7.5
)

// seriesLine is the line style of the k-th series of a panel.
func seriesLine(k int) draw.LineStyle {
	return draw.LineStyle{Color: seriesColors[k%len(seriesColors)], Width: vg.Points(1.5),
		Dashes: seriesDashes[k%len(seriesDashes)]}
}

// seriesGlyph is the marker shape of the k-th series.
func seriesGlyph(k int) draw.GlyphStyle {
	return draw.GlyphStyle{Color: seriesColors[k%len(seriesColors)], Radius: vg.Points(2.6),
		Shape: seriesGlyphs[k%len(seriesGlyphs)]}
}

func refLine(s RefStyle) draw.LineStyle {
	switch s {
	case Limit:
		return draw.LineStyle{Color: limitColor, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(5), vg.Points(2.5)}}
	case Marker:
		return draw.LineStyle{Color: markerColor, Width: vg.Points(0.9),
			Dashes: []vg.Length{vg.Points(5), vg.Points(2), vg.Points(1), vg.Points(2)}}
	}
	return draw.LineStyle{Color: guideColor, Width: vg.Points(0.8), Dashes: []vg.Length{vg.Points(1), vg.Points(2)}}
}

func bandEdgeLine() draw.LineStyle {
	return draw.LineStyle{Color: bandEdge, Width: vg.Points(0.7), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
}

func markGlyph() draw.GlyphStyle {
	return draw.GlyphStyle{Color: markFill, Radius: vg.Points(4.5), Shape: diamondGlyph{outline: inkColor}}
}

// diamondGlyph is a filled diamond with an optional dark outline.
type diamondGlyph struct {
	outline color.Color
}

// DrawGlyph implements draw.GlyphDrawer.
func (g diamondGlyph) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	r := sty.Radius
	var p vg.Path
	p.Move(vg.Point{X: pt.X, Y: pt.Y + r})
	p.Line(vg.Point{X: pt.X + r, Y: pt.Y})
	p.Line(vg.Point{X: pt.X, Y: pt.Y - r})
	p.Line(vg.Point{X: pt.X - r, Y: pt.Y})
	p.Close()
	c.SetColor(sty.Color)
	c.Fill(p)
	if g.outline != nil {
		c.SetLineStyle(draw.LineStyle{Color: g.outline, Width: vg.Points(0.9)})
		c.Stroke(p)
	}
}
