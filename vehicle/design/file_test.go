package design

import (
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

func testFile(t testing.TB) []byte {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("testdata", "tractor.json"))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func TestLoad(t *testing.T) {
	t.Parallel()
	path := filepath.Join("testdata", "tractor.json")
	s, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if s.Source() != path {
		t.Errorf("Source() = %q, want %q", s.Source(), path)
	}
	// Hand check of a few decoded values against the file's text.
	if s.Tractor.Mass != units.Tonnes(8.5) {
		t.Errorf("tractor mass = %v, want 8.5 t", s.Tractor.Mass)
	}
	if s.Transmission.Relief != units.Bar(450) {
		t.Errorf("relief = %v, want 450 bar", s.Transmission.Relief)
	}
	if got := s.Day.Segments[len(s.Day.Segments)-1].Duration.Std().Minutes(); got != 90 {
		t.Errorf("PTO work lasts %v min, want 90", got)
	}
	if s.Format != Format {
		t.Errorf("Format = %d, want %d", s.Format, Format)
	}
	if _, err := s.Vehicle(s.Transmission); err != nil {
		t.Fatal(err)
	}
	for _, a := range s.Alternatives {
		if _, err := s.Vehicle(a); err != nil {
			t.Errorf("alternative %q: %v", a.Name, err)
		}
	}
	if _, err := s.Cycle(); err != nil {
		t.Fatal(err)
	}
	if _, err := Load(filepath.Join(t.TempDir(), "missing.json")); err == nil {
		t.Error("Load(missing file) = nil error")
	}
}

// TestRoundTrip loads a file, changes fields, saves it, loads it again and
// compares: the values must be equal, exactly.
func TestRoundTrip(t *testing.T) {
	t.Parallel()
	a, err := Parse("tractor.json", testFile(t))
	if err != nil {
		t.Fatal(err)
	}
	a.Transmission.Pump.Displacement = units.CCPerRev(87.3)
	a.Transmission.Ranges[1].Ratio = 0.4321
	a.Tractor.Mass = units.Kilograms(9123.456)
	a.Day.Segments[3].Duration = Duration(1234567891)
	temp := units.Celsius(71.5)
	a.Transmission.OilTemperature = &temp
	a.Alternatives[0].OilTemperature = nil
	saveLoad(t, a)
}

// TestErrors checks that a malformed file gives an error naming the file,
// the line, the JSON path and the value as written.
func TestErrors(t *testing.T) {
	t.Parallel()
	base := string(testFile(t))
	line := func(s string) string { // the line of s in the unmodified file
		i := strings.Index(base, s)
		return ":" + itoa(strings.Count(base[:i], "\n")+1) + ":"
	}
	cases := []struct {
		name     string
		old, new string
		kind     error
		want     []string
	}{
		{"bad unit", `"relief": "450 bar"`, `"relief": "450 bra"`, units.ErrUnit,
			[]string{line(`"relief": "450 bar"`), "transmission.relief", `"450 bra"`}},
		{"not a number", `"mass": "8.5 t"`, `"mass": "eight t"`, nil,
			[]string{line(`"mass": "8.5 t"`), "tractor.mass", "eight t"}},
		{"unknown key", `"wheelbase": "2.9 m"`, `"wheelbse": "2.9 m"`, ErrUnknownKey,
			[]string{line(`"wheelbase": "2.9 m"`), "tractor.wheelbse", "misspelt"}},
		{"case differs", `"wheelbase": "2.9 m"`, `"Wheelbase": "2.9 m"`, ErrUnknownKey,
			[]string{"tractor.Wheelbase"}},
		{"duplicate key", `"wheelbase": "2.9 m",`, `"wheelbase": "2.9 m", "wheelbase": "3.1 m",`, ErrDuplicateKey,
			[]string{line(`"wheelbase": "2.9 m"`), "tractor.wheelbase", "twice"}},
		{"duplicate map key", `"asphalt": {"model": "road", "preset": "asphalt"}`,
			`"asphalt": {"model": "road", "preset": "asphalt"}, "asphalt": {"model": "road"}`, ErrDuplicateKey,
			[]string{"surfaces.asphalt", "twice"}},
		{"number as text", `"finalDrive": 13.6`, `"finalDrive": "13.6"`, ErrType,
			[]string{line(`"finalDrive": 13.6`), "tractor.finalDrive", "want a number"}},
		{"text as number", `"mass": "8.5 t"`, `"mass": 8500`, ErrType,
			[]string{"tractor.mass = 8500", "want a text"}},
		{"syntax", `"name": "Demo`, `"name" "Demo`, ErrSyntax,
			[]string{"mine.json:3:"}},
		{"bad duration", `"duration": "90 min"`, `"duration": "90 minutes"`, nil,
			[]string{line(`"duration": "90 min"`), "day.segments[8].duration", "90 minutes"}},
		{"missing value", `"mass": "8.5 t",`, ``, ErrValue,
			[]string{"tractor.mass", "missing"}},
		{"zero in the user's unit", `"displacement": "110 cm³/rev", "maxSpeed": "3000 rpm"`,
			`"displacement": "-5 cm³/rev", "maxSpeed": "3000 rpm"`, ErrValue,
			[]string{line(`"displacement": "110 cm³/rev", "maxSpeed": "3000 rpm"`), "transmission.pump.displacement", `"-5 cm³/rev"`, "greater than zero"}},
		{"unknown surface", `"surface": "asphalt", "trailer"`, `"surface": "tarmac", "trailer"`, ErrValue,
			[]string{"day.segments[4].surface", `"tarmac"`}},
		{"ballast above the mass", `"mass": "8.5 t",`, `"mass": "8.5 t", "ballast": "9 t",`, ErrValue,
			[]string{"tractor.ballast", "operating mass"}},
		{"unknown oil", `"oil": "VG46",`, `"oil": "VG99",`, nil,
			[]string{"transmission", "VG99"}},
		{"newer format", `"format": 1`, `"format": 7`, ErrFormat,
			[]string{"mine.json:2:", "format = 7"}},
		{"trailing data", "", "x", ErrSyntax, []string{"mine.json"}},
		{"empty", "", "", ErrSyntax, []string{"mine.json", "empty"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			text := ""
			switch {
			case c.old != "":
				if !strings.Contains(base, c.old) {
					t.Fatalf("the test file no longer contains %q", c.old)
				}
				text = strings.Replace(base, c.old, c.new, 1)
			case c.new != "":
				text = base + c.new
			}
			_, err := Parse("mine.json", []byte(text))
			if err == nil {
				t.Fatal("Parse = nil error, want one")
			}
			if c.kind != nil && !errors.Is(err, c.kind) {
				t.Errorf("error %q is not %v", err, c.kind)
			}
			var fe *FieldError
			if !errors.As(err, &fe) {
				t.Errorf("error %q holds no *FieldError", err)
			}
			for _, p := range append(c.want, "mine.json") {
				if !strings.Contains(err.Error(), p) {
					t.Errorf("error %q does not contain %q", err, p)
				}
			}
		})
	}
}

func itoa(n int) string { return strconv.Itoa(n) }

func TestDuration(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text string
		want float64 // seconds
		back string  // MarshalText
	}{
		{"25 s", 25, "25 s"}, {"25 min", 1500, "25 min"}, {"1.5 h", 5400, "90 min"},
		{"1h30m", 5400, "90 min"}, {"0 s", 0, "0 s"}, {"0.25 s", 0.25, "0.25 s"},
	}
	for _, c := range cases {
		var d Duration
		if err := d.UnmarshalText([]byte(c.text)); err != nil {
			t.Errorf("UnmarshalText(%q): %v", c.text, err)
			continue
		}
		if got := d.Std().Seconds(); got != c.want {
			t.Errorf("UnmarshalText(%q) = %v s, want %v s", c.text, got, c.want)
		}
		if b, err := d.MarshalText(); err != nil || string(b) != c.back {
			t.Errorf("MarshalText(%v) = %q, %v; want %q", d.Std(), b, err, c.back)
		}
	}
	for _, bad := range []string{"", "min", "-5 s", "5 days", "NaN s", "1e300 h"} {
		var d Duration
		if err := d.UnmarshalText([]byte(bad)); err == nil {
			t.Errorf("UnmarshalText(%q) = nil error", bad)
		}
	}
}

// FuzzParse: any bytes give an error or a valid design, never a panic; a
// design that parses saves and parses again to equal values.
func FuzzParse(f *testing.F) {
	f.Add(testFile(f))
	f.Add([]byte(`{"format": 1, "tractor": {"mass": "1 t", "mass": "2 t"}}`))
	f.Add([]byte(`{"surfaces": {"a": {}, "a": {}}}`))
	f.Add([]byte(`[1, 2]`))
	f.Fuzz(func(t *testing.T, data []byte) {
		a, err := Parse("fuzz.json", data)
		if err != nil {
			return
		}
		reparse(t, a)
	})
}
