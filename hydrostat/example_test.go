package hydrostat_test

import (
	"errors"
	"fmt"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// Invented demo coefficients, not data of any real unit.
var demoLoss = hydrostat.Wilson{Slip: 4e-9, Viscous: 4e4, Friction: 0.015, ConstantPressure: units.Bar(1)}

func ExampleGeometricDisplacement() {
	// Nine 20 mm pistons on a 100 mm pitch circle, 18° swashplate.
	d, err := hydrostat.GeometricDisplacement(hydrostat.Swashplate, 9, units.Millimetres(20), units.Millimetres(100), units.Degrees(18))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.1f cm³/rev\n", d.CCPerRev())
	// Output:
	// 91.9 cm³/rev
}

func ExampleUnit_At() {
	pump, err := hydrostat.NewUnit(hydrostat.UnitSpec{
		MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3000),
		RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: demoLoss,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	p, err := pump.At(0.8, units.RPM(2000), units.Bar(250), hydrostat.VG46, units.Celsius(60))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v: flow %.1f L/min, torque %.1f N·m\n", p.Mode, p.Flow.LitresPerMinute(), p.Torque.NewtonMetres())
	fmt.Printf("η_v %.3f  η_hm %.3f  η %.3f  loss %.2f kW\n", p.Volumetric, p.HydroMechanical, p.Overall, p.Loss.Kilowatts())
	// Output:
	// pumping: flow 139.1 L/min, torque 295.4 N·m
	// η_v 0.966  η_hm 0.970  η 0.937  loss 3.92 kW
}

func ExampleUnit_PressureFor() {
	motor, _ := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(110), PeakPressure: units.Bar(480), Loss: demoLoss})
	// The load takes 300 N·m from the motor shaft turning forward, so the
	// shaft applies −300 N·m to the motor; the motor sees Δp = p_out − p_in < 0.
	p, err := motor.PressureFor(1, units.RPM(1200), units.NewtonMetres(-300), hydrostat.VG46, units.Celsius(60))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v at %.1f bar, η_hm %.3f\n", p.Mode, -p.Pressure.Bar(), p.HydroMechanical)
	// Output:
	// motoring at 175.9 bar, η_hm 0.974
}

func ExampleOil_Viscosity() {
	for _, c := range []float64{0, 40, 60, 100} {
		fmt.Printf("VG 46 at %3.0f °C: %6.1f cSt\n", c, hydrostat.VG46.Viscosity(units.Celsius(c)).Centistokes())
	}
	// Output:
	// VG 46 at   0 °C:  577.3 cSt
	// VG 46 at  40 °C:   46.0 cSt
	// VG 46 at  60 °C:   20.6 cSt
	// VG 46 at 100 °C:    6.8 cSt
}

func newDemoLoop(sched hydrostat.Schedule) (hydrostat.Loop, error) {
	pump, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3200), PeakPressure: units.Bar(480), Loss: demoLoss})
	if err != nil {
		return hydrostat.Loop{}, err
	}
	motor, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4200), PeakPressure: units.Bar(480), Loss: demoLoss, Kind: hydrostat.BentAxis})
	if err != nil {
		return hydrostat.Loop{}, err
	}
	return hydrostat.NewLoop(hydrostat.LoopSpec{
		Pump: pump, Motors: []hydrostat.Unit{motor}, Oil: hydrostat.VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(25), Relief: units.Bar(450), Schedule: sched,
	})
}

func ExampleLoop_At() {
	loop, err := newDemoLoop(hydrostat.Sequential{})
	if err != nil {
		fmt.Println(err)
		return
	}
	var st hydrostat.LoopState // reuse across calls: At then allocates nothing
	pumpSpeed := units.RPM(2000)
	for _, ratio := range []float64{0, 0.5, 1, 2, 5} {
		motor := []units.AngularVelocity{pumpSpeed * units.AngularVelocity(ratio)}
		err := loop.At(pumpSpeed, motor, units.Bar(250), &st)
		if errors.Is(err, hydrostat.ErrSettingLimit) {
			fmt.Printf("ratio %.1f: %v\n", ratio, err)
			continue
		}
		fmt.Printf("ratio %.1f: pump %.3f motor %.3f η %.3f\n", ratio, st.Settings[0], st.Settings[1], st.Efficiency)
	}
	// Output:
	// ratio 0.0: pump 0.061 motor 1.000 η 0.000
	// ratio 0.5: pump 0.672 motor 1.000 η 0.858
	// ratio 1.0: pump 1.000 motor 0.768 η 0.887
	// ratio 2.0: pump 1.000 motor 0.384 η 0.843
	// ratio 5.0: hydrostat: motor setting 0.153654 below schedule's minimum motor setting 0.2
}

func ExampleLoop_Solve() {
	loop, err := newDemoLoop(nil) // nil schedule: Sequential
	if err != nil {
		fmt.Println(err)
		return
	}
	st, err := loop.Solve(hydrostat.LoopInput{
		PumpSpeed:    units.RPM(2000),
		MotorSpeeds:  []units.AngularVelocity{units.RPM(1200)},
		MotorTorques: []units.Torque{units.NewtonMetres(-300)},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Δp %.1f bar, high line %.1f bar, pump torque %.1f N·m, η %.3f\n",
		st.Pressure.Bar(), st.High.Bar(), st.Pump.Torque.NewtonMetres(), st.Efficiency)
	// Output:
	// Δp 175.9 bar, high line 200.9 bar, pump torque 202.8 N·m, η 0.887
}

func ExampleNewMap() {
	// Invented demo test data of a fixed unit: one setting layer.
	m, err := hydrostat.NewMap(hydrostat.MapSpec{
		Speeds:          []units.AngularVelocity{units.RPM(1000), units.RPM(3000)},
		Pressures:       []units.Pressure{units.Bar(100), units.Bar(400)},
		Settings:        []float64{1},
		Volumetric:      [][][]float64{{{0.97, 0.92}, {0.99, 0.96}}},
		HydroMechanical: [][][]float64{{{0.93, 0.96}, {0.89, 0.94}}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	u, _ := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(50), Loss: m})
	p, err := u.At(1, units.RPM(2000), units.Bar(250), hydrostat.VG46, units.Celsius(50))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("η_v %.4f η_hm %.4f η %.4f\n", p.Volumetric, p.HydroMechanical, p.Overall)
	_, err = u.At(1, units.RPM(4000), units.Bar(250), hydrostat.VG46, units.Celsius(50))
	fmt.Println(err)
	// Output:
	// η_v 0.9600 η_hm 0.9300 η 0.8928
	// hydrostat: operating point outside the measured map
}

// The motor swings through zero and over centre while the pump shaft comes
// to rest and turns backwards, as at the mechanical point of an
// output-coupled split: the pump holds full stroke and the settings pass
// continuously through the point.
func ExampleSequential_overCentre() {
	pump, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(90), Loss: demoLoss})
	if err != nil {
		fmt.Println(err)
		return
	}
	motor, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(110), Loss: demoLoss,
		Swing: hydrostat.SwingOverCentre})
	if err != nil {
		fmt.Println(err)
		return
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: []hydrostat.Unit{motor}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(25), Relief: units.Bar(450), Schedule: hydrostat.Sequential{}})
	if err != nil {
		fmt.Println(err)
		return
	}
	var st hydrostat.LoopState
	motorSpeed := []units.AngularVelocity{units.RPM(1500)}
	for _, rpm := range []float64{600, 300, 0, -300, -600} {
		if err := loop.At(units.RPM(rpm), motorSpeed, units.Bar(250), &st); err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("pump %5.0f rpm: pump %.3f motor %+.3f\n", rpm, st.Settings[0], st.Settings[1])
	}
	// Output:
	// pump   600 rpm: pump 1.000 motor +0.261
	// pump   300 rpm: pump 1.000 motor +0.097
	// pump     0 rpm: pump 1.000 motor -0.067
	// pump  -300 rpm: pump 1.000 motor -0.230
	// pump  -600 rpm: pump 1.000 motor -0.394
}

// An oil built from its ISO 3448 grade and its viscosity index (ASTM D2270).
func ExampleNewGradeOil() {
	oil, err := hydrostat.NewGradeOil(46, 150)
	if err != nil {
		fmt.Println(err)
		return
	}
	vi, _ := oil.ViscosityIndex()
	fmt.Printf("%s: %.2f cSt at 100 °C, VI %.1f, %.1f cSt at 60 °C\n", oil.Spec().Name,
		oil.Viscosity(units.Celsius(100)).Centistokes(), vi, oil.Viscosity(units.Celsius(60)).Centistokes())
	// Output:
	// ISO VG 46, VI 150: 8.10 cSt at 100 °C, VI 150.0, 22.5 cSt at 60 °C
}

// Fit the Wilson model to test-bench measurements. The measurements here
// are generated from a known (invented) model, so the fit recovers it.
func ExampleFitWilson() {
	d := units.CCPerRev(75)
	truth := hydrostat.Wilson{Slip: 6e-9, Viscous: 4e4, Friction: 0.025, ConstantPressure: units.Bar(1.5)}
	u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: d, Loss: truth})
	if err != nil {
		fmt.Println(err)
		return
	}
	var ms []hydrostat.Measurement
	for _, rpm := range []float64{800, 1600, 2400} {
		for _, bar := range []float64{100, 200, 300} {
			p, _ := u.At(1, units.RPM(rpm), units.Bar(bar), hydrostat.VG46, units.Celsius(50))
			ms = append(ms, hydrostat.Measurement{Speed: units.RPM(rpm), Pressure: units.Bar(bar), Setting: 1,
				Flow: p.Flow, Torque: p.Torque, Temperature: units.Celsius(50), Mode: hydrostat.Pumping})
		}
	}
	fit, err := hydrostat.FitWilson(hydrostat.FitSpec{MaxDisplacement: d, Oil: hydrostat.VG46}, ms)
	if err != nil {
		fmt.Println(err)
		return
	}
	m := fit.Model
	fmt.Printf("Cs %.3g, Cv %.4g, Cf %.4g, p_c %.3g bar; η within 1e-9 of the measured: %v\n",
		m.Slip, m.Viscous, m.Friction, m.ConstantPressure.Bar(), fit.MaxOverallError < 1e-9)
	// Output:
	// Cs 6e-09, Cv 4e+04, Cf 0.025, p_c 1.5 bar; η within 1e-9 of the measured: true
}
