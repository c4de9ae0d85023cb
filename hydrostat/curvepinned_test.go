package hydrostat

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/units"
)

// TestCurvePinnedMatchesAt: a loop of two or three motors under the Pinned
// schedule, some motors held at drawn settings (read when the Curve is
// prepared), seen as a Curve gives the settings, unit torques, loop state,
// leakage and limit of Loop.At (the schedule's bracketed search) to
// rounding, each held motor at its setting; the slopes match central
// differences of At away from the kinks. A point the Curve solves At
// solves too, or finds at the same setting limit.
func TestCurvePinnedMatchesAt(t *testing.T) {
	drawn, checked, held, limited, slopes := 0, 0, 0, 0, 0
	defer func() {
		t.Logf("%d drawn, %d checked (%d with a motor held, %d at a setting limit), %d slopes", drawn, checked, held, limited, slopes)
		if checked < drawn/3 || held < drawn/5 || slopes < drawn/10 {
			t.Error("too few points checked")
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		drawn++
		m := drawWilsonBase(t)
		m.Compressibility = rapid.Bool().Draw(t, "compressibility")
		m.DeadVolume = rapid.Float64Range(0, 1).Draw(t, "dead volume")
		m.LeakageSetting = rapid.Float64Range(0, 1).Draw(t, "leakage share")
		m.TorqueSetting = rapid.SampledFrom([]float64{0, 0, 0.5, 1}).Draw(t, "torque share")
		unit := func(cc float64) Unit {
			u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(cc), Loss: m})
			if err != nil {
				t.Fatal(err)
			}
			return u
		}
		nm := rapid.IntRange(2, 3).Draw(t, "motors")
		motors := make([]Unit, nm)
		hold := make([]float64, nm)
		for i := range motors {
			motors[i] = unit(rapid.Float64Range(40, 160).Draw(t, "motor cc"))
			hold[i] = math.NaN()
			if rapid.Bool().Draw(t, "held") {
				hold[i] = rapid.SampledFrom([]float64{0, 0.3, 1, -0.5, rapid.Float64Range(-1, 1).Draw(t, "held setting")}).Draw(t, "hold")
			}
		}
		base, err := NewLoop(LoopSpec{Pump: unit(rapid.Float64Range(40, 160).Draw(t, "pump cc")), Motors: motors, Oil: VG46,
			Temperature: units.Celsius(rapid.Float64Range(30, 90).Draw(t, "oil °C")), Charge: units.Bar(20), Relief: units.Bar(450)})
		if err != nil {
			t.Fatal(err)
		}
		// The schedule reads Held at every call, as a layout solver's
		// shared buffer is read: the Curve takes the settings held when
		// it is prepared.
		buf := make([]float64, nm)
		l, err := base.WithSchedule(Pinned{Held: buf, MinMotorSetting: math.Max(0, base.MinMotorSetting())})
		if err != nil {
			t.Fatal(err)
		}
		copy(buf, hold)
		wp := units.RPM(rapid.Float64Range(-2500, 2500).Draw(t, "pump rpm"))
		wms := make([]units.AngularVelocity, nm)
		for i := range wms {
			wms[i] = units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "motor rpm"))
		}
		dp := units.Bar(rapid.Float64Range(-400, 400).Draw(t, "Δp bar"))
		var c Curve
		if !l.Curve(wp, wms, &c) {
			t.Fatal("a Pinned loop of Wilson units is no Curve")
		}
		set := make([]float64, nm+1)
		tq := make([]units.Torque, nm+1)
		sl := make([]units.Displacement, nm+1)
		var st LoopState
		errAt := l.At(wp, wms, dp, &st)
		if !c.Torques(dp, set, tq, sl) {
			// A limit the general path names, a pump near standstill or a
			// balance not monotone in the pump setting: the checked share
			// above says this stays the exception.
			return
		}
		checked++
		anyHeld := false
		for k, x := range hold {
			if !math.IsNaN(x) {
				anyHeld = true
				if set[k+1] != x {
					t.Fatalf("motor %d held at %v: Curve's setting %v", k, x, set[k+1])
				}
			}
		}
		if anyHeld {
			held++
		}
		if errAt != nil && !errors.Is(errAt, ErrSettingLimit) {
			t.Fatalf("the Curve solves what At refuses: %v", errAt)
		}
		matchUnits(t, set, tq, &st, 1e-12, 1e-11)
		var fs LoopState
		ef := c.Fill(dp, set, &fs)
		if (ef == nil) != (errAt == nil) || math.Abs(float64(fs.Loss-st.Loss)) > 1e-11*(math.Abs(float64(st.Input))+math.Abs(float64(st.Loss))+1) {
			t.Fatalf("Fill: %v, loss %v; At: %v, loss %v", ef, fs.Loss, errAt, st.Loss)
		}
		matchLimit(t, &fs, &st)
		if st.Limit.Err == ErrSettingLimit {
			limited++
		}
		q, qs, okq := c.Leakage(dp)
		if !okq || math.Abs(float64(q-st.ChargeFlow)) > 1e-11*(float64(st.ChargeFlow)+math.Abs(float64(st.Pump.IdealFlow)))+1e-300 {
			t.Fatalf("Leakage %v (%v), At's charge flow %v", q, okq, st.ChargeFlow)
		}
		// The slopes against central differences of At, away from the
		// kinks at Δp = 0 and at the switch of the schedule's branch.
		h := 1e-6 * math.Abs(float64(dp))
		var lo, hi LoopState
		free := -1
		for k, x := range hold {
			if math.IsNaN(x) {
				free = k
				break
			}
		}
		branch := func(s *LoopState) bool { return free < 0 || s.Settings[free+1] == 1 }
		if errAt != nil || l.At(wp, wms, dp-units.Pressure(h), &lo) != nil || l.At(wp, wms, dp+units.Pressure(h), &hi) != nil ||
			math.Abs(float64(dp)) < 1e3 || branch(&lo) != branch(&hi) {
			return
		}
		slopes++
		matchSlopes(t, qs, sl, &lo, &hi, h, l.spec.Pump.dmax)
	})
}
