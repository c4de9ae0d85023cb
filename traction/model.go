package traction

import (
	"math"
	"strconv"

	"github.com/powersplit-dev/powersplit/units"
)

// MinSlip is the least slip the traction models accept. Negative slip
// (travel faster than ω·r) describes an overrun wheel: one pushed along by
// the vehicle, as an axle is when another axle drives it through a fixed
// ratio. Driving-wheel entries such as Wheel.At accept only [0, 1).
const MinSlip = -0.5

// Pull is the state of one wheel at one slip: the forces along the travel
// direction and the tractive efficiency.
//
// By construction Gross = Net + Resistance. The torque on the wheel is
// Gross·r (r the rolling radius).
type Pull struct {
	Slip       float64     // s = 1 − v/(ω·r)
	Load       units.Force // dynamic vertical load W on the wheel
	Gross      units.Force // gross traction GT·W, the pull the wheel torque produces
	Resistance units.Force // motion resistance MR·W
	Net        units.Force // net pull NT·W = Gross − Resistance
	// Efficiency is the tractive efficiency TE = (NT/GT)·(1 − s), the
	// drawbar power over the wheel input power. It is 0 when the wheel
	// gives no net pull or takes no torque (NT <= 0 or GT <= 0): then no
	// useful power leaves it.
	Efficiency float64
	// Outside is a flag, not an error: it names the inputs that lie outside
	// the range the model was fitted to ("" when all lie within), for
	// example "slip below 0 (the equations are fitted to driving wheels)"
	// or "b/d 0.55 outside 0.2–0.4". The pull is then an extrapolation.
	Outside string
}

// GrossRatio returns GT = Gross/Load.
func (p Pull) GrossRatio() float64 { return float64(p.Gross) / float64(p.Load) }

// ResistanceRatio returns MR = Resistance/Load.
func (p Pull) ResistanceRatio() float64 { return float64(p.Resistance) / float64(p.Load) }

// NetRatio returns NT = Net/Load.
func (p Pull) NetRatio() float64 { return float64(p.Net) / float64(p.Load) }

// A Model gives the pull of a tyre on a surface at a dynamic wheel load and
// a slip in [MinSlip, 1). Implementations are immutable and safe for
// concurrent use; they return an error (never NaN) for bad input.
type Model interface {
	Pull(t Tyre, s Surface, load units.Force, slip float64) (Pull, error)
}

// A SlopeModel is a Model that also gives the slope of its net pull over
// slip in closed form. LoadedWheel.SlipFor takes Newton steps on it; a
// Model without it is searched by Brent's method.
type SlopeModel interface {
	Model
	// NetSlope returns the net pull at slip, Pull's Net to the bit, and
	// its slope dNet/dslip (newtons per unit slip); where the slope jumps
	// (a kink at zero slip), either side's. Its errors are Pull's.
	NetSlope(t Tyre, s Surface, load units.Force, slip float64) (net, slope units.Force, err error)
}

// slipRise returns the rise of traction with slip, 1 − e^(−a·s), for a
// driving wheel (s ≥ 0), and its mirror −(1 − e^(a·s)) for an overrun
// (braked) wheel (s < 0), so that the braking coefficient is bounded by
// the same asymptote as the driving one, never growing exponentially with
// −s as the driving-wheel equations extrapolated would (Brixius at −12 %
// slip would brake with 1.24 times the wheel load).
//
// From memory: Theory of Ground Vehicles (3rd ed., 2001), ch. 2: a
// braked tyre develops its braking force by the same shearing of the soil
// as a driven one, bounded by the soil's shear strength; the mirror of the
// driving curve is this package's choice of that bound.
func slipRise(a, s float64) float64 {
	if s < 0 {
		return math.Expm1(a * s) // e^(a·s) − 1 in (−1, 0)
	}
	return -math.Expm1(-a * s)
}

// slipRiseSlope returns slipRise(a, s), bit for bit, and its slope over
// s, a·e^(−a·|s|), from the one e^(−a·|s|) − 1 both need.
func slipRiseSlope(a, s float64) (rise, slope float64) {
	e := math.Expm1(-a * math.Abs(s))
	if s < 0 {
		return e, a * (1 + e)
	}
	return -e, a * (1 + e)
}

// overrun is the Outside flag of a negative slip.
const overrun = "slip below 0 (the equations are fitted to driving wheels; mirrored for an overrun wheel)"

func makePull(load units.Force, slip, gt, mr float64) Pull {
	nt := gt - mr
	te := 0.0
	if nt > 0 && gt > 0 {
		te = nt / gt * (1 - slip)
	}
	w := float64(load)
	return Pull{
		Slip: slip, Load: load,
		Gross: units.Force(gt * w), Resistance: units.Force(mr * w), Net: units.Force(nt * w),
		Efficiency: te,
	}
}

func checkLoadSlip(load units.Force, slip float64) error {
	if !validLoad(load) {
		return rangeErr(ErrLoad, "wheel load", load, "> 0 and finite")
	}
	if !validSlip(slip) {
		return rangeErr(ErrSlip, "slip", slip, "in [-0.5, 1)")
	}
	return nil
}

func validLoad(load units.Force) bool { return finite(float64(load)) && load > 0 }

func validSlip(slip float64) bool { return slip >= MinSlip && slip < 1 }

// A netModel gives a wheel's net pull alone, as Pull's Net, for a tyre and
// surface it accepted (NewWheel checks them): the slip searches ask for
// nothing else, many times per solution, so the checks of the tyre and
// surface and the rest of the Pull are left out. ok is false where Pull
// would refuse the load or slip.
type netModel interface {
	net(t Tyre, s Surface, load units.Force, slip float64) (net float64, ok bool)
}

func checkSoil(t Tyre, s Surface) error {
	if err := t.Validate(); err != nil {
		return err
	}
	if err := s.Validate(); err != nil {
		return err
	}
	if s.ConeIndex <= 0 {
		return rangeErr(ErrSurface, "cone index", s.ConeIndex, "> 0 for a soil model")
	}
	return nil
}

// Brixius is the traction model of ASAE paper 87-1622 (1987) for bias-ply
// tyres, as given in ASABE D497.7 (2011):
//
//	Bn = (CI·b·d/W)·(1 + 5δ/h)/(1 + 3b/d)
//	GT = 0.88·(1 − e^(−0.1·Bn))·(1 − e^(−7.5·s)) + 0.04
//	MR = 1/Bn + 0.04 + 0.5·s/√Bn
//	NT = GT − MR
//	TE = (NT/GT)·(1 − s)
//
// The zero value is ready to use.
type Brixius struct{}

// MobilityNumber returns the Brixius mobility number Bn of a tyre on a soil
// under a wheel load.
func (Brixius) MobilityNumber(t Tyre, s Surface, load units.Force) (float64, error) {
	if err := checkSoil(t, s); err != nil {
		return 0, err
	}
	if err := checkLoadSlip(load, 0); err != nil {
		return 0, err
	}
	return brixiusBn(t, s, load), nil
}

func brixiusBn(t Tyre, s Surface, load units.Force) float64 {
	b, d := float64(t.Width), float64(t.Diameter)
	cn := float64(s.ConeIndex) * b * d / float64(load)
	return cn * (1 + 5*float64(t.Deflection)/float64(t.SectionHeight)) / (1 + 3*b/d)
}

// Pull implements Model.
func (m Brixius) Pull(t Tyre, s Surface, load units.Force, slip float64) (Pull, error) {
	if err := checkSoil(t, s); err != nil {
		return Pull{}, err
	}
	if err := checkLoadSlip(load, slip); err != nil {
		return Pull{}, err
	}
	gt, mr := brixiusTerms(t, s, load, slip)
	p := makePull(load, slip, gt, mr)
	p.Outside = brixiusOutside(t, slip)
	return p, nil
}

// net implements netModel: makePull's Net of the same terms.
func (Brixius) net(t Tyre, s Surface, load units.Force, slip float64) (float64, bool) {
	if !validLoad(load) || !validSlip(slip) {
		return 0, false
	}
	gt, mr := brixiusTerms(t, s, load, slip)
	return float64(units.Force((gt - mr) * float64(load))), true
}

// NetSlope implements SlopeModel:
//
//	dNT/ds = 0.88·(1 − e^(−0.1·Bn))·7.5·e^(−7.5·|s|) − 0.5·sign(s)/√Bn
func (m Brixius) NetSlope(t Tyre, s Surface, load units.Force, slip float64) (net, slope units.Force, err error) {
	if err := checkSoil(t, s); err != nil {
		return 0, 0, err
	}
	if err := checkLoadSlip(load, slip); err != nil {
		return 0, 0, err
	}
	n, d := brixiusLoad(t, s, load).netSlope(load, slip)
	return units.Force(n), units.Force(d), nil
}

// brixiusTerms returns the gross traction and motion resistance ratios,
// GT and MR, of a checked tyre, soil, load and slip.
func brixiusTerms(t Tyre, s Surface, load units.Force, slip float64) (gt, mr float64) {
	return brixiusLoad(t, s, load).terms(slip)
}

// brixiusAtLoad holds the parts of the Brixius equations that depend on
// the load alone, so a search over slip at one load works them out once:
// 0.88·(1 − e^(−0.1·Bn)), 1/Bn + 0.04 and √Bn.
type brixiusAtLoad struct {
	gt0, mr0, sqrtBn float64
}

func brixiusLoad(t Tyre, s Surface, load units.Force) brixiusAtLoad {
	bn := brixiusBn(t, s, load)
	return brixiusAtLoad{gt0: 0.88 * (1 - math.Exp(-0.1*bn)), mr0: 1/bn + 0.04, sqrtBn: math.Sqrt(bn)}
}

// terms returns GT and MR at slip, each rounded as the equations written
// out in one line round them.
func (b brixiusAtLoad) terms(slip float64) (gt, mr float64) {
	gt = b.gt0*slipRise(7.5, slip) + 0.04
	mr = b.mr0 + 0.5*math.Abs(slip)/b.sqrtBn
	return gt, mr
}

// netSlope returns the net pull at slip under load, makePull's Net of
// terms, and its slope over slip (the slope of s ≥ 0 at zero slip).
func (b brixiusAtLoad) netSlope(load units.Force, slip float64) (net, slope float64) {
	rise, dRise := slipRiseSlope(7.5, slip)
	gt := b.gt0*rise + 0.04
	mr := b.mr0 + 0.5*math.Abs(slip)/b.sqrtBn
	dmr := 0.5 / b.sqrtBn
	if slip < 0 {
		dmr = -dmr
	}
	w := float64(load)
	return float64(units.Force((gt - mr) * w)), (b.gt0*dRise - dmr) * w
}

// The ranges of b/d and δ/h the Brixius equations are used within without
// a flag.
//
// From memory: ASABE D497.7 (2011) gives the equations of ASAE paper
// 87-1622 (1987) for bias-ply tyres, fitted to tyres near b/d = 0.3 and
// δ/h = 0.2 (the factor (1 + 5δ/h)/(1 + 3b/d) carries them to other tyres);
// the bands of ±0.1 around those values are this package's choice, not the
// standard's.
const (
	brixiusBDMin, brixiusBDMax = 0.2, 0.4
	brixiusDHMin, brixiusDHMax = 0.1, 0.3
)

// brixiusOutside names the inputs outside the Brixius model's range.
func brixiusOutside(t Tyre, slip float64) string {
	bd := float64(t.Width) / float64(t.Diameter)
	dh := float64(t.Deflection) / float64(t.SectionHeight)
	var out string
	if bd < brixiusBDMin || bd > brixiusBDMax {
		out = "b/d " + strconv.FormatFloat(bd, 'g', 3, 64) + " outside 0.2–0.4"
	}
	if dh < brixiusDHMin || dh > brixiusDHMax {
		out = join(out, "δ/h "+strconv.FormatFloat(dh, 'g', 3, 64)+" outside 0.1–0.3")
	}
	if slip < 0 {
		out = join(out, overrun)
	}
	return out
}

// join joins two flags with "; ".
func join(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

// WismerLuth is the traction model of Off-road traction prediction for
// wheeled vehicles, Transactions of the ASAE 17(1) (1974), with its wheel
// numeric Cn = CI·b·d/W:
//
//	NT = 0.75·(1 − e^(−0.3·Cn·s)) − (1.2/Cn + 0.04)
//	MR = 1.2/Cn + 0.04
//	GT = NT + MR = 0.75·(1 − e^(−0.3·Cn·s))
//
// The zero value is ready to use.
type WismerLuth struct{}

// Pull implements Model.
func (WismerLuth) Pull(t Tyre, s Surface, load units.Force, slip float64) (Pull, error) {
	if err := checkSoil(t, s); err != nil {
		return Pull{}, err
	}
	if err := checkLoadSlip(load, slip); err != nil {
		return Pull{}, err
	}
	cn := float64(s.ConeIndex) * float64(t.Width) * float64(t.Diameter) / float64(load)
	gt := 0.75 * slipRise(0.3*cn, slip)
	mr := 1.2/cn + 0.04
	p := makePull(load, slip, gt, mr)
	if slip < 0 {
		p.Outside = overrun
	}
	return p, nil
}

// NetSlope implements SlopeModel: dNT/ds = 0.75·0.3·Cn·e^(−0.3·Cn·|s|).
func (WismerLuth) NetSlope(t Tyre, s Surface, load units.Force, slip float64) (net, slope units.Force, err error) {
	if err := checkSoil(t, s); err != nil {
		return 0, 0, err
	}
	if err := checkLoadSlip(load, slip); err != nil {
		return 0, 0, err
	}
	cn := float64(s.ConeIndex) * float64(t.Width) * float64(t.Diameter) / float64(load)
	rise, dRise := slipRiseSlope(0.3*cn, slip)
	gt := 0.75 * rise
	mr := 1.2/cn + 0.04
	w := float64(load)
	return units.Force((gt - mr) * w), units.Force(0.75 * dRise * w), nil
}

// Road is a model for tyres on a hard road, with the surface's rolling
// coefficient f and peak adhesion μ:
//
//	GT = μ·(1 − e^(−k·s)) + f
//	MR = f
//	NT = μ·(1 − e^(−k·s))
//
// so a wheel at zero slip carries its rolling resistance and gives no net
// pull, and the net pull rises towards μ·W. The slip constant k sets how
// fast; its zero value means the default 15 (63 % of μ at 6.7 % slip).
//
// Common practice (no published source): the exponential traction curve
// and k near 15 describe a pneumatic tyre on a dry hard surface.
type Road struct {
	SlipConstant float64 // k; 0 means 15; otherwise > 0 and finite
}

// check checks Pull's arguments and returns the slip constant k.
func (m Road) check(t Tyre, s Surface, load units.Force, slip float64) (float64, error) {
	if err := t.Validate(); err != nil {
		return 0, err
	}
	if err := s.Validate(); err != nil {
		return 0, err
	}
	if s.RollingCoefficient <= 0 {
		return 0, rangeErr(ErrSurface, "rolling coefficient", s.RollingCoefficient, "> 0 for the road model")
	}
	k := m.SlipConstant
	if k == 0 {
		k = 15
	}
	if !finite(k) || k < 0 {
		return 0, rangeErr(ErrInput, "road slip constant", k, "> 0 and finite")
	}
	if err := checkLoadSlip(load, slip); err != nil {
		return 0, err
	}
	return k, nil
}

// Pull implements Model.
func (m Road) Pull(t Tyre, s Surface, load units.Force, slip float64) (Pull, error) {
	k, err := m.check(t, s, load, slip)
	if err != nil {
		return Pull{}, err
	}
	f := s.RollingCoefficient
	nt := s.adhesion() * slipRise(k, slip)
	return makePull(load, slip, nt+f, f), nil
}

// NetSlope implements SlopeModel: dNT/ds = μ·k·e^(−k·|s|).
func (m Road) NetSlope(t Tyre, s Surface, load units.Force, slip float64) (net, slope units.Force, err error) {
	k, err := m.check(t, s, load, slip)
	if err != nil {
		return 0, 0, err
	}
	f := s.RollingCoefficient
	rise, dRise := slipRiseSlope(k, slip)
	mu := s.adhesion()
	w := float64(load)
	return units.Force((mu*rise + f - f) * w), units.Force(mu * dRise * w), nil
}
