package traction

import (
	"errors"
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// loadedTol is the absolute tolerance on slip of LoadedWheel.SlipFor.
const loadedTol = 1e-13

// A LoadedWheel is a wheel under one load: its pull over slip, with what
// depends on the load alone worked out once, for a solver that asks for
// many slips at one load (an axle of a two-axle point). Build it with
// Wheel.Loaded; the value is immutable and safe to share.
type LoadedWheel struct {
	w       Wheel
	load    units.Force
	brixius bool // b holds the load's terms of a Brixius wheel
	b       brixiusAtLoad
	slope   SlopeModel // the model's slope, nil without one
}

// Loaded returns the wheel under load (> 0 and finite).
func (w Wheel) Loaded(load units.Force) (LoadedWheel, error) {
	if err := w.check(load); err != nil {
		return LoadedWheel{}, err
	}
	c := LoadedWheel{w: w, load: load}
	if _, ok := w.model.(Brixius); ok {
		c.brixius, c.b = true, brixiusLoad(w.tyre, w.surface, load)
	} else if m, ok := w.model.(SlopeModel); ok {
		c.slope = m
	}
	return c, nil
}

// Wheel returns the wheel.
func (c LoadedWheel) Wheel() Wheel { return c.w }

// Load returns the wheel load.
func (c LoadedWheel) Load() units.Force { return c.load }

// Pull returns the pull at slip, the model's Pull at the load bit for bit.
func (c LoadedWheel) Pull(slip float64) (Pull, error) {
	if c.brixius && validSlip(slip) {
		gt, mr := c.b.terms(slip)
		p := makePull(c.load, slip, gt, mr)
		p.Outside = brixiusOutside(c.w.tyre, slip)
		return p, nil
	}
	if c.w.model == nil {
		return Pull{}, rangeErr(ErrInput, "loaded wheel", 0.0, "built with Wheel.Loaded")
	}
	return c.w.model.Pull(c.w.tyre, c.w.surface, c.load, slip)
}

// SlipFor returns the slip in [lo, hi] at which the wheel's net pull is
// net. The net pulls at lo and hi must lie on either side of net (either
// may equal it), else a *PullError. A guess inside (lo, hi) starts the
// search (a solver asking for nearby pulls passes the last slip); NaN
// starts it from the bracket. Brixius and any other SlopeModel are solved
// by Newton's method kept inside the bracket, bisecting where a step would
// leave it or shrink it too slowly; any other Model by Brent's method.
// Either way the search stops with the sign change of the net pull less
// net bracketed within 4·ε·|s| + 1e-13 (ε the float64 machine epsilon)
// and returns the bracket's end nearer a root, by value: for a
// continuous model, a slip that far from a root at most.
func (c LoadedWheel) SlipFor(net units.Force, lo, hi, guess float64) (float64, error) {
	if c.w.model == nil {
		return 0, rangeErr(ErrInput, "loaded wheel", 0.0, "built with Wheel.Loaded")
	}
	want := float64(net)
	if !finite(want) {
		return 0, rangeErr(ErrInput, "required net pull", net, "finite")
	}
	if !validSlip(lo) || !validSlip(hi) || !(lo < hi) {
		return 0, rangeErr(ErrSlip, "slip bracket", hi-lo, "lo < hi, both in [-0.5, 1)")
	}
	if !c.brixius && c.slope == nil {
		return c.brent(want, lo, hi)
	}
	fd := func(s float64) (float64, float64) {
		if c.brixius {
			n, d := c.b.netSlope(c.load, s)
			return n - want, d
		}
		n, d, err := c.slope.NetSlope(c.w.tyre, c.w.surface, c.load, s)
		if err != nil {
			return math.NaN(), math.NaN()
		}
		return float64(n) - want, float64(d)
	}
	fa, _ := fd(lo)
	fb, _ := fd(hi)
	if math.IsNaN(fa) || math.IsNaN(fb) {
		return 0, ErrNoConvergence
	}
	if fa != 0 && fb != 0 && (fa > 0) == (fb > 0) {
		return 0, bracketErr(want, lo, hi, fa, fb)
	}
	s, ok := newtonBracket(fd, lo, hi, fa, fb, guess, loadedTol, maxIters)
	if !ok {
		return 0, ErrNoConvergence
	}
	return s, nil
}

// brent is SlipFor by Brent's method on the model's Pull.
func (c LoadedWheel) brent(want, lo, hi float64) (float64, error) {
	f := func(s float64) float64 {
		q, err := c.w.model.Pull(c.w.tyre, c.w.surface, c.load, s)
		if err != nil {
			return math.NaN()
		}
		return float64(q.Net) - want
	}
	s, err := numeric.Brent(f, lo, hi, loadedTol, maxIters)
	if errors.Is(err, numeric.ErrNoBracket) {
		return 0, bracketErr(want, lo, hi, f(lo), f(hi))
	}
	if err != nil {
		return 0, ErrNoConvergence
	}
	return s, nil
}

// bracketErr is the *PullError of a net pull outside the nets at the ends
// of [lo, hi], fa and fb less the pull: the limit is the nearer end's.
func bracketErr(want, lo, hi, fa, fb float64) error {
	if math.Abs(fa) <= math.Abs(fb) {
		return &PullError{Required: units.Force(want), Limit: units.Force(fa + want), Slip: lo}
	}
	return &PullError{Required: units.Force(want), Limit: units.Force(fb + want), Slip: hi}
}
