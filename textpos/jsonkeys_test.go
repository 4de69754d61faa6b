package textpos

import (
	"encoding/json"
	"strings"
	"testing"
)

type keysOuter struct {
	Name  string            `json:"name"`
	Inner *keysInner        `json:"inner,omitempty"`
	List  []keysInner       `json:"list"`
	Map   map[string]int    `json:"map"`
	Raw   json.RawMessage   `json:"raw"`
	Any   any               `json:"any"`
	Skip  string            `json:"-"`
	More  map[string]keysIn `json:"more"`
}

type keysInner struct {
	Kind string `json:"kind"`
}

type keysIn = keysInner

func TestCheckJSONKeys(t *testing.T) {
	for _, c := range []struct {
		in   string
		want string // "" for accepted
	}{
		{`{"name":"a","inner":{"kind":"x"},"list":[{"kind":"y"}],"map":{"A":1,"b":2}}`, ""},
		{`{"name":"a","name":"b"}`, `f.json:1:13: key "name" appears twice in one object`},
		{`{"name":"a",` + "\n" + ` "Name":"b"}`, `f.json:2:2: keys "name" and "Name" differ only in case`},
		{`{"Name":"b"}`, `f.json:1:2: key "Name" is not "name" (keys are case-sensitive)`},
		{`{"inner":{"KIND":"x"}}`, `key "KIND" is not "kind"`},
		{`{"list":[{"kind":"x"},{"kind":"x","kind":"y"}]}`, `key "kind" appears twice`},
		{`{"map":{"a":1,"A":2}}`, `keys "a" and "A" differ only in case`},
		{`{"more":{"x":{"Kind":"s"}}}`, `key "Kind" is not "kind"`},
		{`{"raw":{"x":1,"x":2}}`, `key "x" appears twice`},
		{`{"raw":{"x":1,"X":2}}`, `keys "x" and "X" differ only in case`},
		{`{"raw":{"X":1}}`, ""}, // a raw value's own schema is its reader's
		{`{"any":[{"a":{"b":1,"b":2}}]}`, `key "b" appears twice`},
		{`{"name":"a","\u006eame":"b"}`, `key "name" appears twice`},
		{`{"inner":{"\u212aind":"x"}}`, `key "\u212aind" is not "kind"`}, // the Kelvin sign folds with k
		{`{"-":"x","skip":"y"}`, ""},
		{`{"unknown":{"a":1,"A":2}}`, `differ only in case`},
		{`{"name":`, ""}, // malformed: the decoder reports it
		{`[1,2`, ""},
	} {
		err := CheckJSONKeys([]byte(c.in), "f.json", &keysOuter{})
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: %v, want no error", c.in, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%s: %v, want an error containing %q", c.in, err, c.want)
		}
	}
}
