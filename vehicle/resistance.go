package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// AirDensity is the density of dry air in the ISO 2533 standard atmosphere
// at sea level, 1.225 kg/m³, the default for aerodynamic drag.
const AirDensity units.Density = 1.225

// RollingResistance returns the rolling resistance F = f·W·cos θ of a load of
// mass m on a grade (rise over run) with rolling-resistance coefficient f.
func RollingResistance(m units.Mass, coefficient, grade float64) units.Force {
	return units.Force(coefficient * float64(m) * float64(units.Gravity) * cosGrade(grade))
}

// GradeResistance returns the grade resistance F = m·g·sin θ, where the grade
// is the rise over the run (tan θ); negative grades give negative forces.
func GradeResistance(m units.Mass, grade float64) units.Force {
	return units.Force(float64(m) * float64(units.Gravity) * sinGrade(grade))
}

// AeroDrag returns the aerodynamic drag F = ½·ρ·c_d·A·v² for drag area
// c_d·A at air density ρ (still air). The sign follows the speed.
func AeroDrag(dragArea units.Area, rho units.Density, v units.Speed) units.Force {
	s := float64(v)
	return units.Force(0.5 * float64(rho) * float64(dragArea) * s * math.Abs(s))
}

// InertiaResistance returns the force F = (m + m_r)·a needed to accelerate a
// mass m whose rotating parts add the equivalent translating mass m_r.
func InertiaResistance(m, rotating units.Mass, a units.Acceleration) units.Force {
	return units.Force((float64(m) + float64(rotating)) * float64(a))
}

// RotatingMass returns the translating mass equivalent to a rotating part of
// moment of inertia J (kg·m²) turning at ratio times the wheel speed on
// wheels of rolling radius r: m_r = J·ratio²/r². Add the results for all
// wheels and driveline parts.
func RotatingMass(inertiaKgM2, ratio float64, r units.Length) (units.Mass, error) {
	if err := nonNegative("inertiaKgM2", inertiaKgM2); err != nil {
		return 0, err
	}
	if err := isFinite("ratio", ratio); err != nil {
		return 0, err
	}
	if err := positive("r", r); err != nil {
		return 0, err
	}
	return units.Mass(inertiaKgM2 * ratio * ratio / (float64(r) * float64(r))), nil
}

func sinGrade(g float64) float64 { return g / math.Sqrt(1+g*g) }
func cosGrade(g float64) float64 { return 1 / math.Sqrt(1+g*g) }

// A Trailer is a towed vehicle whose resistance the tractor pulls at its
// hitch. Its zero value is "no trailer".
type Trailer struct {
	Mass               units.Mass // laden mass; zero means no trailer
	RotatingMass       units.Mass // equivalent mass of its wheels; default 0
	RollingCoefficient float64    // rolling-resistance coefficient of its tyres on the surface
}

// Validate reports whether the trailer's fields are valid.
func (t Trailer) Validate() error {
	if err := nonNegative("Trailer.Mass", t.Mass); err != nil {
		return err
	}
	if err := nonNegative("Trailer.RotatingMass", t.RotatingMass); err != nil {
		return err
	}
	if err := nonNegative("Trailer.RollingCoefficient", t.RollingCoefficient); err != nil {
		return err
	}
	if t.RollingCoefficient >= 1 {
		return invalid("Trailer.RollingCoefficient", t.RollingCoefficient, "must be below 1")
	}
	return nil
}

// Pull returns the force the trailer needs at the hitch on a grade while
// accelerating at a: rolling + grade + inertia (aerodynamic drag of the
// trailer is neglected).
func (t Trailer) Pull(grade float64, a units.Acceleration) units.Force {
	return t.rolling(grade) + GradeResistance(t.Mass, grade) + InertiaResistance(t.Mass, t.RotatingMass, a)
}

func (t Trailer) rolling(grade float64) units.Force {
	return RollingResistance(t.Mass, t.RollingCoefficient, grade)
}

// A Road is a road surface with a tabulated rolling-resistance coefficient.
type Road int

// Road surfaces of the rolling-resistance table.
const (
	Concrete     Road = iota // concrete or asphalt
	RolledGravel             // rolled gravel
	TarMacadam               // tar macadam
	Unpaved                  // unpaved road
	FieldSurface             // field (lower bound of the tabulated range)
)

// roadCoefficients holds the rolling-resistance coefficients of pneumatic
// tyres on road surfaces.
//
// From memory: the table of rolling-resistance coefficients in Theory of
// Ground Vehicles (3rd ed., 2001), chapter 1, for car tyres:
// concrete/asphalt 0.013, rolled gravel 0.02, tar macadam 0.025, unpaved
// road 0.05, field 0.1–0.35 (the lower bound is used here).
var roadCoefficients = [...]struct {
	name string
	f    float64
}{
	Concrete:     {"concrete or asphalt", 0.013},
	RolledGravel: {"rolled gravel", 0.02},
	TarMacadam:   {"tar macadam", 0.025},
	Unpaved:      {"unpaved road", 0.05},
	FieldSurface: {"field", 0.1},
}

// RollingCoefficient returns the surface's tabulated rolling-resistance
// coefficient, and false for an unknown surface.
func (r Road) RollingCoefficient() (float64, bool) {
	if r < 0 || int(r) >= len(roadCoefficients) {
		return 0, false
	}
	return roadCoefficients[r].f, true
}

// String returns the surface's name.
func (r Road) String() string {
	if r < 0 || int(r) >= len(roadCoefficients) {
		return "unknown road"
	}
	return roadCoefficients[r].name
}
