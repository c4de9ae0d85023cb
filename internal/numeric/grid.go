package numeric

import (
	"fmt"
	"math"
	"sort"
)

// Grid2 is a table of values on a rectilinear grid, interpolated
// bilinearly. The zero Grid2 has no points and every At is ErrOutOfRange.
// A Grid2 is immutable once built.
type Grid2 struct {
	xs, ys []float64
	z      []float64 // row-major: z[i*len(ys)+j] = f(xs[i], ys[j])
}

// NewGrid2 returns the grid with axes xs and ys (each strictly increasing,
// at least two points, finite) and values z[i][j] = f(xs[i], ys[j]), so z
// has len(xs) rows of len(ys) finite values. The slices are copied.
func NewGrid2(xs, ys []float64, z [][]float64) (Grid2, error) {
	if err := checkAxis("x", xs); err != nil {
		return Grid2{}, err
	}
	if err := checkAxis("y", ys); err != nil {
		return Grid2{}, err
	}
	if len(z) != len(xs) {
		return Grid2{}, fmt.Errorf("%w: %d rows for %d x values", ErrGrid, len(z), len(xs))
	}
	g := Grid2{
		xs: append([]float64(nil), xs...),
		ys: append([]float64(nil), ys...),
		z:  make([]float64, 0, len(xs)*len(ys)),
	}
	for i, row := range z {
		if len(row) != len(ys) {
			return Grid2{}, fmt.Errorf("%w: row %d has %d values for %d y values", ErrGrid, i, len(row), len(ys))
		}
		for j, v := range row {
			if bad(v) {
				return Grid2{}, fmt.Errorf("%w: z[%d][%d] is %v", ErrNaN, i, j, v)
			}
		}
		g.z = append(g.z, row...)
	}
	return g, nil
}

func checkAxis(name string, a []float64) error {
	if len(a) < 2 {
		return fmt.Errorf("%w: %s axis needs at least 2 points, has %d", ErrGrid, name, len(a))
	}
	for i, v := range a {
		if bad(v) {
			return fmt.Errorf("%w: %s[%d] is %v", ErrNaN, name, i, v)
		}
		if i > 0 && !(v > a[i-1]) {
			return fmt.Errorf("%w: %s axis not strictly increasing at %d", ErrGrid, name, i)
		}
	}
	return nil
}

// X returns a copy of the x axis.
func (g Grid2) X() []float64 { return append([]float64(nil), g.xs...) }

// Y returns a copy of the y axis.
func (g Grid2) Y() []float64 { return append([]float64(nil), g.ys...) }

// Contains reports whether (x, y) lies on the grid, edges included.
func (g Grid2) Contains(x, y float64) bool {
	n, m := len(g.xs), len(g.ys)
	return n >= 2 && m >= 2 && x >= g.xs[0] && x <= g.xs[n-1] && y >= g.ys[0] && y <= g.ys[m-1]
}

// At returns the bilinear interpolate at (x, y). A point outside the axes
// (edges included are inside) is ErrOutOfRange; NaN is ErrNaN. At does not
// allocate.
func (g Grid2) At(x, y float64) (float64, error) {
	if math.IsNaN(x) || math.IsNaN(y) {
		return 0, ErrNaN
	}
	if !g.Contains(x, y) {
		return 0, ErrOutOfRange
	}
	i := cell(g.xs, x)
	j := cell(g.ys, y)
	m := len(g.ys)
	u := (x - g.xs[i]) / (g.xs[i+1] - g.xs[i])
	v := (y - g.ys[j]) / (g.ys[j+1] - g.ys[j])
	z00 := g.z[i*m+j]
	z01 := g.z[i*m+j+1]
	z10 := g.z[(i+1)*m+j]
	z11 := g.z[(i+1)*m+j+1]
	r := (1-u)*((1-v)*z00+v*z01) + u*((1-v)*z10+v*z11)
	if bad(r) { // only on axes or values so large that the arithmetic overflows
		return 0, ErrNaN
	}
	return r, nil
}

// cell returns i with a[i] ≤ x ≤ a[i+1], for a[0] ≤ x ≤ a[len(a)-1].
func cell(a []float64, x float64) int {
	i := sort.SearchFloat64s(a, x) - 1 // a[i] < x ≤ a[i+1]
	if i < 0 {
		i = 0
	}
	if i > len(a)-2 {
		i = len(a) - 2
	}
	return i
}
