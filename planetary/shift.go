package planetary

import (
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// PressureAngle is the reference (tool) pressure angle of every mesh the
// package checks: 20°, with the standard basic rack (addendum 1·m).
const PressureAngle = 20 * math.Pi / 180

// CoaxialTolerance is the largest difference, in modules, between the
// zero-backlash centre distances of the sun–planet and the planet–ring
// mesh of a profile-shifted set that Check accepts: the difference is
// taken up as backlash (about 2·Δa·sin α_w, under 0.01 module).
//
// Common practice (no published source): shifts are chosen to make the
// two centre distances equal; a residue of a hundredth of a module is
// within normal backlash allowances.
const CoaxialTolerance = 0.01

// MinTipThickness is the smallest tooth thickness at the tip circle of an
// external gear, in modules, that Check accepts: a large positive shift
// thins the tip until the tooth is pointed.
//
// Common practice (no published source): about 0.4·m is customary and
// 0.25·m an absolute floor; Check enforces the floor.
const MinTipThickness = 0.25

// Involute returns the involute function inv φ = tan φ − φ.
func Involute(phi units.Angle) float64 {
	p := float64(phi)
	return math.Tan(p) - p
}

// InvoluteInverse returns the angle φ in [0, π/2) with inv φ = v, for
// v ≥ 0 (ok false for a negative, NaN or infinite v).
func InvoluteInverse(v float64) (phi units.Angle, ok bool) {
	if !(v >= 0) || math.IsInf(v, 0) {
		return 0, false
	}
	if v == 0 {
		return 0, true
	}
	hi := math.Pi / 2 * (1 - 1e-15)
	x, err := numeric.Brent(func(p float64) float64 { return math.Tan(p) - p - v }, 0, hi, 0, 200)
	if err != nil {
		return 0, false
	}
	return units.Angle(x), true
}

// externalMesh returns the zero-backlash working centre distance (in
// modules) and working pressure angle of an external mesh of z1, z2 teeth
// with shifts x1, x2:
//
//	inv α_w = inv α + 2·tan α·(x1 + x2)/(z1 + z2),  a = (z1 + z2)/2 · cos α / cos α_w
//
// ok is false when the shifts are so negative that no mesh forms.
func externalMesh(z1, x1, z2, x2 float64) (a float64, aw units.Angle, ok bool) {
	return mesh(z1+z2, x1+x2)
}

// internalMesh is externalMesh for a planet of zp teeth, shift xp, inside a
// ring of zr teeth, shift xr (positive xr moves the ring's teeth outward):
//
//	inv α_w = inv α + 2·tan α·(xr − xp)/(zr − zp),  a = (zr − zp)/2 · cos α / cos α_w
func internalMesh(zp, xp, zr, xr float64) (a float64, aw units.Angle, ok bool) {
	return mesh(zr-zp, xr-xp)
}

func mesh(zsum, xsum float64) (a float64, aw units.Angle, ok bool) {
	if !(zsum > 0) {
		return 0, 0, false
	}
	if xsum == 0 {
		return zsum / 2, PressureAngle, true
	}
	v := Involute(PressureAngle) + 2*math.Tan(PressureAngle)*xsum/zsum
	aw, ok = InvoluteInverse(v)
	if !ok || !(aw > 0) {
		return 0, 0, false
	}
	return zsum / 2 * math.Cos(PressureAngle) / math.Cos(float64(aw)), aw, true
}

// minShift returns the smallest profile shift of an external gear of z
// teeth that Check accepts against undercut: x_min = (17 − z)/17, the
// standard relation x_min = h_a − (z/2)·sin²α with the theoretical limit
// 2/sin²α ≈ 17.1 rounded to MinTeeth as in practice, so that an unshifted
// gear of MinTeeth teeth passes as before.
func minShift(z float64) float64 { return (MinTeeth - z) / MinTeeth }

// tipThickness returns the tooth thickness at the tip circle of an
// external gear of z teeth and shift x whose tip is shortened by k modules
// (k ≥ 0), in modules:
//
//	s = π/2 + 2x·tan α,  d = z,  d_b = d·cos α,  d_a = z + 2 + 2x − 2k,
//	α_a = acos(d_b/d_a),  s_a = d_a·(s/d + inv α − inv α_a)
func tipThickness(z, x, k float64) float64 {
	s := math.Pi/2 + 2*x*math.Tan(PressureAngle)
	da := z + 2 + 2*x - 2*k
	c := z * math.Cos(PressureAngle) / da
	if !(c > 0 && c < 1) {
		return math.Inf(-1)
	}
	aa := units.Angle(math.Acos(c))
	return da * (s/z + Involute(PressureAngle) - Involute(aa))
}

// tipShortening returns the tip shortening k = (x1 + x2) − y of an
// external pair that keeps the standard bottom clearance at its working
// centre distance a (in modules), y = a − (z1 + z2)/2; 0 when negative.
func tipShortening(z1, x1, z2, x2, a float64) float64 {
	return math.Max(0, x1+x2-(a-(z1+z2)/2))
}

// Mesh is the working geometry of one mesh of a set.
type Mesh struct {
	// CentreDistance is the zero-backlash working centre distance, in
	// multiples of the module.
	CentreDistance float64
	// WorkingPressureAngle α_w; 20° for unshifted gears.
	WorkingPressureAngle units.Angle
}

// Geometry is the meshing geometry of a set built from tooth counts, with
// its profile shifts. Lengths are in multiples of the module (dimensionless);
// Length converts them when the design gives a module.
type Geometry struct {
	Module units.Length // the design's module; 0 when not given
	// SunPlanet is the sun–planet mesh (sun–inner planet for pairs),
	// PlanetRing the planet–ring mesh (outer planet–ring for pairs) and
	// PlanetPlanet the inner–outer planet mesh of a pair (zero for single
	// planets).
	SunPlanet, PlanetRing, PlanetPlanet Mesh
	// CoaxialMismatch is, for single planets, the sun–planet minus the
	// planet–ring centre distance in modules (zero when coaxial); zero for
	// pairs, whose three distances close a triangle instead.
	CoaxialMismatch float64
	// NeighbourClearance is the gap between the tip circles of
	// neighbouring planets, 2·a·sin(π/N) − d_a, in modules: the smallest of
	// the planet circles (inner and outer for pairs); +Inf with one planet.
	// Tip diameters are taken without tip shortening (d_a = z + 2 + 2x), so
	// the gap is on the safe side. Negative means the planets collide.
	NeighbourClearance float64
}

// Length returns v modules as a length; 0 when the design gives no module.
func (g Geometry) Length(v float64) units.Length { return units.Length(v) * g.Module }

// geometry computes the meshes of validated, normalised d; ok is false when
// a mesh does not form (shifts too negative).
func geometry(d Design) (g Geometry, ok bool) {
	g.Module = d.Module
	zs, zr, zp := float64(d.Sun), float64(d.Ring), float64(d.Planet)
	n := float64(d.Planets)
	gap := func(a, z, x float64) float64 {
		if d.Planets < 2 {
			return math.Inf(1)
		}
		return 2*a*math.Sin(math.Pi/n) - (z + 2 + 2*x)
	}
	var ok1, ok2, ok3 bool
	if d.Arrangement == SinglePlanet {
		g.SunPlanet.CentreDistance, g.SunPlanet.WorkingPressureAngle, ok1 = externalMesh(zs, d.SunShift, zp, d.PlanetShift)
		g.PlanetRing.CentreDistance, g.PlanetRing.WorkingPressureAngle, ok2 = internalMesh(zp, d.PlanetShift, zr, d.RingShift)
		g.CoaxialMismatch = g.SunPlanet.CentreDistance - g.PlanetRing.CentreDistance
		g.NeighbourClearance = gap(g.SunPlanet.CentreDistance, zp, d.PlanetShift)
		return g, ok1 && ok2
	}
	zo := float64(d.OuterPlanet)
	g.SunPlanet.CentreDistance, g.SunPlanet.WorkingPressureAngle, ok1 = externalMesh(zs, d.SunShift, zp, d.PlanetShift)
	g.PlanetRing.CentreDistance, g.PlanetRing.WorkingPressureAngle, ok2 = internalMesh(zo, d.OuterPlanetShift, zr, d.RingShift)
	g.PlanetPlanet.CentreDistance, g.PlanetPlanet.WorkingPressureAngle, ok3 = externalMesh(zp, d.PlanetShift, zo, d.OuterPlanetShift)
	g.NeighbourClearance = math.Min(gap(g.SunPlanet.CentreDistance, zp, d.PlanetShift),
		gap(g.PlanetRing.CentreDistance, zo, d.OuterPlanetShift))
	return g, ok1 && ok2 && ok3
}

// Geometry returns the meshing geometry of a set built by New (ErrNoTeeth
// for a set from FromRatio).
func (s Set) Geometry() (Geometry, error) {
	if !s.valid() {
		return Geometry{}, errZeroSet
	}
	if !s.teeth {
		return Geometry{}, ErrNoTeeth
	}
	g, _ := geometry(s.d) // New refused designs whose meshes do not form
	return g, nil
}

// RingShiftFor returns the ring profile shift that makes a single-planet
// design coaxial with its sun and planet shifts: the planet–ring
// zero-backlash centre distance equal to the sun–planet one. The tooth
// counts need not satisfy z_ring = z_sun + 2·z_planet. It returns an
// *InputError (ErrCoaxial) when no shift does.
func RingShiftFor(d Design) (float64, error) {
	if d.Sun <= 0 || d.Planet <= 0 || d.Ring <= d.Planet || d.Arrangement != SinglePlanet ||
		!isFinite(d.SunShift) || !isFinite(d.PlanetShift) {
		return 0, &InputError{Quantity: "single-planet design for a ring shift", Value: float64(d.Ring), Limit: math.NaN(), Err: ErrCoaxial}
	}
	a, _, ok := externalMesh(float64(d.Sun), d.SunShift, float64(d.Planet), d.PlanetShift)
	zd := float64(d.Ring - d.Planet)
	// a = zd/2·cos α/cos α_w  →  cos α_w = zd·cos α/(2a), then invert the
	// involute relation for the shift sum.
	c := zd * math.Cos(PressureAngle) / (2 * a)
	if !ok || !(c > 0 && c <= 1) {
		return 0, &InputError{Quantity: "planet–ring centre distance needed", Value: a, Limit: zd / 2 * math.Cos(PressureAngle), Err: ErrCoaxial}
	}
	aw := units.Angle(math.Acos(c))
	xsum := (Involute(aw) - Involute(PressureAngle)) * zd / (2 * math.Tan(PressureAngle))
	return xsum + d.PlanetShift, nil
}
