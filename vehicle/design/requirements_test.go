package design

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// TestCheckReport checks the demo file's report: a missing standstill and
// speed gaps are reported, and the pull check's margin is the
// tractive-effort diagram's greatest pull at that speed.
func TestCheckReport(t *testing.T) {
	t.Parallel()
	f, err := Load("testdata/tractor.json")
	if err != nil {
		t.Fatal(err)
	}
	rep, err := f.Check(f.Transmission, f.Requirements)
	if err != nil {
		t.Fatal(err)
	}
	if rep.Standstill || rep.Feasible() {
		t.Errorf("input-coupled demo: standstill %v, feasible %v; want false, false (no range reaches 0 km/h)", rep.Standstill, rep.Feasible())
	}
	if got := rep.Failed(); len(got) == 0 || !strings.Contains(got[0], "standstill") {
		t.Errorf("Failed() = %q, want the standstill check first", got)
	}
	if len(rep.Gaps) != 0 {
		t.Errorf("input-coupled demo: gaps %v, want none (its ranges overlap)", rep.Gaps)
	}
	alt, err := f.Check(f.Alternatives[0], f.Requirements)
	if err != nil {
		t.Fatal(err)
	}
	if len(alt.Gaps) == 0 {
		t.Error("output-coupled demo: no gaps reported, want two (its ranges do not overlap)")
	}
	// The pull check against the diagram, computed here on its own.
	req := f.Requirements.Pulls[0]
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	g, err := f.Ground(f.firstSurface("field"))
	if err != nil {
		t.Fatal(err)
	}
	pts, err := TractiveEffort(v, EffortSpec{Speeds: []units.Speed{req.Speed}, Ground: g})
	if err != nil {
		t.Fatal(err)
	}
	best := 0.0
	for _, p := range pts {
		best = math.Max(best, float64(p.Pull))
	}
	var pull *Check
	for i := range rep.Checks {
		if strings.HasPrefix(rep.Checks[i].Name, "pull ") {
			pull = &rep.Checks[i]
		}
	}
	if pull == nil {
		t.Fatal("no pull check in the report")
	}
	if want := best/float64(req.Pull) - 1; math.Abs(pull.Margin-want) > 1e-12 {
		t.Errorf("pull margin %g, want %g from the diagram", pull.Margin, want)
	}
	var buf bytes.Buffer
	if err := rep.WriteText(&buf); err != nil || !strings.Contains(buf.String(), "FAILED") {
		t.Errorf("WriteText: %v, %q", err, buf.String())
	}
}
