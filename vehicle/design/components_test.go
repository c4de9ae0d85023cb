package design

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// replaceIn replaces the first old after the first occurrence of after
// (the whole text when after is ""), failing when either is missing.
func replaceIn(t testing.TB, text, after, old, new string) string {
	t.Helper()
	i := strings.Index(text, after)
	if i < 0 {
		t.Fatalf("the test file no longer contains %q", after)
	}
	j := strings.Index(text[i:], old)
	if j < 0 {
		t.Fatalf("the test file no longer contains %q after %q", old, after)
	}
	return text[:i+j] + new + text[i+j+len(old):]
}

// componentFile is the test design file with the optional component
// fields written as a user would: on the input-coupled transmission a
// motor that swings to zero, a constant loss torque and an oil of grade
// VG46 with viscosity index 140; on the output-coupled alternative a set
// by teeth with profile shifts, over-centre units and an oil of fixed
// viscosity.
func componentFile(t testing.TB) string {
	t.Helper()
	text := string(testFile(t))
	const motor = `"motor": {"displacement": "110 cm³/rev", "maxSpeed": "3200 rpm", "ratedPressure": "420 bar", "peakPressure": "480 bar"`
	const pump = `"pump": {"displacement": "110 cm³/rev", "maxSpeed": "3200 rpm", "ratedPressure": "420 bar", "peakPressure": "480 bar"`
	text = replaceIn(t, text, "", motor, motor+`, "swing": "to zero"`)
	text = replaceIn(t, text, "", `"constantPressure": "1 bar"}`, `"constantPressure": "1 bar", "constantTorque": "2 N·m"}`)
	text = replaceIn(t, text, "", `"oil": "VG46",`, `"oil": "VG46", "oilViscosityIndex": 140,`)
	const alt = `"kind": "output-coupled"`
	// Sun 15, planet 21, ring 57, three planets: coaxial unshifted
	// (15 + 2·21 = 57) and assembly (15 + 57)/3 = 24 (hand calculation).
	// The sun's 15 teeth need x ≥ 2/17 against undercut; +0.2 on the sun
	// with −0.2 on planet and ring keeps both centre distances standard.
	text = replaceIn(t, text, alt, `"set": {"fixedCarrierRatio": -2.5, "basicEfficiency": 0.98}`,
		`"set": {"basicEfficiency": 0.98, "teeth": {"sun": 15, "ring": 57, "planet": 21, "planets": 3, "module": "3 mm",
        "sunShift": 0.2, "planetShift": -0.2, "ringShift": -0.2}}`)
	text = replaceIn(t, text, alt, pump, pump+`, "swing": "over centre"`)
	text = replaceIn(t, text, alt, motor, motor+`, "swing": "over centre"`)
	return replaceIn(t, text, alt, `"oil": "VG46",`, `"oilViscosity": "25 mPa·s",`)
}

// TestComponentFields reads the component fields, checks that each reaches
// the built values, and that load, save, load gives equal values.
func TestComponentFields(t *testing.T) {
	t.Parallel()
	f, err := Parse("components.json", []byte(componentFile(t)))
	if err != nil {
		t.Fatal(err)
	}
	tr, alt := f.Transmission, f.Alternatives[0]

	// The input-coupled transmission: swing, constant torque, VG46 of VI 140.
	l, err := tr.loop(nil)
	if err != nil {
		t.Fatal(err)
	}
	spec := l.Spec()
	if got := spec.Motors[0].Spec().Swing; got != hydrostat.SwingToZero {
		t.Errorf("motor swing = %v, want to zero", got)
	}
	if got := spec.Pump.Spec().Swing; got != hydrostat.SwingUnstated {
		t.Errorf("pump swing = %v, want unstated (left out)", got)
	}
	if w, ok := spec.Motors[0].Spec().Loss.(hydrostat.Wilson); !ok || w.ConstantTorque != units.NewtonMetres(2) {
		t.Errorf("motor loss = %#v, want a Wilson model with ConstantTorque 2 N·m", spec.Motors[0].Spec().Loss)
	}
	vi, err := spec.Oil.ViscosityIndex()
	if err != nil || math.Abs(vi-140) > 1e-6 {
		t.Errorf("oil viscosity index = %v, %v; want 140", vi, err)
	}
	if nu := spec.Oil.Viscosity(units.Celsius(40)).Centistokes(); math.Abs(nu-46) > 1e-9 {
		t.Errorf("oil at 40 °C = %v cSt, want the grade's 46", nu)
	}

	// The output-coupled alternative: teeth with shifts, over centre, fixed viscosity.
	set, err := alt.Set.build()
	if err != nil {
		t.Fatal(err)
	}
	if i0 := set.FixedCarrierRatio(); i0 != -57.0/15 {
		t.Errorf("fixed-carrier ratio from the teeth = %v, want −57/15", i0)
	}
	d, ok := set.Design()
	if !ok || d.SunShift != 0.2 || d.PlanetShift != -0.2 || d.RingShift != -0.2 || d.Module != units.Millimetres(3) || d.Planets != 3 {
		t.Errorf("set design = %+v, %v; want the file's teeth and shifts", d, ok)
	}
	l, err = alt.loop(nil)
	if err != nil {
		t.Fatal(err)
	}
	spec = l.Spec()
	if spec.Pump.Spec().Swing != hydrostat.SwingOverCentre || spec.Motors[0].Spec().Swing != hydrostat.SwingOverCentre {
		t.Errorf("swings = %v, %v; want over centre", spec.Pump.Spec().Swing, spec.Motors[0].Spec().Swing)
	}
	for _, c := range []float64{20, 60, 90} {
		if mu := spec.Oil.DynamicViscosity(units.Celsius(c)); mu != units.Centipoise(25) {
			t.Errorf("fixed-viscosity oil at %v °C = %v, want 25 mPa·s", c, mu)
		}
	}
	if _, err := f.Vehicle(alt); err != nil {
		t.Errorf("vehicle with the alternative: %v", err)
	}

	// Load, save, load: equal values, and the saved text in the file's words.
	_, x := saveLoad(t, f)
	for _, want := range []string{`"swing": "over centre"`, `"swing": "to zero"`, `"oilViscosityIndex": 140`, `"oilViscosity": "25 `,
		`"constantTorque": "2 `, `"sunShift": 0.2`, `"ringShift": -0.2`} {
		if !strings.Contains(string(x), want) {
			t.Errorf("saved file lacks %s", want)
		}
	}
}

// TestComponentThroughMechanicalPoint: the file's over-centre motor lets
// the output-coupled alternative run at its mechanical point; the same
// design with the swing left out (unstated: the motor stays at or above
// its 0.2 minimum) cannot reach it.
func TestComponentThroughMechanicalPoint(t *testing.T) {
	t.Parallel()
	f, err := Parse("components.json", []byte(componentFile(t)))
	if err != nil {
		t.Fatal(err)
	}
	alt := f.Alternatives[0]
	// The pump (on the sun) stands still when the ring turns at
	// (1 − i0)/(−i0) of the carrier (Willis, hand calculation); the
	// output turns at the first range's ratio of the ring.
	i0 := -57.0 / 15
	engine := units.RPM(2000)
	out := units.AngularVelocity(float64(engine) * (1 - i0) / -i0 * alt.Ranges[0].Ratio)
	p := powersplit.Point{Input: engine, Outputs: []powersplit.OutputDemand{{Speed: out, Torque: units.NewtonMetres(2000)}}}
	var st powersplit.State
	for _, swing := range []hydrostat.Swing{hydrostat.SwingOverCentre, hydrostat.SwingUnstated} {
		alt.Motor.Swing = swing
		l, err := alt.Layout()
		if err != nil {
			t.Fatal(err)
		}
		err = powersplit.NewSolver(l).Solve(p, &st)
		switch {
		case swing == hydrostat.SwingOverCentre && err != nil:
			t.Errorf("over-centre motor at the mechanical point: %v", err)
		case swing == hydrostat.SwingOverCentre:
			if lp := st.Loops[0]; math.Abs(lp.Pump.Speed.RPM()) > 1e-6 || math.Abs(lp.Settings[1]) > 0.05 {
				t.Errorf("at the mechanical point: pump %v, motor setting %v; want the pump still and the motor near zero", lp.Pump.Speed, lp.Settings[1])
			}
		case !errors.Is(err, powersplit.ErrUnreachable):
			t.Errorf("unstated motor swing at the mechanical point: %v, want ErrUnreachable", err)
		}
	}
}

// TestComponentErrors: a mistake in a component field names its JSON path.
func TestComponentErrors(t *testing.T) {
	t.Parallel()
	base := componentFile(t)
	const alt = `"kind": "output-coupled"`
	cases := []struct {
		name, after, old, new string
		kind                  error
		want                  []string
	}{
		{"unknown swing", "", `"swing": "to zero"`, `"swing": "sideways"`, hydrostat.ErrInvalid,
			[]string{"transmission.motor.swing", `"sideways"`, "over centre"}},
		{"swing as number", "", `"swing": "to zero"`, `"swing": 1`, ErrType,
			[]string{"transmission.motor.swing = 1", `"over centre"`}},
		{"negative constant torque", "", `"constantTorque": "2 N·m"`, `"constantTorque": "-2 N·m"`, ErrValue,
			[]string{"transmission.losses.constantTorque", "zero or greater"}},
		{"viscosity index out of range", "", `"oilViscosityIndex": 140`, `"oilViscosityIndex": 900`, hydrostat.ErrInvalid,
			[]string{"transmission.oilViscosityIndex = 900"}},
		{"grade without preset", "", `"oil": "VG46", "oilViscosityIndex": 140,`, `"oil": "VG100",`, ErrValue,
			[]string{"transmission.oil", "VG100", "oilViscosityIndex"}},
		{"not a grade", "", `"oil": "VG46"`, `"oil": "VG47"`, ErrValue,
			[]string{"transmission.oil", "VG47", "ISO 3448"}},
		{"viscosity and grade", "", `"oilViscosityIndex": 140,`, `"oilViscosityIndex": 140, "oilViscosity": "20 cP",`, ErrValue,
			[]string{"transmission.oilViscosity", "not both"}},
		{"negative viscosity", alt, `"oilViscosity": "25 mPa·s"`, `"oilViscosity": "-25 mPa·s"`, ErrValue,
			[]string{"alternatives[0].oilViscosity", "greater than zero"}},
		{"no oil", alt, `"oilViscosity": "25 mPa·s",`, ``, ErrValue,
			[]string{"alternatives[0].oil", "missing"}},
		{"undercut", alt, `"sunShift": 0.2, "planetShift": -0.2, "ringShift": -0.2`, `"planetShift": -0.2, "ringShift": -0.2`, planetary.ErrUndercut,
			[]string{"alternatives[0].set.teeth", "undercut"}},
		{"ratio disagrees", alt, `"set": {"basicEfficiency": 0.98,`, `"set": {"fixedCarrierRatio": -2.5, "basicEfficiency": 0.98,`, ErrValue,
			[]string{"alternatives[0].set.fixedCarrierRatio = -2.5", "-3.8"}},
		{"arrangement", alt, `"planets": 3,`, `"planets": 3, "arrangement": "triple planet",`, ErrValue,
			[]string{"alternatives[0].set.teeth.arrangement", "triple planet"}},
		{"misspelt shift", alt, `"sunShift"`, `"sunshift"`, ErrUnknownKey,
			[]string{"alternatives[0].set.teeth.sunshift"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			_, err := Parse("mine.json", []byte(replaceIn(t, base, c.after, c.old, c.new)))
			if err == nil {
				t.Fatal("Parse = nil error, want one")
			}
			if !errors.Is(err, c.kind) {
				t.Errorf("error %q is not %v", err, c.kind)
			}
			var fe *FieldError
			if !errors.As(err, &fe) {
				t.Errorf("error %q holds no *FieldError", err)
			}
			for _, p := range append(c.want, "mine.json:") {
				if !strings.Contains(err.Error(), p) {
					t.Errorf("error %q does not contain %q", err, p)
				}
			}
		})
	}
}

// FuzzComponentFields: the component file with a swing, a shift, a
// viscosity index and a fixed viscosity replaced by arbitrary text either
// fails to parse or parses, saves and parses again to equal values.
func FuzzComponentFields(f *testing.F) {
	f.Add("over centre", "0.2", "140", "25 mPa·s")
	f.Add("to-zero", "0.5", "-20", "0.02 Pa·s")
	f.Add("sideways", "3", "1e9", "-1 cP")
	f.Add("", "NaN", "null", "")
	base := componentFile(f)
	f.Fuzz(func(t *testing.T, swing, shift, vi, mu string) {
		text := replaceIn(t, base, "", `"swing": "to zero"`, `"swing": `+strconv.Quote(swing))
		text = replaceIn(t, text, "", `"oilViscosityIndex": 140`, `"oilViscosityIndex": `+vi)
		const alt = `"kind": "output-coupled"`
		text = replaceIn(t, text, alt, `"sunShift": 0.2`, `"sunShift": `+shift)
		text = replaceIn(t, text, alt, `"oilViscosity": "25 mPa·s"`, `"oilViscosity": `+strconv.Quote(mu))
		a, err := Parse("fuzz.json", []byte(text))
		if err != nil {
			return
		}
		reparse(t, a)
	})
}
