package vehicle_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

func TestDriveline(t *testing.T) {
	t.Parallel()
	d := vehicle.Driveline{FinalDrive: 20, RollingRadius: units.Metres(0.8), Efficiency: 0.96}
	if err := d.Validate(); err != nil {
		t.Fatal(err)
	}
	// Hand calculation: 10 km/h = 2.7778 m/s; at 10 % slip the wheel turns
	// at 2.7778/(0.8·0.9) = 3.858 rad/s, the output 20 times faster.
	w := d.OutputSpeed(units.KMH(10), 0.1)
	if !testutil.Close(float64(w), 20*(10/3.6)/(0.8*0.9), 1e-12, 0) {
		t.Errorf("OutputSpeed(10 km/h, 0.1) = %v", w)
	}
	if v := d.TravelSpeed(w, 0.1); !testutil.Close(v.KMH(), 10, 1e-12, 0) {
		t.Errorf("TravelSpeed(OutputSpeed(10 km/h)) = %v", v)
	}
	// Hand calculation: 40 kN at 0.8 m is 32 kN·m at the wheels, 32000/(20·0.96)
	// = 1666.7 N·m at the output.
	tq := d.OutputTorque(units.Kilonewtons(40))
	if !testutil.Close(float64(tq), 32000/(20*0.96), 1e-12, 0) {
		t.Errorf("OutputTorque(40 kN) = %v", tq)
	}
	if f := d.Pull(tq); !testutil.Close(f.Kilonewtons(), 40, 1e-12, 0) {
		t.Errorf("Pull(OutputTorque(40 kN)) = %v", f)
	}
	if err := (vehicle.Driveline{FinalDrive: 20}).Validate(); err == nil {
		t.Error("Validate accepts a zero rolling radius")
	}
}
