package report

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// An output folder holds one run's set of files per study. Beside them,
// WriteStudy keeps a manifest, a hidden file .scaleplan-manifest-BASE.json
// listing the files it wrote for the study BASE; the next run of that
// study removes those of its earlier files that it does not write again
// (a map of a strategy that is gone), and nothing else: a file scaleplan
// did not write is never removed.

// manifestPrefix starts the name of every manifest.
const manifestPrefix = ".scaleplan-manifest-"

// ManifestName is the name of the manifest of the study whose outputs are
// named after base (a FileName).
func ManifestName(base string) string { return manifestPrefix + base + ".json" }

// IsManifest reports whether a file name is a manifest of WriteStudy.
func IsManifest(name string) bool {
	return strings.HasPrefix(name, manifestPrefix) && strings.HasSuffix(name, ".json")
}

// manifest is what a manifest file holds.
type manifest struct {
	Study string   `json:"study"`
	Files []string `json:"files"` // base names, in the order written
}

// readManifest returns the files an earlier run listed for base (none
// when there is no manifest or it cannot be read: then nothing is
// removed). Names that are not plain file names of the folder, or that
// are not outputs of base, are dropped, so a damaged or forged manifest
// cannot remove anything else.
func readManifest(dir, base string) []string {
	b, err := readSmall(filepath.Join(dir, ManifestName(base)), 1<<20)
	if err != nil {
		return nil
	}
	var m manifest
	if json.Unmarshal(b, &m) != nil {
		return nil
	}
	var out []string
	for _, n := range m.Files {
		if n == filepath.Base(n) && !strings.ContainsAny(n, `/\`) && ownOutput(n, base) {
			out = append(out, n)
		}
	}
	return out
}

// ownOutput reports whether a file name can be an output of the study
// base: base itself followed by a dot and more (tug.xlsx, tug.memo.md,
// tug.band-1-froude.png). A base holds no dot (see FileName), so the
// outputs of another study (tug-2.xlsx) never match.
func ownOutput(name, base string) bool {
	rest, ok := strings.CutPrefix(name, base)
	return ok && len(rest) > 1 && rest[0] == '.'
}

// readSmall reads a regular file of at most limit bytes.
func readSmall(p string, limit int64) ([]byte, error) {
	fi, err := os.Lstat(p)
	if err != nil {
		return nil, err
	}
	if !fi.Mode().IsRegular() || fi.Size() > limit {
		return nil, fmt.Errorf("%s: not a small regular file", p)
	}
	return os.ReadFile(p)
}

// writeManifest records the files written for a study.
func writeManifest(dir, base, study string, files []string) error {
	m := manifest{Study: study}
	for _, f := range files {
		m.Files = append(m.Files, filepath.Base(f))
	}
	return WriteFileAtomic(filepath.Join(dir, ManifestName(base)), func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(m)
	})
}

// removeStale removes what a killed run of the study base left in dir: a
// staging folder (.BASE.partial-*) and temporary files of its outputs
// (.BASE.xlsx.partial-*, …). Nothing else is touched.
func removeStale(dir, base string) {
	es, err := os.ReadDir(dir)
	if err != nil {
		return
	}
	for _, e := range es {
		n := e.Name()
		if IsPartial(n) && (strings.HasPrefix(n, "."+base+partialMark) || ownOutput(strings.TrimPrefix(n, "."), base)) {
			os.RemoveAll(filepath.Join(dir, n))
		}
	}
}

// removeOld removes the files an earlier run wrote for the study (as its
// manifest lists them) that this run did not write again. Only regular
// files are removed.
func removeOld(dir string, old, written []string) {
	keep := map[string]bool{}
	for _, w := range written {
		keep[filepath.Base(w)] = true
	}
	for _, n := range old {
		if keep[n] {
			continue
		}
		p := filepath.Join(dir, n)
		if fi, err := os.Lstat(p); err == nil && fi.Mode().IsRegular() {
			os.Remove(p)
		}
	}
}

// moveIntoPlace moves the staged files into dir. An output it replaces is
// first moved aside into backup; if a move fails, every file moved so far
// is taken out again and the outputs it replaced are put back, so dir
// holds the earlier run's set, not a mixture. The error says so, or names
// what could not be put back.
func moveIntoPlace(dir, backup string, staged []string) ([]string, error) {
	type moved struct{ target, aside string }
	var done []moved
	rollback := func(cause error) error {
		var lost []string
		for i := len(done) - 1; i >= 0; i-- {
			m := done[i]
			os.Remove(m.target)
			if m.aside != "" {
				if err := os.Rename(m.aside, m.target); err != nil {
					lost = append(lost, m.target)
				}
			}
		}
		if len(lost) > 0 {
			return fmt.Errorf("%v; the earlier outputs %s could not be put back (they are gone): run again", cause, strings.Join(lost, ", "))
		}
		return fmt.Errorf("%v; nothing was changed (the earlier outputs are as they were)", cause)
	}
	for _, s := range staged {
		p := filepath.Join(dir, filepath.Base(s))
		m := moved{target: p}
		if fi, err := os.Lstat(p); err == nil && fi.Mode().IsRegular() {
			m.aside = filepath.Join(backup, filepath.Base(s))
			if err := os.Rename(p, m.aside); err != nil {
				return nil, rollback(fmt.Errorf("writing %s: %v", p, err))
			}
		} else if err != nil && !errors.Is(err, fs.ErrNotExist) {
			return nil, rollback(fmt.Errorf("writing %s: %v", p, err))
		}
		if err := os.Rename(s, p); err != nil {
			if m.aside != "" {
				os.Rename(m.aside, p)
			}
			return nil, rollback(fmt.Errorf("writing %s: %v", p, err))
		}
		done = append(done, m)
	}
	out := make([]string, len(done))
	for i, m := range done {
		out[i] = m.target
	}
	return out, nil
}
