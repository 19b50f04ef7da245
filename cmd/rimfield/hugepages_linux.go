package main

import (
	"os"
	"runtime"
	"strconv"
	"strings"
	"syscall"
	"unsafe"
)

// hugeHeapBytes is the span of heap address space that adviseHugePages asks
// the kernel to back with huge pages: room for the dense systems, pictures
// and Krylov spaces of solves up to several thousand panels.
const hugeHeapBytes = 1 << 30

// adviseHugePages asks Linux to back the first hugeHeapBytes of the Go heap
// with transparent huge pages, where the kernel offers them on request
// (/sys/kernel/mm/transparent_hugepage/enabled set to madvise or always).
//
// Why: a solve touches fresh memory all the time (the dense matrix and its
// LU copy, picture rasters, sample grids), and on virtual machines the first
// touch of each 4 KiB page is dear. Measured on the 2-core machine: the first
// write of 12.8 MB took 110-170 ms in 4 KiB pages and 2.5 ms in 2 MiB pages;
// a default solve of examples/weir went from 0.95 s to 0.58 s and its page
// faults from 22 700 to 2 100.
//
// How: the Go runtime maps heap address space as it grows and never unmaps
// it. A slice of hugeHeapBytes, never written, maps that space without
// touching it; the advice is attached to the mapping, the slice is freed, and
// later allocations reuse the advised addresses. The runtime gives no knob
// for this. It is skipped when the kernel refuses huge pages on request, when
// memory is strictly accounted (vm.overcommit_memory 2, where even an
// untouched mapping is charged) or when less than four times the span is
// available, and any failure leaves the process as it was.
func adviseHugePages() {
	if !strings.Contains(readSys("/sys/kernel/mm/transparent_hugepage/enabled"), "[madvise]") {
		return // [always] needs no advice, [never] takes none
	}
	if readSys("/proc/sys/vm/overcommit_memory") == "2" || availableBytes() < 4*hugeHeapBytes {
		return
	}
	b := make([]byte, hugeHeapBytes)
	const huge = 2 << 20
	p := uintptr(unsafe.Pointer(unsafe.SliceData(b)))
	start := (p + huge - 1) &^ (huge - 1)
	end := (p + hugeHeapBytes) &^ (huge - 1)
	if end > start {
		_ = syscall.Madvise(b[start-p:end-p], syscall.MADV_HUGEPAGE)
	}
	runtime.KeepAlive(b)
	b = nil
	runtime.GC()
}

// readSys returns the trimmed text of a small kernel file, "" when it
// cannot be read.
func readSys(path string) string {
	data, err := os.ReadFile(path)
	if err != nil {
		return ""
	}
	return strings.TrimSpace(string(data))
}

// availableBytes returns MemAvailable from /proc/meminfo, 0 when unknown.
func availableBytes() int64 {
	for _, line := range strings.Split(readSys("/proc/meminfo"), "\n") {
		f := strings.Fields(line)
		if len(f) >= 2 && f[0] == "MemAvailable:" {
			kb, err := strconv.ParseInt(f[1], 10, 64)
			if err != nil {
				return 0
			}
			return kb << 10
		}
	}
	return 0
}
