package traction_test

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
	"pgregory.net/rapid"
)

// genTyre draws a valid tyre of agricultural size.
func genTyre(label string) *rapid.Generator[traction.Tyre] {
	return rapid.Custom(func(t *rapid.T) traction.Tyre {
		d := rapid.Float64Range(0.6, 2.2).Draw(t, label+" diameter m")
		b := rapid.Float64Range(0.15, 0.9).Draw(t, label+" width m")
		h := rapid.Float64Range(0.1, 0.45).Draw(t, label+" height/diameter") * d
		r := rapid.Float64Range(0.85, 0.99).Draw(t, label+" rolling radius/half diameter") * d / 2
		delta := rapid.Float64Range(0, 0.3).Draw(t, label+" deflection/height") * h
		return traction.Tyre{
			Diameter: units.Metres(d), Width: units.Metres(b), SectionHeight: units.Metres(h),
			RollingRadius: units.Metres(r), Deflection: units.Metres(delta),
		}
	})
}

// genSoil draws a soil with cone index 300 kPa to 3 MPa that also carries
// road coefficients, so every model accepts it.
var genSoil = rapid.Custom(func(t *rapid.T) traction.Surface {
	return traction.Surface{
		ConeIndex:          units.Kilopascals(rapid.Float64Range(300, 3000).Draw(t, "cone index kPa")),
		RollingCoefficient: rapid.Float64Range(0.01, 0.08).Draw(t, "rolling coefficient"),
		Adhesion:           rapid.Float64Range(0.4, 1.0).Draw(t, "adhesion"),
	}
})

var genModel = rapid.SampledFrom([]traction.Model{traction.Brixius{}, traction.WismerLuth{}, traction.Road{}})

// drawCase draws a tyre, a surface and a traction model.
func drawCase(t *rapid.T) (traction.Tyre, traction.Surface, traction.Model) {
	return genTyre("tyre").Draw(t, "tyre"), genSoil.Draw(t, "soil"), genModel.Draw(t, "model")
}

// genLoad draws a wheel load that keeps the mobility number in a sensible
// range for the tyre and soil (Cn between 8 and 120).
func genLoad(t *rapid.T, ty traction.Tyre, s traction.Surface) units.Force {
	cnW := float64(s.ConeIndex) * float64(ty.Width) * float64(ty.Diameter)
	cn := rapid.Float64Range(8, 120).Draw(t, "wheel numeric")
	return units.Force(cnW / cn)
}

func relClose(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Max(math.Abs(want), 1e-300)
}

// TestPropNetRisesWithSlip: net pull rises with slip up to its maximum.
func TestPropNetRisesWithSlip(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		w, err := traction.NewWheel(ty, s, m)
		if err != nil {
			t.Fatal(err)
		}
		load := genLoad(t, ty, s)
		mx, err := w.MaxPull(load)
		if err != nil {
			t.Fatal(err)
		}
		a := rapid.Float64Range(0, 1).Draw(t, "first slip/max slip") * mx.Slip
		b := rapid.Float64Range(0, 1).Draw(t, "second slip/max slip") * mx.Slip
		if a > b {
			a, b = b, a
		}
		pa, _ := w.At(load, a)
		pb, _ := w.At(load, b)
		if pb.Net < pa.Net-units.Force(1e-9*float64(load)) {
			t.Fatalf("net pull falls from %v at slip %g to %v at slip %g (max at %g)", pa.Net, a, pb.Net, b, mx.Slip)
		}
		if pb.Net > mx.Net+units.Force(1e-9*float64(load)) {
			t.Fatalf("net pull %v at slip %g above the maximum %v", pb.Net, b, mx.Net)
		}
	})
}

// TestPropEfficiencyRange: tractive efficiency lies in [0, 1).
func TestPropEfficiencyRange(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		load := genLoad(t, ty, s)
		slip := rapid.Float64Range(0, 0.999).Draw(t, "slip")
		p, err := m.Pull(ty, s, load, slip)
		if err != nil {
			t.Fatal(err)
		}
		if !(p.Efficiency >= 0 && p.Efficiency < 1) {
			t.Fatalf("TE = %g at slip %g, want in [0, 1)", p.Efficiency, slip)
		}
	})
}

// TestPropWheelPowerBalance: T·ω = drawbar + slip loss + rolling loss.
func TestPropWheelPowerBalance(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		load := genLoad(t, ty, s)
		slip := rapid.Float64Range(traction.MinSlip, 0.95).Draw(t, "slip")
		om := units.RadPerSec(rapid.Float64Range(0.1, 30).Draw(t, "wheel speed rad/s"))
		p, err := m.Pull(ty, s, load, slip)
		if err != nil {
			t.Fatal(err)
		}
		st := traction.StateOf(ty, p, om)
		sum := float64(st.DrawbarPower + st.SlipLoss + st.RollingLoss)
		scale := math.Abs(float64(st.DrawbarPower)) + math.Abs(float64(st.SlipLoss)) + math.Abs(float64(st.RollingLoss))
		if math.Abs(float64(st.InputPower)-sum) > 1e-9*scale {
			t.Fatalf("input %v, drawbar+slip+rolling %g (scale %g)", st.InputPower, sum, scale)
		}
	})
}

// genVehicle draws a valid two-axle vehicle whose axles share a tyre size
// when equal is true.
func genVehicle(equal bool) *rapid.Generator[traction.Vehicle] {
	return rapid.Custom(func(t *rapid.T) traction.Vehicle {
		rear := genTyre("rear").Draw(t, "rear tyre")
		front := rear
		if !equal {
			front = genTyre("front").Draw(t, "front tyre")
		}
		l := rapid.Float64Range(2, 3.5).Draw(t, "wheelbase m")
		return traction.Vehicle{
			Mass:         units.Kilograms(rapid.Float64Range(3000, 20000).Draw(t, "mass kg")),
			Wheelbase:    units.Metres(l),
			CentreOfMass: units.Metres(l * rapid.Float64Range(0.3, 0.6).Draw(t, "front share")),
			Hitch:        traction.Hitch{Height: units.Metres(rapid.Float64Range(0.3, 0.6).Draw(t, "hitch height m"))},
			Front:        traction.Axle{Tyre: front, Wheels: 2},
			Rear:         traction.Axle{Tyre: rear, Wheels: 2},
		}
	})
}

// TestPropAxlePowerBalance: the vehicle's wheel input power equals drawbar
// power plus slip and rolling losses, at any lead. Draws whose pull the soil
// cannot give (ErrPull, ErrUnstable, ErrLoad) are skipped; at least 50 % of
// the draws must reach the balance (about 75 % do).
func TestPropAxlePowerBalance(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.5)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		v := genVehicle(false).Draw(t, "vehicle")
		soil := traction.Surface{ConeIndex: units.Kilopascals(rapid.Float64Range(500, 2500).Draw(t, "cone index kPa"))}
		w := float64(v.Weight())
		op := traction.Operation{
			Pull:  units.Force(w * rapid.Float64Range(0, 0.4).Draw(t, "pull/weight")),
			Speed: units.KMH(rapid.Float64Range(1, 15).Draw(t, "speed km/h")),
		}
		lead := rapid.Float64Range(-0.05, 0.08).Draw(t, "lead")
		d, err := v.FixedRatio(traction.Brixius{}, soil, op, lead)
		if errors.Is(err, traction.ErrPull) || errors.Is(err, traction.ErrUnstable) || errors.Is(err, traction.ErrLoad) {
			t.Skip("pull not reachable for this draw")
		}
		if err != nil {
			t.Fatal(err)
		}
		reach.Reached()
		sum := float64(d.DrawbarPower + d.SlipLoss + d.RollingLoss)
		scale := math.Abs(float64(d.DrawbarPower)) + math.Abs(float64(d.SlipLoss)) + math.Abs(float64(d.RollingLoss))
		if math.Abs(float64(d.InputPower)-sum) > 1e-9*scale {
			t.Fatalf("input %v, drawbar+slip+rolling %g", d.InputPower, sum)
		}
		// Straight ahead the drawbar power is pull × speed.
		if !relClose(float64(d.DrawbarPower), float64(op.Pull)*float64(op.Speed), 1e-6) &&
			math.Abs(float64(d.DrawbarPower)-float64(op.Pull)*float64(op.Speed)) > 1e-6*w*float64(op.Speed) {
			t.Fatalf("drawbar power %v, pull×speed %g", d.DrawbarPower, float64(op.Pull)*float64(op.Speed))
		}
	})
}

// TestPropZeroLeadNoCirculation: equal tyres geared with zero lead never
// circulate power. Skips and share as in TestPropAxlePowerBalance.
func TestPropZeroLeadNoCirculation(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.5)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		v := genVehicle(true).Draw(t, "vehicle")
		soil := traction.Surface{ConeIndex: units.Kilopascals(rapid.Float64Range(500, 2500).Draw(t, "cone index kPa"))}
		op := traction.Operation{
			Pull:  units.Force(float64(v.Weight()) * rapid.Float64Range(0, 0.4).Draw(t, "pull/weight")),
			Speed: units.KMH(rapid.Float64Range(1, 15).Draw(t, "speed km/h")),
		}
		d, err := v.FixedRatio(traction.Brixius{}, soil, op, 0)
		if errors.Is(err, traction.ErrPull) || errors.Is(err, traction.ErrUnstable) || errors.Is(err, traction.ErrLoad) {
			t.Skip("pull not reachable for this draw")
		}
		if err != nil {
			t.Fatal(err)
		}
		reach.Reached()
		if d.CirculatingPower != 0 {
			t.Fatalf("circulating power %v with zero lead (slips %g, %g)", d.CirculatingPower, d.Front.Wheel.Slip, d.Rear.Wheel.Slip)
		}
		if math.Abs(d.Front.Wheel.Slip-d.Rear.Wheel.Slip) > 1e-12 {
			t.Fatalf("slips differ with zero lead: %g, %g", d.Front.Wheel.Slip, d.Rear.Wheel.Slip)
		}
	})
}

// TestPropSlipForPullInverts: SlipForPull returns a slip whose net pull is
// the one asked.
func TestPropSlipForPullInverts(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		ty, s, m := drawCase(t)
		w, _ := traction.NewWheel(ty, s, m)
		load := genLoad(t, ty, s)
		mx, _ := w.MaxPull(load)
		p0, _ := w.At(load, 0)
		want := p0.Net + units.Force(rapid.Float64Range(0, 1).Draw(t, "pull fraction")*float64(mx.Net-p0.Net))
		p, err := w.SlipForPull(load, want)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(float64(p.Net-want)) > 1e-7*float64(load) {
			t.Fatalf("SlipForPull(%v) net = %v at slip %g", want, p.Net, p.Slip)
		}
		if _, err := w.SlipForPull(load, mx.Net+units.Force(1e-3*float64(load))); !errors.Is(err, traction.ErrPull) {
			t.Fatalf("pull above maximum: error %v, want ErrPull", err)
		}
	})
}

// TestPropTurnPowerBalance: in a turn, geared or with own motors, the wheel
// input power equals pull × speed plus the slip and rolling losses. Skips and
// share as in TestPropAxlePowerBalance (about 85 % reach the balance).
func TestPropTurnPowerBalance(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.5)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		v := genVehicle(false).Draw(t, "vehicle")
		v.Front.Track = units.Metres(rapid.Float64Range(1.2, 2.2).Draw(t, "front track m"))
		v.Rear.Track = units.Metres(rapid.Float64Range(1.2, 2.2).Draw(t, "rear track m"))
		soil := traction.Surface{ConeIndex: units.Kilopascals(rapid.Float64Range(500, 2500).Draw(t, "cone index kPa"))}
		op := traction.Operation{
			Pull:  units.Force(float64(v.Weight()) * rapid.Float64Range(0, 0.3).Draw(t, "pull/weight")),
			Speed: units.KMH(rapid.Float64Range(1, 12).Draw(t, "speed km/h")),
		}
		radius := units.Metres(rapid.Float64Range(4, 40).Draw(t, "turn radius m"))
		lead := rapid.Float64Range(0, 0.1).Draw(t, "lead")
		var d traction.Drive
		var err error
		if rapid.Bool().Draw(t, "own motors") {
			d, _, err = v.IndependentTurn(traction.Brixius{}, soil, op, radius)
		} else {
			d, _, err = v.FixedRatioTurn(traction.Brixius{}, soil, op, lead, radius)
		}
		if errors.Is(err, traction.ErrPull) || errors.Is(err, traction.ErrUnstable) || errors.Is(err, traction.ErrLoad) {
			t.Skip("pull not reachable for this draw")
		}
		if err != nil {
			t.Fatal(err)
		}
		reach.Reached()
		pv := float64(op.Pull) * float64(op.Speed)
		sum := pv + float64(d.SlipLoss+d.RollingLoss)
		scale := pv + math.Abs(float64(d.SlipLoss)) + math.Abs(float64(d.RollingLoss))
		if math.Abs(float64(d.InputPower)-sum) > 1e-9*scale {
			t.Fatalf("input %v, pull×speed+losses %g", d.InputPower, sum)
		}
	})
}
