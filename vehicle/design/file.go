package design

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// Format is the version of the file format this package reads and writes.
// A file without a "format" key is read as this version.
const Format = 1

// File is a design file: the machine (tractor, engine, PTO), its
// transmission and alternatives to compare it with, the surfaces,
// implements and trailers it works with, and its working day.
//
// Every physical value is a units quantity, written in the file as text in
// any unit the units package reads ("8.5 t", "450 bar", "110 cm³/rev");
// ratios, efficiencies and coefficients are plain numbers. A field marked
// optional may be left out; the others are required and checked by
// Validate.
type File struct {
	// Format is the file format version (optional; Format when left out).
	// A file of a newer version is refused.
	Format int `json:"format,omitempty"`
	// Name names the design in reports.
	Name string `json:"name,omitempty"`
	// Owner is who the design is for (optional, reports only).
	Owner string `json:"owner,omitempty"`
	// Note is free text (optional).
	Note string `json:"note,omitempty"`
	// Tractor is the machine's mass, geometry, axles and final drive.
	Tractor Tractor `json:"tractor"`
	// Engine is the engine's full-load curve and fuel map.
	Engine Engine `json:"engine"`
	// PTO is the power take-off (optional: no PTO when left out).
	PTO PTO `json:"pto,omitzero"`
	// Transmission is the design studied.
	Transmission Transmission `json:"transmission"`
	// Alternatives are other transmissions to compare with (optional).
	Alternatives []Transmission `json:"alternatives,omitempty"`
	// Surfaces are the ground surfaces, by the name segments use.
	Surfaces map[string]Surface `json:"surfaces,omitempty"`
	// Implements are drawn implements, by the name segments use.
	Implements map[string]Implement `json:"implements,omitempty"`
	// Trailers are towed trailers, by the name segments use.
	Trailers map[string]Trailer `json:"trailers,omitempty"`
	// Day is the working day.
	Day Day `json:"day"`
	// Requirements are what the design must do (optional); File.Check
	// reports on them.
	Requirements *Requirements `json:"requirements,omitempty"`

	source string
	index  index
}

// Source returns the name of the file f was read from ("" for a File made
// in Go).
func (f *File) Source() string { return f.source }

// Tractor is the machine's mass, geometry, axles and final drive.
type Tractor struct {
	// Mass is the operating mass with ballast, without trailer (kg).
	Mass units.Mass `json:"mass"`
	// Ballast is the ballast fitted, part of Mass (optional, kg): ballast
	// advice never removes more than this.
	Ballast units.Mass `json:"ballast,omitempty"`
	// MaxMass is the permissible operating mass (optional, kg): ballast
	// advice that goes beyond it is reported as not permissible. Take it
	// from the vehicle maker's rating, never from this library.
	MaxMass units.Mass `json:"maxMass,omitempty"`
	// RotatingMass is the translating mass equivalent to the inertia of the
	// wheels and drive line, added to Mass when accelerating (optional, kg).
	RotatingMass units.Mass `json:"rotatingMass,omitempty"`
	// DragArea is the aerodynamic drag coefficient times frontal area
	// (optional, m²).
	DragArea units.Area `json:"dragArea,omitempty"`
	// Wheelbase is the distance between the axles (m).
	Wheelbase units.Length `json:"wheelbase"`
	// CentreOfMass is the horizontal distance of the centre of mass ahead
	// of the rear axle (m).
	CentreOfMass units.Length `json:"centreOfMass"`
	// CentreOfMassHeight is the height of the centre of mass above the
	// ground (optional, m).
	CentreOfMassHeight units.Length `json:"centreOfMassHeight,omitempty"`
	// HitchHeight is the height of the drawbar hitch above the ground
	// (optional, m).
	HitchHeight units.Length `json:"hitchHeight,omitempty"`
	// HitchBehind is the horizontal distance of the hitch behind the rear
	// axle (optional, m).
	HitchBehind units.Length `json:"hitchBehind,omitempty"`
	// Front and Rear are the axles.
	Front Axle `json:"front"`
	Rear  Axle `json:"rear"`
	// FrontLead is the mechanical front drive's lead: front theoretical
	// speed over rear, minus one (0.02 for 2 %; within ±0.2).
	FrontLead float64 `json:"frontLead,omitempty"`
	// FinalDrive is the ratio of transmission output speed to wheel speed
	// (> 0).
	FinalDrive float64 `json:"finalDrive"`
	// FinalDriveEfficiency is the final drive's efficiency, 0 to 1
	// (optional; the vehicle package's default when left out).
	FinalDriveEfficiency float64 `json:"finalDriveEfficiency,omitempty"`
	// FrontMotor, when given, drives the front axle by a second motor on
	// the transmission's loop instead of the mechanical front drive at
	// FrontLead (optional; input- and output-coupled splits only).
	FrontMotor *FrontMotor `json:"frontMotor,omitempty"`
}

// FrontMotor is a second hydrostatic motor on the transmission's loop that
// drives the front axle at its own speed: full torque at low travel speed,
// swung back along Setting, declutched (and held still) above
// DeclutchAbove. The travel speeds are turned into speeds of the rear
// output shaft without slip (the transmission knows no travel speed), so
// with rear slip s the motor swings back and declutches at a travel speed
// (1 − s) times the one written.
type FrontMotor struct {
	// Motor is the front motor (its displacement in cm³/rev; the
	// transmission's loss coefficients apply).
	Motor Unit `json:"motor"`
	// Ratio is the speed ratio of the front output shaft to the motor
	// (optional; 1 when left out).
	Ratio float64 `json:"ratio,omitempty"`
	// FinalDrive is the ratio of the front output shaft's speed to the
	// front wheels' speed (> 0).
	FinalDrive float64 `json:"finalDrive"`
	// FinalDriveEfficiency is the front final drive's efficiency, 0 to 1
	// (optional; the vehicle package's default when left out).
	FinalDriveEfficiency float64 `json:"finalDriveEfficiency,omitempty"`
	// DeclutchAbove is the travel speed above which the front motor is
	// declutched (km/h).
	DeclutchAbove units.Speed `json:"declutchAbove"`
	// Setting is the front motor's setting over travel speed (optional:
	// full up to the declutch speed when left out).
	Setting []SettingPoint `json:"setting,omitempty"`
	// Control is "schedule" (the Setting curve; the default) or "least
	// power" (the setting of least engine power, point by point; slower).
	Control string `json:"control,omitempty"`
}

// SettingPoint is one point of the front motor's setting curve.
type SettingPoint struct {
	// Speed is the travel speed (km/h).
	Speed units.Speed `json:"speed"`
	// Setting is the motor's relative displacement there, 0 to 1.
	Setting float64 `json:"setting"`
}

// Axle is one axle's tyres.
type Axle struct {
	// Tyre is the tyre fitted to every wheel of the axle.
	Tyre Tyre `json:"tyre"`
	// Wheels is the number of wheels on the axle (2 or 4).
	Wheels int `json:"wheels"`
	// Track is the distance between the wheel centre planes (optional, m).
	Track units.Length `json:"track,omitempty"`
}

// Tyre is one tyre's geometry and load rating.
type Tyre struct {
	// Diameter is the unloaded overall diameter (m).
	Diameter units.Length `json:"diameter"`
	// Width is the unloaded section width (m).
	Width units.Length `json:"width"`
	// SectionHeight is the unloaded section height (m).
	SectionHeight units.Length `json:"sectionHeight"`
	// RollingRadius is the rolling radius on a hard surface: travel per
	// wheel revolution over 2π (m).
	RollingRadius units.Length `json:"rollingRadius"`
	// Deflection is the tyre's deflection under its static load
	// (optional, m).
	Deflection units.Length `json:"deflection,omitempty"`
	// RatedLoad is the manufacturer's load rating at the inflation used
	// (optional, N: without it tyre load is not checked).
	RatedLoad units.Force `json:"ratedLoad,omitempty"`
}

// Engine is the full-load curve and the fuel map (optional: without it the
// ASABE D497 fuel equation is used).
type Engine struct {
	// Idle is the lowest running speed (rpm).
	Idle units.AngularVelocity `json:"idle"`
	// Rated is the rated speed (rpm).
	Rated units.AngularVelocity `json:"rated"`
	// Curve is the full-load torque curve, at least two points in rising
	// speed.
	Curve []CurvePoint `json:"curve"`
	// FuelMap is the brake specific fuel consumption map (optional).
	FuelMap *FuelMap `json:"fuelMap,omitempty"`
}

// CurvePoint is one point of the full-load torque curve.
type CurvePoint struct {
	// Speed is the engine speed (rpm).
	Speed units.AngularVelocity `json:"speed"`
	// Torque is the greatest torque at Speed (N·m).
	Torque units.Torque `json:"torque"`
}

// FuelMap is brake specific fuel consumption over speed × torque:
// SFC[i][j] at Speeds[i], Torques[j].
type FuelMap struct {
	// Speeds are the engine speeds of the grid, rising (rpm).
	Speeds []units.AngularVelocity `json:"speeds"`
	// Torques are the engine torques of the grid, rising (N·m).
	Torques []units.Torque `json:"torques"`
	// SFC is the specific fuel consumption at each grid point (g/kWh).
	SFC [][]units.SpecificFuelConsumption `json:"sfc"`
}

// PTO is the power take-off: its standard shaft speeds, all reached at one
// engine speed.
type PTO struct {
	// Speeds are the PTO shaft speeds offered (rpm, for example 540 and
	// 1000 rpm).
	Speeds []units.AngularVelocity `json:"speeds,omitempty"`
	// AtEngine is the engine speed at which the PTO shaft turns at each of
	// Speeds (rpm).
	AtEngine units.AngularVelocity `json:"atEngine,omitempty"`
	// Efficiency is the PTO drive's efficiency, 0 to 1.
	Efficiency float64 `json:"efficiency,omitempty"`
	// MaxPower is the PTO drive's rated power (optional, kW).
	MaxPower units.Power `json:"maxPower,omitempty"`
	// Idle is the PTO driveline's drag while no PTO power is asked
	// (optional; none when left out).
	Idle *PTOIdle `json:"idle,omitempty"`
}

// PTOIdle is the idle drag of the PTO driveline: the open plates of its
// clutch, slipping at engine speed, and its bearings, in the
// transmission's oil at its no-load temperature (see powersplit.Plates
// and powersplit.Bearings).
type PTOIdle struct {
	// Films is the number of oil films (friction faces) of the PTO
	// clutch's plates (> 0).
	Films int `json:"films"`
	// Inner and Outer are the radii of the friction faces (mm).
	Inner units.Length `json:"inner"`
	Outer units.Length `json:"outer"`
	// Clearance is the oil film thickness of one open film (mm).
	Clearance units.Length `json:"clearance"`
	// MeanDiameter is the mean diameter of the PTO shaft's bearings
	// (optional, mm; no bearing drag when left out).
	MeanDiameter units.Length `json:"bearingMeanDiameter,omitempty"`
	// F0 is Palmgren's lubrication factor of those bearings (with
	// MeanDiameter).
	F0 float64 `json:"f0,omitempty"`
	// Bearings is the number of those bearings (optional; 1).
	Bearings int `json:"bearings,omitempty"`
}

// Transmission is a power-split design: its kind ("input-coupled",
// "output-coupled" or "compound"), planetary sets, gear ratios, hydrostatic
// units, loop and range gears.
type Transmission struct {
	// Name names the design in reports.
	Name string `json:"name,omitempty"`
	// Kind is "input-coupled", "output-coupled" or "compound".
	Kind string `json:"kind"`
	// Set is the (first) planetary set.
	Set Set `json:"set"`
	// Set2 is the second planetary set of a compound split.
	Set2 *Set `json:"set2,omitempty"`
	// InputRatio is the speed ratio of the set's input shaft to the engine
	// (optional; 1 when left out).
	InputRatio float64 `json:"inputRatio,omitempty"`
	// PumpRatio is the speed ratio of pump to the shaft that drives it
	// (optional; 1 when left out).
	PumpRatio float64 `json:"pumpRatio,omitempty"`
	// MotorRatio is the speed ratio of the motor's shaft to the motor
	// (optional; 1 when left out).
	MotorRatio float64 `json:"motorRatio,omitempty"`
	// Pump and Motor are the hydrostatic units.
	Pump  Unit `json:"pump"`
	Motor Unit `json:"motor"`
	// Losses are the units' loss coefficients.
	Losses Losses `json:"losses,omitzero"`
	// Oil is the hydraulic oil's ISO 3448 viscosity grade: "VG32", "VG46"
	// or "VG68" (hydrostat's presets, viscosity index near 100), or any
	// grade from "VG2" to "VG3200" with OilViscosityIndex. Required unless
	// OilViscosity is given.
	Oil string `json:"oil,omitempty"`
	// OilViscosityIndex is the oil's viscosity index by ASTM D2270
	// (optional, a plain number, −100 to 400): the oil is then built from
	// its grade's 40 °C viscosity and this index (hydrostat.NewGradeOil)
	// instead of the preset.
	OilViscosityIndex *float64 `json:"oilViscosityIndex,omitempty"`
	// OilViscosity is the oil's dynamic viscosity at the operating point
	// (optional, mPa·s, written for example "20 mPa·s" or "20 cP"), taken
	// the same at every temperature (hydrostat.OilSpec.Viscosity); given,
	// it replaces Oil and OilViscosityIndex, which must then be left out,
	// and OilTemperature sets only the oil's density.
	OilViscosity units.DynamicViscosity `json:"oilViscosity,omitempty"`
	// OilTemperature is the oil temperature in the loop (optional; 50 °C
	// when left out).
	OilTemperature *units.Temperature `json:"oilTemperature,omitempty"`
	// Charge is the charge (boost) pressure of the low-pressure side (bar).
	Charge units.Pressure `json:"charge,omitempty"`
	// Relief is the high-pressure relief valve setting (bar).
	Relief units.Pressure `json:"relief"`
	// MinMotorSetting is the smallest relative motor displacement the
	// schedule uses, 0 to 1 (optional).
	MinMotorSetting float64 `json:"minMotorSetting,omitempty"`
	// Ranges are the range gears, lowest first.
	Ranges []Range `json:"ranges"`
	// GearEfficiency is the mesh efficiency of each fixed gear pair, 0 to 1
	// (optional; the root package's default when left out).
	GearEfficiency float64 `json:"gearEfficiency,omitempty"`
	// NoLoad lists the load-independent losses (optional; none when left
	// out).
	NoLoad *NoLoad `json:"noLoad,omitempty"`
}

// Set is a planetary set given by its fixed-carrier ratio.
type Set struct {
	// FixedCarrierRatio is the sun-to-ring speed ratio with the carrier
	// held (negative for a simple set, for example −2.5). With Teeth it
	// may be left out; given, it must equal the teeth's.
	FixedCarrierRatio float64 `json:"fixedCarrierRatio,omitempty"`
	// BasicEfficiency is the set's efficiency with the carrier held, 0 to
	// 1 (optional; the planetary package's default when left out).
	BasicEfficiency float64 `json:"basicEfficiency,omitempty"`
	// Teeth gives the set by tooth counts and profile shifts (optional;
	// see Teeth): the set is then checked as a gear design.
	Teeth *Teeth `json:"teeth,omitempty"`
}

// Unit is an axial-piston pump or motor.
type Unit struct {
	// Displacement is the largest displacement (cm³/rev).
	Displacement units.Displacement `json:"displacement"`
	// MaxSpeed is the rated greatest shaft speed (rpm; optional, not
	// checked when left out).
	MaxSpeed units.AngularVelocity `json:"maxSpeed,omitempty"`
	// RatedPressure is the rated continuous pressure (bar; optional, not
	// checked when left out).
	RatedPressure units.Pressure `json:"ratedPressure,omitempty"`
	// PeakPressure is the rated peak pressure (bar; optional).
	PeakPressure units.Pressure `json:"peakPressure,omitempty"`
	// Swing is how far the unit's swashplate or yoke swings: "to zero"
	// (settings 0 to 1: a motor swung back to zero displacement),
	// "over centre" (−1 to 1: through zero and over centre, reversing the
	// flow) or "unstated" (optional; the default: the schedule keeps a
	// motor at or above minMotorSetting). See hydrostat.Swing.
	Swing hydrostat.Swing `json:"swing,omitempty"`
}

// Losses are the Wilson loss coefficients of both units (per radian, as the
// hydrostat package takes them).
type Losses struct {
	// Slip is the laminar leakage coefficient (dimensionless).
	Slip float64 `json:"slip,omitempty"`
	// Viscous is the viscous torque coefficient (dimensionless).
	Viscous float64 `json:"viscous,omitempty"`
	// Friction is the Coulomb friction torque coefficient (dimensionless).
	Friction float64 `json:"friction,omitempty"`
	// ConstantPressure is the load-independent torque loss expressed as a
	// pressure (bar).
	ConstantPressure units.Pressure `json:"constantPressure,omitempty"`
	// ConstantTorque is a loss torque of each unit that no setting, speed
	// or pressure changes, such as seal and bearing drag (optional, N·m;
	// hydrostat.Wilson.ConstantTorque). Not scaled by size: pump and motor
	// each lose this torque while turning.
	ConstantTorque units.Torque `json:"constantTorque,omitempty"`
}

// Range is one range gear.
type Range struct {
	// Name names the range ("field", "road"; optional).
	Name string `json:"name,omitempty"`
	// Ratio is the range gear's speed ratio, output over the member it is
	// taken from (the summing shaft unless FromVariator).
	Ratio float64 `json:"ratio"`
	// FromVariator takes the range gear from the planetary member on the
	// hydrostat's side (the pump member of an output-coupled split, the
	// motor member of an input-coupled one) instead of the summing shaft,
	// so that ranges alternate and shift synchronously
	// (powersplit.RangeGear.FromVariator). Optional; default false.
	FromVariator bool `json:"fromVariator,omitempty"`
	// Locked makes the range a locked (mechanical) range: a brake holds the
	// variator member and the hydrostat is bypassed, so the range runs at
	// the split's mechanical point only (powersplit.RangeGear.Locked).
	// Optional; default false.
	Locked bool `json:"locked,omitempty"`
}

// Surface is a ground surface and the traction model used on it. Model is
// "brixius", "wismer-luth" or "road"; Preset is one of the built-in
// surfaces ("hard", "firm", "tilled", "soft", "concrete", "asphalt",
// "gravel"), whose values the other fields override.
type Surface struct {
	// Model is the traction model: "brixius", "wismer-luth" or "road".
	Model string `json:"model"`
	// Preset names a built-in surface (optional).
	Preset string `json:"preset,omitempty"`
	// ConeIndex is the soil's cone index (kPa; optional, overrides the
	// preset).
	ConeIndex units.Pressure `json:"coneIndex,omitempty"`
	// RollingCoefficient is motion resistance over wheel load on a road
	// (optional, overrides the preset).
	RollingCoefficient float64 `json:"rollingCoefficient,omitempty"`
	// Adhesion is the greatest pull over wheel load on a road (optional,
	// overrides the preset).
	Adhesion float64 `json:"adhesion,omitempty"`
}

// Implement is a drawn implement: a row of the ASABE D497 draft table by
// name, its width (in the row's unit: m, rows or tools), depth and soil
// texture ("fine", "medium", "coarse").
type Implement struct {
	// Row is the draft table row's name, for example "moldboard plough".
	Row string `json:"row"`
	// Width is the implement's width in the row's unit (m, rows or tools).
	Width float64 `json:"width"`
	// Depth is the working depth (cm; for rows that take one).
	Depth units.Length `json:"depth,omitempty"`
	// Texture is the soil texture: "fine", "medium" or "coarse".
	Texture string `json:"texture"`
}

// Trailer is a towed trailer.
type Trailer struct {
	// Mass is the loaded trailer's mass (t).
	Mass units.Mass `json:"mass"`
	// RollingCoefficient is its motion resistance over weight.
	RollingCoefficient float64 `json:"rollingCoefficient"`
}

// Day is the working day: the simulation time step and the segments.
type Day struct {
	// Step is the simulation time step (optional; 1 s when left out).
	Step Duration `json:"step,omitempty"`
	// Segments are the parts of the day, in order.
	Segments []Segment `json:"segments"`
}

// Segment is one part of the day. Kind is "field" (a pass with the
// implement working), "turn" (headland turns, implement raised), "road"
// (towing the trailer along the profile) or "pto" (standing, driving the
// PTO).
type Segment struct {
	// Name names the segment in reports.
	Name string `json:"name,omitempty"`
	// Kind is "field", "turn", "road" or "pto".
	Kind string `json:"kind"`
	// Speed is the travel speed wanted (km/h).
	Speed units.Speed `json:"speed,omitempty"`
	// Distance is the distance driven in a field pass (km).
	Distance units.Length `json:"distance,omitempty"`
	// Duration is how long a turn or PTO segment lasts.
	Duration Duration `json:"duration,omitempty"`
	// Surface names one of the file's surfaces.
	Surface string `json:"surface,omitempty"`
	// Implement names one of the file's implements (field passes).
	Implement string `json:"implement,omitempty"`
	// Trailer names one of the file's trailers (road segments).
	Trailer string `json:"trailer,omitempty"`
	// Profile is the road's grade profile (road segments).
	Profile []Stretch `json:"profile,omitempty"`
	// Grade is the ground's grade, rise over run (0.06 for 6 %).
	Grade float64 `json:"grade,omitempty"`
	// PTOPower is the power the PTO shaft delivers (kW).
	PTOPower units.Power `json:"ptoPower,omitempty"`
	// PTOSpeed is the PTO shaft speed wanted (rpm; one of PTO.Speeds).
	PTOSpeed units.AngularVelocity `json:"ptoSpeed,omitempty"`
	// TurnRadius is the path radius of the rear axle's centre in a
	// headland turn (optional, m; the turn is run straight when left out).
	TurnRadius units.Length `json:"turnRadius,omitempty"`
}

// Stretch is a piece of road of one grade.
type Stretch struct {
	// Length is the stretch's length (km).
	Length units.Length `json:"length"`
	// Grade is rise over run (0.06 for 6 %).
	Grade float64 `json:"grade"`
}

// Duration is a time span written "25 s", "25 min", "1.5 h" (or in Go's
// form, "1h30m").
type Duration time.Duration

// DurationError is a duration text that could not be read.
type DurationError struct{ Text string }

func (e *DurationError) Error() string {
	return fmt.Sprintf("cannot read %q as a duration (write \"25 s\", \"25 min\" or \"1.5 h\")", e.Text)
}

// UnmarshalText implements encoding.TextUnmarshaler.
func (d *Duration) UnmarshalText(b []byte) error {
	s := strings.TrimSpace(string(b))
	num := strings.TrimRightFunc(s, func(r rune) bool { return r < '0' || r > '9' })
	unit := strings.TrimSpace(s[len(num):])
	v, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
	scale := map[string]float64{"s": 1, "min": 60, "h": 3600}[unit]
	if err == nil && scale > 0 && v >= 0 && v*scale < 1e9 {
		*d = Duration(time.Duration(math.Round(v * scale * float64(time.Second))))
		return nil
	}
	if g, err := time.ParseDuration(s); err == nil && g >= 0 {
		*d = Duration(g)
		return nil
	}
	return &DurationError{Text: s}
}

// MarshalText implements encoding.TextMarshaler: whole minutes as "25 min",
// anything else in seconds ("12.5 s"), so that UnmarshalText gives d back.
func (d Duration) MarshalText() ([]byte, error) {
	g := time.Duration(d)
	if g < 0 {
		return nil, &DurationError{Text: g.String()}
	}
	if g >= time.Minute && g%time.Minute == 0 {
		return []byte(strconv.FormatInt(int64(g/time.Minute), 10) + " min"), nil
	}
	return []byte(strconv.FormatFloat(g.Seconds(), 'g', -1, 64) + " s"), nil
}

// Std returns d as a time.Duration.
func (d Duration) Std() time.Duration { return time.Duration(d) }

// Load reads a design file.
func Load(path string) (*File, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(path, data)
}

// Parse decodes and validates a design file; source names the file in
// errors. Errors are *FieldError values (joined when there are several)
// giving the file, line, JSON path and the value as written.
func Parse(source string, data []byte) (*File, error) {
	idx, err := scan(source, data)
	if err != nil {
		return nil, err
	}
	var f File
	if err := json.Unmarshal(data, &f); err != nil {
		// scan accepts only what decodes; this is a bug.
		return nil, fmt.Errorf("%s: %w", source, err)
	}
	f.source, f.index = source, idx
	if f.Format == 0 {
		f.Format = Format
	}
	if f.Format > Format || f.Format < 0 {
		return nil, f.fieldError("format", fmt.Errorf("%w: version %d, this library reads up to %d", ErrFormat, f.Format, Format))
	}
	if err := f.Validate(); err != nil {
		return nil, err
	}
	return &f, nil
}

// Marshal writes f as indented JSON, with its format version, in the form
// Parse reads back to an equal File.
func (f *File) Marshal() ([]byte, error) {
	g := *f
	g.Format = Format
	b, err := json.MarshalIndent(&g, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// Save writes f to path (see Marshal).
func (f *File) Save(path string) error {
	b, err := f.Marshal()
	if err != nil {
		return err
	}
	return os.WriteFile(path, b, 0o644)
}
