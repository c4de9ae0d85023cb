package powersplit_test

import (
	"fmt"
	"log"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// demoLoop returns a hydrostatic loop of invented demo units: a pump of
// pumpCC and motors of motorCC cm³/rev with an invented Wilson loss model.
func demoLoop(pumpCC, motorCC float64, motors int) hydrostat.Loop {
	loss := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	unit := func(cc float64) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc), MaxSpeed: units.RPM(4500),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: loss})
		if err != nil {
			log.Fatal(err)
		}
		return u
	}
	ms := make([]hydrostat.Unit, motors)
	for i := range ms {
		ms[i] = unit(motorCC)
	}
	l, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: unit(pumpCC), Motors: ms, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		log.Fatal(err)
	}
	return l
}

func ExampleOutputCoupled() {
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{
		Set:  set, // carrier on the engine, sun to the pump, ring the summing shaft
		Loop: demoLoop(100, 100, 1), PumpRatio: 0.6, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Name: "field", Ratio: 0.2}, {Name: "road", Ratio: 0.45}},
		PTOs:   []powersplit.PTOSpec{{Name: "PTO", Ratio: 1000.0 / 2000}},
	})
	if err != nil {
		log.Fatal(err)
	}
	s := powersplit.NewSolver(l)
	var st powersplit.State
	p := powersplit.Point{
		Range:   l.RangeIndex("field"),
		Input:   units.RPM(2000),
		Outputs: []powersplit.OutputDemand{{Speed: units.RPM(300), Torque: units.NewtonMetres(2500)}},
		PTO:     []units.Torque{units.NewtonMetres(200)},
	}
	if err := s.Solve(p, &st); err != nil {
		log.Fatal(err)
	}
	fmt.Printf("input %.1f kW, output %.1f kW, PTO %.1f kW at %.0f rpm\n",
		st.InputPower.Kilowatts(), st.OutputPower.Kilowatts(), st.PTOPower.Kilowatts(), st.PTOs[0].Speed.RPM())
	fmt.Printf("efficiency %.3f, hydraulic share %.3f, loop %.0f bar\n",
		st.Efficiency, st.HydraulicShare, st.Loops[0].Pressure.Bar())
	ivs, err := s.Interval(p)
	if err != nil {
		log.Fatal(err)
	}
	// Between the two intervals the motor would have to swivel below its
	// minimum setting (0.2) as the pump slows towards standstill; in the
	// second the pump turns backwards at full stroke and the motor is back
	// within its settings.
	for _, iv := range ivs {
		fmt.Printf("field range reaches %.0f to %.0f rpm at the output\n", iv.Lo.RPM(), iv.Hi.RPM())
	}
	// Output:
	// input 108.5 kW, output 78.5 kW, PTO 20.9 kW at 1000 rpm
	// efficiency 0.917, hydraulic share 0.334, loop 115 bar
	// field range reaches -40 to 480 rpm at the output
	// field range reaches 672 to 720 rpm at the output
}

func ExampleInputCoupled() {
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	l, err := powersplit.InputCoupled(powersplit.InputCoupledSpec{
		Set:  set, // ring on the engine side, sun to the motor, carrier sums
		Loop: demoLoop(100, 100, 1), PumpRatio: 1.1, InputRatio: 0.9,
		Ranges: []powersplit.RangeGear{{Ratio: 0.6}},
	})
	if err != nil {
		log.Fatal(err)
	}
	s := powersplit.NewSolver(l)
	var st powersplit.State
	for _, rpm := range []float64{300, 771.4, 1100} {
		p := powersplit.Point{Input: units.RPM(2000),
			Outputs: []powersplit.OutputDemand{{Speed: units.RPM(rpm), Torque: units.NewtonMetres(800)}}}
		if err := s.Solve(p, &st); err != nil {
			log.Fatal(err)
		}
		fmt.Printf("%5.0f rpm: efficiency %.3f, hydraulic share %+.3f\n", rpm, st.Efficiency, st.HydraulicShare)
	}
	// Output:
	// 300 rpm: efficiency 0.676, hydraulic share -0.913
	//   771 rpm: efficiency 0.913, hydraulic share +0.001
	//  1100 rpm: efficiency 0.905, hydraulic share +0.307
}

func ExamplePureHydrostatic() {
	// Two motors; the second drives an axle of its own and is declutched
	// above 400 rpm of the main output.
	l, err := powersplit.PureHydrostatic(powersplit.PureHydrostaticSpec{
		PumpRatio: 1.1, Loop: demoLoop(100, 80, 2),
		Ranges: []powersplit.RangeGear{{Ratio: 0.5}},
		Second: &powersplit.SecondMotor{Ratio: 0.5, DeclutchAbove: units.RPM(400)},
	})
	if err != nil {
		log.Fatal(err)
	}
	s := powersplit.NewSolver(l)
	var st powersplit.State
	for _, rpm := range []float64{150, 600} {
		p := powersplit.Point{Input: units.RPM(2000), Outputs: []powersplit.OutputDemand{
			{Speed: units.RPM(rpm), Torque: units.NewtonMetres(600)}, // main output
			{Speed: units.RPM(rpm)},                                  // second axle: torque solved
		}}
		if err := s.Best(p, nil, &st); err != nil {
			log.Fatal(err)
		}
		fmt.Printf("%3.0f rpm: %-14s axle 2 %6.1f N·m, efficiency %.3f\n",
			rpm, st.RangeName, st.Outputs[1].Torque.NewtonMetres(), st.Efficiency)
	}
	// Output:
	// 150 rpm: range 1        axle 2  600.0 N·m, efficiency 0.739
	// 600 rpm: range 1 single axle 2    0.0 N·m, efficiency 0.822
}

// A compound split with two planetary sets and two mechanical points,
// composed from the public elements and solved by the same solver.
func Example_compoundSplit() {
	set1, err := planetary.FromRatio(-2, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	set2, err := planetary.FromRatio(-2, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	b := powersplit.NewBuilder()
	in, out, a, c := b.Shaft("engine"), b.Shaft("output"), b.Shaft("A"), b.Shaft("B")
	b.Input("engine", in)
	b.Output("output", out)
	b.Planetary("set 1", set1, a, in, out) // sun A, ring engine, carrier output
	b.Planetary("set 2", set2, c, out, in) // sun B, ring output, carrier engine
	b.Loop("hydrostat", demoLoop(120, 120, 1), c, a)
	l, err := b.Build()
	if err != nil {
		log.Fatal(err)
	}
	// Mechanical points: B stops at ν = 3/2, A at ν = 2/3.
	s := powersplit.NewSolver(l)
	var st powersplit.State
	for _, nu := range []float64{0.5, 2.0 / 3, 1, 1.25} {
		p := powersplit.Point{Input: units.RPM(1500),
			Outputs: []powersplit.OutputDemand{{Speed: units.RPM(1500 * nu), Torque: units.NewtonMetres(300)}}}
		if err := s.Solve(p, &st); err != nil {
			fmt.Printf("ν = %.3f: %v\n", nu, err)
			continue
		}
		fmt.Printf("ν = %.3f: efficiency %.3f, hydraulic share %+.3f\n", nu, st.Efficiency, st.HydraulicShare)
	}
	// Output:
	// ν = 0.500: efficiency 0.736, hydraulic share -0.219
	// ν = 0.667: efficiency 0.850, hydraulic share +0.001
	// ν = 1.000: efficiency 0.920, hydraulic share +0.192
	// ν = 1.250: efficiency 0.896, hydraulic share +0.147
}

func ExampleLayout_Sweep() {
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: demoLoop(100, 100, 1),
		PumpRatio: 0.6, MotorRatio: 0.8, Ranges: []powersplit.RangeGear{{Ratio: 0.2}, {Ratio: 0.45}}})
	if err != nil {
		log.Fatal(err)
	}
	sw, err := l.Sweep(powersplit.SweepSpec{Range: powersplit.Auto, Input: units.RPM(2000),
		From: units.RPM(100), To: units.RPM(1300), Steps: 4, Power: units.Kilowatts(90)})
	if err != nil {
		log.Fatal(err)
	}
	// sw.WriteCSV(w) writes the same as CSV, with the reasons.
	for _, c := range sw.Cells() {
		if !c.OK {
			fmt.Printf("%4.0f rpm: infeasible\n", c.OutputSpeed.RPM())
			continue
		}
		fmt.Printf("%4.0f rpm: range %d, %6.0f N·m, efficiency %.3f\n",
			c.OutputSpeed.RPM(), c.Range, c.OutputTorque.NewtonMetres(), c.Efficiency)
	}
	// Output:
	// 100 rpm: infeasible
	//  500 rpm: range 1,   1508 N·m, efficiency 0.877
	//  900 rpm: range 1,    868 N·m, efficiency 0.909
	// 1300 rpm: infeasible
}
