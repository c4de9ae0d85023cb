package traction

import (
	"errors"

	"github.com/powersplit-dev/powersplit/units"
)

// SlipCeiling is the largest slip the solvers search. Working slips lie far
// below it; above it a wheel digs in rather than pulls.
const SlipCeiling = 0.9

// Wheel is one driven wheel: a tyre on a surface, described by a traction
// model. Build it with NewWheel; the value is immutable and safe to share.
type Wheel struct {
	tyre    Tyre
	surface Surface
	model   Model
}

// NewWheel returns a wheel after checking the tyre, the surface and that
// the model accepts them (it is probed at a nominal load).
func NewWheel(t Tyre, s Surface, m Model) (Wheel, error) {
	if m == nil {
		return Wheel{}, rangeErr(ErrInput, "traction model", 0.0, "not nil")
	}
	if err := t.Validate(); err != nil {
		return Wheel{}, err
	}
	if err := s.Validate(); err != nil {
		return Wheel{}, err
	}
	if _, err := m.Pull(t, s, units.Kilonewtons(10), 0.1); err != nil && !errors.Is(err, ErrLoad) {
		return Wheel{}, err
	}
	return Wheel{tyre: t, surface: s, model: m}, nil
}

// Tyre returns the wheel's tyre.
func (w Wheel) Tyre() Tyre { return w.tyre }

// Surface returns the surface the wheel runs on.
func (w Wheel) Surface() Surface { return w.surface }

// Model returns the wheel's traction model.
func (w Wheel) Model() Model { return w.model }

// On returns the same wheel on another surface.
func (w Wheel) On(s Surface) (Wheel, error) { return NewWheel(w.tyre, s, w.model) }

// At returns the pull of the driving wheel under load at a slip in [0, 1).
func (w Wheel) At(load units.Force, slip float64) (Pull, error) {
	if !(slip >= 0 && slip < 1) {
		return Pull{}, rangeErr(ErrSlip, "slip", slip, "in [0, 1)")
	}
	return w.pull(load, slip)
}

func (w Wheel) pull(load units.Force, slip float64) (Pull, error) {
	if w.model == nil {
		return Pull{}, rangeErr(ErrInput, "wheel", 0.0, "built with NewWheel")
	}
	return w.model.Pull(w.tyre, w.surface, load, slip)
}

// net returns the net pull at slip, or -Inf when the model refuses (which
// the validated inputs never cause).
func (w Wheel) net(load units.Force, slip float64) float64 {
	if m, ok := w.model.(netModel); ok {
		if n, ok := m.net(w.tyre, w.surface, load, slip); ok {
			return n
		}
		return bigNeg
	}
	p, err := w.model.Pull(w.tyre, w.surface, load, slip)
	if err != nil {
		return bigNeg
	}
	return float64(p.Net)
}

// A loadNet is a wheel's net pull over slip at one load, as net gives it,
// with what depends on the load alone worked out once (for a Brixius
// wheel): the slip searches ask for many slips at one load.
type loadNet struct {
	w       Wheel
	load    units.Force
	brixius bool // b holds the load's terms (a valid load of a Brixius wheel)
	refuse  bool // a Brixius wheel refuses the load
	b       brixiusAtLoad
}

// at returns the wheel's net pull at load.
func (w Wheel) at(load units.Force) loadNet {
	c := loadNet{w: w, load: load}
	if _, ok := w.model.(Brixius); ok {
		if !validLoad(load) {
			c.refuse = true
		} else {
			c.brixius, c.b = true, brixiusLoad(w.tyre, w.surface, load)
		}
	}
	return c
}

// net returns w.net(load, slip).
func (c *loadNet) net(slip float64) float64 {
	switch {
	case c.refuse:
		return bigNeg
	case c.brixius:
		if !validSlip(slip) {
			return bigNeg
		}
		gt, mr := c.b.terms(slip)
		return float64(units.Force((gt - mr) * float64(c.load)))
	}
	return c.w.net(c.load, slip)
}

// gross returns the wheel's gross pull at slip, Pull's Gross, or bigNeg
// where Pull refuses the load or slip.
func (c *loadNet) gross(slip float64) float64 {
	switch {
	case c.refuse:
		return bigNeg
	case c.brixius:
		if !validSlip(slip) {
			return bigNeg
		}
		gt, _ := c.b.terms(slip)
		return float64(units.Force(gt * float64(c.load)))
	}
	q, err := c.w.model.Pull(c.w.tyre, c.w.surface, c.load, slip)
	if err != nil {
		return bigNeg
	}
	return float64(q.Gross)
}

func (w Wheel) check(load units.Force) error {
	if w.model == nil {
		return rangeErr(ErrInput, "wheel", 0.0, "built with NewWheel")
	}
	if !finite(float64(load)) || load <= 0 {
		return rangeErr(ErrLoad, "wheel load", load, "> 0 and finite")
	}
	return nil
}

// MaxPull returns the state of greatest net pull over slips in
// [0, SlipCeiling].
func (w Wheel) MaxPull(load units.Force) (Pull, error) {
	if err := w.check(load); err != nil {
		return Pull{}, err
	}
	s, _ := w.maxNetSlip(load, 0, SlipCeiling)
	return w.pull(load, s)
}

func (w Wheel) maxNetSlip(load units.Force, lo, hi float64) (float64, float64) {
	c := w.at(load)
	return goldenMax(c.net, lo, hi, slipOpt)
}

// SlipForPull returns the state at which the wheel gives the net pull
// required, searching slips from 0 up to the slip of greatest net pull. A
// pull above that greatest pull, or below the net pull at zero slip (a
// driving wheel cannot give less), is a *PullError wrapping ErrPull.
func (w Wheel) SlipForPull(load, net units.Force) (Pull, error) {
	if err := w.check(load); err != nil {
		return Pull{}, err
	}
	if !finite(float64(net)) {
		return Pull{}, rangeErr(ErrInput, "required net pull", net, "finite")
	}
	s, err := w.slipForNet(load, float64(net), 0)
	if err != nil {
		return Pull{}, err
	}
	return w.pull(load, s)
}

// slipForNet solves Net(s) = want over [lo, slip of max net pull].
func (w Wheel) slipForNet(load units.Force, want, lo float64) (float64, error) {
	sMax, nMax := w.maxNetSlip(load, lo, SlipCeiling)
	// A pull within rounding of an end is that end.
	eps := 1e-12 * float64(load)
	if want > nMax {
		if want-nMax <= eps {
			return sMax, nil
		}
		return 0, &PullError{Required: units.Force(want), Limit: units.Force(nMax), Slip: sMax}
	}
	c := w.at(load)
	n0 := c.net(lo)
	if want < n0 {
		if n0-want <= eps {
			return lo, nil
		}
		return 0, &PullError{Required: units.Force(want), Limit: units.Force(n0), Slip: lo}
	}
	f := func(s float64) float64 { return c.net(s) - want }
	s, ok := brent(f, lo, sMax, n0-want, nMax-want, slipTol)
	if !ok {
		return 0, ErrNoConvergence
	}
	return s, nil
}

// BestSlip returns the state of greatest tractive efficiency over the
// slips at which the wheel gives net pull, up to the slip of greatest net
// pull.
func (w Wheel) BestSlip(load units.Force) (Pull, error) {
	if err := w.check(load); err != nil {
		return Pull{}, err
	}
	sMax, nMax := w.maxNetSlip(load, 0, SlipCeiling)
	if nMax <= 0 {
		return Pull{}, &PullError{Required: 0, Limit: units.Force(nMax), Slip: sMax}
	}
	lo := 0.0
	if n0 := w.net(load, 0); n0 <= 0 {
		f := func(s float64) float64 { return w.net(load, s) }
		s0, ok := brent(f, 0, sMax, n0, nMax, slipTol)
		if !ok {
			return Pull{}, ErrNoConvergence
		}
		lo = s0
	}
	te := func(s float64) float64 {
		p, err := w.model.Pull(w.tyre, w.surface, load, s)
		if err != nil {
			return -1
		}
		return p.Efficiency
	}
	s, _ := goldenMax(te, lo, sMax, slipOpt)
	return w.pull(load, s)
}

// FreeRolling returns the state of the wheel rolling free under load: no
// torque (Gross = 0), so its net pull is minus its motion resistance. The
// slip is usually slightly negative (the wheel is pushed along).
func (w Wheel) FreeRolling(load units.Force) (Pull, error) {
	if err := w.check(load); err != nil {
		return Pull{}, err
	}
	s, ok := w.freeSlip(load)
	if !ok {
		return Pull{}, ErrNoConvergence
	}
	return w.pull(load, s)
}

func (w Wheel) freeSlip(load units.Force) (float64, bool) {
	c := w.at(load)
	return brent(c.gross, MinSlip, SlipCeiling, c.gross(MinSlip), c.gross(SlipCeiling), slipTol)
}

// State is a wheel's pull together with its speeds, torque and the split of
// its input power. The balance
//
//	InputPower = DrawbarPower + SlipLoss + RollingLoss
//
// holds to rounding: T·ω = Net·v + Gross·(ω·r − v) + Resistance·v.
type State struct {
	Pull
	WheelSpeed   units.AngularVelocity // ω
	TravelSpeed  units.Speed           // v = ω·r·(1 − s)
	Torque       units.Torque          // T = Gross·r, on the wheel from its axle
	InputPower   units.Power           // T·ω
	DrawbarPower units.Power           // Net·v
	SlipLoss     units.Power           // Gross·ω·r·s
	RollingLoss  units.Power           // Resistance·v
	// Overloaded is true when the load exceeds the tyre's rated load. The
	// result is still computed; a rated limit crossed is never hidden.
	Overloaded bool
}

// StateOf returns the state of a tyre at pull p while its wheel turns at ω.
// It does not check its arguments: p comes from a Model and ω is finite.
func StateOf(t Tyre, p Pull, wheel units.AngularVelocity) State {
	r := float64(t.RollingRadius)
	om := float64(wheel)
	v0 := om * r
	v := v0 * (1 - p.Slip)
	g := float64(p.Gross)
	return State{
		Pull:         p,
		WheelSpeed:   wheel,
		TravelSpeed:  units.Speed(v),
		Torque:       units.Torque(g * r),
		InputPower:   units.Power(g * r * om),
		DrawbarPower: units.Power(float64(p.Net) * v),
		SlipLoss:     units.Power(g * v0 * p.Slip),
		RollingLoss:  units.Power(float64(p.Resistance) * v),
		Overloaded:   t.Overloaded(p.Load),
	}
}

// Run returns the state of the wheel under load at a slip in [0, 1) while
// it travels at speed v (v >= 0); the wheel speed is ω = v/(r·(1 − s)).
func (w Wheel) Run(load units.Force, slip float64, v units.Speed) (State, error) {
	if !finite(float64(v)) || v < 0 {
		return State{}, rangeErr(ErrInput, "travel speed", v, ">= 0 and finite")
	}
	p, err := w.At(load, slip)
	if err != nil {
		return State{}, err
	}
	return StateOf(w.tyre, p, wheelSpeed(w.tyre, slip, v)), nil
}

func wheelSpeed(t Tyre, slip float64, v units.Speed) units.AngularVelocity {
	return units.AngularVelocity(float64(v) / (float64(t.RollingRadius) * (1 - slip)))
}
