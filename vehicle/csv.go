package vehicle

import (
	"encoding/csv"
	"io"
	"strconv"
)

func ftoa(x float64) string { return strconv.FormatFloat(x, 'g', 9, 64) }

// WriteCSV writes one row per time step of the segments that ran, with a
// header row. Columns: segment index and name, start and duration (s),
// speed (km/h), grade, engine speed (rpm) and torque (N·m), range,
// transmission efficiency, hydrostatic share, slip, fuel flow (kg/h).
func (d Day) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"segment", "name", "start_s", "duration_s", "speed_kmh", "grade",
		"engine_rpm", "engine_torque_Nm", "range", "transmission_efficiency", "hydrostatic_share",
		"slip", "fuel_kg_per_h"}); err != nil {
		return err
	}
	for _, s := range d.Segments {
		for _, st := range s.Steps {
			rec := []string{strconv.Itoa(s.Index), s.Name, ftoa(st.Start.Seconds()), ftoa(st.Duration.Seconds()),
				ftoa(st.Speed.KMH()), ftoa(st.Grade), ftoa(st.EngineSpeed.RPM()), ftoa(float64(st.EngineTorque)),
				strconv.Itoa(st.Range), ftoa(st.TransmissionEfficiency), ftoa(st.HydrostaticShare),
				ftoa(st.Slip), ftoa(st.FuelRate.KilogramsPerHour())}
			if err := cw.Write(rec); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteAuditCSV writes the energy audit (MJ) of every segment and the day,
// one row each, with a header row; a segment that could not be run has its
// reason in the last column.
func (d Day) WriteAuditCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"segment", "name", "kind", "duration_s", "distance_m", "fuel_kg",
		"fuel_MJ", "engine_loss_MJ", "engine_work_MJ", "hydrostatic_loss_MJ", "mechanical_loss_MJ",
		"pto_loss_MJ", "pto_work_MJ", "slip_loss_MJ", "rolling_loss_MJ", "brake_MJ", "drawbar_MJ",
		"trailer_rolling_MJ", "aero_MJ", "potential_MJ", "kinetic_MJ", "relative_residual", "error"}); err != nil {
		return err
	}
	row := func(idx, name, kind string, a Audit, err error) error {
		msg := ""
		if err != nil {
			msg = err.Error()
		}
		mj := func(e interface{ Megajoules() float64 }) string { return ftoa(e.Megajoules()) }
		return cw.Write([]string{idx, name, kind, ftoa(a.Duration.Seconds()), ftoa(float64(a.Distance)),
			ftoa(float64(a.Fuel)), mj(a.FuelEnergy), mj(a.EngineLoss), mj(a.EngineWork), mj(a.Hydrostatic),
			mj(a.Mechanical), mj(a.PTOLoss), mj(a.PTOWork), mj(a.Slip), mj(a.Rolling), mj(a.Brake),
			mj(a.Drawbar), mj(a.Trailer), mj(a.Aero), mj(a.Potential), mj(a.Kinetic),
			ftoa(a.RelativeResidual()), msg})
	}
	for _, s := range d.Segments {
		if err := row(strconv.Itoa(s.Index), s.Name, s.Kind.String(), s.Audit, s.Err); err != nil {
			return err
		}
	}
	if err := row("day", "", "", d.Audit, nil); err != nil {
		return err
	}
	cw.Flush()
	return cw.Error()
}
