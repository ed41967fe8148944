//go:build linux

package safefile

import (
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"syscall"
	"testing"
)

// checkChild is the environment variable that makes the test binary run
// Check on the output path it holds, print the result and exit: a child
// that TestUnwritableDirectoryAsAnotherUser runs under another user.
const checkChild = "GAINSCAPE_SAFEFILE_CHECK"

func TestMain(m *testing.M) {
	if path := os.Getenv(checkChild); path != "" {
		p := NewPlan()
		p.Add("--data", path)
		if err := p.Check(); err != nil {
			io.WriteString(os.Stdout, err.Error())
			os.Exit(1)
		}
		os.Exit(0)
	}
	os.Exit(m.Run())
}

// TestUnwritableDirectoryAsAnotherUser checks the refusal of a directory
// the user may not write, which TestCheck cannot when the tests run as
// root, whom permissions do not bind: the test then runs Check in a
// child process under the unprivileged user 65534 ("nobody" on most
// systems) against a directory owned by root with mode 0555.
func TestUnwritableDirectoryAsAnotherUser(t *testing.T) {
	if os.Geteuid() != 0 {
		t.Skip("not root: TestCheck covers an unwritable directory")
	}
	base, err := os.MkdirTemp("", "safefile-user")
	if err != nil {
		t.Fatal(err)
	}
	defer os.RemoveAll(base)
	locked := filepath.Join(base, "locked")
	bin := filepath.Join(base, "check.test")
	if err := os.Chmod(base, 0o755); err != nil || os.Mkdir(locked, 0o555) != nil || copyFile(os.Args[0], bin) != nil {
		t.Skip("cannot prepare a directory another user can reach")
	}
	cmd := exec.Command(bin)
	cmd.Dir = base
	cmd.Env = append(os.Environ(), checkChild+"=locked/m.json")
	cmd.SysProcAttr = &syscall.SysProcAttr{Credential: &syscall.Credential{Uid: 65534, Gid: 65534}}
	out, err := cmd.Output()
	if _, ok := err.(*exec.ExitError); !ok {
		t.Skipf("cannot run a child as another user: %v", err)
	}
	want := `--data "locked/m.json": directory "locked" is not writable: permission denied`
	if string(out) != want {
		t.Errorf("child printed %q; want %q", out, want)
	}
	if entries, _ := os.ReadDir(locked); len(entries) != 0 {
		t.Errorf("the locked directory holds %d entries", len(entries))
	}
}

func copyFile(from, to string) error {
	b, err := os.ReadFile(from)
	if err != nil {
		return err
	}
	return os.WriteFile(to, b, 0o755)
}
