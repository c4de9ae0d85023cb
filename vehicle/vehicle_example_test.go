package vehicle_test

import (
	"fmt"
	"time"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// A short working day: accelerate, one pass with a tandem disk harrow, a
// headland turn, a road transfer with a trailer over a hill, and stationary
// PTO work. The machine data are invented.
func ExampleSimulate() {
	engine, err := vehicle.NewEngine(vehicle.EngineSpec{
		CurveSpeeds:  []units.AngularVelocity{units.RPM(800), units.RPM(1300), units.RPM(1800), units.RPM(2100), units.RPM(2300)},
		CurveTorques: []units.Torque{600, 900, 800, 690, 300},
		Idle:         units.RPM(800),
		Rated:        units.RPM(2100),
		// No fuel map: the ASABE D497 fuel equation is used.
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	mass := units.Tonnes(9)
	v, err := vehicle.New(vehicle.Spec{
		Mass:     mass,
		DragArea: units.SquareMetres(4),
		Tyres: vehicle.SlipCurve{Weight: units.ForceFromMass(mass, units.Gravity), Radius: units.Metres(0.85),
			Rolling: 0.02, PeakTraction: 0.85, SlipRate: 12},
		Transmission: &vehicle.SplitEstimate{
			Spans: []vehicle.SplitRange{
				{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5},
				{MinRatio: 0.5, MaxRatio: 2, MechanicalPoint: 1.3},
			},
			MechanicalEfficiency: 0.97, HydrostaticEfficiency: 0.8, NoLoadLoss: units.Kilowatts(1.5),
		},
		FinalDrive: 20,
		Engine:     engine,
		PTO:        vehicle.PTO{Ratios: []float64{3.5, 1.9}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	field := vehicle.SlipCurve{Weight: units.ForceFromMass(mass, units.Gravity), Radius: units.Metres(0.85),
		Rolling: 0.08, PeakTraction: 0.75, SlipRate: 10}
	disk := &vehicle.Implement{Row: vehicle.TandemDiskSecondary, Width: 4, Depth: units.Centimetres(10), Texture: vehicle.Medium}
	cycle := []vehicle.Segment{
		{Name: "start", Kind: vehicle.Accelerate, Speed: units.KMH(9), Acceleration: 0.5, Ground: field},
		{Name: "disking", Kind: vehicle.FieldPass, Speed: units.KMH(9), Distance: units.Metres(300), Implement: disk, Ground: field},
		{Name: "turn", Kind: vehicle.HeadlandTurn, Speed: units.KMH(6), Duration: 15 * time.Second, Ground: field},
		{Name: "road", Kind: vehicle.RoadTransfer, Speed: units.KMH(25),
			Trailer: vehicle.Trailer{Mass: units.Tonnes(6), RollingCoefficient: 0.02},
			Profile: []vehicle.Stretch{{Length: units.Metres(400), Grade: 0.04}, {Length: units.Metres(400), Grade: -0.04}}},
		{Name: "pump", Kind: vehicle.StationaryPTO, Duration: time.Minute, PTOPower: units.Kilowatts(40), PTOSpeed: vehicle.PTO540},
	}
	day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range day.Segments {
		if s.Err != nil {
			fmt.Printf("%-8s %v\n", s.Name, s.Err)
			continue
		}
		a := s.Audit
		fmt.Printf("%-8s %5.0f s  fuel %6.3f kg  drawbar %5.2f MJ  PTO %5.2f MJ  transmission loss %5.2f MJ\n",
			s.Name, a.Duration.Seconds(), a.Fuel.Kilograms(), a.Drawbar.Megajoules(), a.PTOWork.Megajoules(),
			(a.Hydrostatic + a.Mechanical + a.NoLoad).Megajoules())
	}
	fmt.Printf("day: %.2f L of fuel, audit closes: %v\n", day.Audit.Volume(engine.Fuel()).Litres(), day.Audit.RelativeResidual() < 1e-6)
	// Output:
	// start        5 s  fuel  0.011 kg  drawbar  0.00 MJ  PTO  0.00 MJ  transmission loss  0.02 MJ
	// disking    120 s  fuel  0.435 kg  drawbar  3.35 MJ  PTO  0.00 MJ  transmission loss  1.12 MJ
	// turn        15 s  fuel  0.030 kg  drawbar  0.00 MJ  PTO  0.00 MJ  transmission loss  0.04 MJ
	// road       115 s  fuel  0.264 kg  drawbar  0.00 MJ  PTO  0.00 MJ  transmission loss  0.85 MJ
	// pump        60 s  fuel  0.204 kg  drawbar  0.00 MJ  PTO  2.40 MJ  transmission loss  0.00 MJ
	// day: 1.13 L of fuel, audit closes: true
}

// The least-fuel strategy at one field operating point: an 8 km/h pass
// pulling 25 kN. The machine data are invented.
func ExampleLeastFuel() {
	engine, _ := vehicle.NewEngine(vehicle.EngineSpec{
		CurveSpeeds:  []units.AngularVelocity{units.RPM(800), units.RPM(1300), units.RPM(1800), units.RPM(2100), units.RPM(2300)},
		CurveTorques: []units.Torque{600, 900, 800, 690, 300},
		Rated:        units.RPM(2100),
	})
	mass := units.Tonnes(9)
	v, err := vehicle.New(vehicle.Spec{
		Mass: mass,
		Tyres: vehicle.SlipCurve{Weight: units.ForceFromMass(mass, units.Gravity), Radius: units.Metres(0.85),
			Rolling: 0.08, PeakTraction: 0.75, SlipRate: 10},
		Transmission: &vehicle.SplitEstimate{
			Spans:                []vehicle.SplitRange{{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5}},
			MechanicalEfficiency: 0.97, HydrostaticEfficiency: 0.8,
		},
		FinalDrive: 20,
		Engine:     engine,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(25)}
	for _, s := range []vehicle.Strategy{vehicle.LeastFuel{}, vehicle.FixedSpeed{Speed: units.RPM(2100)}} {
		p, err := s.Operate(v, d)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%-20T engine %4.0f rpm %4.0f N·m  slip %.3f  transmission %.3f  fuel %.2f kg/h\n",
			s, p.EngineSpeed.RPM(), float64(p.EngineTorque), p.Slip, p.TransmissionEfficiency(), p.FuelRate.KilogramsPerHour())
	}
	// Output:
	// vehicle.LeastFuel    engine 1044 rpm  747 N·m  slip 0.066  transmission 0.964  fuel 18.49 kg/h
	// vehicle.FixedSpeed   engine 2100 rpm  407 N·m  slip 0.066  transmission 0.878  fuel 28.61 kg/h
}

// From travel speed and pull to the transmission's output shaft and back,
// through a 20:1 final drive, 0.8 m rolling radius and 96 % efficiency.
func ExampleDriveline() {
	d := vehicle.Driveline{FinalDrive: 20, RollingRadius: units.Metres(0.8), Efficiency: 0.96}
	w := d.OutputSpeed(units.KMH(10), 0.08) // 8 % slip
	t := d.OutputTorque(units.Kilonewtons(40))
	fmt.Printf("output %.0f rpm, %.0f N·m\n", w.RPM(), float64(t))
	fmt.Printf("back: %.1f km/h, %.1f kN\n", d.TravelSpeed(w, 0.08).KMH(), d.Pull(t).Kilonewtons())
	// Output:
	// output 721 rpm, 1667 N·m
	// back: 10.0 km/h, 40.0 kN
}

// A rated limit crossed for part of a day, as the simulation reports it.
func ExampleFlag() {
	f := vehicle.Flag{Name: "hydrostat: pump pressure", Value: units.Of(units.Bar(290)), Limit: units.Of(units.Bar(150)),
		Time: 42 * time.Minute}
	fmt.Println(f)
	// Output:
	// hydrostat: pump pressure 290 bar above rated 150 bar for 42 min
}
