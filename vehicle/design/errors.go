package design

import (
	"errors"
	"fmt"
	"strconv"
)

// Sentinel errors: the kinds of mistakes in a design file. A *FieldError
// wraps one of them (or an error of the units, planetary, hydrostat or
// vehicle packages), so errors.Is finds the kind.
var (
	// ErrSyntax is text that is not valid JSON.
	ErrSyntax = errors.New("design: not valid JSON")
	// ErrUnknownKey is a key the format does not have (often misspelt).
	ErrUnknownKey = errors.New("design: unknown key")
	// ErrDuplicateKey is a key given twice in one object.
	ErrDuplicateKey = errors.New("design: duplicate key")
	// ErrType is a value of the wrong JSON type (a number where a quantity
	// text is wanted, say).
	ErrType = errors.New("design: wrong type")
	// ErrValue is a value outside what the field accepts (missing,
	// negative, not one of the allowed words, a name that refers to
	// nothing).
	ErrValue = errors.New("design: bad value")
	// ErrFormat is a file of a newer format version than this library
	// reads.
	ErrFormat = errors.New("design: unsupported format version")
)

// FieldError is a mistake at one place of a design file: the file, the
// line (0 when the value is not from a file), the JSON path of the value
// (for example "transmission.pump.displacement" or "day.segments[3].speed")
// and the value as the user wrote it, in the user's unit.
type FieldError struct {
	Source string // file name ("" for a File made in Go)
	Line   int    // 1-based line of the value; 0 when unknown
	Path   string // JSON path
	Value  string // the value as written ("" when missing)
	Err    error  // what is wrong
}

func (e *FieldError) Error() string {
	loc := e.Source
	if e.Line > 0 {
		loc += ":" + strconv.Itoa(e.Line)
	}
	if loc != "" {
		loc += ": "
	}
	path := e.Path
	if path == "" {
		path = "(top level)"
	}
	if e.Value != "" {
		return fmt.Sprintf("%s%s = %s: %v", loc, path, e.Value, e.Err)
	}
	return fmt.Sprintf("%s%s: %v", loc, path, e.Err)
}

// Unwrap returns the kind of mistake.
func (e *FieldError) Unwrap() error { return e.Err }
