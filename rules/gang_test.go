package rules

import (
	"strings"
	"testing"
)

func TestGangAnnotation(t *testing.T) {
	src := `
band = "530k..1.6M"
inputs = ["ant"]
outputs = ["a"]
[parts]
VC1a = { c = "12p..365p", gang = "tune", pins = ["rf", "gnd"] }
TC1 = { c = "5p..50p", set = "31p", pins = ["rf", "gnd"] }
VC1b = { c = "12p..365p", gang = "tune", pins = ["osc", "gnd"] }
L1 = { l = "230u", pins = ["rf", "gnd"] }
L2 = { l = "128u", pins = ["osc", "gnd"] }
C1 = { c = "10p", pins = ["ant", "rf"] }
C2 = { c = "10p", pins = ["osc", "rf"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "rf", k = "gnd" } }
R1 = { r = "10k", pins = ["a", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if got := strings.Join(log.Gangs["tune"], ","); got != "VC1a,VC1b" {
		t.Errorf("Gangs[tune] = %s, want VC1a,VC1b", got)
	}
	p := r.Part("VC1a")
	if p == nil || p.Gang != "tune" || strings.Join(p.From, ",") != "TC1,VC1a" {
		t.Fatalf("the merged section should keep its gang and list TC1, VC1a: %+v\n%s", p, logText(log))
	}
}
