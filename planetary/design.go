package planetary

import (
	"errors"
	"math"
	"strconv"
)

// MinTeeth is the smallest tooth count of an external gear (sun, planets)
// that Check accepts: the number below which a standard full-depth 20°
// pressure-angle gear cut by a rack is undercut.
//
// Common practice (no published source) for the rounded value 17; the
// theoretical limit behind it is z_min = 2/sin²α = 2/sin²20° = 17.1
// (From memory: the standard undercut relation of gear handbooks).
const MinTeeth = 17

// Check runs the input validation and the design checks on d and returns
// nil or every violation joined with errors.Join. Input errors are
// *InputError values (ErrTeeth, ErrEfficiency, ErrModule, ErrArrangement);
// design violations are *DesignError values:
//
//   - coaxial (ErrCoaxial). Single planet: z_ring = z_sun + 2·z_planet, the
//     sun–planet and planet–ring centre distances m(z_sun + z_planet)/2 and
//     m(z_ring − z_planet)/2 being equal for standard gears without profile
//     shift. Double planet: the centre distances a1 = m(z_sun + z_inner)/2,
//     a2 = m(z_ring − z_outer)/2 and a12 = m(z_inner + z_outer)/2 must close
//     a triangle, |a1 − a2| < a12 < a1 + a2, the inner planet's tip circle
//     must clear the ring's tip circle, and the outer planet's the sun's.
//   - assembly (ErrAssembly), equally spaced planets: (z_sun + z_ring)/N an
//     integer for single planets, (z_ring − z_sun)/N for planet pairs.
//   - neighbour (ErrNeighbour): neighbouring planets on a circle of radius a
//     must not touch, 2·a·sin(π/N) > d_tip = m(z + 2) (standard addendum
//     equal to the module). The module cancels, so the check runs without
//     one; lengths are then reported in multiples of the module. For planet
//     pairs both planet circles are checked; the clearance between the inner
//     planet of one pair and the outer planet of the next is not.
//   - undercut (ErrUndercut): external gears with at least MinTeeth teeth.
//
// From memory: AGMA 6123-B06, Design Manual for Enclosed Epicyclic Gear
// Drives, gives the coaxial, assembly and neighbour conditions for tooth-count
// selection, as does Müller, Epicyclic Drive Trains (1982).
// Source: Glinsky (2020), "Geometry / Planetary Gears" notebook: |a12| = |a23|,
// l = 2a·sin(π/N) > d_a2 and k = (z1 − z3)/N integer (z3 < 0) for equal spacing.
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
	if len(errs) > 0 {
		return errors.Join(errs...)
	}
	return errors.Join(designChecks(normalise(d))...)
}

// designChecks assumes validated, normalised input.
func designChecks(d Design) []error {
	var errs []error
	zs, zr, zp := float64(d.Sun), float64(d.Ring), float64(d.Planet)
	n := d.Planets
	// Lengths: in mm when the module is given, else in modules.
	m, unit := 1.0, "module"
	if d.Module > 0 {
		m, unit = d.Module.Millimetres(), "mm"
	}
	fail := func(cond, q string, v, limit float64, u, detail string, err error) {
		errs = append(errs, &DesignError{Condition: cond, Quantity: q, Value: v, Limit: limit, Unit: u, Detail: detail, Err: err})
	}
	undercut := func(q string, z int) {
		if z < MinTeeth {
			fail("undercut", q, float64(z), MinTeeth, "teeth", "external gear at 20° pressure angle needs at least the minimum", ErrUndercut)
		}
	}
	neighbour := func(q string, a, z float64) {
		if n < 2 {
			return
		}
		pitch := 2 * a * math.Sin(math.Pi/float64(n))
		tip := m * (z + 2)
		if !(pitch > tip) {
			fail("neighbour", q, pitch, tip, unit, "distance between neighbouring planet centres 2·a·sin(π/N) must exceed the planet tip diameter m(z+2)", ErrNeighbour)
		}
	}
	undercut("sun teeth", d.Sun)
	undercut("planet teeth", d.Planet)

	if d.Arrangement == SinglePlanet {
		if want := d.Sun + 2*d.Planet; d.Ring != want {
			fail("coaxial", "ring teeth", zr, float64(want), "teeth", "z_ring = z_sun + 2·z_planet", ErrCoaxial)
		}
		if r := (d.Sun + d.Ring) % n; r != 0 {
			fail("assembly", "(z_sun + z_ring) mod N", float64(r), 0, "teeth",
				"z_sun + z_ring = "+strconv.Itoa(d.Sun+d.Ring)+" must be a multiple of N = "+strconv.Itoa(n)+" planets", ErrAssembly)
		}
		neighbour("planet centre spacing", m*(zs+zp)/2, zp)
		return errs
	}

	zo := float64(d.OuterPlanet)
	if d.OuterPlanet != d.Planet {
		undercut("outer planet teeth", d.OuterPlanet)
	}
	a1 := m * (zs + zp) / 2  // sun to inner planet
	a2 := m * (zr - zo) / 2  // ring to outer planet
	a12 := m * (zp + zo) / 2 // inner to outer planet
	if !(a12 > math.Abs(a1-a2)) {
		fail("coaxial", "inner-outer planet centre distance", a12, math.Abs(a1-a2), unit, "planet pair must close the triangle: a12 > |a1 − a2|", ErrCoaxial)
	}
	if !(a12 < a1+a2) {
		fail("coaxial", "inner-outer planet centre distance", a12, a1+a2, unit, "planet pair must close the triangle: a12 < a1 + a2", ErrCoaxial)
	}
	// Inner planet tip circle inside the ring's tip circle (radius m(z_ring/2 − 1)).
	if reach, ringTip := a1+m*(zp/2+1), m*(zr/2-1); !(reach < ringTip) {
		fail("coaxial", "inner planet outer reach", reach, ringTip, unit, "inner planet tip must clear the ring tip circle", ErrCoaxial)
	}
	// Outer planet tip circle outside the sun's tip circle (radius m(z_sun/2 + 1)).
	if reach, sunTip := a2-m*(zo/2+1), m*(zs/2+1); !(reach > sunTip) {
		fail("coaxial", "outer planet inner reach", reach, sunTip, unit, "outer planet tip must clear the sun tip circle", ErrCoaxial)
	}
	if r := (d.Ring - d.Sun) % n; r != 0 {
		fail("assembly", "(z_ring − z_sun) mod N", float64(r), 0, "teeth",
			"z_ring − z_sun = "+strconv.Itoa(d.Ring-d.Sun)+" must be a multiple of N = "+strconv.Itoa(n)+" planet pairs", ErrAssembly)
	}
	neighbour("inner planet centre spacing", a1, zp)
	neighbour("outer planet centre spacing", a2, zo)
	return errs
}
