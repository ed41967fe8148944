package scenario

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"unicode/utf8"

	"gainscape/regions/spec"
)

// The types below bind one TOML key to the field of a Scenario it fills.
// Each accepts one kind of TOML value and rejects every other kind with a
// message saying what was expected and what was found; the TOML reader
// adds the key and the line. Empty arrays leave the field nil.

// intoString reads a string.
type intoString struct{ p *string }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoString) UnmarshalTOML(v any) error {
	s, ok := v.(string)
	if !ok {
		return expected("a string", v)
	}
	*d.p = s
	return nil
}

// intoNumber reads an integer or a float.
type intoNumber struct{ p *float64 }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoNumber) UnmarshalTOML(v any) error {
	x, ok := toNumber(v)
	if !ok {
		return expected("a number", v)
	}
	*d.p = x
	return nil
}

// intoInt reads a whole number.
type intoInt struct{ p *int }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoInt) UnmarshalTOML(v any) error {
	n, ok := v.(int64)
	if !ok || n < math.MinInt32 || n > math.MaxInt32 {
		return expected("a whole number", v)
	}
	*d.p = int(n)
	return nil
}

// number is a map value read like intoNumber; the [fixed] table is a map
// from parameter names to numbers.
type number float64

// UnmarshalTOML implements toml.Unmarshaler.
func (n *number) UnmarshalTOML(v any) error { return intoNumber{(*float64)(n)}.UnmarshalTOML(v) }

// intoBool reads true or false.
type intoBool struct{ p *bool }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoBool) UnmarshalTOML(v any) error {
	b, ok := v.(bool)
	if !ok {
		return expected("true or false", v)
	}
	*d.p = b
	return nil
}

// intoNumbers reads an array of numbers.
type intoNumbers struct{ p *[]float64 }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoNumbers) UnmarshalTOML(v any) error {
	list, ok := v.([]any)
	if !ok {
		return expected("an array of numbers such as [1.4, 2.0]", v)
	}
	var out []float64
	for i, e := range list {
		x, ok := toNumber(e)
		if !ok {
			return fmt.Errorf("element %d: %w", i+1, expected("a number", e))
		}
		out = append(out, x)
	}
	*d.p = out
	return nil
}

// intoStrings reads an array of strings.
type intoStrings struct{ p *[]string }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoStrings) UnmarshalTOML(v any) error {
	list, ok := v.([]any)
	if !ok {
		return expected(`an array of strings such as ["decay"]`, v)
	}
	var out []string
	for i, e := range list {
		s, ok := e.(string)
		if !ok {
			return fmt.Errorf("element %d: %w", i+1, expected("a string", e))
		}
		out = append(out, s)
	}
	*d.p = out
	return nil
}

// intoAxis reads an axis as the --x flag writes it, "kp=0:20", or as a
// table {param = "kp", min = 0, max = 20}.
type intoAxis struct{ p *spec.Axis }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoAxis) UnmarshalTOML(v any) error {
	switch v := v.(type) {
	case string:
		a, err := spec.ParseAxis(v)
		if err != nil {
			return err
		}
		*d.p = a
		return nil
	case map[string]any:
		var a spec.Axis
		fields := []struct {
			key  string
			into interface{ UnmarshalTOML(any) error }
		}{{"param", intoString{&a.Param}}, {"min", intoNumber{&a.Min}}, {"max", intoNumber{&a.Max}}}
		for _, f := range fields {
			x, ok := v[f.key]
			if !ok {
				return fmt.Errorf("the table has no key %q; it needs param, min and max", f.key)
			}
			if err := f.into.UnmarshalTOML(x); err != nil {
				return fmt.Errorf("%s: %w", f.key, err)
			}
		}
		if len(v) > len(fields) {
			for _, k := range sortedKeys(v) {
				if k != "param" && k != "min" && k != "max" {
					return fmt.Errorf("unknown key %q in the table; it takes param, min and max", k)
				}
			}
		}
		*d.p = a
		return nil
	}
	return expected(`a string such as "kp=0:20", or a table such as {param = "kp", min = 0, max = 20}`, v)
}

// intoGrid reads a grid size as the --grid flag writes it, "400x300".
type intoGrid struct{ columns, rows *int }

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoGrid) UnmarshalTOML(v any) error {
	s, ok := v.(string)
	if !ok {
		return expected(`a string such as "400x300"`, v)
	}
	c, r, err := spec.ParseGrid(s)
	if err != nil {
		return fmt.Errorf(`%w; expected nodes along x and along y, such as "400x300"`, err)
	}
	*d.columns, *d.rows = c, r
	return nil
}

// intoMarks reads an array of design points, each a string as the --mark
// flag writes it, "kp=2, ki=0.8", or a table {kp = 2, ki = 0.8}. The
// names of a table come out in alphabetical order; Decode restores the
// order of the file. tables records which points were tables.
type intoMarks struct {
	p      *[][]spec.Value
	tables *[]bool
}

// UnmarshalTOML implements toml.Unmarshaler.
func (d intoMarks) UnmarshalTOML(v any) error {
	var list []any
	switch v := v.(type) {
	case []any:
		list = v
	case []map[string]any:
		for _, t := range v {
			list = append(list, t)
		}
	default:
		return expected(`an array of points such as ["kp=2, ki=0.8"] or [{kp = 2, ki = 0.8}]`, v)
	}
	var out [][]spec.Value
	var tables []bool
	for i, e := range list {
		var vals []spec.Value
		switch e := e.(type) {
		case string:
			var err error
			if vals, err = spec.ParseValues(e); err != nil {
				return fmt.Errorf("point %d: %w", i+1, err)
			}
		case map[string]any:
			for _, k := range sortedKeys(e) {
				x, ok := toNumber(e[k])
				if !ok {
					return fmt.Errorf("point %d: %s: %w", i+1, k, expected("a number", e[k]))
				}
				vals = append(vals, spec.Value{Param: k, V: x})
			}
		default:
			return fmt.Errorf("point %d: %w", i+1, expected(`a string such as "kp=2, ki=0.8" or a table such as {kp = 2, ki = 0.8}`, e))
		}
		out = append(out, vals)
		tables = append(tables, isTable(e))
	}
	*d.p, *d.tables = out, tables
	return nil
}

// checkSchema accepts only the integer Version.
type checkSchema struct{}

// UnmarshalTOML implements toml.Unmarshaler.
func (checkSchema) UnmarshalTOML(v any) error {
	n, ok := v.(int64)
	if !ok {
		return expected(fmt.Sprintf("the integer %d", Version), v)
	}
	if n != Version {
		return fmt.Errorf("version %d is unknown; this gainscape reads schema %d", n, Version)
	}
	return nil
}

func isTable(v any) bool {
	_, ok := v.(map[string]any)
	return ok
}

func toNumber(v any) (float64, bool) {
	switch x := v.(type) {
	case int64:
		return float64(x), true
	case float64:
		return x, true
	}
	return 0, false
}

func sortedKeys(m map[string]any) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// expected returns the error "expected WHAT, found DESCRIPTION OF v".
func expected(what string, v any) error {
	return errors.New("expected " + what + ", found " + describe(v))
}

// describe names the kind of a decoded TOML value and, for a scalar, the
// value itself.
func describe(v any) string {
	switch v := v.(type) {
	case string:
		return "the string " + quoteShort(v)
	case int64:
		return "the integer " + strconv.FormatInt(v, 10)
	case float64:
		return "the number " + strconv.FormatFloat(v, 'g', -1, 64)
	case bool:
		return "the boolean " + strconv.FormatBool(v)
	case []map[string]any:
		return "an array of tables"
	case []any:
		return "an array"
	case map[string]any:
		return "a table"
	}
	return "a date or time"
}

// tomlType names a type as MetaData.Type reports it.
func tomlType(t string) string {
	switch t {
	case "Integer":
		return "an integer"
	case "Float":
		return "a number"
	case "String":
		return "a string"
	case "Bool":
		return "a boolean"
	case "Array":
		return "an array"
	case "ArrayHash":
		return "an array of tables"
	case "Datetime":
		return "a date or time"
	}
	return "a value of type " + t
}

// quoteShort quotes s, shortened to a readable length.
func quoteShort(s string) string {
	const max = 60
	if utf8.RuneCountInString(s) <= max {
		return strconv.Quote(s)
	}
	r := []rune(s)
	return strconv.Quote(string(r[:max])) + "..."
}

// finite reports whether x is neither NaN nor infinite.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
