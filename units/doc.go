// Package units provides the typed physical quantities that every powersplit
// signature uses.
//
// Each quantity is a float64 holding its value in SI units, in the style of
// time.Duration: the type says what the number is, constructors take the
// units engineers type, accessors give them back, and String prints a
// sensible unit.
//
//	relief := units.Bar(420)           // Pressure, stored as 4.2e7 Pa
//	engine := units.RPM(2100)          // AngularVelocity, stored in rad/s
//	road := units.KMH(40)              // Speed, stored in m/s
//	fmt.Println(relief, engine, road)  // 420 bar 2100 rpm 40 km/h
//	fmt.Println(relief.PSI())          // 6091.58...
//
// Adding two values of one quantity, or scaling one by a plain number, is
// ordinary Go arithmetic (relief + units.Bar(20), 2*engine). Products and
// quotients that change the quantity go through the named relations, so the
// dimensions stay right:
//
//	P = T·ω        PowerFromTorque, TorqueFromPower
//	P = F·v        PowerFromForce, ForceFromPower
//	P = Δp·Q       PowerFromFlow (hydraulic power)
//	Q = D·ω        FlowFromDisplacement, SpeedFromFlow
//	T = Δp·D       TorqueFromPressure, PressureFromTorque
//	T = F·r        TorqueFromForce, ForceFromTorque
//	v = ω·r        SpeedFromAngular, AngularFromSpeed
//	E = P·t        EnergyFromPower
//	ṁ = b·P        FuelFromPower (b a specific fuel consumption)
//
// # Displacement
//
// A hydrostatic unit's Displacement is stored per radian (m³/rad), so that
// Q = D·ω and T = Δp·D hold with no 2π. Data sheets give it per revolution:
// CCPerRev(210) is a 210 cm³/rev unit, and d.CCPerRev() reads it back.
//
// # Temperature
//
// A Temperature is a point on the absolute scale (kelvins); Celsius(20) is
// 293.15 K. The difference of two temperatures is a TemperatureDifference,
// which has no offset: Celsius(60).Sub(Celsius(40)) is 20 K.
//
// # Text
//
// Every quantity implements encoding.TextMarshaler and TextUnmarshaler, and
// has a ParseX function, so configuration files can say "420 bar",
// "2100 rpm" or "40 km/h". The text is a decimal number, optional spaces and
// a unit symbol. Symbols are case-sensitive (mPa·s is not MPa). Besides the
// symbols in each ParseX comment, ASCII spellings are accepted: "N*m", "Nm",
// "cm3/rev", "cc/rev", "m/s2", "degC", "degF", "r/min", "lpm", "gpm", "kph",
// "mm2/s", "mPa*s", "g/cm3", "kg/m3".
//
// MarshalText writes text that parses back to exactly the same float64: in
// the display unit when that is exact, otherwise in the SI unit. String prints
// six significant digits and is for people.
//
// Errors are *ParseError values that name the quantity and the text, and wrap
// ErrSyntax (not a number and a unit), ErrUnit (missing or unknown unit) or
// ErrRange (NaN, infinite, overflowing, or below absolute zero). Nothing in
// this package panics on any input.
//
// # Conversion factors
//
// The factors follow from exact definitions (the international inch and
// pound, standard gravity gn = 9.806 65 m/s², the US gallon of 231 in³; the
// mechanical horsepower is 550 ft·lbf/s, the metric horsepower 75 kgf·m/s).
// The tests check each against the rounded factor printed in NIST Special
// Publication 811 (2008 edition), Appendix B.8, quoting the row.
package units
