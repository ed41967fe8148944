package safefile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestWrite(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.txt")
	if err := Write(path, func(w io.Writer) error { _, err := io.WriteString(w, "one"); return err }); err != nil {
		t.Fatal(err)
	}
	// A failing writer leaves the earlier file untouched and no temporary.
	err := Write(path, func(w io.Writer) error { io.WriteString(w, "partial"); return errors.New("stopped") })
	if err == nil || !strings.Contains(err.Error(), path) {
		t.Fatalf("error %v; want one naming %s", err, path)
	}
	b, _ := os.ReadFile(path)
	if string(b) != "one" {
		t.Fatalf("content %q; want the earlier file", b)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Fatalf("%d entries in the directory; want only the output", len(entries))
	}
	if err := Write(filepath.Join(dir, "missing", "x.txt"), func(io.Writer) error { return nil }); err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Fatalf("missing directory: error %v", err)
	}
}
