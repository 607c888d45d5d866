// Package golden compares test output with reviewed golden files: the one golden helper of hmb's
// tests, and the one -update flag that rewrites the files (go test ./PKG -update; read the diff
// before committing). Only tests import it.
package golden

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files (and the generated README sections) from the output")

// Update reports whether the test run rewrites golden files instead of comparing with them.
func Update() bool { return *update }

// Check compares got with the golden file at path or, under -update, writes got there (through
// a temporary file and a rename, so an interrupted run leaves the old file or the new one).
func Check(t testing.TB, path string, got []byte) {
	t.Helper()
	if *update {
		if err := Write(path, got); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (go test -run '%s' -update creates it; review it before committing)", err, t.Name())
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the output (go test -run '%s' -update rewrites it after review):\n--- got\n%s\n--- want\n%s", path, t.Name(), got, want)
	}
}

// Write writes data to path through a temporary file in the same directory and a rename.
func Write(path string, data []byte) error {
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		return err
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	defer os.Remove(tmp.Name())
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Chmod(0o644); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}
