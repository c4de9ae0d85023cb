package design

import (
	"errors"
	"fmt"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestClassify: each kind of operating-point error names the limit the
// tractive-effort diagram reports for it, however it is wrapped.
func TestClassify(t *testing.T) {
	t.Parallel()
	wrap := func(err error) error { return fmt.Errorf("point 3: %w", err) }
	cases := []struct {
		err  error
		want string
	}{
		{nil, LimitNone},
		{wrap(hydrostat.ErrPressureLimit), LimitPressure},
		{wrap(hydrostat.ErrSpeedLimit), LimitUnitSpeed},
		{wrap(hydrostat.ErrSettingLimit), LimitRatio},
		{wrap(powersplit.ErrUnreachable), LimitRatio},
		{&powersplit.LimitError{Quantity: "loop pressure", Err: powersplit.ErrInfeasible}, LimitPressure},
		{&powersplit.LimitError{Quantity: "output speed", Err: powersplit.ErrInfeasible}, LimitRatio},
		{&powersplit.LimitError{Quantity: "pump speed", Err: powersplit.ErrInfeasible}, LimitUnitSpeed},
		{&powersplit.LimitError{Quantity: "motor setting", Err: powersplit.ErrInfeasible}, LimitRatio},
		{wrap(vehicle.ErrEngineLimit), LimitEngine},
		{wrap(vehicle.ErrTraction), LimitTraction},
		{wrap(vehicle.ErrStability), LimitStability},
		{errors.New("something else"), "something else"},
	}
	for _, c := range cases {
		if got := Classify(c.err); got != c.want {
			t.Errorf("Classify(%v) = %q, want %q", c.err, got, c.want)
		}
	}
}
