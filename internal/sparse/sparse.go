package sparse

// Matrix is a sparse n × n matrix by rows: the entries of row i are
// val[row[i]:row[i+1]] in the columns col[row[i]:row[i+1]].
type Matrix struct {
	row []int32
	col []int32
	val []float64
}

// NewMatrix returns an n × n Matrix with room for capacity non-zero entries.
func NewMatrix(n, capacity int) Matrix {
	return Matrix{row: make([]int32, n+1), col: make([]int32, capacity), val: make([]float64, capacity)}
}

// FromDense fills m with the non-zero entries of the n × n row-major d in
// the columns [lo(i), hi(i)) of each row i, growing m's storage when it has
// too little room (so a Matrix sized for its largest fill does not
// allocate again). It panics if m is not n × n.
func (m *Matrix) FromDense(d []float64, n int, lo, hi func(i int) int) {
	if len(m.row) != n+1 {
		panic("sparse: FromDense into a matrix of another size")
	}
	nz := 0
	for i := 0; i < n; i++ {
		for _, v := range d[i*n+lo(i) : i*n+hi(i)] {
			if v != 0 {
				nz++
			}
		}
	}
	if nz > len(m.col) {
		m.col, m.val = make([]int32, nz), make([]float64, nz)
	}
	k := int32(0)
	for i := 0; i < n; i++ {
		m.row[i] = k
		for j := lo(i); j < hi(i); j++ {
			if v := d[i*n+j]; v != 0 {
				m.col[k], m.val[k] = int32(j), v
				k++
			}
		}
	}
	m.row[n] = k
}

// SubMul subtracts m·x from r: r = r − m·x.
func (m *Matrix) SubMul(x, r []float64) {
	n := len(m.row) - 1
	r = r[:n]
	for i := range r {
		v := r[i]
		for q := m.row[i]; q < m.row[i+1]; q++ {
			v -= m.val[q] * x[m.col[q]]
		}
		r[i] = v
	}
}

// Factors are the LU factors of an n × n matrix by rows of their non-zero
// entries: P·A = L·U with L unit lower triangular.
type Factors struct {
	piv    []int
	lo, up Matrix // L strictly below, U strictly above the diagonal
	diag   []float64
}

// NewFactors returns room for the factors of an n × n matrix; the room for
// their non-zero entries grows as From needs it.
func NewFactors(n int) Factors {
	return Factors{piv: make([]int, n), lo: NewMatrix(n, 0), up: NewMatrix(n, 0), diag: make([]float64, n)}
}

// From keeps the factors that Factor left in the n × n row-major lu, with
// its pivots piv.
func (f *Factors) From(lu []float64, piv []int) {
	n := len(f.diag)
	copy(f.piv, piv[:n])
	f.lo.FromDense(lu, n, func(int) int { return 0 }, func(i int) int { return i })
	f.up.FromDense(lu, n, func(i int) int { return i + 1 }, func(int) int { return n })
	for i := 0; i < n; i++ {
		f.diag[i] = lu[i*n+i]
	}
}

// Solve solves A·z = b in place (z into b).
func (f *Factors) Solve(b []float64) {
	n := len(f.diag)
	b = b[:n]
	for k := 0; k < n; k++ {
		if p := f.piv[k]; p != k {
			b[k], b[p] = b[p], b[k]
		}
	}
	lo, up := &f.lo, &f.up
	for i := 1; i < n; i++ {
		v := b[i]
		for q := lo.row[i]; q < lo.row[i+1]; q++ {
			v -= lo.val[q] * b[lo.col[q]]
		}
		b[i] = v
	}
	for i := n - 1; i >= 0; i-- {
		v := b[i]
		for q := up.row[i]; q < up.row[i+1]; q++ {
			v -= up.val[q] * b[up.col[q]]
		}
		b[i] = v / f.diag[i]
	}
}

// Factor factors the n × n row-major matrix a in place into P·A = L·U by
// Gaussian elimination with partial pivoting (the unblocked algorithm of
// LAPACK dgetf2: first largest pivot, multipliers scaled by the reciprocal
// of the pivot), skipping zero entries. It returns false when a pivot is
// exactly zero, as dgetrf does. piv receives the row interchanges; nz is
// work space of length n.
func Factor(a []float64, n int, piv, nz []int) bool {
	a, nz = a[:n*n], nz[:n]
	for k := 0; k < n; k++ {
		p, best := k, abs(a[k*n+k])
		for i := k + 1; i < n; i++ {
			if v := abs(a[i*n+k]); v > best {
				p, best = i, v
			}
		}
		piv[k] = p
		if best == 0 {
			return false
		}
		if p != k {
			rk, rp := a[k*n:(k+1)*n], a[p*n:(p+1)*n]
			for j := range rk {
				rk[j], rp[j] = rp[j], rk[j]
			}
		}
		// The non-zero entries of the pivot row right of the pivot.
		nnz := 0
		for j := k + 1; j < n; j++ {
			if a[k*n+j] != 0 {
				nz[nnz] = j
				nnz++
			}
		}
		cols := nz[:nnz]
		inv := 1 / a[k*n+k]
		for i := k + 1; i < n; i++ {
			f := a[i*n+k]
			if f == 0 {
				continue
			}
			f *= inv
			a[i*n+k] = f
			for _, j := range cols {
				a[i*n+j] -= f * a[k*n+j]
			}
		}
	}
	return true
}

// Solve solves A·x = b in place (x into b) with the factors of Factor.
func Solve(a []float64, n int, piv []int, b []float64) {
	a, b = a[:n*n], b[:n]
	for k := 0; k < n; k++ {
		if p := piv[k]; p != k {
			b[k], b[p] = b[p], b[k]
		}
	}
	for i := 1; i < n; i++ {
		v := b[i]
		for j, l := range a[i*n : i*n+i] {
			if l != 0 {
				v -= l * b[j]
			}
		}
		b[i] = v
	}
	for i := n - 1; i >= 0; i-- {
		v := b[i]
		for j, u := range a[i*n+i+1 : (i+1)*n] {
			if u != 0 {
				v -= u * b[i+1+j]
			}
		}
		b[i] = v / a[i*n+i]
	}
}

// Woodbury turns y = A⁻¹·b into x = (A + U·Δ·Vᵀ)⁻¹·b. The update has rank
// m = len(delta): column u of U is the unit vector of some row, w holds
// W = A⁻¹·U by columns of length n (w[u*n:(u+1)*n]), column u of V is the
// unit vector of column vcol[u], and Δ = diag(delta). k (m × m) and g (m)
// are work space. It returns false when the updated matrix is singular (the
// small system is); x is then unspecified. x and y may not overlap.
func Woodbury(w []float64, n int, vcol []int, delta, y, x, k, g []float64) bool {
	m := len(delta)
	// (I + Δ·Vᵀ·W)·s = Δ·Vᵀ·y
	for u := 0; u < m; u++ {
		d := delta[u]
		c := vcol[u]
		for v := 0; v < m; v++ {
			k[u*m+v] = d * w[v*n+c]
		}
		k[u*m+u]++
		g[u] = d * y[c]
	}
	if !SolveSmall(k, g, m) {
		return false
	}
	copy(x, y[:n])
	for u := 0; u < m; u++ {
		if g[u] != 0 {
			Axpy(-g[u], w[u*n:(u+1)*n], x)
		}
	}
	return true
}

// Correct adds the refinement correction d to x and reports whether it was
// negligible for every component (below 1e-15 of it), that is whether x was
// already accurate. A correction with a component that is not finite is
// not applied and ends the refinement (true).
func Correct(x, d []float64) bool {
	d = d[:len(x)]
	small := true
	for i, v := range d {
		if v-v != 0 {
			return true
		}
		if abs(v) > 1e-15*abs(x[i]) {
			small = false
		}
	}
	for i := range x {
		x[i] += d[i]
	}
	return small
}

// Axpy adds a·x to y.
func Axpy(a float64, x, y []float64) {
	y = y[:len(x)]
	for i, v := range x {
		y[i] += a * v
	}
}

// SolveSmall solves the m × m row-major system k·z = g in place (z into g)
// by Gaussian elimination with partial pivoting; false when it is singular
// (or its pivots are not finite). k is overwritten.
func SolveSmall(k, g []float64, m int) bool {
	for c := 0; c < m; c++ {
		pr, best := c, abs(k[c*m+c])
		for r := c + 1; r < m; r++ {
			if v := abs(k[r*m+c]); v > best {
				pr, best = r, v
			}
		}
		if best == 0 || best-best != 0 {
			return false
		}
		if pr != c {
			for j := 0; j < m; j++ {
				k[c*m+j], k[pr*m+j] = k[pr*m+j], k[c*m+j]
			}
			g[c], g[pr] = g[pr], g[c]
		}
		piv := k[c*m+c]
		for r := c + 1; r < m; r++ {
			f := k[r*m+c] / piv
			if f == 0 {
				continue
			}
			for j := c; j < m; j++ {
				k[r*m+j] -= f * k[c*m+j]
			}
			g[r] -= f * g[c]
		}
	}
	for c := m - 1; c >= 0; c-- {
		v := g[c]
		for j := c + 1; j < m; j++ {
			v -= k[c*m+j] * g[j]
		}
		g[c] = v / k[c*m+c]
	}
	return true
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}
