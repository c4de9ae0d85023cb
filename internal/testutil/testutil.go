// Package testutil holds helpers shared by the tests of every powersplit
// package. It is internal: nothing here is part of the public API.
package testutil

import (
	"math"
	"reflect"
	"sync/atomic"
	"testing"

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

// Reach counts the draws of a property test and how many of them reach the
// property's main assertion, so a test can state, and check, the share of
// draws that test something (a property that skips or returns early on
// most draws passes without testing much). Safe for concurrent use.
type Reach struct {
	drawn, reached atomic.Int64
}

// Drew counts one draw.
func (r *Reach) Drew() { r.drawn.Add(1) }

// Reached counts one draw that reached the main assertion.
func (r *Reach) Reached() { r.reached.Add(1) }

// Share returns the share of draws that reached the main assertion (0 with
// no draws) and the number of draws.
func (r *Reach) Share() (share float64, draws int64) {
	n := r.drawn.Load()
	if n == 0 {
		return 0, 0
	}
	return float64(r.reached.Load()) / float64(n), n
}

// Check reports an error on tb when fewer than min of the draws reached the
// main assertion (or when nothing was drawn).
func (r *Reach) Check(tb testing.TB, min float64) {
	tb.Helper()
	s, n := r.Share()
	if n == 0 || s < min {
		tb.Errorf("%d of %d draws reached the assertion (%.0f %%), want at least %.0f %%", r.reached.Load(), n, 100*s, 100*min)
	}
}
