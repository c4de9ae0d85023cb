package powersplit

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// TestErrorTexts pins the text of the errors users meet most: values in the
// trade's units (bar, rpm, cm³/rev), wording that says what happened, and no
// cause repeated after its own numbers.
func TestErrorTexts(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 0.5, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	solve := func(p Point) error {
		var st State
		return s.Solve(p, &st)
	}
	at := func(out float64) Point {
		return Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(out), Torque: units.NewtonMetres(100)}}}
	}
	unit, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3000),
		RatedPressure: units.Bar(420), PeakPressure: units.Bar(480)})
	if err != nil {
		t.Fatal(err)
	}
	unitAt := func(w float64, dp units.Pressure) error {
		_, err := unit.At(0.5, units.RPM(w), dp, hydrostat.VG46, units.Celsius(60))
		return err
	}
	_, badUnit := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(-75)})
	cause := &hydrostat.LimitError{Quantity: "high-line pressure", Value: units.Of(units.Bar(2560)), Bound: "relief setting",
		Limit: units.Of(units.Bar(450)), Err: hydrostat.ErrPressureLimit}
	for _, c := range []struct {
		name string
		err  error
		want string
	}{
		// Hand calculation (TestLimitErrors): the motor turns at 6.25 times
		// the output, 7500 rpm at 1200 rpm out.
		{"unit speed", solve(at(1200)),
			"powersplit: operating point infeasible: hydrostat: motor 1 speed 7500 rpm above maximum speed 4500 rpm"},
		{"relief, with its cause", &LimitError{Element: "hydrostat", Quantity: cause.Quantity, Value: cause.Value, Bound: cause.Bound,
			Limit: cause.Limit, Err: ErrInfeasible, Cause: cause},
			"powersplit: operating point infeasible: hydrostat: high-line pressure 2560 bar above relief setting 450 bar"},
		{"loop failure without a value", &LimitError{Element: "hydrostat", Err: ErrInfeasible, Cause: hydrostat.ErrOutsideMap},
			"powersplit: operating point infeasible: hydrostat: hydrostat: operating point outside the measured map"},
		{"no such range", solve(Point{Range: 3, Input: units.RPM(2000), Outputs: []OutputDemand{{}}}),
			"powersplit: invalid input: Range = 3: no such range"},
		{"NaN engine speed", solve(Point{Input: units.AngularVelocity(math.NaN()), Outputs: []OutputDemand{{}}}),
			"powersplit: invalid input: Input = NaN rpm: not finite"},
		{"hydrostat overspeed", unitAt(3500, units.Bar(100)),
			"hydrostat: unit speed 3500 rpm above maximum speed 3000 rpm"},
		{"hydrostat peak pressure", unitAt(1000, units.Bar(500)),
			"hydrostat: unit pressure 500 bar above peak pressure 480 bar"},
		{"negative displacement", badUnit,
			"hydrostat: invalid input: maximum displacement -75 cm³/rev must be finite and non-negative"},
		{"margin crossed", errorf(Margin{Element: "hydrostat", Quantity: "pump pressure", Value: units.Of(units.Bar(430)),
			Bound: "rated pressure", Limit: units.Of(units.Bar(420))}),
			"hydrostat: pump pressure 430 bar above rated pressure 420 bar"},
		{"margin unrated", errorf(Margin{Element: "hydrostat", Quantity: "motor 1 speed", Value: units.Of(units.RPM(2500)),
			Bound: "maximum speed", Unchecked: true}),
			"hydrostat: motor 1 speed 2500 rpm, maximum speed not rated: not checked"},
	} {
		if c.err == nil {
			t.Errorf("%s: no error, want %q", c.name, c.want)
			continue
		}
		if got := c.err.Error(); got != c.want {
			t.Errorf("%s:\n got %q\nwant %q", c.name, got, c.want)
		}
	}
}

// textErr lets a Stringer stand in the table of error texts.
type textErr struct{ s string }

func (e textErr) Error() string { return e.s }

func errorf(m Margin) error { return textErr{m.String()} }

// TestDuplicateRangeName: two ranges of one name are reported as such, not
// as the duplicate shaft the builder would make of them.
func TestDuplicateRangeName(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	_, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 0.5, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "field", Ratio: 0.2}, {Name: "field", Ratio: 0.4}}})
	want := `powersplit: invalid layout: "field": duplicate range name (Ranges[1])`
	if err == nil || err.Error() != want {
		t.Errorf("OutputCoupled with two ranges named field: %v, want %q", err, want)
	}
}
