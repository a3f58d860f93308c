package data

import (
	"bytes"
	"fmt"
	"io"
	"runtime"
	"sync"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"github.com/hatsieve/hatsieve/thermo"
)

// A large YAML library is read in runs of couples rather than as one node
// tree: yaml.v3 builds the whole tree of a document before the loader sees
// it (some 4 kB of heap per couple), while runs of a few hundred items,
// parsed on every core and read in file order, keep only a few runs in
// memory at once. Runs in the plainest YAML are read by quickRun, the others
// by yaml.v3.
//
// The fast path is taken only for the shape people and hatsieve-gen write:
// a block mapping at column 0 whose "couples:" key stands alone on its line
// and is followed by a block sequence whose "-" sit at column 0 or 2. The
// rest of the file (the "header") is parsed as one document with the
// sequence's lines blanked, so every other node keeps its line; each run is
// parsed as "couples:\n" followed by the run's own lines, so the parser is
// in the same state inside an item as it is in the whole file, and node
// lines are moved back to the file's. Anything the line scan does not
// recognise keeps the whole-document path, and so does any parser error in
// the header or a run: a run that fails is reported by starting the whole
// load again without the fast path, so problems and their lines are always
// the whole-document path's.

// yamlFastMin is the smallest couples section, in bytes, read in runs.
var yamlFastMin = 64 << 10

// yamlRunItems is how many couples make one run.
var yamlRunItems = 500

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
	// The parser counts a lone CR and the Unicode line and paragraph
	// separators (and NEL) as line breaks; lines here are counted by LF.
	if bytes.Count(data, []byte{'\r'}) != bytes.Count(data, []byte("\r\n")) ||
		bytes.Contains(data, []byte("\u0085")) || bytes.Contains(data, []byte("\u2028")) || bytes.Contains(data, []byte("\u2029")) {
		return
	}
	if n := bytes.Count(data, bom); n > 1 || n == 1 && !bytes.HasPrefix(data, bom) {
		return
	}
	const (
		before = iota // looking for "couples:"
		first         // after it, before the first item
		items         // inside the sequence
		after         // past it
	)
	state := before
	indent = -1
	regionStart, regionEnd := -1, len(data)
	// Runs are cut as the items are found: each run's first offset and
	// line, and how many items it has.
	per := max(1, yamlRunItems)
	var starts, startLines, counts []int
	item := func(off, line int) {
		if len(counts) == 0 || counts[len(counts)-1] == per {
			starts, startLines, counts = append(starts, off), append(startLines, line), append(counts, 0)
		}
		counts[len(counts)-1]++
	}
	line := 0
	for off := 0; off < len(data); {
		line++
		l, next := nextLine(data, off)
		sp := 0
		for sp < len(l) && l[sp] == ' ' {
			sp++
		}
		if state == items && sp > indent && sp < len(l) && l[sp] != '\r' {
			off = next
			continue // inside an item: the most common line, read quickly
		}
		l = bytes.TrimSuffix(l, []byte{'\r'})
		if line == 1 {
			l = bytes.TrimPrefix(l, bom)
		}
		// No document markers or directives anywhere.
		if len(l) > 0 && l[0] == '%' {
			return
		}
		if (bytes.HasPrefix(l, []byte("---")) || bytes.HasPrefix(l, []byte("..."))) && (len(l) == 3 || l[3] == ' ' || l[3] == '\t') {
			return
		}
		blank := len(bytes.Trim(l, " \t")) == 0
		comment := !blank && sp < len(l) && l[sp] == '#'
		switch state {
		case before:
			if rest, found := bytes.CutPrefix(l, []byte("couples:")); found && sp == 0 {
				r := bytes.TrimLeft(rest, " \t")
				if len(r) == 0 || (len(r) < len(rest) && r[0] == '#') {
					state, keyLine, regionStart = first, line, next
				}
			}
		case first:
			if blank || comment {
				break
			}
			if (sp != 0 && sp != 2) || l[sp] != '-' || (len(l) > sp+1 && l[sp+1] != ' ') {
				return
			}
			indent, state = sp, items
			seqLine = line
			item(off, line)
		case items:
			if blank || comment {
				break
			}
			if sp > indent {
				break // inside an item
			}
			if sp < len(l) && l[sp] == '\t' {
				return
			}
			if sp == indent && l[sp] == '-' {
				if len(l) > sp+1 && l[sp+1] != ' ' {
					return
				}
				item(off, line)
				break
			}
			// The sequence ends at a top-level key at column 0.
			if sp != 0 || !(l[0] == '_' || l[0] >= 'a' && l[0] <= 'z' || l[0] >= 'A' && l[0] <= 'Z') {
				return
			}
			state, regionEnd = after, off
		}
		off = next
	}
	if state < items || regionEnd-regionStart < yamlFastMin {
		return
	}
	header = make([]byte, 0, regionStart+bytes.Count(data[regionStart:regionEnd], []byte{'\n'})+len(data)-regionEnd)
	header = append(header, data[:regionStart]...)
	header = append(header, bytes.Repeat([]byte{'\n'}, bytes.Count(data[regionStart:regionEnd], []byte{'\n'}))...)
	header = append(header, data[regionEnd:]...)
	for i := range starts {
		end := regionEnd
		if i+1 < len(starts) {
			end = starts[i+1]
		}
		runs = append(runs, yamlRun{data: data[starts[i]:end], line: startLines[i], items: counts[i]})
	}
	return header, keyLine, seqLine, indent, runs, true
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
func parseRun(r yamlRun, indent int, a *nodeArena) (items []*yaml.Node, ok bool) {
	if items, ok := quickRun(r, indent, a); ok {
		return items, true
	}
	a.reset()
	return parseRunFull(r)
}

// parseRunFull parses a run with yaml.v3.
func parseRunFull(r yamlRun) (items []*yaml.Node, ok bool) {
	src := make([]byte, 0, len(runPrefix)+len(r.data))
	src = append(append(src, runPrefix...), r.data...)
	doc, err := decodeYAML(src)
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
// parsed on every core, at most one per core ahead of the reader, and their
// items read in file order. It returns false when a run fails to parse.
func (ld *loader) runCouples(d *yamlDoc, def *thermo.Solvent) bool {
	runs := d.runs.runs
	workers := max(1, min(runtime.GOMAXPROCS(0), len(runs)))
	type result struct {
		items []*yaml.Node
		ok    bool
		arena *nodeArena
	}
	res := make([]chan result, len(runs))
	for i := range res {
		res[i] = make(chan result, 1)
	}
	type job struct {
		i     int
		arena *nodeArena
	}
	next := make(chan job)
	stop := make(chan struct{})
	// Each run parsed and not yet read holds an arena; there are
	// workers+1 of them.
	arenas := make(chan *nodeArena, workers+1)
	for range workers + 1 {
		arenas <- new(nodeArena)
	}
	var wg sync.WaitGroup
	go func() {
		defer close(next)
		for i := range runs {
			// Arenas go to the runs in file order, so the run read next
			// always has one.
			var a *nodeArena
			select {
			case a = <-arenas:
			case <-stop:
				return
			}
			select {
			case next <- job{i, a}:
			case <-stop:
				return
			}
		}
	}()
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range next {
				items, ok := parseRun(runs[j.i], d.runs.indent, j.arena)
				res[j.i] <- result{items, ok, j.arena}
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
		if !r.ok {
			return false
		}
		for _, it := range r.items {
			ld.yamlCouple(d.file, it, def)
		}
		r.arena.reset()
		arenas <- r.arena
	}
	return true
}

// nodeArena hands out the nodes of one run from blocks that are used again
// once the run's couples are read, so that reading a large library leaves
// little garbage behind.
type nodeArena struct {
	nodes [][]yaml.Node
	ptrs  [][]*yaml.Node
	n, p  int // blocks in use are nodes[:n] (the last one partly), ptrs[:p]
}

const arenaBlock = 4096

func (a *nodeArena) reset() {
	for i, b := range a.nodes[:a.n] {
		clear(b)
		a.nodes[i] = b[:0]
	}
	for i, b := range a.ptrs[:a.p] {
		clear(b)
		a.ptrs[i] = b[:0]
	}
	a.n, a.p = 0, 0
}

// node returns a new node set to v.
func (a *nodeArena) node(v yaml.Node) *yaml.Node {
	if a.n == 0 || len(a.nodes[a.n-1]) == arenaBlock {
		if a.n == len(a.nodes) {
			a.nodes = append(a.nodes, make([]yaml.Node, 0, arenaBlock))
		}
		a.n++
	}
	b := &a.nodes[a.n-1]
	*b = append(*b, v)
	return &(*b)[len(*b)-1]
}

// list returns a copy of ns, kept in the arena.
func (a *nodeArena) list(ns []*yaml.Node) []*yaml.Node {
	if len(ns) == 0 {
		return nil
	}
	if len(ns) > arenaBlock {
		return append([]*yaml.Node(nil), ns...)
	}
	if a.p == 0 || len(a.ptrs[a.p-1])+len(ns) > arenaBlock {
		if a.p == len(a.ptrs) {
			a.ptrs = append(a.ptrs, make([]*yaml.Node, 0, arenaBlock))
		}
		a.p++
	}
	b := &a.ptrs[a.p-1]
	at := len(*b)
	*b = append(*b, ns...)
	return (*b)[at:len(*b):len(*b)]
}

// quickRun reads a run of couples written in the plainest YAML, as
// hatsieve-gen and most people write it, without the general parser: each
// item a block mapping whose lines are "KEY: VALUE" ("- KEY: VALUE" on its
// first line), every VALUE on one line and one of a plain scalar, a quoted
// scalar with no escape or quote inside, or a flow list of plain words.
// It gives the nodes yaml.v3 gives for the same text, as far as the loader
// looks at them (kind, value, null or not, line, column, style; a plain
// scalar that is not null is tagged !!str), and ok is false for anything
// else (comments after a value, tabs, multi-line scalars, nested mappings,
// anchors, tags...), which then goes to the parser.
func quickRun(r yamlRun, indent int, a *nodeArena) (items []*yaml.Node, ok bool) {
	data := r.data
	line := r.line - 1
	var item *yaml.Node
	var pairs, list []*yaml.Node
	done := func() {
		if item != nil {
			item.Content = a.list(pairs)
			pairs = pairs[:0]
		}
	}
	for off := 0; off < len(data); {
		line++
		l, next := nextLine(data, off)
		l = bytes.TrimSuffix(l, []byte{'\r'})
		off = next
		if !printableYAML(l) {
			return nil, false
		}
		sp := 0
		for sp < len(l) && l[sp] == ' ' {
			sp++
		}
		if sp == len(l) || l[sp] == '#' {
			continue // blank or a comment
		}
		switch {
		case sp == indent && l[sp] == '-' && len(l) > sp+2 && l[sp+1] == ' ' && l[sp+2] != ' ':
			done()
			item = a.node(yaml.Node{Kind: yaml.MappingNode, Tag: "!!map", Line: line, Column: indent + 3})
			items = append(items, item)
		case sp == indent+2 && item != nil:
		default:
			return nil, false
		}
		var k, v *yaml.Node
		var good bool
		k, v, list, good = quickPair(l, indent+2, line, a, list[:0])
		if !good {
			return nil, false
		}
		pairs = append(pairs, k, v)
	}
	done()
	return items, len(items) == r.items
}

// quickPair reads "KEY: VALUE" starting at byte at of l.
func quickPair(l []byte, at, line int, a *nodeArena, list []*yaml.Node) (k, v *yaml.Node, _ []*yaml.Node, ok bool) {
	i := at
	for i < len(l) && (l[i] == '_' || l[i] >= 'a' && l[i] <= 'z' || l[i] >= 'A' && l[i] <= 'Z' || i > at && l[i] >= '0' && l[i] <= '9') {
		i++
	}
	// The parser looks for a key's ':' within 1024 characters.
	if i == at || i-at > 100 || i+1 >= len(l) || l[i] != ':' || l[i+1] != ' ' {
		return nil, nil, list, false
	}
	k = a.node(yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: keyString(l[at:i]), Line: line, Column: at + 1})
	if isNullText(k.Value) {
		k.Tag = "!!null"
	}
	j := i + 1
	for j < len(l) && l[j] == ' ' {
		j++
	}
	rest := bytes.TrimRight(l[j:], " ")
	if len(rest) == 0 {
		return nil, nil, list, false
	}
	col := j + 1
	switch c := rest[0]; c {
	case '"', '\'':
		if len(rest) < 2 || rest[len(rest)-1] != c {
			return nil, nil, list, false
		}
		in := rest[1 : len(rest)-1]
		if bytes.IndexByte(in, c) >= 0 || bytes.IndexByte(in, '\\') >= 0 {
			return nil, nil, list, false
		}
		style := yaml.DoubleQuotedStyle
		if c == '\'' {
			style = yaml.SingleQuotedStyle
		}
		return k, a.node(yaml.Node{Kind: yaml.ScalarNode, Style: style, Tag: "!!str", Value: string(in), Line: line, Column: col}), list, true
	case '[':
		if rest[len(rest)-1] != ']' {
			return nil, nil, list, false
		}
		seq := a.node(yaml.Node{Kind: yaml.SequenceNode, Style: yaml.FlowStyle, Tag: "!!seq", Line: line, Column: col})
		in := rest[1 : len(rest)-1]
		if len(bytes.Trim(in, " ")) == 0 {
			return k, seq, list, true
		}
		p := j + 1 // offset of in within l
		for len(in) > 0 {
			word, after, more := bytes.Cut(in, []byte{','})
			lead := len(word) - len(bytes.TrimLeft(word, " "))
			w := bytes.TrimSpace(word)
			if !flowWord(w) || more && len(bytes.Trim(after, " ")) == 0 {
				return nil, nil, list, false
			}
			list = append(list, plainNode(a, w, line, p+lead+1))
			p += len(word) + 1
			in = after
		}
		seq.Content = a.list(list)
		return k, seq, list, true
	}
	if !plainValue(rest) {
		return nil, nil, list, false
	}
	return k, plainNode(a, rest, line, col), list, true
}

func plainNode(a *nodeArena, v []byte, line, col int) *yaml.Node {
	n := a.node(yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: string(v), Line: line, Column: col})
	if isNullText(n.Value) {
		n.Tag = "!!null"
	}
	return n
}

// isNullText reports whether a plain scalar is null (YAML 1.2 core schema).
func isNullText(s string) bool {
	switch s {
	case "~", "null", "Null", "NULL":
		return true
	}
	return false
}

// keyString is string(b), without a copy for the keys a library uses.
func keyString(b []byte) string {
	for _, k := range CoupleFields {
		if string(b) == k {
			return k
		}
	}
	switch string(b) {
	case "value":
		return "value"
	case "sigma":
		return "sigma"
	case "vs":
		return "vs"
	}
	return string(b)
}

// plainValue reports whether v, trimmed, is read by the parser as one plain
// scalar of that very text in a block mapping's value.
func plainValue(v []byte) bool {
	switch v[0] {
	case '?', ':', ',', '[', ']', '{', '}', '#', '&', '*', '!', '|', '>', '\'', '"', '%', '@', '`':
		return false
	case '-':
		if len(v) < 2 || v[1] == ' ' {
			return false
		}
	}
	return v[len(v)-1] != ':' && !bytes.Contains(v, []byte(": ")) && !bytes.Contains(v, []byte(" #"))
}

// flowWord reports whether w is one plain scalar inside a flow list: words
// of letters, digits and _ . + / ; - ~ separated by single spaces.
func flowWord(w []byte) bool {
	if len(w) == 0 || w[0] == '-' {
		return false
	}
	for i, c := range w {
		switch {
		case c >= 'a' && c <= 'z', c >= 'A' && c <= 'Z', c >= '0' && c <= '9':
		case c == '_' || c == '.' || c == '+' || c == '/' || c == ';' || c == '-' || c == '~':
		case c == ' ' && w[i-1] != ' ':
		default:
			return false
		}
	}
	return true
}

// printableYAML reports whether a line holds only what the parser takes
// without complaint in a plain or quoted scalar: printable ASCII and the
// printable Unicode it accepts (no tab, no control character, no byte
// order mark).
func printableYAML(l []byte) bool {
	for i := 0; i < len(l); {
		c := l[i]
		if c < utf8.RuneSelf {
			if c < 0x20 || c == 0x7f {
				return false
			}
			i++
			continue
		}
		r, n := utf8.DecodeRune(l[i:])
		if r == utf8.RuneError || r < 0xa0 || r >= 0xd800 && r < 0xe000 || r == 0xfeff || r == 0xfffe || r == 0xffff {
			return false
		}
		i += n
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
