package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestCompareRun runs a three-panel comparison of 1/(s+1)⁴ (a test
// process of Åström, Panagopoulos & Hägglund, Automatica 34(5), 1998)
// as a user would and checks the files against the interface scripts
// rely on: the panels' map fields as map --data writes them, the table
// and the responses, the note with its bound, source and caution.
func TestCompareRun(t *testing.T) {
	dir := t.TempDir()
	out, errs, code := runBinary(t, dir, "compare", "--plant", "1/(s+1)^4", "--ctrl", "pi,pid,lead", "--set", "pid:kd=1,tau=0.1",
		"--grid", "60x45", "-o", "cmp.svg", "--data", "cmp.json", "--note", "cmp.md", "--responses", "steps.pdf", "--kd-range", "0:2")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"panel 1     PI:", "window chosen:", "PID, kd = 1, tau = 0.1", "Ms ≤ 1.4", "Åström", "over kd 0…2", caution} {
		if !strings.Contains(out, want) {
			t.Errorf("report lacks %q:\n%s", want, out)
		}
	}
	var doc struct {
		MsBound float64 `json:"ms_bound"`
		Panels  []map[string]json.RawMessage
	}
	data, err := os.ReadFile(filepath.Join(dir, "cmp.json"))
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Panels) != 3 || doc.MsBound != 1.4 {
		t.Fatalf("%d panels, bound %g", len(doc.Panels), doc.MsBound)
	}
	for k, p := range doc.Panels {
		for _, key := range []string{"controller", "fixed", "x", "y", "rhp", "axis", "boundaries", "table", "responses"} {
			if _, ok := p[key]; !ok {
				t.Errorf("panel %d has no %q", k+1, key)
			}
		}
	}
	var table struct {
		BestKi    map[string]json.RawMessage `json:"best_ki"`
		BestDecay map[string]json.RawMessage `json:"best_decay"`
		MinMs     *float64                   `json:"min_ms"`
		Ultimate  struct{ Ku, Tu float64 }   `json:"ultimate"`
		Share     float64                    `json:"stable_share"`
		OverKd    *struct {
			Range  [2]float64         `json:"range"`
			Values map[string]float64 `json:"values"`
		} `json:"best_ki_over_kd"`
	}
	if err := json.Unmarshal(doc.Panels[1]["table"], &table); err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{"values", "ms", "gain_margin", "phase_margin_deg", "ie"} {
		if _, ok := table.BestKi[key]; !ok {
			t.Errorf("best_ki has no %q", key)
		}
	}
	for _, key := range []string{"values", "decay_rate", "min_damping", "ms"} {
		if _, ok := table.BestDecay[key]; !ok {
			t.Errorf("best_decay has no %q", key)
		}
	}
	// By hand: (jω+1)⁴ is real and negative at ω = 1, |·| = 4.
	if table.MinMs == nil || math.Abs(table.Ultimate.Ku-4) > 1e-9 || math.Abs(table.Ultimate.Tu-2*math.Pi) > 1e-9 || !(table.Share > 0) {
		t.Errorf("table %+v", table)
	}
	if table.OverKd == nil || table.OverKd.Range != [2]float64{0, 2} || table.OverKd.Values["kd"] < 0 || table.OverKd.Values["kd"] > 2 {
		t.Errorf("best over kd %+v", table.OverKd)
	}
	var resp map[string]*float64
	if err := json.Unmarshal(doc.Panels[0]["responses"], &resp); err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{"iae_load", "overshoot", "settling_time"} {
		if resp[key] == nil {
			t.Errorf("responses.%s missing", key)
		}
	}
	if string(doc.Panels[2]["responses"]) != "null" {
		t.Errorf("the lead panel has responses %s; it has no best-ki design", doc.Panels[2]["responses"])
	}
	note, err := os.ReadFile(filepath.Join(dir, "cmp.md"))
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"](cmp.svg)", "](steps.pdf)", "Ms ≤ 1.4", "Automatica 34(5), 1998", "| panel | best load design |", "> " + caution} {
		if !strings.Contains(string(note), want) {
			t.Errorf("note lacks %q", want)
		}
	}
	for _, f := range []string{"cmp.svg", "steps.pdf"} {
		if fi, err := os.Stat(filepath.Join(dir, f)); err != nil || fi.Size() == 0 {
			t.Errorf("%s: %v", f, err)
		}
	}
}

// TestCompareScenario runs a compare scenario file: a nominal and a worn
// plant (invented) under PI, with outputs beside the file.
func TestCompareScenario(t *testing.T) {
	dir := t.TempDir()
	file := `schema = 1
[loop]
plant = "1/(s+1)^4"
[compare]
grid = "50x40"
[[panels]]
controller = "pi"
plant_label = "nominal"
[[panels]]
controller = "pi"
plant = "0.5/(s+1)^4"
plant_label = "worn"
[output]
image = "worn.png"
data = "worn.json"
`
	path := filepath.Join(dir, "worn.toml")
	if err := os.WriteFile(path, []byte(file), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := runBinary(t, t.TempDir(), "compare", "--scenario", path, "--quiet")
	if code != 0 || out != "" {
		t.Fatalf("exit %d, output %q: %s", code, out, errs)
	}
	var doc struct {
		Panels []struct {
			Label string
			Table struct {
				BestKi struct{ Values map[string]float64 } `json:"best_ki"`
			}
		}
	}
	data, err := os.ReadFile(filepath.Join(dir, "worn.json"))
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	// Half the plant gain: every gain of the best design doubles.
	if len(doc.Panels) != 2 || doc.Panels[1].Label != "worn: PI" {
		t.Fatalf("panels %+v", doc.Panels)
	}
	if r := doc.Panels[1].Table.BestKi.Values["ki"] / doc.Panels[0].Table.BestKi.Values["ki"]; math.Abs(r-2) > 1e-4 {
		t.Errorf("ki ratio %g; want 2", r)
	}
	_, errs, code = runBinary(t, dir, "compare", "--scenario", path, "--ctrl", "pid")
	if code != 2 || !strings.Contains(errs, "--ctrl") {
		t.Errorf("a panel flag beside --scenario: exit %d, %q", code, errs)
	}
}

// TestComparePanels: the flags expand into panels as the help says.
func TestComparePanels(t *testing.T) {
	tests := []struct {
		name   string
		args   []string
		labels []string
	}{
		{"slices of kd", []string{"--ctrl", "pi,pid", "--slices", "kd=0,1", "--set", "tau=0.1"},
			[]string{"PI", "PID, kd = 0, tau = 0.1", "PID, kd = 1, tau = 0.1"}},
		{"sample times", []string{"--ctrl", "pi", "--slices", "sample=0,0.5"}, []string{"PI", "PI, T = 0.5 s"}},
		{"two plants", []string{"--plant", "worn=0.5/(s+1)^4", "--ctrl", "pi"}, []string{"PI", "worn: PI"}},
		{"scoped set", []string{"--ctrl", "pd,lead", "--set", "lead:p=20"}, []string{"PD", "Lead, p = 20"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			args := append([]string{"compare", "--plant", "1/(s+1)^4", "--grid", "30x25", "-o", "", "--data", "d.json", "--quiet", "--kd-range", "0:0"}, tc.args...)
			_, errs, code := runBinary(t, dir, args...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			var doc struct{ Panels []struct{ Label string } }
			data, _ := os.ReadFile(filepath.Join(dir, "d.json"))
			if err := json.Unmarshal(data, &doc); err != nil {
				t.Fatal(err)
			}
			var got []string
			for _, p := range doc.Panels {
				got = append(got, p.Label)
			}
			if !slices.Equal(got, tc.labels) {
				t.Errorf("panels %q; want %q", got, tc.labels)
			}
		})
	}
}

// TestCompareBadInputs: each mistake is reported with the flag and exit
// code 2, and no file is written.
func TestCompareBadInputs(t *testing.T) {
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"no plant", []string{"--ctrl", "pi"}, "give the plant"},
		{"unknown structure", []string{"--plant", "1/(s+1)", "--ctrl", "pi,pidd"}, "--ctrl"},
		{"scope not compared", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--set", "pid:kd=1"}, "pid is not among"},
		{"parameter in no structure", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--set", "kd=1"}, "no structure"},
		{"bad slices", []string{"--plant", "1/(s+1)", "--slices", "kd=0,x"}, "--slices"},
		{"too many panels", []string{"--plant", "1/(s+1)", "--ctrl", "pid", "--slices", "kd=0,1,2,3,4,5,6,7,8,9"}, "at most 9"},
		{"bad bound", []string{"--plant", "1/(s+1)", "--ms-bound", "0.5"}, "ms-bound"},
		{"bad image", []string{"--plant", "1/(s+1)", "-o", "cmp.gif"}, "extension"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			_, errs, code := runBinary(t, dir, append([]string{"compare"}, tc.args...)...)
			if code != 2 || !strings.Contains(errs, tc.want) {
				t.Errorf("exit %d, %q; want 2 and %q", code, errs, tc.want)
			}
			if entries, _ := os.ReadDir(dir); len(entries) > 0 {
				t.Errorf("left %d files", len(entries))
			}
		})
	}
}

// TestMapAutomaticWindow: map --x kp --y ki chooses the window, prints
// the rule, and saves the window chosen in the scenario.
func TestMapAutomaticWindow(t *testing.T) {
	dir := t.TempDir()
	out, errs, code := runBinary(t, dir, "map", "--plant", "1/(s+1)^4", "--ctrl", "pi", "--x", "kp", "--y", "ki", "--grid", "40x30", "-o", "m.png", "--save-scenario", "m.toml")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "chosen: kp holds every stable node") {
		t.Errorf("no rule in the report:\n%s", out)
	}
	saved, err := os.ReadFile(filepath.Join(dir, "m.toml"))
	if err != nil || !strings.Contains(string(saved), `x = "kp=-1.5:4.5"`) {
		t.Errorf("saved scenario %s (%v)", saved, err)
	}
}

// TestProbeResponse: probe --response writes the figure and adds the
// figures to the JSON; an unstable design is refused with exit code 2.
func TestProbeResponse(t *testing.T) {
	dir := t.TempDir()
	out, errs, code := runBinary(t, dir, "probe", "--plant", "2/(3*s+1)", "--ctrl", "pi", "--set", "kp=1,ki=1", "--response", "r.png", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var doc struct {
		Response map[string]float64 `json:"response"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	// By hand (regions/study, TestStepResponseFirstOrderPI): the load
	// error integrates to −1/ki = −1 and the setpoint response ends at 1.
	if math.Abs(doc.Response["ie_load"]+1) > 1e-3 || doc.Response["final_setpoint"] != 1 {
		t.Errorf("response %v", doc.Response)
	}
	if _, err := os.Stat(filepath.Join(dir, "r.png")); err != nil {
		t.Error(err)
	}
	_, errs, code = runBinary(t, dir, "probe", "--plant", "2/(3*s+1)", "--ctrl", "pi", "--set", "kp=1,ki=-1", "--response", "bad.png")
	if code != 2 || !strings.Contains(errs, "not stable") {
		t.Errorf("exit %d, %q", code, errs)
	}
	if _, err := os.Stat(filepath.Join(dir, "bad.png")); err == nil {
		t.Error("a figure was written for an unstable design")
	}
}

// TestCompareTableFlagsWindowEdge: a best point on the edge of its window
// may have a better one outside it; the table says so for both searches.
// On 1/(s+1)^4 under PI (invented window, far inside the stable region
// that reaches kp = 4) both searches are pushed to ki's top edge.
func TestCompareTableFlagsWindowEdge(t *testing.T) {
	out, errs, code := runBinary(t, t.TempDir(), "compare", "--plant", "1/(s+1)^4", "--ctrl", "pi",
		"--x", "kp=0:0.1", "--y", "ki=0:0.05", "--grid", "40x30", "-o", "", "--kd-range", "0:0")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	// The PI row appears twice: in the load table, then in the other figures.
	var rows []string
	for _, line := range strings.Split(out, "\n") {
		if strings.HasPrefix(line, "1 PI") {
			rows = append(rows, line)
		}
	}
	if len(rows) != 2 {
		t.Fatalf("%d PI rows; want 2:\n%s", len(rows), out)
	}
	for k, what := range []string{"best load design", "best decay design"} {
		if !strings.Contains(rows[k], "(on the window's edge)") {
			t.Errorf("%s not flagged on the window's edge: %q", what, rows[k])
		}
	}
}
