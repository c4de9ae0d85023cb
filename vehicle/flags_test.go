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
		{Flag{Name: "hydrostat: pump rated pressure", Value: float64(units.Bar(290)), Limit: float64(units.Bar(150)), Unit: "Pa", Time: 42 * time.Minute},
			"hydrostat: pump rated pressure 290 bar above rated 150 bar for 42 min"},
		{Flag{Name: FlagTyreOverload, Value: 31500, Limit: 30000, Unit: "N", Time: 12 * time.Second},
			"tyre load 31.5 kN above rated 30 kN for 12 s"},
		{Flag{Name: "hydrostat: motor speed", Value: float64(units.RPM(4620)), Limit: float64(units.RPM(4500)), Unit: "rad/s"},
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
	p := Flag{Name: "p", Value: 2, Limit: 1, Unit: "Pa"}
	q := Flag{Name: "q", Value: 5, Limit: 4, Unit: "N"}
	var acc []Flag
	acc = addFlags(acc, []Flag{p}, time.Second)
	p.Value = 3
	acc = addFlags(acc, []Flag{p, q}, 2*time.Second)
	if len(acc) != 2 || acc[0].Value != 3 || acc[0].Time != 3*time.Second || acc[1].Time != 2*time.Second {
		t.Errorf("addFlags = %+v", acc)
	}
	d := Day{Segments: []SegmentResult{{Flags: acc}, {Flags: []Flag{{Name: "p", Value: 2.5, Time: time.Minute}}}}}
	if got := d.Flags(); len(got) != 2 || got[0].Time != time.Minute+3*time.Second || got[0].Value != 3 {
		t.Errorf("Day.Flags() = %+v", got)
	}
}
