package safefile

import (
	"context"
	"errors"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"sync"
	"unicode/utf8"
)

// live holds every plan not yet committed or aborted, for AbortAll.
// Once closed, by AbortAll, no plan creates a temporary file again.
var live struct {
	sync.Mutex
	plans  map[*Plan]struct{}
	closed bool
}

// AbortAll aborts every plan not yet committed or aborted and stops all
// plans, later ones included, from creating temporary files. It is for
// the cleanup of an interrupt just before the process ends, and is safe
// to call from any goroutine at any moment: a plan in the middle of
// creating a temporary file or of committing finishes that step first,
// so no temporary file survives and no output is left half renamed.
func AbortAll() {
	live.Lock()
	live.closed = true
	plans := make([]*Plan, 0, len(live.plans))
	for p := range live.plans {
		plans = append(plans, p)
	}
	live.Unlock()
	for _, p := range plans {
		p.Abort()
	}
}

// register adds p to the live plans; it reports false once AbortAll has
// run.
func register(p *Plan) bool {
	live.Lock()
	defer live.Unlock()
	if live.closed {
		return false
	}
	if live.plans == nil {
		live.plans = map[*Plan]struct{}{}
	}
	live.plans[p] = struct{}{}
	return true
}

func deregister(p *Plan) {
	live.Lock()
	delete(live.plans, p)
	live.Unlock()
}

// errClosed is the error of a plan used after AbortAll.
var errClosed = errors.New("the program is being interrupted")

// tempPrefixBytes bounds the part of the target's name a temporary
// file's name repeats, so that the name stays within the 255 bytes most
// file systems allow whatever the target's length.
const tempPrefixBytes = 100

// createTemp creates a new, empty temporary file in dir for the file
// named base. The name is hidden and says what it is for: ".BASE.N.tmp".
// O_EXCL makes the file ours alone, and the mode 0666 lets the kernel
// apply the umask as for any file the user creates.
func createTemp(dir, base string) (*os.File, error) {
	for len(base) > tempPrefixBytes {
		_, size := utf8.DecodeLastRuneInString(base)
		base = base[:len(base)-size]
	}
	for range 100 {
		name := filepath.Join(dir, "."+base+"."+strconv.FormatUint(rand.Uint64(), 36)+".tmp")
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		if !errors.Is(err, fs.ErrExist) {
			return f, err
		}
	}
	return nil, errors.New("no unused temporary file name after 100 tries")
}

// chunk is the most a cancellable writer passes on between two looks at
// its context: small enough to stop within milliseconds on any disk.
const chunk = 256 << 10

// cancellable passes writes on to w in chunks and fails with the cause
// of ctx's cancellation, such as the signal that interrupted the
// program, as soon as ctx is done.
type cancellable struct {
	ctx context.Context
	w   io.Writer
}

// Write implements io.Writer.
func (c cancellable) Write(p []byte) (int, error) {
	n := 0
	for {
		if c.ctx.Err() != nil {
			return n, context.Cause(c.ctx)
		}
		if len(p) == 0 {
			return n, nil
		}
		k := min(len(p), chunk)
		m, err := c.w.Write(p[:k])
		n += m
		if err != nil {
			return n, err
		}
		p = p[k:]
	}
}
