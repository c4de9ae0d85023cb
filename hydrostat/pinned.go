package hydrostat

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// Pinned is the sequential schedule with some motors held at settings of
// their own: a motor whose entry in Held is a number keeps that setting
// (a front-axle motor whose setting a controller sets); the pump swings
// out first with the free motors at full displacement, then the free
// motors swing back together towards MinMotorSetting. With every motor
// held, the pump alone meets the flow.
//
// Held is read at every call: its owner may change the held settings
// between calls (a layout solver does, point by point), never while
// another goroutine uses a loop with this schedule. Settings does not
// allocate unless it reports a limit.
type Pinned struct {
	// Held has one entry per motor: the held setting in [-1, 1], or NaN for
	// a motor the schedule sets.
	Held []float64
	// MinMotorSetting is the smallest setting of the free motors, in
	// [0, 1]; 0 means as far as the motors' swings allow, as in Sequential.
	MinMotorSetting float64
}

// Validate checks MinMotorSetting and the held settings.
func (p Pinned) Validate() error {
	for i, x := range p.Held {
		if !math.IsNaN(x) && !(x >= -1 && x <= 1) {
			return fmt.Errorf("%w: held setting %v of motor %d (Held[%d]) outside [-1, 1]", ErrInvalid, x, i+1, i)
		}
	}
	return validMin(p.MinMotorSetting)
}

// Settings implements Schedule.
func (p Pinned) Settings(l Loop, pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, dp units.Pressure, settings []float64) error {
	if err := checkArgs(&l, motorSpeeds, settings); err != nil {
		return err
	}
	if len(p.Held) != len(l.spec.Motors) {
		return fmt.Errorf("%w: %d held settings for %d motors", ErrInvalid, len(p.Held), len(l.spec.Motors))
	}
	if err := p.Validate(); err != nil {
		return err
	}
	smin := l.motorFloor(p.MinMotorSetting)
	wp, d := float64(pumpSpeed), float64(dp)
	ms := settings[1:]
	free := 0
	setFree := func(s float64) {
		for i, x := range p.Held {
			if math.IsNaN(x) {
				ms[i] = s
			} else {
				ms[i] = x
			}
		}
	}
	for _, x := range p.Held {
		if math.IsNaN(x) {
			free++
		}
	}
	var ferr error
	res := func(xp float64) float64 {
		r, e := l.residual(xp, ms, 0, false, wp, motorSpeeds, d)
		if e != nil {
			ferr = e
			return math.NaN()
		}
		return r
	}
	// The pump first, the free motors at full.
	setFree(1)
	ga, gb := res(-1), res(1)
	if ferr != nil {
		return ferr
	}
	if ga == 0 && gb == 0 {
		settings[0] = 0
		return nil
	}
	if (ga > 0) != (gb > 0) || ga == 0 || gb == 0 {
		x, e := numeric.Brent(res, -1, 1, 0, 200)
		if ferr != nil {
			return ferr
		}
		if e != nil {
			return fmt.Errorf("%w: pump setting: %v", ErrNoSolution, e)
		}
		settings[0] = x
		return nil
	}
	xp := -1.0
	if math.Abs(gb) < math.Abs(ga) {
		xp = 1
	}
	settings[0] = xp
	if free == 0 {
		need := -1 - ga*2/(gb-ga)
		if gb == ga || !finite(need) {
			return fmt.Errorf("%w: no pump setting gives flow continuity", ErrNoSolution)
		}
		return &LimitError{Quantity: "pump setting", Value: units.Plain(need), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, need)), Err: ErrSettingLimit}
	}
	// The pump at full: swing the free motors back.
	h := func(s float64) float64 {
		setFree(s)
		return res(xp)
	}
	ha, hb := h(smin), h(1)
	if ferr != nil {
		return ferr
	}
	if (ha > 0) != (hb > 0) || ha == 0 || hb == 0 {
		s, e := numeric.Brent(h, smin, 1, 0, 200)
		if ferr != nil {
			return ferr
		}
		if e != nil {
			return fmt.Errorf("%w: motor setting: %v", ErrNoSolution, e)
		}
		setFree(s)
		return nil
	}
	sm := smin
	if math.Abs(hb) < math.Abs(ha) {
		sm = 1
	}
	setFree(sm)
	need := smin - ha*(1-smin)/(hb-ha)
	if hb == ha || !finite(need) {
		return fmt.Errorf("%w: no motor setting gives flow continuity", ErrNoSolution)
	}
	lim := smin
	if need > 1 {
		lim = 1
	}
	return (setLimit{hit: true, need: need, lim: lim}).err()
}

// WithSchedule returns a copy of the loop that chooses its settings by
// sched (validated as NewLoop does) instead of its own schedule.
func (l Loop) WithSchedule(sched Schedule) (Loop, error) {
	if len(l.spec.Motors) == 0 {
		return Loop{}, fmt.Errorf("%w: zero Loop", ErrInvalid)
	}
	if sched == nil {
		return Loop{}, fmt.Errorf("%w: nil schedule", ErrInvalid)
	}
	if v, ok := sched.(interface{ Validate() error }); ok {
		if err := v.Validate(); err != nil {
			return Loop{}, err
		}
	}
	l.spec.Schedule = sched
	l.sched = sched
	l.plan = l.planCurve()
	return l, nil
}

// MinMotorSetting returns the smallest common motor setting of the loop's
// schedule: the schedule's own for Sequential, MinLoss and Pinned (when
// set), else what the motors' swings allow.
func (l Loop) MinMotorSetting() float64 {
	switch s := l.sched.(type) {
	case Sequential:
		return l.motorFloor(s.MinMotorSetting)
	case MinLoss:
		return l.motorFloor(s.MinMotorSetting)
	case Pinned:
		return l.motorFloor(s.MinMotorSetting)
	}
	return l.floor
}
