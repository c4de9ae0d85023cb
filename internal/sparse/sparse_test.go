package sparse

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"
	"pgregory.net/rapid"
)

// drawSparse draws an n × n matrix with a full diagonal and about a fifth
// of its other entries non-zero, like the solver's torque systems.
func drawSparse(t *rapid.T, n int) []float64 {
	a := make([]float64, n*n)
	for i := range n {
		for j := range n {
			if i == j || rapid.IntRange(0, 9).Draw(t, "sparsity") < 2 {
				a[i*n+j] = rapid.Float64Range(-3, 3).Draw(t, "entry")
			}
		}
	}
	return a
}

func drawVec(t *rapid.T, n int, label string) []float64 {
	b := make([]float64, n)
	for i := range b {
		b[i] = rapid.Float64Range(-10, 10).Draw(t, label)
	}
	return b
}

// rcond returns LAPACK's estimate of the reciprocal condition number
// (1-norm) of the n × n row-major a, 0 when dgetrf finds it singular.
func rcond(a []float64, n int) float64 {
	lu := append([]float64(nil), a...)
	g := blas64.General{Rows: n, Cols: n, Stride: n, Data: lu}
	anorm := lapack64.Lange(lapack.MaxColumnSum, blas64.General{Rows: n, Cols: n, Stride: n, Data: a}, make([]float64, n))
	if !lapack64.Getrf(g, make([]int, n)) {
		return 0
	}
	return lapack64.Gecon(lapack.MaxColumnSum, g, anorm, make([]float64, 4*n), make([]int, n))
}

// backward returns the normwise backward error ‖b − A·x‖∞/(‖A‖∞‖x‖∞ + ‖b‖∞).
func backward(a []float64, n int, x, b []float64) float64 {
	var an, xn, bn, rn float64
	for i := range n {
		r, row := -b[i], 0.0
		for j := range n {
			r += a[i*n+j] * x[j]
			row += math.Abs(a[i*n+j])
		}
		an, xn, bn, rn = math.Max(an, row), math.Max(xn, math.Abs(x[i])), math.Max(bn, math.Abs(b[i])), math.Max(rn, math.Abs(r))
	}
	return rn / (an*xn + bn)
}

// TestLUBackwardStable: Factor and Solve solve random sparse systems with a
// normwise backward error at rounding level, and find the same systems
// singular as LAPACK's dgetrf (through gonum) where neither is near a tie.
// (The pivots may differ from dgetrf's in near-ties: gonum's dgetrf factors
// recursively, in another order of operations.)
//
// Source: Matrix Computations, 4th ed. (2013),
// theorem 3.4.2: Gaussian elimination with partial pivoting is backward
// stable for all but pathological growth.
func TestLUBackwardStable(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 24).Draw(t, "n")
		a := drawSparse(t, n)
		b := drawVec(t, n, "rhs")
		mine := append([]float64(nil), a...)
		piv, nz := make([]int, n), make([]int, n)
		if !Factor(mine, n, piv, nz) {
			if rc := rcond(a, n); rc > 1e-12 {
				t.Fatalf("Factor finds singular a matrix with reciprocal condition %g", rc)
			}
			return
		}
		x := append([]float64(nil), b...)
		Solve(mine, n, piv, x)
		be := backward(a, n, x, b)
		if math.IsNaN(be) || math.IsInf(be, 0) {
			return // overflow on a numerically singular draw
		}
		if be > 1e-13*float64(n) {
			t.Fatalf("backward error %g", be)
		}
	})
}

// TestFactorsMatchDense: the factors kept by rows solve exactly as the
// dense factors they were taken from (the same operations on the non-zero
// entries, so bit for bit), and SubMul is b − A·x.
func TestFactorsMatchDense(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 16).Draw(t, "n")
		a := drawSparse(t, n)
		lu := append([]float64(nil), a...)
		piv, nz := make([]int, n), make([]int, n)
		if !Factor(lu, n, piv, nz) {
			return
		}
		f := NewFactors(n)
		f.From(lu, piv)
		b := drawVec(t, n, "rhs")
		x1, x2 := append([]float64(nil), b...), append([]float64(nil), b...)
		Solve(lu, n, piv, x1)
		f.Solve(x2)
		for i := range x1 {
			if math.Float64bits(x1[i]) != math.Float64bits(x2[i]) {
				t.Fatalf("component %d: by rows %v, dense %v", i, x2[i], x1[i])
			}
		}
		m := NewMatrix(n, n*n)
		m.FromDense(a, n, func(int) int { return 0 }, func(int) int { return n })
		r := append([]float64(nil), b...)
		m.SubMul(x1, r)
		for i := range n {
			want := b[i]
			for j := range n {
				want -= a[i*n+j] * x1[j]
			}
			if math.Abs(r[i]-want) > 1e-12*(1+math.Abs(b[i])) {
				t.Fatalf("SubMul row %d: %v, want %v", i, r[i], want)
			}
		}
	})
}

// TestWoodburyMatchesDirect: the Woodbury solve of a rank-m update equals
// the direct solve of the updated matrix (gonum's LU) to the accuracy the
// conditions of both matrices allow, and reports singular an update that
// makes the matrix singular.
func TestWoodburyMatchesDirect(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(2, 14).Draw(t, "n")
		m := rapid.IntRange(1, min(3, n)).Draw(t, "rank")
		a := drawSparse(t, n)
		if rcond(a, n) < 1e-6 {
			return
		}
		// Distinct rows for U, columns for V.
		rows := rapid.Permutation(seq(n)).Draw(t, "rows")[:m]
		vcol := rapid.Permutation(seq(n)).Draw(t, "cols")[:m]
		delta := drawVec(t, m, "delta")
		b := drawVec(t, n, "rhs")
		// The updated matrix A + U·Δ·Vᵀ.
		ad := append([]float64(nil), a...)
		for u := range m {
			ad[rows[u]*n+vcol[u]] += delta[u]
		}
		lu := append([]float64(nil), a...)
		piv, nz := make([]int, n), make([]int, n)
		if !Factor(lu, n, piv, nz) {
			t.Fatal("a well-conditioned matrix found singular")
		}
		f := NewFactors(n)
		f.From(lu, piv)
		w := make([]float64, n*m)
		for u := range m {
			c := w[u*n : (u+1)*n]
			c[rows[u]] = 1
			f.Solve(c)
		}
		y := append([]float64(nil), b...)
		f.Solve(y)
		x := make([]float64, n)
		ok := Woodbury(w, n, vcol, delta, y, x, make([]float64, m*m), make([]float64, m))
		rc := rcond(ad, n)
		if !ok {
			if rc > 1e-10 {
				t.Fatalf("Woodbury finds singular an update with reciprocal condition %g", rc)
			}
			return
		}
		if rc < 1e-6 {
			return
		}
		var want mat.VecDense
		if err := want.SolveVec(mat.NewDense(n, n, ad), mat.NewVecDense(n, b)); err != nil {
			return
		}
		for i := range n {
			if d := math.Abs(x[i] - want.AtVec(i)); d > 1e-9/rc*(1+math.Abs(want.AtVec(i))) {
				t.Fatalf("component %d: Woodbury %v, direct %v (rcond %g)", i, x[i], want.AtVec(i), rc)
			}
		}
	})
}

func seq(n int) []int {
	s := make([]int, n)
	for i := range s {
		s[i] = i
	}
	return s
}

// TestRefinementConverges: a few refinement steps (r = b − A·x by SubMul,
// the correction from the factors, Correct) take a solution perturbed by
// 1e-6 back to a backward error at rounding level, and the last correction
// is at rounding level of the solution's largest component.
func TestRefinementConverges(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 12).Draw(t, "n")
		a := drawSparse(t, n)
		if rcond(a, n) < 1e-4 {
			return
		}
		lu := append([]float64(nil), a...)
		piv, nz := make([]int, n), make([]int, n)
		if !Factor(lu, n, piv, nz) {
			t.Fatal("a well-conditioned matrix found singular")
		}
		f := NewFactors(n)
		f.From(lu, piv)
		m := NewMatrix(n, n*n)
		m.FromDense(a, n, func(int) int { return 0 }, func(int) int { return n })
		b := drawVec(t, n, "rhs")
		x := append([]float64(nil), b...)
		f.Solve(x)
		for i := range x {
			x[i] *= 1 + 1e-6
		}
		r := make([]float64, n)
		var last, xmax float64
		for range 4 {
			copy(r, b)
			m.SubMul(x, r)
			f.Solve(r)
			last, xmax = 0, 0
			for i := range r {
				last, xmax = math.Max(last, math.Abs(r[i])), math.Max(xmax, math.Abs(x[i]))
			}
			if Correct(x, r) {
				break
			}
		}
		if last > 1e-12*xmax {
			t.Fatalf("last correction %g against max |x| %g", last, xmax)
		}
		if be := backward(a, n, x, b); be > 1e-14*float64(n) {
			t.Fatalf("backward error %g after refinement", be)
		}
	})
}

// TestCorrectNotFinite: a correction that is not finite is not applied.
func TestCorrectNotFinite(t *testing.T) {
	x := []float64{1, 2}
	if !Correct(x, []float64{0.5, math.NaN()}) || x[0] != 1 || x[1] != 2 {
		t.Errorf("Correct applied a NaN correction: %v", x)
	}
	if Correct(x, []float64{0.5, 0}) || x[0] != 1.5 {
		t.Errorf("Correct(0.5) = true or not applied: %v", x)
	}
}

// TestSolveSmall: a 3 × 3 system worked by hand, and a singular one.
func TestSolveSmall(t *testing.T) {
	// Hand calculation: 2x + y = 4, x + 3y + z = 8, y + 4z = 6 has x = 1,
	// y = 2, z = 1.
	k := []float64{2, 1, 0, 1, 3, 1, 0, 1, 4}
	g := []float64{4, 8, 6}
	if !SolveSmall(k, g, 3) {
		t.Fatal("SolveSmall: singular")
	}
	for i, want := range []float64{1, 2, 1} {
		if math.Abs(g[i]-want) > 1e-14 {
			t.Errorf("SolveSmall: z[%d] = %v, want %v", i, g[i], want)
		}
	}
	if SolveSmall([]float64{1, 2, 2, 4}, []float64{1, 2}, 2) {
		t.Error("SolveSmall on a singular matrix: true")
	}
}

func BenchmarkFactorsSolve(b *testing.B) {
	// A chain of two entries a row, as the torque systems are.
	const n = 24
	a := make([]float64, n*n)
	for i := range n {
		a[i*n+i] = 2
		if i > 0 {
			a[i*n+i-1] = -1
		}
	}
	piv, nz := make([]int, n), make([]int, n)
	if !Factor(a, n, piv, nz) {
		b.Fatal("singular")
	}
	f := NewFactors(n)
	f.From(a, piv)
	x := make([]float64, n)
	b.ReportAllocs()
	for b.Loop() {
		x[0] = 1
		f.Solve(x)
	}
}

// TestFromDenseGrows: a Matrix with no room takes a dense matrix's
// non-zero entries (m·x equals the dense product), grows once, and keeps
// its storage for a later fill with fewer entries.
func TestFromDenseGrows(t *testing.T) {
	const n = 4
	d := []float64{
		2, 0, 0, 1,
		0, 3, 0, 0,
		-1, 0, 4, 0,
		0, 0, 0, 5,
	}
	m := NewMatrix(n, 0)
	all := func(int) int { return 0 }
	end := func(int) int { return n }
	m.FromDense(d, n, all, end)
	if len(m.col) != 6 {
		t.Fatalf("room for %d entries after a fill with 6", len(m.col))
	}
	x := []float64{1, 2, 3, 4}
	r := make([]float64, n)
	m.SubMul(x, r)
	for i := range n {
		var want float64
		for j := range n {
			want -= d[i*n+j] * x[j]
		}
		if r[i] != want {
			t.Errorf("row %d: −m·x = %v, want %v", i, r[i], want)
		}
	}
	col := &m.col[0]
	d[3] = 0
	m.FromDense(d, n, all, end)
	if &m.col[0] != col || m.row[n] != 5 {
		t.Errorf("a fill with fewer entries moved the storage or holds %d entries", m.row[n])
	}
}
