package powersplit

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// ocFront is ocLossless with a second motor (100 cm³/rev) driving axle 2
// through a gear of ratio 0.4, declutched above 600 rpm of the output.
// Invented numbers, round for hand calculation.
func ocFront(tb testing.TB, etaGear, eta0 float64, lossy bool, curve SettingCurve) Layout {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 100, motors: 2, lossy: lossy, wilson: demoWilson, sched: hydrostat.Sequential{MinMotorSetting: 0.05}})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(tb, testI0, eta0), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "field", Ratio: 0.5}}, GearEfficiency: etaGear,
		Second: &SecondMotor{Ratio: 0.4, DeclutchAbove: units.RPM(600), Setting: curve}})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

func TestSecondMotorLayout(t *testing.T) {
	t.Parallel()
	l := ocFront(t, 1, 1, false, SettingCurve{})
	if got := []string{l.RangeName(0), l.RangeName(1)}; got[0] != "field" || got[1] != "field single" {
		t.Fatalf("ranges = %v, want [field, field single]", got)
	}
	if o := l.Outputs(); len(o) != 2 || o[1] != "axle 2" {
		t.Fatalf("outputs = %v", o)
	}
	info, ok := l.SecondMotor()
	if !ok || info.Loop != 0 || info.Motor != 1 || info.Output != 1 || info.MaxSetting != 1 || info.DeclutchAbove != units.RPM(600) {
		t.Fatalf("SecondMotor() = %+v, %v", info, ok)
	}
	// A loop with one motor is refused, as is a curve outside the range.
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	if _, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp, Second: &SecondMotor{Ratio: 1, DeclutchAbove: 1}}); !errors.Is(err, ErrInput) {
		t.Errorf("one-motor loop with Second: err = %v, want ErrInput", err)
	}
	lp2 := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, motors: 2})
	bad := SettingCurve{Speeds: []units.AngularVelocity{0, 10}, Settings: []float64{1, 0.9}}
	if _, err := InputCoupled(InputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp2, Second: &SecondMotor{Ratio: 1, DeclutchAbove: 1, MaxSetting: 0.8, Setting: bad}}); !errors.Is(err, ErrInput) {
		t.Errorf("curve above MaxSetting: err = %v, want ErrInput", err)
	}
}

// TestSecondMotorTorqueSplit checks the torques on both axles of a lossless
// split with the front motor held at a setting against the ideal torques
// D·Δp of the units through each gear.
//
// Hand calculation: a motor of displacement D (m³/rad) at setting x under
// the loop pressure Δp gives the ideal torque x·D·Δp. The front motor
// drives axle 2 through ωaxle = R2·ωmotor, so T_front = x2·D2·Δp/R2. The
// rear: the pump's torque xp·Dp·Δp reaches the sun through ωpump = 1.2·ωsun
// (T_sun = 1.2·T_pump); a lossless set with Willis ωs − i0·ωr − (1−i0)·ωc = 0
// carries T_ring = −i0·T_sun; the first motor adds x1·D1·Δp/0.8 on the
// summing shaft and the range gear 0.5 gives T_rear = T_sum/0.5.
func TestSecondMotorTorqueSplit(t *testing.T) {
	t.Parallel()
	l := ocFront(t, 1, 1, false, SettingCurve{})
	s := NewSolver(l)
	var st State
	d := float64(units.CCPerRev(100))
	for _, c := range []struct{ v, x2, tq float64 }{
		{200, 0.6, 800}, {400, 0.3, 600}, {100, 1, 1000},
	} {
		w := units.RPM(c.v)
		p := Point{Range: 0, Input: units.RPM(2000),
			Outputs:  []OutputDemand{{Speed: w, Torque: units.NewtonMetres(c.tq)}, {Speed: w}},
			Settings: []MotorSetting{{Loop: 0, Motor: 1, Setting: c.x2}}}
		if err := s.Solve(p, &st); err != nil {
			t.Fatalf("v %v: %v", c.v, err)
		}
		lr := st.Loops[0]
		dp := float64(lr.Pressure)
		xp, x1, x2 := lr.Settings[0], lr.Settings[1], lr.Settings[2]
		if x2 != c.x2 {
			t.Errorf("front setting = %v, want the held %v", x2, c.x2)
		}
		front := x2 * d * dp / 0.4
		sun := 1.2 * xp * d * dp
		rear := (-testI0*sun + x1*d*dp/0.8) / 0.5
		if got := float64(st.Outputs[1].Torque); math.Abs(got-front) > 1e-9*math.Abs(front) {
			t.Errorf("v %v: front torque = %.9g, want x2·D·Δp/R2 = %.9g", c.v, got, front)
		}
		if got := float64(st.Outputs[0].Torque); math.Abs(got-rear) > 1e-9*math.Abs(rear) {
			t.Errorf("v %v: rear torque = %.9g, want hand calculation %.9g", c.v, got, rear)
		}
	}
}

// TestDeclutch checks the second motor's declutch speed: the margin to it
// reported below it, the clutched range refused above it, and the single
// range there with the front motor still, at zero setting and without
// drag.
func TestDeclutch(t *testing.T) {
	t.Parallel()
	curve := SettingCurve{Speeds: []units.AngularVelocity{units.RPM(300), units.RPM(550)}, Settings: []float64{1, 0}}
	l := ocFront(t, 0.98, 0.97, true, curve)
	s := NewSolver(l)
	var st State
	pt := func(rng int, rpm float64) Point {
		w := units.RPM(rpm)
		return Point{Range: rng, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: w, Torque: units.NewtonMetres(1500)}, {Speed: w}}}
	}
	if err := s.Solve(pt(0, 400), &st); err != nil {
		t.Fatal(err)
	}
	found := false
	for _, m := range st.Margins {
		if m.Quantity == "output speed" && m.Bound == boundRangeSpeed {
			found = true
			want := float64(units.RPM(600) - units.RPM(400))
			if math.Abs(m.Left().SI-want) > 1e-9*want || m.Left().Kind != units.AngularVelocityKind {
				t.Errorf("declutch margin = %v, want %v", m.Left(), units.AngularVelocity(want))
			}
		}
	}
	if !found {
		t.Errorf("no declutch margin in %v", st.Margins)
	}
	// On the curve: 1 at 300 rpm, 0 at 550: 0.6 at 400 rpm, driving.
	if x := st.Loops[0].Settings[2]; math.Abs(math.Abs(x)-0.6) > 1e-12 {
		t.Errorf("front setting at 400 rpm = %v, want ±0.6", x)
	}
	if m := st.Loops[0].Motors[1]; m.Mechanical > 0 {
		t.Errorf("front motor pumps (%v W): the curve's sign was not turned to drive", m.Mechanical)
	}
	err := s.Solve(pt(0, 650), &st)
	var le *LimitError
	if !errors.As(err, &le) || !errors.Is(err, ErrInfeasible) || le.Quantity != "output speed" {
		t.Fatalf("clutched range above the declutch speed: err = %v, want the output speed limit", err)
	}
	if err := s.Solve(pt(1, 650), &st); err != nil {
		t.Fatal(err)
	}
	m2 := st.Loops[0].Motors[1]
	if m2.Speed != 0 || m2.Setting != 0 || m2.Mechanical != 0 {
		t.Errorf("declutched front motor: speed %v, setting %v, shaft power %v; want all zero", m2.Speed, m2.Setting, m2.Mechanical)
	}
	if tq := st.Outputs[1].Torque; tq != 0 {
		t.Errorf("declutched axle 2 torque = %v, want 0", tq)
	}
	for _, m := range st.Margins {
		if m.Quantity == "output speed (range limit)" {
			t.Errorf("single range reports a range limit: %+v", m)
		}
	}
}

// TestSolveTotal checks that SolveTotal meets a total of both axles'
// torques and that the split follows the front motor's setting.
func TestSolveTotal(t *testing.T) {
	t.Parallel()
	l := ocFront(t, 0.98, 0.97, true, SettingCurve{})
	s := NewSolver(l)
	var st State
	w := units.RPM(250)
	total := TotalDemand{Torque: units.NewtonMetres(2000), Weights: []float64{1, 0.8}}
	prev := -1.0
	for _, x2 := range []float64{0.2, 0.5, 0.9} {
		p := Point{Input: units.RPM(1800), Outputs: []OutputDemand{{Speed: w}, {Speed: w}},
			Settings: []MotorSetting{{Loop: 0, Motor: 1, Setting: x2}}}
		if err := s.SolveTotal(p, total, &st); err != nil {
			t.Fatalf("x2 %v: %v", x2, err)
		}
		got := float64(st.Outputs[0].Torque) + 0.8*float64(st.Outputs[1].Torque)
		if math.Abs(got-2000) > 1e-8*2000 {
			t.Errorf("x2 %v: total = %v, want 2000", x2, got)
		}
		share := 0.8 * float64(st.Outputs[1].Torque) / got
		if share <= prev {
			t.Errorf("x2 %v: front share %v not above %v at a smaller setting", x2, share, prev)
		}
		prev = share
	}
}

// TestBestSetting checks that the chosen front setting has no more loss
// than a grid of others.
func TestBestSetting(t *testing.T) {
	t.Parallel()
	l := ocFront(t, 0.98, 0.97, true, SettingCurve{})
	s := NewSolver(l)
	var st State
	w := units.RPM(250)
	p := Point{Input: units.RPM(1800), Outputs: []OutputDemand{{Speed: w}, {Speed: w}}}
	total := &TotalDemand{Torque: units.NewtonMetres(2000)}
	// An invented loss outside the layout that falls as the front axle
	// takes more of the total (as tyre slip does).
	extra := func(st *State) (units.Power, error) {
		f := float64(st.Outputs[1].Torque) / 2000
		return units.Power(4000 * (f - 0.45) * (f - 0.45) * 10), nil
	}
	x, loss, err := s.BestSetting(p, SettingSearch{Loop: 0, Motor: 1, Total: total, Extra: extra}, &st)
	if err != nil {
		t.Fatal(err)
	}
	if st.Loops[0].Settings[2] != x {
		t.Errorf("state's front setting %v, want the best %v", st.Loops[0].Settings[2], x)
	}
	for i := 0; i <= 20; i++ {
		xi := float64(i) / 20
		p.Settings = []MotorSetting{{Loop: 0, Motor: 1, Setting: xi}}
		if err := s.SolveTotal(p, *total, &st); err != nil {
			continue
		}
		e, _ := extra(&st)
		if li := st.Loss + e; li < loss*(1-1e-6) {
			t.Errorf("setting %v loses %v < best %v at %v", xi, li, loss, x)
		}
	}
}

// genFront draws a lossy split (output- or input-coupled) with a front
// motor and a point on it: both axles at independent speeds (a turn makes
// the front axle faster), the front motor held by a curve or by the point.
func genFront(t *rapid.T) (string, Layout, Point) {
	kind := rapid.SampledFrom([]string{"output-coupled", "input-coupled"}).Draw(t, "builder")
	eta := rapid.Float64Range(0.94, 0.995).Draw(t, "gear efficiency")
	set, err := planetaryFromRatio(rapid.Float64Range(-3.5, -1.6).Draw(t, "i0"), rapid.Float64Range(0.94, 0.995).Draw(t, "basic efficiency"))
	if err != nil {
		t.Fatal(err)
	}
	k := rapid.Float64Range(0.2, 2).Draw(t, "loss scale")
	lm := hydrostat.Wilson{Slip: k * 1e-9, Viscous: k * 2e5, Friction: k * 0.01, ConstantPressure: units.Bar(k)}
	mk := func(label string) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(rapid.Float64Range(40, 160).Draw(t, label+" cc/rev")),
			Loss: lm, MaxSpeed: units.RPM(rapid.Float64Range(2500, 5000).Draw(t, label+" max rpm"))})
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	lp, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: mk("pump"), Motors: []hydrostat.Unit{mk("motor"), mk("front motor")}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(2000)})
	if err != nil {
		t.Fatal(err)
	}
	sm := &SecondMotor{Ratio: rapid.Float64Range(0.2, 0.8).Draw(t, "axle 2 ratio"), DeclutchAbove: units.RPM(rapid.Float64Range(100, 800).Draw(t, "declutch rpm"))}
	if rapid.Bool().Draw(t, "curve") {
		sm.Setting = SettingCurve{Speeds: []units.AngularVelocity{0, sm.DeclutchAbove}, Settings: []float64{rapid.Float64Range(0, 1).Draw(t, "curve start"), 0}}
	}
	var l Layout
	if kind == "output-coupled" {
		l, err = OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp,
			PumpRatio: rapid.Float64Range(0.4, 1.2).Draw(t, "pump ratio"), MotorRatio: rapid.Float64Range(0.5, 1.5).Draw(t, "motor ratio"),
			Ranges: genRanges(t, false), GearEfficiency: eta, Second: sm})
	} else {
		l, err = InputCoupled(InputCoupledSpec{Set: set, Loop: lp,
			PumpRatio: rapid.Float64Range(0.8, 1.6).Draw(t, "pump ratio"), InputRatio: rapid.Float64Range(0.7, 1.3).Draw(t, "input ratio"),
			Ranges: genRanges(t, false), GearEfficiency: eta, Second: sm})
	}
	if err != nil {
		t.Fatalf("%s: %v", kind, err)
	}
	turn := rapid.Float64Range(0.95, 1.3).Draw(t, "front over rear speed")
	p := Point{Range: rapid.IntRange(0, l.Ranges()-1).Draw(t, "range"), Input: units.RPM(rapid.Float64Range(900, 2300).Draw(t, "engine rpm")),
		Outputs: []OutputDemand{{Speed: units.RPM(1)}, {Speed: units.RPM(turn)}}}
	if sm.Setting.Empty() {
		p.Settings = []MotorSetting{{Loop: 0, Motor: 1, Setting: rapid.Float64Range(-1, 1).Draw(t, "front setting")}}
	}
	s := NewSolver(l)
	ivs, err := s.Interval(p)
	if err != nil {
		t.Skipf("range reaches nothing: %v", err)
	}
	iv := ivs[rapid.IntRange(0, len(ivs)-1).Draw(t, "interval")]
	lo, hi := iv.Lo, iv.Hi
	v := float64(lo) + (float64(hi)-float64(lo))*rapid.Float64Range(0.02, 0.98).Draw(t, "place in interval")
	p.Outputs[0].Speed = units.AngularVelocity(v)
	p.Outputs[1].Speed = units.AngularVelocity(v * turn)
	p.Outputs[0].Torque = units.NewtonMetres(math.Copysign(rapid.Float64Range(10, 1500).Draw(t, "output N·m"), v))
	return kind, l, p
}

// TestPropertyFrontMotorConservation: with every loss on, a split with a
// front motor conserves power across both outputs: each element's ports
// take its loss, the losses are >= 0, input = both outputs + losses.
func TestPropertyFrontMotorConservation(t *testing.T) {
	t.Parallel()
	solved := 0
	defer func() {
		t.Logf("%d points solved and checked", solved)
		if solved < 5 {
			t.Errorf("only %d points solved", solved)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		kind, l, p := genFront(t)
		s := NewSolver(l)
		var st State
		err := s.Solve(p, &st)
		if errors.Is(err, ErrInfeasible) || errors.Is(err, ErrUnreachable) || errors.Is(err, ErrSelfLocking) {
			t.Skipf("%s infeasible: %v", kind, err)
		}
		if err != nil {
			t.Fatalf("%s: %v", kind, err)
		}
		pin, pout := float64(st.InputPower), float64(st.OutputPower)
		if got := float64(st.Outputs[0].Power + st.Outputs[1].Power); got != pout {
			t.Fatalf("%s: output power %v is not the sum over both outputs %v", kind, pout, got)
		}
		scale := math.Abs(pin) + math.Abs(pout) + 1e-3*st.powerScale()
		loss := 0.0
		for _, e := range st.Elements {
			if e.Loss < 0 {
				t.Fatalf("%s: %s loss %v < 0", kind, e.Name, e.Loss)
			}
			loss += float64(e.Loss)
			if e.Kind == InputKind || e.Kind == OutputKind || e.Kind == FreeOutputKind || e.Kind == PTOKind {
				continue
			}
			sum := 0.0
			for _, q := range e.Ports {
				sum += float64(q.Power)
			}
			if math.Abs(sum-float64(e.Loss)) > 1e-9*scale {
				t.Fatalf("%s: %s ports take %g W, loss %v", kind, e.Name, sum, e.Loss)
			}
		}
		if r := math.Abs(pin - pout - loss); r > 1e-9*scale {
			t.Fatalf("%s: power balance residual %g of %g", kind, r/scale, scale)
		}
		if r := kinematicResidual(l, &st, p); r > 1e-12 {
			t.Fatalf("%s: kinematic residual %g", kind, r)
		}
		solved++
	})
}

// FuzzSolveTotal: any total, weights, speeds and held setting give an error
// or a finite state, never a panic or NaN.
func FuzzSolveTotal(f *testing.F) {
	f.Add(2000.0, 1.0, 0.8, 250.0, 260.0, 0.5, 1800.0)
	f.Add(-500.0, 1.0, 0.0, -100.0, 0.0, -1.0, 900.0)
	f.Add(1e30, 0.0, 1.0, 1e9, 1.0, 2.0, 0.0)
	l := ocFront(f, 0.98, 0.97, true, SettingCurve{})
	f.Fuzz(func(t *testing.T, total, w0, w1, rearRPM, frontRPM, x2, engineRPM float64) {
		s := NewSolver(l)
		var st State
		p := Point{Input: units.RPM(engineRPM), Outputs: []OutputDemand{{Speed: units.RPM(rearRPM)}, {Speed: units.RPM(frontRPM)}},
			Settings: []MotorSetting{{Loop: 0, Motor: 1, Setting: x2}}}
		err := s.SolveTotal(p, TotalDemand{Torque: units.NewtonMetres(total), Weights: []float64{w0, w1}}, &st)
		if err != nil {
			return
		}
		for _, o := range st.Outputs {
			if bad(float64(o.Torque)) || bad(float64(o.Power)) {
				t.Fatalf("non-finite output %+v", o)
			}
		}
		if bad(float64(st.InputPower)) || bad(float64(st.Loss)) {
			t.Fatalf("non-finite state: in %v loss %v", st.InputPower, st.Loss)
		}
	})
}
