package vehicle_test

import (
	"fmt"
	"log"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// A tractor whose front axle is driven by a second motor of the split's
// loop (invented, round numbers): each axle slips by its own pull, and in
// a turn the front axle runs faster than the rear without wind-up.
func ExampleFromFrontMotorLayout() {
	loss := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	unit := func(cc float64) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc), MaxSpeed: units.RPM(3600), Loss: loss})
		if err != nil {
			log.Fatal(err)
		}
		return u
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: unit(110), Motors: []hydrostat.Unit{unit(110), unit(45)},
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		log.Fatal(err)
	}
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		log.Fatal(err)
	}
	const rearFD, frontFD = 13.6, 60.0
	rearOut := func(kmh float64) units.AngularVelocity {
		return units.AngularVelocity(rearFD * float64(units.KMH(kmh)) / 0.88)
	}
	layout, err := powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.1,
		Ranges: []powersplit.RangeGear{{Name: "field", Ratio: 0.174}},
		Second: &powersplit.SecondMotor{Ratio: 1, DeclutchAbove: rearOut(13),
			Setting: powersplit.SettingCurve{Speeds: []units.AngularVelocity{rearOut(8), rearOut(12)}, Settings: []float64{1, 0}}}})
	if err != nil {
		log.Fatal(err)
	}
	drive, err := vehicle.FromFrontMotorLayout(layout, vehicle.FrontMotorSpec{FinalDrive: frontFD, AxleRatio: frontFD * 0.88 / (rearFD * 0.71)})
	if err != nil {
		log.Fatal(err)
	}
	tyre := func(d, w, h, r float64) traction.Tyre {
		return traction.Tyre{Diameter: units.Metres(d), Width: units.Metres(w), SectionHeight: units.Metres(h), RollingRadius: units.Metres(r)}
	}
	ground := vehicle.Tyres{Model: traction.Brixius{}, Surface: traction.FirmSoil(),
		Vehicle: traction.Vehicle{Mass: units.Tonnes(8.5), Wheelbase: units.Metres(2.9), CentreOfMass: units.Metres(1.15),
			Hitch: traction.Hitch{Height: units.Metres(0.5), Behind: units.Metres(1)},
			Front: traction.Axle{Tyre: tyre(1.5, 0.54, 0.37, 0.71), Wheels: 2, Track: units.Metres(1.9)},
			Rear:  traction.Axle{Tyre: tyre(1.85, 0.65, 0.46, 0.88), Wheels: 2, Track: units.Metres(1.9)}}}
	engine, err := vehicle.NewEngine(vehicle.EngineSpec{Idle: units.RPM(800), Rated: units.RPM(2100),
		CurveSpeeds:  []units.AngularVelocity{units.RPM(800), units.RPM(1400), units.RPM(2100), units.RPM(2300)},
		CurveTorques: []units.Torque{units.NewtonMetres(620), units.NewtonMetres(960), units.NewtonMetres(730), units.NewtonMetres(150)}})
	if err != nil {
		log.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(8.5), Tyres: ground, Transmission: drive,
		FinalDrive: rearFD, FinalDriveEfficiency: 0.97, Engine: engine})
	if err != nil {
		log.Fatal(err)
	}
	for _, d := range []vehicle.Demand{
		{Speed: units.KMH(7), Draft: units.Kilonewtons(22)},
		{Speed: units.KMH(5), TurnRadius: units.Metres(6)},
	} {
		p, err := v.At(d, units.RPM(1800), 0)
		if err != nil {
			log.Fatal(err)
		}
		front := float64(p.Drive.FrontSpeed) / frontFD * 0.71 * (1 - p.FrontSlip) / float64(d.Speed)
		what := "straight, 22 kN draft"
		if d.TurnRadius > 0 {
			what = "turn of 6 m radius"
		}
		fmt.Printf("%s: front share %.2f, slip front %.3f rear %.3f, front/rear travel %.3f, circulating %v\n",
			what, p.FrontShare, p.FrontSlip, p.Slip, front, p.Flows.Circulating)
	}
	// Output:
	// straight, 22 kN draft: front share 0.12, slip front 0.018 rear 0.095, front/rear travel 1.000, circulating 0 W
	// turn of 6 m radius: front share 0.03, slip front -0.005 rear 0.015, front/rear travel 1.113, circulating 0 W
}
