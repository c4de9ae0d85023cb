package planetary

import (
	"errors"
	"math"
	"strconv"
)

// MinTeeth is the smallest tooth count of an unshifted external gear (sun,
// planets) that Check accepts: the number below which a standard
// full-depth 20° pressure-angle gear cut by a rack is undercut. A gear with
// fewer teeth passes when its profile shift is at least (17 − z)/17.
//
// Common practice (no published source) for the rounded value 17; the
// theoretical limit behind it is z_min = 2/sin²α = 2/sin²20° = 17.1
// (Source: machinecalcs.com, "Profile Shift Coefficient Calculator", method
// notes: z_min = 2/sin²α, x_min = (z_min − z)/z_min).
const MinTeeth = 17

// Check runs the input validation and the design checks on d and returns
// nil or every violation joined with errors.Join. Input errors are
// *InputError values (ErrTeeth, ErrEfficiency, ErrModule, ErrArrangement,
// ErrShift); design violations are *DesignError values:
//
//   - coaxial (ErrCoaxial). Single planet, unshifted: z_ring = z_sun +
//     2·z_planet, the sun–planet and planet–ring centre distances
//     m(z_sun + z_planet)/2 and m(z_ring − z_planet)/2 being equal. With
//     profile shifts each mesh has its zero-backlash working centre distance
//     (the working pressure angle from the involute function):
//     inv α_w = inv α + 2·tan α·(x1 + x2)/(z1 + z2) and
//     a = m(z1 + z2)/2·cos α/cos α_w for an external mesh; for the planet in
//     the ring the same with z_ring − z_planet and x_ring − x_planet. The two
//     distances must agree within CoaxialTolerance modules (RingShiftFor
//     gives the ring shift that makes them equal). Double planet: the
//     centre distances a1 (sun–inner), a2 (ring–outer) and a12 (inner–outer)
//     must close a triangle, |a1 − a2| < a12 < a1 + a2, the inner planet's
//     tip circle must clear the ring's tip circle, and the outer planet's
//     the sun's. Shifts so negative that a mesh cannot form fail here too.
//   - assembly (ErrAssembly), equally spaced planets: (z_sun + z_ring)/N an
//     integer for single planets, (z_ring − z_sun)/N for planet pairs.
//   - neighbour (ErrNeighbour): neighbouring planets on a circle of radius a
//     must not touch, 2·a·sin(π/N) > d_tip = m(z + 2 + 2x) (standard
//     addendum equal to the module, no tip shortening). The module cancels,
//     so the check runs without one; lengths are then reported in multiples
//     of the module. For planet pairs both planet circles are checked; the
//     clearance between the inner planet of one pair and the outer planet
//     of the next is not. Set.Geometry reports the clearance margin.
//   - undercut (ErrUndercut): an external gear (sun, planets) needs
//     x ≥ (17 − z)/17: unshifted at least MinTeeth teeth, and 14–16 teeth
//     with a positive shift (14 teeth: x ≥ 0.18).
//   - pointed teeth (ErrUndercut as well): an external gear's tooth at the
//     tip circle must stay at least MinTipThickness modules thick,
//     s_a = d_a·(s/d + inv α − inv α_a), s = m(π/2 + 2x·tan α), with the tip
//     d_a = m(z + 2 + 2x − 2k) shortened by k = (x1 + x2) − y of the
//     external mesh the gear is cut for (y = (a − a0)/m), which keeps the
//     standard bottom clearance.
//
// The ring's own tooth form (internal-gear interference, its tip against
// the planet root) is not checked.
//
// From memory: AGMA 6123-B06, Design Manual for Enclosed Epicyclic Gear
// Drives, gives the coaxial, assembly and neighbour conditions for tooth-count
// selection, as does Epicyclic Drive Trains (1982).
// Source: "Geometry / Planetary Gears" notebook (2020): |a12| = |a23|,
// l = 2a·sin(π/N) > d_a2 and k = (z1 − z3)/N integer (z3 < 0) for equal spacing.
// Source: "Chapter 2 – Spur Gears" notebook (drivetrainhub
// notebooks-gears): inv θ = tan θ − θ, tip diameter d_p + 2m(1 + x − y),
// working pressure angle α_w = acos(a0/a·cos α); the profile-shifted pair
// relation inv α_w = inv α + 2(x1 + x2)·tan α/(z1 + z2) and the tip
// thickness as in machinecalcs.com's profile-shift method notes.
// The planet-pair form (z_ring − z_sun)/N follows from the same argument (hand
// derivation: turn the carrier by 2π/N with the ring held; the sun turns by
// (1 − i0)·2π/N, which must be a whole number of sun pitches 2π/z_sun).
func Check(d Design) error {
	var errs []error
	bad := func(q string, v int, limit float64, err error) {
		errs = append(errs, &InputError{Quantity: q, Value: float64(v), Limit: limit, Err: err})
	}
	if d.Sun <= 0 {
		bad("sun teeth", d.Sun, 1, ErrTeeth)
	}
	if d.Ring <= 0 {
		bad("ring teeth", d.Ring, 1, ErrTeeth)
	}
	if d.Planet <= 0 {
		bad("planet teeth", d.Planet, 1, ErrTeeth)
	}
	if d.Planets <= 0 {
		bad("number of planets", d.Planets, 1, ErrTeeth)
	}
	if d.OuterPlanet < 0 {
		bad("outer planet teeth", d.OuterPlanet, 0, ErrTeeth)
	}
	if d.Ring > 0 && d.Sun > 0 && d.Ring <= d.Sun {
		bad("ring teeth (must exceed sun teeth)", d.Ring, float64(d.Sun+1), ErrTeeth)
	}
	if d.Arrangement != SinglePlanet && d.Arrangement != DoublePlanet {
		bad("arrangement", int(d.Arrangement), 1, ErrArrangement)
	}
	if m := float64(d.Module); math.IsNaN(m) || math.IsInf(m, 0) || m < 0 {
		errs = append(errs, &InputError{Quantity: "module", Value: m, Limit: 0, Err: ErrModule})
	}
	if e := d.BasicEfficiency; math.IsNaN(e) || e < 0 || e > 1 {
		errs = append(errs, &InputError{Quantity: "basic efficiency", Value: e, Limit: 1, Err: ErrEfficiency})
	}
	for _, x := range []struct {
		q string
		v float64
	}{{"sun shift", d.SunShift}, {"planet shift", d.PlanetShift}, {"ring shift", d.RingShift}, {"outer planet shift", d.OuterPlanetShift}} {
		if !isFinite(x.v) || math.Abs(x.v) > MaxShift {
			errs = append(errs, &InputError{Quantity: x.q, Value: x.v, Limit: MaxShift, Err: ErrShift})
		}
	}
	if len(errs) > 0 {
		return errors.Join(errs...)
	}
	return errors.Join(designChecks(normalise(d))...)
}

// MaxShift bounds the magnitude of a profile-shift coefficient Check
// accepts as input; the design checks (undercut, pointed teeth, meshing)
// then judge the value.
const MaxShift = 2

// designChecks assumes validated, normalised input.
func designChecks(d Design) []error {
	var errs []error
	zs, zr, zp := float64(d.Sun), float64(d.Ring), float64(d.Planet)
	// Lengths: in mm when the module is given, else in modules.
	m, unit := 1.0, "module"
	if d.Module > 0 {
		m, unit = d.Module.Millimetres(), "mm"
	}
	fail := func(cond, q string, v, limit float64, u, detail string, err error) {
		errs = append(errs, &DesignError{Condition: cond, Quantity: q, Value: v, Limit: limit, Unit: u, Detail: detail, Err: err})
	}
	g, meshes := geometry(d)
	// Tip shortening of each external gear, from the external mesh it is
	// cut for: sun and (inner) planet from theirs, an outer planet from the
	// planet–planet mesh.
	kSP := tipShortening(zs, d.SunShift, zp, d.PlanetShift, g.SunPlanet.CentreDistance)
	undercut := func(q string, z int, x, k float64) {
		if x == 0 {
			if z < MinTeeth {
				fail("undercut", q, float64(z), MinTeeth, "teeth", "external gear at 20° pressure angle needs at least the minimum, or a profile shift", ErrUndercut)
			}
		} else if xm := minShift(float64(z)); x < xm {
			fail("undercut", q+" shift", x, xm, "", "external gear of "+strconv.Itoa(z)+" teeth at 20° needs a profile shift x ≥ (17 − z)/17", ErrUndercut)
		}
		if sa := tipThickness(float64(z), x, k); !(sa >= MinTipThickness) {
			fail("pointed tooth", q+" tip thickness", sa*m, MinTipThickness*m, unit, "tooth thickness at the tip circle of an external gear", ErrUndercut)
		}
	}
	neighbour := func(q string, a, z, x float64) {
		if d.Planets < 2 {
			return
		}
		pitch := 2 * a * math.Sin(math.Pi/float64(d.Planets))
		tip := z + 2 + 2*x
		if !(pitch > tip) {
			fail("neighbour", q, pitch*m, tip*m, unit, "distance between neighbouring planet centres 2·a·sin(π/N) must exceed the planet tip diameter m(z + 2 + 2x)", ErrNeighbour)
		}
	}
	undercut("sun teeth", d.Sun, d.SunShift, kSP)
	undercut("planet teeth", d.Planet, d.PlanetShift, kSP)
	if !meshes {
		fail("coaxial", "sum of profile shifts", d.SunShift+d.PlanetShift+d.RingShift+d.OuterPlanetShift, 0, "",
			"shifts so negative that a mesh has no working pressure angle", ErrCoaxial)
		return errs
	}
	shifted := d.SunShift != 0 || d.PlanetShift != 0 || d.RingShift != 0 || d.OuterPlanetShift != 0

	if d.Arrangement == SinglePlanet {
		if !shifted {
			if want := d.Sun + 2*d.Planet; d.Ring != want {
				fail("coaxial", "ring teeth", zr, float64(want), "teeth", "z_ring = z_sun + 2·z_planet", ErrCoaxial)
			}
		} else if diff := g.CoaxialMismatch; !(math.Abs(diff) <= CoaxialTolerance) {
			fail("coaxial", "sun–planet minus planet–ring centre distance", diff*m, math.Copysign(CoaxialTolerance, diff)*m, unit,
				"the zero-backlash centre distances of the two meshes must agree (RingShiftFor gives the ring shift)", ErrCoaxial)
		}
		if r := (d.Sun + d.Ring) % d.Planets; r != 0 {
			fail("assembly", "(z_sun + z_ring) mod N", float64(r), 0, "teeth",
				"z_sun + z_ring = "+strconv.Itoa(d.Sun+d.Ring)+" must be a multiple of N = "+strconv.Itoa(d.Planets)+" planets", ErrAssembly)
		}
		neighbour("planet centre spacing", g.SunPlanet.CentreDistance, zp, d.PlanetShift)
		return errs
	}

	zo := float64(d.OuterPlanet)
	if d.OuterPlanet != d.Planet || d.OuterPlanetShift != d.PlanetShift {
		undercut("outer planet teeth", d.OuterPlanet, d.OuterPlanetShift,
			tipShortening(zp, d.PlanetShift, float64(d.OuterPlanet), d.OuterPlanetShift, g.PlanetPlanet.CentreDistance))
	}
	a1 := g.SunPlanet.CentreDistance     // sun to inner planet
	a2 := g.PlanetRing.CentreDistance    // ring to outer planet
	a12 := g.PlanetPlanet.CentreDistance // inner to outer planet
	if !(a12 > math.Abs(a1-a2)) {
		fail("coaxial", "inner-outer planet centre distance", a12*m, math.Abs(a1-a2)*m, unit, "planet pair must close the triangle: a12 > |a1 − a2|", ErrCoaxial)
	}
	if !(a12 < a1+a2) {
		fail("coaxial", "inner-outer planet centre distance", a12*m, (a1+a2)*m, unit, "planet pair must close the triangle: a12 < a1 + a2", ErrCoaxial)
	}
	// Inner planet tip circle inside the ring's tip circle (radius z_ring/2 − 1 + x_ring).
	if reach, ringTip := a1+zp/2+1+d.PlanetShift, zr/2-1+d.RingShift; !(reach < ringTip) {
		fail("coaxial", "inner planet outer reach", reach*m, ringTip*m, unit, "inner planet tip must clear the ring tip circle", ErrCoaxial)
	}
	// Outer planet tip circle outside the sun's tip circle (radius z_sun/2 + 1 + x_sun).
	if reach, sunTip := a2-(zo/2+1+d.OuterPlanetShift), zs/2+1+d.SunShift; !(reach > sunTip) {
		fail("coaxial", "outer planet inner reach", reach*m, sunTip*m, unit, "outer planet tip must clear the sun tip circle", ErrCoaxial)
	}
	if r := (d.Ring - d.Sun) % d.Planets; r != 0 {
		fail("assembly", "(z_ring − z_sun) mod N", float64(r), 0, "teeth",
			"z_ring − z_sun = "+strconv.Itoa(d.Ring-d.Sun)+" must be a multiple of N = "+strconv.Itoa(d.Planets)+" planet pairs", ErrAssembly)
	}
	neighbour("inner planet centre spacing", a1, zp, d.PlanetShift)
	neighbour("outer planet centre spacing", a2, zo, d.OuterPlanetShift)
	return errs
}
