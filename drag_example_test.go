package powersplit_test

import (
	"fmt"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Load-independent losses added to a built layout by the names of its
// shafts and elements, and listed by name in the solved state. Invented
// sizes.
func ExampleLayout_WithLosses() {
	u, _ := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100)})
	loop, _ := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: u, Motors: []hydrostat.Unit{u}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	set, _ := planetary.FromRatio(-2.5, 1)
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Ratio: 0.5}}, GearEfficiency: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	oil := hydrostat.VG46
	l, err = l.WithLosses(powersplit.NoLoad{
		Lubricant: powersplit.Lubricant{Viscosity: oil.Viscosity(units.Celsius(70)), Density: oil.Density(units.Celsius(70))},
		Bearings: []powersplit.ShaftBearings{{Name: "input bearings", Shaft: "engine",
			Bearings: powersplit.Bearings{MeanDiameter: units.Millimetres(85), F0: 2, Count: 2}}},
		Churning: []powersplit.ShaftWheel{{Name: "summing wheel", Shaft: "sum", Wheel: powersplit.Wheel{Diameter: units.Millimetres(260),
			FaceWidth: units.Millimetres(40), Module: units.Millimetres(4), HelixAngle: units.Degrees(20), Dip: 0.1}}},
		ChargePumps: []powersplit.LoopChargePump{{Name: "charge pump", Loop: "hydrostat", Shaft: "engine",
			ChargePump: powersplit.ChargePump{Flushing: units.LitresPerMinute(10), Efficiency: 0.8}}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	s := powersplit.NewSolver(l)
	var st powersplit.State
	engine := units.RPM(2000)
	// No load at the output: the engine supplies only the drag.
	p := powersplit.Point{Input: engine, Outputs: []powersplit.OutputDemand{{Speed: units.AngularVelocity(0.35 * float64(engine))}}}
	if err := s.Solve(p, &st); err != nil {
		fmt.Println(err)
		return
	}
	for _, d := range st.Drags {
		fmt.Printf("%-15s %-11s %7.1f W\n", d.Name, d.Kind, float64(d.Loss))
	}
	fmt.Printf("input %.1f W = no-load loss %.1f W\n", float64(st.InputPower), float64(st.DragLoss))
	// Output:
	// input bearings  bearings       49.3 W
	// summing wheel   churning      150.9 W
	// charge pump     charge pump   416.7 W
	// input 617.0 W = no-load loss 617.0 W
}
