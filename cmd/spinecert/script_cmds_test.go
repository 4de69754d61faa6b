package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"os/exec"
	"strconv"
	"strings"
	"testing"

	"github.com/rogpeppe/go-internal/testscript"
)

// scriptCmds are the commands the scenarios in testdata/script add to
// testscript's own.
var scriptCmds = map[string]func(ts *testscript.TestScript, neg bool, args []string){
	"exits":   scriptExits,
	"jsonone": scriptJSONOne,
}

// scriptExits is "exits N PROG [ARGS...]": it runs PROG as exec does and
// fails unless PROG exits with status N. Its stdout and stderr are kept for
// the stdout and stderr matchers that follow.
func scriptExits(ts *testscript.TestScript, neg bool, args []string) {
	if neg {
		ts.Fatalf("exits: no ! before exits; name the status instead")
	}
	if len(args) < 2 {
		ts.Fatalf("usage: exits N PROG [ARGS...]")
	}
	want, err := strconv.Atoi(args[0])
	if err != nil || want < 0 || want > 255 {
		ts.Fatalf("exits: status %q is not a number from 0 to 255", args[0])
	}
	err = ts.Exec(args[1], args[2:]...)
	got := 0
	if err != nil {
		var ee *exec.ExitError
		if !errors.As(err, &ee) || !ee.Exited() {
			ts.Fatalf("exits: %s did not exit by itself: %v", args[1], err)
		}
		got = ee.ExitCode()
	}
	if got != want {
		ts.Fatalf("%s exited with status %d, want %d", args[1], got, want)
	}
}

// scriptJSONOne is "jsonone": the stdout of the last command must be exactly
// one JSON object, with nothing but white space after it.
func scriptJSONOne(ts *testscript.TestScript, neg bool, args []string) {
	if neg || len(args) != 0 {
		ts.Fatalf("usage: jsonone")
	}
	if err := oneJSONObject(ts.ReadFile("stdout")); err != nil {
		ts.Fatalf("stdout: %v", err)
	}
}

// oneJSONObject returns nil when out is exactly one JSON object, with
// nothing but white space around it.
func oneJSONObject(out string) error {
	dec := json.NewDecoder(strings.NewReader(out))
	var v any
	if err := dec.Decode(&v); err != nil {
		return fmt.Errorf("not a JSON value: %w", err)
	}
	if _, ok := v.(map[string]any); !ok {
		return fmt.Errorf("a JSON %s, want an object", jsonKind(v))
	}
	if rest := out[dec.InputOffset():]; strings.TrimSpace(rest) != "" {
		return fmt.Errorf("more after the JSON object: %.40q", rest)
	}
	return nil
}

func TestOneJSONObject(t *testing.T) {
	for _, c := range []struct {
		out string
		ok  bool
	}{
		{"{}\n", true},
		{"  {\"a\": [1, 2]}\n\n", true},
		{"", false},
		{"[]\n", false},
		{"null\n", false},
		{"\"x\"\n", false},
		{"{} {}\n", false},
		{"{}\nwrote x\n", false},
		{"{\"a\": 1\n", false},
	} {
		if err := oneJSONObject(c.out); (err == nil) != c.ok {
			t.Errorf("oneJSONObject(%q) = %v, want ok=%v", c.out, err, c.ok)
		}
	}
}

// jsonKind names the kind of a decoded JSON value for messages.
func jsonKind(v any) string {
	switch v.(type) {
	case nil:
		return "null"
	case bool:
		return "boolean"
	case float64:
		return "number"
	case string:
		return "string"
	case []any:
		return "array"
	}
	return "value"
}
