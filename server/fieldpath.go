package server

import (
	"fmt"
	"strconv"
	"strings"

	"google.golang.org/protobuf/reflect/protoreflect"
)

// pathSegment is one step of a field path: a field name and, for a repeated
// field, an element index.
type pathSegment struct {
	name  string
	index int // -1 when the segment has no [i]
}

// parsePath splits "sample.layers[0].thickness_um" into segments.
func parsePath(path string) ([]pathSegment, error) {
	if path == "" {
		return nil, fmt.Errorf("empty parameter path")
	}
	var segs []pathSegment
	for _, part := range strings.Split(path, ".") {
		seg := pathSegment{name: part, index: -1}
		if i := strings.IndexByte(part, '['); i >= 0 {
			if !strings.HasSuffix(part, "]") {
				return nil, fmt.Errorf("%q: unclosed index in %q", path, part)
			}
			n, err := strconv.Atoi(part[i+1 : len(part)-1])
			if err != nil || n < 0 {
				return nil, fmt.Errorf("%q: bad index in %q", path, part)
			}
			seg.name, seg.index = part[:i], n
		}
		if seg.name == "" {
			return nil, fmt.Errorf("%q: empty field name", path)
		}
		segs = append(segs, seg)
	}
	return segs, nil
}

// setNumber sets the numeric field at path in m to x. Intermediate messages
// are created as needed (setting a field of a oneof selects it); list
// elements must already exist. Only double, float and integer fields can be
// set, and an integer field only to a whole number.
func setNumber(m protoreflect.Message, path string, x float64) error {
	segs, err := parsePath(path)
	if err != nil {
		return err
	}
	for i, seg := range segs {
		fd := m.Descriptor().Fields().ByName(protoreflect.Name(seg.name))
		if fd == nil {
			return fmt.Errorf("%q: %s has no field %q", path, m.Descriptor().Name(), seg.name)
		}
		last := i == len(segs)-1
		if fd.IsList() != (seg.index >= 0) {
			if fd.IsList() {
				return fmt.Errorf("%q: %q is a list: give an element index like %s[0]", path, seg.name, seg.name)
			}
			return fmt.Errorf("%q: %q is not a list", path, seg.name)
		}
		if fd.IsMap() {
			return fmt.Errorf("%q: maps are not supported", path)
		}
		if last {
			if seg.index >= 0 {
				l := m.Mutable(fd).List()
				if seg.index >= l.Len() {
					return fmt.Errorf("%q: %q has %d elements", path, seg.name, l.Len())
				}
				v, err := numberValue(fd, x, path)
				if err != nil {
					return err
				}
				l.Set(seg.index, v)
				return nil
			}
			v, err := numberValue(fd, x, path)
			if err != nil {
				return err
			}
			m.Set(fd, v)
			return nil
		}
		if fd.Kind() != protoreflect.MessageKind {
			return fmt.Errorf("%q: %q is a number, not a message", path, seg.name)
		}
		if seg.index >= 0 {
			l := m.Mutable(fd).List()
			if seg.index >= l.Len() {
				return fmt.Errorf("%q: %q has %d elements", path, seg.name, l.Len())
			}
			m = l.Get(seg.index).Message()
		} else {
			m = m.Mutable(fd).Message()
		}
	}
	return nil
}

func numberValue(fd protoreflect.FieldDescriptor, x float64, path string) (protoreflect.Value, error) {
	switch fd.Kind() {
	case protoreflect.DoubleKind:
		return protoreflect.ValueOfFloat64(x), nil
	case protoreflect.FloatKind:
		return protoreflect.ValueOfFloat32(float32(x)), nil
	case protoreflect.Int32Kind, protoreflect.Sint32Kind, protoreflect.Sfixed32Kind:
		if x != float64(int32(x)) {
			return protoreflect.Value{}, fmt.Errorf("%q is a whole number; %g is not", path, x)
		}
		return protoreflect.ValueOfInt32(int32(x)), nil
	case protoreflect.Int64Kind, protoreflect.Sint64Kind, protoreflect.Sfixed64Kind:
		if x != float64(int64(x)) {
			return protoreflect.Value{}, fmt.Errorf("%q is a whole number; %g is not", path, x)
		}
		return protoreflect.ValueOfInt64(int64(x)), nil
	}
	return protoreflect.Value{}, fmt.Errorf("%q is a %s field; a sweep sets numbers only", path, fd.Kind())
}
