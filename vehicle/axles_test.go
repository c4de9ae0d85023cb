package vehicle_test

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Invented demo data: a two-range input-coupled split whose loop has a
// second motor (45 cm³/rev) on the front axle (front final drive 60),
// full setting up to 8 km/h, swung back by 12 km/h, declutched above
// 13 km/h. Round numbers, no real machine.
const (
	axRearFD  = 13.6
	axFrontFD = 60.0
)

func axTyres(frontDrive bool) vehicle.Tyres {
	rear := traction.Tyre{Diameter: units.Metres(1.85), Width: units.Metres(0.65), SectionHeight: units.Metres(0.46),
		RollingRadius: units.Metres(0.88), Deflection: units.Metres(0.06)}
	front := traction.Tyre{Diameter: units.Metres(1.5), Width: units.Metres(0.54), SectionHeight: units.Metres(0.37),
		RollingRadius: units.Metres(0.71), Deflection: units.Metres(0.045)}
	return vehicle.Tyres{
		Vehicle: traction.Vehicle{Mass: units.Tonnes(8.5), Wheelbase: units.Metres(2.9), CentreOfMass: units.Metres(1.15),
			Hitch: traction.Hitch{Height: units.Metres(0.5), Behind: units.Metres(1)},
			Front: traction.Axle{Tyre: front, Wheels: 2, Track: units.Metres(1.9)}, Rear: traction.Axle{Tyre: rear, Wheels: 2, Track: units.Metres(1.9)}},
		Model: traction.Brixius{}, Surface: traction.FirmSoil(), FrontDrive: frontDrive, Lead: 0.02,
	}
}

// rearOut converts a travel speed to the rear output speed without slip.
func rearOut(v units.Speed) units.AngularVelocity {
	return units.AngularVelocity(axRearFD * float64(v) / 0.88)
}

func axLayout(tb testing.TB, front bool) powersplit.Layout {
	tb.Helper()
	wil := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	mk := func(cc, rpm float64) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc), MaxSpeed: units.RPM(rpm),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: wil})
		if err != nil {
			tb.Fatal(err)
		}
		return u
	}
	motors := []hydrostat.Unit{mk(110, 3200)}
	var sm *powersplit.SecondMotor
	if front {
		motors = append(motors, mk(45, 3600))
		sm = &powersplit.SecondMotor{Ratio: 1, DeclutchAbove: rearOut(units.KMH(13)),
			Setting: powersplit.SettingCurve{Speeds: []units.AngularVelocity{rearOut(units.KMH(8)), rearOut(units.KMH(12))}, Settings: []float64{1, 0}}}
	}
	lp, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: mk(110, 3000), Motors: motors,
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		tb.Fatal(err)
	}
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		tb.Fatal(err)
	}
	l, err := powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: lp, PumpRatio: 1.1,
		Ranges: []powersplit.RangeGear{{Name: "field", Ratio: 0.174}, {Name: "road", Ratio: 1.0}}, GearEfficiency: 0.985, Second: sm})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

func axVehicle(tb testing.TB, front bool, control vehicle.FrontControl) *vehicle.Vehicle {
	tb.Helper()
	l := axLayout(tb, front)
	var tr vehicle.Transmission
	var err error
	if front {
		tr, err = vehicle.FromFrontMotorLayout(l, vehicle.FrontMotorSpec{FinalDrive: axFrontFD, Efficiency: 0.97,
			AxleRatio: axFrontFD * 0.88 / (axRearFD * 0.71), Control: control})
	} else {
		tr, err = vehicle.FromLayout(l)
	}
	if err != nil {
		tb.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(8.5), Tyres: axTyres(!front), Transmission: tr,
		FinalDrive: axRearFD, FinalDriveEfficiency: 0.97, Engine: demoEngine(tb, true)})
	if err != nil {
		tb.Fatal(err)
	}
	return v
}

// checkFlows checks that a point's flows close: fuel = every sink, and the
// axles' slip losses add up to the slip loss.
func checkFlows(t *testing.T, name string, p vehicle.Point) {
	t.Helper()
	f := p.Flows
	sinks := f.EngineLoss + f.EngineBraking + f.Hydrostatic + f.Mechanical + f.NoLoad + f.PTOLoss + f.PTO + f.Slip + f.Rolling + f.Brake +
		f.Drawbar + f.Trailer + f.Aero + f.Grade + f.Inertia
	if r := math.Abs(float64(f.Fuel - sinks)); r > 1e-9*float64(f.Fuel) {
		t.Errorf("%s: fuel %v, sinks %v", name, f.Fuel, sinks)
	}
	// An axle pushed along (slip below zero) may show a slightly negative
	// slip loss of its own; the hydrostat, the gears and the tyres' total
	// slip loss may not.
	for _, x := range []units.Power{f.Hydrostatic, f.Mechanical, f.Slip, f.Rolling} {
		if x < 0 {
			t.Errorf("%s: a loss < 0 in %+v", name, f)
		}
	}
	if r := math.Abs(float64(f.Mechanical - f.MechanicalByElement)); r > 1e-6*math.Max(float64(f.Engine), 1) {
		t.Errorf("%s: mechanical loss %v as the residual, %v element by element", name, f.Mechanical, f.MechanicalByElement)
	}
	if r := math.Abs(float64(f.Slip - f.FrontSlip - f.RearSlip)); r > 1e-6*math.Max(float64(f.Slip), 1) {
		t.Errorf("%s: slip %v != front %v + rear %v", name, f.Slip, f.FrontSlip, f.RearSlip)
	}
}

func TestFrontMotorPoint(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	d := vehicle.Demand{Speed: units.KMH(7), Draft: units.Kilonewtons(22)}
	p, err := v.At(d, units.RPM(1800), 0)
	if err != nil {
		t.Fatal(err)
	}
	checkFlows(t, "7 km/h", p)
	if !(p.FrontShare > 0.05 && p.FrontShare < 0.9) || !(p.FrontSlip > 0) || !(p.Slip > 0) {
		t.Errorf("front share %v, front slip %v, rear slip %v: want both axles driving", p.FrontShare, p.FrontSlip, p.Slip)
	}
	if p.Drive.FrontSetting <= 0 || p.Drive.Declutched || !(p.Drive.DeclutchMargin > 0) {
		t.Errorf("front setting %v, declutched %v, margin %v", p.Drive.FrontSetting, p.Drive.Declutched, p.Drive.DeclutchMargin)
	}
	// Each axle's wheels turn at the speed of its own slip.
	wf := float64(p.Drive.FrontSpeed) / axFrontFD
	if vf := wf * 0.71 * (1 - p.FrontSlip); math.Abs(vf-float64(d.Speed)) > 1e-9*float64(d.Speed) {
		t.Errorf("front wheels travel at %v m/s, want %v", vf, float64(d.Speed))
	}
	// The least-power control needs no more fuel than the schedule at the
	// same engine speed and range.
	q, err := axVehicle(t, true, vehicle.FrontLeastPower).At(d, units.RPM(1800), 0)
	if err != nil {
		t.Fatal(err)
	}
	checkFlows(t, "least power", q)
	if q.EngineTorque > p.EngineTorque*(1+1e-9) {
		t.Errorf("least-power front setting needs %v, the schedule %v", q.EngineTorque, p.EngineTorque)
	}
	t.Logf("schedule: setting %.3f share %.3f slips %.4f/%.4f torque %.1f; least power: setting %.3f share %.3f slips %.4f/%.4f torque %.1f",
		p.Drive.FrontSetting, p.FrontShare, p.FrontSlip, p.Slip, p.EngineTorque.NewtonMetres(),
		q.Drive.FrontSetting, q.FrontShare, q.FrontSlip, q.Slip, q.EngineTorque.NewtonMetres())
}

// TestFrontMotorTurn checks the front axle's speed in a turn against the
// Ackermann steering geometry.
//
// Source: Fundamentals of Vehicle Dynamics (1992), SAE,
// ch. 8, Ackerman steering geometry: with wheelbase L, track t and the
// rear axle's centre on radius R, the front wheels steer to
// tan δ_i = L/(R − t/2) and tan δ_o = L/(R + t/2) and roll on radii
// L/sin δ_i and L/sin δ_o, the rear wheels on R ∓ t/2 (from memory of
// that text; the same relations, tan δ = L/(R ∓ t/2) and the outer front
// wheel's radius √((R + t/2)² + L²), read on
// https://novasolver.jp/en/tools/ackermann-steering.html). The front
// axle's mean travel speed over the rear's is
// (L/sin δ_i + L/sin δ_o)/(2R); here R follows from a given inner
// steering angle, and the vehicle's front axle speed is read back from the
// solved front output speed and front slip.
func TestFrontMotorTurn(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	L, tr := 2.9, 1.9
	for _, deg := range []float64{20, 35, 50} {
		di := deg * math.Pi / 180
		R := L/math.Tan(di) + tr/2
		do := math.Atan(L / (R + tr/2))
		want := (L/math.Sin(di) + L/math.Sin(do)) / (2 * R)
		d := vehicle.Demand{Speed: units.KMH(5), TurnRadius: units.Metres(R)}
		p, err := v.At(d, units.RPM(1500), 0)
		if err != nil {
			t.Fatalf("δi %v°: %v", deg, err)
		}
		checkFlows(t, "turn", p)
		wf := float64(p.Drive.FrontSpeed) / axFrontFD
		got := wf * 0.71 * (1 - p.FrontSlip) / float64(d.Speed)
		if math.Abs(got-want) > 1e-9*want {
			t.Errorf("δi %v°: front/rear travel speed %.12f, want Ackermann %.12f", deg, got, want)
		}
		if p.Flows.Circulating != 0 {
			t.Errorf("δi %v°: circulating power %v with the front motor, want none", deg, p.Flows.Circulating)
		}
		// The mechanical front drive at 2 % lead winds up in the same turn.
		m := axVehicle(t, false, 0)
		q, err := m.At(d, units.RPM(1500), 0)
		if err != nil {
			t.Fatal(err)
		}
		checkFlows(t, "mechanical turn", q)
		if want > 1.02 && !(q.Flows.Circulating > 0) {
			t.Errorf("δi %v°: no circulating power with a 2 %% lead in a turn needing %.3f", deg, want)
		}
		t.Logf("δi %v°: R %.2f m, ratio %.4f; circulating %.2f kW (fixed lead), slip loss %.2f vs %.2f kW",
			deg, R, want, q.Flows.Circulating.Kilowatts(), q.Flows.Slip.Kilowatts(), p.Flows.Slip.Kilowatts())
	}
}

// TestFrontMotorDeclutch: above the declutch speed the clutched range is
// refused and the single range runs with the front motor still: no front
// torque, no drag.
func TestFrontMotorDeclutch(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	tr := v.Spec().Transmission.(*vehicle.FrontMotorDrive)
	l := tr.Layout()
	d := vehicle.Demand{Speed: units.KMH(15), Draft: units.Kilonewtons(5)}
	if _, err := v.At(d, units.RPM(1800), l.RangeIndex("road")); !errors.Is(err, vehicle.ErrTransmission) || !errors.Is(err, powersplit.ErrInfeasible) {
		t.Errorf("clutched range above the declutch speed: err = %v", err)
	}
	p, err := v.At(d, units.RPM(1800), l.RangeIndex("road single"))
	if err != nil {
		t.Fatal(err)
	}
	checkFlows(t, "declutched", p)
	if !p.Drive.Declutched || p.Drive.FrontTorque != 0 || p.FrontShare != 0 || p.Drive.FrontSetting != 0 {
		t.Errorf("declutched: %v, front torque %v, share %v, setting %v", p.Drive.Declutched, p.Drive.FrontTorque, p.FrontShare, p.Drive.FrontSetting)
	}
}

// TestFrontMotorDay runs a short day with a headland turn for both drives
// under the least-fuel strategy: the audits close, and only the fixed lead
// circulates power in the turn.
func TestFrontMotorDay(t *testing.T) {
	t.Parallel()
	plough := &vehicle.Implement{Row: vehicle.MoldboardPlough, Width: 2.4, Depth: units.Centimetres(18), Texture: vehicle.Medium}
	cycle := func(g vehicle.Traction) []vehicle.Segment {
		return []vehicle.Segment{
			{Name: "plough", Kind: vehicle.FieldPass, Speed: units.KMH(7), Distance: units.Metres(60), Implement: plough, Ground: g},
			{Name: "turn", Kind: vehicle.HeadlandTurn, Speed: units.KMH(5), Duration: 20e9, TurnRadius: units.Metres(6), Ground: g},
		}
	}
	for _, front := range []bool{false, true} {
		v := axVehicle(t, front, vehicle.FrontSchedule)
		day, err := vehicle.Simulate(v, vehicle.LeastFuel{Samples: 8}, cycle(axTyres(!front)), vehicle.Options{Step: 10e9})
		if err != nil {
			t.Fatal(err)
		}
		if err := day.Err(); err != nil {
			t.Fatalf("front motor %v: %v", front, err)
		}
		a := day.Audit
		if r := a.RelativeResidual(); r > 1e-9 {
			t.Errorf("front motor %v: audit residual %g", front, r)
		}
		if r := math.Abs(float64(a.Slip - a.FrontSlip - a.RearSlip)); r > 1e-6*float64(a.Slip) {
			t.Errorf("front motor %v: slip %v != %v + %v", front, a.Slip, a.FrontSlip, a.RearSlip)
		}
		turn := day.Segments[1].Audit
		if front && turn.Circulating != 0 || !front && !(turn.Circulating > 0) {
			t.Errorf("front motor %v: circulating energy in the turn %v", front, turn.Circulating)
		}
		t.Logf("front motor %v: fuel %.3f kg, slip front %.1f rear %.1f kJ, hydrostat %.1f kJ, turn circulating %.1f kJ",
			front, a.Fuel.Kilograms(), a.FrontSlip.Kilojoules(), a.RearSlip.Kilojoules(), a.Hydrostatic.Kilojoules(), turn.Circulating.Kilojoules())
	}
}

// BenchmarkFrontMotorAt is one two-axle point: the axle split found by
// secant steps, each a solve of the split transmission.
func BenchmarkFrontMotorAt(b *testing.B) {
	v := axVehicle(b, true, vehicle.FrontSchedule)
	d := vehicle.Demand{Speed: units.KMH(7), Draft: units.Kilonewtons(22)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.At(d, units.RPM(1800), 0); err != nil {
			b.Fatal(err)
		}
	}
}

// TestFrontMotorSearchIsAt: a least-fuel search shares one axle pair
// among the engine speeds and ranges it tries (tyreMemo); the point it
// returns equals, to the bit, the point At solves on its own at that
// engine speed and range, for both front controls, straight and in a
// turn, with draft and downhill (overrun, the brakes' search).
func TestFrontMotorSearchIsAt(t *testing.T) {
	t.Parallel()
	road := axTyres(false)
	road.Model, road.Surface = traction.Road{}, traction.Asphalt()
	demands := []vehicle.Demand{
		{Speed: units.KMH(7), Draft: units.Kilonewtons(22)},
		{Speed: units.KMH(4), Draft: units.Kilonewtons(12), TurnRadius: units.Metres(8)},
		{Speed: units.KMH(10), Grade: -0.15, Ground: road},
	}
	compared := 0
	for _, control := range []vehicle.FrontControl{vehicle.FrontSchedule, vehicle.FrontLeastPower} {
		v := axVehicle(t, true, control)
		for _, d := range demands {
			p, err := (vehicle.LeastFuel{}).Operate(v, d)
			if err != nil {
				t.Errorf("control %v, %+v: %v", control, d, err)
				continue
			}
			q, err := v.At(d, p.EngineSpeed, p.Range)
			if err != nil {
				t.Fatalf("control %v, %+v: At(%v, %d) = %v", control, d, p.EngineSpeed, p.Range, err)
			}
			if !reflect.DeepEqual(p, q) {
				t.Errorf("control %v, %+v: the search's point\n%+v\ndiffers from At's\n%+v", control, d, p, q)
			}
			compared++
		}
	}
	if compared < 5 {
		t.Errorf("only %d points compared", compared)
	}
}

// BenchmarkFrontLeastPowerAt is one two-axle point with the least-power
// front control: the split solved at some twenty front settings.
func BenchmarkFrontLeastPowerAt(b *testing.B) {
	v := axVehicle(b, true, vehicle.FrontLeastPower)
	d := vehicle.Demand{Speed: units.KMH(7), Draft: units.Kilonewtons(22)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.At(d, units.RPM(1800), 0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkFrontMotorLeastFuel is one least-fuel search of a two-axle
// point: the split solved at the engine speeds and ranges it tries.
func BenchmarkFrontMotorLeastFuel(b *testing.B) {
	v := axVehicle(b, true, vehicle.FrontSchedule)
	d := vehicle.Demand{Speed: units.KMH(7), Draft: units.Kilonewtons(22)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := (vehicle.LeastFuel{}).Operate(v, d); err != nil {
			b.Fatal(err)
		}
	}
}

// TestPropertyFrontMotorFlows: at random two-axle points (straight or in a
// turn, with or without draft) that solve, the flows close, the axles'
// slip losses add up to the slip loss, and each axle travels at the speed
// its path needs.
func TestPropertyFrontMotorFlows(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	tr := axTyres(false).Vehicle
	solved := 0
	defer func() {
		t.Logf("%d of the drawn points solved and checked", solved)
		if solved < 5 {
			t.Errorf("only %d points solved", solved)
		}
	}()
	rapid.Check(t, func(rt *rapid.T) {
		d := vehicle.Demand{Speed: units.KMH(rapid.Float64Range(2, 12).Draw(rt, "km/h")),
			Draft: units.Kilonewtons(rapid.Float64Range(0, 25).Draw(rt, "draft kN"))}
		k := 1.0
		if rapid.Bool().Draw(rt, "turn") {
			d.TurnRadius = units.Metres(rapid.Float64Range(4, 30).Draw(rt, "radius m"))
			g, err := tr.Turn(d.TurnRadius)
			if err != nil {
				rt.Fatal(err)
			}
			k = g.SpeedRatio
		}
		w := units.RPM(rapid.Float64Range(1300, 2100).Draw(rt, "engine rpm"))
		rng := rapid.IntRange(0, 3).Draw(rt, "range")
		p, err := v.At(d, w, rng)
		if err != nil {
			rt.Skip(err)
		}
		checkFlows(t, "random point", p)
		wf := float64(p.Drive.FrontSpeed) / axFrontFD
		if got := wf * 0.71 * (1 - p.FrontSlip) / float64(d.Speed); math.Abs(got-k) > 1e-9*k {
			rt.Fatalf("front over rear travel speed %v, want %v", got, k)
		}
		solved++
	})
}

// pullOnly hides a traction model's slope: the axles' slips are then
// searched by Brent's method on its Pull, as before the Newton search.
type pullOnly struct{ traction.Model }

// TestPropertyFrontMotorNewtonMatchesBrent: at random two-axle points on
// random soils the axles' slips searched by Newton's method on the
// Brixius slope give the point that Brent's method on the Brixius Pull
// gives. The slips differ by 1e-13 at most (TestPropertySlipForNewtonMatchesBrent
// in traction), which moves the outer search's residual (front wheel
// torque, tolerance 1e-10 of the torques) by some 1e-8 of its tolerance:
// the points agree to 1e-9 relative (slips to 1e-9 absolute).
func TestPropertyFrontMotorNewtonMatchesBrent(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	solved, worst := 0, 0.0
	defer func() {
		t.Logf("%d of the drawn points solved and compared; worst difference %.3g of its bound", solved, worst)
		if solved < 5 {
			t.Errorf("only %d points solved", solved)
		}
	}()
	rapid.Check(t, func(rt *rapid.T) {
		ground := axTyres(false)
		ground.Surface = traction.Surface{ConeIndex: units.Kilopascals(rapid.Float64Range(500, 2500).Draw(rt, "cone index kPa")),
			RollingCoefficient: 0.03}
		d := vehicle.Demand{Speed: units.KMH(rapid.Float64Range(2, 12).Draw(rt, "km/h")),
			Draft: units.Kilonewtons(rapid.Float64Range(0, 30).Draw(rt, "draft kN")), Ground: ground}
		if rapid.Bool().Draw(rt, "turn") {
			d.TurnRadius = units.Metres(rapid.Float64Range(4, 30).Draw(rt, "radius m"))
		}
		w := units.RPM(rapid.Float64Range(1300, 2100).Draw(rt, "engine rpm"))
		rng := rapid.IntRange(0, 1).Draw(rt, "range")
		p, err := v.At(d, w, rng)
		brent := ground
		brent.Model = pullOnly{ground.Model}
		d.Ground = brent
		q, errB := v.At(d, w, rng)
		if (err == nil) != (errB == nil) {
			rt.Fatalf("Newton: %v; Brent: %v", err, errB)
		}
		if err != nil {
			rt.Skip(err)
		}
		for _, c := range []struct {
			name      string
			got, want float64
			bound     float64
		}{
			{"front slip", p.FrontSlip, q.FrontSlip, 1e-9},
			{"rear slip", p.Slip, q.Slip, 1e-9},
			{"front share", p.FrontShare, q.FrontShare, 1e-9},
			{"engine torque", float64(p.EngineTorque), float64(q.EngineTorque), 1e-9 * math.Abs(float64(q.EngineTorque))},
			{"fuel rate", float64(p.FuelRate), float64(q.FuelRate), 1e-9 * math.Abs(float64(q.FuelRate))},
			// The split between the axles is solved to the torque the
			// drive carries: a front torque near zero (a light draft) is
			// known to that, not to itself (0.0049 N·m differed by 5e-12).
			{"front torque", float64(p.Drive.FrontTorque), float64(q.Drive.FrontTorque), 1e-9 * (math.Abs(float64(q.Drive.FrontTorque)) + math.Abs(float64(q.Drive.OutputTorque)))},
		} {
			diff, bound := math.Abs(c.got-c.want), math.Max(c.bound, 1e-12)
			if !(diff <= bound) {
				rt.Fatalf("%s: %.17g by Newton, %.17g by Brent", c.name, c.got, c.want)
			}
			worst = math.Max(worst, diff/bound)
		}
		solved++
	})
}

// TestFrontMotorOverrun: downhill the two-axle drive brakes on the engine
// first (no fuel, engine braking) and on the service brakes beyond the
// engine's motoring torque; the flows close either way.
func TestFrontMotorOverrun(t *testing.T) {
	t.Parallel()
	v := axVehicle(t, true, vehicle.FrontSchedule)
	road := axTyres(false)
	road.Model, road.Surface = traction.Road{}, traction.Asphalt()
	for _, grade := range []float64{-0.15, -0.25} {
		d := vehicle.Demand{Speed: units.KMH(10), Grade: grade, Ground: road}
		var p vehicle.Point
		var err error
		for _, w := range []float64{1200, 1500, 1800, 2100} {
			if p, err = v.At(d, units.RPM(w), 0); err == nil {
				break
			}
		}
		if err != nil {
			t.Fatalf("grade %v: %v", grade, err)
		}
		checkFlows(t, "overrun", p)
		if p.Flows.EngineBraking <= 0 || p.FuelRate != 0 {
			t.Errorf("grade %v: engine braking %v, fuel %v: want the engine motored without fuel", grade, p.Flows.EngineBraking, p.FuelRate)
		}
		if grade == -0.25 && !(p.Flows.Brake > 0) {
			t.Errorf("grade %v: no service braking beyond the engine's motoring torque", grade)
		}
		t.Logf("grade %v: engine braking %.2f kW, brakes %.2f kW, engine torque %.1f N·m", grade,
			p.Flows.EngineBraking.Kilowatts(), p.Flows.Brake.Kilowatts(), p.EngineTorque.NewtonMetres())
	}
}

// FuzzFrontMotorDrive: the constructor and OperateAxles return an error or
// a finite drive point, never a panic or NaN.
func FuzzFrontMotorDrive(f *testing.F) {
	f.Add(60.0, 0.97, 1.5, 0, 1800.0, 300.0, 1800.0, 1200.0, 0.5)
	f.Add(0.0, 2.0, -1.0, 3, 0.0, -1e9, 1e300, -5.0, 7.0)
	l := axLayout(f, true)
	f.Fuzz(func(t *testing.T, fd, eff, ratio float64, ctl int, engine, rear, front, torque, setting float64) {
		d, err := vehicle.FromFrontMotorLayout(l, vehicle.FrontMotorSpec{FinalDrive: fd, Efficiency: eff, AxleRatio: ratio, Control: vehicle.FrontControl(ctl)})
		if err != nil {
			return
		}
		for rng := range d.Ranges() {
			p, err := d.OperateAxles(rng, units.RPM(engine), units.RPM(rear), units.RPM(front), units.NewtonMetres(torque), setting)
			if err != nil {
				continue
			}
			for _, x := range []float64{float64(p.InputTorque), float64(p.FrontTorque), float64(p.HydrostaticLoss), float64(p.MechanicalLoss), p.FrontSetting} {
				if math.IsNaN(x) || math.IsInf(x, 0) {
					t.Fatalf("range %d: non-finite drive point %+v", rng, p)
				}
			}
		}
	})
}
