// Package traction turns wheel torque and speed into pull: it models
// pneumatic tyres on soil and on roads, one wheel at a time and for a
// two-axle vehicle, with slip, motion resistance, tractive efficiency,
// weight transfer, axles driven at a fixed ratio or independently, turning
// and ballast.
//
// # Slip, speeds and the power balance
//
// A wheel of rolling radius r turning at ω would travel at the theoretical
// speed v₀ = ω·r; it travels at v. Slip follows ASABE S296:
//
//	s = 1 − v/(ω·r),   v = ω·r·(1 − s)
//
// Driving wheels work at s in [0, 1). A negative slip (v > ω·r) describes an
// overrun wheel, pushed along faster than it turns; the models accept
// s ≥ MinSlip (−0.5) for that case, which arises when one axle drives
// another through a fixed ratio.
//
// At a dynamic wheel load W the models give dimensionless ratios
//
//	GT = gross traction / W     (the pull the wheel torque produces: T = GT·W·r)
//	MR = motion resistance / W
//	NT = net pull / W = GT − MR
//	TE = (NT/GT)·(1 − s)        (tractive efficiency, 0 where NT ≤ 0)
//
// and so the wheel's input power T·ω splits exactly into
//
//	T·ω = NT·W·v  +  GT·W·ω·r·s  +  MR·W·v
//	      drawbar     slip loss       rolling-resistance loss
//
// which State reports and the tests check to 1e-9 relative.
//
// # Models
//
// Brixius, the equations of ASAE paper 87-1622 (1987) as given in ASABE
// D497.7 (2011), for bias-ply tyres (the constants below are the bias-ply
// set; radial-ply tyres are not built in). Cone index CI, section width b,
// unloaded diameter d, section height h, deflection δ:
//
//	Bn = (CI·b·d/W)·(1 + 5δ/h)/(1 + 3b/d)         mobility number
//	GT = 0.88·(1 − e^(−0.1·Bn))·(1 − e^(−7.5·s)) + 0.04
//	MR = 1/Bn + 0.04 + 0.5·s/√Bn
//
// WismerLuth, the equations of Transactions of the ASAE 17(1) (1974), with
// its own wheel numeric Cn = CI·b·d/W:
//
//	NT = 0.75·(1 − e^(−0.3·Cn·s)) − (1.2/Cn + 0.04)
//	MR = 1.2/Cn + 0.04,   GT = NT + MR
//
// Road, for hard surfaces, with the surface's rolling coefficient f and
// peak adhesion μ: NT = μ·(1 − e^(−k·s)), MR = f, GT = NT + f. The
// exponential form and k = 15 are common practice, not a published fit.
//
// # Gee-Clough model
//
// GeeClough is the model of Journal of Terramechanics 15(2): 81–94 (1978),
// with the mobility number after a further source. It needs the tyre
// deflection δ > 0:
//
//	M     = (CI·b·d/W)·√(δ/h)/(1 + b/(2d))       mobility number
//	CTmax = 0.796 − 0.92/M,   k·CTmax = 4.838 + 0.061·M
//	NT    = CTmax·(1 − e^(−k·s)),   MR = 0.049 + 0.287/M,   GT = NT + MR
//
// GeeClough.Coefficients gives M, CTmax, the initial slope k·CTmax and
// MR. A mobility number at or below 0.92/0.796 ≈ 1.156
// (GeeCloughMinMobility) is outside the model's range and an error wrapping
// ErrLoad. The equations were fitted for field conditions (stubble,
// ploughed and cultivated ground); they do not apply to hard dry surfaces
// or to very slippery conditions. The tests reproduce a published table of
// CTmax, k·CTmax, MR and the best tractive efficiency for a small drive
// tyre.
//
// # Surfaces
//
// HardSoil, FirmSoil, TilledSoil and SoftSoil carry the cone index of the
// four soil conditions tabulated in ASABE D497 (1800, 1200, 900 and
// 450 kPa; recalled from the standard, check your copy). Concrete, Asphalt
// and Gravel carry rolling and adhesion coefficients for the Road model.
// Recommended returns the recommended slip range and the typical ratios of
// drawbar power to PTO power (whole tractor, driveline losses included, not
// tyre efficiencies) that ASABE D497 tabulates for each condition.
//
// # One wheel
//
// NewWheel binds a Tyre, a Surface and a Model. Wheel.At gives the Pull at
// a slip, Wheel.Run adds speeds and powers, Wheel.SlipForPull inverts the
// curve with Brent's method (a *PullError wrapping ErrPull when the soil
// cannot give the pull), Wheel.MaxPull and Wheel.BestSlip give the greatest
// net pull and the slip of greatest tractive efficiency.
//
//	w, err := traction.NewWheel(tyre, traction.FirmSoil(), traction.Brixius{})
//	p, err := w.SlipForPull(units.Kilonewtons(25), units.Kilonewtons(8))
//	fmt.Println(p.Slip, p.Efficiency)
//
// A solver that asks one wheel for many pulls at one load (an axle of a
// two-axle point) takes Wheel.Loaded: LoadedWheel.Pull is the model's Pull
// at that load, with what depends on the load alone worked out once, and
// LoadedWheel.SlipFor inverts the curve over any slip range, from a start
// the caller gives (the last slip). A model that is a SlopeModel gives the
// slope of its net pull in closed form (Brixius, Wismer–Luth and Road do):
//
//	dNT/ds = 0.88·(1 − e^(−0.1·Bn))·7.5·e^(−7.5·|s|) − 0.5·sign(s)/√Bn   (Brixius)
//
// and SlipFor takes Newton steps on it inside the bracket (bisecting where
// a step would leave it); any other model is searched by Brent's method.
// Both stop with the root bracketed within 4·ε·|s| + 1e-13.
//
// # Vehicles
//
// A Vehicle has a mass, a wheelbase, a centre of mass, a hitch and two
// axles. Moments about the rear contact line give the axle loads under a
// drawbar pull P at hitch height h and a mounted implement's load V at
// distance c behind the rear axle:
//
//	W_f = (W·a − P·h − V·c)/L,   W_r = W + V − W_f
//
// Three drive arrangements are solved at an Operation (pull, implement load,
// speed):
//
//   - FixedRatio: the front axle is geared to the rear with a lead,
//     ω_f·r_f = (1 + lead)·ω_r·r_r, so (1 + lead)·(1 − s_f) = 1 − s_r. The
//     slips satisfying the total pull are found with Brent's method. When
//     the lead forces one axle to be overrun, it returns power into the
//     driveline: Drive.CirculatingPower.
//   - Independent: each axle has its own motor; the pull split (and so the
//     torque split) is chosen to need the least input power, which is the
//     greatest tractive efficiency.
//   - RearDrive: the front wheels roll free at zero torque.
//
// # Turning
//
// Vehicle.Turn gives the Ackermann path radii of each wheel and the
// front-to-rear speed ratio a turn requires, k = (R_fi + R_fo)/(R_ri + R_ro),
// with R_f = √(R_r² + L²). FixedRatioTurn solves a geared front axle in the
// turn with the effective lead (1 + lead)/k − 1 and reports the wind-up
// (circulating) power that a fixed ratio causes; IndependentTurn shows the
// same turn with an axle driven by its own motor, which avoids it. In the
// turn the pulls along the wheel paths balance in moments about the turn
// centre, k·N_f + N_r = P, so the wheels' Σ N·v is still P·v.
//
// Negative slips of an overrun axle extrapolate the traction equations,
// which were fitted to driving wheels: treat circulating and wind-up powers
// as estimates. The soil models mirror their driving curve for s < 0, so a
// braked wheel's coefficient is bounded by the same asymptote as a driving
// one (the soil's shear strength bounds it either way) instead of growing
// exponentially, and Pull.Outside flags the overrun. Pull.Outside also
// flags tyres outside the range a model was fitted to (Brixius: b/d and
// δ/h); such a pull is reported, not refused.
//
// # Ballast
//
// Vehicle.Ballast finds the operating mass, with the recommended static
// weight split for the drive and hitch type (RecommendedFrontShare, after
// ASABE EP496, recalled from the standard), that gives a target pull at a
// target slip, and the ballast to add per axle.
//
// # Safety
//
// These are estimates for design studies. Tyre load ratings at the
// inflation and speed of use, axle and hitch limits, the vehicle
// manufacturer's ballasting instructions and local road rules (axle loads,
// total mass, braking, road speed) bound every result. A wheel load above
// the tyre's RatedLoad is flagged (State.Overloaded, BallastAdvice), a front
// axle lifted by the pull is an error (ErrUnstable), never hidden.
// Safety-relevant decisions need the manufacturer's data, physical tests
// and a qualified engineer.
//
// # Sources
//
//   - ASABE D497.7 (2011), Agricultural Machinery Management Data: traction
//     equations after ASAE paper 87-1622 (1987), soil conditions, slip and
//     tractive efficiency tables.
//   - ASAE paper 87-1622 (1987), Traction prediction equations for bias ply
//     tires.
//   - Transactions of the ASAE 17(1) (1974), Off-road traction prediction
//     for wheeled vehicles.
//   - Journal of Terramechanics 15(2): 81–94 (1978), The empirical
//     prediction of tractor-implement field performance.
//   - ASABE EP496 (agricultural machinery management): recommended weight
//     distributions.
package traction
