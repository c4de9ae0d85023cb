package design

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestSpectrumFuel: the demo day condensed into a spectrum burns the same
// fuel under the least-fuel strategy as the full simulated day, within
// 0.1 % (measured: see the log line).
func TestSpectrumFuel(t *testing.T) {
	if testing.Short() {
		t.Skip("simulates the whole day")
	}
	t.Parallel()
	f, err := Load("testdata/tractor.json")
	if err != nil {
		t.Fatal(err)
	}
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	cycle, err := f.Cycle()
	if err != nil {
		t.Fatal(err)
	}
	spec, err := Spectrum(cycle)
	if err != nil {
		t.Fatal(err)
	}
	e, _, err := SpectrumFuel(v, vehicle.LeastFuel{}, spec)
	if err != nil {
		t.Fatal(err)
	}
	calls, last, total := 0, 0, 0
	day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{Step: f.Step().Std(),
		Progress: func(done, n int) { calls, last, total = calls+1, done, n }})
	if err != nil {
		t.Fatal(err)
	}
	if calls == 0 || last != total || calls != total {
		t.Errorf("progress: %d calls, last %d of %d; want one call per step ending at the total", calls, last, total)
	}
	full := float64(day.Audit.FuelEnergy)
	rel := (float64(e) - full) / full
	t.Logf("spectrum of %d points: %.6g MJ; day: %.6g MJ; difference %.2e relative", len(spec), float64(e)/1e6, full/1e6, rel)
	const tol = 1e-3
	if math.Abs(rel) > tol {
		t.Errorf("spectrum fuel %v differs from the day's %v by %.3g relative, want within %g", e, day.Audit.FuelEnergy, rel, tol)
	}
}
