package planetary_test

import (
	"errors"
	"fmt"

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
	// planetary: undercut condition: sun teeth 15 teeth, limit 17 teeth (external gear at 20° pressure angle needs at least the minimum)
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
