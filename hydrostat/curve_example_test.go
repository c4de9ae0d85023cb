package hydrostat_test

import (
	"fmt"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// A loop at fixed shaft speeds as a function of its pressure: the settings
// the Sequential schedule gives, each unit's torque and its exact slope
// over the pressure, the slope in cm³/rev (torque per pressure is a
// displacement). Newton's method on a torque balance takes these slopes.
func ExampleLoop_Curve() {
	u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100), Loss: demoLoss})
	if err != nil {
		fmt.Println(err)
		return
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: u, Motors: []hydrostat.Unit{u}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		fmt.Println(err)
		return
	}
	var c hydrostat.Curve
	motors := []units.AngularVelocity{units.RPM(1500)}
	if !loop.Curve(units.RPM(2000), motors, &c) {
		fmt.Println("not a curve")
		return
	}
	settings := make([]float64, 2)
	torques := make([]units.Torque, 2)
	slopes := make([]units.Displacement, 2)
	for _, bar := range []float64{100, 300} {
		if !c.Torques(units.Bar(bar), settings, torques, slopes) {
			fmt.Println("cannot decide")
			return
		}
		fmt.Printf("%.0f bar: pump at %.3f, %.1f N·m (slope %.2f cm³/rev); motor at %.3f, %.1f N·m (slope %.2f cm³/rev)\n",
			bar, settings[0], torques[0].NewtonMetres(), slopes[0].CCPerRev(), settings[1], torques[1].NewtonMetres(), slopes[1].CCPerRev())
	}
	// Output:
	// 100 bar: pump at 0.772, 129.2 N·m (slope 80.89 cm³/rev); motor at 1.000, -153.4 N·m (slope -98.50 cm³/rev)
	// 300 bar: pump at 0.816, 400.6 N·m (slope 89.68 cm³/rev); motor at 1.000, -467.0 N·m (slope -98.50 cm³/rev)
}
