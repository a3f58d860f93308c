package data

import (
	"bytes"
	"runtime"
	"sync"
)

// A large CSV file without quotes is read in parts on every core: each part
// is a run of whole lines read by the same row reader (csvRows) into a
// loader of its own, and the parts are then joined in file order. What
// depends on the rows before (duplicate ids) is checked as the parts are
// joined, and the problems are joined in line order, so the couples and
// the problems are those of reading the file in one piece.
//
// Reading 2×10^4 couples takes about a third less time this way on two
// cores (see testdata/bench/RESULTS.md).

// csvPartMin is the least text a part is given, and csvMaxParts the most
// parts (0: two per core, see csvParts); tests lower the first and set the
// second.
var (
	csvPartMin  = 512 << 10
	csvMaxParts = 0
)

// csvParts cuts body into parts of whole lines, at least csvPartMin bytes
// each, one part when the text is short.
func csvParts(body []byte) [][]byte {
	n := csvMaxParts
	if n <= 0 {
		// Two parts a core: the collector takes a core now and then while
		// the parts are read, and with more parts than cores the others
		// keep both busy (2×10^4 couples: 1.5 ms sooner than one a core).
		n = 2 * runtime.GOMAXPROCS(0)
	}
	n = min(n, len(body)/max(csvPartMin, 1))
	if n <= 1 {
		return [][]byte{body}
	}
	parts := make([][]byte, 0, n)
	for k := n; k > 1 && len(body) > 0; k-- {
		cut := len(body) / k
		nl := bytes.IndexByte(body[cut:], '\n')
		if nl < 0 {
			break
		}
		cut += nl + 1
		parts = append(parts, body[:cut])
		body = body[cut:]
	}
	return append(parts, body)
}

// part is a loader for one part of a file: it shares the library's solvent
// table (read only while the couples are read) and keeps its couples in
// file order without indexing them, for join, beside their ids' hashes
// (the time to hash them is spent on every core, not in join).
func (ld *loader) part() *loader {
	p := &loader{lib: &Library{Solvents: ld.lib.Solvents}, deferIDs: true}
	p.ids.seed, p.ids.seeded = ld.ids.hashSeed(), true // hashes as the library's index does
	p.mem.views = ld.mem.views
	return p
}

// csvInParts reads the rows of parts (the body of a file, cut by csvParts)
// on as many cores, lines counted from lineBase+1 in the first part.
func (ld *loader) csvInParts(file string, parts [][]byte, comma byte, lineBase int, ncols int, cols []csvColumn, decimalComma bool) {
	subs := make([]*loader, len(parts))
	var wg sync.WaitGroup
	for i, p := range parts {
		sub := ld.part()
		subs[i] = sub
		base := lineBase
		n := bytes.Count(p, []byte{'\n'})
		sub.lib.Couples, sub.hashes = make([]*Couple, 0, n+1), make([]uint64, 0, n+1)
		wg.Go(func() { sub.csvRows(file, p, base, comma, nil, ncols, cols, decimalComma) })
		lineBase += n
	}
	wg.Wait()
	for _, s := range subs {
		ld.join(file, s)
	}
}

// join adds the couples of part s (of file) to the library, checking their
// ids against those before, and its problems, all in line order: a
// problem the part found on a line comes before the duplicate id found
// there, as when the file is read in one piece.
func (ld *loader) join(file string, s *loader) {
	found := s.c.list // in line order: a part's rows are read in order
	for i, c := range s.lib.Couples {
		for len(found) > 0 && found[0].Pos.Line <= c.Pos.Line {
			ld.c.addIssue(found[0])
			found = found[1:]
		}
		ld.keepCouple(c, c.Pos, s.hashes[i])
	}
	for _, x := range found {
		ld.c.addIssue(x)
	}
	ld.c.skip(file, s.c.overflow[file])
}
