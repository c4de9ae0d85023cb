package vehicle

import (
	"math"
	"strconv"

	"github.com/powersplit-dev/powersplit/units"
)

// A Transmission is the drive from the engine to the final drive, seen by
// the vehicle: given a range, the engine speed and the demanded output speed
// and torque, it returns the input torque it takes from the engine and its
// losses. A power-split layout solved by the root package is adapted to it
// by FromLayout; SplitEstimate is a quick stand-in.
//
// Implementations must conserve power: InputTorque·engine speed = output
// power + HydrostaticLoss + MechanicalLoss + NoLoadLoss, each loss >= 0.
// The output torque is negative when the load drives the engine (overrun:
// downhill, slowing); then the input torque is normally negative too. The vehicle
// checks the balance to 1e-6 relative and reports ErrTransmission if it
// does not close.
type Transmission interface {
	// Ranges returns the number of ranges (at least 1).
	Ranges() int
	// Operate runs range rng (0-based) with the engine at speed engine and
	// the output at speed out (>= 0) carrying torque outTorque (the
	// torque the output delivers to the final drive; negative in overrun).
	Operate(rng int, engine, out units.AngularVelocity, outTorque units.Torque) (DrivePoint, error)
}

// A RangeNamer is a Transmission that names its ranges; the vehicle's
// reports use the names.
type RangeNamer interface {
	// RangeName returns the name of range i (0-based), "" if it has none.
	RangeName(i int) string
}

// RangeName returns the name transmission t gives range i, or "range i+1"
// when t does not name its ranges.
func RangeName(t Transmission, i int) string {
	if n, ok := t.(RangeNamer); ok {
		if s := n.RangeName(i); s != "" {
			return s
		}
	}
	return "range " + strconv.Itoa(i+1)
}

// A DrivePoint is a transmission's solved state at one operating point.
type DrivePoint struct {
	Range        int
	InputTorque  units.Torque          // torque the engine delivers to the input
	OutputSpeed  units.AngularVelocity // output shaft speed
	OutputTorque units.Torque          // torque the output delivers
	// HydrostaticLoss is the loss of the hydrostatic units and lines;
	// MechanicalLoss the load-dependent rest (gears, planetary sets);
	// NoLoadLoss the load-independent losses (bearings, churning, open
	// plates, idle PTO, charge pump), listed by name in NoLoad.
	HydrostaticLoss, MechanicalLoss, NoLoadLoss units.Power
	NoLoad                                      []LossPart
	// HydrostaticShare is the signed share of the input power that flows
	// through the hydrostat (negative: circulating power).
	HydrostaticShare float64
	// RangeName is the range's name when the transmission has names
	// (LayoutDrive); empty otherwise.
	RangeName string
	// Hydrostat is the state of the first hydrostatic loop, when the
	// transmission reports one (LayoutDrive does; SplitEstimate does not).
	Hydrostat UnitState
	// FrontSpeed and FrontTorque are the front output's speed and the
	// torque it delivers, FrontSetting the front motor's setting, for a
	// transmission that drives both axles (AxleTransmission); then
	// InputTorque·ω = OutputTorque·OutputSpeed + FrontTorque·FrontSpeed +
	// losses. Declutched says the front motor is declutched in this range;
	// DeclutchMargin is the speed of the output left below the declutch
	// speed where the range has one.
	FrontSpeed     units.AngularVelocity
	FrontTorque    units.Torque
	FrontSetting   float64
	Declutched     bool
	DeclutchMargin units.AngularVelocity
	// Flags are rated limits crossed that do not make the point
	// infeasible (for example a rated continuous pressure exceeded below
	// the relief setting). They are reported, never hidden.
	Flags []Flag
}

// UnitState is the state of a transmission's hydrostatic loop at one point:
// its high-line pressure and the speeds and settings (displacement over its
// maximum) of the pump and the first motor. The zero value means none is
// known.
type UnitState struct {
	HighPressure              units.Pressure
	PumpSpeed, MotorSpeed     units.AngularVelocity
	PumpSetting, MotorSetting float64
}

// A LossPart is one named loss.
type LossPart struct {
	Name  string
	Power units.Power
}

// Efficiency returns the output power over the input power, or 0 when no
// power flows in.
func (d DrivePoint) Efficiency(engine units.AngularVelocity) float64 {
	in := float64(units.PowerFromTorque(d.InputTorque, engine))
	if in <= 0 {
		return 0
	}
	return float64(units.PowerFromTorque(d.OutputTorque, d.OutputSpeed)) / in
}

// A SplitRange is one range of a SplitEstimate, in terms of the speed ratio
// ν = output speed / engine speed.
type SplitRange struct {
	MinRatio, MaxRatio float64 // ν span of the range; MinRatio may be 0 (geared neutral)
	// MechanicalPoint is the ν at which no power flows through the
	// hydrostat (> 0).
	MechanicalPoint float64
}

// A SplitEstimate is a quick estimate of a power-split transmission from
// its mechanical points, for studies before a layout exists and for tests.
// In a range with mechanical point ν_m the hydrostatic share is
//
//	h = 1 − ν/ν_m
//
// (1 at standstill, 0 at the mechanical point, negative beyond it), and
// with hydrostatic and mechanical path efficiencies η_h and η_m the input
// power is P_in = P_out·[1 + (1 − h)·(1/η_m − 1) + |h|·(1/η_h − 1)] + P_0:
// the mechanical path carries (1 − h)·P_out (output plus circulating power
// beyond the mechanical point) and the no-load loss P_0 is charged to it.
//
// Common practice (no published source): a first estimate of a power-split
// drive from the share of power that passes the variator.
type SplitEstimate struct {
	Spans                 []SplitRange
	MechanicalEfficiency  float64      // η_m in (0, 1]
	HydrostaticEfficiency float64      // η_h in (0, 1]
	NoLoadLoss            units.Power  // P_0 >= 0, drag while the input turns
	MaxInputTorque        units.Torque // input torque rating; zero means none
}

// Validate reports whether the estimate is usable.
func (s *SplitEstimate) Validate() error {
	if len(s.Spans) == 0 {
		return invalid("SplitEstimate.Spans", 0.0, "needs at least one range")
	}
	for _, r := range s.Spans {
		if !finite(r.MinRatio, r.MaxRatio, r.MechanicalPoint) || r.MinRatio < 0 || r.MaxRatio <= r.MinRatio || r.MechanicalPoint <= 0 {
			return invalid("SplitRange", r.MaxRatio, "needs 0 <= MinRatio < MaxRatio and MechanicalPoint > 0")
		}
	}
	if err := fraction("SplitEstimate.MechanicalEfficiency", s.MechanicalEfficiency); err != nil {
		return err
	}
	if err := fraction("SplitEstimate.HydrostaticEfficiency", s.HydrostaticEfficiency); err != nil {
		return err
	}
	if err := nonNegative("SplitEstimate.NoLoadLoss", s.NoLoadLoss); err != nil {
		return err
	}
	return nonNegative("SplitEstimate.MaxInputTorque", s.MaxInputTorque)
}

// Ranges returns the number of ranges.
func (s *SplitEstimate) Ranges() int { return len(s.Spans) }

// Operate implements Transmission.
func (s *SplitEstimate) Operate(rng int, engine, out units.AngularVelocity, outTorque units.Torque) (DrivePoint, error) {
	if rng < 0 || rng >= len(s.Spans) {
		return DrivePoint{}, invalid("range", float64(rng), "does not exist")
	}
	if err := positive("engine speed", engine); err != nil {
		return DrivePoint{}, err
	}
	if err := nonNegative("output speed", out); err != nil {
		return DrivePoint{}, err
	}
	if !finite(float64(outTorque)) {
		return DrivePoint{}, invalid("output torque", float64(outTorque), "must be finite")
	}
	r := s.Spans[rng]
	nu := float64(out) / float64(engine)
	if nu < r.MinRatio*(1-1e-12) {
		return DrivePoint{}, &LimitError{Quantity: "speed ratio", Value: units.Plain(nu), Bound: "range minimum", Limit: units.Plain(r.MinRatio), Err: ErrTransmission}
	}
	if nu > r.MaxRatio*(1+1e-12) {
		return DrivePoint{}, &LimitError{Quantity: "speed ratio", Value: units.Plain(nu), Bound: "range maximum", Limit: units.Plain(r.MaxRatio), Err: ErrTransmission}
	}
	h := 1 - nu/r.MechanicalPoint
	ah := math.Abs(h)
	pOut := float64(outTorque) * float64(out)
	// In overrun (pOut < 0) the same paths carry the power back and lose
	// the same fractions of what they pass on: with the path powers taken
	// at the output, P_in = P_out + losses holds in both directions.
	hydro := math.Abs(pOut) * ah * (1/s.HydrostaticEfficiency - 1)
	mech := math.Abs(pOut)*math.Abs(1-h)*(1/s.MechanicalEfficiency-1) + float64(s.NoLoadLoss)
	if pOut < 0 {
		hydro = math.Abs(pOut) * ah * (1 - s.HydrostaticEfficiency)
		mech = math.Abs(pOut)*math.Abs(1-h)*(1-s.MechanicalEfficiency) + float64(s.NoLoadLoss)
	}
	in := units.Torque((pOut + hydro + mech) / float64(engine))
	if s.MaxInputTorque > 0 && in > s.MaxInputTorque {
		return DrivePoint{}, &LimitError{Quantity: "transmission input torque", Value: units.Of(in), Bound: "rated input torque", Limit: units.Of(s.MaxInputTorque), Err: ErrTransmission}
	}
	share := 0.0
	if pIn := pOut + hydro + mech; pIn > 0 && pOut > 0 {
		share = h * (pOut + hydro) / pIn
	}
	dp := DrivePoint{Range: rng, InputTorque: in, OutputSpeed: out, OutputTorque: outTorque,
		HydrostaticLoss: units.Power(hydro), MechanicalLoss: units.Power(mech), HydrostaticShare: share}
	if s.MaxInputTorque == 0 {
		dp.Flags = unratedInputTorque[:1:1]
	}
	return dp, nil
}

// unratedInputTorque is the flag of a SplitEstimate without an input
// torque rating, shared by every point (capacity-limited: an append copies).
var unratedInputTorque = []Flag{{Name: "transmission input torque: rated input torque not given, not checked", Unchecked: true}}
