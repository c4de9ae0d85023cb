package design

import (
	"errors"
	"math"
	"testing"
	"time"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestSpectrumFuelSums: the fuel over a spectrum is each point's fuel rate
// times its time, summed (a short spectrum of two points, checked against
// the points solved one by one), and a point the vehicle cannot run is
// reported by name.
func TestSpectrumFuelSums(t *testing.T) {
	t.Parallel()
	f, err := Load("testdata/tractor.json")
	if err != nil {
		t.Fatal(err)
	}
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	s := vehicle.FixedSpeed{Speed: units.RPM(1900)}
	spec := []SpectrumPoint{
		{Name: "field", Demand: vehicle.Demand{Speed: units.KMH(7), Draft: units.Kilonewtons(20)}, Time: 30 * time.Minute},
		{Name: "road", Demand: vehicle.Demand{Speed: units.KMH(25)}, Time: 10 * time.Minute},
	}
	e, m, err := SpectrumFuel(v, s, spec)
	if err != nil {
		t.Fatal(err)
	}
	var we, wm float64
	for _, p := range spec {
		pt, err := s.Operate(v, p.Demand)
		if err != nil {
			t.Fatal(err)
		}
		we += float64(pt.Flows.Fuel) * p.Time.Seconds()
		wm += float64(pt.FuelRate) * p.Time.Seconds()
	}
	if math.Abs(float64(e)-we) > 1e-12*we || math.Abs(float64(m)-wm) > 1e-12*wm || !(m > 0) {
		t.Errorf("SpectrumFuel = %v, %v; want %g J, %g kg", e, m, we, wm)
	}
	spec = append(spec, SpectrumPoint{Name: "too steep", Demand: vehicle.Demand{Speed: units.KMH(20), Draft: units.Kilonewtons(500)}, Time: time.Minute})
	if _, _, err := SpectrumFuel(v, s, spec); err == nil || !errors.Is(err, vehicle.ErrInfeasible) && !errors.Is(err, vehicle.ErrTraction) && !errors.Is(err, vehicle.ErrEngineLimit) && !errors.Is(err, vehicle.ErrTransmission) {
		t.Errorf("an impossible point: error %v", err)
	} else if got := err.Error(); len(got) < 9 || got[:9] != "too steep" {
		t.Errorf("error %q does not start with the point's name", got)
	}
}
