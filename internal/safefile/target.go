package safefile

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"syscall"
)

// target is where an output goes once its path has been checked.
type target struct {
	real   string      // absolute path of the file to replace, symbolic links followed
	exists bool        // whether real names an existing file
	info   fs.FileInfo // the existing file, when exists
}

// resolve checks that path can be replaced by a regular file and returns
// where that file is. A symbolic link to a regular file is followed: the
// file it points to is replaced, as a user writing through the link
// expects. The directory must exist; whether it is writable is checked
// by the plan, which owns the temporary files.
func resolve(name, path string) (target, error) {
	if path == "" {
		return target{}, problem(name, path, "no file name given")
	}
	if os.IsPathSeparator(path[len(path)-1]) {
		return target{}, problem(name, path, "names a directory; give a file name")
	}
	abs, err := filepath.Abs(path)
	if err != nil {
		return target{}, wrapOS(name, path, err)
	}
	fi, err := os.Lstat(abs)
	switch {
	case err == nil && fi.Mode()&fs.ModeSymlink != 0:
		fi, err := os.Stat(abs)
		if errors.Is(err, fs.ErrNotExist) {
			return target{}, problem(name, path, "is a symbolic link to a missing file")
		}
		if err != nil {
			return target{}, wrapOS(name, path, err)
		}
		if err := replaceable(name, path, fi); err != nil {
			return target{}, err
		}
		real, err := filepath.EvalSymlinks(abs)
		if err != nil {
			return target{}, problem(name, path, "is a symbolic link that cannot be followed to a file")
		}
		return existing(name, path, real, fi)
	case err == nil:
		real, err := filepath.EvalSymlinks(abs)
		if err != nil {
			return target{}, wrapOS(name, path, err)
		}
		return existing(name, path, real, fi)
	case errors.Is(err, fs.ErrNotExist) || errors.Is(err, syscall.ENOTDIR):
		dir := filepath.Dir(abs)
		realDir, err := filepath.EvalSymlinks(dir)
		if err != nil {
			return target{}, problem(name, path, "directory %s does not exist", strconv.Quote(filepath.Dir(path)))
		}
		if di, err := os.Stat(realDir); err != nil || !di.IsDir() {
			return target{}, problem(name, path, "%s is not a directory", strconv.Quote(filepath.Dir(path)))
		}
		return target{real: filepath.Join(realDir, filepath.Base(abs))}, nil
	default:
		return target{}, wrapOS(name, path, err)
	}
}

// existing checks that the existing file fi at real may be replaced.
func existing(name, path, real string, fi fs.FileInfo) (target, error) {
	if err := replaceable(name, path, fi); err != nil {
		return target{}, err
	}
	return target{real: real, exists: true, info: fi}, nil
}

// replaceable refuses to replace anything but a regular file the owner
// may write: a directory, a device, a named pipe or a socket would be
// replaced by a regular file, which is never what was meant, and a
// read-only file says it is not to be overwritten.
func replaceable(name, path string, fi fs.FileInfo) error {
	m := fi.Mode()
	switch {
	case m.IsDir():
		return problem(name, path, "is a directory; give a file name")
	case m&fs.ModeNamedPipe != 0:
		return problem(name, path, "is a named pipe, not a regular file; give a file name")
	case m&fs.ModeSocket != 0:
		return problem(name, path, "is a socket, not a regular file; give a file name")
	case m&fs.ModeDevice != 0:
		return problem(name, path, "is a device, not a regular file; give a file name")
	case !m.IsRegular():
		return problem(name, path, "is not a regular file; give a file name")
	case m.Perm()&0o200 == 0:
		return problem(name, path, "is read-only; make it writable or choose another file")
	}
	return nil
}

// sameFile reports whether two checked paths name one file: the same
// path once links are followed, or, for files that exist, the same file
// by device and inode, which also catches hard links.
func sameFile(a, b target) bool {
	if a.real == b.real {
		return true
	}
	return a.exists && b.exists && os.SameFile(a.info, b.info)
}

// recheck checks, just before the rename, that the target is still a
// file that may be replaced: something else may have appeared there
// while the outputs were being computed.
func (t target) recheck(name, path string) error {
	fi, err := os.Lstat(t.real)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return wrapOS(name, path, err)
	}
	return replaceable(name, path, fi)
}
