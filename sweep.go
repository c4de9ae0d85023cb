package powersplit

import (
	"encoding/csv"
	"errors"
	"io"
	"math"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"

	"github.com/powersplit-dev/powersplit/units"
)

// Cell is the result at one grid point of a sweep or map.
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
	Torque   units.Torque
	Power    units.Power
	PTO      []units.Torque
	Workers  int                   // parallel workers; 0 means GOMAXPROCS
	Progress func(done, total int) // called after each point, serialised; may be nil
}

// Sweep is the result of Layout.Sweep: one Cell per output speed.
type Sweep struct {
	Design     string                // the spec's Design
	Input      units.AngularVelocity // the spec's input speed
	RangeNames []string              // the layout's range names, by Cell.Range
	Speeds     []units.AngularVelocity
	Cells      []Cell
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
	TorqueSteps          int // ≥ 2
	PTO                  []units.Torque
	Workers              int
	Progress             func(done, total int)
}

// Map is the result of Layout.Map: Cells[i][j] at Torques[i], Speeds[j].
type Map struct {
	Design     string                // the spec's Design
	Input      units.AngularVelocity // the spec's input speed
	RangeNames []string              // the layout's range names, by Cell.Range
	Speeds     []units.AngularVelocity
	Torques    []units.Torque
	Cells      [][]Cell
}

// Feasible returns the feasibility mask: mask[i][j] is Cells[i][j].OK.
func (m Map) Feasible() [][]bool {
	mask := make([][]bool, len(m.Cells))
	for i, row := range m.Cells {
		mask[i] = make([]bool, len(row))
		for j, c := range row {
			mask[i][j] = c.OK
		}
	}
	return mask
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

// job solves one cell.
type job func(s *Solver, st *State, p *Point, i int) Cell

// runChunk is the number of consecutive cells a worker takes at a time in
// a sweep: large enough that the workers rarely meet on the shared counter
// or on neighbouring cells, small enough to balance the load.
const runChunk = 16

// run solves n cells in rows of cols (the last row may be shorter) on
// workers goroutines, each with its own Solver. A worker takes a whole row
// at a time and allocates it itself, so that the zeroing of a large result
// (5 MB for a 200 × 200 map) is shared by the workers instead of preceding
// them. Results depend only on the cell, never on the order or the worker,
// so they are deterministic (and identical for any number of workers).
func (l Layout) run(n, cols, workers int, progress func(int, int), p Point, f job) [][]Cell {
	nrows := (n + cols - 1) / cols
	rows := make([][]Cell, nrows)
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, nrows)
	var next atomic.Int64
	var mu sync.Mutex
	done := 0
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			s := NewSolver(l)
			st := State{Brief: !s.general} // a cell needs the summary only
			q := p
			q.Outputs = append([]OutputDemand(nil), p.Outputs...)
			for {
				r := int(next.Add(1)) - 1
				if r >= nrows {
					return
				}
				i0, i1 := r*cols, min((r+1)*cols, n)
				row := make([]Cell, i1-i0)
				for i := i0; i < i1; i++ {
					row[i-i0] = f(s, &st, &q, i)
					if progress != nil {
						mu.Lock()
						done++
						progress(done, n)
						mu.Unlock()
					}
				}
				rows[r] = row
			}
		})
	}
	wg.Wait()
	return rows
}

// Reason is why the cell failed (its error's text), or "" when it solved.
// The text is built on call, so a map of infeasible cells costs no strings.
func (c Cell) Reason() string {
	if c.Err == nil {
		return ""
	}
	return c.Err.Error()
}

// solveCell solves q in range rg (or Auto) and summarises it.
func solveCell(s *Solver, st *State, q *Point, rg int, pol Policy) Cell {
	var err error
	if rg == Auto {
		err = s.Best(*q, pol, st)
	} else {
		q.Range = rg
		err = s.Solve(*q, st)
	}
	c := Cell{OK: err == nil, Err: err, Range: st.Range, OutputTorque: q.Outputs[0].Torque,
		OutputSpeed: q.Outputs[0].Speed}
	if err != nil {
		return c
	}
	c.InputTorque, c.InputPower, c.OutputPower = st.InputTorque, st.InputPower, st.OutputPower
	c.OutputTorque = st.Outputs[0].Torque
	c.Loss, c.Efficiency, c.HydraulicShare = st.Loss, st.Efficiency, st.HydraulicShare
	if len(st.Loops) > 0 {
		lp := &st.Loops[0]
		c.Pressure, c.HighPressure = lp.Pressure, lp.High
		c.PumpSetting, c.PumpSpeed = lp.Pump.Setting, lp.Pump.Speed
		if len(lp.Motors) > 0 {
			c.MotorSetting, c.MotorSpeed = lp.Motors[0].Setting, lp.Motors[0].Speed
		}
	}
	c.Binding = st.Binding
	return c
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
	rows := l.run(len(vs), runChunk, spec.Workers, spec.Progress, p, func(s *Solver, st *State, q *Point, i int) Cell {
		for k := range q.Outputs {
			q.Outputs[k] = OutputDemand{Speed: units.AngularVelocity(vs[i])}
		}
		if spec.Power == 0 {
			q.Outputs[0].Torque = spec.Torque
			return solveCell(s, st, q, spec.Range, spec.Policy)
		}
		return powerCell(s, st, q, spec.Range, spec.Policy, float64(spec.Power))
	})
	cells := make([]Cell, 0, len(vs))
	for _, r := range rows {
		cells = append(cells, r...)
	}
	out := Sweep{Design: spec.Design, Input: spec.Input, RangeNames: l.rangeNames(),
		Speeds: make([]units.AngularVelocity, len(vs)), Cells: cells}
	for i, v := range vs {
		out.Speeds[i] = units.AngularVelocity(v)
	}
	return out, nil
}

// powerCell finds the output torque at which the engine delivers power P
// (secant iteration on the output torque; input power is close to affine in
// it).
func powerCell(s *Solver, st *State, q *Point, rg int, pol Policy, P float64) Cell {
	pin := func(t float64) (float64, Cell) {
		q.Outputs[0].Torque = units.Torque(t)
		c := solveCell(s, st, q, rg, pol)
		return float64(c.InputPower), c
	}
	w := math.Abs(float64(q.Outputs[0].Speed))
	t0 := 0.0
	t1 := 0.8 * P / math.Max(w, 0.05*math.Abs(float64(q.Input)))
	if float64(q.Outputs[0].Speed) < 0 {
		t1 = -t1
	}
	f0, c0 := pin(t0)
	if !c0.OK {
		return c0
	}
	// lim is the last limit met on the way: when the power is not reached,
	// it is what stopped the search.
	var lim error
	for k := 0; k < 40; k++ {
		f1, c1 := pin(t1)
		if !c1.OK {
			if errors.Is(c1.Err, ErrInfeasible) {
				lim = c1.Err
			}
			// Step back towards the last good torque.
			t1 = (t0 + t1) / 2
			continue
		}
		if math.Abs(f1-P) <= 1e-9*math.Abs(P) {
			return c1
		}
		if f1 == f0 {
			break
		}
		t0, t1, f0 = t1, t1-(f1-P)*(t1-t0)/(f1-f0), f1
		if bad(t1) {
			break
		}
	}
	c := Cell{OutputSpeed: q.Outputs[0].Speed, Range: rg}
	if lim != nil {
		c.Err = &PowerError{Power: units.Power(P), Err: lim}
		return c
	}
	c.Err = &PowerError{Power: units.Power(P), Err: ErrUnreachable}
	return c
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
	vs := axis(float64(spec.SpeedFrom), float64(spec.SpeedTo), spec.SpeedSteps)
	ts := axis(float64(spec.TorqueFrom), float64(spec.TorqueTo), spec.TorqueSteps)
	nv := len(vs)
	p := l.point(spec.Input, spec.PTO)
	// A worker takes a row of the map at a time, unless there are too few
	// rows to share among the workers: then chunks, joined afterwards.
	cols, workers := nv, spec.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	if len(ts) < 4*workers {
		cols = runChunk
	}
	rows := l.run(nv*len(ts), cols, spec.Workers, spec.Progress, p, func(s *Solver, st *State, q *Point, i int) Cell {
		for k := range q.Outputs {
			q.Outputs[k] = OutputDemand{Speed: units.AngularVelocity(vs[i%nv])}
		}
		q.Outputs[0].Torque = units.Torque(ts[i/nv])
		return solveCell(s, st, q, spec.Range, spec.Policy)
	})
	if cols != nv {
		flat := make([]Cell, 0, nv*len(ts))
		for _, r := range rows {
			flat = append(flat, r...)
		}
		rows = make([][]Cell, len(ts))
		for i := range rows {
			rows[i] = flat[i*nv : (i+1)*nv : (i+1)*nv]
		}
	}
	m := Map{Design: spec.Design, Input: spec.Input, RangeNames: l.rangeNames(),
		Speeds: make([]units.AngularVelocity, nv), Torques: make([]units.Torque, len(ts)), Cells: rows}
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

// CSVHeader is the header row of Sweep.WriteCSV and Map.WriteCSV: every
// column names its quantity and its unit (pct for fractions in percent).
// Settings are the displacement over its maximum; binding_limit names the
// margin nearest its limit and binding_left_pct the room left in percent of
// that limit.
var CSVHeader = []string{"design", "input_speed_rpm", "output_speed_rpm", "output_torque_Nm", "feasible", "range",
	"input_torque_Nm", "input_power_kW", "output_power_kW", "loss_kW", "efficiency_pct", "hydraulic_share_pct",
	"loop_pressure_bar", "high_pressure_bar", "pump_speed_rpm", "motor_speed_rpm", "pump_setting_pct",
	"motor_setting_pct", "binding_limit", "binding_left_pct", "reason"}

func (c Cell) record(design string, in units.AngularVelocity, names []string) []string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }
	head := []string{design, f(in.RPM()), f(c.OutputSpeed.RPM()), f(float64(c.OutputTorque))}
	if !c.OK {
		return append(head, "false", "", "", "", "", "", "", "", "", "", "", "", "", "", "", "", c.Reason())
	}
	rg := strconv.Itoa(c.Range)
	if c.Range >= 0 && c.Range < len(names) {
		rg = names[c.Range]
	}
	bind, left := "", ""
	if c.Binding.Limit.SI > 0 {
		bind = c.Binding.Element + " " + c.Binding.Quantity
		left = f(100 * c.Binding.Left().SI / c.Binding.Limit.SI)
	}
	return append(head, "true", rg,
		f(float64(c.InputTorque)), f(c.InputPower.Kilowatts()), f(c.OutputPower.Kilowatts()), f(c.Loss.Kilowatts()),
		f(100*c.Efficiency), f(100*c.HydraulicShare), f(c.Pressure.Bar()), f(c.HighPressure.Bar()),
		f(c.PumpSpeed.RPM()), f(c.MotorSpeed.RPM()), f(100*c.PumpSetting), f(100*c.MotorSetting), bind, left, "")
}

// WriteCSV writes the sweep as CSV: the header CSVHeader, then one row per
// speed. Infeasible rows carry the reason and leave the results empty.
func (s Sweep) WriteCSV(w io.Writer) error {
	return writeCells(w, s.Design, s.Input, s.RangeNames, [][]Cell{s.Cells})
}

// WriteCSV writes the map as CSV in long form: the header CSVHeader, then
// one row per cell, torque-major.
func (m Map) WriteCSV(w io.Writer) error {
	return writeCells(w, m.Design, m.Input, m.RangeNames, m.Cells)
}

func writeCells(w io.Writer, design string, in units.AngularVelocity, names []string, rows [][]Cell) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(CSVHeader); err != nil {
		return err
	}
	for _, row := range rows {
		for _, c := range row {
			if err := cw.Write(c.record(design, in, names)); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return errors.Join(cw.Error())
}

func (l Layout) rangeNames() []string {
	out := make([]string, len(l.l.ranges))
	for i := range out {
		out[i] = l.l.ranges[i].name
	}
	return out
}
