//go:build unix

package scenario

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestResolvePaths runs a scenario kept in folder scen/ from the folder
// above it, the current one, with output paths that stay inside scen/
// and paths that leave it each way they can. Paths from the file are
// taken relative to scen/; those leaving it are refused unless allowed;
// paths from flags and defaults are left as they are.
func TestResolvePaths(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	for _, d := range []string{"scen/fig", "outside"} {
		os.MkdirAll(d, 0o755)
	}
	os.WriteFile("outside/victim.md", []byte("keep"), 0o644)
	os.Symlink("../outside", "scen/away")
	os.Symlink("fig", "scen/near")
	os.Symlink("../outside/victim.md", "scen/note.md")
	os.Symlink("fig/x.md", "scen/fine.md")
	abs := filepath.Join(dir, "outside", "abs.png")
	tests := []struct {
		name       string
		key, value string
		allow      bool
		flag       string // the flag that replaces the value, if any
		want       string // the path after ResolvePaths; "" when refused
		wantErr    string
	}{
		{"file beside the scenario", "output.image", "map.png", false, "", "scen/map.png", ""},
		{"file in a subfolder", "output.data", "fig/map.json", false, "", "scen/fig/map.json", ""},
		{"climbing and coming back", "output.csv", "fig/../e.csv", false, "", "scen/e.csv", ""},
		{"through a link inside the folder", "output.data", "near/m.json", false, "", "scen/near/m.json", ""},
		{"link to a file inside the folder", "output.note", "fine.md", false, "", "scen/fine.md", ""},
		{"standard output", "output.image", "-", false, "", "-", ""},
		{"absolute path", "output.image", abs, false, "", "", "is an absolute path"},
		{"climbing out", "output.data", "../x.json", false, "", "", "climbs out of the scenario's folder"},
		{"climbing out after going in", "output.csv", "fig/../../x.csv", false, "", "", "climbs out"},
		{"through a linked folder", "output.data", "away/x.json", false, "", "", "leads out of the scenario's folder through a symbolic link"},
		{"through a link to a file outside", "output.note", "note.md", false, "", "", "leads out of the scenario's folder through a symbolic link"},
		{"absolute path allowed", "output.image", abs, true, "", abs, ""},
		{"climbing out allowed", "output.data", "../x.json", true, "", "x.json", ""},
		{"absolute path from a flag", "output.image", "map.png", false, "out", abs, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src := "schema = 1\n[output]\n" + strings.TrimPrefix(tc.key, "output.") + " = " + quote(tc.value) + "\n"
			s, err := Decode(strings.NewReader(src), filepath.Join("scen", "s.toml"))
			if err != nil {
				t.Fatal(err)
			}
			if tc.flag != "" {
				var o Scenario
				*o.Output.outputPath(tc.key) = tc.want
				s.Override(o, flagsGiven(tc.flag))
			}
			err = s.ResolvePaths(tc.allow)
			got := *s.Output.outputPath(tc.key)
			if tc.wantErr == "" {
				if err != nil || got != tc.want {
					t.Fatalf("path %q, error %v; want %q", got, err, tc.want)
				}
				return
			}
			want := `scenario file "scen/s.toml", line 3: ` + tc.key + ": " + quote(tc.value) + " " + tc.wantErr
			if err == nil || !strings.HasPrefix(err.Error(), want) || !strings.Contains(err.Error(), "--allow-outside-paths") {
				t.Fatalf("error %v; want one starting %q and naming the flag that allows it", err, want)
			}
			if got != tc.value {
				t.Errorf("a refused path became %q", got)
			}
		})
	}
	if b, _ := os.ReadFile("outside/victim.md"); string(b) != "keep" {
		t.Error("a file outside the folder changed")
	}
}

// TestResolvePathsLeavesDefaults checks that an image the file leaves
// out keeps the default, relative to the current folder.
func TestResolvePathsLeavesDefaults(t *testing.T) {
	s, err := Decode(strings.NewReader("schema = 1\n"), "scen/s.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := s.ResolvePaths(false); err != nil || s.Output.Image != Default().Output.Image {
		t.Fatalf("image %q, error %v; want the default", s.Output.Image, err)
	}
}

// TestEncodeFileRelative saves a scenario into another folder and runs
// it again: the paths written are relative to the saved file, and
// resolving them gives back the paths the scenario had.
func TestEncodeFileRelative(t *testing.T) {
	t.Chdir(t.TempDir())
	os.MkdirAll("scen", 0o755)
	s := tank()
	s.Output.Image, s.Output.Data, s.Output.CSV, s.Output.Note = "scen/fig/map.svg", "map.json", "", ""
	var b bytes.Buffer
	if err := EncodeFile(&b, s, "scen/s.toml"); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`image = "fig/map.svg"`, `data = "../map.json"`, "map --scenario s.toml"} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("file lacks %s:\n%s", want, b.String())
		}
	}
	back, err := Decode(&b, "scen/s.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := back.ResolvePaths(false); err == nil || !strings.Contains(err.Error(), "output.data") {
		t.Errorf("error %v; want the data file outside the folder refused", err)
	}
	if err := back.ResolvePaths(true); err != nil {
		t.Fatal(err)
	}
	if back.Output.Image != filepath.Clean(s.Output.Image) || back.Output.Data != s.Output.Data {
		t.Errorf("paths %q and %q after the round trip; want %q and %q", back.Output.Image, back.Output.Data, s.Output.Image, s.Output.Data)
	}
}

// TestImageFormat checks the choice of image format from --format and
// the extension, and the refusal of a format the name contradicts.
func TestImageFormat(t *testing.T) {
	tests := []struct {
		image, format, want, wantErr string
	}{
		{"map.png", "", "png", ""},
		{"map.SVG", "", "svg", ""},
		{"map.pdf", "PDF", "pdf", ""},
		{"-", "", "png", ""},
		{"-", "svg", "svg", ""},
		{"x.svg", "PNG", "", `--format: "PNG" does not match the image "x.svg"; name the file .png or leave --format out`},
		{"x.png", "gif", "", `--format: "gif" is not an image format; use png, svg or pdf`},
		{"x.jpg", "", "", `output.image: "x.jpg": an image takes the extension .png or .svg or .pdf`},
	}
	for _, tc := range tests {
		s := Scenario{Output: Output{Image: tc.image}}
		got, err := s.ImageFormat(tc.format)
		if tc.wantErr != "" {
			if err == nil || err.Error() != tc.wantErr {
				t.Errorf("%s with %q: error %v; want %q", tc.image, tc.format, err, tc.wantErr)
			}
			continue
		}
		if err != nil || got != tc.want {
			t.Errorf("%s with %q: %q, %v; want %q", tc.image, tc.format, got, err, tc.want)
		}
	}
}
