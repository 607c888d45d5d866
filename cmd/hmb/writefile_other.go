//go:build !unix

package main

import "io/fs"

// ownerOf: without a Unix stat record, owners and links are not known (and not kept).
func ownerOf(fs.FileInfo) (*owner, bool) { return nil, false }

// canWrite: the permission bits (mayWrite) are all there is to go by.
func canWrite(string) error { return nil }
