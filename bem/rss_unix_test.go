//go:build linux

package bem

import "syscall"

// peakRSS is the process's peak resident memory in bytes.
func peakRSS() int64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return int64(ru.Maxrss) * 1024
}
