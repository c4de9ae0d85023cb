package design

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// parsed returns a fresh copy of the test design.
func parsed(t *testing.T) *File {
	t.Helper()
	f, err := Parse("tractor.json", testFile(t))
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// fieldErrors returns the *FieldError values joined in err.
func fieldErrors(err error) []*FieldError {
	var out []*FieldError
	var walk func(error)
	walk = func(e error) {
		var fe *FieldError
		if errors.As(e, &fe) && fe == e {
			out = append(out, fe)
			return
		}
		if j, ok := e.(interface{ Unwrap() []error }); ok {
			for _, x := range j.Unwrap() {
				walk(x)
			}
		}
	}
	walk(err)
	return out
}

// atPath returns the FieldError of err at path, or nil.
func atPath(err error, path string) *FieldError {
	for _, fe := range fieldErrors(err) {
		if fe.Path == path {
			return fe
		}
	}
	return nil
}

// frontMotor is the front motor added to the test design for these tests.
func frontMotor() *FrontMotor {
	return &FrontMotor{
		Motor:         Unit{Displacement: units.CCPerRev(45), MaxSpeed: units.RPM(3600), RatedPressure: units.Bar(420), PeakPressure: units.Bar(480)},
		FinalDrive:    60,
		DeclutchAbove: units.KMH(14),
		Setting:       []SettingPoint{{Speed: units.KMH(9), Setting: 1}, {Speed: units.KMH(14), Setting: 0}},
	}
}

// TestValidateMessages changes one value of the parsed design in Go and
// checks that Validate names the JSON path of that value with ErrValue
// (or the builder's reason) in its message.
func TestValidateMessages(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name   string
		change func(f *File)
		path   string
		words  string
	}{
		{"front lead", func(f *File) { f.Tractor.FrontLead = 0.3 }, "tractor.frontLead", "±0.2"},
		{"front lead NaN", func(f *File) { f.Tractor.FrontLead = math.NaN() }, "tractor.frontLead", "±0.2"},
		{"final drive efficiency above 1", func(f *File) { f.Tractor.FinalDriveEfficiency = 1.5 }, "tractor.finalDriveEfficiency", "must lie in (0, 1]"},
		{"negative PTO efficiency", func(f *File) { f.PTO.Efficiency = -0.1 }, "pto.efficiency", "must lie in (0, 1]"},
		{"front final drive efficiency above 1", func(f *File) {
			f.Tractor.FrontMotor = frontMotor()
			f.Tractor.FrontMotor.FinalDriveEfficiency = 1.5
		}, "tractor.frontMotor.finalDriveEfficiency", "must lie in (0, 1]"},
		{"negative max mass", func(f *File) { f.Tractor.MaxMass = units.Tonnes(-1) }, "tractor.maxMass", "must not be negative"},
		{"front motor control", func(f *File) {
			f.Tractor.FrontMotor = frontMotor()
			f.Tractor.FrontMotor.Control = "sometimes"
		}, "tractor.frontMotor.control", "not one of schedule, least power"},
		{"front motor zero final drive", func(f *File) {
			f.Tractor.FrontMotor = frontMotor()
			f.Tractor.FrontMotor.FinalDrive = 0
		}, "tractor.frontMotor.finalDrive", "missing"},
		{"one curve point", func(f *File) { f.Engine.Curve = f.Engine.Curve[:1] }, "engine.curve", "at least two points"},
		{"unknown kind", func(f *File) { f.Transmission.Kind = "series" }, "transmission.kind", "not one of"},
		{"compound without set2", func(f *File) { f.Transmission.Kind = "compound"; f.Transmission.Set2 = nil }, "transmission.set2", "second set"},
		{"compound locked range", func(f *File) {
			f.Transmission.Kind = "compound"
			f.Transmission.Set2 = &Set{FixedCarrierRatio: -2.5}
			f.Transmission.Ranges[0].Locked = true
		}, "transmission.ranges[0].locked", "no locked range"},
		{"set2 teeth arrangement", func(f *File) {
			f.Transmission = f.Alternatives[1] // the compound split
			f.Transmission.Set2 = &Set{Teeth: &Teeth{Sun: 30, Ring: 78, Planet: 24, Planets: 3, Arrangement: "triple planet"}}
		}, "transmission.set2.teeth.arrangement", `"triple planet" is not one of`},
		{"no ranges", func(f *File) { f.Transmission.Ranges = nil }, "transmission.ranges", "at least one range"},
		{"alternative with no ranges", func(f *File) { f.Alternatives[1].Ranges = nil }, "alternatives[1].ranges", "at least one range"},
		{"bad preset", func(f *File) {
			s := f.Surfaces["asphalt"]
			s.Preset = "ice"
			f.Surfaces["asphalt"] = s
		}, "surfaces.asphalt", `preset "ice"`},
		{"bad texture", func(f *File) {
			im := f.Implements["plough"]
			im.Texture = "lumpy"
			f.Implements["plough"] = im
		}, "implements.plough", `texture "lumpy"`},
		{"no segments", func(f *File) { f.Day.Segments = nil }, "day.segments", "no segments"},
		{"segment kind", func(f *File) { f.Day.Segments[3].Kind = "swim" }, "day.segments[3].kind", "not one of field, turn, road, pto"},
		{"unknown implement", func(f *File) { f.Day.Segments[0].Implement = "harrow" }, "day.segments[0].implement", "no implement of that name"},
		{"field without implement", func(f *File) { f.Day.Segments[1].Implement = "" }, "day.segments[1].implement", "needs an implement"},
		{"unknown trailer", func(f *File) { f.Day.Segments[4].Trailer = "cart" }, "day.segments[4].trailer", "no trailer of that name"},
		{"pull on unknown surface", func(f *File) {
			f.Requirements.Pulls = []PullRequirement{{Speed: units.KMH(7), Pull: units.Kilonewtons(40), Surface: "sand"}}
		}, "requirements.pulls[0].surface", "no surface of that name"},
		{"pull at zero speed", func(f *File) {
			f.Requirements.Pulls = []PullRequirement{{Pull: units.Kilonewtons(40)}}
		}, "requirements.pulls[0].speed", "greater than zero"},
		{"pressure margin of one", func(f *File) { f.Requirements.PressureMargin = 1 }, "requirements.pressureMargin", "[0, 1)"},
		{"negative shift tolerance", func(f *File) { f.Requirements.ShiftTolerance = -0.1 }, "requirements.shiftTolerance", "[0, 1)"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			f := parsed(t)
			if f.Requirements == nil {
				f.Requirements = &Requirements{}
			}
			if err := f.Validate(); err != nil {
				t.Fatalf("the unchanged design does not validate: %v", err)
			}
			c.change(f)
			err := f.Validate()
			if err == nil {
				t.Fatal("Validate = nil error, want one")
			}
			fe := atPath(err, c.path)
			if fe == nil {
				t.Fatalf("no error at %s in %q", c.path, err)
			}
			if !strings.Contains(fe.Error(), c.words) {
				t.Errorf("error %q does not contain %q", fe, c.words)
			}
			if !strings.Contains(fe.Error(), c.path) {
				t.Errorf("error %q does not name its path %s", fe, c.path)
			}
		})
	}
}

// TestValidateValueInDisplayUnit: a File made (or changed) in Go has no
// text as written for its values; a bad value is then shown in its
// display unit, or as a plain number for a ratio.
func TestValidateValueInDisplayUnit(t *testing.T) {
	t.Parallel()
	f := parsed(t)
	f.index = nil // as if made in Go
	f.Tractor.Mass = units.Kilograms(-100)
	f.Tractor.Ballast = 0
	f.Tractor.FinalDrive = math.Inf(1)
	err := f.Validate()
	if !errors.Is(err, ErrValue) {
		t.Fatalf("Validate = %v, want ErrValue", err)
	}
	if fe := atPath(err, "tractor.mass"); fe == nil || fe.Value != units.Kilograms(-100).String() {
		t.Errorf("tractor.mass error = %v, want the value %q", fe, units.Kilograms(-100).String())
	}
	// No display unit for a ratio: fmt.Sprint(+Inf) = "+Inf".
	if fe := atPath(err, "tractor.finalDrive"); fe == nil || fe.Value != "+Inf" {
		t.Errorf("tractor.finalDrive error = %v, want the value +Inf", fe)
	}
}

// TestFrontMotor builds the test design with a front motor.
func TestFrontMotor(t *testing.T) {
	t.Parallel()
	f := parsed(t)
	if _, err := f.FrontLayout(f.Transmission); err == nil || !strings.Contains(err.Error(), "no front motor") {
		t.Errorf("FrontLayout without a front motor = %v, want an error naming it", err)
	}
	f.Tractor.FrontMotor = frontMotor()
	f.Tractor.FrontMotor.Control = "least power"
	if err := f.Validate(); err != nil {
		t.Fatal(err)
	}
	l, err := f.FrontLayout(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	info, ok := l.SecondMotor()
	if !ok {
		t.Fatal("the front layout has no second motor")
	}
	// The declutch travel speed turned into the rear output shaft's speed
	// without slip: ω = finalDrive·v/r = 13.6 · (14/3.6 m/s) / 0.88 m
	// = 13.6 · 3.888889 / 0.88 = 60.10101 rad/s.
	if want := 13.6 * (14 / 3.6) / 0.88; !testutil.Close(float64(info.DeclutchAbove), want, 1e-12, 0) {
		t.Errorf("DeclutchAbove = %v rad/s, want %v", float64(info.DeclutchAbove), want)
	}
	if info.MinSetting != 0 || info.MaxSetting != 1 {
		t.Errorf("setting bounds = [%v, %v], want the default [0, 1]", info.MinSetting, info.MaxSetting)
	}
	// The file's words choose the vehicle's front control; the front final
	// drive is the file's 60.
	for _, c := range []struct {
		word string
		want vehicle.FrontControl
	}{{"least power", vehicle.FrontLeastPower}, {"", vehicle.FrontSchedule}, {"schedule", vehicle.FrontSchedule}} {
		f.Tractor.FrontMotor.Control = c.word
		v, err := f.Vehicle(f.Transmission)
		if err != nil {
			t.Fatalf("Vehicle with the front motor, control %q: %v", c.word, err)
		}
		d, ok := v.Spec().Transmission.(*vehicle.FrontMotorDrive)
		if !ok {
			t.Fatalf("control %q: the vehicle's transmission is %T, want *vehicle.FrontMotorDrive", c.word, v.Spec().Transmission)
		}
		if d.Control() != c.want {
			t.Errorf("control %q: vehicle control %v, want %v", c.word, d.Control(), c.want)
		}
		if fd, _ := d.FrontFinalDrive(); fd != 60 {
			t.Errorf("front final drive = %v, want 60", fd)
		}
	}
	// The compound alternative cannot take a second motor: the vehicle
	// names the transmission and the front motor.
	comp := f.Alternatives[1]
	if comp.Kind != "compound" {
		t.Fatalf("alternative 1 is %q, the test wants the compound one", comp.Kind)
	}
	_, err = f.Vehicle(comp)
	if err == nil || !strings.Contains(err.Error(), "with the front motor") || !strings.Contains(err.Error(), comp.Name) ||
		!strings.Contains(err.Error(), "input- or output-coupled") {
		t.Errorf("Vehicle(compound with front motor) = %v, want an error naming both", err)
	}
	// Validate reports the same at the front motor's path.
	f.Transmission = comp
	if fe := atPath(f.Validate(), "tractor.frontMotor"); fe == nil || !strings.Contains(fe.Error(), "input- or output-coupled") {
		t.Errorf("Validate of a compound split with a front motor: %v, want an error at tractor.frontMotor", fe)
	}
}

// TestNamedParts: looking up a surface or implement that the file lacks
// names it; a set given by an invalid ratio keeps the planetary error's
// kind through Layout.
func TestNamedParts(t *testing.T) {
	t.Parallel()
	f := parsed(t)
	if _, _, err := f.Surface("sand"); err == nil || !strings.Contains(err.Error(), `"sand"`) {
		t.Errorf("Surface(sand) = %v, want an error naming it", err)
	}
	if _, err := f.Implement("harrow"); err == nil || !strings.Contains(err.Error(), `"harrow"`) {
		t.Errorf("Implement(harrow) = %v, want an error naming it", err)
	}
	if _, err := f.Ground("sand"); err == nil {
		t.Error("Ground(sand) = nil error")
	}
	tr := f.Transmission
	tr.Set = Set{FixedCarrierRatio: 0}
	_, err := tr.Layout()
	if !errors.Is(err, planetary.ErrRatio) {
		t.Errorf("Layout with ratio 0 = %v, want planetary.ErrRatio", err)
	}
	if err == nil || !strings.Contains(err.Error(), "set: fixedCarrierRatio: ") {
		t.Errorf("Layout with ratio 0 = %v, want the key set: fixedCarrierRatio", err)
	}
}

// TestStep: the day's time step defaults to 1 s and is kept when given.
func TestStep(t *testing.T) {
	t.Parallel()
	var f File
	if got := f.Step().Std().Seconds(); got != 1 {
		t.Errorf("default step = %v s, want 1 s", got)
	}
	f.Day.Step = Duration(250e6)
	if got := f.Step().Std().Seconds(); got != 0.25 {
		t.Errorf("step = %v s, want 0.25 s", got)
	}
}
