package planetary_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

func mustNew(t testing.TB, d planetary.Design) planetary.Set {
	t.Helper()
	s, err := planetary.New(d)
	if err != nil {
		t.Fatalf("New(%+v): %v", d, err)
	}
	return s
}

func mustRatio(t testing.TB, i0, eta0 float64) planetary.Set {
	t.Helper()
	s, err := planetary.FromRatio(i0, eta0)
	if err != nil {
		t.Fatalf("FromRatio(%v, %v): %v", i0, eta0, err)
	}
	return s
}

// TestWorkedExamples checks speeds against worked examples with published answers.
func TestWorkedExamples(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name    string
		set     func(t testing.TB) planetary.Set
		in      planetary.Speeds
		unknown planetary.Member
		want    float64 // rpm of the unknown member
		tol     float64 // relative
	}{
		{
			// Source: qna.carrieradda.com question 4710, "Mechanical Power Transmission of
			// Farm Machinery": sun 20 T, planet 40 T, ring 100 T held, sun 60 rpm,
			// published answer: arm (carrier) 10 rpm.
			name: "ring held, sun 60 rpm",
			set: func(t testing.TB) planetary.Set {
				return mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
			},
			in:      planetary.Speeds{Sun: units.RPM(60)},
			unknown: planetary.Carrier,
			want:    10,
			tol:     1e-12,
		},
		{
			// Source: homeworksource.com problem 1031202, planetary speed reducer:
			// sun A 23 T held, internal gear C 55 T is the output, arm input 100 rpm,
			// published answer 141.8 rpm (= (55 + 23)/55 · 100, given to 4 digits).
			name:    "sun held, carrier 100 rpm",
			set:     func(t testing.TB) planetary.Set { return mustRatio(t, -55.0/23, 0) },
			in:      planetary.Speeds{Carrier: units.RPM(100)},
			unknown: planetary.Ring,
			want:    141.8,
			tol:     2e-4,
		},
		{
			// Source: "Analysis of Planetary Transmissions", test run of the
			// program listing, lecad.uni-lj.si/~leon/FS/PlanetryTransmissions/node8.html:
			// input sun 21 T, ring 108 T held, output carrier, published transmission
			// ratio 6.14286. With the sun at 6142.86 rpm the carrier turns at 1000 rpm.
			name:    "ring held, ratio 6.14286",
			set:     func(t testing.TB) planetary.Set { return mustRatio(t, -108.0/21, 0) },
			in:      planetary.Speeds{Sun: units.RPM(6142.86)},
			unknown: planetary.Carrier,
			want:    1000,
			tol:     1e-6,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			s := tc.set(t)
			got, err := s.Solve(tc.in, tc.unknown)
			if err != nil {
				t.Fatalf("Solve: %v", err)
			}
			if g := got.Of(tc.unknown).RPM(); !testutil.Close(g, tc.want, tc.tol, 0) {
				t.Errorf("Solve(%v, %v) = %.6g rpm, want %.6g rpm", tc.in, tc.unknown, g, tc.want)
			}
			if r := s.Residual(got); r > 1e-14 {
				t.Errorf("Residual = %g", r)
			}
		})
	}
}

// TestRatios checks the six one-member-held ratios.
func TestRatios(t *testing.T) {
	t.Parallel()
	// Source: "Geometry / Planetary Gears" (2020), open gear-geometry
	// notebook, section Ratios: base ratio u = z3/z1 with z3 < 0 (our i0),
	// i_1V = 1 − u (ring held, sun to carrier), i_3V = 1 − 1/u (sun held, ring to
	// carrier). The carrier-held case is the definition of u; the other three
	// are inverses. Example set sun 20 T, ring 100 T: u = −5.
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	u := -5.0
	tests := []struct {
		in, out planetary.Member
		want    float64
	}{
		{planetary.Sun, planetary.Ring, u},
		{planetary.Ring, planetary.Sun, 1 / u},
		{planetary.Sun, planetary.Carrier, 1 - u},       // 6
		{planetary.Carrier, planetary.Sun, 1 / (1 - u)}, // 1/6
		{planetary.Ring, planetary.Carrier, 1 - 1/u},    // 1.2
		{planetary.Carrier, planetary.Ring, 1 / (1 - 1/u)},
	}
	for _, tc := range tests {
		got, err := s.Ratio(tc.in, tc.out)
		if err != nil {
			t.Fatalf("Ratio(%v, %v): %v", tc.in, tc.out, err)
		}
		if !testutil.Close(got, tc.want, 1e-14, 0) {
			t.Errorf("Ratio(%v, %v) = %.15g, want %.15g", tc.in, tc.out, got, tc.want)
		}
	}
	// Source: homeworksource.com problem 1031202 (as in TestWorkedExamples),
	// here built from tooth counts: sun 23 T held, ring 55 T output, arm 100
	// rpm in, published answer 141.8 rpm (four digits: ±0.05 rpm). The
	// counts are doubled (46/110, same ratio) so that the planet, 32 T, is
	// free of undercut; three planets assemble, (110 + 46)/3 = 52.
	s23 := mustNew(t, planetary.Design{Sun: 46, Ring: 110, Planet: 32, Planets: 3})
	got, err := s23.Ratio(planetary.Carrier, planetary.Ring)
	if err != nil {
		t.Fatal(err)
	}
	if ring := 100 / got; !testutil.Close(ring, 141.8, 0, 0.05) {
		t.Errorf("sun 23 T held, arm 100 rpm: ring %.4g rpm, published 141.8", ring)
	}
	for _, bad := range [][2]planetary.Member{{planetary.Sun, planetary.Sun}, {planetary.Sun, 7}, {-1, planetary.Ring}} {
		if _, err := s.Ratio(bad[0], bad[1]); !errors.Is(err, planetary.ErrMember) {
			t.Errorf("Ratio(%v, %v) error = %v, want ErrMember", bad[0], bad[1], err)
		}
	}
}

// TestFixedCarrierRatio checks i0 from tooth counts for both arrangements.
func TestFixedCarrierRatio(t *testing.T) {
	t.Parallel()
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	if got := s.FixedCarrierRatio(); got != -5 {
		t.Errorf("single: i0 = %g, want -5", got)
	}
	if got := s.BasicEfficiency(); got != planetary.DefaultSingleEfficiency {
		t.Errorf("single: eta0 = %g, want default %g", got, planetary.DefaultSingleEfficiency)
	}
	d := planetary.Design{Sun: 20, Ring: 62, Planet: 18, OuterPlanet: 18, Planets: 3, Arrangement: planetary.DoublePlanet}
	s2 := mustNew(t, d)
	if got := s2.FixedCarrierRatio(); got != 3.1 {
		t.Errorf("double: i0 = %g, want 3.1", got)
	}
	if got := s2.BasicEfficiency(); got != planetary.DefaultDoubleEfficiency {
		t.Errorf("double: eta0 = %g, want default %g", got, planetary.DefaultDoubleEfficiency)
	}
	if got, ok := s2.Design(); !ok || got.Sun != 20 || got.OuterPlanet != 18 {
		t.Errorf("Design() = %+v, %v", got, ok)
	}
	r := mustRatio(t, -2.5, 0.99)
	if _, ok := r.Design(); ok {
		t.Error("FromRatio set reports tooth counts")
	}
}

// efficiency returns the power out over power in for a set with one member held.
func efficiency(t *testing.T, s planetary.Set, in, out planetary.Member) float64 {
	t.Helper()
	var sp planetary.Speeds
	switch out {
	case planetary.Sun:
		sp.Sun = 100
	case planetary.Ring:
		sp.Ring = 100
	case planetary.Carrier:
		sp.Carrier = 100
	}
	sp, err := s.Solve(sp, in)
	if err != nil {
		t.Fatal(err)
	}
	// Drive with a positive input power: input torque in the sense of the input speed.
	tin := units.Torque(math.Copysign(50, float64(sp.Of(in))))
	st, err := s.Torque(sp, in, tin)
	if err != nil {
		t.Fatal(err)
	}
	pin := float64(st.Torques.Of(in)) * float64(st.Speeds.Of(in))
	pout := -float64(st.Torques.Of(out)) * float64(st.Speeds.Of(out))
	return pout / pin
}

// TestEfficiency checks the one-degree-of-freedom efficiencies against the
// closed forms of the carrier-frame method.
func TestEfficiency(t *testing.T) {
	t.Parallel()
	// From memory: Epicyclic Drive Trains (1982), table of the
	// efficiencies of the simple set with one member held, for i0 < 0
	// (also in The Mechanical Efficiency of Epicyclic Gear Trains, ASME J.
	// Mech. Des. 115, 1993, for the 1-dof gear pair entity):
	//   ring held, sun drives carrier:   η = (1 − i0·η0)/(1 − i0) = (1 + |i0|·η0)/(1 + |i0|)
	//   ring held, carrier drives sun:   η = (1 − i0)/(1 − i0/η0)
	//   sun held, ring drives carrier:   η = (|i0| + η0)/(|i0| + 1)
	//   carrier held, sun drives ring:   η = η0
	// Hand calculation for i0 = −5, η0 = 0.98:
	//   (1 + 4.9)/6 = 0.983333…; 6/(1 + 5.102041) = 0.983278…; 5.98/6 = 0.996667…
	s := mustRatio(t, -5, 0.98)
	tests := []struct {
		name    string
		s       planetary.Set
		in, out planetary.Member
		want    float64
	}{
		{"ring held, sun drives", s, planetary.Sun, planetary.Carrier, 5.9 / 6},
		{"ring held, carrier drives", s, planetary.Carrier, planetary.Sun, 6 / (1 + 5/0.98)},
		{"sun held, ring drives", s, planetary.Ring, planetary.Carrier, 5.98 / 6},
		{"carrier held, sun drives", s, planetary.Sun, planetary.Ring, 0.98},
		{"carrier held, ring drives", s, planetary.Ring, planetary.Sun, 0.98},
		// From memory: Epicyclic Drive Trains (1982), positive-ratio set
		// (planet pairs), ring held, sun drives carrier:
		// η = (1 − i0·η0)/(1 − i0). Hand calculation for i0 = 3, η0 = 0.97:
		// (1 − 2.91)/(1 − 3) = 0.955, lower than the simple set.
		{"double planet, ring held, sun drives", mustRatio(t, 3, 0.97), planetary.Sun, planetary.Carrier, 1.91 / 2},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := efficiency(t, tc.s, tc.in, tc.out); !testutil.Close(got, tc.want, 1e-12, 0) {
				t.Errorf("efficiency %v→%v = %.12g, want %.12g", tc.in, tc.out, got, tc.want)
			}
		})
	}
}

// TestAssembly checks the equal-spacing condition on published tooth combinations.
func TestAssembly(t *testing.T) {
	t.Parallel()
	// Source: "Geometry / Planetary Gears" (2020), section Meshing
	// Teeth: equally spaced planets need k = (z1 − z3)/N integer (z3 < 0, so
	// (z_sun + z_ring)/N); the worked combinations (N, z_ring, z_sun):
	// (4, 48, 16), (4, 51, 17), (4, 54, 18) and (5, 52, 18) are equally spaced,
	// (4, 52, 18) can only be built diametrically opposed (k = 17.5).
	tests := []struct {
		n, zr, zs int
		ok        bool
	}{
		{4, 48, 16, true},
		{4, 51, 17, true},
		{4, 54, 18, true},
		{5, 52, 18, true},
		{4, 52, 18, false},
	}
	for _, tc := range tests {
		d := planetary.Design{Sun: tc.zs, Ring: tc.zr, Planet: (tc.zr - tc.zs) / 2, Planets: tc.n}
		err := planetary.Check(d)
		if got := !errors.Is(err, planetary.ErrAssembly); got != tc.ok {
			t.Errorf("Check(%+v) assembly ok = %v, want %v (err %v)", d, got, tc.ok, err)
		}
		if errors.Is(err, planetary.ErrCoaxial) || errors.Is(err, planetary.ErrNeighbour) {
			t.Errorf("Check(%+v) = %v, want no coaxial or neighbour error", d, err)
		}
	}
	var de *planetary.DesignError
	err := planetary.Check(planetary.Design{Sun: 18, Ring: 52, Planet: 17, Planets: 4})
	if !errors.As(err, &de) || de.Condition != "assembly" || de.Value != 2 || de.Limit != 0 {
		t.Errorf("Check(18/52/17, 4 planets) = %#v, want an assembly DesignError with remainder 2", de)
	}
}

// TestNeighbour checks the neighbour condition.
func TestNeighbour(t *testing.T) {
	t.Parallel()
	// Source: "Geometry / Planetary Gears" (2020), section Planet
	// Interference: l = 2·a·sin(π/N) > d_a2. Hand calculation with standard
	// addendum for sun 20, planet 40 (a = 30 m, d_a = 42 m):
	//   N = 3: l = 51.96 m > 42 m   valid
	//   N = 4: l = 42.43 m > 42 m   valid (barely)
	//   N = 5: l = 35.27 m < 42 m   planets touch; (20 + 100)/5 = 24, so only
	//          the neighbour condition fails.
	for _, tc := range []struct {
		n  int
		ok bool
	}{{3, true}, {4, true}, {5, false}, {6, false}} {
		d := planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: tc.n, Module: units.Millimetres(3)}
		err := planetary.Check(d)
		if got := err == nil; got != tc.ok {
			t.Errorf("Check(N=%d) = %v, want ok %v", tc.n, err, tc.ok)
		}
		if !tc.ok {
			var de *planetary.DesignError
			if !errors.As(err, &de) || !errors.Is(de, planetary.ErrNeighbour) || de.Unit != "mm" {
				t.Fatalf("Check(N=%d) = %v, want a neighbour DesignError in mm", tc.n, err)
			}
			want := 2 * 90 * math.Sin(math.Pi/float64(tc.n)) // a = 3 mm · 30
			if !testutil.Close(de.Value, want, 1e-12, 0) || !testutil.Close(de.Limit, 126, 1e-12, 0) {
				t.Errorf("neighbour N=%d: value %g limit %g, want %g and 126 mm", tc.n, de.Value, de.Limit, want)
			}
		}
	}
	// Source: the same published program test run (lecad.uni-lj.si, see
	// TestWorkedExamples): sun 21, planet 43, ring 108, 3 planets, module
	// 1.75 mm, profile-shifted to a centre distance of 56.8 mm. The standard
	// coaxial condition 21 + 2·43 = 107 ≠ 108 fails (the published design
	// needs its profile shift), the assembly condition (21 + 108)/3 = 43
	// holds, and the planets clear each other: 2·56.0·sin 60° = 97.0 mm >
	// 78.75 mm (standard), 2·56.8·sin 60° = 98.4 mm > 78.8 mm (published).
	err := planetary.Check(planetary.Design{Sun: 21, Ring: 108, Planet: 43, Planets: 3, Module: units.Millimetres(1.75)})
	if !errors.Is(err, planetary.ErrCoaxial) || errors.Is(err, planetary.ErrAssembly) || errors.Is(err, planetary.ErrNeighbour) {
		t.Errorf("Check(21/43/108) = %v, want only the coaxial violation", err)
	}
	var de *planetary.DesignError
	if errors.As(err, &de) && (de.Value != 108 || de.Limit != 107) {
		t.Errorf("coaxial error %v, want value 108 limit 107", de)
	}
}

// TestCheckCollectsAll checks that every violation is reported at once.
func TestCheckCollectsAll(t *testing.T) {
	t.Parallel()
	// Sun 12 (undercut), planet 14 (undercut), ring 41 (coaxial: want 40),
	// 4 planets: (12 + 41) mod 4 = 1 (assembly); neighbour 26·sin45° = 18.4 > 16 holds.
	err := planetary.Check(planetary.Design{Sun: 12, Ring: 41, Planet: 14, Planets: 4})
	for _, want := range []error{planetary.ErrUndercut, planetary.ErrCoaxial, planetary.ErrAssembly} {
		if !errors.Is(err, want) {
			t.Errorf("Check = %v, missing %v", err, want)
		}
	}
	if errors.Is(err, planetary.ErrNeighbour) {
		t.Errorf("Check = %v, unexpected neighbour error", err)
	}
	n := len(err.(interface{ Unwrap() []error }).Unwrap())
	if n != 4 {
		t.Errorf("Check reported %d violations, want 4: %v", n, err)
	}
	// Common practice (no published source): 17 teeth is the smallest sun or
	// planet accepted at 20°; From memory: 2/sin²20° = 17.1.
	if got := 2 / math.Pow(math.Sin(20*math.Pi/180), 2); math.Floor(got) != planetary.MinTeeth {
		t.Errorf("2/sin²20° = %g, MinTeeth = %d", got, planetary.MinTeeth)
	}
}

// TestDoublePlanetChecks checks the planet-pair geometry.
func TestDoublePlanetChecks(t *testing.T) {
	t.Parallel()
	// Hand calculation, sun 20, inner 18, outer 18, ring 60, 4 pairs (in modules):
	// a1 = 19, a2 = 21, a12 = 18: |a1 − a2| = 2 < 18 < 40; inner reach 19 + 10 = 29
	// = ring tip radius 29 → touches; so use ring 62: a2 = 22, ring tip 30 > 29,
	// outer reach 22 − 10 = 12 > sun tip 11; (62 − 20)/4 = 10.5 → assembly fails
	// with 4 pairs, holds with 3 (14) and 2 (21).
	base := planetary.Design{Sun: 20, Ring: 62, Planet: 18, Planets: 3, Arrangement: planetary.DoublePlanet}
	if err := planetary.Check(base); err != nil {
		t.Errorf("Check(%+v) = %v, want nil", base, err)
	}
	d := base
	d.Planets = 4
	if err := planetary.Check(d); !errors.Is(err, planetary.ErrAssembly) {
		t.Errorf("Check(4 pairs) = %v, want ErrAssembly", err)
	}
	d = base
	d.Ring = 60
	if err := planetary.Check(d); !errors.Is(err, planetary.ErrCoaxial) {
		t.Errorf("Check(ring 60) = %v, want ErrCoaxial (inner planet reaches the ring tips)", err)
	}
	d = base
	d.Ring, d.OuterPlanet = 100, 17 // a2 = 41.5 > a1 + a12 = 19 + 17.5
	if err := planetary.Check(d); !errors.Is(err, planetary.ErrCoaxial) {
		t.Errorf("Check(ring 100) = %v, want ErrCoaxial (pair cannot close)", err)
	}
}

// TestBadInput checks that invalid input gives the sentinel errors.
func TestBadInput(t *testing.T) {
	t.Parallel()
	valid := planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3}
	tests := []struct {
		name string
		mod  func(d *planetary.Design)
		want error
	}{
		{"zero sun", func(d *planetary.Design) { d.Sun = 0 }, planetary.ErrTeeth},
		{"negative ring", func(d *planetary.Design) { d.Ring = -100 }, planetary.ErrTeeth},
		{"zero planet", func(d *planetary.Design) { d.Planet = 0 }, planetary.ErrTeeth},
		{"zero planets", func(d *planetary.Design) { d.Planets = 0 }, planetary.ErrTeeth},
		{"ring not larger", func(d *planetary.Design) { d.Ring = 20 }, planetary.ErrTeeth},
		{"eta above one", func(d *planetary.Design) { d.BasicEfficiency = 1.01 }, planetary.ErrEfficiency},
		{"eta negative", func(d *planetary.Design) { d.BasicEfficiency = -0.5 }, planetary.ErrEfficiency},
		{"eta NaN", func(d *planetary.Design) { d.BasicEfficiency = math.NaN() }, planetary.ErrEfficiency},
		{"module NaN", func(d *planetary.Design) { d.Module = units.Length(math.NaN()) }, planetary.ErrModule},
		{"module negative", func(d *planetary.Design) { d.Module = -1 }, planetary.ErrModule},
		{"arrangement", func(d *planetary.Design) { d.Arrangement = 5 }, planetary.ErrArrangement},
	}
	for _, tc := range tests {
		d := valid
		tc.mod(&d)
		if _, err := planetary.New(d); !errors.Is(err, tc.want) {
			t.Errorf("%s: New error = %v, want %v", tc.name, err, tc.want)
		}
	}
	for _, r := range []struct{ i0, eta float64 }{
		{0, 0.98}, {math.NaN(), 0.98}, {math.Inf(-1), 0.98}, {1, 0.98}, {1.01, 0.98}, {0.99, 0.98}, {1, 1},
	} {
		if _, err := planetary.FromRatio(r.i0, r.eta); !errors.Is(err, planetary.ErrRatio) {
			t.Errorf("FromRatio(%v, %v) error = %v, want ErrRatio", r.i0, r.eta, err)
		}
	}
	for _, eta := range []float64{-0.1, 1.5, math.NaN(), math.Inf(1)} {
		if _, err := planetary.FromRatio(-3, eta); !errors.Is(err, planetary.ErrEfficiency) {
			t.Errorf("FromRatio(-3, %v) error = %v, want ErrEfficiency", eta, err)
		}
	}
	s := mustRatio(t, -3, 0.98)
	nan := units.AngularVelocity(math.NaN())
	if _, err := s.Solve(planetary.Speeds{Sun: nan}, planetary.Carrier); !errors.Is(err, planetary.ErrNotFinite) {
		t.Errorf("Solve(NaN) error = %v", err)
	}
	if _, err := s.Solve(planetary.Speeds{Sun: 1e308, Ring: -1e308}, planetary.Carrier); !errors.Is(err, planetary.ErrNotFinite) {
		t.Errorf("Solve(overflow) error = %v", err)
	}
	if _, err := s.Solve(planetary.Speeds{}, 4); !errors.Is(err, planetary.ErrMember) {
		t.Errorf("Solve(member 4) error = %v", err)
	}
	if _, err := s.Solve(planetary.Speeds{}, planetary.NoMember); !errors.Is(err, planetary.ErrMember) {
		t.Errorf("Solve(NoMember) error = %v", err)
	}
	if _, err := s.Torque(planetary.Speeds{}, planetary.Sun, units.Torque(math.Inf(1))); !errors.Is(err, planetary.ErrNotFinite) {
		t.Errorf("Torque(Inf) error = %v", err)
	}
	if _, err := s.Torque(planetary.Speeds{Sun: 1}, planetary.Sun, 1); !errors.Is(err, planetary.ErrWillis) {
		t.Errorf("Torque(inconsistent speeds) error = %v", err)
	}
	if _, err := s.PlanetSpeeds(planetary.Speeds{}); !errors.Is(err, planetary.ErrNoTeeth) {
		t.Errorf("PlanetSpeeds on a ratio set error = %v", err)
	}
	var zero planetary.Set
	if _, err := zero.Solve(planetary.Speeds{}, planetary.Sun); !errors.Is(err, planetary.ErrRatio) {
		t.Errorf("zero Set Solve error = %v", err)
	}
	if _, err := zero.Torque(planetary.Speeds{}, planetary.Sun, 1); !errors.Is(err, planetary.ErrRatio) {
		t.Errorf("zero Set Torque error = %v", err)
	}
	var ie *planetary.InputError
	_, err := planetary.FromRatio(0.99, 0.98)
	if !errors.As(err, &ie) || ie.Value != 0.99 {
		t.Errorf("FromRatio(0.99) error %v, want an *InputError with value 0.99", err)
	}
}

// TestBlock checks the set turning as a block and near it.
func TestBlock(t *testing.T) {
	t.Parallel()
	s := mustRatio(t, -4, 0.95)
	w := units.RPM(1000)
	for _, known := range []planetary.Member{planetary.Sun, planetary.Ring, planetary.Carrier} {
		for _, eps := range []float64{0, 1e-14, -1e-14} {
			sp := planetary.Speeds{Sun: w * units.AngularVelocity(1+eps), Carrier: w}
			sp, err := s.Solve(sp, planetary.Ring)
			if err != nil {
				t.Fatal(err)
			}
			st, err := s.Torque(sp, known, 100)
			if err != nil {
				t.Fatal(err)
			}
			if st.Loss != 0 || st.RollingPower != 0 || st.Flow != planetary.SunDrives {
				t.Errorf("block %v eps %g: loss %v rolling %v flow %v, want 0, 0, sun drives", known, eps, st.Loss, st.RollingPower, st.Flow)
			}
			// Lossless: TRing = −i0·TSun = 4·TSun, TCarrier = (i0 − 1)·TSun = −5·TSun.
			ts := float64(st.Torques.Sun)
			if !testutil.Close(float64(st.Torques.Ring), 4*ts, 1e-14, 0) || !testutil.Close(float64(st.Torques.Carrier), -5*ts, 1e-14, 0) {
				t.Errorf("block %v eps %g: torques %v, want lossless ratios", known, eps, st.Torques)
			}
		}
	}
	// Just outside the band the flow is decided by the sign of the rolling power.
	sp, _ := s.Solve(planetary.Speeds{Sun: w * (1 + 1e-9), Carrier: w}, planetary.Ring)
	st, _ := s.Torque(sp, planetary.Sun, 100)
	if st.Flow != planetary.SunDrives || !(st.Loss > 0) {
		t.Errorf("near block: flow %v loss %v, want sun drives with a loss", st.Flow, st.Loss)
	}
	st, _ = s.Torque(sp, planetary.Sun, -100)
	if st.Flow != planetary.RingDrives || !(st.Loss > 0) {
		t.Errorf("near block, reversed torque: flow %v loss %v, want ring drives with a loss", st.Flow, st.Loss)
	}
}

// TestPlanetSpeeds checks the planet speeds relative to the carrier.
func TestPlanetSpeeds(t *testing.T) {
	t.Parallel()
	// Source: qna.carrieradda.com question 4710 (as in TestWorkedExamples):
	// sun 20, planet 40, ring 100 held, sun 60 rpm, carrier 10 rpm. Hand
	// calculation: relative to the carrier the sun turns 50 rpm, the planet
	// −(20/40)·50 = −25 rpm; from the ring side (100/40)·(0 − 10) = −25 rpm.
	s := mustNew(t, planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
	sp, _ := s.Solve(planetary.Speeds{Sun: units.RPM(60)}, planetary.Carrier)
	ps, err := s.PlanetSpeeds(sp)
	if err != nil {
		t.Fatal(err)
	}
	if !testutil.Close(ps.Inner.RPM(), -25, 1e-12, 0) || ps.Outer != ps.Inner {
		t.Errorf("PlanetSpeeds = %v, want -25 rpm", ps)
	}
	// Double planet, hand calculation: sun 20, inner 18, outer 18, ring 62,
	// carrier held, sun 100 rpm: inner −(20/18)·100 = −111.1 rpm, outer
	// +(20/18)·100; ring 100/i0 = 100·20/62 rpm and outer = (62/18)·ring.
	d := mustNew(t, planetary.Design{Sun: 20, Ring: 62, Planet: 18, Planets: 3, Arrangement: planetary.DoublePlanet})
	sp, _ = d.Solve(planetary.Speeds{Sun: units.RPM(100)}, planetary.Ring)
	ps, _ = d.PlanetSpeeds(sp)
	if !testutil.Close(ps.Inner.RPM(), -2000.0/18, 1e-12, 0) || !testutil.Close(ps.Outer.RPM(), 62.0/18*sp.Ring.RPM(), 1e-12, 0) {
		t.Errorf("double PlanetSpeeds = %v (ring %v)", ps, sp.Ring)
	}
}

// TestAllocs checks that the hot paths allocate nothing.
func TestAllocs(t *testing.T) {
	s := mustRatio(t, -3, 0.98)
	sp, _ := s.Solve(planetary.Speeds{Sun: 100, Ring: 10}, planetary.Carrier)
	var sink float64
	n := testing.AllocsPerRun(100, func() {
		r, _ := s.Solve(sp, planetary.Carrier)
		st, _ := s.Torque(r, planetary.Carrier, 100)
		kr, kc := s.TorqueFactors(s.FlowOf(sp, 5))
		sink += float64(st.Loss) + kr + kc
	})
	if n != 0 {
		t.Errorf("Solve/Torque/TorqueFactors allocate %v times per run", n)
	}
	_ = sink
}
