package vehicle_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

func TestD497Draft(t *testing.T) {
	t.Parallel()
	// Source: ASABE D497.7 (2011), Table 1, draft equation
	// D = F_i·[A + B·S + C·S²]·W·T. From memory: the row parameters are
	// recalled (see implement.go); the expected drafts are hand
	// calculations from them.
	tests := []struct {
		name  string
		row   vehicle.DraftRow
		tex   vehicle.Texture
		kmh   float64
		width float64
		cm    float64
		want  float64 // N
	}{
		// 1.0·(652 + 5.1·8²)·1.5 m·20 cm
		{"moldboard plough, fine", vehicle.MoldboardPlough, vehicle.Fine, 8, 1.5, 20, 29352},
		// 0.88·(309 + 16·7)·5 m·10 cm
		{"tandem disk, primary, medium", vehicle.TandemDiskPrimary, vehicle.Medium, 7, 5, 10, 18524},
		// 0.65·(91 + 5.4·9)·9 tools·15 cm
		{"chisel plough, coarse", vehicle.ChiselPlough, vehicle.Coarse, 9, 9, 15, 12249.9},
		// 0.85·(32 + 1.9·10)·30 tools·8 cm
		{"field cultivator, secondary, medium", vehicle.FieldCultivatorSecondary, vehicle.Medium, 10, 30, 8, 10404},
		// 900 N/row·12 rows, independent of speed and depth
		{"planter, drawn", vehicle.PlanterDrawn, vehicle.Fine, 8, 12, 5, 10800},
	}
	for _, tt := range tests {
		got, err := tt.row.Draft(tt.tex, units.KMH(tt.kmh), tt.width, units.Centimetres(tt.cm))
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		if !testutil.Close(float64(got), tt.want, 1e-9, 0) {
			t.Errorf("%s: Draft = %v, want %v N", tt.name, got, tt.want)
		}
	}
	// The soil factors order the textures: fine > medium > coarse.
	for _, r := range vehicle.DraftRows() {
		if err := r.Validate(); err != nil {
			t.Errorf("%s: %v", r.Name, err)
		}
		if r.F[0] < r.F[1] || r.F[1] < r.F[2] {
			t.Errorf("%s: soil factors %v not ordered", r.Name, r.F)
		}
	}
}

func TestD497Fuel(t *testing.T) {
	t.Parallel()
	// Source: ASABE D497.7 (2011), fuel consumption,
	// Q = (0.22·X + 0.096)·P_rated·[1 − (N/N_rated − 1)·(0.45·X − 0.877)] L/h.
	// From memory: the coefficients are recalled; the expected values are
	// hand calculations for a 100 kW rated power.
	tests := []struct {
		x, n, want float64 // load ratio, speed ratio, L/h
	}{
		{1, 1, 31.6},
		{0.75, 1, 26.1},
		{0.5, 1, 20.6},
		{0.2, 1, 14.0},
		{0.5, 0.8, 20.6 * (1 - 0.2*0.652)}, // reduced engine speed: 13 % less
	}
	for _, tt := range tests {
		got := vehicle.D497Fuel(tt.x, tt.n, units.Kilowatts(100)).LitresPerHour()
		if !testutil.Close(got, tt.want, 1e-12, 0) {
			t.Errorf("D497Fuel(%v, %v, 100 kW) = %v L/h, want %v", tt.x, tt.n, got, tt.want)
		}
	}
	// The same through the engine: at rated speed and full torque the
	// specific volumetric consumption is 0.316 L/kWh.
	e := demoEngine(t, false)
	tq, err := e.MaxTorque(e.Rated())
	if err != nil {
		t.Fatal(err)
	}
	m, err := e.FuelRate(e.Rated(), tq)
	if err != nil {
		t.Fatal(err)
	}
	lph := units.VolumeFlowFromMassFlow(m, vehicle.DieselDensity).LitresPerHour()
	if want := 0.316 * e.RatedPower().Kilowatts(); !testutil.Close(lph, want, 1e-9, 0) {
		t.Errorf("engine fuel at rated = %v L/h, want %v", lph, want)
	}
}

func TestRoadRollingCoefficients(t *testing.T) {
	t.Parallel()
	// From memory: Theory of Ground Vehicles (3rd ed., 2001),
	// chapter 1, table of rolling-resistance coefficients (car tyres).
	tests := []struct {
		road vehicle.Road
		want float64
	}{
		{vehicle.Concrete, 0.013},
		{vehicle.RolledGravel, 0.02},
		{vehicle.TarMacadam, 0.025},
		{vehicle.Unpaved, 0.05},
		{vehicle.FieldSurface, 0.1},
	}
	for _, tt := range tests {
		got, ok := tt.road.RollingCoefficient()
		if !ok || got != tt.want {
			t.Errorf("%v.RollingCoefficient() = %v, %v, want %v", tt.road, got, ok, tt.want)
		}
	}
	if _, ok := vehicle.Road(99).RollingCoefficient(); ok {
		t.Error("unknown road has a coefficient")
	}
	// Hand calculation: 10 t on concrete, level: 0.013·10 000 kg·9.806 65 m/s².
	f, _ := vehicle.Concrete.RollingCoefficient()
	if got := vehicle.RollingResistance(units.Tonnes(10), f, 0); !testutil.Close(float64(got), 1274.8645, 1e-9, 0) {
		t.Errorf("RollingResistance = %v, want 1274.8645 N", got)
	}
}

func TestPTOSpeeds(t *testing.T) {
	t.Parallel()
	// Transcription check: the constants are the nominal PTO speeds of
	// ISO 500-1:2014 (From memory: 540 and 1 000 r/min). The rest of the
	// test is hand calculation (engine speed = ratio × PTO speed), a
	// consistency check of the package's kinematics, not of the standard.
	if got := vehicle.PTO540.RPM(); !testutil.Close(got, 540, 1e-12, 0) {
		t.Errorf("PTO540 = %v rpm", got)
	}
	if got := vehicle.PTO1000.RPM(); !testutil.Close(got, 1000, 1e-12, 0) {
		t.Errorf("PTO1000 = %v rpm", got)
	}
	// Hand calculation: engine speed = ratio × PTO speed.
	p := vehicle.PTO{Ratios: []float64{3.5, 1.9}}
	ws, err := p.EngineSpeeds(vehicle.PTO540)
	if err != nil {
		t.Fatal(err)
	}
	if !testutil.Close(ws[0].RPM(), 1890, 1e-12, 0) || !testutil.Close(ws[1].RPM(), 1026, 1e-12, 0) {
		t.Errorf("EngineSpeeds(540) = %v", ws)
	}
	w, _ := vehicle.EngineSpeed(1.9, vehicle.PTO1000)
	if !testutil.Close(w.RPM(), 1900, 1e-12, 0) {
		t.Errorf("EngineSpeed(1.9, 1000 rpm) = %v", w)
	}
	if _, err := vehicle.EngineSpeed(0, vehicle.PTO540); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("EngineSpeed(0) error = %v", err)
	}
	// A stationary PTO demand at 1000 r/min runs the engine at 1900 rpm
	// (the 1.9 ratio: the 3.5 ratio would need 3500 rpm, off the curve).
	v := demoVehicle(t, true)
	pt, err := vehicle.LeastFuel{}.Operate(v, vehicle.Demand{PTOPower: units.Kilowatts(50), PTOSpeed: vehicle.PTO1000})
	if err != nil {
		t.Fatal(err)
	}
	if !testutil.Close(pt.EngineSpeed.RPM(), 1900, 1e-9, 0) {
		t.Errorf("engine speed for 1000 rpm PTO = %v", pt.EngineSpeed)
	}
}

func TestResistances(t *testing.T) {
	t.Parallel()
	// Hand calculations.
	if got := vehicle.AeroDrag(4, vehicle.AirDensity, units.KMH(40)); !testutil.Close(float64(got), 0.5*1.225*4*math.Pow(40/3.6, 2), 1e-12, 0) {
		t.Errorf("AeroDrag = %v", got)
	}
	if got := vehicle.GradeResistance(units.Tonnes(10), 0.1); !testutil.Close(float64(got), 1e4*9.80665*0.1/math.Sqrt(1.01), 1e-12, 0) {
		t.Errorf("GradeResistance = %v", got)
	}
	if got, _ := vehicle.RotatingMass(10, 1, 0.8); !testutil.Close(float64(got), 15.625, 1e-12, 0) {
		t.Errorf("RotatingMass = %v", got)
	}
	if got := vehicle.InertiaResistance(1000, 50, 2); got != 2100 {
		t.Errorf("InertiaResistance = %v", got)
	}
	tr := vehicle.Trailer{Mass: units.Tonnes(8), RollingCoefficient: 0.02}
	want := 8000 * 9.80665 * (0.02 + 0.05) / math.Sqrt(1+0.05*0.05)
	if got := tr.Pull(0.05, 0); !testutil.Close(float64(got), want, 1e-12, 0) {
		t.Errorf("Trailer.Pull = %v, want %v", got, want)
	}
}

func TestEngine(t *testing.T) {
	t.Parallel()
	e := demoEngine(t, true)
	// Interpolated curve: halfway between 1300 (900 N·m) and 1500 rpm (880 N·m).
	if got, err := e.MaxTorque(units.RPM(1400)); err != nil || !testutil.Close(float64(got), 890, 1e-12, 0) {
		t.Errorf("MaxTorque(1400 rpm) = %v, %v", got, err)
	}
	var le *vehicle.LimitError
	if _, err := e.MaxTorque(units.RPM(2500)); !errors.As(err, &le) || !errors.Is(err, vehicle.ErrEngineLimit) {
		t.Errorf("MaxTorque(2500 rpm) error = %v", err)
	}
	if _, err := e.FuelRate(units.RPM(1400), 950); !errors.As(err, &le) || le.Limit.SI != 890 {
		t.Errorf("FuelRate above curve error = %v", err)
	}
	// The Willans demo map: SFC falls with load at fixed speed.
	b1, _ := e.SpecificFuel(units.RPM(1600), 200)
	b2, _ := e.SpecificFuel(units.RPM(1600), 800)
	if !(b2 < b1) {
		t.Errorf("SFC at 800 N·m %v not below SFC at 200 N·m %v", b2, b1)
	}
	if g := b2.GramsPerKWh(); g < 180 || g > 260 {
		t.Errorf("demo SFC %v g/kWh outside a diesel's usual range", g)
	}
	bad := []vehicle.EngineSpec{
		{},
		{CurveSpeeds: []units.AngularVelocity{100, 50}, CurveTorques: []units.Torque{1, 1}, Rated: 100},
		{CurveSpeeds: []units.AngularVelocity{50, 100}, CurveTorques: []units.Torque{1, units.Torque(math.NaN())}, Rated: 100},
		{CurveSpeeds: []units.AngularVelocity{50, 100}, CurveTorques: []units.Torque{1, 1}, Rated: 200},
	}
	for i, s := range bad {
		if _, err := vehicle.NewEngine(s); !errors.Is(err, vehicle.ErrInvalid) {
			t.Errorf("bad spec %d: error = %v", i, err)
		}
	}
}

func TestBadInput(t *testing.T) {
	t.Parallel()
	v := demoVehicle(t, false)
	if _, err := vehicle.New(vehicle.Spec{Mass: -1}); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("negative mass: %v", err)
	}
	if _, err := vehicle.Simulate(v, vehicle.LeastFuel{}, nil, vehicle.Options{}); !errors.Is(err, vehicle.ErrEmptyCycle) {
		t.Errorf("empty cycle: %v", err)
	}
	if _, err := v.At(vehicle.Demand{Speed: units.Speed(math.NaN())}, units.RPM(1500), 0); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("NaN speed: %v", err)
	}
	// Demand beyond the engine: 60 kN at 12 km/h is 200 kW at the drawbar.
	_, err := vehicle.FixedSpeed{Speed: units.RPM(1800)}.Operate(v, vehicle.Demand{Speed: units.KMH(12), Draft: units.Kilonewtons(60)})
	if !errors.Is(err, vehicle.ErrInfeasible) || !errors.Is(err, vehicle.ErrEngineLimit) {
		t.Errorf("beyond the engine: %v", err)
	}
	// Grade beyond traction: 60 % with μ_max 0.85 and a heavy trailer.
	_, err = v.At(vehicle.Demand{Speed: units.KMH(5), Grade: 0.6, Trailer: vehicle.Trailer{Mass: units.Tonnes(10), RollingCoefficient: 0.02}}, units.RPM(1800), 0)
	if !errors.Is(err, vehicle.ErrTraction) {
		t.Errorf("beyond traction: %v", err)
	}
	// An infeasible segment is reported and the rest still runs.
	cycle := demoCycle()
	cycle[1].Implement = &vehicle.Implement{Row: vehicle.MoldboardPlough, Width: 6, Depth: units.Centimetres(30)}
	cycle = append(cycle, vehicle.Segment{Name: "bad", Kind: vehicle.FieldPass, Speed: -1, Distance: 10})
	day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{})
	if err != nil {
		t.Fatal(err)
	}
	var se *vehicle.SegmentError
	if !errors.As(day.Segments[1].Err, &se) || se.Index != 1 {
		t.Errorf("heavy plough segment: %v", day.Segments[1].Err)
	}
	if !errors.Is(day.Segments[len(cycle)-1].Err, vehicle.ErrInvalid) {
		t.Errorf("bad segment: %v", day.Segments[len(cycle)-1].Err)
	}
	if day.Segments[3].Err != nil || day.Audit.Fuel <= 0 {
		t.Errorf("the other segments did not run: %v", day.Err())
	}
	if r := day.Audit.RelativeResidual(); r > 1e-9 {
		t.Errorf("audit residual %g", r)
	}
}

func TestTractionAdapter(t *testing.T) {
	t.Parallel()
	v, err := vehicle.New(vehicle.Spec{
		Mass: units.Tonnes(9), Tyres: demoTraction(t), Transmission: demoTransmission(),
		FinalDrive: 20, Engine: demoEngine(t, true),
	})
	if err != nil {
		t.Fatal(err)
	}
	p, err := vehicle.LeastFuel{}.Operate(v, vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(25)})
	if err != nil {
		t.Fatal(err)
	}
	if !(p.Slip > 0 && p.Slip < 0.3) || p.Flows.Slip <= 0 || p.Flows.Rolling <= 0 {
		t.Errorf("slip %v, slip loss %v, rolling %v", p.Slip, p.Flows.Slip, p.Flows.Rolling)
	}
	_, err = vehicle.LeastFuel{}.Operate(v, vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(200)})
	if !errors.Is(err, vehicle.ErrInfeasible) {
		t.Errorf("200 kN: %v", err)
	}
}

func TestAxleLoads(t *testing.T) {
	t.Parallel()
	g := &vehicle.Geometry{Wheelbase: units.Metres(2.8), CentreOfMass: units.Metres(1.1),
		CentreOfMassHeight: units.Metres(1), HitchHeight: units.Metres(0.6)}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: demoTransmission(),
		FinalDrive: 20, Engine: demoEngine(t, false), Geometry: g})
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation, level, standing: W_f = W·x/L.
	f, r, err := v.AxleLoads(vehicle.Demand{})
	W := 9000 * 9.80665
	if err != nil || !testutil.Close(float64(f), W*1.1/2.8, 1e-12, 0) || !testutil.Close(float64(f+r), W, 1e-12, 0) {
		t.Errorf("AxleLoads(level) = %v, %v, %v", f, r, err)
	}
	// Pull moves weight to the rear: 20 kN at 0.6 m takes 20 000·0.6/2.8 N off the front.
	f2, _, err := v.AxleLoads(vehicle.Demand{Speed: 1, Draft: units.Kilonewtons(20)})
	if err != nil || !testutil.Close(float64(f-f2), 20000*0.6/2.8, 1e-9, 0) {
		t.Errorf("transfer = %v, %v", f-f2, err)
	}
	// A pull that lifts the front is reported, not hidden.
	_, err = v.At(vehicle.Demand{Speed: units.KMH(3), Draft: units.Kilonewtons(200), Grade: 0.2}, units.RPM(1500), 0)
	if !errors.Is(err, vehicle.ErrStability) {
		t.Errorf("front lift: %v", err)
	}
}
