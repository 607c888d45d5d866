//go:build !unix

package if97

// cpuTime is not measured here; the benchmarks report wall time only.
func cpuTime() int64 { return 0 }
