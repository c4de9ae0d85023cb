package vehicle_test

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/traction"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Demo data below is invented for the tests; it describes no real machine.

func demoEngineSpec() vehicle.EngineSpec {
	rpm := []float64{800, 1000, 1300, 1500, 1800, 2100, 2300}
	nm := []float64{600, 780, 900, 880, 800, 690, 300}
	s := vehicle.EngineSpec{Idle: units.RPM(800), Rated: units.RPM(2100)}
	for i := range rpm {
		s.CurveSpeeds = append(s.CurveSpeeds, units.RPM(rpm[i]))
		s.CurveTorques = append(s.CurveTorques, units.NewtonMetres(nm[i]))
	}
	return s
}

// demoMap is a Willans-line fuel map: fuel flow = friction share + indicated
// share, turned into SFC on a grid.
func demoMap() *vehicle.FuelMap {
	m := &vehicle.FuelMap{}
	for _, r := range []float64{700, 1000, 1300, 1600, 1900, 2200, 2400} {
		m.Speeds = append(m.Speeds, units.RPM(r))
	}
	for _, t := range []float64{50, 200, 400, 600, 800, 1000} {
		m.Torques = append(m.Torques, units.NewtonMetres(t))
	}
	for _, w := range m.Speeds {
		row := []units.SpecificFuelConsumption{}
		for _, t := range m.Torques {
			p := float64(units.PowerFromTorque(t, w))
			friction := 60 * float64(w) * (1 + float64(w)/400) // W
			fuel := (p + friction) / 0.42 / float64(vehicle.DieselHeatingValue)
			row = append(row, units.SpecificFuelConsumption(fuel/p))
		}
		m.SFC = append(m.SFC, row)
	}
	return m
}

func demoEngine(t testing.TB, withMap bool) *vehicle.Engine {
	t.Helper()
	s := demoEngineSpec()
	if withMap {
		s.Map = demoMap()
	}
	e, err := vehicle.NewEngine(s)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

func demoTransmission() *vehicle.SplitEstimate {
	return &vehicle.SplitEstimate{
		Spans: []vehicle.SplitRange{
			{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5},
			{MinRatio: 0.5, MaxRatio: 2.0, MechanicalPoint: 1.3},
		},
		MechanicalEfficiency:  0.97,
		HydrostaticEfficiency: 0.80,
		NoLoadLoss:            units.Kilowatts(1.5),
	}
}

func demoTyres(rolling float64) vehicle.SlipCurve {
	return vehicle.SlipCurve{
		Weight:       units.ForceFromMass(units.Tonnes(9), units.Gravity),
		Radius:       units.Metres(0.85),
		Rolling:      rolling,
		PeakTraction: 0.85,
		SlipRate:     12,
	}
}

func demoVehicle(t testing.TB, withMap bool) *vehicle.Vehicle {
	t.Helper()
	v, err := vehicle.New(vehicle.Spec{
		Mass:         units.Tonnes(9),
		RotatingMass: units.Kilograms(400),
		DragArea:     units.SquareMetres(4),
		Tyres:        demoTyres(0.02),
		Transmission: demoTransmission(),
		FinalDrive:   20,
		Engine:       demoEngine(t, withMap),
		PTO:          vehicle.PTO{Ratios: []float64{3.5, 1.9}, MaxPower: units.Kilowatts(130)},
	})
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func demoCycle() []vehicle.Segment {
	field := demoTyres(0.08)
	return []vehicle.Segment{
		{Name: "start", Kind: vehicle.Accelerate, Speed: units.KMH(8), Acceleration: 0.5, Ground: field},
		{Name: "chisel pass", Kind: vehicle.FieldPass, Speed: units.KMH(8), Distance: units.Metres(400), Ground: field,
			Implement: &vehicle.Implement{Row: vehicle.ChiselPlough, Width: 11, Depth: units.Centimetres(20), Texture: vehicle.Medium}},
		{Name: "turn", Kind: vehicle.HeadlandTurn, Speed: units.KMH(6), Duration: 20e9, Ground: field},
		{Name: "road", Kind: vehicle.RoadTransfer, Speed: units.KMH(30),
			Trailer: vehicle.Trailer{Mass: units.Tonnes(8), RollingCoefficient: 0.02},
			Profile: []vehicle.Stretch{{Length: units.Metres(500), Grade: 0.03}, {Length: units.Metres(500), Grade: -0.04}}},
		{Name: "pto", Kind: vehicle.StationaryPTO, Duration: 120e9, PTOPower: units.Kilowatts(60), PTOSpeed: vehicle.PTO1000},
	}
}

func TestDemoCycle(t *testing.T) {
	t.Parallel()
	for _, withMap := range []bool{false, true} {
		v := demoVehicle(t, withMap)
		for _, s := range []vehicle.Strategy{vehicle.LeastFuel{}, vehicle.FixedSpeed{Speed: units.RPM(1900)}} {
			day, err := vehicle.Simulate(v, s, demoCycle(), vehicle.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if err := day.Err(); err != nil {
				t.Fatalf("map %v %T: %v", withMap, s, err)
			}
			if r := day.Audit.RelativeResidual(); r > 1e-9 {
				t.Errorf("map %v %T: day audit residual %g", withMap, s, r)
			}
			for _, sg := range day.Segments {
				if r := sg.Audit.RelativeResidual(); r > 1e-9 {
					t.Errorf("map %v %T: segment %s residual %g", withMap, s, sg.Name, r)
				}
				checkMechanicalLine(t, sg.Name, sg.Audit)
			}
			checkMechanicalLine(t, "day", day.Audit)
			t.Logf("map %v %T: fuel %.3f kg, %+v", withMap, s, day.Audit.Fuel.Kilograms(), day.Audit)
		}
	}
}

// checkMechanicalLine compares the audit's residual mechanical line with the
// same loss summed element by element from each element's own model (the
// transmission's mechanical losses and the final drive's efficiency). The
// residual line also absorbs the transmission's closure rounding, so the two
// agree to the solvers' balance tolerance, not exactly: 1e-6 of the engine's
// work, the tolerance vehicle.At accepts for a transmission's balance.
func checkMechanicalLine(t *testing.T, name string, a vehicle.Audit) {
	t.Helper()
	gap := math.Abs(float64(a.Mechanical - a.MechanicalByElement))
	if gap > 1e-6*math.Abs(float64(a.EngineWork)) {
		t.Errorf("%s: mechanical loss %v by closure, %v by element (gap %.3g J)", name, a.Mechanical, a.MechanicalByElement, gap)
	}
	if a.Distance > 0 && !(a.MechanicalByElement > 0) {
		t.Errorf("%s: moved %v with mechanical loss %v by element", name, a.Distance, a.MechanicalByElement)
	}
}

func demoTraction(t testing.TB) vehicle.Tyres {
	t.Helper()
	tyre := traction.Tyre{Diameter: units.Metres(1.8), Width: units.Metres(0.6), SectionHeight: units.Metres(0.5),
		RollingRadius: units.Metres(0.85), Deflection: units.Metres(0.06)}
	front := traction.Tyre{Diameter: units.Metres(1.4), Width: units.Metres(0.5), SectionHeight: units.Metres(0.4),
		RollingRadius: units.Metres(0.66), Deflection: units.Metres(0.05)}
	return vehicle.Tyres{
		Vehicle: traction.Vehicle{Mass: units.Tonnes(9), Wheelbase: units.Metres(2.9), CentreOfMass: units.Metres(1.2),
			Hitch: traction.Hitch{Height: units.Metres(0.5), Behind: units.Metres(1)},
			Front: traction.Axle{Tyre: front, Wheels: 2}, Rear: traction.Axle{Tyre: tyre, Wheels: 2}},
		Model:      traction.Brixius{},
		Surface:    traction.FirmSoil(),
		FrontDrive: true,
		Lead:       0.02,
	}
}
