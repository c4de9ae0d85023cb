package demo

import (
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/vehicle"
)

func TestBuiltinLoads(t *testing.T) {
	t.Parallel()
	s, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	if _, err := s.Vehicle(s.Transmission); err != nil {
		t.Fatal(err)
	}
	for _, a := range s.Alternatives {
		if _, err := s.Vehicle(a); err != nil {
			t.Errorf("alternative %q: %v", a.Name, err)
		}
	}
	if _, err := s.Cycle(); err != nil {
		t.Fatal(err)
	}
}

func TestFormat(t *testing.T) {
	t.Parallel()
	cases := []struct {
		v    float64
		prec int
		unit string
		want string
	}{
		{12.345, 1, "kg", "12.3 kg"},
		{-0.0001, 1, "kW", "0.0 kW"},
		{0, 0, "", "0"},
	}
	for _, c := range cases {
		if got := F(c.v, c.prec, c.unit); got != c.want {
			t.Errorf("F(%v, %d, %q) = %q, want %q", c.v, c.prec, c.unit, got, c.want)
		}
	}
	for _, v := range []float64{nanValue(), 1 / zero()} {
		if got := F(v, 1, "kg"); strings.Contains(got, "NaN") || strings.Contains(got, "Inf") {
			t.Errorf("F(%v) = %q, want no NaN or Inf", v, got)
		}
	}
}

var zeroValue float64

func zero() float64     { return zeroValue }
func nanValue() float64 { return zero() / zero() }

// TestStrict: the example programs refuse a design with an unrated unit
// limit, naming it; the built-in design is fully rated.
func TestStrict(t *testing.T) {
	t.Parallel()
	sc, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	if err := Strict(sc); err != nil {
		t.Fatalf("built-in design: %v", err)
	}
	sc.Transmission.Motor.MaxSpeed = 0
	err = Strict(sc)
	if err == nil || !strings.Contains(err.Error(), "motor 1 speed: maximum speed not rated") {
		t.Errorf("unrated motor speed: %v", err)
	}
}

func TestFrontMotorBuiltinLoads(t *testing.T) {
	t.Parallel()
	s, err := FrontMotor()
	if err != nil {
		t.Fatal(err)
	}
	if s.Tractor.FrontMotor == nil {
		t.Fatal("the front-motor variant has no front motor")
	}
	v, err := s.Vehicle(s.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := v.Spec().Transmission.(*vehicle.FrontMotorDrive); !ok {
		t.Errorf("transmission %T, want a FrontMotorDrive", v.Spec().Transmission)
	}
	cycle, err := s.Cycle()
	if err != nil {
		t.Fatal(err)
	}
	turns := 0
	for _, g := range cycle {
		if g.Kind == vehicle.HeadlandTurn && g.TurnRadius > 0 {
			turns++
		}
	}
	if turns == 0 {
		t.Error("no headland turn with a radius in the front-motor variant's day")
	}
}

// TestFrontMotorValidate: the design file's front motor is checked.
func TestFrontMotorValidate(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name string
		edit func(s *Scenario)
		want string
	}{
		{"control", func(s *Scenario) { s.Tractor.FrontMotor.Control = "faster" }, "tractor.frontMotor.control"},
		{"final drive", func(s *Scenario) { s.Tractor.FrontMotor.FinalDrive = 0 }, "tractor.frontMotor.finalDrive"},
		{"setting", func(s *Scenario) { s.Tractor.FrontMotor.Setting[0].Setting = 1.5 }, "tractor.frontMotor"},
		{"compound", func(s *Scenario) {
			s.Transmission.Kind = "compound"
			set2 := s.Transmission.Set
			s.Transmission.Set2 = &set2
		}, "front motor needs an input- or output-coupled split"},
	} {
		s, err := FrontMotor()
		if err != nil {
			t.Fatal(err)
		}
		if err := s.Validate(); err != nil {
			t.Fatalf("built-in front-motor variant: %v", err)
		}
		c.edit(s)
		if err := s.Validate(); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Validate() = %v, want an error naming %q", c.name, err, c.want)
		}
	}
}
