package planetary_test

import (
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// genDesign builds valid single- or double-planet designs directly, without
// filtering: tooth counts that satisfy coaxial, undercut and neighbour
// conditions by construction, and a planet count that divides the assembly sum.
func genDesign() *rapid.Generator[planetary.Design] {
	return rapid.Custom(func(t *rapid.T) planetary.Design {
		eta := rapid.Float64Range(0.85, 1).Draw(t, "eta0")
		if rapid.Bool().Draw(t, "double") {
			// Double planet, inner = outer = zp, zr = zs + 2·zp + k. In modules
			// a1 = (zs+zp)/2, a2 = (zr−zp)/2 = a1 + k/2, a12 = zp. The tips clear
			// ring and sun when k > 4 (zs + 2zp + 4 < zr), and the pair closes
			// the triangle when k/2 < zp; so k in [5, 2zp − 1].
			zs := rapid.IntRange(17, 60).Draw(t, "sun")
			zp := rapid.IntRange(17, 40).Draw(t, "planet")
			k := rapid.IntRange(5, 2*zp-1).Draw(t, "ringExtra")
			zr := zs + 2*zp + k
			n := pickPlanets(t, zr-zs, func(n int) bool {
				a1, a2 := float64(zs+zp)/2, float64(zr-zp)/2
				s := math.Sin(math.Pi / float64(n))
				return 2*a1*s > float64(zp+2) && 2*a2*s > float64(zp+2)
			})
			return planetary.Design{Sun: zs, Ring: zr, Planet: zp, Planets: n, Arrangement: planetary.DoublePlanet, BasicEfficiency: eta}
		}
		zs := rapid.IntRange(17, 80).Draw(t, "sun")
		zp := rapid.IntRange(17, 80).Draw(t, "planet")
		zr := zs + 2*zp
		n := pickPlanets(t, zs+zr, func(n int) bool {
			return float64(zs+zp)*math.Sin(math.Pi/float64(n)) > float64(zp+2)
		})
		return planetary.Design{Sun: zs, Ring: zr, Planet: zp, Planets: n, BasicEfficiency: eta}
	})
}

// pickPlanets draws a planet count from 1..8 that divides sum and fits.
func pickPlanets(t *rapid.T, sum int, fits func(int) bool) int {
	ok := []int{1}
	for n := 2; n <= 8; n++ {
		if sum%n == 0 && fits(n) {
			ok = append(ok, n)
		}
	}
	return rapid.SampledFrom(ok).Draw(t, "planets")
}

// genSet gives a valid set, from tooth counts or from a ratio outside the
// self-locking band.
func genSet() *rapid.Generator[planetary.Set] {
	return rapid.Custom(func(t *rapid.T) planetary.Set {
		if rapid.Bool().Draw(t, "fromTeeth") {
			d := genDesign().Draw(t, "design")
			s, err := planetary.New(d)
			if err != nil {
				t.Fatalf("generator produced an invalid design %+v: %v", d, err)
			}
			return s
		}
		eta := rapid.Float64Range(0.8, 1).Draw(t, "eta0")
		var i0 float64
		if rapid.Bool().Draw(t, "negative") {
			i0 = -rapid.Float64Range(0.2, 15).Draw(t, "-i0")
		} else if rapid.Bool().Draw(t, "above") {
			i0 = rapid.Float64Range(1.3, 15).Draw(t, "i0")
		} else {
			i0 = rapid.Float64Range(0.05, 0.75).Draw(t, "i0")
		}
		s, err := planetary.FromRatio(i0, eta)
		if err != nil {
			t.Fatalf("FromRatio(%v, %v): %v", i0, eta, err)
		}
		return s
	})
}

var members = []planetary.Member{planetary.Sun, planetary.Ring, planetary.Carrier}

// genSpeeds gives Willis-consistent speeds: two drawn, the third solved.
func genSpeeds(s planetary.Set) *rapid.Generator[planetary.Speeds] {
	return rapid.Custom(func(t *rapid.T) planetary.Speeds {
		sp := planetary.Speeds{
			Sun:     units.AngularVelocity(rapid.Float64Range(-400, 400).Draw(t, "wSun")),
			Ring:    units.AngularVelocity(rapid.Float64Range(-400, 400).Draw(t, "wRing")),
			Carrier: units.AngularVelocity(rapid.Float64Range(-400, 400).Draw(t, "wCarrier")),
		}
		u := rapid.SampledFrom(members).Draw(t, "unknown")
		out, err := s.Solve(sp, u)
		if err != nil {
			t.Fatalf("Solve(%v, %v): %v", sp, u, err)
		}
		return out
	})
}

func powerScale(st planetary.State) float64 {
	ps, pr, pc, _ := st.Power()
	return math.Abs(float64(ps)) + math.Abs(float64(pr)) + math.Abs(float64(pc))
}

func TestPropWillis(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genSet().Draw(t, "set")
		sp := genSpeeds(s).Draw(t, "speeds")
		if r := s.Residual(sp); r > 1e-12 {
			t.Fatalf("Willis residual %g for %v", r, sp)
		}
		// Planet speeds from the sun side equal those from the ring side.
		if d, ok := s.Design(); ok {
			ps, err := s.PlanetSpeeds(sp)
			if err != nil {
				t.Fatal(err)
			}
			ur := float64(sp.Ring - sp.Carrier)
			outer := d.Planet
			if d.Arrangement == planetary.DoublePlanet {
				outer = d.OuterPlanet
			}
			want := float64(d.Ring) / float64(outer) * ur // internal mesh keeps the sense
			scale := math.Abs(float64(sp.Sun)) + math.Abs(float64(sp.Ring)) + math.Abs(float64(sp.Carrier))
			if !testutil.Close(float64(ps.Outer), want, 1e-9, 1e-9*scale*float64(d.Ring)) {
				t.Fatalf("outer planet %v, from ring side %v", ps.Outer, want)
			}
		}
	})
}

func TestPropLossless(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		i0 := rapid.Float64Range(-15, -0.2).Draw(t, "i0")
		s, err := planetary.FromRatio(i0, 1)
		if err != nil {
			t.Fatal(err)
		}
		sp := genSpeeds(s).Draw(t, "speeds")
		known := rapid.SampledFrom(members).Draw(t, "known")
		tq := units.Torque(rapid.Float64Range(-5000, 5000).Draw(t, "torque"))
		st, err := s.Torque(sp, known, tq)
		if err != nil {
			t.Fatal(err)
		}
		_, _, _, sum := st.Power()
		if math.Abs(float64(sum)) > tiny+1e-12*powerScale(st) || st.Loss != 0 {
			t.Fatalf("lossless power sum %v (scale %g), loss %v", sum, powerScale(st), st.Loss)
		}
	})
}

func TestPropLoss(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genSet().Draw(t, "set")
		sp := genSpeeds(s).Draw(t, "speeds")
		known := rapid.SampledFrom(members).Draw(t, "known")
		tq := units.Torque(rapid.Float64Range(-5000, 5000).Draw(t, "torque"))
		st, err := s.Torque(sp, known, tq)
		if err != nil {
			t.Fatal(err)
		}
		eta := s.BasicEfficiency()
		if st.Loss < 0 || st.RollingPower < 0 {
			t.Fatalf("negative loss %v or rolling power %v", st.Loss, st.RollingPower)
		}
		// The loss is (1 − η0) times the rolling power entering at the driving member,
		// computed here independently from the torques and the carrier-frame speeds.
		us, ur := float64(sp.Sun-sp.Carrier), float64(sp.Ring-sp.Carrier)
		roll := math.Max(float64(st.Torques.Sun)*us, float64(st.Torques.Ring)*ur)
		if st.RollingPower != 0 && !testutil.Close(float64(st.RollingPower), roll, 1e-9, tiny+1e-9*powerScale(st)) {
			t.Fatalf("rolling power %v, independent %g", st.RollingPower, roll)
		}
		if !testutil.Close(float64(st.Loss), (1-eta)*float64(st.RollingPower), 1e-12, 0) {
			t.Fatalf("loss %v, (1-eta0)·rolling = %g", st.Loss, (1-eta)*float64(st.RollingPower))
		}
		// Power balance: the power into the set equals the loss.
		_, _, _, sum := st.Power()
		if !testutil.Close(float64(sum), float64(st.Loss), 1e-9, tiny+1e-9*powerScale(st)) {
			t.Fatalf("sum T·w = %v, loss %v (scale %g)", sum, st.Loss, powerScale(st))
		}
		// Torque balance.
		if tb := float64(st.Torques.Sun + st.Torques.Ring + st.Torques.Carrier); math.Abs(tb) > 1e-9*(math.Abs(float64(st.Torques.Sun))+math.Abs(float64(st.Torques.Ring))+math.Abs(float64(st.Torques.Carrier))) {
			t.Fatalf("torque balance %g", tb)
		}
		// The same state from either other member's torque.
		for _, m := range members {
			st2, err := s.Torque(sp, m, st.Torques.Of(m))
			if err != nil {
				t.Fatal(err)
			}
			// The flow is read off the rolling power's sign, so it is the
			// same only where that power is more than the rounding of
			// subnormal numbers (speeds of 1e-43 rpm and torques of 1e-279
			// N·m drawn together gave 4e-323 W, read as either flow).
			if !testutil.Close(float64(st2.Loss), float64(st.Loss), 1e-9, tiny+1e-9*powerScale(st)) || st2.Flow != st.Flow && float64(st.RollingPower) > tiny {
				t.Fatalf("from %v: state %+v, from %v: %+v", known, st, m, st2)
			}
		}
		// Swapping driving and driven (reversed torques or reversed speeds)
		// never gives a negative loss.
		for _, tt := range []struct {
			sp planetary.Speeds
			tq units.Torque
		}{
			{sp, -tq},
			{planetary.Speeds{Sun: -sp.Sun, Ring: -sp.Ring, Carrier: -sp.Carrier}, tq},
		} {
			st3, err := s.Torque(tt.sp, known, tt.tq)
			if err != nil {
				t.Fatal(err)
			}
			_, _, _, sum3 := st3.Power()
			if st3.Loss < 0 || !testutil.Close(float64(sum3), float64(st3.Loss), 1e-9, tiny+1e-9*powerScale(st3)) {
				t.Fatalf("swapped: loss %v, power sum %v", st3.Loss, sum3)
			}
		}
	})
}

// TestPropFactors checks the torque factors and FlowOf against the loss sign.
func TestPropFactors(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genSet().Draw(t, "set")
		i0, eta := s.FixedCarrierRatio(), s.BasicEfficiency()
		for _, f := range []planetary.Flow{planetary.SunDrives, planetary.RingDrives} {
			kr, kc := s.TorqueFactors(f)
			if math.Abs(kr+kc+1) > 1e-15*(1+math.Abs(kr)) {
				t.Fatalf("kRing + kCarrier = %g", kr+kc)
			}
			want := -i0 * eta
			if f == planetary.RingDrives {
				want = -i0 / eta
			}
			if kr != want {
				t.Fatalf("kRing(%v) = %g, want %g", f, kr, want)
			}
		}
		sp := genSpeeds(s).Draw(t, "speeds")
		ts := units.Torque(rapid.Float64Range(-100, 100).Draw(t, "tSun"))
		kr, _ := s.TorqueFactors(s.FlowOf(sp, ts))
		// Loss with these factors: TSun·uSun·(1 + kRing/i0) ≥ 0.
		us := float64(ts) * float64(sp.Sun-sp.Carrier)
		if loss := us * (1 + kr/i0); loss < -1e-12*math.Abs(us) {
			t.Fatalf("FlowOf gives a negative loss %g", loss)
		}
	})
}

// tiny is an absolute power margin for draws in the subnormal range, where
// float64 products lose their relative precision.
const tiny = 1e-290
