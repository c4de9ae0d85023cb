package units

import (
	"encoding"
	"errors"
	"math"
	"testing"
	"time"
)

// TestScaleFactors checks every constructor against its factor to the SI
// unit, written out by hand (metric prefixes; 1 rev = 2π rad; 1 h = 3600 s;
// 1 L = 10⁻³ m³; the customary factors from NIST SP 811 are checked in
// TestNISTFactors), and that the matching accessor reads one unit back.
func TestScaleFactors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name     string
		si       float64 // constructor(1) in SI
		want     float64 // hand factor
		accessor float64 // accessor of the SI value want (must be 1)
	}{
		{"Radians", float64(Radians(1)), 1, Angle(1).Radians()},
		{"RadPerSec", float64(RadPerSec(1)), 1, AngularVelocity(1).RadPerSec()},
		{"NewtonMetres", float64(NewtonMetres(1)), 1, Torque(1).NewtonMetres()},
		{"Watts", float64(Watts(1)), 1, Power(1).Watts()},
		{"Megawatts", float64(Megawatts(1)), 1e6, Power(1e6).Megawatts()},
		{"Joules", float64(Joules(1)), 1, Energy(1).Joules()},
		{"Kilojoules", float64(Kilojoules(1)), 1e3, Energy(1e3).Kilojoules()},
		{"Megajoules", float64(Megajoules(1)), 1e6, Energy(1e6).Megajoules()},
		{"Pascals", float64(Pascals(1)), 1, Pressure(1).Pascals()},
		{"Kilopascals", float64(Kilopascals(1)), 1e3, Pressure(1e3).Kilopascals()},
		{"CubicMetresPerRadian", float64(CubicMetresPerRadian(1)), 1, Displacement(1).CubicMetresPerRadian()},
		{"LitresPerRev", float64(LitresPerRev(1)), 1e-3 / (2 * math.Pi), Displacement(1e-3 / (2 * math.Pi)).LitresPerRev()},
		{"CubicMetresPerSecond", float64(CubicMetresPerSecond(1)), 1, VolumeFlow(1).CubicMetresPerSecond()},
		{"CubicMetres", float64(CubicMetres(1)), 1, Volume(1).CubicMetres()},
		{"CubicCentimetres", float64(CubicCentimetres(1)), 1e-6, Volume(1e-6).CubicCentimetres()},
		{"Gallons", float64(Gallons(1)), 231 * 0.0254 * 0.0254 * 0.0254, Volume(231 * 0.0254 * 0.0254 * 0.0254).Gallons()},
		{"MetresPerSecond", float64(MetresPerSecond(1)), 1, Speed(1).MetresPerSecond()},
		{"MetresPerSecondSquared", float64(MetresPerSecondSquared(1)), 1, Acceleration(1).MetresPerSecondSquared()},
		{"Newtons", float64(Newtons(1)), 1, Force(1).Newtons()},
		{"Kilograms", float64(Kilograms(1)), 1, Mass(1).Kilograms()},
		{"Grams", float64(Grams(1)), 1e-3, Mass(1e-3).Grams()},
		{"Metres", float64(Metres(1)), 1, Length(1).Metres()},
		{"Centimetres", float64(Centimetres(1)), 1e-2, Length(1e-2).Centimetres()},
		{"Kilometres", float64(Kilometres(1)), 1e3, Length(1e3).Kilometres()},
		{"Feet", float64(Feet(1)), 0.3048, Length(0.3048).Feet()},
		{"SquareMetres", float64(SquareMetres(1)), 1, Area(1).SquareMetres()},
		{"SquareCentimetres", float64(SquareCentimetres(1)), 1e-4, Area(1e-4).SquareCentimetres()},
		{"KilogramsPerCubicMetre", float64(KilogramsPerCubicMetre(1)), 1, Density(1).KilogramsPerCubicMetre()},
		{"KilogramsPerLitre", float64(KilogramsPerLitre(1)), 1e3, Density(1e3).KilogramsPerLitre()},
		{"PascalSeconds", float64(PascalSeconds(1)), 1, DynamicViscosity(1).PascalSeconds()},
		{"SquareMetresPerSecond", float64(SquareMetresPerSecond(1)), 1, KinematicViscosity(1).SquareMetresPerSecond()},
		{"KelvinDifference", float64(KelvinDifference(1)), 1, TemperatureDifference(1).KelvinDifference()},
		{"FahrenheitDifference", float64(FahrenheitDifference(1)), 1 / 1.8, TemperatureDifference(1 / 1.8).FahrenheitDifference()},
		{"KilogramsPerSecond", float64(KilogramsPerSecond(1)), 1, MassFlow(1).KilogramsPerSecond()},
		{"GramsPerHour", float64(GramsPerHour(1)), 1e-3 / 3600, MassFlow(1e-3 / 3600).GramsPerHour()},
		{"KilogramsPerJoule", float64(KilogramsPerJoule(1)), 1, SpecificFuelConsumption(1).KilogramsPerJoule()},
		{"Kelvin", float64(Kelvin(1)), 1, Temperature(1).Kelvin()},
	}
	for _, c := range cases {
		if math.Abs(c.si-c.want) > 1e-15*c.want {
			t.Errorf("%s(1) = %.17g SI, want %.17g", c.name, c.si, c.want)
		}
		if math.Abs(c.accessor-1) > 1e-15 {
			t.Errorf("%s accessor of %.17g SI = %.17g, want 1", c.name, c.want, c.accessor)
		}
	}
}

// TestRelationsByHand checks the named relations on hand-computed values.
func TestRelationsByHand(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name      string
		got, want float64
	}{
		// 10 kW at 2 m/s: 10 000/2 = 5000 N.
		{"ForceFromPower", float64(ForceFromPower(Kilowatts(10), MetresPerSecond(2))), 5000},
		// 1000 N on a 0.5 m arm: 500 N·m.
		{"TorqueFromForce", float64(TorqueFromForce(Newtons(1000), Metres(0.5))), 500},
		// 1 kW for 1 h: 3.6 MJ.
		{"EnergyFromPower", float64(EnergyFromPower(Kilowatts(1), time.Hour)), 3.6e6},
		// 200 g/kWh at 100 kW: 20 kg/h = 20/3600 kg/s.
		{"FuelFromPower", float64(FuelFromPower(GramsPerKWh(200), Kilowatts(100))), 20.0 / 3600},
		// 2 m³ at 850 kg/m³: 1700 kg.
		{"MassFromVolume", float64(MassFromVolume(CubicMetres(2), KilogramsPerCubicMetre(850))), 1700},
		// 36 L/h at 0.835 kg/L: 30.06 kg/h = 0.00835 kg/s.
		{"MassFlowFromVolumeFlow", float64(MassFlowFromVolumeFlow(LitresPerHour(36), KilogramsPerLitre(0.835))), 0.00835},
		// 0.00835 kg/s at 835 kg/m³: 1e-5 m³/s.
		{"VolumeFlowFromMassFlow", float64(VolumeFlowFromMassFlow(KilogramsPerSecond(0.00835), KilogramsPerCubicMetre(835))), 1e-5},
		// 0.04 Pa·s at 800 kg/m³: 5e-5 m²/s (50 cSt).
		{"KinematicFromDynamic", float64(KinematicFromDynamic(PascalSeconds(0.04), KilogramsPerCubicMetre(800))), 5e-5},
		// 50 cSt at 800 kg/m³: 0.04 Pa·s.
		{"DynamicFromKinematic", float64(DynamicFromKinematic(Centistokes(50), KilogramsPerCubicMetre(800))), 0.04},
	}
	for _, c := range cases {
		if math.Abs(c.got-c.want) > 1e-12*math.Abs(c.want) {
			t.Errorf("%s = %.15g, want %.15g", c.name, c.got, c.want)
		}
	}
}

// textQuantity is a quantity with a text form.
type textQuantity interface {
	comparable
	encoding.TextMarshaler
	String() string
}

// roundTrip checks that v's MarshalText parses back to exactly v through
// UnmarshalText, and that String gives the text want.
func roundTrip[Q textQuantity, P interface {
	*Q
	encoding.TextUnmarshaler
}](t *testing.T, v Q, want string) {
	t.Helper()
	b, err := v.MarshalText()
	if err != nil {
		t.Fatalf("%T(%v).MarshalText: %v", v, v, err)
	}
	var back Q
	if err := P(&back).UnmarshalText(b); err != nil || back != v {
		t.Errorf("%T: UnmarshalText(%q) = %v, %v; want exactly %v", v, b, back, err, v)
	}
	if got := v.String(); got != want {
		t.Errorf("%T String() = %q, want %q", v, got, want)
	}
	if err := P(&back).UnmarshalText([]byte("12 parsecs")); err == nil {
		t.Errorf("%T: UnmarshalText of a foreign unit succeeded", v)
	}
}

func TestTextRoundTripEveryType(t *testing.T) {
	t.Parallel()
	roundTrip(t, Degrees(30), "30 °")
	roundTrip(t, RPM(2100), "2100 rpm")
	roundTrip(t, NewtonMetres(850), "850 N·m")
	roundTrip(t, Kilowatts(160), "160 kW")
	roundTrip(t, Megajoules(3.6), "3.6 MJ")
	roundTrip(t, Bar(420), "420 bar")
	roundTrip(t, CCPerRev(110), "110 cm³/rev")
	roundTrip(t, LitresPerMinute(90), "90 L/min")
	roundTrip(t, Litres(40), "40 L")
	roundTrip(t, KMH(40), "40 km/h")
	roundTrip(t, MetresPerSecondSquared(0.5), "0.5 m/s²")
	roundTrip(t, Kilonewtons(25), "25 kN")
	roundTrip(t, Kilograms(8500), "8500 kg")
	roundTrip(t, Metres(1.75), "1.75 m")
	roundTrip(t, SquareMetres(4), "4 m²")
	roundTrip(t, KilogramsPerCubicMetre(870), "870 kg/m³")
	roundTrip(t, Centipoise(40), "40 cP")
	roundTrip(t, Centistokes(46), "46 cSt")
	roundTrip(t, Celsius(60), "60 °C")
	roundTrip(t, KelvinDifference(20), "20 K")
	roundTrip(t, KilogramsPerHour(30), "30 kg/h")
	roundTrip(t, GramsPerKWh(215), "215 g/kWh")
}

func TestMeasure(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		m    Measure
		kind Kind
		text string
	}{
		{Of(Bar(420)), PressureKind, "420 bar"},
		{Of(RPM(2100)), AngularVelocityKind, "2100 rpm"},
		{Of(CCPerRev(-75)), DisplacementKind, "-75 cm³/rev"},
		{Of(Kilonewtons(12.5)), ForceKind, "12.5 kN"},
		{Of(Celsius(60)), TemperatureKind, "60 °C"},
		{Of(0.95), Number, "0.95"},
		{Plain(0.95), Number, "0.95"},
		{Measure{}, Number, "0"},
	} {
		if c.m.Kind != c.kind || c.m.String() != c.text {
			t.Errorf("Measure %+v: kind %v, text %q; want %v, %q", c.m, c.m.Kind, c.m.String(), c.kind, c.text)
		}
		if got := string(c.m.Append([]byte("x="))); got != "x="+c.text {
			t.Errorf("Append = %q, want %q", got, "x="+c.text)
		}
	}
	// Every quantity type maps to its own kind, named after the quantity.
	kinds := []Measure{Of(Degrees(1)), Of(RPM(1)), Of(NewtonMetres(1)), Of(Watts(1)), Of(Joules(1)), Of(Bar(1)),
		Of(CCPerRev(1)), Of(LitresPerMinute(1)), Of(Litres(1)), Of(KMH(1)), Of(MetresPerSecondSquared(1)), Of(Newtons(1)),
		Of(Kilograms(1)), Of(Metres(1)), Of(SquareMetres(1)), Of(KilogramsPerCubicMetre(1)), Of(Centipoise(1)),
		Of(Centistokes(1)), Of(Celsius(1)), Of(KelvinDifference(1)), Of(KilogramsPerHour(1)), Of(GramsPerKWh(1))}
	seen := map[Kind]bool{}
	for _, m := range kinds {
		if m.Kind == Number || seen[m.Kind] || m.Kind.String() == "" || m.Kind.String() == "number" {
			t.Errorf("%v: kind %d (%q) not its own", m, m.Kind, m.Kind.String())
		}
		seen[m.Kind] = true
	}
	if got := PressureKind.String(); got != "pressure" {
		t.Errorf("PressureKind = %q", got)
	}
	if got := Number.String(); got != "number" {
		t.Errorf("Number = %q", got)
	}
	if got := Kind(99).String(); got != "Kind(99)" {
		t.Errorf("Kind(99) = %q", got)
	}
	if got := (Measure{SI: 1, Kind: 99}).String(); got != "1" {
		t.Errorf("unknown kind prints %q, want the plain number", got)
	}
	// As reads a measure back as its own type only.
	if p, ok := As[Pressure](Of(Bar(420))); !ok || p != Bar(420) {
		t.Errorf("As[Pressure] = %v, %v", p, ok)
	}
	if _, ok := As[Torque](Of(Bar(420))); ok {
		t.Errorf("As[Torque] of a pressure reports ok")
	}
	if v, ok := As[float64](Plain(0.5)); !ok || v != 0.5 {
		t.Errorf("As[float64] = %v, %v", v, ok)
	}
	// Sub and Abs keep the kind: a limit minus a value.
	left := Of(Bar(420)).Sub(Of(Bar(450)))
	if left.Kind != PressureKind || math.Abs(left.SI-float64(Bar(-30))) > 1e-9 || left.Abs().SI != -left.SI || left.Abs().Kind != PressureKind {
		t.Errorf("420 bar − 450 bar = %+v, |·| = %+v", left, left.Abs())
	}
}

// TestParseEveryUnit: "2 <unit>" parses, for every unit of every quantity's
// text table and each of its spellings, to the value the matching
// constructor gives (the constructors carry their own factors, checked in
// TestScaleFactors and TestNISTFactors), and every unit of the tables is
// listed here.
func TestParseEveryUnit(t *testing.T) {
	t.Parallel()
	want := map[string]float64{
		"angle|rad": 2, "angle|°": float64(Degrees(2)), "angle|rev": float64(Revolutions(2)),
		"angular velocity|rad/s": 2, "angular velocity|rpm": float64(RPM(2)),
		"torque|N·m": 2, "torque|kN·m": float64(KilonewtonMetres(2)), "torque|lbf·ft": float64(PoundFeet(2)),
		"power|W": 2, "power|kW": float64(Kilowatts(2)), "power|MW": float64(Megawatts(2)), "power|hp": float64(Horsepower(2)),
		"power|PS": float64(MetricHorsepower(2)),
		"energy|J": 2, "energy|kJ": float64(Kilojoules(2)), "energy|MJ": float64(Megajoules(2)), "energy|kWh": float64(KilowattHours(2)),
		"pressure|Pa": 2, "pressure|kPa": float64(Kilopascals(2)), "pressure|MPa": float64(Megapascals(2)), "pressure|bar": float64(Bar(2)),
		"pressure|psi":        float64(PSI(2)),
		"displacement|m³/rad": 2, "displacement|cm³/rev": float64(CCPerRev(2)), "displacement|L/rev": float64(LitresPerRev(2)),
		"volume flow|m³/s": 2, "volume flow|L/min": float64(LitresPerMinute(2)), "volume flow|L/h": float64(LitresPerHour(2)),
		"volume flow|gal/min": float64(GallonsPerMinute(2)),
		"volume|m³":           2, "volume|L": float64(Litres(2)), "volume|cm³": float64(CubicCentimetres(2)), "volume|gal": float64(Gallons(2)),
		"speed|m/s": 2, "speed|km/h": float64(KMH(2)), "speed|mph": float64(MPH(2)),
		"acceleration|m/s²": 2, "acceleration|g": float64(StandardGravities(2)),
		"force|N": 2, "force|kN": float64(Kilonewtons(2)), "force|lbf": float64(PoundsForce(2)),
		"mass|kg": 2, "mass|t": float64(Tonnes(2)), "mass|lb": float64(Pounds(2)), "mass|g": float64(Grams(2)),
		"length|m": 2, "length|mm": float64(Millimetres(2)), "length|cm": float64(Centimetres(2)), "length|km": float64(Kilometres(2)),
		"length|in": float64(Inches(2)), "length|ft": float64(Feet(2)), "length|mi": float64(Miles(2)),
		"area|m²": 2, "area|ha": float64(Hectares(2)), "area|cm²": float64(SquareCentimetres(2)),
		"density|kg/m³": 2, "density|kg/L": float64(KilogramsPerLitre(2)),
		"dynamic viscosity|Pa·s": 2, "dynamic viscosity|cP": float64(Centipoise(2)),
		"kinematic viscosity|m²/s": 2, "kinematic viscosity|cSt": float64(Centistokes(2)),
		"temperature|K": 2, "temperature|°C": float64(Celsius(2)), "temperature|°F": float64(Fahrenheit(2)),
		"temperature difference|K": 2, "temperature difference|°F": float64(FahrenheitDifference(2)),
		"mass flow|kg/s": 2, "mass flow|kg/h": float64(KilogramsPerHour(2)), "mass flow|g/h": float64(GramsPerHour(2)),
		"specific fuel consumption|kg/J": 2, "specific fuel consumption|g/kWh": float64(GramsPerKWh(2)),
	}
	parsers := map[string]func(string) (float64, error){}
	for _, q := range allQuantities {
		parsers[q.name] = q.parse
	}
	seen := 0
	for k := Kind(1); k < numKinds; k++ {
		tb := kindTables[k]
		parse, ok := parsers[tb.quantity]
		if !ok {
			t.Errorf("no parser for %s", tb.quantity)
			continue
		}
		for _, u := range tb.units {
			key := tb.quantity + "|" + u.symbols[0]
			w, ok := want[key]
			if !ok {
				t.Errorf("unit %s is not checked here", key)
				continue
			}
			seen++
			for _, sym := range u.symbols {
				got, err := parse("2 " + sym)
				if err != nil || math.Abs(got-w) > 1e-15*math.Abs(w) {
					t.Errorf("%s: parse(%q) = %.17g, %v; want %.17g", tb.quantity, "2 "+sym, got, err, w)
				}
			}
		}
	}
	if seen != len(want) {
		t.Errorf("%d units checked, %d listed: a listed unit is in no table", seen, len(want))
	}
	// The display unit follows the size: below 1 kW in W, then kW, then MW.
	for _, c := range []struct {
		p    Power
		want string
	}{{Watts(500), "500 W"}, {Watts(999), "999 W"}, {Kilowatts(1), "1 kW"}, {Kilowatts(999), "999 kW"}, {Megawatts(2), "2 MW"}} {
		if got := c.p.String(); got != c.want {
			t.Errorf("%v W prints %q, want %q", float64(c.p), got, c.want)
		}
	}
}

func TestMarshalNonFinite(t *testing.T) {
	t.Parallel()
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		_, err := Pressure(v).MarshalText()
		var pe *ParseError
		if !errors.As(err, &pe) || !errors.Is(err, ErrRange) || pe.Quantity != "pressure" {
			t.Errorf("Pressure(%v).MarshalText() error = %v, want a *ParseError with ErrRange", v, err)
		}
	}
	// The message names the quantity and the text, with or without a cause
	// (a cause from outside the package keeps its own prefix).
	if got := (&ParseError{Quantity: "speed", Text: "fast"}).Error(); got != `units: parsing speed "fast"` {
		t.Errorf("message without cause = %q", got)
	}
	if got := (&ParseError{Quantity: "speed", Text: "fast", Err: errors.New("io: short")}).Error(); got != `units: parsing speed "fast": io: short` {
		t.Errorf("message with a foreign cause = %q", got)
	}
}
