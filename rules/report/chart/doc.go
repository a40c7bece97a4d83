// Package chart computes the curves of a solved recipe (titration,
// speciation, buffer capacity, temperature) and draws them as SVG or PNG
// with gonum.org/v1/plot.
//
// The package has two halves. The builders (Build, All) turn an
// evaluate.Result into a Chart: plain numbers in display units, every
// point taken from the solver's curve functions (no chemistry of its
// own). The renderer (Chart.Render) lays a Chart out in phgate's own
// style: a title band, one or more panels, and a legend column. Series
// differ by dash pattern and marker shape as well as colour, so a chart
// stays readable printed in black and white.
package chart
