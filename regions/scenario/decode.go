package scenario

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"reflect"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"gainscape/regions/spec"
)

// maxFileSize bounds what Decode reads. A scenario is a few hundred
// bytes; the bound keeps a wrong file, an image or a log, from being read
// whole, and bounds the work of finding the line of each key, which the
// TOML reader does by scanning the whole text.
const maxFileSize = 64 << 10

// Load reads the scenario file at path; see Decode. The origins name the
// file by path, so that ResolvePaths takes its output paths relative to
// path's folder.
func Load(path string) (Scenario, error) {
	f, err := openFile(path)
	if err != nil {
		return Scenario{}, err
	}
	defer f.Close()
	return Decode(f, path)
}

// openFile opens a scenario file, an *Error naming it if it cannot.
func openFile(path string) (*os.File, error) {
	f, err := os.Open(path)
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return nil, &Error{File: path, Msg: "cannot be opened: " + err.Error()}
	}
	return f, nil
}

// readText reads the text of a scenario file named name from r and
// checks it against the bounds of size and nesting before the TOML
// reader sees it.
func readText(r io.Reader, name string) ([]byte, error) {
	data, err := io.ReadAll(io.LimitReader(r, maxFileSize+1))
	if err != nil {
		return nil, &Error{File: name, Msg: fmt.Sprintf("cannot be read: %v", err)}
	}
	if len(data) > maxFileSize {
		return nil, &Error{File: name, Msg: fmt.Sprintf("is larger than %d bytes; a scenario file is a short TOML text", maxFileSize)}
	}
	if line := nesting(data); line > 0 {
		return nil, &Error{File: name, Line: line,
			Msg: fmt.Sprintf("nested deeper than %d levels of arrays, tables and dotted keys; a scenario needs at most 4", MaxNesting)}
	}
	return data, nil
}

// Decode reads a scenario file from r; name is the file name for
// messages and, for ResolvePaths, the file's path. Keys the file leaves
// out keep their values from Default.
//
// Decode checks the size and nesting of the text before the TOML reader
// sees it, then TOML syntax, the schema version, key names (which are
// case-sensitive) and value types. It stops at the first problem it meets
// and returns it as an *Error naming the file, the key and, where the
// TOML reader knows it, the line; unknown keys are reported together,
// joined, at most three. It records in Origins the file and line of each
// key given, and the file itself under the empty key. Within a table the order of the checks is not the order of the
// lines, so of two wrong values either may be reported. It does not check
// that the scenario is complete or consistent, because command-line flags
// may still complete or override it: call Validate on the final scenario.
func Decode(r io.Reader, name string) (Scenario, error) {
	fail := func(key, format string, args ...any) (Scenario, error) {
		return Scenario{}, &Error{File: name, Key: key, Msg: fmt.Sprintf(format, args...)}
	}
	data, err := readText(r, name)
	if err != nil {
		return Scenario{}, err
	}
	var top struct {
		Schema   toml.Primitive `toml:"schema"`
		Loop     toml.Primitive `toml:"loop"`
		Axes     toml.Primitive `toml:"axes"`
		Fixed    toml.Primitive `toml:"fixed"`
		Overlays toml.Primitive `toml:"overlays"`
		Output   toml.Primitive `toml:"output"`
	}
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&top)
	if err != nil {
		return Scenario{}, fromTOML(name, err, "TOML syntax: ")
	}
	s := Default()
	var fixed map[string]number
	var markTables []bool
	bind := bindings(&s, &markTables)
	line := keyLine(data)
	if err := checkCase(name, md.Keys(), bind, line); err != nil {
		return Scenario{}, err
	}
	if !md.IsDefined("schema") {
		return fail("schema", "missing; a scenario file starts with schema = %d", Version)
	}
	if err := md.PrimitiveDecode(top.Schema, &checkSchema{}); err != nil {
		return Scenario{}, fromTOML(name, err, "")
	}
	tables := []table{
		{"loop", top.Loop, bind["loop"]},
		{"axes", top.Axes, bind["axes"]},
		{"fixed", top.Fixed, &fixed},
		{"overlays", top.Overlays, bind["overlays"]},
		{"output", top.Output, bind["output"]},
	}
	if err := decodeTables(&md, name, tables); err != nil {
		return Scenario{}, err
	}
	if err := unknownKeys(name, md.Undecoded(), bind, line); err != nil {
		return Scenario{}, err
	}
	if len(fixed) > MaxFixed {
		return fail("fixed", "%d values; a scenario fixes at most %d parameters", len(fixed), MaxFixed)
	}
	s.Fixed = inFileOrder(fixed, md.Keys())
	orderMarks(s.Overlays.Marks, markTables, md.Keys())
	s.Origins = Origins{"": {File: name}, "schema": {File: name, Line: lineOf(&md, top.Schema)}}
	recordTables(s.Origins, &md, name, tables)
	return s, nil
}

// table is one top-level table of a scenario file: its name, its
// undecoded value and where it decodes to.
type table struct {
	name string
	prim toml.Primitive
	into any
}

// decodeTables decodes each table given in the file into its binding,
// refusing a key of that name that is not a table.
func decodeTables(md *toml.MetaData, file string, tables []table) error {
	for _, t := range tables {
		if !md.IsDefined(t.name) {
			continue
		}
		// A table made implicitly, by [overlays.x] or [[overlays.marks]]
		// alone, has no type of its own.
		if typ := md.Type(t.name); typ != "Hash" && typ != "" {
			return &Error{File: file, Key: t.name, Msg: fmt.Sprintf("expected a table [%s], found %s", t.name, tomlType(typ))}
		}
		if err := md.PrimitiveDecode(t.prim, t.into); err != nil {
			return fromTOML(file, err, "")
		}
	}
	return nil
}

// recordTables records in o the file and line of each key of the tables
// given in the file.
func recordTables(o Origins, md *toml.MetaData, file string, tables []table) {
	for _, t := range tables {
		if md.IsDefined(t.name) {
			recordLines(o, md, file, t.name, t.prim)
		}
	}
}

// recordLines records in o the file and line of each key of the table.
func recordLines(o Origins, md *toml.MetaData, file, table string, prim toml.Primitive) {
	var keys map[string]toml.Primitive
	if md.PrimitiveDecode(prim, &keys) != nil {
		return
	}
	for k, p := range keys {
		o[toml.Key{table, k}.String()] = Origin{File: file, Line: lineOf(md, p)}
	}
}

// lineOf returns the line of the key whose value is prim, 0 if unknown.
// The TOML reader keeps the position of every key but shows it only in
// the errors of decoding, so lineOf decodes the value into lineProbe,
// which always fails, and reads the line off the error.
func lineOf(md *toml.MetaData, prim toml.Primitive) int {
	var pe toml.ParseError
	if errors.As(md.PrimitiveDecode(prim, lineProbe{}), &pe) {
		return pe.Position.Line
	}
	return 0
}

// lineProbe refuses every value; see lineOf.
type lineProbe struct{}

// UnmarshalTOML implements toml.Unmarshaler.
func (lineProbe) UnmarshalTOML(any) error { return errLineProbe }

var errLineProbe = errors.New("line probe")

// bindings returns, for each table whose keys are fixed, a pointer to a
// struct whose tagged fields write the keys' values into s. The tags are
// the schema; SCHEMA.md documents them.
func bindings(s *Scenario, markTables *[]bool) map[string]any {
	l, a, v, o := &s.Loop, &s.Axes, &s.Overlays, &s.Output
	return map[string]any{
		"loop": &struct {
			Plant       intoString  `toml:"plant"`
			Numerator   intoNumbers `toml:"numerator"`
			Denominator intoNumbers `toml:"denominator"`
			Controller  intoString  `toml:"controller"`
			TimeUnit    intoString  `toml:"time_unit"`
			Sample      intoNumber  `toml:"sample"`
			Integral    intoString  `toml:"integral"`
			Prewarp     intoNumber  `toml:"prewarp"`
			Pade        intoInt     `toml:"pade"`
		}{intoString{&l.Plant}, intoNumbers{&l.Numerator}, intoNumbers{&l.Denominator}, intoString{&l.Controller}, intoString{&l.TimeUnit},
			intoNumber{&l.Sample}, intoString{&l.Integral}, intoNumber{&l.Prewarp}, intoInt{&l.Pade}},
		"axes": &struct {
			X    intoAxis `toml:"x"`
			Y    intoAxis `toml:"y"`
			Grid intoGrid `toml:"grid"`
		}{intoAxis{&a.X}, intoAxis{&a.Y}, intoGrid{&a.Columns, &a.Rows}},
		"overlays": &struct {
			Decay         intoBool    `toml:"decay"`
			DecayLevels   intoNumbers `toml:"decay_levels"`
			DampingLevels intoNumbers `toml:"damping_levels"`
			MsLevels      intoNumbers `toml:"ms_levels"`
			MsBound       intoNumber  `toml:"ms_bound"`
			Marks         intoMarks   `toml:"marks"`
			Best          intoStrings `toml:"best"`
			Compare       intoNumbers `toml:"compare_samples"`
		}{intoBool{&v.Decay}, intoNumbers{&v.DecayLevels}, intoNumbers{&v.DampingLevels}, intoNumbers{&v.MsLevels},
			intoNumber{&v.MsBound}, intoMarks{&v.Marks, markTables}, intoStrings{&v.Best}, intoNumbers{&v.CompareSamples}},
		"output": &struct {
			Image    intoString `toml:"image"`
			Data     intoString `toml:"data"`
			CSV      intoString `toml:"csv"`
			Note     intoString `toml:"note"`
			Title    intoString `toml:"title"`
			WidthCm  intoNumber `toml:"width_cm"`
			HeightCm intoNumber `toml:"height_cm"`
			DPI      intoInt    `toml:"dpi"`
		}{intoString{&o.Image}, intoString{&o.Data}, intoString{&o.CSV}, intoString{&o.Note}, intoString{&o.Title},
			intoNumber{&o.WidthCm}, intoNumber{&o.HeightCm}, intoInt{&o.DPI}},
	}
}

// topKeys are the keys of the top level.
var topKeys = []string{"schema", "loop", "axes", "fixed", "overlays", "output"}

// keysOf returns the keys a table accepts, in schema order: the tags of
// its binding struct.
func keysOf(binding any) []string {
	t := reflect.TypeOf(binding).Elem()
	keys := make([]string, t.NumField())
	for i := range keys {
		keys[i] = t.Field(i).Tag.Get("toml")
	}
	return keys
}

// checkCase rejects a key that differs from a schema key only in letter
// case. The TOML reader would match it to the field anyway; the schema is
// case-sensitive so that a file has one spelling.
func checkCase(file string, keys []toml.Key, bind map[string]any, line func(toml.Key) int) error {
	for _, k := range keys {
		var known []string
		switch {
		case len(k) == 1:
			known = topKeys
		case len(k) == 2 && bind[k[0]] != nil:
			known = keysOf(bind[k[0]])
		default:
			continue
		}
		last := k[len(k)-1]
		for _, name := range known {
			if last != name && strings.EqualFold(last, name) {
				want := append(append(toml.Key(nil), k[:len(k)-1]...), name)
				return &Error{File: file, Line: line(k), Key: k.String(), Msg: fmt.Sprintf("unknown key; keys are lower case: write %q", want.String())}
			}
		}
	}
	return nil
}

// unknownKeys reports the keys the decoding left undecoded, outermost
// only: a key under an unknown table is not reported again. Keys inside
// the tables of overlays.marks are checked by intoMarks, which the
// reader does not tell about them. The keys shown get their lines from
// line; the others are only counted.
func unknownKeys(file string, undecoded []toml.Key, bind map[string]any, line func(toml.Key) int) error {
	var errs []error
	reported := map[string]bool{}
	var shown []toml.Key
	for _, k := range undecoded {
		if len(k) >= 3 && k[0] == "overlays" && k[1] == "marks" {
			continue
		}
		if under(k, reported) {
			continue
		}
		key := k.String()
		reported[key] = true
		var msg string
		if len(k) == 1 {
			msg = "unknown key; the top level holds schema and the tables [loop], [axes], [fixed], [overlays] and [output]"
		} else if b := bind[k[0]]; b != nil && len(k) == 2 {
			msg = fmt.Sprintf("unknown key; [%s] holds %s", k[0], strings.Join(keysOf(b), ", "))
		} else {
			msg = "unknown key"
		}
		if len(shown) < maxReported {
			shown = append(shown, k)
		}
		errs = append(errs, &Error{File: file, Key: key, Msg: msg})
	}
	for i, k := range shown {
		errs[i].(*Error).Line = line(k)
	}
	return joinReported(file, errs)
}

// keyLine returns a function giving the line of a key of the TOML text
// data, or 0. It reads the text once more, the first time it is asked,
// into tables of undecoded values, which the keys the schema does not
// know need to be found.
func keyLine(data []byte) func(toml.Key) int {
	var md toml.MetaData
	var top map[string]toml.Primitive
	read := false
	return func(k toml.Key) int {
		if !read {
			read = true
			var err error
			if md, err = toml.NewDecoder(bytes.NewReader(data)).Decode(&top); err != nil {
				top = nil
			}
		}
		prim, ok := top[k[0]]
		for _, part := range k[1:] {
			var table map[string]toml.Primitive
			if !ok || md.PrimitiveDecode(prim, &table) != nil {
				return 0
			}
			prim, ok = table[part]
		}
		if !ok {
			return 0
		}
		return lineOf(&md, prim)
	}
}

// under reports whether key or one of the tables it lies in is among the
// keys reported, which are written as Key.String writes them.
func under(key toml.Key, reported map[string]bool) bool {
	for n := 1; n <= len(key); n++ {
		if reported[key[:n].String()] {
			return true
		}
	}
	return false
}

// inFileOrder returns the [fixed] values in the order the file lists them.
func inFileOrder(fixed map[string]number, keys []toml.Key) []spec.Value {
	var out []spec.Value
	for _, k := range keys {
		if len(k) == 2 && k[0] == "fixed" {
			if v, ok := fixed[k[1]]; ok {
				out = append(out, spec.Value{Param: k[1], V: float64(v)})
				delete(fixed, k[1])
			}
		}
	}
	return out
}

// orderMarks puts the names of the points given as tables in the order
// they first appear in the file; the reader delivers tables unordered.
func orderMarks(marks [][]spec.Value, tables []bool, keys []toml.Key) {
	rank := map[string]int{}
	for _, k := range keys {
		if len(k) == 3 && k[0] == "overlays" && k[1] == "marks" {
			if _, ok := rank[k[2]]; !ok {
				rank[k[2]] = len(rank)
			}
		}
	}
	for i, m := range marks {
		if tables[i] {
			sort.SliceStable(m, func(a, b int) bool { return rank[m[a].Param] < rank[m[b].Param] })
		}
	}
}

// fromTOML turns an error of the TOML reader into an *Error. Decoding
// errors carry the key; syntax errors carry only the line, and the key
// the reader last saw is not necessarily the one at fault.
func fromTOML(file string, err error, syntax string) error {
	var pe toml.ParseError
	if !errors.As(err, &pe) {
		return &Error{File: file, Msg: strings.TrimPrefix(err.Error(), "toml: ")}
	}
	e := &Error{File: file, Line: pe.Position.Line, Msg: syntax + pe.Message}
	if syntax == "" {
		e.Key = pe.LastKey
	}
	return e
}
