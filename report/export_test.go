package report

// SysTool lets the external tests find a program from the system's
// packages the same way (see sysTool).
var SysTool = sysTool
