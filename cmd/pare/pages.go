package main

import (
	"fmt"
	"io"
	"strings"

	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/internal/outfile"
	"pare/render"
)

// pageHelp is the --page flag's help, the same on every command that draws.
const pageHelp = "paper to fit the sheets to, landscape: A4, A3, letter, or none for one long sheet"

// Without --page a view is one file (reduced.svg); on paper it is one file
// per page, numbered from 1 (reduced-1.svg, reduced-2.svg, ...), so the
// names say which sheet is which and a rerun writes the same names.
const (
	pagedReducedSheets = "reduced-*.svg"
	pagedFadedSheets   = "faded-*.svg"
)

// checkOutDir refuses, before any work, an output folder that WriteDir
// would refuse: a file, a link to nothing, a folder holding files pare did
// not write, one where a result would overwrite the input netlist. Numbered
// sheets of any count are the job's: a run on other paper may have drawn
// more or fewer.
func checkOutDir(input, dir string) error {
	return outfile.CheckDir(dir, []string{fileReducedNetlist, fileReducedSheet, fileFadedSheet, fileNote, fileNoteHTML,
		pagedReducedSheets, pagedFadedSheets}, input)
}

// pageFile is the file of page n (from 1) of a view's sheet.
func pageFile(single string, n int, paged bool) string {
	if !paged {
		return single
	}
	return fmt.Sprintf("%s-%d.svg", strings.TrimSuffix(single, ".svg"), n)
}

// sheetFiles are the files of a drawn view and the note's entries for
// them: caption and alternative text say which sheet of how many.
func sheetFiles(sh *pipeline.Sheet, single string, paged bool, entry note.Sheet) ([]outFile, []note.Sheet) {
	var files []outFile
	var entries []note.Sheet
	for i, svg := range sh.Pages {
		e := entry
		e.File = pageFile(single, i+1, paged)
		if len(sh.Pages) > 1 {
			of := fmt.Sprintf(" (sheet %d of %d)", i+1, len(sh.Pages))
			e.Alt += of
			e.Caption = strings.TrimSuffix(e.Caption, ".") + of + "."
		}
		files = append(files, outFile{e.File, svg})
		entries = append(entries, e)
	}
	return files, entries
}

// writePages writes a paged drawing of pare draw: OUT-1.svg, OUT-2.svg, ...
// beside OUT.svg's place; standard output takes a drawing of one page only.
func writePages(e *env, out, input string, pages [][]byte) error {
	if out == "-" {
		if len(pages) != 1 {
			return fmt.Errorf("the sheet takes %d pages: give -o FILE.svg (writes FILE-1.svg ...), or --page none", len(pages))
		}
		_, err := e.stdout.Write(pages[0])
		return err
	}
	for i, p := range pages {
		name := pageFile(out, i+1, true)
		if err := writeOutput(e, name, func(w io.Writer) error { _, err := w.Write(p); return err }, input); err != nil {
			return fmt.Errorf("%s: %w", name, err)
		}
	}
	return nil
}

// parsePage reads --page.
func parsePage(s string) (*render.Paper, error) {
	p, err := render.ParsePaper(s)
	if err != nil {
		return nil, fmt.Errorf("--page: %w", err)
	}
	return p, nil
}
