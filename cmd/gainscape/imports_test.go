package main

import (
	"go/build"
	"strings"
	"testing"
)

// TestCommandComputesNothing keeps the command a shell over the study
// layer: its own files (tests aside) import no package that computes
// stability, edges, overlays, margins or iso-lines.
func TestCommandComputesNothing(t *testing.T) {
	pkg, err := build.ImportDir(".", 0)
	if err != nil {
		t.Fatal(err)
	}
	forbidden := []string{
		"routh", "unitcircle", "delay", "grid", "boundary", "dpartition", "overlay",
		"margins", "intervals", "isoline", "plane", "zoh", "response", "loop",
	}
	for _, imp := range pkg.Imports {
		for _, name := range forbidden {
			if imp == "gainscape/regions/"+name || strings.HasPrefix(imp, "gainscape/regions/"+name+"/") {
				t.Errorf("cmd/gainscape imports %s; computation belongs behind regions/study", imp)
			}
		}
	}
	if len(pkg.Imports) == 0 {
		t.Fatal("no imports read: the test is not looking at the command")
	}
}
