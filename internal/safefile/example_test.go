package safefile_test

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"gainscape/internal/safefile"
)

// A run writes its image and its data as one plan: both are checked
// before the work, and both appear only when both are complete.
func ExamplePlan() {
	dir, _ := os.MkdirTemp("", "plan-example")
	defer os.RemoveAll(dir)

	plan := safefile.NewPlan()
	img := plan.Add("--out", filepath.Join(dir, "map.svg"))
	data := plan.Add("--data", filepath.Join(dir, "map.json"))
	if err := plan.Check(); err != nil {
		fmt.Println(err)
		return
	}
	defer plan.Abort()
	ctx := context.Background()
	img.Write(ctx, func(w io.Writer) error { _, err := io.WriteString(w, "<svg/>"); return err })
	data.Write(ctx, func(w io.Writer) error { _, err := io.WriteString(w, "{}"); return err })
	if err := plan.Commit(); err != nil {
		fmt.Println(err)
		return
	}
	b, _ := os.ReadFile(filepath.Join(dir, "map.json"))
	fmt.Println(string(b))
	// Output:
	// {}
}

// Two outputs naming one file are refused before any work.
func ExamplePlan_Check() {
	plan := safefile.NewPlan()
	plan.Add("--out", "same.png")
	plan.Add("--data", "same.png")
	fmt.Println(plan.Check())
	// Output:
	// --data "same.png": is the same file as --out "same.png"; give each output its own file
}
