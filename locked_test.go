package powersplit

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/units"
)

// A locked range at the mechanical point of the output-coupled fixture
// (carrier on the engine, sun to the pump at 1.2, ring the summing shaft,
// range gear 0.5): with the sun held, Willis gives ωring = (i0−1)/i0·ωcarrier
// = 1.4·ωengine, so the output turns at ν_M = 0.7 of the engine. With
// lossless gears and planetary, the output power equals the input power
// less the destroked motor's own drag. Hand calculation: the torque at the
// output is 1/0.7 of the engine's through the locked set.
func TestLockedRange(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "split", Ratio: 0.5}, {Name: "locked", Ratio: 0.5, Locked: true}}, GearEfficiency: 1})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	win := units.RPM(2000)
	p := Point{Range: 1, Input: win, Outputs: []OutputDemand{{Speed: units.AngularVelocity(0.7 * float64(win)), Torque: units.NewtonMetres(700)}}}
	if err := s.Solve(p, &st); err != nil {
		t.Fatal(err)
	}
	// Lossless units: the engine gives 0.7·700 N·m, the brake holds the sun.
	if got := float64(st.InputTorque); math.Abs(got-490) > 1e-6 {
		t.Errorf("input torque %.9g N·m, want 490", got)
	}
	if st.Loops[0].Pressure != 0 || st.Loops[0].Settings[0] != 0 || st.Loops[0].Settings[1] != 0 {
		t.Errorf("locked loop: pressure %v, settings %v", st.Loops[0].Pressure, st.Loops[0].Settings)
	}
	if math.Abs(st.Efficiency-1) > 1e-12 || st.HydraulicShare != 0 {
		t.Errorf("efficiency %v, hydraulic share %v", st.Efficiency, st.HydraulicShare)
	}
	if nu, ok := l.LockedRatio(1); !ok || math.Abs(nu-0.7) > 1e-12 {
		t.Errorf("LockedRatio = %v, %v; want 0.7", nu, ok)
	}
	if _, ok := l.LockedRatio(0); ok {
		t.Error("the split range reported as locked")
	}
	// Any other output speed is unreachable in the locked range, and the
	// error names the speed the range gives.
	p.Outputs[0].Speed = units.AngularVelocity(0.69 * float64(win))
	err = s.Solve(p, &st)
	var le *LimitError
	if !errors.Is(err, ErrUnreachable) || !errors.As(err, &le) || math.Abs(le.Limit.SI-0.7*float64(win)) > 1e-9*float64(win) {
		t.Errorf("off-speed point: %v", err)
	}
	// The split range runs away from the mechanical point.
	p.Range = 0
	p.Outputs[0].Speed = units.AngularVelocity(0.6 * float64(win))
	if err := s.Solve(p, &st); err != nil {
		t.Errorf("split range at 0.6: %v", err)
	}

	// With lossy units the destroked units' drag is the only loss, and
	// the balance closes.
	lp = makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson})
	l, err = OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "locked", Ratio: 0.5, Locked: true}}, GearEfficiency: 1})
	if err != nil {
		t.Fatal(err)
	}
	s = NewSolver(l)
	p = Point{Input: win, Outputs: []OutputDemand{{Speed: units.AngularVelocity(0.7 * float64(win)), Torque: units.NewtonMetres(700)}}}
	if err := s.Solve(p, &st); err != nil {
		t.Fatal(err)
	}
	if !(st.HydrostatLoss > 0) || math.Abs(float64(st.InputPower-st.OutputPower-st.Loss)) > 1e-9*float64(st.InputPower) {
		t.Errorf("lossy locked: in %v out %v loss %v (hydrostat %v)", st.InputPower, st.OutputPower, st.Loss, st.HydrostatLoss)
	}
	if st.Loops[0].Pump.Speed != 0 {
		t.Errorf("pump turns at %v in the locked range", st.Loops[0].Pump.Speed)
	}
}

// An input-coupled split locked by holding its motor member: the pump
// turns with the engine while the motor stands, so the loop is a Curve in
// the speeds' sense, but a locked range runs it destroked (both settings
// zero), never by its own schedule. Both paths give that state, and the
// same numbers.
func TestLockedRangeTurningPump(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := InputCoupled(InputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp,
		Ranges: []RangeGear{{Name: "split", Ratio: 0.5}, {Name: "locked", Ratio: 0.5, Locked: true}}})
	if err != nil {
		t.Fatal(err)
	}
	nu, ok := l.LockedRatio(1)
	if !ok {
		t.Fatal("the locked range has no locked ratio")
	}
	fast, gen := NewSolver(l), NewSolver(l)
	gen.general = true
	win := units.RPM(2000)
	for _, torque := range []float64{-200, 0, 300, 900} {
		p := Point{Range: 1, Input: win, Outputs: []OutputDemand{{Speed: units.AngularVelocity(nu * float64(win)), Torque: units.NewtonMetres(torque)}}}
		var a, b State
		ea, eb := fast.Solve(p, &a), gen.Solve(p, &b)
		if ea != nil || eb != nil {
			t.Fatalf("%v N·m: %v; general: %v", torque, ea, eb)
		}
		lr := &a.Loops[0]
		if lr.Pump.Speed == 0 || lr.Motors[0].Speed != 0 || lr.Settings[0] != 0 || lr.Settings[1] != 0 || lr.Pressure != 0 {
			t.Errorf("%v N·m: pump %v, motor %v, settings %v, pressure %v: want a turning pump, a standing motor, both destroked", torque, lr.Pump.Speed, lr.Motors[0].Speed, lr.Settings, lr.Pressure)
		}
		if d := summaryDiff(&a, &b, 1e-12); d != "" {
			t.Errorf("%v N·m: %s", torque, d)
		}
	}
}

// The interval of a locked range is its one output speed.
func TestLockedRangeInterval(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "locked", Ratio: 0.5, Locked: true}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	win := units.RPM(2000)
	ivs, err := s.Interval(Point{Input: win, Outputs: []OutputDemand{{Speed: 1}}})
	t.Logf("intervals %v, %v", ivs, err)
	if err != nil || len(ivs) != 1 || math.Abs(float64(ivs[0].Lo)-0.7*float64(win)) > 1e-9*float64(win) || ivs[0].Hi != ivs[0].Lo {
		t.Errorf("Interval of a locked range = %v, %v; want the single speed %v", ivs, err, units.AngularVelocity(0.7*float64(win)))
	}
}

// Conservation in locked ranges, with every drag source on: random
// output-coupled splits with a locked range, at the range's one speed.
func TestPropertyLockedConservation(t *testing.T) {
	t.Parallel()
	solved := 0
	defer func() {
		if solved < 5 {
			t.Errorf("only %d points solved", solved)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		set, err := planetaryFromRatio(rapid.Float64Range(-3.5, -1.6).Draw(t, "i0"), rapid.Float64Range(0.94, 1).Draw(t, "eta0"))
		if err != nil {
			t.Fatal(err)
		}
		l0, err := OutputCoupled(OutputCoupledSpec{Set: set, Loop: genLoop(t, 1),
			PumpRatio: rapid.Float64Range(0.4, 1.2).Draw(t, "pump ratio"), MotorRatio: rapid.Float64Range(0.5, 1.5).Draw(t, "motor ratio"),
			Ranges:         []RangeGear{{Name: "locked", Ratio: rapid.Float64Range(0.2, 1.5).Draw(t, "range ratio"), Locked: true}},
			GearEfficiency: rapid.Float64Range(0.94, 1).Draw(t, "gear eta")})
		if err != nil {
			t.Fatal(err)
		}
		l, err := l0.WithLosses(genNoLoad(t, l0))
		if err != nil {
			t.Fatal(err)
		}
		s := NewSolver(l)
		win := units.RPM(rapid.Float64Range(900, 2300).Draw(t, "engine rpm"))
		ivs, err := s.Interval(Point{Input: win, Outputs: []OutputDemand{{Speed: 1}}})
		if err != nil {
			t.Skipf("locked speed unreachable: %v", err)
		}
		p := Point{Input: win, Outputs: []OutputDemand{{Speed: ivs[0].Lo, Torque: units.NewtonMetres(rapid.Float64Range(-1500, 1500).Draw(t, "N·m"))}}}
		var st State
		if err := s.Solve(p, &st); err != nil {
			if errors.Is(err, ErrInfeasible) || errors.Is(err, ErrSelfLocking) {
				t.Skipf("infeasible: %v", err)
			}
			t.Fatal(err)
		}
		pin, pout := float64(st.InputPower), float64(st.OutputPower)
		scale := math.Abs(pin) + math.Abs(pout) + 1e-3*st.powerScale()
		loss := 0.0
		for _, e := range st.Elements {
			if e.Loss < 0 {
				t.Fatalf("%s loss %v", e.Name, e.Loss)
			}
			loss += float64(e.Loss)
		}
		for _, d := range st.Drags {
			loss += float64(d.Loss)
		}
		if r := math.Abs(pin - pout - loss); r > 1e-9*scale {
			t.Fatalf("balance residual %g (in %v out %v loss %g)", r/scale, st.InputPower, st.OutputPower, loss)
		}
		if st.Loops[0].Pressure != 0 || st.Loops[0].Pump.Speed != 0 {
			t.Fatalf("locked loop: pressure %v, pump speed %v", st.Loops[0].Pressure, st.Loops[0].Pump.Speed)
		}
		solved++
	})
}

// PumpShare counts the pump's shaft power: equal to HydraulicShare with
// lossless units, larger in magnitude than it by the pump's own loss when
// the pump pumps (Δp·Q = T·ω − loss).
func TestPumpShare(t *testing.T) {
	t.Parallel()
	for _, lossy := range []bool{false, true} {
		lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: lossy, wilson: demoWilson})
		l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
			Ranges: []RangeGear{{Ratio: 0.5}}, GearEfficiency: 0.98})
		if err != nil {
			t.Fatal(err)
		}
		s := NewSolver(l)
		var st State
		if err := solveNu(t, s, &st, 0.4, 600); err != nil {
			t.Fatal(err)
		}
		pump := st.Loops[0].Pump
		want := float64(pump.Mechanical) / float64(st.InputPower)
		if math.Abs(st.PumpShare-want) > 1e-12 {
			t.Errorf("lossy %v: PumpShare %v, want %v", lossy, st.PumpShare, want)
		}
		gap := (st.PumpShare - st.HydraulicShare) * float64(st.InputPower)
		if !lossy && math.Abs(gap) > 1e-9*float64(st.InputPower) {
			t.Errorf("lossless: PumpShare %v differs from HydraulicShare %v", st.PumpShare, st.HydraulicShare)
		}
		if lossy && (pump.Mechanical <= 0 || math.Abs(gap-float64(pump.Loss)) > 1e-6*float64(st.InputPower)) {
			t.Errorf("lossy: shares differ by %g W, pump loss %v (pump power %v)", gap, pump.Loss, pump.Mechanical)
		}
	}
}
