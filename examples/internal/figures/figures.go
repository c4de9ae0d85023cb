// Package figures draws the example programs' figures with gonum/plot:
// line plots with labelled axes, a heat map with contours, and a bar
// chart, each saved as SVG and PNG.
//
// Plotting lives here, under examples/, so that the library's own packages
// never import gonum.org/v1/plot.
package figures

import (
	"errors"
	"fmt"
	"image/color"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Size is the figure size.
var (
	Width  = 16 * vg.Centimeter
	Height = 10 * vg.Centimeter
)

// Series is one named line. Points whose X or Y is NaN break the line
// (they are not drawn), so an infeasible stretch shows as a gap.
type Series struct {
	Name string
	X, Y []float64
	// Dashed draws the line dashed.
	Dashed bool
	// Points draws markers instead of a line.
	Points bool
	// Step draws the line as steps (a value held until the next point).
	Step bool
	// Colour picks the series' colour: n > 0 is the palette's colour n−1
	// (so that related series share a colour); 0 means by the series'
	// position.
	Colour int
}

// Axes are a figure's title and axis labels (with their units).
type Axes struct {
	Title, X, Y string
	// YMin and YMax fix the Y range when YMax > YMin; XMin and XMax the X
	// range when XMax > XMin.
	YMin, YMax, XMin, XMax float64
	// LegendBottom and LegendLeft move the legend from the top right.
	LegendBottom, LegendLeft bool
	// Note is printed in small type under the figure (a source, the
	// safety caution of figures that show pressures, loads or speeds).
	Note string
	// Limits are drawn as dashed horizontal lines with their names (a
	// unit's maximum speed, a relief setting).
	Limits []Limit
	// Band is shaded across the plot between two X values (a recommended
	// range); nil means none.
	Band *Band
	// YTicks names the integer Y values 0, 1, 2, ... (for a quantity such
	// as the range in use); nil means numeric ticks.
	YTicks []string
}

// unlabelled keeps a ticker's ticks and drops their labels (for the X axis
// of all but the bottom panel).
type unlabelled struct{ plot.Ticker }

// Ticks implements plot.Ticker.
func (u unlabelled) Ticks(lo, hi float64) []plot.Tick {
	ts := u.Ticker.Ticks(lo, hi)
	for i := range ts {
		ts[i].Label = ""
	}
	return ts
}

// named ticks label 0, 1, 2, ... with names.
type named []string

// Ticks implements plot.Ticker.
func (n named) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	for i, s := range n {
		if v := float64(i); v >= lo && v <= hi {
			ts = append(ts, plot.Tick{Value: v, Label: s})
		}
	}
	return ts
}

// Limit is a horizontal line at Y named Name.
type Limit struct {
	Name string
	Y    float64
}

// Band is an X interval shaded and named in the legend.
type Band struct {
	Name     string
	From, To float64
}

// save writes p as base.svg and base.png in dir and returns both paths.
func save(p *plot.Plot, dir, base, note string) ([]string, error) {
	return saveWith(func(c draw.Canvas) { p.Draw(c) }, dir, base, note)
}

// noteHeight is the strip under a figure that holds its note.
const noteHeight = 0.55 * vg.Centimeter

// saveWith draws with paint (and the note under it) into base.svg and
// base.png in dir.
func saveWith(paint func(c draw.Canvas), dir, base, note string) ([]string, error) {
	full := func(c draw.Canvas) {
		if note == "" {
			paint(c)
			return
		}
		paint(draw.Crop(c, 0, 0, noteHeight, 0))
		sty := plot.New().X.Label.TextStyle
		sty.Font.Size = vg.Points(7)
		sty.XAlign = draw.XLeft
		c.FillText(sty, vg.Point{X: c.Min.X + vg.Points(4), Y: c.Min.Y + vg.Points(4)}, note)
	}
	svg := filepath.Join(dir, base+".svg")
	sc := vgsvg.New(Width, Height)
	full(draw.New(sc))
	if err := writeTo(svg, sc); err != nil {
		return nil, err
	}
	// The PNG at 150 dpi, sharp enough for a README.
	png := filepath.Join(dir, base+".png")
	c := vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(Width, Height), vgimg.UseDPI(150))}
	full(draw.New(c))
	if err := writeTo(png, c); err != nil {
		return nil, err
	}
	return []string{svg, png}, nil
}

func writeTo(path string, w io.WriterTo) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	if _, err := w.WriteTo(f); err != nil {
		f.Close()
		return fmt.Errorf("figures: saving %s: %w", path, err)
	}
	return f.Close()
}

// niceTicks puts major ticks at 1, 2, 2.5 or 5 times a power of ten, six to
// ten of them, labelled without trailing noise, with a minor tick between.
type niceTicks struct{}

// Ticks implements plot.Ticker.
func (niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || math.IsInf(hi-lo, 0) {
		return plot.DefaultTicks{}.Ticks(lo, hi)
	}
	span := hi - lo
	mag := math.Pow(10, math.Floor(math.Log10(span/8)))
	step := mag
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		step = m * mag
		if span/step <= 9 {
			break
		}
	}
	k := int(math.Floor(math.Log10(step) + 1e-9))
	dec := max(0, -k)
	if math.Abs(step/math.Pow(10, float64(k))-2.5) < 1e-9 {
		dec = max(0, 1-k)
	}
	var out []plot.Tick
	for k := math.Ceil(lo/step - 1e-9); k*step <= hi+1e-9*step; k++ {
		v := k * step
		if v == 0 {
			v = 0 // no "-0"
		}
		out = append(out, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'f', dec, 64)})
		if m := v + step/2; m <= hi {
			out = append(out, plot.Tick{Value: m})
		}
	}
	if f := math.Ceil(lo/step-1e-9)*step - step/2; f >= lo {
		out = append(out, plot.Tick{Value: f})
	}
	return out
}

// twoLines breaks a long title (a design's name, then what the figure
// shows) after its first ": " so that it does not run off the figure.
func twoLines(t string) string {
	if i := strings.Index(t, ": "); i > 0 && utf8.RuneCountInString(t) > 55 {
		return t[:i] + "\n" + t[i+2:]
	}
	return t
}

func newPlot(a Axes) *plot.Plot {
	p := plot.New()
	p.Title.Text = twoLines(a.Title)
	p.Title.TextStyle.Font.Size = vg.Points(11)
	p.X.Label.Text = a.X
	p.Y.Label.Text = a.Y
	p.X.Tick.Marker = niceTicks{}
	p.Y.Tick.Marker = niceTicks{}
	p.Add(plotter.NewGrid())
	p.Legend.Top = !a.LegendBottom
	p.Legend.Left = a.LegendLeft
	p.Legend.TextStyle.Font.Size = vg.Points(9)
	p.Legend.XOffs, p.Legend.YOffs = -vg.Points(6), -vg.Points(6)
	if a.LegendLeft {
		p.Legend.XOffs = vg.Points(6)
	}
	if a.LegendBottom {
		p.Legend.YOffs = vg.Points(6)
	}
	if a.YMax > a.YMin {
		p.Y.Min, p.Y.Max = a.YMin, a.YMax
	}
	if a.XMax > a.XMin {
		p.X.Min, p.X.Max = a.XMin, a.XMax
	}
	return p
}

// decorate adds a's band and limit lines to p (after the data ranges are
// known) and the legend's background.
func decorate(p *plot.Plot, a Axes, legend bool) error {
	if a.Band != nil {
		ymin, ymax := p.Y.Min, p.Y.Max
		poly, err := plotter.NewPolygon(plotter.XYs{{X: a.Band.From, Y: ymin}, {X: a.Band.To, Y: ymin}, {X: a.Band.To, Y: ymax}, {X: a.Band.From, Y: ymax}})
		if err != nil {
			return err
		}
		poly.Color = color.NRGBA{R: 90, G: 180, B: 90, A: 60}
		poly.LineStyle.Width = 0
		p.Add(poly)
		if a.Band.Name != "" {
			p.Legend.Add(a.Band.Name, poly)
		}
	}
	xmin, xmax := p.X.Min, p.X.Max
	named := 0
	for _, lim := range a.Limits {
		l, err := plotter.NewLine(plotter.XYs{{X: xmin, Y: lim.Y}, {X: xmax, Y: lim.Y}})
		if err != nil {
			return err
		}
		l.LineStyle.Color = color.Gray{Y: 60}
		l.LineStyle.Width = vg.Points(1)
		l.LineStyle.Dashes = []vg.Length{vg.Points(2), vg.Points(2)}
		p.Add(l)
		if lim.Name == "" {
			continue
		}
		// Names alternate between the left and the right end, so that
		// close limits do not print over each other.
		at, align := xmin, draw.XLeft
		if named%2 == 1 {
			at, align = xmax, draw.XRight
		}
		named++
		lb, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{{X: at, Y: lim.Y}}, Labels: []string{" " + lim.Name + " "}})
		if err != nil {
			return err
		}
		lb.TextStyle[0].Font.Size = vg.Points(7)
		lb.TextStyle[0].YAlign = draw.YBottom
		lb.TextStyle[0].XAlign = align
		p.Add(lb)
	}
	_ = legend
	return nil
}

// pieces splits a series at NaN points.
func pieces(s Series) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	n := min(len(s.X), len(s.Y))
	for i := range n {
		x, y := s.X[i], s.Y[i]
		if math.IsNaN(x) || math.IsNaN(y) || math.IsInf(x, 0) || math.IsInf(y, 0) {
			if len(cur) > 0 {
				out = append(out, cur)
				cur = nil
			}
			continue
		}
		cur = append(cur, plotter.XY{X: x, Y: y})
	}
	if len(cur) > 0 {
		out = append(out, cur)
	}
	return out
}

// Lines draws the series as lines (or points) and saves base.svg and
// base.png in dir.
func Lines(dir, base string, a Axes, series ...Series) ([]string, error) {
	p, legend, err := linesPlot(a, series)
	if err != nil {
		return nil, errors.New("figures: " + base + ": " + err.Error())
	}
	if err := settle(p, a, legend); err != nil {
		return nil, err
	}
	return save(p, dir, base, a.Note)
}

// linesPlot builds the plot of Lines; legend reports whether it has one.
func linesPlot(a Axes, series []Series) (*plot.Plot, bool, error) {
	p := newPlot(a)
	drawn := 0
	legend := false
	for i, s := range series {
		c := plotutil.Color(i)
		if s.Colour > 0 {
			c = plotutil.Color(s.Colour - 1)
		}
		first := true
		for _, xy := range pieces(s) {
			drawn++
			if s.Points {
				sc, err := plotter.NewScatter(xy)
				if err != nil {
					return nil, false, err
				}
				sc.GlyphStyle.Color = c
				sc.GlyphStyle.Radius = vg.Points(2.5)
				sc.GlyphStyle.Shape = plotutil.Shape(i)
				p.Add(sc)
				if first && s.Name != "" {
					p.Legend.Add(s.Name, sc)
					legend = true
				}
			} else {
				l, err := plotter.NewLine(xy)
				if err != nil {
					return nil, false, err
				}
				l.LineStyle.Color = c
				l.LineStyle.Width = vg.Points(1.5)
				if s.Dashed {
					l.LineStyle.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
				}
				if s.Step {
					l.StepStyle = plotter.PostStep
				}
				p.Add(l)
				if first && s.Name != "" {
					p.Legend.Add(s.Name, l)
					legend = true
				}
			}
			first = false
		}
	}
	if drawn == 0 {
		return nil, false, errors.New("no finite points to draw")
	}
	return p, legend, nil
}

// settle fixes the data ranges (so that bands and limit lines span them,
// limits included in the Y range) and decorates p.
func settle(p *plot.Plot, a Axes, legend bool) error {
	if a.XMax > a.XMin {
		p.X.Min, p.X.Max = a.XMin, a.XMax
	}
	if a.YMax > a.YMin {
		p.Y.Min, p.Y.Max = a.YMin, a.YMax
	}
	for _, lim := range a.Limits {
		if !(a.YMax > a.YMin) {
			p.Y.Min, p.Y.Max = math.Min(p.Y.Min, lim.Y), math.Max(p.Y.Max, 1.05*lim.Y)
		}
	}
	return decorate(p, a, legend)
}

// Grid is a regular grid of values: Z[r][c] at X[c], Y[r]. Feasible[r][c]
// false marks a cell with no valid value (its Z is ignored).
type Grid struct {
	X, Y     []float64
	Z        [][]float64
	Feasible [][]bool
}

// gridXYZ adapts a filled grid to plotter.GridXYZ.
type gridXYZ struct {
	x, y []float64
	z    [][]float64
}

func (g gridXYZ) Dims() (c, r int)   { return len(g.x), len(g.y) }
func (g gridXYZ) Z(c, r int) float64 { return g.z[r][c] }
func (g gridXYZ) X(c int) float64    { return g.x[c] }
func (g gridXYZ) Y(r int) float64    { return g.y[r] }

// filled returns a copy of z in which infeasible cells take the mean of
// their feasible neighbours, repeatedly, so that the contour routine (which
// does not handle NaN) sees a finite field that agrees with the feasible
// cells. The envelope is drawn separately, so lines a little way into the
// infeasible region are hidden under its fill.
func filled(g Grid) ([][]float64, bool) {
	rows, cols := len(g.Y), len(g.X)
	z := make([][]float64, rows)
	ok := make([][]bool, rows)
	found := false
	for r := range rows {
		z[r] = make([]float64, cols)
		ok[r] = make([]bool, cols)
		for c := range cols {
			if g.Feasible[r][c] && !math.IsNaN(g.Z[r][c]) && !math.IsInf(g.Z[r][c], 0) {
				z[r][c], ok[r][c], found = g.Z[r][c], true, true
			}
		}
	}
	if !found {
		return z, false
	}
	for {
		changed := false
		next := make([][]bool, rows)
		for r := range rows {
			next[r] = append([]bool(nil), ok[r]...)
			for c := range cols {
				if ok[r][c] {
					continue
				}
				sum, n := 0.0, 0
				for _, d := range [][2]int{{-1, 0}, {1, 0}, {0, -1}, {0, 1}} {
					rr, cc := r+d[0], c+d[1]
					if rr >= 0 && rr < rows && cc >= 0 && cc < cols && ok[rr][cc] {
						sum += z[rr][cc]
						n++
					}
				}
				if n > 0 {
					z[r][c] = sum / float64(n)
					next[r][c] = true
					changed = true
				}
			}
		}
		ok = next
		if !changed {
			return z, true
		}
	}
}

// MapOptions are the extras of a heat map.
type MapOptions struct {
	// Levels are the contour levels; none means no contours.
	Levels []float64
	// ZLabel names the colour scale (with its unit).
	ZLabel string
	// Envelope is drawn as a line: the feasibility boundary.
	Envelope *Series
	// Points are marked on the map (for example the day's operating
	// points).
	Points []Series
	// ZMin and ZMax fix the colour range when ZMax > ZMin.
	ZMin, ZMax float64
	// Reverse runs the colour scale from dark at high values to light at
	// low ones (for a quantity where low is good, such as specific fuel
	// consumption).
	Reverse bool
}

// colourBarWidth is the strip right of a heat map that holds its colour bar.
const colourBarWidth = 2.3 * vg.Centimeter

// HeatMap draws a heat map of g on a sequential colour scale with a colour
// bar and labelled contours; infeasible cells are grey. It saves base.svg
// and base.png in dir.
func HeatMap(dir, base string, a Axes, g Grid, o MapOptions) ([]string, error) {
	if len(g.X) < 2 || len(g.Y) < 2 || len(g.Z) != len(g.Y) || len(g.Feasible) != len(g.Y) {
		return nil, errors.New("figures: " + base + ": grid needs at least 2×2 cells and matching rows")
	}
	z, found := filled(g)
	if !found {
		return nil, errors.New("figures: " + base + ": no feasible cell")
	}
	lo, hi := o.ZMin, o.ZMax
	if !(hi > lo) {
		lo, hi = math.Inf(1), math.Inf(-1)
		for r := range g.Y {
			for c := range g.X {
				if g.Feasible[r][c] {
					lo, hi = math.Min(lo, g.Z[r][c]), math.Max(hi, g.Z[r][c])
				}
			}
		}
		if !(hi > lo) {
			hi = lo + 1
		}
	}
	// The heat map shows infeasible cells as NaN (grey).
	hz := make([][]float64, len(g.Y))
	for r := range g.Y {
		hz[r] = make([]float64, len(g.X))
		for c := range g.X {
			hz[r][c] = math.NaN()
			if g.Feasible[r][c] {
				hz[r][c] = math.Max(lo, math.Min(hi, g.Z[r][c]))
			}
		}
	}
	cm := sequential(o.Reverse)
	cm.SetMin(lo)
	cm.SetMax(hi)
	pal := cm.Palette(64)
	p := newPlot(a)
	h := plotter.NewHeatMap(gridXYZ{g.X, g.Y, hz}, pal)
	h.Min, h.Max = lo, hi
	h.NaN = color.Gray{Y: 215}
	h.Rasterized = true
	p.Add(h)
	legend := false
	if len(o.Levels) > 0 {
		ct := plotter.NewContour(gridXYZ{g.X, g.Y, z}, o.Levels, nil)
		ct.LineStyles = []draw.LineStyle{{Color: color.Gray{Y: 40}, Width: vg.Points(0.7)}}
		p.Add(ct)
		// Cover the contours' run into the infeasible cells: a grey mask
		// over those cells, transparent over the feasible ones.
		mz := make([][]float64, len(g.Y))
		for r := range g.Y {
			mz[r] = make([]float64, len(g.X))
			for c := range g.X {
				mz[r][c] = 0.5
				if g.Feasible[r][c] {
					mz[r][c] = math.NaN()
				}
			}
		}
		mask := plotter.NewHeatMap(gridXYZ{g.X, g.Y, mz}, greyPalette{})
		mask.Min, mask.Max = 0, 1
		mask.NaN = color.Transparent
		mask.Rasterized = true
		p.Add(mask)
		// Label the levels where they do not collide.
		if labels := contourLabels(g, z, o.Levels); labels != nil {
			p.Add(labels)
		}
	}
	if o.Envelope != nil {
		for k, xy := range pieces(*o.Envelope) {
			l, err := plotter.NewLine(xy)
			if err != nil {
				return nil, err
			}
			l.LineStyle.Width = vg.Points(2)
			l.LineStyle.Color = color.Black
			p.Add(l)
			if k == 0 && o.Envelope.Name != "" {
				p.Legend.Add(o.Envelope.Name, l)
				legend = true
			}
		}
	}
	for i, s := range o.Points {
		for k, xy := range pieces(s) {
			sc, err := plotter.NewScatter(xy)
			if err != nil {
				return nil, err
			}
			sc.GlyphStyle.Shape = plotutil.Shape(i + 1)
			sc.GlyphStyle.Radius = vg.Points(3.5)
			sc.GlyphStyle.Color = color.RGBA{R: 0, G: 90, B: 200, A: 255}
			p.Add(sc)
			if k == 0 && s.Name != "" {
				p.Legend.Add(s.Name, sc)
				legend = true
			}
		}
	}
	p.X.Min, p.X.Max = g.X[0], g.X[len(g.X)-1]
	p.Y.Min, p.Y.Max = g.Y[0], g.Y[len(g.Y)-1]
	if err := decorate(p, a, legend); err != nil {
		return nil, err
	}
	bar := plot.New()
	bar.HideX()
	bar.Y.Tick.Marker = niceTicks{}
	bar.Y.Label.Text = o.ZLabel
	bar.Add(&plotter.ColorBar{ColorMap: cm, Vertical: true})
	note := a.Note
	if note == "" {
		note = "grey: infeasible"
	} else {
		note = "grey: infeasible. " + note
	}
	return saveWith(func(c draw.Canvas) {
		p.Draw(draw.Crop(c, 0, -colourBarWidth, 0, 0))
		right := draw.Crop(c, c.Max.X-c.Min.X-colourBarWidth+vg.Points(8), 0, 0, 0)
		// Leave the title's height free above the bar.
		right.Max.Y -= p.Title.TextStyle.Rectangle(p.Title.Text).Size().Y + p.Title.Padding
		bar.Draw(right)
	}, dir, base, note)
}

// sequential is the colour scale of heat maps: one hue family from light
// to mid-dark, so that the order of values reads at a glance (and in grey)
// and black contours and labels stay readable everywhere. High values are
// dark unless reverse.
func sequential(reverse bool) palette.ColorMap {
	cm, err := moreland.NewLuminance([]color.Color{
		color.NRGBA{R: 60, G: 130, B: 185, A: 255},
		color.NRGBA{R: 90, G: 180, B: 190, A: 255},
		color.NRGBA{R: 170, G: 220, B: 180, A: 255},
		color.NRGBA{R: 255, G: 255, B: 210, A: 255},
	})
	if err != nil {
		panic("figures: colour scale: " + err.Error()) // fixed controls: a bug if it fails
	}
	if reverse {
		return cm
	}
	return reversed{cm}
}

// reversed runs a colour map backwards.
type reversed struct{ palette.ColorMap }

// At implements palette.ColorMap.
func (r reversed) At(v float64) (color.Color, error) {
	return r.ColorMap.At(r.Max() - (v - r.Min()))
}

// Palette implements palette.ColorMap.
func (r reversed) Palette(n int) palette.Palette {
	c := make([]color.Color, n)
	for i := range c {
		v := r.Min() + (r.Max()-r.Min())*float64(i)/float64(max(n-1, 1))
		c[i], _ = r.At(v)
	}
	return plainPalette(c)
}

type plainPalette []color.Color

func (p plainPalette) Colors() []color.Color { return p }

// greyPalette is the one colour of the infeasibility mask.
type greyPalette struct{}

func (greyPalette) Colors() []color.Color { return []color.Color{color.Gray{Y: 215}} }

// contourLabels places the value of each level once, at a grid point inside
// the feasible region close to the level, choosing among the candidates the
// one farthest from the labels already placed so that labels do not
// collide.
func contourLabels(g Grid, z [][]float64, levels []float64) *plotter.Labels {
	var xys plotter.XYs
	var text []string
	nx, ny := float64(len(g.X)), float64(len(g.Y))
	type cand struct{ r, c int }
	for _, lv := range levels {
		var cs []cand
		tol := 0.01*math.Abs(lv) + 1e-9
		for r := 2; r < len(g.Y)-2; r++ {
			for c := 2; c < len(g.X)-2; c++ {
				if g.Feasible[r][c] && math.Abs(z[r][c]-lv) <= tol {
					cs = append(cs, cand{r, c})
				}
			}
		}
		best, bestD := -1, -1.0
		for i, cd := range cs {
			d := math.Inf(1)
			for _, q := range xys {
				// Distance in grid fractions, X weighted for the label's width.
				dx := (float64(cd.c) - colOf(g, q.X)) / nx * 2.5
				dy := (float64(cd.r) - rowOf(g, q.Y)) / ny
				d = math.Min(d, math.Hypot(dx, dy))
			}
			if d > bestD {
				best, bestD = i, d
			}
		}
		if best < 0 {
			continue
		}
		xys = append(xys, plotter.XY{X: g.X[cs[best].c], Y: g.Y[cs[best].r]})
		text = append(text, strconv.FormatFloat(lv, 'g', 4, 64))
	}
	if len(xys) == 0 {
		return nil
	}
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: text})
	if err != nil {
		return nil
	}
	for i := range l.TextStyle {
		l.TextStyle[i].Font.Size = vg.Points(8)
		l.TextStyle[i].XAlign = draw.XCenter
		l.TextStyle[i].YAlign = draw.YCenter
	}
	return l
}

func colOf(g Grid, x float64) float64 {
	for c := range g.X {
		if g.X[c] == x {
			return float64(c)
		}
	}
	return 0
}

func rowOf(g Grid, y float64) float64 {
	for r := range g.Y {
		if g.Y[r] == y {
			return float64(r)
		}
	}
	return 0
}

// Bars draws a bar chart of values with one label per bar and saves
// base.svg and base.png in dir. Negative values draw downwards.
func Bars(dir, base string, a Axes, labels []string, values []float64) ([]string, error) {
	p, _, err := barsPlot(a, labels, values)
	if err != nil {
		return nil, errors.New("figures: " + base + ": " + err.Error())
	}
	return save(p, dir, base, a.Note)
}

func barsPlot(a Axes, labels []string, values []float64) (*plot.Plot, *plotter.BarChart, error) {
	if len(labels) != len(values) || len(values) == 0 {
		return nil, nil, errors.New("need one label per value")
	}
	v := make(plotter.Values, len(values))
	for i, x := range values {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			x = 0
		}
		v[i] = x
	}
	p := newPlot(a)
	b, err := plotter.NewBarChart(v, vg.Points(18))
	if err != nil {
		return nil, nil, err
	}
	b.Color = plotutil.Color(0)
	b.LineStyle.Width = vg.Length(0)
	p.Add(b)
	p.NominalX(labels...)
	p.X.Tick.Label.Rotation = math.Pi / 6
	p.X.Tick.Label.XAlign = draw.XRight
	p.X.Tick.Label.YAlign = draw.YCenter
	lo, hi := 0.0, 0.0
	for _, x := range v {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	if hi > lo {
		pad := 0.1 * (hi - lo)
		p.Y.Min, p.Y.Max = lo, hi+pad
		if lo < 0 {
			p.Y.Min = lo - pad
		}
	}
	if a.YMax > a.YMin {
		p.Y.Min, p.Y.Max = a.YMin, a.YMax
	}
	return p, b, nil
}

// BarPanel is one bar chart of a figure of panels side by side.
type BarPanel struct {
	Axes   Axes
	Labels []string
	Values []float64
	// Share is the panel's share of the figure's width (0 means equal).
	Share float64
}

// BarPanels draws bar charts side by side under one title and saves
// base.svg and base.png in dir.
func BarPanels(dir, base, title, note string, panels ...BarPanel) ([]string, error) {
	plots := make([]*plot.Plot, len(panels))
	bars := make([]*plotter.BarChart, len(panels))
	total := 0.0
	title = twoLines(title)
	for k, pn := range panels {
		a := pn.Axes
		a.Title = ""
		p, b, err := barsPlot(a, pn.Labels, pn.Values)
		if err != nil {
			return nil, fmt.Errorf("figures: %s panel %d: %w", base, k+1, err)
		}
		bars[k] = b
		p.Title.Text = pn.Axes.Title
		p.Title.TextStyle.Font.Size = vg.Points(9)
		plots[k] = p
		if pn.Share <= 0 {
			panels[k].Share = 1
		}
		total += panels[k].Share
	}
	head := plot.New()
	head.Title.TextStyle.Font.Size = vg.Points(11)
	return saveWith(func(c draw.Canvas) {
		th := head.Title.TextStyle.Rectangle(title).Size().Y + vg.Points(6)
		c.FillText(head.Title.TextStyle, vg.Point{X: c.Center().X, Y: c.Max.Y}, title)
		body := draw.Crop(c, 0, 0, 0, -th)
		w := body.Max.X - body.Min.X
		x := body.Min.X
		for k, p := range plots {
			pw := vg.Length(panels[k].Share / total * float64(w))
			sub := body
			sub.Min.X, sub.Max.X = x, x+pw-vg.Points(6)
			// Bars fill about 60 % of their slot.
			bars[k].Width = vg.Length(0.6 * float64(pw-1.5*vg.Centimeter) / float64(len(panels[k].Values)))
			p.Draw(sub)
			x += pw
		}
	}, dir, base, note)
}

// Panel is one panel of a figure of stacked panels: its axes (the title is
// ignored; the figure has one) and its series.
type Panel struct {
	Axes   Axes
	Series []Series
}

// Panels draws panels stacked top to bottom under one title, sharing the X
// axis (labelled on the bottom panel only), and saves base.svg and base.png
// in dir. The figure is taller than the others: 6 cm per panel.
func Panels(dir, base, title, note string, panels ...Panel) ([]string, error) {
	if len(panels) == 0 {
		return nil, errors.New("figures: " + base + ": no panel")
	}
	plots := make([]*plot.Plot, len(panels))
	legends := make([]bool, len(panels))
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for k, pn := range panels {
		a := pn.Axes
		a.Title = ""
		p, legend, err := linesPlot(a, pn.Series)
		if err != nil {
			return nil, fmt.Errorf("figures: %s panel %d: %w", base, k+1, err)
		}
		if a.XMax > a.XMin {
			p.X.Min, p.X.Max = a.XMin, a.XMax
		}
		xmin, xmax = math.Min(xmin, p.X.Min), math.Max(xmax, p.X.Max)
		plots[k], legends[k] = p, legend
	}
	for k, p := range plots {
		a := panels[k].Axes
		a.XMin, a.XMax = xmin, xmax
		if err := settle(p, a, legends[k]); err != nil {
			return nil, err
		}
		if k < len(plots)-1 {
			p.X.Label.Text = ""
			p.X.Tick.Marker = unlabelled{niceTicks{}}
		}
		if len(a.YTicks) > 0 {
			p.Y.Tick.Marker = named(a.YTicks)
		}
	}
	h := Height
	Height = vg.Length(len(panels))*6*vg.Centimeter + vg.Centimeter
	defer func() { Height = h }()
	head := plot.New()
	title = twoLines(title)
	head.Title.Text = title
	head.Title.TextStyle.Font.Size = vg.Points(11)
	return saveWith(func(c draw.Canvas) {
		th := head.Title.TextStyle.Rectangle(title).Size().Y + vg.Points(6)
		c.FillText(head.Title.TextStyle, vg.Point{X: c.Center().X, Y: c.Max.Y}, title)
		body := draw.Crop(c, 0, 0, 0, -th)
		tiles := draw.Tiles{Rows: len(plots), Cols: 1, PadY: vg.Points(4), PadTop: vg.Points(2)}
		// Align the panels' data areas: the widest Y axis sets the left edge.
		canvases := plot.Align(columnOf(plots), tiles, body)
		for k, p := range plots {
			p.Draw(canvases[k][0])
		}
	}, dir, base, note)
}

func columnOf(ps []*plot.Plot) [][]*plot.Plot {
	out := make([][]*plot.Plot, len(ps))
	for i, p := range ps {
		out[i] = []*plot.Plot{p}
	}
	return out
}
