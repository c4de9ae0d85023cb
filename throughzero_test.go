package powersplit_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// throughZeroLayout is the output-coupled split of
// Example_throughMechanicalPoint (mechanical point at ν = 0.7) with the
// motor's swing as given; the pump swings over centre.
func throughZeroLayout(t *testing.T, motor hydrostat.Swing) powersplit.Layout {
	t.Helper()
	loss := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	unit := func(sw hydrostat.Swing) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(100), MaxSpeed: units.RPM(4000),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: loss, Swing: sw})
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: unit(hydrostat.SwingOverCentre), Motors: []hydrostat.Unit{unit(motor)},
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		t.Fatal(err)
	}
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		t.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Ratio: 0.5}}})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestOutputCoupledThroughMechanicalPoint sweeps ν = ω_out/ω_engine over
// 0.65…0.75 in steps of 0.0025 across the mechanical point ν_M = 0.7
// (hand calculation: the sun stops when the ring turns at
// (1 − i0)/(−i0) = 1.4 of the carrier; the range gear halves it). With an
// over-centre motor every point solves, the settings move in small steps
// and the motor's setting changes sign at ν_M. With the motor's swing
// unstated the Sequential schedule keeps it at or above 0.2, and the band
// around ν_M where it would need less (here wider than 0.65…0.75) is
// refused as unreachable; outside the band it still solves.
func TestOutputCoupledThroughMechanicalPoint(t *testing.T) {
	t.Parallel()
	engine := units.RPM(2000)
	point := func(nu float64) powersplit.Point {
		return powersplit.Point{Input: engine, Outputs: []powersplit.OutputDemand{{Speed: units.AngularVelocity(nu * float64(engine)),
			Torque: units.NewtonMetres(600)}}}
	}
	var st powersplit.State
	s := powersplit.NewSolver(throughZeroLayout(t, hydrostat.SwingOverCentre))
	// The motor's setting falls by 2.2 % of full per 1 % of ν_M near the
	// point (Example_throughMechanicalPoint: 0.265 at 0.9 ν_M): a step of
	// 0.0025 moves it by about 0.008, so 0.02 bounds a continuous change.
	const maxStep = 0.02
	prev := [2]float64{math.NaN(), math.NaN()}
	before, after := 0, 0
	for k := 0; k <= 40; k++ {
		nu := 0.65 + 0.0025*float64(k)
		if err := s.Solve(point(nu), &st); err != nil {
			t.Fatalf("over-centre motor, ν = %.4f: %v", nu, err)
		}
		x := [2]float64{st.Loops[0].Settings[0], st.Loops[0].Settings[1]}
		for i := range x {
			if d := math.Abs(x[i] - prev[i]); d > maxStep {
				t.Errorf("ν = %.4f: setting %d jumps from %.4f to %.4f", nu, i, prev[i], x[i])
			}
		}
		prev = x
		switch {
		case nu < 0.699 && x[1] > 0:
			before++
		case nu > 0.701 && x[1] < 0:
			after++
		}
	}
	if before != 20 || after != 20 {
		t.Errorf("motor setting positive at %d of 20 points below ν_M and negative at %d of 20 above, want all", before, after)
	}

	s = powersplit.NewSolver(throughZeroLayout(t, hydrostat.SwingUnstated))
	// The band: the motor would need 0.18 at ν = 0.65 and 0.16 at 0.75
	// (about 0.26 per 10 % of ν_M, from the over-centre sweep).
	for _, nu := range []float64{0.65, 0.68, 0.695, 0.7, 0.705, 0.72, 0.75} {
		if err := s.Solve(point(nu), &st); !errors.Is(err, powersplit.ErrUnreachable) {
			t.Errorf("unstated motor swing, ν = %.4f: %v, want ErrUnreachable", nu, err)
		}
	}
	for _, nu := range []float64{0.6, 0.78} {
		if err := s.Solve(point(nu), &st); err != nil {
			t.Errorf("unstated motor swing, ν = %.4f (outside the band): %v", nu, err)
		}
	}

	// A motor that swings to zero but not over centre narrows the band to
	// a sliver where its losses would need a slightly negative setting;
	// beyond it the pump reverses (−1) with its shaft nearly still.
	s = powersplit.NewSolver(throughZeroLayout(t, hydrostat.SwingToZero))
	for _, nu := range []float64{0.65, 0.6975, 0.7025, 0.75} {
		if err := s.Solve(point(nu), &st); err != nil {
			t.Errorf("to-zero motor swing, ν = %.4f: %v", nu, err)
		} else if x := st.Loops[0].Settings; x[1] < 0 || (nu > 0.7) != (x[0] < 0) {
			t.Errorf("to-zero motor swing, ν = %.4f: settings %v, want the motor ≥ 0 and the pump reversed above ν_M", nu, x)
		}
	}
}
