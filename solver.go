package powersplit

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/internal/solvepath"
	"github.com/powersplit-dev/powersplit/internal/sparse"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Solver solves operating points of one layout. It holds the work space, so
// repeated solves allocate nothing. A Solver is not safe for concurrent use;
// use one per goroutine (they may share the Layout).
type Solver struct {
	l     *layout
	n     int
	a     *mat.Dense
	rhs   *mat.VecDense
	piv   []int
	w     []float64
	t     []float64
	gearK []float64 // per gear: η (a drives), 1/η (b drives) or 1 (lossless/none)
	flip  []int
	pflow []int8 // per planetary: -1 lossless, 0 sun drives, 1 ring drives
	pflip []int
	dp    []float64
	loopA []hydrostat.LoopState
	loopB []hydrostat.LoopState
	mw    [][]units.AngularVelocity
	outW  []float64
	over  []int // per loop: iterations in a row beyond the relief pressure

	// Slopes of the unit torques over the loop pressure. In the main
	// iteration (secant set) they come from the last two iterates where
	// those are far enough apart, and from a finite difference (a second
	// loop evaluation) only at the start; elsewhere always from the finite
	// difference.
	secant   bool
	havePrev []bool    // per loop: prevDp and prevT hold an earlier iterate
	prevDp   []float64 // per loop
	prevT    []float64 // per unit
	alpha    float64
	lastStep float64
	scratch  State
	bad      *marginDesc // the first infeasible margin of the last fill (margins), at badV
	badV     float64
	rangeM   []marginSet // per range: its speed limit (initMargins)
	loopM    []marginSet // per loop: its margins (initMargins)
	mval     []float64   // a loop's margins' values (margins)
	noPins   bool        // setPins held nothing at its last call
	uspeed   []unitSpeed // every loop's units (unitSpeeds)

	// The factored torque systems (see factor.go) and the work space of
	// their solve.
	unit0     []int // per loop: index of its pump among all units
	nU        int   // units over all loops
	lt0, ld   []float64
	x, y, dx  []float64
	last      *sysEntry // the factored system of the last solve; nil after a full LU
	small, sg []float64
	vcol      []int     // per unit: the column of its loop's pressure
	delta     []float64 // per unit: the Woodbury update of its slope
	work      []float64
	iwork     []int
	lu        []float64 // n × n dense scratch of factor: A_ref, then its LU factors
	luPiv     []int
	cache     []sysEntry
	nextEntry int
	recent    *sysEntry // the entry found last, looked at first
	dpPrev    []float64 // loop pressures of the system last solved
	full      bool      // solve by full LU (after converging on the factored systems)
	noFactor  bool      // tests: always solve by full LU
	general   bool      // the general path only (tests and benchmarks: today's path)
	comp      compiledState
	ec        []elemC // per element: what the hot path reads (compiled.go)
	compErr   error   // the error of the last point solved on the compiled path

	// Drag sources (drag.go): torque per source, the shafts' right-hand
	// sides −Σ T_d, and the work space of their share of the solution.
	dragT, dragRHS, dragY []float64
	// Held motor settings (second.go): per loop, the held setting of each
	// motor (NaN: free), the loop's copy that holds them, and whether a
	// motor of the loop is held at this point.
	pinHeld [][]float64
	pinLoop []hydrostat.Loop
	pinOn   []bool
	// locked ranges (locked.go): each loop with its units destroked, used
	// while lockedNow
	lockLoop  []hydrostat.Loop
	lockedNow bool
	outs      []OutputDemand // SolveTotal's copy of the point's demands

	slab  []LimitError           // fresh errors (limitErr)
	hslab []hydrostat.LimitError // fresh causes (loopLimit)
	// once, set by a map's worker around one Solve whose error it reads
	// before the next, makes limitErr and newHydroLimit write into the
	// two errors below instead of fresh ones (detach copies them out).
	once     bool
	onceErr  LimitError
	onceHydr hydrostat.LimitError
}

// Settings of the iteration.
const (
	maxIter   = 80
	balanceTo = 1e-9  // relative power balance required
	pScale    = 1e5   // Pa per unknown of the loop pressure (bar)
	dpTolRel  = 1e-12 // relative change of the loop pressure to stop
	dpTolAbs  = 1e-6  // Pa
)

// NewSolver returns a Solver for l. It panics if l is the zero Layout.
func NewSolver(l Layout) *Solver {
	if l.l == nil {
		panic("powersplit: NewSolver on a zero Layout")
	}
	ly := l.l
	n := ly.nPorts + len(ly.loops)
	s := &Solver{
		l: ly, n: n,
		a:     mat.NewDense(n, n, nil),
		rhs:   mat.NewVecDense(n, nil),
		piv:   make([]int, n),
		w:     make([]float64, len(ly.shafts)),
		t:     make([]float64, ly.nPorts),
		gearK: make([]float64, len(ly.gears)),
		flip:  make([]int, len(ly.gears)),
		pflow: make([]int8, len(ly.planets)),
		pflip: make([]int, len(ly.planets)),
		dp:    make([]float64, len(ly.loops)),
		loopA: make([]hydrostat.LoopState, len(ly.loops)),
		loopB: make([]hydrostat.LoopState, len(ly.loops)),
		mw:    make([][]units.AngularVelocity, len(ly.loops)),
		outW:  make([]float64, len(ly.outputs)),
		over:  make([]int, len(ly.loops)),
	}
	for j, e := range ly.loops {
		m := len(ly.elems[e].shafts) - 1
		s.loopA[j].Motors = make([]hydrostat.Point, m)
		s.loopB[j].Motors = make([]hydrostat.Point, m)
		s.loopA[j].Settings = make([]float64, m+1)
		s.loopB[j].Settings = make([]float64, m+1)
		s.mw[j] = make([]units.AngularVelocity, m)
	}
	if len(ly.drags) > 0 {
		s.dragT, s.dragRHS, s.dragY = make([]float64, len(ly.drags)), make([]float64, len(ly.shafts)), make([]float64, n)
	}
	s.dpPrev = make([]float64, len(ly.loops))
	s.havePrev, s.prevDp = make([]bool, len(ly.loops)), make([]float64, len(ly.loops))
	s.initCache()
	s.initUnitSpeeds()
	s.initElemC()
	s.initCompiled()
	s.initMargins()
	s.general = ly.general || solvepath.General.Load()
	s.prevT = make([]float64, s.nU)
	s.initPins()
	s.initLocked()
	return s
}

// Layout returns the solver's layout.
func (s *Solver) Layout() Layout { return Layout{l: s.l} }

// bad reports whether v is NaN or infinite (v − v is NaN for both).
func bad(v float64) bool { return v-v != 0 }

// The bounds of an operating point. Beyond them a point means nothing for
// a vehicle drive and its products would overflow; Solve refuses it with an
// *InputError.
//
// Common practice (no published source): vehicle engines and their
// transmission shafts turn below about 10 000 rpm, and drive torques stay
// below a few hundred kN·m.
const (
	MaxSpeed  = units.AngularVelocity(100000 * 2 * math.Pi / 60) // 100 000 rpm: the largest |speed| of the input and the outputs
	MaxTorque = units.Torque(1e8)                                // 100 000 kN·m: the largest |torque| of an output or a PTO
)

// errNilState is the error of an entry point given a nil *State.
var errNilState = &InputError{Field: "st", Value: units.Plain(math.NaN()), Reason: "nil *State: pass a State to fill"}

// checkEntry checks a public entry's point and state. After an *InputError st
// holds no point: it is reset to the zero State (Brief kept), so no number
// of an earlier point can be read as this one's.
// resetOnInput resets st to the zero State (Brief kept) when err is an
// *InputError, so that no number of an earlier point can be read as the
// answer to a refused one; it returns err.
func resetOnInput(err error, st *State) error {
	if err != nil && st != nil && errors.Is(err, ErrInput) {
		*st = State{Brief: st.Brief}
	}
	return err
}

func (s *Solver) checkEntry(p *Point, st *State) error {
	if st == nil {
		return errNilState
	}
	err := s.check(p)
	if err != nil {
		*st = State{Brief: st.Brief}
	}
	return err
}

// checkInput checks an engine speed: finite, positive, at most MaxSpeed.
func checkInput(in units.AngularVelocity) error {
	switch {
	case bad(float64(in)):
		return &InputError{Field: "Input", Value: units.Of(in), Reason: "not finite"}
	case !(in > 0):
		return &InputError{Field: "Input", Value: units.Of(in), Reason: "the engine speed must be positive (the engine turns the input forwards)"}
	case in > MaxSpeed:
		return &InputError{Field: "Input", Value: units.Of(in), Reason: "above " + MaxSpeed.String() + ", beyond any engine"}
	}
	return nil
}

func (s *Solver) check(p *Point) error {
	l := s.l
	if p.Range < 0 || p.Range >= len(l.ranges) {
		return &InputError{Field: "Range", Value: units.Plain(float64(p.Range)), Reason: "no such range"}
	}
	if err := checkInput(p.Input); err != nil {
		return err
	}
	if len(p.Outputs) != len(l.outputs) {
		return &InputError{Field: "len(Outputs)", Value: units.Plain(float64(len(p.Outputs))), Reason: "one demand per output needed"}
	}
	for _, o := range p.Outputs {
		if bad(float64(o.Speed)) {
			return &InputError{Field: "Outputs.Speed", Value: units.Of(o.Speed), Reason: "not finite"}
		}
		if math.Abs(float64(o.Speed)) > float64(MaxSpeed) {
			return &InputError{Field: "Outputs.Speed", Value: units.Of(o.Speed), Reason: "beyond ±" + MaxSpeed.String()}
		}
		if bad(float64(o.Torque)) {
			return &InputError{Field: "Outputs.Torque", Value: units.Of(o.Torque), Reason: "not finite"}
		}
		if math.Abs(float64(o.Torque)) > float64(MaxTorque) {
			return &InputError{Field: "Outputs.Torque", Value: units.Of(o.Torque), Reason: "beyond ±" + MaxTorque.String()}
		}
	}
	if p.PTO != nil && len(p.PTO) != len(l.ptos) {
		return &InputError{Field: "len(PTO)", Value: units.Plain(float64(len(p.PTO))), Reason: "one torque per PTO, or nil"}
	}
	for _, t := range p.PTO {
		if bad(float64(t)) {
			return &InputError{Field: "PTO", Value: units.Of(t), Reason: "not finite"}
		}
		if math.Abs(float64(t)) > float64(MaxTorque) {
			return &InputError{Field: "PTO", Value: units.Of(t), Reason: "beyond ±" + MaxTorque.String()}
		}
	}
	return s.checkSettings(p)
}

// Solve finds the steady state at operating point p and writes it into st.
// It returns a *LimitError (ErrInfeasible, ErrUnreachable) when the point
// crosses a limit — st then holds the state reached, with the crossed margin
// — an *InputError for bad input (a nil st, a speed or torque that is not
// finite or beyond MaxSpeed or MaxTorque, an engine speed that is not
// positive) — st is then reset to the zero State, so it holds no point —
// and a *ConvergenceError or ErrSingular when the iteration fails. Solve does not allocate once st has been used
// with this layout.
//
// A motor the layout sets by a SettingCurve gets the sign with which it
// drives its shaft: when it pumps at the curve's sign, the point is solved
// again with the sign reversed, and the drive kept if that solves.
func (s *Solver) Solve(p Point, st *State) error {
	if err := s.checkEntry(&p, st); err != nil {
		return err
	}
	err := s.solve(&p, st, false)
	if !s.l.hasCurves(p.Range) || (err == nil && s.curveDrives(&p, st)) {
		return err
	}
	if err2 := s.solve(&p, st, true); err2 == nil {
		return nil
	}
	return s.solve(&p, st, false)
}

// solve is Solve on a checked point (p is Solve's copy); flip reverses the settings of the
// motors set by curves.
func (s *Solver) solve(p *Point, st *State, flip bool) error {
	l := s.l
	r := &l.ranges[p.Range]
	for i, o := range p.Outputs {
		s.outW[i] = float64(o.Speed)
	}
	s.setPins(p, flip)
	s.lockedNow = r.locked
	if r.locked {
		if want, ok := r.lockedSpeed(float64(p.Input), s.outW); !ok {
			// The speeds of a locked range follow from the input speed:
			// report the output speed it gives.
			s.outW[0] = want
			l.speeds(r, float64(p.Input), s.outW, s.w)
			s.outW[0] = float64(p.Outputs[0].Speed)
			s.fill(st, *p, r, 0, 0)
			return s.limitErr(LimitError{Element: r.name, Quantity: "output speed", Value: units.Of(units.AngularVelocity(math.Abs(s.outW[0]))),
				Bound: boundLockedSpeed, Limit: units.Of(units.AngularVelocity(math.Abs(want))), Err: ErrUnreachable})
		}
	}
	l.speeds(r, float64(p.Input), s.outW, s.w)
	if r.locked {
		snapSpeeds(s.w)
	}
	if len(l.drags) > 0 {
		if err := s.initDrags(r, p); err != nil {
			s.fill(st, *p, r, 0, 0)
			return err
		}
	}
	if r.maxOut > 0 && math.Abs(s.outW[0]) > r.maxOut*(1+1e-12) {
		s.fill(st, *p, r, 0, 0)
		return s.limitErr(LimitError{Element: r.name, Quantity: "output speed", Value: units.Of(units.AngularVelocity(math.Abs(s.outW[0]))),
			Bound: boundRangeSpeed, Limit: units.Of(units.AngularVelocity(r.maxOut)), Err: ErrInfeasible})
	}
	// Speed limits of the units do not depend on the torques.
	if err := s.unitSpeeds(); err != nil {
		s.fill(st, *p, r, 0, 0)
		return err
	}
	// A range with one loop: the compiled path (compiled.go), which hands
	// every point it cannot decide to the general iteration below.
	if s.compiled(r, p, st) {
		return s.compErr
	}
	s.losslessDirections()
	clear(s.flip)
	clear(s.pflip)
	clear(s.dp)
	converged, it, err := s.iterate(r, p, true, 0)
	if err != nil {
		s.fill(st, *p, r, it, 0)
		return err
	}
	if !converged && !s.frozen() && len(l.loops) == 1 {
		// Newton's method on the loop pressure did not settle (a loss
		// model with kinks, a unit near zero displacement): bracket the
		// pressure instead, then polish from there.
		var ok bool
		ok, err = s.bracket(r, p)
		if err != nil {
			s.fill(st, *p, r, it, 0)
			return err
		}
		if ok {
			var it2 int
			converged, it2, err = s.iterate(r, p, true, it)
			it = it2
			if err != nil {
				s.fill(st, *p, r, it, 0)
				return err
			}
		}
	}
	if !converged || s.frozen() {
		// The loss directions oscillate: try every combination of the
		// directions of the elements that flipped, each iterated on the
		// loop pressure alone, and keep the first consistent one.
		var locked bool
		converged, locked, it, err = s.enumerate(r, p)
		if err != nil {
			s.fill(st, *p, r, it, 0)
			return err
		}
		if !converged {
			res := s.fill(st, *p, r, it, 1)
			return &ConvergenceError{Iterations: it, Residual: res, SelfLocking: locked}
		}
	}
	// Final loop states at the final pressures.
	lerr := s.evalLoops(true)
	res := s.fill(st, *p, r, it+1, 1)
	if lerr != nil {
		// A limit of the hydrostat (setting, pressure, speed): the state is
		// filled as far as it goes; with a setting limit the flows do not
		// balance and neither does the power.
		return lerr
	}
	if !(res <= balanceTo) {
		return &ConvergenceError{Iterations: it + 1, Residual: res}
	}
	return s.limits()
}

// iterate runs the fixed-point iteration on loss directions (if update is
// set) and loop pressures from iteration it0 on, and reports convergence.
func (s *Solver) iterate(r *rangeDef, p *Point, update bool, it0 int) (bool, int, error) {
	l := s.l
	it := it0
	s.full = false
	s.alpha, s.lastStep = 1, math.Inf(1)
	for j := range s.over {
		s.over[j] = 0
		s.havePrev[j] = false
	}
	s.secant = update
	defer func() { s.secant = false }()
	for ; it < it0+maxIter; it++ {
		if err := s.evalLoops(false); err != nil {
			return false, it, err
		}
		// The torque system, factored once per range and directions
		// (factor.go): no allocation.
		x, err := s.solveSystem(r, p)
		if err != nil {
			return false, it, err
		}
		for i := range s.t {
			s.t[i] = x[i]
		}
		for _, v := range x {
			if bad(v) {
				return false, it, ErrSingular
			}
		}
		copy(s.dpPrev, s.dp)
		delta, step := 0.0, 0.0
		for j, e := range l.loops {
			nd := x[l.nPorts+j] * pScale
			d := math.Abs(nd - s.dp[j])
			if d > dpTolAbs+dpTolRel*math.Abs(nd) {
				delta = maxAbs(delta, d)
			}
			step = maxAbs(step, d/(math.Abs(nd)+pScale))
			// Beyond the relief setting the point is infeasible whatever
			// the iteration would do there: hold the iterate at 1.5 times
			// the relief pressure, and stop when it keeps asking for more.
			el := &l.elems[e]
			if lim := 1.5 * float64(el.lspec.Relief-el.lspec.Charge); lim > 0 && math.Abs(nd) > lim {
				s.over[j]++
				if s.over[j] >= 3 {
					return false, it, s.limitErr(LimitError{Element: el.name, Quantity: "high-line pressure",
						Value: units.Of(units.Pressure(math.Abs(nd)) + el.lspec.Charge), Bound: boundRelief, Limit: units.Of(el.lspec.Relief), Err: ErrInfeasible})
				}
				nd = math.Copysign(lim, nd)
			} else {
				s.over[j] = 0
			}
			s.dp[j] += s.alpha * (nd - s.dp[j])
		}
		// Damp the pressure steps when they stop shrinking (a loss model
		// with kinks can make the Newton steps cycle).
		if it-it0 > 5 && step > 0.7*s.lastStep {
			s.alpha = math.Max(s.alpha/2, 1.0/8)
		}
		// A step below 1e-9 of the pressure and a thousand times smaller
		// than the one before shows a contraction that leaves the next step
		// below dpTolRel: the iterate is settled without one more
		// evaluation of the loops to confirm it.
		settled := delta == 0 || (s.alpha == 1 && step <= 1e-9 && step <= 1e-3*s.lastStep)
		s.lastStep = step
		changed := false
		if update {
			changed = s.directions(it - it0)
		}
		if !changed && settled && it > it0 {
			if s.full {
				return true, it, nil
			}
			// Converged on the factored reference systems: make the last
			// solution exact to rounding (exact), and go on by full LU
			// from here if that changes a loss direction.
			s.full = true
			s.exact(r, p)
			if !update || !s.directions(it-it0) {
				return true, it, nil
			}
		}
	}
	return false, it, nil
}

// exact makes the final port torques of the converged iteration exact to
// rounding when they came from a factored reference system (factor.go).
// Those are accurate relative to the largest torques of the point; exact
// refines the last solution until the correction is negligible for every
// torque, and solves by full LU where a torque is too small for that, so
// that every torque is accurate relative to its own size, as a direct LU
// solution is: a point where almost no power flows (a unit at a setting of
// 1e-16) still has its powers right and its loss directions decided on
// true torques. The pressures keep the iteration's values. After a full LU
// solve there is nothing to do.
func (s *Solver) exact(r *rangeDef, p *Point) {
	if s.last == nil {
		return
	}
	for range maxRefine {
		if s.refine(s.last, p) {
			break
		}
	}
	x := s.x[:len(s.t)]
	// The refinement leaves an error of about eps² times the largest torque
	// (the rounding of the large rows' residuals): a torque below 1e-12 of
	// the largest, non-zero, is solved again by full LU, which keeps the
	// rows of such a near-idle part of the network apart.
	var tmax float64
	for _, v := range x {
		tmax = maxAbs(tmax, v)
	}
	for _, v := range x {
		if v != 0 && math.Abs(v) < 1e-12*tmax {
			s.exactLU(r, p)
			return
		}
	}
	copy(s.t, x)
}

// exactLU solves the last system (at the pressures it was linearised at)
// by full LU for the final port torques.
func (s *Solver) exactLU(r *rangeDef, p *Point) {
	copy(s.dx[:len(s.dp)], s.dp)
	copy(s.dp, s.dpPrev)
	defer copy(s.dp, s.dx[:len(s.dp)])
	if s.assemble(r, p) != nil {
		return
	}
	am := s.a.RawMatrix().Data
	if !sparse.Factor(am, s.n, s.piv, s.iwork) {
		return
	}
	x := s.rhs.RawVector().Data
	sparse.Solve(am, s.n, s.piv, x)
	for _, v := range x {
		if bad(v) {
			return
		}
	}
	copy(s.t, x[:len(s.t)])
}

// maxRefine is the most refinement steps exact takes; each shrinks the
// error by about eps·κ, so a few reach the rounding of the smallest torque
// even when it is 1e-30 of the largest.
const maxRefine = 4

// bracket finds the pressure of the single loop as a zero of
// F(Δp) = Δp' − Δp, Δp' being the pressure the torque system gives with the
// loop linearised at Δp, by a scan over ±1.5 times the relief pressure and
// Brent's method on the sign change nearest zero. With no sign change the
// loop cannot balance the torques the point asks for below the relief
// pressure: a *LimitError.
func (s *Solver) bracket(r *rangeDef, p *Point) (bool, error) {
	l := s.l
	el := &l.elems[l.loops[0]]
	lim := 1.5 * float64(el.lspec.Relief-el.lspec.Charge)
	var ferr error
	f := func(dp float64) float64 {
		s.dp[0] = dp
		if err := s.evalLoops(false); err != nil {
			ferr = err
			return math.NaN()
		}
		x, err := s.solveSystem(r, p)
		if errors.Is(err, ErrSingular) {
			return math.NaN()
		}
		if err != nil {
			ferr = err
			return math.NaN()
		}
		return x[l.nPorts]*pScale - dp
	}
	const n = 32 // scan points per side
	best := -1.0
	var lo, hi float64
	prevX, prevF := 0.0, f(0)
	if ferr != nil {
		return false, ferr
	}
	for side := -1.0; side <= 1; side += 2 {
		px, pf := prevX, prevF
		for k := 1; k <= n; k++ {
			x := side * lim * float64(k) / n
			fx := f(x)
			if ferr != nil {
				return false, ferr
			}
			if !bad(pf) && !bad(fx) && (pf <= 0) != (fx <= 0) {
				if d := math.Min(math.Abs(px), math.Abs(x)); best < 0 || d < best {
					best, lo, hi = d, px, x
				}
				break
			}
			px, pf = x, fx
		}
	}
	noBalance := func() error {
		return s.limitErr(LimitError{Element: el.name, Quantity: "high-line pressure for a torque balance", Value: units.Of(units.Pressure(lim) + el.lspec.Charge),
			Bound: boundRelief, Limit: units.Of(el.lspec.Relief), Err: ErrInfeasible})
	}
	if best < 0 {
		return false, noBalance()
	}
	dp, err := numeric.Brent(f, lo, hi, 0, 200)
	if ferr != nil {
		return false, ferr
	}
	if err != nil {
		return false, noBalance()
	}
	// A sign change through a pole of F (the linearised system turning
	// singular where a unit's torque peaks) is no balance: the loop cannot
	// give the torque the point needs at any pressure.
	if fx := f(dp); ferr != nil || bad(fx) || math.Abs(fx) > 1e-6*math.Max(math.Abs(dp), pScale) {
		return false, noBalance()
	}
	s.dp[0] = dp
	return true, nil
}

// maxFlips is how often an element's loss direction may change before it is
// taken to oscillate.
const maxFlips = 4

// frozen reports whether some element reached maxFlips.
func (s *Solver) frozen() bool {
	for _, f := range s.flip {
		if f >= maxFlips {
			return true
		}
	}
	for _, f := range s.pflip {
		if f >= maxFlips {
			return true
		}
	}
	return false
}

// enumerate tries every combination of directions of the elements that
// flipped at least twice (at most 2^10), iterating the loop pressures with
// the directions fixed, and keeps the first combination whose result is
// consistent with its directions. locked reports that there were directions
// to try and every combination converged but none was consistent.
func (s *Solver) enumerate(r *rangeDef, p *Point) (ok, locked bool, it int, err error) {
	l := s.l
	var cand [10]int // gear index, or -(planet index)-1
	n := 0
	for i, f := range s.flip {
		if f >= 2 && n < len(cand) && l.elems[l.gears[i]].eta < 1 {
			cand[n] = i
			n++
		}
	}
	for i, f := range s.pflip {
		if f >= 2 && n < len(cand) {
			cand[n] = -i - 1
			n++
		}
	}
	total := 0
	locked = n > 0
	for mask := 0; mask < 1<<n; mask++ {
		for k := 0; k < n; k++ {
			bit := mask>>k&1 == 1
			if c := cand[k]; c >= 0 {
				e := &l.elems[l.gears[c]]
				s.gearK[c] = e.eta
				if bit {
					s.gearK[c] = 1 / e.eta
				}
			} else if bit {
				s.pflow[-c-1] = 1
			} else {
				s.pflow[-c-1] = 0
			}
		}
		for j := range s.dp {
			s.dp[j] = 0
		}
		conv, it, err := s.iterate(r, p, false, 0)
		total += it
		if isOwnLimit(err) {
			continue // no pressure within the relief balances this combination
		}
		if err != nil {
			return false, false, total, err
		}
		if !conv && len(l.loops) == 1 {
			found, err := s.bracket(r, p)
			if isOwnLimit(err) {
				continue
			}
			if err != nil {
				return false, false, total, err
			}
			if found {
				conv, it, err = s.iterate(r, p, false, total)
				total = it
				if err != nil && !isOwnLimit(err) {
					return false, false, total, err
				}
			}
		}
		if conv && s.consistent() {
			return true, false, total, nil
		}
		locked = locked && conv
	}
	return false, locked, total, nil
}

// consistent reports whether every gear and planetary set carries power in
// the direction its loss was applied for.
func (s *Solver) consistent() bool {
	l := s.l
	for _, gi := range l.gears {
		e := &l.elems[gi]
		pa := s.t[e.port0] * s.w[e.shafts[0]]
		pb := s.t[e.port0+1] * s.w[e.shafts[1]]
		tol := 1e-12 * (math.Abs(pa) + math.Abs(pb))
		k := s.gearK[e.index]
		if (k < 1 && pa < -tol) || (k > 1 && pb < -tol) {
			return false
		}
	}
	for _, pi := range l.planets {
		e := &l.elems[pi]
		roll := s.t[e.port0] * (s.w[e.shafts[0]] - s.w[e.shafts[2]])
		tol := 1e-12 * math.Abs(s.t[e.port0]) * (math.Abs(s.w[e.shafts[0]]) + math.Abs(s.w[e.shafts[2]]))
		f := s.pflow[e.index]
		if (f == 0 && roll < -tol) || (f == 1 && roll > tol) {
			return false
		}
	}
	return true
}

// unitSpeeds checks each unit's speed against its maximum.
func (s *Solver) unitSpeeds() error {
	u := s.overSpeed()
	if u < 0 {
		return nil
	}
	us := &s.uspeed[u]
	el := &s.l.elems[us.elem]
	ms := el.uspec[us.k].MaxSpeed
	return s.limitErr(LimitError{Element: el.name, Quantity: el.unames[us.k][1], Value: units.Of(units.AngularVelocity(math.Abs(s.w[us.shaft]))),
		Bound: boundSpeed, Limit: units.Of(ms), Err: ErrInfeasible})
}

// overSpeed returns the first unit (an index into s.uspeed) turning faster
// than its rated speed at the speeds in s.w, −1 where none does.
func (s *Solver) overSpeed() int {
	for u := range s.uspeed {
		if us := &s.uspeed[u]; math.Abs(s.w[us.shaft]) > us.lim {
			return u
		}
	}
	return -1
}

// trial evaluates loop j at its pressure s.dp[j] and the point's shaft
// speeds into s.loopA[j] (Loop.Trial of the loop as the point runs it) and
// returns Trial's error.
func (s *Solver) trial(j int) error {
	el := &s.l.elems[s.l.loops[j]]
	for k := range s.mw[j] {
		s.mw[j][k] = units.AngularVelocity(s.w[el.shafts[k+1]])
	}
	return s.loopOf(j).Trial(units.AngularVelocity(s.w[el.shafts[0]]), s.mw[j], units.Pressure(s.dp[j]), &s.loopA[j])
}

// unitSpeed is what unitSpeeds reads of a unit: its shaft, the speed it
// may not exceed (its maximum speed and rounding, +Inf where not rated),
// and where its names are (the loop's element, the unit's place).
type unitSpeed struct {
	shaft, elem, k int
	lim            float64
}

// initUnitSpeeds lists every loop's units for unitSpeeds.
func (s *Solver) initUnitSpeeds() {
	l := s.l
	for _, e := range l.loops {
		el := &l.elems[e]
		for k, sh := range el.shafts {
			lim := math.Inf(1)
			if ms := float64(el.uspec[k].MaxSpeed); ms > 0 {
				lim = ms * (1 + 1e-12)
			}
			s.uspeed = append(s.uspeed, unitSpeed{shaft: sh, elem: e, k: k, lim: lim})
		}
	}
}

// evalLoops evaluates every loop at its pressure (state A) and sets the
// slopes of the unit torques over the pressure (ld): from the last two
// iterates in the main iteration (a secant), or by a finite difference
// from a second evaluation at a slightly different pressure (state B).
// Limit errors are ignored while iterating (the hydrostat fills the state
// even then) and returned when final is set; final sets no slopes.
func (s *Solver) evalLoops(final bool) error {
	l := s.l
	for j, e := range l.loops {
		el := &l.elems[e]
		err := s.trial(j)
		if final && isLimit(err) && s.loopA[j].Limit.Err != nil {
			return s.loopLimit(el.name, &s.loopA[j].Limit)
		}
		if err != nil && (final || !isLimit(err)) {
			return loopErr(el.name, err, &s.loopA[j])
		}
		if final {
			continue
		}
		u0, nk := s.unit0[j], len(el.shafts)
		if s.secant && s.havePrev[j] && s.secantSlopes(j, u0, nk, s.dp[j]) {
			continue
		}
		if s.secant && !s.havePrev[j] && s.idealSlopes(j, u0, nk, s.dp[j]) {
			continue
		}
		dp := s.dp[j]
		h := dStep(dp)
		if dp < 0 {
			h = -h // step away from zero, where the loss terms change sign
		}
		wp := units.AngularVelocity(s.w[el.shafts[0]])
		if err := s.loopOf(j).Trial(wp, s.mw[j], units.Pressure(dp+h), &s.loopB[j]); err != nil && !isLimit(err) {
			return loopErr(el.name, err, &s.loopB[j])
		}
		for k := range nk {
			s.ld[u0+k] = (unitTorque(&s.loopB[j], k) - unitTorque(&s.loopA[j], k)) / h
		}
		s.remember(j, u0, nk, dp)
	}
	return nil
}

// secantSlopes sets the slopes of loop j's units from the last iterate and
// this one, and reports whether it did. The slopes stay as they are when
// the iterates are too close for a secant (near convergence the slope only
// sets the rate); a secant that differs from the slope before by more than
// a factor of two in any unit (a kink of the loss model between the
// iterates) is refused, and the caller takes the finite difference.
func (s *Solver) secantSlopes(j, u0, nk int, dp float64) bool {
	step := dp - s.prevDp[j]
	if math.Abs(step) <= dStep(dp) {
		return true
	}
	for k := range nk {
		d := (unitTorque(&s.loopA[j], k) - s.prevT[u0+k]) / step
		if old := s.ld[u0+k]; bad(d) || d*old <= 0 || math.Abs(d) > 2*math.Abs(old) || 2*math.Abs(d) < math.Abs(old) {
			return false
		}
	}
	for k := range nk {
		s.ld[u0+k] = (unitTorque(&s.loopA[j], k) - s.prevT[u0+k]) / step
	}
	s.remember(j, u0, nk, dp)
	return true
}

// idealSlopes sets the slopes of loop j's units at the start of the main
// iteration to those of the ideal torques at the settings of this iterate,
// ∂T/∂Δp = x·D for the pump and −x·D for each motor (whose pressure is
// −Δp), and reports whether it did: not when a setting is zero or not
// finite, where the finite difference is needed. The loss torques' share
// of the slope enters with the first secant.
func (s *Solver) idealSlopes(j, u0, nk int, dp float64) bool {
	st := &s.loopA[j]
	sp := &s.l.elems[s.l.loops[j]].lspec
	for k := range nk {
		x := st.Settings[k]
		if x == 0 || bad(x) {
			return false
		}
		d := x * float64(sp.Pump.Displacement(1))
		if k > 0 {
			d = -x * float64(sp.Motors[k-1].Displacement(1))
		}
		s.ld[u0+k] = d
	}
	s.remember(j, u0, nk, dp)
	return true
}

// remember keeps loop j's pressure and unit torques for the next secant.
func (s *Solver) remember(j, u0, nk int, dp float64) {
	s.havePrev[j], s.prevDp[j] = true, dp
	for k := range nk {
		s.prevT[u0+k] = unitTorque(&s.loopA[j], k)
	}
}

// loopLimit is the error of a crossed limit of loop name, from the value
// the loop state holds: what loopErr makes of the *hydrostat.LimitError
// that Loop.At would return, both errors taken from the solver's slabs.
func (s *Solver) loopLimit(name string, hl *hydrostat.LimitError) error {
	cause := s.newHydroLimit()
	*cause = *hl
	sent := ErrInfeasible
	if errors.Is(cause, hydrostat.ErrSettingLimit) {
		sent = ErrUnreachable
	}
	return s.limitErr(LimitError{Element: name, Quantity: cause.Quantity, Value: finiteMeasure(cause.Value),
		Bound: cause.Bound, Limit: finiteMeasure(cause.Limit), Err: sent, Cause: cause})
}

// slabSize is the number of errors a slab holds.
const slabSize = 64

// limitErr returns a copy of e from the solver's slab of errors. A map
// whose cells cross limits would otherwise allocate an error per cell, and
// the garbage collector's work on those (tens of thousands per map) costs
// more of the parallel speed-up than anything else. An error from a slab
// is never reused: the slab lives as long as any of its errors.
func (s *Solver) limitErr(e LimitError) *LimitError {
	if s.once {
		s.onceErr = e
		return &s.onceErr
	}
	if len(s.slab) == 0 {
		s.slab = make([]LimitError, slabSize)
	}
	p := &s.slab[0]
	s.slab = s.slab[1:]
	*p = e
	return p
}

// newHydroLimit returns a fresh *hydrostat.LimitError from the solver's slab.
func (s *Solver) newHydroLimit() *hydrostat.LimitError {
	if s.once {
		return &s.onceHydr
	}
	if len(s.hslab) == 0 {
		s.hslab = make([]hydrostat.LimitError, slabSize)
	}
	p := &s.hslab[0]
	s.hslab = s.hslab[1:]
	return p
}

// detach returns err, or a copy of it in fresh storage where it is the
// solver's once error (its cause copied too where that is the solver's):
// an error a map keeps beyond the next solve.
func (s *Solver) detach(err error) error {
	le, ok := err.(*LimitError)
	if !ok || le != &s.onceErr {
		return err
	}
	c := *le
	if hl, ok := c.Cause.(*hydrostat.LimitError); ok && hl == &s.onceHydr {
		h := *hl
		c.Cause = &h
	}
	return &c
}

// isLimit reports whether err is a *hydrostat.LimitError (errors.AsType:
// no allocation, unlike errors.As with a target that escapes) or one of
// the bare limit sentinels that hydrostat.Loop.Trial reports.
func isLimit(err error) bool {
	if err == hydrostat.ErrSettingLimit || err == hydrostat.ErrPressureLimit || err == hydrostat.ErrSpeedLimit {
		return true
	}
	_, ok := errors.AsType[*hydrostat.LimitError](err)
	return ok
}

// isOwnLimit reports whether err is a *LimitError of this package.
func isOwnLimit(err error) bool {
	_, ok := errors.AsType[*LimitError](err)
	return ok
}

func dStep(dp float64) float64 { return 1e-4 * maxAbs(1e5, dp) }

// loopErr turns an error of the hydrostat package into this package's.
// When the schedule found no settings (hydrostat.ErrNoSolution, or
// ErrSettingLimit without a value) the *LimitError carries the largest
// finite setting magnitude the schedule left in st (0 if none is finite),
// never NaN, and its Quantity says that no setting was found.
func loopErr(name string, err error, st *hydrostat.LoopState) error {
	if le, ok := errors.AsType[*hydrostat.LimitError](err); ok {
		sent := ErrInfeasible
		if errors.Is(err, hydrostat.ErrSettingLimit) {
			sent = ErrUnreachable
		}
		return &LimitError{Element: name, Quantity: le.Quantity, Value: finiteMeasure(le.Value), Bound: le.Bound,
			Limit: finiteMeasure(le.Limit), Err: sent, Cause: err}
	}
	if errors.Is(err, hydrostat.ErrSettingLimit) || errors.Is(err, hydrostat.ErrNoSolution) {
		v := 0.0
		if st != nil {
			for _, x := range st.Settings {
				if !bad(x) {
					v = math.Max(v, math.Abs(x))
				}
			}
		}
		return &LimitError{Element: name, Quantity: "setting (none found; value is the last setting tried)", Value: units.Plain(v),
			Bound: boundFull, Limit: units.Plain(1), Err: ErrUnreachable, Cause: err}
	}
	return &LimitError{Element: name, Err: ErrInfeasible, Cause: err}
}

// unitTorque returns the torque of unit k (0 = pump) of loop state st.
func unitTorque(st *hydrostat.LoopState, k int) float64 {
	if k == 0 {
		return float64(st.Pump.Torque)
	}
	return float64(st.Motors[k-1].Torque)
}

// assemble fills the torque system of range r with the current directions
// and loop linearisation into the solver's dense matrix and right-hand side.
func (s *Solver) assemble(r *rangeDef, p *Point) error {
	return s.assembleInto(r, p, s.a.RawMatrix().Data, s.rhs.RawVector().Data, nil)
}

// assembleInto fills a (n × n, row-major) and rhs with the torque system of
// range r with the current directions. With e == nil the loop rows carry
// the current loop linearisation; otherwise they carry e's reference
// linearisation (rhs of the loop rows zero), and the rows of the loop units
// and of the given torques are recorded in e.
func (s *Solver) assembleInto(r *rangeDef, p *Point, a, rhs []float64, e *sysEntry) error {
	l := s.l
	n := s.n
	clear(a[:n*n])
	clear(rhs[:n])
	set := func(i, j int, v float64) { a[i*n+j] = v }
	// Shaft balances: Σ port torques on a shaft = −Σ drag torques on it.
	for i := range l.elems {
		el := &l.elems[i]
		for k, sh := range el.shafts {
			a[sh*n+el.port0+k]++
		}
	}
	if e == nil && s.dragRHS != nil {
		copy(rhs, s.dragRHS)
	}
	if e != nil {
		e.nExt = 0
	}
	row := len(l.shafts)
	for i := range l.elems {
		el := &l.elems[i]
		p0 := el.port0
		switch el.kind {
		case GearKind:
			// r·Tb + k·Ta = 0
			set(row, p0+1, el.ratio)
			set(row, p0, s.gearK[el.index])
			row++
		case PlanetaryKind:
			var kr, kc float64
			switch s.pflow[el.index] {
			case 0:
				kr, kc = el.set.TorqueFactors(planetary.SunDrives)
			case 1:
				kr, kc = el.set.TorqueFactors(planetary.RingDrives)
			default:
				kr = -el.set.FixedCarrierRatio()
				kc = -(1 + kr)
			}
			set(row, p0+1, 1)
			set(row, p0, -kr)
			set(row+1, p0+2, 1)
			set(row+1, p0, -kc)
			row += 2
		case ClutchKind:
			if r.engaged[i] {
				set(row, p0, 1)
				set(row, p0+1, 1)
				row++
			} else {
				set(row, p0, 1)
				set(row+1, p0+1, 1)
				row += 2
			}
		case BrakeKind:
			if !r.engaged[i] {
				set(row, p0, 1)
				row++
			}
		case OutputKind:
			set(row, p0, 1)
			rhs[row] = float64(p.Outputs[el.index].Torque)
			if e != nil {
				e.extRow[e.nExt], e.extSrc[e.nExt] = row, el.index
				e.nExt++
			}
			row++
		case PTOKind:
			set(row, p0, 1)
			if p.PTO != nil {
				rhs[row] = float64(p.PTO[el.index])
			}
			if e != nil {
				e.extRow[e.nExt], e.extSrc[e.nExt] = row, -el.index-1
				e.nExt++
			}
			row++
		case LoopKind:
			j := el.index
			if e == nil {
				if err := s.linearise(j); err != nil {
					return err
				}
			}
			for k := range el.shafts {
				u := s.unit0[j] + k
				set(row, p0+k, 1)
				if e != nil {
					set(row, l.nPorts+j, -e.dref[u]*pScale)
					e.loopRow[u] = row
					row++
					continue
				}
				// T - d·dp = t0 - d·dp0, with dp in units of pScale.
				set(row, l.nPorts+j, -s.ld[u]*pScale)
				rhs[row] = s.lt0[u] - s.ld[u]*s.dp[j]
				row++
			}
			if r.locked {
				// A bypassed loop (locked range): Δp = 0.
				set(row, l.nPorts+j, 1)
				row++
			}
		}
	}
	return nil
}

// linearise takes the torque t0 of every unit of loop j at the loop's
// pressure from its state; the slopes d = ∂T/∂Δp were set by evalLoops.
func (s *Solver) linearise(j int) error {
	el := &s.l.elems[s.l.loops[j]]
	for k := range el.shafts {
		u := s.unit0[j] + k
		t0 := unitTorque(&s.loopA[j], k)
		if bad(t0) || bad(s.ld[u]) {
			return &LimitError{Element: el.name, Err: ErrInfeasible, Cause: errUnitTorque}
		}
		s.lt0[u] = t0
	}
	return nil
}

// finiteOr returns v, or alt when v is NaN or infinite: a public error
// value never carries NaN.
func finiteOr(v, alt float64) float64 {
	if bad(v) {
		return alt
	}
	return v
}

// directions updates gear and planetary loss directions from the current
// torques and speeds and reports whether any changed. An element that keeps
// flipping is frozen (its power is then near zero and the loss is zero
// either way).
func (s *Solver) directions(it int) bool {
	l := s.l
	changed := false
	for _, gi := range l.gears {
		e := &l.elems[gi]
		pa := s.t[e.port0] * s.w[e.shafts[0]]
		pb := s.t[e.port0+1] * s.w[e.shafts[1]]
		scale := math.Abs(pa) + math.Abs(pb)
		k := s.gearK[e.index]
		switch {
		case scale == 0 || e.eta == 1:
			// no power or lossless: either way
			if it == 0 && e.eta == 1 {
				k = 1
			}
		case pa > 1e-13*scale:
			k = e.eta
		case pb > 1e-13*scale:
			k = 1 / e.eta
		}
		if k != s.gearK[e.index] {
			if s.flip[e.index] < maxFlips {
				s.gearK[e.index] = k
				s.flip[e.index]++
				changed = true
			}
		}
	}
	for _, pi := range l.planets {
		e := &l.elems[pi]
		f := s.planetFlow(&s.ec[pi], 0, false)
		if f != s.pflow[e.index] {
			if s.pflip[e.index] < maxFlips {
				s.pflow[e.index] = f
				s.pflip[e.index]++
				changed = true
			}
		}
	}
	return changed
}

// finiteMeasure returns m with a NaN or infinite value replaced by 0.
func finiteMeasure(m units.Measure) units.Measure {
	m.SI = finiteOr(m.SI, 0)
	return m
}

// errUnitTorque is the cause of a loop whose unit torque or its slope is
// not finite at a point.
var errUnitTorque = errors.New("unit torque not finite at this point")
