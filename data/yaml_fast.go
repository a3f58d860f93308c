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
// it (some 4 kB of heap per couple), while runs of a few thousand items,
// parsed on every core and read in file order, keep only a few runs in
// memory at once.
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
var yamlFastMin = 256 << 10

// yamlRunItems is how many couples make one run.
var yamlRunItems = 2000

// yamlRun is one run of couples: the file's bytes from the first item's
// line to the line after the last item, and the file line it starts on.
type yamlRun struct {
	data  []byte
	line  int
	items int
}

// yamlRuns is a couples sequence cut into runs.
type yamlRuns struct {
	seq  *yaml.Node // the sequence node put in the header in its place
	runs []yamlRun
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
	var starts []int // offset of each item's line
	var startLines []int
	line := 0
	for off := 0; off < len(data); {
		line++
		end := bytes.IndexByte(data[off:], '\n')
		next := len(data)
		if end < 0 {
			end = len(data)
		} else {
			end += off
			next = end + 1
		}
		l := data[off:end]
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
		sp := 0
		for sp < len(l) && l[sp] == ' ' {
			sp++
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
			starts, startLines = append(starts, off), append(startLines, line)
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
				starts, startLines = append(starts, off), append(startLines, line)
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
	per := max(1, yamlRunItems)
	for i := 0; i < len(starts); i += per {
		j := min(i+per, len(starts))
		end := regionEnd
		if j < len(starts) {
			end = starts[j]
		}
		runs = append(runs, yamlRun{data: data[starts[i]:end], line: startLines[i], items: j - i})
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
		return &yamlDoc{file: f.Name, root: root, runs: &yamlRuns{seq: seq, runs: runs}}
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
// parsed on every core, at most two per core ahead of the reader, and their
// items read in file order. It returns false when a run fails to parse.
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
	next := make(chan int)
	stop := make(chan struct{})
	ahead := make(chan struct{}, 2*workers)
	var wg sync.WaitGroup
	go func() {
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
		<-ahead
		res[i] = nil
		if !r.ok {
			return false
		}
		for _, it := range r.items {
			ld.yamlCouple(d.file, it, def)
		}
	}
	return true
}
