package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// writeFileAtomic writes data to path so that no reader and no crash ever sees half a file: the
// data goes to a temporary file in the same directory, which is synced and then renamed over the
// old file. What the user has set up around the file is kept:
//   - a symbolic link is followed, and its target rewritten (the link stays a link);
//   - the file's mode and owner are kept;
//   - a file with other hard links is rewritten in place, since a rename would split it from
//     them: the new text is first made safe in a temporary file beside it, which is kept (and
//     named in the error) should the rewrite fail;
//   - a file the user may not write (no write permission, as with mode 0444) is refused, and so
//     is anything but a regular file.
//
// A new file gets mode 0644.
func writeFileAtomic(path string, data []byte) error {
	target, err := filepath.EvalSymlinks(path)
	if errors.Is(err, fs.ErrNotExist) {
		target, err = path, nil
		if l, lerr := os.Lstat(path); lerr == nil && l.Mode()&fs.ModeSymlink != 0 {
			// A link to a file not there yet: create the file where the link points.
			dest, rerr := os.Readlink(path)
			if rerr != nil {
				return rerr
			}
			if !filepath.IsAbs(dest) {
				dest = filepath.Join(filepath.Dir(path), dest)
			}
			target = dest
		}
	}
	if err != nil {
		return err
	}
	info, err := os.Stat(target)
	if errors.Is(err, fs.ErrNotExist) {
		return replace(target, data, 0o644, nil)
	}
	if err != nil {
		return err
	}
	if !info.Mode().IsRegular() {
		return fmt.Errorf("%s is not a regular file", path)
	}
	if err := mayWrite(target, info); err != nil {
		return err
	}
	own, known := ownerOf(info)
	if known && own.links > 1 {
		return rewriteInPlace(target, data)
	}
	if !known {
		own = nil
	}
	return replace(target, data, info.Mode()&(fs.ModePerm|fs.ModeSetuid|fs.ModeSetgid|fs.ModeSticky), own)
}

// mayWrite refuses a file the user may not write: one with no write permission for anyone (which
// even the superuser, who could, is not to overwrite behind the user's back), or one the
// operating system says the user may not write.
func mayWrite(path string, info fs.FileInfo) error {
	if info.Mode().Perm()&0o222 == 0 {
		return fmt.Errorf("%s is read-only (mode %04o): not rewritten", path, info.Mode().Perm())
	}
	if err := canWrite(path); err != nil {
		return fmt.Errorf("%s may not be written: %w", path, err)
	}
	return nil
}

// owner is who owns a file, and how many names (hard links) it has.
type owner struct {
	uid, gid int
	links    uint64
}

// replace writes data to a temporary file beside path, gives it mode and, when own is not nil,
// that owner and group, syncs it and renames it over path. When the owner cannot be kept (a user
// other than the superuser rewriting someone else's file in a directory they may write), the file
// is rewritten in place instead, which keeps it.
func replace(path string, data []byte, mode fs.FileMode, own *owner) error {
	tmp, err := writeTemp(path, data, mode)
	if err != nil {
		return err
	}
	defer os.Remove(tmp) // no-op after a successful rename
	if own != nil {
		if err := os.Lchown(tmp, own.uid, own.gid); err != nil {
			if fi, serr := os.Stat(tmp); serr == nil {
				if got, ok := ownerOf(fi); ok && (got.uid != own.uid || got.gid != own.gid) {
					return rewriteInPlace(path, data)
				}
			}
		}
		// chown may clear the setuid and setgid bits: set the mode again.
		if err := os.Chmod(tmp, mode); err != nil {
			return err
		}
	}
	return os.Rename(tmp, path)
}

// syncFile flushes a file to the disk; tests stand in a failing one.
var syncFile = (*os.File).Sync

// writeTemp writes data to a new temporary file in path's directory, synced, with mode; it
// returns the temporary file's name.
func writeTemp(path string, data []byte, mode fs.FileMode) (string, error) {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return "", err
	}
	name := tmp.Name()
	ok := false
	defer func() {
		if !ok {
			tmp.Close()
			os.Remove(name)
		}
	}()
	if _, err := tmp.Write(data); err != nil {
		return "", err
	}
	if err := tmp.Chmod(mode); err != nil {
		return "", err
	}
	if err := syncFile(tmp); err != nil {
		return "", err
	}
	if err := tmp.Close(); err != nil {
		return "", err
	}
	ok = true
	return name, nil
}

// rewriteInPlace overwrites path's own contents (its inode, so its hard links, owner and mode
// stay), after making the new text safe in a temporary file beside it. The temporary file is
// removed when the rewrite succeeds and kept, and named, when it fails.
func rewriteInPlace(path string, data []byte) error {
	backup, err := writeTemp(path, data, 0o600)
	if err != nil {
		return err
	}
	fail := func(err error) error {
		return fmt.Errorf("rewriting %s failed (%v); its new text is in %s", path, err, backup)
	}
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		os.Remove(backup)
		return err
	}
	if _, err := f.WriteAt(data, 0); err != nil {
		f.Close()
		return fail(err)
	}
	if err := f.Truncate(int64(len(data))); err != nil {
		f.Close()
		return fail(err)
	}
	if err := f.Sync(); err != nil {
		f.Close()
		return fail(err)
	}
	if err := f.Close(); err != nil {
		return fail(err)
	}
	return os.Remove(backup)
}
