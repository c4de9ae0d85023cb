package traction

import "github.com/powersplit-dev/powersplit/units"

// Class is the kind of surface the published tables distinguish.
type Class int

// The surface classes of the ASABE D497 tables, and roads.
const (
	ClassCustom Class = iota // a user-defined surface
	ClassHard                // hard soil
	ClassFirm                // firm soil
	ClassTilled              // tilled soil
	ClassSoft                // soft or sandy soil
	ClassRoad                // a hard road surface (concrete, asphalt, ...)
)

// String returns the plain-English name of the class.
func (c Class) String() string {
	switch c {
	case ClassHard:
		return "hard soil"
	case ClassFirm:
		return "firm soil"
	case ClassTilled:
		return "tilled soil"
	case ClassSoft:
		return "soft soil"
	case ClassRoad:
		return "road"
	}
	return "custom surface"
}

// Surface is the ground a tyre runs on. Soil is described by its cone
// index (ASABE S313 penetrometer); roads by a rolling-resistance
// coefficient and a peak adhesion coefficient. A surface may carry both, so
// that one value serves several models.
type Surface struct {
	// Name labels the surface in reports. Optional.
	Name string
	// Class says which row of the published tables applies. Default
	// ClassCustom.
	Class Class
	// ConeIndex is the soil cone index CI. The soil models (Brixius,
	// WismerLuth, GeeClough) need CI > 0; zero means "not a soil".
	ConeIndex units.Pressure
	// RollingCoefficient is the rolling-resistance coefficient f (rolling
	// force over wheel load) of the Road model. Zero means "not given";
	// when given it must be in (0, 1).
	RollingCoefficient float64
	// Adhesion is the peak traction coefficient μ (largest gross pull over
	// wheel load) of the Road model. Zero means the default 0.8 of dry
	// concrete or asphalt; when given it must be in (0, 2].
	Adhesion float64
}

// DefaultAdhesion is the Road model's peak traction coefficient when a
// surface gives none.
//
// Common practice (no published source): dry concrete or asphalt under a
// pneumatic tyre gives a peak traction coefficient near 0.8.
const DefaultAdhesion = 0.8

// Validate reports whether the values present are usable. It does not
// require any one of them; the models check for what they need.
func (s Surface) Validate() error {
	ci := float64(s.ConeIndex)
	switch {
	case !finite(ci) || ci < 0:
		return rangeErr(ErrSurface, "cone index", s.ConeIndex, ">= 0 and finite")
	case !finite(s.RollingCoefficient) || s.RollingCoefficient < 0 || s.RollingCoefficient >= 1:
		return rangeErr(ErrSurface, "rolling coefficient", s.RollingCoefficient, "in [0, 1)")
	case !finite(s.Adhesion) || s.Adhesion < 0 || s.Adhesion > 2:
		return rangeErr(ErrSurface, "adhesion coefficient", s.Adhesion, "in [0, 2]")
	case s.Class < ClassCustom || s.Class > ClassRoad:
		return rangeErr(ErrSurface, "surface class", float64(s.Class), "a defined Class")
	}
	return nil
}

func (s Surface) adhesion() float64 {
	if s.Adhesion == 0 {
		return DefaultAdhesion
	}
	return s.Adhesion
}

// The soil presets carry the cone index of the ASABE D497 soil table.
//
// From memory: ASABE D497.7 (2011), table of soil conditions for the
// traction equations, cone index hard 1800 kPa, firm 1200 kPa, tilled
// 900 kPa, soft 450 kPa. These were recalled, not read; check them against
// your copy of the standard before relying on them.
var soilConeIndex = [...]units.Pressure{
	ClassHard:   units.Kilopascals(1800),
	ClassFirm:   units.Kilopascals(1200),
	ClassTilled: units.Kilopascals(900),
	ClassSoft:   units.Kilopascals(450),
}

// HardSoil returns the hard-soil preset of the ASABE D497 soil table.
func HardSoil() Surface {
	return Surface{Name: "hard soil", Class: ClassHard, ConeIndex: soilConeIndex[ClassHard]}
}

// FirmSoil returns the firm-soil preset of the ASABE D497 soil table.
func FirmSoil() Surface {
	return Surface{Name: "firm soil", Class: ClassFirm, ConeIndex: soilConeIndex[ClassFirm]}
}

// TilledSoil returns the tilled-soil preset of the ASABE D497 soil table.
func TilledSoil() Surface {
	return Surface{Name: "tilled soil", Class: ClassTilled, ConeIndex: soilConeIndex[ClassTilled]}
}

// SoftSoil returns the soft-soil preset of the ASABE D497 soil table.
func SoftSoil() Surface {
	return Surface{Name: "soft soil", Class: ClassSoft, ConeIndex: soilConeIndex[ClassSoft]}
}

// Concrete returns a dry concrete road for the Road model.
//
// Common practice (no published source): rolling coefficient 0.02 for
// large agricultural tyres on concrete, peak adhesion 0.8.
func Concrete() Surface {
	return Surface{Name: "concrete", Class: ClassRoad, RollingCoefficient: 0.02, Adhesion: 0.8}
}

// Asphalt returns a dry asphalt road for the Road model.
//
// Common practice (no published source): rolling coefficient 0.025 for
// large agricultural tyres on asphalt, peak adhesion 0.75.
func Asphalt() Surface {
	return Surface{Name: "asphalt", Class: ClassRoad, RollingCoefficient: 0.025, Adhesion: 0.75}
}

// Gravel returns a compacted gravel road for the Road model.
//
// Common practice (no published source): rolling coefficient 0.04,
// peak adhesion 0.6.
func Gravel() Surface {
	return Surface{Name: "gravel road", Class: ClassRoad, RollingCoefficient: 0.04, Adhesion: 0.6}
}

// Recommendation is the published guidance for one surface condition: the
// slip range of best tractive performance and the typical ratio of drawbar
// power to PTO power by drive type.
//
// The power ratios are whole-tractor figures, as ASABE D497 defines them:
// drawbar power over the power the engine delivers at the PTO. They include
// the losses of the transmission and final drives as well as those of the
// tyres (and, for two-wheel drive, the rolling resistance of the free front
// wheels). They are not tyre tractive efficiencies: to estimate engine
// (PTO-equivalent) power from drawbar power, divide by the ratio and do not
// apply a transmission efficiency again.
type Recommendation struct {
	SlipLow, SlipHigh     float64 // recommended slip range
	DrawbarPTORearDrive   float64 // drawbar/PTO power, two-wheel drive
	DrawbarPTOFrontAssist float64 // drawbar/PTO power, mechanical front-wheel assist
	DrawbarPTOFourWheel   float64 // drawbar/PTO power, four-wheel drive
	DrawbarPTOTracked     float64 // drawbar/PTO power, tracked
}

// recommended is the ASABE D497 guidance.
//
// From memory: ASABE D497.7 (2011), table of power ratios (drawbar power
// over PTO power) by surface and drive (concrete, firm, tilled, soft soil):
// two-wheel drive 0.87/0.72/0.67/0.55, front-wheel assist
// 0.87/0.77/0.73/0.65, four-wheel drive 0.88/0.78/0.75/0.70, tracked
// 0.88/0.82/0.80/0.75; recommended slip 4–8 % on concrete, 8–10 % firm,
// 11–13 % tilled, 14–16 % soft. Recalled, not read: check against your
// copy. The table has no separate hard-soil row; the road (concrete) row is
// the nearest.
var recommended = map[Class]Recommendation{
	ClassRoad:   {0.04, 0.08, 0.87, 0.87, 0.88, 0.88},
	ClassFirm:   {0.08, 0.10, 0.72, 0.77, 0.78, 0.82},
	ClassTilled: {0.11, 0.13, 0.67, 0.73, 0.75, 0.80},
	ClassSoft:   {0.14, 0.16, 0.55, 0.65, 0.70, 0.75},
}

// Recommended returns the ASABE D497 recommended slip range and typical
// ratios of drawbar power to PTO power for a surface class. ClassRoad gives the concrete
// row; ClassHard and ClassCustom are not tabulated and return ErrInput.
func Recommended(c Class) (Recommendation, error) {
	r, ok := recommended[c]
	if !ok {
		return Recommendation{}, rangeErr(ErrInput, "surface class", float64(c), "firm, tilled, soft or road")
	}
	return r, nil
}
