package powersplit

import (
	"bytes"
	"encoding/csv"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// resultsLayout is a two-range output-coupled split with a relief setting
// low enough that a power sweep meets it.
func resultsLayout(t *testing.T) Layout {
	t.Helper()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Name: "slow", Ratio: 0.2}, {Name: "fast", Ratio: 0.4}}})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestCellCarriesUnitState checks that a sweep cell repeats the first
// loop's state of the point solved directly, and that the binding margin
// is the one with the least relative room.
func TestCellCarriesUnitState(t *testing.T) {
	t.Parallel()
	l := resultsLayout(t)
	sw, err := l.Sweep(SweepSpec{Range: 0, Input: units.RPM(2000), From: units.RPM(100), To: units.RPM(600), Steps: 6,
		Torque: units.NewtonMetres(1500), Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	n := 0
	for i, c := range sw.Cells() {
		if !c.OK {
			continue
		}
		n++
		p := Point{Range: 0, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: sw.Speeds[i], Torque: units.NewtonMetres(1500)}}}
		if err := s.Solve(p, &st); err != nil {
			t.Fatalf("Solve at %v: %v", sw.Speeds[i], err)
		}
		lp := st.Loops[0]
		got := []float64{float64(c.Pressure), float64(c.HighPressure), float64(c.PumpSpeed), float64(c.MotorSpeed), c.PumpSetting, c.MotorSetting}
		want := []float64{float64(lp.Pressure), float64(lp.High), float64(lp.Pump.Speed), float64(lp.Motors[0].Speed), lp.Pump.Setting, lp.Motors[0].Setting}
		if d := cmp.Diff(want, got); d != "" {
			t.Errorf("cell at %v differs from Solve (pressure, high, pump, motor speed, settings):\n%s", sw.Speeds[i], d)
		}
		if c.HighPressure <= 0 || math.Abs(float64(c.HighPressure)) < math.Abs(float64(c.Pressure)) {
			t.Errorf("high-line pressure %v below the loop's difference %v", c.HighPressure, c.Pressure)
		}
		if c.Binding.Limit.SI <= 0 {
			t.Fatalf("at %v: no binding margin in the cell", sw.Speeds[i])
		}
		if c.Binding.Element != st.Binding.Element || c.Binding.Quantity != st.Binding.Quantity ||
			!testutil.Close(c.Binding.Value.SI, st.Binding.Value.SI, 1e-9, 1e-12) {
			t.Errorf("at %v: cell binds on %s %s, the full state on %s %s", sw.Speeds[i],
				c.Binding.Element, c.Binding.Quantity, st.Binding.Element, st.Binding.Quantity)
		}
		// No margin that makes a point infeasible has less room (the rated
		// pressures are flags, not bounds).
		room := c.Binding.Left().SI / c.Binding.Limit.SI
		for _, m := range st.Margins {
			if m.Unchecked || m.Limit.SI <= 0 || m.Bound == "rated pressure" {
				continue
			}
			if m.Left().SI/m.Limit.SI < room-1e-12 {
				t.Errorf("at %v: margin %s %s has less room than the binding %s %s", sw.Speeds[i], m.Element, m.Quantity, c.Binding.Element, c.Binding.Quantity)
			}
		}
	}
	if n == 0 {
		t.Fatal("no feasible cell")
	}
}

// TestPowerSweepNamesTheLimit checks that a power sweep cell that cannot
// draw the power reports the limit that stopped it, as infeasible.
func TestPowerSweepNamesTheLimit(t *testing.T) {
	t.Parallel()
	l := resultsLayout(t)
	// 5 MW through a 100 cm³ loop: the relief setting or a unit limit
	// stops it long before.
	ivs, err := NewSolver(l).Interval(Point{Range: 0, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: 1}}})
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := ivs[0].Lo, ivs[0].Hi
	sw, err := l.Sweep(SweepSpec{Range: 0, Input: units.RPM(2000), From: lo + (hi-lo)/10, To: hi - (hi-lo)/10, Steps: 3,
		Power: units.Kilowatts(5000), Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range sw.Cells() {
		if c.OK {
			t.Fatalf("5 MW reached at %v", c.OutputSpeed)
		}
		var pe *PowerError
		var le *LimitError
		if !errors.As(c.Err, &pe) || !errors.As(c.Err, &le) || !errors.Is(c.Err, ErrInfeasible) {
			t.Errorf("at %v: %v; want a *PowerError around a *LimitError, infeasible", c.OutputSpeed, c.Err)
		}
		if c.Range != 0 {
			t.Errorf("at %v: range %d, want 0", c.OutputSpeed, c.Range)
		}
	}
}

// TestAutoFailureListsEveryRange checks that with Auto a failed cell has no
// range and one reason per range, by name.
func TestAutoFailureListsEveryRange(t *testing.T) {
	t.Parallel()
	l := resultsLayout(t)
	sw, err := l.Sweep(SweepSpec{Range: Auto, Input: units.RPM(2000), From: units.RPM(200), To: units.RPM(300), Steps: 2,
		Torque: units.NewtonMetres(1e5), Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range sw.Cells() {
		var re *RangesError
		if c.OK || !errors.As(c.Err, &re) {
			t.Fatalf("at %v: %v, want a *RangesError", c.OutputSpeed, c.Err)
		}
		if c.Range != Auto {
			t.Errorf("failed cell has range %d, want Auto", c.Range)
		}
		if len(re.Errs) != 2 || re.Ranges[0] != "slow" || re.Ranges[1] != "fast" || re.Errs[0] == nil || re.Errs[1] == nil {
			t.Errorf("reasons %q %v, want one per range", re.Ranges, re.Errs)
		}
		if msg := c.Reason(); !strings.Contains(msg, `"slow"`) || !strings.Contains(msg, `"fast"`) {
			t.Errorf("reason %q does not name both ranges", msg)
		}
		if !errors.Is(c.Err, ErrInfeasible) {
			t.Errorf("%v is not ErrInfeasible", c.Err)
		}
	}
}

// TestIntervalsOrderedAndReachable checks that every interval Interval
// returns is reachable inside and unreachable just outside its ends.
func TestIntervalsOrderedAndReachable(t *testing.T) {
	t.Parallel()
	l := resultsLayout(t)
	s := NewSolver(l)
	for rg := range l.Ranges() {
		p := Point{Range: rg, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: 1}}}
		ivs, err := s.Interval(p)
		if err != nil {
			t.Fatal(err)
		}
		for i, iv := range ivs {
			if iv.Hi < iv.Lo || (i > 0 && iv.Lo <= ivs[i-1].Hi) {
				t.Errorf("range %d: intervals %v not ordered and disjoint", rg, ivs)
			}
			mid := (float64(iv.Lo) + float64(iv.Hi)) / 2
			if !s.reachable(&p, rg, mid) {
				t.Errorf("range %d: middle of %v unreachable", rg, iv)
			}
			span := float64(iv.Hi - iv.Lo)
			if s.reachable(&p, rg, float64(iv.Hi)+1e-3*span+1e-9) && (i == len(ivs)-1 || float64(iv.Hi)+1e-3*span < float64(ivs[i+1].Lo)) {
				t.Errorf("range %d: just above %v still reachable", rg, iv)
			}
		}
	}
}

// TestCSVHeader pins the sweep and map CSV header: a name per quantity and
// its unit in every column.
func TestCSVHeader(t *testing.T) {
	t.Parallel()
	want := "design,input_speed_rpm,output_speed_rpm,output_torque_Nm,feasible,range,input_torque_Nm," +
		"input_power_kW,output_power_kW,loss_kW,efficiency_pct,hydraulic_share_pct,loop_pressure_bar," +
		"high_pressure_bar,pump_speed_rpm,motor_speed_rpm,pump_setting_pct,motor_setting_pct,binding_limit," +
		"binding_left_pct,reason"
	l := resultsLayout(t)
	sw, err := l.Sweep(SweepSpec{Design: "test split", Range: Auto, Input: units.RPM(1800), From: units.RPM(100), To: units.RPM(400),
		Steps: 3, Torque: units.NewtonMetres(800), Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := sw.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(recs[0], ","); got != want {
		t.Errorf("header\n%s\nwant\n%s", got, want)
	}
	for _, r := range recs[1:] {
		if r[0] != "test split" || r[1] != "1800" {
			t.Errorf("row %q: want the design and input speed", r)
		}
		if r[4] == "true" && r[5] != "slow" && r[5] != "fast" {
			t.Errorf("row %q: range %q is not a range name", r, r[5])
		}
	}
	if !testutil.Close(float64(sw.Input), float64(units.RPM(1800)), 0, 0) {
		t.Errorf("Sweep.Input = %v", sw.Input)
	}
}
