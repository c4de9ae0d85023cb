package demo

import (
	"io"
	"os"
	"strings"
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
