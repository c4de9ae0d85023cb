package vehicle_test

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// The Chen–Flynn motoring estimate against a hand calculation: 6.8 L,
// 135 mm stroke, compression ratio 17, at 2000 rpm. p_max = 1.01325 bar ·
// 17^1.3 = 40.30 bar, S_p = 2·0.135·2000/60 = 9.0 m/s, FMEP = 0.137 +
// 40.30/200 + 0.162·9.0 = 1.7965 bar, T = 1.7965e5·6.8e-3/(4π) = 97.21 N·m.
// Hand calculation from the correlation as documented (its coefficients
// from memory: SAE 650733, 1965).
func TestMotoringChenFlynn(t *testing.T) {
	t.Parallel()
	s := demoEngineSpec()
	s.Displacement, s.Stroke, s.CompressionRatio = units.Litres(6.8), units.Millimetres(135), 17
	e, err := vehicle.NewEngine(s)
	if err != nil {
		t.Fatal(err)
	}
	if got := float64(e.MotoringTorque(units.RPM(2000))); math.Abs(got-97.21) > 0.01 {
		t.Errorf("MotoringTorque(2000 rpm) = %.3f N·m, want 97.21", got)
	}
	// A measured curve takes precedence and is held beyond its ends.
	s.MotoringSpeeds = []units.AngularVelocity{units.RPM(1000), units.RPM(2000)}
	s.MotoringTorques = []units.Torque{60, 100}
	e, err = vehicle.NewEngine(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ rpm, want float64 }{{500, 60}, {1500, 80}, {2500, 100}} {
		if got := float64(e.MotoringTorque(units.RPM(c.rpm))); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("curve MotoringTorque(%g rpm) = %g, want %g", c.rpm, got, c.want)
		}
	}
	s.MotoringTorques = []units.Torque{60, -1}
	if _, err := vehicle.NewEngine(s); err == nil {
		t.Error("negative motoring torque accepted")
	}
}

// Overrun: on a descent the motored engine absorbs up to its motoring
// torque and burns no fuel; the service brakes take only the rest, and
// the point's power flows still balance.
func TestOverrunEngineBraking(t *testing.T) {
	t.Parallel()
	v := demoVehicle(t, true)
	w := units.RPM(1500)
	tm := float64(demoEngine(t, true).MotoringTorque(w))
	trailer := vehicle.Trailer{Mass: units.Tonnes(8), RollingCoefficient: 0.02}
	for _, c := range []struct {
		grade     float64
		wantBrake bool
	}{{-0.01, false}, {-0.03, false}, {-0.10, true}} {
		d := vehicle.Demand{Speed: units.KMH(25), Grade: c.grade, Trailer: trailer}
		p, err := v.At(d, w, 1)
		if err != nil {
			t.Fatalf("grade %g: %v", c.grade, err)
		}
		f := p.Flows
		sinks := f.EngineBraking + f.Hydrostatic + f.Mechanical + f.NoLoad + f.PTOLoss + f.PTO + f.Slip + f.Rolling + f.Brake +
			f.Drawbar + f.Trailer + f.Aero + f.Grade + f.Inertia
		if r := math.Abs(float64(f.Engine - sinks)); r > 1e-6*math.Abs(float64(f.Grade)) {
			t.Errorf("grade %g: engine %v, sinks %v", c.grade, f.Engine, sinks)
		}
		if p.EngineTorque >= 0 {
			if c.grade <= -0.03 {
				t.Errorf("grade %g: engine still drives (%v)", c.grade, p.EngineTorque)
			}
			continue
		}
		if p.FuelRate != 0 || f.Fuel != 0 {
			t.Errorf("grade %g: motored engine burns %v", c.grade, p.FuelRate)
		}
		if math.Abs(float64(f.EngineBraking)-(-float64(p.EngineTorque)*float64(w))) > 1e-9*float64(f.EngineBraking) {
			t.Errorf("grade %g: engine braking %v for torque %v", c.grade, f.EngineBraking, p.EngineTorque)
		}
		if c.wantBrake {
			if !(f.Brake > 0) || math.Abs(-float64(p.EngineTorque)-tm) > 1e-6*tm {
				t.Errorf("grade %g: brake %v, engine torque %v, motoring %.2f", c.grade, f.Brake, p.EngineTorque, tm)
			}
		} else if f.Brake != 0 || -float64(p.EngineTorque) > tm*(1+1e-9) {
			t.Errorf("grade %g: brake %v with engine torque %v (motoring %.2f)", c.grade, f.Brake, p.EngineTorque, tm)
		}
	}
}

// The idle drag of an unloaded PTO driveline against a hand calculation:
// 6 oil films of 60–85 mm radius at 0.25 mm in oil of 20 cSt and
// 860 kg/m³ (μ = 0.0172 Pa·s), slipping at the engine speed 1800 rpm
// (188.50 rad/s): T = 6·π·0.0172·188.50·(0.085⁴ − 0.060⁴)/(2·0.25e-3)
// = 4.796 N·m, plus two bearings of dm 70 mm, f0 2 at ν·n = 36000:
// 2·1e-7·2·36000^(2/3)·70³ N·mm = 0.1496 N·m; P = 4.946·188.50 = 932.3 W.
// Hand calculation from the published formulas of the root package.
func TestPTOIdleDrag(t *testing.T) {
	t.Parallel()
	idle := &vehicle.PTOIdle{
		Plates:    powersplit.Plates{Films: 6, Inner: units.Millimetres(60), Outer: units.Millimetres(85), Clearance: units.Millimetres(0.25)},
		Bearings:  powersplit.Bearings{MeanDiameter: units.Millimetres(70), F0: 2, Count: 2},
		Lubricant: powersplit.Lubricant{Viscosity: units.Centistokes(20), Density: 860},
	}
	w := units.RPM(1800)
	ws := float64(w)
	plates := 6 * math.Pi * 20e-6 * 860 * ws * (math.Pow(0.085, 4) - math.Pow(0.060, 4)) / (2 * 0.25e-3)
	bearings := 2 * 1e-7 * 2 * math.Pow(20*1800, 2.0/3) * 70 * 70 * 70 * 1e-3
	want := (plates + bearings) * ws
	if got := float64(idle.Power(w)); math.Abs(got-want) > 1e-9*want || math.Abs(got-932.3) > 0.5 {
		t.Errorf("idle PTO drag %.3f W, want %.3f (≈932.3)", got, want)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.02), Transmission: demoTransmission(), FinalDrive: 20,
		Engine: demoEngine(t, true), PTO: vehicle.PTO{Ratios: []float64{3.5, 1.9}, Idle: idle}})
	if err != nil {
		t.Fatal(err)
	}
	p, err := v.At(vehicle.Demand{Speed: units.KMH(8)}, w, 0)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(float64(p.Flows.PTOLoss)-want) > 1e-9*want {
		t.Errorf("unloaded PTO loss %v, want %.3f W", p.Flows.PTOLoss, want)
	}
	p, err = v.At(vehicle.Demand{Speed: units.KMH(8), PTOPower: units.Kilowatts(40)}, w, 0)
	if err != nil {
		t.Fatal(err)
	}
	if want := 40e3 * (1/vehicle.DefaultPTOEfficiency - 1); math.Abs(float64(p.Flows.PTOLoss)-want) > 1e-9*want {
		t.Errorf("loaded PTO loss %v, want %.3f W", p.Flows.PTOLoss, want)
	}
}
