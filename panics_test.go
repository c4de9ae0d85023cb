package powersplit

import (
	"io"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// TestNoPanicsOnPublicEntries calls the exported functions and methods of
// the package with the zero values and bad arguments a user can hand them:
// each must return (an error or a documented zero result), never panic.
// NewSolver on the zero Layout is the one documented panic (programmer
// error) and is checked to panic.
func TestNoPanicsOnPublicEntries(t *testing.T) {
	t.Parallel()
	call := func(name string, f func()) {
		t.Helper()
		defer func() {
			if r := recover(); r != nil {
				t.Errorf("%s panics: %v", name, r)
			}
		}()
		f()
	}
	var zero Layout
	call("zero Layout methods", func() {
		_ = zero.Ranges()
		_ = zero.RangeName(0)
		_ = zero.RangeIndex("x")
		_ = zero.Shafts()
		_ = zero.Outputs()
		_ = zero.PTOs()
		_, _ = zero.Elements()
		_ = zero.Valid()
		_ = zero.Unrated()
		_, _ = zero.SecondMotor()
		_, _ = zero.Drags()
		_, _ = zero.WithLosses(NoLoad{})
		_, _ = zero.Sweep(SweepSpec{})
		_, _ = zero.Map(MapSpec{})
	})
	call("zero results", func() {
		_ = Cell{}.Reason()
		_ = Map{}.Feasible()
		_ = Sweep{}.WriteCSV(io.Discard)
		_ = Map{}.WriteCSV(io.Discard)
		_ = Margin{}.String()
		_ = Margin{}.Left()
		_ = (&LimitError{}).Error()
		_ = (&InputError{}).Error()
		_ = (&LayoutError{}).Error()
		_ = (&KinematicsError{}).Error()
		_ = (&ConvergenceError{}).Error()
	})
	call("Builder with bad shafts and names", func() {
		b := NewBuilder()
		b.Gear("g", -1, 7, 1, 1)
		b.Planetary("p", mustSet(t, testI0, 0.98), 0, 1, 2)
		b.Loop("l", hydrostat.Loop{}, 3)
		b.Clutch("c", 5, -2)
		b.Brake("b", 9)
		b.Input("in", -1)
		b.Output("out", 100)
		b.FreeOutput("free", 100)
		b.PTO("pto", -3, math.NaN(), 2)
		b.Range("r", "nothing")
		b.RangeLimit("r", units.AngularVelocity(math.Inf(1)))
		b.ReverseShare("none")
		b.HoldMotor("r", "l", 9, 0.5)
		b.MotorSchedule("l", -1, SettingCurve{})
		b.LockedRange("r")
		_, _ = b.Build()
		_, _ = NewBuilder().Build()
	})
	call("builders with zero specs", func() {
		_, _ = OutputCoupled(OutputCoupledSpec{})
		_, _ = InputCoupled(InputCoupledSpec{})
		_, _ = PureHydrostatic(PureHydrostaticSpec{})
		_, _ = PureHydrostatic(PureHydrostaticSpec{Second: &SecondMotor{}})
	})
	l := benchLayout(t, true)
	s := NewSolver(l)
	var st State
	for _, p := range []Point{
		{},
		{Range: -5, Input: units.RPM(2000)},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{}, {}}},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300)}}, PTO: []units.Torque{1, 2, 3}},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300)}}, Settings: []MotorSetting{{Loop: 7, Motor: -1, Setting: 3}}},
		{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.AngularVelocity(math.NaN())}}},
	} {
		call("Solver entries", func() {
			_ = s.Solve(p, &st)
			_ = s.Solve(p, nil)
			_, _ = s.Interval(p)
			_, _ = s.ShiftPoints(p)
			_ = s.Feasible(p, nil)
			_ = s.Best(p, nil, &st)
			_ = s.Best(p, nil, nil)
			_ = s.SolveTotal(p, TotalDemand{Weights: []float64{1, 2, 3}}, &st)
			_, _, _ = s.BestSetting(p, SettingSearch{Loop: 3, Motor: 9}, &st)
			_ = s.Layout()
		})
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("NewSolver on the zero Layout does not panic as documented")
			}
		}()
		NewSolver(zero)
	}()
}
