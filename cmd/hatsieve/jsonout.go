package main

import (
	"bytes"
	"encoding/json"
	"math"
	"strconv"

	"github.com/hatsieve/hatsieve/data"
)

// object is a JSON object that keeps its keys in the order they were added,
// so the output reads the same way as the key order data/FORMAT.md gives.
type object []field

type field struct {
	key string
	val any
}

func (o object) add(key string, val any) object { return append(o, field{key, val}) }

// MarshalJSON writes the fields in order. Floats are written as
// data.FormatNumber writes them (rounded to data.Decimals decimals).
func (o object) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	for i, f := range o {
		if i > 0 {
			b.WriteByte(',')
		}
		k, _ := json.Marshal(f.key)
		b.Write(k)
		b.WriteByte(':')
		switch v := f.val.(type) {
		case sigFigs:
			if math.IsNaN(float64(v)) || math.IsInf(float64(v), 0) {
				b.WriteString("null")
			} else {
				b.WriteString(strconv.FormatFloat(float64(v), 'g', 6, 64))
			}
		case float64:
			if math.IsNaN(v) || math.IsInf(v, 0) {
				b.WriteString("null")
			} else {
				b.WriteString(data.FormatNumber(v))
			}
		default:
			j, err := json.Marshal(v)
			if err != nil {
				return nil, err
			}
			b.Write(j)
		}
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// sigFigs is a dimensionless number written to 6 significant digits rather
// than 4 decimals: a fraction such as an equilibrium conversion of
// 0.999928, or 1.5e-15 of the acceptor left (data/FORMAT.md, Numbers).
type sigFigs float64

// round is data.Round, the one rounding rule of CSV, JSON and the table
// (data/FORMAT.md, Numbers).
func round(v float64) float64 { return data.Round(v) }
