// Package probe holds a test that calls the library's exported methods on
// zero values; it has no code of its own.
package probe

import (
	"fmt"
	"io"
	"reflect"
	"testing"

	ps "github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestZeroValuesDoNotPanic calls every exported method of the exported
// types of the library's packages on their zero values (and enum values
// out of range) with zero arguments (io.Discard for a writer): each must
// return, never panic, except the panics the docs name (documented below).
func TestZeroValuesDoNotPanic(t *testing.T) {
	// Documented programmer errors.
	documented := map[string]bool{
		"powersplit.SettingCurve.At": true, // "It panics on an empty curve."
		"powersplit.Sweep.At":        true, // "It panics if i is out of range." (the zero Sweep has no cell)
		"powersplit.Map.At":          true, // "It panics if i or j is out of range." (the zero Map has no cell)
	}
	vals := []any{
		ps.Layout{}, &ps.Builder{}, ps.NewBuilder(), &ps.State{}, ps.Margin{}, ps.Cell{}, ps.Sweep{}, ps.Map{}, &ps.LimitError{}, &ps.InputError{}, &ps.LayoutError{}, &ps.KinematicsError{}, &ps.ConvergenceError{}, ps.SettingCurve{}, ps.SecondMotor{},
		hydrostat.Loop{}, hydrostat.Unit{}, hydrostat.Oil{}, hydrostat.Map{}, hydrostat.Wilson{}, hydrostat.Sequential{}, hydrostat.MinLoss{}, hydrostat.Pinned{}, &hydrostat.LimitError{}, hydrostat.Kind(99), hydrostat.Swing(99), hydrostat.Mode(99), hydrostat.Curve{}, hydrostat.Fit{}, hydrostat.LoopState{},
		planetary.Set{}, planetary.Design{}, &planetary.DesignError{}, &planetary.InputError{}, planetary.Member(99), planetary.Arrangement(99), planetary.Speeds{}, planetary.Torques{}, planetary.Flow(99), planetary.Geometry{}, planetary.Mesh{},
		traction.Vehicle{}, traction.Tyre{}, traction.Surface{}, traction.Wheel{}, traction.Brixius{}, traction.WismerLuth{}, traction.GeeClough{}, traction.Road{}, &traction.RangeError{}, &traction.PullError{}, traction.Class(99), traction.DriveType(99), traction.HitchType(99), traction.Pull{}, traction.Axle{},
		&vehicle.Engine{}, &vehicle.Vehicle{}, &vehicle.LayoutDrive{}, &vehicle.SplitEstimate{}, vehicle.Tyres{}, vehicle.SlipCurve{}, &vehicle.LimitError{}, &vehicle.InputError{}, &vehicle.SegmentError{}, vehicle.Flag{}, vehicle.Day{}, vehicle.DraftRow{}, vehicle.PTORow{}, vehicle.Implement{}, &vehicle.PTO{}, vehicle.Trailer{}, vehicle.LeastFuel{}, vehicle.FixedSpeed{}, vehicle.DrivePoint{}, vehicle.Kind(99), vehicle.Texture(99), vehicle.Road(99), vehicle.Geometry{}, &vehicle.FuelMap{}, vehicle.SegmentResult{}, &vehicle.FrontMotorDrive{},
		units.Measure{Kind: 200}, units.Kind(200), &units.ParseError{},
	}
	for _, v := range vals {
		rv := reflect.ValueOf(v)
		for i := 0; i < rv.NumMethod(); i++ {
			m := rv.Method(i)
			name := fmt.Sprintf("%T.%s", v, rv.Type().Method(i).Name)
			args := make([]reflect.Value, m.Type().NumIn())
			for k := range args {
				args[k] = reflect.Zero(m.Type().In(k))
				if m.Type().In(k) == reflect.TypeOf((*io.Writer)(nil)).Elem() {
					args[k] = reflect.ValueOf(io.Discard)
				}
			}
			if m.Type().IsVariadic() {
				func() {
					defer func() {
						if r := recover(); r != nil {
							if !documented[name] {
								t.Errorf("%s panics: %v", name, r)
							}
						}
					}()
					m.CallSlice(args)
				}()
				continue
			}
			func() {
				defer func() {
					if r := recover(); r != nil {
						if !documented[name] {
							t.Errorf("%s panics: %v", name, r)
						}
					}
				}()
				m.Call(args)
			}()
		}
	}
}
