package thermo

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// sortedOrder (a radix sort of the keys' bits) orders as comparing the keys
// as floats does, ties (−0 and +0 among them) by id, ascending and
// descending: negative and positive keys, many ties, tiny and huge
// magnitudes.
func TestSortedOrderAsComparisonSort(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	pool := []float64{0, math.Copysign(0, -1), 1, -1, 1e-300, -1e-300, 1e300, -1e300, 52.6, -52.6, 0.1, 0.30000000000000004}
	for _, n := range []int{1, 2, 7, 300, 5000} {
		key, id := make([]float64, n), make([]string, n)
		for i := range key {
			switch r.IntN(3) {
			case 0:
				key[i] = pool[r.IntN(len(pool))]
			case 1:
				key[i] = float64(r.IntN(20) - 10) // many ties
			default:
				key[i] = (r.Float64() - 0.5) * 200
			}
			id[i] = fmt.Sprintf("c%05d", r.IntN(100000))
		}
		for _, desc := range []bool{false, true} {
			sign := 1.0
			if desc {
				sign = -1
			}
			want := make([]int32, n)
			for i := range want {
				want[i] = int32(i)
			}
			slices.SortStableFunc(want, func(x, y int32) int {
				switch a, b := sign*key[x], sign*key[y]; {
				case a < b:
					return -1
				case a > b:
					return 1
				}
				return strings.Compare(id[x], id[y])
			})
			if got := sortedOrder(key, id, desc); !slices.Equal(got, want) {
				t.Fatalf("n %d, desc %v: order differs from the comparison sort", n, desc)
			}
		}
	}
}
