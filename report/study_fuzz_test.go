package report_test

import (
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"

	"scaleplan/materials"
	"scaleplan/report"
	"scaleplan/sweep"
	"scaleplan/sweep/study"
)

// FuzzStudy runs whole small studies through the check, the sweep and
// every output, in process: the sheets a person edits most (Study,
// Prototype, Facilities, Strategies, Limits) are fuzzed as CSV text on top
// of the tug scenario. Whatever the text, the check returns a plan or
// problems that each name a place, never a panic; a plan sweeps and its
// outputs are written whole (every file listed exists, the folder holds
// them and their manifest, no temporary file is left). Grids are capped
// small so each input runs in a moment.
func FuzzStudy(f *testing.F) {
	sheets := []string{"Study", "Prototype", "Facilities", "Strategies", "Limits"}
	tug := map[string]string{}
	for _, s := range sheets {
		b, err := os.ReadFile(filepath.Join("..", "sweep", "study", "testdata", "scenarios", "tug", s+".csv"))
		if err != nil {
			f.Fatal(err)
		}
		tug[s] = string(b)
	}
	seed := func(edit func(m map[string]string)) {
		m := map[string]string{}
		for k, v := range tug {
			m[k] = v
		}
		if edit != nil {
			edit(m)
		}
		f.Add(m["Study"], m["Prototype"], m["Facilities"], m["Strategies"], m["Limits"])
	}
	seed(nil)
	seed(func(m map[string]string) { m["Study"] = strings.Replace(m["Study"], "scale_to,60", "scale_to,1:25", 1) })
	seed(func(m map[string]string) {
		m["Study"] = strings.Replace(m["Study"], "tolerance,0.1", "tolerance,10%", 1)
	})
	seed(func(m map[string]string) {
		m["Prototype"] = strings.ReplaceAll(strings.Replace(m["Prototype"], "value,", "value [ft],", 1), ",m,", ",,")
	})
	seed(func(m map[string]string) {
		m["Prototype"] = strings.ReplaceAll(strings.ReplaceAll(m["Prototype"], ",", ";"), "4.8", "4,8")
	})
	seed(func(m map[string]string) {
		m["Facilities"] = strings.Replace(m["Facilities"], "Estuary tank", "Estuary\u00a0tank", 1)
	})
	seed(func(m map[string]string) { m["Limits"] += "all,gap,hull_length / (beam - beam) >= 1,test\n" })
	seed(func(m map[string]string) {
		m["Study"] += "axis,tank_depth,,\naxis_from,2,m,\naxis_to,6,m,\naxis_points,3,,\n"
	})

	cat, err := sweep.NewFacilityCatalog()
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, studyCSV, prototype, facilities, strategies, limits string) {
		fsys := fstest.MapFS{}
		for _, s := range []string{"Media", "Materials", "Costs"} {
			b, err := os.ReadFile(filepath.Join("..", "sweep", "study", "testdata", "scenarios", "tug", s+".csv"))
			if err == nil {
				fsys["tug/"+s+".csv"] = &fstest.MapFile{Data: b}
			}
		}
		for s, v := range map[string]string{"Study": studyCSV, "Prototype": prototype, "Facilities": facilities, "Strategies": strategies, "Limits": limits} {
			fsys["tug/"+s+".csv"] = &fstest.MapFile{Data: []byte(v)}
		}
		s, err := study.LoadFS(fsys, "tug")
		if s == nil {
			t.Fatalf("no study: %v", err)
		}
		fzCheckPlaces(t, err)
		if err != nil {
			return
		}
		fzCap(s)
		lib, err := materials.Default()
		if err != nil {
			t.Fatal(err)
		}
		plan, err := sweep.Prepare(s, lib, cat)
		fzCheckPlaces(t, err)
		if err != nil {
			return
		}
		res, err := plan.Run(context.Background())
		if err != nil {
			t.Fatalf("sweep: %v", err)
		}
		dir := t.TempDir()
		files, err := report.WriteStudy(context.Background(), dir, res)
		if err != nil {
			t.Fatalf("outputs: %v", err)
		}
		names := rbEntries(t, dir)
		if len(names) != len(files)+1 {
			t.Errorf("the folder holds %v, written %v (and a manifest)", names, files)
		}
		for _, n := range names {
			if report.IsPartial(n) {
				t.Errorf("temporary file left: %s", n)
			}
		}
		for _, p := range files {
			if fi, err := os.Stat(p); err != nil || fi.Size() == 0 {
				t.Errorf("output %s: %v", p, err)
			}
		}
	})
}

// fzCap keeps a fuzzed study small: at most 12 scales, 3 axis values, 50
// draws of the uncertain inputs and 2 strategy rows (each input then runs
// in about a second, outputs included).
func fzCap(s *study.Study) {
	if len(s.Strategies) > 2 {
		s.Strategies = s.Strategies[:2]
	}
	for key, limit := range map[string]int{"points": 12, "axis_points": 3, "samples": 50} {
		set, ok := s.Settings[key]
		if !ok {
			continue
		}
		if n, err := strconv.Atoi(strings.TrimSpace(set.Value)); err == nil && n > limit {
			set.Value = strconv.Itoa(limit)
			s.Settings[key] = set
		}
	}
	if _, ok := s.Settings["points"]; !ok {
		s.Settings["points"] = study.Setting{Name: "points", Value: "12", Cell: study.Cell{Sheet: "Study", Row: 900, Col: 2}}
	}
}

// fzCheckPlaces checks that every problem names a sheet of the study.
func fzCheckPlaces(t *testing.T, err error) {
	t.Helper()
	if err == nil {
		return
	}
	ps, ok := err.(study.Problems)
	if !ok {
		t.Fatalf("not problems: %v", err)
	}
	for _, p := range ps {
		known := false
		for _, s := range study.SheetNames {
			known = known || p.Cell.Sheet == s
		}
		if !known {
			t.Errorf("problem without a sheet: %v", p)
		}
	}
}
