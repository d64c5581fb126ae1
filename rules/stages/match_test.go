package stages

import (
	"encoding/json"
	"errors"
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"pare/graph"
)

// Two-terminal parts match whichever way round their pins were typed, and
// the result does not depend on the order the parts were written in.
func TestOrientationAndOrder(t *testing.T) {
	lines := []string{
		`@Q1(g, tap, ht)`,
		`L1 = { l = ["20u", "5u"], k = 0.5, pins = ["top", "tap", "gnd"] }`,
		`C1 = { c = "100p", pins = ["top", "gnd"] }`,
		`C2 = { c = "100p", pins = ["top", "g"] }`,
		`R1 = { r = "47k", pins = ["g", "gnd"] }`,
	}
	flipped := []string{
		`@Q1(g, tap, ht)`,
		`R1 = { r = "47k", pins = ["gnd", "g"] }`,
		`C2 = { c = "100p", pins = ["g", "top"] }`,
		`C1 = { c = "100p", pins = ["gnd", "top"] }`,
		`L1 = { l = ["5u", "20u"], k = 0.5, pins = ["gnd", "tap", "top"] }`,
	}
	a := find(t, circuit(t, "valve", strings.Join(lines, "\n")), Options{})
	b := find(t, circuit(t, "valve", strings.Join(flipped, "\n")), Options{})
	ja, _ := json.Marshal(a)
	jb, _ := json.Marshal(b)
	if string(ja) != string(jb) {
		t.Errorf("pin order or part order changed the result:\n%s\n%s", ja, jb)
	}
	if s := stageOf(a, "hartley-common-tap"); s == nil || strings.Join(s.Parts, " ") != "C1 C2 L1 Q1 R1" {
		t.Errorf("hartley parts: %s", topologies(a))
	}
}

// A sub-stage is recorded in its parent's Contains and named after it; a
// partly overlapping match is dropped, never shown twice.
func TestNesting(t *testing.T) {
	c := circuit(t, "valve", mixerRef, "[freqs]\nif = \"455k\"")
	st := find(t, c, Options{})
	mix := stageOf(st, "self-oscillating-mixer")
	if mix == nil {
		t.Fatalf("no mixer: %s", topologies(st))
	}
	want := map[string]bool{"hartley-common-tap": false, "double-tuned": false}
	for _, name := range mix.Contains {
		for _, s := range st {
			if s.Name == name {
				if !strings.HasPrefix(s.Name, mix.Name+".") {
					t.Errorf("sub-stage %s not named after %s", s.Name, mix.Name)
				}
				want[s.Topology] = true
			}
		}
	}
	for topo, ok := range want {
		if !ok {
			t.Errorf("mixer does not contain a %s: %s", topo, topologies(st))
		}
	}
	claimed := map[string]string{}
	for _, s := range st {
		if strings.Contains(s.Name, ".") {
			continue
		}
		for _, r := range s.Parts {
			if other, dup := claimed[r]; dup {
				t.Errorf("%s is in top-level stages %s and %s", r, other, s.Name)
			}
			claimed[r] = s.Name
		}
	}
}

// Stage names follow the signal from the inputs.
func TestSignalOrder(t *testing.T) {
	c := circuit(t, "valve", `@Q1(in, gnd, a)
R2 = { r = "47k", pins = ["a", "ht"] }
C1 = { c = "10n", pins = ["a", "b"] }
R1 = { r = "470k", pins = ["b", "gnd"] }
@Q2(b, gnd, o)
R3 = { r = "47k", pins = ["o", "ht"] }`)
	st := find(t, c, Options{})
	var got []string
	for _, s := range st {
		got = append(got, s.Name+"="+strings.Join(s.Parts, ","))
	}
	if want := "S1=Q1,R2 S2=C1,R1 S3=Q2,R3"; strings.Join(got, " ") != want {
		t.Errorf("order %s, want %s", strings.Join(got, " "), want)
	}
}

// pathological: many coils and capacitors on the same two nets make the
// tank pattern's search combinatorial; the budget ends it with a clear error.
func TestSearchLimit(t *testing.T) {
	var b strings.Builder
	for i := 1; i <= 60; i++ {
		fmt.Fprintf(&b, "L%d = { l = \"100u\", pins = [\"t\", \"gnd\"] }\n", i)
		fmt.Fprintf(&b, "C%d = { c = \"100p\", pins = [\"t\", \"gnd\"] }\n", i)
	}
	c := circuit(t, "valve", b.String())
	start := time.Now()
	_, err := Find(c, Options{Limit: 20000})
	if !errors.Is(err, ErrSearchLimit) {
		t.Fatalf("want ErrSearchLimit, got %v", err)
	}
	if !strings.Contains(err.Error(), "search limit reached") {
		t.Errorf("message %q does not say the search limit was reached", err)
	}
	if d := time.Since(start); d > 10*time.Second {
		t.Errorf("a 20000-step budget took %v", d) // a hang guard, not a timing test
	}
}

// A part no pattern explains is reported; ports are the sheet's
// connections, not stages.
func TestUnmatched(t *testing.T) {
	c := circuit(t, "valve", `L1 = { l = "1m", pins = ["in", "x"] }
P1 = { port = "from the aerial", pins = ["in"] }
P2 = { port = "to the mixer", pins = ["x"] }`)
	st := find(t, c, Options{})
	if got := Unmatched(c, st); strings.Join(got, " ") != "L1" {
		t.Errorf("unmatched %v, want [L1]", got)
	}
}

var (
	refNumber = regexp.MustCompile(`(?m)^(@?)([A-Z]+)(\d+)( = |\()`)
	netMark   = regexp.MustCompile(`\$(\w+)`)
)

// benchCircuit strings n copies of a receiver chain (mixer, IF amplifier,
// detector, audio stage) into one circuit, each copy on nets of its own.
func benchCircuit(tb testing.TB, copies int) *graph.Circuit {
	block := `@Q1($g, $tap, $o)
T1 = { windings = { p = "40u", s = "230u" }, k = 0.3, pins = { p1 = "$in", p2 = "gnd", s1 = "$rf", s2 = "gnd" } }
VC1 = { c = "12p..365p", pins = ["$rf", "gnd"] }
C1 = { c = "10p", pins = ["$rf", "$g"] }
C2 = { c = "100p", pins = ["$top", "$g"] }
R1 = { r = "47k", pins = ["$g", "gnd"] }
L1 = { l = "128u", tap = 0.12, pins = ["gnd", "$tap", "$top"] }
VC2 = { c = "12p..365p", pins = ["$top", "gnd"] }
T2 = { windings = { p = "1m147", s = "1m147" }, k = 0.01, pins = { p1 = "$o", p2 = "ht", s1 = "$if", s2 = "gnd" } }
C3 = { c = "100p", pins = ["$o", "ht"] }
C4 = { c = "100p", pins = ["$if", "gnd"] }
@Q2($if, gnd, $a2)
T3 = { windings = { p = "1m147", s = "1m147" }, k = 0.012, pins = { p1 = "$a2", p2 = "ht", s1 = "$d", s2 = "$out" } }
C5 = { c = "100p", pins = ["$a2", "ht"] }
C6 = { c = "100p", pins = ["$d", "$out"] }
D1 = { diode = "signal", pins = ["$d", "gnd"] }
C7 = { c = "100p", pins = ["$out", "gnd"] }
R2 = { r = "1M", pins = ["$out", "gnd"] }
R3 = { r = "47k", pins = ["$out", "$f"] }
C8 = { c = "100p", pins = ["$f", "gnd"] }
RV1 = { pot = "500k", pins = ["$f", "$w", "gnd"] }
C9 = { c = "10n", pins = ["$w", "$g3"] }
R4 = { r = "470k", pins = ["$g3", "gnd"] }
@Q3($g3, $k3, $a3)
R5 = { r = "1k5", pins = ["$k3", "gnd"] }
C10 = { c = "100u", pins = ["$k3", "gnd"] }
R6 = { r = "100k", pins = ["$a3", "ht"] }
C11 = { c = "22n", pins = ["$a3", "$next"] }`
	var b strings.Builder
	for i := 0; i < copies; i++ {
		s := refNumber.ReplaceAllStringFunc(block, func(m string) string {
			g := refNumber.FindStringSubmatch(m)
			n, _ := strconv.Atoi(g[3])
			return fmt.Sprintf("%s%s%d%s", g[1], g[2], i*100+n, g[4])
		})
		s = netMark.ReplaceAllString(s, fmt.Sprintf("${1}_%d", i))
		b.WriteString(s + "\n")
	}
	src := strings.Replace(b.String(), `"$in_0"`, `"in"`, 1)
	src = strings.ReplaceAll(src, `"in_0"`, `"in"`)
	return circuit(tb, "valve", src)
}

func TestBenchCircuitRecognised(t *testing.T) {
	c := benchCircuit(t, 3)
	st := find(t, c, Options{})
	count := map[string]int{}
	for _, s := range st {
		if !strings.Contains(s.Name, ".") {
			count[s.Topology]++
		}
	}
	for _, topo := range []string{"self-oscillating-mixer", "amp-tuned", "diode-detector-cold-end", "amp-common-bypassed"} {
		if count[topo] != 3 {
			t.Errorf("%d × %s in 3 copies; stages %v", count[topo], topo, count)
		}
	}
	if u := Unmatched(c, st); len(u) > 0 {
		t.Errorf("unmatched parts %v", u)
	}
}

// BenchmarkFind recognises every stage of circuits of up to 5,000 parts
// (copies of a 28-part receiver chain: 20 copies 560 parts, 179 copies 5,012).
func BenchmarkFind(b *testing.B) {
	lib, err := Builtin()
	if err != nil {
		b.Fatal(err)
	}
	for _, copies := range []int{20, 179} {
		c := benchCircuit(b, copies)
		b.Run(fmt.Sprintf("parts=%d", len(c.Parts)), func(b *testing.B) {
			start := cpuTime()
			for i := 0; i < b.N; i++ {
				if _, err := Find(c, Options{Library: lib}); err != nil {
					b.Fatal(err)
				}
			}
			// CPU time as well as wall time: on a shared machine the wall
			// clock counts other people's work.
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N)/1e6, "cpu-ms/op")
		})
	}
}

// cpuTime is the process's user and system CPU time so far.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
