package powersplit_test

import (
	"fmt"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// An output-coupled split run continuously through its mechanical point:
// the pump shaft stops there and turns backwards beyond it, so the motor
// swings back to zero and over centre (a SwingOverCentre motor with the
// Sequential schedule). Invented unit sizes and loss coefficients.
func Example_throughMechanicalPoint() {
	loss := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	unit := func(sw hydrostat.Swing) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100), MaxSpeed: units.RPM(4000),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: loss, Swing: sw})
		if err != nil {
			panic(err)
		}
		return u
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: unit(hydrostat.SwingOverCentre), Motors: []hydrostat.Unit{unit(hydrostat.SwingOverCentre)},
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		panic(err)
	}
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		panic(err)
	}
	// Carrier on the engine, sun to the pump (1.2), ring the summing shaft,
	// motor geared to it (0.8), one range of 0.5: the pump stops at output
	// speed ν_M = 1.4·0.5 = 0.7 of the engine's.
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Ratio: 0.5}}})
	if err != nil {
		panic(err)
	}
	s := powersplit.NewSolver(l)
	var st powersplit.State
	engine := units.RPM(2000)
	fmt.Println("ν/ν_M   pump rpm  pump x  motor x  efficiency  hydraulic share")
	for _, f := range []float64{0.9, 0.97, 0.99, 1, 1.01, 1.03, 1.1} {
		out := units.AngularVelocity(f * 0.7 * float64(engine))
		p := powersplit.Point{Input: engine, Outputs: []powersplit.OutputDemand{{Speed: out, Torque: units.NewtonMetres(600)}}}
		if err := s.Solve(p, &st); err != nil {
			fmt.Println(f, err)
			continue
		}
		lp := st.Loops[0]
		fmt.Printf("%5.2f  %9.1f  %6.3f  %7.3f  %10.4f  %15.4f\n", f, lp.Pump.Speed.RPM(), lp.Settings[0], lp.Settings[1], st.Efficiency, st.HydraulicShare)
	}
	// Output:
	// ν/ν_M   pump rpm  pump x  motor x  efficiency  hydraulic share
	//  0.90      840.0   1.000    0.265      0.8953           0.0922
	//  0.97      252.0   1.000    0.072      0.8947           0.0284
	//  0.99       84.0   1.000    0.022      0.8936           0.0093
	//  1.00        0.0   1.000   -0.002      0.8929          -0.0004
	//  1.01      -84.0   1.000   -0.026      0.8910          -0.0111
	//  1.03     -252.0   1.000   -0.072      0.8878          -0.0326
	//  1.10     -840.0   1.000   -0.221      0.8746          -0.1098
}
