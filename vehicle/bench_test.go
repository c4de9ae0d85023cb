package vehicle_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/internal/solvepath"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

func BenchmarkAt(b *testing.B) {
	v := demoVehicle(b, true)
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(25)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.At(d, units.RPM(1500), 0); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkLeastFuel(b *testing.B) {
	v := demoVehicle(b, true)
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(25)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (vehicle.LeastFuel{}).Operate(v, d); err != nil {
			b.Fatal(err)
		}
	}
}

// layoutVehicle is the 9 t benchmark vehicle with the demo layout solved
// point by point (LayoutDrive).
func layoutVehicle(b *testing.B) *vehicle.Vehicle {
	drive, err := vehicle.FromLayout(demoLayout(b))
	if err != nil {
		b.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: drive,
		FinalDrive: 20, Engine: demoEngine(b, true)})
	if err != nil {
		b.Fatal(err)
	}
	return v
}

func BenchmarkLayoutAt(b *testing.B) {
	v := layoutVehicle(b)
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(15)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.At(d, units.RPM(1500), 0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLeastFuelLayout is one least-fuel search with the transmission
// solved point by point by the root package's solver (LayoutDrive): each
// engine speed and range it asks for solved once, the tyres once.
func BenchmarkLeastFuelLayout(b *testing.B) {
	v := layoutVehicle(b)
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(15)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (vehicle.LeastFuel{}).Operate(v, d); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkShortCycle simulates the tests' short duty cycle (a start to
// 8 km/h, a 400 m field pass, a 20 s headland turn, 1 km of road with a
// trailer over a hill and 2 min of stationary PTO work: 7.4 min of work in
// 445 one-second steps) with the least-fuel strategy. A step that repeats
// the demand before it is answered from memory (Simulate), so the cycle
// costs the searches of its distinct demands: the acceleration's steps and
// one per steady stretch.
func BenchmarkShortCycle(b *testing.B) {
	v := demoVehicle(b, true)
	benchDay(b, v)
}

// benchDay simulates the short cycle with v and the least-fuel strategy,
// once per benchmark iteration.
func benchDay(b *testing.B, v *vehicle.Vehicle) {
	cycle := demoCycle()
	b.ReportAllocs()
	for b.Loop() {
		day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{})
		if err != nil {
			b.Fatal(err)
		}
		if err := day.Err(); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkShortCycleLayout simulates the short cycle with the transmission
// solved point by point by the root package's solver (an output-coupled
// split through LayoutDrive) with the least-fuel strategy, which solves
// the split at many engine speeds per step.
//
// "general" is the same cycle with the layout solved on the general path
// only (the solver before its compiled path), for the comparison.
func BenchmarkShortCycleLayout(b *testing.B) {
	for _, general := range []bool{false, true} {
		name := "compiled"
		if general {
			name = "general"
		}
		b.Run(name, func(b *testing.B) {
			solvepath.General.Store(general)
			defer solvepath.General.Store(false)
			drive, err := vehicle.FromLayout(demoLayout(b))
			if err != nil {
				b.Fatal(err)
			}
			v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: drive,
				FinalDrive: 20, Engine: demoEngine(b, true),
				PTO: vehicle.PTO{Ratios: []float64{3.5, 1.9}, MaxPower: units.Kilowatts(130)}})
			if err != nil {
				b.Fatal(err)
			}
			benchDay(b, v)
		})
	}
}

// TestLayoutDriveAllocatesNothing: the adapter reuses its State, so an
// operating point solved through it allocates nothing once the drive has
// solved one point (points with flagged ratings excepted: their flags are
// new strings).
func TestLayoutDriveAllocatesNothing(t *testing.T) {
	drive, err := vehicle.FromLayout(demoLayout(t))
	if err != nil {
		t.Fatal(err)
	}
	op := func() {
		if _, err := drive.Operate(0, units.RPM(1800), units.RPM(900), units.NewtonMetres(400)); err != nil {
			t.Fatal(err)
		}
	}
	op()
	if n := testing.AllocsPerRun(50, op); n != 0 {
		t.Errorf("LayoutDrive.Operate allocates %v times per point", n)
	}
}
