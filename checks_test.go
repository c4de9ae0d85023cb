package powersplit

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// The lossless hydraulic power share P_h/P_in of the three classic layouts.
//
// Derivation (the method of SAE paper 680549): the pump speed ωp and motor
// speed ωm are affine in ωin and ωout, ωp ∝ (ν − ν_p) and ωm ∝ (ν − ν_m),
// ν = ωout/ωin, ν_p and ν_m the ratios at which the pump or the motor stops.
// Lossless, P_h/P_in = d ln ν / d ln r with r = ωm/ωp, which gives
//
//	compound:        P_h/P_in = (ν − ν_p)(ν − ν_m) / (ν·(ν_m − ν_p))
//	output-coupled:  ν_m = 0 (motor on the output):  P_h/P_in = 1 − ν/ν_M
//	input-coupled:   ν_p → ∞ (pump on the input):     P_h/P_in = 1 − ν_M/ν
func shareOC(nu, nuM float64) float64 { return 1 - nu/nuM }
func shareIC(nu, nuM float64) float64 { return 1 - nuM/nu }
func shareCompound(nu, nuP, nuM float64) float64 {
	return (nu - nuP) * (nu - nuM) / (nu * (nuM - nuP))
}

// span returns n ratios evenly over [lo, hi], skipping ν = 0.
func span(lo, hi float64, n int) []float64 {
	out := make([]float64, 0, n)
	for i := 0; i < n; i++ {
		v := lo + (hi-lo)*float64(i)/float64(n-1)
		if math.Abs(v) > 1e-6 {
			out = append(out, v)
		}
	}
	return out
}

func TestLosslessShare(t *testing.T) {
	t.Parallel()
	oc, nuOC := ocLossless(t, 1, 1, false)
	ic, nuIC := icLossless(t, 1, 1, false)
	cp, nuP, nuM := compound(t, -2, -2, 1, false)
	cases := []struct {
		name   string
		l      Layout
		lo, hi float64
		want   func(nu float64) float64
	}{
		// Source: SAE paper 680549 (1968), output-coupled ("output split")
		// share 1 − ν/ν_M; ASAE Distinguished Lecture 29 (2005), same
		// relation. From memory: the printed forms; derived above.
		{"output-coupled", oc, -0.6, 1.4, func(nu float64) float64 { return shareOC(nu, nuOC) }},
		// Source: SAE paper 680549 (1968), input-coupled share 1 − ν_M/ν;
		// ASAE Distinguished Lecture 29 (2005). From memory: the printed
		// forms; derived above.
		{"input-coupled", ic, -0.5, 1.2, func(nu float64) float64 { return shareIC(nu, nuIC) }},
		// Source: J. Terramechanics 47 (2010), Design parameters for
		// continuously variable power-split transmissions using planetaries
		// with 3 active shafts, compound split with two mechanical points.
		// From memory: the product form (ν − ν1)(ν − ν2)/(ν(ν2 − ν1));
		// derived above.
		{"compound", cp, 0.2, 2.5, func(nu float64) float64 { return shareCompound(nu, nuP, nuM) }},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := NewSolver(c.l)
			var st State
			n := 0
			for _, nu := range span(c.lo, c.hi, 81) {
				if err := solveNu(t, s, &st, nu, 500); err != nil {
					t.Fatalf("ν = %g: %v", nu, err)
				}
				n++
				got, want := st.HydraulicShare, c.want(nu)
				if !testutil.Close(got, want, 1e-9, 1e-9) {
					t.Errorf("ν = %g: share = %.12g, want %.12g (rel err %.2g)", nu, got, want, testutil.RelErr(got, want))
				}
				if st.Efficiency < 1-1e-12 || st.Efficiency > 1+1e-12 {
					if st.InputPower > 0 && st.OutputPower > 0 {
						t.Errorf("ν = %g: lossless efficiency %.15g", nu, st.Efficiency)
					}
				}
			}
			if n < 70 {
				t.Fatalf("only %d points", n)
			}
		})
	}
}

// TestMechanicalPoints: at the mechanical points the share is exactly zero
// (to rounding); beyond them the sign changes to circulating power.
func TestMechanicalPoints(t *testing.T) {
	t.Parallel()
	oc, nuOC := ocLossless(t, 1, 1, false)
	ic, nuIC := icLossless(t, 1, 1, false)
	cp, nuP, nuM := compound(t, -2, -2, 1, false)
	cases := []struct {
		name string
		l    Layout
		nu   float64
		// sign of the share just below and above the point
		below, above float64
	}{
		// Source: SAE paper 680549 (1968): output-coupled, the pump shaft is
		// blocked and the motor swung back to zero at ν_M; circulating power
		// above ν_M. From memory.
		{"output-coupled ν_M", oc, nuOC, +1, -1},
		// Source: SAE paper 680549 (1968): input-coupled, the motor stops at
		// ν_M; circulating power below ν_M. From memory.
		{"input-coupled ν_M", ic, nuIC, -1, +1},
		// Source: J. Terramechanics 47 (2010), the paper on design
		// parameters of power-split transmissions cited above: compound
		// split, share zero at both mechanical points, positive between
		// them, circulating outside. From memory.
		{"compound ν_m", cp, nuM, -1, +1},
		{"compound ν_p", cp, nuP, +1, -1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := NewSolver(c.l)
			var st State
			if err := solveNu(t, s, &st, c.nu, 800); err != nil {
				t.Fatal(err)
			}
			if math.Abs(st.HydraulicShare) > 1e-12 {
				t.Errorf("share at mechanical point = %g, want 0", st.HydraulicShare)
			}
			for _, d := range []struct {
				nu, sign float64
			}{{c.nu * 0.95, c.below}, {c.nu * 1.05, c.above}} {
				if err := solveNu(t, s, &st, d.nu, 800); err != nil {
					t.Fatal(err)
				}
				if st.HydraulicShare*d.sign <= 0 {
					t.Errorf("ν = %g: share %g, want sign %v", d.nu, st.HydraulicShare, d.sign)
				}
			}
		})
	}
}

// TestMechanicalPointEfficiency: at the mechanical point with lossless
// units the transmission is purely mechanical, and its efficiency is the
// product of the gear efficiencies on the mechanical path and of the
// planetary set's efficiency with the hydrostat's member held.
//
// Common practice (no published source) as a statement; it follows from
// the share relations of SAE paper 680549 (1968): where P_h/P_in = 0 no
// power passes the hydrostat, so all of it takes the mechanical path.
func TestMechanicalPointEfficiency(t *testing.T) {
	t.Parallel()
	const etaG, eta0 = 0.98, 0.97
	heldEta := func(in, out planetary.Member, held planetary.Member, win units.AngularVelocity) float64 {
		s := mustSet(t, testI0, eta0)
		sp := planetary.Speeds{}
		switch in {
		case planetary.Carrier:
			sp.Carrier = win
		case planetary.Ring:
			sp.Ring = win
		}
		sp, err := s.Solve(sp, out)
		if err != nil {
			t.Fatal(err)
		}
		// Load torque on the output member: the torque its shaft applies to
		// the set is negative of the torque the set delivers; take 100 N·m.
		st, err := s.Torque(sp, out, units.NewtonMetres(-100))
		if err != nil {
			t.Fatal(err)
		}
		_, pr, pc, _ := st.Power()
		pin, pout := pc, pr
		if in == planetary.Ring {
			pin, pout = pr, pc
		}
		return -float64(pout) / float64(pin)
	}
	// Source: Epicyclic Drive Trains (1982), efficiency of a simple
	// set with one member held, from its basic efficiency. From memory:
	// sun held, ring in → carrier out (power enters the meshes at the ring):
	// η = (η0 − i0)/(1 − i0). It is checked here against
	// planetary.Set.Torque, which then serves for the other held-member case.
	closedRC := (eta0 - testI0) / (1 - testI0)
	if got := heldEta(planetary.Ring, planetary.Carrier, planetary.Sun, units.RPM(1000)); !testutil.Close(got, closedRC, 1e-12, 0) {
		t.Errorf("planetary ring→carrier, sun held: η = %.12g, closed form %.12g", got, closedRC)
	}
	t.Run("output-coupled", func(t *testing.T) {
		l, nuM := ocLossless(t, etaG, eta0, false)
		var st State
		if err := solveNu(t, NewSolver(l), &st, nuM, 800); err != nil {
			t.Fatal(err)
		}
		// Mechanical path: carrier (engine) → ring, then the range gear.
		// Hand calculation, sun held, carrier in: ωring = (1 − 1/i0)·ωcarrier
		// = 1.4·ωcarrier. In the carrier frame the sun turns at −ωc and the
		// ring at 0.4·ωc; with the carrier driving, power enters the meshes
		// at the sun and leaves at the ring, so Tring·0.4·ωc = −η0·Tsun·(−ωc),
		// that is Tring = −i0·η0·Tsun and Tcarrier = −(1 − i0·η0)·Tsun:
		//
		//	η = −Tring·ωring/(Tcarrier·ωcarrier) = (1 − i0)·η0/(1 − i0·η0)
		//	  = 3.5·0.97/3.425 = 0.991 240 875 9
		const etaCR = (1 - testI0) * eta0 / (1 - testI0*eta0)
		if got := heldEta(planetary.Carrier, planetary.Ring, planetary.Sun, units.RPM(2000)); !testutil.Close(got, etaCR, 1e-12, 0) {
			t.Errorf("planetary carrier→ring, sun held: η = %.12g, hand value %.12g", got, etaCR)
		}
		want := etaCR * etaG
		if math.Abs(float64(st.Loops[0].HydraulicPower)) > 1e-9 {
			t.Errorf("hydraulic power %v, want 0", st.Loops[0].HydraulicPower)
		}
		if !testutil.Close(st.Efficiency, want, 1e-9, 0) {
			t.Errorf("efficiency = %.12g, want %.12g", st.Efficiency, want)
		}
	})
	t.Run("input-coupled", func(t *testing.T) {
		l, nuM := icLossless(t, etaG, eta0, false)
		var st State
		if err := solveNu(t, NewSolver(l), &st, nuM, 800); err != nil {
			t.Fatal(err)
		}
		// Mechanical path: input gear, ring → carrier with the sun held,
		// range gear.
		want := etaG * closedRC * etaG
		if math.Abs(float64(st.Loops[0].HydraulicPower)) > 1e-9 {
			t.Errorf("hydraulic power %v, want 0", st.Loops[0].HydraulicPower)
		}
		if !testutil.Close(st.Efficiency, want, 1e-9, 0) {
			t.Errorf("efficiency = %.12g, want %.12g", st.Efficiency, want)
		}
	})
}

// TestShareIsLogSensitivity checks the general identity
//
//	P_h/P_in = d ln ν / d ln r,   r = ωmotor/ωpump   (lossless)
//
// by central finite differences on every builder and on the compound split.
//
// Source: Proc. IMechE Part D 205 (1991), doi:10.1243/PIME_PROC_1991_205_151_02,
// abstract: in a single-degree-of-freedom differential system the
// sensitivity of the overall ratio to the ratio of one element is
// proportional to the fraction of the input power flowing through it.
func TestShareIsLogSensitivity(t *testing.T) {
	t.Parallel()
	oc, _ := ocLossless(t, 1, 1, false)
	ic, _ := icLossless(t, 1, 1, false)
	cp, _, _ := compound(t, -2, -2, 1, false)
	hs := pureLossless(t, false)
	hs2 := pureLossless(t, true)
	cases := []struct {
		name   string
		l      Layout
		lo, hi float64
	}{
		{"output-coupled", oc, -0.6, 1.4},
		{"input-coupled", ic, -0.5, 1.2},
		{"compound", cp, 0.2, 2.5},
		{"pure hydrostatic", hs, -0.4, 0.4},
		{"pure hydrostatic, second motor", hs2, -0.35, 0.35},
	}
	const h = 1e-4
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := NewSolver(c.l)
			var st State
			ratio := func(nu float64) float64 {
				if err := solveNu(t, s, &st, nu, 300); err != nil {
					t.Fatalf("ν = %g: %v", nu, err)
				}
				return st.Loops[0].Ratio
			}
			checked := 0
			for _, nu := range span(c.lo, c.hi, 41) {
				rp, rm := ratio(nu*(1+h)), ratio(nu*(1-h))
				if !(rp/rm > 0) || math.IsInf(rp, 0) || math.IsInf(rm, 0) || math.Abs(math.Log(rp/rm)) < 1e-6 {
					continue // a mechanical point lies in the step
				}
				fd := math.Log((1+h)/(1-h)) / math.Log(rp/rm)
				if err := solveNu(t, s, &st, nu, 300); err != nil {
					t.Fatal(err)
				}
				if !testutil.Close(fd, st.HydraulicShare, 1e-6, 1e-6) {
					t.Errorf("ν = %g: d ln ν/d ln r = %.10g, share %.10g", nu, fd, st.HydraulicShare)
				}
				checked++
			}
			if checked < 30 {
				t.Errorf("only %d points checked", checked)
			}
		})
	}
}

// TestPTOSpeeds: a PTO geared to the engine turns at engine speed × ratio
// whatever the travel speed, and takes the power its torque gives.
//
// Consistency check (no published source): the ratios are chosen so that the
// PTO turns at 540 and 1000 rpm, the nominal speeds of ISO 500-1 (from
// memory), at invented engine speeds; what is checked is that the layout
// keeps the PTO on the engine's kinematics at every travel speed, not the
// standard. Hand values: 400 N·m at 540 rpm = 400·540·2π/60 = 22 619.467 W;
// 200 N·m at 1000 rpm = 20 943.951 W.
func TestPTOSpeeds(t *testing.T) {
	t.Parallel()
	std := []struct {
		name        string
		rpm, engine float64
	}{{"540", 540, 1980}, {"1000", 1000, 2000}}
	lp := makeLoop(t, loopSpec{pumpCC: 90, motorCC: 110, lossy: true, wilson: demoWilson})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.97), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.3}}, PTOs: []PTOSpec{{Name: "PTO 540", Ratio: 540.0 / 1980}, {Name: "PTO 1000", Ratio: 1000.0 / 2000}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	for k, c := range std {
		for _, v := range []float64{-150, 0, 100, 300, 500} {
			p := Point{Input: units.RPM(c.engine), Outputs: []OutputDemand{{Speed: units.RPM(v), Torque: units.NewtonMetres(300 * math.Copysign(1, v))}},
				PTO: []units.Torque{units.NewtonMetres(400), units.NewtonMetres(200)}}
			if err := s.Solve(p, &st); err != nil {
				t.Fatalf("travel %g rpm: %v", v, err)
			}
			if got := st.PTOs[k].Speed.RPM(); !testutil.Close(got, c.rpm, 1e-12, 0) {
				t.Errorf("PTO %s at engine %g rpm, output %g rpm: %g rpm", c.name, c.engine, v, got)
			}
			if want := []float64{22619.467, 20943.951}[k]; !testutil.Close(float64(st.PTOs[k].Power), want, 2e-8, 0) {
				t.Errorf("PTO %s power %v, want %g W", c.name, st.PTOs[k].Power, want)
			}
		}
	}
}

// TestFromVariatorRange: an output-coupled split whose second range takes
// the output from the pump-side member. That range is again an
// output-coupled split, with the sun as its output member and the unit on
// the ring leading, so (SAE paper 680549, 1968, from memory; derived above)
// its lossless share is 1 − ν/ν_M2 with ν_M2 = r2·(1 − i0) (ring stopped),
// counted from the ring unit to the sun unit (Builder.ReverseShare). The two
// ranges shift synchronously (hand calculation as in TestShiftPoints).
func TestFromVariatorRange(t *testing.T) {
	t.Parallel()
	const r1, r2 = 0.5, 0.05
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, sched: zeroMotor{}})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp, GearEfficiency: 1,
		Ranges: []RangeGear{{Name: "low", Ratio: r1}, {Name: "high", Ratio: r2, FromVariator: true}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	e := units.RPM(2000)
	sp, err := s.ShiftPoints(Point{Input: e, Outputs: []OutputDemand{{Speed: 1}}})
	want := r2 * (1 - testI0) * float64(e) / (1 - r2*testI0/r1)
	if err != nil || len(sp) != 1 || !testutil.Close(float64(sp[0].Output), want, 1e-12, 0) {
		t.Fatalf("ShiftPoints = %+v, %v; want one at %g rad/s", sp, err, want)
	}
	nuM2 := r2 * (1 - testI0)
	var st State
	for _, nu := range span(0.02, 0.3, 29) {
		p := Point{Range: 1, Input: e, Outputs: []OutputDemand{{Speed: units.AngularVelocity(nu * float64(e)), Torque: 300}}}
		if err := s.Solve(p, &st); err != nil {
			t.Fatalf("ν = %g: %v", nu, err)
		}
		if got, want := st.HydraulicShare, shareOC(nu, nuM2); !testutil.Close(got, want, 1e-9, 1e-9) {
			t.Errorf("ν = %g: share %.12g, want %.12g", nu, got, want)
		}
	}
}

// TestInputCoupledHydrostaticRange: an input-coupled split's range taken
// from the motor member is purely hydrostatic (the summing member idles):
// the whole input power passes the loop, share 1 (lossless).
//
// Common practice (no published source): the hydrostatic start range of
// multi-range input-coupled splits.
func TestInputCoupledHydrostaticRange(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, sched: zeroMotor{}})
	l, err := InputCoupled(InputCoupledSpec{Set: mustSet(t, testI0, 1), Loop: lp, PumpRatio: 1.1, InputRatio: 0.9, GearEfficiency: 1,
		Ranges: []RangeGear{{Name: "start", Ratio: 0.3, FromVariator: true}, {Name: "split", Ratio: 0.6}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	for _, nu := range []float64{-0.2, 0.05, 0.2, 0.3} {
		p := Point{Range: 0, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.AngularVelocity(nu * float64(units.RPM(2000))), Torque: units.NewtonMetres(math.Copysign(300, nu))}}}
		if err := s.Solve(p, &st); err != nil {
			t.Fatalf("ν = %g: %v", nu, err)
		}
		if !testutil.Close(st.HydraulicShare, 1, 1e-12, 0) || !testutil.Close(st.Efficiency, 1, 1e-12, 0) {
			t.Errorf("ν = %g: share %.15g, efficiency %.15g, want 1", nu, st.HydraulicShare, st.Efficiency)
		}
	}
	if _, err := PureHydrostatic(PureHydrostaticSpec{Loop: lp, Ranges: []RangeGear{{Ratio: 1, FromVariator: true}}}); !errors.Is(err, ErrInput) {
		t.Errorf("FromVariator in a pure hydrostatic drive: %v", err)
	}
}
