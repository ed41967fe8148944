//go:build unix

package safefile

import (
	"io/fs"
	"net"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// spec is one output or input of a test plan.
type spec struct{ name, path string }

// TestCheck runs Check on plans that are fine and on each kind of
// hostile plan, each in a fresh current directory that setup fills. Check must refuse the hostile ones with a message
// naming the output and its path, and must leave the directory as it
// found it.
func TestCheck(t *testing.T) {
	tests := []struct {
		name     string
		setup    func(t *testing.T, dir string)
		outputs  []spec
		inputs   []spec
		wantErr  string // "" when the plan is fine
		wantName string // the output the message names
		byMode   bool   // the case relies on permissions, which do not bind root
	}{
		{name: "new files", outputs: []spec{{"--out", "map.png"}, {"--data", "map.json"}}},
		{name: "existing regular file", setup: file("map.png", 0o644), outputs: []spec{{"--out", "map.png"}}},
		{name: "standard output and a file", outputs: []spec{{"--out", "-"}, {"--data", "map.json"}}},
		{name: "symbolic link to a regular file", setup: all(file("real.png", 0o644), symlink("real.png", "link.png")),
			outputs: []spec{{"--out", "link.png"}}},
		{name: "two outputs one path", outputs: []spec{{"--out", "same.png"}, {"--data", "same.png"}},
			wantErr: `is the same file as --out "same.png"`, wantName: "--data"},
		{name: "one path spelled two ways", setup: dirs("sub"), outputs: []spec{{"--data", "x"}, {"--csv", "sub/../x"}},
			wantErr: "same file", wantName: "--csv"},
		{name: "one file through a symbolic link", setup: all(file("x.png", 0o644), symlink("x.png", "y.png")),
			outputs: []spec{{"--out", "x.png"}, {"--save-scenario", "y.png"}}, wantErr: "same file", wantName: "--save-scenario"},
		{name: "new file through a linked directory", setup: all(dirs("real"), symlink("real", "alias")),
			outputs: []spec{{"--out", "real/m.png"}, {"--note", "alias/m.png"}}, wantErr: "same file", wantName: "--note"},
		{name: "one file through a hard link", setup: all(file("x.json", 0o644), hardlink("x.json", "y.json")),
			outputs: []spec{{"--data", "x.json"}, {"--csv", "y.json"}}, wantErr: "same file", wantName: "--csv"},
		{name: "output is the input", setup: file("in.toml", 0o644), outputs: []spec{{"--data", "in.toml"}},
			inputs: []spec{{"--scenario", "in.toml"}}, wantErr: `is the input --scenario "in.toml"`, wantName: "--data"},
		{name: "output is the input through a link", setup: all(file("in.toml", 0o644), symlink("in.toml", "out.toml")),
			outputs: []spec{{"--save-scenario", "out.toml"}}, inputs: []spec{{"--scenario", "in.toml"}}, wantErr: "is the input", wantName: "--save-scenario"},
		{name: "missing input is no collision", outputs: []spec{{"--data", "a.json"}}, inputs: []spec{{"--scenario", "none.toml"}}},
		{name: "named pipe", setup: fifo("pipe"), outputs: []spec{{"--data", "pipe"}}, wantErr: "is a named pipe", wantName: "--data"},
		{name: "symbolic link to a named pipe", setup: all(fifo("pipe"), symlink("pipe", "p.json")),
			outputs: []spec{{"--data", "p.json"}}, wantErr: "is a named pipe", wantName: "--data"},
		{name: "socket", setup: socket("sock"), outputs: []spec{{"--csv", "sock"}}, wantErr: "is a socket", wantName: "--csv"},
		{name: "directory", setup: dirs("d"), outputs: []spec{{"--data", "d"}}, wantErr: "is a directory", wantName: "--data"},
		{name: "trailing separator", outputs: []spec{{"--data", "new/"}}, wantErr: "names a directory", wantName: "--data"},
		{name: "missing directory", outputs: []spec{{"--out", "png"}, {"--data", "nowhere/m.json"}},
			wantErr: `directory "nowhere" does not exist`, wantName: "--data"},
		{name: "parent is a file", setup: file("f", 0o644), outputs: []spec{{"--data", "f/m.json"}},
			wantErr: `"f" is not a directory`, wantName: "--data"},
		{name: "dangling symbolic link", setup: symlink("gone.png", "link.png"), outputs: []spec{{"--out", "link.png"}},
			wantErr: "link to a missing file", wantName: "--out"},
		{name: "symbolic link loop", setup: all(symlink("b", "a"), symlink("a", "b")), outputs: []spec{{"--out", "a"}},
			wantErr: "--out", wantName: "--out"},
		{name: "read-only file", setup: file("keep.png", 0o444), outputs: []spec{{"--out", "keep.png"}},
			wantErr: "is read-only", wantName: "--out"},
		{name: "two outputs on standard output", outputs: []spec{{"--out", "-"}, {"--data", "-"}},
			wantErr: "--out goes to standard output too", wantName: "--data"},
		{name: "empty path", outputs: []spec{{"--note", ""}}, wantErr: "no file name", wantName: "--note"},
		{name: "unwritable directory", setup: all(dirs("locked"), chmod("locked", 0o500)), outputs: []spec{{"--data", "locked/m.json"}},
			wantErr: `directory "locked" is not writable`, wantName: "--data", byMode: true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if tc.byMode && os.Geteuid() == 0 {
				t.Skip("running as root, for whom directory permissions do not apply")
			}
			dir := t.TempDir()
			if tc.setup != nil {
				tc.setup(t, dir)
			}
			before := snapshot(t, dir)
			t.Chdir(dir)
			p := NewPlan()
			for _, o := range tc.outputs {
				p.Add(o.name, o.path)
			}
			for _, in := range tc.inputs {
				p.AddInput(in.name, in.path)
			}
			err := p.Check()
			if tc.wantErr == "" {
				if err != nil {
					t.Fatalf("refused: %v", err)
				}
			} else {
				if err == nil {
					t.Fatal("accepted")
				}
				checkMessage(t, err, tc.wantName, tc.wantErr)
			}
			p.Abort()
			if after := snapshot(t, dir); after != before {
				t.Errorf("directory changed:\nbefore %s\nafter  %s", before, after)
			}
		})
	}
}

// TestReplaceableDevice checks the refusal of a device, which the tests
// do not create: a real one could be damaged if the check were wrong.
func TestReplaceableDevice(t *testing.T) {
	err := replaceable("--out", "/dev/x", fakeInfo{fs.ModeDevice | fs.ModeCharDevice | 0o666})
	checkMessage(t, err, "--out", "is a device")
}

type fakeInfo struct{ mode fs.FileMode }

func (f fakeInfo) Name() string       { return "x" }
func (f fakeInfo) Size() int64        { return 0 }
func (f fakeInfo) Mode() fs.FileMode  { return f.mode }
func (f fakeInfo) ModTime() time.Time { return time.Time{} }
func (f fakeInfo) IsDir() bool        { return f.mode.IsDir() }
func (f fakeInfo) Sys() any           { return nil }

// checkMessage checks that err names the output first, says what is
// wrong, takes one to three lines and never shows a temporary file.
func checkMessage(t *testing.T, err error, name, want string) {
	t.Helper()
	if err == nil {
		t.Fatalf("no error; want one containing %q", want)
	}
	msg := err.Error()
	if !strings.HasPrefix(msg, name+" ") || !strings.Contains(msg, want) {
		t.Errorf("message %q; want one starting with %s and containing %q", msg, name, want)
	}
	if strings.Contains(msg, ".tmp") {
		t.Errorf("message %q shows a temporary file", msg)
	}
	if n := strings.Count(msg, "\n"); n > 2 {
		t.Errorf("message has %d lines", n+1)
	}
}

func all(steps ...func(*testing.T, string)) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		for _, s := range steps {
			s(t, dir)
		}
	}
}

func file(name string, mode os.FileMode) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte("earlier content of "+name), 0o644); err != nil {
			t.Fatal(err)
		}
		if err := os.Chmod(p, mode); err != nil {
			t.Fatal(err)
		}
	}
}

func dirs(name string) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		if err := os.Mkdir(filepath.Join(dir, name), 0o755); err != nil {
			t.Fatal(err)
		}
	}
}

func chmod(name string, mode os.FileMode) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		p := filepath.Join(dir, name)
		if err := os.Chmod(p, mode); err != nil {
			t.Fatal(err)
		}
		t.Cleanup(func() { os.Chmod(p, 0o755) })
	}
}

func symlink(oldname, newname string) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		if err := os.Symlink(oldname, filepath.Join(dir, newname)); err != nil {
			t.Fatal(err)
		}
	}
}

func hardlink(oldname, newname string) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		if err := os.Link(filepath.Join(dir, oldname), filepath.Join(dir, newname)); err != nil {
			t.Fatal(err)
		}
	}
}

func fifo(name string) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		if err := syscall.Mkfifo(filepath.Join(dir, name), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

func socket(name string) func(*testing.T, string) {
	return func(t *testing.T, dir string) {
		l, err := net.Listen("unix", filepath.Join(dir, name))
		if err != nil {
			t.Skipf("no Unix socket: %v", err)
		}
		// Keep the socket file after closing the listener.
		l.(*net.UnixListener).SetUnlinkOnClose(false)
		l.Close()
	}
}

// snapshot describes every entry of dir, recursively: name, type,
// permissions, link target and content, so that any change shows.
func snapshot(t *testing.T, dir string) string {
	t.Helper()
	var b strings.Builder
	filepath.WalkDir(dir, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			b.WriteString(path + ": " + err.Error() + "\n")
			return nil
		}
		fi, err := d.Info()
		if err != nil {
			return nil
		}
		rel, _ := filepath.Rel(dir, path)
		b.WriteString(rel + " " + fi.Mode().String())
		switch {
		case fi.Mode()&fs.ModeSymlink != 0:
			target, _ := os.Readlink(path)
			b.WriteString(" -> " + target)
		case fi.Mode().IsRegular():
			content, _ := os.ReadFile(path)
			b.WriteString(" " + string(content))
		}
		b.WriteString("\n")
		return nil
	})
	return b.String()
}
