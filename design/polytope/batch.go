package polytope

import (
	"bufio"
	"context"
	"fmt"
	"io"
	"runtime"
	"strings"
	"sync"
)

// Block is one cell of a batch file as written: its 1-based index in the
// whole file, the line it starts on and its text.
type Block struct {
	Index, Line int
	Text        string
}

// maxBatchLine bounds one line of a batch file.
const maxBatchLine = 1 << 20

// SplitBlocks splits a batch file into cells separated by one or more
// blank lines (a line of only spaces or a comment counts as blank only if
// empty after the comment is removed).
func SplitBlocks(r io.Reader, name string) ([]Block, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64*1024), maxBatchLine)
	var out []Block
	var cur strings.Builder
	start, no := 0, 0
	flush := func() {
		if cur.Len() > 0 {
			out = append(out, Block{Index: len(out) + 1, Line: start, Text: cur.String()})
			cur.Reset()
		}
	}
	for sc.Scan() {
		no++
		t := sc.Text()
		bare := t
		if i := strings.IndexByte(bare, '#'); i >= 0 {
			bare = bare[:i]
		}
		if strings.TrimSpace(bare) == "" {
			if strings.TrimSpace(t) == "" {
				flush()
			}
			continue
		}
		if cur.Len() == 0 {
			start = no
		}
		cur.WriteString(t)
		cur.WriteByte('\n')
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s line %d: %v", name, no+1, err)
	}
	flush()
	if len(out) == 0 {
		return nil, fmt.Errorf("%s: no cells in the file", name)
	}
	return out, nil
}

// Shard returns the K-th (1-based) of N contiguous blocks of n items that
// differ in size by at most one: the half-open range [lo, hi).
func Shard(n, k, N int) (lo, hi int) {
	return (k - 1) * n / N, k * n / N
}

// Result is the outcome for one cell of a batch.
type Result struct {
	Index int
	Rule  *Rule
	Err   error
}

// BatchOptions say how a batch is built.
type BatchOptions struct {
	Options
	// Dim is 2 (polygons) or 3 (polyhedra).
	Dim int
	// Workers is the number of cells built at once (0: GOMAXPROCS).
	Workers int
}

// classEntry is one similarity class's solution, computed once.
type classEntry struct {
	once sync.Once
	cs   *classSolution
	err  error
}

// Batch builds the rule of every block, in parallel, and returns the
// results in the order of blocks. A block that cannot be read, is not a
// valid cell or whose rule fails gets its error; the others are not
// affected. Cells of one similarity class share the solution of the
// class's canonical form, computed once from that form alone, and each
// cell's mapped rule is confirmed and verified against its own exact
// moments: a cell's rule does not depend on the other cells, on their
// order or on the number of workers.
func Batch(ctx context.Context, blocks []Block, name string, opt BatchOptions) []Result {
	if err := checkOptions(opt.Dim, opt.Options); err != nil {
		out := make([]Result, len(blocks))
		for i, b := range blocks {
			out[i] = Result{Index: b.Index, Err: err}
		}
		return out
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	var mu sync.Mutex
	classes := map[string]*classEntry{}
	cache := func(key string, canon func() cell) (*classSolution, error) {
		mu.Lock()
		e, ok := classes[key]
		if !ok {
			e = &classEntry{}
			classes[key] = e
		}
		mu.Unlock()
		e.once.Do(func() { e.cs, e.err = solveClass(ctx, canon(), opt.Options) })
		return e.cs, e.err
	}
	out := make([]Result, len(blocks))
	jobs := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				out[i] = buildBlock(ctx, blocks[i], name, opt, cache)
			}
		}()
	}
	for i := range blocks {
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	return out
}

func buildBlock(ctx context.Context, b Block, name string, opt BatchOptions, cache func(string, func() cell) (*classSolution, error)) Result {
	where := fmt.Sprintf("%s cell %d (line %d)", name, b.Index, b.Line)
	var c cell
	if opt.Dim == 2 {
		p, err := ParsePolygon(strings.NewReader(b.Text), where)
		if err != nil {
			return Result{Index: b.Index, Err: err}
		}
		c = polygonCell{p}
	} else {
		p, err := ParsePolyhedron(strings.NewReader(b.Text), where)
		if err != nil {
			return Result{Index: b.Index, Err: err}
		}
		c = polyhedronCell{p}
	}
	r, err := build(ctx, c, opt.Options, cache)
	if err != nil {
		return Result{Index: b.Index, Err: fmt.Errorf("%s: %v", where, err)}
	}
	return Result{Index: b.Index, Rule: r}
}
