package vehicle_test

import (
	"testing"
	"time"

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

// TestUnratedFlags: the unit limits a layout leaves unrated come with
// every drive point as flags that say they were not checked. Before, a
// zero MaxSpeed turned the check off with no trace.
func TestUnratedFlags(t *testing.T) {
	t.Parallel()
	drive, err := vehicle.FromLayout(demoLayout(t)) // units with no maximum speed
	if err != nil {
		t.Fatal(err)
	}
	dp, err := drive.Operate(0, units.RPM(1800), units.RPM(900), units.NewtonMetres(300))
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, f := range dp.Flags {
		if f.Unchecked {
			got = append(got, f.String())
		}
	}
	want := []string{"hydrostat: pump speed: maximum speed not rated, not checked",
		"hydrostat: motor 1 speed: maximum speed not rated, not checked"}
	if len(got) != len(want) || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("unchecked flags %q, want %q", got, want)
	}
	f := vehicle.Flag{Name: "front tyre load", Unchecked: true, Time: 3 * time.Minute}
	if s := f.String(); s != "front tyre load: not rated, not checked for 3 min" {
		t.Errorf("Flag.String() = %q", s)
	}
}

// TestExtrapolatedFlagText: a traction model outside its fitted range is a
// flag that says so.
func TestExtrapolatedFlagText(t *testing.T) {
	t.Parallel()
	f := vehicle.Flag{Name: "traction model outside its fitted range: front tyres: b/d 0.55 outside 0.2–0.4", Extrapolated: true, Time: 2 * time.Minute}
	want := "traction model outside its fitted range: front tyres: b/d 0.55 outside 0.2–0.4 (the pull is extrapolated) for 2 min"
	if s := f.String(); s != want {
		t.Errorf("Flag.String() = %q, want %q", s, want)
	}
}

// TestUnratedInputTorqueFlag: a split estimate without an input torque
// rating says at every point that the input torque is not checked; with a
// rating it does not.
func TestUnratedInputTorqueFlag(t *testing.T) {
	t.Parallel()
	tr := demoTransmission()
	dp, err := tr.Operate(0, units.RPM(1800), units.RPM(600), units.NewtonMetres(500))
	if err != nil {
		t.Fatal(err)
	}
	if len(dp.Flags) != 1 || !dp.Flags[0].Unchecked || dp.Flags[0].String() != "transmission input torque: rated input torque not given, not checked" {
		t.Errorf("flags %v, want the input torque not checked", dp.Flags)
	}
	tr.MaxInputTorque = units.NewtonMetres(5000)
	if dp, err = tr.Operate(0, units.RPM(1800), units.RPM(600), units.NewtonMetres(500)); err != nil || len(dp.Flags) != 0 {
		t.Errorf("rated: flags %v, %v", dp.Flags, err)
	}
}
