package feature

// This file implements the solved tables of a whole file: the stream table and the unit table
// that hmb table prints, shown in the hover of the file's title and returned by a command.

import (
	"context"
	"net/url"
	"slices"
	"strings"

	"hmb/lang"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/report"
)

// CommandStreamTable is the command that returns the tables of the document whose URI is its
// one argument, as Markdown.
const CommandStreamTable = "hmb.streamTable"

// Tables returns the stream and unit tables of the snapshot as Markdown, the very tables hmb
// table prints, waiting (under ctx) for its solution. A superseded snapshot, which will have no
// solution, tabulates as unsolved.
func Tables(ctx context.Context, snap *cache.Snapshot) (string, error) {
	in, err := reportInput(ctx, snap)
	if err != nil {
		return "", err
	}
	var b strings.Builder
	if err := report.WriteMarkdown(&b, in); err != nil {
		return "", err
	}
	return b.String(), nil
}

// reportInput is the snapshot as the report package takes it: the checked file and, once the
// solver is done (under ctx), its solution; a superseded snapshot has none.
func reportInput(ctx context.Context, snap *cache.Snapshot) (*report.Input, error) {
	res := snap.Check()
	in := &report.Input{Path: docName(string(snap.URI)), Src: snap.Src(), Model: res.Model, Diags: slices.Clone(res.Diags)}
	if res.Model != nil {
		sol, err := snap.Solution(ctx)
		if err != nil && ctx.Err() != nil {
			return nil, err
		}
		if sol != nil {
			in.Result = sol
			in.Diags = append(in.Diags, sol.Diags...)
		}
	}
	return in, nil
}

// docName is the name a document goes by in a report: the path of a file URI, else the URI.
func docName(uri string) string {
	u, err := url.Parse(uri)
	if err != nil || u.Scheme != "file" || u.Path == "" {
		return uri
	}
	return u.Path
}

// titleSpan returns the span of the title setting when token t is its keyword or its string.
func titleSpan(src []byte, toks []lang.Token, t int) (model.Span, bool) {
	isTitle := func(i int) bool {
		tok := toks[i]
		return tok.Kind == lang.KeywordToken && string(src[tok.Pos:tok.End]) == "title"
	}
	tok := toks[t]
	switch {
	case isTitle(t):
		sp := model.Span{Start: tok.Pos, End: tok.End}
		if t+1 < len(toks) && toks[t+1].Kind == lang.StringToken {
			sp.End = toks[t+1].End
		}
		return sp, true
	case tok.Kind == lang.StringToken && t > 0 && isTitle(t-1):
		return model.Span{Start: toks[t-1].Pos, End: tok.End}, true
	}
	return model.Span{}, false
}
