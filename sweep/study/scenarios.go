package study

import (
	"embed"
	"encoding/csv"
	"fmt"
	"io/fs"
	"path"
	"strings"
)

// The built-in scenarios: invented studies, stored as CSV sheets so that
// their diffs are readable, embedded in the binary. They are the default
// job of `scaleplan run` and the templates of `scaleplan init --scenario`.
//
//go:embed testdata/scenarios
var scenarioFS embed.FS

// Scenario names a built-in study.
type Scenario struct {
	Name, Description string
}

const scenarioRoot = "testdata/scenarios"

// Scenarios lists the built-in studies in their order of the index.
func Scenarios() ([]Scenario, error) {
	f, err := scenarioFS.Open(path.Join(scenarioRoot, "index.csv"))
	if err != nil {
		return nil, err
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		return nil, fmt.Errorf("scenario index: %v", err)
	}
	var out []Scenario
	for _, r := range rows[1:] {
		out = append(out, Scenario{r[0], r[1]})
	}
	return out, nil
}

// LoadScenario reads a built-in study by name.
func LoadScenario(name string) (*Study, error) {
	list, err := Scenarios()
	if err != nil {
		return nil, err
	}
	var names []string
	for _, s := range list {
		if s.Name == name {
			sub, err := fs.Sub(scenarioFS, scenarioRoot)
			if err != nil {
				return nil, err
			}
			return LoadFS(sub, name)
		}
		names = append(names, s.Name)
	}
	return nil, fmt.Errorf("no built-in scenario %q (scenarios: %s)", name, strings.Join(names, ", "))
}
