package safefile

import (
	"bufio"
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"sync"
)

// Plan is the set of outputs of one run, written all or not at all. Its
// methods may be called from any goroutine; Abort and AbortAll may be
// called at any moment, Write for different outputs concurrently.
type Plan struct {
	// Stdout receives the content of the output whose path is Stdout,
	// when the plan commits; NewPlan sets it to os.Stdout.
	Stdout io.Writer

	mu      sync.Mutex
	state   state
	outputs []*Output
	inputs  []input
	failure error // why the plan was aborted
}

type state int

const (
	planning state = iota
	checked
	committed
	aborted
)

// Output is one file of a plan.
type Output struct {
	plan       *Plan
	name, path string
	target     target
	temp       string // the temporary file while it exists
	written    bool   // Write has been called
	ready      bool   // the content is complete
	content    []byte // the content for standard output
}

type input struct{ name, path string }

// errAborted is why a plan fails after Abort.
var errAborted = errors.New("the outputs were abandoned")

// NewPlan returns an empty plan.
func NewPlan() *Plan {
	p := &Plan{Stdout: os.Stdout}
	if !register(p) {
		p.state, p.failure = aborted, errClosed
	}
	return p
}

// Add adds the output at path, Stdout for standard output; name is the
// flag or key that gave the path, such as "--data", and is how errors
// name it. It panics after Check.
func (p *Plan) Add(name, path string) *Output {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.state != planning && p.state != aborted {
		panic("safefile: Add after Check")
	}
	o := &Output{plan: p, name: name, path: path}
	p.outputs = append(p.outputs, o)
	return o
}

// AddInput names a file the run reads, which no output may replace.
func (p *Plan) AddInput(name, path string) {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.inputs = append(p.inputs, input{name, path})
}

// Name returns the name the output was added with.
func (o *Output) Name() string { return o.name }

// Path returns the path the output was added with.
func (o *Output) Path() string { return o.path }

// Check checks every output before any work is done: each path names a
// regular file or nothing, in a directory that exists and is writable
// (a temporary file is created there and removed); no two outputs are
// one file, through symbolic or hard links included; no output is an
// input; at most one goes to standard output. It returns the first
// problem, naming the output, and aborts the plan; it panics when called
// twice.
func (p *Plan) Check() error {
	p.mu.Lock()
	defer p.mu.Unlock()
	switch p.state {
	case aborted:
		return p.failure
	case planning:
	default:
		panic("safefile: Check called twice")
	}
	if err := p.check(); err != nil {
		p.abort(err)
		return err
	}
	p.state = checked
	return nil
}

func (p *Plan) check() error {
	var files []*Output
	var toStdout *Output
	for _, o := range p.outputs {
		if o.path == Stdout {
			if toStdout != nil {
				return problem(o.name, o.path, "%s goes to standard output too; only one output can", toStdout.name)
			}
			toStdout = o
			continue
		}
		t, err := resolve(o.name, o.path)
		if err != nil {
			return err
		}
		o.target = t
		for _, q := range files {
			if sameFile(t, q.target) {
				return problem(o.name, o.path, "is the same file as %s %s; give each output its own file", q.name, strconv.Quote(q.path))
			}
		}
		files = append(files, o)
	}
	for _, in := range p.inputs {
		t := inputTarget(in.path)
		for _, o := range files {
			if sameFile(t, o.target) {
				return problem(o.name, o.path, "is the input %s %s; writing it would destroy it", in.name, strconv.Quote(in.path))
			}
		}
	}
	probed := map[string]bool{}
	for _, o := range files {
		dir := filepath.Dir(o.target.real)
		if probed[dir] {
			continue
		}
		probed[dir] = true
		f, err := createTemp(dir, filepath.Base(o.target.real))
		if err != nil {
			return problem(o.name, o.path, "directory %s is not writable: %v", strconv.Quote(filepath.Dir(o.path)), plain(err))
		}
		f.Close()
		if err := os.Remove(f.Name()); err != nil {
			return wrapOS(o.name, o.path, err)
		}
	}
	return nil
}

// inputTarget returns where the input at path is, for comparing it with
// the outputs; an input that cannot be found is compared by its path.
func inputTarget(path string) target {
	abs, err := filepath.Abs(path)
	if err != nil {
		return target{real: path}
	}
	if real, err := filepath.EvalSymlinks(abs); err == nil {
		abs = real
	}
	fi, err := os.Stat(abs)
	return target{real: abs, exists: err == nil, info: fi}
}

// Write makes the output's content: produce writes it to a temporary
// file beside the target (for standard output, to memory), which is
// flushed to the disk. Writes fail with the cause of ctx's cancellation
// once ctx is done, at the latest after the chunk under way. The output
// is put in place by Commit. On failure the whole plan is aborted and
// the error names the output. Write panics before Check and when called
// twice for one output.
func (o *Output) Write(ctx context.Context, produce func(io.Writer) error) error {
	p := o.plan
	p.mu.Lock()
	switch {
	case p.state == aborted:
		defer p.mu.Unlock()
		return p.failure
	case p.state != checked:
		p.mu.Unlock()
		panic("safefile: Write before Check or after Commit")
	case o.written:
		p.mu.Unlock()
		panic("safefile: output " + o.name + " written twice")
	}
	o.written = true
	var err error
	if o.path == Stdout {
		p.mu.Unlock()
		var buf bytes.Buffer
		err = fill(ctx, &buf, produce)
		p.mu.Lock()
		o.content = buf.Bytes()
	} else {
		var f *os.File
		f, err = createTemp(filepath.Dir(o.target.real), filepath.Base(o.target.real))
		if err != nil {
			err = wrapOS(o.name, o.path, err)
			p.abort(err)
			p.mu.Unlock()
			return err
		}
		// The name is recorded in the same hold of the lock that created
		// the file, so an abort at any moment finds it.
		o.temp = f.Name()
		p.mu.Unlock()
		err = fillFile(ctx, f, o.target, produce)
		p.mu.Lock()
	}
	defer p.mu.Unlock()
	if err != nil {
		err = fmt.Errorf("%s %s: %w", o.name, strconv.Quote(o.path), plain(err))
		p.abort(err)
		return err
	}
	if p.state == aborted {
		return p.failure
	}
	o.ready = true
	return nil
}

// fillFile writes the content to the temporary file f, with the
// permissions of the file it replaces, and flushes it to the disk.
func fillFile(ctx context.Context, f *os.File, t target, produce func(io.Writer) error) error {
	err := func() error {
		if t.exists {
			if err := f.Chmod(t.info.Mode().Perm()); err != nil {
				return err
			}
		}
		if err := fill(ctx, f, produce); err != nil {
			return err
		}
		return f.Sync()
	}()
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return err
}

// fill runs produce on a buffered writer to w that stops once ctx is
// done.
func fill(ctx context.Context, w io.Writer, produce func(io.Writer) error) error {
	bw := bufio.NewWriterSize(cancellable{ctx, w}, chunk)
	if err := produce(bw); err != nil {
		return err
	}
	if err := bw.Flush(); err != nil {
		return err
	}
	if ctx.Err() != nil {
		return context.Cause(ctx)
	}
	return nil
}

// Commit puts every output in place: standard output first, then each
// file, renamed over its target in the order added, and the directories
// are flushed. It panics if an output has not been written. If the plan
// was aborted, or a target has since become something that may not be
// replaced, nothing is put in place and the error says why. A rename
// that fails, which a checked plan makes rare, aborts the outputs not
// yet renamed.
func (p *Plan) Commit() error {
	p.mu.Lock()
	switch p.state {
	case aborted:
		defer p.mu.Unlock()
		return p.failure
	case checked:
	default:
		p.mu.Unlock()
		panic("safefile: Commit before Check or twice")
	}
	var content []byte
	var toStdout *Output
	for _, o := range p.outputs {
		if !o.ready {
			p.mu.Unlock()
			panic("safefile: Commit with output " + o.name + " not written")
		}
		if o.path == Stdout {
			content, toStdout = o.content, o
		} else if err := o.target.recheck(o.name, o.path); err != nil {
			p.abort(err)
			p.mu.Unlock()
			return err
		}
	}
	p.mu.Unlock()
	// Standard output may block on a slow reader: it is written without
	// the lock, so that an abort meanwhile can still remove the files.
	if toStdout != nil {
		if _, err := p.Stdout.Write(content); err != nil {
			err = fmt.Errorf("%s %s: %w", toStdout.name, strconv.Quote(toStdout.path), err)
			p.mu.Lock()
			p.abort(err)
			p.mu.Unlock()
			return err
		}
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.state == aborted {
		return p.failure
	}
	dirs := map[string]bool{}
	for _, o := range p.outputs {
		if o.path == Stdout {
			continue
		}
		if err := os.Rename(o.temp, o.target.real); err != nil {
			err = wrapOS(o.name, o.path, err)
			p.abort(err)
			return err
		}
		o.temp = ""
		dirs[filepath.Dir(o.target.real)] = true
	}
	for dir := range dirs {
		syncDir(dir)
	}
	p.state = committed
	deregister(p)
	return nil
}

// syncDir flushes a directory's entries, so the renames survive a power
// cut. Some file systems refuse to flush a directory; the renames are
// made all the same, so the error is not reported.
func syncDir(dir string) {
	if d, err := os.Open(dir); err == nil {
		d.Sync()
		d.Close()
	}
}

// Abort removes every temporary file of the plan, leaving every target
// as it was. It does nothing after Commit or a first Abort.
func (p *Plan) Abort() {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.abort(errAborted)
}

// abort removes the temporary files and records why; the lock is held.
func (p *Plan) abort(why error) {
	if p.state == committed || p.state == aborted {
		return
	}
	for _, o := range p.outputs {
		if o.temp != "" {
			os.Remove(o.temp)
			o.temp = ""
		}
	}
	p.state, p.failure = aborted, why
	deregister(p)
}
