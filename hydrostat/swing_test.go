package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// swingLoop is the demo loop with the motors' (and the pump's) swing set.
func swingLoop(t testing.TB, pumpSwing, motorSwing Swing, loss LossModel, sched Schedule) Loop {
	t.Helper()
	pump := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3200),
		PeakPressure: units.Bar(480), Loss: loss, Swing: pumpSwing})
	motor := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000),
		PeakPressure: units.Bar(480), Loss: loss, Kind: BentAxis, Swing: motorSwing})
	l, err := NewLoop(LoopSpec{Pump: pump, Motors: []Unit{motor}, Oil: VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(25), Relief: units.Bar(450), Schedule: sched})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestOverCentreLossless checks the over-centre sequential settings of a
// lossless loop against their closed form, on a sweep of the pump speed
// through zero at a fixed motor speed (the path through the mechanical
// point of an output-coupled split).
func TestOverCentreLossless(t *testing.T) {
	t.Parallel()
	for _, sched := range []Schedule{Sequential{}, MinLoss{}} {
		l := swingLoop(t, SwingOverCentre, SwingOverCentre, nil, sched)
		dp, dm := 90.0, 110.0
		// The pump speed through zero at a fixed motor speed, then the motor
		// speed through zero (the pump through zero) at a fixed pump speed.
		type pt struct{ rpm, wmRPM float64 }
		var pts []pt
		for v := -3000.0; v <= 3000; v += 125 {
			pts = append(pts, pt{v, 1500}, pt{1800, v})
		}
		for _, q := range pts {
			rpm, wm := q.rpm, units.RPM(q.wmRPM)
			var st LoopState
			if err := l.At(units.RPM(rpm), []units.AngularVelocity{wm}, units.Bar(200), &st); err != nil {
				t.Fatalf("%T at pump %v rpm, motor %v: %v", sched, rpm, wm, err)
			}
			checkLoopState(t, &st)
			// Hand calculation: x_p·D_p·ω_p = x_m·D_m·ω_m with
			// (x_p, x_m) = k·(D_m·ω_m, D_p·ω_p), k > 0, max |x| = 1.
			mq, pq := dm*wm.RPM(), dp*rpm
			if mq == 0 {
				continue // motor at rest: the pump passes only leakage (none here)
			}
			k := 1 / math.Max(math.Abs(mq), math.Abs(pq))
			if got, want := st.Settings[0], k*mq; math.Abs(got-want) > 1e-12 {
				t.Errorf("%T pump %v rpm: pump setting %v, want %v", sched, rpm, got, want)
			}
			if got, want := st.Settings[1], k*pq; math.Abs(got-want) > 1e-12 {
				t.Errorf("%T pump %v rpm: motor setting %v, want %v", sched, rpm, got, want)
			}
		}
	}
}

// TestOverCentreContinuous sweeps a lossy loop's pump speed finely through
// zero: the flow balance holds exactly, no limit is hit, the motor setting
// crosses zero, the pump stays at full stroke and no setting jumps.
func TestOverCentreContinuous(t *testing.T) {
	t.Parallel()
	for _, sched := range []Schedule{Sequential{}, MinLoss{}} {
		l := swingLoop(t, SwingUnstated, SwingOverCentre, demoWilson, sched)
		wm := []units.AngularVelocity{units.RPM(1500)}
		const step = 2.0 // rpm
		var prev []float64
		var crossed bool
		for rpm := -600.0; rpm <= 600; rpm += step {
			var st LoopState
			if err := l.At(units.RPM(rpm), wm, units.Bar(300), &st); err != nil {
				t.Fatalf("%T at pump %v rpm: %v", sched, rpm, err)
			}
			checkLoopState(t, &st)
			if st.Settings[0] != 1 {
				t.Errorf("%T at pump %v rpm: pump setting %v, want 1", sched, rpm, st.Settings[0])
			}
			if prev != nil {
				// Ideal slope dx_m/dω_p = D_p/(D_m·ω_m): 90/110/1500 per rpm.
				if d := math.Abs(st.Settings[1] - prev[1]); d > 2*step*90/110/1500 {
					t.Errorf("%T at pump %v rpm: motor setting jumps by %v", sched, rpm, d)
				}
				if prev[1] < 0 && st.Settings[1] >= 0 {
					crossed = true
				}
			}
			prev = append(prev[:0], st.Settings...)
		}
		if !crossed {
			t.Errorf("%T: motor setting never crossed zero", sched)
		}
	}
}

// TestMotorToZero checks the classic end point of an input-planetary
// layout: the pump at full stroke standing still, the motor swung back to
// exactly zero.
func TestMotorToZero(t *testing.T) {
	t.Parallel()
	wm := []units.AngularVelocity{units.RPM(1500)}
	// Lossless: at a standing pump the motor reaches exactly zero and its
	// ideal torque and flow are exactly zero.
	l := swingLoop(t, SwingUnstated, SwingToZero, nil, nil)
	var st LoopState
	if err := l.At(0, wm, units.Bar(300), &st); err != nil {
		t.Fatal(err)
	}
	if st.Settings[0] != 1 || st.Settings[1] != 0 {
		t.Errorf("settings %v, want [1 0]", st.Settings)
	}
	m := st.Motors[0]
	if m.IdealTorque != 0 || m.IdealFlow != 0 || m.Mode != Idle || m.Overall != 1 {
		t.Errorf("motor at zero: %+v", m)
	}
	checkLoopState(t, &st)
	// Lossy: the motor reaches zero at the pump speed that supplies the
	// leakage; a slower pump would need a negative motor setting, which a
	// to-zero motor reports as a setting limit.
	l = swingLoop(t, SwingUnstated, SwingToZero, demoWilson, nil)
	err := l.At(0, wm, units.Bar(300), &st)
	var le *LimitError
	if !errors.As(err, &le) || !errors.Is(err, ErrSettingLimit) || !(le.Value.SI < 0) || le.Limit.SI != 0 {
		t.Fatalf("lossy to-zero motor at a standing pump: %v, want a setting limit below 0", err)
	}
	// Find the pump speed where the motor setting is zero and check that
	// the pump flow there is the loop's leakage.
	lo, hi := 0.0, 300.0
	for range 60 {
		mid := (lo + hi) / 2
		if l.At(units.RPM(mid), wm, units.Bar(300), &st) != nil || st.Settings[1] == 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	if err := l.At(units.RPM(hi), wm, units.Bar(300), &st); err != nil {
		t.Fatal(err)
	}
	if !(st.Settings[1] >= 0 && st.Settings[1] < 1e-6) {
		t.Errorf("motor setting %v near the leakage speed, want just above 0", st.Settings[1])
	}
	// Hand calculation: with the motor at zero the pump's ideal flow is the
	// whole loop leakage.
	if got, want := float64(st.Pump.IdealFlow), float64(st.Leakage); math.Abs(got-want) > 1e-3*want {
		t.Errorf("pump ideal flow %v at the zero motor setting, want the leakage %v", got, want)
	}
}

func TestSwingLimits(t *testing.T) {
	t.Parallel()
	u := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(100), Swing: SwingToZero, Loss: demoWilson})
	if _, err := u.At(-0.1, units.RPM(1000), units.Bar(100), VG46, units.Celsius(50)); !errors.Is(err, ErrSettingLimit) {
		t.Errorf("to-zero unit at setting -0.1: %v, want ErrSettingLimit", err)
	}
	if _, err := u.PressureFor(-0.1, units.RPM(1000), 100, VG46, units.Celsius(50)); !errors.Is(err, ErrSettingLimit) {
		t.Errorf("to-zero unit PressureFor at setting -0.1: %v, want ErrSettingLimit", err)
	}
	p, err := u.At(0, units.RPM(1000), units.Bar(100), VG46, units.Celsius(50))
	if err != nil || p.IdealTorque != 0 || p.Mode != Idle {
		t.Errorf("to-zero unit at setting 0: %+v, %v", p, err)
	}
	if _, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(100), Swing: Swing(7)}); !errors.Is(err, ErrInvalid) {
		t.Errorf("unknown swing: %v, want ErrInvalid", err)
	}
	// A to-zero pump cannot reverse the loop's flow.
	l := swingLoop(t, SwingToZero, SwingOverCentre, demoWilson, nil)
	var st LoopState
	err = l.At(units.RPM(2000), []units.AngularVelocity{units.RPM(-800)}, units.Bar(200), &st)
	var le *LimitError
	if !errors.As(err, &le) || le.Quantity != "pump setting" || !(le.Value.SI < 0) {
		t.Errorf("to-zero pump asked to reverse: %v", err)
	}
	if st.Settings[0] != 0 {
		t.Errorf("to-zero pump setting %v, want 0", st.Settings[0])
	}
	// Solve with the motor held at zero: no pressure meets a torque demand.
	l = swingLoop(t, SwingUnstated, SwingOverCentre, demoWilson, nil)
	_, err = l.Solve(LoopInput{PumpSpeed: units.RPM(2000), MotorSpeeds: []units.AngularVelocity{units.RPM(1000)},
		MotorTorques: []units.Torque{-100}, MotorSettings: []float64{0}})
	if !errors.Is(err, ErrNoSolution) {
		t.Errorf("Solve with the motor at zero: %v, want ErrNoSolution", err)
	}
	for s, want := range map[Swing]string{SwingUnstated: "unstated", SwingToZero: "to zero", SwingOverCentre: "over centre", 9: "Swing(9)"} {
		if s.String() != want {
			t.Errorf("Swing(%d).String() = %q, want %q", int(s), s.String(), want)
		}
	}
}

func TestOverCentreAllocations(t *testing.T) {
	l := swingLoop(t, SwingUnstated, SwingOverCentre, demoWilson, nil)
	ml := swingLoop(t, SwingUnstated, SwingOverCentre, demoWilson, MinLoss{})
	wm := []units.AngularVelocity{units.RPM(1500)}
	var st LoopState
	_ = l.At(units.RPM(-100), wm, units.Bar(300), &st)
	for name, f := range map[string]func(){
		"Loop.At":    func() { _ = l.At(units.RPM(-100), wm, units.Bar(300), &st) },
		"MinLoss.At": func() { _ = ml.At(units.RPM(-100), wm, units.Bar(300), &st) },
	} {
		if n := testing.AllocsPerRun(50, f); n != 0 {
			t.Errorf("%s allocates %v times", name, n)
		}
	}
}

// TestMinLossOverCentreMirror: with the pump turning backwards an
// over-centre motor runs on the negative side; the state is the mirror of
// the forward one (pump speed, motor setting and pressure negated), so
// MinLoss must choose the mirrored setting.
func TestMinLossOverCentreMirror(t *testing.T) {
	t.Parallel()
	// Invented demo coefficients that make smaller settings pay at light
	// load (as in TestMinLossSchedule).
	w := Wilson{Slip: 5e-9, Viscous: 8e4, Friction: 0.02, ConstantPressure: units.Bar(3), Hydrodynamic: 30, LeakageSetting: 1, TorqueSetting: 1}
	l := swingLoop(t, SwingUnstated, SwingOverCentre, w, MinLoss{})
	wm := []units.AngularVelocity{units.RPM(600)}
	var fwd, rev LoopState
	if err := l.At(units.RPM(2000), wm, units.Bar(150), &fwd); err != nil {
		t.Fatal(err)
	}
	if err := l.At(units.RPM(-2000), wm, units.Bar(-150), &rev); err != nil {
		t.Fatal(err)
	}
	if !(fwd.Settings[1] > 0.2 && fwd.Settings[1] < 0.999) {
		t.Fatalf("forward MinLoss motor setting %v: the case should move it off full", fwd.Settings[1])
	}
	if !testutil.Close(rev.Settings[1], -fwd.Settings[1], 1e-6, 0) || !testutil.Close(rev.Settings[0], fwd.Settings[0], 1e-6, 0) {
		t.Errorf("reverse settings %v, want the mirror of %v", rev.Settings, fwd.Settings)
	}
	if !testutil.Close(float64(rev.Loss), float64(fwd.Loss), 1e-6, 0) {
		t.Errorf("reverse loss %v, forward %v", rev.Loss, fwd.Loss)
	}
	checkLoopState(t, &rev)
}
