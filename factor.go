package powersplit

import (
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"

	"github.com/powersplit-dev/powersplit/internal/sparse"
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
// The numerics on plain slices (the LU by rows, the Woodbury solve, the
// refinement step) live in internal/sparse; this file assembles the torque
// systems and keeps their factors. The factors are kept by rows of their
// non-zero entries: a torque system has two or three entries per row and
// hardly fills in. The Woodbury
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
	gen      uint64 // counts the systems this entry has held
	r        *rangeDef
	gearK    []float64
	pflow    []int8
	dref     []float64 // per unit
	loopRow  []int     // per unit
	nExt     int
	extRow   []int          // rows of the given torques
	extSrc   []int          // output index, or −(PTO index)−1
	w        []float64      // W, one column of n per unit
	h        []float64      // A_ref⁻¹ times the unit vector of each given-torque row
	a        sparse.Matrix  // A_ref itself, for the residual of the refinement
	f        sparse.Factors // its factors by rows
	// pt holds, port by port, the rows of H then W: T_port = H·b + W·τ
	// (the compiled path, compiled.go), nPorts × (nExt + units).
	pt []float64
	// kp holds the compiled path's key ports' rows of pt, four wide and
	// zero-padded (keyPass), where the range has at most four columns.
	kp []float64
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
	s.vcol, s.delta = make([]int, nu), make([]float64, nu)
	for j, e := range l.loops {
		for k := range l.elems[e].shafts {
			s.vcol[s.unit0[j]+k] = l.nPorts + j
		}
	}
	s.work, s.iwork = make([]float64, 4*n), make([]int, n)
	s.lu, s.luPiv = make([]float64, n*n), make([]int, n)
	nExt := len(l.outputs) + len(l.ptos)
	s.cache = make([]sysEntry, cacheSize)
	// The entries' slices, cut from one block of each type.
	nf := len(l.gears) + nu + n*nu + n*nExt + l.nPorts*(nExt+nu)
	fs, is, bs := slab[float64](make([]float64, cacheSize*nf)), slab[int](make([]int, cacheSize*(nu+2*nExt))), slab[int8](make([]int8, cacheSize*len(l.planets)))
	for i := range s.cache {
		e := &s.cache[i]
		e.gearK, e.pflow = fs.take(len(l.gears)), bs.take(len(l.planets))
		e.dref, e.loopRow = fs.take(nu), is.take(nu)
		e.extRow, e.extSrc = is.take(nExt), is.take(nExt)
		e.w, e.h = fs.take(n*nu), fs.take(n*nExt)
		// The sparse storage grows to the entry's system at its first
		// factoring (factor): most systems fill a small part of n × n.
		e.a, e.f = sparse.NewMatrix(n, 0), sparse.NewFactors(n)
		e.pt = fs.take(l.nPorts * (nExt + nu))
	}
}

// slab hands out consecutive pieces of one allocation, each with its
// capacity cut to its length.
type slab[T any] []T

// take returns the next n elements of b.
func (b *slab[T]) take(n int) []T {
	s := (*b)[:n:n]
	*b = (*b)[n:]
	return s
}

// entry returns the factored system of range r with the current
// directions, factoring it if it is not cached.
func (s *Solver) entry(r *rangeDef, p *Point) *sysEntry {
	if e := s.recent; e != nil && e.used && e.r == r && equalK(e.gearK, s.gearK) && equalF(e.pflow, s.pflow) {
		return e
	}
	for i := range s.cache {
		e := &s.cache[i]
		if e.used && e.r == r && equalK(e.gearK, s.gearK) && equalF(e.pflow, s.pflow) {
			s.recent = e
			return e
		}
	}
	e := &s.cache[s.nextEntry]
	s.nextEntry = (s.nextEntry + 1) % len(s.cache)
	e.used, e.ok, e.r = true, false, r
	e.gen++
	copy(e.gearK, s.gearK)
	copy(e.pflow, s.pflow)
	s.factor(e, r, p)
	s.recent = e
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
		lu := s.lu // dense scratch: the entry keeps A_ref and its factors sparse
		if err := s.assembleInto(r, p, lu, s.y, e); err != nil {
			return
		}
		e.a.FromDense(lu, n, func(int) int { return 0 }, func(int) int { return n })
		a := blas64.General{Rows: n, Cols: n, Stride: n, Data: lu}
		anorm := lapack64.Lange(lapack.MaxColumnSum, a, s.work)
		if !sparse.Factor(lu, n, s.luPiv, s.iwork) {
			continue
		}
		if rc := lapack64.Gecon(lapack.MaxColumnSum, a, anorm, s.work, s.iwork); !(rc >= minRcond) {
			continue
		}
		e.f.From(lu, s.luPiv)
		for u := 0; u < s.nU; u++ {
			c := e.w[u*n : (u+1)*n]
			clear(c)
			c[e.loopRow[u]] = 1
			e.f.Solve(c)
		}
		for k := 0; k < e.nExt; k++ {
			c := e.h[k*n : (k+1)*n]
			clear(c)
			c[e.extRow[k]] = 1
			e.f.Solve(c)
		}
		m := e.nExt + s.nU
		for i := 0; i < l.nPorts; i++ {
			for k := 0; k < e.nExt; k++ {
				e.pt[i*m+k] = e.h[k*n+i]
			}
			for u := 0; u < s.nU; u++ {
				e.pt[i*m+e.nExt+u] = e.w[u*n+i]
			}
		}
		s.keyRows(e)
		e.ok = true
		return
	}
}

// solveSystem solves the torque system of range r at the current
// directions and loop linearisation and returns the solution (port torques,
// then the loop pressures in units of pScale). The slice is the solver's
// storage. It returns ErrSingular for a singular system.
func (s *Solver) solveSystem(r *rangeDef, p *Point) ([]float64, error) {
	if s.l.hasCharge {
		s.chargeTorques()
	}
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
		if !sparse.Factor(am, s.n, s.piv, s.iwork) {
			return nil, ErrSingular
		}
		x := s.rhs.RawVector().Data
		sparse.Solve(am, s.n, s.piv, x)
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
			sparse.Axpy(v, e.h[k*n:(k+1)*n], y)
		}
	}
	for j, ei := range l.loops {
		for k := range l.elems[ei].shafts {
			u := s.unit0[j] + k
			if b := s.lt0[u] - s.ld[u]*s.dp[j]; b != 0 {
				sparse.Axpy(b, e.w[u*n:(u+1)*n], y)
			}
		}
	}
	if s.dragRHS != nil {
		// The drag torques load the shaft rows: add A_ref⁻¹ of them.
		dy := s.dragY
		clear(dy)
		copy(dy, s.dragRHS)
		e.f.Solve(dy)
		sparse.Axpy(1, dy, y)
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
	for u := range s.delta {
		s.delta[u] = -pScale * (s.ld[u] - e.dref[u])
	}
	return sparse.Woodbury(e.w, s.n, s.vcol, s.delta, y, x, s.small, s.sg)
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
	l := s.l
	x, r := s.x, s.y
	// r = b − A_ref·x − Σ δ_k·x[col(k)] in the loop rows.
	clear(r)
	copy(r, s.dragRHS)
	for k := 0; k < e.nExt; k++ {
		if src := e.extSrc[k]; src >= 0 {
			r[e.extRow[k]] = float64(p.Outputs[src].Torque)
		} else if p.PTO != nil {
			r[e.extRow[k]] = float64(p.PTO[-src-1])
		}
	}
	e.a.SubMul(x, r)
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
	e.f.Solve(r)
	d := s.dx
	if !s.woodbury(e, r, d) {
		return true
	}
	return sparse.Correct(x, d)
}
