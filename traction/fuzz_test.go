package traction_test

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

func finiteOrErr(t *testing.T, err error, vals ...float64) {
	t.Helper()
	if err != nil {
		return
	}
	for i, v := range vals {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("value %d = %g without an error", i, v)
		}
	}
}

func FuzzNewWheel(f *testing.F) {
	f.Add(1.85, 0.47, 0.40, 0.88, 0.06, 1200.0, 25.0, 0.1, 0)
	f.Add(0.0, 0.47, 0.40, 0.88, 0.06, 1200.0, 25.0, 0.1, 1)
	f.Add(1.85, 0.47, 0.40, 0.88, 0.5, -5.0, 25.0, 1.0, 2)
	f.Add(math.NaN(), math.Inf(1), 0.40, 0.88, 0.06, 1200.0, -1.0, -0.7, 0)
	f.Fuzz(func(t *testing.T, d, b, h, r, delta, ciKPa, loadKN, slip float64, model int) {
		ty := traction.Tyre{Diameter: units.Metres(d), Width: units.Metres(b), SectionHeight: units.Metres(h),
			RollingRadius: units.Metres(r), Deflection: units.Metres(delta)}
		s := traction.Surface{ConeIndex: units.Kilopascals(ciKPa), RollingCoefficient: 0.03}
		models := []traction.Model{traction.Brixius{}, traction.WismerLuth{}, traction.Road{}}
		m := models[(model%3+3)%3]
		w, err := traction.NewWheel(ty, s, m)
		if err != nil {
			return
		}
		p, err := w.At(units.Kilonewtons(loadKN), slip)
		finiteOrErr(t, err, float64(p.Gross), float64(p.Net), float64(p.Resistance), p.Efficiency)
		if err != nil {
			return
		}
		if !(p.Efficiency >= 0 && p.Efficiency < 1) {
			t.Fatalf("TE %g", p.Efficiency)
		}
		// Net pull is gross pull less motion resistance.
		if d := float64(p.Gross - p.Resistance - p.Net); math.Abs(d) > 1e-9*(math.Abs(float64(p.Gross))+math.Abs(float64(p.Resistance))) {
			t.Fatalf("net %v ≠ gross %v − resistance %v", p.Net, p.Gross, p.Resistance)
		}
		// More slip never gives less gross pull (for driving slips). The
		// net pull may fall: Brixius's motion resistance grows with slip
		// (its 0.5·s/√Bn term), which wins on very weak wheels.
		if slip >= 0 && slip < 0.98 {
			q, err := w.At(units.Kilonewtons(loadKN), slip+0.01)
			if err == nil && float64(q.Gross) < float64(p.Gross)-1e-9*math.Abs(float64(p.Gross)) {
				t.Fatalf("gross pull falls from %v at slip %g to %v at %g", p.Gross, slip, q.Gross, slip+0.01)
			}
		}
	})
}

func FuzzSlipForPull(f *testing.F) {
	f.Add(1200.0, 25.0, 8.0, 0)
	f.Add(450.0, 20.0, 30.0, 1)
	f.Add(900.0, 1e-9, -3.0, 2)
	f.Add(1e9, 1e9, math.NaN(), 0)
	f.Fuzz(func(t *testing.T, ciKPa, loadKN, pullKN float64, model int) {
		s := traction.Surface{ConeIndex: units.Kilopascals(ciKPa), RollingCoefficient: 0.03}
		models := []traction.Model{traction.Brixius{}, traction.WismerLuth{}, traction.Road{}}
		w, err := traction.NewWheel(rearTyre, s, models[(model%3+3)%3])
		if err != nil {
			return
		}
		p, err := w.SlipForPull(units.Kilonewtons(loadKN), units.Kilonewtons(pullKN))
		finiteOrErr(t, err, p.Slip, float64(p.Net), p.Efficiency)
		if err == nil && !(p.Slip >= 0 && p.Slip < 1) {
			t.Fatalf("slip %g", p.Slip)
		}
		if err == nil && p.Slip > 1e-10 {
			// Round trip: the pull asked for lies between the wheel's net
			// pulls just below and just above the slip found (the search
			// stops within 1e-12 of slip; on a very stiff soil that is
			// more than 1e-6 of the pull).
			load, want := units.Kilonewtons(loadKN), float64(units.Kilonewtons(pullKN))
			lo, err1 := w.At(load, p.Slip-1e-11)
			hi, err2 := w.At(load, p.Slip+1e-11)
			tol := 1e-9 * float64(load)
			if err1 != nil || err2 != nil || float64(lo.Net) > want+tol || float64(hi.Net) < want-tol {
				t.Fatalf("SlipForPull(%v kN) = slip %g; net %v just below, %v just above (%v, %v)", pullKN, p.Slip, lo.Net, hi.Net, err1, err2)
			}
		}
		b, err := w.BestSlip(units.Kilonewtons(loadKN))
		finiteOrErr(t, err, b.Slip, b.Efficiency)
	})
}

func FuzzFixedRatio(f *testing.F) {
	f.Add(9000.0, 2.8, 1.1, 0.5, 30.0, 8.0, 0.02, 1200.0)
	f.Add(9000.0, 2.8, 1.1, 0.5, 1.0, 8.0, 0.08, 450.0)
	f.Add(-1.0, 0.0, 5.0, -1.0, math.NaN(), -8.0, 0.6, 0.0)
	f.Fuzz(func(t *testing.T, mass, l, a, hh, pullKN, kmh, lead, ciKPa float64) {
		v := demoVehicle()
		v.Mass = units.Kilograms(mass)
		v.Wheelbase = units.Metres(l)
		v.CentreOfMass = units.Metres(a)
		v.Hitch.Height = units.Metres(hh)
		op := traction.Operation{Pull: units.Kilonewtons(pullKN), Speed: units.KMH(kmh)}
		s := traction.Surface{ConeIndex: units.Kilopascals(ciKPa)}
		// Where a drive solves, the wheels' input power is drawbar power
		// plus the slip and rolling losses.
		balanced := func(name string, d traction.Drive) {
			sum := float64(d.DrawbarPower + d.SlipLoss + d.RollingLoss)
			scale := math.Abs(float64(d.DrawbarPower)) + math.Abs(float64(d.SlipLoss)) + math.Abs(float64(d.RollingLoss))
			if math.Abs(float64(d.InputPower)-sum) > 1e-9*scale {
				t.Fatalf("%s: input %v, drawbar + slip + rolling %g W", name, d.InputPower, sum)
			}
		}
		d, err := v.FixedRatio(traction.Brixius{}, s, op, lead)
		finiteOrErr(t, err, float64(d.InputPower), float64(d.CirculatingPower), d.Efficiency, d.TorqueShare)
		if err == nil {
			balanced("FixedRatio", d)
		}
		d, err = v.Independent(traction.Brixius{}, s, op)
		finiteOrErr(t, err, float64(d.InputPower), d.Efficiency, d.TorqueShare)
		if err == nil {
			balanced("Independent", d)
		}
		d, g, err := v.FixedRatioTurn(traction.Brixius{}, s, op, lead, units.Metres(3*l))
		finiteOrErr(t, err, float64(d.InputPower), float64(d.CirculatingPower), g.SpeedRatio)
		adv, err := v.Ballast(traction.Brixius{}, s, op, traction.FourWheelDrive, traction.Towed, lead+0.1)
		finiteOrErr(t, err, float64(adv.Mass), float64(adv.Ballast), float64(adv.Dynamic.Front))
	})
}
