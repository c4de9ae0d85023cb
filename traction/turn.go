package traction

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// TurnGeometry is the Ackermann geometry of a steady turn: every wheel
// rolls about one centre on the line of the rear axle.
type TurnGeometry struct {
	// Radius is the path radius of the rear axle's centre, the input.
	Radius units.Length
	// Path radii of the wheels (each at half the track from its axle's
	// centre) and of the axle centres.
	RearInner, RearOuter, FrontInner, FrontOuter units.Length
	RearCentre, FrontCentre                      units.Length
	// Steering angles of the inner and outer front wheels.
	InnerSteer, OuterSteer units.Angle
	// SpeedRatio is the front axle's mean path speed over the rear's,
	// (R_fi + R_fo)/(R_ri + R_ro): the front-to-rear speed ratio the turn
	// requires of axles with open differentials. It is > 1.
	SpeedRatio float64
}

// Turn returns the Ackermann geometry of a turn whose rear axle centre
// follows a circle of the given radius:
//
//	R_ri,ro = R ∓ t_r/2
//	R_fi,fo = √((R ∓ t_f/2)² + L²)
//	δ_i,o   = atan(L/(R ∓ t_f/2))
//
// Both axles need a track (Axle.Track > 0), and the inner rear wheel must
// stay outside the turn centre: R > t_r/2 and R > t_f/2.
func (v Vehicle) Turn(radius units.Length) (TurnGeometry, error) {
	if err := v.Validate(); err != nil {
		return TurnGeometry{}, err
	}
	tf, tr := float64(v.Front.Track), float64(v.Rear.Track)
	if tf <= 0 || tr <= 0 {
		return TurnGeometry{}, rangeErr(ErrInput, "axle track", units.Length(math.Min(tf, tr)), "> 0 on both axles for turning")
	}
	r := float64(radius)
	if !finite(r) || r <= math.Max(tf, tr)/2 {
		return TurnGeometry{}, rangeErr(ErrInput, "turn radius", radius, "> half the track and finite")
	}
	l := float64(v.Wheelbase)
	g := TurnGeometry{
		Radius:      radius,
		RearInner:   units.Length(r - tr/2),
		RearOuter:   units.Length(r + tr/2),
		RearCentre:  radius,
		FrontInner:  units.Length(math.Hypot(r-tf/2, l)),
		FrontOuter:  units.Length(math.Hypot(r+tf/2, l)),
		FrontCentre: units.Length(math.Hypot(r, l)),
		InnerSteer:  units.Angle(math.Atan2(l, r-tf/2)),
		OuterSteer:  units.Angle(math.Atan2(l, r+tf/2)),
	}
	g.SpeedRatio = float64(g.FrontInner+g.FrontOuter) / float64(g.RearInner+g.RearOuter)
	return g, nil
}

// FixedRatioTurn solves a vehicle with a fixed front-to-rear drive ratio
// (lead) in a steady turn of the given rear-axle radius. The front axle
// must travel SpeedRatio times faster than the rear, so the lead the slips
// see is
//
//	1 + lead_eff = (1 + lead)/SpeedRatio
//
// A lead smaller than the turn needs makes the front axle brake and the
// rear push (wind-up); CirculatingPower is the power the braked axle
// returns into the driveline. An axle driven by its own motor
// (Independent) has none. Forces are taken along each axle's path, side
// forces are neglected, and the pulls balance in moments about the turn
// centre with the hitch on the rear axle's path:
//
//	SpeedRatio·N_f + N_r = P,  so that  N_f·v_f + N_r·v_r = P·v
//
// The overrun axle's negative slip extrapolates the traction model beyond
// the driving range it was fitted to; treat wind-up figures as estimates.
func (v Vehicle) FixedRatioTurn(m Model, s Surface, op Operation, lead float64, radius units.Length) (Drive, TurnGeometry, error) {
	if err := checkLead(lead); err != nil {
		return Drive{}, TurnGeometry{}, err
	}
	g, err := v.Turn(radius)
	if err != nil {
		return Drive{}, TurnGeometry{}, err
	}
	p, err := v.pair(m, s, op)
	if err != nil {
		return Drive{}, g, err
	}
	eff := (1+lead)/g.SpeedRatio - 1
	if err := checkLead(eff); err != nil {
		return Drive{}, g, err
	}
	p.frontSpeedMult = g.SpeedRatio
	d, err := p.fixed(op.Pull, eff)
	return d, g, err
}

// IndependentTurn solves a vehicle whose axles have their own motors in a
// steady turn of the given rear-axle radius: each axle runs at the speed its
// path needs, the pull split is chosen for the least input power, and no
// power circulates. Compare with FixedRatioTurn to see the wind-up an
// independent front drive avoids. Drive.Lead reports the front-to-rear
// theoretical speed ratio minus one that the motors run at.
func (v Vehicle) IndependentTurn(m Model, s Surface, op Operation, radius units.Length) (Drive, TurnGeometry, error) {
	g, err := v.Turn(radius)
	if err != nil {
		return Drive{}, TurnGeometry{}, err
	}
	p, err := v.pair(m, s, op)
	if err != nil {
		return Drive{}, g, err
	}
	p.frontSpeedMult = g.SpeedRatio
	d, err := p.independent(op.Pull)
	return d, g, err
}
