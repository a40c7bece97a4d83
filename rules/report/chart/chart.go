package chart

import (
	"fmt"
	"strings"
)

// Kind names one of the charts phgate draws for a recipe.
type Kind int

const (
	// Titration is pH against titrant added.
	Titration Kind = iota
	// Species is the fraction of each protonation state against pH.
	Species
	// Capacity is buffer capacity against pH.
	Capacity
	// Temperature is pH against temperature.
	Temperature
)

// Kinds lists every kind in report order.
var Kinds = []Kind{Titration, Species, Capacity, Temperature}

// String returns the kind's name as used by --kind.
func (k Kind) String() string {
	switch k {
	case Titration:
		return "titration"
	case Species:
		return "species"
	case Capacity:
		return "capacity"
	case Temperature:
		return "temperature"
	}
	return "unknown"
}

// ParseKind reads a --kind value.
func ParseKind(s string) (Kind, error) {
	for _, k := range Kinds {
		if strings.EqualFold(strings.TrimSpace(s), k.String()) {
			return k, nil
		}
	}
	names := make([]string, len(Kinds))
	for i, k := range Kinds {
		names[i] = k.String()
	}
	return 0, fmt.Errorf("unknown chart kind %q (use %s)", s, strings.Join(names, ", "))
}

// Chart is one figure ready to draw: numbers in display units.
type Chart struct {
	Kind Kind
	// Recipe is the recipe id.
	Recipe string
	// Title and Subtitle head the figure.
	Title, Subtitle string
	// MaxLegendSeries caps the series listed in the legend: when a chart
	// has more curves, only its panels' direct labels name them (0: no cap).
	MaxLegendSeries int
	// Panels are drawn in a grid, left to right, top to bottom.
	Panels []Panel
	// Titration holds the raw sweeps of a Titration chart (nil otherwise),
	// for callers that want the numbers behind the curve.
	Titration *TitrationData
}

// Axis is one axis of a panel.
type Axis struct {
	Label string
	// Min and Max fix the range; when Min >= Max the range follows the data.
	Min, Max float64
	// Log selects a logarithmic scale (all values must be positive).
	Log bool
	// Alt, when set, prints a second value under each tick label.
	Alt *AltScale
}

// AltScale converts an axis value to a second unit shown under each tick
// label, e.g. mmol of titrant to mL of its stock.
type AltScale struct {
	// Factor multiplies the axis value.
	Factor float64
	// Unit follows the converted number ("mL").
	Unit string
}

// Panel is one plotting area with its own axes.
type Panel struct {
	Title string
	X, Y  Axis
	// Series are curves; the position of a series in the slice picks its
	// line style, so the k-th series looks the same in every panel.
	Series []Series
	Bands  []Band
	Refs   []Ref
	Marks  []Mark
	// Note is printed in the middle of an empty panel.
	Note string
	// LabelCurves writes each series' label at the curve's highest point,
	// for panels whose series would crowd a legend.
	LabelCurves bool
}

// Series is one curve.
type Series struct {
	Label string
	X, Y  []float64
}

// Band shades an interval of one axis across the whole panel.
type Band struct {
	Label string
	// OnX shades an interval of the x axis; otherwise of the y axis.
	OnX bool
	// Lo and Hi bound the interval; an infinite end runs to the panel edge.
	Lo, Hi float64
}

// RefStyle picks how a reference line is drawn.
type RefStyle int

const (
	// Guide is a faint dotted line (pKa values).
	Guide RefStyle = iota
	// Limit is a strong dashed line (a rule's threshold).
	Limit
	// Marker is a thin dash-dot line (the recipe's own value).
	Marker
)

// Ref is a straight reference line across a panel.
type Ref struct {
	// Text is written beside the line; Legend is its legend entry (lines
	// with the same Legend share one entry; empty: none).
	Text, Legend string
	// OnX draws a vertical line at x = At; otherwise horizontal at y = At.
	OnX   bool
	At    float64
	Style RefStyle
}

// Mark is a highlighted point, the recipe as made.
type Mark struct {
	Label string
	X, Y  float64
}
