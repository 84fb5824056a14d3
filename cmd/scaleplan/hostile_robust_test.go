package main

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"encoding/csv"
	"fmt"
	"hash/crc32"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"scaleplan/report"
)

// The hostile-input tests: each kind of bad or hostile input, given to the
// command as a user would, gets exit status 1 (2 for bad usage), problems
// one per line each with its place, no panic, and no file in the output
// folder. DEVELOPERS.md ("Bad input and what it gets") lists them; keep
// the two in step. Helpers start with h.

// TestMain lets a test run the command in a child process (the interrupt
// and memory tests): with SCALEPLAN_TEST_MAIN=1 the test binary is
// scaleplan.
func TestMain(m *testing.M) {
	if os.Getenv("SCALEPLAN_TEST_MAIN") == "1" {
		code := run(append([]string{"scaleplan"}, os.Args[1:]...), os.Stdout, os.Stderr)
		if p := os.Getenv("SCALEPLAN_TEST_PEAK"); p != "" {
			// The peak resident memory of this process since exec (Linux):
			// getrusage would count the parent's memory too.
			status, _ := os.ReadFile("/proc/self/status")
			for _, l := range strings.Split(string(status), "\n") {
				if strings.HasPrefix(l, "VmHWM:") {
					os.WriteFile(p, []byte(l), 0o644)
				}
			}
		}
		os.Exit(code)
	}
	os.Exit(m.Run())
}

// hRun runs the command and returns its exit status and output.
func hRun(args ...string) (int, string, string) {
	var stdout, stderr bytes.Buffer
	code := run(append([]string{"scaleplan"}, args...), &stdout, &stderr)
	return code, stdout.String(), stderr.String()
}

// hRunOK runs the command and fails the test unless it succeeds.
func hRunOK(t *testing.T, args ...string) string {
	t.Helper()
	code, out, errs := hRun(args...)
	if code != 0 {
		t.Fatalf("scaleplan %s: exit %d\n%s", strings.Join(args, " "), code, errs)
	}
	return out
}

// hTugCSV writes the tug scenario as a folder study dir/name.
func hTugCSV(t *testing.T, dir, name string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	hRunOK(t, "init", p, "--scenario", "tug")
	return p
}

// hTugXLSX writes the tug scenario as a workbook study dir/name.
func hTugXLSX(t *testing.T, dir, name string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	hRunOK(t, "init", p, "--scenario", "tug")
	return p
}

// hEdit rewrites one sheet of a folder study; edit gets its records, the
// header first.
func hEdit(t *testing.T, study, sheet string, edit func([][]string) [][]string) {
	t.Helper()
	p := filepath.Join(study, sheet+".csv")
	f, err := os.Open(p)
	if err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(f)
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	w.WriteAll(edit(recs))
	if err := os.WriteFile(p, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// hSet sets one cell of a folder study: the row whose first cell is key
// (a spreadsheet row of 1 means the header), the column by name.
func hSet(t *testing.T, study, sheet, key, col, v string) {
	t.Helper()
	found := false
	hEdit(t, study, sheet, func(recs [][]string) [][]string {
		c := -1
		for i, h := range recs[0] {
			if h == col {
				c = i
			}
		}
		if c < 0 {
			t.Fatalf("%s has no column %s", sheet, col)
		}
		for _, r := range recs[1:] {
			if len(r) > 0 && r[0] == key {
				r[c] = v
				found = true
			}
		}
		return recs
	})
	if !found {
		t.Fatalf("%s has no row %s", sheet, key)
	}
}

// hAppend adds a row to a sheet of a folder study.
func hAppend(t *testing.T, study, sheet string, cells ...string) {
	t.Helper()
	hEdit(t, study, sheet, func(recs [][]string) [][]string {
		row := make([]string, len(recs[0]))
		copy(row, cells)
		return append(recs, row)
	})
}

// hWriteSheet replaces a sheet file of a folder study.
func hWriteSheet(t *testing.T, study, sheet, content string) {
	t.Helper()
	if err := os.WriteFile(filepath.Join(study, sheet+".csv"), []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
}

// hXLSXSet sets cells of a workbook study with excelize.
func hXLSXSet(t *testing.T, path string, set func(f *excelize.File) error) {
	t.Helper()
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := set(f); err != nil {
		t.Fatal(err)
	}
	if err := f.Save(); err != nil {
		t.Fatal(err)
	}
}

// hParts reads the parts of a zip file in their order.
func hParts(t *testing.T, path string) ([]string, map[string][]byte) {
	t.Helper()
	zr, err := zip.OpenReader(path)
	if err != nil {
		t.Fatal(err)
	}
	defer zr.Close()
	var names []string
	parts := map[string][]byte{}
	for _, f := range zr.File {
		rc, err := f.Open()
		if err != nil {
			t.Fatal(err)
		}
		data, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			t.Fatal(err)
		}
		names = append(names, f.Name)
		parts[f.Name] = data
	}
	return names, parts
}

// hSheetPart finds the part of a named sheet in a workbook's parts.
func hSheetPart(t *testing.T, parts map[string][]byte, sheet string) string {
	t.Helper()
	m := regexp.MustCompile(`<sheet name="` + sheet + `" sheetId="\d+" r:id="(rId\d+)"`).FindSubmatch(parts["xl/workbook.xml"])
	if m == nil {
		t.Fatalf("no sheet %s in the workbook", sheet)
	}
	rel := regexp.MustCompile(`Id="` + string(m[1]) + `" Target="/?(?:xl/)?([^"]+)"`).FindSubmatch(parts["xl/_rels/workbook.xml.rels"])
	if rel == nil {
		t.Fatalf("no relationship %s", m[1])
	}
	return "xl/" + string(rel[1])
}

// zipEntry is one entry of a zip file built by hZip.
type zipEntry struct {
	name string
	data []byte // stored deflated
	// declared, when not 0, is the uncompressed size the header claims
	// (a lie when it differs from len(data)).
	declared uint64
}

// hZip packs entries as a zip file, deflated, with the sizes the entries
// declare.
func hZip(t *testing.T, path string, entries []zipEntry) {
	t.Helper()
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, e := range entries {
		var comp bytes.Buffer
		fw, _ := flate.NewWriter(&comp, flate.BestCompression)
		fw.Write(e.data)
		fw.Close()
		size := uint64(len(e.data))
		if e.declared != 0 {
			size = e.declared
		}
		w, err := zw.CreateRaw(&zip.FileHeader{Name: e.name, Method: zip.Deflate, CRC32: crc32.ChecksumIEEE(e.data),
			CompressedSize64: uint64(comp.Len()), UncompressedSize64: size})
		if err != nil {
			t.Fatal(err)
		}
		w.Write(comp.Bytes())
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, out.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// hReplacePart rewrites a workbook with one part replaced (declared: the
// size its header claims, 0 for the true size).
func hReplacePart(t *testing.T, path, part string, data []byte, declared uint64) {
	t.Helper()
	names, parts := hParts(t, path)
	var entries []zipEntry
	for _, n := range names {
		e := zipEntry{name: n, data: parts[n]}
		if n == part {
			e.data, e.declared = data, declared
		}
		entries = append(entries, e)
	}
	hZip(t, path, entries)
}

// hReplaceCell rewrites a workbook with the XML of one cell of a sheet
// replaced.
func hReplaceCell(t *testing.T, path, sheet, cell, xml string) {
	t.Helper()
	_, parts := hParts(t, path)
	part := hSheetPart(t, parts, sheet)
	re := regexp.MustCompile(`<c r="` + cell + `"[^>]*?(/>|>.*?</c>)`)
	if !re.Match(parts[part]) {
		t.Fatalf("no cell %s in %s", cell, part)
	}
	hReplacePart(t, path, part, re.ReplaceAll(parts[part], []byte(xml)), 0)
}

// hugeSheet is the XML of a Prototype sheet with the header and n rows of
// items (inline strings), each at column col.
func hugeSheet(n int, col string) []byte {
	var b bytes.Buffer
	b.WriteString(`<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>`)
	b.WriteString(`<row r="1">`)
	for i, h := range []string{"item", "value", "unit", "scales_as", "note"} {
		fmt.Fprintf(&b, `<c r="%c1" t="inlineStr"><is><t>%s</t></is></c>`, 'A'+i, h)
	}
	b.WriteString(`</row>`)
	for r := 2; r <= n+1; r++ {
		if col == "A" {
			fmt.Fprintf(&b, `<row r="%d"><c r="A%d" t="inlineStr"><is><t>item_%d</t></is></c><c r="B%d"><v>%d</v></c><c r="C%d" t="inlineStr"><is><t>m</t></is></c><c r="D%d" t="inlineStr"><is><t>length</t></is></c></row>`, r, r, r, r, r, r, r)
		} else {
			fmt.Fprintf(&b, `<row r="%d"><c r="%s%d" t="inlineStr"><is><t>x</t></is></c></row>`, r, col, r)
		}
	}
	b.WriteString(`</sheetData></worksheet>`)
	return b.Bytes()
}

// zeros is n zero bytes: the contents of a zip bomb.
func zeros(n int) []byte { return make([]byte, n) }

// hostileCase is one kind of bad input given to the command.
type hostileCase struct {
	kind string
	// build writes the input into dir and returns the command line after
	// "scaleplan"; the output folder, when the case does not choose it, is
	// dir/out.
	build func(t *testing.T, dir string) []string
	code  int
	// place is where the problem is: a problem line reads
	// "  PLACE: ...want...". With "", the command's own line
	// ("scaleplan: ...") holds want.
	place, want string
}

// runStudy is the usual command line: run the study into dir/out.
func runStudy(dir, study string) []string {
	return []string{"run", study, "--out", filepath.Join(dir, "out")}
}

// csvCase is a case on the tug study as a folder, changed by edit.
func csvCase(edit func(t *testing.T, study string)) func(t *testing.T, dir string) []string {
	return func(t *testing.T, dir string) []string {
		s := hTugCSV(t, dir, "tug")
		edit(t, s)
		return runStudy(dir, s)
	}
}

// xlsxCase is a case on the tug study as a workbook, changed by edit.
func xlsxCase(edit func(t *testing.T, path string)) func(t *testing.T, dir string) []string {
	return func(t *testing.T, dir string) []string {
		s := hTugXLSX(t, dir, "tug.xlsx")
		edit(t, s)
		return runStudy(dir, s)
	}
}

func hostileCases() []hostileCase {
	setCell := func(sheet, cell string, v any) func(t *testing.T, path string) {
		return func(t *testing.T, path string) {
			hXLSXSet(t, path, func(f *excelize.File) error { return f.SetCellValue(sheet, cell, v) })
		}
	}
	return []hostileCase{
		// Damaged and hostile workbooks.
		{"truncated workbook", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "tug.xlsx")
			data, _ := os.ReadFile(s)
			os.WriteFile(s, data[:len(data)/2], 0o644)
			return runStudy(dir, s)
		}, 1, "tug.xlsx", "not an .xlsx workbook, or a damaged or truncated one"},
		{"not a zip file", func(t *testing.T, dir string) []string {
			s := filepath.Join(dir, "notes.xlsx")
			os.WriteFile(s, []byte("item,value\nhull_length,28\n"), 0o644)
			return runStudy(dir, s)
		}, 1, "notes.xlsx", "not an .xlsx workbook, or a damaged or truncated one (zip: not a valid zip file)"},
		{"empty file", func(t *testing.T, dir string) []string {
			s := filepath.Join(dir, "empty.xlsx")
			os.WriteFile(s, nil, 0o644)
			return runStudy(dir, s)
		}, 1, "empty.xlsx", "not an .xlsx workbook"},
		{"old .xls workbook renamed .xlsx", func(t *testing.T, dir string) []string {
			s := filepath.Join(dir, "old.xlsx")
			os.WriteFile(s, append([]byte{0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1}, zeros(504)...), 0o644)
			return runStudy(dir, s)
		}, 1, "old.xlsx", "it is an old .xls workbook or a password-protected one"},
		{"zip bomb (declares its size)", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "bomb.xlsx")
			_, parts := hParts(t, s)
			hReplacePart(t, s, hSheetPart(t, parts, "Prototype"), zeros(200<<20), 0)
			return runStudy(dir, s)
		}, 1, "bomb.xlsx", "the workbook unpacks to more than 64 MiB: refused"},
		{"zip bomb (lies about its size)", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "liar.xlsx")
			_, parts := hParts(t, s)
			hReplacePart(t, s, hSheetPart(t, parts, "Prototype"), zeros(200<<20), 2000)
			return runStudy(dir, s)
		}, 1, "liar.xlsx", "the workbook is damaged (xl/worksheets/sheet3.xml: zip: not a valid zip file)"},
		{"workbook file too large", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "huge.xlsx")
			os.Truncate(s, 65<<20) // sparse: costs no disk
			return runStudy(dir, s)
		}, 1, "huge.xlsx", "the workbook is larger than 64 MiB"},
		{"enormous sheet (200,000 rows)", xlsxCase(func(t *testing.T, s string) {
			_, parts := hParts(t, s)
			hReplacePart(t, s, hSheetPart(t, parts, "Prototype"), hugeSheet(200000, "A"), 0)
		}), 1, "Prototype!100001", "more than 100000 rows"},
		{"enormous sheet (a cell at XFD1048576)", xlsxCase(func(t *testing.T, s string) {
			_, parts := hParts(t, s)
			part := hSheetPart(t, parts, "Prototype")
			far := `<row r="1048576"><c r="A1048576" t="inlineStr"><is><t>far_item</t></is></c><c r="XFD1048576" t="inlineStr"><is><t>far away</t></is></c></row></sheetData>`
			hReplacePart(t, s, part, bytes.Replace(parts[part], []byte("</sheetData>"), []byte(far), 1), 0)
		}), 1, "Prototype!1048576", "beyond column IV"},
		{"enormous cell", xlsxCase(setCell("Study", "B3", strings.Repeat("purpose ", 2000))), 1, "Study!B3", "the cell holds 15999 characters; a study cell holds at most 10000"},
		{"formula without a cached value", xlsxCase(func(t *testing.T, s string) {
			hReplaceCell(t, s, "Prototype", "B2", `<c r="B2"><f>20+8</f></c>`)
		}), 1, "Prototype!B2", "formula without a cached value"},
		{"spreadsheet error in a cell", xlsxCase(func(t *testing.T, s string) {
			hReplaceCell(t, s, "Prototype", "B2", `<c r="B2" t="e"><f>1/0</f><v>#DIV/0!</v></c>`)
		}), 1, "Prototype!B2", "the cell holds the spreadsheet error #DIV/0!"},
		{"text that the workbook does not hold", xlsxCase(func(t *testing.T, s string) {
			hReplaceCell(t, s, "Prototype", "A2", `<c r="A2" t="s"><v>99999</v></c>`)
		}), 1, "Prototype!A2", "the cell refers to a text that the workbook does not hold"},
		{"workbook without a required sheet", xlsxCase(func(t *testing.T, s string) {
			hXLSXSet(t, s, func(f *excelize.File) error { return f.DeleteSheet("Strategies") })
		}), 1, "Strategies", "sheet missing: the workbook has no worksheet named Strategies"},
		{"NaN in a workbook cell", xlsxCase(setCell("Prototype", "B2", "NaN")), 1, "Prototype!B2", `value "NaN m" is not a finite number`},

		// Values that must be positive and finite.
		{"NaN value", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "hull_length", "value", "NaN") }),
			1, "Prototype!B2", `value "NaN m" is not a finite number`},
		{"infinite value", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "beam", "value", "Inf") }),
			1, "Prototype!B3", `value "Inf m" is not a finite number`},
		{"overflowing value", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "beam", "value", "1e999") }),
			1, "Prototype!B3", "1e999"},
		{"negative value", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "draft", "value", "-4.8") }),
			1, "Prototype!B4", "draft must be positive, got -4.8"},
		{"zero value", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "hull_length", "value", "0") }),
			1, "Prototype!B2", "hull_length must be positive, got 0"},
		{"zero facility capability", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Facilities", func(r [][]string) [][]string { r[1][3] = "0"; return r })
		}), 1, "Facilities!D2", "tank_length must be positive, got 0"},
		{"negative scale range", csvCase(func(t *testing.T, s string) { hSet(t, s, "Study", "scale_from", "value", "-4") }),
			1, "Study!B5", "the scale range must be positive"},
		{"NaN setting", csvCase(func(t *testing.T, s string) { hSet(t, s, "Study", "scale_to", "value", "NaN") }),
			1, "Study!B6", `scale_to: "NaN" is not a number`},
		{"scale range backwards", csvCase(func(t *testing.T, s string) { hSet(t, s, "Study", "scale_from", "value", "600") }),
			1, "Study!B5", "scale_from (600) must be below scale_to (60)"},
		{"zero points", csvCase(func(t *testing.T, s string) { hSet(t, s, "Study", "points", "value", "0") }),
			1, "Study!B7", `points: "0" must be a whole number from 2 to 10000000`},
		{"negative cost coefficient", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Costs", func(r [][]string) [][]string { r[1][1] = "-2600"; return r })
		}), 1, "Costs!B2", `"-2600" is not a non-negative number`},
		{"NaN cost coefficient", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Costs", func(r [][]string) [][]string { r[1][1] = "NaN"; return r })
		}), 1, "Costs!B2", `"NaN" is not a non-negative number`},
		{"zero factor in a fix", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Strategies", func(r [][]string) [][]string { r[2][8] = "velocity=0"; return r })
		}), 1, "Strategies!I3", `"velocity=0" is not QUANTITY=FACTOR with a positive factor`},

		// Empty required cells and columns.
		{"empty scales_as column", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Prototype", func(r [][]string) [][]string {
				for _, row := range r[1:] {
					row[3] = ""
				}
				return r
			})
		}), 1, "Prototype!D2", "say which quantity hull_length scales as"},
		{"empty value column", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Prototype", func(r [][]string) [][]string {
				for _, row := range r[1:] {
					row[1] = ""
				}
				return r
			})
		}), 1, "Prototype!B2", ""},
		{"empty item name", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "beam", "item", "") }),
			1, "Prototype!A3", `item name "" must be letters, digits and underscores`},
		{"empty technique", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Strategies", func(r [][]string) [][]string { r[1][2] = ""; return r })
		}), 1, "Strategies!C2", `unknown technique ""`},
		{"empty required setting", csvCase(func(t *testing.T, s string) { hSet(t, s, "Study", "scale_to", "value", "") }),
			1, "Study", `setting "scale_to" is missing`},
		{"missing required sheet", csvCase(func(t *testing.T, s string) { os.Remove(filepath.Join(s, "Strategies.csv")) }),
			1, "Strategies", "sheet missing: the folder"},
		{"empty required sheet", csvCase(func(t *testing.T, s string) { hWriteSheet(t, s, "Prototype", "") }),
			1, "Prototype!A1", "the sheet is empty: row 1 must name the columns"},
		{"wrong header", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Prototype", func(r [][]string) [][]string { r[0][1] = "amount"; return r })
		}), 1, "Prototype!B1", `expected column "value", found "amount"`},
		{"no prototype item", csvCase(func(t *testing.T, s string) { hWriteSheet(t, s, "Prototype", "item,value,unit,scales_as,note\n") }),
			1, "Prototype", "no prototype items"},
		{"no strategy", csvCase(func(t *testing.T, s string) {
			hWriteSheet(t, s, "Strategies", "strategy,case,technique,retain,relax,untie,given,tuned,fix,media,materials,facilities,correction,note\n")
		}), 1, "Strategies", "no strategy: add at least one row"},

		// Duplicated names.
		{"duplicated prototype item", csvCase(func(t *testing.T, s string) { hAppend(t, s, "Prototype", "beam", "12", "m", "length") }),
			1, "Prototype!A8", `item "beam" appears twice`},
		{"duplicated setting", csvCase(func(t *testing.T, s string) { hAppend(t, s, "Study", "Points", "500") }),
			1, "Study!A", `setting "Points" is given twice (first at Study!A7)`},
		{"duplicated medium", csvCase(func(t *testing.T, s string) { hAppend(t, s, "Media", "tank water", "seawater", "15C") }),
			1, "Media!A3", `medium "tank water" appears twice`},
		{"duplicated capability", csvCase(func(t *testing.T, s string) {
			hAppend(t, s, "Facilities", "Estuary tank", "towing_tank", "tank_length", "130", "m")
		}), 1, "Facilities!C14", `capability tank_length of "Estuary tank" is set twice`},
		{"duplicated strategy case", csvCase(func(t *testing.T, s string) {
			hEdit(t, s, "Strategies", func(r [][]string) [][]string {
				dup := append([]string(nil), r[2]...)
				return append(r, dup)
			})
		}), 1, "Strategies!B5", `strategy "Froude scaling" has case "" twice`},
		{"duplicated limit", csvCase(func(t *testing.T, s string) {
			hAppend(t, s, "Limits", "all", "short model", "hull_length >= 0.5 [m]", "")
			hAppend(t, s, "Limits", "all", "short model", "hull_length >= 0.8 [m]", "")
		}), 1, "Limits!B3", `limit "short model" for all appears twice`},
		{"a facility with two types", csvCase(func(t *testing.T, s string) {
			hAppend(t, s, "Facilities", "Estuary tank", "wave_basin", "basin_length", "60", "m")
		}), 1, "Facilities!B14", `facility "Estuary tank" is a towing_tank on row 2`},

		// Text that cannot be read.
		{"not UTF-8", csvCase(func(t *testing.T, s string) {
			hWriteSheet(t, s, "Media", "name,library_entry,conditions,note\nEau \xe9t\xe9,water,18C,\n")
		}), 1, "Media!A2", "not UTF-8 text"},
		{"control character", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "beam", "unit", "m\x07") }),
			1, "Prototype!C3", "the cell holds a control character (U+0007)"},
		{"unclosed quote", csvCase(func(t *testing.T, s string) {
			hWriteSheet(t, s, "Media", "name,library_entry,conditions,note\n\"tank water,water,18C,\n")
		}), 1, "Media!2", "a quoted cell is never closed"},
		{"CSV sheet file too large", csvCase(func(t *testing.T, s string) { os.Truncate(filepath.Join(s, "Costs.csv"), 65<<20) }),
			1, "Costs", "Costs.csv is larger than 64 MiB"},
		{"misspelt unit", csvCase(func(t *testing.T, s string) { hSet(t, s, "Prototype", "beam", "unit", "mx") }),
			1, "Prototype!B3", `unknown symbol "mx"`},
		{"unknown setting", csvCase(func(t *testing.T, s string) { hAppend(t, s, "Study", "scale_form", "4") }),
			1, "Study!A", `unknown setting "scale_form" (did you mean scale_from?)`},
		{"bad limit expression", csvCase(func(t *testing.T, s string) { hAppend(t, s, "Limits", "all", "odd", "hull_length >= >= 1", "") }),
			1, "Limits!C2", ""},

		// Limits.
		{"sweep larger than max_points", csvCase(func(t *testing.T, s string) {
			hSet(t, s, "Study", "points", "value", "10000000")
			hAppend(t, s, "Study", "axis", "temperature")
			hAppend(t, s, "Study", "axis_from", "5", "C")
			hAppend(t, s, "Study", "axis_to", "30", "C")
			hAppend(t, s, "Study", "axis_points", "100")
		}), 1, "Study!B7", "the sweep has 6e+09 points (1000000000 grid points × 6 combinations), more than 100000000: reduce points (or axis_points): --max-points allows at most 2147483647"},
		{"sweep larger than --max-points", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			return append(runStudy(dir, s), "--max-points", "1000")
		}, 1, "Study!B7", "the sweep has 2.4e+03 points (400 grid points × 6 combinations), more than 1000: pass --max-points N to scaleplan run"},
		{"bad --max-points", func(t *testing.T, dir string) []string {
			return append(runStudy(dir, hTugCSV(t, dir, "tug")), "--max-points", "-5")
		}, 2, "", `--max-points: "-5" must be a whole number from 1 to 2147483647`},

		// Studies that refer to themselves, and outputs over inputs.
		{"sheet that is a link to its own folder", csvCase(func(t *testing.T, s string) {
			os.Remove(filepath.Join(s, "Study.csv"))
			if err := os.Symlink(".", filepath.Join(s, "Study.csv")); err != nil {
				t.Skip("no symbolic links:", err)
			}
		}), 1, "Study", "cannot read Study.csv"},
		{"sheet that is a link to itself", csvCase(func(t *testing.T, s string) {
			os.Remove(filepath.Join(s, "Study.csv"))
			if err := os.Symlink("Study.csv", filepath.Join(s, "Study.csv")); err != nil {
				t.Skip("no symbolic links:", err)
			}
		}), 1, "Study", "cannot read Study.csv"},
		{"output folder is the study folder", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			return []string{"run", s, "--out", s}
		}, 1, "", "holds the study"},
		{"output folder holds the workbook study", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "harbour-tug.xlsx")
			return []string{"run", s, "--out", dir}
		}, 1, "", "holds the study"},
		{"output folder holds the workbook study (.XLSX)", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "TUG.XLSX")
			return []string{"run", s, "--out", dir}
		}, 1, "", "holds the study"},
		{"output folder is a link to the study folder", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			link := filepath.Join(dir, "results")
			if err := os.Symlink(s, link); err != nil {
				t.Skip("no symbolic links:", err)
			}
			return []string{"run", s, "--out", link}
		}, 1, "", "holds the study"},
		{"study given twice", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "tug.xlsx")
			return []string{"run", s, s, "--out", filepath.Join(dir, "out")}
		}, 1, "", "is given twice"},
		{"study given twice under two spellings", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			return []string{"run", s, filepath.Join(dir, ".", "tug") + string(filepath.Separator), "--out", filepath.Join(dir, "out")}
		}, 1, "", "are the same file or folder"},
		{"study given twice through a hard link", func(t *testing.T, dir string) []string {
			s := hTugXLSX(t, dir, "tug.xlsx")
			other := filepath.Join(dir, "copy.xlsx")
			if err := os.Link(s, other); err != nil {
				t.Skip("no hard links:", err)
			}
			return []string{"run", s, other, "--out", filepath.Join(dir, "out")}
		}, 1, "", "are the same file or folder"},
		{"two studies with one name", func(t *testing.T, dir string) []string {
			a := hTugCSV(t, dir, "tug")
			b := hTugXLSX(t, dir, "tug.xlsx")
			return []string{"run", a, b, "--out", filepath.Join(dir, "out")}
		}, 1, "", `would both write harbour-tug.xlsx`},
		{"two names that give one file name", func(t *testing.T, dir string) []string {
			a := hTugCSV(t, dir, "a")
			b := hTugCSV(t, dir, "b")
			hSet(t, a, "Study", "name", "value", "Tug/1")
			hSet(t, b, "Study", "name", "value", "tug:1")
			return []string{"run", a, b, "--out", filepath.Join(dir, "out")}
		}, 1, "", `would both write tug_1.xlsx`},
		{"output folder is a file", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			f := filepath.Join(dir, "out")
			os.WriteFile(f, []byte("x"), 0o644)
			return []string{"run", s, "--out", f}
		}, 1, "", "output folder"},
		{"no such study", func(t *testing.T, dir string) []string { return runStudy(dir, filepath.Join(dir, "nothing.xlsx")) },
			1, "study ", "nothing.xlsx: no such file or folder"},
		{"one CSV sheet instead of a folder", func(t *testing.T, dir string) []string {
			s := hTugCSV(t, dir, "tug")
			return runStudy(dir, filepath.Join(s, "Study.csv"))
		}, 1, "study ", "a single .csv file is one sheet"},
	}
}

// TestHostileSamples runs the committed samples of testdata/hostile (see
// its README): each fails with exit 1 and names its problems' places,
// through check and through run.
func TestHostileSamples(t *testing.T) {
	samples := map[string][]string{
		"truncated.xlsx":      {"truncated.xlsx: not an .xlsx workbook, or a damaged or truncated one"},
		"not-a-zip.xlsx":      {"not-a-zip.xlsx: not an .xlsx workbook, or a damaged or truncated one"},
		"declares-1-TiB.xlsx": {"declares-1-TiB.xlsx: the workbook unpacks to more than 64 MiB: refused"},
		"bad-values": {"Study!B5: the scale range must be positive", `Prototype!B2: value "NaN m" is not a finite number`,
			`Prototype!B3: value "Inf m" is not a finite number`, "Prototype!B4: draft must be positive, got -4.8",
			"Prototype!B7: runs must be positive, got 0", "Facilities!D2: tank_length must be positive, got 0"},
		"duplicates":    {`Study!A15: setting "Points" is given twice (first at Study!A7)`},
		"empty-columns": {"Prototype!D2: say which quantity hull_length scales as", "Prototype!D7: say which quantity runs scales as"},
	}
	root := filepath.Join("..", "..", "testdata", "hostile")
	entries, err := os.ReadDir(root)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if e.Name() == "README.md" {
			continue
		}
		want, ok := samples[e.Name()]
		if !ok {
			t.Errorf("testdata/hostile/%s is not checked: add it here and to its README", e.Name())
			continue
		}
		p := filepath.Join(root, e.Name())
		for _, args := range [][]string{{"check", p}, {"run", p, "--out", filepath.Join(t.TempDir(), "out")}} {
			code, _, stderr := hRun(args...)
			if code != 1 {
				t.Errorf("scaleplan %s: exit %d, want 1", strings.Join(args, " "), code)
			}
			for _, w := range want {
				if !strings.Contains(stderr, w) {
					t.Errorf("scaleplan %s: no %q in\n%s", strings.Join(args, " "), w, stderr)
				}
			}
		}
	}
}

// placeLine is a problem line of a study: two spaces, a place (a sheet, a
// sheet and a row or cell, or the file), a colon.
var placeLine = regexp.MustCompile(`^  ([A-Z][A-Za-z]*(![A-Z]*[0-9]+)?|[^ :]+\.(xlsx|XLSX)|study [^ ]+): \S`)

// TestHostileInputs runs every hostile case through the command.
func TestHostileInputs(t *testing.T) {
	for _, c := range hostileCases() {
		t.Run(c.kind, func(t *testing.T) { hCheck(t, c) })
	}
	if n := len(hostileCases()); n < 20 {
		t.Errorf("%d hostile cases, want at least 20", n)
	}
}

// hCheck runs one hostile case through the command and checks its exit
// status, that every problem line names its place, the wanted problem, no
// panic and no output.
func hCheck(t *testing.T, c hostileCase) {
	t.Helper()
	dir := t.TempDir()
	args := c.build(t, dir)
	code, stdout, stderr := hRun(args...)
	if code != c.code {
		t.Fatalf("exit %d, want %d\nstdout %s\nstderr %s", code, c.code, stdout, stderr)
	}
	lines := strings.Split(strings.TrimRight(stderr, "\n"), "\n")
	last := lines[len(lines)-1]
	if !strings.HasPrefix(last, "scaleplan: ") {
		t.Errorf("the last line is not the command's own: %q", last)
	}
	found := false
	for i, l := range lines[:len(lines)-1] {
		switch {
		case strings.HasSuffix(l, ":") && !strings.HasPrefix(l, " "):
			// the study's name, before its problems
		case placeLine.MatchString(l):
			if strings.HasPrefix(l, "  "+c.place) && strings.Contains(l, c.want) && c.place != "" {
				found = true
			}
		default:
			t.Errorf("line %d is neither a study nor a problem with its place: %q", i+1, l)
		}
	}
	if c.place == "" {
		found = strings.Contains(last, c.want)
	}
	if !found {
		t.Errorf("no problem at %q saying %q:\n%s", c.place, c.want, stderr)
	}
	if strings.Contains(stderr, "panic") || strings.Contains(stderr, "goroutine ") {
		t.Errorf("a panic: %s", stderr)
	}
	hNoOutputs(t, dir)
}

// hNoOutputs checks that a failed run wrote nothing into dir/out and left
// no temporary file anywhere under dir.
func hNoOutputs(t *testing.T, dir string) {
	t.Helper()
	out := filepath.Join(dir, "out")
	if info, err := os.Stat(out); err == nil && info.IsDir() {
		if es, _ := os.ReadDir(out); len(es) > 0 {
			var names []string
			for _, e := range es {
				names = append(names, e.Name())
			}
			t.Errorf("written although the study failed: %v", names)
		}
	}
	filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err == nil && report.IsPartial(d.Name()) {
			t.Errorf("temporary file left: %s", p)
		}
		return nil
	})
}
