package demo

import (
	"io"
	"os"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// FirstLine returns the first line of err's message, for one-line reports.
func FirstLine(err error) string {
	s, _, _ := strings.Cut(err.Error(), "\n")
	return s
}

// FileName turns a label into a file name: letters and digits kept, every
// other character replaced by '_'.
func FileName(s string) string {
	return strings.Map(func(r rune) rune {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' || r >= 'A' && r <= 'Z' {
			return r
		}
		return '_'
	}, s)
}

// WriteFile creates path and fills it with write, reporting the first
// error of writing or closing.
func WriteFile(path string, write func(io.Writer) error) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	if err := write(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// Widest returns the widest of a range's reachable speed intervals (as
// Solver.Interval lists them), the one a sweep of the range runs over.
func Widest(ivs []powersplit.SpeedInterval) (lo, hi units.AngularVelocity) {
	for i, iv := range ivs {
		if i == 0 || iv.Hi-iv.Lo > hi-lo {
			lo, hi = iv.Lo, iv.Hi
		}
	}
	return lo, hi
}
