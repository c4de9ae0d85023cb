package units

// Exact definitions behind the conversion factors. Each is exact by definition;
// NIST SP 811 (2008), Appendix B, lists the rounded factors the tests check.
const (
	inch            = 0.0254      // m, exact (international inch, 1959)
	foot            = 12 * inch   // m, exact
	mile            = 5280 * foot // m, exact (statute mile)
	pound           = 0.45359237  // kg, exact (avoirdupois pound)
	standardGravity = 9.80665     // m/s², exact (CGPM 1901)
	poundForce      = pound * standardGravity
	usGallon        = 231 * inch * inch * inch // m³, exact (231 in³)
)
