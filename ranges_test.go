package powersplit

import (
	"bytes"
	"encoding/csv"
	"errors"
	"math"
	"slices"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// swapLayout is a two-range split whose ranges take the output from
// different planetary members, so a synchronous shift exists: range 1 from
// the ring (motor side) through gear r1, range 2 from the sun (pump side)
// through gear r2. Carrier on the engine.
func swapLayout(tb testing.TB, r1, r2 float64) Layout {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 100})
	b := NewBuilder()
	e, sn, rg, out := b.Shaft("engine"), b.Shaft("sun"), b.Shaft("ring"), b.Shaft("output")
	g1, g2 := b.Shaft("g1"), b.Shaft("g2")
	b.Input("engine", e)
	b.Planetary("set", mustSet(tb, testI0, 0.98), sn, rg, e)
	b.Loop("hydrostat", lp, sn, rg)
	b.Gear("range 1 gear", rg, g1, r1, 0.98)
	b.Gear("range 2 gear", sn, g2, r2, 0.98)
	b.Clutch("c1", g1, out)
	b.Clutch("c2", g2, out)
	b.Output("output", out)
	b.Range("1", "c1")
	b.Range("2", "c2")
	l, err := b.Build()
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

func TestShiftPoints(t *testing.T) {
	t.Parallel()
	const r1, r2 = 0.5, 0.05
	l := swapLayout(t, r1, r2)
	s := NewSolver(l)
	e := units.RPM(2000)
	p := Point{Input: e, Outputs: []OutputDemand{{Speed: units.RPM(1)}}}
	sp, err := s.ShiftPoints(p)
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: in range 1 ωring = v/r1 and, by Willis,
	// ωsun = i0·ωring + (1−i0)·ωengine; the range 2 clutch is synchronous
	// when r2·ωsun = v, so v = r2(1−i0)ωe / (1 − r2·i0/r1).
	want := r2 * (1 - testI0) * float64(e) / (1 - r2*testI0/r1)
	if len(sp) != 1 || !testutil.Close(float64(sp[0].Output), want, 1e-12, 0) {
		t.Fatalf("ShiftPoints = %+v, want one at %g rad/s", sp, want)
	}
	// At the shift point both ranges give the same state of every shaft.
	var a, b State
	p.Outputs[0] = OutputDemand{Speed: sp[0].Output, Torque: 200}
	p.Range = 0
	if err := s.Solve(p, &a); err != nil {
		t.Fatal(err)
	}
	p.Range = 1
	if err := s.Solve(p, &b); err != nil {
		t.Fatal(err)
	}
	if d := cmp.Diff(a.Shafts, b.Shafts, cmpopts.IgnoreFields(ShaftState{}, "Torque", "Power"), testutil.EquateApprox(1e-12, 1e-9)); d != "" {
		t.Errorf("shaft speeds differ at the shift:\n%s", d)
	}
	// The standard builder's range gears follow the summing shaft: no
	// synchronous point away from standstill.
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	oc, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}})
	if err != nil {
		t.Fatal(err)
	}
	if sp, _ := NewSolver(oc).ShiftPoints(Point{Input: e, Outputs: []OutputDemand{{Speed: 1}}}); len(sp) != 0 {
		t.Errorf("output-coupled with range gears after the sum: shift points %+v", sp)
	}
}

func TestInterval(t *testing.T) {
	t.Parallel()
	// Pure hydrostatic, lossless, Sequential with motor down to 0.2: the
	// output reaches ±(D_p/(0.2·D_m))·ωpump·r_range, and the pump's 3000 rpm
	// limit is not reached.
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 80, maxRPM: 6000})
	l, err := PureHydrostatic(PureHydrostaticSpec{PumpRatio: 1.1, Loop: lp, Ranges: []RangeGear{{Ratio: 0.1}}, GearEfficiency: 1})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	ivs, err := s.Interval(Point{Input: units.RPM(2000), Outputs: []OutputDemand{{}}})
	if err != nil {
		t.Fatal(err)
	}
	if len(ivs) != 1 {
		t.Fatalf("Interval = %v, want one interval", ivs)
	}
	lo, hi := ivs[0].Lo, ivs[0].Hi
	// Hand calculation: motor speed limit 6000 rpm binds before the setting
	// limit (100/(0.2·80)·2200 = 13750 rpm): output ±600 rpm.
	want := units.RPM(600)
	if !testutil.Close(float64(hi), float64(want), 1e-9, 0) || !testutil.Close(float64(lo), -float64(want), 1e-9, 0) {
		t.Errorf("Interval = [%v, %v], want ±%v", lo, hi, want)
	}
}

func TestBestAndPolicy(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 80, motors: 2, lossy: true, wilson: demoWilson})
	l, err := PureHydrostatic(PureHydrostaticSpec{PumpRatio: 1.1, Loop: lp, Ranges: []RangeGear{{Ratio: 0.5}},
		Second: &SecondMotor{Ratio: 0.5, DeclutchAbove: units.RPM(300)}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	pt := func(rpm float64) Point {
		return Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(rpm), Torque: 400}, {Speed: units.RPM(rpm)}}}
	}
	// Above the declutch speed only the single-motor range is feasible.
	if got := s.Feasible(pt(500), nil); len(got) != 1 || l.RangeName(got[0]) != "range 1 single" {
		t.Errorf("Feasible(500 rpm) = %v", got)
	}
	if err := s.Best(pt(500), nil, &st); err != nil || st.RangeName != "range 1 single" {
		t.Errorf("Best(500 rpm) = %v in %q", err, st.RangeName)
	}
	p := pt(500)
	p.Range = l.RangeIndex("range 1")
	if err := s.Solve(p, &st); !errors.Is(err, ErrInfeasible) {
		t.Errorf("two motors above the declutch speed: %v", err)
	}
	// Below it both are; the default policy takes the more efficient and a
	// policy of the caller may choose otherwise.
	if got := s.Feasible(pt(100), nil); len(got) != 2 {
		t.Fatalf("Feasible(100 rpm) = %v", got)
	}
	var e [2]float64
	for i := range e {
		p := pt(100)
		p.Range = i
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		e[i] = st.Efficiency
	}
	if err := s.Best(pt(100), nil, &st); err != nil || st.Efficiency != math.Max(e[0], e[1]) {
		t.Errorf("Best = %v, efficiency %g of %v", err, st.Efficiency, e)
	}
	if err := s.Best(pt(100), worst{}, &st); err != nil || st.Efficiency != math.Min(e[0], e[1]) {
		t.Errorf("Best(worst) = %v, efficiency %g of %v", err, st.Efficiency, e)
	}
	// The state Best returns is the state Solve gives in that range.
	var direct State
	p = pt(100)
	p.Range = st.Range
	if err := s.Solve(p, &direct); err != nil {
		t.Fatal(err)
	}
	if d := cmp.Diff(direct, st, cmp.AllowUnexported(State{})); d != "" {
		t.Errorf("Best state differs from Solve:\n%s", d)
	}
}

type worst struct{}

func (worst) Better(a, b *State) bool { return a.Efficiency < b.Efficiency }

func TestSweepAndMap(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}})
	if err != nil {
		t.Fatal(err)
	}
	// Progress is reported once per block of 16 cells (the calls are
	// serialised), done rising to the total.
	var dones []int
	spec := MapSpec{Range: Auto, Input: units.RPM(2000), SpeedFrom: units.RPM(-200), SpeedTo: units.RPM(1400), SpeedSteps: 17,
		TorqueFrom: units.NewtonMetres(100), TorqueTo: units.NewtonMetres(4000), TorqueSteps: 9, Workers: 1,
		Progress: func(done, total int) {
			if total != 17*9 {
				t.Errorf("progress total %d, want %d", total, 17*9)
			}
			dones = append(dones, done)
		}}
	m1, err := l.Map(spec)
	if err != nil {
		t.Fatal(err)
	}
	if len(dones) != 10 || dones[9] != 17*9 || !slices.IsSorted(dones) {
		t.Errorf("progress reported %v, want 10 calls rising to %d", dones, 17*9)
	}
	spec.Workers, spec.Progress = 4, nil
	m4, err := l.Map(spec)
	if err != nil {
		t.Fatal(err)
	}
	if d := cmp.Diff(m1, m4, cmp.AllowUnexported(Map{}, results{}, block{}, cell{}, marginName{}), cmpopts.IgnoreFields(block{}, "errs", "shapes")); d != "" {
		t.Errorf("map differs with 4 workers:\n%s", d)
	}
	ok, bad := 0, 0
	for i := range m1.Torques {
		for j := range m1.Speeds {
			c := m1.At(i, j)
			if c.OK {
				ok++
				continue
			}
			bad++
			if c.Reason() == "" || c.Err == nil {
				t.Errorf("infeasible cell without reason: %+v", c)
			}
			if r4 := m4.At(i, j).Reason(); r4 != c.Reason() {
				t.Errorf("cell %d,%d: reason %q with 1 worker, %q with 4", i, j, c.Reason(), r4)
			}
		}
	}
	if ok == 0 || bad == 0 {
		t.Errorf("%d feasible, %d infeasible cells; want both", ok, bad)
	}
	var buf bytes.Buffer
	if err := m1.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	rec, err := csv.NewReader(&buf).ReadAll()
	if err != nil || len(rec) != 1+17*9 {
		t.Errorf("CSV: %d records, %v", len(rec), err)
	}
	// Power sweep: every feasible point draws the asked input power.
	sw, err := l.Sweep(SweepSpec{Range: Auto, Input: units.RPM(2000), From: units.RPM(50), To: units.RPM(1200), Steps: 12,
		Power: units.Kilowatts(80)})
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, c := range sw.Cells() {
		if c.OK {
			n++
			if !testutil.Close(c.InputPower.Kilowatts(), 80, 1e-9, 0) {
				t.Errorf("sweep at %v: input %v", c.OutputSpeed, c.InputPower)
			}
		}
	}
	if n < 6 {
		t.Errorf("only %d feasible sweep points", n)
	}
	if _, err := l.Sweep(SweepSpec{Steps: 1}); !errors.Is(err, ErrInput) {
		t.Errorf("one step: %v", err)
	}
}

// TestSelfLocking: a compound split driven far outside its mechanical
// points, with strongly circulating power and lossy sets, has no consistent
// direction of its mesh losses: the solver reports ErrSelfLocking instead of
// a state that creates power.
//
// From memory: Epicyclic Drive Trains (1982), on self-locking of
// trains with circulating power. The point itself was found by the rapid
// property test.
func TestSelfLocking(t *testing.T) {
	t.Parallel()
	l, _, _ := compound(t, -1.6, -3.5, 0.94, false)
	s := NewSolver(l)
	var st State
	err := s.Solve(Point{Input: 94.2477796076938, Outputs: []OutputDemand{{Speed: -678.6074578966909, Torque: -10}}}, &st)
	if !errors.Is(err, ErrSelfLocking) {
		t.Fatalf("Solve = %v, want ErrSelfLocking", err)
	}
	// The same layout near its mechanical points solves.
	if err := solveNu(t, s, &st, 1.2, 300); err != nil {
		t.Fatal(err)
	}
}

func TestLimitErrors(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 0.5, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	cases := []struct {
		name     string
		out, tq  float64 // rpm, N·m
		sentinel error
		quantity string
	}{
		// relief 500 bar: far too much torque at low speed
		{"pressure", 100, 20000, ErrInfeasible, "high-line pressure"},
		// hand calculation: the motor turns at 5/0.8 = 6.25× the output, so
		// 1200 rpm out needs it at 7500 rpm, above its 4500 rpm (the pump,
		// at 0.5·(7000 − 12.5·1200) = −4000 rpm, is within its limit)
		{"motor speed", 1200, 100, ErrInfeasible, "motor 1 speed"},
		// hand calculation: the sun (pump side) stops at 7000/12.5 = 560 rpm
		// out, where the motor would need zero displacement; it stops at 0.2
		{"setting", 560, 100, ErrUnreachable, "motor setting"},
	}
	for _, c := range cases {
		err := s.Solve(Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(c.out), Torque: units.NewtonMetres(c.tq)}}}, &st)
		var le *LimitError
		if !errors.Is(err, c.sentinel) || !errors.As(err, &le) || le.Quantity != c.quantity {
			t.Errorf("%s: Solve = %v, want %v on %q", c.name, err, c.sentinel, c.quantity)
		}
	}
	if err := s.Solve(Point{Range: 3, Input: 1, Outputs: []OutputDemand{{}}}, &st); !errors.Is(err, ErrInput) {
		t.Errorf("range 3: %v", err)
	}
	if err := s.Solve(Point{Input: 1}, &st); !errors.Is(err, ErrInput) {
		t.Errorf("no outputs: %v", err)
	}
}
