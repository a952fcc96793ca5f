//go:build unix

package main

import (
	"os/exec"
	"syscall"
)

// mkfifo makes a named pipe at path.
func mkfifo(path string) error { return syscall.Mkfifo(path, 0o644) }

// ownGroup makes cmd start in a process group of its own, so that
// killGroup ends it with every process it started.
func ownGroup(cmd *exec.Cmd) { cmd.SysProcAttr = &syscall.SysProcAttr{Setpgid: true} }

func killGroup(cmd *exec.Cmd) { syscall.Kill(-cmd.Process.Pid, syscall.SIGKILL) }
