package rules

import (
	"bytes"
	"fmt"
	"math"
	"reflect"
	"sort"
	"strings"
	"testing"

	"pare/graph"
)

// parse loads an inline netlist for a test, failing the test on error.
func parse(t testing.TB, src string) *graph.Circuit {
	t.Helper()
	c, err := graph.Parse("test.toml", []byte(src))
	if err != nil {
		t.Fatalf("fixture does not load: %v", err)
	}
	return c
}

// reduceChecked reduces with an invariant check after every step (the way
// the compiler runs checkFunc after each pass when checking is on).
func reduceChecked(t testing.TB, c *graph.Circuit, o Options) (*graph.Circuit, *Log) {
	t.Helper()
	o.CheckStep = func(j *graph.Journal, st *Step) error {
		after := j.Circuit()
		if err := invariants(after); err != nil {
			t.Fatalf("invariant broken after step %q (%s): %v", st.Rule, st.Why, err)
		}
		return nil
	}
	r, log, err := Reduce(c, o)
	if err != nil {
		t.Fatalf("Reduce: %v", err)
	}
	if err := invariants(r); err != nil {
		t.Fatalf("invariant broken in the result: %v", err)
	}
	return r, log
}

// invariants: every pin on an existing net, no duplicate refs, parts and nets
// sorted, every declared end an existing net, and the connection index the
// edits keep equal to one built from scratch.
func invariants(c *graph.Circuit) error {
	if err := indexFresh(c); err != nil {
		return err
	}
	nets := map[string]bool{}
	for i, n := range c.Nets {
		if nets[n.Name] {
			return errorf("net %s twice", n.Name)
		}
		nets[n.Name] = true
		if i > 0 && c.Nets[i-1].Name >= n.Name {
			return errorf("nets not sorted at %s", n.Name)
		}
	}
	for i, p := range c.Parts {
		if i > 0 && c.Parts[i-1].Ref >= p.Ref {
			return errorf("parts not sorted or duplicated at %s", p.Ref)
		}
		for _, pin := range p.Pins {
			if !nets[pin.Net] {
				return errorf("%s.%s is on net %q, which does not exist", p.Ref, pin.Name, pin.Net)
			}
		}
		if !sort.StringsAreSorted(p.From) {
			return errorf("%s: From not sorted: %v", p.Ref, p.From)
		}
	}
	for _, n := range append(append([]string(nil), c.Inputs...), c.Outputs...) {
		if !nets[n] {
			return errorf("declared end %s is not a net", n)
		}
	}
	return nil
}

// indexFresh compares the circuit's kept connection index with a fresh one.
func indexFresh(c *graph.Circuit) error {
	fresh := graph.NewIndex(c.Parts, c.Nets)
	for _, p := range c.Parts {
		if c.Part(p.Ref) != p {
			return errorf("index: part %s not found by ref", p.Ref)
		}
		for _, pin := range p.Pins {
			if !reflect.DeepEqual(c.ConnsOf(pin.Net), fresh.Conns(pin.Net)) {
				return errorf("index: terminals on %s differ from a fresh index", pin.Net)
			}
		}
	}
	for _, n := range c.Nets {
		if c.Net(n.Name) != n || !reflect.DeepEqual(c.ConnsOf(n.Name), fresh.Conns(n.Name)) {
			return errorf("index: net %s differs from a fresh index", n.Name)
		}
	}
	return nil
}

type testErr string

func (e testErr) Error() string { return string(e) }

func errorf(format string, args ...any) error {
	return testErr(sprintf(format, args...))
}

// written is the canonical text of a circuit, for byte comparisons.
func written(t testing.TB, c *graph.Circuit) string {
	t.Helper()
	var b bytes.Buffer
	if err := graph.Write(&b, c); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// writtenByName writes c as if nothing had a position, so entries come in
// natural order of their names rather than in the order they were typed:
// for comparing circuits loaded from texts in different orders.
func writtenByName(t testing.TB, c *graph.Circuit) string {
	t.Helper()
	d := c.Clone()
	for _, p := range d.Parts {
		p.Pos = graph.Pos{}
	}
	for _, n := range d.Nets {
		n.Pos = graph.Pos{}
	}
	for _, r := range d.Regions {
		r.Pos = graph.Pos{}
	}
	return written(t, d)
}

func logText(l *Log) string {
	var b strings.Builder
	for _, s := range l.Steps {
		b.WriteString(s.String() + "\n")
	}
	for _, s := range l.Declined {
		b.WriteString("declined " + s.String() + "\n")
	}
	return b.String()
}

func stepsOf(l *Log, rule string) []Step {
	var out []Step
	for _, s := range l.Steps {
		if s.Rule == rule {
			out = append(out, s)
		}
	}
	return out
}

func near(a, b, rel float64) bool {
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }
