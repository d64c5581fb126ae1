package main

import (
	"bytes"
	"math/rand"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"

	"pare/internal/outfile"
)

// The kill test runs the main job in a child process (this test binary,
// told by an environment variable to be pare) and kills it with SIGKILL at
// random moments, 100 times, over a large set. After every kill the result
// folder must hold one whole pack, the previous one or the new one, file
// for file, and nothing else; what a killed run left beside it must be
// gone after the next run. Red-team item 3: three folders in 60 kills were
// left half old, half new, one with a .notes.md.tmp file.

const killArgsEnv = "PARE_KILL_TEST_ARGS"

// killChildArgs returns the arguments of a child run: the environment
// variable marks the process as a child, and its arguments follow "--".
func killChildArgs() ([]string, bool) {
	if os.Getenv(killArgsEnv) != "1" {
		return nil, false
	}
	for i, a := range os.Args {
		if a == "--" {
			return os.Args[i+1:], true
		}
	}
	return nil, true
}

func childCmd(args ...string) *exec.Cmd {
	cmd := exec.Command(os.Args[0], append([]string{"-test.run=^$", "--"}, args...)...)
	cmd.Env = append(os.Environ(), killArgsEnv+"=1")
	return cmd
}

// readPack reads a result folder: file name → content, hidden files too.
func readPack(t *testing.T, dir string) map[string]string {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]string{}
	for _, e := range entries {
		b, err := os.ReadFile(filepath.Join(dir, e.Name()))
		if err != nil {
			t.Fatalf("%s: %v", e.Name(), err)
		}
		out[e.Name()] = string(b)
	}
	return out
}

func samePack(a, b map[string]string) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

func packNames(p map[string]string) string {
	var n []string
	for k := range p {
		n = append(n, k)
	}
	sort.Strings(n)
	return strings.Join(n, " ")
}

func TestKillLeavesWholePack(t *testing.T) {
	if testing.Short() {
		t.Skip("100 child runs: not in -short")
	}
	dir := t.TempDir()
	in := filepath.Join(dir, "chain.toml")
	if err := os.WriteFile(in, []byte(chainNetlist(120)), 0o644); err != nil {
		t.Fatal(err)
	}
	// The two packs a run may leave: the job at two levels writes different
	// files, so a mix of the two would show.
	levels := []string{"signal", "tidy"}
	want := map[string]map[string]string{}
	var full time.Duration
	for _, lvl := range levels {
		ref := filepath.Join(dir, "ref-"+lvl)
		start := time.Now()
		out, err := childCmd(in, "-o", ref, "--level", lvl).CombinedOutput()
		full = max(full, time.Since(start))
		if err != nil {
			t.Fatalf("reference run at %s: %v\n%s", lvl, err, out)
		}
		want[lvl] = readPack(t, ref)
	}
	if samePack(want["signal"], want["tidy"]) {
		t.Fatal("the two reference packs are the same: the test could not see a mix")
	}
	pack := filepath.Join(dir, "chain.pare")
	if out, err := childCmd(in, "-o", pack, "--level", "signal").CombinedOutput(); err != nil {
		t.Fatalf("first run: %v\n%s", err, out)
	}
	rng := rand.New(rand.NewSource(14))
	counts := map[string]int{}
	seen := map[string]bool{}
	const kills = 100
	for i := 0; i < kills; i++ {
		lvl := levels[i%2]
		// Half the kills anywhere in the run, half in its last fifth,
		// where the files are written.
		at := time.Duration(rng.Float64() * float64(full) * 1.05)
		if i%4 >= 2 {
			at = time.Duration((0.8 + 0.25*rng.Float64()) * float64(full))
		}
		cmd := childCmd(in, "-o", pack, "--level", lvl)
		var outb bytes.Buffer
		cmd.Stdout, cmd.Stderr = &outb, &outb
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(at)
		cmd.Process.Kill() // SIGKILL
		cmd.Wait()
		got := readPack(t, pack)
		switch {
		case samePack(got, want["signal"]):
			counts["pack at signal"]++
		case samePack(got, want["tidy"]):
			counts["pack at tidy"]++
		default:
			t.Fatalf("kill %d after %v: the folder holds %s, not one whole pack", i+1, at, packNames(got))
		}
		left := outfile.Leftovers(pack)
		if len(left) > 1 {
			t.Fatalf("kill %d: leftovers of more than the killed run: %v", i+1, left)
		}
		if len(left) == 1 && !seen[left[0]] {
			counts["killed while writing (staging left, swept by the next run)"]++
			seen[left[0]] = true
		}
	}
	if out, err := childCmd(in, "-o", pack, "--level", "signal").CombinedOutput(); err != nil {
		t.Fatalf("last run: %v\n%s", err, out)
	}
	if got := readPack(t, pack); !samePack(got, want["signal"]) {
		t.Errorf("after the last run the folder holds %s", packNames(got))
	}
	if left := outfile.Leftovers(pack); len(left) > 0 {
		t.Errorf("left beside the folder after a complete run: %v", left)
	}
	t.Logf("%d kills (a full run takes %v): %v", kills, full, counts)
}
