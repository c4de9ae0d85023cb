package units

import (
	"math"
	"strconv"
	"strings"
)

// unit is one way of writing a quantity: value_SI = number*scale + offset.
type unit struct {
	symbols []string // the first is canonical, the rest are accepted aliases
	scale   float64
	offset  float64 // non-zero only for Celsius and Fahrenheit temperatures
}

// table describes how one quantity is read and written.
type table struct {
	quantity string
	units    []unit
	// display lists the units String chooses from, in increasing size:
	// the last whose threshold is at most |value| is used; zero and values
	// below the first threshold use display[0].
	display []displayUnit
	// base is the SI unit (scale 1, no offset) that MarshalText falls back to.
	base int
	// min is the smallest valid SI value (for temperature, 0 K); -Inf otherwise.
	min float64
}

type displayUnit struct {
	unit      int     // index into units
	threshold float64 // smallest |SI value| for which this unit is chosen
}

// splitNumber splits s into its leading decimal number and the rest.
func splitNumber(s string) (num, rest string, ok bool) {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return "", s, false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return s[:i], s[i:], true
}

func (t *table) lookup(sym string) (unit, bool) {
	for _, u := range t.units {
		for _, s := range u.symbols {
			if s == sym {
				return u, true
			}
		}
	}
	return unit{}, false
}

// parse reads text such as "420 bar" or "2100rpm" into an SI value.
func (t *table) parse(text string) (float64, error) {
	s := strings.TrimSpace(text)
	num, rest, ok := splitNumber(s)
	if !ok {
		return 0, &ParseError{t.quantity, text, ErrSyntax}
	}
	sym := strings.TrimSpace(rest)
	if sym == "" {
		return 0, &ParseError{t.quantity, text, ErrUnit}
	}
	u, ok := t.lookup(sym)
	if !ok {
		return 0, &ParseError{t.quantity, text, ErrUnit}
	}
	x, err := strconv.ParseFloat(num, 64)
	if err != nil {
		// Only a range error is possible after splitNumber.
		return 0, &ParseError{t.quantity, text, ErrRange}
	}
	v := x*u.scale + u.offset
	if math.IsNaN(v) || math.IsInf(v, 0) || v < t.min {
		return 0, &ParseError{t.quantity, text, ErrRange}
	}
	return v, nil
}

// displayFor returns the unit String uses for the SI value v.
func (t *table) displayFor(v float64) unit {
	u := t.units[t.display[0].unit]
	a := math.Abs(v)
	for _, d := range t.display[1:] {
		if a >= d.threshold {
			u = t.units[d.unit]
		}
	}
	return u
}

// format writes v with six significant digits in a unit chosen for its size.
func (t *table) format(v float64) string {
	return string(t.appendFormat(make([]byte, 0, 24), v))
}

// appendFormat appends what format writes to b.
func (t *table) appendFormat(b []byte, v float64) []byte {
	u := t.displayFor(v)
	b = strconv.AppendFloat(b, (v-u.offset)/u.scale, 'g', 6, 64)
	b = append(b, ' ')
	return append(b, u.symbols[0]...)
}

// marshal writes v so that parse gives back exactly v: in the display unit
// when that round trips exactly, otherwise in the SI base unit.
func (t *table) marshal(v float64) ([]byte, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil, &ParseError{t.quantity, strconv.FormatFloat(v, 'g', -1, 64), ErrRange}
	}
	u := t.displayFor(v)
	x := (v - u.offset) / u.scale
	if x*u.scale+u.offset != v {
		u, x = t.units[t.base], v
	}
	b := strconv.AppendFloat(nil, x, 'g', -1, 64)
	b = append(b, ' ')
	return append(b, u.symbols[0]...), nil
}
