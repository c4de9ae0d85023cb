package units

// Temperature is a thermodynamic (absolute) temperature in kelvins.
//
// A Temperature is a point on a scale, not an interval: 20 °C is 293.15 K.
// The difference of two temperatures is a TemperatureDifference, which has
// no offset (a difference of 10 °C is a difference of 10 K).
type Temperature float64

// Kelvin returns v kelvins (K) as a Temperature.
func Kelvin(v float64) Temperature { return Temperature(v) }

// Kelvin returns t in kelvins (K).
func (t Temperature) Kelvin() float64 { return float64(t) }

// Celsius returns v degrees Celsius (°C) as a Temperature.
func Celsius(v float64) Temperature { return Temperature(v + celsiusZero) }

// Celsius returns t in degrees Celsius (°C).
func (t Temperature) Celsius() float64 { return float64(t) - celsiusZero }

// Fahrenheit returns v degrees Fahrenheit (°F) as a Temperature.
func Fahrenheit(v float64) Temperature { return Temperature((v + fahrenheitZero) / 1.8) }

// Fahrenheit returns t in degrees Fahrenheit (°F).
func (t Temperature) Fahrenheit() float64 { return float64(t)*1.8 - fahrenheitZero }

// Sub returns the difference t - u.
func (t Temperature) Sub(u Temperature) TemperatureDifference {
	return TemperatureDifference(float64(t) - float64(u))
}

// Add returns the temperature d above t.
func (t Temperature) Add(d TemperatureDifference) Temperature {
	return Temperature(float64(t) + float64(d))
}

const (
	celsiusZero    = 273.15 // K at 0 °C, exact by definition
	fahrenheitZero = 459.67 // °F below 0 °F at absolute zero, exact: T/K = (t/°F + 459.67)/1.8
)

var temperatureTable = table{
	quantity: "temperature",
	units: []unit{
		{symbols: []string{"K"}, scale: 1},
		{symbols: []string{"°C", "degC", "C"}, scale: 1, offset: celsiusZero},
		{symbols: []string{"°F", "degF", "F"}, scale: 1 / 1.8, offset: fahrenheitZero / 1.8},
	},
	display: []displayUnit{{1, 0}},
	min:     0,
}

// String formats t in degrees Celsius with six significant digits.
func (t Temperature) String() string { return temperatureTable.format(float64(t)) }

// MarshalText implements encoding.TextMarshaler. The text parses back to exactly t;
// NaN, infinities and temperatures below absolute zero are an error.
func (t Temperature) MarshalText() ([]byte, error) {
	if t < 0 {
		return nil, &ParseError{"temperature", temperatureTable.format(float64(t)), ErrRange}
	}
	return temperatureTable.marshal(float64(t))
}

// UnmarshalText implements encoding.TextUnmarshaler with the forms ParseTemperature accepts.
func (t *Temperature) UnmarshalText(text []byte) error {
	return unmarshal(t, &temperatureTable, text)
}

// ParseTemperature parses a temperature written as a number and a unit, such
// as "60 °C", "333.15 K" or "140 °F" ("degC", "C", "degF" and "F" are accepted
// too). A temperature below absolute zero is an ErrRange.
func ParseTemperature(s string) (Temperature, error) {
	return parse[Temperature](&temperatureTable, s)
}
