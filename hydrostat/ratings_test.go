package hydrostat

import (
	"errors"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// TestReliefAboveUnits: a relief setting above what the units can take is
// refused with both values: the lowest peak pressure, or a unit's rated
// pressure where it gives no peak. Before, 4500 bar with units rated 480
// bar peak was accepted.
func TestReliefAboveUnits(t *testing.T) {
	t.Parallel()
	pump := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3200),
		RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: demoWilson})
	motor := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000),
		RatedPressure: units.Bar(400), PeakPressure: units.Bar(460), Loss: demoWilson})
	ratedOnly := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000),
		RatedPressure: units.Bar(350), Loss: demoWilson})
	unrated := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), Loss: demoWilson})
	spec := func(relief float64, m Unit) LoopSpec {
		return LoopSpec{Pump: pump, Motors: []Unit{m}, Oil: VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(relief)}
	}
	for _, c := range []struct {
		s    LoopSpec
		want string // "" means accepted
	}{
		{spec(4500, motor), "hydrostat: invalid input: relief setting 4500 bar above peak pressure 460 bar of motor 1: the units cannot take the pressure the relief allows"},
		{spec(460, motor), ""},
		{spec(400, ratedOnly), "hydrostat: invalid input: relief setting 400 bar above rated pressure 350 bar of motor 1: the units cannot take the pressure the relief allows"},
		{spec(480, unrated), ""},
		{spec(490, unrated), "hydrostat: invalid input: relief setting 490 bar above peak pressure 480 bar of the pump: the units cannot take the pressure the relief allows"},
	} {
		_, err := NewLoop(c.s)
		switch {
		case c.want == "" && err != nil:
			t.Errorf("relief %v: %v, want accepted", c.s.Relief, err)
		case c.want != "" && (err == nil || err.Error() != c.want || !errors.Is(err, ErrInvalid)):
			t.Errorf("relief %v: %v, want %q", c.s.Relief, err, c.want)
		}
	}
	// Strict refuses the unit with no ratings, and accepts rated units.
	s := spec(450, unrated)
	s.Strict = true
	if _, err := NewLoop(s); !errors.Is(err, ErrInvalid) {
		t.Errorf("strict loop with an unrated motor: %v, want ErrInvalid", err)
	}
	s = spec(450, motor)
	s.Strict = true
	if _, err := NewLoop(s); err != nil {
		t.Errorf("strict loop with rated units: %v", err)
	}
}
