package cases

import "hmb/thermo/model"

// Diagnostic codes of cases and sweeps, HMB8xx. They are stable: quick fixes and suppressions
// key on them. A case's own findings keep the solver's codes, marked with the case.
const (
	CodePointFailed = "HMB801"
	CodeSweepNotRun = "HMB802"
)

// Codes documents the codes of cases and sweeps.
var Codes = []model.CodeInfo{
	{Code: CodePointFailed, Name: "sweep-point-failed", Severity: model.Warning, Summary: "points of a sweep that did not solve (the first with its reason)",
		Help: "The sweep went on past these points; its table marks them. Where the reason is a state or balance the plant cannot reach there (a valve outlet above its inlet, a flash tank fed subcooled), the range goes beyond what the plant can do: narrow it, or read the curve up to there."},
	{Code: CodeSweepNotRun, Name: "sweep-not-run", Severity: model.Warning, Summary: "sweep not run: its case has errors, or it would keep too many values",
		Help: "Fix the errors of the case the sweep runs on; or name the results a sweep of a large plant shows (show NAME RESULT, ...), so that it keeps only those."},
}
