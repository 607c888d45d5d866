package feature

// This file implements the heat and material balance diagram of a whole file, the drawing hmb
// plot --kind flowsheet --values writes, returned by a command for editors that show SVG.

import (
	"context"
	"fmt"

	"hmb/lsp/cache"
	"hmb/thermo/report"
)

// CommandFlowsheet is the command that returns the heat and material balance diagram of the
// document whose URI is its one argument, as a standalone SVG document.
const CommandFlowsheet = "hmb.flowsheet"

// Flowsheet draws the snapshot's heat and material balance diagram, each stream's flow,
// pressure and temperature under its tag, waiting (under ctx) for its solution. A file the
// notation could not read into a model is an error; an unsolved one draws its streams dashed.
func Flowsheet(ctx context.Context, snap *cache.Snapshot) (string, error) {
	in, err := reportInput(ctx, snap)
	if err != nil {
		return "", err
	}
	if in.Model == nil {
		return "", fmt.Errorf("%s could not be read into a model: see its diagnostics", in.Path)
	}
	return report.PlotString(in, report.PlotOptions{Kind: report.Flowsheet, Values: true})
}
