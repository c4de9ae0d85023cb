package traction_test

import (
	"fmt"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

// A slip curve of one rear tyre on firm soil (Brixius), and the slip that
// gives a required net pull.
func ExampleWheel_At() {
	tyre := traction.Tyre{ // invented demo tyre
		Diameter:      units.Metres(1.85),
		Width:         units.Metres(0.47),
		SectionHeight: units.Metres(0.40),
		RollingRadius: units.Metres(0.88),
		Deflection:    units.Metres(0.06),
	}
	w, err := traction.NewWheel(tyre, traction.FirmSoil(), traction.Brixius{})
	if err != nil {
		fmt.Println(err)
		return
	}
	load := units.Kilonewtons(25)
	fmt.Println("slip  GT     MR     NT     TE")
	for _, s := range []float64{0.02, 0.05, 0.10, 0.15, 0.20, 0.30} {
		p, err := w.At(load, s)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%.2f  %.3f  %.3f  %.3f  %.3f\n", s, p.GrossRatio(), p.ResistanceRatio(), p.NetRatio(), p.Efficiency)
	}
	best, _ := w.BestSlip(load)
	fmt.Printf("best TE %.3f at slip %.3f\n", best.Efficiency, best.Slip)
	p, err := w.SlipForPull(load, units.Kilonewtons(10))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("10 kN net pull at slip %.4f\n", p.Slip)
	// Output:
	// slip  GT     MR     NT     TE
	// 0.02  0.161  0.066  0.095  0.579
	// 0.05  0.311  0.068  0.243  0.742
	// 0.10  0.497  0.072  0.425  0.770
	// 0.15  0.625  0.076  0.549  0.747
	// 0.20  0.713  0.080  0.633  0.711
	// 0.30  0.815  0.087  0.727  0.625
	// best TE 0.771 at slip 0.090
	// 10 kN net pull at slip 0.0919
}

// A four-wheel-drive vehicle with a geared front axle (2 % lead) at a
// drawbar pull, compared with independently driven axles.
func ExampleVehicle_FixedRatio() {
	v := traction.Vehicle{ // invented demo vehicle
		Mass:         units.Kilograms(9000),
		Wheelbase:    units.Metres(2.8),
		CentreOfMass: units.Metres(1.1),
		Hitch:        traction.Hitch{Height: units.Metres(0.5)},
		Front: traction.Axle{Wheels: 2, Tyre: traction.Tyre{
			Diameter: units.Metres(1.35), Width: units.Metres(0.38), SectionHeight: units.Metres(0.30),
			RollingRadius: units.Metres(0.64), Deflection: units.Metres(0.04)}},
		Rear: traction.Axle{Wheels: 2, Tyre: traction.Tyre{
			Diameter: units.Metres(1.85), Width: units.Metres(0.47), SectionHeight: units.Metres(0.40),
			RollingRadius: units.Metres(0.88), Deflection: units.Metres(0.06)}},
	}
	op := traction.Operation{Pull: units.Kilonewtons(30), Speed: units.KMH(8)}
	d, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), op, 0.02)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("geared:      slip front %.3f rear %.3f, torque front %.0f N·m rear %.0f N·m, TE %.3f\n",
		d.Front.Wheel.Slip, d.Rear.Wheel.Slip, float64(d.Front.Torque), float64(d.Rear.Torque), d.Efficiency)
	fmt.Printf("             wheel power %.1f kW, drawbar %.1f kW, circulating %.1f kW\n",
		d.InputPower.Kilowatts(), d.DrawbarPower.Kilowatts(), d.CirculatingPower.Kilowatts())
	light := op
	light.Pull = units.Kilonewtons(2)
	l, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), light, 0.05)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("light pull, 5 %% lead: slip front %.3f rear %.3f, circulating %.2f kW\n",
		l.Front.Wheel.Slip, l.Rear.Wheel.Slip, l.CirculatingPower.Kilowatts())
	ind, err := v.Independent(traction.Brixius{}, traction.FirmSoil(), op)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("independent: slip front %.3f rear %.3f, front torque share %.3f, TE %.3f\n",
		ind.Front.Wheel.Slip, ind.Rear.Wheel.Slip, ind.TorqueShare, ind.Efficiency)
	// Output:
	// geared:      slip front 0.089 rear 0.071, torque front 8611 N·m rear 20318 N·m, TE 0.757
	//              wheel power 88.0 kW, drawbar 66.7 kW, circulating 0.0 kW
	// light pull, 5 % lead: slip front 0.040 rear -0.008, circulating 1.50 kW
	// independent: slip front 0.077 rear 0.076, front torque share 0.268, TE 0.758
}

// The Ackermann geometry of a 6 m turn and the wind-up a geared front axle
// without lead causes in it.
func ExampleVehicle_FixedRatioTurn() {
	v := traction.Vehicle{ // invented demo vehicle
		Mass:         units.Kilograms(9000),
		Wheelbase:    units.Metres(2.8),
		CentreOfMass: units.Metres(1.1),
		Front: traction.Axle{Wheels: 2, Track: units.Metres(1.9), Tyre: traction.Tyre{
			Diameter: units.Metres(1.35), Width: units.Metres(0.38), SectionHeight: units.Metres(0.30),
			RollingRadius: units.Metres(0.64), Deflection: units.Metres(0.04)}},
		Rear: traction.Axle{Wheels: 2, Track: units.Metres(1.8), Tyre: traction.Tyre{
			Diameter: units.Metres(1.85), Width: units.Metres(0.47), SectionHeight: units.Metres(0.40),
			RollingRadius: units.Metres(0.88), Deflection: units.Metres(0.06)}},
	}
	op := traction.Operation{Speed: units.KMH(6)} // turning on the headland, no drawbar pull
	d, g, err := v.FixedRatioTurn(traction.Brixius{}, traction.FirmSoil(), op, 0, units.Metres(6))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("front wheel paths %.2f m and %.2f m, rear %.2f m and %.2f m\n",
		float64(g.FrontInner), float64(g.FrontOuter), float64(g.RearInner), float64(g.RearOuter))
	fmt.Printf("steering %.1f° inner, %.1f° outer; front/rear speed ratio %.4f\n",
		g.InnerSteer.Degrees(), g.OuterSteer.Degrees(), g.SpeedRatio)
	fmt.Printf("geared 1:1: front slip %.3f, rear slip %.3f, wind-up %.2f kW\n",
		d.Front.Wheel.Slip, d.Rear.Wheel.Slip, d.CirculatingPower.Kilowatts())
	ind, _, err := v.IndependentTurn(traction.Brixius{}, traction.FirmSoil(), op, units.Metres(6))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("own motors: wheel power %.2f kW against %.2f kW geared, circulating %.2f kW\n",
		ind.InputPower.Kilowatts(), d.InputPower.Kilowatts(), ind.CirculatingPower.Kilowatts())
	// Output:
	// front wheel paths 5.77 m and 7.49 m, rear 5.10 m and 6.90 m
	// steering 29.0° inner, 21.9° outer; front/rear speed ratio 1.1056
	// geared 1:1: front slip -0.054, rear slip 0.047, wind-up 14.55 kW
	// own motors: wheel power 10.53 kW against 13.15 kW geared, circulating 0.00 kW
}

// Ballast for a front-assist vehicle to pull 32 kN at 10 % slip on firm
// soil with the recommended static weight split.
func ExampleVehicle_Ballast() {
	v := traction.Vehicle{ // invented demo vehicle
		Mass:         units.Kilograms(6500),
		Wheelbase:    units.Metres(2.8),
		CentreOfMass: units.Metres(1.0),
		Hitch:        traction.Hitch{Height: units.Metres(0.5)},
		Front: traction.Axle{Wheels: 2, Tyre: traction.Tyre{
			Diameter: units.Metres(1.35), Width: units.Metres(0.38), SectionHeight: units.Metres(0.30),
			RollingRadius: units.Metres(0.64), Deflection: units.Metres(0.04), RatedLoad: units.Kilonewtons(22)}},
		Rear: traction.Axle{Wheels: 2, Tyre: traction.Tyre{
			Diameter: units.Metres(1.85), Width: units.Metres(0.47), SectionHeight: units.Metres(0.40),
			RollingRadius: units.Metres(0.88), Deflection: units.Metres(0.06), RatedLoad: units.Kilonewtons(32)}},
	}
	op := traction.Operation{Pull: units.Kilonewtons(32), Speed: units.KMH(8)}
	a, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), op, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("recommended front share %.0f %%\n", 100*a.FrontShare)
	fmt.Printf("operating mass %.0f kg: add %.0f kg front, %.0f kg rear\n",
		a.Mass.Kilograms(), a.FrontBallast.Kilograms(), a.RearBallast.Kilograms())
	fmt.Printf("axle loads working: front %.1f kN, rear %.1f kN; overloaded: %v %v\n",
		a.Dynamic.Front.Kilonewtons(), a.Dynamic.Rear.Kilonewtons(), a.FrontOverloaded, a.RearOverloaded)
	// Output:
	// recommended front share 35 %
	// operating mass 7696 kg: add 372 kg front, 824 kg rear
	// axle loads working: front 20.7 kN, rear 54.8 kN; overloaded: false false
}
