package powersplit

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Invented demo data: unit sizes, ratios and loss coefficients below are
// round numbers chosen for the tests, not taken from any machine.

// loopSpec describes a test loop.
type loopSpec struct {
	pumpCC, motorCC float64 // cc/rev
	motors          int
	lossy           bool
	wilson          hydrostat.Wilson
	maxRPM          float64 // 0: not rated
	sched           hydrostat.Schedule
}

// demoWilson is an invented, plausible set of loss coefficients.
var demoWilson = hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}

func makeLoop(tb testing.TB, s loopSpec) hydrostat.Loop {
	tb.Helper()
	var lm hydrostat.LossModel
	if s.lossy {
		lm = s.wilson
	}
	mk := func(cc float64) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc),
			MaxSpeed: units.RPM(s.maxRPM), RatedPressure: units.Bar(420), PeakPressure: units.Bar(520), Loss: lm})
		if err != nil {
			tb.Fatal(err)
		}
		return u
	}
	n := s.motors
	if n == 0 {
		n = 1
	}
	ms := make([]hydrostat.Unit, n)
	for i := range ms {
		ms[i] = mk(s.motorCC)
	}
	l, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: mk(s.pumpCC), Motors: ms, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(500), Schedule: s.sched})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

// zeroMotor is a lossless schedule that may swing the motor back to zero:
// the pump swings out first; when it is full, the motors swing back as far
// as needed, down to zero (a motor with no minimum setting). It serves the
// mechanical points of the output-coupled split, where the pump shaft stands
// still and the motor is at zero displacement.
type zeroMotor struct{}

func (zeroMotor) Settings(l hydrostat.Loop, wp units.AngularVelocity, wm []units.AngularVelocity, dp units.Pressure, x []float64) error {
	sp := l.Spec()
	dP := float64(sp.Pump.Spec().MaxDisplacement)
	need := 0.0 // motor flow at full setting
	for i, w := range wm {
		need += float64(sp.Motors[i].Spec().MaxDisplacement) * float64(w)
	}
	qp := dP * float64(wp)
	for i := 1; i < len(x); i++ {
		x[i] = 1
	}
	switch {
	case need == 0:
		x[0] = 0
	case math.Abs(qp) >= math.Abs(need):
		x[0] = need / qp
	default:
		x[0] = 1
		if qp*need < 0 {
			x[0] = -1
		}
		for i := 1; i < len(x); i++ {
			x[i] = x[0] * qp / need
		}
	}
	return nil
}

func mustSet(tb testing.TB, i0, eta0 float64) planetary.Set {
	tb.Helper()
	s, err := planetary.FromRatio(i0, eta0)
	if err != nil {
		tb.Fatal(err)
	}
	return s
}

// TestLossySweep solves one lossy output-coupled split across its speed range
// and checks each point's outcome against a hand calculation.
//
// Hand calculation (Willis, i0 = −2.5, carrier on the engine at 2000 rpm,
// sun → pump ×1.2, ring → motor ÷0.8, range gear 0.2):
//
//	ring  = output/0.2 = 5·v          motor = ring/0.8 = 6.25·v
//	sun   = i0·ring + (1 − i0)·carrier = 7000 − 12.5·v      pump = 1.2·sun
//
// The sun stops (mechanical point) at v = 560 rpm: the hydraulic share is
// positive below it and negative (circulating power) above it. With units
// rated 6000 rpm, the pump exceeds its speed at v = −300 (12 900 rpm) and the
// motor at v = 1200 (7500 rpm). At v = 600 the pump turns at −600 rpm and the
// motor at 3750 rpm: lossless, the motor needs a setting 100·600/(100·3750) =
// 0.16, below its minimum 0.2, so the ratio is unreachable.
func TestLossySweep(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 6000})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, -2.5, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}, PTOs: []PTOSpec{{Ratio: 0.25}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	cases := []struct {
		v     float64 // output speed, rpm
		want  error   // nil: solves
		share float64 // sign of the hydraulic share when it solves
	}{
		{-300, ErrInfeasible, 0},
		{200, nil, +1},
		{500, nil, +1},
		{600, ErrUnreachable, 0},
		{620, nil, -1},
		{900, nil, -1},
		{1200, ErrInfeasible, 0},
	}
	for _, c := range cases {
		err := s.Solve(Point{Range: 0, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(c.v), Torque: units.NewtonMetres(2000)}},
			PTO: []units.Torque{units.NewtonMetres(100)}}, &st)
		if c.want != nil {
			var le *LimitError
			if !errors.Is(err, c.want) || !errors.As(err, &le) {
				t.Errorf("v = %g rpm: error %v, want a *LimitError matching %v", c.v, err, c.want)
			}
			continue
		}
		if err != nil {
			t.Errorf("v = %g rpm: %v", c.v, err)
			continue
		}
		if got := st.Outputs[0].Speed.RPM(); !testutil.Close(got, c.v, 1e-12, 0) {
			t.Errorf("v = %g rpm: output speed %g rpm", c.v, got)
		}
		if got := st.PTOs[0].Speed.RPM(); !testutil.Close(got, 500, 1e-12, 0) {
			t.Errorf("v = %g rpm: PTO speed %g rpm, want 0.25·2000 = 500", c.v, got)
		}
		in, out := float64(st.InputPower), float64(st.OutputPower+st.PTOPower+st.Loss)
		if !testutil.Close(in, out, 1e-9, 0) {
			t.Errorf("v = %g rpm: input %v ≠ outputs + PTO + losses %g W", c.v, st.InputPower, out)
		}
		for _, e := range st.Elements {
			if e.Loss < 0 {
				t.Errorf("v = %g rpm: %s loss %v < 0", c.v, e.Name, e.Loss)
			}
		}
		if st.HydrostatLoss <= 0 || st.Loss <= st.HydrostatLoss {
			t.Errorf("v = %g rpm: losses %v (hydrostat %v): want both paths lossy", c.v, st.Loss, st.HydrostatLoss)
		}
		if st.HydraulicShare*c.share <= 0 || !(st.Efficiency > 0 && st.Efficiency < 1) {
			t.Errorf("v = %g rpm: share %g (want sign %v), efficiency %g", c.v, st.HydraulicShare, c.share, st.Efficiency)
		}
	}
	// Overrun: the load drives (−2000 N·m at 200 rpm, 41.9 kW in at the
	// output), the PTO takes 5.2 kW and the engine absorbs the rest less the
	// losses. Power flows from the loads to the engine, so the efficiency
	// is the engine's share of it, InputPower/(OutputPower + PTOPower), both
	// negative (State.Efficiency); a point where the engine and the load
	// both drive has efficiency 0.
	for _, c := range []struct {
		tq      float64 // output torque, N·m
		overrun bool    // the engine absorbs power
	}{{-2000, true}, {-400, false}} {
		p := Point{Range: 0, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(200), Torque: units.NewtonMetres(c.tq)}},
			PTO: []units.Torque{units.NewtonMetres(100)}}
		if err := s.Solve(p, &st); err != nil {
			t.Fatalf("%g N·m at 200 rpm: %v", c.tq, err)
		}
		pin, useful := float64(st.InputPower), float64(st.OutputPower+st.PTOPower)
		if !(useful < 0) || (pin < 0) != c.overrun {
			t.Fatalf("%g N·m: input %v, outputs + PTO %g W: not the case meant", c.tq, st.InputPower, useful)
		}
		want := 0.0
		if c.overrun {
			want = pin / useful // hand rule: power delivered to the engine over power the loads put in
		}
		if st.Efficiency != want || (c.overrun && !(want > 0 && want < 1)) {
			t.Errorf("%g N·m: efficiency %v, want %v (input %v, outputs + PTO %g W)", c.tq, st.Efficiency, want, st.InputPower, useful)
		}
	}
}

// Lossless fixtures for the published checks. i0 = −2.5 for every set.

const testI0 = -2.5

// ocLossless: carrier on the engine, sun to the pump (ratio 1.2), ring the
// summing shaft, motor geared to it (ratio 0.8), one range of ratio 0.5.
// Mechanical point (sun stopped): ωring = (i0−1)/i0·ωcarrier, so
// ν_M = 1.4·0.5 = 0.7.
func ocLossless(tb testing.TB, etaGear, eta0 float64, lossyUnits bool) (Layout, float64) {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 100, lossy: lossyUnits, wilson: demoWilson, sched: zeroMotor{}})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(tb, testI0, eta0), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.5}}, GearEfficiency: etaGear})
	if err != nil {
		tb.Fatal(err)
	}
	return l, (testI0 - 1) / testI0 * 0.5
}

// icLossless: pump geared to the engine (1.1), ring on the engine through a
// gear (0.9), sun to the motor (direct), carrier the summing shaft, one
// range of ratio 0.6. Mechanical point (sun stopped): ωcarrier =
// −i0/(1−i0)·ωring, so ν_M = 0.9·(2.5/3.5)·0.6.
func icLossless(tb testing.TB, etaGear, eta0 float64, lossyUnits bool) (Layout, float64) {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 100, lossy: lossyUnits, wilson: demoWilson, sched: zeroMotor{}})
	l, err := InputCoupled(InputCoupledSpec{Set: mustSet(tb, testI0, eta0), Loop: lp, PumpRatio: 1.1, InputRatio: 0.9,
		Ranges: []RangeGear{{Ratio: 0.6}}, GearEfficiency: etaGear})
	if err != nil {
		tb.Fatal(err)
	}
	return l, 0.9 * (-testI0 / (1 - testI0)) * 0.6
}

// compound builds the compound split of the package example from public
// elements: shafts I (engine), O (output), A, B; set 1 (sun A, ring I,
// carrier O) and set 2 (sun B, ring O, carrier I); the pump on B, the motor
// on A. Willis gives ωA = i1·ωI + (1−i1)·ωO and ωB = (1−i2)·ωI + i2·ωO, so
// the pump stops at ν_p = −(1−i2)/i2 and the motor at ν_m = −i1/(1−i1).
func compound(tb testing.TB, i1, i2, eta0 float64, lossyUnits bool) (l Layout, nuP, nuM float64) {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 120, motorCC: 120, lossy: lossyUnits, wilson: demoWilson, sched: zeroMotor{}})
	b := NewBuilder()
	in, out, a, c := b.Shaft("I"), b.Shaft("O"), b.Shaft("A"), b.Shaft("B")
	b.Input("engine", in)
	b.Output("output", out)
	b.Planetary("set 1", mustSet(tb, i1, eta0), a, in, out)
	b.Planetary("set 2", mustSet(tb, i2, eta0), c, out, in)
	b.Loop("hydrostat", lp, c, a)
	l, err := b.Build()
	if err != nil {
		tb.Fatal(err)
	}
	return l, -(1 - i2) / i2, -i1 / (1 - i1)
}

// solveNu solves layout l in range 0 at 2000 rpm input, output speed ν·ωin,
// output torque t (same sign as ν).
func solveNu(tb testing.TB, s *Solver, st *State, nu, t float64) error {
	tb.Helper()
	win := units.RPM(2000)
	tq := units.NewtonMetres(t)
	if nu < 0 {
		tq = -tq
	}
	p := Point{Input: win, Outputs: make([]OutputDemand, len(s.l.outputs))}
	for i := range p.Outputs {
		p.Outputs[i].Speed = units.AngularVelocity(nu * float64(win))
	}
	p.Outputs[0].Torque = tq
	return s.Solve(p, st)
}

// pureLossless: pump geared 1.1 to the engine, motor → output through one
// range of 0.5; with second a second motor drives axle 2 (ratio 0.5),
// declutched above 800 rpm.
func pureLossless(tb testing.TB, second bool) Layout {
	tb.Helper()
	n := 1
	var sm *SecondMotor
	if second {
		n = 2
		sm = &SecondMotor{Ratio: 0.5, DeclutchAbove: units.RPM(800)}
	}
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 80, motors: n, sched: zeroMotor{}})
	l, err := PureHydrostatic(PureHydrostaticSpec{PumpRatio: 1.1, Loop: lp, Ranges: []RangeGear{{Ratio: 0.5}}, Second: sm, GearEfficiency: 1})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

type planetaryT = planetary.Set

func planetaryFromRatio(i0, eta0 float64) (planetary.Set, error) {
	return planetary.FromRatio(i0, eta0)
}
