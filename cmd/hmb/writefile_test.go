package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

const messySrc = "stream   A   {p 10 bar;T 200 C}\n\n\n\nstream B\n"

// fmtW runs hmb fmt -w on path and returns the exit code and stderr.
func fmtW(path string) (int, string) {
	var out, errb bytes.Buffer
	code := run([]string{"fmt", "-w", path}, nil, &out, &errb)
	return code, errb.String()
}

func formatted(t *testing.T, path string) bool {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return !bytes.Equal(b, []byte(messySrc)) && strings.HasPrefix(string(b), "stream A {")
}

// noTemps fails when a temporary file is left in dir.
func noTemps(t *testing.T, dir string) {
	t.Helper()
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.Contains(e.Name(), ".tmp") {
			t.Errorf("temporary file left behind: %s", e.Name())
		}
	}
}

// hmb fmt -w rewrites the target of a symbolic link, and the link stays a link.
func TestFmtWriteSymlink(t *testing.T) {
	dir := t.TempDir()
	real := filepath.Join(dir, "sub", "real.hmb")
	os.MkdirAll(filepath.Dir(real), 0o755)
	os.WriteFile(real, []byte(messySrc), 0o644)
	link := filepath.Join(dir, "link.hmb")
	if err := os.Symlink(filepath.Join("sub", "real.hmb"), link); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	if code, errs := fmtW(link); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if fi, err := os.Lstat(link); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced: %v %v", fi.Mode(), err)
	}
	if !formatted(t, real) {
		t.Error("the link's target was not rewritten")
	}
	noTemps(t, dir)
	noTemps(t, filepath.Dir(real))
}

// hmb fmt -w keeps hard links: every name of the file sees the new text, still one file.
func TestFmtWriteHardLink(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.hmb"), filepath.Join(dir, "b.hmb")
	os.WriteFile(a, []byte(messySrc), 0o640)
	if err := os.Link(a, b); err != nil {
		t.Skip("no hard links here:", err)
	}
	if code, errs := fmtW(a); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	fa, _ := os.Stat(a)
	fb, _ := os.Stat(b)
	if !os.SameFile(fa, fb) {
		t.Error("the hard link was split from the file")
	}
	if !formatted(t, b) || fa.Mode().Perm() != 0o640 {
		t.Errorf("the other name sees the old text, or the mode changed (%v)", fa.Mode().Perm())
	}
	noTemps(t, dir)
}

// hmb fmt -w keeps the file's mode and owner.
func TestFmtWriteModeOwner(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "m.hmb")
	os.WriteFile(p, []byte(messySrc), 0o600)
	os.Chmod(p, 0o600)
	chowned := false
	if os.Geteuid() == 0 {
		chowned = os.Chown(p, 4321, 4322) == nil
	}
	if code, errs := fmtW(p); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	fi, _ := os.Stat(p)
	if fi.Mode().Perm() != 0o600 || !formatted(t, p) {
		t.Errorf("mode %v, formatted %v", fi.Mode().Perm(), formatted(t, p))
	}
	if st, ok := fi.Sys().(*syscall.Stat_t); ok && chowned && (st.Uid != 4321 || st.Gid != 4322) {
		t.Errorf("owner %d:%d, want 4321:4322", st.Uid, st.Gid)
	}
	noTemps(t, dir)
}

// hmb fmt -w refuses a file the user may not write (mode 0444), leaves it as it was, still
// formats the others, and exits 2.
func TestFmtWriteReadOnly(t *testing.T) {
	dir := t.TempDir()
	ro, rw := filepath.Join(dir, "ro.hmb"), filepath.Join(dir, "rw.hmb")
	os.WriteFile(ro, []byte(messySrc), 0o444)
	os.Chmod(ro, 0o444)
	os.WriteFile(rw, []byte(messySrc), 0o644)
	var out, errb bytes.Buffer
	code := run([]string{"fmt", "-w", ro, rw}, nil, &out, &errb)
	if code != 2 || !strings.Contains(errb.String(), "read-only") {
		t.Errorf("exit %d, stderr %q; want 2 and read-only", code, errb.String())
	}
	if b, _ := os.ReadFile(ro); string(b) != messySrc {
		t.Errorf("the read-only file was rewritten: %q", b)
	}
	if fi, _ := os.Stat(ro); fi.Mode().Perm() != 0o444 {
		t.Errorf("mode %v", fi.Mode().Perm())
	}
	if !formatted(t, rw) {
		t.Error("the writable file was not formatted")
	}
	noTemps(t, dir)
}

// A write that cannot complete (here the disk fails to take the new text) leaves the old file
// whole, and no temporary file behind; for a hard-linked file too.
func TestFmtWriteNeverHalf(t *testing.T) {
	dir := t.TempDir()
	p, q := filepath.Join(dir, "x.hmb"), filepath.Join(dir, "y.hmb")
	os.WriteFile(p, []byte(messySrc), 0o644)
	os.WriteFile(q, []byte(messySrc), 0o644)
	linked := os.Link(q, filepath.Join(dir, "y2.hmb")) == nil
	defer func(f func(*os.File) error) { syncFile = f }(syncFile)
	syncFile = func(*os.File) error { return syscall.ENOSPC }
	for _, f := range []string{p, q} {
		if code, errs := fmtW(f); code != 2 || !strings.Contains(errs, "no space") {
			t.Errorf("%s: exit %d, stderr %q; want 2", f, code, errs)
		}
		if b, _ := os.ReadFile(f); string(b) != messySrc {
			t.Errorf("%s changed: %q", f, b)
		}
	}
	if !linked {
		t.Log("no hard links here: only the plain file was tried")
	}
	noTemps(t, dir)
}
