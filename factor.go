package powersplit

import (
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// The torque system of a range, A(d)·x = b, changes from one iteration to
// the next only in the loop rows: unit k of loop j has the row
// T_k − d_k·pScale·Δp_j = t0_k − d_k·Δp0_j, whose coefficient d_k (the
// slope of the unit torque over the pressure) and right-hand side follow
// the loop state. Everything else depends on the range and the loss
// directions only. So the solver factors, once per range and set of
// directions, the system A_ref with the loop slopes at fixed reference
// values d_ref, and solves each iteration by the Woodbury identity:
//
//	A(d) = A_ref + U·Δ·Vᵀ,  Δ = diag(−pScale·(d_k − d_ref,k))
//	y = A_ref⁻¹·b,  W = A_ref⁻¹·U
//	(I + Δ·Vᵀ·W)·s = Δ·Vᵀ·y,  x = y − W·s
//
// U selects the loop rows and V the pressure columns, so the only system
// left to solve per iteration has one row per hydrostatic unit. y is
// assembled from precomputed columns: b is non-zero only in the rows of the
// given torques (outputs, PTOs) and the loop rows. A reference that leaves
// A_ref singular or ill-conditioned (reciprocal condition number below
// minRcond) is replaced by another; when none serves, that range and set
// of directions is solved by a full LU factorisation every iteration, as
// the general fallback. By the matrix determinant lemma,
// det A(d) = det A_ref · det(I + Δ·Vᵀ·W), so A(d) is singular exactly when
// the small system is.
//
// The factors are kept by rows of their non-zero entries: a torque system
// has two or three entries per row and hardly fills in. The Woodbury
// solution is accurate relative to the largest torques of the point; the
// converged one is refined (Solver.exact) to be accurate relative to each
// torque's own size. The profile this replaces: an LU factorisation of the
// whole system (LAPACK dgetrf through gonum) and a bracketed root search
// for the loop settings in every iteration, 19 µs a point of the two-range
// output-coupled benchmark; now about 3 µs.

// cacheSize is the number of factored (range, directions) systems a Solver
// keeps; the oldest is replaced when a new one is needed.
const cacheSize = 12

// minRcond is the smallest reciprocal condition number (1-norm) accepted for
// a reference system.
const minRcond = 1e-10

// refMotor are the motor slopes tried for the reference, as multiples of
// −D_max (the pump's is +D_max): the ideal slopes at full settings first.
var refMotor = [...]float64{1, -1, 0.37}

// sysEntry is one factored reference system.
type sysEntry struct {
	used, ok bool
	r        *rangeDef
	gearK    []float64
	pflow    []int8
	lu       []float64 // n × n LU factors of A_ref, row-major
	piv      []int
	dref     []float64 // per unit
	loopRow  []int     // per unit
	nExt     int
	extRow   []int     // rows of the given torques
	extSrc   []int     // output index, or −(PTO index)−1
	w        []float64 // W, one column of n per unit
	h        []float64 // A_ref⁻¹ times the unit vector of each given-torque row
	a        csr       // A_ref itself, for the residual of the refinement
	lo, up   csr       // the factors: L strictly below, U strictly above the diagonal
	diag     []float64 // the diagonal of U
}

// csr is a sparse matrix by rows: the entries of row i are val[row[i]:row[i+1]]
// in the columns col[row[i]:row[i+1]].
type csr struct {
	row []int32
	col []int32
	val []float64
}

func newCSR(n, capacity int) csr {
	return csr{row: make([]int32, n+1), col: make([]int32, capacity), val: make([]float64, capacity)}
}

// fromDense fills c with the entries of the n × n row-major d in the
// columns [lo(i), hi(i)) of each row i.
func (c *csr) fromDense(d []float64, n int, lo, hi func(i int) int) {
	k := int32(0)
	for i := 0; i < n; i++ {
		c.row[i] = k
		for j := lo(i); j < hi(i); j++ {
			if v := d[i*n+j]; v != 0 {
				c.col[k], c.val[k] = int32(j), v
				k++
			}
		}
	}
	c.row[n] = k
}

// initCache allocates the cache and the work space of the Woodbury solve.
func (s *Solver) initCache() {
	l, n := s.l, s.n
	s.unit0 = make([]int, len(l.loops))
	nu := 0
	for j, e := range l.loops {
		s.unit0[j] = nu
		nu += len(l.elems[e].shafts)
	}
	s.nU = nu
	s.lt0, s.ld = make([]float64, nu), make([]float64, nu)
	s.x, s.y, s.dx = make([]float64, n), make([]float64, n), make([]float64, n)
	s.small, s.sg = make([]float64, nu*nu), make([]float64, nu)
	s.work, s.iwork = make([]float64, 4*n), make([]int, n)
	nExt := len(l.outputs) + len(l.ptos)
	s.cache = make([]sysEntry, cacheSize)
	for i := range s.cache {
		e := &s.cache[i]
		e.gearK, e.pflow = make([]float64, len(l.gears)), make([]int8, len(l.planets))
		e.lu, e.piv = make([]float64, n*n), make([]int, n)
		e.dref, e.loopRow = make([]float64, nu), make([]int, nu)
		e.extRow, e.extSrc = make([]int, nExt), make([]int, nExt)
		e.w, e.h = make([]float64, n*nu), make([]float64, n*nExt)
		e.a, e.lo, e.up = newCSR(n, n*n), newCSR(n, n*(n-1)/2), newCSR(n, n*(n-1)/2)
		e.diag = make([]float64, n)
	}
}

// entry returns the factored system of range r with the current
// directions, factoring it if it is not cached.
func (s *Solver) entry(r *rangeDef, p *Point) *sysEntry {
	for i := range s.cache {
		e := &s.cache[i]
		if e.used && e.r == r && equalK(e.gearK, s.gearK) && equalF(e.pflow, s.pflow) {
			return e
		}
	}
	e := &s.cache[s.nextEntry]
	s.nextEntry = (s.nextEntry + 1) % len(s.cache)
	e.used, e.ok, e.r = true, false, r
	copy(e.gearK, s.gearK)
	copy(e.pflow, s.pflow)
	s.factor(e, r, p)
	return e
}

func equalK(a, b []float64) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

func equalF(a, b []int8) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// factor factors the reference system of e; e.ok reports success.
func (s *Solver) factor(e *sysEntry, r *rangeDef, p *Point) {
	l, n := s.l, s.n
	for _, m := range refMotor {
		for j, ei := range l.loops {
			sp := &l.elems[ei].lspec
			u := s.unit0[j]
			e.dref[u] = float64(sp.Pump.Displacement(1))
			for k := range sp.Motors {
				e.dref[u+1+k] = -m * float64(sp.Motors[k].Displacement(1))
			}
		}
		if err := s.assembleInto(r, p, e.lu, s.y, e); err != nil {
			return
		}
		e.a.fromDense(e.lu, n, func(int) int { return 0 }, func(int) int { return n })
		a := blas64.General{Rows: n, Cols: n, Stride: n, Data: e.lu}
		anorm := lapack64.Lange(lapack.MaxColumnSum, a, s.work)
		if !luFactor(e.lu, n, e.piv, s.iwork) {
			continue
		}
		if rc := lapack64.Gecon(lapack.MaxColumnSum, a, anorm, s.work, s.iwork); !(rc >= minRcond) {
			continue
		}
		e.lo.fromDense(e.lu, n, func(int) int { return 0 }, func(i int) int { return i })
		e.up.fromDense(e.lu, n, func(i int) int { return i + 1 }, func(int) int { return n })
		for i := 0; i < n; i++ {
			e.diag[i] = e.lu[i*n+i]
		}
		for u := 0; u < s.nU; u++ {
			c := e.w[u*n : (u+1)*n]
			clear(c)
			c[e.loopRow[u]] = 1
			e.solveRef(c)
		}
		for k := 0; k < e.nExt; k++ {
			c := e.h[k*n : (k+1)*n]
			clear(c)
			c[e.extRow[k]] = 1
			e.solveRef(c)
		}
		e.ok = true
		return
	}
}

// solveSystem solves the torque system of range r at the current
// directions and loop linearisation and returns the solution (port torques,
// then the loop pressures in units of pScale). The slice is the solver's
// storage. It returns ErrSingular for a singular system.
func (s *Solver) solveSystem(r *rangeDef, p *Point) ([]float64, error) {
	var e *sysEntry
	if !s.full && !s.noFactor {
		e = s.entry(r, p)
	}
	if e == nil || !e.ok {
		// General fallback: assemble and factor in full.
		s.last = nil
		if err := s.assemble(r, p); err != nil {
			return nil, err
		}
		am := s.a.RawMatrix().Data
		if !luFactor(am, s.n, s.piv, s.iwork) {
			return nil, ErrSingular
		}
		x := s.rhs.RawVector().Data
		luSolve(am, s.n, s.piv, x)
		return x, nil
	}
	l, n := s.l, s.n
	for j := range l.loops {
		if err := s.linearise(j); err != nil {
			return nil, err
		}
	}
	// y = A_ref⁻¹·b from the columns of the given torques and the loop rows.
	y := s.y
	clear(y)
	for k := 0; k < e.nExt; k++ {
		var v float64
		if src := e.extSrc[k]; src >= 0 {
			v = float64(p.Outputs[src].Torque)
		} else if p.PTO != nil {
			v = float64(p.PTO[-src-1])
		}
		if v != 0 {
			axpy(v, e.h[k*n:(k+1)*n], y)
		}
	}
	for j, ei := range l.loops {
		for k := range l.elems[ei].shafts {
			u := s.unit0[j] + k
			if b := s.lt0[u] - s.ld[u]*s.dp[j]; b != 0 {
				axpy(b, e.w[u*n:(u+1)*n], y)
			}
		}
	}
	s.last = e
	if !s.woodbury(e, y, s.x) {
		return nil, ErrSingular
	}
	return s.x, nil
}

// woodbury turns y = A_ref⁻¹·b into x = A(d)⁻¹·b for the current loop
// slopes; false when A(d) is singular.
func (s *Solver) woodbury(e *sysEntry, y, x []float64) bool {
	l, n, nu := s.l, s.n, s.nU
	// (I + Δ·Vᵀ·W)·s = Δ·Vᵀ·y
	k, g := s.small, s.sg
	for j, ei := range l.loops {
		col := l.nPorts + j
		for kk := range l.elems[ei].shafts {
			u := s.unit0[j] + kk
			delta := -pScale * (s.ld[u] - e.dref[u])
			for v := 0; v < nu; v++ {
				k[u*nu+v] = delta * e.w[v*n+col]
			}
			k[u*nu+u]++
			g[u] = delta * y[col]
		}
	}
	if !solveSmall(k, g, nu) {
		return false
	}
	copy(x, y)
	for u := 0; u < nu; u++ {
		if g[u] != 0 {
			axpy(-g[u], e.w[u*n:(u+1)*n], x)
		}
	}
	return true
}

// solveRef solves A_ref·z = b in place (z into b) with the sparse factors.
func (e *sysEntry) solveRef(b []float64) {
	n := len(e.diag)
	b = b[:n]
	for k := 0; k < n; k++ {
		if p := e.piv[k]; p != k {
			b[k], b[p] = b[p], b[k]
		}
	}
	lo, up := &e.lo, &e.up
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
		b[i] = v / e.diag[i]
	}
}

// refine improves the last solution x (in s.x) of the system solved with e
// by one step of iterative refinement: r = b − A(d)·x computed from the
// sparse A_ref and the loop rows, then x += A(d)⁻¹·r by the same Woodbury
// solve. The step takes out the rounding error of the Woodbury update
// (which is relative to the largest torques of the point), shrinking it by
// a factor of about the machine epsilon times the condition number. It
// reports whether the correction was negligible for every component (below
// 1e-15 of it), that is whether x was already accurate; a correction that is
// not finite is not applied and ends the refinement (true).
func (s *Solver) refine(e *sysEntry, p *Point) bool {
	l, n := s.l, s.n
	x, r := s.x, s.y
	// r = b − A_ref·x − Σ δ_k·x[col(k)] in the loop rows.
	clear(r)
	for k := 0; k < e.nExt; k++ {
		if src := e.extSrc[k]; src >= 0 {
			r[e.extRow[k]] = float64(p.Outputs[src].Torque)
		} else if p.PTO != nil {
			r[e.extRow[k]] = float64(p.PTO[-src-1])
		}
	}
	a := &e.a
	for i := 0; i < n; i++ {
		v := r[i]
		for q := a.row[i]; q < a.row[i+1]; q++ {
			v -= a.val[q] * x[a.col[q]]
		}
		r[i] = v
	}
	// The loop rows straight from A(d), T − d·pScale·Δp = t0 − d·Δp0: not
	// through A_ref and the correction, whose large terms would cancel.
	for j, ei := range l.loops {
		col := l.nPorts + j
		el := &l.elems[ei]
		for kk := range el.shafts {
			u := s.unit0[j] + kk
			r[e.loopRow[u]] = s.lt0[u] - s.ld[u]*s.dpPrev[j] - (x[el.port0+kk] - s.ld[u]*pScale*x[col])
		}
	}
	e.solveRef(r)
	d := s.dx
	if !s.woodbury(e, r, d) {
		return true
	}
	small := true
	for i, v := range d {
		if bad(v) {
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

// axpy adds a·x to y.
func axpy(a float64, x, y []float64) {
	y = y[:len(x)]
	for i, v := range x {
		y[i] += a * v
	}
}

// solveSmall solves the m × m system k·z = g in place (z into g) by
// Gaussian elimination with partial pivoting; false when it is singular.
func solveSmall(k, g []float64, m int) bool {
	for c := 0; c < m; c++ {
		pr, best := c, abs(k[c*m+c])
		for r := c + 1; r < m; r++ {
			if v := abs(k[r*m+c]); v > best {
				pr, best = r, v
			}
		}
		if best == 0 || bad(best) {
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

// luFactor factors the n × n row-major matrix a in place into P·A = L·U by
// Gaussian elimination with partial pivoting (the unblocked algorithm of
// LAPACK dgetf2: first largest pivot, multipliers scaled by the reciprocal
// of the pivot). It skips the zero entries of the sparse torque systems,
// which leaves the arithmetic on the non-zero ones unchanged. It returns
// false when a pivot is exactly zero, as dgetrf does. nz is work space of
// length n.
func luFactor(a []float64, n int, piv, nz []int) bool {
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

// luSolve solves A·x = b in place (x into b) with the factors of luFactor.
func luSolve(a []float64, n int, piv []int, b []float64) {
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
