package design

import (
	"errors"
	"strings"
	"testing"
)

// TestDecodeKinds: a value of the wrong JSON kind for its field is refused
// with the error kind, the JSON path and the reason; a null leaves the
// value out.
func TestDecodeKinds(t *testing.T) {
	t.Parallel()
	base := string(testFile(t))
	trailers := `"trailers": {
    "grain trailer": {"mass": "12 t", "rollingCoefficient": 0.02}
  },`
	cases := []struct {
		name     string
		old, new string
		kind     error
		want     []string
	}{
		{"object wanted", trailers, `"trailers": 5,`, ErrType, []string{"trailers = 5", "want an object"}},
		{"list wanted", `"ptoSpeeds": ["540 rpm", "1000 rpm"]`, `"ptoSpeeds": "540 rpm"`, ErrType,
			[]string{`requirements.ptoSpeeds = "540 rpm"`, "want a list"}},
		// 1e999 is valid JSON but beyond float64 (max about 1.8e308).
		{"number out of range", `"finalDrive": 13.6`, `"finalDrive": 1e999`, ErrValue,
			[]string{"tractor.finalDrive = 1e999", "out of range"}},
		{"fraction for a count", `"wheels": 2,`, `"wheels": 2.5,`, ErrType,
			[]string{"tractor.front.wheels = 2.5", "whole number"}},
		{"text for a count", `"wheels": 2,`, `"wheels": "2",`, ErrType,
			[]string{`tractor.front.wheels = "2"`, "whole number"}},
		// 2^31 = 2147483648 does not fit the 32-bit range counts are read in.
		{"count too large", `"wheels": 2,`, `"wheels": 2147483648,`, ErrType,
			[]string{"tractor.front.wheels = 2147483648", "whole number"}},
		{"number for a flag", `"standstill": true`, `"standstill": 1`, ErrType,
			[]string{"requirements.standstill = 1", "want true or false"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			if !strings.Contains(base, c.old) {
				t.Fatalf("the test file no longer contains %q", c.old)
			}
			_, err := Parse("mine.json", []byte(strings.Replace(base, c.old, c.new, 1)))
			if !errors.Is(err, c.kind) {
				t.Fatalf("Parse = %v, want %v", err, c.kind)
			}
			for _, w := range append(c.want, "mine.json:") {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
		})
	}
	t.Run("ends early", func(t *testing.T) {
		t.Parallel()
		cut := base[:strings.Index(base, `"engine"`)]
		_, err := Parse("mine.json", []byte(cut))
		if !errors.Is(err, ErrSyntax) || !strings.Contains(err.Error(), "ends early") {
			t.Errorf("Parse of a cut file = %v, want ErrSyntax and \"ends early\"", err)
		}
	})
	t.Run("null leaves out", func(t *testing.T) {
		t.Parallel()
		f, err := Parse("mine.json", []byte(strings.Replace(base, `"hitchBehind": "1 m"`, `"hitchBehind": null`, 1)))
		if err != nil {
			t.Fatal(err)
		}
		if f.Tractor.HitchBehind != 0 {
			t.Errorf("hitchBehind after null = %v, want 0 (left out)", f.Tractor.HitchBehind)
		}
		if g := parsed(t); g.Tractor.HitchBehind == 0 {
			t.Error("the unchanged file gives hitchBehind 0; the check above proves nothing")
		}
	})
}
