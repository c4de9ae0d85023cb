package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Texture is the soil texture class of the ASABE D497 draft equation; it
// selects the soil factor F_i of an implement.
type Texture int

// Soil textures of ASABE D497.
const (
	Fine   Texture = iota // fine-textured soil (clays): factor F1
	Medium                // medium-textured soil (loams): factor F2
	Coarse                // coarse-textured soil (sands): factor F3
)

// String returns the texture's name.
func (t Texture) String() string {
	switch t {
	case Fine:
		return "fine"
	case Medium:
		return "medium"
	case Coarse:
		return "coarse"
	}
	return "unknown texture"
}

// WidthUnit says what the width W of a draft row counts.
type WidthUnit int

// Width units of the draft table.
const (
	Metres WidthUnit = iota // implement width in metres
	Rows                    // number of rows
	Tools                   // number of tools (shanks, tines)
)

// A DraftRow is one row of the ASABE D497 implement draft table: the draft
//
//	D = F_i·[A + B·S + C·S²]·W·T
//
// in newtons, with S the travel speed in km/h, W the width in Unit, T the
// tillage depth in cm (T = 1 for minor tillage and seeding, flagged by
// Minor) and F_i the soil texture factor.
type DraftRow struct {
	Name    string
	Unit    WidthUnit
	A, B, C float64    // N per width unit (and per cm of depth unless Minor)
	F       [3]float64 // soil factors F1 (fine), F2 (medium), F3 (coarse)
	Minor   bool       // minor tillage or seeding: draft independent of depth
	Range   float64    // expected ± range of the prediction, as a fraction
}

// The implement draft rows. Units: draft N, speed km/h, width m or count,
// depth cm.
//
// From memory: ASABE D497.7 (March 2011), "Agricultural Machinery
// Management Data", Table 1 "Draft parameters ... for tillage and seeding
// implements" (SI columns). The values were recalled, not read from the
// standard; check them against the standard before relying on them.
var (
	MoldboardPlough = DraftRow{Name: "moldboard plough", Unit: Metres,
		A: 652, B: 0, C: 5.1, F: [3]float64{1.0, 0.70, 0.45}, Range: 0.40}
	ChiselPlough = DraftRow{Name: "chisel plough, 5 cm straight point", Unit: Tools,
		A: 91, B: 5.4, C: 0, F: [3]float64{1.0, 0.85, 0.65}, Range: 0.50}
	SweepPlough = DraftRow{Name: "sweep plough, primary tillage", Unit: Metres,
		A: 390, B: 19.0, C: 0, F: [3]float64{1.0, 0.85, 0.65}, Range: 0.45}
	TandemDiskPrimary = DraftRow{Name: "tandem disk harrow, primary tillage", Unit: Metres,
		A: 309, B: 16.0, C: 0, F: [3]float64{1.0, 0.88, 0.78}, Range: 0.50}
	TandemDiskSecondary = DraftRow{Name: "tandem disk harrow, secondary tillage", Unit: Metres,
		A: 216, B: 11.2, C: 0, F: [3]float64{1.0, 0.88, 0.78}, Range: 0.50}
	FieldCultivatorPrimary = DraftRow{Name: "field cultivator, primary tillage", Unit: Tools,
		A: 46.0, B: 2.8, C: 0, F: [3]float64{1.0, 0.85, 0.65}, Range: 0.30}
	FieldCultivatorSecondary = DraftRow{Name: "field cultivator, secondary tillage", Unit: Tools,
		A: 32.0, B: 1.9, C: 0, F: [3]float64{1.0, 0.85, 0.65}, Range: 0.35}
	PlanterMounted = DraftRow{Name: "row-crop planter, prepared seedbed, mounted, seeding only", Unit: Rows,
		A: 500, F: [3]float64{1, 1, 1}, Minor: true, Range: 0.25}
	PlanterDrawn = DraftRow{Name: "row-crop planter, prepared seedbed, drawn, seeding only", Unit: Rows,
		A: 900, F: [3]float64{1, 1, 1}, Minor: true, Range: 0.25}
	PlanterDrawnFertiliser = DraftRow{Name: "row-crop planter, prepared seedbed, drawn, seed, fertiliser, herbicide", Unit: Rows,
		A: 1550, F: [3]float64{1, 1, 1}, Minor: true, Range: 0.25}
)

// DraftRows returns the built-in draft table rows.
func DraftRows() []DraftRow {
	return []DraftRow{MoldboardPlough, ChiselPlough, SweepPlough, TandemDiskPrimary,
		TandemDiskSecondary, FieldCultivatorPrimary, FieldCultivatorSecondary,
		PlanterMounted, PlanterDrawn, PlanterDrawnFertiliser}
}

// Validate reports whether the row's parameters are valid.
func (r DraftRow) Validate() error {
	if !finite(r.A, r.B, r.C, r.F[0], r.F[1], r.F[2], r.Range) {
		return invalid("DraftRow", math.NaN(), "has a non-finite parameter")
	}
	if r.A < 0 || r.B < 0 || r.C < 0 || r.A+r.B+r.C == 0 {
		return invalid("DraftRow.A", r.A, "A, B and C must be non-negative and not all zero")
	}
	for i, f := range r.F {
		if f <= 0 || f > 2 {
			return invalid("DraftRow.F", float64(i+1), "soil factors must be in (0, 2]")
		}
	}
	return nil
}

// Draft returns the ASABE D497 draft D = F_i·[A + B·S + C·S²]·W·T of the row
// at travel speed v on soil of the given texture, for width w (in the row's
// Unit) and tillage depth (ignored for minor tillage and seeding).
func (r DraftRow) Draft(t Texture, v units.Speed, width float64, depth units.Length) (units.Force, error) {
	if err := r.Validate(); err != nil {
		return 0, err
	}
	if t < Fine || t > Coarse {
		return 0, invalid("Texture", float64(t), "must be Fine, Medium or Coarse")
	}
	if err := nonNegative("speed", v); err != nil {
		return 0, err
	}
	if err := positive("width", width); err != nil {
		return 0, err
	}
	T := 1.0
	if !r.Minor {
		if err := positive("depth", depth); err != nil {
			return 0, err
		}
		T = depth.Centimetres()
	}
	S := v.KMH()
	return units.Force(r.F[t] * (r.A + r.B*S + r.C*S*S) * width * T), nil
}

// A PTORow is one row of the ASABE D497 PTO power table: the power
//
//	P = a + b·W + c·F
//
// in kW, with W the working width in m and F the material feed rate in t/h.
type PTORow struct {
	Name  string
	A     units.Power // a: power independent of width and feed
	B     units.Power // b: power per metre of width
	C     float64     // c: energy per tonne of material, in kWh/t
	Range float64     // expected ± range of the prediction, as a fraction
}

// PTO power rows.
//
// From memory: ASABE D497.7 (2011), Table 1, PTO power columns; recalled
// rather than read, so check them against the standard before relying on
// them.
var (
	SquareBaler = PTORow{Name: "small rectangular baler", A: units.Kilowatts(2.0), C: 1.0, Range: 0.35}
	DiskMower   = PTORow{Name: "disk mower", B: units.Kilowatts(5.0), Range: 0.30}
	CutterBar   = PTORow{Name: "cutterbar mower", B: units.Kilowatts(1.2), Range: 0.25}
)

// Power returns the PTO power a + b·W + c·F for working width w and material
// feed rate feed.
func (r PTORow) Power(width units.Length, feed units.MassFlow) (units.Power, error) {
	if !finite(float64(r.A), float64(r.B), r.C) || r.A < 0 || r.B < 0 || r.C < 0 {
		return 0, invalid("PTORow", math.NaN(), "parameters must be finite and not negative")
	}
	if err := nonNegative("width", width); err != nil {
		return 0, err
	}
	if err := nonNegative("feed", feed); err != nil {
		return 0, err
	}
	kwhPerTonne := r.C * 3.6e6 / 1000 // J per kg
	return r.A + units.Power(float64(r.B)*width.Metres()) + units.Power(kwhPerTonne*float64(feed)), nil
}

// An Implement is a drawn or mounted implement: a draft row with its width,
// depth and soil, and an optional PTO load.
type Implement struct {
	Row     DraftRow
	Width   float64      // in Row.Unit (m, rows or tools)
	Depth   units.Length // tillage depth; ignored for minor tillage and seeding
	Texture Texture
	// PTOPower is the power the implement takes from the PTO shaft; zero for
	// implements without PTO drive.
	PTOPower units.Power
	// PTOSpeed is the standard PTO speed the implement needs (PTO540 or
	// PTO1000); zero when PTOPower is zero.
	PTOSpeed units.AngularVelocity
}

// Draft returns the implement's draft at travel speed v.
func (im Implement) Draft(v units.Speed) (units.Force, error) {
	return im.Row.Draft(im.Texture, v, im.Width, im.Depth)
}
