package data

import (
	"bytes"
	"fmt"
	"io"
	"runtime"
	"sync"

	"gopkg.in/yaml.v3"

	"github.com/hatsieve/hatsieve/thermo"
)

// A large YAML library is read in runs of couples rather than as one node
// tree: yaml.v3 builds the whole tree of a document before the loader sees
// it (some 4 kB of heap per couple, so 10^5 couples parsed whole take 3.3 s
// and 590 MB at peak, against a target of 2 s and 200 MB), while runs of
// yamlRunItems couples, each parsed by yaml.v3 and read in file order, keep
// only a few runs in memory at once.
//
// Runs are taken only for the shape people and hatsieve-gen write: a block
// mapping at column 0 whose "couples:" key stands alone on its line and is
// followed by a block sequence whose "-" sit at column 0 or 2. The rest of
// the file (the "header") is parsed as one document with the sequence's
// lines blanked, so every other node keeps its line; each run is parsed as
// "couples:\n" followed by the run's own lines, so the parser is in the same
// state inside an item as it is in the whole file, and node lines are moved
// back to the file's. Anything the line scan does not recognise is parsed
// whole, and so is a file whose header or a run the parser refuses: Load
// then starts again with every file parsed whole (loader.retry), so problems
// and their lines are always the whole-document path's.

// yamlRunsMin is the smallest couples section, in bytes, read in runs.
var yamlRunsMin = 64 << 10

// yamlRunItems is how many couples make one run.
var yamlRunItems = 128

// yamlRun is one run of couples: the file's bytes from the first item's
// line to the line after the last item, and the file line it starts on.
type yamlRun struct {
	data  []byte
	line  int
	items int
}

// yamlRuns is a couples sequence cut into runs.
type yamlRuns struct {
	seq    *yaml.Node // the sequence node put in the header in its place
	indent int        // the column of its "-", from 0
	runs   []yamlRun
}

var bom = []byte("\uFEFF")

// planYAMLRuns scans a file's lines for a couples sequence to read in runs.
// It returns the header (the file with the sequence's lines left empty), the
// line of "couples:", the sequence's first line and column, and the runs;
// ok is false when the file is not of the shape described above.
func planYAMLRuns(data []byte) (header []byte, keyLine, seqLine, indent int, runs []yamlRun, ok bool) {
	if !plainLineBreaks(data) {
		return
	}
	p := runPlanner{indent: -1, regionStart: -1, regionEnd: len(data), per: max(1, yamlRunItems)}
	line := 0
	for off := 0; off < len(data); {
		line++
		l, next := nextLine(data, off)
		sp := 0
		for sp < len(l) && l[sp] == ' ' {
			sp++
		}
		if p.state == inItems && sp > p.indent && sp < len(l) && l[sp] != '\r' {
			off = next
			continue // inside an item: the most common line, read quickly
		}
		l = bytes.TrimSuffix(l, []byte{'\r'})
		if line == 1 {
			l = bytes.TrimPrefix(l, bom)
		}
		if !p.next(l, sp, off, next, line) {
			return
		}
		off = next
	}
	if p.state < inItems || p.regionEnd-p.regionStart < yamlRunsMin {
		return
	}
	return p.header(data), p.keyLine, p.seqLine, p.indent, p.runs(data), true
}

// plainLineBreaks reports whether data breaks lines only at LF (or CRLF)
// and has a byte-order mark, if any, only at its start: the parser also
// counts a lone CR, NEL and the Unicode line and paragraph separators as
// line breaks, and the line scan counts LFs.
func plainLineBreaks(data []byte) bool {
	if bytes.Count(data, []byte{'\r'}) != bytes.Count(data, []byte("\r\n")) ||
		bytes.Contains(data, []byte("\u0085")) || bytes.Contains(data, []byte("\u2028")) || bytes.Contains(data, []byte("\u2029")) {
		return false
	}
	n := bytes.Count(data, bom)
	return n == 0 || n == 1 && bytes.HasPrefix(data, bom)
}

// Where the line scan stands.
const (
	beforeKey = iota // looking for "couples:"
	beforeSeq        // after it, before the first item
	inItems          // inside the sequence
	pastSeq          // past it
)

// runPlanner is the state of planYAMLRuns' line scan. Runs are cut as the
// items are found: each run's first offset and line, and how many items it
// has.
type runPlanner struct {
	state                    int
	keyLine, seqLine, indent int
	regionStart, regionEnd   int
	per                      int // items per run
	starts, startLines       []int
	counts                   []int
}

func (p *runPlanner) item(off, line int) {
	if len(p.counts) == 0 || p.counts[len(p.counts)-1] == p.per {
		p.starts, p.startLines, p.counts = append(p.starts, off), append(p.startLines, line), append(p.counts, 0)
	}
	p.counts[len(p.counts)-1]++
}

// next reads line l (sp spaces of indent, at offset off, the next line at
// next); false when the file is not of the shape runs are taken for.
func (p *runPlanner) next(l []byte, sp, off, next, line int) bool {
	// No document markers or directives anywhere.
	if len(l) > 0 && l[0] == '%' {
		return false
	}
	if (bytes.HasPrefix(l, []byte("---")) || bytes.HasPrefix(l, []byte("..."))) && (len(l) == 3 || l[3] == ' ' || l[3] == '\t') {
		return false
	}
	blank := len(bytes.Trim(l, " \t")) == 0
	if p.state != beforeKey && (blank || l[sp] == '#') {
		return true
	}
	switch p.state {
	case beforeKey:
		if rest, found := bytes.CutPrefix(l, []byte("couples:")); found && sp == 0 {
			r := bytes.TrimLeft(rest, " \t")
			if len(r) == 0 || (len(r) < len(rest) && r[0] == '#') {
				p.state, p.keyLine, p.regionStart = beforeSeq, line, next
			}
		}
	case beforeSeq:
		if (sp != 0 && sp != 2) || l[sp] != '-' || (len(l) > sp+1 && l[sp+1] != ' ') {
			return false
		}
		p.indent, p.state, p.seqLine = sp, inItems, line
		p.item(off, line)
	case inItems:
		switch {
		case sp > p.indent: // inside an item
		case sp < len(l) && l[sp] == '\t':
			return false
		case sp == p.indent && l[sp] == '-':
			if len(l) > sp+1 && l[sp+1] != ' ' {
				return false
			}
			p.item(off, line)
		case sp != 0 || !(l[0] == '_' || l[0] >= 'a' && l[0] <= 'z' || l[0] >= 'A' && l[0] <= 'Z'):
			return false
		default: // the sequence ends at a top-level key at column 0
			p.state, p.regionEnd = pastSeq, off
		}
	}
	return true
}

// header is the file with the sequence's lines left empty.
func (p *runPlanner) header(data []byte) []byte {
	blanked := bytes.Count(data[p.regionStart:p.regionEnd], []byte{'\n'})
	h := make([]byte, 0, p.regionStart+blanked+len(data)-p.regionEnd)
	h = append(h, data[:p.regionStart]...)
	h = append(h, bytes.Repeat([]byte{'\n'}, blanked)...)
	return append(h, data[p.regionEnd:]...)
}

func (p *runPlanner) runs(data []byte) []yamlRun {
	var runs []yamlRun
	for i := range p.starts {
		end := p.regionEnd
		if i+1 < len(p.starts) {
			end = p.starts[i+1]
		}
		runs = append(runs, yamlRun{data: data[p.starts[i]:end], line: p.startLines[i], items: p.counts[i]})
	}
	return runs
}

// decodeYAML parses one YAML document, catching a parser panic; more than
// one document is an error.
func decodeYAML(data []byte) (doc *yaml.Node, err error) {
	defer func() {
		if r := recover(); r != nil {
			doc, err = nil, fmt.Errorf("the YAML parser failed on this file (%v)", r)
		}
	}()
	doc = new(yaml.Node)
	dec := yaml.NewDecoder(bytes.NewReader(data))
	if err := dec.Decode(doc); err != nil {
		return nil, err
	}
	var more yaml.Node
	if err := dec.Decode(&more); err != io.EOF {
		if err == nil {
			return nil, errMoreDocs{more.Line}
		}
		return nil, err
	}
	return doc, nil
}

// decodeFirstYAML parses the first YAML document of data, as yaml.v3
// reads a byte slice it holds whole (a little faster than decodeYAML's
// reader), and never fails by panicking. A run needs no check for a second
// document: one would hide items, and parseRun counts them.
func decodeFirstYAML(data []byte) (doc *yaml.Node, err error) {
	defer func() {
		if r := recover(); r != nil {
			doc, err = nil, fmt.Errorf("the YAML parser failed on this file (%v)", r)
		}
	}()
	doc = new(yaml.Node)
	if err := yaml.Unmarshal(data, doc); err != nil {
		return nil, err
	}
	return doc, nil
}

type errMoreDocs struct{ line int }

func (e errMoreDocs) Error() string {
	return fmt.Sprintf("line %d: more than one YAML document (---); a library is one document", e.line)
}

// parseYAMLRuns parses the header of a file planned for runs and checks
// that "couples:" is a key of its top-level block mapping with nothing after
// it; it returns nil when the file must take the whole-document path.
func parseYAMLRuns(f File) *yamlDoc {
	header, keyLine, seqLine, indent, runs, ok := planYAMLRuns(f.Data)
	if !ok {
		return nil
	}
	doc, err := decodeYAML(header)
	if err != nil || doc.Kind != yaml.DocumentNode || len(doc.Content) != 1 {
		return nil
	}
	root := doc.Content[0]
	if root.Kind != yaml.MappingNode || root.Style&yaml.FlowStyle != 0 || root.Column != 1 || root.Anchor != "" || root.Tag != "!!map" {
		return nil
	}
	for i := 0; i+1 < len(root.Content); i += 2 {
		k, v := root.Content[i], root.Content[i+1]
		if k.Line != keyLine {
			continue
		}
		if k.Kind != yaml.ScalarNode || k.Style != 0 || k.Column != 1 || k.Value != "couples" || k.Anchor != "" || k.Tag != "!!str" ||
			v.Kind != yaml.ScalarNode || v.Style != 0 || v.Tag != "!!null" || v.Value != "" || v.Anchor != "" {
			return nil
		}
		seq := &yaml.Node{Kind: yaml.SequenceNode, Tag: "!!seq", Line: seqLine, Column: indent + 1}
		root.Content[i+1] = seq
		return &yamlDoc{file: f.Name, root: root, runs: &yamlRuns{seq: seq, indent: indent, runs: runs}}
	}
	return nil
}

var runPrefix = []byte("couples:\n")

// parseRun parses one run as "couples:\n" and its lines, and returns its
// items with their lines moved to the file's; ok is false on any parser
// error or when the parser does not see the items the line scan counted.
func parseRun(r yamlRun) (items []*yaml.Node, ok bool) {
	src := make([]byte, 0, len(runPrefix)+len(r.data))
	src = append(append(src, runPrefix...), r.data...)
	doc, err := decodeFirstYAML(src)
	if err != nil || doc.Kind != yaml.DocumentNode || len(doc.Content) != 1 {
		return nil, false
	}
	root := doc.Content[0]
	if root.Kind != yaml.MappingNode || len(root.Content) != 2 {
		return nil, false
	}
	seq := root.Content[1]
	if seq.Kind != yaml.SequenceNode || seq.Style != 0 || seq.Tag != "!!seq" || seq.Anchor != "" || len(seq.Content) != r.items {
		return nil, false
	}
	shift := r.line - 2
	var walk func(n *yaml.Node)
	walk = func(n *yaml.Node) {
		n.Line += shift
		for _, c := range n.Content {
			walk(c)
		}
	}
	for _, it := range seq.Content {
		walk(it)
	}
	return seq.Content, true
}

// runCouples reads the couples of a file planned for runs: the runs are
// parsed on every core, a few ahead of the reader, and their items read in
// file order. It returns false when a run fails to parse; every goroutine
// it starts has ended when it returns.
func (ld *loader) runCouples(d *yamlDoc, def *thermo.Solvent) bool {
	runs := d.runs.runs
	workers := max(1, min(runtime.GOMAXPROCS(0), len(runs)))
	type result struct {
		items []*yaml.Node
		ok    bool
	}
	res := make([]chan result, len(runs))
	for i := range res {
		res[i] = make(chan result, 1)
	}
	// ahead holds a token for each run parsed and not yet read.
	ahead := make(chan struct{}, workers+1)
	next := make(chan int)
	stop := make(chan struct{})
	var wg sync.WaitGroup
	wg.Add(1)
	go func() {
		defer wg.Done()
		defer close(next)
		for i := range runs {
			select {
			case ahead <- struct{}{}:
			case <-stop:
				return
			}
			select {
			case next <- i:
			case <-stop:
				return
			}
		}
	}()
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				items, ok := parseRun(runs[i])
				res[i] <- result{items, ok}
			}
		}()
	}
	defer func() {
		close(stop)
		wg.Wait()
	}()
	for i := range runs {
		r := <-res[i]
		res[i] = nil
		<-ahead
		if !r.ok {
			return false
		}
		for _, it := range r.items {
			ld.yamlCouple(d.file, it, def)
		}
	}
	return true
}

// nextLine returns the line of data that starts at off, without its '\n',
// and the offset of the line after it.
func nextLine(data []byte, off int) (line []byte, next int) {
	end := bytes.IndexByte(data[off:], '\n')
	if end < 0 {
		return data[off:], len(data)
	}
	return data[off : off+end], off + end + 1
}
