package planetary_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

func finiteAll(v ...float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

func FuzzNew(f *testing.F) {
	f.Add(20, 100, 40, 3, 0, 0.0, 0.0, 0, 0.0, 0.0, 0.0, 0.0)
	f.Add(21, 108, 43, 3, 0, 1.75e-3, 0.97, 0, 0.0, 0.0, 0.0, 0.0)
	f.Add(20, 62, 18, 3, 1, 0.0, 0.0, 18, 0.0, 0.0, 0.0, 0.0)
	f.Add(15, 63, 24, 3, 0, 3e-3, 0.0, 0, 0.2, 0.1, 0.4, 0.0)
	f.Add(14, 60, 23, 1, 1, 0.0, 0.0, 16, 0.3, -0.5, 1.9, -2.0)
	f.Add(0, -1, 0, 0, 9, math.NaN(), math.Inf(1), -3, math.NaN(), math.Inf(-1), 3.0, -3.0)
	f.Add(1, 2, 1, 1<<30, 0, 1e300, 1.0, 0, 1e300, 0.0, 0.0, 0.0)
	f.Fuzz(func(t *testing.T, zs, zr, zp, n, arr int, module, eta float64, zo int, xs, xp, xr, xo float64) {
		d := planetary.Design{Sun: zs, Ring: zr, Planet: zp, Planets: n, Arrangement: planetary.Arrangement(arr),
			Module: units.Length(module), BasicEfficiency: eta, OuterPlanet: zo,
			SunShift: xs, PlanetShift: xp, RingShift: xr, OuterPlanetShift: xo}
		s, err := planetary.New(d)
		if err != nil {
			return
		}
		i0, e := s.FixedCarrierRatio(), s.BasicEfficiency()
		if !finiteAll(i0, e) || i0 == 0 || e <= 0 || e > 1 {
			t.Fatalf("New(%+v) gave i0 %v eta0 %v", d, i0, e)
		}
		sp, err := s.Solve(planetary.Speeds{Sun: 300, Ring: -20}, planetary.Carrier)
		if err != nil {
			t.Fatalf("Solve on a valid set: %v", err)
		}
		// A set built from tooth counts keeps the Willis equation, and its
		// fixed-carrier ratio is the tooth ratio: −ring/sun for single
		// planets, +ring/sun for planet pairs.
		if r := s.Residual(sp); r > 1e-12 {
			t.Fatalf("New(%+v): Willis residual %g", d, r)
		}
		if want := float64(zr) / float64(zs); math.Abs(math.Abs(i0)-want) > 1e-12*want {
			t.Fatalf("New(%+v): i0 = %v, tooth ratio %v", d, i0, want)
		}
		ps, err := s.PlanetSpeeds(sp)
		if err != nil || !finiteAll(float64(ps.Inner), float64(ps.Outer), float64(ps.InnerAbsolute), float64(ps.OuterAbsolute)) {
			t.Fatalf("PlanetSpeeds(%v) = %v, %v", sp, ps, err)
		}
		g, err := s.Geometry()
		if err != nil || !finiteAll(g.SunPlanet.CentreDistance, g.PlanetRing.CentreDistance, float64(g.SunPlanet.WorkingPressureAngle),
			g.CoaxialMismatch) || math.IsNaN(g.NeighbourClearance) || (n > 1 && !(g.NeighbourClearance > 0)) {
			t.Fatalf("Geometry of %+v = %+v, %v", d, g, err)
		}
		if d.Arrangement == planetary.SinglePlanet && math.Abs(g.CoaxialMismatch) > planetary.CoaxialTolerance {
			t.Fatalf("New accepted %+v with coaxial mismatch %v", d, g.CoaxialMismatch)
		}
	})
}

func FuzzRingShiftFor(f *testing.F) {
	f.Add(15, 24, 63, 0.2, 0.1)
	f.Add(12, 36, 84, 0.3, 0.0)
	f.Add(14, 21, 60, 0.0, 0.0)
	f.Add(-1, 0, 1, math.NaN(), math.Inf(1))
	f.Fuzz(func(t *testing.T, zs, zp, zr int, xs, xp float64) {
		xr, err := planetary.RingShiftFor(planetary.Design{Sun: zs, Planet: zp, Ring: zr, SunShift: xs, PlanetShift: xp})
		if err == nil && !finiteAll(xr) {
			t.Fatalf("RingShiftFor = %v", xr)
		}
	})
}

func FuzzFromRatio(f *testing.F) {
	f.Add(-3.0, 0.98)
	f.Add(2.0, 0.0)
	f.Add(1.0, 1.0)
	f.Add(math.NaN(), 0.5)
	f.Add(1e-300, 1e-300)
	f.Fuzz(func(t *testing.T, i0, eta float64) {
		s, err := planetary.FromRatio(i0, eta)
		if err != nil {
			return
		}
		if s.FixedCarrierRatio() != i0 || !(s.BasicEfficiency() > 0 && s.BasicEfficiency() <= 1) {
			t.Fatalf("FromRatio(%v, %v) = %v, %v", i0, eta, s.FixedCarrierRatio(), s.BasicEfficiency())
		}
	})
}

func FuzzSolve(f *testing.F) {
	f.Add(-3.0, 0.98, 100.0, 0.0, 0.0, 2)
	f.Add(2.5, 0.97, 1e308, -1e308, 0.0, 0)
	f.Add(-1e-300, 1.0, 1.0, 1.0, 1.0, 1)
	f.Add(-3.0, 0.98, math.NaN(), 0.0, 0.0, 5)
	f.Fuzz(func(t *testing.T, i0, eta, ws, wr, wc float64, unknown int) {
		s, err := planetary.FromRatio(i0, eta)
		if err != nil {
			return
		}
		sp := planetary.Speeds{Sun: units.AngularVelocity(ws), Ring: units.AngularVelocity(wr), Carrier: units.AngularVelocity(wc)}
		m := planetary.Member(unknown)
		out, err := s.Solve(sp, m)
		if m != planetary.Sun && m != planetary.Ring && m != planetary.Carrier {
			if !errors.Is(err, planetary.ErrMember) {
				t.Fatalf("Solve for member %d: error %v, want ErrMember", unknown, err)
			}
			return
		}
		if err != nil {
			return
		}
		if !finiteAll(float64(out.Sun), float64(out.Ring), float64(out.Carrier)) {
			t.Fatalf("Solve(%v, %d) = %v", sp, unknown, out)
		}
		// The solved speeds satisfy the Willis equation and keep the two
		// given members' speeds.
		if r := s.Residual(out); r > 1e-12 {
			t.Fatalf("Solve(%v, %v) = %v: Willis residual %g", sp, m, out, r)
		}
		for _, k := range []planetary.Member{planetary.Sun, planetary.Ring, planetary.Carrier} {
			if k != m && out.Of(k) != sp.Of(k) {
				t.Fatalf("Solve(%v, %v) changed the given %v speed to %v", sp, m, k, out.Of(k))
			}
		}
	})
}

func FuzzTorque(f *testing.F) {
	f.Add(-3.0, 0.98, 100.0, 10.0, 0, 50.0)
	f.Add(-3.0, 0.98, 100.0, 100.0, 2, -50.0)
	f.Add(4.0, 0.9, -1e300, 1e300, 1, 1e300)
	f.Add(0.5, 0.95, 1.0, -1.0, 2, math.Inf(-1))
	f.Fuzz(func(t *testing.T, i0, eta, ws, wr float64, known int, tq float64) {
		s, err := planetary.FromRatio(i0, eta)
		if err != nil {
			return
		}
		sp, err := s.Solve(planetary.Speeds{Sun: units.AngularVelocity(ws), Ring: units.AngularVelocity(wr)}, planetary.Carrier)
		if err != nil {
			return
		}
		m := planetary.Member(known)
		st, err := s.Torque(sp, m, units.Torque(tq))
		if m != planetary.Sun && m != planetary.Ring && m != planetary.Carrier {
			if !errors.Is(err, planetary.ErrMember) {
				t.Fatalf("Torque for member %d: error %v, want ErrMember", known, err)
			}
			return
		}
		if err != nil {
			return
		}
		if !finiteAll(float64(st.Torques.Sun), float64(st.Torques.Ring), float64(st.Torques.Carrier), float64(st.Loss), float64(st.RollingPower)) || st.Loss < 0 {
			t.Fatalf("Torque(%v, %d, %v) = %+v", sp, known, tq, st)
		}
		// The given torque is kept; the power into the set is its loss.
		if st.Torques.Of(m) != units.Torque(tq) {
			t.Fatalf("Torque(%v, %v, %v): that member carries %v", sp, m, tq, st.Torques.Of(m))
		}
		_, _, _, sum := st.Power()
		if scale := powerScale(st); !finiteAll(scale, float64(sum)) || math.Abs(float64(sum-st.Loss)) > 1e-9*scale+tiny {
			t.Fatalf("Torque(%v, %v, %v): power in %v, loss %v", sp, m, tq, sum, st.Loss)
		}
	})
}
