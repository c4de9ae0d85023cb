package vehicle_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestErrorTexts pins the text of the vehicle's common errors: values in
// the trade's units, engine limits with their engine speed.
func TestErrorTexts(t *testing.T) {
	t.Parallel()
	e := demoEngine(t, true)
	_, overTorque := e.FuelRate(units.RPM(1400), 950)
	_, overSpeed := e.MaxTorque(units.RPM(2500))
	_, badEngine := vehicle.NewEngine(vehicle.EngineSpec{Idle: units.RPM(800), Rated: units.RPM(2100),
		CurveSpeeds: []units.AngularVelocity{units.RPM(-800), units.RPM(2100)}, CurveTorques: []units.Torque{600, 700}})
	for _, c := range []struct {
		name string
		err  error
		want string
	}{
		// The demo curve: 890 N·m at 1400 rpm, halfway between 900 and 880.
		{"engine torque", overTorque,
			"vehicle: beyond the engine's limits: engine torque 950 N·m above full-load torque 890 N·m at 1400 rpm"},
		{"engine speed", overSpeed,
			"vehicle: beyond the engine's limits: engine speed 2500 rpm above highest speed of the full-load curve 2300 rpm"},
		{"negative curve speed", badEngine,
			"vehicle: invalid input: EngineSpec.CurveSpeeds = -800 rpm must be finite and positive"},
	} {
		if c.err == nil {
			t.Errorf("%s: no error, want %q", c.name, c.want)
			continue
		}
		if got := c.err.Error(); got != c.want {
			t.Errorf("%s:\n got %q\nwant %q", c.name, got, c.want)
		}
	}
}
