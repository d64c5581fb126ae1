package main

import (
	"fmt"

	"pare/graph/dc"
)

func runReadings(e *env, pt *dc.Point, o *dcOpts) int {
	fmt.Fprintln(e.stderr, "pare dc: --readings is not available yet")
	return exitBad
}
