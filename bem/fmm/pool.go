package fmm

import (
	"sync"
	"sync/atomic"
)

// pool runs loops over index ranges on a fixed number of goroutines. Work is
// handed out in chunks of grain indices; the body gets the worker number so
// that it can use that worker's scratch. Results never depend on which worker
// ran a chunk: every output is written by exactly one iteration.
type pool struct {
	workers int
}

func (p *pool) run(n, grain int, body func(lo, hi, worker int)) {
	if n <= 0 {
		return
	}
	if grain < 1 {
		grain = 1
	}
	w := p.workers
	if chunks := (n + grain - 1) / grain; w > chunks {
		w = chunks
	}
	if w <= 1 {
		body(0, n, 0)
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for g := 0; g < w; g++ {
		wg.Add(1)
		go func(g int) {
			defer wg.Done()
			for {
				lo := int(next.Add(int64(grain))) - grain
				if lo >= n {
					return
				}
				body(lo, min(lo+grain, n), g)
			}
		}(g)
	}
	wg.Wait()
}
