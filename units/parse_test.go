package units

import (
	"encoding/json"
	"errors"
	"math"
	"testing"

	"github.com/google/go-cmp/cmp"
	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/internal/testutil"
)

func TestParse(t *testing.T) {
	t.Parallel()
	// Hand calculation from the exact definitions in constants.go.
	cases := []struct {
		text string
		got  func(string) (float64, error)
		want float64
	}{
		{"420 bar", f(ParsePressure), 420e5},
		{"420bar", f(ParsePressure), 420e5},
		{"  35 MPa ", f(ParsePressure), 35e6},
		{"5000 psi", f(ParsePressure), 5000 * poundForce / (inch * inch)},
		{"2100 rpm", f(ParseAngularVelocity), 2100 * 2 * math.Pi / 60},
		{"-1.5e3 r/min", f(ParseAngularVelocity), -1500 * 2 * math.Pi / 60},
		{"40 km/h", f(ParseSpeed), 40 / 3.6},
		{"25 mph", f(ParseSpeed), 25 * mile / 3600},
		{"850 N·m", f(ParseTorque), 850},
		{"850 Nm", f(ParseTorque), 850},
		{"100 lbf·ft", f(ParseTorque), 100 * poundForce * foot},
		{"160 kW", f(ParsePower), 160e3},
		{"200 hp", f(ParsePower), 200 * 550 * foot * poundForce},
		{"200 PS", f(ParsePower), 200 * 75 * standardGravity},
		{"210 cm³/rev", f(ParseDisplacement), 210e-6 / (2 * math.Pi)},
		{"210 cc/rev", f(ParseDisplacement), 210e-6 / (2 * math.Pi)},
		{"320 L/min", f(ParseVolumeFlow), 320e-3 / 60},
		{"50 gal/min", f(ParseVolumeFlow), 50 * 231 * inch * inch * inch / 60},
		{"46 cSt", f(ParseKinematicViscosity), 46e-6},
		{"8.5 t", f(ParseMass), 8500},
		{"45 kN", f(ParseForce), 45e3},
		{"1000 lbf", f(ParseForce), 1000 * poundForce},
		{"1.75 m", f(ParseLength), 1.75},
		{"30 in", f(ParseLength), 0.762},
		{"12 ha", f(ParseArea), 12e4},
		{"215 g/kWh", f(ParseSpecificFuelConsumption), 215e-3 / 3.6e6},
		{"60 °C", f(ParseTemperature), 333.15},
		{"60 degC", f(ParseTemperature), 333.15},
		{"140 °F", f(ParseTemperature), (140 + 459.67) / 1.8},
		{"20 L/h", f(ParseVolumeFlow), 20e-3 / 3600},
		{"3.2 kWh", f(ParseEnergy), 3.2 * 3.6e6},
		{"12 °", f(ParseAngle), 12 * math.Pi / 180},
		{"870 kg/m³", f(ParseDensity), 870},
		{"40 cP", f(ParseDynamicViscosity), 0.04},
		{"0.8 m/s²", f(ParseAcceleration), 0.8},
		{"38 kg/h", f(ParseMassFlow), 38.0 / 3600},
		{"60 L", f(ParseVolume), 0.06},
		{"15 K", f(ParseTemperatureDifference), 15},
	}
	for _, c := range cases {
		got, err := c.got(c.text)
		if err != nil {
			t.Errorf("parse %q: %v", c.text, err)
			continue
		}
		if math.Abs(got-c.want) > 1e-12*math.Abs(c.want) {
			t.Errorf("parse %q = %.17g, want %.17g", c.text, got, c.want)
		}
	}
}

// f adapts a typed parser to a float64 one for the table above.
func f[Q ~float64](p func(string) (Q, error)) func(string) (float64, error) {
	return func(s string) (float64, error) {
		q, err := p(s)
		return float64(q), err
	}
}

func TestParseErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text string
		want error
	}{
		{"", ErrSyntax},
		{"bar", ErrSyntax},
		{"NaN bar", ErrSyntax},
		{"Inf bar", ErrSyntax},
		{"420", ErrUnit},
		{"420 rpm", ErrUnit},
		{"420 BAR", ErrUnit},
		{"1e400 bar", ErrRange},
		{"1e308 MPa", ErrRange},
		{"--1 bar", ErrSyntax},
	}
	for _, c := range cases {
		_, err := ParsePressure(c.text)
		if !errors.Is(err, c.want) {
			t.Errorf("ParsePressure(%q) error = %v, want %v", c.text, err, c.want)
		}
		var pe *ParseError
		if err != nil && (!errors.As(err, &pe) || pe.Text != c.text || pe.Quantity != "pressure") {
			t.Errorf("ParsePressure(%q) error %v does not name the text and quantity", c.text, err)
		}
	}
	if _, err := ParseTemperature("-300 °C"); !errors.Is(err, ErrRange) {
		t.Errorf("ParseTemperature(-300 °C) error = %v, want ErrRange (below absolute zero)", err)
	}
	if _, err := Temperature(-1).MarshalText(); !errors.Is(err, ErrRange) {
		t.Errorf("Temperature(-1).MarshalText error = %v, want ErrRange", err)
	}
	if _, err := Pressure(math.NaN()).MarshalText(); !errors.Is(err, ErrRange) {
		t.Errorf("Pressure(NaN).MarshalText error = %v, want ErrRange", err)
	}
}

func TestJSON(t *testing.T) {
	t.Parallel()
	type config struct {
		Relief Pressure        `json:"relief"`
		Rated  AngularVelocity `json:"rated"`
		Road   Speed           `json:"road"`
		Oil    Temperature     `json:"oil"`
	}
	var c config
	in := `{"relief":"420 bar","rated":"2100 rpm","road":"40 km/h","oil":"60 °C"}`
	if err := json.Unmarshal([]byte(in), &c); err != nil {
		t.Fatal(err)
	}
	want := config{Bar(420), RPM(2100), KMH(40), Celsius(60)}
	if d := cmp.Diff(want, c, testutil.EquateApprox(1e-15, 0)); d != "" {
		t.Errorf("decoded config differs (-want +got):\n%s", d)
	}
	out, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	var back config
	if err := json.Unmarshal(out, &back); err != nil {
		t.Fatal(err)
	}
	if back != c {
		t.Errorf("round trip through %s gave %+v, want %+v", out, back, c)
	}
	if err := json.Unmarshal([]byte(`{"relief":"420 rpm"}`), &c); !errors.Is(err, ErrUnit) {
		t.Errorf("decoding a wrong unit: error %v, want ErrUnit", err)
	}
}

// quantity bundles one quantity type's text functions for the properties below.
type quantity struct {
	name    string
	str     func(float64) string
	marshal func(float64) ([]byte, error)
	parse   func(string) (float64, error)
	min     float64
}

func q[Q interface {
	~float64
	String() string
	MarshalText() ([]byte, error)
}](name string, parse func(string) (Q, error)) quantity {
	return quantity{
		name:    name,
		str:     func(v float64) string { return Q(v).String() },
		marshal: func(v float64) ([]byte, error) { return Q(v).MarshalText() },
		parse:   f(parse),
		min:     math.Inf(-1),
	}
}

var allQuantities = []quantity{
	q("angle", ParseAngle), q("angular velocity", ParseAngularVelocity), q("torque", ParseTorque),
	q("power", ParsePower), q("energy", ParseEnergy), q("pressure", ParsePressure),
	q("displacement", ParseDisplacement), q("volume flow", ParseVolumeFlow), q("volume", ParseVolume),
	q("speed", ParseSpeed), q("acceleration", ParseAcceleration), q("force", ParseForce),
	q("mass", ParseMass), q("length", ParseLength), q("area", ParseArea), q("density", ParseDensity),
	q("dynamic viscosity", ParseDynamicViscosity), q("kinematic viscosity", ParseKinematicViscosity),
	q("temperature difference", ParseTemperatureDifference), q("mass flow", ParseMassFlow),
	q("specific fuel consumption", ParseSpecificFuelConsumption),
	func() quantity { t := q("temperature", ParseTemperature); t.min = 0; return t }(),
}

// Parse(x.MarshalText()) gives back exactly x, and Parse(x.String()) gives x to the six
// significant digits String prints, for every quantity.
func TestTextRoundTrip(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		qi := rapid.IntRange(0, len(allQuantities)-1).Draw(t, "quantity")
		qu := allQuantities[qi]
		exp := rapid.Float64Range(-12, 12).Draw(t, "exponent")
		sign := rapid.SampledFrom([]float64{-1, 1}).Draw(t, "sign")
		v := sign * math.Pow(10, exp)
		if qu.min == 0 {
			v = math.Abs(v)
		}
		b, err := qu.marshal(v)
		if err != nil {
			t.Fatalf("%s: MarshalText(%g): %v", qu.name, v, err)
		}
		got, err := qu.parse(string(b))
		if err != nil || got != v {
			t.Fatalf("%s: parse(%q) = %.17g, %v; want exactly %.17g", qu.name, b, got, err, v)
		}
		s := qu.str(v)
		got, err = qu.parse(s)
		tol := 5e-6 * math.Abs(v)
		if qu.min == 0 {
			tol = 5e-6 * (v + 273.15) // printed in °C: six digits of the Celsius number
		}
		if err != nil || math.Abs(got-v) > tol {
			t.Fatalf("%s: parse(String %q) = %.17g, %v; want %.17g within 6 digits", qu.name, s, got, err, v)
		}
	})
}

// Every constructor and accessor pair round trips within 1e-12 relative.
func TestConstructorRoundTrip(t *testing.T) {
	t.Parallel()
	pairs := map[string]func(float64) float64{
		"Degrees":           func(v float64) float64 { return Degrees(v).Degrees() },
		"Revolutions":       func(v float64) float64 { return Revolutions(v).Revolutions() },
		"RPM":               func(v float64) float64 { return RPM(v).RPM() },
		"PoundFeet":         func(v float64) float64 { return PoundFeet(v).PoundFeet() },
		"KilonewtonMetres":  func(v float64) float64 { return KilonewtonMetres(v).KilonewtonMetres() },
		"Kilowatts":         func(v float64) float64 { return Kilowatts(v).Kilowatts() },
		"Horsepower":        func(v float64) float64 { return Horsepower(v).Horsepower() },
		"MetricHorsepower":  func(v float64) float64 { return MetricHorsepower(v).MetricHorsepower() },
		"KilowattHours":     func(v float64) float64 { return KilowattHours(v).KilowattHours() },
		"Bar":               func(v float64) float64 { return Bar(v).Bar() },
		"PSI":               func(v float64) float64 { return PSI(v).PSI() },
		"Megapascals":       func(v float64) float64 { return Megapascals(v).Megapascals() },
		"CCPerRev":          func(v float64) float64 { return CCPerRev(v).CCPerRev() },
		"LitresPerMinute":   func(v float64) float64 { return LitresPerMinute(v).LitresPerMinute() },
		"GallonsPerMinute":  func(v float64) float64 { return GallonsPerMinute(v).GallonsPerMinute() },
		"LitresPerHour":     func(v float64) float64 { return LitresPerHour(v).LitresPerHour() },
		"Litres":            func(v float64) float64 { return Litres(v).Litres() },
		"KMH":               func(v float64) float64 { return KMH(v).KMH() },
		"MPH":               func(v float64) float64 { return MPH(v).MPH() },
		"StandardGravities": func(v float64) float64 { return StandardGravities(v).StandardGravities() },
		"Kilonewtons":       func(v float64) float64 { return Kilonewtons(v).Kilonewtons() },
		"PoundsForce":       func(v float64) float64 { return PoundsForce(v).PoundsForce() },
		"Tonnes":            func(v float64) float64 { return Tonnes(v).Tonnes() },
		"Pounds":            func(v float64) float64 { return Pounds(v).Pounds() },
		"Millimetres":       func(v float64) float64 { return Millimetres(v).Millimetres() },
		"Inches":            func(v float64) float64 { return Inches(v).Inches() },
		"Miles":             func(v float64) float64 { return Miles(v).Miles() },
		"Hectares":          func(v float64) float64 { return Hectares(v).Hectares() },
		"Centistokes":       func(v float64) float64 { return Centistokes(v).Centistokes() },
		"Centipoise":        func(v float64) float64 { return Centipoise(v).Centipoise() },
		"KilogramsPerHour":  func(v float64) float64 { return KilogramsPerHour(v).KilogramsPerHour() },
		"GramsPerKWh":       func(v float64) float64 { return GramsPerKWh(v).GramsPerKWh() },
		"Celsius":           func(v float64) float64 { return Celsius(v).Celsius() },
		"Fahrenheit":        func(v float64) float64 { return Fahrenheit(v).Fahrenheit() },
	}
	rapid.Check(t, func(t *rapid.T) {
		v := magnitude(t, "value")
		for name, rt := range pairs {
			got := rt(v)
			tol := 1e-12 * math.Abs(v)
			if name == "Celsius" || name == "Fahrenheit" {
				tol = 1e-12 * (math.Abs(v) + 460) // the offset costs absolute, not relative, precision
			}
			if math.Abs(got-v) > tol {
				t.Fatalf("%s round trip of %.17g = %.17g", name, v, got)
			}
		}
	})
}

// The relations agree with each other: for an ideal hydrostatic unit the mechanical power
// T·ω equals the hydraulic power Δp·Q, since T = Δp·D and Q = D·ω.
func TestRelationsConsistent(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		d := CCPerRev(rapid.Float64Range(1, 500).Draw(t, "displacement cm³/rev"))
		w := RPM(magnitude(t, "speed rpm"))
		dp := Bar(magnitude(t, "pressure bar"))
		mech := PowerFromTorque(TorqueFromPressure(dp, d), w)
		hyd := PowerFromFlow(dp, FlowFromDisplacement(d, w))
		if math.Abs(float64(mech-hyd)) > 1e-12*math.Abs(float64(mech))+1e-12 {
			t.Fatalf("T·ω = %v, Δp·Q = %v", mech, hyd)
		}
		{
			if back := SpeedFromFlow(FlowFromDisplacement(d, w), d); math.Abs(float64(back-w)) > 1e-12*math.Abs(float64(w)) {
				t.Fatalf("SpeedFromFlow(FlowFromDisplacement) = %v, want %v", back, w)
			}
			p := PowerFromTorque(TorqueFromPressure(dp, d), w)
			if back := TorqueFromPower(p, w); math.Abs(float64(back-TorqueFromPressure(dp, d))) > 1e-9*math.Abs(float64(back))+1e-12 {
				t.Fatalf("TorqueFromPower = %v, want %v", back, TorqueFromPressure(dp, d))
			}
		}
		{
			if back := PressureFromTorque(TorqueFromPressure(dp, d), d); math.Abs(float64(back-dp)) > 1e-12*math.Abs(float64(dp)) {
				t.Fatalf("PressureFromTorque = %v, want %v", back, dp)
			}
		}
		r := Metres(rapid.Float64Range(0.2, 1.2).Draw(t, "radius m"))
		tq := NewtonMetres(magnitude(t, "torque N·m"))
		v := SpeedFromAngular(w, r)
		p1 := PowerFromTorque(tq, w)
		p2 := PowerFromForce(ForceFromTorque(tq, r), v)
		if math.Abs(float64(p1-p2)) > 1e-12*math.Abs(float64(p1))+1e-9 {
			t.Fatalf("T·ω = %v, F·v = %v", p1, p2)
		}
		if back := AngularFromSpeed(v, r); math.Abs(float64(back-w)) > 1e-12*math.Abs(float64(w))+1e-15 {
			t.Fatalf("AngularFromSpeed(SpeedFromAngular) = %v, want %v", back, w)
		}
	})
}

// magnitude draws a value of either sign between 1e-6 and 1e6 in size, spread
// evenly on a log scale: the physical range of every quantity here.
func magnitude(t *rapid.T, label string) float64 {
	v := math.Pow(10, rapid.Float64Range(-6, 6).Draw(t, label+" (log10)"))
	if rapid.Bool().Draw(t, label+" negative") {
		return -v
	}
	return v
}

func TestString(t *testing.T) {
	t.Parallel()
	cases := []struct {
		got, want string
	}{
		{Bar(420).String(), "420 bar"},
		{RPM(2100).String(), "2100 rpm"},
		{Kilowatts(160).String(), "160 kW"},
		{Watts(12).String(), "12 W"},
		{KMH(40).String(), "40 km/h"},
		{CCPerRev(210).String(), "210 cm³/rev"},
		{Celsius(60).String(), "60 °C"},
		{Kilonewtons(45).String(), "45 kN"},
		{Tonnes(8.5).String(), "8500 kg"},
		{GramsPerKWh(215).String(), "215 g/kWh"},
		{Millimetres(650).String(), "650 mm"},
		{Metres(1.75).String(), "1.75 m"},
		{NewtonMetres(-850).String(), "-850 N·m"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("String() = %q, want %q", c.got, c.want)
		}
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"420 bar", "2100 rpm", "-1.5e3 r/min", "60 °C", "1e400 bar", "NaN bar", "", "°C", "1e", "+.5 kW", "-300 °C"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for _, qu := range allQuantities {
			v, err := qu.parse(s)
			if err != nil {
				var pe *ParseError
				if !errors.As(err, &pe) || pe.Text != s {
					t.Fatalf("%s: parse(%q) error %v is not a *ParseError naming the text", qu.name, s, err)
				}
				continue
			}
			if math.IsNaN(v) || math.IsInf(v, 0) || v < qu.min {
				t.Fatalf("%s: parse(%q) = %v without an error", qu.name, s, v)
			}
			// Round trip: the value's text form parses back to exactly it.
			b, err := qu.marshal(v)
			if err != nil {
				t.Fatalf("%s: MarshalText(%v) of parse(%q): %v", qu.name, v, s, err)
			}
			if w, err := qu.parse(string(b)); err != nil || w != v {
				t.Fatalf("%s: parse(%q) = %.17g, its text %q parses to %.17g, %v", qu.name, s, v, b, w, err)
			}
		}
	})
}
