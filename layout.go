package powersplit

import (
	"fmt"
	"math"
	"strconv"

	"gonum.org/v1/gonum/mat"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Shaft identifies a shaft of a layout under construction. A shaft is a node
// of the network with one speed; elements connect to shafts through ports.
type Shaft int

// Kind says what an element is.
type Kind int

// The element kinds.
const (
	GearKind       Kind = iota // fixed gear pair: ports a, b
	PlanetaryKind              // planetary set: ports sun, ring, carrier
	LoopKind                   // hydrostatic loop: ports pump, motor 1, motor 2, ...
	ClutchKind                 // clutch: ports a, b
	BrakeKind                  // brake: port a
	InputKind                  // the engine side: one port, speed given
	OutputKind                 // an output: one port, speed and torque given
	FreeOutputKind             // an output whose speed is given and torque solved
	PTOKind                    // a power take-off: one port, torque given
)

var kindNames = [...]string{"gear", "planetary", "loop", "clutch", "brake", "input", "output", "free output", "PTO"}

func (k Kind) String() string {
	if k < 0 || int(k) >= len(kindNames) {
		return "Kind(" + fmt.Sprint(int(k)) + ")"
	}
	return kindNames[k]
}

// element is one element of a layout. Its ports are ports[port0:port0+nports].
type element struct {
	kind   Kind
	name   string
	shafts []int // one per port, in port order
	ratio  float64
	eta    float64
	set    planetary.Set
	loop   hydrostat.Loop
	port0  int
	index  int // index among the elements of its kind (outputs, PTOs, loops, switches)
	// loops: the spec, each unit's spec and margin names, cached at Build so
	// the solver's hot path copies nothing
	lspec  hydrostat.LoopSpec
	uspec  []hydrostat.UnitSpec
	unames [][3]string // "<unit> pressure", "<unit> speed", "<unit> setting"
}

// rangeDef is one named range: which clutches and brakes are engaged.
type rangeDef struct {
	name    string
	engaged []bool    // per element index; only clutches and brakes are read
	maxOut  float64   // |first output speed| limit in rad/s, 0 = none
	reverse bool      // hydraulic share counted from the motors to the pump
	g       []float64 // S × (1+nOut) row-major: shaft speeds = g · [win, wout...]
	kinRows int
	// locked: the range fixes the loops' ratios (locked.go); the given
	// speeds must satisfy nConsist rows consist (each 1+nOut long)
	wantLock bool // declared locked (Builder.LockedRange)
	locked   bool
	consist  []float64
	nConsist int
	nTorque  int // unknowns of the torque system (ports + loops)
	relCount int
}

// layout is the immutable inside of a Layout.
type layout struct {
	shafts   []string
	elems    []element
	nPorts   int
	input    int   // element index
	outputs  []int // element indices of outputs (OutputKind and FreeOutputKind)
	ptos     []int
	loops    []int
	gears    []int
	planets  []int
	switches []int // clutches and brakes
	ranges   []rangeDef
	// load-independent losses (drag.go)
	lube      Lubricant
	drags     []dragSrc
	hasCharge bool        // a drag source is a charge pump
	pins      []pinDef    // motors whose settings the layout sets (second.go)
	second    *SecondInfo // a builder's second motor
	// general makes every Solver of this layout solve on the general path
	// only and sweeps and maps fill full States: the solver as it was
	// before the compiled path, kept reachable for tests and benchmarks.
	general bool
}

// Layout is a validated, immutable transmission layout: shafts, elements and
// ranges. Copying a Layout is cheap and it is safe for concurrent use. Build
// one with a Builder or one of the layout builders (OutputCoupled,
// InputCoupled, PureHydrostatic).
type Layout struct{ l *layout }

// Builder collects shafts and elements and builds a Layout. The zero value
// is ready to use. Errors are collected and reported by Build, so the calls
// can be chained without checks.
type Builder struct {
	shafts       []string
	elems        []element
	rangeNames   []string
	rangeEngaged [][]string
	limits       map[string]float64
	reverse      map[string]bool
	lockedRanges map[string]bool
	lube         Lubricant
	drags        []dragSrc
	pins         []pinSpec
	holds        []holdSpec
	second       *SecondInfo
	err          error
}

// NewBuilder returns an empty Builder.
func NewBuilder() *Builder { return &Builder{} }

func (b *Builder) fail(name, reason string) {
	if b.err == nil {
		b.err = &LayoutError{Element: name, Reason: reason, Err: ErrLayout}
	}
}

// Shaft adds a shaft and returns its handle.
func (b *Builder) Shaft(name string) Shaft {
	b.shafts = append(b.shafts, name)
	return Shaft(len(b.shafts) - 1)
}

func (b *Builder) add(e element) {
	for _, s := range e.shafts {
		if s < 0 || s >= len(b.shafts) {
			b.fail(e.name, fmt.Sprintf("shaft %d does not exist", s))
			return
		}
	}
	b.elems = append(b.elems, e)
}

func (b *Builder) eff(name string, eta float64) float64 {
	if !(eta > 0 && eta <= 1) {
		b.fail(name, fmt.Sprintf("efficiency %g outside (0, 1]", eta))
		return 1
	}
	return eta
}

// Gear adds a fixed gear pair from shaft a to shaft c with ωc = ratio·ωa
// (negative for an external mesh that reverses the direction) and mesh
// efficiency eta in (0, 1], applied in the direction the power flows.
func (b *Builder) Gear(name string, a, c Shaft, ratio, eta float64) {
	if ratio == 0 || math.IsNaN(ratio) || math.IsInf(ratio, 0) {
		b.fail(name, fmt.Sprintf("gear ratio %g must be finite and non-zero", ratio))
	}
	if a == c {
		b.fail(name, "both ends of the gear on one shaft")
	}
	b.add(element{kind: GearKind, name: name, shafts: []int{int(a), int(c)}, ratio: ratio, eta: b.eff(name, eta)})
}

// Planetary adds a planetary set with its sun, ring and carrier on the
// given shafts.
func (b *Builder) Planetary(name string, set planetary.Set, sun, ring, carrier Shaft) {
	if set.BasicEfficiency() <= 0 || set.FixedCarrierRatio() == 0 {
		b.fail(name, "zero planetary.Set; build one with planetary.New or planetary.FromRatio")
	}
	if sun == ring || sun == carrier || ring == carrier {
		b.fail(name, "a member on two shafts: two members of the set share one shaft")
	}
	b.add(element{kind: PlanetaryKind, name: name, shafts: []int{int(sun), int(ring), int(carrier)}, set: set})
}

// Loop adds a hydrostatic loop: the pump on shaft pump and one motor per
// shaft in motors (in the order of loop.Spec().Motors). The loop's speed
// ratio is free: its displacement schedule sets it.
func (b *Builder) Loop(name string, loop hydrostat.Loop, pump Shaft, motors ...Shaft) {
	spec := loop.Spec()
	if len(spec.Motors) == 0 {
		b.fail(name, "zero hydrostat.Loop; build one with hydrostat.NewLoop")
	}
	if len(motors) != len(spec.Motors) {
		b.fail(name, fmt.Sprintf("%d motor shafts for a loop with %d motors", len(motors), len(spec.Motors)))
	}
	sh := []int{int(pump)}
	for _, m := range motors {
		for _, s := range sh {
			if s == int(m) {
				b.fail(name, "a unit on the shaft of another unit of the same loop")
			}
		}
		sh = append(sh, int(m))
	}
	b.add(element{kind: LoopKind, name: name, shafts: sh, loop: loop})
}

// Clutch adds a clutch between shafts a and c; it is engaged in the ranges
// that name it (see Range) and open otherwise.
func (b *Builder) Clutch(name string, a, c Shaft) {
	if a == c {
		b.fail(name, "both sides of the clutch on one shaft")
	}
	b.add(element{kind: ClutchKind, name: name, shafts: []int{int(a), int(c)}})
}

// Brake adds a brake holding shaft a to the housing in the ranges that name
// it (see Range), open otherwise.
func (b *Builder) Brake(name string, a Shaft) {
	b.add(element{kind: BrakeKind, name: name, shafts: []int{int(a)}})
}

// Input makes shaft a the input (engine side). A layout has exactly one.
func (b *Builder) Input(name string, a Shaft) {
	b.add(element{kind: InputKind, name: name, shafts: []int{int(a)}})
}

// Output adds an output on shaft a whose speed and torque the operating
// point gives (a Point's Outputs, in the order the outputs were added).
func (b *Builder) Output(name string, a Shaft) {
	b.add(element{kind: OutputKind, name: name, shafts: []int{int(a)}})
}

// FreeOutput adds an output on shaft a whose speed the operating point gives
// and whose torque the solver finds, for example a second axle driven by a
// motor of its own: its torque follows from the loop pressure and the
// motor's setting. The torque of its OutputDemand is ignored.
func (b *Builder) FreeOutput(name string, a Shaft) {
	b.add(element{kind: FreeOutputKind, name: name, shafts: []int{int(a)}})
}

// PTO adds a power take-off: a new shaft geared to shaft from with
// ωPTO = ratio·ωfrom and mesh efficiency eta, carrying a port whose torque
// the operating point gives. Geared to the input, its speed follows the
// engine and not the travel speed. It returns the PTO shaft.
func (b *Builder) PTO(name string, from Shaft, ratio, eta float64) Shaft {
	s := b.Shaft(name + " shaft")
	b.Gear(name+" gear", from, s, ratio, eta)
	b.add(element{kind: PTOKind, name: name, shafts: []int{int(s)}})
	return s
}

// Range adds a range in which the named clutches and brakes are engaged
// (all others open). A layout without ranges has one range named "single"
// with every clutch and brake open.
func (b *Builder) Range(name string, engaged ...string) {
	b.rangeNames = append(b.rangeNames, name)
	b.rangeEngaged = append(b.rangeEngaged, append([]string(nil), engaged...))
}

// RangeLimit sets the largest |speed| of the first output for which range
// name may be used (for example a range with a second motor clutched in,
// declutched above a set speed). Points above it are infeasible in that range.
func (b *Builder) RangeLimit(name string, max units.AngularVelocity) {
	if !(max > 0) || math.IsInf(float64(max), 0) {
		b.fail(name, "range speed limit must be positive and finite")
		return
	}
	if b.limits == nil {
		b.limits = map[string]float64{}
	}
	b.limits[name] = float64(max)
}

// ReverseShare makes range name count the hydraulic power share from the
// loop's motors to its pump: for a range in which the motor side of the loop
// lies on the input side of the power flow and the pump side on the output
// side, so that a negative share still means circulating power.
func (b *Builder) ReverseShare(name string) {
	if b.reverse == nil {
		b.reverse = map[string]bool{}
	}
	b.reverse[name] = true
}

// Build validates the layout and returns it. It reports unconnected shafts
// (no element, or one gear that turns nothing), duplicate names, members or units sharing a shaft, a missing or second
// input, no outputs, unknown clutch names in a range, and — for every range
// — over- or under-determined kinematics (*KinematicsError) and torque
// balances (ErrTorques).
func (b *Builder) Build() (Layout, error) {
	if b.err != nil {
		return Layout{}, b.err
	}
	l := &layout{shafts: append([]string(nil), b.shafts...), input: -1}
	if len(l.shafts) == 0 {
		return Layout{}, &LayoutError{Reason: "no shafts", Err: ErrLayout}
	}
	seen := map[string]bool{}
	for _, n := range l.shafts {
		if seen[n] {
			return Layout{}, &LayoutError{Element: n, Reason: "duplicate shaft name", Err: ErrLayout}
		}
		seen[n] = true
	}
	seen = map[string]bool{}
	used := make([]int, len(l.shafts))
	last := make([]int, len(l.shafts)) // the element of a shaft's last port
	l.elems = make([]element, len(b.elems))
	for i, e := range b.elems {
		if seen[e.name] {
			return Layout{}, &LayoutError{Element: e.name, Reason: "duplicate element name", Err: ErrLayout}
		}
		seen[e.name] = true
		e.shafts = append([]int(nil), e.shafts...)
		e.port0 = l.nPorts
		l.nPorts += len(e.shafts)
		for _, s := range e.shafts {
			used[s]++
			last[s] = i
		}
		switch e.kind {
		case InputKind:
			if l.input >= 0 {
				return Layout{}, &LayoutError{Element: e.name, Reason: "second input; a layout has one", Err: ErrLayout}
			}
			l.input = i
		case OutputKind, FreeOutputKind:
			e.index = len(l.outputs)
			l.outputs = append(l.outputs, i)
		case PTOKind:
			e.index = len(l.ptos)
			l.ptos = append(l.ptos, i)
		case LoopKind:
			e.index = len(l.loops)
			l.loops = append(l.loops, i)
			e.lspec = e.loop.Spec()
			e.uspec = append(e.uspec, e.lspec.Pump.Spec())
			e.unames = append(e.unames, [3]string{"pump pressure", "pump speed", "pump setting"})
			for k, m := range e.lspec.Motors {
				e.uspec = append(e.uspec, m.Spec())
				n := "motor " + strconv.Itoa(k+1)
				e.unames = append(e.unames, [3]string{n + " pressure", n + " speed", n + " setting"})
			}
		case GearKind:
			e.index = len(l.gears)
			l.gears = append(l.gears, i)
		case PlanetaryKind:
			e.index = len(l.planets)
			l.planets = append(l.planets, i)
		case ClutchKind, BrakeKind:
			e.index = len(l.switches)
			l.switches = append(l.switches, i)
		}
		l.elems[i] = e
	}
	for s, n := range used {
		if n == 0 {
			return Layout{}, &LayoutError{Element: l.shafts[s], Reason: "no element on this shaft", Err: ErrUnconnected}
		}
	}
	if l.input < 0 {
		return Layout{}, &LayoutError{Reason: "no input", Err: ErrLayout}
	}
	if len(l.outputs) == 0 {
		return Layout{}, &LayoutError{Reason: "no output", Err: ErrLayout}
	}
	for s, n := range used {
		if e := &l.elems[last[s]]; n == 1 && e.kind == GearKind {
			return Layout{}, &LayoutError{Element: l.shafts[s],
				Reason: fmt.Sprintf("its only element is gear %q: the gear turns nothing", e.name), Err: ErrUnconnected}
		}
	}
	names, engaged := b.rangeNames, b.rangeEngaged
	if len(names) == 0 {
		names, engaged = []string{"single"}, [][]string{nil}
	}
	seen = map[string]bool{}
	for i, n := range names {
		if seen[n] {
			return Layout{}, &LayoutError{Element: n, Reason: "duplicate range name", Err: ErrLayout}
		}
		seen[n] = true
		r := rangeDef{name: n, engaged: make([]bool, len(l.elems)), maxOut: b.limits[n], reverse: b.reverse[n], wantLock: b.lockedRanges[n]}
		for _, en := range engaged[i] {
			found := false
			for j, e := range l.elems {
				if e.name == en && (e.kind == ClutchKind || e.kind == BrakeKind) {
					r.engaged[j], found = true, true
				}
			}
			if !found {
				return Layout{}, &LayoutError{Element: n, Reason: fmt.Sprintf("range engages %q, which is no clutch or brake", en), Err: ErrLayout}
			}
		}
		if err := l.prepareRange(&r); err != nil {
			return Layout{}, err
		}
		l.ranges = append(l.ranges, r)
	}
	if err := l.setDrags(b.lube, b.drags); err != nil {
		return Layout{}, err
	}
	for n := range b.limits {
		if !seen[n] {
			return Layout{}, &LayoutError{Element: n, Reason: "speed limit for an unknown range", Err: ErrLayout}
		}
	}
	for n := range b.lockedRanges {
		if !seen[n] {
			return Layout{}, &LayoutError{Element: n, Reason: "LockedRange for an unknown range", Err: ErrLayout}
		}
	}
	for n := range b.reverse {
		if !seen[n] {
			return Layout{}, &LayoutError{Element: n, Reason: "ReverseShare for an unknown range", Err: ErrLayout}
		}
	}
	if err := b.buildPins(l); err != nil {
		return Layout{}, err
	}
	if b.second != nil {
		sc := *b.second
		l.second = &sc
	}
	return Layout{l: l}, nil
}

// kinematic fills the kinematic constraint rows of range r: k (rows × S) and
// the right-hand side map bm (rows × (1+nOut)) so that k·ω = bm·[ωin, ωout...].
func (l *layout) kinematic(r *rangeDef) (k, bm *mat.Dense) {
	S, nG := len(l.shafts), 1+len(l.outputs)
	var rows [][]float64
	var rhs [][]float64
	row := func() ([]float64, []float64) {
		a, c := make([]float64, S), make([]float64, nG)
		rows, rhs = append(rows, a), append(rhs, c)
		return a, c
	}
	for i, e := range l.elems {
		switch e.kind {
		case GearKind:
			a, _ := row()
			a[e.shafts[1]] += 1
			a[e.shafts[0]] -= e.ratio
		case PlanetaryKind:
			a, _ := row()
			i0 := e.set.FixedCarrierRatio()
			a[e.shafts[0]] += 1
			a[e.shafts[1]] -= i0
			a[e.shafts[2]] -= 1 - i0
		case ClutchKind:
			if r.engaged[i] {
				a, _ := row()
				a[e.shafts[0]] += 1
				a[e.shafts[1]] -= 1
			}
		case BrakeKind:
			if r.engaged[i] {
				a, _ := row()
				a[e.shafts[0]] = 1
			}
		case InputKind:
			a, c := row()
			a[e.shafts[0]] = 1
			c[0] = 1
		case OutputKind, FreeOutputKind:
			a, c := row()
			a[e.shafts[0]] = 1
			c[1+e.index] = 1
		}
	}
	k = mat.NewDense(len(rows), S, nil)
	bm = mat.NewDense(len(rows), nG, nil)
	for i := range rows {
		k.SetRow(i, rows[i])
		bm.SetRow(i, rhs[i])
	}
	return k, bm
}

// relations returns the number of torque relations of element i in range r.
func (l *layout) relations(r *rangeDef, i int) int {
	e := &l.elems[i]
	switch e.kind {
	case GearKind, OutputKind, PTOKind:
		return 1
	case PlanetaryKind:
		return 2
	case ClutchKind:
		if r.engaged[i] {
			return 1
		}
		return 2
	case BrakeKind:
		if r.engaged[i] {
			return 0
		}
		return 1
	case LoopKind:
		return len(e.shafts)
	}
	return 0
}

func (l *layout) prepareRange(r *rangeDef) error {
	S := len(l.shafts)
	k, bm := l.kinematic(r)
	rows, _ := k.Dims()
	r.kinRows = rows
	var svd mat.SVD
	if !svd.Factorize(k, mat.SVDFull) {
		return &KinematicsError{Range: r.name, Shafts: S, Constraints: rows}
	}
	vals := svd.Values(nil)
	tol := 1e-10 * math.Max(1, vals[0])
	rank := 0
	for _, v := range vals {
		if v > tol {
			rank++
		}
	}
	locked := r.wantLock && rank == S && rows-S == len(l.loops) && len(l.loops) > 0 && l.prepareLocked(r, k, bm)
	if r.wantLock && !locked {
		return &LayoutError{Element: r.name, Err: ErrKinematics, Reason: fmt.Sprintf(
			"a locked range must fix every loop's ratio: %d kinematic constraints of rank %d for %d shafts and %d loops",
			rows, rank, S, len(l.loops))}
	}
	if !locked && (rank < S || rows != S) {
		ke := &KinematicsError{Range: r.name, Shafts: S, Constraints: rows, Rank: rank}
		if rank < S {
			var v mat.Dense
			svd.VTo(&v)
			for s := 0; s < S; s++ {
				for j := rank; j < S; j++ {
					if math.Abs(v.At(s, j)) > 1e-9 {
						ke.Free = append(ke.Free, l.shafts[s])
						break
					}
				}
			}
		}
		return ke
	}
	if !locked {
		var inv mat.Dense
		if err := inv.Inverse(k); err != nil {
			return &KinematicsError{Range: r.name, Shafts: S, Constraints: rows, Rank: rank}
		}
		var g mat.Dense
		g.Mul(&inv, bm)
		_, nG := g.Dims()
		r.g = make([]float64, S*nG)
		for s := 0; s < S; s++ {
			for j := 0; j < nG; j++ {
				r.g[s*nG+j] = g.At(s, j)
			}
		}
	}
	rel := 0
	for i := range l.elems {
		rel += l.relations(r, i)
	}
	r.relCount = rel
	r.nTorque = l.nPorts + len(l.loops)
	if locked {
		rel += len(l.loops) // Δp = 0 for each bypassed loop
		r.relCount = rel
	}
	if S+rel != r.nTorque {
		return &LayoutError{Element: r.name, Err: ErrTorques, Reason: fmt.Sprintf(
			"%d torque equations for %d unknowns; outputs with a given torque (%d) must equal hydrostatic loops (%d)",
			S+rel, r.nTorque, l.givenOutputs(), len(l.loops))}
	}
	return nil
}

func (l *layout) givenOutputs() int {
	n := 0
	for _, o := range l.outputs {
		if l.elems[o].kind == OutputKind {
			n++
		}
	}
	return n
}

// speeds fills w (length S) with the shaft speeds of range r.
func (l *layout) speeds(r *rangeDef, win float64, wout, w []float64) {
	nG := 1 + len(l.outputs)
	if nG == 2 {
		// One output: the common case, without the inner loop.
		wo := wout[0]
		for s := range w {
			row := r.g[2*s : 2*s+2 : 2*s+2]
			w[s] = row[0]*win + row[1]*wo
		}
		return
	}
	for s := range w {
		row := r.g[s*nG : (s+1)*nG]
		v := row[0] * win
		for j := 1; j < nG; j++ {
			v += row[j] * wout[j-1]
		}
		w[s] = v
	}
}

// Unrated lists the limits of the layout's hydrostatic units that their
// specs leave at zero, which the solver therefore does not check, one line
// each: "<loop>: <unit> <quantity>: <bound> not rated, not checked" (for
// example "hydrostat: motor 1 speed: maximum speed not rated, not
// checked"). Empty when every limit is rated (a loop built with
// hydrostat.LoopSpec.Strict has none unrated); nil for the zero Layout.
func (l Layout) Unrated() []string {
	if l.l == nil {
		return nil
	}
	var out []string
	for _, e := range l.l.loops {
		el := &l.l.elems[e]
		for k := range el.shafts {
			us := &el.uspec[k]
			for _, c := range []struct {
				rated    bool
				quantity string
				bound    string
			}{
				{us.MaxSpeed > 0, el.unames[k][1], boundSpeed},
				{us.RatedPressure > 0, el.unames[k][0], boundRated},
				{us.PeakPressure > 0, el.unames[k][0], boundPeak},
			} {
				if !c.rated {
					out = append(out, el.name+": "+c.quantity+": "+c.bound+" not rated, not checked")
				}
			}
		}
	}
	return out
}

// Ranges returns the number of ranges (0 for the zero Layout).
func (l Layout) Ranges() int {
	if l.l == nil {
		return 0
	}
	return len(l.l.ranges)
}

// RangeName returns the name of range i, or "" when there is no range i
// (an index out of range, or the zero Layout).
func (l Layout) RangeName(i int) string {
	if l.l == nil || i < 0 || i >= len(l.l.ranges) {
		return ""
	}
	return l.l.ranges[i].name
}

// RangeIndex returns the index of the range named name, or -1.
func (l Layout) RangeIndex(name string) int {
	if l.l == nil {
		return -1
	}
	for i, r := range l.l.ranges {
		if r.name == name {
			return i
		}
	}
	return -1
}

// Shafts returns the shaft names in order.
func (l Layout) Shafts() []string {
	if l.l == nil {
		return nil
	}
	return append([]string(nil), l.l.shafts...)
}

// Outputs returns the output names in the order of a Point's Outputs.
func (l Layout) Outputs() []string {
	if l.l == nil {
		return nil
	}
	out := make([]string, len(l.l.outputs))
	for i, e := range l.l.outputs {
		out[i] = l.l.elems[e].name
	}
	return out
}

// PTOs returns the PTO names in the order of a Point's PTO torques.
func (l Layout) PTOs() []string {
	if l.l == nil {
		return nil
	}
	out := make([]string, len(l.l.ptos))
	for i, e := range l.l.ptos {
		out[i] = l.l.elems[e].name
	}
	return out
}

// Elements returns the element names and kinds in order.
func (l Layout) Elements() (names []string, kinds []Kind) {
	if l.l == nil {
		return nil, nil
	}
	for _, e := range l.l.elems {
		names = append(names, e.name)
		kinds = append(kinds, e.kind)
	}
	return names, kinds
}

// Valid reports whether l was built (the zero Layout is not).
func (l Layout) Valid() bool { return l.l != nil }
