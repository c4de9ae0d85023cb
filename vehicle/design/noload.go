package design

import (
	"fmt"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// NoLoad lists a transmission's load-independent losses (see
// powersplit.NoLoad for the models and their sources): bearings and
// churning parts on named shafts, the plates of named clutches while they
// are open, and the loop's charge pump. Shaft and clutch names are those
// of the layout the transmission's kind builds (powersplit.Layout.Shafts
// and Elements). Left out, the transmission has none of these losses.
type NoLoad struct {
	// Note says where the values come from (for the reader only).
	Note string `json:"note,omitempty"`
	// Oil is the ISO viscosity grade of the transmission oil (optional;
	// the loop's oil when left out) and Temperature its sump temperature
	// (optional; the loop's oil temperature when left out).
	Oil         string             `json:"oil,omitempty"`
	Temperature *units.Temperature `json:"temperature,omitempty"`
	// Bearings are the rolling bearings, one set per shaft (Palmgren).
	Bearings []BearingSet `json:"bearings,omitempty"`
	// Churning are the parts dipping into the oil (ISO/TR 14179-1).
	Churning []ChurningPart `json:"churning,omitempty"`
	// Plates are the plate packs of clutches and brakes, dragging while open.
	Plates []PlatePack `json:"plates,omitempty"`
	// ChargePump is the loop's charge pump (optional).
	ChargePump *ChargePump `json:"chargePump,omitempty"`
}

// BearingSet is the rolling bearings of one shaft (Palmgren's model), in
// the housing or, with Other, between the shaft and another (a gear free
// on its shaft).
type BearingSet struct {
	// Name names the loss in states and audits.
	Name string `json:"name"`
	// Shaft is the layout shaft the bearings carry.
	Shaft string `json:"shaft"`
	// Other is the second shaft for bearings between two shafts (optional;
	// the housing when left out): they turn at the speed difference.
	Other string `json:"other,omitempty"`
	// MeanDiameter is the bearing's mean diameter dm, (bore + outside)/2 (mm).
	MeanDiameter units.Length `json:"meanDiameter"`
	// F0 is Palmgren's lubrication factor f0 (> 0; it depends on the
	// bearing type and the lubrication).
	F0 float64 `json:"f0"`
	// F1 is Palmgren's load factor f1 (optional, ≥ 0; with Load).
	F1 float64 `json:"f1,omitempty"`
	// Load is the bearing load P1 for the load-dependent moment (optional, kN).
	Load units.Force `json:"load,omitempty"`
	// Count is the number of such bearings on the shaft (optional; 1).
	Count int `json:"count,omitempty"`
}

// ChurningPart is a rotating part dipping into the oil (ISO/TR 14179-1).
type ChurningPart struct {
	// Name names the loss in states and audits.
	Name string `json:"name"`
	// Shaft is the layout shaft the part turns with.
	Shaft string `json:"shaft"`
	// Diameter is the part's outside diameter D (mm).
	Diameter units.Length `json:"diameter"`
	// FaceWidth is the tooth face width b (optional, mm; 0 for a part
	// without teeth).
	FaceWidth units.Length `json:"faceWidth,omitempty"`
	// Module is the transverse module mt (mm; needed with FaceWidth).
	Module units.Length `json:"module,omitempty"`
	// HelixAngle is the helix angle β (optional, °; a spur gear, 0, is
	// evaluated at 10°).
	HelixAngle units.Angle `json:"helixAngle,omitempty"`
	// Cylinder is the length L of a smooth outside cylinder such as a
	// shaft or drum (optional, mm).
	Cylinder units.Length `json:"cylinder,omitempty"`
	// Sides adds the loss of the two smooth sides of a disc of diameter D.
	Sides bool `json:"sides,omitempty"`
	// Dip is the dip factor fg: 0 clear of the oil, 1 fully submerged, the
	// immersed fraction of the diameter in between.
	Dip float64 `json:"dip"`
}

// PlatePack is the plates of a clutch or brake, dragging while it is open.
type PlatePack struct {
	// Name names the loss in states and audits.
	Name string `json:"name"`
	// Clutch is the layout's clutch or brake element the plates belong to.
	Clutch string `json:"clutch"`
	// Films is the number of oil films (friction faces) (> 0).
	Films int `json:"films"`
	// Inner and Outer are the radii ri and ro of the friction faces (mm).
	Inner units.Length `json:"inner"`
	Outer units.Length `json:"outer"`
	// Clearance is the oil film thickness h of one open film (mm).
	Clearance units.Length `json:"clearance"`
}

// ChargePump is the loop's charge pump, driven from a named shaft.
type ChargePump struct {
	// Shaft is the layout shaft driving the charge pump (usually the input).
	Shaft string `json:"shaft"`
	// Flushing is the flushing flow delivered beyond the loop's leakage
	// (optional, L/min).
	Flushing units.VolumeFlow `json:"flushing,omitempty"`
	// Efficiency is the charge pump's overall efficiency, in (0, 1].
	Efficiency float64 `json:"efficiency"`
}

// lubricant returns the transmission oil at its no-load temperature: the
// noLoad block's grade and temperature, else the loop's.
func (t Transmission) lubricant() (powersplit.Lubricant, error) {
	temp := units.Celsius(50)
	if t.OilTemperature != nil {
		temp = *t.OilTemperature
	}
	var oil hydrostat.Oil
	if n := t.NoLoad; n != nil && n.Oil != "" {
		o, ok := oils[strings.ReplaceAll(strings.ToUpper(n.Oil), " ", "")]
		if !ok {
			return powersplit.Lubricant{}, fmt.Errorf("noLoad.oil: %q is not one of VG32, VG46, VG68", n.Oil)
		}
		oil = o
	} else {
		o, err := t.hydraulicOil() // the loop's oil
		if err != nil {
			return powersplit.Lubricant{}, err
		}
		oil = o
	}
	if n := t.NoLoad; n != nil && n.Temperature != nil {
		temp = *n.Temperature
	}
	return powersplit.Lubricant{Viscosity: oil.Viscosity(temp), Density: oil.Density(temp)}, nil
}

var oils = map[string]hydrostat.Oil{"VG32": hydrostat.VG32, "VG46": hydrostat.VG46, "VG68": hydrostat.VG68}

// withLosses adds t's no-load losses to layout l.
func (t Transmission) withLosses(l powersplit.Layout) (powersplit.Layout, error) {
	n := t.NoLoad
	if n == nil {
		return l, nil
	}
	lube, err := t.lubricant()
	if err != nil {
		return l, err
	}
	spec := powersplit.NoLoad{Lubricant: lube}
	for _, b := range n.Bearings {
		spec.Bearings = append(spec.Bearings, powersplit.ShaftBearings{Name: b.Name, Shaft: b.Shaft, Other: b.Other, Bearings: powersplit.Bearings{
			MeanDiameter: b.MeanDiameter, F0: b.F0, F1: b.F1, Load: b.Load, Count: b.Count}})
	}
	for _, c := range n.Churning {
		spec.Churning = append(spec.Churning, powersplit.ShaftWheel{Name: c.Name, Shaft: c.Shaft, Wheel: powersplit.Wheel{
			Diameter: c.Diameter, FaceWidth: c.FaceWidth, Module: c.Module, HelixAngle: c.HelixAngle, Cylinder: c.Cylinder,
			Sides: c.Sides, Dip: c.Dip}})
	}
	for _, p := range n.Plates {
		spec.Plates = append(spec.Plates, powersplit.ElementPlates{Name: p.Name, Element: p.Clutch, Plates: powersplit.Plates{
			Films: p.Films, Inner: p.Inner, Outer: p.Outer, Clearance: p.Clearance}})
	}
	if cp := n.ChargePump; cp != nil {
		spec.ChargePumps = append(spec.ChargePumps, powersplit.LoopChargePump{Name: "charge pump", Loop: "hydrostat", Shaft: cp.Shaft,
			ChargePump: powersplit.ChargePump{Flushing: cp.Flushing, Efficiency: cp.Efficiency}})
	}
	l, err = l.WithLosses(spec)
	if err != nil {
		return l, fmt.Errorf("noLoad: %w", err)
	}
	return l, nil
}
