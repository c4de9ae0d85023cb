package hydrostat

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// Schedule chooses the settings that give the required speeds at a
// pressure difference: pumpSpeed and motorSpeeds are the shaft speeds, dp
// the loop pressure difference p_A − p_B (its sign says which line is
// high). It writes settings[0] for the pump and settings[1:] for the
// motors, satisfying flow continuity including leakage (Loop.Balance ≈ 0).
// When no settings in range do, it writes the nearest ones and returns a
// *LimitError with ErrSettingLimit. Implementations used with Loop.At
// should not allocate.
type Schedule interface {
	Settings(l Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error
}

// defaultMinMotor is the default smallest motor setting of the schedules.
//
// Common practice (no published source): variable motors are seldom run
// below about a fifth of full displacement, where losses dominate and the
// motor speed is high.
const defaultMinMotor = 0.2

// Sequential is the sequential schedule: the pump swings out first with
// every motor at full displacement; once the pump is at full, the motors
// (all at one common setting) swing back towards their lowest setting.
//
// How far the motors swing back: MinMotorSetting when it is positive;
// otherwise as far as the motors' Swing allows: to exactly zero
// (SwingToZero), through zero and over centre to −1 (SwingOverCentre), or
// to 0.2 for a motor whose swing is unstated. With several motors the
// narrowest swing rules. The pump uses [-1, 1], or [0, 1] for a SwingToZero
// pump (a negative pump setting it would need is reported as a setting
// limit).
//
// Over centre the settings pass continuously through a pump shaft standing
// still, as at the mechanical point of an output-coupled split: the pump
// stays at full stroke on one side (the side of the motors' flow
// Σ D_m·ω_m) and the motors swing through zero; with the pump turning
// backwards the motors start from −1 instead of 1. Ideally (no leakage)
// the settings are then x_p = k·Σ D_m·ω_m and x_m = k·D_p·ω_p with k > 0
// chosen so that the larger magnitude is 1. With leakage the motors reach
// zero at a small pump speed that supplies the leakage, and cross zero
// just after it. A motor that only swings to zero cannot follow a pump
// slower than that: the needed negative setting is reported as a setting
// limit.
type Sequential struct {
	// MinMotorSetting is the smallest motor setting, in [0, 1]; 0 means as
	// far as the motors' swing allows (0.2 when unstated).
	MinMotorSetting float64
}

// Validate checks MinMotorSetting.
func (s Sequential) Validate() error { return validMin(s.MinMotorSetting) }

func validMin(m float64) error {
	if !(m >= 0 && m <= 1) {
		return fmt.Errorf("%w: minimum motor setting %v must be in [0, 1]", ErrInvalid, m)
	}
	return nil
}

// motorFloor returns the smallest common motor setting of a schedule with
// minimum m: m itself when positive, else what the motors' swings allow.
func (l *Loop) motorFloor(m float64) float64 {
	if m > 0 {
		return m
	}
	return l.floor
}

// searchFloor returns the smallest magnitude of the motor setting MinLoss
// chooses to save loss: m, or 0.2 when m is 0.
func searchFloor(m float64) float64 {
	if m == 0 {
		return defaultMinMotor
	}
	return m
}

func checkArgs(l *Loop, motorSpeeds []units.AngularVelocity, settings []float64) error {
	n := len(l.spec.Motors)
	if n == 0 || len(motorSpeeds) != n || len(settings) != n+1 {
		return fmt.Errorf("%w: need %d motor speeds and %d settings", ErrInvalid, n, n+1)
	}
	return nil
}

// Settings implements Schedule.
func (s Sequential) Settings(l Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	return s.settings(&l, pumpSpeed, motorSpeeds, dp, settings)
}

// settings is Settings on a *Loop: Loop.At calls it directly (no interface
// call, no copy of the loop).
func (s Sequential) settings(l *Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	sl, err := s.settingsV(l, pumpSpeed, motorSpeeds, dp, settings)
	if err == nil && sl.hit {
		return sl.err()
	}
	return err
}

// settingsV is settings with a setting limit returned as a value (no
// allocation): err is nil then and sl.hit is set.
func (s Sequential) settingsV(l *Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) (sl setLimit, err error) {
	if err := checkArgs(l, motorSpeeds, settings); err != nil {
		return setLimit{}, err
	}
	if err := validMin(s.MinMotorSetting); err != nil {
		return setLimit{}, err
	}
	xp, sm, sl, err := sequential(l, l.motorFloor(s.MinMotorSetting), float64(pumpSpeed), motorSpeeds, float64(dp))
	settings[0] = xp
	for i := 1; i < len(settings); i++ {
		settings[i] = sm
	}
	return sl, err
}

// pumpFor solves the pump setting for the motors at the common setting sm.
// ok is false when no pump setting in [-1, 1] balances; xp is then the
// nearer end.
func pumpFor(l *Loop, sm, wp float64, wms []units.AngularVelocity, dp float64) (xp float64, ok bool, err error) {
	if lin, lok := l.linear(wp, wms, dp); lok {
		xp, ok = lin.pumpFor(sm)
		return xp, ok, nil
	}
	var ferr error
	g := func(x float64) float64 {
		r, e := l.residual(x, nil, sm, true, wp, wms, dp)
		if e != nil {
			ferr = e
			return math.NaN()
		}
		return r
	}
	ga, gb := g(-1), g(1)
	if ferr != nil {
		return 0, false, ferr
	}
	if ga == 0 && gb == 0 {
		return 0, true, nil // the pump stands still and nothing leaks
	}
	if (ga > 0) == (gb > 0) && ga != 0 && gb != 0 {
		if math.Abs(gb) < math.Abs(ga) {
			return 1, false, nil
		}
		return -1, false, nil
	}
	x, e := numeric.Brent(g, -1, 1, 0, 200)
	if ferr != nil {
		return 0, false, ferr
	}
	if e != nil {
		return 0, false, fmt.Errorf("%w: pump setting: %v", ErrNoSolution, e)
	}
	return x, true, nil
}

// sequential returns the pump setting and the common motor setting of the
// sequential schedule.
//
// Where every unit's leakage is affine in its setting (Wilson, lossless)
// the settings are placed in closed form (see linLoop); otherwise by
// Brent's method on the flow balance. Both give the zero of the same
// residual, to rounding.
// setLimit is a motor setting the sequential schedule would need beyond its
// range, as a value (the *LimitError is built only when reported).
type setLimit struct {
	hit       bool
	pump      bool // the pump's setting, not the motors'
	need, lim float64
}

func (s setLimit) value() LimitError {
	q := "motor setting"
	if s.pump {
		q = "pump setting"
	}
	return LimitError{Quantity: q, Value: units.Plain(s.need), Bound: s.bound(), Limit: units.Plain(s.lim), Err: ErrSettingLimit}
}

// bound names the limit: full displacement, or the schedule's minimum
// motor setting.
func (s setLimit) bound() string {
	if s.pump || math.Abs(s.lim) == 1 {
		return "full displacement"
	}
	return "schedule's minimum motor setting"
}

func (s setLimit) err() error {
	e := s.value()
	return &e
}

func sequential(l *Loop, smin, wp float64, wms []units.AngularVelocity, dp float64) (xp, sm float64, sl setLimit, err error) {
	xp, sm, sl, err = sequentialBoth(l, smin, wp, wms, dp)
	if err == nil && !sl.hit && xp < l.pumpLow {
		sl = setLimit{hit: true, pump: true, need: xp, lim: l.pumpLow}
		xp = l.pumpLow
	}
	return xp, sm, sl, err
}

// sequentialBoth is sequential with the pump in [-1, 1].
func sequentialBoth(l *Loop, smin, wp float64, wms []units.AngularVelocity, dp float64) (xp, sm float64, sl setLimit, err error) {
	// Over centre, the motors start from full stroke on the side of the
	// pump's speed, so the settings stay continuous where the pump speed
	// passes through zero.
	full := 1.0
	if smin < 0 && wp < 0 {
		full = -1
	}
	lin, linear := l.linear(wp, wms, dp)
	var ok bool
	if linear {
		xp, ok = lin.pumpFor(full)
	} else {
		xp, ok, err = pumpFor(l, full, wp, wms, dp)
	}
	if err != nil || ok {
		return xp, full, setLimit{}, err
	}
	// The pump is at full (xp = ±1): swing the motors back. A pump standing
	// still delivers the same at either end; where the motors may reach
	// zero, take the end on the side of the motors' flow, the end the pump
	// holds just before and after (no jump of the pump's torque).
	if smin <= 0 && wp == 0 {
		var mq float64
		for i := range l.spec.Motors {
			mq += l.spec.Motors[i].dmax * float64(wms[i])
		}
		xp = 1
		if mq < 0 {
			xp = -1
		}
	}
	var ferr error
	h := func(s float64) float64 {
		r, e := l.residual(xp, nil, s, true, wp, wms, dp)
		if e != nil {
			ferr = e
			return math.NaN()
		}
		return r
	}
	var ha, hb float64
	if linear {
		ha, hb = lin.residual(xp, smin), lin.residual(xp, 1)
	} else {
		ha, hb = h(smin), h(1)
	}
	if ferr != nil {
		return 0, 0, setLimit{}, ferr
	}
	if (ha > 0) != (hb > 0) || ha == 0 || hb == 0 {
		if linear {
			return xp, lin.motorFor(xp, smin, ha, hb), setLimit{}, nil
		}
		s, e := numeric.Brent(h, smin, 1, 0, 200)
		if ferr != nil {
			return 0, 0, setLimit{}, ferr
		}
		if e != nil {
			return 0, 0, setLimit{}, fmt.Errorf("%w: motor setting: %v", ErrNoSolution, e)
		}
		return xp, s, setLimit{}, nil
	}
	// No motor setting in range: report the setting that would be needed
	// (linear in s to good accuracy) against the limit.
	sm = smin
	if math.Abs(hb) < math.Abs(ha) {
		sm = 1
	}
	if hb == ha {
		return xp, sm, setLimit{}, fmt.Errorf("%w: no settings give flow continuity at these speeds (all shafts idle under pressure?)", ErrNoSolution)
	}
	need := smin - ha*(1-smin)/(hb-ha)
	lim := smin
	if need > 1 {
		lim = 1
	}
	if !finite(need) {
		return xp, sm, setLimit{}, fmt.Errorf("%w: no motor setting gives flow continuity", ErrNoSolution)
	}
	return xp, sm, setLimit{hit: true, need: need, lim: lim}, nil
}

// MinLoss is the minimum-loss schedule. Among the settings that give the
// speeds (a common motor setting s between MinMotorSetting and the largest
// feasible one, the pump setting following from flow continuity) it takes
// the s at which the loop loss is stationary, a minimum, for the load the
// motors carry: along a change of setting that keeps the motor torque
// fixed (the pressure moving as Δp·s = const), dLoss/ds = 0. So when a
// caller (Loop.Solve, or a layout solver) iterates the pressure until the
// motor torque meets the load, the settings at the converged pressure are
// the loss-minimising ones for that load. Where the loss falls all the way
// to the largest feasible setting MinLoss gives the Sequential settings;
// where it falls all the way down it gives MinMotorSetting, and the
// pressure needed for the load rises accordingly (the relief limit is then
// reported, not hidden).
//
// Through zero and over centre: MinLoss starts from the Sequential
// settings with the same MinMotorSetting, so where the speeds need it the
// motors swing to zero and over centre as far as their Swing allows (see
// Sequential). To save loss it searches only magnitudes |s| from
// MinMotorSetting (0.2 when 0) up to the Sequential one, on the Sequential
// setting's side of zero: a smaller magnitude at the same motor torque
// would need a pressure rising without bound as s → 0.
type MinLoss struct {
	// MinMotorSetting is the smallest motor setting, in [0, 1]: the floor of
	// the Sequential settings (0: as far as the motors' swing allows) and
	// the smallest magnitude chosen to save loss (0: 0.2).
	MinMotorSetting float64
	// Tolerance is the tolerance on the motor setting; 0 means 1e-9 (tight,
	// so that the settings vary smoothly with the pressure for a caller that
	// differentiates numerically).
	Tolerance float64
}

// Validate checks the fields.
func (m MinLoss) Validate() error {
	if !(m.Tolerance >= 0) || math.IsInf(m.Tolerance, 0) {
		return fmt.Errorf("%w: tolerance %v", ErrInvalid, m.Tolerance)
	}
	return validMin(m.MinMotorSetting)
}

// Settings implements Schedule.
func (m MinLoss) Settings(l Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	if err := checkArgs(&l, motorSpeeds, settings); err != nil {
		return err
	}
	if err := m.Validate(); err != nil {
		return err
	}
	wp, d := float64(pumpSpeed), float64(dp)
	xp, sq, sl, err := sequential(&l, l.motorFloor(m.MinMotorSetting), wp, motorSpeeds, d)
	if err == nil && sl.hit {
		err = sl.err()
	}
	fill := func(xp, sm float64) {
		settings[0] = xp
		for i := 1; i < len(settings); i++ {
			settings[i] = sm
		}
	}
	fill(xp, sq)
	// Search the magnitudes [smin, shi] on the Sequential setting's side.
	side, shi, smin := 1.0, math.Abs(sq), searchFloor(m.MinMotorSetting)
	if sq < 0 {
		side = -1
	}
	if err != nil || shi <= smin {
		return err
	}
	tol := m.Tolerance
	if tol == 0 {
		tol = 1e-9
	}
	// slope returns dLoss/ds at s along Δp·s = const, by central
	// differences kept inside [smin, shi].
	const h = 1e-4
	slope := func(s float64) float64 {
		lo, hi := math.Max(smin, s-h), math.Min(shi, s+h)
		return (l.lossAtTorque(side*hi, side*s, wp, motorSpeeds, d) - l.lossAtTorque(side*lo, side*s, wp, motorSpeeds, d)) / (hi - lo)
	}
	ga, gb := slope(smin), slope(shi)
	switch {
	case !finite(ga) || !finite(gb) || gb <= 0:
		return nil // loss falls (or cannot be told) up to the largest setting: Sequential
	case ga >= 0:
		x, ok, e := pumpFor(&l, side*smin, wp, motorSpeeds, d)
		if e != nil {
			return e
		}
		if ok && !(x < l.pumpLow) {
			fill(x, side*smin)
		}
		return nil
	}
	s, e := numeric.Brent(slope, smin, shi, tol, 100)
	if e != nil {
		return nil // keep the Sequential settings
	}
	x, ok, e := pumpFor(&l, side*s, wp, motorSpeeds, d)
	if e != nil {
		return e
	}
	if ok && !(x < l.pumpLow) {
		fill(x, side*s)
	}
	return nil
}

// lossAtTorque returns the loop loss with the motors at s2 and the pressure
// moved to dp·s/s2, so that the motors carry about the torque they carry at
// (s, dp); the pump setting follows from flow continuity. +Inf on error.
func (l *Loop) lossAtTorque(s2, s, wp float64, wms []units.AngularVelocity, dp float64) float64 {
	d2 := dp * s / s2
	xp, _, err := pumpFor(l, s2, wp, wms, d2)
	if err != nil {
		return math.Inf(1)
	}
	var p Point
	if err := l.spec.Pump.eval(xp, wp, d2, l.fl, &p); err != nil {
		return math.Inf(1)
	}
	loss := float64(p.Loss)
	for i := range l.spec.Motors {
		if err := l.spec.Motors[i].eval(s2, float64(wms[i]), -d2, l.fl, &p); err != nil {
			return math.Inf(1)
		}
		loss += float64(p.Loss)
	}
	return loss
}

// fixedMotors keeps given motor settings and solves the pump setting.
type fixedMotors struct{ motors []float64 }

func (f fixedMotors) Settings(l Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	if err := checkArgs(&l, motorSpeeds, settings); err != nil {
		return err
	}
	copy(settings[1:], f.motors)
	wp, d := float64(pumpSpeed), float64(dp)
	var ferr error
	g := func(x float64) float64 {
		r, e := l.residual(x, f.motors, 0, false, wp, motorSpeeds, d)
		if e != nil {
			ferr = e
			return math.NaN()
		}
		return r
	}
	ga, gb := g(-1), g(1)
	if ferr != nil {
		return ferr
	}
	if ga == 0 && gb == 0 {
		settings[0] = 0
		return nil
	}
	if (ga > 0) == (gb > 0) && ga != 0 && gb != 0 {
		settings[0] = -1
		if math.Abs(gb) < math.Abs(ga) {
			settings[0] = 1
		}
		if gb == ga {
			return fmt.Errorf("%w: no pump setting gives flow continuity", ErrNoSolution)
		}
		need := -1 - ga*2/(gb-ga)
		if !finite(need) {
			return fmt.Errorf("%w: no pump setting gives flow continuity", ErrNoSolution)
		}
		return &LimitError{Quantity: "pump setting", Value: units.Plain(need), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, need)), Err: ErrSettingLimit}
	}
	x, e := numeric.Brent(g, -1, 1, 0, 200)
	if ferr != nil {
		return ferr
	}
	if e != nil {
		return fmt.Errorf("%w: pump setting: %v", ErrNoSolution, e)
	}
	settings[0] = x
	return nil
}
