package scenario

import (
	"strings"
	"testing"

	"gainscape/regions/spec"
)

// TestMessagesNameTheOrigin decodes a file, applies flags and validates:
// each problem must be reported against the file, line and key that gave
// the value, or against the flag that gave it, and never against a flag
// the user did not type.
func TestMessagesNameTheOrigin(t *testing.T) {
	const file = "schema = 1\n" + // 1
		"[loop]\n" + // 2
		"plant = \"1/(s+1)^2\"\n" + // 3
		"[axes]\n" + // 4
		"x = \"kp=1:1.00000000001\"\n" + // 5
		"grid = \"4000x30\"\n" + // 6
		"[fixed]\n" + // 7
		"ki = 1\n" + // 8
		"[overlays]\n" + // 9
		"best = [\"fastest\"]\n" + // 10
		"marks = [\"kp=1\", {kp = 2}]\n" // 11
	tests := []struct {
		name  string
		flags Scenario
		given []string
		want  []string // the lines of the message
	}{
		{"every problem from the file", Scenario{}, nil, []string{
			`scenario file "f.toml", line 5: axes.x: kp=1:1.00000000001: the window is too narrow for floating point: about 11 representable values between neighbouring nodes of 4000, fewer than 1024; widen it or use fewer nodes`,
			`scenario file "f.toml", line 8: fixed.ki: ki is swept by axes.y; an axis parameter cannot also be fixed`,
			`scenario file "f.toml", line 10: overlays.best[1]: "fastest" is not a search; the searches are decay and ki`,
		}},
		{"flags replace some values", Scenario{Axes: Axes{X: spec.Axis{Param: "kp", Min: 0, Max: 1}},
			Fixed: []spec.Value{{Param: "ki", V: 2}}, Output: Output{Image: "map.gif"}}, []string{"x", "set", "out"}, []string{
			`--set: ki is swept by axes.y; an axis parameter cannot also be fixed`,
			`scenario file "f.toml", line 10: overlays.best[1]: "fastest" is not a search; the searches are decay and ki`,
			`--out: "map.gif": an image takes the extension .png or .svg or .pdf`,
		}},
		{"an empty plant flag", Scenario{Axes: Axes{Columns: 30, Rows: 30}}, []string{"plant", "grid", "best"}, []string{
			`--plant: "" is empty; give a plant transfer function in s, such as "1/(s+1)^2"`,
			`scenario file "f.toml", line 8: fixed.ki: ki is swept by axes.y; an axis parameter cannot also be fixed`,
		}},
		{"an empty numerator flag", Scenario{Axes: Axes{Columns: 30, Rows: 30}}, []string{"num", "grid", "best"}, []string{
			`--num: [] is empty; give the numerator coefficients, highest power first`,
			`scenario file "f.toml", line 8: fixed.ki: ki is swept by axes.y; an axis parameter cannot also be fixed`,
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := Decode(strings.NewReader(file), "f.toml")
			if err != nil {
				t.Fatal(err)
			}
			s.Override(tc.flags, flagsGiven(tc.given...))
			err = s.Validate()
			if err == nil {
				t.Fatal("no error")
			}
			if got := strings.Split(err.Error(), "\n"); strings.Join(got, "\n") != strings.Join(tc.want, "\n") {
				t.Errorf("message\n%s\nwant\n%s", err, strings.Join(tc.want, "\n"))
			}
		})
	}
}

// TestWhere checks how the command names a value it finds wrong itself,
// such as a plant that does not parse or a mark off the plane.
func TestWhere(t *testing.T) {
	const file = "schema = 1\nloop = {plant = \"2*(s+1\", controller = \"pi\"}\n\n[[overlays.marks]]\nkp = 1\n"
	s, err := Decode(strings.NewReader(file), "g.toml")
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name, key, want string
		flags           []string
	}{
		{"key of an inline table", "loop.plant", `scenario file "g.toml", line 2: loop.plant`, nil},
		{"element of an array of tables", "overlays.marks[1]", `scenario file "g.toml", line 4: overlays.marks[1]`, nil},
		{"key left out", "axes.grid", `scenario file "g.toml": axes.grid`, nil},
		{"key given by a flag", "loop.plant", "--plant", []string{"plant"}},
		{"key of a flag with two keys", "output.width_cm", "--size", []string{"size"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := s
			s.Override(Scenario{Loop: Loop{Plant: "1/s"}}, flagsGiven(tc.flags...))
			if got := s.Where(tc.key); got != tc.want {
				t.Errorf("Where(%q) = %q; want %q", tc.key, got, tc.want)
			}
			if got, want := s.Errorf(tc.key, "bad %d", 1).Error(), tc.want+": bad 1"; got != want {
				t.Errorf("Errorf = %q; want %q", got, want)
			}
		})
	}
	if !s.Given("loop.plant") || !s.Given("overlays.marks[1]") || s.Given("axes.grid") {
		t.Error("Given does not tell the keys the file gave from those it left out")
	}
	if got := (Scenario{}).Where("axes.x"); got != "axes.x" {
		t.Errorf("Where without origins = %q; want the key", got)
	}
}

// TestMarkLabelsAndSearches checks the labels of the marks Validate
// allows, which must be distinct, and the list of searches.
func TestMarkLabelsAndSearches(t *testing.T) {
	seen := map[string]bool{}
	for i := range MaxMarks {
		l := MarkLabel(i)
		if seen[l] || len(l) != 1 {
			t.Errorf("label %d is %q", i, l)
		}
		seen[l] = true
	}
	if MarkLabel(0) != "A" || MarkLabel(MaxMarks-1) != "Z" {
		t.Errorf("labels run %s to %s; want A to Z", MarkLabel(0), MarkLabel(MaxMarks-1))
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("MarkLabel(MaxMarks) did not panic")
			}
		}()
		MarkLabel(MaxMarks)
	}()
	if got := strings.Join(Searches(), ","); got != SearchDecay+","+SearchIntegral {
		t.Errorf("Searches() = %s", got)
	}
}
