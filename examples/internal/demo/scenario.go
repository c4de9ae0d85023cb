// Package demo holds the demo tractor shared by the example programs: its
// design and working day as a small JSON file (built in, or a user's copy),
// the typed decoding of that file with clear errors, the construction of the
// library's values from it, and the command-line plumbing every example
// shares (the -out and -design flags, progress, aligned tables).
//
// The built-in scenario is invented. It describes no real machine, maker,
// farm or place.
//
// # The file
//
// The file is one JSON object. Every physical value is a string in the units
// package's text form ("420 bar", "2100 rpm", "8.5 t", "6 km/h"); ratios,
// efficiencies and coefficients are plain numbers; durations are written
// "25 s", "25 min" or "1.5 h". Unknown fields are errors, so a misspelt name
// is reported rather than ignored. Copy the built-in file (run any example
// with -print-design) and edit it; load it with -design path.
package demo

import (
	"bytes"
	_ "embed"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/powersplit-dev/powersplit/units"
)

//go:embed tractor.json
var builtin []byte

// BuiltinName is how errors and reports name the built-in scenario file.
const BuiltinName = "tractor.json (built in)"

// Builtin returns a copy of the built-in scenario file.
func Builtin() []byte { return bytes.Clone(builtin) }

// Scenario is the decoded demo file: the tractor, its engine, PTO,
// transmission (and alternative transmissions for comparisons), the
// surfaces, implements and trailers it works with, and its working day.
type Scenario struct {
	Name         string               `json:"name"`
	Owner        string               `json:"owner"`
	Note         string               `json:"note"`
	Tractor      Tractor              `json:"tractor"`
	Engine       Engine               `json:"engine"`
	PTO          PTO                  `json:"pto"`
	Transmission Transmission         `json:"transmission"`
	Alternatives []Transmission       `json:"alternatives"`
	Surfaces     map[string]Surface   `json:"surfaces"`
	Implements   map[string]Implement `json:"implements"`
	Trailers     map[string]Trailer   `json:"trailers"`
	Day          Day                  `json:"day"`

	source string
}

// Source returns the name of the file the scenario came from.
func (s *Scenario) Source() string { return s.source }

// Tractor is the machine's mass, geometry, axles and final drive.
type Tractor struct {
	Mass               units.Mass   `json:"mass"`
	RotatingMass       units.Mass   `json:"rotatingMass"`
	DragArea           units.Area   `json:"dragArea"`
	Wheelbase          units.Length `json:"wheelbase"`
	CentreOfMass       units.Length `json:"centreOfMass"` // ahead of the rear axle
	CentreOfMassHeight units.Length `json:"centreOfMassHeight"`
	HitchHeight        units.Length `json:"hitchHeight"`
	HitchBehind        units.Length `json:"hitchBehind"`
	Front              Axle         `json:"front"`
	Rear               Axle         `json:"rear"`
	// FrontLead is the mechanical front drive's lead: front theoretical
	// speed over rear, minus one (0.02 for 2 %).
	FrontLead            float64 `json:"frontLead"`
	FinalDrive           float64 `json:"finalDrive"`
	FinalDriveEfficiency float64 `json:"finalDriveEfficiency"`
}

// Axle is one axle's tyres.
type Axle struct {
	Tyre   Tyre         `json:"tyre"`
	Wheels int          `json:"wheels"`
	Track  units.Length `json:"track"`
}

// Tyre is one tyre's geometry and load rating.
type Tyre struct {
	Diameter      units.Length `json:"diameter"`
	Width         units.Length `json:"width"`
	SectionHeight units.Length `json:"sectionHeight"`
	RollingRadius units.Length `json:"rollingRadius"`
	Deflection    units.Length `json:"deflection"`
	RatedLoad     units.Force  `json:"ratedLoad"`
}

// Engine is the full-load curve and the fuel map (optional: without it the
// ASABE D497 fuel equation is used).
type Engine struct {
	Idle    units.AngularVelocity `json:"idle"`
	Rated   units.AngularVelocity `json:"rated"`
	Curve   []CurvePoint          `json:"curve"`
	FuelMap *FuelMap              `json:"fuelMap"`
}

// CurvePoint is one point of the full-load torque curve.
type CurvePoint struct {
	Speed  units.AngularVelocity `json:"speed"`
	Torque units.Torque          `json:"torque"`
}

// FuelMap is brake specific fuel consumption over speed × torque:
// SFC[i][j] at Speeds[i], Torques[j].
type FuelMap struct {
	Speeds  []units.AngularVelocity           `json:"speeds"`
	Torques []units.Torque                    `json:"torques"`
	SFC     [][]units.SpecificFuelConsumption `json:"sfc"`
}

// PTO is the power take-off: its standard shaft speeds, all reached at one
// engine speed.
type PTO struct {
	Speeds     []units.AngularVelocity `json:"speeds"`
	AtEngine   units.AngularVelocity   `json:"atEngine"`
	Efficiency float64                 `json:"efficiency"`
	MaxPower   units.Power             `json:"maxPower"`
}

// Transmission is a power-split design: its kind ("input-coupled",
// "output-coupled" or "compound"), planetary sets, gear ratios, hydrostatic
// units, loop and range gears.
type Transmission struct {
	Name string `json:"name"`
	Kind string `json:"kind"`
	Set  Set    `json:"set"`
	// Set2 is the second planetary set of a compound split.
	Set2            *Set           `json:"set2"`
	InputRatio      float64        `json:"inputRatio"`
	PumpRatio       float64        `json:"pumpRatio"`
	MotorRatio      float64        `json:"motorRatio"`
	Pump            Unit           `json:"pump"`
	Motor           Unit           `json:"motor"`
	Losses          Losses         `json:"losses"`
	Oil             string         `json:"oil"`
	OilTemperature  Temperature    `json:"oilTemperature"`
	Charge          units.Pressure `json:"charge"`
	Relief          units.Pressure `json:"relief"`
	MinMotorSetting float64        `json:"minMotorSetting"`
	Ranges          []Range        `json:"ranges"`
	GearEfficiency  float64        `json:"gearEfficiency"`
}

// Temperature wraps units.Temperature so that an absent value is told apart
// from 0 K.
type Temperature struct {
	units.Temperature
	Set bool
}

// UnmarshalText implements encoding.TextUnmarshaler.
func (t *Temperature) UnmarshalText(b []byte) error {
	if err := t.Temperature.UnmarshalText(b); err != nil {
		return err
	}
	t.Set = true
	return nil
}

// Set is a planetary set given by its fixed-carrier ratio.
type Set struct {
	FixedCarrierRatio float64 `json:"fixedCarrierRatio"`
	BasicEfficiency   float64 `json:"basicEfficiency"`
}

// Unit is an axial-piston pump or motor.
type Unit struct {
	Displacement  units.Displacement    `json:"displacement"`
	MaxSpeed      units.AngularVelocity `json:"maxSpeed"`
	RatedPressure units.Pressure        `json:"ratedPressure"`
	PeakPressure  units.Pressure        `json:"peakPressure"`
}

// Losses are the Wilson loss coefficients of both units (per radian, as the
// hydrostat package takes them).
type Losses struct {
	Slip             float64        `json:"slip"`
	Viscous          float64        `json:"viscous"`
	Friction         float64        `json:"friction"`
	ConstantPressure units.Pressure `json:"constantPressure"`
}

// Range is one range gear.
type Range struct {
	Name  string  `json:"name"`
	Ratio float64 `json:"ratio"`
}

// Surface is a ground surface and the traction model used on it. Model is
// "brixius", "wismer-luth" or "road"; Preset is one of the built-in
// surfaces ("hard", "firm", "tilled", "soft", "concrete", "asphalt",
// "gravel"), whose values the other fields override.
type Surface struct {
	Model              string         `json:"model"`
	Preset             string         `json:"preset"`
	ConeIndex          units.Pressure `json:"coneIndex"`
	RollingCoefficient float64        `json:"rollingCoefficient"`
	Adhesion           float64        `json:"adhesion"`
}

// Implement is a drawn implement: a row of the ASABE D497 draft table by
// name, its width (in the row's unit: m, rows or tools), depth and soil
// texture ("fine", "medium", "coarse").
type Implement struct {
	Row     string       `json:"row"`
	Width   float64      `json:"width"`
	Depth   units.Length `json:"depth"`
	Texture string       `json:"texture"`
}

// Trailer is a towed trailer.
type Trailer struct {
	Mass               units.Mass `json:"mass"`
	RollingCoefficient float64    `json:"rollingCoefficient"`
}

// Day is the working day: the simulation time step and the segments.
type Day struct {
	Step     Duration  `json:"step"`
	Segments []Segment `json:"segments"`
}

// Segment is one part of the day. Kind is "field" (a pass with the
// implement working), "turn" (headland turns, implement raised), "road"
// (towing the trailer along the profile) or "pto" (standing, driving the
// PTO).
type Segment struct {
	Name      string                `json:"name"`
	Kind      string                `json:"kind"`
	Speed     units.Speed           `json:"speed"`
	Distance  units.Length          `json:"distance"`
	Duration  Duration              `json:"duration"`
	Surface   string                `json:"surface"`
	Implement string                `json:"implement"`
	Trailer   string                `json:"trailer"`
	Profile   []Stretch             `json:"profile"`
	Grade     float64               `json:"grade"`
	PTOPower  units.Power           `json:"ptoPower"`
	PTOSpeed  units.AngularVelocity `json:"ptoSpeed"`
}

// Stretch is a piece of road of one grade (rise over run: 0.06 for 6 %).
type Stretch struct {
	Length units.Length `json:"length"`
	Grade  float64      `json:"grade"`
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
		*d = Duration(time.Duration(v * scale * float64(time.Second)))
		return nil
	}
	if g, err := time.ParseDuration(s); err == nil && g >= 0 {
		*d = Duration(g)
		return nil
	}
	return &DurationError{Text: s}
}

// Std returns d as a time.Duration.
func (d Duration) Std() time.Duration { return time.Duration(d) }

// Default returns the built-in scenario.
func Default() (*Scenario, error) { return Parse(BuiltinName, builtin) }

// Load reads a scenario file.
func Load(path string) (*Scenario, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(path, data)
}

// Parse decodes a scenario from data; source names the file in errors.
// Errors name the file, the line, the field and what was wrong.
func Parse(source string, data []byte) (*Scenario, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var s Scenario
	if err := dec.Decode(&s); err != nil {
		return nil, describe(source, data, err)
	}
	if dec.More() {
		return nil, fmt.Errorf("%s:%d: unexpected data after the scenario object", source, lineOf(data, int(dec.InputOffset())))
	}
	s.source = source
	if err := s.validate(); err != nil {
		return nil, fmt.Errorf("%s: %w", source, err)
	}
	return &s, nil
}

// describe turns a decoding error into one that names the file, the line
// and the field.
func describe(source string, data []byte, err error) error {
	var (
		syn *json.SyntaxError
		typ *json.UnmarshalTypeError
		pe  *units.ParseError
		de  *DurationError
	)
	switch {
	case errors.As(err, &syn):
		return fmt.Errorf("%s:%d: not valid JSON: %v", source, lineOf(data, int(syn.Offset)), syn)
	case errors.As(err, &typ):
		what := "a number"
		if typ.Type != nil && typ.Type.Kind().String() == "string" || strings.Contains(fmt.Sprint(typ.Type), "units.") {
			what = "a quantity text such as \"420 bar\""
		}
		if typ.Type != nil && strings.HasPrefix(typ.Type.String(), "[]") {
			what = "a list"
		}
		if typ.Type != nil && (typ.Type.Kind().String() == "struct" || typ.Type.Kind().String() == "map") {
			what = "an object"
		}
		return fmt.Errorf("%s:%d: field %q: got a JSON %s, want %s", source, lineOf(data, int(typ.Offset)), typ.Field, typ.Value, what)
	case errors.As(err, &pe):
		line, key := locateText(data, pe.Text)
		return fmt.Errorf("%s:%d: field %q: %v", source, line, key, pe)
	case errors.As(err, &de):
		line, key := locateText(data, de.Text)
		return fmt.Errorf("%s:%d: field %q: %v", source, line, key, de)
	case strings.HasPrefix(err.Error(), "json: unknown field "):
		name, _ := strconv.Unquote(strings.TrimPrefix(err.Error(), "json: unknown field "))
		line := lineOf(data, bytes.Index(data, []byte(strconv.Quote(name))))
		return fmt.Errorf("%s:%d: unknown field %q (misspelt, or not part of the scenario format)", source, line, name)
	case errors.Is(err, io.EOF) || errors.Is(err, io.ErrUnexpectedEOF):
		return fmt.Errorf("%s: empty or truncated file", source)
	}
	return fmt.Errorf("%s: %w", source, err)
}

// locateText finds the JSON string "text" in data and returns its line and
// the object key it is the value of (or that holds the list it is in).
func locateText(data []byte, text string) (line int, key string) {
	if text == "" {
		return 0, "?"
	}
	q, _ := json.Marshal(text)
	i := bytes.Index(data, q)
	if i < 0 {
		i = bytes.Index(data, []byte(text))
	}
	if i < 0 {
		return 0, "?"
	}
	return lineOf(data, i), keyBefore(data[:i])
}

// keyBefore returns the last `"key":` before the end of b.
func keyBefore(b []byte) string {
	for end := len(b); end > 0; {
		c := bytes.LastIndexByte(b[:end], ':')
		if c < 0 {
			return "?"
		}
		j := c - 1
		for j >= 0 && (b[j] == ' ' || b[j] == '\t' || b[j] == '\n' || b[j] == '\r') {
			j--
		}
		if j > 0 && b[j] == '"' {
			k := bytes.LastIndexByte(b[:j], '"')
			if k >= 0 {
				return string(b[k+1 : j])
			}
		}
		end = c
	}
	return "?"
}

// lineOf returns the 1-based line of byte offset off (0 when unknown).
func lineOf(data []byte, off int) int {
	if off < 0 {
		return 0
	}
	if off > len(data) {
		off = len(data)
	}
	return bytes.Count(data[:off], []byte{'\n'}) + 1
}
