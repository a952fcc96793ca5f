package manuscript

import (
	"errors"
	"fmt"
	"reflect"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"
)

// CheckKeys reports the first mapping key in n that has no field in the
// struct pointed to by out, with the closest valid key suggested. It
// descends into nested struct fields; types with their own UnmarshalYAML
// check themselves. Errors carry "line N:" relative to the YAML text.
func CheckKeys(n *yaml.Node, out any) error {
	return checkKeysType(n, reflect.TypeOf(out), "")
}

var unmarshalerType = reflect.TypeOf((*yaml.Unmarshaler)(nil)).Elem()

// checkKeysType checks n against type t; key names the value in messages.
func checkKeysType(n *yaml.Node, t reflect.Type, key string) error {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if reflect.PointerTo(t).Implements(unmarshalerType) {
		return nil // such types decode, and check, their own keys
	}
	if err := checkScalar(n, t, key); err != nil {
		return err
	}
	switch t.Kind() {
	case reflect.Struct:
		if n.Kind != yaml.MappingNode {
			return nil // a type error that Decode will report
		}
		fields := YamlFields(t)
		names := make([]string, 0, len(fields))
		for k := range fields {
			names = append(names, k)
		}
		sort.Strings(names)
		for i := 0; i+1 < len(n.Content); i += 2 {
			k := n.Content[i]
			ft, ok := fields[k.Value]
			if !ok {
				if now, was := FormerKeys(t)[k.Value]; was {
					return fmt.Errorf("line %d: the key %q is now called %q", k.Line, k.Value, now)
				}
				return fmt.Errorf("line %d: unknown key %q%s; valid keys: %s", k.Line, k.Value, DidYouMean(k.Value, names), strings.Join(names, ", "))
			}
			if err := checkKeysType(n.Content[i+1], ft, k.Value); err != nil {
				return err
			}
		}
	case reflect.Slice:
		if n.Kind == yaml.SequenceNode {
			for _, c := range n.Content {
				if err := checkKeysType(c, t.Elem(), key); err != nil {
					return err
				}
			}
		}
	case reflect.Map:
		if n.Kind == yaml.MappingNode {
			for i := 1; i < len(n.Content); i += 2 {
				if err := checkKeysType(n.Content[i], t.Elem(), n.Content[i-1].Value); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// checkScalar refuses a scalar that the decoder would take wrongly or
// report in its own words: a fraction for a whole number (which the
// decoder would truncate), text for a number or a switch.
func checkScalar(n *yaml.Node, t reflect.Type, key string) error {
	if n.Kind != yaml.ScalarNode || n.ShortTag() == "!!null" {
		return nil
	}
	what := "this key"
	if key != "" {
		what = key
	}
	tag := n.ShortTag()
	switch t.Kind() {
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64,
		reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		if tag != "!!int" {
			return fmt.Errorf("line %d: %s takes a whole number, not %q", n.Line, what, n.Value)
		}
	case reflect.Float32, reflect.Float64:
		if tag != "!!int" && tag != "!!float" {
			return fmt.Errorf("line %d: %s takes a number, not %q", n.Line, what, n.Value)
		}
	case reflect.Bool:
		if tag != "!!bool" {
			return fmt.Errorf("line %d: %s takes true or false, not %q", n.Line, what, n.Value)
		}
	}
	return nil
}

// eachYAMLField calls visit with the YAML key of each exported field of
// the struct type t (or of what t points to), following ",inline" and
// skipping fields tagged "-"; a field without a name in its tag has its
// lower-cased Go name, as yaml.v3 gives it.
func eachYAMLField(t reflect.Type, visit func(key string, f reflect.StructField)) {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t.Kind() != reflect.Struct {
		return
	}
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		if !f.IsExported() {
			continue
		}
		tag := f.Tag.Get("yaml")
		if tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		if strings.Contains(opts, "inline") {
			eachYAMLField(f.Type, visit)
			continue
		}
		if name == "" {
			name = strings.ToLower(f.Name)
		}
		visit(name, f)
	}
}

// YamlFields maps YAML keys to field types, following ",inline".
func YamlFields(t reflect.Type) map[string]reflect.Type {
	out := map[string]reflect.Type{}
	eachYAMLField(t, func(key string, f reflect.StructField) { out[key] = f.Type })
	return out
}

// FormerKeys maps the retired names of a struct's YAML keys to their
// current ones, following ",inline". A field lists its former names in a
// formerly tag, comma-separated:
//
//	Replications *int `yaml:"replications" formerly:"reps"`
//
// CheckKeys refuses a former name with an error that names the current
// one, as the registry does for a kind's former names.
func FormerKeys(t reflect.Type) map[string]string {
	out := map[string]string{}
	eachYAMLField(t, func(key string, f reflect.StructField) {
		for _, old := range strings.Split(f.Tag.Get("formerly"), ",") {
			if old = strings.TrimSpace(old); old != "" {
				out[old] = key
			}
		}
	})
	return out
}

var yamlLineRE = regexp.MustCompile(`line (\d+)`)

// YamlError turns a yaml.v3 error (with lines relative to the YAML text)
// into a PosError with the file line; base is the file line of YAML line 1.
func YamlError(file string, base int, err error) error {
	msg := err.Error()
	msg = strings.TrimPrefix(msg, "yaml: ")
	msg = strings.TrimPrefix(msg, "unmarshal errors:\n  ")
	line := base // an error the decoder gives no line (excessive aliasing) is put at the block's start
	if m := yamlLineRE.FindStringSubmatchIndex(msg); m != nil {
		l, _ := strconv.Atoi(msg[m[2]:m[3]])
		line = base + l - 1
		msg = strings.TrimSpace(msg[:m[0]] + msg[m[1]:])
		msg = strings.TrimPrefix(msg, ":")
		msg = strings.TrimSpace(msg)
		// Further line numbers in the message ("already defined at line
		// 3") become file lines too.
		msg = yamlLineRE.ReplaceAllStringFunc(msg, func(s string) string {
			l, _ := strconv.Atoi(yamlLineRE.FindStringSubmatch(s)[1])
			return "line " + strconv.Itoa(base+l-1)
		})
	}
	var te *yaml.TypeError
	if errors.As(err, &te) && len(te.Errors) > 1 {
		msg = strings.ReplaceAll(msg, "\n", ";")
	}
	return &PosError{File: file, Line: line, Msg: msg}
}
