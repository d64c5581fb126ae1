package main

import (
	"os"
	"runtime/pprof"
)

// profileEnv names a file to write a CPU profile of the whole invocation to.
// It is hidden (no flag, no help line): it serves the performance work
// (docs/performance.md, "The main job on the flagship example"), where the
// job must be measured as the user runs it, as one process.
const profileEnv = "PARE_CPUPROFILE"

// startProfile starts the CPU profile if profileEnv names a file and returns
// the function that stops it; a profile that cannot start is not the input's
// fault, so it is reported and the job runs unprofiled.
func startProfile() func() {
	path := os.Getenv(profileEnv)
	if path == "" {
		return func() {}
	}
	f, err := os.Create(path)
	if err != nil {
		os.Stderr.WriteString("pare: " + profileEnv + ": " + err.Error() + "\n")
		return func() {}
	}
	if err := pprof.StartCPUProfile(f); err != nil {
		os.Stderr.WriteString("pare: " + profileEnv + ": " + err.Error() + "\n")
		f.Close()
		return func() {}
	}
	return func() {
		pprof.StopCPUProfile()
		f.Close()
	}
}
