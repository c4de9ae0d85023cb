package powersplit

import (
	"math"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// OutputDemand is what an operating point asks of one output: its speed and
// the torque it delivers to the load (positive when driving a load that turns
// the same way). For a FreeOutput the torque is ignored and solved.
type OutputDemand struct {
	Speed  units.AngularVelocity
	Torque units.Torque
}

// Point is an operating point: the range, the input (engine) speed, one
// demand per output in the order of Layout.Outputs, and one torque per PTO
// in the order of Layout.PTOs (nil means no PTO load). Settings holds
// motors at given settings for this point, overriding the layout's
// schedules (nil: none held beyond the layout's own, see
// Builder.MotorSchedule and Builder.HoldMotor).
type Point struct {
	Range    int
	Input    units.AngularVelocity
	Outputs  []OutputDemand
	PTO      []units.Torque
	Settings []MotorSetting
}

// PortState is the state at one port: the speed of its shaft, the torque the
// shaft applies to the element, and the power T·ω into the element.
type PortState struct {
	Shaft  int
	Speed  units.AngularVelocity
	Torque units.Torque
	Power  units.Power
}

// ElementState is the state of one element.
type ElementState struct {
	Name    string
	Kind    Kind
	Ports   []PortState    // in port order (gear a, b; sun, ring, carrier; pump, motors)
	Loss    units.Power    // ≥ 0
	Engaged bool           // clutch or brake engaged in this range
	Flow    planetary.Flow // planetary: direction of the rolling power
	Loop    int            // loop: index into State.Loops
}

// ShaftState is the state of one shaft: its speed, the torque it carries
// (half the sum of |T| over its ports, so |T| for a shaft between two
// elements) and the power it carries (half the sum of |T·ω|).
type ShaftState struct {
	Name   string
	Speed  units.AngularVelocity
	Torque units.Torque
	Power  units.Power
}

// FlowState is the state of an output or a PTO.
type FlowState struct {
	Name   string
	Speed  units.AngularVelocity
	Torque units.Torque // torque delivered to the load
	Power  units.Power  // T·ω delivered to the load
}

// LoopResult is the state of one hydrostatic loop.
type LoopResult struct {
	Name string
	hydrostat.LoopState
	// Ratio is the loop's speed ratio ωmotor/ωpump (first motor); ±Inf with
	// the pump stopped.
	Ratio float64
	// HydraulicPower is the power the pump delivers into the circuit, Δp·Q:
	// positive when power passes from the pump shaft to the motors, negative
	// when it passes back (circulating power).
	HydraulicPower units.Power
}

// Margin is the distance of one quantity from its limit, as typed measures
// that print in the trade's units. Value is the magnitude reached.
type Margin struct {
	Element  string
	Quantity string        // "high-line pressure", "pump pressure", "motor speed", "pump setting", ...
	Value    units.Measure // the magnitude reached
	Bound    string        // what the limit is: "relief setting", "rated pressure", "peak pressure", "maximum speed", "full displacement"
	Limit    units.Measure // zero when Unchecked
	// Unchecked means the limit is not rated (zero in the unit's spec): the
	// value is reported but nothing was checked against it.
	Unchecked bool
}

// Left returns Limit − Value in their unit: negative when the limit is
// crossed. It is zero for an unchecked margin.
func (m Margin) Left() units.Measure {
	if m.Unchecked {
		return units.Measure{Kind: m.Value.Kind}
	}
	return m.Limit.Sub(m.Value)
}

// Crossed reports whether the value lies beyond the limit (by more than
// rounding: 1e-12 of the limit). An unchecked margin is never crossed.
func (m Margin) Crossed() bool {
	return !m.Unchecked && m.Limit.SI-m.Value.SI < -1e-12*m.Limit.SI
}

// String returns "<element>: <quantity> <value>, <bound> <limit>",
// "<element>: <quantity> <value> above <bound> <limit>" when the limit is
// crossed, or "<element>: <quantity> <value>, <bound> not rated: not
// checked" when there is no limit.
func (m Margin) String() string {
	b := make([]byte, 0, 96)
	b = append(b, m.Element...)
	b = append(b, ": "...)
	if m.Crossed() {
		return string(units.AppendLimit(b, m.Quantity, m.Value, m.Bound, m.Limit))
	}
	b = append(b, m.Quantity...)
	b = append(b, ' ')
	b = m.Value.Append(b)
	b = append(b, ", "...)
	b = append(b, m.Bound...)
	if m.Unchecked {
		b = append(b, " not rated: not checked"...)
		return string(b)
	}
	b = append(b, ' ')
	b = m.Limit.Append(b)
	return string(b)
}

// State is the full steady state at an operating point. A State is filled by
// Solver.Solve and can be reused: its slices are kept and overwritten.
type State struct {
	Range     int
	RangeName string

	InputSpeed  units.AngularVelocity
	InputTorque units.Torque // torque the engine delivers into the input shaft
	InputPower  units.Power  // power the engine delivers

	Outputs     []FlowState
	PTOs        []FlowState
	OutputPower units.Power // sum over the outputs
	PTOPower    units.Power // sum over the PTOs

	Shafts   []ShaftState
	Elements []ElementState
	Loops    []LoopResult

	// Drags lists the load-independent losses (bearings, churning, open
	// plates, idle PTO, charge pumps) in the order the layout added them;
	// empty when the layout has none.
	Drags []DragState

	Loss          units.Power // sum of every element's loss and every drag source's loss
	HydrostatLoss units.Power // the part of Loss in the hydrostatic loops (Loss − HydrostatLoss is mechanical)
	DragLoss      units.Power // the part of Loss in the drag sources (charge pumps included)
	// Efficiency is (output + PTO power)/input power while the engine drives,
	// input/(output + PTO) power when the loads drive the engine (overrun),
	// and 0 when no power flows.
	Efficiency float64
	// HydraulicShare is the signed share of the input power through the
	// hydrostats: the sum of the loops' HydraulicPower over InputPower
	// (taken the other way in a range built with Builder.ReverseShare).
	// Negative means circulating power. Zero when no power enters.
	//
	// Δp·Q leaves out the pump's own loss: the shaft power the pump takes
	// is larger when it pumps (and smaller when it is driven as a motor).
	// PumpShare counts that shaft power.
	HydraulicShare float64
	// PumpShare is the signed share of the input power taken by the pumps'
	// shafts: Σ T·ω of the loops' pumps (their Mechanical power, own loss
	// included) over InputPower. Negative when the pumps run as motors and
	// return power to their shafts. Zero when no power enters.
	PumpShare float64

	// Margins lists, per loop: the high-line pressure against the relief
	// setting, the loop pressure against each unit's rated (continuous) and
	// peak pressure, each unit's speed against its maximum, each unit's
	// setting against full displacement. A limit the spec leaves at zero
	// (not rated) is listed with Unchecked set, so it is never silently
	// skipped.
	Margins []Margin
	// Flags lists the margins that are crossed but do not make the point
	// infeasible (rated continuous pressure exceeded below the relief).
	Flags []Margin

	// Binding is the limit the point is closest to: of the margins that
	// make a point infeasible when crossed (relief pressure, unit speeds,
	// settings; not the rated pressures, which are Flags), the one with the
	// least room left relative to its limit. Zero with no loop.
	Binding Margin

	Iterations int
	Residual   float64 // relative power-balance residual reached

	// Brief, set by the caller before Solve, asks for the summary of the
	// point only, the few numbers a sweep, a map or a search reads: every
	// field above except Shafts, Elements and Margins, which a Brief State
	// leaves empty. In Loops, each unit's Point then holds its Setting,
	// Speed, Pressure, Torque, Mechanical power and Loss (and the pump its
	// Flow and Hydraulic power); its other fields are zero. Everything a
	// Brief State holds equals what the full State of the same point
	// holds, to rounding. A State with Brief unset (the zero value) gets
	// the full state.
	Brief bool

	ports []PortState
}

// fill writes the state into st and returns the relative power-balance
// residual. With torques == 0 the torques are not known yet and are zero.
// The summary (summary) is written always; the detail (every port, shaft,
// element and margin) only when st is not Brief.
func (s *Solver) fill(st *State, p Point, r *rangeDef, iters int, torques int) float64 {
	st.size(s.l)
	res := s.summary(st, p, r, iters, torques)
	if !st.Brief {
		s.detail(st, r, torques)
	}
	return res
}

// portTorque returns the torque at port k of the solver's last solution,
// zero while torques are not known (torques == 0).
func (s *Solver) portTorque(k, torques int) float64 {
	if torques == 0 {
		return 0
	}
	return s.t[k] + 0 // + 0 turns −0 into 0
}

// elemLoss returns the loss of element i at the solver's last solution and,
// for a planetary set, the direction of its rolling power.
func (s *Solver) elemLoss(i, torques int) (float64, planetary.Flow) {
	e := &s.ec[i]
	if torques == 0 {
		return 0, 0
	}
	switch e.kind {
	case GearKind:
		switch k := s.gearK[e.index]; {
		case k < 1:
			return pos((1 - e.eta) * (s.portTorque(int(e.port0), 1) * s.w[e.a])), 0
		case k > 1:
			return pos((1 - e.eta) * (s.portTorque(int(e.port0)+1, 1) * s.w[e.b])), 0
		}
	case PlanetaryKind:
		roll := s.portTorque(int(e.port0), 1) * (s.w[e.a] - s.w[e.c])
		switch s.pflow[e.index] {
		case 0:
			return pos(roll * (1 - e.eta)), planetary.SunDrives
		case 1:
			return pos(roll * (1 - 1/e.eta)), planetary.RingDrives
		}
	case LoopKind:
		return pos(float64(s.loopA[e.index].Loss)), 0
	}
	return 0, 0
}

// summary writes what every point reports, Brief or not: the range, the
// input, the outputs and PTOs, the totals, the loops, the flags and the
// binding margin, and returns the relative power-balance residual.
func (s *Solver) summary(st *State, p Point, r *rangeDef, iters int, torques int) float64 {
	l := s.l
	st.Range, st.RangeName = p.Range, r.name
	st.Iterations = iters
	flow := func(i int) FlowState {
		e := &s.ec[i]
		w := s.w[e.a]
		t := s.portTorque(int(e.port0), torques)
		return FlowState{Name: l.elems[i].name, Speed: units.AngularVelocity(w), Torque: units.Torque(t), Power: units.Power(t * w)}
	}
	in := flow(l.input)
	st.InputSpeed = in.Speed
	st.InputTorque = -in.Torque
	st.InputPower = -in.Power
	st.OutputPower, st.PTOPower, st.Loss, st.HydrostatLoss = 0, 0, 0, 0
	for k, oi := range l.outputs {
		st.Outputs[k] = flow(oi)
		st.OutputPower += st.Outputs[k].Power
	}
	for k, pi := range l.ptos {
		st.PTOs[k] = flow(pi)
		st.PTOPower += st.PTOs[k].Power
	}
	for i := range s.ec {
		if torques == 0 {
			break
		}
		if k := s.ec[i].kind; k != GearKind && k != PlanetaryKind && k != LoopKind {
			continue // no loss
		}
		loss, _ := s.elemLoss(i, torques)
		st.Loss += units.Power(loss)
		if s.ec[i].kind == LoopKind {
			st.HydrostatLoss += units.Power(loss)
		}
	}
	hyd, pump := 0.0, 0.0
	for j, e := range l.loops {
		el := &l.elems[e]
		lr := &st.Loops[j]
		src := &s.loopA[j]
		m, set := lr.Motors, lr.Settings
		if torques == 0 {
			// Nothing solved yet (a limit found from the speeds alone): no
			// loop state but the units' speeds, never an earlier point's.
			clear(m)
			clear(set)
			lr.LoopState = hydrostat.LoopState{Motors: m, Settings: set}
			lr.Pump.Speed = units.AngularVelocity(s.w[el.shafts[0]])
			for k := range m {
				m[k].Speed = units.AngularVelocity(s.w[el.shafts[k+1]])
			}
		} else {
			copy(m, src.Motors)
			copy(set, src.Settings)
			lr.LoopState = *src
			lr.Motors, lr.Settings = m, set
		}
		lr.Name = el.name
		lr.Ratio = s.w[el.shafts[1]] / s.w[el.shafts[0]]
		lr.HydraulicPower = 0
		if torques != 0 {
			lr.HydraulicPower = src.Pump.Hydraulic
			pump += s.portTorque(el.port0, torques) * s.w[el.shafts[0]]
		}
		hyd += float64(lr.HydraulicPower)
	}
	var tmax float64
	if torques != 0 {
		for _, v := range s.t[:l.nPorts] {
			tmax = maxAbs(tmax, v)
		}
	}
	var wmax float64
	for _, v := range s.w[:len(l.shafts)] { // every shaft has a port
		wmax = maxAbs(wmax, v)
	}
	return s.totals(st, r, torques, pump, hyd, tmax, wmax)
}

// totals finishes a summary: the drag sources' losses, the efficiency, the
// shares of the input power through the pumps' shafts (pump) and through
// the loops (hyd), the margins, and the relative power-balance residual,
// which it returns. The balance is relative to the powers that flow, with
// a floor of 1e-3 of the largest port torque (tmax) at the largest shaft
// speed, so that a point where almost no power flows is judged by the
// rounding of the powers it could carry; wmax is the largest shaft speed.
func (s *Solver) totals(st *State, r *rangeDef, torques int, pump, hyd, tmax, wmax float64) float64 {
	l := s.l
	st.DragLoss = 0
	if len(l.drags) > 0 {
		st.DragLoss = units.Power(s.fillDrags(st, torques))
		st.Loss += st.DragLoss
	}
	pin, useful := float64(st.InputPower), float64(st.OutputPower+st.PTOPower)
	switch {
	case pin > 0 && useful > 0:
		st.Efficiency = min(1, useful/pin) // ≤ 1 up to rounding; min as math.Min, without its call
	case pin < 0 && useful < 0:
		st.Efficiency = min(1, pin/useful)
	default:
		st.Efficiency = 0
	}
	st.HydraulicShare, st.PumpShare = 0, 0
	if pin != 0 {
		st.PumpShare = pump / pin
		st.HydraulicShare = hyd / pin
		if r.reverse {
			st.HydraulicShare = -hyd / pin
		}
	}
	scale := math.Abs(pin) + math.Abs(useful) + float64(st.Loss) + 1e-3*tmax*wmax
	res := pin - useful - float64(st.Loss)
	if scale > 0 {
		res = math.Abs(res) / scale
	} else {
		res = 0
	}
	st.Residual = res
	s.margins(st, torques != 0)
	return res
}

// detail writes every port, shaft and element of the last solution into st.
func (s *Solver) detail(st *State, r *rangeDef, torques int) {
	l := s.l
	for i := range l.elems {
		e := &l.elems[i]
		es := &st.Elements[i]
		loss, fl := s.elemLoss(i, torques)
		if e.kind == LoopKind && torques != 0 {
			loss = pos(float64(st.Loops[e.index].Loss)) // the loop state as the summary took it
		}
		es.Name, es.Kind, es.Loss, es.Engaged, es.Flow, es.Loop = e.name, e.kind, units.Power(loss), r.engaged[i], fl, -1
		if e.kind == LoopKind {
			es.Loop = e.index
		}
		for k, sh := range e.shafts {
			ps := &es.Ports[k]
			ps.Shaft = sh
			ps.Speed = units.AngularVelocity(s.w[sh])
			ps.Torque = units.Torque(s.portTorque(e.port0+k, torques))
			ps.Power = units.Power(float64(ps.Torque) * float64(ps.Speed))
		}
	}
	for i := range st.Shafts {
		st.Shafts[i] = ShaftState{Name: l.shafts[i], Speed: units.AngularVelocity(s.w[i])}
	}
	for i := range st.ports {
		ps := &st.ports[i]
		sh := &st.Shafts[ps.Shaft]
		sh.Torque += units.Torque(math.Abs(float64(ps.Torque)) / 2)
		sh.Power += units.Power(math.Abs(float64(ps.Power)) / 2)
	}
}

// powerScale returns the largest port torque times the largest shaft speed.
func (st *State) powerScale() float64 {
	var t, w float64
	for i := range st.ports {
		t = maxAbs(t, float64(st.ports[i].Torque))
		w = maxAbs(w, float64(st.ports[i].Speed))
	}
	return t * w
}

// pos returns max(0, v) as math.Max does (+0 for −0, NaN for NaN) without
// its call.
func pos(v float64) float64 {
	if v <= 0 {
		return 0
	}
	return v
}

// maxAbs returns max(m, |v|) for m ≥ 0, NaN once either is NaN.
func maxAbs(m, v float64) float64 {
	if v < 0 {
		v = -v
	}
	if v > m || v != v {
		return v
	}
	return m
}

// size makes st's slices fit layout l, allocating only when they do not.
// A Brief st gets empty Shafts, Elements and Margins (their storage kept
// for a later full solve).
func (st *State) size(l *layout) {
	if cap(st.ports) < l.nPorts || cap(st.Elements) < len(l.elems) || len(st.Loops) != len(l.loops) ||
		cap(st.Shafts) < len(l.shafts) || len(st.Outputs) != len(l.outputs) || len(st.PTOs) != len(l.ptos) ||
		len(st.Drags) != len(l.drags) {
		st.ports = make([]PortState, l.nPorts)
		st.Elements = make([]ElementState, len(l.elems))
		st.Shafts = make([]ShaftState, len(l.shafts))
		st.Outputs = make([]FlowState, len(l.outputs))
		st.PTOs = make([]FlowState, len(l.ptos))
		st.Drags = nil
		if len(l.drags) > 0 {
			st.Drags = make([]DragState, len(l.drags))
		}
		st.Loops = make([]LoopResult, len(l.loops))
		nm := 0
		for j, e := range l.loops {
			m := len(l.elems[e].shafts) - 1
			st.Loops[j].Motors = make([]hydrostat.Point, m)
			st.Loops[j].Settings = make([]float64, m+1)
			nm += 4*(m+1) + 1
		}
		nm++ // the range's speed limit
		st.Margins = make([]Margin, 0, nm)
		st.Flags = make([]Margin, 0, nm)
	}
	if st.Brief {
		st.ports, st.Elements, st.Shafts, st.Margins = st.ports[:0], st.Elements[:0], st.Shafts[:0], st.Margins[:0]
	} else {
		st.ports, st.Elements, st.Shafts = st.ports[:l.nPorts], st.Elements[:len(l.elems)], st.Shafts[:len(l.shafts)]
		// A State filled for another layout of the same shape keeps its slices.
		for i := range l.elems {
			e := &l.elems[i]
			if len(st.Elements[i].Ports) != len(e.shafts) || cap(st.Elements[i].Ports) == 0 ||
				&st.Elements[i].Ports[:1][0] != &st.ports[e.port0] {
				st.Elements[i].Ports = st.ports[e.port0 : e.port0+len(e.shafts) : e.port0+len(e.shafts)]
			}
		}
	}
	for j, e := range l.loops {
		if m := len(l.elems[e].shafts) - 1; len(st.Loops[j].Motors) != m || len(st.Loops[j].Settings) != m+1 {
			st.Loops[j].Motors = make([]hydrostat.Point, m)
			st.Loops[j].Settings = make([]float64, m+1)
		}
	}
}

// Bounds of the margins.
const (
	boundRelief = "relief setting"
	boundRated  = "rated pressure"
	boundPeak   = "peak pressure"
	boundSpeed  = "maximum speed"
	boundFull   = "full displacement"
	// boundRangeSpeed is a range's speed limit (a second motor's declutch
	// speed).
	boundRangeSpeed = "range's maximum output speed"
)

// marginDesc is what a margin of the layout is, known before any point:
// its names, its limit and whether that limit is rated. margins reads the
// point's value of each.
type marginDesc struct {
	elem, quantity, bound string
	limit                 float64
	kind                  units.Kind
	inv                   float64 // 1/limit: the room left relative to the limit is (limit − v)·inv
	unchecked             bool    // the limit is not rated: listed, never checked
	rated                 bool    // a rated pressure: crossing it is a flag, not a limit
}

// at returns the margin of d at value v.
func (d *marginDesc) at(v float64) Margin {
	return Margin{Element: d.elem, Quantity: d.quantity, Value: measure(v, d.kind), Bound: d.bound, Limit: measure(d.limit, d.kind), Unchecked: d.unchecked}
}

// marginSet is a list of margins with the places of those take checks:
// the limits and the ratings, each in the list's order, the unrated left
// out.
type marginSet struct {
	ds         []marginDesc
	lim, rated []int
}

// newMarginSet returns the set of ds.
func newMarginSet(ds []marginDesc) marginSet {
	m := marginSet{ds: ds}
	for i := range ds {
		switch d := &ds[i]; {
		case d.unchecked:
		case d.rated:
			m.rated = append(m.rated, i)
		default:
			m.lim = append(m.lim, i)
		}
	}
	return m
}

// initMargins lists the layout's margins in the order margins takes them:
// per range its speed limit (when it has one); per loop the high-line
// pressure against the relief setting, then per unit its pressure against
// the rated and the peak pressure, its speed and its setting.
func (s *Solver) initMargins() {
	l := s.l
	const w, pa = units.AngularVelocityKind, units.PressureKind
	s.rangeM = make([]marginSet, len(l.ranges))
	for i := range l.ranges {
		r := &l.ranges[i]
		s.rangeM[i] = newMarginSet([]marginDesc{{elem: r.name, quantity: "output speed", bound: boundRangeSpeed, limit: r.maxOut, kind: w, inv: 1 / r.maxOut}})
	}
	s.loopM = make([]marginSet, len(l.loops))
	s.mval = make([]float64, 1) // the range's speed limit; a loop's below
	for j, e := range l.loops {
		el := &l.elems[e]
		spec := &el.lspec
		ds := []marginDesc{{elem: el.name, quantity: "high-line pressure", bound: boundRelief, limit: float64(spec.Relief), kind: pa, unchecked: spec.Relief <= 0}}
		for k := range el.shafts {
			us := &el.uspec[k]
			ds = append(ds,
				marginDesc{elem: el.name, quantity: el.unames[k][0], bound: boundRated, limit: float64(us.RatedPressure), kind: pa, unchecked: us.RatedPressure <= 0, rated: true},
				marginDesc{elem: el.name, quantity: el.unames[k][0], bound: boundPeak, limit: float64(us.PeakPressure), kind: pa, unchecked: us.PeakPressure <= 0},
				marginDesc{elem: el.name, quantity: el.unames[k][1], bound: boundSpeed, limit: float64(us.MaxSpeed), kind: w, unchecked: us.MaxSpeed <= 0},
				marginDesc{elem: el.name, quantity: el.unames[k][2], bound: boundFull, limit: 1, kind: units.Number})
		}
		for k := range ds {
			ds[k].inv = 1 / ds[k].limit
		}
		s.loopM[j] = newMarginSet(ds)
		if len(ds) > len(s.mval) {
			s.mval = make([]float64, len(ds))
		}
	}
}

// margins lists the distance of every loop quantity from its limit in
// st.Margins (not for a Brief st), the crossed ratings in st.Flags, the
// binding margin in st.Binding, and keeps the first infeasible margin for
// limits. A limit the spec leaves at zero is listed as Unchecked. With
// known false (no torques yet) only the lists are cleared.
func (s *Solver) margins(st *State, known bool) {
	l := s.l
	st.Margins = st.Margins[:0]
	st.Flags = st.Flags[:0]
	s.bad = nil
	if !known {
		st.Binding = Margin{}
		return
	}
	var k mtake
	k.room = math.Inf(1)
	if r := &l.ranges[st.Range]; r.maxOut > 0 {
		v := s.mval[:1]
		v[0] = math.Abs(s.outW[0])
		k.take(st, &s.rangeM[st.Range], v)
	}
	for j := range l.loops {
		ms := &s.loopM[j]
		ds := ms.ds
		ls := &st.Loops[j]
		dp := math.Abs(float64(ls.Pressure))
		v := s.mval[:len(ds)]
		v[0] = float64(l.elems[l.loops[j]].lspec.Charge) + dp
		for k := 1; k+3 < len(v); k += 4 {
			pt := &ls.Pump
			if k > 1 {
				pt = &ls.Motors[(k-1)/4-1]
			}
			v[k], v[k+1], v[k+2], v[k+3] = dp, dp, math.Abs(float64(pt.Speed)), math.Abs(pt.Setting)
		}
		k.take(st, ms, v)
	}
	s.bad, s.badV = k.bad, k.badV
	b := &st.Binding
	if d := k.bind; d != nil {
		// Field by field: a composite literal is built aside and copied.
		b.Element, b.Quantity, b.Bound, b.Unchecked = d.elem, d.quantity, d.bound, d.unchecked
		b.Value, b.Limit = measure(k.bindV, d.kind), measure(d.limit, d.kind)
	} else {
		*b = Margin{}
	}
}

// mtake is what margins keeps while it takes the margins of a point: the
// binding margin so far with its relative room, and the first crossed
// limit.
type mtake struct {
	room        float64
	bind, bad   *marginDesc
	bindV, badV float64
}

// take takes the margins ds at values v into st: each listed unless st is
// Brief, flagged when a crossed rating, the binding one when it has the
// least room so far, and kept for limits when it is the first crossed
// limit. A Margin value is built only where it is kept.
func (k *mtake) take(st *State, m *marginSet, v []float64) {
	ds := m.ds
	v = v[:len(ds)]
	if !st.Brief {
		for i := range ds {
			st.Margins = append(st.Margins, ds[i].at(v[i]))
		}
	}
	for _, i := range m.rated {
		// A rating is a flag, not a limit.
		if d := &ds[i]; d.limit-v[i] < -1e-12*d.limit { // Margin.Crossed
			st.Flags = append(st.Flags, d.at(v[i]))
		}
	}
	room, bind, bindV := k.room, -1, 0.0
	for _, i := range m.lim {
		d := &ds[i]
		left := d.limit - v[i]
		if r := left * d.inv; r < room {
			room, bind, bindV = r, i, v[i]
		}
		if left < -1e-12*d.limit && k.bad == nil {
			k.bad, k.badV = d, v[i]
		}
	}
	if bind >= 0 {
		k.room, k.bind, k.bindV = room, &ds[bind], bindV
	}
}

// measure is units.Of for a known kind, without its type switch.
func measure(v float64, k units.Kind) units.Measure { return units.Measure{SI: v, Kind: k} }

// limits returns a *LimitError for the first infeasible margin that
// margins found.
func (s *Solver) limits() error {
	if s.bad == nil {
		return nil
	}
	m := s.bad.at(s.badV)
	sent := ErrInfeasible
	if m.Bound == boundFull {
		sent = ErrUnreachable
	}
	return s.limitErr(LimitError{Element: m.Element, Quantity: m.Quantity, Value: m.Value, Bound: m.Bound, Limit: m.Limit, Err: sent})
}
