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
	"math"
	"os"
	"path/filepath"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
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
}

// Axes are a figure's title and axis labels (with their units).
type Axes struct {
	Title, X, Y string
	// YMin and YMax fix the Y range when YMax > YMin.
	YMin, YMax float64
	// LegendBottom and LegendLeft move the legend from the top right.
	LegendBottom, LegendLeft bool
}

// save writes p as base.svg and base.png in dir and returns both paths.
func save(p *plot.Plot, dir, base string) ([]string, error) {
	svg := filepath.Join(dir, base+".svg")
	if err := p.Save(Width, Height, svg); err != nil {
		return nil, fmt.Errorf("figures: saving %s: %w", svg, err)
	}
	// The PNG at 150 dpi, sharp enough for a README.
	png := filepath.Join(dir, base+".png")
	c := vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(Width, Height), vgimg.UseDPI(150))}
	p.Draw(draw.New(c))
	f, err := os.Create(png)
	if err != nil {
		return nil, err
	}
	if _, err := c.WriteTo(f); err != nil {
		f.Close()
		return nil, fmt.Errorf("figures: saving %s: %w", png, err)
	}
	if err := f.Close(); err != nil {
		return nil, err
	}
	return []string{svg, png}, nil
}

func newPlot(a Axes) *plot.Plot {
	p := plot.New()
	p.Title.Text = a.Title
	p.X.Label.Text = a.X
	p.Y.Label.Text = a.Y
	p.Add(plotter.NewGrid())
	p.Legend.Top = !a.LegendBottom
	p.Legend.Left = a.LegendLeft
	if a.YMax > a.YMin {
		p.Y.Min, p.Y.Max = a.YMin, a.YMax
	}
	return p
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
	p := newPlot(a)
	drawn := 0
	for i, s := range series {
		c := plotutil.Color(i)
		first := true
		for _, xy := range pieces(s) {
			drawn++
			if s.Points {
				sc, err := plotter.NewScatter(xy)
				if err != nil {
					return nil, err
				}
				sc.GlyphStyle.Color = c
				sc.GlyphStyle.Radius = vg.Points(2.5)
				sc.GlyphStyle.Shape = plotutil.Shape(i)
				p.Add(sc)
				if first && s.Name != "" {
					p.Legend.Add(s.Name, sc)
				}
			} else {
				l, err := plotter.NewLine(xy)
				if err != nil {
					return nil, err
				}
				l.LineStyle.Color = c
				l.LineStyle.Width = vg.Points(1.5)
				if s.Dashed {
					l.LineStyle.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
				}
				p.Add(l)
				if first && s.Name != "" {
					p.Legend.Add(s.Name, l)
				}
			}
			first = false
		}
	}
	if drawn == 0 {
		return nil, errors.New("figures: " + base + ": no finite points to draw")
	}
	return save(p, dir, base)
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
}

// HeatMap draws a heat map of g with contours; infeasible cells are filled
// grey. It saves base.svg and base.png in dir.
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
	cm := moreland.SmoothBlueRed()
	cm.SetMin(lo)
	cm.SetMax(hi)
	pal := cm.Palette(64)
	p := newPlot(a)
	h := plotter.NewHeatMap(gridXYZ{g.X, g.Y, hz}, pal)
	h.Min, h.Max = lo, hi
	h.NaN = color.Gray{Y: 200}
	h.Rasterized = true
	p.Add(h)
	if len(o.Levels) > 0 {
		ct := plotter.NewContour(gridXYZ{g.X, g.Y, z}, o.Levels, nil)
		ct.LineStyles = []draw.LineStyle{{Color: color.Black, Width: vg.Points(0.8)}}
		p.Add(ct)
		// Label each level once, at a point of the filled grid near it.
		labels := contourLabels(g, z, o.Levels)
		if labels != nil {
			p.Add(labels)
		}
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
			sc.GlyphStyle.Color = color.Black
			p.Add(sc)
			if k == 0 && s.Name != "" {
				p.Legend.Add(s.Name, sc)
			}
		}
	}
	p.X.Min, p.X.Max = g.X[0], g.X[len(g.X)-1]
	p.Y.Min, p.Y.Max = g.Y[0], g.Y[len(g.Y)-1]
	if o.ZLabel != "" {
		p.X.Label.Text += fmt.Sprintf("\ncolour: %s from %.3g (blue) to %.3g (red); grey: infeasible", o.ZLabel, lo, hi)
	}
	return save(p, dir, base)
}

// greyPalette is the one colour of the infeasibility mask.
type greyPalette struct{}

func (greyPalette) Colors() []color.Color { return []color.Color{color.Gray{Y: 200}} }

// contourLabels places the value of each level at one grid point close to
// it, inside the feasible region.
func contourLabels(g Grid, z [][]float64, levels []float64) *plotter.Labels {
	var xys plotter.XYs
	var text []string
	for _, lv := range levels {
		best, br, bc := math.Inf(1), -1, -1
		for r := 1; r < len(g.Y)-1; r++ {
			for c := 1; c < len(g.X)-1; c++ {
				if !g.Feasible[r][c] {
					continue
				}
				// Prefer points in the middle of the X span.
				d := math.Abs(z[r][c]-lv) + 1e-3*math.Abs(float64(c)-float64(len(g.X))/2)
				if d < best {
					best, br, bc = d, r, c
				}
			}
		}
		if br < 0 || best > 0.02*math.Abs(lv)+1e-9 {
			continue
		}
		xys = append(xys, plotter.XY{X: g.X[bc], Y: g.Y[br]})
		text = append(text, fmt.Sprintf("%.3g", lv))
	}
	if len(xys) == 0 {
		return nil
	}
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: text})
	if err != nil {
		return nil
	}
	return l
}

// Bars draws a bar chart of values with one label per bar and saves
// base.svg and base.png in dir.
func Bars(dir, base string, a Axes, labels []string, values []float64) ([]string, error) {
	if len(labels) != len(values) || len(values) == 0 {
		return nil, errors.New("figures: " + base + ": need one label per value")
	}
	v := make(plotter.Values, len(values))
	for i, x := range values {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			x = 0
		}
		v[i] = x
	}
	p := newPlot(a)
	b, err := plotter.NewBarChart(v, vg.Points(22))
	if err != nil {
		return nil, err
	}
	b.Color = plotutil.Color(0)
	b.LineStyle.Width = vg.Length(0)
	p.Add(b)
	p.NominalX(labels...)
	p.X.Tick.Label.Rotation = math.Pi / 6
	p.X.Tick.Label.XAlign = draw.XRight
	p.X.Tick.Label.YAlign = draw.YCenter
	p.Y.Min = 0
	top := 0.0
	for _, x := range v {
		top = math.Max(top, x)
	}
	if top > 0 {
		p.Y.Max = 1.1 * top
	}
	return save(p, dir, base)
}
