package units_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// TestMeasure: a Measure prints as its typed quantity does, in the trade's
// display unit, and reads back as that quantity.
func TestMeasure(t *testing.T) { // not parallel: AllocsPerRun
	for _, c := range []struct {
		m    units.Measure
		want string
		kind string
	}{
		{units.Of(units.Bar(2560)), "2560 bar", "pressure"},
		{units.Of(units.RPM(2100)), "2100 rpm", "angular velocity"},
		{units.Of(units.CCPerRev(-75)), "-75 cm³/rev", "displacement"},
		{units.Of(units.Kilowatts(160)), "160 kW", "power"},
		{units.Of(units.Kilonewtons(44.6)), "44.6 kN", "force"},
		{units.Of(units.Celsius(60)), "60 °C", "temperature"},
		{units.Of(0.95), "0.95", "number"},
		{units.Plain(-0.125), "-0.125", "number"},
		{units.Measure{SI: 1, Kind: 200}, "1", "Kind(200)"},
	} {
		if got := c.m.String(); got != c.want {
			t.Errorf("%#v.String() = %q, want %q", c.m, got, c.want)
		}
		if got := c.m.Kind.String(); got != c.kind {
			t.Errorf("%#v.Kind.String() = %q, want %q", c.m, got, c.kind)
		}
	}
	if p, ok := units.As[units.Pressure](units.Of(units.Bar(450))); !ok || p != units.Bar(450) {
		t.Errorf("As[Pressure] = %v, %v", p, ok)
	}
	if _, ok := units.As[units.Torque](units.Of(units.Bar(450))); ok {
		t.Error("As[Torque] of a pressure reports ok")
	}
	if d := units.Of(units.Bar(450)).Sub(units.Of(units.Bar(460))); d != units.Of(units.Bar(-10)) || d.Abs() != units.Of(units.Bar(10)) {
		t.Errorf("Sub, Abs = %v, %v", d, d.Abs())
	}
	// Append does not allocate into a buffer with room: maps format the
	// reason of every infeasible cell.
	buf := make([]byte, 0, 64)
	m := units.Of(units.Bar(2560))
	if a := testing.AllocsPerRun(100, func() { buf = m.Append(buf[:0]) }); a != 0 {
		t.Errorf("Append allocates %v times", a)
	}
}

// TestOfEveryKind: Of gives every quantity type its own kind, named after
// its quantity.
func TestOfEveryKind(t *testing.T) {
	t.Parallel()
	kinds := []units.Measure{
		units.Of(units.Angle(1)), units.Of(units.AngularVelocity(1)), units.Of(units.Torque(1)), units.Of(units.Power(1)),
		units.Of(units.Energy(1)), units.Of(units.Pressure(1)), units.Of(units.Displacement(1)), units.Of(units.VolumeFlow(1)),
		units.Of(units.Volume(1)), units.Of(units.Speed(1)), units.Of(units.Acceleration(1)), units.Of(units.Force(1)),
		units.Of(units.Mass(1)), units.Of(units.Length(1)), units.Of(units.Area(1)), units.Of(units.Density(1)),
		units.Of(units.DynamicViscosity(1)), units.Of(units.KinematicViscosity(1)), units.Of(units.Temperature(1)),
		units.Of(units.TemperatureDifference(1)), units.Of(units.MassFlow(1)), units.Of(units.SpecificFuelConsumption(1)),
	}
	seen := map[units.Kind]bool{}
	for _, m := range kinds {
		if m.Kind == units.Number || seen[m.Kind] || m.Kind.String() == "number" {
			t.Errorf("kind %v repeated or unnamed", m.Kind)
		}
		seen[m.Kind] = true
	}
}
