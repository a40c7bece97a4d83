package main

import (
	"bytes"
	"fmt"
	"os"

	"github.com/phgate/phgate/rules/report/chart"
	"github.com/phgate/phgate/spec/evaluate"
	"github.com/phgate/phgate/spec/project"
)

func (a *App) plot(args []string) int {
	fs := a.flags("plot", "RECIPE -o FILE.svg|FILE.png")
	kind := fs.String("kind", "titration", "chart: titration, species, capacity or temperature")
	out := fs.String("o", "", "output file, ending in .svg or .png (required)")
	titrant := fs.String("titrant", "", "catalog ingredient to titrate with (default: the recipe's q.s. titrant, or strong acid and base)")
	width := fs.String("width", "16cm", "chart width (cm, mm, in, pt, or px at --dpi)")
	height := fs.String("height", "10cm", "chart height (cm, mm, in, pt, or px at --dpi)")
	dpi := fs.Int("dpi", chart.DefaultSize.DPI, "dots per inch of PNG output (and of px sizes)")
	paths, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	if len(paths) != 1 || *out == "" {
		fs.Usage()
		return ExitProblem
	}
	k, err := chart.ParseKind(*kind)
	if err != nil {
		return a.fail("%v", err)
	}
	format, err := chart.FormatOf(*out)
	if err != nil {
		return a.fail("%v", err)
	}
	size, err := chartSize(*width, *height, *dpi)
	if err != nil {
		return a.fail("%v", err)
	}
	res, minCap, status := a.solveOne(paths[0])
	if res == nil {
		return status
	}
	c, err := chart.Build(res, k, chart.Options{Titrant: *titrant, MinCapacity: minCap})
	if err != nil {
		return a.fail("%s: %v", paths[0], err)
	}
	var buf bytes.Buffer
	if err := c.Render(&buf, format, size); err != nil {
		return a.fail("drawing the %s chart: %v", k, err)
	}
	return a.writeOutput(*out, buf.Bytes())
}

// chartSize reads --width, --height and --dpi.
func chartSize(width, height string, dpi int) (chart.Size, error) {
	if dpi <= 0 {
		return chart.Size{}, fmt.Errorf("--dpi must be positive")
	}
	w, err := chart.ParseLength(width, dpi)
	if err != nil {
		return chart.Size{}, fmt.Errorf("--width: %v", err)
	}
	h, err := chart.ParseLength(height, dpi)
	if err != nil {
		return chart.Size{}, fmt.Errorf("--height: %v", err)
	}
	s := chart.Size{Width: w, Height: h, DPI: dpi}
	if err := s.Validate(); err != nil {
		return chart.Size{}, err
	}
	return s, nil
}

// solveOne loads and solves one recipe file and returns it with the
// weak-buffer minimum that applies to it; on failure it prints the
// problems and returns a nil result with the exit status.
func (a *App) solveOne(path string) (*evaluate.Result, float64, int) {
	run := project.Discover([]string{path})
	pols, ps := policies(run)
	if len(ps) > 0 {
		return nil, 0, a.problems(ps)
	}
	if len(run.Files) != 1 || run.Files[0].Recipe == nil && len(run.Files[0].Problems) == 0 {
		return nil, 0, a.fail("%s: not a recipe file", path)
	}
	file := run.Files[0]
	res, ps := file.Evaluate()
	if len(ps) > 0 {
		return nil, 0, a.problems(ps)
	}
	return res, pols[file.Project()].BufferCapacityMinimum(res.Recipe), ExitOK
}

// writeOutput writes the finished output in one go, so a failed run
// leaves no half-written file behind.
func (a *App) writeOutput(path string, data []byte) int {
	if err := os.WriteFile(path, data, 0o644); err != nil {
		return a.fail("cannot write %s: %v", path, unwrapPath(err))
	}
	return ExitOK
}

// unwrapPath drops the operation and path of an *os.PathError, which the
// message already names.
func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}
