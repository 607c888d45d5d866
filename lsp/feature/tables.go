package feature

// This file implements the solved tables of a whole file: the stream table and the unit table
// that hmb table prints, shown in the hover of the file's title and returned by a command.

import (
	"context"
	"net/url"

	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// CommandStreamTable is the command that returns the tables of the document whose URI is its
// one argument, as Markdown.
const CommandStreamTable = "hmb.streamTable"

// Tables returns the stream and unit tables of the snapshot as Markdown, waiting (under ctx) for
// its solution. A superseded snapshot, which will have no solution, tabulates as unsolved.
func Tables(ctx context.Context, snap *cache.Snapshot) (string, error) {
	syn := snap.Syntax()
	var sol *cache.Solution
	if syn.Model != nil {
		var err error
		sol, err = snap.Solution(ctx)
		if err != nil && ctx.Err() != nil {
			return "", err
		}
	}
	return snap.Analyzer().Tables(docName(string(snap.URI)), snap.Src(), syn, sol)
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
func titleSpan(src []byte, syn *cache.Syntax, t int) (model.Span, bool) {
	isTitle := func(i int) bool {
		tok := syn.Tokens[i]
		return tok.Kind == cache.KeywordToken && string(src[tok.Span.Start:tok.Span.End]) == "title"
	}
	tok := syn.Tokens[t]
	switch {
	case isTitle(t):
		sp := tok.Span
		if t+1 < len(syn.Tokens) && syn.Tokens[t+1].Kind == cache.StringToken {
			sp.End = syn.Tokens[t+1].Span.End
		}
		return sp, true
	case tok.Kind == cache.StringToken && t > 0 && isTitle(t-1):
		return model.Span{Start: syn.Tokens[t-1].Span.Start, End: tok.Span.End}, true
	}
	return model.Span{}, false
}
