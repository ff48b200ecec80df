package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/reflect/protoreflect"
	"sigs.k8s.io/yaml"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// A scenario file is a PlanExperimentRequest in the proto JSON mapping,
// written as JSON or YAML: the file and the API are one format and cannot
// drift. Field names may be the proto names (pulse_energy_uj) or their JSON
// names (pulseEnergyUj); enum values are their full names
// (PULSE_SHAPE_SINGLE_CYCLE).

// maxScenarioBytes bounds a scenario file (a measured trace inside one is
// the only large part).
const maxScenarioBytes = 64 << 20

// loadScenario reads and decodes a scenario file; "-" reads standard input.
// Every failure is a usage error (exit 2): the file is the command line's.
func loadScenario(path string) (*thzdrivev1.PlanExperimentRequest, error) {
	var in io.Reader = os.Stdin
	if path != "-" {
		f, err := os.Open(path)
		if err != nil {
			return nil, usagef("scenario: %v", err)
		}
		defer f.Close()
		in = f
	}
	data, err := io.ReadAll(io.LimitReader(in, maxScenarioBytes+1))
	if err != nil {
		return nil, usagef("scenario %s: %v", path, err)
	}
	if len(data) > maxScenarioBytes {
		return nil, usagef("scenario %s: larger than %d MiB", path, maxScenarioBytes>>20)
	}
	req, err := decodeScenario(data, path)
	if err != nil {
		return nil, usageError{err}
	}
	return req, nil
}

// decodeScenario turns the text of a scenario file into the request. The
// format is YAML or JSON, by the name's extension (.yaml, .yml, .json) or,
// without one, by the content (JSON starts with '{'). Unknown fields are an
// error that names each one by its path, with the nearest known name.
func decodeScenario(data []byte, name string) (*thzdrivev1.PlanExperimentRequest, error) {
	if name == "" {
		name = "scenario"
	}
	trimmed := bytes.TrimSpace(data)
	if len(trimmed) == 0 {
		return nil, fmt.Errorf("%s: empty scenario", name)
	}
	var jsonText []byte
	switch ext := strings.ToLower(filepath.Ext(name)); {
	case ext == ".json" || (ext != ".yaml" && ext != ".yml" && trimmed[0] == '{'):
		jsonText = trimmed
	default:
		j, err := yaml.YAMLToJSON(data)
		if err != nil {
			return nil, fmt.Errorf("%s: not valid YAML: %v", name, err)
		}
		jsonText = j
	}
	dec := json.NewDecoder(bytes.NewReader(jsonText))
	dec.UseNumber()
	var doc any
	if err := dec.Decode(&doc); err != nil {
		return nil, fmt.Errorf("%s: not valid JSON: %v", name, err)
	}
	if dec.More() {
		return nil, fmt.Errorf("%s: more than one document", name)
	}
	req := &thzdrivev1.PlanExperimentRequest{}
	if _, ok := doc.(map[string]any); !ok {
		return nil, fmt.Errorf("%s: a scenario is a mapping of PlanExperimentRequest fields (%s), not %s",
			name, strings.Join(fieldNames(req.ProtoReflect().Descriptor()), ", "), describeJSON(doc))
	}
	var problems []string
	checkMessage(req.ProtoReflect().Descriptor(), doc, "", &problems)
	if len(problems) > 0 {
		return nil, fmt.Errorf("%s:\n  %s", name, strings.Join(problems, "\n  "))
	}
	if err := (protojson.UnmarshalOptions{}).Unmarshal(jsonText, req); err != nil {
		return nil, fmt.Errorf("%s: %v", name, err)
	}
	return req, nil
}

// checkMessage walks a decoded JSON value against a message descriptor and
// records, with their paths in proto field names, the fields the message
// does not have, values of the wrong type, unknown enum names and oneofs
// given twice. protojson would refuse these too, but without the path.
func checkMessage(md protoreflect.MessageDescriptor, v any, path string, problems *[]string) {
	if v == nil {
		return
	}
	obj, ok := v.(map[string]any)
	if !ok {
		*problems = append(*problems, fmt.Sprintf("%s: expected a mapping (%s), got %s", orTop(path), md.Name(), describeJSON(v)))
		return
	}
	keys := make([]string, 0, len(obj))
	for k := range obj {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	oneofSeen := map[protoreflect.FullName]string{}
	for _, k := range keys {
		fd := md.Fields().ByJSONName(k)
		if fd == nil {
			fd = md.Fields().ByName(protoreflect.Name(k))
		}
		if fd == nil {
			msg := fmt.Sprintf("%s: unknown field %q", join(path, k), k)
			if s := suggest(k, md); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			} else {
				msg += fmt.Sprintf(" (%s has %s)", md.Name(), strings.Join(fieldNames(md), ", "))
			}
			*problems = append(*problems, msg)
			continue
		}
		child := join(path, string(fd.Name()))
		if od := fd.ContainingOneof(); od != nil && !od.IsSynthetic() && obj[k] != nil {
			if other, dup := oneofSeen[od.FullName()]; dup {
				*problems = append(*problems, fmt.Sprintf("%s: give only one of %s and %s", orTop(path), other, fd.Name()))
			}
			oneofSeen[od.FullName()] = string(fd.Name())
		}
		val := obj[k]
		switch {
		case fd.IsMap():
			// No map fields in the API; protojson checks them if one appears.
		case fd.IsList():
			if val == nil {
				continue
			}
			list, ok := val.([]any)
			if !ok {
				*problems = append(*problems, fmt.Sprintf("%s: expected a list, got %s", child, describeJSON(val)))
				continue
			}
			for i, e := range list {
				checkValue(fd, e, fmt.Sprintf("%s[%d]", child, i), problems)
			}
		default:
			checkValue(fd, val, child, problems)
		}
	}
}

func checkValue(fd protoreflect.FieldDescriptor, v any, path string, problems *[]string) {
	if v == nil {
		return
	}
	bad := func(want string) {
		*problems = append(*problems, fmt.Sprintf("%s: expected %s, got %s", path, want, describeJSON(v)))
	}
	switch fd.Kind() {
	case protoreflect.MessageKind, protoreflect.GroupKind:
		if strings.HasPrefix(string(fd.Message().FullName()), "google.protobuf.") {
			return // well-known types have their own JSON forms
		}
		checkMessage(fd.Message(), v, path, problems)
	case protoreflect.EnumKind:
		switch e := v.(type) {
		case string:
			if fd.Enum().Values().ByName(protoreflect.Name(e)) == nil {
				var names []string
				vals := fd.Enum().Values()
				for i := 0; i < vals.Len(); i++ {
					if vals.Get(i).Number() != 0 {
						names = append(names, string(vals.Get(i).Name()))
					}
				}
				*problems = append(*problems, fmt.Sprintf("%s: unknown value %q; use one of %s", path, e, strings.Join(names, ", ")))
			}
		case json.Number:
		default:
			bad("an enum name")
		}
	case protoreflect.BoolKind:
		if _, ok := v.(bool); !ok {
			bad("true or false")
		}
	case protoreflect.StringKind, protoreflect.BytesKind:
		if _, ok := v.(string); !ok {
			bad("a string")
		}
	default: // numbers; protojson also accepts them quoted
		switch v.(type) {
		case json.Number, string:
		default:
			bad("a number")
		}
	}
}

func join(path, name string) string {
	if path == "" {
		return name
	}
	return path + "." + name
}

func orTop(path string) string {
	if path == "" {
		return "(top level)"
	}
	return path
}

func describeJSON(v any) string {
	switch x := v.(type) {
	case nil:
		return "nothing"
	case map[string]any:
		return "a mapping"
	case []any:
		return "a list"
	case string:
		if len(x) > 40 {
			x = x[:40] + "…"
		}
		return fmt.Sprintf("the text %q", x)
	case bool:
		return fmt.Sprintf("%v", x)
	case json.Number:
		return "the number " + x.String()
	}
	return fmt.Sprintf("%T", v)
}

func fieldNames(md protoreflect.MessageDescriptor) []string {
	var out []string
	for i := 0; i < md.Fields().Len(); i++ {
		out = append(out, string(md.Fields().Get(i).Name()))
	}
	return out
}

// suggest returns the field of md nearest to the unknown key k: a field
// that is k plus a unit suffix ("thickness" -> "thickness_um"), or one
// within a small edit distance of k written in snake case.
func suggest(k string, md protoreflect.MessageDescriptor) string {
	key := snake(k)
	best, bestD := "", 0
	for _, name := range fieldNames(md) {
		if strings.HasPrefix(name, key+"_") {
			return name
		}
		d := editDistance(key, name)
		if best == "" || d < bestD {
			best, bestD = name, d
		}
	}
	if best != "" && bestD <= max(2, len(key)/3) {
		return best
	}
	return ""
}

// snake turns camelCase into snake_case.
func snake(s string) string {
	var b strings.Builder
	for i, r := range s {
		if r >= 'A' && r <= 'Z' {
			if i > 0 {
				b.WriteByte('_')
			}
			r += 'a' - 'A'
		}
		b.WriteRune(r)
	}
	return b.String()
}

func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	if len(ra) > 64 || len(rb) > 64 {
		return max(len(ra), len(rb))
	}
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			c := 1
			if ra[i-1] == rb[j-1] {
				c = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+c)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
