package traction

import (
	"math"

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
	// Caution is BallastCaution.
	Caution string
}

// Ballast returns the operating mass, with the recommended static weight
// split for the drive and hitch type, at which the vehicle gives the
// operation's drawbar pull at the target slip (both axles of a
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
	}
	a.FrontOverloaded = v.Front.Tyre.Overloaded(units.Force(float64(st.Front)/nf)) ||
		v.Front.Tyre.Overloaded(units.Force(float64(dy.Front)/nf))
	a.RearOverloaded = v.Rear.Tyre.Overloaded(units.Force(float64(st.Rear)/nr)) ||
		v.Rear.Tyre.Overloaded(units.Force(float64(dy.Rear)/nr))
	return a, nil
}
