package vehicle_test

import (
	"testing"

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

func BenchmarkLayoutAt(b *testing.B) {
	drive, err := vehicle.FromLayout(demoLayout(b))
	if err != nil {
		b.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: drive,
		FinalDrive: 20, Engine: demoEngine(b, true)})
	if err != nil {
		b.Fatal(err)
	}
	d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(15)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.At(d, units.RPM(1500), 0); err != nil {
			b.Fatal(err)
		}
	}
}
