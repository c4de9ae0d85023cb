package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Geometry is where the vehicle's weight and pull act, for the axle loads
// and the check that the front axle stays loaded.
type Geometry struct {
	Wheelbase units.Length // distance between the axles, > 0
	// CentreOfMass is the horizontal distance of the centre of mass ahead
	// of the rear axle, in (0, Wheelbase).
	CentreOfMass units.Length
	// CentreOfMassHeight is the height of the centre of mass, >= 0.
	CentreOfMassHeight units.Length
	// HitchHeight is the height of the line of pull (drawbar or trailer
	// hitch) above the ground, >= 0.
	HitchHeight units.Length
}

func (g *Geometry) validate() error {
	if err := positive("Geometry.Wheelbase", g.Wheelbase); err != nil {
		return err
	}
	if err := positive("Geometry.CentreOfMass", g.CentreOfMass); err != nil {
		return err
	}
	if g.CentreOfMass >= g.Wheelbase {
		return invalid("Geometry.CentreOfMass", g.CentreOfMass, "must be less than the wheelbase")
	}
	if err := nonNegative("Geometry.CentreOfMassHeight", g.CentreOfMassHeight); err != nil {
		return err
	}
	return nonNegative("Geometry.HitchHeight", g.HitchHeight)
}

// AxleLoads returns the front and rear axle loads under demand d, from the
// moments about the rear tyre contact:
//
//	W_f·L = m·g·(x·cos θ − h·sin θ) − m·a·h − F_hitch·h_hitch
//
// with x and h the centre of mass ahead of the rear axle and its height,
// F_hitch the draft plus the trailer's pull. A front load at or below zero
// is a *LimitError wrapping ErrStability: the front would lift, the vehicle
// could not be steered and could overturn backwards. A vehicle without
// Geometry returns ErrInvalid.
func (v *Vehicle) AxleLoads(d Demand) (front, rear units.Force, err error) {
	g := v.s.Geometry
	if g == nil {
		return 0, 0, invalid("Spec.Geometry", math.NaN(), "is needed for axle loads")
	}
	if err := d.Validate(); err != nil {
		return 0, 0, err
	}
	m := float64(v.s.Mass)
	gr := float64(units.Gravity)
	hitch := float64(d.Draft) + float64(d.Trailer.Pull(d.Grade, d.Acceleration))
	x, h, L := float64(g.CentreOfMass), float64(g.CentreOfMassHeight), float64(g.Wheelbase)
	normal := m * gr * cosGrade(d.Grade)
	wf := (m*gr*(x*cosGrade(d.Grade)-h*sinGrade(d.Grade)) - m*float64(d.Acceleration)*h - hitch*float64(g.HitchHeight)) / L
	if !(wf > 0) {
		return 0, 0, &LimitError{Quantity: "front axle load", Value: units.Of(units.Force(wf)), Bound: "zero load", Limit: units.Of(units.Force(0)), Err: ErrStability}
	}
	return units.Force(wf), units.Force(normal - wf), nil
}
