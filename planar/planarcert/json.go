package planarcert

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strconv"
	"unicode/utf8"

	"spinecert.dev/graph"
	"spinecert.dev/textpos"
)

// Format is the format name in planarity certificate files.
const Format = "spinecert-planarity"

// Version is the version of the planarity certificate format.
const Version = 1

// Write writes c for g as JSON (format spinecert-planarity, version 1):
//
//	{"format":"spinecert-planarity","version":1,"graph":ID,"vertices":N,"edges":M,
//	 "planar":true,"rotation":[["a","b","c"],...]}
//	{"format":"spinecert-planarity","version":1,"graph":ID,"vertices":N,"edges":M,
//	 "planar":false,"kuratowski":{"kind":"K3,3","branch":[...],"paths":[[...],...]}}
//
// Each rotation entry is a vertex followed by its neighbours in cyclic order;
// every vertex has an entry, in vertex order. The output is the same bytes for the same certificate.
func Write(w io.Writer, g *graph.Graph, c *Cert) error {
	if c == nil || (c.Planar && c.Embedding == nil) || (!c.Planar && c.Kuratowski == nil) {
		return errors.New("planarcert: incomplete planarity certificate")
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	fmt.Fprintf(bw, "{\n  \"format\": %q,\n  \"version\": %d,\n  \"graph\": %q,\n  \"vertices\": %d,\n  \"edges\": %d,\n",
		Format, Version, g.ID(), g.N(), g.M())
	var buf []byte
	str := func(v int32) {
		buf = planarAppendJSON(buf[:0], g.Label(v))
		bw.Write(buf)
	}
	list := func(vs []int32) {
		bw.WriteByte('[')
		for i, v := range vs {
			if i > 0 {
				bw.WriteString(", ")
			}
			str(v)
		}
		bw.WriteByte(']')
	}
	if c.Planar {
		rot := c.Embedding.Rotation
		if len(rot) != g.N() {
			return fmt.Errorf("planarcert: embedding has %d vertices, graph has %d", len(rot), g.N())
		}
		bw.WriteString("  \"planar\": true,\n  \"rotation\": [")
		for v := range rot {
			if v > 0 {
				bw.WriteByte(',')
			}
			bw.WriteString("\n    [")
			str(int32(v))
			for _, w := range rot[v] {
				bw.WriteString(", ")
				str(w)
			}
			bw.WriteByte(']')
		}
		bw.WriteString("\n  ]\n}\n")
		return bw.Flush()
	}
	k := c.Kuratowski
	fmt.Fprintf(bw, "  \"planar\": false,\n  \"kuratowski\": {\n    \"kind\": %q,\n    \"branch\": ", k.Kind.String())
	list(k.Branch)
	bw.WriteString(",\n    \"paths\": [")
	for i, p := range k.Paths {
		if i > 0 {
			bw.WriteByte(',')
		}
		bw.WriteString("\n      ")
		list(p)
	}
	bw.WriteString("\n    ]\n  }\n}\n")
	return bw.Flush()
}

// planarAppendJSON appends s as a JSON string.
func planarAppendJSON(b []byte, s string) []byte {
	plain := utf8.ValidString(s)
	for i := 0; plain && i < len(s); i++ {
		c := s[i]
		plain = c >= 0x20 && c != '"' && c != '\\' && c != '<' && c != '>' && c != '&' && c < 0x7f
	}
	if plain {
		b = append(b, '"')
		b = append(b, s...)
		return append(b, '"')
	}
	q, _ := json.Marshal(s)
	return append(b, q...)
}

type planarFile struct {
	Format     *string         `json:"format"`
	Version    *int            `json:"version"`
	Graph      *string         `json:"graph"`
	Vertices   *int            `json:"vertices"`
	Edges      *int            `json:"edges"`
	Planar     *bool           `json:"planar"`
	Rotation   json.RawMessage `json:"rotation"`
	Kuratowski *struct {
		Kind   string     `json:"kind"`
		Branch []string   `json:"branch"`
		Paths  [][]string `json:"paths"`
	} `json:"kuratowski"`
}

// Read reads a planarity certificate for g written by
// Write (or by anything else in its format); name is used in error
// messages, which are *textpos.Error values with line and column. Reading
// resolves labels against g and checks that the certificate is for g; it
// does not check the certificate itself (Check does).
func Read(r io.Reader, name string, g *graph.Graph) (*Cert, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("planarcert: reading %s: %w", name, err)
	}
	perr := func(off int64, format string, args ...any) error {
		line, col := offsetPosition(data, off)
		return &textpos.Error{File: name, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var f planarFile
	if err := dec.Decode(&f); err != nil {
		return nil, jsonError(data, name, err, dec.InputOffset())
	}
	if dec.More() {
		return nil, perr(dec.InputOffset(), "expected end of input after the certificate object")
	}
	if err := textpos.CheckJSONKeys(data, name, &f); err != nil {
		return nil, err
	}
	switch {
	case f.Format == nil || *f.Format != Format:
		return nil, perr(0, "expected \"format\": %q", Format)
	case f.Version == nil || *f.Version != Version:
		return nil, perr(0, "expected \"version\": %d", Version)
	case f.Graph == nil:
		return nil, perr(0, "expected \"graph\": the graph's identity")
	case *f.Graph != g.ID():
		return nil, perr(0, "certificate is for graph %s, not for this graph (%s)", *f.Graph, g.ID())
	case f.Vertices != nil && *f.Vertices != g.N():
		return nil, perr(0, "certificate says %d vertices, the graph has %d", *f.Vertices, g.N())
	case f.Edges != nil && *f.Edges != g.M():
		return nil, perr(0, "certificate says %d edges, the graph has %d", *f.Edges, g.M())
	case f.Planar == nil:
		return nil, perr(0, "expected \"planar\": true or false")
	}
	if *f.Planar {
		if f.Kuratowski != nil || f.Rotation == nil {
			return nil, perr(0, "a planar certificate has \"rotation\" and no \"kuratowski\"")
		}
		base := int64(bytes.Index(data, f.Rotation))
		emb, err := readRotation(f.Rotation, g, func(off int64, format string, args ...any) error {
			return perr(base+off, format, args...)
		})
		if err != nil {
			return nil, err
		}
		return &Cert{Planar: true, Embedding: emb}, nil
	}
	if f.Kuratowski == nil || f.Rotation != nil {
		return nil, perr(0, "a non-planar certificate has \"kuratowski\" and no \"rotation\"")
	}
	k := &Kuratowski{}
	switch f.Kuratowski.Kind {
	case "K5":
		k.Kind = K5
	case "K3,3":
		k.Kind = K33
	default:
		return nil, perr(0, "expected \"kind\": \"K5\" or \"K3,3\", found %q", f.Kuratowski.Kind)
	}
	resolve := func(labels []string, what string) ([]int32, error) {
		out := make([]int32, len(labels))
		for i, l := range labels {
			v, ok := g.Index(l)
			if !ok {
				return nil, perr(0, "%s names %q, which is not a vertex of the graph", what, l)
			}
			out[i] = v
		}
		return out, nil
	}
	if k.Branch, err = resolve(f.Kuratowski.Branch, "branch"); err != nil {
		return nil, err
	}
	for i, p := range f.Kuratowski.Paths {
		vs, err := resolve(p, "path "+strconv.Itoa(i+1))
		if err != nil {
			return nil, err
		}
		k.Paths = append(k.Paths, vs)
	}
	return &Cert{Kuratowski: k}, nil
}

// readRotation reads [["vertex", "neighbour", ...], ...].
func readRotation(raw json.RawMessage, g *graph.Graph, perr func(int64, string, ...any) error) (*Embedding, error) {
	var entries [][]string
	if err := json.Unmarshal(raw, &entries); err != nil {
		var syn *json.SyntaxError
		var off int64
		if errors.As(err, &syn) {
			off = syn.Offset
		}
		return nil, perr(off, "expected \"rotation\" to be a list of [vertex, neighbours...] lists")
	}
	rot := make([][]int32, g.N())
	given := make([]bool, g.N())
	flat := make([]int32, 0, 2*g.M())
	for i, e := range entries {
		if len(e) == 0 {
			return nil, perr(0, "rotation entry %d is empty (expected a vertex and its neighbours)", i+1)
		}
		v, ok := g.Index(e[0])
		if !ok {
			return nil, perr(0, "rotation entry %d names %q, which is not a vertex of the graph", i+1, e[0])
		}
		if given[v] {
			return nil, perr(0, "rotation of %q given twice", e[0])
		}
		given[v] = true
		start := len(flat)
		for _, l := range e[1:] {
			w, ok := g.Index(l)
			if !ok {
				return nil, perr(0, "rotation of %q names %q, which is not a vertex of the graph", e[0], l)
			}
			flat = append(flat, w)
		}
		rot[v] = flat[start:len(flat):len(flat)]
	}
	return &Embedding{Rotation: rot}, nil
}

// offsetPosition turns a byte offset into a 1-based line and column.
func offsetPosition(data []byte, off int64) (int, int) {
	off = max(0, min(off, int64(len(data))))
	before := data[:off]
	line := 1 + bytes.Count(before, []byte{'\n'})
	col := int(off) - bytes.LastIndexByte(before, '\n')
	return line, col
}

// jsonError turns an encoding/json error into a *textpos.Error.
func jsonError(data []byte, name string, err error, fallback int64) error {
	off := fallback
	var syn *json.SyntaxError
	var typ *json.UnmarshalTypeError
	msg := err.Error()
	switch {
	case errors.As(err, &syn):
		off = syn.Offset
	case errors.As(err, &typ):
		off = typ.Offset
		msg = fmt.Sprintf("expected %s for %q, found %s", typ.Type, typ.Field, typ.Value)
	case errors.Is(err, io.EOF):
		msg = "expected a JSON object, found end of input"
	}
	line, col := offsetPosition(data, off)
	return &textpos.Error{File: name, Line: line, Col: col, Msg: msg}
}
