package textpos

import (
	"bytes"
	"encoding/json"
	"fmt"
	"reflect"
	"strings"
	"unicode"
)

// CheckJSONKeys checks the object keys of the JSON value at the start of
// data, which is to be (or was) decoded into a value of v's type with
// encoding/json. encoding/json matches keys to fields without regard to case
// and lets a later key override an earlier one, so a document that decodes
// without error can still mean one thing to spinecert and another to other
// readers. CheckJSONKeys refuses, with the position of the key in file:
//
//   - a key given twice in one object, or two keys that differ only in case;
//   - a key that names a field of v's type only when case is ignored.
//
// It looks into the values of fields whose type decodes itself (such as
// json.RawMessage) only for repeated keys. Malformed JSON is left to the
// decoder to report: CheckJSONKeys stops at the first syntax error and
// returns nil.
func CheckJSONKeys(data []byte, file string, v any) error {
	k := keyChecker{data: data, file: file, dec: json.NewDecoder(bytes.NewReader(data))}
	k.dec.UseNumber()
	err := k.value(reflect.TypeOf(v))
	if ke, ok := err.(*Error); ok {
		return ke
	}
	return nil
}

type keyChecker struct {
	data []byte
	file string
	dec  *json.Decoder
}

var unmarshalerType = reflect.TypeFor[json.Unmarshaler]()

// schema returns the type whose fields t's objects are matched against:
// t without pointers, or nil when t decodes itself or is not known.
func schema(t reflect.Type) reflect.Type {
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == nil || t.Kind() == reflect.Interface || reflect.PointerTo(t).Implements(unmarshalerType) {
		return nil
	}
	return t
}

// value checks one JSON value to be decoded into t (nil: unknown).
func (k *keyChecker) value(t reflect.Type) error {
	t = schema(t)
	tok, err := k.dec.Token()
	if err != nil {
		return err
	}
	switch tok {
	case json.Delim('{'):
		return k.object(t)
	case json.Delim('['):
		var elem reflect.Type
		if t != nil && (t.Kind() == reflect.Slice || t.Kind() == reflect.Array) {
			elem = t.Elem()
		}
		for k.dec.More() {
			if err := k.value(elem); err != nil {
				return err
			}
		}
		_, err := k.dec.Token() // ']'
		return err
	}
	return nil
}

func (k *keyChecker) object(t reflect.Type) error {
	var fields map[string]reflect.StructField // folded name -> field
	if t != nil && t.Kind() == reflect.Struct {
		fields = map[string]reflect.StructField{}
		jsonFields(t, fields)
	}
	seen := map[string]string{} // folded key -> the key as given
	for k.dec.More() {
		start := k.keyStart(k.dec.InputOffset())
		tok, err := k.dec.Token()
		if err != nil {
			return err
		}
		key, _ := tok.(string)
		fold := foldKey(key)
		if prev, dup := seen[fold]; dup {
			if prev == key {
				return k.errAt(start, "key %+q appears twice in one object", key)
			}
			return k.errAt(start, "keys %+q and %+q differ only in case (keys are case-sensitive)", prev, key)
		}
		seen[fold] = key
		var child reflect.Type
		switch {
		case fields != nil:
			if f, ok := fields[fold]; ok {
				name := jsonName(f)
				if name != key {
					return k.errAt(start, "key %+q is not %q (keys are case-sensitive)", key, name)
				}
				child = f.Type
			}
		case t != nil && t.Kind() == reflect.Map:
			child = t.Elem()
		}
		if err := k.value(child); err != nil {
			return err
		}
	}
	_, err := k.dec.Token() // '}'
	return err
}

// jsonFields adds the fields encoding/json decodes into for struct type t.
func jsonFields(t reflect.Type, out map[string]reflect.StructField) {
	for f := range t.Fields() {
		tag := f.Tag.Get("json")
		if tag == "-" {
			continue
		}
		if f.Anonymous && tag == "" {
			if et := schema(f.Type); et != nil && et.Kind() == reflect.Struct {
				jsonFields(et, out)
				continue
			}
		}
		if !f.IsExported() {
			continue
		}
		out[foldKey(jsonName(f))] = f
	}
}

func jsonName(f reflect.StructField) string {
	name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
	if name == "" {
		return f.Name
	}
	return name
}

// foldKey maps keys that encoding/json treats as equal to the same string:
// each rune becomes the smallest rune of its simple case-folding orbit (so
// the Kelvin sign folds with "k", as bytes.EqualFold has it).
func foldKey(s string) string {
	var b strings.Builder
	for _, r := range s {
		m := r
		for f := unicode.SimpleFold(r); f != r; f = unicode.SimpleFold(f) {
			m = min(m, f)
		}
		b.WriteRune(m)
	}
	return b.String()
}

// keyStart returns the offset of the key's opening quote: the decoder's
// offset is just after the previous token, before any ',' and white space.
func (k *keyChecker) keyStart(off int64) int64 {
	for off < int64(len(k.data)) && strings.IndexByte(" \t\r\n,", k.data[off]) >= 0 {
		off++
	}
	return off
}

func (k *keyChecker) errAt(off int64, format string, args ...any) *Error {
	before := k.data[:min(max(off, 0), int64(len(k.data)))]
	line := 1 + bytes.Count(before, []byte{'\n'})
	col := len(before) - bytes.LastIndexByte(before, '\n')
	return &Error{File: k.file, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
}
