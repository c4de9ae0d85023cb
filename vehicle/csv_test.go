package vehicle_test

import (
	"bytes"
	"encoding/csv"
	"strconv"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/vehicle"
)

func TestCSV(t *testing.T) {
	t.Parallel()
	v := demoVehicle(t, true)
	day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, demoCycle(), vehicle.Options{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := day.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, s := range day.Segments {
		n += len(s.Steps)
	}
	// The headers are pinned: a name per quantity and its unit in every
	// column, the same names as the root package's sweep CSV.
	wantSteps := "design,segment,segment_name,start_s,duration_s,speed_kmh,grade_pct,engine_speed_rpm," +
		"engine_torque_Nm,range,transmission_efficiency_pct,hydraulic_share_pct,slip_pct,fuel_kg_per_h," +
		"high_pressure_bar,pump_speed_rpm,motor_speed_rpm,pump_setting_pct,motor_setting_pct,front_slip_pct,front_torque_share_pct"
	if got := strings.Join(recs[0], ","); got != wantSteps {
		t.Errorf("steps header\n%s\nwant\n%s", got, wantSteps)
	}
	if len(recs) != n+1 {
		t.Fatalf("steps CSV: %d rows, want %d", len(recs), n+1)
	}
	if _, err := strconv.ParseFloat(recs[1][7], 64); err != nil {
		t.Errorf("engine rpm %q: %v", recs[1][7], err)
	}
	buf.Reset()
	if err := day.WriteAuditCSV(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err = csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	wantAudit := "design,segment,segment_name,kind,duration_s,distance_m,mean_engine_speed_rpm,fuel_kg,fuel_MJ,engine_loss_MJ," +
		"engine_work_MJ,engine_braking_MJ,hydrostatic_loss_MJ,mechanical_loss_MJ,no_load_loss_MJ,pto_loss_MJ,pto_work_MJ,slip_loss_MJ," +
		"rolling_loss_MJ,brake_MJ,drawbar_MJ,trailer_rolling_MJ,aero_MJ,potential_MJ,kinetic_MJ," +
		"front_slip_loss_MJ,rear_slip_loss_MJ,circulating_MJ,relative_residual_fraction,error"
	if got := strings.Join(recs[0], ","); got != wantAudit {
		t.Errorf("audit header\n%s\nwant\n%s", got, wantAudit)
	}
	if len(recs) != len(day.Segments)+1 {
		t.Fatalf("audit CSV: %d rows, want %d", len(recs), len(day.Segments)+1)
	}
	buf.Reset()
	if err := day.WriteTotalsCSV(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err = csv.NewReader(&buf).ReadAll()
	if err != nil || len(recs) != 2 {
		t.Fatalf("totals CSV: %d rows, %v; want 2", len(recs), err)
	}
	last := recs[len(recs)-1]
	if last[1] != "day" {
		t.Errorf("last row %q, want the day", last[0])
	}
	if r, err := strconv.ParseFloat(last[len(last)-2], 64); err != nil || r > 1e-6 {
		t.Errorf("day residual %q: %v", last[len(last)-2], err)
	}
}
