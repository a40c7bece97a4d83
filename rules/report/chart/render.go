package chart

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Format is an output file format.
type Format int

const (
	// SVG is scalable vector graphics (text stays text).
	SVG Format = iota
	// PNG is a raster image at Size.DPI.
	PNG
)

// String returns the format's file extension without the dot.
func (f Format) String() string {
	if f == PNG {
		return "png"
	}
	return "svg"
}

// FormatOf picks the format from a file name's extension (.svg or .png).
func FormatOf(path string) (Format, error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".svg":
		return SVG, nil
	case ".png":
		return PNG, nil
	}
	return 0, fmt.Errorf("%s: the output file must end in .svg or .png", path)
}

// Size is the drawing size; DPI sets the pixel size of PNG output
// (width in inches × DPI, rounded).
type Size struct {
	Width, Height vg.Length
	DPI           int
}

// DefaultSize is 16 × 10 cm at 96 dots per inch (a PNG of 605 × 378 pixels).
var DefaultSize = Size{Width: 16 * vg.Centimeter, Height: 10 * vg.Centimeter, DPI: 96}

// Size limits: smaller charts cannot hold their labels, larger ones are
// a typo (a PNG of more than 8000 pixels a side is hundreds of megabytes).
const (
	minSide   = 4 * vg.Centimeter
	maxPixels = 8000
	minDPI    = 24
	maxDPI    = 1200
)

// Pixels returns the PNG size in pixels.
func (s Size) Pixels() (int, int) {
	px := func(l vg.Length) int { return int(math.Round(float64(l/vg.Inch) * float64(s.DPI))) }
	return px(s.Width), px(s.Height)
}

// Validate reports a size that cannot be drawn.
func (s Size) Validate() error {
	if s.DPI < minDPI || s.DPI > maxDPI {
		return fmt.Errorf("dpi %d is outside %d–%d", s.DPI, minDPI, maxDPI)
	}
	if s.Width < minSide || s.Height < minSide {
		return fmt.Errorf("width and height must be at least %g cm", float64(minSide/vg.Centimeter))
	}
	if w, h := s.Pixels(); w > maxPixels || h > maxPixels {
		return fmt.Errorf("%d × %d pixels is more than %d a side; lower the size or the dpi", w, h, maxPixels)
	}
	return nil
}

// ParseLength reads a length such as "16cm", "120 mm", "4in", "300pt" or
// "800px" (pixels at dpi).
func ParseLength(s string, dpi int) (vg.Length, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	units := []struct {
		suffix string
		per    vg.Length
	}{{"cm", vg.Centimeter}, {"mm", vg.Millimeter}, {"in", vg.Inch}, {"pt", 1}, {"px", vg.Inch / vg.Length(dpi)}}
	for _, u := range units {
		if num, ok := strings.CutSuffix(t, u.suffix); ok {
			v, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
				break
			}
			return vg.Length(v) * u.per, nil
		}
	}
	return 0, fmt.Errorf("cannot read length %q (use e.g. 16cm, 120mm, 4in, 300pt or 800px)", s)
}

// Render draws the chart to w.
func (c *Chart) Render(w io.Writer, f Format, s Size) error {
	if err := s.Validate(); err != nil {
		return err
	}
	switch f {
	case PNG:
		pw, ph := s.Pixels()
		cv := vgimg.NewWith(vgimg.UseImage(image.NewRGBA(image.Rect(0, 0, pw, ph))), vgimg.UseDPI(s.DPI))
		c.draw(draw.New(cv))
		_, err := vgimg.PngCanvas{Canvas: cv}.WriteTo(w)
		return err
	default:
		cv := vgsvg.New(s.Width, s.Height)
		c.draw(draw.New(cv))
		var buf bytes.Buffer
		if _, err := cv.WriteTo(&buf); err != nil {
			return err
		}
		_, err := w.Write(svgFonts(buf.Bytes()))
		return err
	}
}

// svgFonts gives the SVG's font names metric-compatible fallbacks, so a
// viewer without Liberation Sans keeps the laid-out text widths instead of
// falling back to a serif face.
func svgFonts(b []byte) []byte {
	return bytes.ReplaceAll(b, []byte("font-family:Liberation Sans;"),
		[]byte("font-family:'Liberation Sans',Arimo,Arial,Helvetica,sans-serif;"))
}

func textStyle(f font.Font, size float64, clr color.Color) text.Style {
	return text.Style{Color: clr, Font: font.From(f, vg.Points(size)), Handler: plot.DefaultTextHandler}
}

func sub(c draw.Canvas, minX, minY, maxX, maxY vg.Length) draw.Canvas {
	return draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{Min: vg.Point{X: minX, Y: minY}, Max: vg.Point{X: maxX, Y: maxY}}}
}

// Layout spacing.
const (
	margin    = vg.Length(8)
	headerGap = vg.Length(6)
	legendGap = vg.Length(8)
	thumbW    = vg.Length(24)
	thumbGap  = vg.Length(4)
	// minTitleSize is the smallest a chart title shrinks to (points).
	minTitleSize = 9
	// maxFlowRows is the most rows a legend under the panels may take.
	maxFlowRows = 3
	// legendShare is the largest share of the width a legend column may
	// take before the legend moves under the panels.
	legendShare = 0.4
)

func (c *Chart) draw(dc draw.Canvas) {
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	area := sub(dc, dc.Min.X+margin, dc.Min.Y+margin, dc.Max.X-margin, dc.Max.Y-margin)

	y := area.Max.Y
	title := textStyle(boldFont, titleSize, inkColor)
	title.YAlign = draw.YTop
	width := area.Max.X - area.Min.X
	// A long recipe id shrinks the title a little before anything is cut.
	for size := float64(titleSize); size > minTitleSize && title.Width(c.Title) > width; size -= 0.5 {
		title.Font.Size = vg.Points(size - 0.5)
	}
	dc.FillText(title, vg.Point{X: area.Min.X, Y: y}, fitText(title, c.Title, width))
	y -= title.Height(c.Title) + 2
	if c.Subtitle != "" {
		st := textStyle(sansFont, subSize, mutedColor)
		st.YAlign = draw.YTop
		dc.FillText(st, vg.Point{X: area.Min.X, Y: y}, fitText(st, c.Subtitle, width))
		y -= st.Height(c.Subtitle)
	}
	y -= headerGap
	body := sub(dc, area.Min.X, area.Min.Y, area.Max.X, y)

	entries := c.legend()
	plots := body
	if len(entries) > 0 {
		// Under the panels when it takes at most maxFlowRows rows (the
		// panels keep the full width), else in a column on the right.
		lg := newLegend(entries)
		bodyW := body.Max.X - body.Min.X
		h := lg.flowHeight(bodyW)
		if colW := lg.columnWidth(); h > maxFlowRows*lg.rowH && colW <= legendShare*bodyW {
			cols := lg.columnsFor(body.Max.Y - body.Min.Y)
			w := colW * vg.Length(cols)
			lg.drawColumns(sub(dc, body.Max.X-w, body.Min.Y, body.Max.X, body.Max.Y), cols)
			plots = sub(dc, body.Min.X, body.Min.Y, body.Max.X-w-legendGap, body.Max.Y)
		} else {
			lg.drawFlow(sub(dc, body.Min.X, body.Min.Y, body.Max.X, body.Min.Y+h))
			plots = sub(dc, body.Min.X, body.Min.Y+h+legendGap/2, body.Max.X, body.Max.Y)
		}
	}
	cols, rows := grid(len(c.Panels), plots.Max.X-plots.Min.X, plots.Max.Y-plots.Min.Y)
	tw := (plots.Max.X - plots.Min.X) / vg.Length(cols)
	th := (plots.Max.Y - plots.Min.Y) / vg.Length(rows)
	for i := range c.Panels {
		row, col := i/cols, i%cols
		x0 := plots.Min.X + tw*vg.Length(col)
		y1 := plots.Max.Y - th*vg.Length(row)
		tile := sub(dc, x0, y1-th, x0+tw, y1)
		if cols > 1 && col < cols-1 {
			tile.Max.X -= 6
		}
		if rows > 1 && row > 0 {
			tile.Max.Y -= 4
		}
		lastRow := row == rows-1 || i+cols >= len(c.Panels)
		drawPanel(tile, &c.Panels[i], lastRow, col == 0 || len(c.Panels) == 1)
	}
}

// grid picks the columns and rows for n panels whose tiles come closest
// to a 3:2 shape with the fewest empty cells.
func grid(n int, w, h vg.Length) (cols, rows int) {
	if n <= 1 {
		return 1, 1
	}
	best := math.Inf(1)
	for c := 1; c <= n; c++ {
		r := (n + c - 1) / c
		aspect := float64(w/vg.Length(c)) / float64(h/vg.Length(r))
		score := math.Abs(math.Log(aspect/1.5)) + 0.25*float64(r*c-n)
		if score < best {
			best, cols, rows = score, c, r
		}
	}
	return cols, rows
}

func drawPanel(tile draw.Canvas, p *Panel, xLabel, yLabel bool) {
	pl := plot.New()
	pl.BackgroundColor = nil
	if p.Title != "" {
		pl.Title.TextStyle = textStyle(boldFont, panelSize, inkColor)
		pl.Title.Text = fitText(pl.Title.TextStyle, p.Title, tile.Max.X-tile.Min.X-4)
		pl.Title.TextStyle.XAlign = draw.XCenter
		pl.Title.TextStyle.YAlign = draw.YTop
		pl.Title.Padding = 3
	}
	for _, ax := range []*plot.Axis{&pl.X, &pl.Y} {
		ax.Label.TextStyle = textStyle(sansFont, labelSize, inkColor)
		ax.Tick.Label = textStyle(sansFont, tickSize, mutedColor)
		ax.LineStyle = draw.LineStyle{Color: mutedColor, Width: vg.Points(0.7)}
		ax.Tick.LineStyle = draw.LineStyle{Color: mutedColor, Width: vg.Points(0.6)}
		ax.Tick.Length = 3
		ax.Padding = 2
	}
	pl.X.Tick.Label.XAlign, pl.X.Tick.Label.YAlign = draw.XCenter, draw.YTop
	pl.Y.Tick.Label.XAlign, pl.Y.Tick.Label.YAlign = draw.XRight, draw.YCenter
	pl.Y.Label.TextStyle.XAlign, pl.Y.Label.TextStyle.YAlign = draw.XCenter, draw.YBottom
	pl.X.Label.TextStyle.XAlign, pl.X.Label.TextStyle.YAlign = draw.XCenter, draw.YBottom
	if xLabel {
		pl.X.Label.Text = wrapText(pl.X.Label.TextStyle, p.X.Label, tile.Max.X-tile.Min.X)
	}
	if yLabel && p.Y.Label != "" {
		// Drawn here rather than by gonum/plot, which centres a y label
		// on the data midpoint and so pushes it off a log axis.
		ts := textStyle(sansFont, labelSize, inkColor)
		ts.Rotation = math.Pi / 2
		ts.XAlign, ts.YAlign = draw.XCenter, draw.YTop
		label := fitText(ts, p.Y.Label, tile.Max.Y-tile.Min.Y)
		tile.FillText(ts, vg.Point{X: tile.Min.X, Y: (tile.Min.Y + tile.Max.Y) / 2}, label)
		tile.Min.X += ts.Height(p.Y.Label) + 3
	}
	// About one labelled tick per 40 pt of axis, 3 to 7 of them.
	pl.X.Tick.Marker = niceTicks{alt: p.X.Alt, most: min(max(int((tile.Max.X-tile.Min.X)/40), 3), 7)}
	pl.Y.Tick.Marker = niceTicks{most: min(max(int((tile.Max.Y-tile.Min.Y)/30), 3), 7)}
	if p.Y.Log {
		pl.Y.Scale = plot.LogScale{}
		pl.Y.Tick.Marker = decadeTicks{}
	}

	g := plotter.NewGrid()
	g.Vertical = draw.LineStyle{Color: gridColor, Width: vg.Points(0.6)}
	g.Horizontal = g.Vertical
	for _, b := range p.Bands {
		pl.Add(bandPlotter{b})
	}
	pl.Add(g)
	for _, r := range p.Refs {
		pl.Add(refPlotter{r})
	}
	for k, s := range p.Series {
		xys := make(plotter.XYs, 0, len(s.X))
		for i := range s.X {
			if p.Y.Log && s.Y[i] <= 0 {
				continue
			}
			xys = append(xys, plotter.XY{X: s.X[i], Y: s.Y[i]})
		}
		if len(xys) == 0 {
			continue
		}
		ln := &plotter.Line{XYs: xys, LineStyle: seriesLine(k)}
		// About one marker per 60 pt of panel width, 3 to 6 per curve.
		n := min(max(int((tile.Max.X-tile.Min.X)/60), 3), 6)
		pl.Add(ln, markers(xys, k, len(p.Series), n, p.Y))
	}
	if p.LabelCurves {
		pl.Add(curveLabels{p.Series})
	}
	for _, m := range p.Marks {
		pl.Add(markPlotter{m})
	}
	if p.Note != "" {
		pl.Add(notePlotter{p.Note})
	}
	// Fixed ranges are set after Add, which widens them to the data.
	if p.X.Min < p.X.Max {
		pl.X.Min, pl.X.Max = p.X.Min, p.X.Max
	}
	if p.Y.Min < p.Y.Max {
		pl.Y.Min, pl.Y.Max = p.Y.Min, p.Y.Max
	}
	pl.Draw(tile)
}

// markers places count markers along the k-th of n series, offset so
// markers of different curves do not stack. Points outside a fixed
// y range are left out: gonum/plot pads the axes to keep every marker in
// view, which would squeeze the panel.
func markers(xys plotter.XYs, k, n, count int, y Axis) *plotter.Scatter {
	var pts plotter.XYs
	for j := 0; j < count; j++ {
		f := (float64(j) + 0.5 + float64(k)/float64(max(n, 1))*0.8) / float64(count)
		pt := xys[min(int(f*float64(len(xys)-1)), len(xys)-1)]
		if y.Min < y.Max && (pt.Y < y.Min || pt.Y > y.Max) {
			continue
		}
		pts = append(pts, pt)
	}
	return &plotter.Scatter{XYs: pts, GlyphStyle: seriesGlyph(k)}
}

// niceTicks puts at most `most` intervals between labelled ticks on
// round values (1, 2 or 5 times a power of ten), with a minor tick
// between each pair, and writes the second unit under each label when
// alt is set.
type niceTicks struct {
	alt  *AltScale
	most int
}

// Ticks implements plot.Ticker.
func (t niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) {
		return []plot.Tick{{Value: lo, Label: formatTick(lo, 4)}}
	}
	raw := (hi - lo) / float64(max(t.most, 1))
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := 10 * mag
	for _, m := range []float64{1, 2, 5} {
		if m*mag >= raw*(1-1e-9) {
			step = m * mag
			break
		}
	}
	decimals := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	var ts []plot.Tick
	for i := math.Ceil(lo/step - 1e-9); i*step <= hi+step*1e-9; i++ {
		v := i * step
		label := formatTick(v, decimals)
		if t.alt != nil {
			label += "\n" + formatTick(v*t.alt.Factor, max(0, decimals)) + " " + t.alt.Unit
		}
		ts = append(ts, plot.Tick{Value: v, Label: label})
		if m := v + step/2; m < hi {
			ts = append(ts, plot.Tick{Value: m})
		}
	}
	return ts
}

// decadeTicks labels every power of ten in range, with minor ticks at 2–9
// times each.
type decadeTicks struct{}

// Ticks implements plot.Ticker.
func (decadeTicks) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	for e := math.Floor(math.Log10(lo) + 1e-9); e <= math.Log10(hi)+1e-9; e++ {
		v := math.Pow(10, e)
		ts = append(ts, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'f', max(0, int(-e)), 64)})
		for m := 2.0; m < 10; m++ {
			if m*v <= hi {
				ts = append(ts, plot.Tick{Value: m * v})
			}
		}
	}
	return ts
}

// formatTick writes v with the given decimals and a true minus sign.
func formatTick(v float64, decimals int) string {
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return strings.Replace(s, "-", "−", 1)
}

// fitText shortens txt to width w: first to the part before " · ", then
// by cutting characters and adding an ellipsis.
func fitText(ts text.Style, txt string, w vg.Length) string {
	if ts.Width(txt) <= w {
		return txt
	}
	if head, _, ok := strings.Cut(txt, " · "); ok {
		txt = head
		if ts.Width(txt) <= w {
			return txt
		}
	}
	r := []rune(txt)
	for len(r) > 1 && ts.Width(string(r)+"…") > w {
		r = r[:len(r)-1]
	}
	return string(r) + "…"
}

// wrapText breaks txt into at most two lines of width w at spaces, and
// shortens the second line if it is still too long.
func wrapText(ts text.Style, txt string, w vg.Length) string {
	if ts.Width(txt) <= w {
		return txt
	}
	words := strings.Fields(txt)
	line := ""
	for i, word := range words {
		next := strings.TrimSpace(line + " " + word)
		if line != "" && ts.Width(next) > w {
			return line + "\n" + fitText(ts, strings.Join(words[i:], " "), w)
		}
		line = next
	}
	return fitText(ts, txt, w)
}

// curveLabels writes each series' label just under the curve's highest
// point (inside the panel at either edge), moving a label down when it
// would overlap one already placed.
type curveLabels struct{ series []Series }

// Plot implements plot.Plotter.
func (cl curveLabels) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	var placed []vg.Rectangle
	for k, s := range cl.series {
		top := 0
		for i := range s.Y {
			if s.Y[i] > s.Y[top] {
				top = i
			}
		}
		if len(s.Y) == 0 {
			continue
		}
		pt := vg.Point{X: tx(s.X[top]), Y: ty(s.Y[top]) - 3}
		ts := textStyle(sansFont, noteSize, seriesColors[k%len(seriesColors)])
		ts.YAlign = draw.YTop
		w, h := ts.Width(s.Label), ts.Height(s.Label)
		switch {
		case pt.X-w/2 < c.Min.X+2:
			pt.X = c.Min.X + 2
		case pt.X+w/2 > c.Max.X-2:
			ts.XAlign, pt.X = draw.XRight, c.Max.X-2
		default:
			ts.XAlign = draw.XCenter
		}
		box := func() vg.Rectangle {
			x0 := pt.X + vg.Length(ts.XAlign)*w
			return vg.Rectangle{Min: vg.Point{X: x0, Y: pt.Y - h}, Max: vg.Point{X: x0 + w, Y: pt.Y}}
		}
		for tries := 0; tries < 4 && overlapsAny(box(), placed); tries++ {
			pt.Y -= h + 2
		}
		placed = append(placed, box())
		labelBox(c, ts, pt, s.Label)
	}
}

func overlapsAny(r vg.Rectangle, rs []vg.Rectangle) bool {
	for _, o := range rs {
		if r.Min.X < o.Max.X && o.Min.X < r.Max.X && r.Min.Y < o.Max.Y && o.Min.Y < r.Max.Y {
			return true
		}
	}
	return false
}

type bandPlotter struct{ b Band }

// Plot implements plot.Plotter.
func (bp bandPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	b := bp.b
	lo, hi := c.Min.Y, c.Max.Y
	tr := ty
	if b.OnX {
		lo, hi, tr = c.Min.X, c.Max.X, tx
	}
	loEdge, hiEdge := !math.IsInf(b.Lo, 0), !math.IsInf(b.Hi, 0)
	if loEdge {
		lo = max(lo, min(hi, tr(b.Lo)))
	}
	if hiEdge {
		hi = min(hi, max(lo, tr(b.Hi)))
	}
	var pts []vg.Point
	if b.OnX {
		pts = []vg.Point{{X: lo, Y: c.Min.Y}, {X: hi, Y: c.Min.Y}, {X: hi, Y: c.Max.Y}, {X: lo, Y: c.Max.Y}}
	} else {
		pts = []vg.Point{{X: c.Min.X, Y: lo}, {X: c.Max.X, Y: lo}, {X: c.Max.X, Y: hi}, {X: c.Min.X, Y: hi}}
	}
	c.FillPolygon(bandFill, pts)
	edge := bandEdgeLine()
	for _, e := range []struct {
		on bool
		at vg.Length
		v  float64
	}{{loEdge, lo, b.Lo}, {hiEdge, hi, b.Hi}} {
		if !e.on || e.at != tr(e.v) {
			continue
		}
		if b.OnX {
			c.StrokeLine2(edge, e.at, c.Min.Y, e.at, c.Max.Y)
		} else {
			c.StrokeLine2(edge, c.Min.X, e.at, c.Max.X, e.at)
		}
	}
}

// minLabelledWidth: reference lines in narrower panels go without their
// text (the legend still names them).
const minLabelledWidth = 150

type refPlotter struct{ r Ref }

// Plot implements plot.Plotter.
func (rp refPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	r := rp.r
	sty := refLine(r.Style)
	ts := textStyle(sansFont, noteSize, sty.Color)
	if c.Max.X-c.Min.X < minLabelledWidth {
		r.Text = ""
	}
	if r.Style == Guide {
		ts.Color = mutedColor
	}
	if r.OnX {
		x := tx(r.At)
		if !c.ContainsX(x) {
			return
		}
		c.StrokeLine2(sty, x, c.Min.Y, x, c.Max.Y)
		ts.YAlign = draw.YTop
		pt := vg.Point{X: x + 2, Y: c.Max.Y - 2}
		if x+2+ts.Width(r.Text) > c.Max.X {
			ts.XAlign, pt.X = draw.XRight, x-2
		}
		labelBox(c, ts, pt, r.Text)
		return
	}
	if r.At <= 0 && p.Y.Scale == (plot.LogScale{}) {
		return
	}
	y := ty(r.At)
	if !c.ContainsY(y) {
		return
	}
	c.StrokeLine2(sty, c.Min.X, y, c.Max.X, y)
	ts.XAlign, ts.YAlign = draw.XRight, draw.YBottom
	labelBox(c, ts, vg.Point{X: c.Max.X - 2, Y: y + 3}, r.Text)
}

// labelBox writes txt on a translucent white box so it stays readable
// over curves and grid lines.
func labelBox(c draw.Canvas, ts text.Style, pt vg.Point, txt string) {
	if txt == "" {
		return
	}
	w, h := ts.Width(txt), ts.Height(txt)
	x0 := pt.X + vg.Length(ts.XAlign)*w
	y0 := pt.Y + vg.Length(ts.YAlign)*h
	var box vg.Path
	pad := vg.Length(1.2)
	box.Move(vg.Point{X: x0 - pad, Y: y0 - pad})
	box.Line(vg.Point{X: x0 + w + pad, Y: y0 - pad})
	box.Line(vg.Point{X: x0 + w + pad, Y: y0 + h + pad})
	box.Line(vg.Point{X: x0 - pad, Y: y0 + h + pad})
	box.Close()
	c.SetColor(color.NRGBA{R: 255, G: 255, B: 255, A: 210})
	c.Fill(box)
	c.FillText(ts, pt, txt)
}

type markPlotter struct{ m Mark }

// Plot implements plot.Plotter.
func (mp markPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	m := mp.m
	if p.Y.Scale == (plot.LogScale{}) && m.Y <= 0 {
		return
	}
	pt := vg.Point{X: tx(m.X), Y: ty(m.Y)}
	if !c.Contains(pt) {
		return
	}
	g := markGlyph()
	c.DrawGlyph(g, pt)
	ts := textStyle(boldFont, noteSize+0.5, inkColor)
	ts.YAlign = draw.YCenter
	at := vg.Point{X: pt.X + g.Radius + 3, Y: pt.Y}
	if at.X+ts.Width(m.Label) > c.Max.X {
		ts.XAlign, at.X = draw.XRight, pt.X-g.Radius-3
	}
	// Keep the label off the curve's steep part: lift it half a line.
	at.Y += ts.Height(m.Label) * 0.9
	if at.Y+ts.Height(m.Label)/2 > c.Max.Y {
		at.Y = pt.Y - ts.Height(m.Label)*0.9
	}
	labelBox(c, ts, at, m.Label)
}

// GlyphBoxes implements plot.GlyphBoxer so the axes leave room for the
// whole diamond at a panel edge.
func (mp markPlotter) GlyphBoxes(p *plot.Plot) []plot.GlyphBox {
	if p.Y.Scale == (plot.LogScale{}) && mp.m.Y <= 0 {
		return nil
	}
	g := markGlyph()
	return []plot.GlyphBox{{X: p.X.Norm(mp.m.X), Y: p.Y.Norm(mp.m.Y), Rectangle: g.Rectangle()}}
}

// DataRange implements plot.DataRanger so the point is always in view.
func (mp markPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	return mp.m.X, mp.m.X, mp.m.Y, mp.m.Y
}

type notePlotter struct{ text string }

// Plot implements plot.Plotter.
func (np notePlotter) Plot(c draw.Canvas, p *plot.Plot) {
	ts := textStyle(sansFont, labelSize, mutedColor)
	ts.XAlign, ts.YAlign = draw.XCenter, draw.YCenter
	c.FillText(ts, c.Center(), np.text)
}
