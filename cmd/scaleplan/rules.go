package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"scaleplan/feasibility"
	"scaleplan/report"
)

func rulesCommand() *cli.Command {
	return &cli.Command{
		Name:      "rules",
		Usage:     "solve the scale laws of one strategy",
		UsageText: "scaleplan rules --retain LAWS [--relax LAWS] [--given Q=K,...] [--untie Q,...] [--length K] [--json]",
		Description: "Prints every quantity's scale law (k = prototype/model) as exact exponents over the length scale kL,\n" +
			"the given scale factors and any free choice; the compatibility conditions; the free choices; the\n" +
			"required properties; and the mismatch of every relaxed law. Laws: " + strings.Join(feasibility.LawNames(), ", ") + ".",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "retain", Usage: "laws that must scale alike, comma separated", Required: true},
			&cli.StringFlag{Name: "relax", Usage: "laws monitored but not matched"},
			&cli.StringFlag{Name: "given", Usage: "fixed scale factors, e.g. density=1,gravity=1 (a number or p/q)"},
			&cli.StringFlag{Name: "untie", Usage: "geometric quantities scaled apart: thickness, area_moment, strain"},
			&cli.StringFlag{Name: "length", Usage: "length scale kL at which to evaluate (25 for 1:25)"},
			&cli.BoolFlag{Name: "json", Usage: "print data as JSON"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() > 0 {
				return usagef("rules takes no arguments, got %q (use --retain, --given, ...)", c.Args().First())
			}
			given, order, err := parseGiven(c.String("given"))
			if err != nil {
				return err
			}
			length := 0.0
			if s := c.String("length"); s != "" {
				length, err = parseFactor(s)
				if err != nil {
					return fmt.Errorf("--length: %v", err)
				}
			}
			if g, ok := given["length"]; ok {
				if length > 0 && g != length {
					return fmt.Errorf("inconsistent request: --given length=%s and --length %s differ", report.Num(g), report.Num(length))
				}
				length = g
				delete(given, "length")
			}
			strategy := feasibility.Strategy{
				Retain: splitList(c.String("retain")),
				Relax:  splitList(c.String("relax")),
				Untie:  splitList(c.String("untie")),
				Given:  order,
			}
			// An untied quantity left open is the natural free choice (the
			// vertical scale of a distorted model).
			strategy.PreferFree = strategy.Untie
			sol, err := feasibility.Solve(strategy)
			if err != nil {
				return err
			}
			ev, err := feasibility.EvaluateRules(sol, given, length)
			if err != nil {
				return err
			}
			r := report.NewRulesReport(ev)
			if err := r.Broken(); err != nil {
				return err
			}
			if c.Bool("json") {
				return r.WriteJSON(c.App.Writer)
			}
			return r.WriteText(c.App.Writer)
		},
	}
}

// splitList splits a comma-separated list, dropping blanks.
func splitList(s string) []string {
	var out []string
	for _, p := range strings.Split(s, ",") {
		if p = strings.TrimSpace(p); p != "" {
			out = append(out, p)
		}
	}
	return out
}

// parseGiven reads "density=1,gravity=1" into factors and their order.
func parseGiven(s string) (map[string]float64, []string, error) {
	given := map[string]float64{}
	var order []string
	for _, item := range splitList(s) {
		name, val, ok := strings.Cut(item, "=")
		name = strings.TrimSpace(name)
		if !ok || name == "" {
			return nil, nil, fmt.Errorf("--given: %q is not QUANTITY=FACTOR (e.g. density=1)", item)
		}
		if _, err := feasibility.LookupQuantity(name); err != nil {
			return nil, nil, fmt.Errorf("--given: %v", err)
		}
		k, err := parseFactor(val)
		if err != nil {
			return nil, nil, fmt.Errorf("--given %s: %v", name, err)
		}
		if _, dup := given[name]; dup {
			return nil, nil, fmt.Errorf("--given: %s is given twice", name)
		}
		given[name] = k
		if name != "length" {
			order = append(order, name)
		}
	}
	return given, order, nil
}

// parseFactor reads a positive scale factor: a number or a fraction p/q.
func parseFactor(s string) (float64, error) {
	s = strings.TrimSpace(s)
	var k float64
	if num, den, ok := strings.Cut(s, "/"); ok {
		n, err1 := strconv.ParseFloat(strings.TrimSpace(num), 64)
		d, err2 := strconv.ParseFloat(strings.TrimSpace(den), 64)
		if err1 != nil || err2 != nil || d == 0 {
			return 0, fmt.Errorf("%q is not a number or a fraction p/q", s)
		}
		k = n / d
	} else {
		var err error
		k, err = strconv.ParseFloat(s, 64)
		if err != nil {
			return 0, fmt.Errorf("%q is not a number", s)
		}
	}
	if !(k > 0) || math.IsInf(k, 0) {
		return 0, fmt.Errorf("a scale factor must be a positive finite number, got %q", s)
	}
	return k, nil
}
