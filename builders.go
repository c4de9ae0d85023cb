package powersplit

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// DefaultGearEfficiency is the mesh efficiency of a fixed gear pair when a
// spec leaves it zero.
//
// Common practice (no published source): 0.98–0.99 per loaded spur or
// helical mesh including bearings.
const DefaultGearEfficiency = 0.985

// RangeGear is one range of a builder: a fixed gear engaged by its own
// clutch, with ωout = Ratio·ωfrom.
type RangeGear struct {
	Name       string  // range name; "" means "range 1", "range 2", ...
	Ratio      float64 // non-zero; negative reverses
	Efficiency float64 // mesh efficiency; 0 means the spec's GearEfficiency
	// FromVariator takes the range gear from the planetary member on the
	// hydrostat's side instead of the summing member: the pump member of an
	// output-coupled split (the units then swap roles: the pump side turns
	// with the output, and the share is counted from motor to pump, see
	// Builder.ReverseShare), the motor member of an input-coupled split (a
	// purely hydrostatic range: the summing member idles). Ranges of both
	// kinds can shift synchronously (Solver.ShiftPoints). Not for
	// PureHydrostatic.
	FromVariator bool
	// Locked makes this a locked (purely mechanical) range: a brake named
	// "<range> lock" holds the variator member (the pump member of an
	// output-coupled split, the motor member of an input-coupled one) and
	// the hydrostat is bypassed with its units destroked, so the range
	// runs at the split's mechanical point only, at one output speed per
	// engine speed (any other is ErrUnreachable). Not with FromVariator;
	// not for PureHydrostatic.
	Locked bool
}

// PTOSpec is a power take-off geared to the engine: ωPTO = Ratio·ωengine.
type PTOSpec struct {
	Name       string  // "" means "PTO", "PTO 2", ...
	Ratio      float64 // non-zero
	Efficiency float64 // 0 means the spec's GearEfficiency
}

// OutputCoupledSpec describes an output-coupled split: the planetary set at
// the input divides the engine power between its output member (mechanical
// path) and the pump; the motor is geared to the summing shaft on the output
// side, which drives the output through the range gears.
type OutputCoupledSpec struct {
	Set planetary.Set
	// Input, Pump and Output name the members on the engine side, the pump
	// side and the summing side. All three unset (planetary.NoMember) means
	// Input = Carrier, Pump = Sun, Output = Ring; with two given, the third
	// is the member left. Any other value is an *InputError naming the field.
	Input, Pump, Output planetary.Member
	InputRatio          float64 // ωinput member = InputRatio·ωengine; 0 means direct (no gear)
	PumpRatio           float64 // ωpump = PumpRatio·ωpump member; 0 means direct
	MotorRatio          float64 // ωsum = MotorRatio·ωmotor; 0 means direct
	// Loop is the hydrostatic loop; it must have exactly one motor.
	Loop hydrostat.Loop
	// Ranges are the range gears from the summing shaft to the output;
	// none means the summing shaft is the output (one range, "single").
	Ranges         []RangeGear
	GearEfficiency float64 // mesh efficiency of every fixed gear; 0 means DefaultGearEfficiency
	PTOs           []PTOSpec
	// Second, when set, is a second motor of the loop (the loop then needs
	// two motors) on an output of its own, for example the front axle; see
	// SecondMotor.
	Second *SecondMotor
}

// InputCoupledSpec describes an input-coupled split: the pump turns at a
// fixed ratio to the engine; the planetary set at the output sums the
// engine's mechanical path (input member) and the motor (motor member) on
// its output member, which drives the output through the range gears.
type InputCoupledSpec struct {
	Set planetary.Set
	// Input, Motor and Output name the members. All three unset
	// (planetary.NoMember) means Input = Ring, Motor = Sun, Output =
	// Carrier; with two given, the third is the member left. Any other
	// value is an *InputError naming the field.
	Input, Motor, Output planetary.Member
	InputRatio           float64        // ωinput member = InputRatio·ωengine; 0 means direct
	PumpRatio            float64        // ωpump = PumpRatio·ωengine; 0 means direct
	MotorRatio           float64        // ωmotor member = MotorRatio·ωmotor; 0 means direct
	Loop                 hydrostat.Loop // exactly one motor
	Ranges               []RangeGear    // from the output member to the output
	GearEfficiency       float64
	PTOs                 []PTOSpec
	Second               *SecondMotor // a second motor on an output of its own; see SecondMotor
}

// SecondMotor is a second motor of the loop driving a second output (an
// axle of its own, the "axle 2" FreeOutput) through a clutch and a gear,
// ωaxle2 = Ratio·ωmotor2. Both motors share the loop pressure; the torque
// on each output follows from its motor's setting and gear.
//
// Every range of the builder comes twice: name, with the second motor
// clutched in, usable up to DeclutchAbove of the first output (the solver
// reports the margin to it in State.Margins: "output speed" against the
// range's maximum output speed),
// and name+" single", with the second motor declutched, held still by its
// brake and swung back to zero, so it carries no torque and has no drag.
// Both ranges of a pair have the same kinematics of the first output, so
// the change between them is synchronous; a setting curve that reaches
// zero at DeclutchAbove makes it free of a torque step too.
type SecondMotor struct {
	Ratio         float64
	Efficiency    float64               // 0 means the spec's GearEfficiency
	DeclutchAbove units.AngularVelocity // > 0
	// Setting is the second motor's setting magnitude over the first
	// output's speed while clutched in (for example: full at low speed,
	// swung back before DeclutchAbove). Empty means: held at MaxSetting in
	// the split builders, and set by the loop's schedule (both motors at
	// one setting) in PureHydrostatic. Solver.BestSetting (with
	// Point.Settings) may choose it point by point instead.
	Setting SettingCurve
	// MinSetting and MaxSetting bound the second motor's setting
	// magnitude: the curve's values must lie within them and
	// Layout.SecondMotor reports them for a setting search. Both zero mean
	// [0, 1].
	MinSetting, MaxSetting float64
}

// SecondInfo describes a layout's second motor (see SecondMotor).
type SecondInfo struct {
	Loop, Motor            int // the motor, for MotorSetting and SettingSearch
	Output                 int // index of its output among Layout.Outputs
	MinSetting, MaxSetting float64
	DeclutchAbove          units.AngularVelocity
}

// SecondMotor describes the layout's second motor, if a builder gave it one.
func (l Layout) SecondMotor() (SecondInfo, bool) {
	if l.l == nil || l.l.second == nil {
		return SecondInfo{}, false
	}
	return *l.l.second, true
}

// checkSecond validates sm and returns the number of motors the loop needs.
func checkSecond(c *specCheck, sm *SecondMotor) int {
	if sm == nil {
		return 1
	}
	c.ratio("Second.Ratio", sm.Ratio, false)
	c.eff("Second.Efficiency", sm.Efficiency)
	if c.err == nil && (!(sm.DeclutchAbove > 0) || math.IsInf(float64(sm.DeclutchAbove), 0)) {
		c.err = &InputError{Field: "Second.DeclutchAbove", Value: units.Of(sm.DeclutchAbove), Reason: "must be positive and finite"}
	}
	lo, hi := sm.MinSetting, sm.MaxSetting
	if lo == 0 && hi == 0 {
		hi = 1
	}
	if c.err == nil && !(lo >= 0 && lo <= hi && hi <= 1) {
		c.err = &InputError{Field: "Second.MinSetting", Value: units.Plain(lo), Reason: "need 0 <= MinSetting <= MaxSetting <= 1"}
	}
	if c.err == nil {
		c.err = sm.Setting.Validate()
	}
	for i, x := range sm.Setting.Settings {
		if c.err == nil && (x < lo || x > hi) {
			c.err = &InputError{Field: fmt.Sprintf("Second.Setting.Settings[%d]", i), Value: units.Plain(x), Reason: "outside [MinSetting, MaxSetting]"}
		}
	}
	return 2
}

// finishSecond adds the second motor's clutch, brake, gear and output, the
// PTOs, the first output and the doubled ranges (see SecondMotor) from
// shaft from; hold sets the second motor's curve and holds it at zero in
// the single ranges.
func finishSecond(b *Builder, c *specCheck, engine, from, alt Shaft, reverseAlt bool, m2 Shaft, sm *SecondMotor, ranges []RangeGear, ptos []PTOSpec, eta float64, hold bool) {
	m2c := b.Shaft("motor 2 clutch shaft")
	b.Clutch("motor 2 clutch", m2, m2c)
	b.Brake("motor 2 brake", m2)
	axle := b.Shaft("axle 2")
	b.Gear("axle 2 gear", m2c, axle, sm.Ratio, orDefault(sm.Efficiency, eta))
	addPTOs(b, c, engine, ptos, eta)
	out := b.Shaft("output")
	b.Output("output", out)
	b.FreeOutput("axle 2", axle)
	if len(ranges) == 0 {
		ranges = []RangeGear{{Name: "direct", Ratio: 1, Efficiency: 1}}
	}
	addRanges(b, c, from, alt, reverseAlt, out, ranges, eta, func(name string, engaged []string) {
		b.Range(name, append(engaged, "motor 2 clutch")...)
		b.RangeLimit(name, sm.DeclutchAbove)
		b.Range(name+" single", append(engaged, "motor 2 brake")...)
		if b.reverse[name] {
			b.ReverseShare(name + " single")
		}
		if hold {
			b.HoldMotor(name+" single", "hydrostat", 1, 0)
		}
	})
	lo, hi := sm.MinSetting, sm.MaxSetting
	if lo == 0 && hi == 0 {
		hi = 1
	}
	curve := sm.Setting
	if curve.Empty() && hold {
		curve = SettingCurve{Speeds: []units.AngularVelocity{0}, Settings: []float64{hi}}
	}
	if !curve.Empty() {
		b.MotorSchedule("hydrostat", 1, curve)
	}
	b.second = &SecondInfo{Loop: 0, Motor: 1, Output: 1, MinSetting: lo, MaxSetting: hi, DeclutchAbove: sm.DeclutchAbove}
}

// PureHydrostaticSpec describes a hydrostatic drive: pump geared to the
// engine, motor driving the output through the range gears, and optionally
// a second motor on a second output.
type PureHydrostaticSpec struct {
	PumpRatio      float64 // ωpump = PumpRatio·ωengine; 0 means direct
	Loop           hydrostat.Loop
	Ranges         []RangeGear // from the motor to the output
	Second         *SecondMotor
	GearEfficiency float64
	PTOs           []PTOSpec
}

type specCheck struct{ err error }

func (c *specCheck) ratio(field string, v float64, zeroOK bool) {
	if c.err != nil {
		return
	}
	if math.IsNaN(v) || math.IsInf(v, 0) || (!zeroOK && v == 0) {
		c.err = &InputError{Field: field, Value: units.Plain(v), Reason: "ratio must be finite and non-zero"}
	}
}

func (c *specCheck) eff(field string, v float64) {
	if c.err == nil && (math.IsNaN(v) || v < 0 || v > 1) {
		c.err = &InputError{Field: field, Value: units.Plain(v), Reason: "efficiency outside (0, 1] (0 means default)"}
	}
}

func (c *specCheck) loop(l hydrostat.Loop, motors int) {
	if c.err == nil && len(l.Spec().Motors) != motors {
		c.err = &InputError{Field: "Loop motors", Value: units.Plain(float64(len(l.Spec().Motors))),
			Reason: fmt.Sprintf("this builder needs a loop with %d motor(s)", motors)}
	}
}

// members checks the members of a split's set, fields names, and fills the
// unset ones: all three unset take the defaults def; with two given the
// third is the member left. A value other than sun, ring, carrier or unset,
// or a single member given alone, is an *InputError naming the field.
func (c *specCheck) members(names [3]string, ms, def [3]planetary.Member) (a, b, d planetary.Member) {
	if c.err != nil {
		return
	}
	unset := 0
	var have [4]bool
	for i, m := range ms {
		switch {
		case m == planetary.NoMember:
			unset++
		case m < planetary.Sun || m > planetary.Carrier:
			c.err = &InputError{Field: names[i], Value: units.Plain(float64(m)), Reason: "not a member of the set (sun, ring or carrier)"}
			return
		default: // a member given twice is the set's error (splitSet)
			have[m] = true
		}
	}
	switch unset {
	case 3:
		ms = def
	case 1:
		left := planetary.Sun
		for have[left] {
			left++
		}
		for i := range ms {
			if ms[i] == planetary.NoMember {
				ms[i] = left
			}
		}
	case 2:
		for i, m := range ms {
			if m == planetary.NoMember {
				c.err = &InputError{Field: names[i], Value: units.Plain(0),
					Reason: fmt.Sprintf("unset: give two or three of %s, %s and %s, or none for the defaults", names[0], names[1], names[2])}
				return
			}
		}
	}
	return ms[0], ms[1], ms[2]
}

func orDefault(v, d float64) float64 {
	if v == 0 {
		return d
	}
	return v
}

// geared returns shaft from itself when ratio is 0, else a new shaft geared
// to it.
func geared(b *Builder, name string, from Shaft, ratio, eta float64) Shaft {
	if ratio == 0 {
		return from
	}
	s := b.Shaft(name)
	b.Gear(name+" gear", from, s, ratio, eta)
	return s
}

// motorOn returns the motor's shaft: to itself when ratio is zero (the motor
// sits on it), else a shaft "motor" geared to to with ω_to = ratio·ω_motor.
func motorOn(b *Builder, to Shaft, ratio, eta float64) Shaft {
	if ratio == 0 {
		return to
	}
	motor := b.Shaft("motor")
	b.Gear("motor gear", motor, to, ratio, eta)
	return motor
}

// splitSet adds the planetary set of a split: the input member geared from
// the engine, the member on the hydrostat's side (side, named sideField in
// the spec) on a shaft of its own and the summing member on the shaft "sum".
// It returns the members' shafts.
func splitSet(b *Builder, set planetary.Set, engine Shaft, in, side, sum planetary.Member, inputRatio, eta float64, sideField string) (map[planetary.Member]Shaft, error) {
	sh := map[planetary.Member]Shaft{}
	sh[in] = geared(b, "planetary input", engine, inputRatio, eta)
	sh[side] = b.Shaft("planetary " + side.String())
	sh[sum] = b.Shaft("sum")
	if len(sh) != 3 {
		return nil, &LayoutError{Element: "planetary", Reason: "a member on two shafts: Input, " + sideField + " and Output must differ", Err: ErrLayout}
	}
	sun, ring, carrier := members(sh)
	b.Planetary("planetary", set, sun, ring, carrier)
	return sh, nil
}

func members(sh map[planetary.Member]Shaft) (sun, ring, carrier Shaft) {
	return sh[planetary.Sun], sh[planetary.Ring], sh[planetary.Carrier]
}

// finish adds ranges, PTOs and the output from shaft from.
func finish(b *Builder, c *specCheck, engine, from, alt Shaft, reverseAlt bool, ranges []RangeGear, ptos []PTOSpec, eta float64) {
	addPTOs(b, c, engine, ptos, eta)
	if len(ranges) == 0 {
		b.Output("output", from)
		return
	}
	out := b.Shaft("output")
	b.Output("output", out)
	addRanges(b, c, from, alt, reverseAlt, out, ranges, eta, nil)
}

func addPTOs(b *Builder, c *specCheck, engine Shaft, ptos []PTOSpec, eta float64) {
	for i, p := range ptos {
		c.ratio(fmt.Sprintf("PTOs[%d].Ratio", i), p.Ratio, false)
		c.eff(fmt.Sprintf("PTOs[%d].Efficiency", i), p.Efficiency)
		name := p.Name
		if name == "" {
			name = "PTO"
			if i > 0 {
				name = fmt.Sprintf("PTO %d", i+1)
			}
		}
		b.PTO(name, engine, p.Ratio, orDefault(p.Efficiency, eta))
	}
}

// addRanges adds one range gear and clutch per range from shaft from to
// shaft out; more, if not nil, adds to each range (and may add ranges).
func addRanges(b *Builder, c *specCheck, from, alt Shaft, reverseAlt bool, out Shaft, ranges []RangeGear, eta float64, more func(name string, engaged []string)) {
	seen := make(map[string]bool, len(ranges))
	for i, rg := range ranges {
		src := from
		if rg.FromVariator {
			if alt < 0 && c.err == nil {
				c.err = &InputError{Field: fmt.Sprintf("Ranges[%d].FromVariator", i), Value: units.Plain(1), Reason: "this builder has no variator member"}
			}
			src = alt
		}
		c.ratio(fmt.Sprintf("Ranges[%d].Ratio", i), rg.Ratio, false)
		c.eff(fmt.Sprintf("Ranges[%d].Efficiency", i), rg.Efficiency)
		name := rg.Name
		if name == "" {
			name = fmt.Sprintf("range %d", i+1)
		}
		if seen[name] && c.err == nil {
			c.err = &LayoutError{Element: name, Reason: fmt.Sprintf("duplicate range name (Ranges[%d])", i), Err: ErrLayout}
		}
		seen[name] = true
		if src < 0 {
			continue
		}
		engaged := []string{name + " clutch"}
		if rg.Locked {
			if (alt < 0 || rg.FromVariator) && c.err == nil {
				c.err = &InputError{Field: fmt.Sprintf("Ranges[%d].Locked", i), Value: units.Plain(1),
					Reason: "a locked range needs a variator member to hold and a gear from the summing member"}
			}
			if alt >= 0 {
				b.Brake(name+" lock", alt)
				engaged = append(engaged, name+" lock")
				b.LockedRange(name)
			}
		}
		rs := b.Shaft(name + " gear shaft")
		b.Gear(name+" gear", src, rs, rg.Ratio, orDefault(rg.Efficiency, eta))
		b.Clutch(name+" clutch", rs, out)
		if rg.FromVariator && reverseAlt {
			b.ReverseShare(name)
		}
		if more != nil {
			more(name, engaged)
		} else {
			b.Range(name, engaged...)
		}
	}
}

// checkSplit checks the gear ratios, gear efficiency and loop of a
// single-set split and returns the check and the gear efficiency to use.
func checkSplit(input, pump, motor, eff float64, loop hydrostat.Loop, second *SecondMotor) (specCheck, float64) {
	var c specCheck
	c.ratio("InputRatio", input, true)
	c.ratio("PumpRatio", pump, true)
	c.ratio("MotorRatio", motor, true)
	c.eff("GearEfficiency", eff)
	c.loop(loop, checkSecond(&c, second))
	return c, orDefault(eff, DefaultGearEfficiency)
}

// OutputCoupled builds an output-coupled split from spec. The layout, with
// the default members (carrier on the engine, sun to the pump, ring the
// summing shaft):
//
//	engine ─[InputRatio]─ carrier ─┐
//	                               ├─ planetary set
//	pump ─[PumpRatio]───── sun ────┤
//	  ║                            └─ ring = summing shaft ─┬─[range gear]─ clutch ─ output
//	  ║ high and low lines                                  │
//	  ╚══ motor ─[MotorRatio]───────────────────────────────┘
//
// (a FromVariator range gear starts from the sun instead of the ring).
//
// The motor may turn
// either way, so the hydrostat gives reverse without a reverse gear. At the
// mechanical point the pump shaft stands still and the motor must swing back
// to zero displacement; beyond it the pump shaft turns backwards. How far
// the range reaches there follows from the motor's hydrostat.Swing:
//
//   - SwingOverCentre: the schedules swing the motor through zero and over
//     centre, so the range runs continuously through its mechanical point
//     (Example_throughMechanicalPoint).
//   - SwingToZero: the motor reaches zero but not over centre; beyond the
//     mechanical point a pump that swings over centre reverses instead, and
//     only a sliver next to the point, where the losses would need a
//     slightly negative motor setting, stays unreachable.
//   - SwingUnstated (the zero value): the schedule keeps a minimum motor
//     setting (hydrostat.Sequential: 0.2 by default), and a band of output
//     speeds around the mechanical point is unreachable (ErrUnreachable).
func OutputCoupled(spec OutputCoupledSpec) (Layout, error) {
	c, eta := checkSplit(spec.InputRatio, spec.PumpRatio, spec.MotorRatio, spec.GearEfficiency, spec.Loop, spec.Second)
	if c.err != nil {
		return Layout{}, c.err
	}
	in, pm, om := c.members([3]string{"Input", "Pump", "Output"}, [3]planetary.Member{spec.Input, spec.Pump, spec.Output},
		[3]planetary.Member{planetary.Carrier, planetary.Sun, planetary.Ring})
	if c.err != nil {
		return Layout{}, c.err
	}
	b := NewBuilder()
	engine := b.Shaft("engine")
	b.Input("engine", engine)
	sh, err := splitSet(b, spec.Set, engine, in, pm, om, spec.InputRatio, eta, "Pump")
	if err != nil {
		return Layout{}, err
	}
	pump := geared(b, "pump", sh[pm], spec.PumpRatio, eta)
	if spec.Second != nil {
		m2 := b.Shaft("motor 2")
		b.Loop("hydrostat", spec.Loop, pump, motorOn(b, sh[om], spec.MotorRatio, eta), m2)
		finishSecond(b, &c, engine, sh[om], sh[pm], true, m2, spec.Second, spec.Ranges, spec.PTOs, eta, true)
	} else {
		b.Loop("hydrostat", spec.Loop, pump, motorOn(b, sh[om], spec.MotorRatio, eta))
		finish(b, &c, engine, sh[om], sh[pm], true, spec.Ranges, spec.PTOs, eta)
	}
	if c.err != nil {
		return Layout{}, c.err
	}
	return b.Build()
}

// InputCoupled builds an input-coupled split from spec. The layout, with
// the default members (ring on the engine, sun to the motor, carrier the
// summing shaft):
//
//	engine ─┬─[InputRatio]─ ring ─────────────┐
//	        │                                 ├─ planetary set
//	        │     motor ─[MotorRatio]─ sun ───┤
//	        │       ║                         └─ carrier = summing shaft ─[range gear]─ clutch ─ output
//	        │       ║ high and low lines
//	        └─[PumpRatio]─ pump
//
// (a FromVariator range gear starts from the sun: a purely hydrostatic
// range).
func InputCoupled(spec InputCoupledSpec) (Layout, error) {
	c, eta := checkSplit(spec.InputRatio, spec.PumpRatio, spec.MotorRatio, spec.GearEfficiency, spec.Loop, spec.Second)
	if c.err != nil {
		return Layout{}, c.err
	}
	in, mm, om := c.members([3]string{"Input", "Motor", "Output"}, [3]planetary.Member{spec.Input, spec.Motor, spec.Output},
		[3]planetary.Member{planetary.Ring, planetary.Sun, planetary.Carrier})
	if c.err != nil {
		return Layout{}, c.err
	}
	b := NewBuilder()
	engine := b.Shaft("engine")
	b.Input("engine", engine)
	pump := geared(b, "pump", engine, spec.PumpRatio, eta)
	sh, err := splitSet(b, spec.Set, engine, in, mm, om, spec.InputRatio, eta, "Motor")
	if err != nil {
		return Layout{}, err
	}
	if spec.Second != nil {
		m2 := b.Shaft("motor 2")
		b.Loop("hydrostat", spec.Loop, pump, motorOn(b, sh[mm], spec.MotorRatio, eta), m2)
		finishSecond(b, &c, engine, sh[om], sh[mm], false, m2, spec.Second, spec.Ranges, spec.PTOs, eta, true)
	} else {
		b.Loop("hydrostat", spec.Loop, pump, motorOn(b, sh[mm], spec.MotorRatio, eta))
		finish(b, &c, engine, sh[om], sh[mm], false, spec.Ranges, spec.PTOs, eta)
	}
	if c.err != nil {
		return Layout{}, c.err
	}
	return b.Build()
}

// PureHydrostatic builds a hydrostatic drive from spec. The layout:
//
//	engine ──[PumpRatio]── pump ── high / low lines ──┬── motor ──[range gear]──clutch── output
//	                                                  └── second motor ──clutch──[Second.Ratio]── second output (optional)
//
// With spec.Second set
// the loop needs two motors and every range comes twice: name (both motors,
// usable up to Second.DeclutchAbove of the first output) and name+" single"
// (second motor declutched and held by its brake). The second axle is a
// FreeOutput: its torque follows from the loop pressure.
func PureHydrostatic(spec PureHydrostaticSpec) (Layout, error) {
	var c specCheck
	c.ratio("PumpRatio", spec.PumpRatio, true)
	c.eff("GearEfficiency", spec.GearEfficiency)
	c.loop(spec.Loop, checkSecond(&c, spec.Second))
	if c.err != nil {
		return Layout{}, c.err
	}
	eta := orDefault(spec.GearEfficiency, DefaultGearEfficiency)
	b := NewBuilder()
	engine := b.Shaft("engine")
	b.Input("engine", engine)
	pump := geared(b, "pump", engine, spec.PumpRatio, eta)
	motor := b.Shaft("motor")
	if spec.Second == nil {
		b.Loop("hydrostat", spec.Loop, pump, motor)
		finish(b, &c, engine, motor, -1, false, spec.Ranges, spec.PTOs, eta)
		if c.err != nil {
			return Layout{}, c.err
		}
		return b.Build()
	}
	sm := spec.Second
	m2 := b.Shaft("motor 2")
	b.Loop("hydrostat", spec.Loop, pump, motor, m2)
	finishSecond(b, &c, engine, motor, -1, false, m2, sm, spec.Ranges, spec.PTOs, eta, !sm.Setting.Empty())
	if c.err != nil {
		return Layout{}, c.err
	}
	return b.Build()
}
