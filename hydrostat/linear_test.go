package hydrostat

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// opaque hides a Wilson model behind a type the closed-form settings do not
// know, so the schedules take the bracketed search.
type opaque struct{ w Wilson }

func (o opaque) Losses(c Condition) (Losses, error) { return o.w.Losses(c) }

// TestPropertyClosedFormSettings: where the leakage is affine in the
// setting, the schedules place the settings in closed form; the result is
// the same, to rounding, as Brent's method on the flow balance, and so is
// the outcome (error or not, and which error).
//
// Draws: one in ten has the pump stopped and one in four random motor speeds
// (mostly outside the loop's range: they test that both ways fail alike);
// the rest put the motors at speeds the loop reaches with some setting.
// At least 70 % of all draws must reach the settings comparison (about 97 %
// do).
func TestPropertyClosedFormSettings(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.7)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		w := Wilson{
			Slip:            rapid.Float64Range(0, 5e-9).Draw(t, "slip"),
			Viscous:         rapid.Float64Range(0, 4e5).Draw(t, "viscous"),
			Friction:        rapid.Float64Range(0, 0.03).Draw(t, "friction"),
			Compressibility: rapid.Bool().Draw(t, "compressibility"),
			DeadVolume:      rapid.Float64Range(0, 1).Draw(t, "dead volume"),
			LeakageSetting:  rapid.Float64Range(0, 1).Draw(t, "leakage setting share"),
		}
		if rapid.Bool().Draw(t, "lossless") {
			w = Wilson{}
		}
		motors := rapid.IntRange(1, 2).Draw(t, "motors")
		mk := func(lm LossModel, cc float64) Unit {
			u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(cc), Loss: lm})
			if err != nil {
				t.Fatal(err)
			}
			return u
		}
		pcc := rapid.Float64Range(20, 200).Draw(t, "pump cc")
		mcc := rapid.Float64Range(20, 200).Draw(t, "motor cc")
		var sched Schedule = Sequential{MinMotorSetting: rapid.Float64Range(0, 0.6).Draw(t, "min motor setting")}
		if rapid.Bool().Draw(t, "min loss") {
			sched = MinLoss{}
		}
		build := func(lm LossModel) Loop {
			ms := make([]Unit, motors)
			for i := range ms {
				ms[i] = mk(lm, mcc)
			}
			l, err := NewLoop(LoopSpec{Pump: mk(lm, pcc), Motors: ms, Oil: VG46, Temperature: units.Celsius(50),
				Charge: units.Bar(20), Relief: units.Bar(500), Schedule: sched})
			if err != nil {
				t.Fatal(err)
			}
			return l
		}
		closed, search := build(w), build(opaque{w})
		if w == (Wilson{}) {
			search = build(opaque{Wilson{}})
		}
		wp := units.RPM(rapid.Float64Range(-2500, 2500).Draw(t, "pump rpm"))
		if rapid.IntRange(0, 9).Draw(t, "pump stopped (0)") == 0 {
			wp = 0
		}
		wm := make([]units.AngularVelocity, motors)
		if rapid.IntRange(0, 3).Draw(t, "random motor speeds (0)") == 0 {
			for i := range wm {
				wm[i] = units.RPM(rapid.Float64Range(-4000, 4000).Draw(t, "motor rpm"))
			}
		} else {
			// Lossless, the pump at setting xp and the motors at xm pass the
			// same flow: Σ wm·xm·Dm = wp·xp·Dp, shared equally. Settings well
			// inside their ranges leave room for the leakage.
			xp := rapid.Float64Range(0.2, 0.8).Draw(t, "pump setting")
			xm := rapid.Float64Range(0.7, 0.95).Draw(t, "motor setting")
			for i := range wm {
				wm[i] = units.AngularVelocity(float64(wp) * xp * pcc / (xm * mcc * float64(motors)))
			}
		}
		dp := units.Bar(rapid.Float64Range(-450, 450).Draw(t, "Δp bar"))
		xa, xb := make([]float64, motors+1), make([]float64, motors+1)
		ea := closed.Settings(wp, wm, dp, xa)
		eb := search.Settings(wp, wm, dp, xb)
		if flatTie(ea, eb) || flatTie(eb, ea) {
			return
		}
		// Where the balance is flat to rounding (a pump and motors whose
		// flows cancel, a pressure of 1e-12 bar) rounding decides between
		// settings that all balance the flows: accept both when each
		// balances to 1e-12 of the flows that pass.
		scale := math.Abs(float64(wp)) * float64(closed.spec.Pump.dmax)
		for i, w := range wm {
			scale += math.Abs(float64(w)) * closed.spec.Motors[i].dmax
		}
		ra, _ := search.Balance(wp, wm, dp, xa)
		rb, _ := search.Balance(wp, wm, dp, xb)
		// With nothing turning (scale 0) no flow passes: every setting
		// balances, and residuals of a pressure of 1e-90 bar are rounding.
		flat := scale == 0 || math.Abs(float64(ra)) <= 1e-12*scale && math.Abs(float64(rb)) <= 1e-12*scale
		if ((ea == nil) != (eb == nil) || (ea != nil && !sameKind(ea, eb))) && !flat {
			t.Fatalf("closed form: %v; search: %v", ea, eb)
		}
		if ea != nil && !errors.Is(ea, ErrSettingLimit) {
			return
		}
		if math.Abs(xa[0]) == 1 && xa[0] == -xb[0] {
			// The pump at opposite ends: only right when the ends tie (a
			// pump that all but stands still, its flow lost in the
			// leakage), so that rounding chooses the end.
			xb[0] = -xb[0]
			ra, _ := search.Balance(wp, wm, dp, xb)
			xb[0] = -xb[0]
			rb, _ := search.Balance(wp, wm, dp, xb)
			// The ends tie when they differ by less than the rounding of the
			// residuals or of the flows that pass (a pump at 1e-15 rpm).
			if d := math.Abs(float64(ra - rb)); d > 1e-9*math.Max(math.Abs(float64(ra)), math.Abs(float64(rb))) && d > 1e-12*scale {
				t.Fatalf("pump setting: closed form %v, search %v, and the ends do not tie (%g, %g)", xa[0], xb[0], ra, rb)
			}
			return
		}
		reach.Reached()
		tol := 1e-9
		if _, ok := sched.(MinLoss); ok {
			tol = 1e-6 // the minimum-loss setting is itself found to 1e-9 by a search
		}
		for i := range xa {
			if math.Abs(xa[i]-xb[i]) > tol && !flat {
				t.Fatalf("setting %d: closed form %.17g, search %.17g", i, xa[i], xb[i])
			}
		}
		// The needed setting is extrapolated through the two ends of the
		// motor range, 1/(r(1) − r(smin)) amplifying the rounding of r: a
		// looser tolerance for that extrapolated value, compared only where
		// it means something (within ten times the full setting; beyond, the
		// motors hardly respond to their setting and the value is only a
		// direction).
		var la, lb *LimitError
		if !flat && errors.As(ea, &la) && errors.As(eb, &lb) && math.Abs(lb.Value.SI) < 10 &&
			math.Abs(la.Value.SI-lb.Value.SI) > 1e-6*math.Max(1, math.Abs(lb.Value.SI)) {
			t.Fatalf("needed setting: closed form %v, search %v", la.Value, lb.Value)
		}
	})
}

// flatTie reports the degenerate case of motors whose flow hardly depends
// on their setting (all but stopped): one way finds the balance flat to
// rounding (ErrNoSolution), the other extrapolates a needed setting through
// two residuals equal to rounding, far beyond any setting. Both say that no
// setting serves.
func flatTie(a, b error) bool {
	var le *LimitError
	return errors.Is(a, ErrNoSolution) && errors.As(b, &le) && errors.Is(b, ErrSettingLimit) && math.Abs(le.Value.SI) > 1e6
}

func sameKind(a, b error) bool {
	for _, s := range []error{ErrSettingLimit, ErrNoSolution, ErrInvalid, ErrModel, ErrPressureLimit, ErrSpeedLimit} {
		if errors.Is(a, s) != errors.Is(b, s) {
			return false
		}
	}
	return true
}
