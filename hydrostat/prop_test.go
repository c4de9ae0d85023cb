package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
	"pgregory.net/rapid"
)

func wilsonGen() *rapid.Generator[Wilson] {
	return rapid.Custom(func(t *rapid.T) Wilson {
		return Wilson{
			Slip:             rapid.Float64Range(0, 2e-8).Draw(t, "Cs"),
			Viscous:          rapid.Float64Range(0, 2e5).Draw(t, "Cv"),
			Friction:         rapid.Float64Range(0, 0.06).Draw(t, "Cf"),
			Hydrodynamic:     rapid.Float64Range(0, 50).Draw(t, "Ch"),
			ConstantPressure: units.Bar(rapid.Float64Range(0, 5).Draw(t, "pc/bar")),
			Compressibility:  rapid.Bool().Draw(t, "compressibility"),
			DeadVolume:       rapid.Float64Range(0, 1).Draw(t, "Cr"),
			LeakageSetting:   rapid.Float64Range(0, 1).Draw(t, "sq"),
			TorqueSetting:    rapid.Float64Range(0, 1).Draw(t, "st"),
			ConstantTorque:   units.Torque(rapid.Float64Range(0, 10).Draw(t, "T0")),
		}
	})
}

func unitGen() *rapid.Generator[Unit] {
	return rapid.Custom(func(t *rapid.T) Unit {
		u, err := NewUnit(UnitSpec{
			MaxDisplacement: units.CCPerRev(rapid.Float64Range(5, 500).Draw(t, "Dmax/cc")),
			Loss:            wilsonGen().Draw(t, "wilson"),
		})
		if err != nil {
			t.Fatalf("NewUnit: %v", err)
		}
		return u
	})
}

type unitCase struct {
	u    Unit
	x    float64
	w    units.AngularVelocity
	dp   units.Pressure
	oil  Oil
	temp units.Temperature
}

func unitCaseGen() *rapid.Generator[unitCase] {
	return rapid.Custom(func(t *rapid.T) unitCase {
		return unitCase{
			u:    unitGen().Draw(t, "unit"),
			x:    rapid.Float64Range(-1, 1).Draw(t, "setting"),
			w:    units.RPM(rapid.Float64Range(-4000, 4000).Draw(t, "speed/rpm")),
			dp:   units.Bar(rapid.Float64Range(-500, 500).Draw(t, "dp/bar")),
			oil:  rapid.SampledFrom([]Oil{VG32, VG46, VG68}).Draw(t, "oil"),
			temp: units.Celsius(rapid.Float64Range(0, 100).Draw(t, "temp/°C")),
		}
	})
}

// checkPoint checks the invariants of one unit's point: its power balance,
// losses ≥ 0, efficiencies in [0, 1] and their product rule. It serves the
// properties (*rapid.T) and the fuzz targets (*testing.T).
func checkPoint(t interface{ Fatalf(string, ...any) }, p Point) {
	mech, hyd, loss := float64(p.Mechanical), float64(p.Hydraulic), float64(p.Loss)
	scale := math.Max(math.Max(math.Abs(mech), math.Abs(hyd)), loss)
	if math.Abs(mech-hyd-loss) > 1e-9*scale+1e-300 {
		t.Fatalf("power balance: mech %g − hyd %g − loss %g = %g", mech, hyd, loss, mech-hyd-loss)
	}
	if !(p.Leakage >= 0 && p.LossTorque >= 0 && p.Loss >= 0) {
		t.Fatalf("negative loss: %+v", p)
	}
	for _, e := range []float64{p.Volumetric, p.HydroMechanical, p.Overall} {
		if !(e >= 0 && e <= 1) {
			t.Fatalf("efficiency %v outside [0, 1]: %+v", e, p)
		}
	}
	if p.Overall != p.Volumetric*p.HydroMechanical {
		t.Fatalf("overall %v ≠ η_v·η_hm %v", p.Overall, p.Volumetric*p.HydroMechanical)
	}
	// Where the unit delivers useful power, every efficiency is in (0, 1]
	// and the overall one is output over input (ISO 4409).
	out, in := hyd, mech
	if p.Mode == Motoring {
		out, in = -mech, -hyd
	}
	if p.Mode != Idle && out > 1e-290 && in > 0 { // normal float64 range only
		if !(p.Volumetric > 0 && p.HydroMechanical > 0 && p.Overall > 0) {
			t.Fatalf("zero efficiency with useful output: %+v", p)
		}
		// Below the normal float64 range (subnormal powers) the ratio loses
		// precision; the model is not at fault there.
		if out > 1e-290 && math.Abs(p.Overall-out/in) > 1e-9 {
			t.Fatalf("overall %v ≠ out/in %v", p.Overall, out/in)
		}
	}
	if p.Mode == Idle && (p.Volumetric != 1 || p.Overall != 1) {
		t.Fatalf("idle efficiencies %+v", p)
	}
}

func TestPropUnitPowerBalance(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := unitCaseGen().Draw(t, "case")
		p, err := c.u.At(c.x, c.w, c.dp, c.oil, c.temp)
		if err != nil {
			t.Fatalf("At: %v", err)
		}
		checkPoint(t, p)
		if p.Mode != Idle && (p.Mode == Pumping) != (sgn(float64(c.dp))*sgn(c.x)*sgn(float64(c.w)) > 0) {
			t.Fatalf("mode %v for Δp·x·ω sign", p.Mode)
		}
	})
}

func TestPropVolumetricFallsWithPressure(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := unitCaseGen().Draw(t, "case")
		k := rapid.Float64Range(1, 5).Draw(t, "pressure factor")
		p1, err1 := c.u.At(c.x, c.w, c.dp, c.oil, c.temp)
		p2, err2 := c.u.At(c.x, c.w, c.dp*units.Pressure(k), c.oil, c.temp)
		if err1 != nil || err2 != nil {
			t.Fatalf("At: %v, %v", err1, err2)
		}
		if p1.Mode == Idle || p2.Mode == Idle {
			return
		}
		if p2.Volumetric > p1.Volumetric*(1+1e-12) {
			t.Fatalf("η_v rose with pressure: %v at %v, %v at %v", p1.Volumetric, c.dp, p2.Volumetric, c.dp*units.Pressure(k))
		}
	})
}

type loopCase struct {
	l      Loop
	wp     units.AngularVelocity
	wm     []units.AngularVelocity
	dp     units.Pressure
	minimi bool
}

func loopCaseGen() *rapid.Generator[loopCase] {
	return rapid.Custom(func(t *rapid.T) loopCase {
		n := rapid.IntRange(1, 3).Draw(t, "motors")
		ms := make([]Unit, n)
		for i := range ms {
			ms[i] = unitGen().Draw(t, "motor")
		}
		minimi := rapid.Bool().Draw(t, "MinLoss")
		var sched Schedule = Sequential{MinMotorSetting: rapid.Float64Range(0, 0.5).Draw(t, "min motor")}
		if minimi {
			sched = MinLoss{}
		}
		l, err := NewLoop(LoopSpec{
			Pump: unitGen().Draw(t, "pump"), Motors: ms,
			Oil:         rapid.SampledFrom([]Oil{VG32, VG46, VG68}).Draw(t, "oil"),
			Temperature: units.Celsius(rapid.Float64Range(10, 90).Draw(t, "temp/°C")),
			Charge:      units.Bar(20), Relief: units.Bar(470), Schedule: sched,
		})
		if err != nil {
			t.Fatalf("NewLoop: %v", err)
		}
		// Motor speeds the loop reaches: lossless, the pump at setting xp
		// and the motors at xm pass the same flow, Σ wm·xm·Dm = wp·xp·Dp,
		// split between the motors by random shares. Settings inside their
		// ranges leave room for the leakage; one draw in eight takes random
		// motor speeds instead (mostly out of range).
		wp := units.RPM(rapid.Float64Range(800, 3000).Draw(t, "|pump rpm|"))
		if rapid.Bool().Draw(t, "pump reversed") {
			wp = -wp
		}
		wm := make([]units.AngularVelocity, n)
		if rapid.IntRange(0, 7).Draw(t, "random motor speeds (0)") == 0 {
			wp = units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "pump rpm"))
			for i := range wm {
				wm[i] = units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "motor rpm"))
			}
		} else {
			xp := rapid.Float64Range(0.3, 0.8).Draw(t, "pump setting")
			xm := rapid.Float64Range(0.6, 0.95).Draw(t, "motor setting")
			q := float64(wp) * xp * float64(l.Spec().Pump.Spec().MaxDisplacement)
			share := make([]float64, n)
			sum := 0.0
			for i := range share {
				share[i] = rapid.Float64Range(0.2, 1).Draw(t, "flow share")
				sum += share[i]
			}
			for i := range wm {
				wm[i] = units.AngularVelocity(q * share[i] / sum / (xm * float64(ms[i].Spec().MaxDisplacement)))
			}
		}
		dp := units.Bar(rapid.Float64Range(-450, 450).Draw(t, "dp/bar"))
		// The motors' swing; to zero or over centre, the pump may also run
		// slowly either way, near the standing pump of a mechanical point.
		if sw := rapid.SampledFrom([]Swing{SwingUnstated, SwingToZero, SwingOverCentre}).Draw(t, "motor swing"); sw != SwingUnstated {
			sp := l.Spec()
			for i := range sp.Motors {
				us := sp.Motors[i].Spec()
				us.Swing = sw
				u, err := NewUnit(us)
				if err != nil {
					t.Fatalf("NewUnit: %v", err)
				}
				sp.Motors[i] = u
			}
			if l, err = NewLoop(sp); err != nil {
				t.Fatalf("NewLoop: %v", err)
			}
			if rapid.Bool().Draw(t, "slow pump") {
				wp = units.RPM(rapid.Float64Range(-400, 400).Draw(t, "slow pump rpm"))
			}
		}
		return loopCase{l: l, wp: wp, wm: wm, dp: dp, minimi: minimi}
	})
}

// TestPropLoopBalance: flow continuity, power balance and the settings'
// ranges of a loop at speeds drawn mostly inside its range. A draw is
// skipped only on the documented infeasibility (ErrSettingLimit,
// ErrNoSolution: the speeds are outside the loop's range); at least 60 % of
// the draws must reach the balance checks (about 90 % do).
func TestPropLoopBalance(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.6)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		c := loopCaseGen().Draw(t, "case")
		var st LoopState
		err := c.l.At(c.wp, c.wm, c.dp, &st)
		if errors.Is(err, ErrSettingLimit) || errors.Is(err, ErrNoSolution) {
			return // the speeds are outside the loop's range
		}
		if err != nil {
			t.Fatalf("At: %v", err)
		}
		reach.Reached()
		r, s := balance(&st)
		if math.Abs(r) > 1e-12*s+1e-300 {
			t.Fatalf("flow balance residual %g of %g", r, s)
		}
		sum := float64(st.Pump.Mechanical)
		checkPoint(t, st.Pump)
		for _, m := range st.Motors {
			sum += float64(m.Mechanical)
			checkPoint(t, m)
		}
		if math.Abs(sum-float64(st.Loss)) > 1e-9*float64(st.Input)+1e-9 {
			t.Fatalf("Σ T·ω = %g, loss %g, input %g", sum, float64(st.Loss), float64(st.Input))
		}
		if !(st.Efficiency >= 0 && st.Efficiency <= 1) || st.Loss < 0 {
			t.Fatalf("efficiency %v, loss %v", st.Efficiency, st.Loss)
		}
		for i, x := range st.Settings {
			if math.Abs(x) > 1 || (i > 0 && x < 0 && c.l.spec.Motors[i-1].spec.Swing != SwingOverCentre) {
				t.Fatalf("settings %v", st.Settings)
			}
		}
	})
}

func TestPropPressureForRoundTrip(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := unitCaseGen().Draw(t, "case")
		// |x| ≥ 0.1 > Cf keeps the torque monotone in Δp, so the pressure for
		// a torque is unique.
		x := rapid.Float64Range(0.1, 1).Draw(t, "|setting|")
		if rapid.Bool().Draw(t, "negative setting") {
			x = -x
		}
		p, err := c.u.At(x, c.w, c.dp, c.oil, c.temp)
		if err != nil {
			t.Fatalf("At: %v", err)
		}
		q, err := c.u.PressureFor(x, c.w, p.Torque, c.oil, c.temp)
		if err != nil {
			t.Fatalf("PressureFor: %v", err)
		}
		if math.Abs(float64(q.Pressure-c.dp)) > 1e-6*math.Abs(float64(c.dp))+1e-3 {
			t.Fatalf("PressureFor(At(%v).Torque) = %v, want %v", c.dp, q.Pressure, c.dp)
		}
	})
}
