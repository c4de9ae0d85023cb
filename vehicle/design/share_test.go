package design

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// losslessSplit is a single-range input-coupled split with lossless gears,
// set and units, and its solver's hydraulic share at an output speed.
type losslessSplit struct {
	engine units.AngularVelocity
	torque units.Torque
}

func (ls losslessSplit) layout(t testing.TB, ratio float64) powersplit.Layout {
	t.Helper()
	set, err := planetary.FromRatio(-2.5, 1)
	if err != nil {
		t.Fatal(err)
	}
	pump, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100)})
	if err != nil {
		t.Fatal(err)
	}
	motor, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100)})
	if err != nil {
		t.Fatal(err)
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: []hydrostat.Unit{motor}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(50), Relief: units.Bar(2000)})
	if err != nil {
		t.Fatal(err)
	}
	l, err := powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.2, GearEfficiency: 1,
		Ranges: []powersplit.RangeGear{{Name: "only", Ratio: ratio}}})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// share returns the solver's signed hydraulic share at output speed out.
func (ls losslessSplit) share(s *powersplit.Solver, st *powersplit.State, out units.AngularVelocity) (float64, error) {
	err := s.Solve(powersplit.Point{Input: ls.engine, Outputs: []powersplit.OutputDemand{{Speed: out, Torque: ls.torque}}}, st)
	return st.HydraulicShare, err
}

// TestSolverOptimumShare: the solver's hydraulic share of a lossless
// input-coupled split follows ε(ν) = 1 − νM/ν, and a search over the range
// ratio that minimises the largest |ε| over a required output speed range
// [ν1, ν2] finds the closed-form optimum νM* = 2·ν1·ν2/(ν1 + ν2), the
// harmonic mean of the range's ends.
// Source: SAE paper 680549 (1968), Hydrostatic power-splitting
// transmissions for wheeled vehicles — classification and theory of
// operation (the share of an input-coupled split); the optimum by hand
// from it: |ε| is monotone in ν, so the largest |ε| is least when
// νM/ν1 − 1 = 1 − νM/ν2.
func TestSolverOptimumShare(t *testing.T) {
	t.Parallel()
	ls := losslessSplit{engine: units.RPM(2000), torque: units.NewtonMetres(500)}
	l1 := ls.layout(t, 1)
	s := powersplit.NewSolver(l1)
	var st powersplit.State
	// The mechanical point of the ratio-1 layout: where the share changes
	// sign (the motor stands), found by bisection on the solver alone.
	ivs, err := s.Interval(powersplit.Point{Input: ls.engine, Outputs: []powersplit.OutputDemand{{}}})
	if err != nil || len(ivs) == 0 {
		t.Fatalf("Interval: %v, %v", ivs, err)
	}
	iv := ivs[len(ivs)-1]
	t.Logf("ratio 1 reaches %.6g to %.6g rpm", iv.Lo.RPM(), iv.Hi.RPM())
	lo, hi := max(iv.Lo, units.RPM(10))*1.001, iv.Hi*0.999
	elo, err := ls.share(s, &st, lo)
	if err != nil {
		t.Fatal(err)
	}
	if ehi, err := ls.share(s, &st, hi); err != nil || math.Signbit(elo) == math.Signbit(ehi) {
		t.Fatalf("share %g at %v and %g at %v (%v): no mechanical point between", elo, lo, ehi, hi, err)
	}
	for range 100 {
		mid := (lo + hi) / 2
		e, err := ls.share(s, &st, mid)
		if err != nil {
			t.Fatal(err)
		}
		if math.Signbit(e) == math.Signbit(elo) {
			lo = mid
		} else {
			hi = mid
		}
	}
	nuM := float64(lo+hi) / 2 / float64(ls.engine)
	// The share relation of SAE paper 680549 at a few speed ratios.
	for _, nu := range []float64{0.6 * nuM, 0.8 * nuM, 1.2 * nuM, 1.5 * nuM} {
		e, err := ls.share(s, &st, units.AngularVelocity(nu*float64(ls.engine)))
		if err != nil {
			t.Fatal(err)
		}
		if want := 1 - nuM/nu; math.Abs(e-want) > 1e-9 {
			t.Errorf("share at ν = %.4g: solver %.12g, 1 − νM/ν = %.12g", nu, e, want)
		}
	}
	// The design problem: output speeds ν1..ν2 (of engine speed) required;
	// the range ratio r scales the mechanical point to r·νM.
	nu1, nu2 := 0.5*nuM, 2.5*nuM
	p := Problem{
		Space:      Space{Name: "range ratio", Params: []Param{{Name: "ratio", Lo: 0.2, Hi: 3}}},
		Objectives: []string{"largest share"},
		Evaluate: func(x []float64) ([]float64, string) {
			l := ls.layout(t, x[0])
			s := powersplit.NewSolver(l)
			var st powersplit.State
			worst := 0.0
			for _, nu := range []float64{nu1, nu2} {
				e, err := ls.share(s, &st, units.AngularVelocity(nu*float64(ls.engine)))
				if err != nil {
					return nil, err.Error()
				}
				worst = math.Max(worst, math.Abs(e))
			}
			return []float64{worst}, ""
		},
	}
	rs, err := Explore{Problem: p, Seed: 5, Candidates: 16}.Run()
	if err != nil {
		t.Fatal(err)
	}
	start, ok := Best(rs, nil)
	if !ok {
		t.Fatal("no feasible candidate")
	}
	best, err := Refine(p, start, RefineSpec{Evaluations: 200, Step: 0.02})
	if err != nil {
		t.Fatal(err)
	}
	want := 2 * nu1 * nu2 / (nu1 + nu2) / nuM // r* = νM*/νM
	const tol = 1e-4
	t.Logf("νM at ratio 1: %.6g; sample best ratio %.6g, refined %.6g, closed form %.6g; largest share %.6g (closed form %.6g)",
		nuM, start.X[0], best.X[0], want, best.Objectives[0], (nu2-nu1)/(nu2+nu1))
	if math.Abs(best.X[0]/want-1) > tol {
		t.Errorf("refined ratio %.8g, closed form %.8g: off by more than %g relative", best.X[0], want, tol)
	}
}
