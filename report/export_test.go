package report

import "scaleplan/sweep"

// SysTool lets the external tests find a program from the system's
// packages the same way (see sysTool).
var SysTool = sysTool

// MemoWords rewrites a sentence of sweep as the memo says it (proseText
// with the study's own names kept), so the tests can compare the memo
// with the workbook, which keeps sweep's words.
func MemoWords(res *sweep.Result, s string) string { return proseText(s, userNames(res)) }
