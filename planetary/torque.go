package planetary

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Torques are the torques each shaft applies TO the set; power into the set
// at a member is T·ω.
type Torques struct{ Sun, Ring, Carrier units.Torque }

// Of returns the torque of member m (zero for an invalid member).
func (t Torques) Of(m Member) units.Torque {
	switch m {
	case Sun:
		return t.Sun
	case Ring:
		return t.Ring
	case Carrier:
		return t.Carrier
	}
	return 0
}

// Flow is the direction of the rolling power in the carrier frame.
type Flow int

// The two directions.
const (
	SunDrives  Flow = iota // power enters the meshes at the sun (in the carrier frame)
	RingDrives             // power enters at the ring
)

// String returns "sun drives" or "ring drives".
func (f Flow) String() string {
	if f == RingDrives {
		return "ring drives"
	}
	return "sun drives"
}

// TorqueFactors returns kRing, kCarrier with TRing = kRing·TSun and
// TCarrier = kCarrier·TSun, including the mesh loss for flow f:
//
//	SunDrives:  kRing = −i0·η0
//	RingDrives: kRing = −i0/η0
//	always:     kCarrier = −(1 + kRing)   (torque balance)
//
// Any value of f other than RingDrives is taken as SunDrives.
// TorqueFactors does not allocate.
func (s Set) TorqueFactors(f Flow) (kRing, kCarrier float64) {
	if f == RingDrives {
		kRing = -s.i0 / s.eta0
	} else {
		kRing = -s.i0 * s.eta0
	}
	return kRing, -(1 + kRing)
}

// FlowOf returns the rolling-power direction for speeds sp and sun torque
// tSun: SunDrives when tSun·(ωSun − ωCarrier) ≥ 0 (ties included), else
// RingDrives. A caller building its own torque balance from FlowOf and
// TorqueFactors gets Torque's result everywhere except inside the block band
// (BlockTolerance), where Torque uses the lossless factors; there the loss is
// zero with either choice, so the power balance is the same.
func (s Set) FlowOf(sp Speeds, tSun units.Torque) Flow {
	if float64(tSun)*(float64(sp.Sun)-float64(sp.Carrier)) >= 0 {
		return SunDrives
	}
	return RingDrives
}

// State is the full static state of a set.
type State struct {
	Speeds
	Torques
	Flow         Flow        // direction of the rolling power (SunDrives when none rolls)
	RollingPower units.Power // |power through the meshes in the carrier frame| at the driving member
	Loss         units.Power // ≥ 0; equals the power into the set, T·ω summed over the members
}

// BlockTolerance is the relative speed difference |ωSun − ωCarrier| / max|ω|
// at or below which Set.Torque takes the set to turn as a block: no power
// rolls, the loss is zero and the torques are the lossless ones. It sits far
// above the float64 rounding of the difference (about 1e-16), so rounding
// noise cannot flip the flow direction.
const BlockTolerance = 1e-12

// Torque returns the full state from the speeds sp (which must satisfy the
// Willis equation to 1e-9 relative, see Residual) and the torque t of the
// known member. The other two torques follow from the torque factors of the
// flow direction that is consistent with the result:
//
//   - known sun torque: the flow is FlowOf(sp, t);
//   - known ring torque: RingDrives when TRing·(ωRing − ωCarrier) > 0, else
//     SunDrives (the ring's speed relative to the carrier taken as u/i0,
//     u = ωSun − ωCarrier, so a residual in the given speeds cannot flip it);
//   - known carrier torque: the direction whose sun torque gives a
//     consistent sign of TSun·(ωSun − ωCarrier) (outside the self-locking
//     band that FromRatio excludes there is exactly one).
//
// When the set turns as a block (|ωSun − ωCarrier| ≤ 1e-12·max|ω|) no power
// rolls: the loss is zero, Flow is SunDrives and the torques are the
// lossless ones (kRing = −i0), the midpoint of the two loss-bearing
// directions, so the result does not jump between them on rounding noise.
// Elsewhere the loss is (1 − η0)·RollingPower, never negative.
//
// Torque does not allocate on success.
func (s Set) Torque(sp Speeds, known Member, t units.Torque) (State, error) {
	if !s.valid() {
		return State{}, errZeroSet
	}
	if !known.valid() {
		return State{}, ErrMember
	}
	if !isFinite(float64(t)) {
		return State{}, notFinite(known.String()+" torque", float64(t))
	}
	if err := s.checkSpeeds(sp); err != nil {
		return State{}, err
	}
	i0, eta0 := s.i0, s.eta0
	ws, wr, wc := float64(sp.Sun), float64(sp.Ring), float64(sp.Carrier)
	// Speeds relative to the carrier; the ring's follows from the sun's by
	// Willis, u_ring = u_sun/i0, so the direction and the rolling power do
	// not depend on a residual of the given speeds.
	us := ws - wc
	scale := math.Max(math.Abs(ws), math.Max(math.Abs(wr), math.Abs(wc)))
	block := math.Abs(us) <= BlockTolerance*scale

	var ts float64
	flow := SunDrives
	tk := float64(t)
	switch {
	case block:
		// Lossless: kRing = −i0, kCarrier = i0 − 1.
		switch known {
		case Sun:
			ts = tk
		case Ring:
			ts = tk / -i0
		case Carrier:
			ts = tk / (i0 - 1)
		}
	case known == Sun:
		ts = tk
		flow = s.FlowOf(sp, t)
	case known == Ring:
		// Sign of TRing·(ωRing − ωCarrier), with ωRing − ωCarrier = u/i0 from Willis.
		if tk*us*i0 > 0 {
			flow = RingDrives
		}
		kr, _ := s.TorqueFactors(flow)
		ts = tk / kr
	default: // Carrier
		// Try SunDrives; keep it when its sun torque rolls power into the
		// meshes at the sun (tie included), else RingDrives.
		ts = tk / -(1 - i0*eta0)
		if ts*us < 0 {
			flow = RingDrives
			ts = tk / -(1 - i0/eta0)
		}
	}
	var kr, kc float64
	if block {
		kr, kc = -i0, i0-1
	} else {
		kr, kc = s.TorqueFactors(flow)
	}
	var st State
	st.Speeds = sp
	st.Flow = flow
	st.Torques.Sun = units.Torque(ts)
	st.Torques.Ring = units.Torque(kr * ts)
	st.Torques.Carrier = units.Torque(kc * ts)
	// The known member's torque is reported exactly as given.
	switch known {
	case Ring:
		st.Torques.Ring = t
	case Carrier:
		st.Torques.Carrier = t
	}
	if !block {
		// At the driving member: TSun·u (≥ 0 for SunDrives) or TRing·u/i0
		// (> 0 for RingDrives); Abs only clears a negative zero.
		roll := ts * us
		if flow == RingDrives {
			roll = float64(st.Torques.Ring) * us / i0
		}
		roll = math.Abs(roll)
		st.RollingPower = units.Power(roll)
		st.Loss = units.Power((1 - eta0) * roll)
	}
	if v := float64(st.Torques.Sun) + float64(st.Torques.Ring) + float64(st.Torques.Carrier) + float64(st.RollingPower); !isFinite(v) {
		return State{}, notFinite("torque result", v)
	}
	return st, nil
}

// Power returns the power into the set at each member, T·ω, and their sum,
// which equals the loss.
func (st State) Power() (sun, ring, carrier, sum units.Power) {
	sun = units.PowerFromTorque(st.Torques.Sun, st.Speeds.Sun)
	ring = units.PowerFromTorque(st.Torques.Ring, st.Speeds.Ring)
	carrier = units.PowerFromTorque(st.Torques.Carrier, st.Speeds.Carrier)
	return sun, ring, carrier, sun + ring + carrier
}
