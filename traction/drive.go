package traction

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Operation is what the vehicle is asked to do.
type Operation struct {
	Pull      units.Force // drawbar pull at the hitch, >= 0
	Implement units.Force // vertical load of a mounted implement at the hitch, >= 0
	Speed     units.Speed // travel speed of the rear axle, >= 0
}

func (op Operation) validate() error {
	if !finite(float64(op.Speed)) || op.Speed < 0 {
		return rangeErr(ErrInput, "travel speed", op.Speed, ">= 0 and finite")
	}
	return nil // pull and implement are checked by DynamicLoads
}

// AxleState is the state of one axle: one wheel's state and the axle
// totals (the wheel's values times the number of wheels).
type AxleState struct {
	Wheel      State // one wheel of the axle
	Wheels     int
	Load       units.Force  // axle load
	Net        units.Force  // axle net pull
	Torque     units.Torque // torque into the axle's wheels, summed
	InputPower units.Power  // T·ω summed over the wheels
	// DrawbarPower, SlipLoss and RollingLoss are the wheel values summed.
	DrawbarPower, SlipLoss, RollingLoss units.Power
}

func axleState(t Tyre, n int, p Pull, w units.AngularVelocity) AxleState {
	st := StateOf(t, p, w)
	k := float64(n)
	return AxleState{
		Wheel: st, Wheels: n,
		Load:         units.Force(k * float64(p.Load)),
		Net:          units.Force(k * float64(p.Net)),
		Torque:       units.Torque(k * float64(st.Torque)),
		InputPower:   units.Power(k * float64(st.InputPower)),
		DrawbarPower: units.Power(k * float64(st.DrawbarPower)),
		SlipLoss:     units.Power(k * float64(st.SlipLoss)),
		RollingLoss:  units.Power(k * float64(st.RollingLoss)),
	}
}

// Drive is the solved state of a two-axle vehicle at an operation.
type Drive struct {
	Front, Rear AxleState
	// Lead is the front axle's theoretical speed over the rear's, minus
	// one, that the drive ran at (in a turn, the effective lead after the
	// turn's own speed ratio).
	Lead float64
	// TorqueShare is the front axle's share of the total wheel torque
	// (front torque over front plus rear), NaN-free: 0 when both are zero.
	TorqueShare float64
	// InputPower is the total wheel input power, the sum of the axles'.
	InputPower units.Power
	// DrawbarPower is the power the axles deliver to the chassis, Σ Net·v;
	// it equals drawbar pull × rear-axle travel speed, straight ahead and
	// in a turn.
	DrawbarPower units.Power
	// SlipLoss and RollingLoss are summed over both axles.
	SlipLoss, RollingLoss units.Power
	// CirculatingPower is the power an overrun axle returns into the
	// driveline (one axle pushing against the other), >= 0. The driving
	// axle carries it in addition to the useful power.
	CirculatingPower units.Power
	// Efficiency is the vehicle's tractive efficiency DrawbarPower/InputPower,
	// 0 when no useful power leaves the wheels.
	Efficiency float64
}

func makeDrive(f, r AxleState, lead float64) Drive {
	d := Drive{Front: f, Rear: r, Lead: lead}
	d.InputPower = f.InputPower + r.InputPower
	d.DrawbarPower = f.DrawbarPower + r.DrawbarPower
	d.SlipLoss = f.SlipLoss + r.SlipLoss
	d.RollingLoss = f.RollingLoss + r.RollingLoss
	d.CirculatingPower = units.Power(math.Max(0, -float64(f.InputPower)) + math.Max(0, -float64(r.InputPower)))
	if d.InputPower > 0 && d.DrawbarPower > 0 {
		d.Efficiency = float64(d.DrawbarPower) / float64(d.InputPower)
	}
	if s := math.Abs(float64(f.Torque)) + math.Abs(float64(r.Torque)); s > 0 {
		d.TorqueShare = float64(f.Torque) / float64(f.Torque+r.Torque)
		if !finite(d.TorqueShare) {
			d.TorqueShare = 0
		}
	}
	return d
}

// axlePair holds what the vehicle solvers share.
type axlePair struct {
	front, rear    Wheel
	nf, nr         float64
	loadF, loadR   units.Force // per wheel
	axleF, axleR   units.Force
	speed          units.Speed
	frontSpeedMult float64 // front axle travel speed over rear (1 straight ahead)
}

// kf is the weight of one front wheel's net pull in the balance of pulls:
// the number of wheels times the front axle's speed over the rear's. In a
// steady turn the tangential pulls balance in moments about the turn
// centre, Σ N_i·R_i = P·R_r, which is Σ N_i·v_i = P·v: drawbar power.
func (p axlePair) kf() float64 { return p.nf * p.frontSpeedMult }

func (v Vehicle) pair(m Model, s Surface, op Operation) (axlePair, error) {
	if err := op.validate(); err != nil {
		return axlePair{}, err
	}
	loads, err := v.DynamicLoads(op.Pull, op.Implement)
	if err != nil {
		return axlePair{}, err
	}
	if loads.Rear <= 0 {
		return axlePair{}, rangeErr(ErrLoad, "rear axle load", loads.Rear, "> 0")
	}
	fw, err := NewWheel(v.Front.Tyre, s, m)
	if err != nil {
		return axlePair{}, err
	}
	rw, err := NewWheel(v.Rear.Tyre, s, m)
	if err != nil {
		return axlePair{}, err
	}
	nf, nr := float64(v.Front.Wheels), float64(v.Rear.Wheels)
	return axlePair{
		front: fw, rear: rw, nf: nf, nr: nr,
		loadF: units.Force(float64(loads.Front) / nf), loadR: units.Force(float64(loads.Rear) / nr),
		axleF: loads.Front, axleR: loads.Rear,
		speed: op.Speed, frontSpeedMult: 1,
	}, nil
}

func checkLead(lead float64) error {
	if !finite(lead) || lead <= -0.5 || lead >= 0.5 {
		return rangeErr(ErrInput, "lead", lead, "in (-0.5, 0.5)")
	}
	return nil
}

// FixedRatio solves a vehicle whose front axle is driven from the rear at
// a fixed speed ratio (a mechanical front drive). The lead is the front
// axle's theoretical speed over the rear's, minus one:
//
//	ω_f·r_f = (1 + lead)·ω_r·r_r
//
// Both axles travel at the same speed, so (1 + lead)·(1 − s_f) = 1 − s_r,
// and the slips are found with Brent's method so that the axles' net pulls
// sum to the drawbar pull. With a positive lead the front axle slips more;
// at a light pull the rear axle may be overrun (negative slip, negative
// torque) and return power into the driveline: CirculatingPower.
func (v Vehicle) FixedRatio(m Model, s Surface, op Operation, lead float64) (Drive, error) {
	if err := checkLead(lead); err != nil {
		return Drive{}, err
	}
	p, err := v.pair(m, s, op)
	if err != nil {
		return Drive{}, err
	}
	return p.fixed(op.Pull, lead)
}

func (p axlePair) fixed(pull units.Force, lead float64) (Drive, error) {
	k := 1 + lead
	sf := func(sr float64) float64 { return 1 - (1-sr)/k }
	front, rear := p.front.at(p.loadF), p.rear.at(p.loadR)
	total := func(sr float64) float64 {
		return p.kf()*front.net(sf(sr)) + p.nr*rear.net(sr)
	}
	lo := math.Max(MinSlip, 1-k*(1-MinSlip))
	hi := math.Min(SlipCeiling, 1-k*(1-SlipCeiling))
	if sf(lo) < MinSlip {
		lo = math.Nextafter(lo, 1)
	}
	want := float64(pull)
	sMax, nMax := goldenMax(total, lo, hi, slipOpt)
	eps := 1e-12 * float64(p.axleF+p.axleR)
	if want > nMax {
		if want-nMax > eps {
			return Drive{}, &PullError{Required: pull, Limit: units.Force(nMax), Slip: sMax}
		}
		return p.solved(sf(sMax), sMax, lead)
	}
	nLo := total(lo)
	if want < nLo {
		return Drive{}, &PullError{Required: pull, Limit: units.Force(nLo), Slip: lo}
	}
	sr, ok := brent(func(x float64) float64 { return total(x) - want }, lo, sMax, nLo-want, nMax-want, slipTol)
	if !ok {
		return Drive{}, ErrNoConvergence
	}
	return p.solved(sf(sr), sr, lead)
}

func (p axlePair) solved(sf, sr, lead float64) (Drive, error) {
	pf, err := p.front.pull(p.loadF, sf)
	if err != nil {
		return Drive{}, err
	}
	pr, err := p.rear.pull(p.loadR, sr)
	if err != nil {
		return Drive{}, err
	}
	vf := units.Speed(float64(p.speed) * p.frontSpeedMult)
	f := axleState(p.front.tyre, int(p.nf), pf, wheelSpeed(p.front.tyre, sf, vf))
	r := axleState(p.rear.tyre, int(p.nr), pr, wheelSpeed(p.rear.tyre, sr, p.speed))
	return makeDrive(f, r, lead), nil
}

// RearDrive solves a vehicle driven by its rear axle only: the front wheels
// roll free (zero torque) at the slip where their gross traction is zero,
// and the rear axle gives the drawbar pull plus the front's rolling
// resistance.
func (v Vehicle) RearDrive(m Model, s Surface, op Operation) (Drive, error) {
	p, err := v.pair(m, s, op)
	if err != nil {
		return Drive{}, err
	}
	pf, err := p.front.FreeRolling(p.loadF)
	if err != nil {
		return Drive{}, err
	}
	sf := pf.Slip
	want := (float64(op.Pull) - p.nf*float64(pf.Net)) / p.nr
	sr, err := p.rear.slipForNet(p.loadR, want, 0)
	if err != nil {
		if pe, ok := err.(*PullError); ok {
			pe.Required = op.Pull
			pe.Limit = units.Force(p.nr*float64(pe.Limit) + p.nf*float64(pf.Net))
		}
		return Drive{}, err
	}
	return p.solved(sf, sr, 0)
}

// Independent solves a vehicle whose axles are driven each by its own
// motor (a hydraulic front drive), so the torque split is free. It returns
// the split of the drawbar pull between the axles that needs the least
// wheel input power, which is the split of greatest tractive efficiency.
// Both axles work at driving slips in [0, SlipCeiling]; no power circulates.
func (v Vehicle) Independent(m Model, s Surface, op Operation) (Drive, error) {
	p, err := v.pair(m, s, op)
	if err != nil {
		return Drive{}, err
	}
	return p.independent(op.Pull)
}

func (p axlePair) independent(pull units.Force) (Drive, error) {
	sfMax, nfMax := p.front.maxNetSlip(p.loadF, 0, SlipCeiling)
	srMax, nrMax := p.rear.maxNetSlip(p.loadR, 0, SlipCeiling)
	nf0, nr0 := p.front.net(p.loadF, 0), p.rear.net(p.loadR, 0)
	// Axle net pulls (not per wheel), the front's weighted by its speed.
	fLo, fHi := p.kf()*nf0, p.kf()*nfMax
	rLo, rHi := p.nr*nr0, p.nr*nrMax
	want := float64(pull)
	if want > fHi+rHi {
		return Drive{}, &PullError{Required: pull, Limit: units.Force(fHi + rHi), Slip: math.Max(sfMax, srMax)}
	}
	if want < fLo+rLo {
		return Drive{}, &PullError{Required: pull, Limit: units.Force(fLo + rLo), Slip: 0}
	}
	a := math.Max(fLo, want-rHi)
	b := math.Min(fHi, want-rLo)
	cf, cr := p.front.at(p.loadF), p.rear.at(p.loadR)
	slipAt := func(c *loadNet, perWheel, sMax, n0, nMax float64) float64 {
		if perWheel <= n0 {
			return 0
		}
		if perWheel >= nMax {
			return sMax
		}
		x, _ := brent(func(x float64) float64 { return c.net(x) - perWheel }, 0, sMax, n0-perWheel, nMax-perWheel, slipTol)
		return x
	}
	slips := func(front float64) (float64, float64) {
		sf := slipAt(&cf, front/p.kf(), sfMax, nf0, nfMax)
		sr := slipAt(&cr, (want-front)/p.nr, srMax, nr0, nrMax)
		return sf, sr
	}
	// Input power per unit rear travel speed: Σ n·Gross·k/(1 − s), with k
	// the axle's travel speed over the rear's.
	negInput := func(front float64) float64 {
		sf, sr := slips(front)
		qf, err1 := p.front.model.Pull(p.front.tyre, p.front.surface, p.loadF, sf)
		qr, err2 := p.rear.model.Pull(p.rear.tyre, p.rear.surface, p.loadR, sr)
		if err1 != nil || err2 != nil {
			return bigNeg
		}
		return -(p.nf*float64(qf.Gross)*p.frontSpeedMult/(1-sf) + p.nr*float64(qr.Gross)/(1-sr))
	}
	tol := 1e-9 * math.Max(1, math.Abs(b-a))
	front, _ := goldenMax(negInput, a, b, tol)
	sf, sr := slips(front)
	return p.solved(sf, sr, p.frontSpeedMult*(1-sr)/(1-sf)-1)
}
