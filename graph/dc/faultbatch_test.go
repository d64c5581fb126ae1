package dc

import (
	"bufio"
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

// batchMark opens one deck's section of a batch run's output.
const batchMark = "@@deck"

// runFaultBatch runs several decks written by WriteSpiceReadings in one
// ngspice process and returns each deck's printed values, in order, n per
// deck. Each deck's circuit goes to a file of its own; one control script
// sources it (ngspice makes it the current circuit), runs the deck's own
// control lines (its meter alters, op and prints) and removes it again.
// The same analyses as one process per deck, without the process starts.
func runFaultBatch(t *testing.T, bin string, decks []string, n int) [][]float64 {
	t.Helper()
	dir := t.TempDir()
	var ctl strings.Builder
	ctl.WriteString("* injected faults, one deck after another\n.control\n")
	for k, deck := range decks {
		circuit, control, ok := splitDeck(deck)
		if !ok {
			t.Fatalf("deck %d has no control block of its own", k)
		}
		name := fmt.Sprintf("f%d.cir", k)
		if err := os.WriteFile(filepath.Join(dir, name), []byte(circuit), 0o644); err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&ctl, "source %s\necho %s %d\n%sremcirc\ndestroy all\n", name, batchMark, k, control)
	}
	ctl.WriteString("quit\n.endc\n.end\n")
	path := filepath.Join(dir, "batch.cir")
	if err := os.WriteFile(path, []byte(ctl.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	out := runNgspice(t, bin, dir, path, ngspiceLimit+time.Duration(len(decks))*2*time.Second)
	got := parseBatch(t, out, len(decks))
	for k, vals := range got {
		if len(vals) != n {
			t.Fatalf("ngspice printed %d readings for deck %d, want %d", len(vals), k, n)
		}
	}
	return got
}

// splitDeck cuts a deck at its control block: the circuit (closed with
// .end) and the control lines between .control and the final quit.
func splitDeck(deck string) (circuit, control string, ok bool) {
	head, rest, ok := strings.Cut(deck, "\n.control\n")
	if !ok {
		return "", "", false
	}
	control, _, ok = strings.Cut(rest, "quit\n.endc\n")
	return head + "\n.end\n", control, ok
}

// parseBatch reads the "name = value" lines of each deck's section.
func parseBatch(t *testing.T, out *bytes.Buffer, decks int) [][]float64 {
	t.Helper()
	got := make([][]float64, decks)
	cur := -1
	sc := bufio.NewScanner(out)
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 2 && f[0] == batchMark {
			k, err := strconv.Atoi(f[1])
			if err != nil || k != cur+1 || k >= decks {
				t.Fatalf("ngspice batch: section %q after %d", sc.Text(), cur)
			}
			cur = k
			continue
		}
		if len(f) == 3 && f[1] == "=" && cur >= 0 {
			if v, err := strconv.ParseFloat(f[2], 64); err == nil {
				got[cur] = append(got[cur], v)
			}
		}
	}
	if cur != decks-1 {
		t.Fatalf("ngspice batch ended after deck %d of %d", cur+1, decks)
	}
	return got
}
