package numeric

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
)

func TestBrentPublished(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		want float64
		tol  float64
	}{
		// Source: Computer Methods for Mathematical Computations (1977),
		// section 7.2: the zeroin example x³ − 2x − 5 = 0 on [2, 3] (the
		// classic test equation of root finders), root 2.094551481542327
		// (value from memory: 2.0945514815423265).
		{"cubic", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265, 1e-14},
		// Hand calculation: cos x = x, the fixed point of cos,
		// 0.7390851332151607 (from memory; checked below by the residual).
		{"cos", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607, 1e-14},
		// Hand calculation: x² − 2 on [0, 2] has the root √2.
		{"sqrt2", func(x float64) float64 { return x*x - 2 }, 0, 2, math.Sqrt2, 1e-14},
		// Hand calculation: a root at an end point is returned exactly.
		{"endpoint", func(x float64) float64 { return x - 1 }, 1, 5, 1, 0},
		// Hand calculation: a flat-then-steep function (x−1)^9 needs the
		// bisection fallback. Its sign changes exactly at 1 (every float64
		// x < 1 gives a negative value, none underflows to zero before
		// |x − 1| < 1e-35), so the root is 1 to Brent's own tolerance,
		// 2·eps·|x| = 4.4e-16.
		{"steep", func(x float64) float64 { return math.Pow(x-1, 9) }, 0, 3, 1, 5e-16},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			got, err := Brent(c.f, c.a, c.b, 0, 200)
			if err != nil {
				t.Fatalf("Brent(%s) error %v", c.name, err)
			}
			if !testutil.Close(got, c.want, c.tol, c.tol) {
				t.Errorf("Brent(%s) = %.17g, want %.17g", c.name, got, c.want)
			}
		})
	}
}

func TestBrentErrors(t *testing.T) {
	t.Parallel()
	f := func(x float64) float64 { return x*x + 1 }
	if _, err := Brent(f, -1, 1, 0, 0); !errors.Is(err, ErrNoBracket) {
		t.Errorf("no bracket: err = %v", err)
	}
	if _, err := Brent(f, math.NaN(), 1, 0, 0); !errors.Is(err, ErrNaN) {
		t.Errorf("NaN a: err = %v", err)
	}
	g := func(x float64) float64 { return math.NaN() }
	if _, err := Brent(g, 0, 1, 0, 0); !errors.Is(err, ErrNaN) {
		t.Errorf("NaN f: err = %v", err)
	}
	h := func(x float64) float64 { return math.Cos(x) - x }
	if _, err := Brent(h, 0, 1, 0, 2); !errors.Is(err, ErrNoConvergence) {
		t.Errorf("2 iterations: err = %v", err)
	}
}

func TestMinimizePublished(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		want float64
	}{
		// Source: Computer Methods for Mathematical Computations (1977),
		// section 8.2: the fmin example minimises x³ − 2x − 5 on [0, 1]; the
		// minimiser is √(2/3) = 0.81650 (from memory; exact by calculus:
		// f′ = 3x² − 2).
		{"cubic", func(x float64) float64 { return x*x*x - 2*x - 5 }, 0, 1, math.Sqrt(2.0 / 3)},
		// Hand calculation: (x − 2)² + 1 on [−10, 10].
		{"parabola", func(x float64) float64 { return (x-2)*(x-2) + 1 }, -10, 10, 2},
		// Hand calculation: a monotone function is minimised at its end.
		{"end", func(x float64) float64 { return x }, 3, 1, 1},
		// Hand calculation: |x − 0.3| (not smooth) on [0, 1].
		{"abs", func(x float64) float64 { return math.Abs(x - 0.3) }, 0, 1, 0.3},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			got, fx := Minimize(c.f, c.a, c.b, 1e-10)
			if !testutil.Close(got, c.want, 0, 1e-7) {
				t.Errorf("Minimize(%s) = %.12g, want %.12g", c.name, got, c.want)
			}
			if fx != c.f(got) {
				t.Errorf("Minimize(%s) fx = %g, want f(x) = %g", c.name, fx, c.f(got))
			}
		})
	}
}

func TestGrid2(t *testing.T) {
	t.Parallel()
	// From memory: the worked example of bilinear interpolation commonly
	// used in numerical-methods teaching: f(20,14)=91, f(21,14)=162,
	// f(20,15)=210, f(21,15)=95 gives f(20.2,14.5)=146.1.
	// Hand calculation confirms: at y=14: 91+0.2·71 = 105.2; at y=15:
	// 210−0.2·115 = 187; midway: 146.1.
	g, err := NewGrid2([]float64{20, 21}, []float64{14, 15}, [][]float64{{91, 210}, {162, 95}})
	if err != nil {
		t.Fatal(err)
	}
	got, err := g.At(20.2, 14.5)
	if err != nil || !testutil.Close(got, 146.1, 1e-12, 0) {
		t.Errorf("At(20.2, 14.5) = %v, %v, want 146.1", got, err)
	}
	// Hand calculation: bilinear interpolation reproduces a + bx + cy + dxy
	// exactly on any rectilinear grid.
	f := func(x, y float64) float64 { return 1.5 - 2*x + 0.25*y + 0.125*x*y }
	xs := []float64{-1, 0, 0.5, 3}
	ys := []float64{2, 2.5, 7}
	z := make([][]float64, len(xs))
	for i, x := range xs {
		for _, y := range ys {
			z[i] = append(z[i], f(x, y))
		}
	}
	h, err := NewGrid2(xs, ys, z)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range [][2]float64{{-1, 2}, {3, 7}, {0.2, 5}, {2.9, 2.1}, {0.5, 2.5}, {-0.3, 6.9}} {
		got, err := h.At(p[0], p[1])
		if err != nil || !testutil.Close(got, f(p[0], p[1]), 1e-13, 1e-13) {
			t.Errorf("At(%v, %v) = %v, %v, want %v", p[0], p[1], got, err, f(p[0], p[1]))
		}
	}
	for _, p := range [][2]float64{{-1.01, 2}, {0, 7.01}, {4, 3}, {0, 1}} {
		if _, err := h.At(p[0], p[1]); !errors.Is(err, ErrOutOfRange) {
			t.Errorf("At(%v, %v) err = %v, want ErrOutOfRange", p[0], p[1], err)
		}
	}
	if _, err := h.At(math.NaN(), 3); !errors.Is(err, ErrNaN) {
		t.Errorf("At(NaN) err = %v", err)
	}
	var zero Grid2
	if _, err := zero.At(0, 0); !errors.Is(err, ErrOutOfRange) {
		t.Errorf("zero grid err = %v", err)
	}
}

func TestNewGrid2Errors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name   string
		xs, ys []float64
		z      [][]float64
	}{
		{"short", []float64{1}, []float64{1, 2}, [][]float64{{1, 2}}},
		{"order", []float64{2, 1}, []float64{1, 2}, [][]float64{{1, 2}, {1, 2}}},
		{"rows", []float64{1, 2}, []float64{1, 2}, [][]float64{{1, 2}}},
		{"cols", []float64{1, 2}, []float64{1, 2}, [][]float64{{1, 2}, {1}}},
		{"nan", []float64{1, 2}, []float64{1, 2}, [][]float64{{1, 2}, {1, math.NaN()}}},
		{"infaxis", []float64{1, math.Inf(1)}, []float64{1, 2}, [][]float64{{1, 2}, {1, 2}}},
	}
	for _, c := range cases {
		if _, err := NewGrid2(c.xs, c.ys, c.z); err == nil {
			t.Errorf("NewGrid2(%s) gave no error", c.name)
		}
	}
}

func TestAllocs(t *testing.T) {
	f := func(x float64) float64 { return x*x*x - 2*x - 5 }
	g, _ := NewGrid2([]float64{0, 1, 2}, []float64{0, 1}, [][]float64{{0, 1}, {2, 3}, {4, 5}})
	n := testing.AllocsPerRun(100, func() {
		_, _ = Brent(f, 2, 3, 0, 100)
		_, _ = Minimize(f, 0, 1, 0)
		_, _ = g.At(1.5, 0.5)
	})
	if n != 0 {
		t.Errorf("allocations = %v, want 0", n)
	}
}

func FuzzBrent(f *testing.F) {
	f.Add(2.0, 3.0, 1.0, -2.0, -5.0)
	f.Add(0.0, 0.0, 0.0, 0.0, 0.0)
	f.Add(-1e300, 1e300, 1.0, 0.0, 1.0)
	f.Fuzz(func(t *testing.T, a, b, c2, c1, c0 float64) {
		fn := func(x float64) float64 { return ((x+c2)*x+c1)*x + c0 }
		x, err := Brent(fn, a, b, 0, 100)
		if err == nil && math.IsNaN(x) {
			t.Fatalf("Brent returned NaN without error")
		}
		if err == nil {
			// The root lies in the bracket, and f changes sign (or
			// vanishes) within the documented 2·eps·|x| of it.
			if x < math.Min(a, b) || x > math.Max(a, b) {
				t.Fatalf("Brent left [%g, %g]: %g", a, b, x)
			}
			// Near the root f is rounding noise: accept |f| within 1e-12 of
			// the size of its terms.
			h := 4*0x1p-52*math.Abs(x) + 1e-300
			terms := math.Abs(x*x*x) + math.Abs(c2*x*x) + math.Abs(c1*x) + math.Abs(c0)
			if lo, hi := fn(x-h), fn(x+h); fn(x) != 0 && !bad(lo) && !bad(hi) && !bad(terms) && lo*hi > 0 && math.Abs(fn(x)) > 1e-12*terms {
				t.Fatalf("Brent(%g, %g) = %g: no sign change near it (f = %g, %g, %g)", a, b, x, lo, fn(x), hi)
			}
		}
		m, _ := Minimize(fn, a, b, 0)
		if !bad(a) && !bad(b) && (m < math.Min(a, b) || m > math.Max(a, b)) {
			t.Fatalf("Minimize left [%g, %g]: %g", a, b, m)
		}
	})
}

func FuzzGrid2(f *testing.F) {
	f.Add(0.0, 1.0, 0.0, 1.0, 1.0, 2.0, 3.0, 4.0, 0.5, 0.5)
	f.Fuzz(func(t *testing.T, x0, x1, y0, y1, z00, z01, z10, z11, x, y float64) {
		g, err := NewGrid2([]float64{x0, x1}, []float64{y0, y1}, [][]float64{{z00, z01}, {z10, z11}})
		if err != nil {
			return
		}
		v, err := g.At(x, y)
		if err == nil && math.IsNaN(v) {
			t.Fatalf("At returned NaN without error")
		}
		// A bilinear interpolate lies within its cell's corner values, and
		// the corners are reproduced.
		if err == nil {
			lo := math.Min(math.Min(z00, z01), math.Min(z10, z11))
			hi := math.Max(math.Max(z00, z01), math.Max(z10, z11))
			if slack := 1e-9 * math.Max(math.Abs(lo), math.Abs(hi)); !bad(slack) && (v < lo-slack || v > hi+slack) {
				t.Fatalf("At(%g, %g) = %g outside the corners [%g, %g]", x, y, v, lo, hi)
			}
		}
		if c, err := g.At(x0, y0); err == nil && c != z00 && !bad(z00) {
			t.Fatalf("At(x0, y0) = %g, corner %g", c, z00)
		}
	})
}

func BenchmarkBrent(b *testing.B) {
	f := func(x float64) float64 { return x*x*x - 2*x - 5 }
	b.ReportAllocs()
	for b.Loop() {
		_, _ = Brent(f, 2, 3, 0, 100)
	}
}

func BenchmarkGrid2At(b *testing.B) {
	g, _ := NewGrid2([]float64{0, 1, 2, 3}, []float64{0, 1, 2}, [][]float64{{0, 1, 2}, {2, 3, 4}, {4, 5, 6}, {1, 1, 1}})
	b.ReportAllocs()
	for b.Loop() {
		_, _ = g.At(1.5, 0.5)
	}
}
