package traction

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Constants of the equations of Journal of Terramechanics 15(2) (1978).
const (
	gcCTmaxA = 0.796 // CTmax = gcCTmaxA − gcCTmaxB/M
	gcCTmaxB = 0.92
	gcSlopeA = 4.838 // k·CTmax = gcSlopeA + gcSlopeB·M
	gcSlopeB = 0.061
	gcCRRA   = 0.049 // CRR = gcCRRA + gcCRRB/M
	gcCRRB   = 0.287
)

// GeeCloughMinMobility is the least mobility number at which the
// Gee-Clough model is defined: below it the maximum net traction
// coefficient CTmax = 0.796 − 0.92/M is not positive.
const GeeCloughMinMobility = gcCTmaxB / gcCTmaxA

// GeeClough is the traction model of The empirical prediction of
// tractor-implement field performance, Journal of Terramechanics 15(2):
// 81–94 (1978), with the mobility number after a further source. Cone index
// C, section width b, unloaded diameter d, section height h, deflection δ,
// wheel load W, slip s:
//
//	M     = (C·b·d/W)·√(δ/h)·1/(1 + b/(2d))     mobility number
//	CTmax = 0.796 − 0.92/M                      maximum net traction coefficient
//	k     = (4.838 + 0.061·M)/CTmax             so k·CTmax is the slope at s = 0
//	CT    = CTmax·(1 − e^(−k·s))                net traction coefficient
//	CRR   = 0.049 + 0.287/M                     rolling resistance coefficient
//
// and so NT = CT, MR = CRR, GT = CT + CRR and TE = CT·(1 − s)/(CT + CRR).
// In this form the equations reproduce a published table of predicted
// tractive performance for a small drive tyre (see the package tests).
// At zero slip the wheel gives no net pull and its gross traction is its
// rolling resistance.
//
// The equations were fitted for field conditions (stubble, ploughed and
// cultivated ground). They do not apply to hard dry surfaces, which give
// more traction, nor to very slippery conditions, which give less.
//
// The model needs a tyre deflection δ > 0: a zero deflection is an error
// wrapping ErrTyre. A mobility number at or below GeeCloughMinMobility
// (0.92/0.796 ≈ 1.156) is outside the model's range: the soil is too weak
// for the model under that load. Because M falls as the load rises, the
// error is a *RangeError wrapping ErrLoad, naming M and the limit; so
// NewWheel, which probes a model at a nominal load, accepts the tyre and
// soil, and the refusal comes at the load that causes it.
//
// Negative slips down to MinSlip (an overrun wheel) mirror the driving
// curve, as with the other models: CT turns negative and is bounded by
// −CTmax (see Pull.Outside, which flags the extrapolation).
//
// The zero value is ready to use.
type GeeClough struct{}

// MobilityNumber returns the Gee-Clough mobility number M of a tyre on a
// soil under a wheel load. It does not check M against the model's range
// (GeeCloughMinMobility); Pull does.
func (GeeClough) MobilityNumber(t Tyre, s Surface, load units.Force) (float64, error) {
	if err := geeCloughCheck(t, s, load, 0); err != nil {
		return 0, err
	}
	m := geeCloughM(t, s, load)
	if !finite(m) {
		return 0, rangeErr(ErrInput, "Gee-Clough mobility number", m, "finite")
	}
	return m, nil
}

// GeeCloughCoefficients are the coefficients of the Gee-Clough traction
// curve of one tyre on one soil under one load.
type GeeCloughCoefficients struct {
	Mobility float64 // mobility number M
	MaxNet   float64 // CTmax, the greatest net traction coefficient (approached as s → 1)
	Slope    float64 // k·CTmax, the slope dCT/ds of the net traction curve at s = 0
	Rolling  float64 // CRR, the rolling resistance coefficient
}

// Coefficients returns the coefficients of the Gee-Clough traction curve.
// A mobility number at or below GeeCloughMinMobility is an error, as in
// Pull.
func (GeeClough) Coefficients(t Tyre, s Surface, load units.Force) (GeeCloughCoefficients, error) {
	if err := geeCloughCheck(t, s, load, 0); err != nil {
		return GeeCloughCoefficients{}, err
	}
	return geeCloughCoeff(t, s, load)
}

func geeCloughCoeff(t Tyre, s Surface, load units.Force) (GeeCloughCoefficients, error) {
	m := geeCloughM(t, s, load)
	if !finite(m) {
		return GeeCloughCoefficients{}, rangeErr(ErrInput, "Gee-Clough mobility number", m, "finite")
	}
	ctMax := gcCTmaxA - gcCTmaxB/m
	if !(ctMax > 0) {
		return GeeCloughCoefficients{}, rangeErr(ErrLoad, "Gee-Clough mobility number", m,
			fmt.Sprintf("> %.4g (0.92/0.796; below it the soil is too weak for the model under this load)",
				GeeCloughMinMobility))
	}
	return GeeCloughCoefficients{
		Mobility: m,
		MaxNet:   ctMax,
		Slope:    gcSlopeA + gcSlopeB*m,
		Rolling:  gcCRRA + gcCRRB/m,
	}, nil
}

func geeCloughCheck(t Tyre, s Surface, load units.Force, slip float64) error {
	if err := checkSoil(t, s); err != nil {
		return err
	}
	if t.Deflection <= 0 {
		return rangeErr(ErrTyre, "tyre deflection", t.Deflection, "> 0 for the Gee-Clough model")
	}
	return checkLoadSlip(load, slip)
}

func geeCloughM(t Tyre, s Surface, load units.Force) float64 {
	b, d := float64(t.Width), float64(t.Diameter)
	cn := float64(s.ConeIndex) * b * d / float64(load)
	return cn * math.Sqrt(float64(t.Deflection)/float64(t.SectionHeight)) / (1 + b/(2*d))
}

// Pull implements Model.
func (GeeClough) Pull(t Tyre, s Surface, load units.Force, slip float64) (Pull, error) {
	if err := geeCloughCheck(t, s, load, slip); err != nil {
		return Pull{}, err
	}
	c, err := geeCloughCoeff(t, s, load)
	if err != nil {
		return Pull{}, err
	}
	crr := c.Rolling
	k := c.Slope / c.MaxNet
	p := makePull(load, slip, c.MaxNet*slipRise(k, slip)+crr, crr)
	if !finite(float64(p.Gross)) || !finite(float64(p.Net)) || !finite(float64(p.Resistance)) {
		return Pull{}, rangeErr(ErrLoad, "wheel load", load, "small enough for a finite pull")
	}
	if slip < 0 {
		p.Outside = overrun
	}
	return p, nil
}
