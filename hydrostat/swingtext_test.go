package hydrostat

import (
	"encoding/json"
	"errors"
	"testing"
)

// TestSwingText: every Swing marshals to its name and reads back to
// itself; the accepted variants read to the same Swing; other text and
// values outside the constants are errors.
func TestSwingText(t *testing.T) {
	t.Parallel()
	for s, want := range map[Swing]string{SwingUnstated: "unstated", SwingToZero: "to zero", SwingOverCentre: "over centre"} {
		b, err := s.MarshalText()
		if err != nil || string(b) != want {
			t.Errorf("%v.MarshalText() = %q, %v; want %q", s, b, err, want)
		}
		var back Swing = 7
		if err := back.UnmarshalText(b); err != nil || back != s {
			t.Errorf("UnmarshalText(%q) = %v, %v; want %v", b, back, err, s)
		}
		// Inside JSON, as a field of a struct (the design file's use).
		type doc struct {
			Swing Swing `json:"swing"`
		}
		j, err := json.Marshal(doc{s})
		if err != nil || string(j) != `{"swing":"`+want+`"}` {
			t.Errorf("json.Marshal(%v) = %s, %v", s, j, err)
		}
		var d doc
		if err := json.Unmarshal(j, &d); err != nil || d.Swing != s {
			t.Errorf("json.Unmarshal(%s) = %v, %v; want %v", j, d.Swing, err, s)
		}
	}
	for text, want := range map[string]Swing{"Over-Centre": SwingOverCentre, " TO_ZERO ": SwingToZero, "over_centre": SwingOverCentre, "UNSTATED": SwingUnstated, "to-zero": SwingToZero} {
		var s Swing
		if err := s.UnmarshalText([]byte(text)); err != nil || s != want {
			t.Errorf("UnmarshalText(%q) = %v, %v; want %v", text, s, err, want)
		}
	}
	for _, text := range []string{"", "over center", "zero", "overcentre", "to  zero", "0", "1", "Swing(2)", "over centre!"} {
		s := SwingToZero
		if err := s.UnmarshalText([]byte(text)); !errors.Is(err, ErrInvalid) || s != SwingToZero {
			t.Errorf("UnmarshalText(%q) = %v, %v; want ErrInvalid and the value unchanged", text, s, err)
		}
	}
	for _, s := range []Swing{-1, 3, 9} {
		if b, err := s.MarshalText(); !errors.Is(err, ErrInvalid) {
			t.Errorf("Swing(%d).MarshalText() = %q, %v; want ErrInvalid", int(s), b, err)
		}
	}
}

// FuzzSwingText: any text either fails with ErrInvalid, leaving the value
// unchanged, or reads to one of the constants, whose MarshalText reads back
// to the same constant; any int either marshals and reads back to itself or
// fails with ErrInvalid.
func FuzzSwingText(f *testing.F) {
	for _, seed := range []string{"unstated", "to zero", "over centre", "Over-Centre", "", "over center", "\x00", "to\tzero"} {
		f.Add(seed, 0)
	}
	f.Add("x", 2)
	f.Add("x", -1)
	f.Add("x", 3)
	f.Fuzz(func(t *testing.T, text string, n int) {
		s := Swing(-5)
		err := s.UnmarshalText([]byte(text))
		switch {
		case err != nil:
			if !errors.Is(err, ErrInvalid) || s != -5 {
				t.Fatalf("UnmarshalText(%q) = %v, %v; want ErrInvalid and the value unchanged", text, s, err)
			}
		case s < SwingUnstated || s > SwingOverCentre:
			t.Fatalf("UnmarshalText(%q) = %v, not a constant", text, s)
		default:
			b, err := s.MarshalText()
			var back Swing
			if err != nil || back.UnmarshalText(b) != nil || back != s {
				t.Fatalf("%v: MarshalText %q, %v reads back to %v", s, b, err, back)
			}
		}
		b, err := Swing(n).MarshalText()
		if n < int(SwingUnstated) || n > int(SwingOverCentre) {
			if !errors.Is(err, ErrInvalid) {
				t.Fatalf("Swing(%d).MarshalText() = %q, %v; want ErrInvalid", n, b, err)
			}
			return
		}
		var back Swing
		if err != nil || back.UnmarshalText(b) != nil || back != Swing(n) {
			t.Fatalf("Swing(%d): MarshalText %q, %v reads back to %v", n, b, err, back)
		}
	})
}
