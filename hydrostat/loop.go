package hydrostat

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// LoopSpec describes a closed hydrostatic loop: one pump and one or more
// motors in parallel on two common lines A and B.
//
// The pump's outlet is line A and every motor's outlet is line B, so with
// positive settings and positive speeds the pump delivers into A and the
// motors take oil from A and turn forward.
type LoopSpec struct {
	Pump        Unit
	Motors      []Unit
	Oil         Oil
	Temperature units.Temperature // oil temperature in the loop
	Charge      units.Pressure    // low-side (boost) pressure, ≥ 0
	Relief      units.Pressure    // high-side relief setting (gauge), > Charge, at most the units' lowest peak (else rated) pressure
	Schedule    Schedule          // nil means Sequential{}
	// Strict refuses a unit whose maximum speed, rated pressure or peak
	// pressure is not rated (zero in its spec). Without it such a limit is
	// not checked, and the solver's margins say so.
	Strict bool
}

// Loop is a built, immutable closed loop.
type Loop struct {
	spec  LoopSpec
	fl    fluid
	sched Schedule
	names [][2]string // per unit (pump first): the names of its pressure and speed limits
	// floor is the smallest common motor setting the motors' swings allow
	// (−1 over centre, 0 to zero, 0.2 when a motor's swing is unstated);
	// pumpLow the pump's (−1, or 0 for SwingToZero).
	floor, pumpLow float64
	plan           curvePlan // what Curve needs, worked out once (planCurve)
}

// checkRatings refuses a relief setting above what the units can take —
// the lowest peak pressure of the loop's units, or a unit's rated pressure
// where it gives no peak — and, with s.Strict, a unit with a limit not
// rated.
func checkRatings(s *LoopSpec) error {
	lowest, which, bound := units.Pressure(0), "", ""
	for i := range 1 + len(s.Motors) {
		u, name := s.Pump, "the pump"
		if i > 0 {
			u, name = s.Motors[i-1], "motor "+strconv.Itoa(i)
		}
		sp := &u.spec
		if s.Strict {
			for _, r := range []struct {
				rated bool
				what  string
			}{{sp.MaxSpeed > 0, "maximum speed"}, {sp.RatedPressure > 0, "rated pressure"}, {sp.PeakPressure > 0, "peak pressure"}} {
				if !r.rated {
					return fmt.Errorf("%w: %s has no %s; a strict loop needs every unit's maximum speed, rated and peak pressure", ErrInvalid, name, r.what)
				}
			}
		}
		lim, b := sp.PeakPressure, "peak pressure"
		if lim == 0 {
			lim, b = sp.RatedPressure, "rated pressure"
		}
		if lim > 0 && (which == "" || lim < lowest) {
			lowest, which, bound = lim, name, b
		}
	}
	if which != "" && s.Relief > lowest {
		return fmt.Errorf("%w: relief setting %v above %s %v of %s: the units cannot take the pressure the relief allows",
			ErrInvalid, s.Relief, bound, lowest, which)
	}
	return nil
}

// NewLoop validates s and returns the loop. The Motors slice is copied. It
// refuses a relief setting above the lowest peak pressure of the loop's
// units (or a unit's rated pressure where no peak is given), and with
// Strict a unit whose speed or pressures are not rated.
func NewLoop(s LoopSpec) (Loop, error) {
	if !(s.Pump.dmax > 0) {
		return Loop{}, fmt.Errorf("%w: loop needs a pump built with NewUnit", ErrInvalid)
	}
	if len(s.Motors) == 0 {
		return Loop{}, fmt.Errorf("%w: loop needs at least one motor", ErrInvalid)
	}
	for i, m := range s.Motors {
		if !(m.dmax > 0) {
			return Loop{}, fmt.Errorf("%w: motor %d not built with NewUnit", ErrInvalid, i+1)
		}
	}
	c, r := float64(s.Charge), float64(s.Relief)
	if !finite(c) || c < 0 || !finite(r) || !(r > c) {
		return Loop{}, fmt.Errorf("%w: need 0 ≤ charge < relief, finite (charge %v, relief %v)", ErrInvalid, s.Charge, s.Relief)
	}
	if err := checkRatings(&s); err != nil {
		return Loop{}, err
	}
	fl, err := s.Oil.at(s.Temperature)
	if err != nil {
		return Loop{}, err
	}
	s.Motors = append([]Unit(nil), s.Motors...)
	if s.Schedule == nil {
		s.Schedule = Sequential{}
	}
	if v, ok := s.Schedule.(interface{ Validate() error }); ok {
		if err := v.Validate(); err != nil {
			return Loop{}, err
		}
	}
	names := make([][2]string, 1+len(s.Motors))
	names[0] = [2]string{"pump pressure", "pump speed"}
	for i := range s.Motors {
		m := "motor " + strconv.Itoa(i+1)
		names[i+1] = [2]string{m + " pressure", m + " speed"}
	}
	floor := -1.0
	for _, m := range s.Motors {
		switch m.spec.Swing {
		case SwingUnstated:
			floor = max(floor, defaultMinMotor)
		case SwingToZero:
			floor = max(floor, 0)
		}
	}
	l := Loop{spec: s, fl: fl, sched: s.Schedule, names: names, floor: floor, pumpLow: s.Pump.spec.Swing.lowest()}
	l.plan = l.planCurve()
	return l, nil
}

// Spec returns the specification (with a copy of the motors and the
// schedule filled in).
func (l Loop) Spec() LoopSpec {
	s := l.spec
	s.Motors = append([]Unit(nil), s.Motors...)
	return s
}

// NumMotors returns the number of motors.
func (l Loop) NumMotors() int { return len(l.spec.Motors) }

// MaxPressure returns the largest loop pressure difference before the
// relief valve opens, Relief − Charge.
func (l Loop) MaxPressure() units.Pressure { return l.spec.Relief - l.spec.Charge }

// unit returns unit i: 0 the pump, i ≥ 1 motor i−1; sign converts the loop
// pressure difference p_A − p_B into the unit's own p_out − p_in.
func (l *Loop) unit(i int) (*Unit, float64) {
	if i == 0 {
		return &l.spec.Pump, 1
	}
	return &l.spec.Motors[i-1], -1
}

// UnitAt evaluates unit i of the loop (0 the pump, i ≥ 1 motor i−1) at
// setting x and speed w, with dp the loop pressure difference p_A − p_B
// (a motor sees −dp in its own frame), at the loop's oil temperature.
// Rated limits are not checked. It is the building block for a Schedule.
func (l Loop) UnitAt(i int, setting float64, w units.AngularVelocity, dp units.Pressure) (Point, error) {
	if i < 0 || i > len(l.spec.Motors) {
		return Point{}, fmt.Errorf("%w: unit index %d", ErrInvalid, i)
	}
	u, s := l.unit(i)
	var p Point
	err := u.eval(setting, float64(w), s*float64(dp), l.fl, &p)
	return p, err
}

// Balance returns the flow-continuity residual on line A at the given
// settings (settings[0] the pump, settings[1:] the motors):
// pump Flow − Σ motor Flow (each in its own frame, so a motor's Flow is the
// flow it draws from A). Zero means the settings suit the speeds.
func (l Loop) Balance(pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) (units.VolumeFlow, error) {
	if len(motorSpeeds) != len(l.spec.Motors) || len(settings) != len(l.spec.Motors)+1 {
		return 0, fmt.Errorf("%w: need %d motor speeds and %d settings", ErrInvalid, len(l.spec.Motors), len(l.spec.Motors)+1)
	}
	r, err := l.residual(settings[0], settings[1:], 0, false, float64(pumpSpeed), motorSpeeds, float64(dp))
	return units.VolumeFlow(r), err
}

// residual returns pump Flow − Σ motor Flow with the pump at xp and the
// motors at ms[i], or, when common is true, all motors at sm.
func (l *Loop) residual(xp float64, ms []float64, sm float64, common bool, wp float64, wms []units.AngularVelocity, dp float64) (float64, error) {
	var p Point
	if err := l.spec.Pump.eval(xp, wp, dp, l.fl, &p); err != nil {
		return 0, err
	}
	r := float64(p.Flow)
	for i := range l.spec.Motors {
		x := sm
		if !common {
			x = ms[i]
		}
		if err := l.spec.Motors[i].eval(x, float64(wms[i]), -dp, l.fl, &p); err != nil {
			return 0, err
		}
		r -= float64(p.Flow)
	}
	return r, nil
}

// Settings writes the settings the loop's schedule chooses for the given
// speeds and loop pressure difference into settings (length
// NumMotors()+1: the pump, then the motors). This is the "required speed
// ratio → settings" question: pass motorSpeeds = ratio·pumpSpeed.
func (l Loop) Settings(pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	if l.sched == nil {
		return fmt.Errorf("%w: zero Loop", ErrInvalid)
	}
	if !finite(float64(pumpSpeed)) || !finite(float64(dp)) {
		return fmt.Errorf("%w: pump speed %v, pressure %v", ErrInvalid, pumpSpeed, dp)
	}
	for _, w := range motorSpeeds {
		if !finite(float64(w)) {
			return fmt.Errorf("%w: motor speed %v", ErrInvalid, w)
		}
	}
	return l.sched.Settings(l, pumpSpeed, motorSpeeds, dp, settings)
}

// LoopState is the full state of a loop at one operating point.
type LoopState struct {
	// Pressure is the loop pressure difference p_A − p_B: positive when A
	// (the pump's outlet) is the high line, negative when B is.
	Pressure  units.Pressure
	High, Low units.Pressure // absolute line pressures: Low = Charge, High = Charge + |Pressure|
	Pump      Point          // in the pump's frame (its Pressure = p_A − p_B)
	Motors    []Point        // in each motor's frame (its Pressure = p_B − p_A); storage reused by At
	Settings  []float64      // Settings[0] the pump, Settings[1:] the motors; storage reused by At
	// Limit is the first rated limit the state crosses, as At reports it
	// (settings, relief pressure, then each unit's peak pressure and
	// speed); Limit.Err is nil when none is crossed.
	Limit   LimitError
	Leakage units.VolumeFlow
	// ChargeFlow is the flow the charge pump must supply if all leakage
	// drains to the cases: equal to Leakage.
	ChargeFlow units.VolumeFlow
	Input      units.Power // Σ of positive shaft powers T·ω into the loop
	Output     units.Power // Σ of shaft powers leaving the loop (magnitudes)
	Loss       units.Power // Σ unit losses ≥ 0; Input − Output = Loss
	Efficiency float64     // Output/Input in [0, 1]; 1 when Input is 0
}

func (st *LoopState) size(n int) {
	if cap(st.Motors) < n {
		st.Motors = make([]Point, n)
	}
	st.Motors = st.Motors[:n]
	if cap(st.Settings) < n+1 {
		st.Settings = make([]float64, n+1)
	}
	st.Settings = st.Settings[:n+1]
}

// At fills st for the given shaft speeds and loop pressure difference
// dp = p_A − p_B, with the settings chosen by the loop's schedule. It is
// what a layout solver calls inside its iteration: deterministic and
// allocation-free once st.Motors and st.Settings have room for the motors
// (At grows them on first use).
//
// Signs: dp > 0 means line A (the pump's outlet) is high, dp < 0 that B is
// high (for example when the vehicle drives the motors and the pump brakes
// the engine). The pump's Point is in its own frame, with Pressure = dp;
// each motor's Point has Pressure = −dp. Flow continuity holds to rounding:
// Pump.Flow = Σ Motors[i].Flow (each motor's Flow being the flow it draws
// from A, ideal plus leakage). A motor standing still gets the setting the
// schedule chooses (full for Sequential) and passes only its leakage.
//
// A unit at zero setting has exactly zero ideal flow and torque (its torque
// is its loss torque alone, whatever dp). With every motor at zero, as at
// the mechanical point of an output-coupled split (pump at full stroke,
// standing still, motors at zero), the loop pressure no longer follows from
// the motors' load: At evaluates the dp it is given, the pump's torque
// Δp·x_p·D_p then sets it in a layout, and with the pump at zero too it is
// undetermined (Solve reports ErrNoSolution).
//
// Errors: ErrInvalid for bad input (st untouched beyond sizing); a
// *LimitError when the relief pressure is exceeded (Charge + |dp| >
// Relief), when no settings within range meet the speeds (ErrSettingLimit;
// the settings are then the schedule's nearest and the flows do not
// balance), or when a unit crosses its speed or peak pressure limit. With a
// *LimitError st is still filled completely; with any other error
// (ErrInvalid, ErrNoSolution, ErrModel) its values are unspecified.
func (l Loop) At(pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, st *LoopState) error {
	return l.at(l.sched, pumpSpeed, motorSpeeds, dp, st)
}

// Trial is At for the inner loop of an iteration: it fills st exactly as
// At does, but reports a crossed limit by the bare sentinel
// (ErrPressureLimit, ErrSpeedLimit or ErrSettingLimit) instead of a
// *LimitError, so that with the Sequential schedule it never allocates.
// Call At at the converged point for the error that names the limit.
func (l Loop) Trial(pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, st *LoopState) error {
	return l.atQ(l.sched, pumpSpeed, motorSpeeds, dp, st, true)
}

func (l Loop) at(sched Schedule, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, st *LoopState) error {
	return l.atQ(sched, pumpSpeed, motorSpeeds, dp, st, false)
}

func (l Loop) atQ(sched Schedule, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, st *LoopState, quiet bool) error {
	n := len(l.spec.Motors)
	if st == nil || n == 0 {
		return fmt.Errorf("%w: nil state or zero Loop", ErrInvalid)
	}
	if len(motorSpeeds) != n {
		return fmt.Errorf("%w: %d motor speeds for %d motors", ErrInvalid, len(motorSpeeds), n)
	}
	if !finite(float64(pumpSpeed)) || !finite(float64(dp)) {
		return fmt.Errorf("%w: pump speed %v, pressure %v", ErrInvalid, pumpSpeed, dp)
	}
	for _, w := range motorSpeeds {
		if !finite(float64(w)) {
			return fmt.Errorf("%w: motor speed %v", ErrInvalid, w)
		}
	}
	st.size(n)
	st.Limit = LimitError{}
	var schedErr error // the schedule's own limit error, as it gave it
	if sq, ok := sched.(Sequential); ok {
		sl, err := sq.settingsV(&l, pumpSpeed, motorSpeeds, dp, st.Settings)
		if err != nil {
			return err
		}
		if sl.hit {
			st.Limit = sl.value()
		}
	} else if err := sched.Settings(l, pumpSpeed, motorSpeeds, dp, st.Settings); err != nil {
		le, ok := errors.AsType[*LimitError](err)
		if !ok {
			return err
		}
		st.Limit, schedErr = *le, err
	}
	if err := l.fill(pumpSpeed, motorSpeeds, dp, st); err != nil {
		return err
	}
	if st.Limit.Err == nil {
		l.crossed(st)
	}
	switch {
	case st.Limit.Err == nil:
		return nil
	case quiet:
		return st.Limit.Err
	case schedErr != nil:
		return schedErr
	}
	out := st.Limit
	return &out
}

// crossed records in st.Limit the first rated limit of the loop's pressure
// and its units that st crosses, if any.
func (l *Loop) crossed(st *LoopState) {
	if st.High > l.spec.Relief {
		st.Limit = LimitError{Quantity: "high-line pressure", Value: units.Of(st.High), Bound: "relief setting", Limit: units.Of(l.spec.Relief), Err: ErrPressureLimit}
		return
	}
	if l.spec.Pump.crossed(&st.Pump, &l.names[0], &st.Limit) {
		return
	}
	for i := range st.Motors {
		if l.spec.Motors[i].crossed(&st.Motors[i], &l.names[i+1], &st.Limit) {
			return
		}
	}
	// A setting below a unit's swing (only a custom schedule gives one).
	if x := st.Settings[0]; l.spec.Pump.belowSwing(x) {
		st.Limit = LimitError{Quantity: "pump setting", Value: units.Plain(x), Bound: "zero (the unit swings to one side only)", Limit: units.Plain(0), Err: ErrSettingLimit}
		return
	}
	for i := range st.Motors {
		if x := st.Settings[i+1]; l.spec.Motors[i].belowSwing(x) {
			st.Limit = LimitError{Quantity: "motor setting", Value: units.Plain(x), Bound: "zero (the unit swings to one side only)", Limit: units.Plain(0), Err: ErrSettingLimit}
			return
		}
	}
}

// isLimit reports whether err is a *LimitError.
func isLimit(err error) bool {
	_, ok := errors.AsType[*LimitError](err)
	return ok
}

// fill evaluates every unit at st.Settings and sums the loop.
func (l *Loop) fill(wp units.AngularVelocity, wms []units.AngularVelocity, dp units.Pressure, st *LoopState) error {
	for _, x := range st.Settings {
		if !finite(x) {
			return fmt.Errorf("%w: schedule gave setting %v", ErrModel, x)
		}
	}
	st.Pressure = dp
	st.Low = l.spec.Charge
	st.High = l.spec.Charge + units.Pressure(math.Abs(float64(dp)))
	if err := l.spec.Pump.eval(st.Settings[0], float64(wp), float64(dp), l.fl, &st.Pump); err != nil {
		return err
	}
	for i := range l.spec.Motors {
		if err := l.spec.Motors[i].eval(st.Settings[i+1], float64(wms[i]), -float64(dp), l.fl, &st.Motors[i]); err != nil {
			return err
		}
	}
	st.sum()
	return nil
}

// sum sums the loop's powers, loss and leakage from its units' points.
func (st *LoopState) sum() {
	var in, out, loss, leak float64
	add := func(p *Point) {
		if m := float64(p.Mechanical); m > 0 {
			in += m
		} else {
			out -= m
		}
		loss += float64(p.Loss)
		leak += float64(p.Leakage)
	}
	add(&st.Pump)
	for i := range st.Motors {
		add(&st.Motors[i])
	}
	st.Input, st.Output, st.Loss = units.Power(in), units.Power(out), units.Power(loss)
	st.Leakage, st.ChargeFlow = units.VolumeFlow(leak), units.VolumeFlow(leak)
	st.Efficiency = 1
	if in > 0 {
		st.Efficiency = clamp01(out / in) // out ≥ 0, in > 0: never NaN
	}
}

// LoopInput is the operating point for Loop.Solve.
type LoopInput struct {
	PumpSpeed   units.AngularVelocity
	MotorSpeeds []units.AngularVelocity // one per motor
	// MotorTorques are the torque demands: the torque each motor's shaft
	// applies TO the motor (negative when the motor drives a load turning
	// forward, as in Point.Torque).
	MotorTorques []units.Torque
	// MotorSettings fixes the motor settings; the pump setting then follows
	// from flow continuity. Nil means the loop's schedule chooses all
	// settings at each pressure.
	MotorSettings []float64
}

// Solve finds the loop pressure that meets the motors' torque demands at
// the given speeds, and the full state there. With one motor the demand is
// met exactly; with several motors on one common pressure the demands can
// only all be met when they suit the displacements, and Solve takes the
// least-squares pressure Σ wᵢ·(Tᵢ(Δp) − Tdemᵢ) = 0 with wᵢ = xᵢ·D_max,i
// (read each motor's Torque in the result).
//
// A demand that needs more than the relief pressure returns the state at
// the relief pressure and a *LimitError with the needed pressure (an
// estimate from the ideal torques) and the relief setting.
func (l Loop) Solve(in LoopInput) (LoopState, error) {
	n := len(l.spec.Motors)
	if n == 0 {
		return LoopState{}, fmt.Errorf("%w: zero Loop", ErrInvalid)
	}
	if len(in.MotorSpeeds) != n || len(in.MotorTorques) != n || (in.MotorSettings != nil && len(in.MotorSettings) != n) {
		return LoopState{}, fmt.Errorf("%w: need %d motor speeds, torques and (optional) settings", ErrInvalid, n)
	}
	if !finite(float64(in.PumpSpeed)) {
		return LoopState{}, fmt.Errorf("%w: pump speed %v", ErrInvalid, in.PumpSpeed)
	}
	for i := range n {
		if !finite(float64(in.MotorSpeeds[i])) || !finite(float64(in.MotorTorques[i])) {
			return LoopState{}, fmt.Errorf("%w: motor %d speed or torque not finite", ErrInvalid, i+1)
		}
		if in.MotorSettings != nil && (!finite(in.MotorSettings[i]) || math.Abs(in.MotorSettings[i]) > 1) {
			return LoopState{}, &LimitError{Quantity: fmt.Sprintf("motor %d setting", i+1), Value: units.Plain(in.MotorSettings[i]), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, in.MotorSettings[i])), Err: ErrSettingLimit}
		}
	}
	st := LoopState{}
	st.size(n)
	sched := l.sched
	if in.MotorSettings != nil {
		sched = fixedMotors{in.MotorSettings}
	}
	var ferr error
	var wsum float64 // Σ |x·D| of the motors at the last call of resid
	resid := func(dp float64) float64 {
		err := sched.Settings(l, in.PumpSpeed, in.MotorSpeeds, units.Pressure(dp), st.Settings)
		if err != nil && !isLimit(err) {
			ferr = err
			return math.NaN()
		}
		if err := l.fill(in.PumpSpeed, in.MotorSpeeds, units.Pressure(dp), &st); err != nil {
			ferr = err
			return math.NaN()
		}
		var r float64
		wsum = 0
		for i := range st.Motors {
			w := st.Settings[i+1] * l.spec.Motors[i].dmax
			r += w * float64(st.Motors[i].Torque-in.MotorTorques[i])
			wsum += math.Abs(w)
		}
		return r
	}
	pmax := float64(l.MaxPressure())
	ra := resid(-pmax)
	wa := wsum
	rb := resid(pmax)
	if ferr != nil {
		return LoopState{}, ferr
	}
	if wa == 0 && wsum == 0 {
		return LoopState{}, fmt.Errorf("%w: every motor is at zero setting, so no pressure meets the torque demand (the motors' torque does not depend on it)", ErrNoSolution)
	}
	var dp float64
	if (ra > 0) != (rb > 0) || ra == 0 || rb == 0 {
		var err error
		dp, err = numeric.Brent(resid, -pmax, pmax, 1e-9*pmax, 200)
		if ferr != nil {
			return LoopState{}, ferr
		}
		if err != nil {
			return LoopState{}, fmt.Errorf("%w: pressure search: %v", ErrNoSolution, err)
		}
	} else {
		// Beyond relief: estimate the needed pressure from the ideal torques
		// (a motor's ideal torque is −x·D·Δp in the loop frame).
		var num, den float64
		for i := range n {
			w := st.Settings[i+1] * l.spec.Motors[i].dmax
			num += -w * float64(in.MotorTorques[i])
			den += w * w
		}
		need := math.Inf(1)
		if den > 0 {
			need = num / den
		}
		dp = pmax
		if math.Abs(ra) < math.Abs(rb) {
			dp = -pmax
		}
		if need < 0 {
			dp = -pmax
		} else if need > 0 {
			dp = pmax
		}
		if err := l.atQ(sched, in.PumpSpeed, in.MotorSpeeds, units.Pressure(dp), &st, true); err != nil && !isLimit(err) && !isBareLimit(err) {
			return LoopState{}, err
		}
		v := float64(l.spec.Charge) + math.Abs(need)
		if !finite(v) {
			return st, fmt.Errorf("%w: the torque demand cannot be met at any pressure up to relief", ErrNoSolution)
		}
		return st, &LimitError{Quantity: "high-line pressure needed", Value: units.Of(units.Pressure(v)), Bound: "relief setting", Limit: units.Of(l.spec.Relief), Err: ErrPressureLimit}
	}
	return st, l.at(sched, in.PumpSpeed, in.MotorSpeeds, units.Pressure(dp), &st)
}
