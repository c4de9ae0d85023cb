package powersplit_test

import (
	"fmt"
	"log"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// An output-coupled split with a second motor of the loop on the front
// axle: full setting up to 250 rpm of the output, swung back to zero by
// 400 rpm, declutched above 420 rpm. SolveTotal shares a total demand
// between the axles.
func ExampleSecondMotor() {
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{
		Set: set, Loop: demoLoop(100, 100, 2), PumpRatio: 0.6, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Name: "field", Ratio: 0.2}},
		Second: &powersplit.SecondMotor{
			Ratio: 0.25, DeclutchAbove: units.RPM(420),
			Setting: powersplit.SettingCurve{
				Speeds:   []units.AngularVelocity{units.RPM(250), units.RPM(400)},
				Settings: []float64{1, 0},
			},
		},
	})
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println("ranges:", l.RangeName(0), "/", l.RangeName(1), "; outputs:", l.Outputs())
	s := powersplit.NewSolver(l)
	var st powersplit.State
	w := units.RPM(200) // both axles' outputs at 200 rpm
	p := powersplit.Point{Range: 0, Input: units.RPM(1900),
		Outputs: []powersplit.OutputDemand{{Speed: w}, {Speed: w}}}
	if err := s.SolveTotal(p, powersplit.TotalDemand{Torque: units.NewtonMetres(3000)}, &st); err != nil {
		log.Fatal(err)
	}
	lr := st.Loops[0]
	fmt.Printf("rear %.0f N·m, front %.0f N·m at %.0f bar\n", st.Outputs[0].Torque.NewtonMetres(), st.Outputs[1].Torque.NewtonMetres(), lr.Pressure.Bar())
	fmt.Printf("settings: pump %.3f, motor %.3f, front motor %.3f\n", lr.Settings[0], lr.Settings[1], lr.Settings[2])
	fmt.Printf("hydraulic share %.3f, efficiency %.3f\n", st.HydraulicShare, st.Efficiency)
	for _, m := range st.Margins {
		if m.Quantity == "output speed" && m.Element == "field" {
			fmt.Printf("declutch margin %v\n", m.Left())
		}
	}
	// Above the declutch speed only the single range drives.
	w = units.RPM(450)
	p = powersplit.Point{Range: 1, Input: units.RPM(1900),
		Outputs: []powersplit.OutputDemand{{Speed: w, Torque: units.NewtonMetres(1200)}, {Speed: w}}}
	if err := s.Solve(p, &st); err != nil {
		log.Fatal(err)
	}
	fmt.Printf("%s: front %.0f N·m, front motor at %.0f rpm\n", st.RangeName, st.Outputs[1].Torque.NewtonMetres(), st.Loops[0].Motors[1].Speed.RPM())
	// Output:
	// ranges: field / field single ; outputs: [output axle 2]
	// rear 2319 N·m, front 681 N·m at 114 bar
	// settings: pump 0.831, motor 1.000, front motor 1.000
	// hydraulic share 0.540, efficiency 0.868
	// declutch margin 220 rpm
	// field single: front 0 N·m, front motor at 0 rpm
}
