package design

import (
	"bytes"
	"encoding"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"strconv"
	"strings"
	"sync"
)

// leaf is where a value sits in the file and how it was written.
type leaf struct {
	line int
	text string // the JSON text of a scalar ("" for objects and lists)
}

// index maps each JSON path of a file to its place.
type index map[string]leaf

// scanner walks a file's JSON tokens alongside the Go type they decode
// into. It refuses what encoding/json would take silently (unknown keys,
// duplicate keys, keys differing only in case) and reports every mistake
// with its JSON path and line, so that json.Unmarshal afterwards meets only
// input it decodes exactly.
type scanner struct {
	source string
	data   []byte
	dec    *json.Decoder
	idx    index
}

var textUnmarshaler = reflect.TypeFor[encoding.TextUnmarshaler]()

// scan checks data against the File type and indexes its values.
func scan(source string, data []byte) (index, error) {
	s := &scanner{source: source, data: data, dec: json.NewDecoder(bytes.NewReader(data)), idx: index{}}
	s.dec.UseNumber()
	if len(bytes.TrimSpace(data)) == 0 {
		return nil, &FieldError{Source: source, Err: fmt.Errorf("%w: empty file", ErrSyntax)}
	}
	if err := s.value(reflect.TypeFor[File](), ""); err != nil {
		return nil, err
	}
	line := s.line()
	if _, err := s.dec.Token(); err != io.EOF {
		return nil, &FieldError{Source: source, Line: line, Err: fmt.Errorf("%w: unexpected data after the design object", ErrSyntax)}
	}
	return s.idx, nil
}

// line returns the line of the next token.
func (s *scanner) line() int {
	off := int(s.dec.InputOffset())
	for off < len(s.data) && strings.IndexByte(" \t\r\n,:", s.data[off]) >= 0 {
		off++
	}
	return lineOf(s.data, off)
}

// token reads the next token, turning a syntax error into a FieldError at
// path.
func (s *scanner) token(path string) (json.Token, int, error) {
	line := s.line()
	tok, err := s.dec.Token()
	if err != nil {
		var syn *json.SyntaxError
		if errors.As(err, &syn) {
			line = lineOf(s.data, int(syn.Offset))
		}
		if err == io.EOF || errors.Is(err, io.ErrUnexpectedEOF) {
			err = errors.New("the file ends early")
		}
		return nil, line, &FieldError{Source: s.source, Line: line, Path: path, Err: fmt.Errorf("%w: %v", ErrSyntax, err)}
	}
	return tok, line, nil
}

// fail makes a FieldError at path.
func (s *scanner) fail(line int, path, value string, kind error, format string, args ...any) error {
	return &FieldError{Source: s.source, Line: line, Path: path, Value: value, Err: fmt.Errorf("%w: %s", kind, fmt.Sprintf(format, args...))}
}

// value reads one value of Go type t at path.
func (s *scanner) value(t reflect.Type, path string) error {
	tok, line, err := s.token(path)
	if err != nil {
		return err
	}
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	text := ""
	switch v := tok.(type) {
	case string:
		text = strconv.Quote(v)
	case json.Number:
		text = string(v)
	case bool:
		text = strconv.FormatBool(v)
	case nil:
		text = "null"
	}
	s.idx[path] = leaf{line: line, text: text}
	if tok == nil { // null: the value is left out
		return nil
	}
	if reflect.PointerTo(t).Implements(textUnmarshaler) {
		str, ok := tok.(string)
		if !ok {
			return s.fail(line, path, text, ErrType, "want a text such as %s", example(t))
		}
		u := reflect.New(t).Interface().(encoding.TextUnmarshaler)
		if err := u.UnmarshalText([]byte(str)); err != nil {
			return &FieldError{Source: s.source, Line: line, Path: path, Value: text, Err: err}
		}
		return nil
	}
	switch t.Kind() {
	case reflect.Struct:
		if tok != json.Delim('{') {
			return s.fail(line, path, text, ErrType, "want an object")
		}
		fields := fieldsOf(t)
		return s.object(path, func(key string, keyLine int, p string) error {
			ft, ok := fields[key]
			if !ok {
				return s.fail(keyLine, p, "", ErrUnknownKey, "%q is not a key of %s (misspelt, or not part of the format)", key, where(path))
			}
			return s.value(ft, p)
		})
	case reflect.Map:
		if tok != json.Delim('{') {
			return s.fail(line, path, text, ErrType, "want an object")
		}
		return s.object(path, func(_ string, _ int, p string) error { return s.value(t.Elem(), p) })
	case reflect.Slice:
		if tok != json.Delim('[') {
			return s.fail(line, path, text, ErrType, "want a list")
		}
		for i := 0; s.dec.More(); i++ {
			if err := s.value(t.Elem(), fmt.Sprintf("%s[%d]", path, i)); err != nil {
				return err
			}
		}
		_, _, err := s.token(path)
		return err
	case reflect.String:
		if _, ok := tok.(string); !ok {
			return s.fail(line, path, text, ErrType, "want a text")
		}
	case reflect.Float64:
		n, ok := tok.(json.Number)
		if !ok {
			return s.fail(line, path, text, ErrType, "want a number")
		}
		if _, err := strconv.ParseFloat(string(n), 64); err != nil {
			return s.fail(line, path, text, ErrValue, "out of range")
		}
	case reflect.Int:
		n, ok := tok.(json.Number)
		if !ok {
			return s.fail(line, path, text, ErrType, "want a whole number")
		}
		if _, err := strconv.ParseInt(string(n), 10, 32); err != nil {
			return s.fail(line, path, text, ErrType, "want a whole number")
		}
	case reflect.Bool:
		if _, ok := tok.(bool); !ok {
			return s.fail(line, path, text, ErrType, "want true or false")
		}
	default:
		panic("design: scanner meets a field of kind " + t.Kind().String())
	}
	return nil
}

// structFields caches each struct type's JSON keys and field types.
var structFields sync.Map // reflect.Type → map[string]reflect.Type

// fieldsOf returns the JSON keys of struct type t and their types.
func fieldsOf(t reflect.Type) map[string]reflect.Type {
	if m, ok := structFields.Load(t); ok {
		return m.(map[string]reflect.Type)
	}
	fields := map[string]reflect.Type{}
	for i := range t.NumField() {
		f := t.Field(i)
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if !f.IsExported() || name == "-" || name == "" {
			continue
		}
		fields[name] = f.Type
	}
	structFields.Store(t, fields)
	return fields
}

// object reads the keys of an object whose '{' has been read, refusing
// duplicates, and calls each for every key with the key's path.
func (s *scanner) object(path string, each func(key string, line int, p string) error) error {
	seen := map[string]int{}
	for s.dec.More() {
		tok, line, err := s.token(path)
		if err != nil {
			return err
		}
		key := tok.(string) // the decoder only returns string keys
		p := join(path, key)
		if first, dup := seen[key]; dup {
			return s.fail(line, p, "", ErrDuplicateKey, "%q is given twice in %s (first on line %d)", key, where(path), first)
		}
		seen[key] = line
		if err := each(key, line, p); err != nil {
			return err
		}
	}
	_, _, err := s.token(path)
	return err
}

// join appends key to a JSON path: a.b, or a["key with spaces"].
func join(path, key string) string {
	plain := key != ""
	for _, r := range key {
		if !(r == '_' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9') {
			plain = false
		}
	}
	switch {
	case !plain:
		return path + "[" + strconv.Quote(key) + "]"
	case path == "":
		return key
	}
	return path + "." + key
}

// where names an object for a message.
func where(path string) string {
	if path == "" {
		return "the design file"
	}
	return path
}

// example gives a sample text for a type read from text.
func example(t reflect.Type) string {
	switch t.Name() {
	case "Duration":
		return `"25 min"`
	case "Pressure":
		return `"420 bar"`
	case "AngularVelocity":
		return `"2100 rpm"`
	case "Mass":
		return `"8.5 t"`
	case "Length":
		return `"1.2 m"`
	case "Speed":
		return `"40 km/h"`
	case "Temperature":
		return `"60 °C"`
	case "Swing":
		return `"over centre"`
	case "Torque":
		return `"2 N·m"`
	case "DynamicViscosity":
		return `"20 mPa·s"`
	}
	return `"110 cm³/rev"`
}

// lineOf returns the 1-based line of byte offset off.
func lineOf(data []byte, off int) int {
	off = max(0, min(off, len(data)))
	return bytes.Count(data[:off], []byte{'\n'}) + 1
}

// fieldError makes a FieldError at path of f, with the line and the value
// as written when f was read from a file. A path absent from the file (a
// missing key) takes the line of the nearest enclosing object.
func (f *File) fieldError(path string, err error) *FieldError {
	e := &FieldError{Source: f.source, Path: path, Err: err}
	if l, ok := f.index[path]; ok {
		e.Line, e.Value = l.line, l.text
		return e
	}
	for p := path; p != ""; {
		i := strings.LastIndexAny(p, ".[")
		if i < 0 {
			break
		}
		p = p[:i]
		if l, ok := f.index[p]; ok {
			e.Line = l.line
			break
		}
	}
	return e
}
