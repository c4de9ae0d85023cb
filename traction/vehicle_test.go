package traction_test

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

var firmOp = traction.Operation{Pull: units.Kilonewtons(30), Speed: units.KMH(8)}

func TestLeadCirculation(t *testing.T) {
	t.Parallel()
	v := demoVehicle()
	// Common practice (no published source): a geared front axle with a
	// lead of a few percent pushes against the rear axle at light pull, so
	// power circulates; at a heavy pull both axles drive.
	light := traction.Operation{Pull: units.Kilonewtons(1), Speed: units.KMH(8)}
	d, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), light, 0.06)
	if err != nil {
		t.Fatal(err)
	}
	if d.CirculatingPower <= 0 || d.Rear.Wheel.Slip >= 0 || d.Rear.Torque >= 0 {
		t.Errorf("light pull, 6%% lead: circulating %v, rear slip %g, rear torque %v; want > 0, < 0, < 0",
			d.CirculatingPower, d.Rear.Wheel.Slip, d.Rear.Torque)
	}
	// (1 + lead)(1 − s_f) = 1 − s_r.
	if got := 1.06 * (1 - d.Front.Wheel.Slip); math.Abs(got-(1-d.Rear.Wheel.Slip)) > 1e-12 {
		t.Errorf("kinematics: (1+lead)(1−s_f) = %.15g, 1−s_r = %.15g", got, 1-d.Rear.Wheel.Slip)
	}
	h, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), firmOp, 0.02)
	if err != nil {
		t.Fatal(err)
	}
	if h.CirculatingPower != 0 {
		t.Errorf("heavy pull, 2%% lead: circulating %v, want 0", h.CirculatingPower)
	}
	if math.Abs(float64(h.Front.Net+h.Rear.Net-firmOp.Pull)) > 1e-6 {
		t.Errorf("net pulls %v + %v, want sum %v", h.Front.Net, h.Rear.Net, firmOp.Pull)
	}
}

func TestIndependentBeatsFixed(t *testing.T) {
	t.Parallel()
	v := demoVehicle()
	ind, err := v.Independent(traction.Brixius{}, traction.FirmSoil(), firmOp)
	if err != nil {
		t.Fatal(err)
	}
	if ind.CirculatingPower != 0 {
		t.Errorf("independent drive circulates %v", ind.CirculatingPower)
	}
	for _, lead := range []float64{-0.03, 0, 0.01, 0.02, 0.05, 0.1} {
		d, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), firmOp, lead)
		if err != nil {
			t.Fatal(err)
		}
		if d.Efficiency > ind.Efficiency+1e-9 {
			t.Errorf("lead %g: fixed-ratio TE %.6f above independent %.6f", lead, d.Efficiency, ind.Efficiency)
		}
	}
	rd, err := v.RearDrive(traction.Brixius{}, traction.FirmSoil(), firmOp)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(float64(rd.Front.Torque)) > 1e-6 {
		t.Errorf("rear drive: front torque %v, want 0", rd.Front.Torque)
	}
	if rd.Efficiency >= ind.Efficiency {
		t.Errorf("rear drive TE %.4f not below four-wheel drive %.4f", rd.Efficiency, ind.Efficiency)
	}
}

func TestTurnWindUp(t *testing.T) {
	t.Parallel()
	v := demoVehicle()
	// Equal front and rear gearing (lead 0) in a tight turn: the front axle
	// must run about 10 % faster, so it is braked and the rear pushes.
	zero := traction.Operation{Speed: units.KMH(6)}
	d, g, err := v.FixedRatioTurn(traction.Brixius{}, traction.FirmSoil(), zero, 0, units.Metres(6))
	if err != nil {
		t.Fatal(err)
	}
	if d.CirculatingPower <= 0 || d.Front.Torque >= 0 {
		t.Errorf("turn at lead 0: circulating %v, front torque %v; want > 0, < 0", d.CirculatingPower, d.Front.Torque)
	}
	// A lead matching the turn's speed ratio on these tyres leaves the axles
	// at one slip: no wind-up beyond the straight-ahead state.
	m, _, err := v.FixedRatioTurn(traction.Brixius{}, traction.FirmSoil(), zero, g.SpeedRatio-1, units.Metres(6))
	if err != nil {
		t.Fatal(err)
	}
	ind, _, err := v.IndependentTurn(traction.Brixius{}, traction.FirmSoil(), zero, units.Metres(6))
	if err != nil {
		t.Fatal(err)
	}
	if ind.CirculatingPower != 0 || ind.InputPower >= d.InputPower {
		t.Errorf("own motors in the turn: circulating %v, input %v (geared %v)", ind.CirculatingPower, ind.InputPower, d.InputPower)
	}
	for _, x := range []traction.Drive{d, m, ind} {
		if math.Abs(float64(x.DrawbarPower)) > 1e-6 {
			t.Errorf("turn at zero pull: drawbar power %v, want 0", x.DrawbarPower)
		}
		sum := x.DrawbarPower + x.SlipLoss + x.RollingLoss
		if math.Abs(float64(x.InputPower-sum)) > 1e-9*math.Abs(float64(x.SlipLoss+x.RollingLoss)) {
			t.Errorf("turn power balance: input %v, drawbar+losses %v", x.InputPower, sum)
		}
	}
	if m.CirculatingPower >= d.CirculatingPower {
		t.Errorf("matched lead circulates %v, not less than %v", m.CirculatingPower, d.CirculatingPower)
	}
}

func TestBallast(t *testing.T) {
	t.Parallel()
	v := demoVehicle()
	a, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), firmOp, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	if a.FrontShare != 0.35 || !strings.Contains(a.Caution, "road rules") {
		t.Errorf("front share %g, caution %q", a.FrontShare, a.Caution)
	}
	// At the mass the pull asks for, the vehicle at equal slips gives the
	// pull (the advised Mass is bounded by the fitted ballast, none here).
	w := v
	w.Mass = a.PullMass
	w.CentreOfMass = units.Length(a.FrontShare * float64(v.Wheelbase))
	d, err := w.FixedRatio(traction.Brixius{}, traction.FirmSoil(), firmOp, 0)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(d.Rear.Wheel.Slip-0.10) > 1e-6 {
		t.Errorf("slip at advised mass %v = %.6f, want 0.10", a.Mass, d.Rear.Wheel.Slip)
	}
	if got := float64(a.FrontBallast + a.RearBallast); math.Abs(got-float64(a.Ballast)) > 1e-6 {
		t.Errorf("axle ballasts sum %g, want %v", got, a.Ballast)
	}
	if _, err := v.Ballast(traction.Brixius{}, traction.SoftSoil(), traction.Operation{Pull: units.Kilonewtons(1e4)},
		traction.FourWheelDrive, traction.Towed, 0.1); !errors.Is(err, traction.ErrPull) {
		t.Errorf("impossible pull: error %v, want ErrPull", err)
	}
}

func TestTyreOverloadFlag(t *testing.T) {
	t.Parallel()
	w, _ := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	st, err := w.Run(units.Kilonewtons(40), 0.1, units.KMH(8))
	if err != nil {
		t.Fatal(err)
	}
	if !st.Overloaded {
		t.Errorf("40 kN on a 32 kN tyre not flagged")
	}
}

func TestBadInput(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	good := traction.FirmSoil()
	w, _ := traction.NewWheel(rearTyre, good, traction.Brixius{})
	badTyre := rearTyre
	badTyre.Width = units.Length(nan)
	cases := []struct {
		name string
		err  error
		want error
	}{
		{"NaN tyre", func() error { _, e := traction.NewWheel(badTyre, good, traction.Brixius{}); return e }(), traction.ErrTyre},
		{"zero cone index", func() error {
			_, e := traction.NewWheel(rearTyre, traction.Surface{}, traction.Brixius{})
			return e
		}(), traction.ErrSurface},
		{"negative cone index", func() error {
			_, e := traction.NewWheel(rearTyre, traction.Surface{ConeIndex: -1}, traction.WismerLuth{})
			return e
		}(), traction.ErrSurface},
		{"negative load", func() error { _, e := w.At(-1, 0.1); return e }(), traction.ErrLoad},
		{"slip 1", func() error { _, e := w.At(units.Kilonewtons(20), 1); return e }(), traction.ErrSlip},
		{"negative slip", func() error { _, e := w.At(units.Kilonewtons(20), -0.1); return e }(), traction.ErrSlip},
		{"NaN slip", func() error { _, e := w.At(units.Kilonewtons(20), nan); return e }(), traction.ErrSlip},
		{"NaN pull", func() error { _, e := w.SlipForPull(units.Kilonewtons(20), units.Force(nan)); return e }(), traction.ErrInput},
		{"pull too big", func() error { _, e := w.SlipForPull(units.Kilonewtons(20), units.Kilonewtons(50)); return e }(), traction.ErrPull},
		{"nil model", func() error { _, e := traction.NewWheel(rearTyre, good, nil); return e }(), traction.ErrInput},
		{"lead", func() error { _, e := demoVehicle().FixedRatio(traction.Brixius{}, good, firmOp, nan); return e }(), traction.ErrInput},
		{"negative pull", func() error { _, e := demoVehicle().DynamicLoads(-1, 0); return e }(), traction.ErrInput},
	}
	for _, c := range cases {
		if !errors.Is(c.err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, c.err, c.want)
		}
	}
	var re *traction.RangeError
	if _, err := w.At(-5, 0.1); !errors.As(err, &re) || re.Value.SI != -5 {
		t.Errorf("RangeError not carried: %v", err)
	}
	var pe *traction.PullError
	if _, err := w.SlipForPull(units.Kilonewtons(20), units.Kilonewtons(50)); !errors.As(err, &pe) || pe.Limit <= 0 {
		t.Errorf("PullError not carried: %v", err)
	}
}

func TestFreeRollingAndRearDriveBallast(t *testing.T) {
	t.Parallel()
	w, _ := traction.NewWheel(frontTyre, traction.FirmSoil(), traction.Brixius{})
	p, err := w.FreeRolling(units.Kilonewtons(15))
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(float64(p.Gross)) > 1e-6 || p.Slip >= 0 || math.Abs(float64(p.Net+p.Resistance)) > 1e-6 {
		t.Errorf("free rolling: gross %v, slip %g, net %v, resistance %v", p.Gross, p.Slip, p.Net, p.Resistance)
	}
	v := demoVehicle()
	a, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), firmOp, traction.RearWheelDrive, traction.Towed, 0.12)
	if err != nil {
		t.Fatal(err)
	}
	wv := v
	wv.Mass = a.PullMass
	wv.CentreOfMass = units.Length(a.FrontShare * float64(v.Wheelbase))
	d, err := wv.RearDrive(traction.Brixius{}, traction.FirmSoil(), firmOp)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(d.Rear.Wheel.Slip-0.12) > 1e-6 {
		t.Errorf("rear-drive slip at advised mass = %.6f, want 0.12", d.Rear.Wheel.Slip)
	}
}

// TestBallastBounded: ballast advice never removes more than the fitted
// ballast and keeps within the permissible mass and the axle and tyre
// ratings, says which bound held and lists what it respects. Before, it
// could tell the user to remove more ballast than was fitted.
func TestBallastBounded(t *testing.T) {
	t.Parallel()
	v := demoVehicle() // 9000 kg; the pull of firmOp at 10 % slip asks for less
	free, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), firmOp, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	if !(free.PullMass < v.Mass) {
		t.Fatalf("the test needs a pull that asks for less than the vehicle mass: %v", free.PullMass)
	}
	v.FittedBallast = units.Kilograms(300)
	a, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), firmOp, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: at most the 300 kg fitted come off.
	if a.Ballast != -v.FittedBallast || a.Mass != v.Mass-v.FittedBallast || a.Bound != "fitted ballast" {
		t.Errorf("fitted 300 kg: ballast %v, mass %v, bound %q; want −300 kg, 8700 kg, fitted ballast", a.Ballast, a.Mass, a.Bound)
	}
	if len(a.Respects) == 0 || !strings.HasPrefix(a.Respects[0], "fitted ballast 300 kg") {
		t.Errorf("Respects = %q", a.Respects)
	}
	// A heavy pull asks for more mass than the permissible mass and the
	// rear tyres' rating allow.
	heavy := traction.Operation{Pull: units.Kilonewtons(60), Speed: firmOp.Speed}
	// With the rear tyres' rating even the lightest mass overloads them
	// under this pull: the advice keeps the ballast on and says so.
	c, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), heavy, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	if c.Mass != v.Mass-v.FittedBallast || c.Bound != "fitted ballast (and above the rear tyre rated load)" || !c.RearOverloaded {
		t.Errorf("contradicting bounds: mass %v, bound %q, rear overloaded %v", c.Mass, c.Bound, c.RearOverloaded)
	}
	v.Front.Tyre.RatedLoad, v.Rear.Tyre.RatedLoad = 0, 0
	v.MaxMass = units.Kilograms(10000)
	h, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), heavy, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	if !(h.PullMass > v.MaxMass) || h.Mass != v.MaxMass || h.Bound != "permissible operating mass" {
		t.Errorf("heavy pull: pull mass %v, mass %v, bound %q; want the permissible 10000 kg", h.PullMass, h.Mass, h.Bound)
	}
	v.MaxMass = 0
	v.Rear.MaxLoad = units.Kilonewtons(75)
	r, err := v.Ballast(traction.Brixius{}, traction.FirmSoil(), heavy, traction.FrontWheelAssist, traction.Towed, 0.10)
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: under the pull the rear load is
	// (1 − 0.35)·m·gₙ + P·h/L, which reaches 75 kN at
	// m = (75000 − 60000·0.5/2.8)/(0.65·9.80665) = 10085.4 kg.
	want := (75000 - 60000*0.5/2.8) / (0.65 * 9.80665)
	if r.Bound != "rear axle permissible load" || math.Abs(float64(r.Mass)-want) > 1e-6*want {
		t.Errorf("rear axle limit: mass %v, bound %q; want %.1f kg", r.Mass, r.Bound, want)
	}
	if !slices.Contains(r.NotChecked, "permissible operating mass") || !slices.Contains(r.NotChecked, "rear tyre rated load") {
		t.Errorf("NotChecked = %q, want the permissible mass listed", r.NotChecked)
	}
}
