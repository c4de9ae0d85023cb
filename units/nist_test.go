package units

import (
	"math"
	"testing"
)

// nistFactors lists the conversion factors of NIST Special Publication 811 (2008),
// Appendix B.8/B.9 ("Factors for units listed alphabetically/by kind of quantity"),
// each quoted with the row it comes from. The table gives seven significant digits,
// so each constant here is checked to within half a unit in the seventh digit.
var nistFactors = []struct {
	row  string
	got  float64
	want float64
}{
	// Source: NIST SP 811 (2008), Appendix B.8, row "degree (°): 1.745 329 E-02 rad".
	{"degree (°): 1.745 329 E-02 rad", float64(Degrees(1)), 1.745329e-02},
	// Source: NIST SP 811 (2008), Appendix B.8, row "revolution (r): 6.283 185 E+00 rad".
	{"revolution (r): 6.283 185 E+00 rad", float64(Revolutions(1)), 6.283185e+00},
	// Source: NIST SP 811 (2008), Appendix B.8, row "revolution per minute (rpm) (r/min): 1.047 198 E-01 rad/s".
	{"revolution per minute (rpm) (r/min): 1.047 198 E-01 rad/s", float64(RPM(1)), 1.047198e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force foot (lbf · ft): 1.355 818 E+00 N · m".
	{"pound-force foot (lbf · ft): 1.355 818 E+00 N · m", float64(PoundFeet(1)), 1.355818e+00},
	// Source: NIST SP 811 (2008), Appendix B.8, row "horsepower (550 ft · lbf/s): 7.456 999 E+02 W".
	{"horsepower (550 ft · lbf/s): 7.456 999 E+02 W", float64(Horsepower(1)), 7.456999e+02},
	// Source: NIST SP 811 (2008), Appendix B.8, row "horsepower, metric: 7.354 988 E+02 W".
	{"horsepower, metric: 7.354 988 E+02 W", float64(MetricHorsepower(1)), 7.354988e+02},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilowatt hour (kW · h): 3.6 E+06 J".
	{"kilowatt hour (kW · h): 3.6 E+06 J", float64(KilowattHours(1)), 3.6e+06},
	// Source: NIST SP 811 (2008), Appendix B.8, row "bar (bar): 1.0 E+05 Pa".
	{"bar (bar): 1.0 E+05 Pa", float64(Bar(1)), 1.0e+05},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force per square inch (psi) (lbf/in²): 6.894 757 E+03 Pa".
	{"pound-force per square inch (psi) (lbf/in²): 6.894 757 E+03 Pa", float64(PSI(1)), 6.894757e+03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter per minute: 1.666 667 E-05 m³/s (litre: 1.0 E-03 m³)".
	{"liter per minute: 1.666 667 E-05 m³/s (litre: 1.0 E-03 m³)", float64(LitresPerMinute(1)), 1.666667e-05},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon (U.S.) per minute (gpm) (gal/min): 6.309 020 E-05 m³/s".
	{"gallon (U.S.) per minute (gpm) (gal/min): 6.309 020 E-05 m³/s", float64(GallonsPerMinute(1)), 6.309020e-05},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter (L): 1.0 E-03 m³".
	{"liter (L): 1.0 E-03 m³", float64(Litres(1)), 1.0e-03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon [U.S. liquid (gal)]: 3.785 412 E-03 m³".
	{"gallon [U.S. liquid (gal)]: 3.785 412 E-03 m³", float64(Gallons(1)), 3.785412e-03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilometer per hour (km/h): 2.777 778 E-01 m/s".
	{"kilometer per hour (km/h): 2.777 778 E-01 m/s", float64(KMH(1)), 2.777778e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "mile per hour (mi/h): 4.4704 E-01 m/s".
	{"mile per hour (mi/h): 4.4704 E-01 m/s", float64(MPH(1)), 4.4704e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "standard acceleration of gravity (gn): 9.806 65 E+00 m/s²".
	{"standard acceleration of gravity (gn): 9.806 65 E+00 m/s²", float64(StandardGravities(1)), 9.80665e+00},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force (lbf): 4.448 222 E+00 N".
	{"pound-force (lbf): 4.448 222 E+00 N", float64(PoundsForce(1)), 4.448222e+00},
	// Source: NIST SP 811 (2008), Appendix B.8, row "ton, metric (t): 1.0 E+03 kg".
	{"ton, metric (t): 1.0 E+03 kg", float64(Tonnes(1)), 1.0e+03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound (avoirdupois) (lb): 4.535 924 E-01 kg".
	{"pound (avoirdupois) (lb): 4.535 924 E-01 kg", float64(Pounds(1)), 4.535924e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "inch (in): 2.54 E-02 m".
	{"inch (in): 2.54 E-02 m", float64(Inches(1)), 2.54e-02},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot (ft): 3.048 E-01 m".
	{"foot (ft): 3.048 E-01 m", float64(Feet(1)), 3.048e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "mile (mi): 1.609 344 E+03 m".
	{"mile (mi): 1.609 344 E+03 m", float64(Miles(1)), 1.609344e+03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "hectare (ha): 1.0 E+04 m²".
	{"hectare (ha): 1.0 E+04 m²", float64(Hectares(1)), 1.0e+04},
	// Source: NIST SP 811 (2008), Appendix B.8, row "centipoise (cP): 1.0 E-03 Pa · s".
	{"centipoise (cP): 1.0 E-03 Pa · s", float64(Centipoise(1)), 1.0e-03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "centistokes (cSt): 1.0 E-06 m²/s".
	{"centistokes (cSt): 1.0 E-06 m²/s", float64(Centistokes(1)), 1.0e-06},
	// Source: NIST SP 811 (2008), Appendix B.8, row "degree Fahrenheit (°F) [temperature interval]: 5.555 556 E-01 K".
	{"degree Fahrenheit (°F) [temperature interval]: 5.555 556 E-01 K", float64(FahrenheitDifference(1)), 5.555556e-01},
}

// Rows of NIST SP 811 (2008), Appendix B.8, for units without a generated row above.
var nistExtra = []struct {
	row  string
	got  float64
	want float64
}{
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force foot (lbf · ft): 1.355 818 E+00 N · m".
	{"pound-force foot (lbf · ft)", float64(PoundFeet(1)), 1.355818},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot per minute: 5.08 E-03 m/s" (checks foot/60).
	{"foot per minute", float64(Feet(1)) / 60, 5.08e-03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilogram-force meter (kgf · m): 9.806 65 E+00 N · m".
	{"kilogram-force meter (kgf · m)", float64(ForceFromMass(Kilograms(1), Gravity)) * float64(Metres(1)), 9.80665},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon [U.S. liquid] per hour: 1.051 503 E-06 m³/s".
	{"gallon (U.S.) per hour", float64(Gallons(1)) / 3600, 1.051503e-06},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter (L): 1.0 E-03 m³" via L/h.
	{"liter per hour", float64(LitresPerHour(3600)), 1.0e-03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "poise (P): 1.0 E-01 Pa · s" (1 cP = 0.01 P).
	{"poise (P)", float64(Centipoise(100)), 1.0e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "stokes (St): 1.0 E-04 m²/s" (1 cSt = 0.01 St).
	{"stokes (St)", float64(Centistokes(100)), 1.0e-04},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound per hour (lb/h): 1.259 979 E-04 kg/s".
	{"pound per hour (lb/h)", float64(Pounds(1)) / 3600, 1.259979e-04},
	// Source: NIST SP 811 (2008), Appendix B.8, row "ton, metric, per hour"
	// is not listed; row "pound per hour (lb/h)" above checks the hour; this row checks g/h.
	{"gram per hour", float64(GramsPerHour(3.6e6)), 1.0},
	// Source: NIST SP 811 (2008), Appendix B.8, row "degree Fahrenheit (°F) [temperature interval]:
	// 5.555 556 E-01 K".
	{"degree Fahrenheit interval", float64(FahrenheitDifference(1)), 5.555556e-01},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force per square inch (psi): 6.894 757 E+03 Pa",
	// via 1 psi = 1 lbf / 1 in².
	{"psi from lbf and in", float64(PoundsForce(1)) / (float64(Inches(1)) * float64(Inches(1))), 6.894757e03},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot pound-force per second (ft · lbf/s):
	// 1.355 818 E+00 W".
	{"foot pound-force per second", float64(Horsepower(1)) / 550, 1.355818},
}

func TestNISTFactors(t *testing.T) {
	t.Parallel()
	for _, c := range append(nistFactors, nistExtra...) {
		// NIST prints seven significant digits: the exact factor lies within half a unit of
		// the seventh digit of the printed one.
		if rel := math.Abs(c.got-c.want) / math.Abs(c.want); rel > 5e-7 {
			t.Errorf("%s: factor = %.10g, want %.7g (relative difference %.2g)", c.row, c.got, c.want, rel)
		}
	}
}

// Source: NIST SP 811 (2008), Section 4.2.1.1 and Appendix B.9 ("thermodynamic temperature"):
// T/K = t/°C + 273.15 and T/K = (t/°F + 459.67)/1.8.
func TestTemperatureScales(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		got  Temperature
		want float64 // kelvins
	}{
		{"0 °C", Celsius(0), 273.15},
		{"100 °C", Celsius(100), 373.15},
		{"32 °F", Fahrenheit(32), 273.15},
		{"212 °F", Fahrenheit(212), 373.15},
		{"-40 °F", Fahrenheit(-40), 233.15},
		{"0 K", Kelvin(0), 0},
	}
	for _, c := range cases {
		if math.Abs(float64(c.got)-c.want) > 1e-12 {
			t.Errorf("%s = %.15g K, want %.15g K", c.name, float64(c.got), c.want)
		}
	}
	if d := Celsius(60).Sub(Celsius(40)); math.Abs(float64(d)-20) > 1e-12 {
		t.Errorf("Celsius(60).Sub(Celsius(40)) = %v, want 20 K", d)
	}
	if got := Celsius(40).Add(KelvinDifference(20)).Celsius(); math.Abs(got-60) > 1e-12 {
		t.Errorf("Celsius(40).Add(20 K) = %v °C, want 60 °C", got)
	}
}
