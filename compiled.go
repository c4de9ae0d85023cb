package powersplit

import (
	"math"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// The compiled path for a range with one loop. With the loss directions
// fixed, the torque system of a range is linear in the port torques once
// the units' torques τ are known; a factored reference system (factor.go)
// with W = A_ref⁻¹·U (U selecting the loop rows) and H = A_ref⁻¹·E (E the
// rows of the given output and PTO torques b) gives every port torque as
//
//	T_port = H·b + W·τ
//
// whatever the reference slopes: their terms cancel in the port torques and
// land in the pressure unknown alone. The pressure unknown (Δp/pScale) comes
// out as H_X·b + W_X·τ + Δp/pScale, since W_X·d_ref = −1/pScale (A_ref
// maps the reference slopes in the loop rows to a pressure of −1/pScale).
// So the torques balance at the loop pressure Δp where
//
//	F(Δp) = H_X·b + W_X·τ(Δp) = 0,   F′(Δp) = W_X·τ′(Δp),
//
// X the row of the pressure in W and H. The hydrostat gives τ and its exact
// slope τ′ (hydrostat.Curve), so Newton's method converges quadratically
// from Δp = 0, where the slope is the ideal one. Drag sources load the
// shaft rows with torques known at the point's speeds: z = A_ref⁻¹ of them
// adds to H_X·b and to every port torque. A charge pump's torque follows
// the loop's leakage, K·(Q_leak(Δp) + Q_flush) with K = p_charge/(η·ω):
// its part z_c·Q_leak(Δp) joins F with the leakage's exact slope
// (hydrostat.Curve.Leakage), so the charge torque is the one at the
// pressure reached.
//
// The first guess of the directions is those of the last point of the
// same range with the same signs of output power, unit speeds and rolling
// speed (guessSlot); the directions read off the solution (as the general
// path reads them) must agree with those assumed, else the solve is
// repeated with them (settle). A point's result depends on the point
// alone, never on the points solved before it, so maps stay identical for
// any number of workers and a repeated point gives the same bits
// (TestPropertyCompiledHistoryFree): each solve of a direction set starts
// from Δp = 0; a gear or set whose torque is rounding (below 1e-12 of the
// point's largest) reads as the lossless start reads it, whatever the
// guess; and a guess that fails is followed by the lossless start. The
// directions and the summary read only the key ports (the input, outputs
// and PTOs, the lossy gears, the sets' suns, the pump); every port torque
// is computed only for a full State.
//
// Where no motor setting in range gives the speeds, the schedule holds its
// nearest settings (hydrostat.Curve does as Loop.At does) and the point
// ends as on the general path: the state filled as far as it goes and the
// loop's setting limit as the error; a point beyond the relief as well is
// left to the general path, which says which limit it crosses (it may find
// no balance below the relief at all). Everywhere else the compiled path
// gives up and the general path solves the point: several loops, a loop
// the hydrostat cannot see as a Curve (a schedule other than Sequential or
// Pinned, held motors included; a locked range's destroked loop) or a pump
// near standstill, a Newton iterate held at 1.5 times the relief,
// Newton's method not settling, directions that oscillate, a key port's
// torque below 1e-12 of the largest, any other crossed limit, or a power
// balance not closing. So both paths give the same errors and agree to rounding
// (TestPropertyCompiledMatchesGeneral, TestMapCompiledMatchesGeneral; with
// a charge pump to the general path's own lag, ...Drags).

// elemC is what the hot path reads of an element, compact: the element
// values themselves are large (a loop's spec, a set), and reading a few
// numbers from each costs a cache line apiece.
type elemC struct {
	kind    Kind
	index   int32
	port0   int32
	a, b, c int32   // the shafts of the first three ports, −1 where none
	eta     float64 // gear: mesh efficiency; planetary: basic efficiency
	inv     float64 // 1/eta, the factor of a gear driven from its second port
	// invRatio is a gear's 1/r, r its ratio in the gear's equation
	// r·T_b + k·T_a = 0.
	invRatio float64
}

// initElemC fills the solver's compact view of the elements.
func (s *Solver) initElemC() {
	l := s.l
	s.ec = make([]elemC, len(l.elems))
	for i := range l.elems {
		e := &l.elems[i]
		c := elemC{kind: e.kind, index: int32(e.index), port0: int32(e.port0), a: -1, b: -1, c: -1, eta: e.eta}
		for k, sh := range e.shafts {
			switch k {
			case 0:
				c.a = int32(sh)
			case 1:
				c.b = int32(sh)
			case 2:
				c.c = int32(sh)
			}
		}
		if e.kind == PlanetaryKind {
			c.eta = e.set.BasicEfficiency()
		}
		c.inv = 1 / c.eta
		if e.kind == GearKind {
			c.invRatio = 1 / e.ratio
		}
		s.ec[i] = c
	}
}

// maxPasses is the most direction sets the compiled path tries for a point.
const maxPasses = 4

// compiledState is the compiled path's work space in a Solver.
type compiledState struct {
	on    bool // the layout has one loop and no drag sources
	curve hydrostat.Curve
	// The layout's own loop was last prepared as curve at pump speed
	// curveWp and motor speeds curveW (bit for bit) where curveOK: a
	// point at the same speeds (a map's cells along the torque axis)
	// finds it prepared. Preparing is a function of the loop and the
	// speeds alone, and Torques and Fill keep nothing of an earlier point
	// that a later one reads, so the point's result is the same bits.
	curveOK  bool
	curveWp  float64
	curveW   []float64
	wms      []units.AngularVelocity
	tau      []units.Torque
	slope    []units.Displacement
	settings []float64
	b        []float64   // given torques, in the order of the entries' extSrc
	v        []float64   // b, then the units' torques
	guessK   [][]float64 // per range and quadrant (guessSlot): the directions the last such point ended with
	guessF   [][]int8
	guessOK  []bool
	// guessE is, per slot, the factored system of the guess's directions
	// and the generation it had (sysEntry.gen): the first pass finds it
	// there while the cache still holds it.
	guessE    []*sysEntry
	guessG    []uint64
	losslessK []float64 // the lossless directions (losslessDirections), the first pass's without a guess
	losslessF []int8
	hits      int // points solved on the compiled path (for tests)
	passes    int // direction sets tried on the compiled path (for tests)
	// keyPorts are the ports whose torques a point's summary and its
	// directions read (the input, outputs and PTOs, the pump, the lossy
	// gears' first ports, every set's sun: keyPass): the compiled path
	// computes only these unless the full State is asked for.
	keyPorts []int32
	nFlow    int     // the input, the outputs, the PTOs and the pump: the key ports before the gears
	wmax     float64 // the point's largest shaft speed
	tmax     float64 // the largest key-port |torque| of the last keyPass
	near     bool    // a key port's torque of the last keyPass is rounding: non-zero, below 1e-12·tmax
	loss     float64 // the lossy gears' and the sets' loss at the last keyPass
	held     bool    // the last newton held an iterate at ±lim
	// The charge pumps (indices into the layout's drags): their torques
	// follow the loop's leakage, T = K·(Q_leak(Δp) + Q_flush) with
	// K = p_charge/(η·ω), so the shafts' right-hand side is Q_leak·g + g0
	// and A_ref⁻¹ of it is Q_leak·zc plus a part folded into the drags' z.
	charge  []int
	chargeK []float64 // per charge pump: K at the point's speeds
	g, g0   []float64 // per shaft
	zc, zt  []float64 // A_ref⁻¹·g; the drags' z with the charge at the final pressure
	gears   []int32   // element indices of the gears with a loss (η < 1)
}

func (s *Solver) initCompiled() {
	l := s.l
	c := &s.comp
	c.on = len(l.loops) == 1
	if !c.on {
		return
	}

	nu := len(l.elems[l.loops[0]].shafts)
	c.wms = make([]units.AngularVelocity, nu-1)
	c.curveW = make([]float64, nu-1)
	c.tau, c.slope, c.settings = make([]units.Torque, nu), make([]units.Displacement, nu), make([]float64, nu)
	c.b = make([]float64, len(l.outputs)+len(l.ptos))
	c.v = make([]float64, len(c.b)+nu)
	ng := quadrants * len(l.ranges)
	c.guessK, c.guessF, c.guessOK = make([][]float64, ng), make([][]int8, ng), make([]bool, ng)
	c.guessE, c.guessG = make([]*sysEntry, ng), make([]uint64, ng)
	gk, gf := slab[float64](make([]float64, ng*len(l.gears))), slab[int8](make([]int8, ng*len(l.planets)))
	for i := range ng {
		c.guessK[i], c.guessF[i] = gk.take(len(l.gears)), gf.take(len(l.planets))
	}
	c.losslessK, c.losslessF = make([]float64, len(l.gears)), make([]int8, len(l.planets))
	for i := range c.losslessK {
		c.losslessK[i] = 1
	}
	for i := range c.losslessF {
		c.losslessF[i] = -1
	}
	for i := range l.drags {
		if l.drags[i].kind == ChargePumpDrag {
			c.charge = append(c.charge, i)
		}
	}
	if len(c.charge) > 0 {
		c.chargeK = make([]float64, len(c.charge))
		c.g, c.g0 = make([]float64, len(l.shafts)), make([]float64, len(l.shafts))
		c.zc, c.zt = make([]float64, s.n), make([]float64, s.n)
	}
	// The key ports in the order keyPass reads them: the input, the
	// outputs and PTOs, the pump, the lossy gears' first ports, the sets'
	// suns.
	key := []int32{int32(l.elems[l.input].port0)}
	for _, i := range l.outputs {
		key = append(key, int32(l.elems[i].port0))
	}
	for _, i := range l.ptos {
		key = append(key, int32(l.elems[i].port0))
	}
	key = append(key, int32(l.elems[l.loops[0]].port0))
	for _, gi := range l.gears {
		if e := &s.ec[gi]; e.eta != 1 {
			key = append(key, e.port0)
			c.gears = append(c.gears, int32(gi))
		}
	}
	for _, pi := range l.planets {
		key = append(key, s.ec[pi].port0)
	}
	c.keyPorts = key
	c.nFlow = 2 + len(l.outputs) + len(l.ptos)
	if len(c.b)+nu <= 4 {
		// keyPass reads the key ports' rows four wide, zero-padded.
		kp := slab[float64](make([]float64, len(s.cache)*4*len(key)))
		for i := range s.cache {
			s.cache[i].kp = kp.take(4 * len(key))
		}
	}
	// Size the curve's storage now (at standstill), so that no solve
	// allocates.
	l.elems[l.loops[0]].loop.Curve(0, c.wms, &c.curve)
}

// compiled solves p on the compiled path and reports whether it did; st is
// then filled and s.compErr holds the point's error: nil, or the setting
// limit of a point no setting in range reaches. Otherwise the solver's
// iteration state is left for the general path to reset.
func (s *Solver) compiled(r *rangeDef, p *Point, st *State) bool {
	c := &s.comp
	if !c.on || s.general || s.noFactor {
		return false
	}
	l := s.l
	el := &l.elems[l.loops[0]]
	// The loop as this point runs it: with its held motors (Pinned), or
	// destroked in a locked range; a schedule the Curve does not serve
	// leaves the point to the general path.
	if !s.prepareCurve(el) {
		return false
	}
	wmax := 0.0
	for _, v := range s.w[:len(l.shafts)] {
		wmax = maxAbs(wmax, v)
	}
	c.wmax = wmax
	rg := s.guessSlot(p, s.w[el.shafts[0]]*s.w[el.shafts[1]])
	lim := 1.5 * float64(el.lspec.Relief-el.lspec.Charge)
	if c.charge != nil {
		s.chargeRHS(el)
	}
	// From the guess of the directions, and where that fails from the
	// lossless ones: so a point the compiled path solves from the lossless
	// directions is solved whatever guess the points before left (which
	// path solves a point must not depend on them, since the two paths
	// agree only to rounding).
	var ps settled
	ok, kept := false, c.guessOK[rg]
	if kept {
		var hint *sysEntry
		if e := c.guessE[rg]; e != nil && e.gen == c.guessG[rg] {
			hint = e
		}
		ok = s.settle(r, p, c.guessK[rg], c.guessF[rg], hint, lim, &ps)
	}
	if !ok {
		kept = false
		ok = s.settle(r, p, c.losslessK, c.losslessF, nil, lim, &ps)
	}
	if !ok || ps.held {
		// A point whose pressure Newton's method pressed beyond the
		// relief is the general path's to decide: it may find no balance
		// below the relief where Newton's method found one at a limit.
		return false
	}
	kept = kept && ps.passes == 1 // the guess held: it is kept already
	e, dz, dp, evals := ps.e, ps.dz, ps.dp, ps.evals
	// A torque below 1e-12 of the largest, non-zero, is no better than the
	// rounding of the largest: the general path solves such a near-idle
	// point (exact does, by full LU).
	tmax := c.tmax // of the key ports, from the last pass
	if c.near {
		return false
	}
	// Accepted: the loop state at the final pressure, then the state.
	s.dp[0] = dp
	st.size(l)
	lr := &st.Loops[0]
	if lerr := c.curve.Fill(units.Pressure(dp), c.settings, &lr.LoopState); lerr != nil {
		if lerr != hydrostat.ErrSettingLimit || lr.High > el.lspec.Relief {
			// Beyond the relief as well: which limit the point crosses
			// first is the general path's to say (it may find no balance
			// below the relief at all).
			return false
		}
		// No setting in range gives the speeds: as the general path ends
		// (the state filled as far as it goes, the loop's limit).
		s.summaryC(st, p, r, evals, tmax)
		if !st.Brief {
			s.portTorques(e, dz, nil)
			s.detail(st, r, 1)
		}
		s.compErr = s.loopLimit(el.name, &lr.Limit)
		s.keepGuess(rg, kept, e)
		return true
	}
	res := s.summaryC(st, p, r, evals, tmax)
	if !(res <= balanceTo) || s.bad != nil {
		return false
	}
	if !st.Brief {
		s.portTorques(e, dz, nil)
		s.detail(st, r, 1)
	}
	s.compErr = nil
	s.keepGuess(rg, kept, e)
	return true
}

// prepareCurve prepares c.curve for the loop of el as the point runs it
// at the point's speeds, unless it holds the layout's own loop at the same
// speeds already, and reports whether the loop can be seen as a Curve.
func (s *Solver) prepareCurve(el *element) bool {
	c := &s.comp
	lp, wp := s.loopOf(0), s.w[el.shafts[0]]
	same := c.curveOK && lp == &el.loop && math.Float64bits(wp) == math.Float64bits(c.curveWp)
	for k, sh := range el.shafts[1:] {
		w := s.w[sh]
		same = same && math.Float64bits(w) == math.Float64bits(c.curveW[k])
		c.wms[k], c.curveW[k] = units.AngularVelocity(w), w
	}
	if same {
		return true
	}
	ok := lp.Curve(units.AngularVelocity(wp), c.wms, &c.curve)
	c.curveWp, c.curveOK = wp, ok && lp == &el.loop
	return ok
}

// settled is where settle leaves a point: the factored system of the
// directions reached, the drags' z (nil without drag sources), the loop
// pressure, the evaluations of the unit torques of the last pass and the
// passes taken.
type settled struct {
	e      *sysEntry
	dz     []float64
	dp     float64
	evals  int
	passes int
	held   bool // Newton's method held an iterate at 1.5 times the relief
}

// settle solves p from the directions k, f (the guess, or the lossless
// set), repeating with the directions read off each solution until they
// hold, and reports whether they did; where it leaves the point is in
// *ps, the key ports' torques in s.t and the charge pumps' in s.dragT.
// hint, when not nil, is the factored system of k and f in range r. The
// directions are copied element by element and ps filled in place: copy's
// memmove call for a few numbers, and a struct returned by value, cost
// more than the rest of the call (3 % of a benchmark point).
func (s *Solver) settle(r *rangeDef, p *Point, k []float64, f []int8, hint *sysEntry, lim float64, ps *settled) bool {
	c := &s.comp
	//lint:ignore S1001 a few numbers: copy's memmove call costs more
	for i, v := range k {
		s.gearK[i] = v
	}
	//lint:ignore S1001 as above
	for i, v := range f {
		s.pflow[i] = v
	}
	*ps = settled{}
	for pass := 0; ; pass++ {
		if pass == maxPasses {
			return false
		}
		c.passes++
		ps.passes = pass + 1
		e := hint
		if pass > 0 || e == nil {
			e = s.entry(r, p)
		}
		if !e.ok {
			return false
		}
		if pass > 0 && equalK(k, s.gearK) && equalF(f, s.pflow) {
			return false // back to the first directions: they oscillate
		}
		var dz, zc []float64
		if s.dragRHS != nil {
			// The drag torques load the shaft rows: z = A_ref⁻¹ of them
			// adds to the pressure's equation and to every port torque.
			dz = s.dragY
			clear(dz)
			copy(dz, s.dragRHS)
			if c.charge != nil {
				for i, v := range c.g0 {
					dz[i] += v
				}
				zc = c.zc
				clear(zc)
				copy(zc, c.g)
				e.f.Solve(zc)
			}
			e.f.Solve(dz)
		}
		evals := 0 // the final pass's count: the same whatever the first guess
		dp, ok := s.newton(e, p, dz, zc, lim, &evals)
		if !ok {
			return false
		}
		ps.held = c.held
		if zc != nil {
			// The charge pumps' torques at the pressure reached, in the
			// drags' z and in their states.
			q, _, ok := c.curve.Leakage(units.Pressure(dp))
			if !ok {
				return false
			}
			dz = c.zt
			for i, v := range s.dragY {
				dz[i] = v + float64(q)*zc[i]
			}
			for k, i := range c.charge {
				s.dragT[i] = c.chargeK[k] * (float64(q) + float64(s.l.drags[i].pump.Flushing))
			}
		}
		ps.e, ps.dz, ps.dp, ps.evals = e, dz, dp, evals
		if !s.keyPass(e, dz) {
			return true
		}
	}
}

// summaryC is summary on the compiled path: it reads the key ports only
// (tmax the largest of their torques) and the loop state already in
// st.Loops[0], and gives the same numbers whether st is Brief or not.
func (s *Solver) summaryC(st *State, p *Point, r *rangeDef, iters int, tmax float64) float64 {
	l := s.l
	st.Range, st.RangeName = p.Range, r.name
	st.Iterations = iters
	e := &s.ec[l.input]
	w, t := s.w[e.a], s.t[e.port0]+0
	st.InputSpeed, st.InputTorque, st.InputPower = units.AngularVelocity(w), -units.Torque(t), -units.Power(t*w)
	var out, pto float64
	for k, oi := range l.outputs {
		out += s.flowState(&st.Outputs[k], oi)
	}
	for k, pi := range l.ptos {
		pto += s.flowState(&st.PTOs[k], pi)
	}
	st.OutputPower, st.PTOPower = units.Power(out), units.Power(pto)
	loss := s.comp.loss
	lr := &st.Loops[0]
	el := &l.elems[l.loops[0]]
	hl := pos(float64(lr.Loss))
	loss += hl
	st.Loss, st.HydrostatLoss = units.Power(loss), units.Power(hl)
	lr.Name = el.name
	lr.Ratio = s.w[el.shafts[1]] / s.w[el.shafts[0]]
	lr.HydraulicPower = lr.Pump.Hydraulic
	hyd := float64(lr.HydraulicPower)
	pump := (s.t[el.port0] + 0) * s.w[el.shafts[0]]
	return s.totals(st, r, 1, pump, hyd, tmax, s.comp.wmax)
}

// flowState writes the state of output or PTO element i into fs, field
// by field (a composite literal is built aside and copied), and returns
// its power.
func (s *Solver) flowState(fs *FlowState, i int) float64 {
	e := &s.ec[i]
	w, t := s.w[e.a], s.t[e.port0]+0
	fs.Name, fs.Speed, fs.Torque, fs.Power = s.l.elems[i].name, units.AngularVelocity(w), units.Torque(t), units.Power(t*w)
	return t * w
}

// quadrants is the number of first guesses of the directions a range
// keeps (guessSlot).
const quadrants = 8

// guessSlot returns where the first guess of p's directions is kept: by
// range and by three signs, of the output power, of the product wu of the
// pump's and the first motor's speeds (it changes at a mechanical point,
// where the hydraulic power turns round) and of the first planetary set's
// rolling speed ωs − ωc (where its rolling power turns round). The loss
// directions follow the power's paths, so a point's directions are most
// often those of the last point of its range with the same three signs;
// which guess is taken never changes a result, only the passes it takes
// (the directions read off the solution must hold).
func (s *Solver) guessSlot(p *Point, wu float64) int {
	var pout float64
	for _, o := range p.Outputs {
		pout += float64(o.Torque) * float64(o.Speed)
	}
	k := p.Range * quadrants
	if pout < 0 {
		k += 4
	}
	if wu < 0 {
		k += 2
	}
	if pl := s.l.planets; len(pl) > 0 {
		if e := &s.ec[pl[0]]; s.w[e.a] < s.w[e.c] {
			k++
		}
	}
	return k
}

// chargeRHS sets the charge pumps' coefficients at the point's speeds:
// K = p_charge/(η·ω) per pump (zero on a standing shaft, as chargeTorques
// has it) and the shafts' right-hand sides g (per unit leakage) and g0
// (the flushing flows) of their torques. The layout has charge pumps.
func (s *Solver) chargeRHS(el *element) {
	c := &s.comp
	clear(c.g)
	clear(c.g0)
	for k, i := range c.charge {
		d := &s.l.drags[i]
		K := 0.0
		if w := s.w[d.a]; w != 0 {
			K = float64(el.lspec.Charge) / d.pump.Efficiency / w
		}
		c.chargeK[k] = K
		f := K * float64(d.pump.Flushing)
		c.g[d.a] -= K
		c.g0[d.a] -= f
		if d.b >= 0 {
			c.g[d.b] += K
			c.g0[d.b] += f
		}
	}
}

// keepGuess keeps the directions of a point solved on the compiled path,
// and e, their factored system, as the first guess in slot rg
// (guessSlot), unless they are kept there already.
func (s *Solver) keepGuess(rg int, kept bool, e *sysEntry) {
	c := &s.comp
	if !kept {
		gk, gf := c.guessK[rg], c.guessF[rg]
		//lint:ignore S1001 a few numbers: copy's memmove call costs more
		for i, v := range s.gearK {
			gk[i] = v
		}
		//lint:ignore S1001 as above
		for i, v := range s.pflow {
			gf[i] = v
		}
		c.guessOK[rg] = true
	}
	c.guessE[rg], c.guessG[rg] = e, e.gen
	c.hits++
}

// newton solves F(Δp) = 0 for the directions of e from Δp = 0 and returns
// Δp, with the units' torques at it in c.tau; false when it does not
// settle within 30 steps, asks three times in a row for a pressure beyond
// ±lim, or the curve cannot decide.
func (s *Solver) newton(e *sysEntry, p *Point, dz, zc []float64, lim float64, evals *int) (float64, bool) {
	c := &s.comp
	n := s.n
	x := s.l.nPorts // the pressure's row in W and H
	// The constant part pScale·H_X·b.
	var a0 float64 // H_X·b
	for k := 0; k < e.nExt; k++ {
		var v float64
		if src := e.extSrc[k]; src >= 0 {
			v = float64(p.Outputs[src].Torque)
		} else if p.PTO != nil {
			v = float64(p.PTO[-src-1])
		}
		c.b[k] = v
		a0 += e.h[k*n+x] * v
	}
	if dz != nil {
		a0 += dz[x]
	}
	dp := 0.0
	done := false
	over := 0 // iterates in a row held at ±lim
	c.held = false
	var f0 float64 // F(0)
	for it := 0; it < 30; it++ {
		*evals++
		if !c.curve.Torques(units.Pressure(dp), c.settings, c.tau, c.slope) {
			return 0, false
		}
		if done {
			return dp, true
		}
		f, df := a0, 0.0
		if zc != nil {
			// The charge pumps' torques follow the leakage.
			q, dq, ok := c.curve.Leakage(units.Pressure(dp))
			if !ok {
				return 0, false
			}
			f += zc[x] * float64(q)
			df += zc[x] * dq
		}
		for u := range c.tau {
			w := e.w[u*n+x]
			f += w * float64(c.tau[u])
			df += w * float64(c.slope[u])
		}
		step := f / df
		if bad(step) {
			return 0, false
		}
		switch it {
		case 0:
			f0 = f
		case 1:
			if over == 0 {
				step = quadStep(f0, f, df, dp, step)
			}
		}
		if math.Abs(step) <= 1e-13*math.Abs(dp) {
			// Already balanced to rounding (F linear, as with ideal units,
			// lands here on the second evaluation): the torques just taken
			// are the point's.
			return dp, true
		}
		dp -= step
		if math.Abs(dp) > lim {
			// Beyond 1.5 times the relief (an overshoot from Δp = 0 under
			// directions not yet the point's): hold the iterate there, as
			// the general path does, and give up when Newton keeps asking
			// for more.
			if over++; over == 3 {
				return 0, false
			}
			dp = math.Copysign(lim, dp)
			c.held = true
			continue
		}
		over = 0
		// Quadratic convergence: after a step below 1e-7 of the pressure
		// the next would be below 1e-14 of it; the torques are taken at
		// the pressure the step reached.
		done = math.Abs(step) <= 1e-7*math.Abs(dp)+dpTolAbs
	}
	return 0, false
}

// quadStep returns the second step of newton: the Newton step s = F/F′
// at the first iterate d, or where the parabola through F(0) = f0, F(d) = f
// with the slope F′(d) = df has a root near d, at most a tenth of s away,
// d minus that root. On a side of Δp = 0 where the schedule keeps its
// branch, F of Wilson units is such a parabola (the floor's quadratic,
// lossyfloor_test.go), so the next evaluation finds it balanced to
// rounding and returns: three evaluations a solve rather than four.
// Elsewhere it is a step near Newton's, and Newton's method goes on.
func quadStep(f0, f, df, d, s float64) float64 {
	// F(d + h) = f + df·h + a·h², a = (df·d − f + f0)/d² from F(0) = f0.
	// The root nearer d in the form without cancellation,
	// h = −2f/(df + sgn(df)·√(df² − 4af)), is taken times |d|/|d| so that
	// one division and one square root follow each other (the chain of
	// Newton's iterates waits on them): h = −2f·|d|/(df·|d| + sgn(df)·√q),
	// q = (df·d)² − 4f·(df·d − f + f0).
	ad := math.Abs(d)
	q := df*d*(df*d) - 4*f*(df*d-f+f0)
	if !(q >= 0) || d == 0 {
		return s
	}
	h := -2 * f * ad / (df*ad + math.Copysign(math.Sqrt(q), df))
	if !(math.Abs(h+s) <= 0.1*math.Abs(s)) {
		return s
	}
	return -h
}

// portTorques sets the port torques T = H·b + W·τ (+ z of the drag
// torques) into s.t: of the ports listed, or of every port when ports is
// nil.
func (s *Solver) portTorques(e *sysEntry, dz []float64, ports []int32) {
	c := &s.comp
	v := c.v[:e.nExt+len(c.tau)]
	copy(v, c.b[:e.nExt])
	for u, t := range c.tau {
		v[e.nExt+u] = float64(t)
	}
	m := len(v)
	t := s.t[:s.l.nPorts]
	pt := e.pt[:len(t)*m]
	if ports != nil {
		for _, i := range ports {
			var sum float64
			for j, x := range pt[int(i)*m : int(i+1)*m] {
				sum += x * v[j]
			}
			if dz != nil {
				sum += dz[i]
			}
			t[i] = sum
		}
		return
	}
	for i := range t {
		row := pt[i*m : (i+1)*m]
		var sum float64
		for j, x := range row {
			sum += x * v[j]
		}
		t[i] = sum
	}
	if dz != nil {
		for i := range t {
			t[i] += dz[i]
		}
	}
}

// losslessDirections sets the directions of the general path's first pass.
func (s *Solver) losslessDirections() {
	for i := range s.gearK {
		s.gearK[i] = 1
	}
	for i := range s.pflow {
		s.pflow[i] = -1
	}
}

// keyPass sets the key ports' torques T = H·b + W·τ (+ z of the drag
// torques) into s.t and their largest magnitude into c.tmax, reads the
// gear and planetary loss directions off them by the rules of directions,
// and reports whether any changed; c.near then says whether a key port's
// torque is rounding (non-zero, below 1e-12 of the largest) and
// c.loss holds the loss of the gears and sets at these torques and
// directions (the point's, once none changed).
//
// A gear's second port is not a row of its own: with the direction k of
// the system solved, the gear's equation r·T_b + k·T_a = 0 gives its
// torque; the directions are then read off both ports' powers as
// directions reads them, and the loss is (1 − η) times the power entering.
func (s *Solver) keyPass(e *sysEntry, dz []float64) bool {
	c := &s.comp
	t := s.t
	tmax := 0.0
	if kp := e.kp; kp != nil {
		// At most four columns (one output and a PTO, or two outputs, a
		// pump and a motor: the common layout), the rows zero-padded.
		var v [4]float64
		ne := e.nExt
		//lint:ignore S1001 at most four numbers: copy's memmove call costs more
		for k, b := range c.b[:ne] {
			v[k] = b
		}
		for u, tq := range c.tau {
			v[ne+u] = float64(tq)
		}
		v0, v1, v2, v3 := v[0], v[1], v[2], v[3]
		kp = kp[:4*len(c.keyPorts)]
		for k, i := range c.keyPorts {
			row := kp[4*k : 4*k+4 : 4*k+4]
			sum := 0 + row[0]*v0 + row[1]*v1 + row[2]*v2 + row[3]*v3
			if dz != nil {
				sum += dz[i]
			}
			t[i] = sum
			tmax = maxAbs(tmax, sum)
		}
	} else {
		s.portTorques(e, dz, c.keyPorts)
		for _, i := range c.keyPorts {
			tmax = maxAbs(tmax, t[i])
		}
	}
	// The rounding of the point's torques: 1e-12 of the largest key-port
	// torque. A torque below it is nil (an idle range gear, an idle set):
	// read off it, a direction would follow the rounding of the factored
	// system, which differs from one set of directions to the next, and so
	// with the points solved before.
	floor := 1e-12 * tmax
	near, changed := false, false
	for _, i := range c.keyPorts[:c.nFlow] {
		if a := math.Abs(t[i]); a <= floor && a != 0 {
			near = true
		}
	}
	var loss float64
	for _, gi := range c.gears {
		g := &s.ec[gi]
		ta := t[g.port0]
		tb := -s.gearK[g.index] * ta * g.invRatio // the gear's equation r·Tb + k·Ta = 0
		pa, pb := ta*s.w[g.a], tb*s.w[g.b]
		scale := math.Abs(pa) + math.Abs(pb)
		if a := math.Abs(ta); a <= floor && a != 0 {
			near = true
		}
		// A gear without torque (an idle range gear) is taken as lossless,
		// as a fresh general solve starts it, whatever the guess said; so
		// is one whose powers at the two ports are rounding of the same
		// sign (shafts standing to rounding).
		k := 1.0
		switch {
		case scale == 0 || math.Abs(ta) <= floor && math.Abs(tb) <= floor:
		case pa > 1e-13*scale:
			k = g.eta
			loss += (1 - g.eta) * pa
		case pb > 1e-13*scale:
			k = g.inv
			loss += (1 - g.eta) * pb
		}
		if k != s.gearK[g.index] {
			s.gearK[g.index] = k
			changed = true
		}
	}
	for _, pi := range s.l.planets {
		ps := &s.ec[pi]
		ts := t[ps.port0]
		if a := math.Abs(ts); a <= floor && a != 0 {
			near = true
		}
		f := s.planetFlow(ps, floor, true)
		if f != s.pflow[ps.index] {
			s.pflow[ps.index] = f
			changed = true
		}
		switch roll := ts * (s.w[ps.a] - s.w[ps.c]); f {
		case 0:
			loss += pos(roll * (1 - ps.eta))
		case 1:
			loss += pos(roll * (1 - ps.inv))
		}
	}
	c.tmax, c.near, c.loss = tmax, near, loss
	return changed
}

// keyRows copies the key ports' rows of e.pt into e.kp, four wide.
func (s *Solver) keyRows(e *sysEntry) {
	if e.kp == nil {
		return
	}
	m := e.nExt + s.nU
	clear(e.kp)
	for k, i := range s.comp.keyPorts {
		copy(e.kp[4*k:4*k+4], e.pt[int(i)*m:int(i+1)*m])
	}
}

// planetFlow returns the direction of the rolling power of set e read off
// the solver's torques and speeds (−1: turning as a block, lossless). A
// rolling power within rounding keeps the direction the set has, −1 read
// as the sun driving; with canon set, such a power (or a sun torque below
// floor) reads as the sun driving whatever the set had, as a fresh general
// solve reads it from its lossless start (the compiled path: its result
// must not follow a guess).
func (s *Solver) planetFlow(e *elemC, floor float64, canon bool) int8 {
	ws, wr, wc := s.w[e.a], s.w[e.b], s.w[e.c]
	rel := ws - wc
	wmax := maxAbs(maxAbs(math.Abs(ws), wr), wc)
	roll := s.t[e.port0] * rel
	scale := math.Abs(s.t[e.port0])*wmax + 1e-300
	f := s.pflow[e.index]
	switch {
	case math.Abs(rel) <= planetary.BlockTolerance*wmax:
		f = -1
	case canon && (math.Abs(s.t[e.port0]) <= floor || math.Abs(roll) <= 1e-13*scale):
		f = 0
	case roll > 1e-13*scale:
		f = 0
	case roll < -1e-13*scale:
		f = 1
	case f < 0:
		f = 0
	}
	return f
}
