package hydrostat

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// benchData generates test-bench measurements of a unit with model m over
// a grid of speeds, pressures, settings and temperatures, in both modes,
// with relative Gaussian noise of size noise on flow and torque (seeded).
func benchData(t *testing.T, m Wilson, d units.Displacement, noise float64, settings []float64) []Measurement {
	t.Helper()
	u := mustUnit(t, UnitSpec{MaxDisplacement: d, Loss: m})
	rng := rand.New(rand.NewPCG(1, 2))
	var ms []Measurement
	for _, mode := range []Mode{Pumping, Motoring} {
		for _, rpm := range []float64{600, 1200, 1800, 2400, 3000} {
			for _, bar := range []float64{50, 150, 250, 350} {
				for _, x := range settings {
					for _, c := range []float64{45, 70} {
						dp := units.Bar(bar)
						if mode == Motoring {
							dp = -dp
						}
						p, err := u.At(x, units.RPM(rpm), dp, VG46, units.Celsius(c))
						if err != nil {
							t.Fatal(err)
						}
						q, tq := math.Abs(float64(p.Flow)), math.Abs(float64(p.Torque))
						ms = append(ms, Measurement{Speed: units.RPM(rpm), Pressure: units.Bar(bar), Setting: x,
							Flow:   units.VolumeFlow(q * (1 + noise*rng.NormFloat64())),
							Torque: units.Torque(tq * (1 + noise*rng.NormFloat64())), Temperature: units.Celsius(c), Mode: mode})
					}
				}
			}
		}
	}
	return ms
}

// TestFitWilsonRecovers fits generated data: without noise the known
// coefficients come back to rounding; with noise of 0.1 % on flow and
// torque (a good test bench) within a few per cent, and the fitted model's
// efficiencies stay within a few tenths of a point of the measured ones.
func TestFitWilsonRecovers(t *testing.T) {
	t.Parallel()
	d := units.CCPerRev(90)
	cases := []struct {
		name     string
		m        Wilson
		spec     FitSpec
		settings []float64
	}{
		{"classic", Wilson{Slip: 5e-9, Viscous: 5e4, Friction: 0.02, ConstantPressure: units.Bar(1)},
			FitSpec{}, []float64{1}},
		{"extended", Wilson{Slip: 5e-9, Viscous: 5e4, Friction: 0.02, ConstantPressure: units.Bar(2), Hydrodynamic: 8,
			Compressibility: true, DeadVolume: 0.5, LeakageSetting: 0.4, TorqueSetting: 0.6, ConstantTorque: 2},
			FitSpec{Compressibility: true, Hydrodynamic: true, SettingShares: true, ConstantTorque: true}, []float64{0.3, 0.6, 1}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			spec := c.spec
			spec.MaxDisplacement, spec.Oil = d, VG46
			for _, noise := range []float64{0, 1e-3} {
				f, err := FitWilson(spec, benchData(t, c.m, d, noise, c.settings))
				if err != nil {
					t.Fatalf("noise %v: %v", noise, err)
				}
				tol := 1e-6
				if noise > 0 {
					tol = 0.05
				}
				got, want := f.Model, c.m
				for _, k := range []struct {
					name   string
					g, w   float64
					absTol float64
				}{
					{"Cs", got.Slip, want.Slip, 0}, {"Cv", got.Viscous, want.Viscous, 0}, {"Cf", got.Friction, want.Friction, 0},
					{"p_c", float64(got.ConstantPressure), float64(want.ConstantPressure), 0.5e5 * tol / 0.05},
					{"Ch", got.Hydrodynamic, want.Hydrodynamic, 0}, {"Cr", got.DeadVolume, want.DeadVolume, 0},
					{"s_q", got.LeakageSetting, want.LeakageSetting, 0}, {"s_t", got.TorqueSetting, want.TorqueSetting, 0},
					{"T_0", float64(got.ConstantTorque), float64(want.ConstantTorque), 0.5 * tol / 0.05},
				} {
					if !testutil.Close(k.g, k.w, tol, k.absTol) {
						t.Errorf("noise %v: %s = %g, want %g", noise, k.name, k.g, k.w)
					}
				}
				limit := 1e-9
				if noise > 0 {
					limit = 0.01
				}
				if !(f.MaxOverallError < limit) {
					t.Errorf("noise %v: largest overall-efficiency error %v", noise, f.MaxOverallError)
				}
				if noise == 0 && (f.RMSLeakage > 1e-12 || f.RMSTorque > 1e-7) {
					t.Errorf("noise-free residuals %v, %v", f.RMSLeakage, f.RMSTorque)
				}
			}
		})
	}
}

// TestISO4409FromMeasurements computes the efficiencies directly from
// measured quantities.
func TestISO4409FromMeasurements(t *testing.T) {
	t.Parallel()
	// From memory: Fluid Power with Applications, pump example:
	// 100 cm³/rev at 1000 rpm and 70 bar delivers 0.0015 m³/s with 120 N·m:
	// η_v = 90 %, η_m = 92.8 %, η_o = 83.5 %; motor example: 164 cm³/rev at
	// 70 bar and 2000 rpm takes 0.006 m³/s and delivers 170 N·m:
	// η_v = 91.1 %, η_m = 93.0 %, η_o = 84.8 %.
	for _, c := range []struct {
		m          Measurement
		d          units.Displacement
		v, hm, all float64
	}{
		{Measurement{Speed: units.RPM(1000), Pressure: units.Bar(70), Setting: 1, Flow: 0.0015, Torque: 120,
			Temperature: units.Celsius(50), Mode: Pumping}, units.CCPerRev(100), 0.900, 0.928, 0.835},
		{Measurement{Speed: units.RPM(2000), Pressure: units.Bar(70), Setting: 1, Flow: 0.006, Torque: 170,
			Temperature: units.Celsius(50), Mode: Motoring}, units.CCPerRev(164), 0.911, 0.930, 0.848},
	} {
		e, err := ISO4409(c.m, c.d)
		if err != nil {
			t.Fatal(err)
		}
		if !testutil.Close(e.Volumetric, c.v, 1.5e-3, 0) || !testutil.Close(e.HydroMechanical, c.hm, 1.5e-3, 0) || !testutil.Close(e.Overall, c.all, 1.5e-3, 0) {
			t.Errorf("ISO4409(%v) = %+v, want %v %v %v", c.m.Mode, e, c.v, c.hm, c.all)
		}
		// Source: ISO 4409: overall efficiency = output power / input power.
		pin, pout := float64(c.m.Torque)*float64(c.m.Speed), float64(c.m.Pressure)*float64(c.m.Flow)
		if c.m.Mode == Motoring {
			pin, pout = pout, pin
		}
		if !testutil.Close(e.Overall, pout/pin, 1e-12, 0) {
			t.Errorf("overall %v, power ratio %v", e.Overall, pout/pin)
		}
	}
	if _, err := ISO4409(Measurement{Speed: 1, Pressure: 1, Setting: 2, Flow: 1, Torque: 1, Temperature: 300}, 1); !errors.Is(err, ErrInvalid) {
		t.Errorf("setting 2: %v", err)
	}
}

// TestFitWilsonRefuses: data that cannot determine a coefficient is
// refused with ErrUndetermined, naming it.
func TestFitWilsonRefuses(t *testing.T) {
	t.Parallel()
	d := units.CCPerRev(90)
	w := Wilson{Slip: 5e-9, Viscous: 5e4, Friction: 0.02, ConstantPressure: units.Bar(1)}
	all := benchData(t, w, d, 0, []float64{1})
	// One speed and one temperature: D·μ·ω is the same at every point,
	// proportional to D, so Cv and p_c cannot be told apart.
	var one []Measurement
	for _, m := range all {
		if m.Speed == units.RPM(1800) && m.Temperature == units.Celsius(45) {
			one = append(one, m)
		}
	}
	spec := FitSpec{MaxDisplacement: d, Oil: VG46}
	if _, err := FitWilson(spec, one); !errors.Is(err, ErrUndetermined) {
		t.Errorf("one speed: %v, want ErrUndetermined", err)
	}
	// Setting shares from one setting.
	if _, err := FitWilson(FitSpec{MaxDisplacement: d, Oil: VG46, SettingShares: true}, all); !errors.Is(err, ErrUndetermined) {
		t.Errorf("shares from one setting: %v, want ErrUndetermined", err)
	}
	// A constant torque besides p_c at s_t = 0: both multiply a constant.
	if _, err := FitWilson(FitSpec{MaxDisplacement: d, Oil: VG46, ConstantTorque: true}, all); !errors.Is(err, ErrUndetermined) {
		t.Errorf("T_0 and p_c at one setting: %v, want ErrUndetermined", err)
	}
	// Too few points.
	if _, err := FitWilson(spec, all[:2]); !errors.Is(err, ErrUndetermined) {
		t.Errorf("two points: %v, want ErrUndetermined", err)
	}
	bad := append([]Measurement(nil), all...)
	bad[3].Flow = units.VolumeFlow(math.NaN())
	if _, err := FitWilson(spec, bad); !errors.Is(err, ErrInvalid) {
		t.Errorf("NaN flow: %v, want ErrInvalid", err)
	}
}
