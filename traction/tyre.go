package traction

import "github.com/powersplit-dev/powersplit/units"

// Tyre is the geometry and rating of one pneumatic tyre, taken from the
// user's data. The library never invents a load rating: a zero RatedLoad
// means "unknown" and turns the overload flag off.
type Tyre struct {
	// Diameter is the unloaded overall diameter d. Required, > 0.
	Diameter units.Length
	// Width is the unloaded section width b. Required, > 0.
	Width units.Length
	// SectionHeight is the unloaded section height h. Required, > 0 and
	// at most half the diameter.
	SectionHeight units.Length
	// RollingRadius is the rolling radius r that turns wheel speed into
	// theoretical travel speed, v₀ = ω·r. Required, > 0 and at most half
	// the diameter.
	RollingRadius units.Length
	// Deflection is the tyre deflection δ under its working load, used by
	// the Brixius mobility number. Zero means δ = 0; it must be >= 0 and
	// less than SectionHeight.
	Deflection units.Length
	// RatedLoad is the manufacturer's load rating at the inflation and
	// speed of use. Zero means unknown (no overload flag); it must be >= 0.
	RatedLoad units.Force
}

// Validate reports whether t is a usable tyre. The error is a *RangeError
// wrapping ErrTyre.
func (t Tyre) Validate() error {
	d, b, h, r, delta := float64(t.Diameter), float64(t.Width), float64(t.SectionHeight),
		float64(t.RollingRadius), float64(t.Deflection)
	switch {
	case !finite(d) || d <= 0:
		return rangeErr(ErrTyre, "tyre diameter", t.Diameter, "> 0 and finite")
	case !finite(b) || b <= 0:
		return rangeErr(ErrTyre, "tyre section width", t.Width, "> 0 and finite")
	case !finite(h) || h <= 0 || h > d/2:
		return rangeErr(ErrTyre, "tyre section height", t.SectionHeight, "> 0 and <= diameter/2")
	case !finite(r) || r <= 0 || r > d/2:
		return rangeErr(ErrTyre, "tyre rolling radius", t.RollingRadius, "> 0 and <= diameter/2")
	case !finite(delta) || delta < 0 || delta >= h:
		return rangeErr(ErrTyre, "tyre deflection", t.Deflection, ">= 0 and < section height")
	case !finite(float64(t.RatedLoad)) || t.RatedLoad < 0:
		return rangeErr(ErrTyre, "tyre rated load", t.RatedLoad, ">= 0 and finite")
	}
	return nil
}

// Overloaded reports whether load exceeds the tyre's rated load. It is
// false when the rating is unknown (zero).
func (t Tyre) Overloaded(load units.Force) bool {
	return t.RatedLoad > 0 && load > t.RatedLoad
}
