package demo

import (
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// TestDemoShiftsSynchronously checks what the demo transmission is
// dimensioned for: its ranges change synchronously (every shaft at the same
// speed in both ranges), the first change where the pump reaches full
// stroke, and no power circulates between the shift points at a typical
// working power.
func TestDemoShiftsSynchronously(t *testing.T) {
	t.Parallel()
	sc, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	l, err := sc.Transmission.Layout()
	if err != nil {
		t.Fatal(err)
	}
	s := powersplit.NewSolver(l)
	in := units.RPM(1600)
	sps, err := s.ShiftPoints(powersplit.Point{Input: in, Outputs: []powersplit.OutputDemand{{Speed: 1}}})
	if err != nil {
		t.Fatal(err)
	}
	if len(sps) != l.Ranges()-1 {
		t.Fatalf("%d shift points for %d ranges: %+v", len(sps), l.Ranges(), sps)
	}
	// Hand calculation: at the first shift the pump (on the sun, 0.38 of
	// its speed) and the motor (on the ring, 1/0.84 of its speed) of equal
	// displacement pass the same flow at full stroke, so their speeds are
	// about equal: loop ratio near 1.
	if r := sps[0].Ratio; r < 0.9 || r > 1.1 {
		t.Errorf("first shift at loop ratio %.3f, want about 1 (pump at full stroke)", r)
	}
	bounds := []units.AngularVelocity{units.RPM(1)}
	for _, sp := range sps {
		bounds = append(bounds, sp.Output)
	}
	// The top of the last range: 40 km/h at this engine speed is beyond it,
	// so sweep to the range's reach.
	ivs, err := s.Interval(powersplit.Point{Range: l.Ranges() - 1, Input: in, Outputs: []powersplit.OutputDemand{{Speed: 1}}})
	if err != nil {
		t.Fatal(err)
	}
	_, hi := Widest(ivs)
	bounds = append(bounds, hi)
	for rg := range l.Ranges() {
		lo, top := bounds[rg], bounds[rg+1]
		sw, err := l.Sweep(powersplit.SweepSpec{Range: rg, Input: in, From: lo + (top-lo)/50, To: top - (top-lo)/50, Steps: 12,
			Power: units.Kilowatts(90), Workers: 1})
		if err != nil {
			t.Fatal(err)
		}
		n := 0
		for _, c := range sw.Cells() {
			if !c.OK {
				continue
			}
			n++
			if c.HydraulicShare < -0.02 {
				t.Errorf("range %s at %v: hydraulic share %.2f, want no circulating power between the shift points",
					l.RangeName(rg), c.OutputSpeed, c.HydraulicShare)
			}
		}
		if n == 0 {
			t.Errorf("range %s: no feasible point at 90 kW between its shift points", l.RangeName(rg))
		}
	}
}
