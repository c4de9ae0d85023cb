package powersplit

import (
	"errors"
	"io"
	"iter"
	"math"
	"runtime"
	"slices"
	"strconv"
	"sync"
	"sync/atomic"
	"unicode"
	"unicode/utf8"
	"weak"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// Cell is the result at one grid point of a sweep or map, as Sweep.At and
// Map.At build it from the result's compact storage.
type Cell struct {
	OK  bool  // the point solved and is feasible
	Err error // why not, when !OK (a *RangesError when the spec's Range is Auto and every range failed)
	// Range is the range solved in (the best one when the spec's Range is
	// Auto); Auto when Auto found no feasible range.
	Range int

	OutputSpeed    units.AngularVelocity
	OutputTorque   units.Torque
	InputTorque    units.Torque
	InputPower     units.Power
	OutputPower    units.Power
	Loss           units.Power
	Efficiency     float64
	HydraulicShare float64
	// The first loop's state: its pressure difference, high-line pressure,
	// pump and first motor speeds and settings.
	Pressure     units.Pressure
	HighPressure units.Pressure
	PumpSpeed    units.AngularVelocity
	MotorSpeed   units.AngularVelocity
	PumpSetting  float64
	MotorSetting float64
	// Binding is the margin with the least room left relative to its
	// limit (the limit nearest to being crossed, State.Binding); zero
	// without a loop.
	Binding Margin
}

// Auto as a spec's Range means: the best feasible range by the spec's Policy.
const Auto = -1

// SweepSpec describes a sweep over output speed.
type SweepSpec struct {
	Design string // the design's name, written in every CSV row; may be empty
	Range  int    // range index, or Auto
	Policy Policy // for Auto; nil means HighestEfficiency
	Input  units.AngularVelocity
	// From, To and Steps (≥ 2) give the output speeds, evenly spaced. Every
	// output of the layout gets the swept speed.
	From, To units.AngularVelocity
	Steps    int
	// Torque is the first output's torque; other outputs carry none. When
	// Power is non-zero instead, the output torque at each speed is found so
	// that the engine delivers Power.
	Torque  units.Torque
	Power   units.Power
	PTO     []units.Torque
	Workers int // parallel workers; 0 means GOMAXPROCS
	// Progress, when not nil, is called as the points complete, after each
	// block of 16 to 128 points (about a 256th of the sweep), with the number
	// done so far and the total; the calls are serialised, done increases
	// and the last call has done = total.
	Progress func(done, total int)
}

// Sweep is the result of Layout.Sweep: one cell per output speed, read
// with At or Cells.
type Sweep struct {
	Design     string                // the spec's Design
	Input      units.AngularVelocity // the spec's input speed
	RangeNames []string              // the layout's range names, by Cell.Range
	Speeds     []units.AngularVelocity
	res        results
}

// At returns the cell at Speeds[i]. It panics if i is out of range.
func (s Sweep) At(i int) Cell {
	if i < 0 || i >= s.res.n {
		panic("powersplit: Sweep.At index out of range")
	}
	return s.res.at(i)
}

// Cells returns the sweep's cells in order of speed, with their index.
func (s Sweep) Cells() iter.Seq2[int, Cell] {
	return func(yield func(int, Cell) bool) {
		for i := range s.res.n {
			if !yield(i, s.res.at(i)) {
				return
			}
		}
	}
}

// MapSpec describes a 2-D map over output speed × output torque.
type MapSpec struct {
	Design               string // the design's name, written in every CSV row; may be empty
	Range                int
	Policy               Policy
	Input                units.AngularVelocity
	SpeedFrom, SpeedTo   units.AngularVelocity
	SpeedSteps           int // ≥ 2
	TorqueFrom, TorqueTo units.Torque
	TorqueSteps          int // ≥ 2; SpeedSteps × TorqueSteps ≤ 2^30
	PTO                  []units.Torque
	Workers              int // parallel workers; 0 means GOMAXPROCS
	// Progress, when not nil, is called as the cells complete, after each
	// block of 16 to 128 cells (about a 256th of the map), with the number
	// done so far and the total; the calls are serialised, done increases
	// and the last call has done = total.
	Progress func(done, total int)
}

// Map is the result of Layout.Map: the cell at Torques[i], Speeds[j] is
// At(i, j).
type Map struct {
	Design     string                // the spec's Design
	Input      units.AngularVelocity // the spec's input speed
	RangeNames []string              // the layout's range names, by Cell.Range
	Speeds     []units.AngularVelocity
	Torques    []units.Torque
	res        results // torque-major
}

// At returns the cell at Torques[i], Speeds[j]. It panics if i or j is out
// of range.
func (m Map) At(i, j int) Cell {
	if i < 0 || i >= len(m.Torques) || j < 0 || j >= len(m.Speeds) || m.res.n != len(m.Torques)*len(m.Speeds) {
		panic("powersplit: Map.At index out of range")
	}
	return m.res.at(i*len(m.Speeds) + j)
}

// Feasible returns the feasibility mask: mask[i][j] is At(i, j).OK.
func (m Map) Feasible() [][]bool {
	nv := len(m.Speeds)
	if m.res.n != len(m.Torques)*nv {
		return nil
	}
	flat := make([]bool, m.res.n)
	for k := range flat {
		c, _ := m.res.cell(k)
		flat[k] = !c.failed()
	}
	mask := make([][]bool, len(m.Torques))
	for i := range mask {
		mask[i] = flat[i*nv : (i+1)*nv : (i+1)*nv]
	}
	return mask
}

// results holds the cells of a sweep or map compactly: the numbers of every
// cell in slices without pointers, which the garbage collector never scans,
// and the few things with pointers in side tables, the errors of the failed
// cells and the names of the binding margins. The cells are stored in the
// blocks the workers solved them in, each block's cells a piece of one
// slice allocated before the workers start, with the errors of its cells:
// with a block allocated by each worker as it went, a map's allocations
// ran the garbage collector while the workers solved (a map of 200 × 200
// took about 4 % longer on two cores, and two cores gained 1.68× over one
// at the median of ten runs against 1.79× with the one slice), and one
// list of errors took a pass over the cells after them.
type results struct {
	n      int          // cells
	size   int          // cells per block (the last may have fewer)
	blocks []block      // cell k is blocks[k/size].cells[k%size]
	binds  []marginName // binds[c.aux-1] names OK cell c's binding margin
	speeds []float64    // cell k's output speed is speeds[k%len(speeds)]
}

// A block holds consecutive cells and the errors of those that failed:
// most of them limit errors kept as numbers in the cell and names in the
// block's table of shapes, rebuilt when read, so that a map does not keep
// the solver's error values (two per failed cell, with pointers) for the
// collector to trace; any other error kept as it is.
type block struct {
	cells  []cell
	errs   []error      // errs[c.aux&index] is why failed cell c failed, without errShape
	shapes []limitShape // shapes[c.aux&index] is failed cell c's error, with errShape
}

// cell returns cell k and its block.
func (r *results) cell(k int) (*cell, *block) {
	b := &r.blocks[k/r.size]
	return &b.cells[k%r.size], b
}

// cell is one Cell as results stores it: 120 bytes. The output speed is
// the result's axis, the binding margin's limit and names are in the
// result's table. A failed cell keeps only its range and output torque,
// and for a limit error of known shape the error's value and limit in
// inTorque and inPower, its cause's in outPower and loss.
type cell struct {
	outTorque, inTorque, inPower, outPower, loss float64
	eff, share, dp, high, pumpW, motorW, xp, xm  float64
	bindValue                                    float64
	rng                                          int32
	// aux is, for an OK cell, the index (+1) of its binding margin's names
	// in results.binds (0: none); for a failed cell, failedBit, errShape
	// for an error kept as numbers, and the index of the error or its shape
	// in its block.
	aux uint32
}

const (
	failedBit = 1 << 31
	errShape  = 1 << 30
	index     = errShape - 1
)

// failed reports whether the cell did not solve.
func (c *cell) failed() bool { return c.aux&failedBit != 0 }

// marginName is what a binding Margin holds besides its value (its limit
// as bits, so that names compare with ==).
type marginName struct {
	element, quantity, bound string
	limit                    uint64
	kind                     units.Kind
	unchecked                bool
}

func newMarginName(element, quantity, bound string, limit float64, kind units.Kind, unchecked bool) marginName {
	return marginName{element, quantity, bound, math.Float64bits(limit), kind, unchecked}
}

// at builds the Cell of cells[k].
func (r *results) at(k int) Cell {
	c, b := r.cell(k)
	speed := units.AngularVelocity(r.speeds[k%len(r.speeds)])
	if c.failed() {
		out := Cell{Range: int(c.rng), OutputSpeed: speed, OutputTorque: units.Torque(c.outTorque)}
		if c.aux&errShape != 0 {
			out.Err = b.shapes[c.aux&index].rebuild(c)
		} else {
			out.Err = b.errs[c.aux&index]
		}
		return out
	}
	out := Cell{OK: true, Range: int(c.rng), OutputSpeed: speed, OutputTorque: units.Torque(c.outTorque),
		InputTorque: units.Torque(c.inTorque), InputPower: units.Power(c.inPower), OutputPower: units.Power(c.outPower),
		Loss: units.Power(c.loss), Efficiency: c.eff, HydraulicShare: c.share,
		Pressure: units.Pressure(c.dp), HighPressure: units.Pressure(c.high),
		PumpSpeed: units.AngularVelocity(c.pumpW), MotorSpeed: units.AngularVelocity(c.motorW),
		PumpSetting: c.xp, MotorSetting: c.xm}
	if c.aux != 0 {
		n := &r.binds[c.aux-1]
		out.Binding = Margin{Element: n.element, Quantity: n.quantity, Bound: n.bound, Unchecked: n.unchecked,
			Value: measure(c.bindValue, n.kind), Limit: measure(math.Float64frombits(n.limit), n.kind)}
	}
	return out
}

// marginNames lists the names of every margin the solver can find binding
// on layout l (those of Solver.margins, in its order): the per-map table
// the cells index, fixed before the run so that the indices do not depend
// on the order the workers meet the margins in.
func marginNames(l *layout) []marginName {
	const w, pa = units.AngularVelocityKind, units.PressureKind
	var out []marginName
	for i := range l.ranges {
		if r := &l.ranges[i]; r.maxOut > 0 {
			out = append(out, newMarginName(r.name, "output speed", boundRangeSpeed, r.maxOut, w, false))
		}
	}
	for _, e := range l.loops {
		el := &l.elems[e]
		out = append(out, newMarginName(el.name, "high-line pressure", boundRelief, float64(el.lspec.Relief), pa, el.lspec.Relief <= 0))
		for k := range el.shafts {
			us := &el.uspec[k]
			out = append(out,
				newMarginName(el.name, el.unames[k][0], boundPeak, float64(us.PeakPressure), pa, us.PeakPressure <= 0),
				newMarginName(el.name, el.unames[k][1], boundSpeed, float64(us.MaxSpeed), w, us.MaxSpeed <= 0),
				newMarginName(el.name, el.unames[k][2], boundFull, 1, units.Number, false))
		}
	}
	return out
}

// A worker solves cells with its own solver, state and point.
type worker struct {
	s     *Solver
	st    State
	q     Point
	binds []marginName // the run's table, shared and read-only
	last  uint32       // the index (+1) of the last binding margin found
	// extra lists binding margins missing from binds (none unless
	// marginNames misses one of Solver.margins), shared under mu.
	extra  *extraNames
	errs   []error      // the errors of the block being solved, without errShape
	shapes []limitShape // the shapes of its limit errors
}

// limitShape is a *LimitError (and its *hydrostat.LimitError cause, if any)
// without its numbers.
type limitShape struct {
	element, quantity, bound string
	valueKind, limitKind     units.Kind
	err                      error // ErrInfeasible or ErrUnreachable
	cause                    bool
	cQuantity, cBound        string
	cValueKind, cLimitKind   units.Kind
	cErr                     error // one of hydrostat's sentinels, or nil
}

// hydroSentinels are the errors a *hydrostat.LimitError's Err may be for
// its shape to be kept (sentinels compare by pointer).
var hydroSentinels = []error{nil, hydrostat.ErrInvalid, hydrostat.ErrLimit, hydrostat.ErrPressureLimit, hydrostat.ErrSpeedLimit,
	hydrostat.ErrSettingLimit, hydrostat.ErrNoSolution, hydrostat.ErrModel, hydrostat.ErrUndetermined, hydrostat.ErrOutsideMap}

// keep records the error of failed cell c in the worker's block and
// returns the cell's aux: a *LimitError of the solver's (sentinel Err, no
// cause or a *hydrostat.LimitError with a sentinel Err) as numbers in c and
// a shape, any other error as it is.
func (w *worker) keep(err error, c *cell) uint32 {
	if le, ok := err.(*LimitError); ok && (le.Err == ErrInfeasible || le.Err == ErrUnreachable) {
		sh := limitShape{element: le.Element, quantity: le.Quantity, bound: le.Bound,
			valueKind: le.Value.Kind, limitKind: le.Limit.Kind, err: le.Err}
		ok := le.Cause == nil
		if hl, isHydro := le.Cause.(*hydrostat.LimitError); isHydro && slices.Contains(hydroSentinels, hl.Err) {
			ok, sh.cause = true, true
			sh.cQuantity, sh.cBound, sh.cValueKind, sh.cLimitKind, sh.cErr = hl.Quantity, hl.Bound, hl.Value.Kind, hl.Limit.Kind, hl.Err
			c.outPower, c.loss = hl.Value.SI, hl.Limit.SI
		}
		if ok {
			c.inTorque, c.inPower = le.Value.SI, le.Limit.SI
			i := slices.Index(w.shapes, sh)
			if i < 0 {
				i = len(w.shapes)
				w.shapes = append(w.shapes, sh)
			}
			return failedBit | errShape | uint32(i)
		}
	}
	w.errs = append(w.errs, w.s.detach(err))
	return failedBit | uint32(len(w.errs)-1)
}

// rebuild returns the error of failed cell c of this shape.
func (sh *limitShape) rebuild(c *cell) error {
	le := &LimitError{Element: sh.element, Quantity: sh.quantity, Value: measure(c.inTorque, sh.valueKind), Bound: sh.bound,
		Limit: measure(c.inPower, sh.limitKind), Err: sh.err}
	if sh.cause {
		le.Cause = &hydrostat.LimitError{Quantity: sh.cQuantity, Value: measure(c.outPower, sh.cValueKind), Bound: sh.cBound,
			Limit: measure(c.loss, sh.cLimitKind), Err: sh.cErr}
	}
	return le
}

type extraNames struct {
	mu    sync.Mutex
	names []marginName
}

// bindIndex returns the index (+1) of m's names in the run's table, 0 for
// the zero Margin.
func (w *worker) bindIndex(m *Margin) uint32 {
	if m.Element == "" && m.Quantity == "" && m.Bound == "" {
		return 0
	}
	n := newMarginName(m.Element, m.Quantity, m.Bound, m.Limit.SI, m.Value.Kind, m.Unchecked)
	if w.last != 0 && w.last <= uint32(len(w.binds)) && w.binds[w.last-1] == n {
		return w.last
	}
	for i := range w.binds {
		if w.binds[i] == n {
			w.last = uint32(i + 1)
			return w.last
		}
	}
	x := w.extra
	x.mu.Lock()
	defer x.mu.Unlock()
	k := slices.Index(x.names, n)
	if k < 0 {
		k = len(x.names)
		x.names = append(x.names, n)
	}
	return uint32(len(w.binds) + k + 1)
}

// workerPools keeps the idle workers of small sweeps and maps (at most
// poolCells cells) per layout, each with its Solver and State: a Solver
// takes 150 µs and 270 kB to build for the benchmark layout, as long as
// solving 200 of its points, and a sweep of a few points was mostly that.
// A worker's results do not depend on the points it solved before. The key
// is a weak pointer and the entry goes when its layout is collected, which
// the pooled workers (they refer to it) do not hold up for long: the
// collector empties a sync.Pool within two cycles.
//
// A large run builds its workers afresh, each on the goroutine that uses
// it, where the Solver costs about 1 % of the run: in BenchmarkMapSpeedup a
// 200 × 200 map on 2 cores ran about 10 % slower on pooled workers than on
// fresh ones (medians of 120 rounds each, 439 and 398 ns a point), though
// faster in BenchmarkMapVsGeneral (348 and 380). The likely cause, not
// verified: solvers built one after the other on one core (as the 1-core
// maps build them) share cache lines between their small slices.
var workerPools sync.Map // weak.Pointer[layout] → *sync.Pool of *worker

// poolCells is the largest run whose workers come from the pool.
const poolCells = 8192

// getWorker returns an idle worker of l's pool (when pooled) or a new one.
// Each worker is its own allocation, so that one worker's writes to its
// State never share a cache line with another's.
func (l Layout) getWorker(pooled bool) *worker {
	if !pooled {
		return l.newWorker()
	}
	if w, _ := l.workerPool().Get().(*worker); w != nil {
		return w
	}
	return l.newWorker()
}

func (l Layout) newWorker() *worker {
	w := &worker{s: NewSolver(l)}
	w.st = State{Brief: !w.s.general} // a cell needs the summary only
	return w
}

// putWorker returns w to l's pool, without the references of its run.
func (l Layout) putWorker(w *worker) {
	w.q.PTO, w.binds, w.extra = nil, nil, nil
	clear(w.errs)
	clear(w.shapes)
	l.workerPool().Put(w)
}

func (l Layout) workerPool() *sync.Pool {
	key := weak.Make(l.l)
	if p, ok := workerPools.Load(key); ok {
		return p.(*sync.Pool)
	}
	p, loaded := workerPools.LoadOrStore(key, &sync.Pool{})
	if !loaded {
		runtime.AddCleanup(l.l, func(k weak.Pointer[layout]) { workerPools.Delete(k) }, key)
	}
	return p.(*sync.Pool)
}

// job solves cell k into c and returns its error (nil when it is OK).
type job func(w *worker, k int, c *cell) error

// blockSize returns the number of consecutive cells a worker takes at a
// time out of n: about n/256, so that the workers share the
// load evenly to the end, but at least 16, so that they rarely meet on the
// shared counter, and at most 128 (18 KiB). It depends on n only, never on
// the number of workers, so the stored result does not either.
func blockSize(n int) int { return min(128, max(16, n/256)) }

// maxCells bounds the cells of a map (the cells' indices are 32-bit).
const maxCells = 1 << 30

// run solves n cells in blocks of consecutive cells on workers goroutines,
// each with its own Solver, into compact cells. Results depend only on the
// cell, never on the order or the worker, so they are deterministic (and
// identical for any number of workers): the table of margin names is fixed
// before the run and the errors are listed by block in order of the cells.
func (l Layout) run(n, workers int, progress func(int, int), p Point, f job) results {
	size := blockSize(n)
	nblocks := (n + size - 1) / size
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, nblocks))
	pooled := n <= poolCells
	res := results{n: n, size: size, blocks: make([]block, nblocks), binds: marginNames(l.l)}
	all := make([]cell, n)
	extra := &extraNames{}
	var next atomic.Int64
	var mu sync.Mutex
	done := 0
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			w := l.getWorker(pooled)
			if pooled {
				defer l.putWorker(w)
			}
			outs := w.q.Outputs
			w.q = p
			w.q.Outputs = append(outs[:0], p.Outputs...)
			w.binds, w.extra, w.last = res.binds, extra, 0
			for {
				r := int(next.Add(1)) - 1
				if r >= nblocks {
					return
				}
				k0, k1 := r*size, min((r+1)*size, n)
				cs := all[k0:k1:k1]
				w.errs, w.shapes = w.errs[:0], w.shapes[:0]
				for k := range cs {
					if err := f(w, k0+k, &cs[k]); err != nil {
						cs[k].aux = w.keep(err, &cs[k])
					}
				}
				res.blocks[r] = block{cells: cs, errs: slices.Clip(slices.Clone(w.errs)), shapes: slices.Clip(slices.Clone(w.shapes))}
				clear(w.errs) // drop the references
				clear(w.shapes)
				if progress != nil {
					mu.Lock()
					done += k1 - k0
					progress(done, n)
					mu.Unlock()
				}
			}
		})
	}
	wg.Wait()
	if len(extra.names) > 0 {
		res.binds = canonicalBinds(res, len(res.binds), extra.names)
	}
	return res
}

// canonicalBinds appends the margin names the workers added during the run
// to the table in order of the first cell binding on each (the workers'
// order depends on their timing) and renumbers the cells to match.
func canonicalBinds(res results, fixed int, extra []marginName) []marginName {
	renum := make([]uint32, len(extra))
	binds := res.binds
	for k := range res.n {
		c, _ := res.cell(k)
		if c.failed() || int(c.aux) <= fixed {
			continue
		}
		x := int(c.aux) - fixed - 1
		if renum[x] == 0 {
			binds = append(binds, extra[x])
			renum[x] = uint32(len(binds))
		}
		c.aux = renum[x]
	}
	return binds
}

// Reason is why the cell failed (its error's text), or "" when it solved.
// The text is built on call, so a map of infeasible cells costs no strings.
func (c Cell) Reason() string {
	if c.Err == nil {
		return ""
	}
	return c.Err.Error()
}

// solveCell solves w.q in range rg (or Auto) into c and returns the error.
// A failed cell keeps the range the solver reports and the demanded speed
// and torque; its other numbers are zero.
func solveCell(w *worker, rg int, pol Policy, c *cell) error {
	s, st, q := w.s, &w.st, &w.q
	var err error
	if rg == Auto {
		err = s.Best(*q, pol, st)
	} else {
		q.Range = rg
		err = s.Solve(*q, st)
	}
	return cellOf(w, q, st, err, c)
}

// solveCellOnce is solveCell for a cell whose error the caller reads
// before the worker's next solve (keep): the solver writes a limit into
// its own two errors rather than fresh ones, the garbage of the failed
// cells of a map (a fifth of the benchmark map's, a quarter of its bytes)
// left out. Best keeps the errors of several solves and takes solveCell.
func solveCellOnce(w *worker, rg int, pol Policy, c *cell) error {
	if rg == Auto {
		return solveCell(w, rg, pol, c)
	}
	s, st, q := w.s, &w.st, &w.q
	q.Range = rg
	s.once = true
	err := s.Solve(*q, st)
	s.once = false
	return cellOf(w, q, st, err, c)
}

// cellOf writes the cell of point q, solved into st with error err.
func cellOf(w *worker, q *Point, st *State, err error, c *cell) error {
	if err != nil {
		*c = cell{rng: int32(st.Range), outTorque: float64(q.Outputs[0].Torque)}
		return err
	}
	*c = cell{rng: int32(st.Range), outTorque: float64(st.Outputs[0].Torque),
		inTorque: float64(st.InputTorque), inPower: float64(st.InputPower), outPower: float64(st.OutputPower),
		loss: float64(st.Loss), eff: st.Efficiency, share: st.HydraulicShare}
	if len(st.Loops) > 0 {
		lp := &st.Loops[0]
		c.dp, c.high = float64(lp.Pressure), float64(lp.High)
		c.xp, c.pumpW = lp.Pump.Setting, float64(lp.Pump.Speed)
		if len(lp.Motors) > 0 {
			c.xm, c.motorW = lp.Motors[0].Setting, float64(lp.Motors[0].Speed)
		}
	}
	if c.aux = w.bindIndex(&st.Binding); c.aux != 0 {
		c.bindValue = st.Binding.Value.SI
	}
	return nil
}

func (l Layout) point(in units.AngularVelocity, pto []units.Torque) Point {
	return Point{Input: in, Outputs: make([]OutputDemand, len(l.l.outputs)), PTO: pto}
}

// Sweep solves the layout over output speed at the given input speed and
// either output torque or input power, in parallel. Cells that fail carry
// the reason; the error return is for a bad spec only.
func (l Layout) Sweep(spec SweepSpec) (Sweep, error) {
	if err := l.checkSpec(spec.Range, spec.Input, spec.PTO); err != nil {
		return Sweep{}, err
	}
	if err := checkAxis("Sweep speed", units.Of(spec.From), units.Of(spec.To), spec.Steps); err != nil {
		return Sweep{}, err
	}
	if bad(float64(spec.Torque)) {
		return Sweep{}, &InputError{Field: "Torque", Value: units.Of(spec.Torque), Reason: "not finite"}
	}
	if bad(float64(spec.Power)) {
		return Sweep{}, &InputError{Field: "Power", Value: units.Of(spec.Power), Reason: "not finite"}
	}
	vs := axis(float64(spec.From), float64(spec.To), spec.Steps)
	p := l.point(spec.Input, spec.PTO)
	res := l.run(len(vs), spec.Workers, spec.Progress, p, func(w *worker, k int, c *cell) error {
		q := &w.q
		for o := range q.Outputs {
			q.Outputs[o] = OutputDemand{Speed: units.AngularVelocity(vs[k])}
		}
		if spec.Power == 0 {
			q.Outputs[0].Torque = spec.Torque
			return solveCellOnce(w, spec.Range, spec.Policy, c)
		}
		return powerCell(w, spec.Range, spec.Policy, float64(spec.Power), c)
	})
	res.speeds = vs
	out := Sweep{Design: spec.Design, Input: spec.Input, RangeNames: l.rangeNames(),
		Speeds: make([]units.AngularVelocity, len(vs)), res: res}
	for i, v := range vs {
		out.Speeds[i] = units.AngularVelocity(v)
	}
	return out, nil
}

// powerCell finds the output torque at which the engine delivers power P
// (secant iteration on the output torque; input power is close to affine in
// it) and writes that point into c.
func powerCell(w *worker, rg int, pol Policy, P float64, c *cell) error {
	q := &w.q
	pin := func(t float64) (float64, error) {
		q.Outputs[0].Torque = units.Torque(t)
		err := solveCell(w, rg, pol, c)
		return c.inPower, err
	}
	speed := q.Outputs[0].Speed
	wo := math.Abs(float64(speed))
	t0 := 0.0
	t1 := 0.8 * P / math.Max(wo, 0.05*math.Abs(float64(q.Input)))
	if float64(speed) < 0 {
		t1 = -t1
	}
	f0, err := pin(t0)
	if err != nil {
		return err
	}
	// lim is the last limit met on the way: when the power is not reached,
	// it is what stopped the search.
	var lim error
	for k := 0; k < 40; k++ {
		f1, err := pin(t1)
		if err != nil {
			if errors.Is(err, ErrInfeasible) {
				lim = err
			}
			// Step back towards the last good torque.
			t1 = (t0 + t1) / 2
			continue
		}
		if math.Abs(f1-P) <= 1e-9*math.Abs(P) {
			return nil
		}
		if f1 == f0 {
			break
		}
		t0, t1, f0 = t1, t1-(f1-P)*(t1-t0)/(f1-f0), f1
		if bad(t1) {
			break
		}
	}
	*c = cell{rng: int32(rg)}
	if lim != nil {
		return &PowerError{Power: units.Power(P), Err: lim}
	}
	return &PowerError{Power: units.Power(P), Err: ErrUnreachable}
}

// PowerError reports that a power sweep's cell could not draw the demanded
// input power: Err is the limit that stopped it (a *LimitError or
// *RangesError, classed as ErrInfeasible), or ErrUnreachable when the
// search found no torque without meeting a limit.
type PowerError struct {
	Power units.Power // the demanded input power
	Err   error
}

// Error returns "input power <P> not reached: <cause>".
func (e *PowerError) Error() string {
	return "powersplit: input power " + e.Power.String() + " not reached: " + e.Err.Error()
}

// Unwrap returns the cause.
func (e *PowerError) Unwrap() error { return e.Err }

// Map solves the layout over the grid output speed × output torque at the
// given input speed, in parallel.
func (l Layout) Map(spec MapSpec) (Map, error) {
	if err := l.checkSpec(spec.Range, spec.Input, spec.PTO); err != nil {
		return Map{}, err
	}
	if err := checkAxis("Map speed", units.Of(spec.SpeedFrom), units.Of(spec.SpeedTo), spec.SpeedSteps); err != nil {
		return Map{}, err
	}
	if err := checkAxis("Map torque", units.Of(spec.TorqueFrom), units.Of(spec.TorqueTo), spec.TorqueSteps); err != nil {
		return Map{}, err
	}
	if n := spec.SpeedSteps * spec.TorqueSteps; n > maxCells {
		return Map{}, &InputError{Field: "Map cells", Value: units.Plain(float64(n)), Reason: "at most 2^30 cells (speed steps × torque steps)"}
	}
	vs := axis(float64(spec.SpeedFrom), float64(spec.SpeedTo), spec.SpeedSteps)
	ts := axis(float64(spec.TorqueFrom), float64(spec.TorqueTo), spec.TorqueSteps)
	nv := len(vs)
	p := l.point(spec.Input, spec.PTO)
	res := l.run(nv*len(ts), spec.Workers, spec.Progress, p, func(w *worker, k int, c *cell) error {
		q := &w.q
		i, j := k/nv, k%nv
		for o := range q.Outputs {
			q.Outputs[o] = OutputDemand{Speed: units.AngularVelocity(vs[j])}
		}
		q.Outputs[0].Torque = units.Torque(ts[i])
		return solveCellOnce(w, spec.Range, spec.Policy, c)
	})
	res.speeds = vs
	m := Map{Design: spec.Design, Input: spec.Input, RangeNames: l.rangeNames(),
		Speeds: make([]units.AngularVelocity, nv), Torques: make([]units.Torque, len(ts)), res: res}
	for j, v := range vs {
		m.Speeds[j] = units.AngularVelocity(v)
	}
	for i, t := range ts {
		m.Torques[i] = units.Torque(t)
	}
	return m, nil
}

func (l Layout) checkSpec(rg int, in units.AngularVelocity, pto []units.Torque) error {
	if l.l == nil {
		return &LayoutError{Reason: "zero Layout", Err: ErrLayout}
	}
	if rg != Auto && (rg < 0 || rg >= len(l.l.ranges)) {
		return &InputError{Field: "Range", Value: units.Plain(float64(rg)), Reason: "no such range"}
	}
	if err := checkInput(in); err != nil {
		return err
	}
	if pto != nil && len(pto) != len(l.l.ptos) {
		return &InputError{Field: "len(PTO)", Value: units.Plain(float64(len(pto))), Reason: "one torque per PTO, or nil"}
	}
	return nil
}

func axis(from, to float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = from + (to-from)*float64(i)/float64(n-1)
	}
	out[n-1] = to
	return out
}

func checkAxis(field string, from, to units.Measure, n int) error {
	if bad(from.SI) {
		return &InputError{Field: field, Value: from, Reason: "not finite"}
	}
	if bad(to.SI) {
		return &InputError{Field: field, Value: to, Reason: "not finite"}
	}
	if n < 2 || n > 1<<20 {
		return &InputError{Field: field + " steps", Value: units.Plain(float64(n)), Reason: "need 2 to 2^20 steps"}
	}
	return nil
}

// CSVHeader is the header row of Sweep.WriteCSV and Map.WriteCSV: every
// column names its quantity and its unit (pct for fractions in percent).
// Settings are the displacement over its maximum; binding_limit names the
// margin nearest its limit and binding_left_pct the room left in percent of
// that limit.
var CSVHeader = []string{"design", "input_speed_rpm", "output_speed_rpm", "output_torque_Nm", "feasible", "range",
	"input_torque_Nm", "input_power_kW", "output_power_kW", "loss_kW", "efficiency_pct", "hydraulic_share_pct",
	"loop_pressure_bar", "high_pressure_bar", "pump_speed_rpm", "motor_speed_rpm", "pump_setting_pct",
	"motor_setting_pct", "binding_limit", "binding_left_pct", "reason"}

// WriteCSV writes the sweep as CSV: the header CSVHeader, then one row per
// speed. Infeasible rows carry the reason and leave the results empty.
func (s Sweep) WriteCSV(w io.Writer) error {
	return writeCells(w, s.Design, s.Input, s.RangeNames, &s.res)
}

// WriteCSV writes the map as CSV in long form: the header CSVHeader, then
// one row per cell, torque-major.
func (m Map) WriteCSV(w io.Writer) error {
	return writeCells(w, m.Design, m.Input, m.RangeNames, &m.res)
}

// writeCells writes the CSV of res (encoding/csv's format: quotes only
// where a field needs them, "\n" line ends) straight into one reused
// buffer: a map writes 40 000 rows of 21 fields, and strings for them cost
// several times the map's own solving.
func writeCells(w io.Writer, design string, in units.AngularVelocity, names []string, res *results) error {
	b := make([]byte, 0, 64<<10)
	for i, h := range CSVHeader {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendCSVField(b, h)
	}
	b = append(b, '\n')
	f := func(b []byte, v float64) []byte { return append(strconv.AppendFloat(b, v, 'g', 10, 64), ',') }
	head := append(appendCSVField(nil, design), ',')
	head = f(head, in.RPM())
	var scratch []byte
	for k := range res.n {
		c := res.at(k)
		b = append(b, head...)
		b = f(b, c.OutputSpeed.RPM())
		b = f(b, float64(c.OutputTorque))
		if !c.OK {
			b = append(b, "false,,,,,,,,,,,,,,,,"...)
			b = appendCSVField(b, c.Reason())
		} else {
			b = append(b, "true,"...)
			if c.Range >= 0 && c.Range < len(names) {
				b = appendCSVField(b, names[c.Range])
			} else {
				b = strconv.AppendInt(b, int64(c.Range), 10)
			}
			b = append(b, ',')
			for _, v := range [...]float64{float64(c.InputTorque), c.InputPower.Kilowatts(), c.OutputPower.Kilowatts(),
				c.Loss.Kilowatts(), 100 * c.Efficiency, 100 * c.HydraulicShare, c.Pressure.Bar(), c.HighPressure.Bar(),
				c.PumpSpeed.RPM(), c.MotorSpeed.RPM(), 100 * c.PumpSetting, 100 * c.MotorSetting} {
				b = f(b, v)
			}
			if c.Binding.Limit.SI > 0 {
				scratch = append(append(append(scratch[:0], c.Binding.Element...), ' '), c.Binding.Quantity...)
				b = append(appendCSVField(b, scratch), ',')
				b = f(b, 100*c.Binding.Left().SI/c.Binding.Limit.SI)
			} else {
				b = append(b, ",,"...)
			}
		}
		b = append(b, '\n')
		if len(b) >= 60<<10 {
			if _, err := w.Write(b); err != nil {
				return err
			}
			b = b[:0]
		}
	}
	_, err := w.Write(b)
	return err
}

// appendCSVField appends s as one CSV field, quoted as encoding/csv quotes
// it (when empty it is not; when it holds a comma, a quote, a line break,
// starts with a space or is \.), with quotes doubled.
func appendCSVField[S string | []byte](b []byte, s S) []byte {
	quote := false
	if len(s) > 0 {
		r, _ := utf8.DecodeRuneInString(string(s[:min(len(s), utf8.UTFMax)]))
		quote = string(s) == `\.` || unicode.IsSpace(r)
		for i := 0; i < len(s) && !quote; i++ {
			quote = s[i] == ',' || s[i] == '"' || s[i] == '\r' || s[i] == '\n'
		}
	}
	if !quote {
		return append(b, s...)
	}
	b = append(b, '"')
	for i := 0; i < len(s); i++ {
		if s[i] == '"' {
			b = append(b, '"')
		}
		b = append(b, s[i])
	}
	return append(b, '"')
}

func (l Layout) rangeNames() []string {
	out := make([]string, len(l.l.ranges))
	for i := range out {
		out[i] = l.l.ranges[i].name
	}
	return out
}
