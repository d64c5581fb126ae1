package main

import (
	"path/filepath"
	"testing"

	"pare/render/check"
)

// throughDeviceCeiling bounds TestRowLinesThroughDevices over the A3 pages
// of the reduced and faded views of every example and review13-21
// circuit: devices (valve, transistor) with two different nets' wires on
// one horizontal line through them, one of them the device's lead
// (render/check's ThroughDevices): the line reads as one wire running
// through the device (review21 a01's cathode output, at the grid line's
// height on the valve's far side, read as the grid line carried on into
// the coupling capacitor). A ratchet: lowered as the placement and the
// router learn to keep an output off its input's line, never raised.
// 109 re-measured with a loop through two devices drawn as one oscillator.
const throughDeviceCeiling = 109

// TestRowLinesThroughDevices: no device stands with another net's wire in
// line with its input lead on its far side, beyond throughDeviceCeiling
// over the examples and the blind-review circuits; every one is logged.
func TestRowLinesThroughDevices(t *testing.T) {
	files := append(exampleFiles(t), reviewCircuitsFrom(t, "review13", "review14", "review15", "review16", "review17", "review18", "review19", "review20", "review21")...)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		name := filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f))
		for _, v := range galleryViews {
			gs, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, g := range gs {
				for _, s := range check.ThroughDevices(g) {
					t.Logf("%s %s page %d: %s", name, v, i+1, s)
					n++
				}
			}
		}
	}
	t.Logf("devices with two nets' wires in line through them: %d (ceiling %d)", n, throughDeviceCeiling)
	if n > throughDeviceCeiling {
		t.Errorf("%d devices with two nets' wires in line through them, ceiling %d; the log lists them", n, throughDeviceCeiling)
	}
}
