//go:build unix

package if97

import "syscall"

// cpuTime is the CPU time the process has used, ns: what a benchmark on a shared machine
// should report, since wall time counts the other programs' turns too.
func cpuTime() int64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}
