package powersplit

import (
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// BenchmarkSolveOutputCoupled solves one operating point of a two-range
// output-coupled split with lossy units, gears and set: 0 allocations per
// solve once the State has been used.
func BenchmarkSolveOutputCoupled(b *testing.B) {
	lp := makeLoop(b, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(b, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}, PTOs: []PTOSpec{{Ratio: 0.27}}})
	if err != nil {
		b.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	p := Point{Range: 1, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(700), Torque: units.NewtonMetres(1200)}},
		PTO: []units.Torque{units.NewtonMetres(150)}}
	if err := s.Solve(p, &st); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := s.Solve(p, &st); err != nil {
			b.Fatal(err)
		}
	}
}

func TestSolveAllocatesNothing(t *testing.T) {
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	p := Point{Range: 1, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(700), Torque: units.NewtonMetres(1200)}}}
	if err := s.Solve(p, &st); err != nil {
		t.Fatal(err)
	}
	if n := testing.AllocsPerRun(50, func() { _ = s.Solve(p, &st) }); n != 0 {
		t.Errorf("Solve allocates %v times per call", n)
	}
}
