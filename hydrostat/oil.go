package hydrostat

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// OilSpec describes a hydraulic oil by two points of its viscosity–
// temperature line (ASTM D341), or by one dynamic viscosity that holds at
// the operating point, and its density and bulk modulus.
type OilSpec struct {
	Name string // for display only
	// Viscosity, when positive, is the oil's dynamic viscosity at the
	// operating point, taken the same at every temperature (for a user who
	// knows it, or a test at one temperature); T1, Nu1, T2 and Nu2 must then
	// be zero. Zero means: from the two points below.
	Viscosity units.DynamicViscosity
	// Two kinematic viscosities at two different temperatures, each at
	// least 2 cSt (the range of the Walther equation as used here).
	T1  units.Temperature
	Nu1 units.KinematicViscosity
	T2  units.Temperature
	Nu2 units.KinematicViscosity
	// Density at DensityTemperature; 0 means 870 kg/m³ at 15 °C.
	Density            units.Density
	DensityTemperature units.Temperature // 0 means 15 °C
	// Expansion is the volumetric thermal expansion coefficient α in 1/K;
	// 0 means 7×10⁻⁴ /K. ρ(T) = ρ_ref / (1 + α·(T − T_ref)).
	Expansion float64
	// BulkModulus β, taken constant; 0 means 1.6 GPa.
	BulkModulus units.Pressure
}

// Oil is a built, immutable hydraulic oil.
type Oil struct {
	spec  OilSpec
	a, b  float64 // log₁₀ log₁₀(ν + 0.7) = a − b·log₁₀ T
	mu    float64 // a fixed dynamic viscosity (Pa·s), or 0
	valid bool
}

// Default property values of an OilSpec.
//
// From memory: typical mineral hydraulic oil: density 0.86–0.88 kg/L at
// 15 °C, volumetric expansion 6.5–7.5×10⁻⁴ /K, bulk modulus 1.4–1.8 GPa
// (air-free, moderate pressure). Check the oil supplier's data.
const (
	defaultDensity   = 870.0
	defaultExpansion = 7e-4
	defaultBulk      = 1.6e9
)

// NewOil validates s and fits the Walther line through its two points (or
// keeps its fixed viscosity).
func NewOil(s OilSpec) (Oil, error) {
	t1, t2 := float64(s.T1), float64(s.T2)
	n1, n2 := s.Nu1.Centistokes(), s.Nu2.Centistokes()
	for _, v := range []struct {
		name string
		x    units.Measure
	}{
		{"T1", units.Of(s.T1)}, {"T2", units.Of(s.T2)}, {"Nu1", units.Of(s.Nu1)}, {"Nu2", units.Of(s.Nu2)},
		{"Density", units.Of(s.Density)}, {"DensityTemperature", units.Of(s.DensityTemperature)},
		{"Expansion", units.Plain(s.Expansion)}, {"BulkModulus", units.Of(s.BulkModulus)},
		{"Viscosity", units.Of(s.Viscosity)},
	} {
		if !finite(v.x.SI) || v.x.SI < 0 {
			return Oil{}, fmt.Errorf("%w: oil property %s = %v must be finite and ≥ 0", ErrInvalid, v.name, v.x)
		}
	}
	if s.Viscosity > 0 {
		if t1 != 0 || t2 != 0 || n1 != 0 || n2 != 0 {
			return Oil{}, fmt.Errorf("%w: give either a fixed viscosity or two viscosity–temperature points, not both", ErrInvalid)
		}
		defaults(&s)
		return Oil{spec: s, mu: float64(s.Viscosity), valid: true}, nil
	}
	if !(t1 > 0) || !(t2 > 0) || t1 == t2 {
		return Oil{}, fmt.Errorf("%w: two different positive temperatures needed", ErrInvalid)
	}
	if !(n1 >= 2) || !(n2 >= 2) {
		return Oil{}, fmt.Errorf("%w: viscosities must be at least 2 cSt", ErrInvalid)
	}
	if (t2-t1)*(n2-n1) >= 0 {
		return Oil{}, fmt.Errorf("%w: viscosity must fall as temperature rises", ErrInvalid)
	}
	defaults(&s)
	z1 := math.Log10(math.Log10(n1 + 0.7))
	z2 := math.Log10(math.Log10(n2 + 0.7))
	b := (z1 - z2) / (math.Log10(t2) - math.Log10(t1))
	a := z1 + b*math.Log10(t1)
	if !finite(a) || !finite(b) || !(b > 0) {
		return Oil{}, fmt.Errorf("%w: viscosity points give no valid Walther line", ErrInvalid)
	}
	return Oil{spec: s, a: a, b: b, valid: true}, nil
}

// defaults fills the zero density, expansion and bulk modulus of s.
func defaults(s *OilSpec) {
	if s.Density == 0 {
		s.Density = defaultDensity
	}
	if s.DensityTemperature == 0 {
		s.DensityTemperature = units.Celsius(15)
	}
	if s.Expansion == 0 {
		s.Expansion = defaultExpansion
	}
	if s.BulkModulus == 0 {
		s.BulkModulus = defaultBulk
	}
}

// Spec returns the specification with defaults filled in.
func (o Oil) Spec() OilSpec { return o.spec }

// Viscosity returns the kinematic viscosity at t by ASTM D341:
// log₁₀ log₁₀(ν + 0.7) = A − B·log₁₀ T, ν in cSt, T in K. It returns 0 for
// a zero Oil or a temperature that is not finite and positive. Far above
// the fitted points ν falls towards the equation's floor of 0.3 cSt, where
// the equation no longer holds (ASTM D341 adds terms below 2 cSt). An oil
// of fixed dynamic viscosity μ returns μ/ρ(T).
func (o Oil) Viscosity(t units.Temperature) units.KinematicViscosity {
	tk := float64(t)
	if !o.valid || !finite(tk) || tk <= 0 {
		return 0
	}
	if o.mu > 0 {
		return units.KinematicFromDynamic(units.DynamicViscosity(o.mu), o.Density(t))
	}
	z := math.Pow(10, math.Pow(10, o.a-o.b*math.Log10(tk)))
	return units.Centistokes(z - 0.7)
}

// Density returns ρ(T) = ρ_ref / (1 + α·(T − T_ref)); 0 for a zero Oil or a
// temperature that is not finite and positive.
func (o Oil) Density(t units.Temperature) units.Density {
	tk := float64(t)
	if !o.valid || !finite(tk) || tk <= 0 {
		return 0
	}
	return units.Density(float64(o.spec.Density) / (1 + o.spec.Expansion*(tk-float64(o.spec.DensityTemperature))))
}

// DynamicViscosity returns μ = ν·ρ at t (the fixed viscosity, for an oil
// given one; 0 for a zero Oil or a temperature that is not finite and
// positive).
func (o Oil) DynamicViscosity(t units.Temperature) units.DynamicViscosity {
	if o.mu > 0 {
		if tk := float64(t); !finite(tk) || tk <= 0 {
			return 0
		}
		return units.DynamicViscosity(o.mu)
	}
	return units.DynamicFromKinematic(o.Viscosity(t), o.Density(t))
}

// ViscosityIndex returns the oil's viscosity index by ASTM D2270 from its
// viscosities at 40 °C and 100 °C (see the function ViscosityIndex). An oil
// of fixed viscosity has none (ErrInvalid).
func (o Oil) ViscosityIndex() (float64, error) {
	if !o.valid || o.mu > 0 {
		return 0, fmt.Errorf("%w: the oil has no viscosity–temperature line", ErrInvalid)
	}
	return ViscosityIndex(o.Viscosity(units.Celsius(40)), o.Viscosity(units.Celsius(100)))
}

// BulkModulus returns the (constant) bulk modulus β.
func (o Oil) BulkModulus() units.Pressure { return o.spec.BulkModulus }

// ISO 3448 viscosity-grade presets: mineral hydraulic oils of viscosity
// index near 100. The 40 °C point is the grade's midpoint by definition
// (ISO 3448). The 100 °C point is a round typical value.
//
// From memory: 5.4, 6.8 and 8.7 cSt at 100 °C for VG 32, 46 and 68, typical
// data-sheet values of mineral oils. By ASTM D2270 they give viscosity
// indices of 102.2, 101.6 and 99.3 (Oil.ViscosityIndex; the test
// TestPresetsViscosityIndex checks them): "about 100", not exactly. For an
// exact index build the oil with NewGradeOil. Density and bulk modulus are
// the defaults above.
var (
	VG32 = mustOil(OilSpec{Name: "ISO VG 32", T1: units.Celsius(40), Nu1: units.Centistokes(32), T2: units.Celsius(100), Nu2: units.Centistokes(5.4)})
	VG46 = mustOil(OilSpec{Name: "ISO VG 46", T1: units.Celsius(40), Nu1: units.Centistokes(46), T2: units.Celsius(100), Nu2: units.Centistokes(6.8)})
	VG68 = mustOil(OilSpec{Name: "ISO VG 68", T1: units.Celsius(40), Nu1: units.Centistokes(68), T2: units.Celsius(100), Nu2: units.Centistokes(8.7)})
)

func mustOil(s OilSpec) Oil {
	o, err := NewOil(s)
	if err != nil {
		panic("hydrostat: bad preset: " + err.Error())
	}
	return o
}
