package powersplit

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Regression tests of the hardening issue: every public entry point is
// either right or loud.

// TestInvalidMemberRefused: a member outside sun, ring and carrier is an
// *InputError naming its field, in both split builders. Before, an invalid
// Input built a different transmission (the set on the engine shaft, the
// input gear turning nothing) and an invalid Pump or Output failed with
// "two members of the set share one shaft".
func TestInvalidMemberRefused(t *testing.T) {
	t.Parallel()
	set := mustSet(t, testI0, 0.98)
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	bad := planetary.Member(7)
	for _, c := range []struct {
		field string
		build func() (Layout, error)
	}{
		{"Input", func() (Layout, error) {
			return OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, Input: bad, Pump: planetary.Sun, Output: planetary.Ring, InputRatio: 1.5})
		}},
		{"Pump", func() (Layout, error) {
			return OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, Input: planetary.Carrier, Pump: bad, Output: planetary.Ring})
		}},
		{"Output", func() (Layout, error) {
			return OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, Input: planetary.Carrier, Pump: planetary.Sun, Output: -1})
		}},
		{"Input", func() (Layout, error) {
			return InputCoupled(InputCoupledSpec{Set: set, Loop: lp, Input: bad, Motor: planetary.Sun, Output: planetary.Carrier})
		}},
		{"Motor", func() (Layout, error) {
			return InputCoupled(InputCoupledSpec{Set: set, Loop: lp, Input: planetary.Ring, Motor: bad, Output: planetary.Carrier})
		}},
	} {
		_, err := c.build()
		var ie *InputError
		if !errors.As(err, &ie) || ie.Field != c.field {
			t.Errorf("invalid %s: %v, want an *InputError naming %s", c.field, err, c.field)
		}
	}
}

// TestMemberDefaults: all members unset take the documented defaults; two
// given fix the third; one alone is an *InputError naming an unset field.
// Before, the zero Member was Sun, so one member set alone failed with an
// unrelated error.
func TestMemberDefaults(t *testing.T) {
	t.Parallel()
	set := mustSet(t, testI0, 0.98)
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	share := func(spec OutputCoupledSpec) float64 {
		t.Helper()
		spec.Set, spec.Loop, spec.PumpRatio, spec.MotorRatio = set, lp, 1.2, 0.8
		l, err := OutputCoupled(spec)
		if err != nil {
			t.Fatal(err)
		}
		var st State
		if err := solveNu(t, NewSolver(l), &st, 0.3, 200); err != nil {
			t.Fatal(err)
		}
		return st.HydraulicShare
	}
	def := share(OutputCoupledSpec{})
	explicit := share(OutputCoupledSpec{Input: planetary.Carrier, Pump: planetary.Sun, Output: planetary.Ring})
	two := share(OutputCoupledSpec{Input: planetary.Carrier, Pump: planetary.Sun})
	if def != explicit || two != explicit {
		t.Errorf("hydraulic share: defaults %v, explicit %v, two given %v; want all equal", def, explicit, two)
	}
	_, err := OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, Input: planetary.Sun})
	var ie *InputError
	if !errors.As(err, &ie) || ie.Field != "Pump" {
		t.Errorf("one member alone: %v, want an *InputError naming Pump", err)
	}
}

// TestGearToNowhere: Build flags a shaft whose only element is one gear.
func TestGearToNowhere(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	b := NewBuilder()
	in, m, idle := b.Shaft("in"), b.Shaft("motor"), b.Shaft("idle")
	b.Input("engine", in)
	b.Loop("hst", lp, in, m)
	b.Gear("stray", in, idle, 2, 1)
	b.Output("out", m)
	_, err := b.Build()
	var le *LayoutError
	if !errors.Is(err, ErrUnconnected) || !errors.As(err, &le) || le.Element != "idle" {
		t.Errorf("Build with a gear to nowhere: %v, want ErrUnconnected on shaft idle", err)
	}
}

// TestNoPanics: RangeName out of range and on the zero Layout, and Solve,
// SolveTotal, BestSetting and Best with a nil *State return instead of
// panicking.
func TestNoPanics(t *testing.T) {
	t.Parallel()
	l := benchLayout(t, false)
	for _, i := range []int{-1, l.Ranges(), 1 << 30} {
		if got := l.RangeName(i); got != "" {
			t.Errorf("RangeName(%d) = %q, want \"\"", i, got)
		}
	}
	if got := (Layout{}).RangeName(0); got != "" {
		t.Errorf("zero Layout: RangeName(0) = %q", got)
	}
	s := NewSolver(l)
	p := Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 100}}}
	if err := s.Solve(p, nil); !errors.Is(err, ErrInput) {
		t.Errorf("Solve(nil State) = %v, want ErrInput", err)
	}
	if err := s.Best(p, nil, nil); !errors.Is(err, ErrInput) {
		t.Errorf("Best(nil State) = %v, want ErrInput", err)
	}
	if err := s.SolveTotal(p, TotalDemand{Torque: 100}, nil); !errors.Is(err, ErrInput) {
		t.Errorf("SolveTotal(nil State) = %v, want ErrInput", err)
	}
	if _, _, err := s.BestSetting(p, SettingSearch{}, nil); !errors.Is(err, ErrInput) {
		t.Errorf("BestSetting(nil State) = %v, want ErrInput", err)
	}
}

// TestMeaninglessInput: a negative, zero or huge engine speed is an
// *InputError naming the field and giving the value in rpm, and the State
// then holds no point. Before, a negative speed solved (efficiency 0.473),
// zero gave the bare ErrSingular and 1e300 rad/s "loop 0 beyond limit 0";
// the State kept the previous point.
func TestMeaninglessInput(t *testing.T) {
	t.Parallel()
	l := benchLayout(t, false)
	s := NewSolver(l)
	for _, c := range []struct {
		in   units.AngularVelocity
		want string
	}{
		{units.RPM(-2000), "powersplit: invalid input: Input = -2000 rpm: the engine speed must be positive (the engine turns the input forwards)"},
		{0, "powersplit: invalid input: Input = 0 rpm: the engine speed must be positive (the engine turns the input forwards)"},
		{1e300, "powersplit: invalid input: Input = 9.5493e+300 rpm: above 100000 rpm, beyond any engine"},
	} {
		var st State
		if err := s.Solve(Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 100}}}, &st); err != nil {
			t.Fatal(err)
		}
		err := s.Solve(Point{Input: c.in, Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 100}}}, &st)
		var ie *InputError
		if !errors.As(err, &ie) || ie.Field != "Input" || err.Error() != c.want {
			t.Errorf("Input %v: %v, want %q", c.in, err, c.want)
		}
		if st.InputPower != 0 || st.Efficiency != 0 || len(st.Loops) != 0 || len(st.Outputs) != 0 {
			t.Errorf("Input %v: the State still holds a point: power %v, efficiency %v", c.in, st.InputPower, st.Efficiency)
		}
	}
	var st State
	for _, p := range []Point{
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.AngularVelocity(math.Inf(1))}}},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: 1e300}}},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 1e300}}},
	} {
		if err := s.Solve(p, &st); !errors.Is(err, ErrInput) {
			t.Errorf("Solve(%+v) = %v, want ErrInput", p, err)
		}
	}
}

// TestUnratedListed: a limit a unit's spec leaves at zero is listed in
// State.Margins as not checked and by Layout.Unrated; a rated one is not.
// Before, a zero MaxSpeed dropped the margin with no trace.
func TestUnratedListed(t *testing.T) {
	t.Parallel()
	for _, rpm := range []float64{0, 9000} {
		lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, maxRPM: rpm})
		l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8})
		if err != nil {
			t.Fatal(err)
		}
		var st State
		if err := solveNu(t, NewSolver(l), &st, 0.3, 200); err != nil {
			t.Fatal(err)
		}
		unchecked := map[string]bool{}
		for _, m := range st.Margins {
			if m.Unchecked {
				unchecked[m.Quantity+": "+m.Bound] = true
				if m.Value.SI == 0 {
					t.Errorf("unchecked margin %v carries no value", m)
				}
			}
		}
		want := map[string]bool{}
		if rpm == 0 {
			want = map[string]bool{"pump speed: maximum speed": true, "motor 1 speed: maximum speed": true}
		}
		if len(unchecked) != len(want) || (rpm == 0 && (!unchecked["pump speed: maximum speed"] || !unchecked["motor 1 speed: maximum speed"])) {
			t.Errorf("max speed %v rpm: unchecked margins %v, want %v", rpm, unchecked, want)
		}
		if got := l.Unrated(); len(got) != len(want) {
			t.Errorf("max speed %v rpm: Unrated() = %q", rpm, got)
		} else if rpm == 0 && got[0] != "hydrostat: pump speed: maximum speed not rated, not checked" {
			t.Errorf("Unrated()[0] = %q", got[0])
		}
	}
}

// TestStateResetEveryEntry: every entry that fills a State leaves it
// holding no point after an *InputError.
func TestStateResetEveryEntry(t *testing.T) {
	t.Parallel()
	l := benchLayout(t, false)
	s := NewSolver(l)
	good := Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 100}}}
	bad := Point{Input: -1, Outputs: good.Outputs}
	for name, call := range map[string]func(*State) error{
		"Best": func(st *State) error { return s.Best(bad, nil, st) },
		"SolveTotal": func(st *State) error {
			return s.SolveTotal(good, TotalDemand{Torque: 100, Weights: []float64{1, 2, 3}}, st)
		},
		"BestSetting": func(st *State) error { _, _, err := s.BestSetting(bad, SettingSearch{}, st); return err },
	} {
		var st State
		if err := s.Solve(good, &st); err != nil {
			t.Fatal(err)
		}
		if err := call(&st); !errors.Is(err, ErrInput) {
			t.Errorf("%s: %v, want ErrInput", name, err)
		}
		if st.InputPower != 0 || len(st.Outputs) != 0 {
			t.Errorf("%s: the State still holds the earlier point", name)
		}
	}
}

// TestSweepRefusesEngineSpeed: a sweep or map at a non-positive engine
// speed is refused up front, naming the field, not cell by cell.
func TestSweepRefusesEngineSpeed(t *testing.T) {
	t.Parallel()
	l := benchLayout(t, false)
	for _, in := range []units.AngularVelocity{units.RPM(-2000), 0} {
		_, err := l.Sweep(SweepSpec{Input: in, From: units.RPM(100), To: units.RPM(500), Steps: 3, Torque: 100})
		var ie *InputError
		if !errors.As(err, &ie) || ie.Field != "Input" {
			t.Errorf("Sweep at %v: %v, want an *InputError naming Input", in, err)
		}
		_, err = l.Map(MapSpec{Input: in, SpeedFrom: units.RPM(100), SpeedTo: units.RPM(500), SpeedSteps: 2, TorqueTo: 100, TorqueSteps: 2})
		if !errors.As(err, &ie) || ie.Field != "Input" {
			t.Errorf("Map at %v: %v, want an *InputError naming Input", in, err)
		}
	}
}
