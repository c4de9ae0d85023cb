package units

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// nistFactors lists conversion factors of NIST Special Publication 811 (2008),
// Appendix B.8 ("Factors for units listed alphabetically"). Each row keeps the
// factor exactly as printed (digit groups and exponent); the test reads the
// expected value and its tolerance from that text. The table prints each factor
// rounded to at most seven significant digits, so the exact factor lies within
// half a unit of the last printed digit: 7.456 999 E+02 W for the horsepower
// allows ±0.000 05 W, and 745.7 W fails. Factors the table prints in boldface
// are exact (the inch, the pound, the standard gravity, the metric prefixes):
// those rows are marked exact and checked to the rounding of a float64.
var nistFactors = []struct {
	row     string  // the unit as the table names it
	printed string  // the factor as printed, with its digit groups
	exact   bool    // printed in boldface (an exact factor)
	got     float64 // the library's value of one such unit, in SI
}{
	// Source: NIST SP 811 (2008), Appendix B.8, row "degree (°)".
	{"degree (°)", "1.745 329 E-02", false, float64(Degrees(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "revolution (r)".
	{"revolution (r)", "6.283 185 E+00", false, float64(Revolutions(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "revolution per minute (rpm) (r/min)".
	{"revolution per minute (rpm) (r/min)", "1.047 198 E-01", false, float64(RPM(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force foot (lbf · ft)".
	{"pound-force foot (lbf · ft)", "1.355 818 E+00", false, float64(PoundFeet(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "horsepower (550 ft · lbf/s)".
	{"horsepower (550 ft · lbf/s)", "7.456 999 E+02", false, float64(Horsepower(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "horsepower, metric".
	{"horsepower, metric", "7.354 988 E+02", false, float64(MetricHorsepower(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot pound-force per second (ft · lbf/s)",
	// here through the horsepower's definition 1 hp = 550 ft · lbf/s.
	{"foot pound-force per second (ft · lbf/s)", "1.355 818 E+00", false, float64(Horsepower(1)) / 550},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilowatt hour (kW · h)".
	{"kilowatt hour (kW · h)", "3.6 E+06", true, float64(KilowattHours(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "bar (bar)".
	{"bar (bar)", "1.0 E+05", true, float64(Bar(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force per square inch (psi) (lbf/in²)".
	{"pound-force per square inch (psi) (lbf/in²)", "6.894 757 E+03", false, float64(PSI(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter per minute (L/min)"
	// is not printed; the row "liter (L)" (exact) divided by 60 s.
	{"liter (L) per 60 s", "1.666 667 E-05", false, float64(LitresPerMinute(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon (U.S.) per minute (gpm) (gal/min)".
	{"gallon (U.S.) per minute (gpm) (gal/min)", "6.309 020 E-05", false, float64(GallonsPerMinute(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon [U.S.] per hour (gal/h)",
	// through the library's gallon over 3600 s.
	{"gallon [U.S.] per hour (gal/h)", "1.051 503 E-06", false, float64(Gallons(1)) / 3600},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter (L)".
	{"liter (L)", "1.0 E-03", true, float64(Litres(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "liter (L)", through litres per hour.
	{"liter (L) per hour × 3600 s", "1.0 E-03", true, float64(LitresPerHour(3600))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "gallon [U.S. liquid (gal)]".
	{"gallon [U.S. liquid (gal)]", "3.785 412 E-03", false, float64(Gallons(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilometer per hour (km/h)".
	{"kilometer per hour (km/h)", "2.777 778 E-01", false, float64(KMH(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "mile per hour (mi/h)".
	{"mile per hour (mi/h)", "4.4704 E-01", true, float64(MPH(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot per minute (ft/min)".
	{"foot per minute (ft/min)", "5.08 E-03", true, float64(Feet(1)) / 60},
	// Source: NIST SP 811 (2008), Appendix B.8, row "standard acceleration of gravity (gn)".
	{"standard acceleration of gravity (gn)", "9.806 65 E+00", true, float64(StandardGravities(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "kilogram-force meter (kgf · m)".
	{"kilogram-force meter (kgf · m)", "9.806 65 E+00", true, float64(ForceFromMass(Kilograms(1), Gravity)) * float64(Metres(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force (lbf)".
	{"pound-force (lbf)", "4.448 222 E+00", false, float64(PoundsForce(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "ton, metric (t)".
	{"ton, metric (t)", "1.0 E+03", true, float64(Tonnes(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound (avoirdupois) (lb)".
	{"pound (avoirdupois) (lb)", "4.535 924 E-01", false, float64(Pounds(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound per hour (lb/h)".
	{"pound per hour (lb/h)", "1.259 979 E-04", false, float64(Pounds(1)) / 3600},
	// Source: NIST SP 811 (2008), Appendix B.8, row "inch (in)".
	{"inch (in)", "2.54 E-02", true, float64(Inches(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "foot (ft)".
	{"foot (ft)", "3.048 E-01", true, float64(Feet(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "mile (mi)".
	{"mile (mi)", "1.609 344 E+03", true, float64(Miles(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "hectare (ha)".
	{"hectare (ha)", "1.0 E+04", true, float64(Hectares(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "centipoise (cP)".
	{"centipoise (cP)", "1.0 E-03", true, float64(Centipoise(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "poise (P)", through 100 cP.
	{"poise (P)", "1.0 E-01", true, float64(Centipoise(100))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "centistokes (cSt)".
	{"centistokes (cSt)", "1.0 E-06", true, float64(Centistokes(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "stokes (St)", through 100 cSt.
	{"stokes (St)", "1.0 E-04", true, float64(Centistokes(100))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "degree Fahrenheit (°F) [temperature interval]".
	{"degree Fahrenheit (°F) [temperature interval]", "5.555 556 E-01", false, float64(FahrenheitDifference(1))},
	// Source: NIST SP 811 (2008), Appendix B.8, row "pound-force per square inch (psi) (lbf/in²)",
	// here through 1 psi = 1 lbf / 1 in² from the library's pound-force and inch.
	{"psi as lbf / in²", "6.894 757 E+03", false, float64(PoundsForce(1)) / (float64(Inches(1)) * float64(Inches(1)))},
}

// printedFactor reads a factor printed as NIST SP 811 prints it ("7.456 999 E+02")
// and returns its value and half a unit of its last printed digit.
func printedFactor(tb testing.TB, s string) (value, halfULP float64) {
	tb.Helper()
	mant, exp, ok := strings.Cut(s, " E")
	if !ok {
		tb.Fatalf("printed factor %q: no exponent", s)
	}
	mant = strings.ReplaceAll(mant, " ", "")
	e, err := strconv.Atoi(exp)
	if err != nil {
		tb.Fatalf("printed factor %q: %v", s, err)
	}
	value, err = strconv.ParseFloat(mant+"e"+strconv.Itoa(e), 64)
	if err != nil {
		tb.Fatalf("printed factor %q: %v", s, err)
	}
	decimals := 0
	if _, frac, ok := strings.Cut(mant, "."); ok {
		decimals = len(frac)
	}
	return value, 0.5 * math.Pow(10, float64(e-decimals))
}

func TestPrintedFactor(t *testing.T) {
	t.Parallel()
	// Hand reading: 7.456 999 E+02 = 745.6999, last digit 1e-4, half 5e-5.
	v, h := printedFactor(t, "7.456 999 E+02")
	if v != 745.6999 || math.Abs(h-5e-5) > 1e-18 {
		t.Errorf("printedFactor(7.456 999 E+02) = %v, %v, want 745.6999, 5e-05", v, h)
	}
	// 745.7 W, the rounded horsepower, lies outside that half unit.
	if math.Abs(745.7-v) <= h {
		t.Errorf("745.7 W passes as the printed horsepower factor")
	}
}

func TestNISTFactors(t *testing.T) {
	t.Parallel()
	seen := map[string]bool{}
	for _, c := range nistFactors {
		if seen[c.row] {
			t.Errorf("row %q listed twice", c.row)
		}
		seen[c.row] = true
		want, tol := printedFactor(t, c.printed)
		if c.exact {
			tol = 4e-16 * math.Abs(want) // exact factor: a float64 rounding or two
		}
		if d := math.Abs(c.got - want); d > tol {
			t.Errorf("%s: factor = %.12g, want %s (difference %.3g, allowed %.3g)", c.row, c.got, c.printed, d, tol)
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
