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
	if workers > blocks {
		workers = blocks
	}
	var mu sync.Mutex
	next := 0
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				mu.Lock()
				b := next
				next++
				mu.Unlock()
				if b >= blocks {
					return
				}
				lo := b * block
				hi := min(lo+block, n)
				do(lo, hi)
			}
		}()
	}
	wg.Wait()
}
