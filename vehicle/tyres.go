package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

// Traction is the vehicle's tyres on the ground, seen by the vehicle.
type Traction interface {
	// Drive returns the state of the driven wheels when they give the net
	// pull `pull` (>= 0: the drawbar pull plus the grade, drag and inertia
	// forces) at travel speed v (> 0) on a grade (rise over run).
	Drive(pull units.Force, grade float64, v units.Speed) (Wheels, error)
}

// Wheels is the state of the driven wheels. It must satisfy
// Power = pull·v + SlipLoss + RollingLoss (checked by the vehicle to 1e-6
// relative).
type Wheels struct {
	// Speed is the speed of the wheel shaft that the final drive turns.
	Speed units.AngularVelocity
	// Power is the power the driveline delivers to all driven wheels.
	Power units.Power
	// Slip is the slip of the wheels on Speed's shaft.
	Slip float64
	// SlipLoss and RollingLoss are summed over all wheels.
	SlipLoss, RollingLoss units.Power
	// Overloaded is true when a tyre carries more than its rated load.
	Overloaded bool
	// TyreLoad is the load on one tyre of the axle loaded most heavily
	// relative to its rating, RatedLoad that tyre's rating (zero when
	// unknown).
	TyreLoad, RatedLoad units.Force
	// FrontSlipLoss and RearSlipLoss split SlipLoss between the axles and
	// Circulating is the power an overrun axle returns into the driveline
	// (zero when the model does not tell).
	FrontSlipLoss, RearSlipLoss, Circulating units.Power
	// Unrated names the axles whose tyres have no load rating, so that
	// their load is not checked: "", "front", "rear" or "front and rear".
	Unrated string
	// Outside names the traction model's inputs outside the range it was
	// fitted to, per axle (see traction.Pull.Outside); "" when none.
	Outside string
}

// A SlipCurve is a simple traction model for studies and tests: all wheels
// driven, rolling-resistance coefficient f, and a gross traction ratio
// that rises with slip s as
//
//	μ(s) = μ_max·(1 − e^(−k·s))
//
// so the slip for a gross traction ratio μ = (pull + f·W)/W is
// s = −ln(1 − μ/μ_max)/k. Pulls that need μ >= μ_max are beyond traction.
//
// Common practice (no published source): an exponential slip curve is a
// usual first model of a tyre's pull–slip relation.
type SlipCurve struct {
	Weight       units.Force  // weight on the driven wheels, > 0
	Radius       units.Length // rolling radius, > 0
	Rolling      float64      // f in [0, 1)
	PeakTraction float64      // μ_max in (0, 2]
	SlipRate     float64      // k > 0
}

// Validate reports whether the curve is usable.
func (c SlipCurve) Validate() error {
	if err := positive("SlipCurve.Weight", c.Weight); err != nil {
		return err
	}
	if err := positive("SlipCurve.Radius", c.Radius); err != nil {
		return err
	}
	if err := nonNegative("SlipCurve.Rolling", c.Rolling); err != nil || c.Rolling >= 1 {
		return invalid("SlipCurve.Rolling", c.Rolling, "must be in [0, 1)")
	}
	if !finite(c.PeakTraction) || c.PeakTraction <= 0 || c.PeakTraction > 2 {
		return invalid("SlipCurve.PeakTraction", c.PeakTraction, "must be in (0, 2]")
	}
	return positive("SlipCurve.SlipRate", c.SlipRate)
}

// Drive implements Traction. The normal load is W·cos θ on a grade.
func (c SlipCurve) Drive(pull units.Force, grade float64, v units.Speed) (Wheels, error) {
	if err := c.Validate(); err != nil {
		return Wheels{}, err
	}
	if err := nonNegative("pull", pull); err != nil {
		return Wheels{}, err
	}
	if err := isFinite("grade", grade); err != nil {
		return Wheels{}, err
	}
	if err := positive("travel speed", v); err != nil {
		return Wheels{}, err
	}
	w := float64(c.Weight) * cosGrade(grade)
	mr := c.Rolling * w
	gross := float64(pull) + mr
	mu := gross / w
	if mu >= c.PeakTraction*(1-1e-9) {
		return Wheels{}, &LimitError{Quantity: "gross traction", Value: units.Of(units.Force(gross)), Bound: "peak traction", Limit: units.Of(units.Force(c.PeakTraction * w)), Err: ErrTraction}
	}
	s := -math.Log1p(-mu/c.PeakTraction) / c.SlipRate
	if s >= 0.99 {
		return Wheels{}, &LimitError{Quantity: "slip", Value: units.Plain(s), Bound: "highest slip", Limit: units.Plain(0.99), Err: ErrTraction}
	}
	vs := float64(v)
	return Wheels{
		Speed:       units.AngularVelocity(vs / (float64(c.Radius) * (1 - s))),
		Power:       units.Power(gross * vs / (1 - s)),
		Slip:        s,
		SlipLoss:    units.Power(gross * vs * s / (1 - s)),
		RollingLoss: units.Power(mr * vs),
	}, nil
}

// Tyres adapts the traction package's two-axle model to Traction. The rear
// axle's wheels set the wheel-shaft speed; with FrontDrive the front axle
// is driven too, at the fixed lead Lead (front theoretical speed over
// rear, minus one), otherwise it rolls free.
//
// The traction model sees the whole net pull as a drawbar pull at the
// hitch, so grade, drag and inertia forces move weight to the rear axle as
// a pull at hitch height would; the grade's cos θ reduction of the normal
// load is neglected.
type Tyres struct {
	Vehicle    traction.Vehicle
	Model      traction.Model
	Surface    traction.Surface
	FrontDrive bool
	Lead       float64
}

// Drive implements Traction.
func (t Tyres) Drive(pull units.Force, grade float64, v units.Speed) (Wheels, error) {
	if err := nonNegative("pull", pull); err != nil {
		return Wheels{}, err
	}
	if err := positive("travel speed", v); err != nil {
		return Wheels{}, err
	}
	if t.Model == nil {
		return Wheels{}, invalid("Tyres.Model", math.NaN(), "is required")
	}
	op := traction.Operation{Pull: pull, Speed: v}
	var (
		d   traction.Drive
		err error
	)
	if t.FrontDrive {
		d, err = t.Vehicle.FixedRatio(t.Model, t.Surface, op, t.Lead)
	} else {
		d, err = t.Vehicle.RearDrive(t.Model, t.Surface, op)
	}
	if err != nil {
		return Wheels{}, tractionErr(err)
	}
	return t.wheels(d), nil
}

// wheels is the Wheels view of a solved traction drive.
func (t Tyres) wheels(d traction.Drive) Wheels {
	load, rated := d.Rear.Wheel.Load, t.Vehicle.Rear.Tyre.RatedLoad
	if fl, fr := d.Front.Wheel.Load, t.Vehicle.Front.Tyre.RatedLoad; fr > 0 && (rated <= 0 || float64(fl)/float64(fr) > float64(load)/float64(rated)) {
		load, rated = fl, fr
	}
	return Wheels{
		Speed:         d.Rear.Wheel.WheelSpeed,
		Power:         d.InputPower,
		Slip:          d.Rear.Wheel.Slip,
		SlipLoss:      d.SlipLoss,
		RollingLoss:   d.RollingLoss,
		Overloaded:    d.Front.Wheel.Overloaded || d.Rear.Wheel.Overloaded,
		TyreLoad:      load,
		RatedLoad:     rated,
		FrontSlipLoss: d.Front.SlipLoss,
		RearSlipLoss:  d.Rear.SlipLoss,
		Circulating:   d.CirculatingPower,
		Unrated:       unrated(t.Vehicle.Front.Tyre.RatedLoad > 0, t.Vehicle.Rear.Tyre.RatedLoad > 0),
		Outside:       outside(d.Front.Wheel.Outside, d.Rear.Wheel.Outside),
	}
}

// outside joins the axles' Pull.Outside flags; it allocates only when
// there is one.
func outside(front, rear string) string {
	switch {
	case front == "" && rear == "":
		return ""
	case front == "":
		return "rear tyres: " + rear
	case rear == "":
		return "front tyres: " + front
	}
	return "front tyres: " + front + "; rear tyres: " + rear
}

// unrated names the axles whose tyres have no load rating.
func unrated(front, rear bool) string {
	switch {
	case !front && !rear:
		return "front and rear"
	case !front:
		return "front"
	case !rear:
		return "rear"
	}
	return ""
}
