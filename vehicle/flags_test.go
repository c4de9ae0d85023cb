package vehicle

import (
	"testing"
	"time"

	"github.com/powersplit-dev/powersplit/units"
)

func TestFlagText(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f    Flag
		want string
	}{
		{Flag{Name: "hydrostat: pump pressure", Value: units.Of(units.Bar(290)), Limit: units.Of(units.Bar(150)), Time: 42 * time.Minute},
			"hydrostat: pump pressure 290 bar above rated 150 bar for 42 min"},
		{Flag{Name: FlagTyreOverload, Value: units.Of(units.Newtons(31500)), Limit: units.Of(units.Newtons(30000)), Time: 12 * time.Second},
			"tyre load 31.5 kN above rated 30 kN for 12 s"},
		{Flag{Name: "hydrostat: motor speed", Value: units.Of(units.RPM(4620)), Limit: units.Of(units.RPM(4500))},
			"hydrostat: motor speed 4620 rpm above rated 4500 rpm"},
	} {
		if got := c.f.String(); got != c.want {
			t.Errorf("Flag.String() = %q, want %q", got, c.want)
		}
	}
}

// TestAddFlags checks that merged flags keep one entry per name, the
// largest value and the summed time.
func TestAddFlags(t *testing.T) {
	t.Parallel()
	p := Flag{Name: "p", Value: units.Plain(2), Limit: units.Plain(1)}
	q := Flag{Name: "q", Value: units.Plain(5), Limit: units.Plain(4)}
	var acc []Flag
	acc = addFlags(acc, []Flag{p}, time.Second)
	p.Value = units.Plain(3)
	acc = addFlags(acc, []Flag{p, q}, 2*time.Second)
	if len(acc) != 2 || acc[0].Value.SI != 3 || acc[0].Time != 3*time.Second || acc[1].Time != 2*time.Second {
		t.Errorf("addFlags = %+v", acc)
	}
	d := Day{Segments: []SegmentResult{{Flags: acc}, {Flags: []Flag{{Name: "p", Value: units.Plain(2.5), Time: time.Minute}}}}}
	if got := d.Flags(); len(got) != 2 || got[0].Time != time.Minute+3*time.Second || got[0].Value.SI != 3 {
		t.Errorf("Day.Flags() = %+v", got)
	}
}
