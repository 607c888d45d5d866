package feature

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// Diagnostics converts findings to the protocol's form: codes and messages exactly as hmb check
// prints them, related places (the other given of a conflict, the streams of a balance) as
// related information. The result is never nil, so that an empty set is published as [].
func Diagnostics(uri protocol.DocumentURI, m cache.Mapper, diags []model.Diagnostic) []protocol.Diagnostic {
	out := make([]protocol.Diagnostic, 0, len(diags))
	for _, d := range diags {
		out = append(out, Diagnostic(uri, m, d))
	}
	return out
}

// Diagnostic converts one finding.
func Diagnostic(uri protocol.DocumentURI, m cache.Mapper, d model.Diagnostic) protocol.Diagnostic {
	pd := protocol.Diagnostic{
		Range:    m.Range(d.Span),
		Severity: protocol.DiagnosticSeverity(d.Severity),
		Source:   "hmb",
		Message:  d.Message,
	}
	if d.Code != "" {
		pd.Code = d.Code
	}
	if pd.Severity == 0 {
		pd.Severity = protocol.DiagnosticSeverityError
	}
	for _, r := range d.Related {
		pd.RelatedInformation = append(pd.RelatedInformation, protocol.DiagnosticRelatedInformation{
			Location: protocol.Location{URI: uri, Range: m.Range(r.Span)},
			Message:  r.Message,
		})
	}
	return pd
}
