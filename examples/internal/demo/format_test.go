package demo

import (
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

func TestReportFormatting(t *testing.T) {
	t.Parallel()
	tb := NewTable("soil", "pull", "slip")
	tb.Row("firm", "32.7 kN", "8.2 %")
	tb.Rule()
	tb.Row("soft soil", "29.7 kN", "11.5 %")
	var b bytes.Buffer
	tb.Write(&b)
	want := "  soil          pull    slip\n" +
		"  ··························\n" +
		"  firm       32.7 kN   8.2 %\n" +
		"  ··························\n" +
		"  soft soil  29.7 kN  11.5 %\n"
	if b.String() != want {
		t.Errorf("table:\n%s\nwant:\n%s", b.String(), want)
	}
	for _, c := range []struct{ got, want string }{
		{Pct(0.775, 1), "77.5 %"},
		{Pct(-0.0001, 1), "0.0 %"},
		{Ratio(0.9, units.Kilowatts(100), units.Kilowatts(110), 1), "90.0 %"},
		{Ratio(0.9, units.Watts(400), units.Kilowatts(110), 1), "—"},   // below NearZero
		{Ratio(0.9, units.Kilowatts(1), units.Kilowatts(110), 1), "—"}, // below 2 % of the input
		{Ratio(0.9, units.Kilowatts(10), units.Kilowatts(-5), 1), "—"}, // overrun
		{FileName("range 2 / high"), "range_2___high"},
		{FirstLine(errors.New("first\nsecond")), "first"},
	} {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
	lo, hi := Widest([]powersplit.SpeedInterval{{Lo: 0, Hi: 10}, {Lo: 20, Hi: 45}, {Lo: 50, Hi: 60}})
	if lo != 20 || hi != 45 {
		t.Errorf("Widest = %v, %v, want the 20–45 rad/s interval", lo, hi)
	}
	path := filepath.Join(t.TempDir(), "x.txt")
	if err := WriteFile(path, func(w io.Writer) error { _, err := w.Write([]byte("ok")); return err }); err != nil {
		t.Fatal(err)
	}
	if data, err := os.ReadFile(path); err != nil || string(data) != "ok" {
		t.Errorf("WriteFile wrote %q, %v", data, err)
	}
	boom := errors.New("boom")
	if err := WriteFile(filepath.Join(t.TempDir(), "y.txt"), func(io.Writer) error { return boom }); !errors.Is(err, boom) {
		t.Errorf("WriteFile error = %v, want the writer's", err)
	}
	if err := WriteFile(filepath.Join(t.TempDir(), "no", "such", "dir"), func(io.Writer) error { return nil }); err == nil {
		t.Error("WriteFile into a missing directory succeeded")
	}
}
