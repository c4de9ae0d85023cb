package traction_test

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

// pullOnly hides a model's NetSlope: LoadedWheel.SlipFor searches it by
// Brent's method, as it searches any Model without a slope.
type pullOnly struct{ traction.Model }

// slipTolAt is SlipFor's stated bound at slip s: 4·ε·|s| + 1e-13.
func slipTolAt(s float64) float64 { return 4*2.220446049250313e-16*math.Abs(s) + 1e-13 }

// TestPropertySlipForNewtonMatchesBrent: for random tyres, soils, models,
// loads and pulls between an overrun slip and the slip of greatest pull,
// SlipFor by Newton's method on the model's slope gives the slip that
// Brent's method on its Pull gives, to the bound both state (4·ε·|s| +
// 1e-13; where the curve is flat, near the greatest pull, plus the net's
// rounding over the slope), with or without a start guess; the net pull
// changes sign within that bound of either slip (the same allowance); and the Pull at the
// Newton slip is the model's, bit for bit.
func TestPropertySlipForNewtonMatchesBrent(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		load := genLoad(t, ty, s)
		w, err := traction.NewWheel(ty, s, m)
		if err != nil {
			t.Fatal(err)
		}
		wb, err := traction.NewWheel(ty, s, pullOnly{m})
		if err != nil {
			t.Fatal(err)
		}
		mx, err := w.MaxPull(load)
		if err != nil {
			t.Fatal(err)
		}
		lo := rapid.Float64Range(-0.4, 0).Draw(t, "lowest slip")
		hi := mx.Slip
		if !(lo < hi) {
			t.Skip("no bracket")
		}
		lw, err := w.Loaded(load)
		if err != nil {
			t.Fatal(err)
		}
		lb, err := wb.Loaded(load)
		if err != nil {
			t.Fatal(err)
		}
		pLo, err := lw.Pull(lo)
		if err != nil {
			t.Fatal(err)
		}
		frac := rapid.Float64Range(0, 1).Draw(t, "pull between the ends")
		want := min(units.Force(float64(pLo.Net)+frac*float64(mx.Net-pLo.Net)), mx.Net)
		guess := math.NaN()
		if rapid.Bool().Draw(t, "guess") {
			guess = lo + rapid.Float64Range(0, 1).Draw(t, "guess/bracket")*(hi-lo)
		}
		sn, err := lw.SlipFor(want, lo, hi, guess)
		if err != nil {
			t.Fatalf("Newton: SlipFor(%v, %g, %g, %g) = %v", want, lo, hi, guess, err)
		}
		sb, err := lb.SlipFor(want, lo, hi, guess)
		if err != nil {
			t.Fatalf("Brent: SlipFor(%v, %g, %g, %g) = %v", want, lo, hi, guess, err)
		}
		// Where the curve is flat (near the greatest pull) the net's
		// rounding, a few ε of the load, moves the root by that over the
		// slope: the slips agree to the bound plus that much.
		_, slope, err := m.(traction.SlopeModel).NetSlope(ty, s, load, sn)
		if err != nil {
			t.Fatal(err)
		}
		flat := 8 * 2.220446049250313e-16 * float64(load) / math.Abs(float64(slope))
		if d := math.Abs(sn - sb); !(d <= slipTolAt(sn)+flat) {
			t.Fatalf("SlipFor(%v) = %.17g by Newton, %.17g by Brent: %g apart (bound %g + %g)", want, sn, sb, d, slipTolAt(sn), flat)
		}
		// Each has a sign change of Net − want within the bound (plus the
		// rounding's reach, where the net's rounding, not the curve, may
		// change its sign).
		for _, c := range []struct {
			name string
			s    float64
		}{{"Newton", sn}, {"Brent", sb}} {
			d := slipTolAt(c.s) + flat
			a, b := math.Max(lo, c.s-d), math.Min(hi, c.s+d)
			pa, _ := lw.Pull(a)
			pb, _ := lw.Pull(b)
			if (pa.Net-want > 0) == (pb.Net-want > 0) && pa.Net != want && pb.Net != want {
				t.Fatalf("%s: no sign change of Net − %v in [%.17g, %.17g]: %v, %v", c.name, want, a, b, pa.Net-want, pb.Net-want)
			}
		}
		// The loaded wheel's Pull is the model's, bit for bit.
		got, err := lw.Pull(sn)
		if err != nil {
			t.Fatal(err)
		}
		ref, err := m.Pull(ty, s, load, sn)
		if err != nil {
			t.Fatal(err)
		}
		if got != ref {
			t.Fatalf("Loaded(%v).Pull(%g) = %+v, model's Pull %+v", load, sn, got, ref)
		}
	})
}

// TestPropertyNetSlope: each built-in model's NetSlope gives Pull's Net to
// the bit and a slope that matches a central difference of Pull's Net
// (step 1e-6 in slip, away from the kink at zero slip; the difference's
// own error is of order 1e-12 of the slope).
func TestPropertyNetSlope(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		sm, ok := m.(traction.SlopeModel)
		if !ok {
			t.Fatalf("%T is not a SlopeModel", m)
		}
		load := genLoad(t, ty, s)
		slip := rapid.Float64Range(traction.MinSlip+1e-5, 0.95).Draw(t, "slip")
		if math.Abs(slip) < 1e-5 {
			slip = 1e-5
		}
		net, slope, err := sm.NetSlope(ty, s, load, slip)
		if err != nil {
			t.Fatal(err)
		}
		p, err := m.Pull(ty, s, load, slip)
		if err != nil {
			t.Fatal(err)
		}
		if math.Float64bits(float64(net)) != math.Float64bits(float64(p.Net)) {
			t.Fatalf("NetSlope net %v, Pull's Net %v", net, p.Net)
		}
		const h = 1e-6
		up, err := m.Pull(ty, s, load, slip+h)
		if err != nil {
			t.Fatal(err)
		}
		dn, err := m.Pull(ty, s, load, slip-h)
		if err != nil {
			t.Fatal(err)
		}
		fd := float64(up.Net-dn.Net) / (2 * h)
		if math.Abs(float64(slope)-fd) > 1e-6*math.Max(math.Abs(fd), 1e-3*float64(load)) {
			t.Fatalf("slope %v at slip %g, central difference %v", slope, slip, fd)
		}
	})
}

// TestSlipForErrors: a pull outside the ends' is a *PullError naming the
// nearer end, a bad bracket or pull an error, never a slip.
func TestSlipForErrors(t *testing.T) {
	t.Parallel()
	for _, m := range []traction.Model{traction.Brixius{}, pullOnly{traction.Brixius{}}} {
		w, err := traction.NewWheel(rearTyre, traction.FirmSoil(), m)
		if err != nil {
			t.Fatal(err)
		}
		lw, err := w.Loaded(units.Kilonewtons(25))
		if err != nil {
			t.Fatal(err)
		}
		pHi, _ := lw.Pull(0.3)
		_, err = lw.SlipFor(pHi.Net+units.Newtons(1), 0, 0.3, math.NaN())
		var pe *traction.PullError
		if !errors.As(err, &pe) || pe.Slip != 0.3 || pe.Limit != pHi.Net {
			t.Errorf("%T: SlipFor above the top end: %v, want a *PullError at slip 0.3, limit %v", m, err, pHi.Net)
		}
		for _, c := range []struct{ net, lo, hi float64 }{
			{math.NaN(), 0, 0.3}, {math.Inf(1), 0, 0.3}, {1e3, 0.3, 0}, {1e3, -0.6, 0.3}, {1e3, 0, 1}, {1e3, math.NaN(), 0.3},
		} {
			if s, err := lw.SlipFor(units.Force(c.net), c.lo, c.hi, math.NaN()); err == nil {
				t.Errorf("%T: SlipFor(%g, %g, %g) = %g, want an error", m, c.net, c.lo, c.hi, s)
			}
		}
	}
	if _, err := (traction.Wheel{}).Loaded(units.Kilonewtons(25)); err == nil {
		t.Error("zero Wheel: Loaded gave no error")
	}
	if _, err := (traction.LoadedWheel{}).SlipFor(0, 0, 0.3, math.NaN()); err == nil {
		t.Error("zero LoadedWheel: SlipFor gave no error")
	}
}

// TestSlipForAllocs keeps the loaded wheel's search allocation-free.
func TestSlipForAllocs(t *testing.T) {
	w, _ := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	lw, err := w.Loaded(units.Kilonewtons(25))
	if err != nil {
		t.Fatal(err)
	}
	n := testing.AllocsPerRun(50, func() {
		if _, err := lw.SlipFor(units.Kilonewtons(8), -0.3, 0.4, math.NaN()); err != nil {
			t.Fatal(err)
		}
	})
	if n != 0 {
		t.Errorf("SlipFor allocates %g times per call, want 0", n)
	}
}

// BenchmarkSlipFor is one slip search at one load, by Newton's method on
// the Brixius slope and by Brent's method on its Pull, from the bracket
// and from a start a little off the root (a nearby pull's slip).
func BenchmarkSlipFor(b *testing.B) {
	for _, c := range []struct {
		name  string
		m     traction.Model
		guess float64
	}{{"newton", traction.Brixius{}, math.NaN()}, {"newton-guess", traction.Brixius{}, 0.09}, {"brent", pullOnly{traction.Brixius{}}, math.NaN()}} {
		b.Run(c.name, func(b *testing.B) {
			w, _ := traction.NewWheel(rearTyre, traction.FirmSoil(), c.m)
			lw, err := w.Loaded(units.Kilonewtons(25))
			if err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := lw.SlipFor(units.Kilonewtons(8), -0.3, 0.4, c.guess); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// FuzzLoadedSlipFor: Loaded and SlipFor return an error or a slip inside
// the range, never a panic or NaN; a slip found has the pull asked for
// between the net pulls just either side of it (the search's bound, and a
// rounding of the load), for any model, load, range, pull and start.
func FuzzLoadedSlipFor(f *testing.F) {
	f.Add(1200.0, 25.0, 8.0, -0.3, 0.4, math.NaN(), 0)
	f.Add(450.0, 20.0, 0.0, -0.5, 0.9, 0.1, 1)
	f.Add(900.0, 12.0, 3.0, 0.0, 0.2, 0.5, 2)
	f.Add(1e9, 1e-9, math.Inf(1), 0.3, 0.1, -1.0, 3)
	f.Fuzz(func(t *testing.T, ciKPa, loadKN, pullKN, lo, hi, guess float64, model int) {
		s := traction.Surface{ConeIndex: units.Kilopascals(ciKPa), RollingCoefficient: 0.03}
		models := []traction.Model{traction.Brixius{}, traction.WismerLuth{}, traction.Road{}, pullOnly{traction.Brixius{}}}
		w, err := traction.NewWheel(rearTyre, s, models[(model%4+4)%4])
		if err != nil {
			return
		}
		load := units.Kilonewtons(loadKN)
		lw, err := w.Loaded(load)
		if err != nil {
			return
		}
		want := units.Kilonewtons(pullKN)
		sl, err := lw.SlipFor(want, lo, hi, guess)
		finiteOrErr(t, err, sl)
		if err != nil {
			return
		}
		if !(sl >= lo && sl <= hi) {
			t.Fatalf("SlipFor(%v, %g, %g) = %g outside the range", want, lo, hi, sl)
		}
		d := slipTolAt(sl)
		a, errA := lw.Pull(math.Max(lo, sl-d))
		b, errB := lw.Pull(math.Min(hi, sl+d))
		if errA != nil || errB != nil {
			t.Fatalf("Pull beside the slip %g: %v, %v", sl, errA, errB)
		}
		tol := 1e-12 * float64(load)
		if (float64(a.Net-want) > tol && float64(b.Net-want) > tol) || (float64(a.Net-want) < -tol && float64(b.Net-want) < -tol) {
			t.Fatalf("SlipFor(%v, %g, %g) = %.17g: no sign change of Net − pull beside it (%v, %v)", want, lo, hi, sl, a.Net-want, b.Net-want)
		}
	})
}
