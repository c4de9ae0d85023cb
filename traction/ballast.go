package traction

import (
	"math"
	"strconv"

	"github.com/powersplit-dev/powersplit/units"
)

// DriveType is how a tractor's axles are driven, as the ballasting tables
// distinguish them.
type DriveType int

// The drive types of the ballasting tables.
const (
	RearWheelDrive   DriveType = iota // two-wheel drive, rear axle driven
	FrontWheelAssist                  // mechanical front-wheel drive with smaller front tyres
	FourWheelDrive                    // four-wheel drive with equal tyres
)

// HitchType is how the implement is carried.
type HitchType int

// The hitch types of the ballasting tables.
const (
	Towed       HitchType = iota // drawn on the drawbar
	SemiMounted                  // carried partly on the three-point hitch
	Mounted                      // carried fully on the three-point hitch
)

// recommendedFront holds the recommended static front-axle share of the
// operating weight.
//
// From memory: ASABE EP496.3 (2006), agricultural machinery management,
// recommended static weight distribution front/rear: two-wheel drive
// 25/75 towed, 30/70 semi-mounted, 35/65 mounted; front-wheel assist
// 35/65, 35/65, 40/60; four-wheel drive 55/45, 55/45, 60/40. Recalled,
// not read: check against your copy.
var recommendedFront = [3][3]float64{
	RearWheelDrive:   {Towed: 0.25, SemiMounted: 0.30, Mounted: 0.35},
	FrontWheelAssist: {Towed: 0.35, SemiMounted: 0.35, Mounted: 0.40},
	FourWheelDrive:   {Towed: 0.55, SemiMounted: 0.55, Mounted: 0.60},
}

// RecommendedFrontShare returns the published recommended static share of
// the operating weight on the front axle (see the package documentation
// for the source).
func RecommendedFrontShare(d DriveType, h HitchType) (float64, error) {
	if d < RearWheelDrive || d > FourWheelDrive {
		return 0, rangeErr(ErrInput, "drive type", float64(d), "a defined DriveType")
	}
	if h < Towed || h > Mounted {
		return 0, rangeErr(ErrInput, "hitch type", float64(h), "a defined HitchType")
	}
	return recommendedFront[d][h], nil
}

// BallastCaution is the caution every ballast advice carries.
const BallastCaution = "Ballast estimates only: tyre load ratings at the inflation and speed of use, " +
	"axle and hitch limits, the vehicle manufacturer's ballasting instructions and local road rules " +
	"(axle loads, total mass, braking) bound any ballast; added mass lengthens stopping distances and " +
	"changes handling. Check with the manufacturer or a qualified engineer before use."

// BallastAdvice is the operating mass and its split that let the vehicle
// give a target pull at a target slip.
type BallastAdvice struct {
	// FrontShare is the recommended static front-axle share used.
	FrontShare float64
	// Mass is the operating mass that gives the target pull at the target
	// slip with the recommended split.
	Mass units.Mass
	// Ballast is Mass minus the vehicle's present mass; negative means
	// the vehicle is heavier than the pull needs (remove ballast).
	Ballast units.Mass
	// FrontBallast and RearBallast are the masses to add on each axle to
	// reach Mass with the recommended split; a negative value means
	// mass must come off that axle.
	FrontBallast, RearBallast units.Mass
	// Static and Dynamic are the axle loads at Mass, at rest and at the
	// target pull.
	Static, Dynamic AxleLoads
	// FrontOverloaded and RearOverloaded flag a wheel load above its
	// tyre's rated load (static or dynamic); the advice is then unsafe.
	FrontOverloaded, RearOverloaded bool
	// PullMass is the operating mass the pull alone asks for; Mass differs
	// from it when a bound holds it back, and Bound then names that bound
	// ("fitted ballast", "permissible operating mass", "front tyre rated
	// load", "rear axle permissible load", ...); "" when none does. With
	// an upper bound holding, the target pull is not reached at the target
	// slip.
	PullMass units.Mass
	Bound    string
	// Respects lists the limits the advice keeps to, with their values;
	// NotChecked the ones the vehicle does not give, which the advice
	// therefore cannot respect.
	Respects, NotChecked []string
	// Caution is BallastCaution.
	Caution string
}

// Ballast returns the operating mass, with the recommended static weight
// split for the drive and hitch type, at which the vehicle gives the
// operation's drawbar pull at the target slip, kept within the bounds the
// vehicle gives: no more ballast removed than is fitted (Vehicle.FittedBallast),
// no more mass than permitted (Vehicle.MaxMass), and no axle loaded above
// its permissible load (Axle.MaxLoad) or its tyres' rated load
// (Tyre.RatedLoad), at rest or under the pull; BallastAdvice.Bound says
// which bound held, Respects lists them and NotChecked those not given (both axles of a
// four-wheel-drive or front-assist vehicle at the same slip, the front of
// a rear-wheel-drive one rolling free at zero torque). The mass is found by
// Brent's method; a pull beyond what any mass gives is a *PullError.
// The vehicle's own centre of mass is replaced by the recommended split.
func (v Vehicle) Ballast(m Model, s Surface, op Operation, d DriveType, h HitchType, slip float64) (BallastAdvice, error) {
	share, err := RecommendedFrontShare(d, h)
	if err != nil {
		return BallastAdvice{}, err
	}
	if !(slip > 0 && slip < SlipCeiling) {
		return BallastAdvice{}, rangeErr(ErrSlip, "target slip", slip, "in (0, 0.9)")
	}
	if err := v.Validate(); err != nil {
		return BallastAdvice{}, err
	}
	if err := op.validate(); err != nil {
		return BallastAdvice{}, err
	}
	fw, err := NewWheel(v.Front.Tyre, s, m)
	if err != nil {
		return BallastAdvice{}, err
	}
	rw, err := NewWheel(v.Rear.Tyre, s, m)
	if err != nil {
		return BallastAdvice{}, err
	}
	sf := slip
	trial := v
	trial.CentreOfMass = units.Length(share * float64(v.Wheelbase))
	nf, nr := float64(v.Front.Wheels), float64(v.Rear.Wheels)
	// pullAt returns the vehicle's net pull at the target slip with mass
	// mass, or -Inf where the loads are not valid (front lifted).
	pullAt := func(mass float64) float64 {
		t := trial
		t.Mass = units.Mass(mass)
		l, err := t.DynamicLoads(op.Pull, op.Implement)
		if err != nil {
			return bigNeg
		}
		lf := units.Force(float64(l.Front) / nf)
		front := sf
		if d == RearWheelDrive {
			s0, ok := fw.freeSlip(lf)
			if !ok {
				return bigNeg
			}
			front = s0
		}
		return nf*fw.net(lf, front) + nr*rw.net(units.Force(float64(l.Rear)/nr), slip)
	}
	want := float64(op.Pull)
	m0 := float64(v.Mass)
	lo, hi := m0/50, m0*50
	// The pull rises with mass, then falls once sinkage (1/Bn) dominates.
	mBest, pBest := goldenMax(func(x float64) float64 { return pullAt(x) }, lo, hi, 1e-9*hi)
	if want > pBest {
		return BallastAdvice{}, &PullError{Required: op.Pull, Limit: units.Force(pBest), Slip: slip}
	}
	// Smallest mass that gives the pull: search up from the lightest
	// mass at which the front is still loaded.
	start := lo
	for pullAt(start) == bigNeg && start < mBest {
		start = math.Min(start*1.5, mBest)
	}
	pStart := pullAt(start)
	var mass float64
	if pStart >= want {
		mass = start
	} else {
		var ok bool
		mass, ok = brent(func(x float64) float64 { return pullAt(x) - want }, start, mBest, pStart-want, pBest-want, 1e-9*mBest)
		if !ok {
			return BallastAdvice{}, ErrNoConvergence
		}
	}
	pullMass := mass
	b := v.ballastBounds(trial, op)
	bound := ""
	switch {
	case mass < b.low:
		mass, bound = b.low, b.lowName
	case mass > b.high:
		mass, bound = b.high, b.highName
	}
	if b.low > b.high {
		// The bounds contradict each other: even with all ballast off a
		// limit is crossed; keep the ballast on and say so.
		mass, bound = b.low, b.lowName+" (and above the "+b.highName+")"
	}
	t := trial
	t.Mass = units.Mass(mass)
	st, err := t.StaticLoads()
	if err != nil {
		return BallastAdvice{}, err
	}
	dy, err := t.DynamicLoads(op.Pull, op.Implement)
	if err != nil {
		return BallastAdvice{}, err
	}
	// Present static masses per axle from the vehicle's own centre of mass.
	frontNow := m0 * float64(v.CentreOfMass) / float64(v.Wheelbase)
	a := BallastAdvice{
		FrontShare:   share,
		Mass:         units.Mass(mass),
		Ballast:      units.Mass(mass - m0),
		FrontBallast: units.Mass(share*mass - frontNow),
		RearBallast:  units.Mass((1-share)*mass - (m0 - frontNow)),
		Static:       st,
		Dynamic:      dy,
		Caution:      BallastCaution,
		PullMass:     units.Mass(pullMass),
		Bound:        bound,
		Respects:     b.respects,
		NotChecked:   b.notChecked,
	}
	a.FrontOverloaded = v.Front.Tyre.Overloaded(units.Force(float64(st.Front)/nf)) ||
		v.Front.Tyre.Overloaded(units.Force(float64(dy.Front)/nf))
	a.RearOverloaded = v.Rear.Tyre.Overloaded(units.Force(float64(st.Rear)/nr)) ||
		v.Rear.Tyre.Overloaded(units.Force(float64(dy.Rear)/nr))
	return a, nil
}

// bounds are the least and greatest operating mass a ballast advice may
// give, with the names of the limits that set them.
type bounds struct {
	low, high            float64
	lowName, highName    string
	respects, notChecked []string
}

// ballastBounds returns the bounds on the operating mass of trial (v with
// the recommended split) that its fitted ballast, permissible mass, axle
// and tyre ratings set, for the loads at rest and under the pull of the
// operation. The axle loads are linear in the mass at a fixed split.
func (v Vehicle) ballastBounds(trial Vehicle, op Operation) bounds {
	m0 := float64(v.Mass)
	b := bounds{low: m0 - float64(v.FittedBallast), high: math.Inf(1), lowName: "fitted ballast"}
	kg := func(m float64) string { return strconv.FormatFloat(m, 'f', 0, 64) + " kg" }
	if v.FittedBallast > 0 {
		b.respects = append(b.respects, "fitted ballast "+kg(float64(v.FittedBallast))+" (no more can be removed)")
	} else {
		b.respects = append(b.respects, "no ballast fitted (none can be removed)")
	}
	if v.MaxMass > 0 {
		b.high, b.highName = float64(v.MaxMass), "permissible operating mass"
		b.respects = append(b.respects, "permissible operating mass "+kg(float64(v.MaxMass)))
	} else {
		b.notChecked = append(b.notChecked, "permissible operating mass")
	}
	// The axle loads at rest and under the pull, each linear in the mass,
	// taken at two masses; the larger of the two counts for each axle (the
	// pull unloads the front and loads the rear). A mass at which the front
	// would lift gives no load here: the advice search has excluded it.
	loads := func(m float64) (st, dy AxleLoads, ok bool) {
		t := trial
		t.Mass = units.Mass(m)
		st, err1 := t.StaticLoads()
		dy, err2 := t.DynamicLoads(op.Pull, op.Implement)
		return st, dy, err1 == nil && err2 == nil
	}
	s1, d1, ok1 := loads(m0)
	s2, d2, ok2 := loads(2 * m0)
	if !ok1 || !ok2 {
		return b
	}
	type line struct{ f1, f2 float64 }
	for _, ax := range []struct {
		name  string
		axle  Axle
		lines [2]line
	}{
		{"front", v.Front, [2]line{{float64(s1.Front), float64(s2.Front)}, {float64(d1.Front), float64(d2.Front)}}},
		{"rear", v.Rear, [2]line{{float64(s1.Rear), float64(s2.Rear)}, {float64(d1.Rear), float64(d2.Rear)}}},
	} {
		limits := []struct {
			what  string
			limit float64
		}{
			{ax.name + " axle permissible load", float64(ax.axle.MaxLoad)},
			{ax.name + " tyre rated load", float64(ax.axle.Tyre.RatedLoad) * float64(ax.axle.Wheels)},
		}
		for _, lim := range limits {
			if !(lim.limit > 0) {
				b.notChecked = append(b.notChecked, lim.what)
				continue
			}
			b.respects = append(b.respects, lim.what+" "+units.Force(lim.limit).String())
			for _, ln := range ax.lines {
				slope := (ln.f2 - ln.f1) / m0
				if !(slope > 0) {
					continue
				}
				if m := m0 + (lim.limit-ln.f1)/slope; m < b.high {
					b.high, b.highName = m, lim.what
				}
			}
		}
	}
	return b
}
