package reftool

import (
	"bufio"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// repoRoot is the repository, seen from this package's folder.
const repoRoot = "../.."

var (
	sectionAnchor  = regexp.MustCompile(`^<a id="s(\d+)"></a>$`)
	sectionHeading = regexp.MustCompile(`^## (\d+)\. `)
	// A citation names the page, then one or more sections: "docs/references.md §1, §4".
	citation   = regexp.MustCompile(`docs/references\.md ((?:§\d+(?:,\s*)?)+)`)
	sectionNum = regexp.MustCompile(`§(\d+)`)
	// The check values once lived in notes outside the repository; a test
	// citing them points at something a reader of the repository cannot open.
	outsideNotes = regexp.MustCompile(`reference-values|reference-tools|reference values §`)
)

// referenceSections reads the section numbers of docs/references.md. Each
// section is an anchor line `<a id="sN"></a>` directly above its heading
// `## N. Title`, numbered upwards from 1 with no gaps, so a citation keeps
// pointing at the same topic.
func referenceSections(t *testing.T) map[int]bool {
	t.Helper()
	f, err := os.Open(filepath.Join(repoRoot, "docs", "references.md"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	secs := map[int]bool{}
	anchor, line := 0, 0
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line++
		text := sc.Text()
		if m := sectionAnchor.FindStringSubmatch(text); m != nil {
			anchor, _ = strconv.Atoi(m[1])
			continue
		}
		if m := sectionHeading.FindStringSubmatch(text); m != nil {
			n, _ := strconv.Atoi(m[1])
			if n != anchor {
				t.Errorf("docs/references.md:%d: section %d has anchor s%d above it, want s%d", line, n, anchor, n)
			}
			if n != len(secs)+1 {
				t.Errorf("docs/references.md:%d: section %d follows section %d", line, n, len(secs))
			}
			secs[n] = true
		}
		anchor = 0
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return secs
}

// Every "docs/references.md §N" in the Go sources names a section the page
// has, and no test cites the old notes outside the repository.
func TestReferencesCited(t *testing.T) {
	secs := referenceSections(t)
	if len(secs) < 15 {
		t.Fatalf("docs/references.md has %d sections, want at least 15", len(secs))
	}
	cited := 0
	err := filepath.WalkDir(repoRoot, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && strings.HasPrefix(d.Name(), ".") && path != repoRoot {
			return filepath.SkipDir
		}
		if d.IsDir() || !strings.HasSuffix(path, ".go") {
			return nil
		}
		data, err := os.ReadFile(path)
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(repoRoot, path)
		self := filepath.Join("internal", "reftool", "references_test.go") // names the old notes in its pattern
		for i, text := range strings.Split(string(data), "\n") {
			for _, m := range citation.FindAllStringSubmatch(text, -1) {
				for _, s := range sectionNum.FindAllStringSubmatch(m[1], -1) {
					n, _ := strconv.Atoi(s[1])
					cited++
					if !secs[n] {
						t.Errorf("%s:%d: cites docs/references.md §%d, which the page lacks", rel, i+1, n)
					}
				}
			}
			if strings.HasSuffix(path, "_test.go") && rel != self && outsideNotes.MatchString(text) {
				t.Errorf("%s:%d: cites notes outside the repository; cite docs/references.md §N", rel, i+1)
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	// The tests cite the page about a hundred times; far fewer means the
	// pattern above stopped matching, not that the citations went away.
	if cited < 50 {
		t.Errorf("found %d citations of docs/references.md, want at least 50", cited)
	}
}
