package powersplit

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/units"
)

// summaryDiff compares what a Brief State holds (the summary) in a and b,
// each quantity to tol relative to the scale of its kind (powers to the
// largest power, torques to the largest torque, pressures and settings to
// their own size with a floor), and returns the first difference, or "".
// tol = 0 asks for equal bits.
func summaryDiff(a, b *State, tol float64) string {
	pscale := math.Abs(float64(b.InputPower)) + math.Abs(float64(b.OutputPower+b.PTOPower)) + math.Abs(float64(b.Loss))
	tscale := math.Abs(float64(b.InputTorque))
	for _, o := range b.Outputs {
		tscale = math.Max(tscale, math.Abs(float64(o.Torque)))
	}
	for _, lr := range b.Loops {
		tscale = math.Max(tscale, math.Abs(float64(lr.Pump.Torque)))
		for _, m := range lr.Motors {
			tscale = math.Max(tscale, math.Abs(float64(m.Torque)))
		}
	}
	// Where almost no power flows, powers are judged against the powers the
	// point could carry, as the solver's residual is.
	wscale := math.Abs(float64(b.InputSpeed))
	for _, lr := range b.Loops {
		wscale = math.Max(wscale, math.Abs(float64(lr.Pump.Speed)))
		for _, m := range lr.Motors {
			wscale = math.Max(wscale, math.Abs(float64(m.Speed)))
		}
	}
	pscale += 1e-3 * tscale * wscale
	// A power is as exact as the largest power flowing through the network
	// is: where power circulates through a loop, the input power is a
	// small difference of large ones.
	for _, lr := range b.Loops {
		pscale += math.Abs(float64(lr.HydraulicPower))
	}
	var d string
	cmpf := func(name string, x, y, scale float64) {
		if d != "" {
			return
		}
		if tol == 0 {
			if math.Float64bits(x) != math.Float64bits(y) && !(x == 0 && y == 0) {
				d = fmt.Sprintf("%s: %.17g, want %.17g", name, x, y)
			}
			return
		}
		if !(math.Abs(x-y) <= tol*(math.Abs(y)+scale)) {
			d = fmt.Sprintf("%s: %.17g, want %.17g (relative difference %.3g)", name, x, y, math.Abs(x-y)/(math.Abs(y)+scale))
		}
	}
	if a.Range != b.Range || a.RangeName != b.RangeName {
		return fmt.Sprintf("range %d %q, want %d %q", a.Range, a.RangeName, b.Range, b.RangeName)
	}
	cmpf("input speed", float64(a.InputSpeed), float64(b.InputSpeed), 0)
	cmpf("input torque", float64(a.InputTorque), float64(b.InputTorque), tscale)
	// The input torque is the difference of torques as large as tscale, so
	// the input power is known to tscale·ω_in: where little power enters
	// against the torques the network carries, that bounds it.
	pinScale := pscale + tscale*math.Abs(float64(b.InputSpeed))
	cmpf("input power", float64(a.InputPower), float64(b.InputPower), pinScale)
	cmpf("output power", float64(a.OutputPower), float64(b.OutputPower), pscale)
	cmpf("PTO power", float64(a.PTOPower), float64(b.PTOPower), pscale)
	cmpf("loss", float64(a.Loss), float64(b.Loss), pscale)
	cmpf("hydrostat loss", float64(a.HydrostatLoss), float64(b.HydrostatLoss), pscale)
	// A ratio of powers over the input power is as exact as the input power
	// is relative to itself: pinScale/|P_in| where little power enters.
	ratio := 1.0
	if pin := math.Abs(float64(b.InputPower)); pin > 0 {
		ratio = math.Max(1, pinScale/pin)
	}
	cmpf("efficiency", a.Efficiency, b.Efficiency, ratio)
	cmpf("hydraulic share", a.HydraulicShare, b.HydraulicShare, ratio)
	cmpf("pump share", a.PumpShare, b.PumpShare, ratio)
	for i := range b.Outputs {
		cmpf("output torque", float64(a.Outputs[i].Torque), float64(b.Outputs[i].Torque), tscale)
		cmpf("output speed", float64(a.Outputs[i].Speed), float64(b.Outputs[i].Speed), 0)
	}
	for i := range b.PTOs {
		cmpf("PTO torque", float64(a.PTOs[i].Torque), float64(b.PTOs[i].Torque), tscale)
	}
	for j := range b.Loops {
		la, lb := &a.Loops[j], &b.Loops[j]
		relief := float64(lb.High) + 1e5
		cmpf("pressure", float64(la.Pressure), float64(lb.Pressure), relief)
		cmpf("high pressure", float64(la.High), float64(lb.High), relief)
		cmpf("hydraulic power", float64(la.HydraulicPower), float64(lb.HydraulicPower), pscale)
		cmpf("loop loss", float64(la.Loss), float64(lb.Loss), pscale)
		for k := range lb.Settings {
			cmpf("setting", la.Settings[k], lb.Settings[k], 1)
		}
		cmpf("pump setting", la.Pump.Setting, lb.Pump.Setting, 1)
		cmpf("pump speed", float64(la.Pump.Speed), float64(lb.Pump.Speed), 0)
		cmpf("pump torque", float64(la.Pump.Torque), float64(lb.Pump.Torque), tscale)
		cmpf("pump flow", float64(la.Pump.Flow), float64(lb.Pump.Flow), math.Abs(float64(lb.Pump.IdealFlow)))
		for k := range lb.Motors {
			cmpf("motor setting", la.Motors[k].Setting, lb.Motors[k].Setting, 1)
			cmpf("motor speed", float64(la.Motors[k].Speed), float64(lb.Motors[k].Speed), 0)
			cmpf("motor torque", float64(la.Motors[k].Torque), float64(lb.Motors[k].Torque), tscale)
		}
	}
	cmpf("binding value", a.Binding.Value.SI, b.Binding.Value.SI, a.Binding.Limit.SI)
	if d == "" && (a.Binding.Quantity != b.Binding.Quantity || a.Binding.Element != b.Binding.Element) &&
		math.Abs(a.Binding.Left().SI/a.Binding.Limit.SI-b.Binding.Left().SI/b.Binding.Limit.SI) > 1e-9 {
		d = fmt.Sprintf("binding %s %s, want %s %s", a.Binding.Element, a.Binding.Quantity, b.Binding.Element, b.Binding.Quantity)
	}
	if d == "" && len(a.Flags) != len(b.Flags) {
		d = fmt.Sprintf("%d flags, want %d", len(a.Flags), len(b.Flags))
	}
	return d
}

// sameError reports whether a and b are both nil or both errors with the
// same text.
func sameError(a, b error) bool {
	if a == nil || b == nil {
		return a == nil && b == nil
	}
	return a.Error() == b.Error()
}

// TestPropertyBriefMatchesFull: a Brief State holds, bit for bit, what the
// full State of the same point holds, with the same error, and leaves the
// detail empty.
func TestPropertyBriefMatchesFull(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := rapid.Custom(genCase).Draw(t, "layout and point")
		full, brief := NewSolver(c.l), NewSolver(c.l)
		a := State{Brief: true}
		var b State
		ea, eb := brief.Solve(c.p, &a), full.Solve(c.p, &b)
		if !sameError(ea, eb) {
			t.Fatalf("%s: brief: %v; full: %v", c.kind, ea, eb)
		}
		if errors.Is(eb, ErrInput) {
			return
		}
		if d := summaryDiff(&a, &b, 0); d != "" {
			t.Fatalf("%s (error %v): brief %s", c.kind, eb, d)
		}
		if len(a.Elements) != 0 || len(a.Shafts) != 0 || len(a.Margins) != 0 {
			t.Fatalf("%s: a Brief State holds %d elements, %d shafts, %d margins", c.kind, len(a.Elements), len(a.Shafts), len(a.Margins))
		}
		// The same State back to full gets the whole state again.
		a.Brief = false
		if err := brief.Solve(c.p, &a); !sameError(err, eb) || len(a.Elements) != len(b.Elements) || summaryDiff(&a, &b, 0) != "" {
			t.Fatalf("%s: full again after brief: %v, %d elements", c.kind, err, len(a.Elements))
		}
		for i := range b.ports {
			if a.ports[i] != b.ports[i] {
				t.Fatalf("%s: port %d %+v, want %+v", c.kind, i, a.ports[i], b.ports[i])
			}
		}
	})
}

// TestBindingMargin: the binding margin of a point is the one of its
// margins with the least room left, rated pressures aside.
func TestBindingMargin(t *testing.T) {
	s := NewSolver(benchLayout(t, true))
	var st State
	for _, p := range benchPoints(t) {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		best := math.Inf(1)
		for _, m := range st.Margins {
			if r := m.Left().SI / m.Limit.SI; r < best && !isRated(m) {
				best = r
			}
		}
		if got := st.Binding.Left().SI / st.Binding.Limit.SI; got != best {
			t.Errorf("%v: binding %+v (room %g), want room %g", units.AngularVelocity(p.Outputs[0].Speed).RPM(), st.Binding, got, best)
		}
	}
}

func isRated(m Margin) bool {
	return m.Bound == boundRated || m.Unchecked
}
