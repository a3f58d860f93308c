// Command hatsieve-gen writes a seeded synthetic library of X–H couples, in
// CSV or YAML, for benchmarks and load tests. Every couple and number in it
// is invented: BDFEs spread over 40–110 kcal/mol (most near 80), some given
// directly (with or without σ), some through pKa and E°(X•/X⁻) in
// acetonitrile, a few through both.
//
//	hatsieve-gen [-n N] [-donors D] [-acceptors A] [-format csv|yaml] [-seed S] [-o FILE [-force]]
//
// -n couples get mixed roles (donor, acceptor or both); -donors and
// -acceptors add couples of one role only. The same flags and seed always
// give the same file.
package main

import (
	"bufio"
	"encoding/csv"
	"errors"
	"flag"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// Numbers of the cycle in acetonitrile on the 2022 basis, as hatsieve's
// solvent table holds them, used only to pick pKa and E° that land near the
// BDFE drawn for a couple: BDFE = 2.303RT·pKa + F·E° + C_G.
const (
	rtLn10 = 1.3642470130090958 // kcal/mol at 298.15 K
	farad  = 23.060547829827915 // kcal mol⁻¹ V⁻¹
	cgMeCN = 52.6               // kcal/mol, potentials vs Fc+/Fc
)

type config struct {
	n, donors, acceptors int
	format               string
	seed                 uint64
	out                  string
	force                bool
}

func run(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("hatsieve-gen", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var c config
	fs.IntVar(&c.n, "n", 0, "couples with mixed roles")
	fs.IntVar(&c.donors, "donors", 0, "couples that are donors only")
	fs.IntVar(&c.acceptors, "acceptors", 0, "couples that are acceptors only")
	fs.StringVar(&c.format, "format", "csv", "csv or yaml")
	fs.Uint64Var(&c.seed, "seed", 1, "random seed")
	fs.StringVar(&c.out, "o", "", "output file (default: standard output)")
	fs.BoolVar(&c.force, "force", false, "replace an existing output file")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			fs.SetOutput(stdout)
			fmt.Fprintln(stdout, "usage: hatsieve-gen [-n N] [-donors D] [-acceptors A] [-format csv|yaml] [-seed S] [-o FILE [-force]]")
			fs.PrintDefaults()
			return 0
		}
		fmt.Fprintf(stderr, "hatsieve-gen: %v\n", err)
		return 2
	}
	if err := c.check(fs.NArg()); err != nil {
		fmt.Fprintf(stderr, "hatsieve-gen: %v\n", err)
		return 2
	}
	if err := c.write(stdout); err != nil {
		fmt.Fprintf(stderr, "hatsieve-gen: %v\n", err)
		return 1
	}
	return 0
}

func (c config) check(nargs int) error {
	switch {
	case nargs > 0:
		return errors.New("no arguments expected beyond the flags")
	case c.n < 0 || c.donors < 0 || c.acceptors < 0:
		return errors.New("-n, -donors and -acceptors must not be negative")
	case c.n+c.donors+c.acceptors == 0:
		return errors.New("nothing to write: give -n, -donors or -acceptors")
	case c.n+c.donors+c.acceptors > 10_000_000:
		return errors.New("more than 10^7 couples: too many")
	case c.format != "csv" && c.format != "yaml":
		return fmt.Errorf("-format: want csv or yaml, got %q", c.format)
	}
	return nil
}

// write sends the library to stdout, or to -o through a temporary file in
// the same folder that takes the name only when complete: an interrupted run
// leaves any earlier file whole, and one is replaced only with -force.
func (c config) write(stdout io.Writer) (err error) {
	if c.out == "" {
		return c.generate(stdout)
	}
	exists := fmt.Errorf("%s exists: use -force to replace it", c.out)
	if _, err := os.Lstat(c.out); err == nil && !c.force {
		return exists
	}
	tmp, err := os.CreateTemp(filepath.Dir(c.out), "."+filepath.Base(c.out)+".tmp-*")
	if err != nil {
		return err
	}
	defer os.Remove(tmp.Name()) // gone once renamed or linked
	err = c.generate(tmp)
	if cerr := tmp.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return err
	}
	if err := os.Chmod(tmp.Name(), 0o644); err != nil {
		return err
	}
	if c.force {
		return os.Rename(tmp.Name(), c.out)
	}
	if err := os.Link(tmp.Name(), c.out); errors.Is(err, os.ErrExist) {
		return exists
	} else if err != nil {
		return err
	}
	return nil
}

// couple is one generated row; empty strings are fields left out.
type couple struct {
	id, name, bond, roles              string
	bdfe                               string
	pka, pkaSigma, eAnion, eSigma, eVs string
	source, status, tags               string
}

var bonds = []string{"O–H", "N–H", "C–H", "S–H", "M–H"}

func (c config) couples(yield func(couple)) {
	rng := rand.New(rand.NewPCG(c.seed, 0x6861747369657665))
	total := c.n + c.donors + c.acceptors
	width := len(strconv.Itoa(total))
	for k := range total {
		var cp couple
		switch {
		case k < c.n:
			switch r := rng.IntN(20); {
			case r < 9:
				cp.roles = "donor"
			case r < 18:
				cp.roles = "acceptor"
			default:
				cp.roles = "donor;acceptor"
			}
			cp.id = fmt.Sprintf("c%0*d", width, k+1)
		case k < c.n+c.donors:
			cp.roles = "donor"
			cp.id = fmt.Sprintf("d%0*d", width, k+1-c.n)
		default:
			cp.roles = "acceptor"
			cp.id = fmt.Sprintf("a%0*d", width, k+1-c.n-c.donors)
		}
		cp.name = "synthetic couple " + cp.id
		cp.bond = bonds[rng.IntN(len(bonds))]
		cp.source = fmt.Sprintf("hatsieve-gen seed %d (invented)", c.seed)
		cp.status = "invented"
		cp.tags = "synthetic"
		b := min(110, max(40, 80+13*rng.NormFloat64()))
		route := rng.IntN(20) // 0–10 direct, 11–18 cycle, 19 both
		if route <= 10 || route == 19 {
			cp.bdfe = strconv.FormatFloat(b, 'f', 2, 64)
			if s := rng.IntN(5); s > 0 {
				cp.bdfe += " ± " + strconv.FormatFloat(0.5*float64(s), 'f', 1, 64)
			}
		}
		if route > 10 {
			// E° between −2 and +1 V vs Fc+/Fc with a pKa between 0 and 45
			// that closes the cycle near b; a direct value stands in if none
			// is found.
			found := false
			for range 8 {
				e := -2 + 3*rng.Float64()
				pka := (b - cgMeCN - farad*e) / rtLn10
				if pka < 0 || pka > 45 {
					continue
				}
				cp.pka = strconv.FormatFloat(pka, 'f', 2, 64)
				cp.eAnion = strconv.FormatFloat(e, 'f', 3, 64)
				cp.eVs = "Fc+/Fc"
				if rng.IntN(2) == 0 {
					cp.pkaSigma = "0.3"
					cp.eSigma = "0.01"
				}
				found = true
				break
			}
			if !found && cp.bdfe == "" {
				cp.bdfe = strconv.FormatFloat(b, 'f', 2, 64)
			}
		}
		yield(cp)
	}
}

var csvHeader = []string{"id", "name", "bond", "roles", "solvent", "bdfe", "pka", "pka_sigma", "e_anion", "e_anion_sigma", "e_anion_vs", "source", "status", "tags"}

func (c config) generate(w io.Writer) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	if c.format == "csv" {
		cw := csv.NewWriter(bw)
		cw.Write(csvHeader)
		c.couples(func(cp couple) {
			cw.Write([]string{cp.id, cp.name, cp.bond, cp.roles, "acetonitrile", cp.bdfe, cp.pka, cp.pkaSigma, cp.eAnion, cp.eSigma, cp.eVs, cp.source, cp.status, cp.tags})
		})
		cw.Flush()
		if err := cw.Error(); err != nil {
			return err
		}
		return bw.Flush()
	}
	total := c.n + c.donors + c.acceptors
	fmt.Fprintf(bw, "# Synthetic library written by hatsieve-gen (seed %d): every couple and\n# number in it is invented, for benchmarks only.\n", c.seed)
	fmt.Fprintf(bw, "format: hatsieve/1\ntitle: synthetic library, %d couples (seed %d)\nsolvent: acetonitrile\ncouples:\n", total, c.seed)
	c.couples(func(cp couple) {
		fmt.Fprintf(bw, "  - id: %s\n    name: %s\n    bond: %s\n    roles: [%s]\n", cp.id, cp.name, cp.bond, strings.ReplaceAll(cp.roles, ";", ", "))
		if cp.bdfe != "" {
			fmt.Fprintf(bw, "    bdfe: %s\n", cp.bdfe)
		}
		if cp.pka != "" {
			if cp.pkaSigma != "" {
				fmt.Fprintf(bw, "    pka: %s ± %s\n    e_anion: %s ± %s V vs %s\n", cp.pka, cp.pkaSigma, cp.eAnion, cp.eSigma, cp.eVs)
			} else {
				fmt.Fprintf(bw, "    pka: %s\n    e_anion: %s V vs %s\n", cp.pka, cp.eAnion, cp.eVs)
			}
		}
		fmt.Fprintf(bw, "    source: %s\n    status: %s\n    tags: [%s]\n", strconv.Quote(cp.source), cp.status, cp.tags)
	})
	return bw.Flush()
}
