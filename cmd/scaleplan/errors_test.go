package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestBadInput checks that every kind of bad input gets one clear line on
// stderr and the exit status of the manual: 1 for bad input, 2 for bad
// usage. None may panic.
func TestBadInput(t *testing.T) {
	cases := []struct {
		args []string
		code int
		want string
	}{
		{[]string{"rules", "--retain", "inertia,gravty"}, 1, `unknown law "gravty" (did you mean gravity?)`},
		{[]string{"rules", "--retain", "inertia", "--given", "densty=1"}, 1, `unknown quantity "densty" (did you mean density?)`},
		{[]string{"rules", "--retain", "inertia", "--given", "density"}, 1, `"density" is not QUANTITY=FACTOR`},
		{[]string{"rules", "--retain", "inertia", "--given", "density=abc"}, 1, `--given density: "abc" is not a number`},
		{[]string{"rules", "--retain", "inertia", "--given", "density=-2"}, 1, `must be a positive finite number`},
		{[]string{"rules", "--retain", "inertia", "--given", "density=1,density=2"}, 1, `density is given twice`},
		{[]string{"rules", "--retain", "inertia,gravity", "--relax", "gravity"}, 1, `both retained and relaxed`},
		{[]string{"rules", "--retain", "inertia,gravity", "--given", "thickness=2", "--length", "25"}, 1, `inconsistent request: the given scale factors break the geometric tie thickness = length`},
		{[]string{"rules", "--retain", "inertia", "--untie", "velocity"}, 1, `cannot be untied`},
		{[]string{"rules", "--retain", "inertia", "--length", "0"}, 1, `--length: a scale factor must be a positive finite number`},
		{[]string{"rules", "--retain", "inertia", "--length", "NaN"}, 1, `--length`},
		{[]string{"rules"}, 2, `Required flag "retain" not set`},
		{[]string{"rules", "--retian", "inertia"}, 2, `flag provided but not defined: -retian`},
		{[]string{"rules", "--retain", "inertia", "extra"}, 2, `rules takes no arguments`},
		{[]string{"groups", "F=N", "rho=kg/mx^3"}, 1, `variable rho: unit "kg/mx^3": unknown symbol "mx" at column 4 (did you mean m?)`},
		{[]string{"groups", "F"}, 1, `"F" is not NAME=UNIT`},
		{[]string{"groups", "F=N", "V=m/s", "--repeat", "W"}, 1, `repeating variable "W" is not one of the variables`},
		{[]string{"groups"}, 2, `groups needs variables as NAME=UNIT`},
		{[]string{"frobnicate"}, 2, `unknown command "frobnicate"`},
	}
	for _, c := range cases {
		t.Run(strings.Join(c.args, " "), func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			code := run(append([]string{"scaleplan"}, c.args...), &stdout, &stderr)
			if code != c.code {
				t.Errorf("exit %d, want %d (stderr %q)", code, c.code, stderr.String())
			}
			msg := stderr.String()
			if !strings.Contains(msg, c.want) {
				t.Errorf("stderr %q does not contain %q", msg, c.want)
			}
			if n := strings.Count(strings.TrimRight(msg, "\n"), "\n"); n != 0 {
				t.Errorf("stderr has %d lines, want one: %q", n+1, msg)
			}
		})
	}
}

func TestDanglingFlag(t *testing.T) {
	var stdout, stderr bytes.Buffer
	if code := run([]string{"scaleplan", "run", "study", "--out"}, &stdout, &stderr); code != 2 || !strings.Contains(stderr.String(), "flag --out needs a value") {
		t.Errorf("exit %d, stderr %q; want 2 and the flag named", code, stderr.String())
	}
	if code := run([]string{"scaleplan", "run", "--format", "gif"}, &stdout, &stderr); code != 2 {
		t.Errorf("--format gif: exit %d, want 2", code)
	}
}
