package planetary_test

import (
	"errors"
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// A set from tooth counts, its fixed-carrier ratio and the ring-held ratio.
func ExampleNew() {
	s, err := planetary.New(planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	if err != nil {
		fmt.Println(err)
		return
	}
	r, _ := s.Ratio(planetary.Sun, planetary.Carrier)
	fmt.Printf("i0 = %.4g, eta0 = %.4g, sun/carrier with ring held = %.4g\n",
		s.FixedCarrierRatio(), s.BasicEfficiency(), r)
	// Output:
	// i0 = -5, eta0 = 0.98, sun/carrier with ring held = 6
}

// Every violated design condition is reported, with its numbers.
func ExampleCheck() {
	err := planetary.Check(planetary.Design{Sun: 15, Ring: 52, Planet: 18, Planets: 4})
	var de *planetary.DesignError
	fmt.Println(errors.As(err, &de), errors.Is(err, planetary.ErrAssembly))
	fmt.Println(err)
	// Output:
	// true true
	// planetary: undercut condition: sun teeth 15 teeth, limit 17 teeth (external gear at 20° pressure angle needs at least the minimum, or a profile shift)
	// planetary: coaxial condition: ring teeth 52 teeth, limit 51 teeth (z_ring = z_sun + 2·z_planet)
	// planetary: assembly condition: (z_sun + z_ring) mod N 3 teeth, limit 0 teeth (z_sun + z_ring = 67 must be a multiple of N = 4 planets)
}

// The Willis equation gives the third speed from any two.
func ExampleSet_Solve() {
	s, _ := planetary.FromRatio(-2.5, 0)
	sp, err := s.Solve(planetary.Speeds{Sun: units.RPM(2100), Ring: units.RPM(-600)}, planetary.Carrier)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("carrier %.4g rpm\n", sp.Carrier.RPM())
	// Output:
	// carrier 171.4 rpm
}

// Torques and loss from one known torque: ring held, sun driving.
func ExampleSet_Torque() {
	s, _ := planetary.FromRatio(-5, 0.98)
	sp, _ := s.Solve(planetary.Speeds{Sun: units.RPM(1500)}, planetary.Carrier)
	st, err := s.Torque(sp, planetary.Sun, units.NewtonMetres(100))
	if err != nil {
		fmt.Println(err)
		return
	}
	_, _, pc, _ := st.Power()
	pin := units.PowerFromTorque(st.Torques.Sun, st.Speeds.Sun)
	fmt.Printf("flow: %v\n", st.Flow)
	fmt.Printf("torques: sun %.4g, ring %.4g, carrier %.4g N·m\n",
		st.Torques.Sun.NewtonMetres(), st.Torques.Ring.NewtonMetres(), st.Torques.Carrier.NewtonMetres())
	fmt.Printf("rolling %.4g kW, loss %.4g W, efficiency %.4f\n",
		st.RollingPower.Kilowatts(), st.Loss.Watts(), -float64(pc)/float64(pin))
	// Output:
	// flow: sun drives
	// torques: sun 100, ring 490, carrier -590 N·m
	// rolling 13.09 kW, loss 261.8 W, efficiency 0.9833
}

// The planets' speed relative to the carrier, for bearing life.
func ExampleSet_PlanetSpeeds() {
	s, _ := planetary.New(planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	sp, _ := s.Solve(planetary.Speeds{Sun: units.RPM(60)}, planetary.Carrier)
	ps, _ := s.PlanetSpeeds(sp)
	fmt.Printf("carrier %.4g rpm, planet %.4g rpm relative to it\n", sp.Carrier.RPM(), ps.Inner.RPM())
	// Output:
	// carrier 10 rpm, planet -25 rpm relative to it
}

// The torque factors of the two flow directions.
func ExampleSet_TorqueFactors() {
	s, _ := planetary.FromRatio(-3, 0.98)
	for _, f := range []planetary.Flow{planetary.SunDrives, planetary.RingDrives} {
		kr, kc := s.TorqueFactors(f)
		fmt.Printf("%v: kRing %.4g, kCarrier %.4g\n", f, kr, kc)
	}
	// Output:
	// sun drives: kRing 2.94, kCarrier -3.94
	// ring drives: kRing 3.061, kCarrier -4.061
}

// A 15-tooth sun needs a profile shift against undercut; the ring shift
// that keeps the set coaxial follows from RingShiftFor.
func ExampleRingShiftFor() {
	d := planetary.Design{Sun: 15, Planet: 24, Ring: 63, Planets: 3, SunShift: 0.2, PlanetShift: 0.1,
		Module: units.Millimetres(3)}
	xr, err := planetary.RingShiftFor(d)
	if err != nil {
		fmt.Println(err)
		return
	}
	d.RingShift = xr
	s, err := planetary.New(d)
	if err != nil {
		fmt.Println(err)
		return
	}
	g, _ := s.Geometry()
	fmt.Printf("ring shift %.4f, centre distance %.3f mm at α_w %.3f°\n", xr,
		g.Length(g.SunPlanet.CentreDistance).Millimetres(), float64(g.SunPlanet.WorkingPressureAngle)*180/math.Pi)
	fmt.Printf("planet–ring α_w %.3f°, neighbour clearance %.2f mm, i0 %.3f\n",
		float64(g.PlanetRing.WorkingPressureAngle)*180/math.Pi, g.Length(g.NeighbourClearance).Millimetres(), s.FixedCarrierRatio())
	// Output:
	// ring shift 0.4000, centre distance 59.355 mm at α_w 22.157°
	// planet–ring α_w 22.157°, neighbour clearance 24.21 mm, i0 -4.200
}
