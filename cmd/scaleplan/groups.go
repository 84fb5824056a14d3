package main

import (
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"scaleplan/feasibility"
	"scaleplan/report"
)

func groupsCommand() *cli.Command {
	return &cli.Command{
		Name:      "groups",
		Usage:     "Buckingham pi groups of a list of variables",
		UsageText: "scaleplan groups NAME=UNIT ... [--repeat NAMES] [--json]",
		Description: "Gives the rank of the dimensional matrix, the number of independent dimensionless groups and a basis\n" +
			"of them with exact exponents, recognising the classic named groups up to inversion and powers. By\n" +
			"default the first variable is taken as the dependent one and the repeating variables are chosen\n" +
			"among the others (a length, a speed, a density first); --repeat chooses them.",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "repeat", Usage: "repeating variables, comma separated"},
			&cli.BoolFlag{Name: "json", Usage: "print data as JSON"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() == 0 {
				return usagef("groups needs variables as NAME=UNIT, e.g. F=N rho=kg/m^3 V=m/s D=m mu=Pa*s")
			}
			var vars []feasibility.Variable
			for _, a := range c.Args().Slice() {
				name, unit, ok := strings.Cut(a, "=")
				if !ok || strings.TrimSpace(name) == "" {
					return fmt.Errorf("%q is not NAME=UNIT (e.g. V=m/s; use 1 for a dimensionless variable)", a)
				}
				u := feasibility.Unit{Factor: 1}
				if s := strings.TrimSpace(unit); s != "1" && s != "" {
					var err error
					u, err = feasibility.ParseUnit(s)
					if err != nil {
						return fmt.Errorf("variable %s: %v", name, err)
					}
				}
				vars = append(vars, feasibility.Variable{Name: strings.TrimSpace(name), Dim: u.Dim})
			}
			res, err := feasibility.PiGroups(vars, splitList(c.String("repeat")))
			if err != nil {
				return err
			}
			r := report.NewGroupsReport(vars, res)
			if c.Bool("json") {
				return r.WriteJSON(c.App.Writer)
			}
			return r.WriteText(c.App.Writer)
		},
	}
}
