package tui

import "github.com/charmbracelet/lipgloss"

// The palette: the only colours in the package. Each adapts to light and
// dark backgrounds; with NO_COLOR (or a plain profile) they all vanish, and
// every meaning they carry is also written as a word or a symbol.
var (
	colAccent   = lipgloss.AdaptiveColor{Light: "#1f5fa8", Dark: "#7fb4ff"}
	colDim      = lipgloss.AdaptiveColor{Light: "#6b6b6b", Dark: "#9a9a9a"}
	colDownhill = lipgloss.AdaptiveColor{Light: "#b3261e", Dark: "#ff7a70"} // H2 wins: a warning
	colNear     = lipgloss.AdaptiveColor{Light: "#8a6d00", Dark: "#e8c547"}
	colUphill   = lipgloss.AdaptiveColor{Light: "#1d7a34", Dark: "#6fd38a"}
	colSelBg    = lipgloss.AdaptiveColor{Light: "#d6e4f5", Dark: "#2c3e57"}
	colWarnBg   = lipgloss.AdaptiveColor{Light: "#fff1c2", Dark: "#4a3b00"}
)

// Styles are built once; nothing in a render loop makes a new style.
type Styles struct {
	Top, TopDim                  lipgloss.Style
	TabActive, TabIdle           lipgloss.Style
	Header, Row, Selected, Dim   lipgloss.Style
	Downhill, Near, Uphill, Warn lipgloss.Style
	Status, Error, Dialog        lipgloss.Style
	Bottleneck, Axis, H2Line     lipgloss.Style
	Accent                       lipgloss.Style
}

// DefaultStyles builds the styles for a renderer (its colour profile and
// background decide what the adaptive colours become).
func DefaultStyles(r *lipgloss.Renderer) *Styles {
	n := r.NewStyle
	return &Styles{
		Top:        n().Bold(true),
		TopDim:     n().Foreground(colDim),
		TabActive:  n().Bold(true).Underline(true).Foreground(colAccent),
		TabIdle:    n().Foreground(colDim),
		Header:     n().Bold(true),
		Row:        n(),
		Selected:   n().Background(colSelBg).Bold(true),
		Dim:        n().Foreground(colDim),
		Downhill:   n().Foreground(colDownhill),
		Near:       n().Foreground(colNear),
		Uphill:     n().Foreground(colUphill),
		Warn:       n().Background(colWarnBg).Bold(true),
		Status:     n().Foreground(colDim),
		Error:      n().Foreground(colDownhill).Bold(true),
		Dialog:     n().Border(lipgloss.RoundedBorder()).BorderForeground(colAccent).Padding(0, 1),
		Bottleneck: n().Bold(true).Foreground(colDownhill),
		Axis:       n().Foreground(colDim),
		H2Line:     n().Foreground(colDownhill),
		Accent:     n().Foreground(colAccent).Bold(true),
	}
}
