// Package planetary models epicyclic (planetary) gear sets: the kinematics
// of sun, ring and carrier, the static torques with mesh losses, and the
// tooth-count design checks a gear engineer runs before anything else.
//
// # The set
//
// A set has three shafts, or members: the Sun, the Ring and the Carrier
// that holds the planets. It is described either by tooth counts (New with
// a Design) or, for concept studies, directly by its fixed-carrier ratio i0
// (FromRatio). The fixed-carrier ratio is the speed ratio sun to ring when
// the carrier is held:
//
//	single planet (each planet meshes sun and ring):  i0 = −z_ring/z_sun
//	double planet (planet pairs, inner and outer):    i0 = +z_ring/z_sun
//
// # Kinematics: the Willis equation
//
// Seen from the carrier the set is an ordinary gear train of ratio i0, so
// the speeds relative to the carrier obey (ωSun − ωCarrier) = i0·(ωRing − ωCarrier),
// which is the Willis equation
//
//	ωSun − i0·ωRing − (1 − i0)·ωCarrier = 0.
//
// Any two speeds give the third (Set.Solve). Holding one member gives the
// six classical ratios (Set.Ratio): with the ring held ωSun/ωCarrier = 1 − i0,
// with the sun held ωRing/ωCarrier = 1 − 1/i0, with the carrier held
// ωSun/ωRing = i0, and their inverses. The planets turn relative to the
// carrier at −(z_sun/z_planet)·(ωSun − ωCarrier) (Set.PlanetSpeeds), the
// speed their bearings see; in planet pairs the outer planet turns at
// +(z_sun/z_outer)·(ωSun − ωCarrier). Adding the carrier speed gives their
// absolute speed, which PlanetSpeeds reports too.
//
// # Torques and the carrier-frame view of losses
//
// Each torque is the torque the shaft applies TO the set; the power into
// the set at a member is T·ω. Without losses the torques stand in the fixed
// ratios of the Willis equation, TRing = −i0·TSun and TCarrier = (i0 − 1)·TSun,
// and the powers sum to zero.
//
// The mesh losses depend on the power that rolls through the teeth, which
// is the power seen in the frame of the carrier, not on the power the
// shafts carry. Writing every speed relative to the carrier, the sun passes
// the rolling power
//
//	P_roll = TSun·(ωSun − ωCarrier)
//
// into the meshes; the rest of the sun's power, TSun·ωCarrier, is coupling
// power carried round by the carrier without loss. In the carrier frame the
// set is a fixed-axis train with efficiency η0, the basic efficiency, so the
// torque ratio takes η0 in the direction the rolling power flows:
//
//	sun drives  (P_roll ≥ 0):  TRing = −i0·η0·TSun
//	ring drives (P_roll < 0):  TRing = −(i0/η0)·TSun
//	always:                    TCarrier = −(TSun + TRing)
//
// and the loss is (1 − η0) times the rolling power entering at the driving
// member. It is never negative, and it equals T·ω summed over the members
// (with the opposite convention, power out of the set counted positive, that
// sum is −loss).
// This is Müller's method (Epicyclic Drive Trains, 1982), also that of The
// Mechanical Efficiency of Epicyclic Gear Trains (ASME J. Mech. Des. 115,
// 1993). Set.TorqueFactors gives the two factors; Set.FlowOf the direction;
// Set.Torque the full State from one known torque. Where the set turns as a
// block no power rolls: the loss is zero and the torques are the lossless
// ones (see Set.Torque for the exact band), so a solver iterating near that
// point sees no jumps from rounding.
//
// Only mesh losses at constant η0 are modelled: no bearing, churning or
// windage loss, no load dependence of η0. A set given by FromRatio with i0
// in the band [η0, 1/η0] is refused: driven from the carrier it would
// self-lock and its torques are not determined by one known torque.
//
// # Design checks
//
// New (and Check) verify positive tooth counts, a ring larger than the sun,
// the coaxial condition, the assembly condition for equally spaced planets,
// the neighbour condition (planet tip circles must not touch, standard
// addendum equal to the module) and undercut at 20° pressure angle. Every
// violation is reported at once, each as a *DesignError with its numbers.
//
// Each gear may carry a profile shift x (Design.SunShift, PlanetShift,
// RingShift, OuterPlanetShift). A mesh then works at the pressure angle
// α_w and centre distance a given by the involute function inv φ = tan φ − φ:
//
//	external:  inv α_w = inv α + 2·tan α·(x1 + x2)/(z1 + z2),  a = m(z1 + z2)/2·cos α/cos α_w
//	internal:  inv α_w = inv α + 2·tan α·(x_r − x_p)/(z_r − z_p), a = m(z_r − z_p)/2·cos α/cos α_w
//
// The set is coaxial when the sun–planet and planet–ring distances agree
// (RingShiftFor finds the ring shift), so tooth counts off z_ring = z_sun +
// 2·z_planet become possible; an external gear of 14–16 teeth passes the
// undercut check with x ≥ (17 − z)/17, and no shift may point a tooth.
// Set.Geometry reports the working centre distances and pressure angles,
// the coaxial mismatch and the neighbour clearance margin. Shifts change
// centre distances, not speed or torque ratios.
//
// # Sources
//
// From memory (recalled, not read while writing this package):
// Epicyclic Drive Trains: Analysis, Synthesis and Applications, Wayne
// State University Press, 1982 (Willis equation, basic efficiency, rolling
// and coupling power, default η0);
// The Mechanical Efficiency of Epicyclic Gear Trains, ASME J. Mech. Des.
// 115(3), 645–651, 1993;
// AGMA 6123-B06, Design Manual for Enclosed Epicyclic Gear Drives
// (tooth-count conditions).
// Read: "Geometry / Planetary Gears" (2020), an open gear-geometry
// notebook (ratios, centre-distance, planet-interference and equal-spacing
// conditions); "Chapter 2 – Spur Gears", an open gear-geometry
// notebook (involute function, working pressure angle, tip diameter). The
// tests name each worked example they check.
//
// # Caution
//
// The package estimates; it does not rate gears. Tooth strength, pitting,
// scuffing, bearing life and lubrication must be rated to the applicable
// standards, and a transmission that can hurt someone needs the maker's
// ratings, physical tests and a qualified engineer's sign-off.
//
// # Usage
//
//	s, err := planetary.New(planetary.Design{Sun: 20, Ring: 100, Planet: 40, Planets: 3})
//	if err != nil { ... }
//	sp, _ := s.Solve(planetary.Speeds{Sun: units.RPM(1500)}, planetary.Carrier) // ring held
//	st, _ := s.Torque(sp, planetary.Sun, units.NewtonMetres(100))
//	// st.Torques.Carrier, st.Loss, st.RollingPower ...
package planetary
