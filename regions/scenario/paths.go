package scenario

import (
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
)

// imageFormats are the image formats, named as the --format flag and the
// extensions name them.
var imageFormats = []string{"png", "svg", "pdf"}

// imageExtensions are the extensions of imageFormats.
var imageExtensions = []string{".png", ".svg", ".pdf"}

// extension returns the extension of a path's last element, dot
// included, as filepath.Ext does.
func extension(p string) string { return filepath.Ext(p) }

// ImageFormat returns the format the image is written in, "png", "svg"
// or "pdf": format, the value of the --format flag, when given (in any
// letter case), else the image's extension; for standard output ("-")
// without format, "png". A format that disagrees with the extension is
// refused, so that a file named .svg never holds PNG bytes.
func (s Scenario) ImageFormat(format string) (string, error) {
	f := strings.ToLower(format)
	if f != "" && !slices.Contains(imageFormats, f) {
		return "", &Error{Flag: "format", Msg: strconv.Quote(format) + " is not an image format; use png, svg or pdf"}
	}
	image := s.Output.Image
	if image == "-" || image == "" {
		if f == "" {
			return "png", nil
		}
		return f, nil
	}
	ext := strings.ToLower(extension(image))
	if !slices.Contains(imageExtensions, ext) {
		return "", s.Errorf("output.image", "%s: an image takes the extension %s", quoteShort(image), strings.Join(imageExtensions, " or "))
	}
	if f != "" && f != ext[1:] {
		return "", &Error{Flag: "format", Msg: strconv.Quote(format) + " does not match the image " + quoteShort(image) +
			"; name the file ." + f + " or leave --format out"}
	}
	return ext[1:], nil
}

// outputKeys are the keys of the output files.
var outputKeys = []string{"output.image", "output.data", "output.csv", "output.note"}

// outputPath returns the field of o that key names.
func (o *Output) outputPath(key string) *string {
	switch key {
	case "output.image":
		return &o.Image
	case "output.data":
		return &o.Data
	case "output.csv":
		return &o.CSV
	case "output.note":
		return &o.Note
	}
	panic("scenario: no output key " + key)
}

// ResolvePaths makes the output paths that a scenario file gave relative
// to that file's folder, so a scenario writes the same files wherever it
// is run from; paths given by flags, and defaults, stay relative to the
// current folder. Unless allowOutside (the command's flag
// OutsidePathsFlag), a path from a file must stay inside the file's
// folder: it may not be absolute, climb out with "..", or lead out
// through a symbolic link to a folder or a file, since a file shared by
// a colleague is data, not a licence to write anywhere. It returns an
// *Error naming the file, line and key for each path refused, and then
// changes no path.
//
// Call it once, after Override, so that a flag replacing a path is not
// checked against the file, and before the outputs are checked and
// written.
func (s *Scenario) ResolvePaths(allowOutside bool) error {
	resolved := s.Output
	if err := resolveOutputs(s.Origins, outputKeys, resolved.outputPath, allowOutside); err != nil {
		return err
	}
	s.Output = resolved
	return nil
}

// resolveOutputs resolves the output paths of keys, which path gives, as
// ResolvePaths describes; on an error it may have changed some.
func resolveOutputs(origins Origins, keys []string, path func(key string) *string, allowOutside bool) error {
	var errs []error
	for _, key := range keys {
		at, ok := origins.origin(key)
		p := path(key)
		if !ok || at.File == "" || at.Flag != "" || *p == "" || *p == "-" {
			continue
		}
		dir := filepath.Dir(at.File)
		if !allowOutside {
			if why := inside(dir, *p); why != "" {
				errs = append(errs, &Error{File: at.File, Line: at.Line, Key: key, Msg: fmt.Sprintf("%s %s; a scenario writes only inside its own folder unless --%s is given",
					quoteShort(*p), why, OutsidePathsFlag)})
				continue
			}
		}
		if !filepath.IsAbs(*p) {
			*p = filepath.Join(dir, *p)
		}
	}
	if len(errs) > 0 {
		return joinReported(origins[""].File, errs)
	}
	return nil
}

// inside returns why the path p, written in a scenario file in dir,
// leads out of dir, or "" if it does not.
func inside(dir, p string) string {
	switch {
	case filepath.IsAbs(p):
		return "is an absolute path"
	case !filepath.IsLocal(p):
		return "climbs out of the scenario's folder"
	}
	root, err := filepath.EvalSymlinks(dir)
	if err != nil {
		return ""
	}
	real, ok := existingPart(filepath.Join(dir, p))
	if !ok {
		return ""
	}
	rel, err := filepath.Rel(root, real)
	if err != nil || !filepath.IsLocal(rel) {
		return "leads out of the scenario's folder through a symbolic link"
	}
	return ""
}

// existingPart returns path with symbolic links followed: the file when
// it exists (a link to a file counts), else its folder and the last
// name. It reports false when neither can be followed, for a missing
// folder or a link to nothing, which the writing of the file refuses.
func existingPart(path string) (string, bool) {
	if real, err := filepath.EvalSymlinks(path); err == nil {
		return real, true
	}
	if _, err := os.Lstat(path); err == nil {
		return "", false
	}
	dir, err := filepath.EvalSymlinks(filepath.Dir(path))
	if err != nil {
		return "", false
	}
	return filepath.Join(dir, filepath.Base(path)), true
}

// relativeTo returns the output paths of o rewritten relative to dir,
// where a scenario file saved there finds them; absolute paths, empty
// ones and "-" stay.
func (o Output) relativeTo(dir string) Output {
	absDir, err := filepath.Abs(dir)
	if err != nil {
		return o
	}
	for _, key := range outputKeys {
		p := o.outputPath(key)
		if *p == "" || *p == "-" || filepath.IsAbs(*p) {
			continue
		}
		abs, err := filepath.Abs(*p)
		if err != nil {
			continue
		}
		if rel, err := filepath.Rel(absDir, abs); err == nil {
			*p = rel
		}
	}
	return o
}
