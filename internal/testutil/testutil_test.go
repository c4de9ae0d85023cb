package testutil_test

import (
	"math"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

type state struct {
	Speed  units.AngularVelocity
	Torque units.Torque
	Share  float64
}

func TestEquateApproxNamedTypes(t *testing.T) {
	t.Parallel()
	a := state{units.RPM(2100), units.NewtonMetres(850), 0.25}
	b := state{a.Speed * (1 + 1e-10), a.Torque * (1 - 1e-10), 0.25 * (1 + 1e-10)}
	if d := cmp.Diff(a, b, testutil.EquateApprox(1e-9, 0)); d != "" {
		t.Errorf("values within 1e-9 compare unequal:\n%s", d)
	}
	if cmp.Equal(a, b, testutil.EquateApprox(1e-12, 0)) {
		t.Error("values 1e-10 apart compare equal at a 1e-12 tolerance")
	}
	// The reason this helper exists: cmpopts.EquateApprox skips named float types,
	// so the torque difference below is not tolerated by it.
	if cmp.Equal(a, b, cmpopts.EquateApprox(1e-9, 0)) {
		t.Error("cmpopts.EquateApprox now handles named float types; testutil.EquateApprox may be retired")
	}
	c := a
	c.Torque = units.Torque(math.NaN())
	if cmp.Equal(c, c, testutil.EquateApprox(1, 1)) {
		t.Error("NaN compared equal to NaN")
	}
}

func TestClose(t *testing.T) {
	t.Parallel()
	cases := []struct {
		got, want, frac, margin float64
		close                   bool
	}{
		{1, 1, 0, 0, true},
		{1, 1 + 1e-10, 1e-9, 0, true},
		{1, 1 + 1e-8, 1e-9, 0, false},
		{0, 1e-13, 0, 1e-12, true},
		{math.Inf(1), math.Inf(1), 0, 0, true},
		{math.Inf(1), math.Inf(-1), 1, 1, false},
		{math.NaN(), 0, 1, 1, false},
	}
	for _, c := range cases {
		if got := testutil.Close(c.got, c.want, c.frac, c.margin); got != c.close {
			t.Errorf("Close(%g, %g, %g, %g) = %v, want %v", c.got, c.want, c.frac, c.margin, got, c.close)
		}
	}
	if r := testutil.RelErr(1.1, 1); math.Abs(r-0.1) > 1e-15 {
		t.Errorf("RelErr(1.1, 1) = %g, want 0.1", r)
	}
}

func TestReach(t *testing.T) {
	t.Parallel()
	var r testutil.Reach
	if s, n := r.Share(); s != 0 || n != 0 {
		t.Errorf("empty Share() = %v, %v", s, n)
	}
	for i := 0; i < 4; i++ {
		r.Drew()
		if i%2 == 0 {
			r.Reached()
		}
	}
	if s, n := r.Share(); s != 0.5 || n != 4 {
		t.Errorf("Share() = %v, %v, want 0.5, 4", s, n)
	}
	var low, ok, empty recorder
	r.Check(&low, 0.6)
	r.Check(&ok, 0.5)
	(&testutil.Reach{}).Check(&empty, 0)
	if !low.failed || ok.failed || !empty.failed {
		t.Errorf("Check: 0.5 against 0.6 failed=%v, against 0.5 failed=%v, no draws failed=%v", low.failed, ok.failed, empty.failed)
	}
}

// recorder is a testing.TB that records a failure instead of failing.
type recorder struct {
	testing.TB
	failed bool
}

func (r *recorder) Helper()               {}
func (r *recorder) Errorf(string, ...any) { r.failed = true }
