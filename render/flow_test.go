package render

import (
	"fmt"
	"strconv"
	"strings"
	"testing"

	"pare/graph"
)

// bankSheet is a bank of receivers on one sheet: channels copies of the
// triode chain of chainSheet, each with its own input and output, sharing
// the chassis and the HT line (as a bench of sets on one supply would),
// each fed from an aerial socket (a port, as the stage patterns leave a
// set's connection to what is cut away). A part's ref ends in "_" and its
// channel.
func bankSheet(channels, stages int) *Sheet {
	c := &graph.Circuit{Title: fmt.Sprintf("bank of %d chains", channels)}
	c.EnsureNet("gnd", graph.Pos{})
	ht := c.EnsureNet("ht", graph.Pos{})
	ht.Role, ht.Volts, ht.Label = graph.Supply, 250, "HT +250 V"
	s := &Sheet{Circuit: c, View: Reduced}
	for ch := 1; ch <= channels; ch++ {
		one := chainSheet(stages)
		own := func(n string) string {
			if n == "gnd" || n == "ht" {
				return n
			}
			return fmt.Sprintf("%s_%d", n, ch)
		}
		for _, p := range one.Circuit.Parts {
			q := *p
			q.Ref = own(p.Ref)
			q.Pins = append([]graph.Pin{}, p.Pins...)
			for i := range q.Pins {
				q.Pins[i].Net = own(q.Pins[i].Net)
			}
			c.AddPart(&q)
		}
		c.AddPart(&graph.Part{Ref: own("X"), Kind: graph.Port, Label: "aerial socket",
			Pins: []graph.Pin{{Name: "1", Net: own(one.Circuit.Inputs[0])}}})
		c.Inputs = append(c.Inputs, own(one.Circuit.Inputs[0]))
		c.Outputs = append(c.Outputs, own(one.Circuit.Outputs[0]))
		for _, f := range one.Frames {
			g := Frame{Title: f.Title}
			for _, r := range f.Parts {
				g.Parts = append(g.Parts, own(r))
			}
			s.Frames = append(s.Frames, g)
		}
	}
	return s
}

// TestBankFlowsChannelByChannel: a sheet of several receivers side by side
// is printed channel after channel, each in the order its signal passes
// (common practice: a reader follows one set's signal from its aerial to
// its output before the next set starts). The whole sheet's layered
// placement stands the channels' first stages in one column, and ordering
// by x alone cut rows of the same stage across every channel.
func TestBankFlowsChannelByChannel(t *testing.T) {
	s := bankSheet(3, 4)
	cfg := Config{Page: &Papers[0]}
	f, ends, _, err := cfg.flowRows(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(ends) < 3 {
		t.Fatalf("%d rows for 3 channels of 4 stages on A4; want at least a row a channel", len(ends))
	}
	lastCh, lastStage := 0, 0
	rowOf := map[string]int{} // ref → its row
	for i, e := range ends {
		for _, b := range f.bs[start(ends, i):e] {
			for _, ref := range b.refs {
				rowOf[ref] = i
				name, chs, _ := strings.Cut(ref, "_")
				switch ch := atoi(t, chs); {
				case ch < lastCh:
					t.Errorf("row %d: %s after channel %d", i+1, ref, lastCh)
				case ch > lastCh:
					lastCh, lastStage = ch, 0
				}
				if strings.HasPrefix(name, "V") { // the valve numbers its stage
					if n := atoi(t, name[1:]); n <= lastStage {
						t.Errorf("row %d: %s after stage %d", i+1, ref, lastStage)
					} else {
						lastStage = n
					}
				}
			}
		}
	}
	for ch := 1; ch <= 3; ch++ {
		if x, v := fmt.Sprintf("X_%d", ch), fmt.Sprintf("V1_%d", ch); rowOf[x] != rowOf[v] {
			t.Errorf("channel %d: its socket %s on row %d, its first stage on row %d", ch, x, rowOf[x]+1, rowOf[v]+1)
		}
	}
}

func atoi(t *testing.T, s string) int {
	n, err := strconv.Atoi(s)
	if err != nil {
		t.Fatal(err)
	}
	return n
}

// go test -bench DrawPaged ./render: a bank of 8 chains of 20 triode
// stages (about 1,000 parts) cut into rows on A3 pages, the flow of a
// whole set's sheet (docs/performance.md, "Rows of a paged sheet").
func BenchmarkDrawPaged(b *testing.B) {
	s := bankSheet(8, 20)
	cfg := Config{Page: &Papers[1]}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := cfg.FprintPages(s); err != nil {
			b.Fatal(err)
		}
	}
}
