package units

import (
	"math"
	"strconv"
)

// Kind names the quantity a Measure holds: one of the quantity types of
// this package, or Number for a plain number.
type Kind uint8

// The kinds of a Measure, one per quantity type.
const (
	Number Kind = iota // a plain number: a ratio, a relative setting, a slip, a count
	AngleKind
	AngularVelocityKind
	TorqueKind
	PowerKind
	EnergyKind
	PressureKind
	DisplacementKind
	VolumeFlowKind
	VolumeKind
	SpeedKind
	AccelerationKind
	ForceKind
	MassKind
	LengthKind
	AreaKind
	DensityKind
	DynamicViscosityKind
	KinematicViscosityKind
	TemperatureKind
	TemperatureDifferenceKind
	MassFlowKind
	SpecificFuelConsumptionKind
	numKinds
)

var kindTables = [numKinds]*table{
	AngleKind:                   &angleTable,
	AngularVelocityKind:         &angularVelocityTable,
	TorqueKind:                  &torqueTable,
	PowerKind:                   &powerTable,
	EnergyKind:                  &energyTable,
	PressureKind:                &pressureTable,
	DisplacementKind:            &displacementTable,
	VolumeFlowKind:              &volumeFlowTable,
	VolumeKind:                  &volumeTable,
	SpeedKind:                   &speedTable,
	AccelerationKind:            &accelerationTable,
	ForceKind:                   &forceTable,
	MassKind:                    &massTable,
	LengthKind:                  &lengthTable,
	AreaKind:                    &areaTable,
	DensityKind:                 &densityTable,
	DynamicViscosityKind:        &dynamicViscosityTable,
	KinematicViscosityKind:      &kinematicViscosityTable,
	TemperatureKind:             &temperatureTable,
	TemperatureDifferenceKind:   &temperatureDifferenceTable,
	MassFlowKind:                &massFlowTable,
	SpecificFuelConsumptionKind: &specificFuelConsumptionTable,
}

// String returns the quantity's name ("pressure", "angular velocity"), or
// "number".
func (k Kind) String() string {
	if k < numKinds && kindTables[k] != nil {
		return kindTables[k].quantity
	}
	if k == Number {
		return "number"
	}
	return "Kind(" + strconv.Itoa(int(k)) + ")"
}

// Quantity is the set of quantity types of this package.
type Quantity interface {
	Angle | AngularVelocity | Torque | Power | Energy | Pressure | Displacement |
		VolumeFlow | Volume | Speed | Acceleration | Force | Mass | Length | Area |
		Density | DynamicViscosity | KinematicViscosity | Temperature |
		TemperatureDifference | MassFlow | SpecificFuelConsumption
}

// A Measure is a value of a quantity chosen at run time: a limit, a margin,
// the value in an error. It keeps the SI value with its Kind and prints like
// the typed quantity does (String of a Pressure, an AngularVelocity, ...),
// so every report of the library shows bar, rpm, cm³/rev, kW or kN, never
// a raw SI number. Build one with Of (or Plain for a plain number) and read
// it back with As.
//
// The zero Measure is the plain number 0.
type Measure struct {
	SI   float64 // the value in the SI unit of Kind (the plain value for Number)
	Kind Kind
}

// Of returns q as a Measure of its kind (Number for a float64).
func Of[Q Quantity | float64](q Q) Measure {
	var k Kind
	switch any(q).(type) {
	case Angle:
		k = AngleKind
	case AngularVelocity:
		k = AngularVelocityKind
	case Torque:
		k = TorqueKind
	case Power:
		k = PowerKind
	case Energy:
		k = EnergyKind
	case Pressure:
		k = PressureKind
	case Displacement:
		k = DisplacementKind
	case VolumeFlow:
		k = VolumeFlowKind
	case Volume:
		k = VolumeKind
	case Speed:
		k = SpeedKind
	case Acceleration:
		k = AccelerationKind
	case Force:
		k = ForceKind
	case Mass:
		k = MassKind
	case Length:
		k = LengthKind
	case Area:
		k = AreaKind
	case Density:
		k = DensityKind
	case DynamicViscosity:
		k = DynamicViscosityKind
	case KinematicViscosity:
		k = KinematicViscosityKind
	case Temperature:
		k = TemperatureKind
	case TemperatureDifference:
		k = TemperatureDifferenceKind
	case MassFlow:
		k = MassFlowKind
	case SpecificFuelConsumption:
		k = SpecificFuelConsumptionKind
	}
	return Measure{SI: float64(q), Kind: k}
}

// Plain returns v as a Measure of kind Number.
func Plain(v float64) Measure { return Measure{SI: v} }

// As returns m as the quantity Q, and whether m is of Q's kind (Number for
// a float64).
func As[Q Quantity | float64](m Measure) (Q, bool) {
	q := Q(m.SI)
	return q, Of(q).Kind == m.Kind
}

// Sub returns m − o in m's kind. It is meant for two measures of one kind
// (a limit minus a value); the kind of o is not checked.
func (m Measure) Sub(o Measure) Measure { return Measure{SI: m.SI - o.SI, Kind: m.Kind} }

// Abs returns |m|.
func (m Measure) Abs() Measure { return Measure{SI: math.Abs(m.SI), Kind: m.Kind} }

// String formats m as its quantity's String does: six significant digits
// in a unit suited to its size ("2560 bar", "2100 rpm", "-75 cm³/rev",
// "12.5 kN"); a plain number has no unit ("0.95").
func (m Measure) String() string { return string(m.Append(make([]byte, 0, 24))) }

// Append appends the text String returns to b, without allocating when b
// has room.
func (m Measure) Append(b []byte) []byte {
	if m.Kind < numKinds && kindTables[m.Kind] != nil {
		return kindTables[m.Kind].appendFormat(b, m.SI)
	}
	return strconv.AppendFloat(b, m.SI, 'g', 6, 64)
}

// AppendLimit appends "<quantity> <value> above <bound> <limit>" to b
// ("below" when the value lies under the limit; bound "" reads "limit"),
// the one wording every package's limit errors use, for example "pump
// speed 3100 rpm above maximum speed 2800 rpm".
func AppendLimit(b []byte, quantity string, v Measure, bound string, limit Measure) []byte {
	b = append(b, quantity...)
	b = append(b, ' ')
	b = v.Append(b)
	if v.SI < limit.SI {
		b = append(b, " below "...)
	} else {
		b = append(b, " above "...)
	}
	if bound == "" {
		bound = "limit"
	}
	b = append(b, bound...)
	b = append(b, ' ')
	return limit.Append(b)
}
