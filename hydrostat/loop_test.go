package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// Invented demo coefficients (orders of magnitude as in doc.go).
var demoWilson = Wilson{Slip: 5e-9, Viscous: 5e4, Friction: 0.02, ConstantPressure: units.Bar(1), Hydrodynamic: 5,
	Compressibility: true, DeadVolume: 0.4, TorqueSetting: 0.3}

func demoLoop(t testing.TB, motors int, sched Schedule) Loop {
	t.Helper()
	pump := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3200),
		RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: demoWilson})
	ms := make([]Unit, motors)
	for i := range ms {
		ms[i] = mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: demoWilson, Kind: BentAxis})
	}
	l, err := NewLoop(LoopSpec{Pump: pump, Motors: ms, Oil: VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(25), Relief: units.Bar(450), Schedule: sched})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

func balance(st *LoopState) (resid, scale float64) {
	resid = float64(st.Pump.Flow)
	scale = math.Abs(float64(st.Pump.IdealFlow)) + float64(st.Pump.Leakage)
	for _, m := range st.Motors {
		resid -= float64(m.Flow)
		scale += math.Abs(float64(m.IdealFlow)) + float64(m.Leakage)
	}
	return resid, scale
}

func checkLoopState(t *testing.T, st *LoopState) {
	t.Helper()
	r, s := balance(st)
	if math.Abs(r) > 1e-12*s+1e-300 {
		t.Errorf("flow balance residual %g of %g", r, s)
	}
	sum := float64(st.Pump.Mechanical)
	for _, m := range st.Motors {
		sum += float64(m.Mechanical)
	}
	if !testutil.Close(sum, float64(st.Loss), 1e-9, 1e-9*float64(st.Input)+1e-12) {
		t.Errorf("Σ T·ω = %g, loss %g", sum, float64(st.Loss))
	}
	if !(st.Efficiency >= 0 && st.Efficiency <= 1) {
		t.Errorf("efficiency %v", st.Efficiency)
	}
}

func TestSequentialSchedule(t *testing.T) {
	t.Parallel()
	l := demoLoop(t, 1, nil)
	wp := units.RPM(2000)
	cases := []struct {
		name        string
		wm          units.AngularVelocity
		dp          units.Pressure
		pump, motor float64 // expected (approximately, from the ideal ratio)
		tol         float64
		wantErr     error
	}{
		// Hand calculation: ideal pump setting = (110/90)·(wm/wp) with the
		// motor at full; leakage adds a few per cent.
		// The demo units leak 5–10 % at these pressures, hence the 20 % band;
		// the flow balance itself is checked exactly.
		{"pump swinging", units.RPM(800), units.Bar(200), 110.0 / 90 * 0.4, 1, 0.2, nil},
		{"reverse", units.RPM(-800), units.Bar(200), -110.0 / 90 * 0.4, 1, 0.2, nil},
		{"braking (B high)", units.RPM(800), units.Bar(-150), 110.0 / 90 * 0.4, 1, 0.2, nil},
		// Hand calculation: pump at full, motor setting = (90/110)·(wp/wm).
		{"motor swinging", units.RPM(3000), units.Bar(200), 1, 90.0 / 110 * 2 / 3, 0.2, nil},
		{"motor standing", 0, units.Bar(300), 0.06, 1, 1, nil},
		{"beyond the range", units.RPM(9500), units.Bar(200), 1, 0.2, 1e-9, ErrSettingLimit},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			var st LoopState
			err := l.At(wp, []units.AngularVelocity{c.wm}, c.dp, &st)
			if !errors.Is(err, c.wantErr) && !(c.wantErr == nil && err == nil) {
				t.Fatalf("err = %v, want %v", err, c.wantErr)
			}
			if !testutil.Close(st.Settings[0], c.pump, c.tol, 0) || !testutil.Close(st.Settings[1], c.motor, c.tol, 0) {
				t.Errorf("settings = %v, want ≈ [%v %v]", st.Settings, c.pump, c.motor)
			}
			if c.wantErr == nil {
				checkLoopState(t, &st)
			}
			if c.name == "motor standing" && !(st.Settings[0] > 0 && st.Pump.Flow > 0 && st.Motors[0].Flow == st.Motors[0].Leakage) {
				t.Errorf("standing motor: pump %v flow %v, motor flow %v leak %v", st.Settings[0], st.Pump.Flow, st.Motors[0].Flow, st.Motors[0].Leakage)
			}
			if c.name == "braking (B high)" && !(st.Pump.Mode == Motoring && st.Motors[0].Mode == Pumping) {
				t.Errorf("braking modes: pump %v, motor %v", st.Pump.Mode, st.Motors[0].Mode)
			}
		})
	}
}

func TestLoopLimits(t *testing.T) {
	t.Parallel()
	l := demoLoop(t, 1, nil)
	var st LoopState
	err := l.At(units.RPM(2000), []units.AngularVelocity{units.RPM(1000)}, units.Bar(440), &st)
	var le *LimitError
	if !errors.As(err, &le) || !errors.Is(err, ErrPressureLimit) || le.Quantity != "high-line pressure" || le.Value != units.Of(units.Bar(465)) || le.Limit != units.Of(units.Bar(450)) {
		t.Errorf("relief err = %v", err)
	}
	if st.Pump.Flow == 0 {
		t.Errorf("state not filled at relief")
	}
	err = l.At(units.RPM(3500), []units.AngularVelocity{units.RPM(1000)}, units.Bar(100), &st)
	if !errors.Is(err, ErrSpeedLimit) {
		t.Errorf("pump overspeed err = %v", err)
	}
	if err := l.At(units.RPM(2000), nil, units.Bar(100), &st); !errors.Is(err, ErrInvalid) {
		t.Errorf("missing speeds err = %v", err)
	}
	if err := l.At(units.RPM(2000), []units.AngularVelocity{1}, units.Pressure(math.NaN()), &st); !errors.Is(err, ErrInvalid) {
		t.Errorf("NaN dp err = %v", err)
	}
	// All shafts standing under pressure: nothing can supply the leakage.
	if err := l.At(0, []units.AngularVelocity{0}, units.Bar(100), &st); !errors.Is(err, ErrNoSolution) && !errors.Is(err, ErrSettingLimit) {
		t.Errorf("all standing err = %v", err)
	}
	// All standing without pressure is a valid idle state.
	if err := l.At(0, []units.AngularVelocity{0}, 0, &st); err != nil || st.Efficiency != 1 || st.Loss != 0 {
		t.Errorf("idle: %v, η %v, loss %v", err, st.Efficiency, st.Loss)
	}
	for _, s := range []LoopSpec{
		{},
		{Pump: l.spec.Pump, Oil: VG46, Temperature: 330, Relief: units.Bar(400)},
		{Pump: l.spec.Pump, Motors: l.spec.Motors, Oil: VG46, Temperature: 330, Relief: units.Bar(20), Charge: units.Bar(25)},
		{Pump: l.spec.Pump, Motors: l.spec.Motors, Temperature: 330, Relief: units.Bar(400)},
		{Pump: l.spec.Pump, Motors: l.spec.Motors, Oil: VG46, Temperature: 330, Relief: units.Bar(400), Schedule: Sequential{MinMotorSetting: 2}},
	} {
		if _, err := NewLoop(s); !errors.Is(err, ErrInvalid) {
			t.Errorf("NewLoop err = %v", err)
		}
	}
}

func TestMinLossSchedule(t *testing.T) {
	t.Parallel()
	// Invented demo coefficients whose losses scale with the set
	// displacement, so that a smaller motor setting (at a higher pressure)
	// can pay at light load.
	w := Wilson{Slip: 5e-9, Viscous: 8e4, Friction: 0.02, ConstantPressure: units.Bar(3), Hydrodynamic: 30, LeakageSetting: 1, TorqueSetting: 1}
	pump := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(90), Loss: w})
	motor := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(110), Loss: w})
	mk := func(s Schedule) Loop {
		l, err := NewLoop(LoopSpec{Pump: pump, Motors: []Unit{motor}, Oil: VG46, Temperature: units.Celsius(60),
			Charge: units.Bar(25), Relief: units.Bar(450), Schedule: s})
		if err != nil {
			t.Fatal(err)
		}
		return l
	}
	seq, ml := mk(Sequential{}), mk(MinLoss{})
	for _, c := range []struct {
		wm units.AngularVelocity
		tq units.Torque
	}{{units.RPM(600), -60}, {units.RPM(1200), -100}, {units.RPM(1200), -400}, {units.RPM(2500), -80}} {
		in := LoopInput{PumpSpeed: units.RPM(2000), MotorSpeeds: []units.AngularVelocity{c.wm}, MotorTorques: []units.Torque{c.tq}}
		a, errA := seq.Solve(in)
		b, errB := ml.Solve(in)
		if errA != nil || errB != nil {
			t.Fatalf("Solve: %v, %v", errA, errB)
		}
		checkLoopState(t, &b)
		if !testutil.Close(float64(b.Motors[0].Torque), float64(c.tq), 1e-8, 0) {
			t.Errorf("MinLoss torque %v, want %v", b.Motors[0].Torque, c.tq)
		}
		// Brute force: the best fixed motor setting on a fine grid.
		best := math.Inf(1)
		for s := 0.2; s <= 1.0000001; s += 0.005 {
			in.MotorSettings = []float64{s}
			st, err := seq.Solve(in)
			if err == nil && float64(st.Loss) < best {
				best = float64(st.Loss)
			}
		}
		in.MotorSettings = nil
		t.Logf("wm %v, T %v: MinLoss %.1f W at s = %.3f, grid best %.1f W, Sequential %.1f W", c.wm, c.tq, float64(b.Loss), b.Settings[1], best, float64(a.Loss))
		if float64(b.Loss) > best*(1+1e-3) || float64(b.Loss) > float64(a.Loss)*(1+1e-9) {
			t.Errorf("wm %v, T %v: MinLoss loss %.1f W, grid best %.1f W, Sequential %.1f W (setting %.3f)",
				c.wm, c.tq, float64(b.Loss), best, float64(a.Loss), b.Settings[1])
		}
	}
	// With losses that scale with the maximum displacement, full motor
	// displacement is best: MinLoss gives the Sequential settings.
	l1, l2 := demoLoop(t, 2, nil), demoLoop(t, 2, MinLoss{})
	speeds := []units.AngularVelocity{units.RPM(600), units.RPM(600)}
	var x, y LoopState
	if err := l1.At(units.RPM(2000), speeds, units.Bar(250), &x); err != nil {
		t.Fatal(err)
	}
	if err := l2.At(units.RPM(2000), speeds, units.Bar(250), &y); err != nil {
		t.Fatal(err)
	}
	if x.Settings[1] != 1 || y.Settings[1] != 1 {
		t.Errorf("settings %v and %v, want full motors", x.Settings, y.Settings)
	}
}

func TestLoopSolve(t *testing.T) {
	t.Parallel()
	l := demoLoop(t, 1, nil)
	in := LoopInput{PumpSpeed: units.RPM(2000), MotorSpeeds: []units.AngularVelocity{units.RPM(1200)},
		MotorTorques: []units.Torque{-300}}
	st, err := l.Solve(in)
	if err != nil {
		t.Fatal(err)
	}
	if !testutil.Close(float64(st.Motors[0].Torque), -300, 1e-8, 0) {
		t.Errorf("motor torque %v, want −300 N·m", st.Motors[0].Torque)
	}
	checkLoopState(t, &st)
	// Hand calculation: ideal pressure 300/(110e-6/2π) = 171 bar; losses add some.
	if p := st.Pressure.Bar(); !(p > 171 && p < 200) {
		t.Errorf("pressure %v bar", p)
	}
	// Fixed motor setting: the pump setting follows from continuity.
	in.MotorSettings = []float64{0.6}
	st, err = l.Solve(in)
	if err != nil || st.Settings[1] != 0.6 || !testutil.Close(float64(st.Motors[0].Torque), -300, 1e-8, 0) {
		t.Errorf("fixed setting: %v, settings %v, torque %v", err, st.Settings, st.Motors[0].Torque)
	}
	checkLoopState(t, &st)
	// Beyond relief.
	in.MotorSettings = nil
	in.MotorTorques = []units.Torque{-1000}
	st, err = l.Solve(in)
	var le *LimitError
	if !errors.As(err, &le) || le.Quantity != "high-line pressure needed" || !(le.Value.SI > float64(units.Bar(450))) || st.High != units.Bar(450) {
		t.Errorf("beyond relief: %v, high %v", err, st.High)
	}
	// Overrun: the load drives the motor, the loop brakes (B high).
	in.MotorTorques = []units.Torque{200}
	st, err = l.Solve(in)
	if err != nil || !(st.Pressure < 0) || st.Motors[0].Mode != Pumping {
		t.Errorf("overrun: %v, dp %v, motor %v", err, st.Pressure, st.Motors[0].Mode)
	}
}

func TestAllocations(t *testing.T) {
	l := demoLoop(t, 2, nil)
	ml := demoLoop(t, 2, MinLoss{})
	speeds := []units.AngularVelocity{units.RPM(1500), units.RPM(1500)}
	var st LoopState
	_ = l.At(units.RPM(2000), speeds, units.Bar(250), &st)
	u := l.spec.Pump
	oil, temp := VG46, units.Celsius(60)
	for name, f := range map[string]func(){
		"Unit.At":       func() { _, _ = u.At(0.7, units.RPM(2000), units.Bar(250), oil, temp) },
		"Loop.At":       func() { _ = l.At(units.RPM(2000), speeds, units.Bar(250), &st) },
		"Loop.At(rev)":  func() { _ = l.At(units.RPM(-2000), speeds, units.Bar(-250), &st) },
		"MinLoss.At":    func() { _ = ml.At(units.RPM(2000), speeds, units.Bar(250), &st) },
		"Unit.Pressure": func() { _, _ = u.PressureFor(0.7, units.RPM(2000), 200, oil, temp) },
	} {
		if n := testing.AllocsPerRun(50, f); n != 0 {
			t.Errorf("%s allocates %v times", name, n)
		}
	}
}

func TestLoopSettingsAndTwoMotors(t *testing.T) {
	t.Parallel()
	l := demoLoop(t, 2, nil)
	set := make([]float64, 3)
	// Speed ratio 0.3 for both motors: pump swings, motors full.
	wp := units.RPM(2000)
	if err := l.Settings(wp, []units.AngularVelocity{0.3 * wp, 0.3 * wp}, units.Bar(200), set); err != nil || set[1] != 1 || set[2] != 1 || !(set[0] > 0 && set[0] < 1) {
		t.Errorf("Settings = %v, %v", set, err)
	}
	if err := l.Settings(wp, []units.AngularVelocity{wp}, units.Bar(200), set); !errors.Is(err, ErrInvalid) {
		t.Errorf("wrong length err = %v", err)
	}
	// Two equal motors with equal demands at different speeds: their loss
	// torques differ a little, so one pressure meets the demands in the
	// least-squares sense: the sum exactly, each within a fraction of a per cent.
	st, err := l.Solve(LoopInput{PumpSpeed: wp, MotorSpeeds: []units.AngularVelocity{units.RPM(500), units.RPM(700)},
		MotorTorques: []units.Torque{-250, -250}})
	if err != nil {
		t.Fatal(err)
	}
	for i, m := range st.Motors {
		if !testutil.Close(float64(m.Torque), -250, 5e-3, 0) {
			t.Errorf("motor %d torque %v, want ≈ −250 N·m", i, m.Torque)
		}
	}
	if sum := float64(st.Motors[0].Torque + st.Motors[1].Torque); !testutil.Close(sum, -500, 1e-8, 0) {
		t.Errorf("sum of motor torques %v, want −500 N·m", sum)
	}
	checkLoopState(t, &st)
}

func TestLoopFourQuadrants(t *testing.T) {
	t.Parallel()
	l := demoLoop(t, 1, nil)
	// Common practice (no published source): forward drive has the pump's
	// outlet A high; overrun (the load drives) makes B high; reverse swaps
	// the pump setting's sign and with it which line drive makes high.
	for _, c := range []struct {
		name       string
		wm         units.AngularVelocity
		dp         units.Pressure
		pump, motr Mode
	}{
		{"forward drive", units.RPM(1000), units.Bar(200), Pumping, Motoring},
		{"forward overrun", units.RPM(1000), units.Bar(-200), Motoring, Pumping},
		{"reverse drive", units.RPM(-1000), units.Bar(-200), Pumping, Motoring},
		{"reverse overrun", units.RPM(-1000), units.Bar(200), Motoring, Pumping},
	} {
		var st LoopState
		if err := l.At(units.RPM(2000), []units.AngularVelocity{c.wm}, c.dp, &st); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if st.Pump.Mode != c.pump || st.Motors[0].Mode != c.motr {
			t.Errorf("%s: pump %v, motor %v, want %v, %v", c.name, st.Pump.Mode, st.Motors[0].Mode, c.pump, c.motr)
		}
		if (c.pump == Pumping) != (st.Pump.Mechanical > 0) || (c.motr == Motoring) != (st.Motors[0].Mechanical < 0) {
			t.Errorf("%s: shaft powers pump %v, motor %v", c.name, st.Pump.Mechanical, st.Motors[0].Mechanical)
		}
		if math.Signbit(st.Settings[0]) != math.Signbit(float64(c.wm)) {
			t.Errorf("%s: pump setting %v", c.name, st.Settings[0])
		}
		checkLoopState(t, &st)
	}
}

// TestLoopTrial checks that Trial fills the same state as At, reports a
// crossed limit by its bare sentinel (the limit itself in st.Limit, equal
// to At's *LimitError) and allocates nothing, at limits too.
func TestLoopTrial(t *testing.T) {
	// Not parallel: testing.AllocsPerRun.
	l := demoLoop(t, 1, nil)
	cases := []struct {
		name   string
		wp, wm float64 // rpm
		bar    float64
		want   error
	}{
		{"inside", 2000, 1000, 200, nil},
		{"relief", 2000, 1000, 440, ErrPressureLimit},
		{"pump speed", 3500, 1000, 100, ErrSpeedLimit},
		{"motor speed", 2000, 4200, 100, ErrSpeedLimit},
		{"motor setting", 500, 3000, 100, ErrSettingLimit},
	}
	for _, c := range cases {
		ms := []units.AngularVelocity{units.RPM(c.wm)}
		var a, b LoopState
		errA := l.At(units.RPM(c.wp), ms, units.Bar(c.bar), &a)
		errB := l.Trial(units.RPM(c.wp), ms, units.Bar(c.bar), &b)
		if errB != c.want || (c.want == nil) != (errA == nil) || (c.want != nil && !errors.Is(errA, c.want)) {
			t.Errorf("%s: At %v, Trial %v; want %v", c.name, errA, errB, c.want)
			continue
		}
		if !cmp.Equal(a, b, cmpopts.EquateErrors()) {
			t.Errorf("%s: states differ:\n%s", c.name, cmp.Diff(a, b, cmpopts.EquateErrors()))
		}
		if le, ok := errors.AsType[*LimitError](errA); ok && *le != b.Limit {
			t.Errorf("%s: At's error %+v, Trial's state.Limit %+v", c.name, *le, b.Limit)
		}
		if c.want == nil && b.Limit.Err != nil {
			t.Errorf("%s: Limit %+v without an error", c.name, b.Limit)
		}
		if n := testing.AllocsPerRun(20, func() { _ = l.Trial(units.RPM(c.wp), ms, units.Bar(c.bar), &b) }); n != 0 {
			t.Errorf("%s: Trial allocates %v times", c.name, n)
		}
	}
}
