package chart

import (
	"math"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

type entryKind int

const (
	entrySeries entryKind = iota
	entryMark
	entryBand
	entryRef
)

// legendEntry is one line of the legend: a sample of the style and a text.
type legendEntry struct {
	text string
	kind entryKind
	// k is the series index (entrySeries).
	k   int
	ref RefStyle
}

// legend collects the entries of every panel, each style and text once:
// curves first, then the recipe point, shaded windows and reference lines.
func (c *Chart) legend() []legendEntry {
	var out []legendEntry
	seen := map[legendEntry]bool{}
	add := func(e legendEntry) {
		if e.text != "" && !seen[e] {
			seen[e] = true
			out = append(out, e)
		}
	}
	n := 0
	for _, p := range c.Panels {
		n += len(p.Series)
	}
	if c.MaxLegendSeries == 0 || n <= c.MaxLegendSeries {
		for _, p := range c.Panels {
			for k, s := range p.Series {
				add(legendEntry{text: s.Label, kind: entrySeries, k: k})
			}
		}
	}
	for _, p := range c.Panels {
		for _, m := range p.Marks {
			add(legendEntry{text: m.Label, kind: entryMark})
		}
	}
	for _, p := range c.Panels {
		for _, b := range p.Bands {
			add(legendEntry{text: b.Label, kind: entryBand})
		}
	}
	for _, p := range c.Panels {
		for _, r := range p.Refs {
			add(legendEntry{text: r.Legend, kind: entryRef, ref: r.Style})
		}
	}
	return out
}

type legendBox struct {
	entries []legendEntry
	ts      text.Style
	rowH    vg.Length
}

// legendColGap separates legend columns (and entries in a flowing legend).
const legendColGap = vg.Length(10)

func newLegend(entries []legendEntry) *legendBox {
	ts := textStyle(sansFont, legendSize, inkColor)
	ts.YAlign = draw.YCenter
	return &legendBox{entries: entries, ts: ts, rowH: vg.Points(legendSize * 1.7)}
}

func (l *legendBox) entryWidth(e legendEntry) vg.Length {
	return thumbW + thumbGap + l.ts.Width(e.text)
}

func (l *legendBox) columnWidth() vg.Length {
	w := vg.Length(0)
	for _, e := range l.entries {
		w = max(w, l.entryWidth(e))
	}
	return w + legendColGap
}

// columnsFor returns how many columns the entries need to fit height h.
func (l *legendBox) columnsFor(h vg.Length) int {
	perCol := max(int(h/l.rowH), 1)
	return int(math.Ceil(float64(len(l.entries)) / float64(perCol)))
}

func (l *legendBox) drawColumns(c draw.Canvas, cols int) {
	rows := int(math.Ceil(float64(len(l.entries)) / float64(cols)))
	colW := (c.Max.X - c.Min.X) / vg.Length(cols)
	for i, e := range l.entries {
		col, row := i/rows, i%rows
		x := c.Min.X + colW*vg.Length(col) + legendColGap
		y := c.Max.Y - l.rowH*(vg.Length(row)+0.5)
		l.drawEntry(c, e, x, y)
	}
}

// flowPositions lays entries out left to right, wrapping at width w.
func (l *legendBox) flowPositions(w vg.Length) (xs []vg.Length, rows []int) {
	x, row := vg.Length(0), 0
	for _, e := range l.entries {
		ew := l.entryWidth(e)
		if x > 0 && x+ew > w {
			x, row = 0, row+1
		}
		xs, rows = append(xs, x), append(rows, row)
		x += ew + legendColGap
	}
	return xs, rows
}

func (l *legendBox) flowHeight(w vg.Length) vg.Length {
	_, rows := l.flowPositions(w)
	if len(rows) == 0 {
		return 0
	}
	return l.rowH * vg.Length(rows[len(rows)-1]+1)
}

func (l *legendBox) drawFlow(c draw.Canvas) {
	xs, rows := l.flowPositions(c.Max.X - c.Min.X)
	for i, e := range l.entries {
		l.drawEntry(c, e, c.Min.X+xs[i], c.Max.Y-l.rowH*(vg.Length(rows[i])+0.5))
	}
}

// drawEntry draws the style sample with its left edge at x and its middle
// at y, and the text after it.
func (l *legendBox) drawEntry(c draw.Canvas, e legendEntry, x, y vg.Length) {
	mid := vg.Point{X: x + thumbW/2, Y: y}
	switch e.kind {
	case entrySeries:
		c.StrokeLine2(seriesLine(e.k), x, y, x+thumbW, y)
		c.DrawGlyphNoClip(seriesGlyph(e.k), mid)
	case entryMark:
		c.DrawGlyphNoClip(markGlyph(), mid)
	case entryBand:
		h := l.rowH * 0.36
		c.FillPolygon(bandFill, []vg.Point{{X: x, Y: y - h}, {X: x + thumbW, Y: y - h}, {X: x + thumbW, Y: y + h}, {X: x, Y: y + h}})
		c.StrokeLine2(bandEdgeLine(), x, y-h, x+thumbW, y-h)
		c.StrokeLine2(bandEdgeLine(), x, y+h, x+thumbW, y+h)
	case entryRef:
		c.StrokeLine2(refLine(e.ref), x, y, x+thumbW, y)
	}
	c.FillText(l.ts, vg.Point{X: x + thumbW + thumbGap, Y: y}, e.text)
}
