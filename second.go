package powersplit

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// SettingCurve is a motor's setting magnitude as a piecewise-linear
// function of the first output's speed |ω|: Settings[i] at Speeds[i],
// linear between them and held at the end values beyond them. The solver
// gives the setting the sign with which the motor drives its shaft (the
// loop's high-pressure line changes sides with the direction of the
// hydrostatic power, for example beyond an output-coupled split's
// mechanical point). The zero SettingCurve is empty.
type SettingCurve struct {
	Speeds   []units.AngularVelocity // ascending, >= 0
	Settings []float64               // in [0, 1]
}

// Empty reports whether c has no points.
func (c SettingCurve) Empty() bool { return len(c.Speeds) == 0 }

// Validate checks that c is empty or has matching, finite points with
// ascending speeds >= 0 and settings in [0, 1].
func (c SettingCurve) Validate() error {
	if len(c.Speeds) != len(c.Settings) {
		return &InputError{Field: "SettingCurve.Settings", Value: units.Plain(float64(len(c.Settings))), Reason: "one setting per speed needed"}
	}
	for i, w := range c.Speeds {
		if bad(float64(w)) || w < 0 || (i > 0 && !(w > c.Speeds[i-1])) {
			return &InputError{Field: fmt.Sprintf("SettingCurve.Speeds[%d]", i), Value: units.Of(w), Reason: "speeds must be finite, >= 0 and ascending"}
		}
		if x := c.Settings[i]; !(x >= 0 && x <= 1) {
			return &InputError{Field: fmt.Sprintf("SettingCurve.Settings[%d]", i), Value: units.Plain(x), Reason: "setting magnitude outside [0, 1]"}
		}
	}
	return nil
}

// At returns the setting magnitude at first-output speed w (its
// magnitude is used). It panics on an empty curve.
func (c SettingCurve) At(w units.AngularVelocity) float64 {
	v := math.Abs(float64(w))
	n := len(c.Speeds)
	if v <= float64(c.Speeds[0]) {
		return c.Settings[0]
	}
	if v >= float64(c.Speeds[n-1]) {
		return c.Settings[n-1]
	}
	i := 1
	for float64(c.Speeds[i]) < v {
		i++
	}
	x0, x1 := float64(c.Speeds[i-1]), float64(c.Speeds[i])
	t := (v - x0) / (x1 - x0)
	return c.Settings[i-1] + t*(c.Settings[i]-c.Settings[i-1])
}

// MotorSetting holds one motor of a loop at a setting for one point.
type MotorSetting struct {
	Loop    int     // index of the loop among the layout's loops
	Motor   int     // 0 is the loop's first motor
	Setting float64 // in [-1, 1]
}

// pinDef is a motor whose setting the layout sets: by a curve of the first
// output's speed, or held at a value in some ranges.
type pinDef struct {
	loop, motor int
	curve       SettingCurve
	hold        []float64 // per range: the held setting, NaN for none
}

type pinSpec struct {
	loop  string
	motor int
	curve SettingCurve
}

type holdSpec struct {
	rng, loop string
	motor     int
	x         float64
}

// MotorSchedule sets motor `motor` (0 the first) of loop `loop` by curve:
// its setting magnitude follows the first output's speed (see
// SettingCurve), in every range in which HoldMotor does not hold it. The
// loop's own schedule sets the pump and the other motors (with a held
// motor: hydrostat.Pinned).
func (b *Builder) MotorSchedule(loop string, motor int, curve SettingCurve) {
	if err := curve.Validate(); err != nil {
		b.fail(loop, err.Error())
		return
	}
	if curve.Empty() {
		b.fail(loop, "empty setting curve")
		return
	}
	b.pins = append(b.pins, pinSpec{loop: loop, motor: motor, curve: curve})
}

// HoldMotor holds motor `motor` (0 the first) of loop `loop` at setting x
// in [-1, 1] in range rng: for example a motor swung back to zero and
// declutched.
func (b *Builder) HoldMotor(rng, loop string, motor int, x float64) {
	if !(x >= -1 && x <= 1) {
		b.fail(loop, fmt.Sprintf("held setting %g outside [-1, 1]", x))
		return
	}
	b.holds = append(b.holds, holdSpec{rng: rng, loop: loop, motor: motor, x: x})
}

// buildPins resolves the builder's motor schedules and holds into l.
func (b *Builder) buildPins(l *layout) error {
	find := func(loop string, motor int) (int, error) {
		for j, e := range l.loops {
			if el := &l.elems[e]; el.name == loop {
				if motor < 0 || motor >= len(el.shafts)-1 {
					return 0, &LayoutError{Element: loop, Reason: fmt.Sprintf("no motor %d in this loop", motor), Err: ErrLayout}
				}
				return j, nil
			}
		}
		return 0, &LayoutError{Element: loop, Reason: "motor schedule for an unknown loop", Err: ErrLayout}
	}
	def := func(j, motor int) *pinDef {
		for i := range l.pins {
			if l.pins[i].loop == j && l.pins[i].motor == motor {
				return &l.pins[i]
			}
		}
		h := make([]float64, len(l.ranges))
		for i := range h {
			h[i] = math.NaN()
		}
		l.pins = append(l.pins, pinDef{loop: j, motor: motor, hold: h})
		return &l.pins[len(l.pins)-1]
	}
	for _, p := range b.pins {
		j, err := find(p.loop, p.motor)
		if err != nil {
			return err
		}
		d := def(j, p.motor)
		d.curve = SettingCurve{Speeds: append([]units.AngularVelocity(nil), p.curve.Speeds...), Settings: append([]float64(nil), p.curve.Settings...)}
	}
	for _, h := range b.holds {
		j, err := find(h.loop, h.motor)
		if err != nil {
			return err
		}
		ri := -1
		for i := range l.ranges {
			if l.ranges[i].name == h.rng {
				ri = i
			}
		}
		if ri < 0 {
			return &LayoutError{Element: h.rng, Reason: "held motor setting for an unknown range", Err: ErrLayout}
		}
		def(j, h.motor).hold[ri] = h.x
	}
	return nil
}

// initPins sets up the solver's held settings: one pinned copy of every
// loop, sharing the solver's held-setting buffer.
func (s *Solver) initPins() {
	l := s.l
	s.pinHeld = make([][]float64, len(l.loops))
	s.pinLoop = make([]hydrostat.Loop, len(l.loops))
	s.pinOn = make([]bool, len(l.loops))
	for j, e := range l.loops {
		el := &l.elems[e]
		s.pinHeld[j] = make([]float64, len(el.shafts)-1)
		// The loop's floor is negative for over-centre motors; Pinned takes
		// 0 for "as far as the swings allow", as Sequential does.
		lp, err := el.loop.WithSchedule(hydrostat.Pinned{Held: s.pinHeld[j], MinMotorSetting: math.Max(0, el.loop.MinMotorSetting())})
		if err != nil {
			panic("powersplit: pinned schedule: " + err.Error())
		}
		s.pinLoop[j] = lp
	}
}

// loopOf returns the loop j to evaluate at this point: its pinned copy
// when a motor is held.
func (s *Solver) loopOf(j int) *hydrostat.Loop {
	if s.lockedNow {
		return &s.lockLoop[j]
	}
	if s.pinOn[j] {
		return &s.pinLoop[j]
	}
	return &s.l.elems[s.l.loops[j]].loop
}

// setPins fills the held settings of point p's range at first-output
// speed s.outW[0]; flip negates the settings that come from curves.
func (s *Solver) setPins(p *Point, flip bool) {
	l := s.l
	none := len(l.pins) == 0 && len(p.Settings) == 0
	if none && s.noPins {
		return // nothing held now, nor at the last call
	}
	s.noPins = none
	for j := range s.pinHeld {
		for k := range s.pinHeld[j] {
			s.pinHeld[j][k] = math.NaN()
		}
	}
	ri := p.Range
	for i := range l.pins {
		d := &l.pins[i]
		x := d.hold[ri]
		if math.IsNaN(x) && !d.curve.Empty() {
			x = d.curve.At(units.AngularVelocity(s.outW[0]))
			if flip {
				x = -x
			}
		}
		s.pinHeld[d.loop][d.motor] = x
	}
	for _, m := range p.Settings {
		s.pinHeld[m.Loop][m.Motor] = m.Setting
	}
	for j := range s.pinHeld {
		s.pinOn[j] = false
		for _, x := range s.pinHeld[j] {
			if !math.IsNaN(x) {
				s.pinOn[j] = true
			}
		}
	}
}

// curveDrives reports whether every motor set by a curve at this point
// drives its shaft (or carries no power) in st, and so whether the signs
// the curves were given suit the loop's pressure.
func (s *Solver) curveDrives(p *Point, st *State) bool {
	l := s.l
	for i := range l.pins {
		d := &l.pins[i]
		if d.curve.Empty() || !math.IsNaN(d.hold[p.Range]) || overridden(p, d) {
			continue
		}
		m := &st.Loops[d.loop].Motors[d.motor]
		if m.Mechanical > 0 && m.Setting != 0 {
			return false
		}
	}
	return true
}

func overridden(p *Point, d *pinDef) bool {
	for _, m := range p.Settings {
		if m.Loop == d.loop && m.Motor == d.motor {
			return true
		}
	}
	return false
}

// hasCurves reports whether some motor is set by a curve in range rg.
func (l *layout) hasCurves(rg int) bool {
	for i := range l.pins {
		if !l.pins[i].curve.Empty() && math.IsNaN(l.pins[i].hold[rg]) {
			return true
		}
	}
	return false
}

// checkSettings validates p.Settings against the layout.
func (s *Solver) checkSettings(p *Point) error {
	l := s.l
	for _, m := range p.Settings {
		if m.Loop < 0 || m.Loop >= len(l.loops) {
			return &InputError{Field: "Settings.Loop", Value: units.Plain(float64(m.Loop)), Reason: "no such loop"}
		}
		if m.Motor < 0 || m.Motor >= len(l.elems[l.loops[m.Loop]].shafts)-1 {
			return &InputError{Field: "Settings.Motor", Value: units.Plain(float64(m.Motor)), Reason: "no such motor in the loop"}
		}
		if !(m.Setting >= -1 && m.Setting <= 1) {
			return &InputError{Field: "Settings.Setting", Value: units.Plain(m.Setting), Reason: "outside [-1, 1]"}
		}
	}
	return nil
}

// TotalDemand asks SolveTotal for a total of the outputs' torques,
// Σ Weights[i]·T_i = Torque, T_i being the torque output i delivers to its
// load. The weights convert each output's torque to a common measure (for
// two axles: the ratio of each output to its wheels over the wheels'
// radius, so that the total is a tractive force). Nil Weights means 1 for
// every output.
type TotalDemand struct {
	Torque  units.Torque
	Weights []float64
}

// SolveTotal solves a point of a layout whose first output has a given
// torque and whose other outputs are FreeOutputs (their torques follow from
// the loop pressure and the motors' settings, as with a second motor on a
// second axle): it finds the first output's torque at which the weighted
// total of every output's torque meets d, with the outputs at the speeds p
// gives (p.Outputs[0].Torque is the first guess; zero means the whole
// total). st then holds each output's torque, the pressure, every setting
// and the split of power. Errors are Solve's; a total that no torque of
// the first output meets within 40 solves is a *ConvergenceError.
func (s *Solver) SolveTotal(p Point, d TotalDemand, st *State) error {
	return resetOnInput(s.solveTotal(p, d, st), st)
}

func (s *Solver) solveTotal(p Point, d TotalDemand, st *State) error {
	if err := s.checkEntry(&p, st); err != nil {
		return err
	}
	l := s.l
	if d.Weights != nil && len(d.Weights) != len(l.outputs) {
		return &InputError{Field: "len(TotalDemand.Weights)", Value: units.Plain(float64(len(d.Weights))), Reason: "one weight per output, or nil"}
	}
	wt := func(i int) float64 {
		if d.Weights == nil {
			return 1
		}
		return d.Weights[i]
	}
	for i := range l.outputs {
		if w := wt(i); bad(w) {
			return &InputError{Field: "TotalDemand.Weights", Value: units.Plain(w), Reason: "not finite"}
		}
	}
	if bad(float64(d.Torque)) {
		return &InputError{Field: "TotalDemand.Torque", Value: units.Of(d.Torque), Reason: "not finite"}
	}
	if wt(0) == 0 || l.elems[l.outputs[0]].kind != OutputKind {
		return &InputError{Field: "TotalDemand", Value: units.Plain(wt(0)), Reason: "the first output must have a given torque and a non-zero weight"}
	}
	if len(s.outs) != len(p.Outputs) {
		s.outs = make([]OutputDemand, len(p.Outputs))
	}
	copy(s.outs, p.Outputs)
	p.Outputs = s.outs
	total := float64(d.Torque)
	f := func(x float64) (float64, error) {
		p.Outputs[0].Torque = units.Torque(x)
		if err := s.Solve(p, st); err != nil {
			return 0, err
		}
		sum := 0.0
		for i := range st.Outputs {
			sum += wt(i) * float64(st.Outputs[i].Torque)
		}
		return sum - total, nil
	}
	x0 := float64(p.Outputs[0].Torque)
	if x0 == 0 {
		x0 = total / wt(0)
	}
	f0, err := f(x0)
	if err != nil {
		return err
	}
	tol := 1e-10 * (math.Abs(total) + math.Abs(wt(0)*x0) + 1e-9)
	if math.Abs(f0) <= tol {
		return nil
	}
	// Secant from the first guess and the step the first output alone would
	// need; the free outputs' torques follow the first nearly linearly.
	x1 := x0 - f0/wt(0)
	for it := 0; it < 40; it++ {
		f1, err := f(x1)
		if err != nil {
			return err
		}
		if math.Abs(f1) <= tol {
			return nil
		}
		if f1 == f0 {
			break
		}
		x0, f0, x1 = x1, f1, x1-f1*(x1-x0)/(f1-f0)
		tol = 1e-10 * (math.Abs(total) + math.Abs(wt(0)*x1) + 1e-9)
	}
	return &ConvergenceError{Iterations: 40, Residual: math.Abs(f0) / (math.Abs(total) + 1e-9)}
}

// SettingSearch asks Solver.BestSetting for the setting of one motor that
// minimises the total loss of a point: the layout's loss (State.Loss) plus
// Extra, a loss outside the layout that the setting changes (for example
// the tyres' slip loss, which follows from the split of torque between
// two axles).
type SettingSearch struct {
	Loop, Motor int     // the motor searched (Motor 0 is the loop's first)
	Min, Max    float64 // the setting range searched, within [-1, 1]; both 0 means [0, 1]
	// Total, when set, solves each trial with SolveTotal; otherwise Solve.
	Total *TotalDemand
	// Extra returns the loss outside the layout at a solved trial state;
	// nil means none. An error makes the trial infeasible.
	Extra func(st *State) (units.Power, error)
	// Tolerance on the setting; 0 means 1e-4.
	Tolerance float64
}

// BestSetting finds the setting of motor q.Motor of loop q.Loop in
// [q.Min, q.Max] that minimises State.Loss plus q.Extra at point p (by
// Brent's minimisation over the setting, infeasible settings counting as
// an infinite loss), and leaves the solved state there in st. p.Settings
// may hold other motors; an entry for the searched motor is replaced. It
// returns the setting and the total loss, or Solve's error at the best
// setting found when no setting in the range is feasible.
func (s *Solver) BestSetting(p Point, q SettingSearch, st *State) (float64, units.Power, error) {
	x, loss, err := s.bestSetting(p, q, st)
	return x, loss, resetOnInput(err, st)
}

func (s *Solver) bestSetting(p Point, q SettingSearch, st *State) (float64, units.Power, error) {
	if err := s.checkEntry(&p, st); err != nil {
		return 0, 0, err
	}
	if err := s.checkSettings(&Point{Settings: []MotorSetting{{Loop: q.Loop, Motor: q.Motor}}}); err != nil {
		return 0, 0, err
	}
	lo, hi := q.Min, q.Max
	if lo == 0 && hi == 0 {
		hi = 1
	}
	if !(lo >= -1 && hi <= 1 && lo <= hi) {
		return 0, 0, &InputError{Field: "SettingSearch.Min/Max", Value: units.Plain(lo), Reason: "need -1 <= Min <= Max <= 1"}
	}
	tol := q.Tolerance
	if tol == 0 {
		tol = 1e-4
	}
	if !(tol > 0) || bad(tol) {
		return 0, 0, &InputError{Field: "SettingSearch.Tolerance", Value: units.Plain(tol), Reason: "must be positive and finite"}
	}
	buf := make([]MotorSetting, 0, len(p.Settings)+1)
	for _, m := range p.Settings {
		if m.Loop != q.Loop || m.Motor != q.Motor {
			buf = append(buf, m)
		}
	}
	buf = append(buf, MotorSetting{Loop: q.Loop, Motor: q.Motor})
	p.Settings = buf
	eval := func(x float64) (float64, error) {
		buf[len(buf)-1].Setting = x
		var err error
		if q.Total != nil {
			err = s.SolveTotal(p, *q.Total, st)
		} else {
			err = s.Solve(p, st)
		}
		if err != nil {
			return math.Inf(1), err
		}
		loss := float64(st.Loss)
		if q.Extra != nil {
			e, err := q.Extra(st)
			if err != nil || bad(float64(e)) {
				if err == nil {
					err = &InputError{Field: "SettingSearch.Extra", Value: units.Of(e), Reason: "not finite"}
				}
				return math.Inf(1), err
			}
			loss += float64(e)
		}
		return loss, nil
	}
	obj := func(x float64) float64 {
		v, _ := eval(x)
		return v
	}
	x := lo
	if hi > lo {
		// A coarse scan first: the loss may be infinite over part of the
		// range (settings the loop cannot balance), which a minimiser
		// started across it would not see past.
		const n = 8
		best, bx := math.Inf(1), lo
		for i := 0; i <= n; i++ {
			xi := lo + (hi-lo)*float64(i)/n
			if v := obj(xi); v < best {
				best, bx = v, xi
			}
		}
		a, b := math.Max(lo, bx-(hi-lo)/n), math.Min(hi, bx+(hi-lo)/n)
		x, _ = numeric.Minimize(obj, a, b, tol)
		if v := obj(x); !(v <= best) {
			x = bx
		}
	}
	loss, err := eval(x)
	if err != nil {
		return x, 0, err
	}
	return x, units.Power(loss), nil
}
