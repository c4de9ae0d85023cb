package powersplit

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Load-independent losses ("drag"). Each is a torque between a shaft and
// the housing (or, for an open clutch, between the clutch's two shafts)
// that depends only on shaft speeds and the oil, except the charge pump's,
// which follows the loop's leakage. A drag torque T_d on shaft s enters the
// shaft's torque balance as a known load,
//
//	Σ port torques on s + T_d = 0,
//
// and its loss T_d·ω_rel ≥ 0 (ω_rel the speed of the shaft against the
// housing or the slip across an open clutch) is listed by name in
// State.Drags and included in State.Loss, so the power balance still
// closes. Every drag source is off unless a layout adds it.

// DragKind says what kind of load-independent loss a drag source is.
type DragKind int

// The drag kinds.
const (
	BearingDrag    DragKind = iota // rolling-bearing friction (Palmgren)
	ChurningDrag                   // gear churning and windage (ISO/TR 14179-1)
	PlateDrag                      // viscous drag of an open wet multi-plate clutch or brake
	PTOIdleDrag                    // a PTO driveline turning without load
	ChargePumpDrag                 // the charge pump of a closed loop
)

var dragKindNames = [...]string{"bearings", "churning", "open plates", "idle PTO", "charge pump"}

func (k DragKind) String() string {
	if k < 0 || int(k) >= len(dragKindNames) {
		return "DragKind(" + fmt.Sprint(int(k)) + ")"
	}
	return dragKindNames[k]
}

// Lubricant is the transmission oil at its operating temperature, as the
// drag sources see it. Build it from a hydrostat.Oil at the sump
// temperature (Oil.Viscosity, Oil.Density) or give the values directly.
type Lubricant struct {
	Viscosity units.KinematicViscosity // ν at the operating temperature, > 0
	Density   units.Density            // ρ at the operating temperature, > 0
}

// Bearings describes the rolling bearings of one shaft for Palmgren's
// friction moment (Palmgren's model of 1959; Rolling Bearing Analysis, 5th
// ed. 2007, ch. 9):
//
//	M = M0 + M1
//	M0 = 10⁻⁷·f0·(ν·n)^(2/3)·dm³   [N·mm]  for ν·n ≥ 2000
//	M0 = 160·10⁻⁷·f0·dm³            [N·mm]  for ν·n < 2000
//	M1 = f1·P1·dm                   [N·mm]
//
// with ν the oil's kinematic viscosity in mm²/s (cSt), n the speed in rpm,
// dm the bearing's mean diameter (bore + outside)/2 in mm and P1 the load
// that governs the friction in N. The low-speed form is the high-speed form
// at ν·n = 2000 (2000^(2/3) ≈ 159): below it the film no longer thins with
// speed. M0 is load-independent; M1 depends on a bearing load that the
// layout does not compute, so P1 is given (a typical load at the duty
// considered).
//
// From memory (Rolling Bearing Analysis, table of f0 and f1): f0 for oil-bath
// lubrication about 1.5–2 (deep-groove ball), 2–3 (cylindrical roller with
// cage), 3–4 (tapered roller), 4–6 (spherical roller); half of that with oil
// mist, about double with an oil jet or vertical shafts. f1 about
// 0.0007–0.0009 for radial ball bearings (scaled by (P0/C0)^0.5 in the full
// method), 0.0002–0.0004 for cylindrical, 0.0004 for tapered and
// 0.0004–0.0005 for spherical roller bearings.
type Bearings struct {
	MeanDiameter units.Length // dm, > 0
	F0           float64      // Palmgren's lubrication factor f0, > 0
	F1           float64      // Palmgren's load factor f1, ≥ 0
	Load         units.Force  // P1, ≥ 0 (with F1)
	Count        int          // bearings of this size on the shaft; 0 means 1
}

// Wheel describes one rotating part for the no-load (churning and
// windage) loss of ISO/TR 14179-1:2001, Gears — Thermal capacity — Part 1,
// which adds, for each part dipping into the oil,
//
//	smooth outside diameter:  P = 7.37·fg·ν·n³·D^4.7·L      / (Ag·10²⁶)
//	smooth sides of a disc:   P = 1.474·fg·ν·n³·D^5.7        / (Ag·10²⁶)
//	tooth surfaces:           P = 7.37·fg·ν·n³·D^4.7·b·Rf/√tan β / (Ag·10²⁶)
//	Rf = 7.93 − 4.648/mt
//
// in kW, with ν in mm²/s (cSt) at the operating temperature, n in rpm,
// D (outside diameter), L (length of a smooth cylinder), b (face width) and
// mt (transverse module) in mm, fg the dip factor (0 for a part clear of
// the oil, 1 for one fully submerged, the immersed fraction of the
// diameter in between) and Ag = 0.2 the arrangement constant.
//
// From memory (not re-read): the equations, Ag = 0.2 and the rule that
// spur gears are evaluated with β = 10°. A gear pair is two Wheels, one on
// each shaft; a planetary set is a Wheel per member (sun, ring, and the
// carrier with its planets as a disc of the planets' outside diameter
// turning at carrier speed, plus the planets' teeth). The method is an
// estimate for dip-lubricated gears; jet-lubricated gears churn less.
type Wheel struct {
	Diameter   units.Length // D, outside diameter, > 0
	FaceWidth  units.Length // b; 0 for a part without teeth
	Module     units.Length // mt, transverse module; needed with FaceWidth
	HelixAngle units.Angle  // β; 0 (spur) is evaluated at 10°
	Cylinder   units.Length // L, length of a smooth outside cylinder (shaft, drum); 0 for none
	Sides      bool         // add the loss of the two smooth sides of a disc of diameter D
	Dip        float64      // fg in [0, 1]
}

// Plates describes an open wet multi-plate clutch or brake for the viscous
// drag of its oil films. With the gaps full of oil and laminar (Couette)
// shear, each film between an inner radius ri and an outer radius ro
// transmits
//
//	T = π·μ·Δω·(ro⁴ − ri⁴)/(2·h)
//
// (Newton's law of viscosity integrated over an annulus; the film model of
// open-clutch drag, for example SAE paper 2003-01-1973, and J. Fluids Eng.
// 129 (2007) 333), μ = ν·ρ the dynamic
// viscosity, Δω the slip speed and h the clearance of one film. Above a
// critical slip speed the films break up and the drag falls well below
// this value: the formula is the upper bound of the undisturbed film and
// overstates the drag at high slip.
type Plates struct {
	Films     int          // number of oil films (friction faces), > 0
	Inner     units.Length // ri, > 0
	Outer     units.Length // ro, > ri
	Clearance units.Length // h, clearance of one film, > 0
}

// ChargePump describes the charge pump of a closed hydrostatic loop,
// driven from a shaft of the layout (usually the input). It delivers the
// loop's leakage plus a flushing flow at the charge pressure, so it takes
//
//	P = p_c·(Q_leak + Q_flush)/η,   T = P/ω
//
// from its shaft, with p_c the loop's charge pressure (LoopSpec.Charge) and
// η the pump's overall efficiency.
//
// Common practice (no published source): charge pressures of 15–30 bar; a
// charge pump sized at 15–25 % of the main pump's displacement; flushing
// flows of a few L/min to about 10 % of the main flow; gear charge pumps of
// 0.6–0.85 overall efficiency.
type ChargePump struct {
	Flushing   units.VolumeFlow // Q_flush, ≥ 0
	Efficiency float64          // η in (0, 1]
}

// dragSrc is one drag source of a layout.
type dragSrc struct {
	name     string
	kind     DragKind
	a, b     int // shafts; b = −1 for the housing
	elem     int // PlateDrag: the clutch or brake; PTOIdleDrag: the PTO; ChargePumpDrag: the loop (element index)
	bearings Bearings
	wheel    Wheel
	plates   Plates
	pump     ChargePump
}

func finitePos(v float64) bool { return v > 0 && !math.IsInf(v, 0) }

func finiteNonNeg(v float64) bool { return v >= 0 && !math.IsInf(v, 0) }

// Lubricant sets the transmission oil for the drag sources. A layout with
// drag sources other than charge pumps needs one.
func (b *Builder) Lubricant(l Lubricant) {
	if !finitePos(float64(l.Viscosity)) || !finitePos(float64(l.Density)) {
		b.fail("lubricant", "viscosity and density must be finite and positive")
		return
	}
	b.lube = l
}

func (b *Builder) addDrag(d dragSrc) {
	if d.a < 0 || d.a >= len(b.shafts) || d.b >= len(b.shafts) {
		b.fail(d.name, "drag on a shaft that does not exist")
		return
	}
	b.drags = append(b.drags, d)
}

func checkBearings(br Bearings) string {
	switch {
	case !finitePos(float64(br.MeanDiameter)):
		return "bearing mean diameter must be finite and positive"
	case !finitePos(br.F0):
		return "f0 must be finite and positive"
	case !finiteNonNeg(br.F1) || !finiteNonNeg(float64(br.Load)):
		return "f1 and the load must be finite and ≥ 0"
	case br.Count < 0:
		return "bearing count must be ≥ 0"
	}
	return ""
}

func checkPlates(p Plates) string {
	switch {
	case p.Films <= 0:
		return "a plate pack needs at least one oil film"
	case !finitePos(float64(p.Inner)) || !finitePos(float64(p.Outer)) || !(p.Outer > p.Inner):
		return "plate radii need 0 < inner < outer, finite"
	case !finitePos(float64(p.Clearance)):
		return "plate clearance must be finite and positive"
	}
	return ""
}

// Bearings adds the friction of rolling bearings that carry shaft s in the
// housing (see Bearings for the model).
func (b *Builder) Bearings(name string, s Shaft, br Bearings) {
	if r := checkBearings(br); r != "" {
		b.fail(name, r)
		return
	}
	if br.Count == 0 {
		br.Count = 1
	}
	b.addDrag(dragSrc{name: name, kind: BearingDrag, a: int(s), b: -1, elem: -1, bearings: br})
}

// BearingsBetween adds the friction of rolling bearings between shafts a
// and c (a gear turning free on its shaft, a shaft inside a hollow one):
// their speed is the difference of the shafts' speeds, and the friction
// moment acts on a and, opposite, on c.
func (b *Builder) BearingsBetween(name string, a, c Shaft, br Bearings) {
	if r := checkBearings(br); r != "" {
		b.fail(name, r)
		return
	}
	if a == c {
		b.fail(name, "bearings between a shaft and itself")
		return
	}
	if br.Count == 0 {
		br.Count = 1
	}
	b.addDrag(dragSrc{name: name, kind: BearingDrag, a: int(a), b: int(c), elem: -1, bearings: br})
}

// Churning adds the churning and windage loss of a rotating part on shaft
// s (see Wheel for the model).
func (b *Builder) Churning(name string, s Shaft, w Wheel) {
	switch {
	case !finitePos(float64(w.Diameter)):
		b.fail(name, "wheel diameter must be finite and positive")
		return
	case !finiteNonNeg(float64(w.FaceWidth)) || !finiteNonNeg(float64(w.Cylinder)):
		b.fail(name, "face width and cylinder length must be finite and ≥ 0")
		return
	case w.FaceWidth > 0 && !(float64(w.Module) > 0.001*4.648/7.93 && !math.IsInf(float64(w.Module), 0)):
		b.fail(name, "a toothed wheel needs a transverse module above 0.59 mm")
		return
	case math.IsNaN(float64(w.HelixAngle)) || math.Abs(w.HelixAngle.Degrees()) >= 60:
		b.fail(name, "helix angle must be within ±60°")
		return
	case !(w.Dip >= 0 && w.Dip <= 1):
		b.fail(name, "dip factor must be in [0, 1]")
		return
	}
	b.addDrag(dragSrc{name: name, kind: ChurningDrag, a: int(s), b: -1, elem: -1, wheel: w})
}

// PlateDrag adds the viscous drag of the plates of the clutch or brake
// named element while it is open (see Plates for the model). Add it after
// the clutch or brake.
func (b *Builder) PlateDrag(name, element string, p Plates) {
	if r := checkPlates(p); r != "" {
		b.fail(name, r)
		return
	}
	for i, e := range b.elems {
		if e.name == element && (e.kind == ClutchKind || e.kind == BrakeKind) {
			sb := -1
			if e.kind == ClutchKind {
				sb = e.shafts[1]
			}
			b.addDrag(dragSrc{name: name, kind: PlateDrag, a: e.shafts[0], b: sb, elem: i, plates: p})
			return
		}
	}
	b.fail(name, fmt.Sprintf("no clutch or brake named %q (add it first)", element))
}

// PTOIdle adds the drag of the PTO named pto while it turns without load
// (the point's PTO torque zero or nil): the open plates of its clutch, with
// the PTO shaft's speed as the slip, and its bearings. Under load the
// PTO's mesh efficiency accounts for its losses and this drag is off.
// Add it after the PTO.
func (b *Builder) PTOIdle(name, pto string, p Plates, br Bearings) {
	if r := checkPlates(p); r != "" {
		b.fail(name, r)
		return
	}
	if r := checkBearings(br); r != "" {
		b.fail(name, r)
		return
	}
	if br.Count == 0 {
		br.Count = 1
	}
	for i, e := range b.elems {
		if e.name == pto && e.kind == PTOKind {
			b.addDrag(dragSrc{name: name, kind: PTOIdleDrag, a: e.shafts[0], b: -1, elem: i, plates: p, bearings: br})
			return
		}
	}
	b.fail(name, fmt.Sprintf("no PTO named %q (add it first)", pto))
}

// ChargePump adds the charge pump of the loop named loop, driven from shaft
// s (see ChargePump for the model). Add it after the loop.
func (b *Builder) ChargePump(name, loop string, s Shaft, cp ChargePump) {
	if !finiteNonNeg(float64(cp.Flushing)) || !(cp.Efficiency > 0 && cp.Efficiency <= 1) {
		b.fail(name, "charge pump needs a finite flushing flow ≥ 0 and an efficiency in (0, 1]")
		return
	}
	for i, e := range b.elems {
		if e.name == loop && e.kind == LoopKind {
			b.addDrag(dragSrc{name: name, kind: ChargePumpDrag, a: int(s), b: -1, elem: i, pump: cp})
			return
		}
	}
	b.fail(name, fmt.Sprintf("no loop named %q (add it first)", loop))
}

// BearingTorque returns Palmgren's friction moment M0 + M1 of one bearing
// (see Bearings) at speed w in oil of kinematic viscosity nu, as a
// magnitude (the moment opposes the rotation).
func BearingTorque(br Bearings, nu units.KinematicViscosity, w units.AngularVelocity) units.Torque {
	dm := float64(br.MeanDiameter) * 1e3 // mm
	vn := nu.Centistokes() * math.Abs(w.RPM())
	var m0 float64
	if vn >= 2000 {
		m0 = 1e-7 * br.F0 * math.Cbrt(vn*vn) * dm * dm * dm
	} else {
		m0 = 160e-7 * br.F0 * dm * dm * dm
	}
	m1 := br.F1 * float64(br.Load) * dm
	return units.Torque((m0 + m1) * 1e-3)
}

// ChurningPower returns the no-load loss of ISO/TR 14179-1 of part wh (see
// Wheel) at speed w in oil of kinematic viscosity nu.
func ChurningPower(wh Wheel, nu units.KinematicViscosity, w units.AngularVelocity) units.Power {
	const ag = 0.2
	if wh.Dip == 0 || w == 0 {
		return 0
	}
	n := math.Abs(w.RPM())
	d := float64(wh.Diameter) * 1e3
	k := wh.Dip * nu.Centistokes() * n * n * n / (ag * 1e26) // kW per unit of the geometry terms
	d47 := math.Pow(d, 4.7)
	var g float64
	if wh.Cylinder > 0 {
		g += 7.37 * d47 * float64(wh.Cylinder) * 1e3
	}
	if wh.Sides {
		g += 1.474 * d47 * d
	}
	if wh.FaceWidth > 0 {
		beta := math.Abs(float64(wh.HelixAngle))
		if beta == 0 {
			beta = 10 * math.Pi / 180
		}
		rf := 7.93 - 4.648/(float64(wh.Module)*1e3)
		g += 7.37 * d47 * float64(wh.FaceWidth) * 1e3 * rf / math.Sqrt(math.Tan(beta))
	}
	return units.Kilowatts(k * g)
}

// PlateTorque returns the viscous drag torque of open plates p (see Plates)
// at slip speed slip in oil of dynamic viscosity mu, as a magnitude.
func PlateTorque(p Plates, mu units.DynamicViscosity, slip units.AngularVelocity) units.Torque {
	ro, ri := float64(p.Outer), float64(p.Inner)
	r4 := ro*ro*ro*ro - ri*ri*ri*ri
	return units.Torque(float64(p.Films) * math.Pi * float64(mu) * math.Abs(float64(slip)) * r4 / (2 * float64(p.Clearance)))
}

// sgn returns the sign of v (0 for 0).
func sgn(v float64) float64 {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// dragTorque returns the torque shaft a of drag source d applies to it at
// the current speeds: with the sign of the relative speed, so that its loss
// T·ω_rel is ≥ 0. Charge pumps are set by chargeTorques.
func (l *layout) dragTorque(d *dragSrc, r *rangeDef, p *Point, w []float64) float64 {
	rel := w[d.a]
	if d.b >= 0 {
		rel -= w[d.b]
	}
	if rel == 0 {
		return 0
	}
	nu := l.lube.Viscosity
	switch d.kind {
	case BearingDrag:
		return sgn(rel) * float64(d.bearings.Count) * float64(BearingTorque(d.bearings, nu, units.AngularVelocity(rel)))
	case ChurningDrag:
		return float64(ChurningPower(d.wheel, nu, units.AngularVelocity(rel))) / rel
	case PlateDrag:
		if r.engaged[d.elem] {
			return 0
		}
		mu := units.DynamicFromKinematic(nu, l.lube.Density)
		return sgn(rel) * float64(PlateTorque(d.plates, mu, units.AngularVelocity(rel)))
	case PTOIdleDrag:
		if p.PTO != nil && p.PTO[l.elems[d.elem].index] != 0 {
			return 0
		}
		mu := units.DynamicFromKinematic(nu, l.lube.Density)
		t := float64(PlateTorque(d.plates, mu, units.AngularVelocity(rel))) +
			float64(d.bearings.Count)*float64(BearingTorque(d.bearings, nu, units.AngularVelocity(rel)))
		return sgn(rel) * t
	}
	return 0
}

// initDrags sets the torques of every drag source but the charge pumps
// for the speeds of the point (s.w), once per Solve. A torque that is not
// finite (sizes so large that the formulas overflow) is an *InputError.
func (s *Solver) initDrags(r *rangeDef, p *Point) error {
	l := s.l
	for i := range l.drags {
		d := &l.drags[i]
		if d.kind == ChargePumpDrag {
			s.dragT[i] = 0
			continue
		}
		t := l.dragTorque(d, r, p, s.w)
		if bad(t) {
			clear(s.dragT)
			s.dragRHSFromT()
			return &InputError{Field: "drag " + d.name, Value: units.Of(units.Torque(0)), Reason: "torque not finite at this point (sizes out of range)"}
		}
		s.dragT[i] = t
	}
	s.dragRHSFromT()
	return nil
}

// chargeTorques sets the charge pumps' torques from the loops' leakage at
// the current loop states (s.loopA) and the shaft right-hand sides with
// them; called before every solve of the torque system.
func (s *Solver) chargeTorques() {
	l := s.l
	if !l.hasCharge {
		return
	}
	for i := range l.drags {
		d := &l.drags[i]
		if d.kind != ChargePumpDrag {
			continue
		}
		el := &l.elems[d.elem]
		w := s.w[d.a]
		t := 0.0
		if w != 0 {
			q := float64(s.loopA[el.index].ChargeFlow) + float64(d.pump.Flushing)
			t = float64(el.lspec.Charge) * q / d.pump.Efficiency / w
			if bad(t) {
				t = 0
			}
		}
		s.dragT[i] = t
	}
	s.dragRHSFromT()
}

// dragRHSFromT sets the shafts' right-hand sides −Σ T_d from the drag
// torques.
func (s *Solver) dragRHSFromT() {
	clear(s.dragRHS)
	for i := range s.l.drags {
		d := &s.l.drags[i]
		s.dragRHS[d.a] -= s.dragT[i]
		if d.b >= 0 {
			s.dragRHS[d.b] += s.dragT[i]
		}
	}
}

// DragState is the state of one drag source.
type DragState struct {
	Name  string
	Kind  DragKind
	Shaft int // the shaft the drag acts on
	// Other is the second shaft (an open clutch's other side), −1 for the
	// housing.
	Other  int
	Speed  units.AngularVelocity // speed of Shaft relative to Other (or the housing)
	Torque units.Torque          // torque Shaft applies to the drag
	Loss   units.Power           // Torque·Speed ≥ 0
}

// fillDrags writes the drag sources' states into st and returns their
// total loss.
func (s *Solver) fillDrags(st *State, torques int) float64 {
	l := s.l
	total := 0.0
	for i := range l.drags {
		d := &l.drags[i]
		rel := s.w[d.a]
		if d.b >= 0 {
			rel -= s.w[d.b]
		}
		t := 0.0
		if torques != 0 {
			t = s.dragT[i]
		}
		loss := pos(t * rel)
		st.Drags[i] = DragState{Name: d.name, Kind: d.kind, Shaft: d.a, Other: d.b,
			Speed: units.AngularVelocity(rel), Torque: units.Torque(t + 0), Loss: units.Power(loss)}
		total += loss
	}
	return total
}

// NoLoad lists the load-independent losses of a layout by the names of its
// shafts and elements, for Layout.WithLosses. Each entry's Name names the
// drag source in State.Drags.
type NoLoad struct {
	Lubricant   Lubricant
	Bearings    []ShaftBearings
	Churning    []ShaftWheel
	Plates      []ElementPlates
	PTOIdle     []PTOIdleSpec
	ChargePumps []LoopChargePump
}

// ShaftBearings are the bearings of the shaft named Shaft, in the housing,
// or, when Other names a shaft, between Shaft and Other.
type ShaftBearings struct {
	Name, Shaft string
	Other       string
	Bearings
}

// ShaftWheel is a churning part on the shaft named Shaft.
type ShaftWheel struct {
	Name, Shaft string
	Wheel
}

// ElementPlates are the plates of the clutch or brake named Element.
type ElementPlates struct {
	Name, Element string
	Plates
}

// PTOIdleSpec is the idle drag of the PTO named PTO: its clutch's plates
// and its bearings.
type PTOIdleSpec struct {
	Name, PTO string
	Plates    Plates
	Bearings  Bearings
}

// LoopChargePump is the charge pump of the loop named Loop, driven from
// the shaft named Shaft.
type LoopChargePump struct {
	Name, Loop, Shaft string
	ChargePump
}

// WithLosses returns a copy of l with the load-independent losses of n
// added to those it has (n's lubricant replaces l's when given). It
// reports unknown shaft and element names and invalid values as a
// *LayoutError.
func (l Layout) WithLosses(n NoLoad) (Layout, error) {
	if l.l == nil {
		return Layout{}, &LayoutError{Reason: "WithLosses on the zero Layout", Err: ErrLayout}
	}
	b := &Builder{shafts: l.l.shafts, elems: l.l.elems, lube: l.l.lube, drags: append([]dragSrc(nil), l.l.drags...)}
	if n.Lubricant != (Lubricant{}) {
		b.Lubricant(n.Lubricant)
	}
	shaft := func(owner, name string) Shaft {
		for i, s := range l.l.shafts {
			if s == name {
				return Shaft(i)
			}
		}
		b.fail(owner, fmt.Sprintf("no shaft named %q", name))
		return 0
	}
	for _, x := range n.Bearings {
		if x.Other != "" {
			b.BearingsBetween(x.Name, shaft(x.Name, x.Shaft), shaft(x.Name, x.Other), x.Bearings)
			continue
		}
		b.Bearings(x.Name, shaft(x.Name, x.Shaft), x.Bearings)
	}
	for _, x := range n.Churning {
		b.Churning(x.Name, shaft(x.Name, x.Shaft), x.Wheel)
	}
	for _, x := range n.Plates {
		b.PlateDrag(x.Name, x.Element, x.Plates)
	}
	for _, x := range n.PTOIdle {
		b.PTOIdle(x.Name, x.PTO, x.Plates, x.Bearings)
	}
	for _, x := range n.ChargePumps {
		b.ChargePump(x.Name, x.Loop, shaft(x.Name, x.Shaft), x.ChargePump)
	}
	if b.err != nil {
		return Layout{}, b.err
	}
	c := *l.l
	if err := c.setDrags(b.lube, b.drags); err != nil {
		return Layout{}, err
	}
	return Layout{l: &c}, nil
}

// setDrags sets the lubricant and drag sources of l after checking them.
func (l *layout) setDrags(lube Lubricant, drags []dragSrc) error {
	l.lube, l.drags, l.hasCharge = lube, append([]dragSrc(nil), drags...), false
	seen := map[string]bool{}
	for _, d := range l.drags {
		if seen[d.name] {
			return &LayoutError{Element: d.name, Reason: "duplicate drag source name", Err: ErrLayout}
		}
		seen[d.name] = true
		if d.kind == ChargePumpDrag {
			l.hasCharge = true
		} else if l.lube.Viscosity == 0 {
			return &LayoutError{Element: d.name, Reason: "drag source without a lubricant (Builder.Lubricant)", Err: ErrLayout}
		}
	}
	return nil
}

// Drags returns the names and kinds of the layout's drag sources in the
// order of State.Drags.
func (l Layout) Drags() (names []string, kinds []DragKind) {
	if l.l == nil {
		return nil, nil
	}
	for _, d := range l.l.drags {
		names = append(names, d.name)
		kinds = append(kinds, d.kind)
	}
	return names, kinds
}
