package powersplit

import (
	"errors"

	"pgregory.net/rapid"

	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// Source: Palmgren's friction moment as given in Rolling Bearing Analysis
// (5th ed., 2007), ch. 9: M0 = 10⁻⁷·f0·(ν·n)^(2/3)·dm³ N·mm
// for ν·n ≥ 2000, 160·10⁻⁷·f0·dm³ below, M1 = f1·P1·dm. Hand calculation
// for a cylindrical roller bearing of dm = 100 mm, f0 = 2, f1 = 0.0003,
// P1 = 10 kN in 30 cSt at 1500 rpm: ν·n = 45000, 45000^(2/3) = 1265.1,
// M0 = 1e-7·2·1265.1·1e6 = 253.0 N·mm, M1 = 0.0003·10000·100 = 300 N·mm,
// M = 0.5530 N·m. At 50 rpm, ν·n = 1500 < 2000: M0 = 160e-7·2·1e6 = 32 N·mm.
func TestBearingTorquePalmgren(t *testing.T) {
	t.Parallel()
	br := Bearings{MeanDiameter: units.Millimetres(100), F0: 2, F1: 0.0003, Load: units.Kilonewtons(10)}
	nu := units.Centistokes(30)
	cases := []struct {
		rpm, want float64 // N·m
	}{
		{1500, (1e-7*2*math.Pow(45000, 2.0/3)*1e6 + 300) * 1e-3},
		{50, (160e-7*2*1e6 + 300) * 1e-3},
	}
	for _, c := range cases {
		got := float64(BearingTorque(br, nu, units.RPM(c.rpm)))
		if math.Abs(got-c.want) > 1e-12*c.want {
			t.Errorf("BearingTorque(%g rpm) = %.6g N·m, want %.6g", c.rpm, got, c.want)
		}
	}
	// Rounded hand value at 1500 rpm.
	if got := float64(BearingTorque(br, nu, units.RPM(1500))); math.Abs(got-0.5530) > 5e-4 {
		t.Errorf("BearingTorque(1500 rpm) = %.4f N·m, want 0.5530", got)
	}
	// The two forms meet at ν·n = 2000 to within 2000^(2/3) = 158.7 vs 160.
	lo := float64(BearingTorque(Bearings{MeanDiameter: units.Millimetres(100), F0: 2}, nu, units.RPM(2000/30.0*0.999999)))
	hi := float64(BearingTorque(Bearings{MeanDiameter: units.Millimetres(100), F0: 2}, nu, units.RPM(2000/30.0)))
	if math.Abs(lo-hi)/hi > 0.01 {
		t.Errorf("M0 jumps at ν·n = 2000: %.5g vs %.5g N·m", lo, hi)
	}
}

// Source: the viscous clutch of the textbook Fluid Mechanics: Fundamentals
// and Applications, problem "clutch system … 2-mm-thick oil
// film, μ = 0.38 N·s/m², two 30-cm-diameter disks, 1200 and 1125 rpm";
// its solution integrates the linear film to T = π·μ·Δω·D⁴/(32·h), one film
// over a full disc. Hand calculation: Δω = 75 rpm = 7.854 rad/s, T =
// π·0.38·7.854·0.3⁴/(32·0.002) = 1.187 N·m. (A solution page found online
// prints 0.151 N·m for the same expression; its arithmetic slips by a
// factor of 7.9: 0.00966/0.064 is 0.151 but π·0.38·7.8·0.0081 is 0.0754.)
func TestPlateTorqueFilm(t *testing.T) {
	t.Parallel()
	p := Plates{Films: 1, Inner: units.Millimetres(1e-6), Outer: units.Millimetres(150), Clearance: units.Millimetres(2)}
	got := float64(PlateTorque(p, units.DynamicViscosity(0.38), units.RPM(75)))
	want := math.Pi * 0.38 * (75 * 2 * math.Pi / 60) * math.Pow(0.3, 4) / (32 * 0.002)
	if math.Abs(got-want) > 1e-9*want || math.Abs(got-1.187) > 1e-3 {
		t.Errorf("PlateTorque = %.5g N·m, want %.5g (1.187)", got, want)
	}
	// Annulus and films: z films of (ro⁴ − ri⁴).
	p = Plates{Films: 10, Inner: units.Millimetres(80), Outer: units.Millimetres(110), Clearance: units.Millimetres(0.15)}
	got = float64(PlateTorque(p, units.DynamicViscosity(0.02), units.RadPerSec(100)))
	want = 10 * math.Pi * 0.02 * 100 * (math.Pow(0.11, 4) - math.Pow(0.08, 4)) / (2 * 0.15e-3)
	if math.Abs(got-want) > 1e-12*want {
		t.Errorf("PlateTorque(10 films) = %.6g, want %.6g", got, want)
	}
}

// From memory: ISO/TR 14179-1:2001 no-load gear loss equations (the
// standard was not re-read). Hand calculation for a helical wheel of
// D = 300 mm, b = 40 mm, mt = 4 mm, β = 20°, dipped with fg = 0.2 in 30 cSt
// at 1000 rpm: Rf = 7.93 − 4.648/4 = 6.768, √tan 20° = 0.60330,
// 300^4.7 = 4.3901e11, P = 7.37·0.2·30·1e9·4.3901e11·40·6.768/0.60330
// /(0.2·1e26) = 0.4356 kW; plus the two sides of a disc of 300 mm,
// 1.474·0.2·30·1e9·300^5.7/(0.2e26) = 0.0582 kW.
func TestChurningPowerISO14179(t *testing.T) {
	t.Parallel()
	w := Wheel{Diameter: units.Millimetres(300), FaceWidth: units.Millimetres(40), Module: units.Millimetres(4),
		HelixAngle: units.Degrees(20), Dip: 0.2}
	nu := units.Centistokes(30)
	got := ChurningPower(w, nu, units.RPM(1000)).Kilowatts()
	if math.Abs(got-0.4356) > 0.0005 {
		t.Errorf("ChurningPower(teeth) = %.5f kW, want 0.4356", got)
	}
	w.Sides = true
	got2 := ChurningPower(w, nu, units.RPM(1000)).Kilowatts()
	if math.Abs(got2-got-0.0582) > 0.0005 {
		t.Errorf("ChurningPower(sides) = %.5f kW, want 0.0582", got2-got)
	}
	// n³ and linear in ν and fg.
	if r := float64(ChurningPower(w, nu, units.RPM(2000)) / ChurningPower(w, nu, units.RPM(1000))); math.Abs(r-8) > 1e-9 {
		t.Errorf("speed scaling %g, want 8", r)
	}
	if p := ChurningPower(Wheel{Diameter: units.Millimetres(300), Sides: true}, nu, units.RPM(1000)); p != 0 {
		t.Errorf("a part clear of the oil churns %v", p)
	}
}

// The whole transmission's no-load loss against a hand calculation: the
// lossless output-coupled fixture at 2000 rpm input, output at ν = 0.35
// (speeds by Willis: engine ω, pump shaft 2.1·ω, summing shaft 0.7·ω) and
// no output torque, with ν = 40 cSt oil. With lossless gears, planetary and
// units, the engine supplies exactly the drag losses:
//
//	engine bearings, 2 × (dm 80 mm, f0 2):  2·1e-7·2·(40·2000)^(2/3)·80³ N·mm
//	                                         = 0.3802 N·m → 79.64 W
//	pump-shaft bearings (dm 60 mm, f0 3) at 4200 rpm: 0.1973 N·m → 86.77 W
//	summing-shaft spur wheel (D 250, b 50, mt 5, fg 0.3) at 1400 rpm,
//	  ISO/TR 14179-1 (β taken as 10°):       1884.75 W
//	charge pump, 20 bar·(0 leakage + 10 L/min)/0.8 = 416.67 W
//	total                                     2467.83 W
//
// Hand calculation (from the formulas in drag.go's doc comments).
func TestNoLoadLossHand(t *testing.T) {
	t.Parallel()
	l, _ := ocLossless(t, 1, 1, false)
	l, err := l.WithLosses(NoLoad{
		Lubricant: Lubricant{Viscosity: units.Centistokes(40), Density: 860},
		Bearings: []ShaftBearings{
			{Name: "input bearings", Shaft: "engine", Bearings: Bearings{MeanDiameter: units.Millimetres(80), F0: 2, Count: 2}},
			{Name: "pump bearings", Shaft: "pump", Bearings: Bearings{MeanDiameter: units.Millimetres(60), F0: 3}},
		},
		Churning: []ShaftWheel{{Name: "sum wheel", Shaft: "sum", Wheel: Wheel{Diameter: units.Millimetres(250),
			FaceWidth: units.Millimetres(50), Module: units.Millimetres(5), Dip: 0.3}}},
		ChargePumps: []LoopChargePump{{Name: "charge pump", Loop: "hydrostat", Shaft: "engine",
			ChargePump: ChargePump{Flushing: units.LitresPerMinute(10), Efficiency: 0.8}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	if err := solveNu(t, s, &st, 0.35, 0); err != nil {
		t.Fatal(err)
	}
	if got := float64(st.InputPower); math.Abs(got-2467.83) > 0.01 {
		t.Errorf("no-load input power %.3f W, want 2467.83 (hand calculation)", got)
	}
	if got := float64(st.DragLoss); math.Abs(got-float64(st.InputPower)) > 1e-9*got {
		t.Errorf("drag loss %v, input %v", st.DragLoss, st.InputPower)
	}
	want := map[string]float64{"input bearings": 79.637, "pump bearings": 86.775, "sum wheel": 1884.753, "charge pump": 416.667}
	for _, d := range st.Drags {
		if w, ok := want[d.Name]; !ok || math.Abs(float64(d.Loss)-w) > 1e-3 {
			t.Errorf("drag %q loss %.4f W, want %.3f", d.Name, float64(d.Loss), w)
		}
	}
	if len(st.Drags) != len(want) {
		t.Errorf("%d drags listed, want %d", len(st.Drags), len(want))
	}
}

// genNoLoad draws every kind of drag source for layout l: bearings and a
// churning wheel on every shaft, plates on every clutch and brake, idle
// drag on every PTO and a charge pump on every loop, driven from the input.
func genNoLoad(t *rapid.T, l Layout) NoLoad {
	n := NoLoad{Lubricant: Lubricant{Viscosity: units.Centistokes(rapid.Float64Range(5, 200).Draw(t, "cSt")), Density: 860}}
	for i, sh := range l.l.shafts {
		n.Bearings = append(n.Bearings, ShaftBearings{Name: sh + " bearings", Shaft: sh, Bearings: Bearings{
			MeanDiameter: units.Millimetres(rapid.Float64Range(20, 200).Draw(t, "dm")), F0: rapid.Float64Range(0.5, 6).Draw(t, "f0"),
			F1: 0.0003, Load: units.Kilonewtons(rapid.Float64Range(0, 20).Draw(t, "P1")), Count: rapid.IntRange(0, 3).Draw(t, "count")}})
		if i%2 == 0 {
			n.Churning = append(n.Churning, ShaftWheel{Name: sh + " wheel", Shaft: sh, Wheel: Wheel{
				Diameter: units.Millimetres(rapid.Float64Range(50, 400).Draw(t, "D")), FaceWidth: units.Millimetres(30),
				Module: units.Millimetres(4), HelixAngle: units.Degrees(rapid.Float64Range(0, 30).Draw(t, "beta")),
				Sides: true, Dip: rapid.Float64Range(0, 1).Draw(t, "fg")}})
		}
	}
	pl := Plates{Films: 8, Inner: units.Millimetres(70), Outer: units.Millimetres(100), Clearance: units.Millimetres(0.2)}
	for _, e := range l.l.elems {
		switch e.kind {
		case ClutchKind, BrakeKind:
			n.Plates = append(n.Plates, ElementPlates{Name: e.name + " plates", Element: e.name, Plates: pl})
			if e.kind == ClutchKind {
				n.Bearings = append(n.Bearings, ShaftBearings{Name: e.name + " free gear", Shaft: l.l.shafts[e.shafts[0]],
					Other: l.l.shafts[e.shafts[1]], Bearings: Bearings{MeanDiameter: units.Millimetres(90), F0: 3}})
			}
		case PTOKind:
			n.PTOIdle = append(n.PTOIdle, PTOIdleSpec{Name: e.name + " idle", PTO: e.name, Plates: pl,
				Bearings: Bearings{MeanDiameter: units.Millimetres(60), F0: 2}})
		case LoopKind:
			n.ChargePumps = append(n.ChargePumps, LoopChargePump{Name: e.name + " charge", Loop: e.name,
				Shaft:      l.l.shafts[l.l.elems[l.l.input].shafts[0]],
				ChargePump: ChargePump{Flushing: units.LitresPerMinute(rapid.Float64Range(0, 20).Draw(t, "flush")), Efficiency: 0.8}})
		}
	}
	return n
}

// Conservation with every loss source on: power in = out + element losses
// + drag losses to 1e-9, every drag loss ≥ 0 and equal to its torque times
// its relative speed, every shaft's torques balance with its drags.
func TestPropertyConservationDrags(t *testing.T) {
	t.Parallel()
	solved := 0
	defer func() {
		if solved < 5 {
			t.Errorf("only %d points solved", solved)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		kind, l0 := genLayout(t)
		l, err := l0.WithLosses(genNoLoad(t, l0))
		if err != nil {
			t.Fatal(err)
		}
		p := genPoint(t, l0)
		if rapid.Bool().Draw(t, "PTO idle") && p.PTO != nil {
			p.PTO[0] = 0
		}
		s := NewSolver(l)
		var st State
		err = s.Solve(p, &st)
		if errors.Is(err, ErrInfeasible) || errors.Is(err, ErrSelfLocking) {
			t.Skipf("%s infeasible: %v", kind, err)
		}
		if err != nil {
			t.Fatalf("%s: %v", kind, err)
		}
		pin, pout, ppto := float64(st.InputPower), float64(st.OutputPower), float64(st.PTOPower)
		scale := math.Abs(pin) + math.Abs(pout) + math.Abs(ppto) + 1e-3*st.powerScale()
		loss := 0.0
		for _, e := range st.Elements {
			loss += float64(e.Loss)
		}
		drag := 0.0
		for _, d := range st.Drags {
			if d.Loss < 0 || math.Abs(float64(d.Torque)*float64(d.Speed)-float64(d.Loss)) > 1e-12*scale {
				t.Fatalf("%s: drag %s: torque %v speed %v loss %v", kind, d.Name, d.Torque, d.Speed, d.Loss)
			}
			drag += float64(d.Loss)
		}
		if math.Abs(drag-float64(st.DragLoss)) > 1e-12*scale || math.Abs(loss+drag-float64(st.Loss)) > 1e-12*scale {
			t.Fatalf("%s: DragLoss %v (sum %g), Loss %v (sum %g)", kind, st.DragLoss, drag, st.Loss, loss+drag)
		}
		if r := math.Abs(pin - pout - ppto - loss - drag); r > 1e-9*scale {
			t.Fatalf("%s: power balance residual %g (in %v out %v PTO %v loss %g drag %g)", kind, r/scale, st.InputPower, st.OutputPower, st.PTOPower, loss, drag)
		}
		// Every shaft: Σ port torques + drag torques = 0.
		sum := make([]float64, len(st.Shafts))
		for _, e := range st.Elements {
			for _, pt := range e.Ports {
				sum[pt.Shaft] += float64(pt.Torque)
			}
		}
		tmax := 0.0
		for _, e := range st.Elements {
			for _, pt := range e.Ports {
				tmax = math.Max(tmax, math.Abs(float64(pt.Torque)))
			}
		}
		for _, d := range st.Drags {
			sum[d.Shaft] += float64(d.Torque)
			if d.Other >= 0 {
				sum[d.Other] -= float64(d.Torque)
			}
		}
		for i, v := range sum {
			if math.Abs(v) > 1e-9*tmax {
				t.Fatalf("%s: shaft %s torques sum to %g (largest %g)", kind, st.Shafts[i].Name, v, tmax)
			}
		}
		if p.PTO != nil && p.PTO[0] == 0 {
			for _, d := range st.Drags {
				if d.Kind == PTOIdleDrag && d.Speed != 0 && d.Loss == 0 {
					t.Fatalf("%s: idle PTO without drag", kind)
				}
			}
		}
		solved++
	})
}

// Solving with every drag source on allocates nothing once the State has
// been used (the drag torques live in the solver's work space).
func TestDragsAllocateNothing(t *testing.T) {
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.5}}, GearEfficiency: 0.98})
	if err != nil {
		t.Fatal(err)
	}
	l, err = l.WithLosses(NoLoad{
		Lubricant:   Lubricant{Viscosity: units.Centistokes(30), Density: 860},
		Bearings:    []ShaftBearings{{Name: "b", Shaft: "engine", Bearings: Bearings{MeanDiameter: units.Millimetres(80), F0: 2}}},
		Churning:    []ShaftWheel{{Name: "w", Shaft: "sum", Wheel: Wheel{Diameter: units.Millimetres(250), Sides: true, Dip: 0.2}}},
		ChargePumps: []LoopChargePump{{Name: "c", Loop: "hydrostat", Shaft: "engine", ChargePump: ChargePump{Flushing: units.LitresPerMinute(8), Efficiency: 0.8}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	if err := solveNu(t, s, &st, 0.5, 500); err != nil {
		t.Fatal(err)
	}
	if !(st.DragLoss > 0) || st.Residual > 1e-9 {
		t.Fatalf("drag loss %v, residual %g", st.DragLoss, st.Residual)
	}
	if n := testing.AllocsPerRun(20, func() { _ = solveNu(t, s, &st, 0.5, 500) }); n != 0 {
		t.Errorf("Solve with drags allocates %v times", n)
	}
}

// FuzzWithLosses: any drag specification is refused with an error or gives
// a layout whose solved states have finite, non-negative drag losses.
func FuzzWithLosses(f *testing.F) {
	f.Add(30.0, 860.0, 80.0, 2.0, 0.0003, 5000.0, 250.0, 40.0, 4.0, 20.0, 0.2, 8, 70.0, 100.0, 0.3, 10.0, 0.8, 0.5)
	f.Add(-1.0, 0.0, 0.0, -2.0, 1e300, -5.0, 1e-9, 0.0, 0.0, 90.0, 1.5, 0, 100.0, 70.0, 0.0, -1.0, 1.5, 2.0)
	f.Fuzz(func(t *testing.T, cst, rho, dm, f0, f1, load, d, b, m, beta, dip float64, films int, ri, ro, h, flush, eta, nu float64) {
		l, _ := ocLossless(t, 0.98, 0.98, false)
		l, err := l.WithLosses(NoLoad{
			Lubricant: Lubricant{Viscosity: units.Centistokes(cst), Density: units.Density(rho)},
			Bearings: []ShaftBearings{{Name: "b", Shaft: "engine", Bearings: Bearings{MeanDiameter: units.Millimetres(dm), F0: f0, F1: f1,
				Load: units.Force(load)}}},
			Churning: []ShaftWheel{{Name: "w", Shaft: "sum", Wheel: Wheel{Diameter: units.Millimetres(d), FaceWidth: units.Millimetres(b),
				Module: units.Millimetres(m), HelixAngle: units.Degrees(beta), Dip: dip}}},
			Plates: []ElementPlates{{Name: "p", Element: "range 1 clutch", Plates: Plates{Films: films, Inner: units.Millimetres(ri),
				Outer: units.Millimetres(ro), Clearance: units.Millimetres(h)}}},
			ChargePumps: []LoopChargePump{{Name: "c", Loop: "hydrostat", Shaft: "engine",
				ChargePump: ChargePump{Flushing: units.LitresPerMinute(flush), Efficiency: eta}}},
		})
		if err != nil {
			return
		}
		s := NewSolver(l)
		var st State
		if err := solveNu(t, s, &st, math.Max(-1, math.Min(1, nu)), 300); err != nil {
			return
		}
		for _, dr := range st.Drags {
			if bad(float64(dr.Loss)) || dr.Loss < 0 || bad(float64(dr.Torque)) {
				t.Fatalf("drag %s: torque %v loss %v", dr.Name, dr.Torque, dr.Loss)
			}
		}
	})
}
