package main

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"runtime/debug"
	"strings"
	"testing"
	"time"

	"scaleplan/report"
)

func TestVersionOf(t *testing.T) {
	for _, tc := range []struct {
		info debug.BuildInfo
		want string
	}{
		{debug.BuildInfo{Main: debug.Module{Version: "v1.2.3"}}, "v1.2.3"},
		{debug.BuildInfo{Main: debug.Module{Version: "(devel)"}, Settings: []debug.BuildSetting{
			{Key: "vcs.revision", Value: "0123456789abcdef0123"}, {Key: "vcs.modified", Value: "true"}}}, "0123456789ab+dirty"},
		{debug.BuildInfo{Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: "abc"}}}, "abc"},
		{debug.BuildInfo{Main: debug.Module{Version: "(devel)"}}, "devel"},
	} {
		if got := report.VersionOf(&tc.info); got != tc.want {
			t.Errorf("VersionOf(%+v) = %q, want %q", tc.info.Main, got, tc.want)
		}
	}
}

// buildBinary builds scaleplan from the working tree into a temporary
// folder, with the given GOFLAGS.
func buildBinary(t *testing.T, goflags string) string {
	t.Helper()
	if testing.Short() {
		t.Skip("builds the command (skipped with -short)")
	}
	gobin, err := exec.LookPath("go")
	if err != nil {
		gobin = filepath.Join(os.Getenv("GOROOT"), "bin", "go")
	}
	bin := filepath.Join(t.TempDir(), "scaleplan")
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, gobin, "build", "-o", bin, ".")
	cmd.Env = append(os.Environ(), "GOFLAGS="+goflags)
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

func runBinary(t *testing.T, bin string, args ...string) string {
	t.Helper()
	out, err := exec.Command(bin, args...).Output()
	if err != nil {
		t.Fatalf("%s %s: %v", bin, strings.Join(args, " "), err)
	}
	return string(out)
}

// recordedVersion reads the version from a binary's build information
// with `go version -m` (the go tool's own reader), by the rule of
// report.BuildVersion: the module version, else the revision, else devel.
func recordedVersion(t *testing.T, bin string) string {
	t.Helper()
	out, err := exec.Command("go", "version", "-m", bin).Output()
	if err != nil {
		t.Fatalf("go version -m: %v", err)
	}
	mod := regexp.MustCompile(`(?m)^\tmod\tscaleplan\t(\S+)`).FindStringSubmatch(string(out))
	if mod != nil && mod[1] != "(devel)" {
		return mod[1]
	}
	rev := regexp.MustCompile(`(?m)^\tbuild\tvcs\.revision=(\S{1,12})`).FindStringSubmatch(string(out))
	if rev == nil {
		return "devel"
	}
	if strings.Contains(string(out), "vcs.modified=true") {
		return rev[1] + "+dirty"
	}
	return rev[1]
}

// TestBuiltBinaryVersion: a built binary prints the version recorded in its
// build, with --version and the version command alike, and answers shell
// completion.
func TestBuiltBinaryVersion(t *testing.T) {
	bin := buildBinary(t, os.Getenv("GOFLAGS"))
	want := "scaleplan " + recordedVersion(t, bin) + "\n"
	if got := runBinary(t, bin, "--version"); got != want {
		t.Errorf("--version printed %q, want %q", got, want)
	}
	if got := runBinary(t, bin, "version"); got != want {
		t.Errorf("version printed %q, want %q", got, want)
	}
	cmds := runBinary(t, bin, completionFlag)
	for _, c := range []string{"run", "init", "check", "completion", "version"} {
		if !regexp.MustCompile(`(?m)^` + c + `$`).MatchString(cmds) {
			t.Errorf("completion of commands lacks %s: %q", c, cmds)
		}
	}
	if flags := runBinary(t, bin, "run", "-", completionFlag); !strings.Contains(flags, "--out") || !strings.Contains(flags, "--format") {
		t.Errorf("completion of run's flags lacks --out or --format: %q", flags)
	}

}

// TestInstallFromCleanClone follows the README: `go install
// ./cmd/scaleplan` in a fresh clone puts a scaleplan on GOBIN whose
// --version names the commit checked out (the build records it; git
// worktrees are not stamped by the go tool, hence the clone).
func TestInstallFromCleanClone(t *testing.T) {
	if testing.Short() {
		t.Skip("clones and builds (skipped with -short)")
	}
	top, err := exec.Command("git", "rev-parse", "--show-toplevel").Output()
	if err != nil {
		t.Skipf("not in a git clone (%v)", err)
	}
	clone := filepath.Join(t.TempDir(), "scaleplan")
	if out, err := exec.Command("git", "clone", "-q", string(bytes.TrimSpace(top)), clone).CombinedOutput(); err != nil {
		t.Fatalf("git clone: %v\n%s", err, out)
	}
	head, err := exec.Command("git", "-C", clone, "rev-parse", "HEAD").Output()
	if err != nil {
		t.Fatal(err)
	}
	gobin := filepath.Join(t.TempDir(), "bin")
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, "go", "install", "./cmd/scaleplan")
	cmd.Dir = clone
	cmd.Env = append(os.Environ(), "GOBIN="+gobin, "GOFLAGS=-buildvcs=true")
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("go install ./cmd/scaleplan: %v\n%s", err, out)
	}
	bin := filepath.Join(gobin, "scaleplan")
	got := runBinary(t, bin, "--version")
	if want := "scaleplan " + recordedVersion(t, bin) + "\n"; got != want {
		t.Errorf("--version printed %q, want %q", got, want)
	}
	if !strings.Contains(got, string(bytes.TrimSpace(head))[:12]) {
		t.Errorf("installed from a clone at %s, --version printed %q", bytes.TrimSpace(head), got)
	}
}

// TestCompletionScript: the completion command prints a bash script that
// bash accepts and that registers a completion for scaleplan.
func TestCompletionScript(t *testing.T) {
	var stdout, stderr bytes.Buffer
	if code := run([]string{"scaleplan", "completion"}, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	script := stdout.String()
	if !strings.Contains(script, "complete ") || !strings.Contains(script, " scaleplan\n") || !strings.Contains(script, completionFlag) {
		t.Fatalf("not a completion script for scaleplan:\n%s", script)
	}
	bash, err := exec.LookPath("bash")
	if err != nil {
		t.Skip("bash is not installed")
	}
	cmd := exec.Command(bash, "-n")
	cmd.Stdin = strings.NewReader(script)
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Errorf("bash -n rejects the script: %v\n%s", err, out)
	}
	stdout.Reset()
	if code := run([]string{"scaleplan", "completion", "zsh"}, &stdout, &stderr); code != exitUsage {
		t.Errorf("completion with an argument: exit %d, want %d", code, exitUsage)
	}
}
