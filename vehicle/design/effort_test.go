package design

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// handDrive is a lossless pure-hydrostatic drive on an exponential slip
// curve, simple enough that each limit of the tractive-effort diagram has
// a closed form.
type handDrive struct {
	relief     units.Pressure
	vm         units.Displacement // motor displacement
	motorMax   units.AngularVelocity
	ratio, fd  float64 // range gear (output over motor) and final drive
	curve      vehicle.SlipCurve
	torque     units.Torque // flat full-load torque
	rated      units.AngularVelocity
	pumpVolume units.Displacement
}

func (h handDrive) vehicle(t *testing.T) *vehicle.Vehicle {
	t.Helper()
	pump, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: h.pumpVolume, MaxSpeed: units.RPM(5000)})
	if err != nil {
		t.Fatal(err)
	}
	motor, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: h.vm, MaxSpeed: h.motorMax})
	if err != nil {
		t.Fatal(err)
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: []hydrostat.Unit{motor}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(50), Relief: h.relief})
	if err != nil {
		t.Fatal(err)
	}
	l, err := powersplit.PureHydrostatic(powersplit.PureHydrostaticSpec{Loop: loop, GearEfficiency: 1,
		Ranges: []powersplit.RangeGear{{Name: "only", Ratio: h.ratio}}})
	if err != nil {
		t.Fatal(err)
	}
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	e, err := vehicle.NewEngine(vehicle.EngineSpec{Rated: h.rated,
		CurveSpeeds:  []units.AngularVelocity{units.RPM(1000), h.rated, units.RPM(2500)},
		CurveTorques: []units.Torque{h.torque, h.torque, h.torque}})
	if err != nil {
		t.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Kilograms(float64(h.curve.Weight) / float64(units.Gravity)),
		Tyres: h.curve, Transmission: drive, FinalDrive: h.fd, FinalDriveEfficiency: 1, Engine: e})
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// TestTractiveEffortHand checks the diagram against a hand calculation at
// the points where each limit binds: traction at low speed, relief
// pressure above it, engine power further up, motor speed at the top.
func TestTractiveEffortHand(t *testing.T) {
	t.Parallel()
	h := handDrive{relief: units.Bar(400), vm: units.CCPerRev(100), motorMax: units.RPM(3000), ratio: 1, fd: 40,
		curve:  vehicle.SlipCurve{Weight: units.Kilonewtons(60), Radius: units.Metres(0.8), Rolling: 0.05, PeakTraction: 0.9, SlipRate: 10},
		torque: units.NewtonMetres(300), rated: units.RPM(2000), pumpVolume: units.CCPerRev(100)}
	v := h.vehicle(t)
	W, f := float64(h.curve.Weight), h.curve.Rolling
	const maxSlip = 0.15
	// Hand calculation (equations of SlipCurve and a lossless drive):
	// traction: D = W·μmax·(1 − e^(−k·s)) − f·W at s = 0.15;
	tractionPull := W*h.curve.PeakTraction*(1-math.Exp(-h.curve.SlipRate*maxSlip)) - f*W
	// pressure: D = Δp·Vm/ratio·fd/r − f·W (Vm per radian);
	pressurePull := float64(h.relief)*float64(h.vm)/h.ratio*h.fd/float64(h.curve.Radius) - f*W
	// engine: (D + f·W)·v/(1 − s(D)) = T·ω, s(D) = −ln(1 − (D+fW)/(W·μmax))/k;
	power := float64(h.torque) * float64(h.rated)
	enginePull := func(speed float64) float64 {
		lo, hi := 0.0, W*h.curve.PeakTraction-f*W-1e-6
		for range 200 {
			d := (lo + hi) / 2
			s := -math.Log1p(-(d+f*W)/(W*h.curve.PeakTraction)) / h.curve.SlipRate
			if (d+f*W)*speed/(1-s) > power {
				hi = d
			} else {
				lo = d
			}
		}
		return lo
	}
	// motor speed: at zero draft, v = ωmax·ratio/fd·r·(1 − s(0)).
	s0 := -math.Log1p(-f/h.curve.PeakTraction) / h.curve.SlipRate
	vTop := float64(h.motorMax) * h.ratio / h.fd * float64(h.curve.Radius) * (1 - s0)
	if tractionPull <= pressurePull {
		t.Fatalf("hand case: traction %g N must exceed the pressure pull %g N to see both", tractionPull, pressurePull)
	}
	cases := []struct {
		speed units.Speed
		limit string
		pull  float64 // N; NaN: infeasible
	}{
		{units.KMH(1), LimitPressure, pressurePull},
		{units.KMH(8), LimitEngine, enginePull(float64(units.KMH(8)))},
		{units.KMH(12), LimitEngine, enginePull(float64(units.KMH(12)))},
		{units.Speed(vTop * 1.01), LimitUnitSpeed, math.NaN()},
	}
	// A second vehicle whose motor is large enough that traction binds.
	h2 := h
	h2.vm = units.CCPerRev(150)
	pts2, err := TractiveEffort(h2.vehicle(t), EffortSpec{Speeds: []units.Speed{units.KMH(1)}, MaxSlip: maxSlip, Resolution: 1})
	if err != nil {
		t.Fatal(err)
	}
	pBig := float64(h2.relief)*float64(h2.vm)/h2.ratio*h2.fd/float64(h2.curve.Radius) - f*W
	if pBig <= tractionPull {
		t.Fatalf("hand case: the 150 cm³/rev pull %g N must exceed traction %g N", pBig, tractionPull)
	}
	// Source: hand calculation above (traction at 15 % slip).
	if got := pts2[0]; got.Limit != LimitTraction || math.Abs(float64(got.Pull)-tractionPull) > 2 {
		t.Errorf("150 cm³/rev motor at 1 km/h: pull %v limited by %q, want %.6g N by %q", got.Pull, got.Limit, tractionPull, LimitTraction)
	}
	var speeds []units.Speed
	for _, c := range cases {
		speeds = append(speeds, c.speed)
	}
	pts, err := TractiveEffort(v, EffortSpec{Speeds: speeds, MaxSlip: maxSlip, Resolution: 1})
	if err != nil {
		t.Fatal(err)
	}
	for i, c := range cases {
		got := pts[i]
		// Source: hand calculation above.
		if got.Limit != c.limit {
			t.Errorf("at %v: limit %q, want %q", c.speed, got.Limit, c.limit)
		}
		if math.IsNaN(c.pull) {
			if got.Feasible {
				t.Errorf("at %v: feasible with pull %v, want infeasible", c.speed, got.Pull)
			}
			continue
		}
		if math.Abs(float64(got.Pull)-c.pull) > 2 {
			t.Errorf("at %v: pull %.6g N, want %.6g N", c.speed, float64(got.Pull), c.pull)
		}
	}
	var buf bytes.Buffer
	if err := WriteEffortCSV(&buf, pts, []string{"only"}); err != nil {
		t.Fatal(err)
	}
	if lines := strings.Count(buf.String(), "\n"); lines != len(pts)+1 {
		t.Errorf("CSV has %d lines, want %d", lines, len(pts)+1)
	}
}

// TestGreatestPullOnly (property): the pull check's diagram, which stops
// bisecting a range once it cannot beat an earlier range, gives at every
// speed the same point of greatest pull (the last range's of equal pulls)
// as the full diagram, and no other point above it.
func TestGreatestPullOnly(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	s := demoSpace()
	pick := func(pts []EffortPoint, n, i int) (EffortPoint, bool) {
		var best EffortPoint
		found := false
		for rg := range len(pts) / n {
			if q := pts[rg*n+i]; q.Feasible && q.Pull >= best.Pull {
				best, found = q, true
			}
		}
		return best, found
	}
	drawn, compared := 0, 0
	rapid.Check(t, func(t *rapid.T) {
		g, err := f.Apply(s, Candidate(s, 2, rapid.IntRange(0, 5000).Draw(t, "candidate")))
		if err != nil {
			t.Fatal(err)
		}
		v, err := g.Vehicle(g.Transmission)
		if err != nil {
			t.Skip("does not build:", err)
		}
		ground, err := g.Ground(g.firstSurface("field"))
		if err != nil {
			t.Fatal(err)
		}
		speeds := []units.Speed{units.KMH(rapid.Float64Range(1, 20).Draw(t, "speed 1 km/h")), units.KMH(rapid.Float64Range(1, 40).Draw(t, "speed 2 km/h"))}
		spec := EffortSpec{Speeds: speeds, Ground: ground}
		all, err := TractiveEffort(v, spec)
		if err != nil {
			t.Fatal(err)
		}
		fast, err := tractiveEffort(v, spec, true)
		if err != nil {
			t.Fatal(err)
		}
		for i := range speeds {
			drawn++
			want, ok := pick(all, len(speeds), i)
			got, _ := pick(fast, len(speeds), i)
			if got != want {
				t.Fatalf("at %v: greatest pull %+v, the full diagram's %+v", speeds[i], got, want)
			}
			for rg := range len(all) / len(speeds) {
				if q := fast[rg*len(speeds)+i]; q.Pull > all[rg*len(speeds)+i].Pull {
					t.Fatalf("range %d at %v: pull %v above the full diagram's %v", rg, speeds[i], q.Pull, all[rg*len(speeds)+i].Pull)
				}
			}
			if ok {
				compared++
			}
		}
	})
	if 2*compared < drawn {
		t.Errorf("%d of %d speeds had a feasible range to compare, want at least half", compared, drawn)
	}
}
