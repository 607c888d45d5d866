package reconcile

import "hmb/thermo/model"

// Diagnostic codes of the reconciliation, stage 7 (measurements). They are stable: quick fixes
// and suppressions key on them.
const (
	CodeZeroUncertainty = "HMB701"
	CodeNotMeasurable   = "HMB702"
	CodeGlobalTest      = "HMB703"
	CodeSuspect         = "HMB704"
	CodeUnchecked       = "HMB705"
	CodeBalanceWithin   = "HMB706"
	CodeReconciled      = "HMB707"
	CodeIndistinct      = "HMB708"
	CodeNotReconciled   = "HMB709"
)

// Codes documents every code the reconciliation reports.
var Codes = []model.CodeInfo{
	{Code: CodeZeroUncertainty, Name: "zero-measurement-uncertainty", Severity: model.Error, Summary: "a measurement's ± is zero", Help: "A ± marks a measurement and states its 95 % uncertainty, which is above zero; leave the ± out for an exact value."},
	{Code: CodeNotMeasurable, Name: "not-a-measurement", Severity: model.Error, Summary: "a ± on a quantity no meter reads (h, s, x, an efficiency, a heat loss)", Help: "A ± marks a measurement; enthalpy, entropy, quality, efficiencies and heat losses are computed, not read. State the value without ±."},
	{Code: CodeGlobalTest, Name: "reconciliation-global-test-failed", Severity: model.Error, Summary: "the measurements fail the global test: their corrections are too large for their stated uncertainties", Help: "The sum of squared normalised corrections exceeds the 95 % quantile of chi-square for the redundancy: some meter is wrong, or some ± too small. The message names the most suspect meters first."},
	{Code: CodeSuspect, Name: "suspect-measurement", Severity: model.Warning, Summary: "a measurement's normalised correction is above 1.96: a suspect meter", Help: "Reconciliation had to move this reading by more than its uncertainty makes likely (95 %); check the meter and its stated ±."},
	{Code: CodeUnchecked, Name: "unchecked-measurement", Severity: model.Info, Summary: "a measurement no balance checks (its redundancy is zero)", Help: "No balance or other measurement checks this reading: it is taken as read, with its own uncertainty."},
	{Code: CodeBalanceWithin, Name: "balance-reconciled", Severity: model.Info, Summary: "a redundant balance of measured values, closed by the reconciliation", Help: "The balance was over-determined by measurements; the reconciled values close it exactly, and the message gives the mismatch of the readings against what their uncertainties allow."},
	{Code: CodeReconciled, Name: "reconciliation-passed", Severity: model.Info, Summary: "the measurements pass the global test", Help: "The corrections the reconciliation made are consistent with the measurements' stated uncertainties (95 %)."},
	{Code: CodeIndistinct, Name: "suspects-indistinguishable", Severity: model.Error, Summary: "the global test fails and the most suspect meters cannot be told apart without a further meter", Help: "The balances see only a combination of these meters (their corrections move together), so no test can say which one is wrong; a further meter in a balance that holds only one of them would."},
	{Code: CodeNotReconciled, Name: "reconciliation-failed", Severity: model.Error, Summary: "the measurements could not be reconciled (balances that contradict each other, equations that fix only a combination of values, no convergence)", Help: "The values shown are the solver's, not reconciled; the message says why."},
}
