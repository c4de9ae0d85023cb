package units

import (
	"errors"
	"strconv"
)

// Sentinel errors of the parsers. A *ParseError wraps exactly one of them.
var (
	// ErrSyntax means the text is not a number followed by a unit.
	ErrSyntax = errors.New("units: invalid syntax")
	// ErrUnit means the unit is missing or is not one this quantity knows.
	ErrUnit = errors.New("units: unknown unit")
	// ErrRange means the value is NaN, infinite, overflows float64 or is
	// outside the physical range of the quantity (for example below absolute zero).
	ErrRange = errors.New("units: value out of range")
)

// A ParseError records a failed parse of a quantity's text form.
type ParseError struct {
	Quantity string // the quantity being parsed, e.g. "pressure"
	Text     string // the text that failed
	Err      error  // ErrSyntax, ErrUnit or ErrRange
}

// Error returns the message, naming the quantity and the text.
func (e *ParseError) Error() string {
	if e.Err == nil {
		return "units: parsing " + e.Quantity + " " + strconv.Quote(e.Text)
	}
	return "units: parsing " + e.Quantity + " " + strconv.Quote(e.Text) + ": " + trimPrefix(e.Err.Error())
}

// Unwrap returns the sentinel error so that errors.Is finds it.
func (e *ParseError) Unwrap() error { return e.Err }

func trimPrefix(s string) string {
	const p = "units: "
	if len(s) >= len(p) && s[:len(p)] == p {
		return s[len(p):]
	}
	return s
}
