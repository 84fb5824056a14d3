package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"strings"
	"testing"
)

// runMaterials runs "scaleplan materials ARGS..." and returns the exit
// status, stdout and stderr. Once materialsCommand is listed in commands()
// it goes through run itself; until then it wraps the command in the same
// app newApp builds and reports errors and exit statuses as run does.
func runMaterials(args ...string) (int, string, string) {
	var stdout, stderr bytes.Buffer
	full := append([]string{"scaleplan", "materials"}, args...)
	for _, c := range commands() {
		if c.Name == "materials" {
			code := run(full, &stdout, &stderr)
			return code, stdout.String(), stderr.String()
		}
	}
	app := newApp(&stdout, &stderr)
	cmd := materialsCommand()
	cmd.OnUsageError = app.OnUsageError
	app.Commands = append(app.Commands, cmd)
	ordered, err := flagsFirst(app, full)
	if err == nil {
		err = app.Run(ordered)
	}
	if err == nil {
		return exitOK, stdout.String(), stderr.String()
	}
	fmt.Fprintln(&stderr, "scaleplan: "+err.Error())
	var ue usageError
	if errors.As(err, &ue) || strings.HasPrefix(err.Error(), "Required flag") {
		return exitUsage, stdout.String(), stderr.String()
	}
	return exitBadInput, stdout.String(), stderr.String()
}

func TestMaterialsWaterJSON(t *testing.T) {
	code, out, errOut := runMaterials("water", "--at", "20C", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var got struct {
		Name       string             `json:"name"`
		Kind       string             `json:"kind"`
		Conditions map[string]float64 `json:"conditions"`
		Properties map[string]float64 `json:"properties"`
		Units      map[string]string  `json:"units"`
		Sources    map[string]string  `json:"sources"`
	}
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if got.Name != "water" || got.Kind != "fluid" || got.Conditions["temperature"] != 293.15 {
		t.Errorf("header: %+v", got)
	}
	// SI values at 20 °C: Tanaka et al. 2001 (998.2067 kg/m^3), IAPWS
	// R12-08 (1.0016 mPa·s), ITTC 7.5-02-01-03 (ν = 1.0034e-6 m^2/s),
	// IAPWS R1-76(2014) (72.74 mN/m).
	want := map[string]struct {
		v, tol float64
		unit   string
	}{
		"density":             {998.2067, 1e-4, "kg/m^3"},
		"viscosity":           {1.0016e-3, 1e-7, "Pa*s"},
		"kinematic_viscosity": {1.0034e-6, 1e-10, "m^2/s"},
		"surface_tension":     {72.74e-3, 5e-6, "N/m"},
	}
	for q, w := range want {
		v, ok := got.Properties[q]
		if !ok || v < w.v-w.tol || v > w.v+w.tol {
			t.Errorf("%s = %v, want %v", q, v, w.v)
		}
		if got.Units[q] != w.unit || got.Sources[q] == "" {
			t.Errorf("%s: unit %q source %q", q, got.Units[q], got.Sources[q])
		}
	}
}

func TestMaterialsList(t *testing.T) {
	code, out, errOut := runMaterials()
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, s := range []string{"\nsolid\n", "\nfluid\n", "\nsoil\n", "\nice\n", "structural_steel", "water_glycerol", "temperature 0–40 °C (tunable)", "fixed"} {
		if !strings.Contains(out, s) {
			t.Errorf("listing lacks %q:\n%s", s, out)
		}
	}
	code, out, errOut = runMaterials("--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var list []struct {
		Name, Kind string
	}
	if err := json.Unmarshal([]byte(out), &list); err != nil {
		t.Fatal(err)
	}
	if len(list) < 40 || list[0].Kind != "solid" || list[len(list)-1].Kind != "ice" {
		t.Errorf("JSON listing: %d entries, first %+v", len(list), list[0])
	}
	// Deterministic: the same bytes twice.
	_, again, _ := runMaterials("--json")
	if again != out {
		t.Errorf("listing differs between runs")
	}
}

func TestMaterialsEntryText(t *testing.T) {
	code, out, errOut := runMaterials("structural", "steel")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, s := range []string{"structural_steel (solid)", "conditions: none (fixed properties)", "QUANTITY", "modulus", "2.1e+11", "Pa"} {
		if !strings.Contains(out, s) {
			t.Errorf("output lacks %q:\n%s", s, out)
		}
	}
	// A mixture named without its fraction says the default it took;
	// glycerol is pure glycerol.
	code, out, errOut = runMaterials("water_glycerol")
	if code != 0 || !strings.Contains(out, "conditions: 20 °C, w = 0.5 (w = 0.5 by default: give w= for another mixture)") {
		t.Errorf("water_glycerol without w: exit %d %s\n%s", code, errOut, out)
	}
	code, out, errOut = runMaterials("glycerine")
	if code != 0 || !strings.Contains(out, "glycerol (fluid): glycerol (glycerine), pure") || strings.Contains(out, "w =") {
		t.Errorf("glycerine: exit %d %s\n%s", code, errOut, out)
	}
	code, out, errOut = runMaterials("seawater", "--at", "15C,35g/kg")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "conditions: 15 °C, 35 g/kg") || !strings.Contains(out, "Sharqawy") {
		t.Errorf("seawater output:\n%s", out)
	}
}

func TestMaterialsErrors(t *testing.T) {
	cases := []struct {
		args []string
		code int
		want string
	}{
		{[]string{"water", "--at", "500C"}, 1, "scaleplan: water: temperature 500 °C is outside the valid range 0–40 °C"},
		{[]string{"air", "--at", "-3bar"}, 1, `scaleplan: conditions "-3bar": pressure -300 kPa is not positive (give the absolute pressure)`},
		{[]string{"watr"}, 1, `scaleplan: unknown material or medium "watr" (did you mean water?)`},
		{[]string{"steel", "--at", "20C"}, 1, `scaleplan: material or medium "steel" names several entries: give one of structural_steel, stainless_steel`},
		{[]string{"oil"}, 1, "silicone_oil_100cst"},
		{[]string{"plaster"}, 1, "did you mean gypsum_plaster?"},
		{[]string{"seawater", "--at", "S=0.035"}, 1, "for a fraction write S=3.5% or S=35g/kg"},
		{[]string{"structural_steel", "--at", "20C"}, 1, "scaleplan: structural_steel: its properties are fixed"},
		{[]string{"water", "--at", "20"}, 1, "a bare number is ambiguous"},
		{[]string{"--at", "20C"}, 2, "scaleplan: --at needs a NAME"},
		{[]string{"water", "--bogus"}, 2, "scaleplan: "},
	}
	for _, c := range cases {
		code, out, errOut := runMaterials(c.args...)
		if code != c.code {
			t.Errorf("%v: exit %d, want %d (%s)", c.args, code, c.code, errOut)
		}
		if !strings.HasPrefix(errOut, "scaleplan: ") || !strings.Contains(errOut, c.want) || strings.Count(errOut, "\n") != 1 {
			t.Errorf("%v: stderr %q, want one line containing %q", c.args, errOut, c.want)
		}
		if c.code == 1 && out != "" {
			t.Errorf("%v: stdout should be empty on error, got %q", c.args, out)
		}
	}
}
