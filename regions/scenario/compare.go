package scenario

import (
	"bytes"
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"gainscape/regions/spec"
)

// Compare is a comparison of controller structures side by side, as a
// compare scenario file holds it: a shared plant and sample time, the
// settings every panel takes, a section per panel and the output files.
// Its keys are described in SCHEMA.md.
type Compare struct {
	// Loop is the shared plant, its time unit, and a digital
	// controller's sample time and integral rule; its Controller is not
	// used (each panel names its own).
	Loop     Loop
	Settings CompareSettings
	Panels   []Panel
	Output   CompareOutput
	// Origins says where each value was given, as for Scenario; panel
	// keys are written "panels.2.controller", panels counted from 1.
	Origins Origins
}

// CompareSettings are the settings every panel takes.
type CompareSettings struct {
	// Columns and Rows are each panel's grid (grid = "240x180").
	Columns, Rows int
	// MsBound is the Ms limit of the searches, 0 for the default 1.4.
	MsBound float64
	// MsLevels are the Ms iso-lines drawn; Decay shades by decay rate.
	MsLevels []float64
	Decay    bool
	// KdRange, when it has two values, is the range of the search over
	// kd for structures with a derivative gain.
	KdRange []float64
	// FigureColumns is the number of panels per row of the figure; 0
	// chooses.
	FigureColumns int
}

// Panel is one panel: a controller structure in the plane of two of its
// parameters with the others fixed, on the shared plant or its own.
type Panel struct {
	Controller string
	// Plant, or Numerator and Denominator, replace the shared plant for
	// this panel (a worn plant beside the nominal one); PlantLabel names
	// it in titles.
	Plant                  string
	Numerator, Denominator []float64
	PlantLabel             string
	// Sample replaces the shared sample time when HasSample is set (0:
	// a continuous controller).
	Sample    float64
	HasSample bool
	Fixed     []spec.Value
	// X and Y are the axes as --x takes them: "kp=0:5", or "kp" for a
	// range chosen by the window rule; empty for the structure's first
	// and second parameters, ranges chosen.
	X, Y string
}

// CompareOutput names the files a comparison writes.
type CompareOutput struct {
	Image     string // the panels figure, .png, .svg or .pdf
	Data      string // the comparison as JSON, .json
	Note      string // a Markdown block with the table, .md or .txt
	Responses string // the step responses figure, .png, .svg or .pdf
	Title     string
	WidthCm   float64 // 0: the figure's natural size
	HeightCm  float64
	DPI       int
}

// DefaultCompare returns the comparison an empty file describes, apart
// from the plant and the panels, which have no default.
func DefaultCompare() Compare {
	return Compare{
		Loop:     Loop{TimeUnit: "s"},
		Settings: CompareSettings{MsLevels: []float64{1.4, 2.0}},
		Output:   CompareOutput{Image: "gainscape-compare.png", DPI: 200},
	}
}

// LoadCompare reads the compare scenario file at path; see DecodeCompare.
func LoadCompare(path string) (Compare, error) {
	f, err := openFile(path)
	if err != nil {
		return Compare{}, err
	}
	defer f.Close()
	return DecodeCompare(f, path)
}

// DecodeCompare reads a compare scenario from r; name is the file name
// for messages and the folder of its output paths. Decoding is as strict
// as Decode's: the size and nesting bounds, the schema version, known
// keys in lower case and values of the right type, each problem an
// *Error naming the file, the key and, where known, the line. It does not
// check that the comparison is complete: call Validate.
func DecodeCompare(r io.Reader, name string) (Compare, error) {
	fail := func(key, format string, args ...any) (Compare, error) {
		return Compare{}, &Error{File: name, Key: key, Msg: fmt.Sprintf(format, args...)}
	}
	data, err := readText(r, name)
	if err != nil {
		return Compare{}, err
	}
	var top struct {
		Schema  toml.Primitive   `toml:"schema"`
		Loop    toml.Primitive   `toml:"loop"`
		Compare toml.Primitive   `toml:"compare"`
		Panels  []toml.Primitive `toml:"panels"`
		Output  toml.Primitive   `toml:"output"`
	}
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&top)
	if err != nil {
		return Compare{}, fromTOML(name, err, "TOML syntax: ")
	}
	c := DefaultCompare()
	bind := compareBindings(&c)
	line := keyLine(data)
	if !md.IsDefined("schema") {
		return fail("schema", "missing; a scenario file starts with schema = %d", Version)
	}
	if err := md.PrimitiveDecode(top.Schema, &checkSchema{}); err != nil {
		return Compare{}, fromTOML(name, err, "")
	}
	tables := []table{
		{"loop", top.Loop, bind["loop"]},
		{"compare", top.Compare, bind["compare"]},
		{"output", top.Output, bind["output"]},
	}
	if err := decodeTables(&md, name, tables); err != nil {
		return Compare{}, err
	}
	if len(top.Panels) > maxPanels {
		return fail("panels", "%d panels; a comparison draws at most %d", len(top.Panels), maxPanels)
	}
	fixed := make([]map[string]number, len(top.Panels))
	for i, prim := range top.Panels {
		var p Panel
		if err := md.PrimitiveDecode(prim, panelBinding(&p, &fixed[i])); err != nil {
			e := fromTOML(name, err, "").(*Error)
			if e.Key != "" {
				k := strings.TrimPrefix(e.Key, "panels.")
				e.Key = fmt.Sprintf("panels.%d.%s", i+1, k)
				if l := panelLines(data, i)[k]; l > 0 {
					e.Line = l
				}
			}
			return Compare{}, e
		}
		c.Panels = append(c.Panels, p)
	}
	// Every table is decoded: what is left is unknown. The bookkeeping
	// below reads tables as maps, which marks their keys decoded.
	undecoded := md.Undecoded()
	if err := compareCheckCase(name, md.Keys(), bind, line); err != nil {
		return Compare{}, err
	}
	panelLine := func(k toml.Key) (int, int) {
		for i := range top.Panels {
			if l := panelLines(data, i)[k[1]]; l > 0 {
				return i + 1, l
			}
		}
		return 0, 0
	}
	if err := compareUnknownKeys(name, undecoded, bind, line, panelLine); err != nil {
		return Compare{}, err
	}
	c.Origins = Origins{"": {File: name}, "schema": {File: name, Line: lineOf(&md, top.Schema)}}
	recordTables(c.Origins, &md, name, tables)
	for i, prim := range top.Panels {
		key := fmt.Sprintf("panels.%d", i+1)
		p := &c.Panels[i]
		p.HasSample = definedIn(&md, prim, "sample")
		p.Fixed = sortedValues(fixed[i])
		// The reader keeps one position per key path, shared by every
		// table of the array, so the lines are read off the text.
		lines := panelLines(data, i)
		c.Origins[key] = Origin{File: name, Line: lines[""]}
		var keys map[string]toml.Primitive
		if md.PrimitiveDecode(prim, &keys) == nil {
			for k := range keys {
				c.Origins[key+"."+k] = Origin{File: name, Line: lines[k]}
			}
		}
	}
	return c, nil
}

// panelLines returns the line of the header of the n-th [[panels]]
// table (under "") and of each key written in it, from the text; a panel
// written as an inline table gets no lines (0).
func panelLines(data []byte, n int) map[string]int {
	out := map[string]int{}
	count, in := -1, false
	for i, line := range strings.Split(string(data), "\n") {
		t := strings.TrimSpace(line)
		switch {
		case strings.HasPrefix(t, "[["):
			if strings.TrimSpace(strings.Trim(t, "[] ")) == "panels" {
				count++
				in = count == n
				if in {
					out[""] = i + 1
				}
			} else {
				in = false
			}
			continue
		case strings.HasPrefix(t, "[panels."):
			continue
		case strings.HasPrefix(t, "["):
			in = false
			continue
		}
		if !in {
			continue
		}
		if name, _, ok := strings.Cut(t, "="); ok {
			if name = strings.TrimSpace(name); name != "" && out[name] == 0 {
				out[name] = i + 1
			}
		}
	}
	return out
}

// maxPanels is the most panels a file may hold, as study.MaxPanels.
const maxPanels = 9

// definedIn reports whether the table prim has the key k.
func definedIn(md *toml.MetaData, prim toml.Primitive, k string) bool {
	var keys map[string]toml.Primitive
	if md.PrimitiveDecode(prim, &keys) != nil {
		return false
	}
	_, ok := keys[k]
	return ok
}

// sortedValues returns a [fixed] map as values in the order of their
// names: the tables of an array reach the reader unordered.
func sortedValues(m map[string]number) []spec.Value {
	var out []spec.Value
	for k, v := range m {
		out = append(out, spec.Value{Param: k, V: float64(v)})
	}
	sort.Slice(out, func(a, b int) bool { return out[a].Param < out[b].Param })
	return out
}

// compareBindings binds the tables of a compare file to c.
func compareBindings(c *Compare) map[string]any {
	l, s, o := &c.Loop, &c.Settings, &c.Output
	return map[string]any{
		"loop": &struct {
			Plant       intoString  `toml:"plant"`
			Numerator   intoNumbers `toml:"numerator"`
			Denominator intoNumbers `toml:"denominator"`
			TimeUnit    intoString  `toml:"time_unit"`
			Sample      intoNumber  `toml:"sample"`
			Integral    intoString  `toml:"integral"`
		}{intoString{&l.Plant}, intoNumbers{&l.Numerator}, intoNumbers{&l.Denominator}, intoString{&l.TimeUnit}, intoNumber{&l.Sample}, intoString{&l.Integral}},
		"compare": &struct {
			Grid     intoGrid    `toml:"grid"`
			MsBound  intoNumber  `toml:"ms_bound"`
			MsLevels intoNumbers `toml:"ms_levels"`
			Decay    intoBool    `toml:"decay"`
			KdRange  intoNumbers `toml:"kd_range"`
			Columns  intoInt     `toml:"columns"`
		}{intoGrid{&s.Columns, &s.Rows}, intoNumber{&s.MsBound}, intoNumbers{&s.MsLevels}, intoBool{&s.Decay}, intoNumbers{&s.KdRange}, intoInt{&s.FigureColumns}},
		"output": &struct {
			Image     intoString `toml:"image"`
			Data      intoString `toml:"data"`
			Note      intoString `toml:"note"`
			Responses intoString `toml:"responses"`
			Title     intoString `toml:"title"`
			WidthCm   intoNumber `toml:"width_cm"`
			HeightCm  intoNumber `toml:"height_cm"`
			DPI       intoInt    `toml:"dpi"`
		}{intoString{&o.Image}, intoString{&o.Data}, intoString{&o.Note}, intoString{&o.Responses}, intoString{&o.Title},
			intoNumber{&o.WidthCm}, intoNumber{&o.HeightCm}, intoInt{&o.DPI}},
	}
}

// panelBinding binds the keys of one [[panels]] table to p.
func panelBinding(p *Panel, fixed *map[string]number) any {
	return &struct {
		Controller  intoString         `toml:"controller"`
		Plant       intoString         `toml:"plant"`
		Numerator   intoNumbers        `toml:"numerator"`
		Denominator intoNumbers        `toml:"denominator"`
		PlantLabel  intoString         `toml:"plant_label"`
		Sample      intoNumber         `toml:"sample"`
		Fixed       *map[string]number `toml:"fixed"`
		X           intoString         `toml:"x"`
		Y           intoString         `toml:"y"`
	}{intoString{&p.Controller}, intoString{&p.Plant}, intoNumbers{&p.Numerator}, intoNumbers{&p.Denominator}, intoString{&p.PlantLabel},
		intoNumber{&p.Sample}, fixed, intoString{&p.X}, intoString{&p.Y}}
}

// compareTopKeys are the keys of a compare file's top level.
var compareTopKeys = []string{"schema", "loop", "compare", "panels", "output"}

// compareCheckCase rejects a key that differs from a schema key only in
// letter case, as checkCase does for a map scenario.
func compareCheckCase(file string, keys []toml.Key, bind map[string]any, line func(toml.Key) int) error {
	for _, k := range keys {
		var known []string
		switch {
		case len(k) == 1:
			known = compareTopKeys
		case len(k) == 2 && k[0] == "panels":
			known = keysOf(panelBinding(&Panel{}, nil))
		case len(k) == 2 && bind[k[0]] != nil:
			known = keysOf(bind[k[0]])
		default:
			continue
		}
		last := k[len(k)-1]
		for _, name := range known {
			if last != name && strings.EqualFold(last, name) {
				return &Error{File: file, Line: line(k), Key: k.String(), Msg: fmt.Sprintf("unknown key; keys are lower case: write %q", name)}
			}
		}
	}
	return nil
}

// compareUnknownKeys reports keys the decoding left undecoded, outermost
// only, as unknownKeys does for a map scenario.
func compareUnknownKeys(file string, undecoded []toml.Key, bind map[string]any, line func(toml.Key) int, panelLine func(toml.Key) (int, int)) error {
	var errs []error
	reported := map[string]bool{}
	for _, k := range undecoded {
		if under(k, reported) {
			continue
		}
		reported[k.String()] = true
		var msg string
		switch {
		case len(k) == 1:
			msg = "unknown key; the top level holds " + strings.Join(compareTopKeys, ", ")
		case k[0] == "panels" && len(k) == 2:
			msg = "unknown key; a [[panels]] table holds " + strings.Join(keysOf(panelBinding(&Panel{}, nil)), ", ")
		case bind[k[0]] != nil && len(k) == 2:
			msg = fmt.Sprintf("unknown key; [%s] holds %s", k[0], strings.Join(keysOf(bind[k[0]]), ", "))
		default:
			msg = "unknown key"
		}
		e := &Error{File: file, Key: k.String(), Msg: msg}
		if len(errs) < maxReported {
			e.Line = line(k)
			if k[0] == "panels" && len(k) == 2 {
				if n, l := panelLine(k); l > 0 {
					e.Key, e.Line = fmt.Sprintf("panels.%d.%s", n, k[1]), l
				}
			}
		}
		errs = append(errs, e)
	}
	return joinReported(file, errs)
}
