package stages

import (
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// The self-oscillating mixer is a class: a device with an oscillator loop,
// a signal input and an output tuned to the IF, whichever winding of the
// oscillator coil carries the feedback. Here the feedback comes through a
// separate reaction winding: in a heptode's oscillator anode (g2) and in a
// transistor's collector ahead of an untapped IF can, which no pattern
// draws. Each is named with its oscillator's topology and carries the
// oscillator range, signal and image ranges and tracking figures. The near
// misses: the same converters with the reaction winding too loosely
// coupled (named, and flagged as not oscillating), the bench fixture whose
// reaction winding is phased the wrong way as captured, and a tuned
// transistor stage into an IF can with no oscillator coil at all (an
// amplifier: a mixer needs an oscillator).
func TestMixerWithReactionWinding(t *testing.T) {
	cases := []struct {
		file, title string
		parts       []string
		flags       []string // each must be among the stage's flags
		runs        bool     // the loop has margin somewhere on the dial
	}{
		{"../../testdata/osc/mixer-heptode-reaction.toml", "Self-oscillating mixer, tuned-grid oscillator with reaction winding on T2 (valve)",
			[]string{"C3", "C6", "R2", "T2", "T3", "V1", "VC1b"}, nil, true},
		{"../../testdata/osc/mixer-bjt-reaction.toml", "Self-oscillating mixer, tuned-coil oscillator with reaction winding and link winding to the emitter on T2 (BJT)",
			[]string{"C3", "C4", "Q1", "T2", "VC1b"}, nil, true},
		{"../../testdata/osc/mixer-heptode-weak.toml", "Self-oscillating mixer, tuned-grid oscillator with reaction winding on T2 (valve)",
			[]string{"T2", "V1"}, []string{"does not oscillate as drawn"}, false},
		{"../../testdata/osc/mixer-bjt-weak.toml", "Self-oscillating mixer, tuned-coil oscillator with reaction winding and link winding to the emitter on T2 (BJT)",
			[]string{"T2", "Q1"}, []string{"does not oscillate as drawn"}, false},
		{"../../testdata/good/review-align-c4-heptode.toml", "Self-oscillating mixer, tuned-grid oscillator with reaction winding on T2 (valve)",
			[]string{"C3", "T2", "TC3", "V1"}, []string{"does not oscillate as drawn", "a winding of T2 connected the wrong way round"}, false},
		{"testdata/tuned-amp-to-if.toml", "", nil, nil, false},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			found := find(t, r, Options{Full: c, ACGround: log.ACGround}) // as pare stages does
			st := stageOf(found, loopMixerTopology)
			if tc.title == "" {
				for _, s := range found {
					if s.group == "mixer" {
						t.Fatalf("near miss named a mixer: %s %v", s.Title, s.Parts)
					}
				}
				return
			}
			if st == nil || st.Title != tc.title {
				t.Fatalf("stages %s: want %q", topologies(found), tc.title)
			}
			for _, ref := range tc.parts {
				if !slices.Contains(st.Parts, ref) {
					t.Errorf("parts %v lack %s", st.Parts, ref)
				}
			}
			flags := strings.Join(st.Flags, "\n")
			for _, f := range tc.flags {
				if !strings.Contains(flags, f) {
					t.Errorf("flags %q lack %q", st.Flags, f)
				}
			}
			if len(st.Loop) != 1 {
				t.Fatalf("loops %+v", st.Loop)
			}
			_, _, _, best, _ := st.Loop[0].Range()
			if (best >= 0) != tc.runs {
				t.Errorf("best margin %+.1f dB, want running %v", best, tc.runs)
			}
			// tracking comes from the gang-tuned winding and the signal
			// tank on the other section, whether the loop runs or not
			if _, ok := st.Figures.Get("track_err_max"); !ok && tc.runs {
				t.Errorf("figures %v lack the tracking error", st.Figures)
			}
			if _, ok := st.Figures.Lookup("if_hz"); !ok {
				t.Errorf("figures %v lack the IF", st.Figures)
			}
			want := []string{"osc_f_min_hz", "sig_f_min_hz", "image_f_min_hz"}
			for _, k := range want {
				if _, ok := st.Figures.Lookup(k); ok != tc.runs {
					t.Errorf("figure %s present %v, want %v (a loop that does not run has no frequency)", k, ok, tc.runs)
				}
			}
		})
	}
}
