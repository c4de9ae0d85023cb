// Package testutil holds helpers shared by the tests of every powersplit
// package. It is internal: nothing here is part of the public API.
package testutil

import (
	"math"
	"reflect"

	"github.com/google/go-cmp/cmp"
)

// EquateApprox returns a cmp.Option that treats two float64 values, or two
// values of the same named float64 type (units.Torque, units.Pressure, ...),
// as equal when |x-y| <= max(margin, fraction*min(|x|, |y|)), the rule of
// cmpopts.EquateApprox. Unlike cmpopts.EquateApprox it also applies to named
// float types. NaN equals nothing, not even NaN.
func EquateApprox(fraction, margin float64) cmp.Option {
	if fraction < 0 || margin < 0 || math.IsNaN(fraction) || math.IsNaN(margin) {
		panic("testutil: EquateApprox needs a non-negative fraction and margin")
	}
	return cmp.FilterValues(func(x, y any) bool {
		vx, vy := reflect.ValueOf(x), reflect.ValueOf(y)
		return vx.IsValid() && vy.IsValid() && vx.Type() == vy.Type() &&
			vx.Kind() == reflect.Float64
	}, cmp.Comparer(func(x, y any) bool {
		return Close(reflect.ValueOf(x).Float(), reflect.ValueOf(y).Float(), fraction, margin)
	}))
}

// Close reports whether |got-want| <= max(margin, fraction*min(|got|, |want|)).
// Infinities of the same sign are close; NaN is close to nothing.
func Close(got, want, fraction, margin float64) bool {
	if math.IsNaN(got) || math.IsNaN(want) {
		return false
	}
	if got == want {
		return true
	}
	if math.IsInf(got, 0) || math.IsInf(want, 0) {
		return false
	}
	d := math.Abs(got - want)
	return d <= margin || d <= fraction*math.Min(math.Abs(got), math.Abs(want))
}

// RelErr returns |got-want|/max(|want|, tiny), the relative error used in
// failure messages.
func RelErr(got, want float64) float64 {
	return math.Abs(got-want) / math.Max(math.Abs(want), 1e-300)
}
