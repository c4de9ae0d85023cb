package vehicle

import (
	"encoding/csv"
	"io"
	"strconv"
	"strings"
)

func ftoa(x float64) string { return strconv.FormatFloat(x, 'g', 9, 64) }

// StepsCSVHeader is the header row of Day.WriteCSV. Every column names its
// quantity and unit (pct for fractions in percent); range is the range's
// name (its index when the transmission has no names, -1 disengaged);
// settings are displacement over its maximum; the front slip and torque
// share are those of a transmission that drives both axles (zero
// otherwise).
var StepsCSVHeader = []string{"design", "segment", "segment_name", "start_s", "duration_s", "speed_kmh", "grade_pct",
	"engine_speed_rpm", "engine_torque_Nm", "range", "transmission_efficiency_pct", "hydraulic_share_pct",
	"slip_pct", "fuel_kg_per_h", "high_pressure_bar", "pump_speed_rpm", "motor_speed_rpm",
	"pump_setting_pct", "motor_setting_pct", "front_slip_pct", "front_torque_share_pct"}

// WriteCSV writes one row per time step of the segments that ran, with the
// header StepsCSVHeader.
func (d Day) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(StepsCSVHeader); err != nil {
		return err
	}
	for _, s := range d.Segments {
		for _, st := range s.Steps {
			rg := st.RangeName
			if rg == "" {
				rg = strconv.Itoa(st.Range)
			}
			h := st.Hydrostat
			rec := []string{d.Design, strconv.Itoa(s.Index), s.Name, ftoa(st.Start.Seconds()), ftoa(st.Duration.Seconds()),
				ftoa(st.Speed.KMH()), ftoa(100 * st.Grade), ftoa(st.EngineSpeed.RPM()), ftoa(float64(st.EngineTorque)),
				rg, ftoa(100 * st.TransmissionEfficiency), ftoa(100 * st.HydrostaticShare),
				ftoa(100 * st.Slip), ftoa(st.FuelRate.KilogramsPerHour()), ftoa(h.HighPressure.Bar()),
				ftoa(h.PumpSpeed.RPM()), ftoa(h.MotorSpeed.RPM()), ftoa(100 * h.PumpSetting), ftoa(100 * h.MotorSetting),
				ftoa(100 * st.FrontSlip), ftoa(100 * st.FrontShare)}
			if err := cw.Write(rec); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// AuditCSVHeader is the header row of Day.WriteAuditCSV and
// Day.WriteTotalsCSV (energies in MJ). The front and rear slip losses
// split slip_loss_MJ (zero when the ground does not tell them apart);
// circulating_MJ is the energy an axle driven backwards returned into the
// driveline, a measure and not a further sink; mean_engine_speed_rpm is the
// time-weighted mean over the steps.
var AuditCSVHeader = []string{"design", "segment", "segment_name", "kind", "duration_s", "distance_m", "mean_engine_speed_rpm", "fuel_kg",
	"fuel_MJ", "engine_loss_MJ", "engine_work_MJ", "engine_braking_MJ", "hydrostatic_loss_MJ", "mechanical_loss_MJ", "no_load_loss_MJ",
	"pto_loss_MJ", "pto_work_MJ", "slip_loss_MJ", "rolling_loss_MJ", "brake_MJ", "drawbar_MJ",
	"trailer_rolling_MJ", "aero_MJ", "potential_MJ", "kinetic_MJ",
	"front_slip_loss_MJ", "rear_slip_loss_MJ", "circulating_MJ", "relative_residual_fraction", "error"}

// WriteAuditCSV writes the energy audit of every segment, one row each,
// with the header AuditCSVHeader; a segment that could not be run has its
// reason in the last column. The day's totals are in WriteTotalsCSV.
func (d Day) WriteAuditCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(AuditCSVHeader); err != nil {
		return err
	}
	for _, s := range d.Segments {
		if err := cw.Write(auditRow(d.Design, strconv.Itoa(s.Index), s.Name, s.Kind.String(), meanRPM(s.Steps), s.Audit, s.Err)); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteTotalsCSV writes the day's audit (the sum over the segments that
// ran) as one row under the header AuditCSVHeader, segment "day"; the
// error column joins the reasons of the segments that did not run.
func (d Day) WriteTotalsCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(AuditCSVHeader); err != nil {
		return err
	}
	var all []Step
	for _, s := range d.Segments {
		all = append(all, s.Steps...)
	}
	if err := cw.Write(auditRow(d.Design, "day", "", "", meanRPM(all), d.Audit, d.Err())); err != nil {
		return err
	}
	cw.Flush()
	return cw.Error()
}

// meanRPM returns the time-weighted mean engine speed of the steps in rpm,
// or "" without steps.
func meanRPM(steps []Step) string {
	var t, wt float64
	for _, st := range steps {
		h := st.Duration.Seconds()
		t += h
		wt += h * st.EngineSpeed.RPM()
	}
	if t == 0 {
		return ""
	}
	return ftoa(wt / t)
}

func auditRow(design, idx, name, kind, rpm string, a Audit, err error) []string {
	msg := ""
	if err != nil {
		msg = strings.ReplaceAll(err.Error(), "\n", "; ")
	}
	mj := func(e interface{ Megajoules() float64 }) string { return ftoa(e.Megajoules()) }
	return []string{design, idx, name, kind, ftoa(a.Duration.Seconds()), ftoa(float64(a.Distance)), rpm,
		ftoa(float64(a.Fuel)), mj(a.FuelEnergy), mj(a.EngineLoss), mj(a.EngineWork), mj(a.EngineBraking), mj(a.Hydrostatic),
		mj(a.Mechanical), mj(a.NoLoad), mj(a.PTOLoss), mj(a.PTOWork), mj(a.Slip), mj(a.Rolling), mj(a.Brake),
		mj(a.Drawbar), mj(a.Trailer), mj(a.Aero), mj(a.Potential), mj(a.Kinetic),
		mj(a.FrontSlip), mj(a.RearSlip), mj(a.Circulating),
		ftoa(a.RelativeResidual()), msg}
}
