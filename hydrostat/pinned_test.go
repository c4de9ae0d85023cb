package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// TestPinned checks the Pinned schedule: a held motor keeps its setting,
// flow continuity holds, and with no motor held it gives the Sequential
// settings.
func TestPinned(t *testing.T) {
	t.Parallel()
	mk := func(cc float64) Unit {
		u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(cc), Loss: Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01}})
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	l, err := NewLoop(LoopSpec{Pump: mk(100), Motors: []Unit{mk(80), mk(60)}, Oil: VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		t.Fatal(err)
	}
	held := []float64{math.NaN(), 0.4}
	pl, err := l.WithSchedule(Pinned{Held: held})
	if err != nil {
		t.Fatal(err)
	}
	var st, seq LoopState
	for _, c := range []struct{ wp, w1, w2 float64 }{{2000, 500, 600}, {2000, 2600, 3000}, {1500, -300, 200}} {
		wm := []units.AngularVelocity{units.RPM(c.w1), units.RPM(c.w2)}
		for _, x := range []float64{math.NaN(), 0.4, -0.3} {
			held[1] = x
			if err := pl.At(units.RPM(c.wp), wm, units.Bar(150), &st); err != nil && !errors.Is(err, ErrSettingLimit) {
				t.Fatalf("%v held %v: %v", c, x, err)
			} else if err != nil {
				continue
			}
			if !math.IsNaN(x) && st.Settings[2] != x {
				t.Errorf("%v: held setting %v, want %v", c, st.Settings[2], x)
			}
			q := float64(st.Pump.Flow - st.Motors[0].Flow - st.Motors[1].Flow)
			if math.Abs(q) > 1e-9*math.Abs(float64(st.Pump.Flow))+1e-15 {
				t.Errorf("%v held %v: flow residual %v", c, x, q)
			}
			if math.IsNaN(x) {
				if err := l.At(units.RPM(c.wp), wm, units.Bar(150), &seq); err != nil {
					t.Fatal(err)
				}
				for i := range seq.Settings {
					if math.Abs(seq.Settings[i]-st.Settings[i]) > 1e-9 {
						t.Errorf("%v: nothing held: settings %v, Sequential %v", c, st.Settings, seq.Settings)
					}
				}
			}
		}
	}
	if _, err := l.WithSchedule(Pinned{Held: []float64{2, math.NaN()}}); !errors.Is(err, ErrInvalid) {
		t.Errorf("held setting 2: err = %v, want ErrInvalid", err)
	}
	if got := pl.MinMotorSetting(); got != 0.2 {
		t.Errorf("MinMotorSetting = %v, want the default 0.2", got)
	}
}
