// Package safefile writes a command's output files as one transaction:
// every path is checked before any work is done, each file's content
// goes to a temporary file in its target's directory, and the temporary
// files are renamed into place only once all of them are complete. A
// failure or an interrupt at any moment removes every temporary file and
// leaves every existing file as it was.
//
// A Plan holds the outputs of one run:
//
//	plan := safefile.NewPlan()
//	img := plan.Add("--out", "map.png")
//	data := plan.Add("--data", "map.json")
//	plan.AddInput("--scenario", "tank.toml")
//	if err := plan.Check(); err != nil { ... } // before any work
//	defer plan.Abort()                         // no-op after Commit
//	... compute ...
//	if err := img.Write(ctx, drawImage); err != nil { ... }
//	if err := data.Write(ctx, writeData); err != nil { ... }
//	if err := plan.Commit(); err != nil { ... }
//
// Errors name the output by the name it was added with, a flag or a
// key, and its path as given; never the temporary file.
package safefile

import (
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"strconv"
)

// Stdout is the path that names standard output.
const Stdout = "-"

// Write writes the content that produce gives to the file at path as a
// plan of one output named "writing": path is checked first, and a
// failure leaves path as it was and no temporary file.
func Write(path string, produce func(io.Writer) error) error {
	p := NewPlan()
	out := p.Add("writing", path)
	if err := p.Check(); err != nil {
		return err
	}
	if err := out.Write(context.Background(), produce); err != nil {
		return err
	}
	return p.Commit()
}

// problem returns the error "NAME "PATH": WHAT".
func problem(name, path, format string, args ...any) error {
	return fmt.Errorf("%s %s: %s", name, strconv.Quote(path), fmt.Sprintf(format, args...))
}

// wrapOS returns an error of a file operation as a problem of the
// output, without the file name the operating-system error carries: that
// may be the temporary file, and the output's path is already in the
// message.
func wrapOS(name, path string, err error) error {
	return fmt.Errorf("%s %s: %w", name, strconv.Quote(path), plain(err))
}

// plain returns the error inside an operating-system error on a path,
// without the path.
func plain(err error) error {
	var pe *fs.PathError
	var le *os.LinkError
	switch {
	case errors.As(err, &pe):
		return pe.Err
	case errors.As(err, &le):
		return le.Err
	}
	return err
}
