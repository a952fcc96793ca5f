//go:build !unix

package main

import (
	"errors"
	"os/exec"
)

// mkfifo: no named pipes in the file system here; the tests that need
// one skip.
func mkfifo(string) error { return errors.New("named pipes are not supported on this system") }

func ownGroup(*exec.Cmd) {}

func killGroup(cmd *exec.Cmd) { cmd.Process.Kill() }
