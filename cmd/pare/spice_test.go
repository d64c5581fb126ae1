package main

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"pare/internal/reftool"
)

func TestSpiceDeck(t *testing.T) {
	path := filepath.Join(root, "graph/ac/testdata/if-pair.toml")
	dir := t.TempDir()
	out := filepath.Join(dir, "pair.cir")
	code, stdout, errs := cliRun(t, "spice", path, "-o", out)
	if code != exitOK || errs != "" || stdout != "" {
		t.Fatalf("exit %d\n%s\n%s", code, stdout, errs)
	}
	deck, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"\nLT1_p ", "\nLT1_s ", "\nKT1_p_s LT1_p LT1_s 1e-02\n", "\nGV1_gm p 0 in 0 1e-03\n",
		"\nVpare_in in 0 DC 0 AC 1\n", "\n.ac lin 101 430000 480000\n", "wrdata pair.dat vm(s) vp(s)", "\nquit\n.endc\n.end\n"} {
		if !strings.Contains(string(deck), want) {
			t.Errorf("deck lacks %q:\n%s", want, deck)
		}
	}
	// The deck runs in ngspice where it is installed, and must where
	// PARE_REQUIRE_NGSPICE is set (the ac package's tests compare the numbers).
	if bin := reftool.Lookup(t, reftool.Ngspice); bin != "" {
		ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second) // a sweep card gone wrong fails, never hangs
		defer cancel()
		cmd := exec.CommandContext(ctx, bin, "-b", "pair.cir")
		cmd.Dir = dir
		msg, err := cmd.CombinedOutput()
		if err != nil || strings.Contains(string(msg), "Error") {
			t.Errorf("ngspice: %v\n%s", err, msg)
		}
		if _, err := os.Stat(filepath.Join(dir, "pair.dat")); err != nil {
			t.Errorf("ngspice wrote no table: %v\n%s", err, msg)
		}
	}
	// Same input, same deck.
	code, again, _ := cliRun(t, "spice", path)
	if code != exitOK || strings.Replace(again, "pare-ac.dat", "pair.dat", 1) != string(deck) {
		t.Errorf("the deck on stdout differs from the file")
	}
}

func TestSpiceBadInput(t *testing.T) {
	path := filepath.Join(root, "graph/ac/testdata/if-pair.toml")
	dir := t.TempDir()
	out := filepath.Join(dir, "x.cir")
	code, _, errs := cliRun(t, "spice", path, "--from", "ht", "-o", out)
	if code != exitBad || !strings.Contains(errs, "AC ground") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("a failed run left a deck behind")
	}
}
