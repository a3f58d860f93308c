package thermo

// Series is an ordered list of acceptor couples that one substrate passes
// through as it takes H atoms one by one (N2 → N2H → … → NH3, say).
type Series struct {
	ID    string
	Name  string
	Steps []*Resolved
}

// SeriesResult is one donor driven through a series.
type SeriesResult struct {
	Donor *Resolved
	Steps []Pair // ΔG° of each step, in order
	// Bottleneck is the index of the step with the largest ΔG° (-1 if none).
	Bottleneck int
	// MeanBDFE is the mean BDFE of the series' bonds: the donor BDFE at which
	// the whole series is thermoneutral overall.
	MeanBDFE float64
	// Overall is the sum of the step ΔG° values.
	Overall float64
}

// RunSeries drives donor d through every step of s.
func RunSeries(d *Resolved, s Series, c Conditions) SeriesResult {
	r := SeriesResult{Donor: d, Bottleneck: -1}
	if len(s.Steps) == 0 {
		return r
	}
	sum := 0.0
	for i, a := range s.Steps {
		p := MakePair(d, a, c)
		r.Steps = append(r.Steps, p)
		r.Overall += p.DG.Kcal
		sum += a.BDFE.Kcal
		if r.Bottleneck < 0 || p.DG.Kcal > r.Steps[r.Bottleneck].DG.Kcal {
			r.Bottleneck = i
		}
	}
	r.MeanBDFE = sum / float64(len(s.Steps))
	return r
}
