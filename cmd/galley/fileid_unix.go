//go:build linux || darwin

package main

import (
	"os"
	"syscall"
)

// fileID is a file's identity on disk: its inode number and the time of
// its last status change (ctime), in nanoseconds.
type fileID struct {
	ino   uint64
	ctime int64
	known bool
}

// identity reads a file's identity from its status.
func identity(st os.FileInfo) fileID {
	s, ok := st.Sys().(*syscall.Stat_t)
	if !ok {
		return fileID{}
	}
	return fileID{ino: uint64(s.Ino), ctime: ctimeNs(s), known: true}
}
