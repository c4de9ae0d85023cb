package planetary_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

func deg(a units.Angle) float64 { return float64(a) * 180 / math.Pi }

// TestShiftedMeshWorkedExamples checks the working pressure angle and
// centre distance of profile-shifted external meshes against published
// worked examples, through a single-planet set whose sun–planet mesh is the
// example pair (the ring shift from RingShiftFor).
func TestShiftedMeshWorkedExamples(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name                string
		zs, zp, zr          int
		xs, xp, module      float64
		invW, alphaW, a, tA float64 // inv α_w (0: not printed), α_w in degrees, centre distance in mm, tolerance in mm
	}{
		// Source: bolsover.com, "Profile Shifted External Spur Gears" table:
		// m = 3, α = 20°, z = 12 and 24, x = 0.6 and 0.36: inv α = 0.014904,
		// inv α_w = 0.034317, α_w = 26.0888°, working centre distance 56.500.
		// The table carries inv α rounded to six decimals into the next
		// rows (exact: inv α_w = 0.0343161, α_w = 26.0886°), hence the
		// tolerances of 1e-6 and 3e-4°.
		{"12/24 x 0.6/0.36", 12, 24, 60, 0.6, 0.36, 3, 0.034317, 26.0888, 56.500, 5e-4},
		// Source: machinecalcs.com, "Profile Shift Coefficient Calculator",
		// default case: m = 2, z = 12 and 36, x = 0.3 and 0: α_w = 21.787°,
		// centre distance a′ = 48.575 mm (reference 48.000).
		{"12/36 x 0.3/0", 12, 36, 84, 0.3, 0, 2, 0, 21.787, 48.575, 5e-4},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			d := planetary.Design{Sun: c.zs, Planet: c.zp, Ring: c.zr, Planets: 3, SunShift: c.xs, PlanetShift: c.xp,
				Module: units.Millimetres(c.module)}
			xr, err := planetary.RingShiftFor(d)
			if err != nil {
				t.Fatal(err)
			}
			d.RingShift = xr
			s, err := planetary.New(d)
			if err != nil {
				t.Fatalf("New(%+v): %v", d, err)
			}
			g, err := s.Geometry()
			if err != nil {
				t.Fatal(err)
			}
			if c.invW != 0 && math.Abs(planetary.Involute(g.SunPlanet.WorkingPressureAngle)-c.invW) > 1e-6 {
				t.Errorf("inv α_w = %.6f, want %.6f", planetary.Involute(g.SunPlanet.WorkingPressureAngle), c.invW)
			}
			if got := deg(g.SunPlanet.WorkingPressureAngle); math.Abs(got-c.alphaW) > 3e-4 {
				t.Errorf("α_w = %.4f°, want %.4f°", got, c.alphaW)
			}
			if got := g.Length(g.SunPlanet.CentreDistance).Millimetres(); math.Abs(got-c.a) > c.tA {
				t.Errorf("centre distance %.4f mm, want %.3f", got, c.a)
			}
			// Coaxial by construction: the planet–ring mesh has the same
			// centre distance.
			if math.Abs(g.CoaxialMismatch) > 1e-9 || math.Abs(g.PlanetRing.CentreDistance-g.SunPlanet.CentreDistance) > 1e-9 {
				t.Errorf("coaxial mismatch %g", g.CoaxialMismatch)
			}
		})
	}
	// Source: bolsover.com (above): inv 20° = 0.014904.
	if v := planetary.Involute(units.Degrees(20)); math.Abs(v-0.014904) > 5e-7 {
		t.Errorf("inv 20° = %v", v)
	}
	if a, ok := planetary.InvoluteInverse(0.034317); !ok || math.Abs(deg(a)-26.0888) > 5e-4 {
		t.Errorf("InvoluteInverse(0.034317) = %v°, %v", deg(a), ok)
	}
}

// TestShiftUndercut: 14–16-tooth external gears pass with enough positive
// shift and fail without it.
func TestShiftUndercut(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		z    int
		x    float64
		pass bool
	}{
		// Source: machinecalcs.com (as above): x_min = (z_min − z)/z_min;
		// with z_min rounded to 17 (common practice, see MinTeeth), 14
		// teeth need 3/17 = 0.176, 15 need 0.118, 16 need 0.059.
		{14, 0, false}, {14, 0.17, false}, {14, 0.18, true},
		{15, 0.11, false}, {15, 0.12, true},
		{16, 0.05, false}, {16, 0.06, true},
		{17, 0, true}, {17, -0.01, false},
	} {
		d := planetary.Design{Sun: c.z, Planet: 21, Ring: c.z + 42, Planets: 1, SunShift: c.x}
		if c.x != 0 {
			xr, err := planetary.RingShiftFor(d)
			if err != nil {
				t.Fatal(err)
			}
			d.RingShift = xr
		}
		err := planetary.Check(d)
		if got := !errors.Is(err, planetary.ErrUndercut); got != c.pass {
			t.Errorf("sun %d teeth, shift %v: %v, want pass %v", c.z, c.x, err, c.pass)
		}
	}
	// Source: machinecalcs.com (as above): a 12-tooth, module-2 pinion with
	// x = 0.3 has a tip thickness of 0.871 mm.
	d := planetary.Design{Sun: 12, Planet: 36, Ring: 84, Planets: 3, SunShift: 0.3, Module: units.Millimetres(2)}
	d.RingShift, _ = planetary.RingShiftFor(d)
	if err := planetary.Check(d); err != nil {
		t.Errorf("12-tooth sun with x = 0.3: %v", err)
	}
	// Hand calculation: a large shift points the tip of a small gear
	// (z = 12, x = 1.2: s_a < 0.25·m).
	d = planetary.Design{Sun: 12, Planet: 36, Ring: 84, Planets: 3, SunShift: 1.2}
	d.RingShift, _ = planetary.RingShiftFor(d)
	err := planetary.Check(d)
	var de *planetary.DesignError
	if !errors.As(err, &de) || de.Condition != "pointed tooth" {
		t.Errorf("z = 12, x = 1.2: %v, want a pointed tooth", err)
	}
	if _, err := planetary.New(planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3, SunShift: math.NaN()}); !errors.Is(err, planetary.ErrShift) {
		t.Errorf("NaN shift: %v, want ErrShift", err)
	}
}

// TestShiftCoaxial: a shifted set whose two centre distances disagree is
// refused with the mismatch; the internal mesh follows the handbook
// relation.
func TestShiftCoaxial(t *testing.T) {
	t.Parallel()
	d := planetary.Design{Sun: 15, Planet: 20, Ring: 56, Planets: 1, SunShift: 0.25, PlanetShift: 0.1}
	err := planetary.Check(d)
	var de *planetary.DesignError
	if !errors.As(err, &de) || !errors.Is(err, planetary.ErrCoaxial) {
		t.Fatalf("Check(%+v) = %v, want ErrCoaxial", d, err)
	}
	xr, err := planetary.RingShiftFor(d)
	if err != nil {
		t.Fatal(err)
	}
	d.RingShift = xr
	s, err := planetary.New(d)
	if err != nil {
		t.Fatalf("with ring shift %v: %v", xr, err)
	}
	g, _ := s.Geometry()
	// From memory: the internal-gear form of the relation in gear
	// handbooks, inv α_w = inv α + 2·tan α·(x2 − x1)/(z2 − z1),
	// a = m(z2 − z1)/2·cos α/cos α_w; evaluated here by hand.
	alpha := 20 * math.Pi / 180
	inv := math.Tan(alpha) - alpha + 2*math.Tan(alpha)*(xr-0.1)/(56-20)
	aw, _ := planetary.InvoluteInverse(inv)
	a := (56.0 - 20) / 2 * math.Cos(alpha) / math.Cos(float64(aw))
	if !testutil.Close(g.PlanetRing.CentreDistance, a, 1e-12, 0) || !testutil.Close(a, g.SunPlanet.CentreDistance, 1e-9, 0) {
		t.Errorf("planet–ring a = %v, hand %v, sun–planet %v", g.PlanetRing.CentreDistance, a, g.SunPlanet.CentreDistance)
	}
	// Hand calculation: shifting planet and ring alike leaves the internal
	// centre distance at the standard m(z_r − z_p)/2.
	d2 := planetary.Design{Sun: 20, Planet: 40, Ring: 100, Planets: 3, PlanetShift: 0.15, RingShift: 0.15, SunShift: -0.15}
	s2, err := planetary.New(d2)
	if err != nil {
		t.Fatal(err)
	}
	g2, _ := s2.Geometry()
	if !testutil.Close(g2.PlanetRing.CentreDistance, 30, 1e-12, 0) || !testutil.Close(g2.SunPlanet.CentreDistance, 30, 1e-12, 0) {
		t.Errorf("x-zero pairs: %v, %v, want 30 modules", g2.PlanetRing.CentreDistance, g2.SunPlanet.CentreDistance)
	}
}

// TestNeighbourClearance: the reported margin is the hand-calculated gap,
// and a negative margin is the neighbour violation.
func TestNeighbourClearance(t *testing.T) {
	t.Parallel()
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3, Module: units.Millimetres(2)})
	g, err := s.Geometry()
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: a = 30 modules, 2·30·sin 60° − 42 = 9.9615 modules.
	if want := 60*math.Sin(math.Pi/3) - 42; !testutil.Close(g.NeighbourClearance, want, 1e-12, 0) {
		t.Errorf("clearance %v, want %v", g.NeighbourClearance, want)
	}
	if got := g.Length(g.NeighbourClearance).Millimetres(); !testutil.Close(got, 2*(60*math.Sin(math.Pi/3)-42), 1e-12, 0) {
		t.Errorf("clearance %v mm", got)
	}
	// Five planets of 40 teeth around a 20-tooth sun collide: 60·sin 36° = 35.3 < 42.
	if err := planetary.Check(planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 5}); !errors.Is(err, planetary.ErrNeighbour) {
		t.Errorf("five planets: %v, want ErrNeighbour", err)
	}
	if _, err := mustRatio(t, -3, 0.98).Geometry(); !errors.Is(err, planetary.ErrNoTeeth) {
		t.Errorf("Geometry of a ratio set: %v", err)
	}
}

func TestPlanetSpeedsAbsolute(t *testing.T) {
	t.Parallel()
	// Hand calculation (ring held, sun 60 rpm, carrier 10 rpm): the planet
	// rolls on the fixed ring, so its contact point there is at rest:
	// ω_abs·r_planet = −ω_carrier·a, ω_abs = −(30/20)·10 = −15 rpm, which
	// is −25 rpm relative plus the carrier's 10.
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	sp, _ := s.Solve(planetary.Speeds{Sun: units.RPM(60)}, planetary.Carrier)
	ps, err := s.PlanetSpeeds(sp)
	if err != nil {
		t.Fatal(err)
	}
	if !testutil.Close(ps.InnerAbsolute.RPM(), -15, 1e-12, 0) || ps.OuterAbsolute != ps.InnerAbsolute {
		t.Errorf("absolute planet speeds %v, want -15 rpm", ps)
	}
}

func TestGeometryDoublePlanet(t *testing.T) {
	t.Parallel()
	// Hand calculation, unshifted pairs: sun 20, inner 18, outer 18, ring
	// 62: a1 = (20 + 18)/2 = 19, a2 = (62 − 18)/2 = 22, a12 = 18 modules;
	// clearances 2·19·sin 60° − 20 = 12.909 and 2·22·sin 60° − 20 = 18.105.
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 62, Planet: 18, Planets: 3, Arrangement: planetary.DoublePlanet})
	g, err := s.Geometry()
	if err != nil {
		t.Fatal(err)
	}
	if g.SunPlanet.CentreDistance != 19 || g.PlanetRing.CentreDistance != 22 || g.PlanetPlanet.CentreDistance != 18 {
		t.Errorf("centre distances %v, %v, %v", g.SunPlanet.CentreDistance, g.PlanetRing.CentreDistance, g.PlanetPlanet.CentreDistance)
	}
	if want := 38*math.Sin(math.Pi/3) - 20; !testutil.Close(g.NeighbourClearance, want, 1e-12, 0) {
		t.Errorf("clearance %v, want %v", g.NeighbourClearance, want)
	}
	if g.CoaxialMismatch != 0 || deg(g.PlanetPlanet.WorkingPressureAngle) != 20 {
		t.Errorf("pairs: mismatch %v, α_w %v°", g.CoaxialMismatch, deg(g.PlanetPlanet.WorkingPressureAngle))
	}
}
