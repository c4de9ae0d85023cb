package vehicle_test

import (
	"bytes"
	"encoding/csv"
	"strconv"
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
	if len(recs) != n+1 || len(recs[0]) != 13 {
		t.Fatalf("steps CSV: %d rows of %d, want %d of 13", len(recs), len(recs[0]), n+1)
	}
	if _, err := strconv.ParseFloat(recs[1][6], 64); err != nil {
		t.Errorf("engine rpm %q: %v", recs[1][6], err)
	}
	buf.Reset()
	if err := day.WriteAuditCSV(&buf); err != nil {
		t.Fatal(err)
	}
	recs, err = csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != len(day.Segments)+2 {
		t.Fatalf("audit CSV: %d rows, want %d", len(recs), len(day.Segments)+2)
	}
	last := recs[len(recs)-1]
	if last[0] != "day" {
		t.Errorf("last row %q, want the day", last[0])
	}
	if r, err := strconv.ParseFloat(last[len(last)-2], 64); err != nil || r > 1e-6 {
		t.Errorf("day residual %q: %v", last[len(last)-2], err)
	}
}
