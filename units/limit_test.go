package units

import "testing"

// TestAppendLimit pins the one wording of limit errors across packages.
func TestAppendLimit(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		q     string
		v     Measure
		bound string
		limit Measure
		want  string
	}{
		{"pump speed", Of(RPM(3100)), "maximum speed", Of(RPM(2800)), "pump speed 3100 rpm above maximum speed 2800 rpm"},
		{"motor setting", Plain(0.0151), "schedule's minimum motor setting", Plain(0.05), "motor setting 0.0151 below schedule's minimum motor setting 0.05"},
		{"high-line pressure", Of(Bar(2560)), "", Of(Bar(450)), "high-line pressure 2560 bar above limit 450 bar"},
	} {
		if got := string(AppendLimit([]byte("x: "), c.q, c.v, c.bound, c.limit)); got != "x: "+c.want {
			t.Errorf("AppendLimit(%q) = %q, want %q", c.q, got, "x: "+c.want)
		}
	}
}
