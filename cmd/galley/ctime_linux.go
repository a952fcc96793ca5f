package main

import "syscall"

func ctimeNs(s *syscall.Stat_t) int64 { return s.Ctim.Nano() }
