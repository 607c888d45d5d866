//go:build unix

package main

import "syscall"

// peakMB is the process's peak resident memory in MB (Linux reports ru_maxrss in KiB).
func peakMB() float64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return float64(ru.Maxrss) / 1024
}
