package traction

import "github.com/powersplit-dev/powersplit/units"

// Axle is one axle's wheels. All wheels of an axle carry the same tyre and
// an equal share of the axle load.
type Axle struct {
	Tyre   Tyre
	Wheels int          // wheels on the axle: 2 for singles, 4 for duals; >= 1
	Track  units.Length // track width, centre to centre of the wheels; needed only for turning, else >= 0
	// MaxLoad is the axle's permissible load (the vehicle maker's rating);
	// zero means not given. Ballast advice keeps within it.
	MaxLoad units.Force
}

func (a Axle) validate(name string) error {
	if err := a.Tyre.Validate(); err != nil {
		return err
	}
	if a.Wheels < 1 || a.Wheels > 16 {
		return rangeErr(ErrInput, name+" axle wheel count", float64(a.Wheels), "in [1, 16]")
	}
	if t := float64(a.Track); !finite(t) || t < 0 {
		return rangeErr(ErrInput, name+" axle track", a.Track, ">= 0 and finite")
	}
	if l := float64(a.MaxLoad); !finite(l) || l < 0 {
		return rangeErr(ErrInput, name+" axle permissible load", a.MaxLoad, ">= 0 and finite (0: not given)")
	}
	return nil
}

// Hitch is where the drawbar pull acts.
type Hitch struct {
	Height units.Length // height of the line of pull above the ground, >= 0
	Behind units.Length // horizontal distance of the hitch point behind the rear axle, >= 0
}

// Vehicle is a two-axle vehicle as the traction calculations see it: a
// mass, its position, the axles and the hitch. The front axle steers.
type Vehicle struct {
	Mass      units.Mass   // operating mass, > 0
	Wheelbase units.Length // distance between the axles, > 0
	// CentreOfMass is the horizontal distance of the centre of mass ahead
	// of the rear axle, in [0, Wheelbase].
	CentreOfMass units.Length
	Hitch        Hitch
	Front, Rear  Axle
	// FittedBallast is the ballast fitted, part of Mass; MaxMass the
	// permissible operating mass. Zero means none fitted and not given.
	// Ballast advice never removes more than FittedBallast and never
	// exceeds MaxMass.
	FittedBallast, MaxMass units.Mass
}

// Validate reports whether v is usable.
func (v Vehicle) Validate() error {
	m, l, a := float64(v.Mass), float64(v.Wheelbase), float64(v.CentreOfMass)
	switch {
	case !finite(m) || m <= 0:
		return rangeErr(ErrInput, "vehicle mass", v.Mass, "> 0 and finite")
	case !finite(l) || l <= 0:
		return rangeErr(ErrInput, "wheelbase", v.Wheelbase, "> 0 and finite")
	case !finite(a) || a < 0 || a > l:
		return rangeErr(ErrInput, "centre of mass ahead of rear axle", v.CentreOfMass, "in [0, wheelbase]")
	case !finite(float64(v.Hitch.Height)) || v.Hitch.Height < 0:
		return rangeErr(ErrInput, "hitch height", v.Hitch.Height, ">= 0 and finite")
	case !finite(float64(v.Hitch.Behind)) || v.Hitch.Behind < 0:
		return rangeErr(ErrInput, "hitch distance behind rear axle", v.Hitch.Behind, ">= 0 and finite")
	case !finite(float64(v.FittedBallast)) || v.FittedBallast < 0 || v.FittedBallast >= v.Mass:
		return rangeErr(ErrInput, "fitted ballast", v.FittedBallast, ">= 0 and below the vehicle mass")
	case !finite(float64(v.MaxMass)) || v.MaxMass < 0:
		return rangeErr(ErrInput, "permissible operating mass", v.MaxMass, ">= 0 and finite (0: not given)")
	}
	if err := v.Front.validate("front"); err != nil {
		return err
	}
	return v.Rear.validate("rear")
}

// AxleLoads are the vertical loads the ground carries under each axle.
type AxleLoads struct {
	Front, Rear units.Force
}

// Weight returns the vehicle's weight m·gₙ.
func (v Vehicle) Weight() units.Force { return units.ForceFromMass(v.Mass, units.Gravity) }

// StaticLoads returns the axle loads at rest on level ground:
//
//	W_f = W·a/L,  W_r = W − W_f
//
// with a the centre of mass ahead of the rear axle and L the wheelbase.
func (v Vehicle) StaticLoads() (AxleLoads, error) {
	return v.DynamicLoads(0, 0)
}

// DynamicLoads returns the axle loads while the vehicle pulls a horizontal
// drawbar pull P at the hitch (height h) and carries a mounted implement's
// vertical load V at the hitch point (distance c behind the rear axle).
// Moments about the rear contact line give
//
//	W_f = (W·a − P·h − V·c)/L,  W_r = W + V − W_f
//
// so pull moves weight from the front to the rear axle. A front load at or
// below zero is an error wrapping ErrUnstable.
func (v Vehicle) DynamicLoads(pull, implement units.Force) (AxleLoads, error) {
	if err := v.Validate(); err != nil {
		return AxleLoads{}, err
	}
	if !finite(float64(pull)) || pull < 0 {
		return AxleLoads{}, rangeErr(ErrInput, "drawbar pull", pull, ">= 0 and finite")
	}
	if !finite(float64(implement)) || implement < 0 {
		return AxleLoads{}, rangeErr(ErrInput, "implement vertical load", implement, ">= 0 and finite")
	}
	w := float64(v.Weight())
	wf := (w*float64(v.CentreOfMass) - float64(pull)*float64(v.Hitch.Height) -
		float64(implement)*float64(v.Hitch.Behind)) / float64(v.Wheelbase)
	if wf <= 0 {
		return AxleLoads{}, &RangeError{Quantity: "front axle load", Value: units.Of(units.Force(wf)), Limit: "> 0", Err: ErrUnstable}
	}
	return AxleLoads{Front: units.Force(wf), Rear: units.Force(w + float64(implement) - wf)}, nil
}
