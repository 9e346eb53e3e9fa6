package main

import (
	"io"
	"runtime"
	"strconv"
	"sync"
)

// formatChunk is the number of lines one task of writeLines formats.
const formatChunk = 1 << 14

// writeLines writes line(buf, i) for i = 0..n-1 to w, in order. The lines
// are formatted chunk by chunk on runtime.GOMAXPROCS goroutines (shortest
// round-trip formatting of a float64 costs about 100 ns, the bulk of
// writing a large rule), at most a few chunks ahead of the writer, so the
// memory stays a few megabytes whatever n is.
func writeLines(w io.Writer, n int, line func(buf []byte, i int) []byte) error {
	chunks := (n + formatChunk - 1) / formatChunk
	workers := runtime.GOMAXPROCS(0)
	if chunks <= 1 || workers == 1 {
		buf := make([]byte, 0, 1<<16)
		for i := 0; i < n; i++ {
			buf = line(buf, i)
			if len(buf) >= 1<<16 {
				if _, err := w.Write(buf); err != nil {
					return err
				}
				buf = buf[:0]
			}
		}
		_, err := w.Write(buf)
		return err
	}
	window := make(chan struct{}, 2*workers)
	jobs := make(chan int)
	results := make([]chan []byte, chunks)
	for c := range results {
		results[c] = make(chan []byte, 1)
	}
	pool := sync.Pool{New: func() any { return make([]byte, 0, formatChunk*48) }}
	go func() {
		for c := 0; c < chunks; c++ {
			window <- struct{}{}
			jobs <- c
		}
		close(jobs)
	}()
	for g := 0; g < workers; g++ {
		go func() {
			for c := range jobs {
				buf := pool.Get().([]byte)[:0]
				for i := c * formatChunk; i < min((c+1)*formatChunk, n); i++ {
					buf = line(buf, i)
				}
				results[c] <- buf
			}
		}()
	}
	var err error
	for c := 0; c < chunks; c++ {
		buf := <-results[c]
		if err == nil {
			_, err = w.Write(buf)
		}
		pool.Put(buf) //nolint:staticcheck // a slice header, as the pool's New returns
		<-window
	}
	return err
}

// appendFloat appends the shortest round-trip form of v (strconv's 'g',
// -1: the digits build has always printed).
func appendFloat(buf []byte, v float64) []byte {
	return strconv.AppendFloat(buf, v, 'g', -1, 64)
}

// appendTextLine appends the text format's line "%*d  %-24s  %s\n" of
// index i+1 (width iw) and the sign-padded node and weight, as
// writeFastText printed it with fmt.
func appendTextLine(buf []byte, iw, i int, x, w float64) []byte {
	var num [20]byte
	d := strconv.AppendInt(num[:0], int64(i+1), 10)
	for j := len(d); j < iw; j++ {
		buf = append(buf, ' ')
	}
	buf = append(buf, d...)
	buf = append(buf, ' ', ' ')
	s := len(buf)
	if !(x < 0 || (x == 0 && 1/x < 0)) {
		buf = append(buf, ' ')
	}
	buf = appendFloat(buf, x)
	for len(buf)-s < 24 {
		buf = append(buf, ' ')
	}
	buf = append(buf, ' ', ' ')
	if !(w < 0 || (w == 0 && 1/w < 0)) {
		buf = append(buf, ' ')
	}
	buf = appendFloat(buf, w)
	return append(buf, '\n')
}
