package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// finite reports whether every value is neither NaN nor infinite.
func finite(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// positive checks that v is finite and > 0.
func positive[Q units.Quantity | float64](field string, v Q) error {
	if !finite(float64(v)) || v <= 0 {
		return invalid(field, v, "must be finite and positive")
	}
	return nil
}

// nonNegative checks that v is finite and >= 0.
func nonNegative[Q units.Quantity | float64](field string, v Q) error {
	if !finite(float64(v)) || v < 0 {
		return invalid(field, v, "must be finite and not negative")
	}
	return nil
}

// fraction checks that v is finite and in (0, 1].
func fraction[Q units.Quantity | float64](field string, v Q) error {
	if !finite(float64(v)) || v <= 0 || v > 1 {
		return invalid(field, v, "must be in (0, 1]")
	}
	return nil
}

// isFinite checks that v is finite.
func isFinite[Q units.Quantity | float64](field string, v Q) error {
	if !finite(float64(v)) {
		return invalid(field, v, "must be finite")
	}
	return nil
}
