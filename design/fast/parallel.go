package fast

import (
	"runtime"
	"sync"
)

// parallelFor calls do(lo, hi) on disjoint blocks covering [0, n), on
// runtime.GOMAXPROCS goroutines. Each index must be computed independently
// of the others, so the result does not depend on the number of cores.
func parallelFor(n int, do func(lo, hi int)) {
	const block = 4096
	workers := runtime.GOMAXPROCS(0)
	if n < 2*block || workers == 1 {
		do(0, n)
		return
	}
	blocks := (n + block - 1) / block
	parallelEach(blocks, nil, func(b int) {
		lo := b * block
		do(lo, min(lo+block, n))
	})
}

// parallelEach calls do(i) for i = 0..count-1 on runtime.GOMAXPROCS
// goroutines, handing out one index at a time, and stops handing them out
// once stop returns true (stop may be nil). Each call must be independent
// of the others.
func parallelEach(count int, stop func() bool, do func(i int)) {
	var mu sync.Mutex
	next := 0
	var wg sync.WaitGroup
	for g := 0; g < min(runtime.GOMAXPROCS(0), count); g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				mu.Lock()
				i := next
				next++
				mu.Unlock()
				if i >= count || (stop != nil && stop()) {
					return
				}
				do(i)
			}
		}()
	}
	wg.Wait()
}
