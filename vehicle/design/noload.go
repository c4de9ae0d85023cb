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
	Bearings    []BearingSet       `json:"bearings,omitempty"`
	Churning    []ChurningPart     `json:"churning,omitempty"`
	Plates      []PlatePack        `json:"plates,omitempty"`
	ChargePump  *ChargePump        `json:"chargePump,omitempty"`
}

// BearingSet is the rolling bearings of one shaft (Palmgren's model), in
// the housing or, with Other, between the shaft and another (a gear free
// on its shaft).
type BearingSet struct {
	Name         string       `json:"name"`
	Shaft        string       `json:"shaft"`
	Other        string       `json:"other,omitempty"`
	MeanDiameter units.Length `json:"meanDiameter"`
	F0           float64      `json:"f0"`
	F1           float64      `json:"f1,omitempty"`
	Load         units.Force  `json:"load,omitempty"`
	Count        int          `json:"count,omitempty"`
}

// ChurningPart is a rotating part dipping into the oil (ISO/TR 14179-1).
type ChurningPart struct {
	Name       string       `json:"name"`
	Shaft      string       `json:"shaft"`
	Diameter   units.Length `json:"diameter"`
	FaceWidth  units.Length `json:"faceWidth,omitempty"`
	Module     units.Length `json:"module,omitempty"`
	HelixAngle units.Angle  `json:"helixAngle,omitempty"`
	Cylinder   units.Length `json:"cylinder,omitempty"`
	Sides      bool         `json:"sides,omitempty"`
	Dip        float64      `json:"dip"`
}

// PlatePack is the plates of a clutch or brake, dragging while it is open.
type PlatePack struct {
	Name      string       `json:"name"`
	Clutch    string       `json:"clutch"`
	Films     int          `json:"films"`
	Inner     units.Length `json:"inner"`
	Outer     units.Length `json:"outer"`
	Clearance units.Length `json:"clearance"`
}

// ChargePump is the loop's charge pump, driven from a named shaft.
type ChargePump struct {
	Shaft      string           `json:"shaft"`
	Flushing   units.VolumeFlow `json:"flushing,omitempty"`
	Efficiency float64          `json:"efficiency"`
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
