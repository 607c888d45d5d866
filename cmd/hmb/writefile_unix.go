//go:build unix

package main

import (
	"io/fs"
	"syscall"
)

// ownerOf reads a file's owner and link count from its stat record.
func ownerOf(info fs.FileInfo) (*owner, bool) {
	st, ok := info.Sys().(*syscall.Stat_t)
	if !ok {
		return nil, false
	}
	return &owner{uid: int(st.Uid), gid: int(st.Gid), links: uint64(st.Nlink)}, true
}

// canWrite asks the operating system whether the user may write path (access(2), W_OK).
func canWrite(path string) error { return syscall.Access(path, 2) }
