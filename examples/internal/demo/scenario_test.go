package demo

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

func TestBuiltinLoads(t *testing.T) {
	t.Parallel()
	s, err := Default()
	if err != nil {
		t.Fatal(err)
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
}

func TestLoadFile(t *testing.T) {
	t.Parallel()
	path := filepath.Join(t.TempDir(), "mine.json")
	if err := os.WriteFile(path, Builtin(), 0o644); err != nil {
		t.Fatal(err)
	}
	s, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if s.Source() != path {
		t.Errorf("Source() = %q, want %q", s.Source(), path)
	}
	if _, err := Load(filepath.Join(t.TempDir(), "missing.json")); err == nil {
		t.Error("Load(missing file) = nil error")
	}
}

// TestErrors checks that a malformed file gives an error naming the file,
// the field and what was wrong.
func TestErrors(t *testing.T) {
	t.Parallel()
	base := string(builtin)
	cases := []struct {
		name      string
		old, new  string
		wantParts []string
	}{
		{"bad unit", `"relief": "450 bar"`, `"relief": "450 bra"`,
			[]string{"mine.json:", `field "relief"`, "unknown unit", "450 bra"}},
		{"not a number", `"mass": "8.5 t"`, `"mass": "eight t"`,
			[]string{"mine.json:", `field "mass"`, "eight t"}},
		{"unknown field", `"wheelbase": "2.9 m"`, `"wheelbse": "2.9 m"`,
			[]string{"mine.json:", `unknown field "wheelbse"`}},
		{"number as text", `"finalDrive": 13.6`, `"finalDrive": "13.6"`,
			[]string{"mine.json:", "tractor.finalDrive", "want a number"}},
		{"text as number", `"mass": "8.5 t"`, `"mass": 8500`,
			[]string{"mine.json:", "tractor.mass", "quantity text"}},
		{"syntax", `"name": "Demo`, `"name" "Demo`,
			[]string{"mine.json:2:", "not valid JSON"}},
		{"bad duration", `"duration": "90 min"`, `"duration": "90 minutes"`,
			[]string{"mine.json:", `field "duration"`, "90 minutes"}},
		{"missing value", `"mass": "8.5 t",`, ``,
			[]string{"mine.json:", "tractor.mass", "missing"}},
		{"unknown surface", `"surface": "asphalt", "trailer"`, `"surface": "tarmac", "trailer"`,
			[]string{"mine.json:", "surface", `"tarmac"`}},
		{"unknown oil", `"oil": "VG46",`, `"oil": "VG99",`,
			[]string{"mine.json:", "transmission", "VG99"}},
		{"empty", "", "", []string{"mine.json", "empty"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			text := ""
			if c.old != "" {
				if !strings.Contains(base, c.old) {
					t.Fatalf("the built-in file no longer contains %q", c.old)
				}
				text = strings.Replace(base, c.old, c.new, 1)
			}
			_, err := Parse("mine.json", []byte(text))
			if err == nil {
				t.Fatal("Parse = nil error, want one")
			}
			for _, p := range c.wantParts {
				if !strings.Contains(err.Error(), p) {
					t.Errorf("error %q does not contain %q", err, p)
				}
			}
		})
	}
}

func TestDuration(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text string
		want float64 // seconds
	}{
		{"25 s", 25}, {"25 min", 1500}, {"1.5 h", 5400}, {"1h30m", 5400}, {"0 s", 0},
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
	}
	for _, bad := range []string{"", "min", "-5 s", "5 days", "NaN s", "1e300 h"} {
		var d Duration
		if err := d.UnmarshalText([]byte(bad)); err == nil {
			t.Errorf("UnmarshalText(%q) = nil error", bad)
		}
	}
}

func TestFormat(t *testing.T) {
	t.Parallel()
	cases := []struct {
		v    float64
		prec int
		unit string
		want string
	}{
		{12.345, 1, "kg", "12.3 kg"},
		{-0.0001, 1, "kW", "0.0 kW"},
		{0, 0, "", "0"},
	}
	for _, c := range cases {
		if got := F(c.v, c.prec, c.unit); got != c.want {
			t.Errorf("F(%v, %d, %q) = %q, want %q", c.v, c.prec, c.unit, got, c.want)
		}
	}
	for _, v := range []float64{nanValue(), 1 / zero()} {
		if got := F(v, 1, "kg"); strings.Contains(got, "NaN") || strings.Contains(got, "Inf") {
			t.Errorf("F(%v) = %q, want no NaN or Inf", v, got)
		}
	}
}

var zeroValue float64

func zero() float64     { return zeroValue }
func nanValue() float64 { return zero() / zero() }
