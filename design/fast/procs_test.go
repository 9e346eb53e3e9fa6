package fast_test

import "runtime"

func setProcs(n int) int { return runtime.GOMAXPROCS(n) }
