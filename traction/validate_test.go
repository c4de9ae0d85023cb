package traction_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

// TestValidationNamesTheQuantity: every invalid tyre, surface, vehicle or
// argument is refused with a *RangeError that names the quantity and wraps
// the sentinel of its kind.
func TestValidationNamesTheQuantity(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	tyre := func(f func(*traction.Tyre)) func() error {
		return func() error { ty := rearTyre; f(&ty); return ty.Validate() }
	}
	surface := func(s traction.Surface) func() error { return s.Validate }
	veh := func(f func(*traction.Vehicle)) func() error {
		return func() error { v := demoVehicle(); f(&v); return v.Validate() }
	}
	wheel, err := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		quantity string
		sentinel error
		run      func() error
	}{
		{"tyre diameter", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.Diameter = 0 })},
		{"tyre section width", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.Width = units.Length(nan) })},
		{"tyre section height", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.SectionHeight = 1 })},
		{"tyre rolling radius", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.RollingRadius = 1 })},
		{"tyre deflection", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.Deflection = ty.SectionHeight })},
		{"tyre rated load", traction.ErrTyre, tyre(func(ty *traction.Tyre) { ty.RatedLoad = -1 })},
		{"cone index", traction.ErrSurface, surface(traction.Surface{ConeIndex: -1})},
		{"rolling coefficient", traction.ErrSurface, surface(traction.Surface{RollingCoefficient: 1})},
		{"adhesion coefficient", traction.ErrSurface, surface(traction.Surface{Adhesion: 2.5})},
		{"vehicle mass", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Mass = 0 })},
		{"wheelbase", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Wheelbase = units.Length(nan) })},
		{"centre of mass ahead of rear axle", traction.ErrInput, veh(func(v *traction.Vehicle) { v.CentreOfMass = 3 })},
		{"hitch height", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Hitch.Height = -1 })},
		{"hitch distance behind rear axle", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Hitch.Behind = -1 })},
		{"front axle wheel count", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Front.Wheels = 0 })},
		{"rear axle track", traction.ErrInput, veh(func(v *traction.Vehicle) { v.Rear.Track = -1 })},
		{"tyre diameter", traction.ErrTyre, veh(func(v *traction.Vehicle) { v.Rear.Tyre.Diameter = 0 })},
		{"drive type", traction.ErrInput, func() error { _, err := traction.RecommendedFrontShare(9, traction.Towed); return err }},
		{"hitch type", traction.ErrInput, func() error {
			_, err := traction.RecommendedFrontShare(traction.FourWheelDrive, 9)
			return err
		}},
		{"surface class", traction.ErrInput, func() error { _, err := traction.Recommended(traction.ClassHard); return err }},
		{"wheel load", traction.ErrLoad, func() error { _, err := wheel.MaxPull(0); return err }},
		{"wheel load", traction.ErrLoad, func() error { _, err := wheel.FreeRolling(units.Force(nan)); return err }},
		{"slip", traction.ErrSlip, func() error { _, err := wheel.At(units.Kilonewtons(25), 1); return err }},
		{"wheel", traction.ErrInput, func() error { _, err := (traction.Wheel{}).At(units.Kilonewtons(25), 0.1); return err }},
		{"wheel", traction.ErrInput, func() error { _, err := (traction.Wheel{}).MaxPull(units.Kilonewtons(25)); return err }},
	}
	for _, c := range cases {
		err := c.run()
		var re *traction.RangeError
		if !errors.Is(err, c.sentinel) || !errors.As(err, &re) || re.Quantity != c.quantity {
			t.Errorf("%s: error %v, want a *RangeError for it wrapping %v", c.quantity, err, c.sentinel)
			continue
		}
		if !strings.Contains(err.Error(), c.quantity) {
			t.Errorf("%s: message %q does not name it", c.quantity, err)
		}
	}
	// A pull the wheel cannot give names the pull and the limit.
	_, err = wheel.SlipForPull(units.Kilonewtons(25), units.Kilonewtons(500))
	var pe *traction.PullError
	if !errors.As(err, &pe) || !errors.Is(err, traction.ErrPull) || pe.Limit >= units.Kilonewtons(500) || !strings.Contains(err.Error(), "limit") {
		t.Errorf("SlipForPull(500 kN) error = %v", err)
	}
}

func TestWheelAndSurfaceAccessors(t *testing.T) {
	t.Parallel()
	w, err := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	if err != nil {
		t.Fatal(err)
	}
	if w.Tyre() != rearTyre || w.Surface() != traction.FirmSoil() || w.Model() != (traction.Brixius{}) {
		t.Errorf("accessors: %+v %+v %+v", w.Tyre(), w.Surface(), w.Model())
	}
	soft, err := w.On(traction.SoftSoil())
	if err != nil || soft.Surface() != traction.SoftSoil() || soft.Tyre() != rearTyre {
		t.Fatalf("On(soft) = %+v, %v", soft, err)
	}
	// The same tyre and load pull less on softer soil (Brixius: the mobility
	// number falls with the cone index).
	a, _ := w.At(units.Kilonewtons(25), 0.1)
	b, _ := soft.At(units.Kilonewtons(25), 0.1)
	if !(b.Net < a.Net) {
		t.Errorf("net pull at 10 %% slip: firm %v, soft %v", a.Net, b.Net)
	}
	// Presets: the D497 soil cone indices (recalled, see the package doc)
	// and road coefficients as documented.
	for _, c := range []struct {
		s       traction.Surface
		class   traction.Class
		name    string
		ci      float64 // kPa
		f, adhe float64
	}{
		{traction.HardSoil(), traction.ClassHard, "hard soil", 1800, 0, 0},
		{traction.FirmSoil(), traction.ClassFirm, "firm soil", 1200, 0, 0},
		{traction.TilledSoil(), traction.ClassTilled, "tilled soil", 900, 0, 0},
		{traction.SoftSoil(), traction.ClassSoft, "soft soil", 450, 0, 0},
		{traction.Concrete(), traction.ClassRoad, "road", 0, 0.02, 0.8},
		{traction.Asphalt(), traction.ClassRoad, "road", 0, 0.025, 0.75},
		{traction.Gravel(), traction.ClassRoad, "road", 0, 0.04, 0.6},
	} {
		if c.s.Class != c.class || c.s.Class.String() != c.name || c.s.ConeIndex != units.Kilopascals(c.ci) ||
			c.s.RollingCoefficient != c.f || c.s.Adhesion != c.adhe || c.s.Validate() != nil {
			t.Errorf("preset %q: %+v (class %q)", c.s.Name, c.s, c.s.Class.String())
		}
	}
	if got := traction.ClassCustom.String(); got != "custom surface" {
		t.Errorf("ClassCustom = %q", got)
	}
	if r, err := traction.Recommended(traction.ClassRoad); err != nil || r.SlipLow != 0.04 || r.SlipHigh != 0.08 {
		t.Errorf("Recommended(road) = %+v, %v", r, err)
	}
	// Published front shares (see the package documentation).
	if s, err := traction.RecommendedFrontShare(traction.RearWheelDrive, traction.Mounted); err != nil || s != 0.35 {
		t.Errorf("RecommendedFrontShare(2WD, mounted) = %v, %v", s, err)
	}
}
