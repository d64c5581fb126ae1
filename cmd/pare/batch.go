package main

import (
	"bytes"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"pare/internal/par"
)

// runBatch is the main job over many sets: every .toml named or found under
// a named folder, as many at once as there are cores. Each set's report is
// buffered and printed in input order, so the output does not depend on
// which set finished first; the progress line goes to a terminal only.
func runBatch(e *env, out string, cfg jobConfig, args []string) int {
	paths, err := batchInputs(args)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	dirs, err := batchDirs(paths, out)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	type done struct {
		stdout, stderr bytes.Buffer
		pk             pack
	}
	results := make([]done, len(paths))
	next := make(chan int)
	var wg sync.WaitGroup
	var mu sync.Mutex
	finished := 0
	progress := isTerminal(e.stderr)
	for w := 0; w < min(runtime.GOMAXPROCS(0), len(paths)); w++ {
		wg.Add(1)
		// the first worker stands for the process's own goroutine (idle in
		// Wait); the others count as busy until they run out of sets, so a
		// set's own pieces (par.Do) take only the cores no set holds
		release := func() {}
		if w > 0 {
			release = par.Reserve()
		}
		go func() {
			defer wg.Done()
			defer release()
			for i := range next {
				r := &results[i]
				_, r.pk = oneJob(&env{stdout: &r.stdout, stderr: &r.stderr}, paths[i], dirs[i], cfg)
				if r.pk.code == exitBad {
					r.pk.verdict = firstError(r.stderr.String())
				}
				mu.Lock()
				finished++
				if progress {
					fmt.Fprintf(e.stderr, "\r\x1b[K[%d/%d] %s", finished, len(paths), filepath.Base(paths[i]))
				}
				mu.Unlock()
			}
		}()
	}
	for i := range paths {
		next <- i
	}
	close(next)
	wg.Wait()
	if progress {
		fmt.Fprint(e.stderr, "\r\x1b[K")
	}
	code := exitOK
	packs := make([]pack, len(paths))
	for i := range results {
		e.stdout.Write(results[i].stdout.Bytes())
		e.stderr.Write(results[i].stderr.Bytes())
		packs[i] = results[i].pk
		code = max(code, packs[i].code)
	}
	at := out
	if at == "" {
		at = commonDir(paths)
	}
	if err := writeIndex(at, packs); err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	fmt.Fprintf(e.stdout, "%d sets: %s; index in %s\n", len(packs), tally(packs), filepath.Join(at, "index.md"))
	return code
}

// firstError is the first line of a set's messages that is not a warning:
// what the index says about a set that could not be processed.
func firstError(msgs string) string {
	for _, l := range strings.Split(msgs, "\n") {
		if l != "" && !strings.Contains(l, ": warning: ") {
			return l
		}
	}
	return "not processed"
}

// batchInputs expands folders into the .toml files under them (sorted,
// skipping hidden folders and packs) and keeps named files as given.
func batchInputs(args []string) ([]string, error) {
	var paths []string
	for _, a := range args {
		if !isDir(a) {
			paths = append(paths, a)
			continue
		}
		var found []string
		err := filepath.WalkDir(a, func(p string, d fs.DirEntry, err error) error {
			if err != nil {
				return err
			}
			name := d.Name()
			if d.IsDir() && p != a && (strings.HasPrefix(name, ".") || strings.HasSuffix(name, ".pare")) {
				return filepath.SkipDir
			}
			if !d.IsDir() && strings.HasSuffix(name, ".toml") {
				found = append(found, p)
			}
			return nil
		})
		if err != nil {
			return nil, err
		}
		if len(found) == 0 {
			return nil, fmt.Errorf("%s: no .toml netlist in this folder", a)
		}
		sort.Strings(found)
		paths = append(paths, found...)
	}
	return paths, nil
}

// batchDirs names each set's pack: beside its file, or DIR/NAME.pare with
// -o, where two sets of the same name would overwrite each other.
func batchDirs(paths []string, out string) ([]string, error) {
	dirs := make([]string, len(paths))
	seen := map[string]string{}
	for i, p := range paths {
		dirs[i] = defaultOutDir(p)
		if out != "" {
			dirs[i] = filepath.Join(out, filepath.Base(defaultOutDir(p)))
		}
		if prev, dup := seen[filepath.Clean(dirs[i])]; dup {
			return nil, fmt.Errorf("%s and %s would both write %s; run them apart or without -o", prev, p, dirs[i])
		}
		seen[filepath.Clean(dirs[i])] = p
	}
	return dirs, nil
}

// commonDir is the deepest folder that holds every input.
func commonDir(paths []string) string {
	common := filepath.Dir(filepath.Clean(paths[0]))
	for _, p := range paths[1:] {
		d := filepath.Dir(filepath.Clean(p))
		for common != "." && common != string(filepath.Separator) && d != common && !strings.HasPrefix(d, common+string(filepath.Separator)) {
			common = filepath.Dir(common)
		}
	}
	return common
}

func tally(packs []pack) string {
	var ok, failed, bad int
	for _, p := range packs {
		switch p.code {
		case exitOK:
			ok++
		case exitFound:
			failed++
		default:
			bad++
		}
	}
	return fmt.Sprintf("%d verified, %d failed verification, %d not processed", ok, failed, bad)
}

// isTerminal reports whether w is a character device (a terminal), the
// only place a progress line that rewrites itself belongs.
func isTerminal(w any) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
