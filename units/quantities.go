package units

// The quantity types of this package. Each is a float64 in SI units; see
// the package documentation for the constructors, accessors and text forms.

import "math"

// Angle is a plane angle in radians.
type Angle float64

// Radians returns v radians (rad) as an Angle.
func Radians(v float64) Angle { return Angle(v) }

// Radians returns a in radians (rad).
func (a Angle) Radians() float64 { return float64(a) }

// Degrees returns v degrees (°) as an Angle.
func Degrees(v float64) Angle { return Angle(v * (math.Pi / 180)) }

// Degrees returns a in degrees (°).
func (a Angle) Degrees() float64 { return float64(a) / (math.Pi / 180) }

// Revolutions returns v revolutions (full turns) (rev) as an Angle.
func Revolutions(v float64) Angle { return Angle(v * (2 * math.Pi)) }

// Revolutions returns a in revolutions (full turns) (rev).
func (a Angle) Revolutions() float64 { return float64(a) / (2 * math.Pi) }

var angleTable = table{
	quantity: "angle",
	units: []unit{
		{symbols: []string{"rad"}, scale: 1},
		{symbols: []string{"°", "deg"}, scale: math.Pi / 180},
		{symbols: []string{"rev", "r"}, scale: 2 * math.Pi},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats a with six significant digits in a unit suited to its size.
func (a Angle) String() string { return angleTable.format(float64(a)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly a;
// NaN and infinities are an error.
func (a Angle) MarshalText() ([]byte, error) { return angleTable.marshal(float64(a)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseAngle accepts.
func (a *Angle) UnmarshalText(text []byte) error { return unmarshal(a, &angleTable, text) }

// ParseAngle parses an angle written as a number and a unit, such as
// "12 °". Accepted units: "rad", "°", "rev", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseAngle(s string) (Angle, error) { return parse[Angle](&angleTable, s) }

// AngularVelocity is an angular velocity in radians per second.
type AngularVelocity float64

// RadPerSec returns v radians per second (rad/s) as an AngularVelocity.
func RadPerSec(v float64) AngularVelocity { return AngularVelocity(v) }

// RadPerSec returns w in radians per second (rad/s).
func (w AngularVelocity) RadPerSec() float64 { return float64(w) }

// RPM returns v revolutions per minute (rpm) as an AngularVelocity.
func RPM(v float64) AngularVelocity { return AngularVelocity(v * (2 * math.Pi / 60)) }

// RPM returns w in revolutions per minute (rpm).
func (w AngularVelocity) RPM() float64 { return float64(w) / (2 * math.Pi / 60) }

var angularVelocityTable = table{
	quantity: "angular velocity",
	units: []unit{
		{symbols: []string{"rad/s"}, scale: 1},
		{symbols: []string{"rpm", "r/min", "rev/min", "1/min", "min⁻¹"}, scale: 2 * math.Pi / 60},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats w with six significant digits in a unit suited to its size.
func (w AngularVelocity) String() string { return angularVelocityTable.format(float64(w)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly w;
// NaN and infinities are an error.
func (w AngularVelocity) MarshalText() ([]byte, error) {
	return angularVelocityTable.marshal(float64(w))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseAngularVelocity accepts.
func (w *AngularVelocity) UnmarshalText(text []byte) error {
	return unmarshal(w, &angularVelocityTable, text)
}

// ParseAngularVelocity parses an angular velocity written as a number and a unit, such as
// "2100 rpm". Accepted units: "rad/s", "rpm", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseAngularVelocity(s string) (AngularVelocity, error) {
	return parse[AngularVelocity](&angularVelocityTable, s)
}

// Torque is a torque (moment of force) in newton metres.
type Torque float64

// NewtonMetres returns v newton metres (N·m) as a Torque.
func NewtonMetres(v float64) Torque { return Torque(v) }

// NewtonMetres returns t in newton metres (N·m).
func (t Torque) NewtonMetres() float64 { return float64(t) }

// KilonewtonMetres returns v kilonewton metres (kN·m) as a Torque.
func KilonewtonMetres(v float64) Torque { return Torque(v * (1e3)) }

// KilonewtonMetres returns t in kilonewton metres (kN·m).
func (t Torque) KilonewtonMetres() float64 { return float64(t) / (1e3) }

// PoundFeet returns v pound-force feet (lbf·ft) as a Torque.
func PoundFeet(v float64) Torque { return Torque(v * (poundForce * foot)) }

// PoundFeet returns t in pound-force feet (lbf·ft).
func (t Torque) PoundFeet() float64 { return float64(t) / (poundForce * foot) }

var torqueTable = table{
	quantity: "torque",
	units: []unit{
		{symbols: []string{"N·m", "N*m", "Nm", "N m", "N.m"}, scale: 1},
		{symbols: []string{"kN·m", "kN*m", "kNm", "kN m", "kN.m"}, scale: 1e3},
		{symbols: []string{"lbf·ft", "lbf*ft", "lbf ft", "lbf.ft", "lb·ft", "lb ft", "ft·lbf", "ft lbf"}, scale: poundForce * foot},
	},
	display: []displayUnit{{0, 0}, {1, 10000.0}},
	min:     math.Inf(-1),
}

// String formats t with six significant digits in a unit suited to its size.
func (t Torque) String() string { return torqueTable.format(float64(t)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly t;
// NaN and infinities are an error.
func (t Torque) MarshalText() ([]byte, error) { return torqueTable.marshal(float64(t)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseTorque accepts.
func (t *Torque) UnmarshalText(text []byte) error { return unmarshal(t, &torqueTable, text) }

// ParseTorque parses a torque written as a number and a unit, such as
// "850 N·m". Accepted units: "N·m", "kN·m", "lbf·ft", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseTorque(s string) (Torque, error) { return parse[Torque](&torqueTable, s) }

// Power is a power in watts.
type Power float64

// Watts returns v watts (W) as a Power.
func Watts(v float64) Power { return Power(v) }

// Watts returns p in watts (W).
func (p Power) Watts() float64 { return float64(p) }

// Kilowatts returns v kilowatts (kW) as a Power.
func Kilowatts(v float64) Power { return Power(v * (1e3)) }

// Kilowatts returns p in kilowatts (kW).
func (p Power) Kilowatts() float64 { return float64(p) / (1e3) }

// Megawatts returns v megawatts (MW) as a Power.
func Megawatts(v float64) Power { return Power(v * (1e6)) }

// Megawatts returns p in megawatts (MW).
func (p Power) Megawatts() float64 { return float64(p) / (1e6) }

// Horsepower returns v mechanical horsepower (550 ft·lbf/s) (hp) as a Power.
func Horsepower(v float64) Power { return Power(v * (550 * foot * poundForce)) }

// Horsepower returns p in mechanical horsepower (550 ft·lbf/s) (hp).
func (p Power) Horsepower() float64 { return float64(p) / (550 * foot * poundForce) }

// MetricHorsepower returns v metric horsepower (75 kgf·m/s) (PS) as a Power.
func MetricHorsepower(v float64) Power { return Power(v * (75 * standardGravity)) }

// MetricHorsepower returns p in metric horsepower (75 kgf·m/s) (PS).
func (p Power) MetricHorsepower() float64 { return float64(p) / (75 * standardGravity) }

var powerTable = table{
	quantity: "power",
	units: []unit{
		{symbols: []string{"W"}, scale: 1},
		{symbols: []string{"kW"}, scale: 1e3},
		{symbols: []string{"MW"}, scale: 1e6},
		{symbols: []string{"hp"}, scale: 550 * foot * poundForce},
		{symbols: []string{"PS", "hp(M)", "CV"}, scale: 75 * standardGravity},
	},
	display: []displayUnit{{0, 0}, {1, 1000.0}, {2, 1000000.0}},
	min:     math.Inf(-1),
}

// String formats p with six significant digits in a unit suited to its size.
func (p Power) String() string { return powerTable.format(float64(p)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly p;
// NaN and infinities are an error.
func (p Power) MarshalText() ([]byte, error) { return powerTable.marshal(float64(p)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParsePower accepts.
func (p *Power) UnmarshalText(text []byte) error { return unmarshal(p, &powerTable, text) }

// ParsePower parses a power written as a number and a unit, such as
// "160 kW". Accepted units: "W", "kW", "MW", "hp", "PS", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParsePower(s string) (Power, error) { return parse[Power](&powerTable, s) }

// Energy is an energy in joules.
type Energy float64

// Joules returns v joules (J) as an Energy.
func Joules(v float64) Energy { return Energy(v) }

// Joules returns e in joules (J).
func (e Energy) Joules() float64 { return float64(e) }

// Kilojoules returns v kilojoules (kJ) as an Energy.
func Kilojoules(v float64) Energy { return Energy(v * (1e3)) }

// Kilojoules returns e in kilojoules (kJ).
func (e Energy) Kilojoules() float64 { return float64(e) / (1e3) }

// Megajoules returns v megajoules (MJ) as an Energy.
func Megajoules(v float64) Energy { return Energy(v * (1e6)) }

// Megajoules returns e in megajoules (MJ).
func (e Energy) Megajoules() float64 { return float64(e) / (1e6) }

// KilowattHours returns v kilowatt hours (kWh) as an Energy.
func KilowattHours(v float64) Energy { return Energy(v * (3.6e6)) }

// KilowattHours returns e in kilowatt hours (kWh).
func (e Energy) KilowattHours() float64 { return float64(e) / (3.6e6) }

var energyTable = table{
	quantity: "energy",
	units: []unit{
		{symbols: []string{"J"}, scale: 1},
		{symbols: []string{"kJ"}, scale: 1e3},
		{symbols: []string{"MJ"}, scale: 1e6},
		{symbols: []string{"kWh", "kW·h", "kW h"}, scale: 3.6e6},
	},
	display: []displayUnit{{0, 0}, {1, 1000.0}, {2, 1000000.0}},
	min:     math.Inf(-1),
}

// String formats e with six significant digits in a unit suited to its size.
func (e Energy) String() string { return energyTable.format(float64(e)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly e;
// NaN and infinities are an error.
func (e Energy) MarshalText() ([]byte, error) { return energyTable.marshal(float64(e)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseEnergy accepts.
func (e *Energy) UnmarshalText(text []byte) error { return unmarshal(e, &energyTable, text) }

// ParseEnergy parses an energy written as a number and a unit, such as
// "3.2 kWh". Accepted units: "J", "kJ", "MJ", "kWh", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseEnergy(s string) (Energy, error) { return parse[Energy](&energyTable, s) }

// Pressure is a pressure in pascals.
type Pressure float64

// Pascals returns v pascals (Pa) as a Pressure.
func Pascals(v float64) Pressure { return Pressure(v) }

// Pascals returns p in pascals (Pa).
func (p Pressure) Pascals() float64 { return float64(p) }

// Kilopascals returns v kilopascals (kPa) as a Pressure.
func Kilopascals(v float64) Pressure { return Pressure(v * (1e3)) }

// Kilopascals returns p in kilopascals (kPa).
func (p Pressure) Kilopascals() float64 { return float64(p) / (1e3) }

// Megapascals returns v megapascals (MPa) as a Pressure.
func Megapascals(v float64) Pressure { return Pressure(v * (1e6)) }

// Megapascals returns p in megapascals (MPa).
func (p Pressure) Megapascals() float64 { return float64(p) / (1e6) }

// Bar returns v bar (bar) as a Pressure.
func Bar(v float64) Pressure { return Pressure(v * (1e5)) }

// Bar returns p in bar (bar).
func (p Pressure) Bar() float64 { return float64(p) / (1e5) }

// PSI returns v pounds-force per square inch (psi) as a Pressure.
func PSI(v float64) Pressure { return Pressure(v * (poundForce / (inch * inch))) }

// PSI returns p in pounds-force per square inch (psi).
func (p Pressure) PSI() float64 { return float64(p) / (poundForce / (inch * inch)) }

var pressureTable = table{
	quantity: "pressure",
	units: []unit{
		{symbols: []string{"Pa"}, scale: 1},
		{symbols: []string{"kPa"}, scale: 1e3},
		{symbols: []string{"MPa"}, scale: 1e6},
		{symbols: []string{"bar"}, scale: 1e5},
		{symbols: []string{"psi", "lbf/in²", "lbf/in2"}, scale: poundForce / (inch * inch)},
	},
	display: []displayUnit{{0, 0}, {1, 1000.0}, {3, 100000.0}},
	min:     math.Inf(-1),
}

// String formats p with six significant digits in a unit suited to its size.
func (p Pressure) String() string { return pressureTable.format(float64(p)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly p;
// NaN and infinities are an error.
func (p Pressure) MarshalText() ([]byte, error) { return pressureTable.marshal(float64(p)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParsePressure accepts.
func (p *Pressure) UnmarshalText(text []byte) error { return unmarshal(p, &pressureTable, text) }

// ParsePressure parses a pressure written as a number and a unit, such as
// "420 bar". Accepted units: "Pa", "kPa", "MPa", "bar", "psi", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParsePressure(s string) (Pressure, error) { return parse[Pressure](&pressureTable, s) }

// Displacement is the volume a hydrostatic unit displaces per unit of shaft rotation, stored in cubic metres per radian.
type Displacement float64

// CubicMetresPerRadian returns v cubic metres per radian (m³/rad) as a Displacement.
func CubicMetresPerRadian(v float64) Displacement { return Displacement(v) }

// CubicMetresPerRadian returns d in cubic metres per radian (m³/rad).
func (d Displacement) CubicMetresPerRadian() float64 { return float64(d) }

// CCPerRev returns v cubic centimetres per revolution (cm³/rev) as a Displacement.
func CCPerRev(v float64) Displacement { return Displacement(v * (1e-6 / (2 * math.Pi))) }

// CCPerRev returns d in cubic centimetres per revolution (cm³/rev).
func (d Displacement) CCPerRev() float64 { return float64(d) / (1e-6 / (2 * math.Pi)) }

// LitresPerRev returns v litres per revolution (L/rev) as a Displacement.
func LitresPerRev(v float64) Displacement { return Displacement(v * (1e-3 / (2 * math.Pi))) }

// LitresPerRev returns d in litres per revolution (L/rev).
func (d Displacement) LitresPerRev() float64 { return float64(d) / (1e-3 / (2 * math.Pi)) }

var displacementTable = table{
	quantity: "displacement",
	units: []unit{
		{symbols: []string{"m³/rad", "m3/rad"}, scale: 1},
		{symbols: []string{"cm³/rev", "cm3/rev", "cc/rev", "cm³/r", "cm3/r", "cc"}, scale: 1e-6 / (2 * math.Pi)},
		{symbols: []string{"L/rev", "l/rev"}, scale: 1e-3 / (2 * math.Pi)},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats d with six significant digits in a unit suited to its size.
func (d Displacement) String() string { return displacementTable.format(float64(d)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly d;
// NaN and infinities are an error.
func (d Displacement) MarshalText() ([]byte, error) { return displacementTable.marshal(float64(d)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseDisplacement accepts.
func (d *Displacement) UnmarshalText(text []byte) error {
	return unmarshal(d, &displacementTable, text)
}

// ParseDisplacement parses a displacement written as a number and a unit, such as
// "210 cm³/rev". Accepted units: "m³/rad", "cm³/rev", "L/rev", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseDisplacement(s string) (Displacement, error) {
	return parse[Displacement](&displacementTable, s)
}

// VolumeFlow is a volume flow rate in cubic metres per second.
type VolumeFlow float64

// CubicMetresPerSecond returns v cubic metres per second (m³/s) as a VolumeFlow.
func CubicMetresPerSecond(v float64) VolumeFlow { return VolumeFlow(v) }

// CubicMetresPerSecond returns q in cubic metres per second (m³/s).
func (q VolumeFlow) CubicMetresPerSecond() float64 { return float64(q) }

// LitresPerMinute returns v litres per minute (L/min) as a VolumeFlow.
func LitresPerMinute(v float64) VolumeFlow { return VolumeFlow(v * (1e-3 / 60)) }

// LitresPerMinute returns q in litres per minute (L/min).
func (q VolumeFlow) LitresPerMinute() float64 { return float64(q) / (1e-3 / 60) }

// LitresPerHour returns v litres per hour (L/h) as a VolumeFlow.
func LitresPerHour(v float64) VolumeFlow { return VolumeFlow(v * (1e-3 / 3600)) }

// LitresPerHour returns q in litres per hour (L/h).
func (q VolumeFlow) LitresPerHour() float64 { return float64(q) / (1e-3 / 3600) }

// GallonsPerMinute returns v US gallons per minute (gal/min) as a VolumeFlow.
func GallonsPerMinute(v float64) VolumeFlow { return VolumeFlow(v * (usGallon / 60)) }

// GallonsPerMinute returns q in US gallons per minute (gal/min).
func (q VolumeFlow) GallonsPerMinute() float64 { return float64(q) / (usGallon / 60) }

var volumeFlowTable = table{
	quantity: "volume flow",
	units: []unit{
		{symbols: []string{"m³/s", "m3/s"}, scale: 1},
		{symbols: []string{"L/min", "l/min", "lpm"}, scale: 1e-3 / 60},
		{symbols: []string{"L/h", "l/h"}, scale: 1e-3 / 3600},
		{symbols: []string{"gal/min", "gpm"}, scale: usGallon / 60},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats q with six significant digits in a unit suited to its size.
func (q VolumeFlow) String() string { return volumeFlowTable.format(float64(q)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly q;
// NaN and infinities are an error.
func (q VolumeFlow) MarshalText() ([]byte, error) { return volumeFlowTable.marshal(float64(q)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseVolumeFlow accepts.
func (q *VolumeFlow) UnmarshalText(text []byte) error { return unmarshal(q, &volumeFlowTable, text) }

// ParseVolumeFlow parses a volume flow written as a number and a unit, such as
// "320 L/min". Accepted units: "m³/s", "L/min", "L/h", "gal/min", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseVolumeFlow(s string) (VolumeFlow, error) { return parse[VolumeFlow](&volumeFlowTable, s) }

// Volume is a volume in cubic metres.
type Volume float64

// CubicMetres returns v cubic metres (m³) as a Volume.
func CubicMetres(v float64) Volume { return Volume(v) }

// CubicMetres returns v in cubic metres (m³).
func (v Volume) CubicMetres() float64 { return float64(v) }

// Litres returns v litres (L) as a Volume.
func Litres(v float64) Volume { return Volume(v * (1e-3)) }

// Litres returns v in litres (L).
func (v Volume) Litres() float64 { return float64(v) / (1e-3) }

// CubicCentimetres returns v cubic centimetres (cm³) as a Volume.
func CubicCentimetres(v float64) Volume { return Volume(v * (1e-6)) }

// CubicCentimetres returns v in cubic centimetres (cm³).
func (v Volume) CubicCentimetres() float64 { return float64(v) / (1e-6) }

// Gallons returns v US liquid gallons (gal) as a Volume.
func Gallons(v float64) Volume { return Volume(v * (usGallon)) }

// Gallons returns v in US liquid gallons (gal).
func (v Volume) Gallons() float64 { return float64(v) / (usGallon) }

var volumeTable = table{
	quantity: "volume",
	units: []unit{
		{symbols: []string{"m³", "m3"}, scale: 1},
		{symbols: []string{"L", "l"}, scale: 1e-3},
		{symbols: []string{"cm³", "cm3", "cc", "mL", "ml"}, scale: 1e-6},
		{symbols: []string{"gal"}, scale: usGallon},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats v with six significant digits in a unit suited to its size.
func (v Volume) String() string { return volumeTable.format(float64(v)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly v;
// NaN and infinities are an error.
func (v Volume) MarshalText() ([]byte, error) { return volumeTable.marshal(float64(v)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseVolume accepts.
func (v *Volume) UnmarshalText(text []byte) error { return unmarshal(v, &volumeTable, text) }

// ParseVolume parses a volume written as a number and a unit, such as
// "60 L". Accepted units: "m³", "L", "cm³", "gal", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseVolume(s string) (Volume, error) { return parse[Volume](&volumeTable, s) }

// Speed is a linear speed in metres per second.
type Speed float64

// MetresPerSecond returns v metres per second (m/s) as a Speed.
func MetresPerSecond(v float64) Speed { return Speed(v) }

// MetresPerSecond returns v in metres per second (m/s).
func (v Speed) MetresPerSecond() float64 { return float64(v) }

// KMH returns v kilometres per hour (km/h) as a Speed.
func KMH(v float64) Speed { return Speed(v * (1 / 3.6)) }

// KMH returns v in kilometres per hour (km/h).
func (v Speed) KMH() float64 { return float64(v) / (1 / 3.6) }

// MPH returns v miles per hour (mph) as a Speed.
func MPH(v float64) Speed { return Speed(v * (mile / 3600)) }

// MPH returns v in miles per hour (mph).
func (v Speed) MPH() float64 { return float64(v) / (mile / 3600) }

var speedTable = table{
	quantity: "speed",
	units: []unit{
		{symbols: []string{"m/s"}, scale: 1},
		{symbols: []string{"km/h", "kph"}, scale: 1 / 3.6},
		{symbols: []string{"mph", "mi/h"}, scale: mile / 3600},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats v with six significant digits in a unit suited to its size.
func (v Speed) String() string { return speedTable.format(float64(v)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly v;
// NaN and infinities are an error.
func (v Speed) MarshalText() ([]byte, error) { return speedTable.marshal(float64(v)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseSpeed accepts.
func (v *Speed) UnmarshalText(text []byte) error { return unmarshal(v, &speedTable, text) }

// ParseSpeed parses a speed written as a number and a unit, such as
// "40 km/h". Accepted units: "m/s", "km/h", "mph", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseSpeed(s string) (Speed, error) { return parse[Speed](&speedTable, s) }

// Acceleration is a linear acceleration in metres per second squared.
type Acceleration float64

// MetresPerSecondSquared returns v metres per second squared (m/s²) as an Acceleration.
func MetresPerSecondSquared(v float64) Acceleration { return Acceleration(v) }

// MetresPerSecondSquared returns a in metres per second squared (m/s²).
func (a Acceleration) MetresPerSecondSquared() float64 { return float64(a) }

// StandardGravities returns v multiples of standard gravity (g) as an Acceleration.
func StandardGravities(v float64) Acceleration { return Acceleration(v * (standardGravity)) }

// StandardGravities returns a in multiples of standard gravity (g).
func (a Acceleration) StandardGravities() float64 { return float64(a) / (standardGravity) }

var accelerationTable = table{
	quantity: "acceleration",
	units: []unit{
		{symbols: []string{"m/s²", "m/s2", "m/s^2"}, scale: 1},
		{symbols: []string{"g", "gn"}, scale: standardGravity},
	},
	display: []displayUnit{{0, 0}},
	min:     math.Inf(-1),
}

// String formats a with six significant digits in a unit suited to its size.
func (a Acceleration) String() string { return accelerationTable.format(float64(a)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly a;
// NaN and infinities are an error.
func (a Acceleration) MarshalText() ([]byte, error) { return accelerationTable.marshal(float64(a)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseAcceleration accepts.
func (a *Acceleration) UnmarshalText(text []byte) error {
	return unmarshal(a, &accelerationTable, text)
}

// ParseAcceleration parses an acceleration written as a number and a unit, such as
// "0.8 m/s²". Accepted units: "m/s²", "g", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseAcceleration(s string) (Acceleration, error) {
	return parse[Acceleration](&accelerationTable, s)
}

// Force is a force in newtons.
type Force float64

// Newtons returns v newtons (N) as a Force.
func Newtons(v float64) Force { return Force(v) }

// Newtons returns f in newtons (N).
func (f Force) Newtons() float64 { return float64(f) }

// Kilonewtons returns v kilonewtons (kN) as a Force.
func Kilonewtons(v float64) Force { return Force(v * (1e3)) }

// Kilonewtons returns f in kilonewtons (kN).
func (f Force) Kilonewtons() float64 { return float64(f) / (1e3) }

// PoundsForce returns v pounds-force (lbf) as a Force.
func PoundsForce(v float64) Force { return Force(v * (poundForce)) }

// PoundsForce returns f in pounds-force (lbf).
func (f Force) PoundsForce() float64 { return float64(f) / (poundForce) }

var forceTable = table{
	quantity: "force",
	units: []unit{
		{symbols: []string{"N"}, scale: 1},
		{symbols: []string{"kN"}, scale: 1e3},
		{symbols: []string{"lbf"}, scale: poundForce},
	},
	display: []displayUnit{{0, 0}, {1, 1000.0}},
	min:     math.Inf(-1),
}

// String formats f with six significant digits in a unit suited to its size.
func (f Force) String() string { return forceTable.format(float64(f)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly f;
// NaN and infinities are an error.
func (f Force) MarshalText() ([]byte, error) { return forceTable.marshal(float64(f)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseForce accepts.
func (f *Force) UnmarshalText(text []byte) error { return unmarshal(f, &forceTable, text) }

// ParseForce parses a force written as a number and a unit, such as
// "45 kN". Accepted units: "N", "kN", "lbf", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseForce(s string) (Force, error) { return parse[Force](&forceTable, s) }

// Mass is a mass in kilograms.
type Mass float64

// Kilograms returns v kilograms (kg) as a Mass.
func Kilograms(v float64) Mass { return Mass(v) }

// Kilograms returns m in kilograms (kg).
func (m Mass) Kilograms() float64 { return float64(m) }

// Tonnes returns v tonnes (metric tons) (t) as a Mass.
func Tonnes(v float64) Mass { return Mass(v * (1e3)) }

// Tonnes returns m in tonnes (metric tons) (t).
func (m Mass) Tonnes() float64 { return float64(m) / (1e3) }

// Pounds returns v pounds (avoirdupois) (lb) as a Mass.
func Pounds(v float64) Mass { return Mass(v * (pound)) }

// Pounds returns m in pounds (avoirdupois) (lb).
func (m Mass) Pounds() float64 { return float64(m) / (pound) }

// Grams returns v grams (g) as a Mass.
func Grams(v float64) Mass { return Mass(v * (1e-3)) }

// Grams returns m in grams (g).
func (m Mass) Grams() float64 { return float64(m) / (1e-3) }

var massTable = table{
	quantity: "mass",
	units: []unit{
		{symbols: []string{"kg"}, scale: 1},
		{symbols: []string{"t"}, scale: 1e3},
		{symbols: []string{"lb"}, scale: pound},
		{symbols: []string{"g"}, scale: 1e-3},
	},
	display: []displayUnit{{0, 0}},
	min:     math.Inf(-1),
}

// String formats m with six significant digits in a unit suited to its size.
func (m Mass) String() string { return massTable.format(float64(m)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly m;
// NaN and infinities are an error.
func (m Mass) MarshalText() ([]byte, error) { return massTable.marshal(float64(m)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseMass accepts.
func (m *Mass) UnmarshalText(text []byte) error { return unmarshal(m, &massTable, text) }

// ParseMass parses a mass written as a number and a unit, such as
// "8.5 t". Accepted units: "kg", "t", "lb", "g", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseMass(s string) (Mass, error) { return parse[Mass](&massTable, s) }

// Length is a length in metres.
type Length float64

// Metres returns v metres (m) as a Length.
func Metres(v float64) Length { return Length(v) }

// Metres returns l in metres (m).
func (l Length) Metres() float64 { return float64(l) }

// Millimetres returns v millimetres (mm) as a Length.
func Millimetres(v float64) Length { return Length(v * (1e-3)) }

// Millimetres returns l in millimetres (mm).
func (l Length) Millimetres() float64 { return float64(l) / (1e-3) }

// Centimetres returns v centimetres (cm) as a Length.
func Centimetres(v float64) Length { return Length(v * (1e-2)) }

// Centimetres returns l in centimetres (cm).
func (l Length) Centimetres() float64 { return float64(l) / (1e-2) }

// Kilometres returns v kilometres (km) as a Length.
func Kilometres(v float64) Length { return Length(v * (1e3)) }

// Kilometres returns l in kilometres (km).
func (l Length) Kilometres() float64 { return float64(l) / (1e3) }

// Inches returns v inches (in) as a Length.
func Inches(v float64) Length { return Length(v * (inch)) }

// Inches returns l in inches (in).
func (l Length) Inches() float64 { return float64(l) / (inch) }

// Feet returns v feet (ft) as a Length.
func Feet(v float64) Length { return Length(v * (foot)) }

// Feet returns l in feet (ft).
func (l Length) Feet() float64 { return float64(l) / (foot) }

// Miles returns v statute miles (mi) as a Length.
func Miles(v float64) Length { return Length(v * (mile)) }

// Miles returns l in statute miles (mi).
func (l Length) Miles() float64 { return float64(l) / (mile) }

var lengthTable = table{
	quantity: "length",
	units: []unit{
		{symbols: []string{"m"}, scale: 1},
		{symbols: []string{"mm"}, scale: 1e-3},
		{symbols: []string{"cm"}, scale: 1e-2},
		{symbols: []string{"km"}, scale: 1e3},
		{symbols: []string{"in"}, scale: inch},
		{symbols: []string{"ft"}, scale: foot},
		{symbols: []string{"mi"}, scale: mile},
	},
	display: []displayUnit{{1, 0}, {0, 1}, {3, 10000.0}},
	min:     math.Inf(-1),
}

// String formats l with six significant digits in a unit suited to its size.
func (l Length) String() string { return lengthTable.format(float64(l)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly l;
// NaN and infinities are an error.
func (l Length) MarshalText() ([]byte, error) { return lengthTable.marshal(float64(l)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseLength accepts.
func (l *Length) UnmarshalText(text []byte) error { return unmarshal(l, &lengthTable, text) }

// ParseLength parses a length written as a number and a unit, such as
// "1.75 m". Accepted units: "m", "mm", "cm", "km", "in", "ft", "mi", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseLength(s string) (Length, error) { return parse[Length](&lengthTable, s) }

// Area is an area in square metres.
type Area float64

// SquareMetres returns v square metres (m²) as an Area.
func SquareMetres(v float64) Area { return Area(v) }

// SquareMetres returns a in square metres (m²).
func (a Area) SquareMetres() float64 { return float64(a) }

// Hectares returns v hectares (ha) as an Area.
func Hectares(v float64) Area { return Area(v * (1e4)) }

// Hectares returns a in hectares (ha).
func (a Area) Hectares() float64 { return float64(a) / (1e4) }

// SquareCentimetres returns v square centimetres (cm²) as an Area.
func SquareCentimetres(v float64) Area { return Area(v * (1e-4)) }

// SquareCentimetres returns a in square centimetres (cm²).
func (a Area) SquareCentimetres() float64 { return float64(a) / (1e-4) }

var areaTable = table{
	quantity: "area",
	units: []unit{
		{symbols: []string{"m²", "m2"}, scale: 1},
		{symbols: []string{"ha"}, scale: 1e4},
		{symbols: []string{"cm²", "cm2"}, scale: 1e-4},
	},
	display: []displayUnit{{2, 0}, {0, 0.01}, {1, 10000.0}},
	min:     math.Inf(-1),
}

// String formats a with six significant digits in a unit suited to its size.
func (a Area) String() string { return areaTable.format(float64(a)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly a;
// NaN and infinities are an error.
func (a Area) MarshalText() ([]byte, error) { return areaTable.marshal(float64(a)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseArea accepts.
func (a *Area) UnmarshalText(text []byte) error { return unmarshal(a, &areaTable, text) }

// ParseArea parses an area written as a number and a unit, such as
// "12 ha". Accepted units: "m²", "ha", "cm²", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseArea(s string) (Area, error) { return parse[Area](&areaTable, s) }

// Density is a mass density in kilograms per cubic metre.
type Density float64

// KilogramsPerCubicMetre returns v kilograms per cubic metre (kg/m³) as a Density.
func KilogramsPerCubicMetre(v float64) Density { return Density(v) }

// KilogramsPerCubicMetre returns d in kilograms per cubic metre (kg/m³).
func (d Density) KilogramsPerCubicMetre() float64 { return float64(d) }

// KilogramsPerLitre returns v kilograms per litre (kg/L) as a Density.
func KilogramsPerLitre(v float64) Density { return Density(v * (1e3)) }

// KilogramsPerLitre returns d in kilograms per litre (kg/L).
func (d Density) KilogramsPerLitre() float64 { return float64(d) / (1e3) }

var densityTable = table{
	quantity: "density",
	units: []unit{
		{symbols: []string{"kg/m³", "kg/m3"}, scale: 1},
		{symbols: []string{"kg/L", "kg/l", "g/cm³", "g/cm3"}, scale: 1e3},
	},
	display: []displayUnit{{0, 0}},
	min:     math.Inf(-1),
}

// String formats d with six significant digits in a unit suited to its size.
func (d Density) String() string { return densityTable.format(float64(d)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly d;
// NaN and infinities are an error.
func (d Density) MarshalText() ([]byte, error) { return densityTable.marshal(float64(d)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseDensity accepts.
func (d *Density) UnmarshalText(text []byte) error { return unmarshal(d, &densityTable, text) }

// ParseDensity parses a density written as a number and a unit, such as
// "870 kg/m³". Accepted units: "kg/m³", "kg/L", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseDensity(s string) (Density, error) { return parse[Density](&densityTable, s) }

// DynamicViscosity is a dynamic (absolute) viscosity in pascal seconds.
type DynamicViscosity float64

// PascalSeconds returns v pascal seconds (Pa·s) as a DynamicViscosity.
func PascalSeconds(v float64) DynamicViscosity { return DynamicViscosity(v) }

// PascalSeconds returns mu in pascal seconds (Pa·s).
func (mu DynamicViscosity) PascalSeconds() float64 { return float64(mu) }

// Centipoise returns v centipoise (millipascal seconds) (cP) as a DynamicViscosity.
func Centipoise(v float64) DynamicViscosity { return DynamicViscosity(v * (1e-3)) }

// Centipoise returns mu in centipoise (millipascal seconds) (cP).
func (mu DynamicViscosity) Centipoise() float64 { return float64(mu) / (1e-3) }

var dynamicViscosityTable = table{
	quantity: "dynamic viscosity",
	units: []unit{
		{symbols: []string{"Pa·s", "Pa*s", "Pa s", "Pa.s"}, scale: 1},
		{symbols: []string{"cP", "mPa·s", "mPa*s", "mPa s", "mPa.s"}, scale: 1e-3},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats mu with six significant digits in a unit suited to its size.
func (mu DynamicViscosity) String() string { return dynamicViscosityTable.format(float64(mu)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly mu;
// NaN and infinities are an error.
func (mu DynamicViscosity) MarshalText() ([]byte, error) {
	return dynamicViscosityTable.marshal(float64(mu))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseDynamicViscosity accepts.
func (mu *DynamicViscosity) UnmarshalText(text []byte) error {
	return unmarshal(mu, &dynamicViscosityTable, text)
}

// ParseDynamicViscosity parses a dynamic viscosity written as a number and a unit, such as
// "40 cP". Accepted units: "Pa·s", "cP", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseDynamicViscosity(s string) (DynamicViscosity, error) {
	return parse[DynamicViscosity](&dynamicViscosityTable, s)
}

// KinematicViscosity is a kinematic viscosity in square metres per second.
type KinematicViscosity float64

// SquareMetresPerSecond returns v square metres per second (m²/s) as a KinematicViscosity.
func SquareMetresPerSecond(v float64) KinematicViscosity { return KinematicViscosity(v) }

// SquareMetresPerSecond returns nu in square metres per second (m²/s).
func (nu KinematicViscosity) SquareMetresPerSecond() float64 { return float64(nu) }

// Centistokes returns v centistokes (square millimetres per second) (cSt) as a KinematicViscosity.
func Centistokes(v float64) KinematicViscosity { return KinematicViscosity(v * (1e-6)) }

// Centistokes returns nu in centistokes (square millimetres per second) (cSt).
func (nu KinematicViscosity) Centistokes() float64 { return float64(nu) / (1e-6) }

var kinematicViscosityTable = table{
	quantity: "kinematic viscosity",
	units: []unit{
		{symbols: []string{"m²/s", "m2/s"}, scale: 1},
		{symbols: []string{"cSt", "mm²/s", "mm2/s"}, scale: 1e-6},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats nu with six significant digits in a unit suited to its size.
func (nu KinematicViscosity) String() string { return kinematicViscosityTable.format(float64(nu)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly nu;
// NaN and infinities are an error.
func (nu KinematicViscosity) MarshalText() ([]byte, error) {
	return kinematicViscosityTable.marshal(float64(nu))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseKinematicViscosity accepts.
func (nu *KinematicViscosity) UnmarshalText(text []byte) error {
	return unmarshal(nu, &kinematicViscosityTable, text)
}

// ParseKinematicViscosity parses a kinematic viscosity written as a number and a unit, such as
// "46 cSt". Accepted units: "m²/s", "cSt", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseKinematicViscosity(s string) (KinematicViscosity, error) {
	return parse[KinematicViscosity](&kinematicViscosityTable, s)
}

// TemperatureDifference is a difference between two temperatures in kelvins; unlike a Temperature it has no offset.
type TemperatureDifference float64

// KelvinDifference returns v kelvins (equal to degrees Celsius of difference) (K) as a TemperatureDifference.
func KelvinDifference(v float64) TemperatureDifference { return TemperatureDifference(v) }

// KelvinDifference returns d in kelvins (equal to degrees Celsius of difference) (K).
func (d TemperatureDifference) KelvinDifference() float64 { return float64(d) }

// FahrenheitDifference returns v degrees Fahrenheit of difference (°F) as a TemperatureDifference.
func FahrenheitDifference(v float64) TemperatureDifference {
	return TemperatureDifference(v * (1 / 1.8))
}

// FahrenheitDifference returns d in degrees Fahrenheit of difference (°F).
func (d TemperatureDifference) FahrenheitDifference() float64 { return float64(d) / (1 / 1.8) }

var temperatureDifferenceTable = table{
	quantity: "temperature difference",
	units: []unit{
		{symbols: []string{"K", "°C", "degC", "C"}, scale: 1},
		{symbols: []string{"°F", "degF", "F"}, scale: 1 / 1.8},
	},
	display: []displayUnit{{0, 0}},
	min:     math.Inf(-1),
}

// String formats d with six significant digits in a unit suited to its size.
func (d TemperatureDifference) String() string { return temperatureDifferenceTable.format(float64(d)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly d;
// NaN and infinities are an error.
func (d TemperatureDifference) MarshalText() ([]byte, error) {
	return temperatureDifferenceTable.marshal(float64(d))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseTemperatureDifference accepts.
func (d *TemperatureDifference) UnmarshalText(text []byte) error {
	return unmarshal(d, &temperatureDifferenceTable, text)
}

// ParseTemperatureDifference parses a temperature difference written as a number and a unit, such as
// "15 K". Accepted units: "K", "°F", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseTemperatureDifference(s string) (TemperatureDifference, error) {
	return parse[TemperatureDifference](&temperatureDifferenceTable, s)
}

// MassFlow is a mass flow rate in kilograms per second.
type MassFlow float64

// KilogramsPerSecond returns v kilograms per second (kg/s) as a MassFlow.
func KilogramsPerSecond(v float64) MassFlow { return MassFlow(v) }

// KilogramsPerSecond returns m in kilograms per second (kg/s).
func (m MassFlow) KilogramsPerSecond() float64 { return float64(m) }

// KilogramsPerHour returns v kilograms per hour (kg/h) as a MassFlow.
func KilogramsPerHour(v float64) MassFlow { return MassFlow(v * (1 / 3600.0)) }

// KilogramsPerHour returns m in kilograms per hour (kg/h).
func (m MassFlow) KilogramsPerHour() float64 { return float64(m) / (1 / 3600.0) }

// GramsPerHour returns v grams per hour (g/h) as a MassFlow.
func GramsPerHour(v float64) MassFlow { return MassFlow(v * (1e-3 / 3600)) }

// GramsPerHour returns m in grams per hour (g/h).
func (m MassFlow) GramsPerHour() float64 { return float64(m) / (1e-3 / 3600) }

var massFlowTable = table{
	quantity: "mass flow",
	units: []unit{
		{symbols: []string{"kg/s"}, scale: 1},
		{symbols: []string{"kg/h"}, scale: 1 / 3600.0},
		{symbols: []string{"g/h"}, scale: 1e-3 / 3600},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats m with six significant digits in a unit suited to its size.
func (m MassFlow) String() string { return massFlowTable.format(float64(m)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly m;
// NaN and infinities are an error.
func (m MassFlow) MarshalText() ([]byte, error) { return massFlowTable.marshal(float64(m)) }

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseMassFlow accepts.
func (m *MassFlow) UnmarshalText(text []byte) error { return unmarshal(m, &massFlowTable, text) }

// ParseMassFlow parses a mass flow written as a number and a unit, such as
// "38 kg/h". Accepted units: "kg/s", "kg/h", "g/h", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseMassFlow(s string) (MassFlow, error) { return parse[MassFlow](&massFlowTable, s) }

// SpecificFuelConsumption is a brake specific fuel consumption, the fuel mass per unit of work, in kilograms per joule.
type SpecificFuelConsumption float64

// KilogramsPerJoule returns v kilograms per joule (kg/J) as a SpecificFuelConsumption.
func KilogramsPerJoule(v float64) SpecificFuelConsumption { return SpecificFuelConsumption(v) }

// KilogramsPerJoule returns s in kilograms per joule (kg/J).
func (s SpecificFuelConsumption) KilogramsPerJoule() float64 { return float64(s) }

// GramsPerKWh returns v grams per kilowatt hour (g/kWh) as a SpecificFuelConsumption.
func GramsPerKWh(v float64) SpecificFuelConsumption {
	return SpecificFuelConsumption(v * (1e-3 / 3.6e6))
}

// GramsPerKWh returns s in grams per kilowatt hour (g/kWh).
func (s SpecificFuelConsumption) GramsPerKWh() float64 { return float64(s) / (1e-3 / 3.6e6) }

var specificFuelConsumptionTable = table{
	quantity: "specific fuel consumption",
	units: []unit{
		{symbols: []string{"kg/J"}, scale: 1},
		{symbols: []string{"g/kWh", "g/(kW·h)", "g/kW h"}, scale: 1e-3 / 3.6e6},
	},
	display: []displayUnit{{1, 0}},
	min:     math.Inf(-1),
}

// String formats s with six significant digits in a unit suited to its size.
func (s SpecificFuelConsumption) String() string {
	return specificFuelConsumptionTable.format(float64(s))
}

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly s;
// NaN and infinities are an error.
func (s SpecificFuelConsumption) MarshalText() ([]byte, error) {
	return specificFuelConsumptionTable.marshal(float64(s))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseSpecificFuelConsumption accepts.
func (s *SpecificFuelConsumption) UnmarshalText(text []byte) error {
	return unmarshal(s, &specificFuelConsumptionTable, text)
}

// ParseSpecificFuelConsumption parses a specific fuel consumption written as a number and a unit, such as
// "215 g/kWh". Accepted units: "kg/J", "g/kWh", and the aliases listed in the package documentation.
// Errors are *ParseError values wrapping ErrSyntax, ErrUnit or ErrRange.
func ParseSpecificFuelConsumption(s string) (SpecificFuelConsumption, error) {
	return parse[SpecificFuelConsumption](&specificFuelConsumptionTable, s)
}
