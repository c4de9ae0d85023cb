package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// TestLoopUnitAt: a loop evaluates its units in their own frames; a motor
// sees the loop pressure with the opposite sign. Hand calculation, lossless
// 100 cm³/rev units at full setting, 1500 rpm: Q = 100e-6·1500/60 =
// 2.5e-3 m³/s = 150 L/min; T = Δp·D/(2π) = 200e5·100e-6/(2π) = 318.31 N·m.
func TestLoopUnitAt(t *testing.T) {
	t.Parallel()
	u := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(100)})
	l, err := NewLoop(LoopSpec{Pump: u, Motors: []Unit{u, u}, Oil: VG46, Temperature: units.Celsius(50), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		t.Fatal(err)
	}
	if l.NumMotors() != 2 {
		t.Errorf("NumMotors() = %d, want 2", l.NumMotors())
	}
	pump, err := l.UnitAt(0, 1, units.RPM(1500), units.Bar(200))
	if err != nil || pump.Mode != Pumping || !testutil.Close(pump.Flow.LitresPerMinute(), 150, 1e-12, 0) ||
		!testutil.Close(float64(pump.Torque), 200e5*100e-6/(2*math.Pi), 1e-12, 0) {
		t.Errorf("UnitAt(pump) = %+v, %v", pump, err)
	}
	motor, err := l.UnitAt(2, 1, units.RPM(1500), units.Bar(200))
	if err != nil || motor.Mode != Motoring || !testutil.Close(float64(motor.Pressure), -200e5, 1e-12, 0) {
		t.Errorf("UnitAt(motor 2) = %+v, %v", motor, err)
	}
	for _, i := range []int{-1, 3} {
		if _, err := l.UnitAt(i, 1, units.RPM(1500), units.Bar(200)); !errors.Is(err, ErrInvalid) {
			t.Errorf("UnitAt(%d) error = %v", i, err)
		}
	}
	// Settings refuses a zero loop and non-finite speeds or pressure.
	x := make([]float64, 3)
	if err := (Loop{}).Settings(1, nil, 0, x); !errors.Is(err, ErrInvalid) {
		t.Errorf("zero Loop Settings error = %v", err)
	}
	if err := l.Settings(units.AngularVelocity(math.NaN()), []units.AngularVelocity{1, 1}, 0, x); !errors.Is(err, ErrInvalid) {
		t.Errorf("NaN pump speed error = %v", err)
	}
	if err := l.Settings(100, []units.AngularVelocity{1, units.AngularVelocity(math.Inf(1))}, 0, x); !errors.Is(err, ErrInvalid) {
		t.Errorf("Inf motor speed error = %v", err)
	}
	// The minimum common motor setting each schedule keeps.
	for _, c := range []struct {
		s    Schedule
		want float64
	}{
		{Sequential{MinMotorSetting: 0.3}, 0.3},
		{MinLoss{MinMotorSetting: 0.25}, 0.25},
		{Pinned{MinMotorSetting: 0.4}, 0.4},
	} {
		lc, err := NewLoop(LoopSpec{Pump: u, Motors: []Unit{u}, Oil: VG46, Temperature: units.Celsius(50), Charge: units.Bar(20), Relief: units.Bar(450), Schedule: c.s})
		if err != nil {
			t.Fatal(err)
		}
		if got := lc.MinMotorSetting(); got != c.want {
			t.Errorf("%T: MinMotorSetting() = %v, want %v", c.s, got, c.want)
		}
	}
	if err := (MinLoss{Tolerance: -1}).Validate(); !errors.Is(err, ErrInvalid) {
		t.Errorf("MinLoss{Tolerance: -1}.Validate() = %v", err)
	}
	if err := (MinLoss{MinMotorSetting: 1.5}).Validate(); !errors.Is(err, ErrInvalid) {
		t.Errorf("MinLoss{MinMotorSetting: 1.5}.Validate() = %v", err)
	}
}

func TestNamesAndSmallAccessors(t *testing.T) {
	t.Parallel()
	for k, want := range map[Kind]string{Swashplate: "swashplate", BentAxis: "bent axis", 5: "Kind(5)"} {
		if got := k.String(); got != want {
			t.Errorf("Kind(%d) = %q, want %q", int(k), got, want)
		}
	}
	for m, want := range map[Mode]string{Pumping: "pumping", Motoring: "motoring", Idle: "idle", 7: "Mode(7)"} {
		if got := m.String(); got != want {
			t.Errorf("Mode(%d) = %q, want %q", int(m), got, want)
		}
	}
	u := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(90)})
	if got := u.Displacement(-0.5).CCPerRev(); !testutil.Close(got, -45, 1e-12, 0) {
		t.Errorf("Displacement(-0.5) = %v cm³/rev, want -45", got)
	}
	// The default bulk modulus (see oil.go): 1.6 GPa.
	if got := VG46.BulkModulus(); got != units.Pressure(1.6e9) {
		t.Errorf("VG46.BulkModulus() = %v, want 1.6 GPa", got)
	}
	if err := (Map{}).Validate(); !errors.Is(err, ErrInvalid) {
		t.Errorf("zero Map Validate() = %v", err)
	}
	if _, _, err := (Map{}).Efficiencies(Pumping, 1, 100, units.Bar(100)); !errors.Is(err, ErrInvalid) {
		t.Errorf("zero Map Efficiencies error = %v", err)
	}
}

// TestBentAxisAngle: a bent-axis unit's setting is sin α / sin α_max (its
// displacement follows sin α). Hand calculation, α_max = 25°, setting 0.5:
// α = asin(0.5·sin 25°) = asin(0.211 309) = 12.1991°; and 10° gives
// sin 10°/sin 25° = 0.173 648 2/0.422 618 3 = 0.410 887.
func TestBentAxisAngle(t *testing.T) {
	t.Parallel()
	u := mustUnit(t, UnitSpec{Kind: BentAxis, Pistons: 7, PistonDiameter: units.Millimetres(20), PitchDiameter: units.Millimetres(80),
		MaxAngle: units.Degrees(25)})
	a, err := u.AngleFromSetting(0.5)
	if err != nil || !testutil.Close(a.Degrees(), 12.1991, 0, 5e-5) {
		t.Errorf("AngleFromSetting(0.5) = %v°, %v, want 12.1991°", a.Degrees(), err)
	}
	x, err := u.SettingFromAngle(units.Degrees(10))
	if err != nil || !testutil.Close(x, 0.410887, 0, 5e-7) {
		t.Errorf("SettingFromAngle(10°) = %v, %v, want 0.410887", x, err)
	}
	if _, err := u.SettingFromAngle(units.Degrees(26)); !errors.Is(err, ErrSettingLimit) {
		t.Errorf("SettingFromAngle(26°) error = %v", err)
	}
}
