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
const pageHelp = "paper to fit the sheets to, landscape: A4, A3, letter; auto (one sheet when it fits one A3 page at 2.5 mm text, else rows on A3 pages); or none for one long sheet"

// autoPage is --page's default: a sheet that fits one page of autoPaper
// at text 2.5 mm high (pipeline.FitWidths) stays one sheet as wide as its
// drawing; a bigger one (a row of stages, a whole set) flows into rows on
// that paper, so it prints at that text height. A3 landscape takes a row
// of two to four stages at that text height, A4 one or two.
const (
	autoPage  = "auto"
	autoPaper = "A3"
)

// paging is what --page asks for: a paper to cut every sheet onto (page),
// or one to cut a sheet onto only when it does not fit one page of it
// (fit); neither: one sheet.
type paging struct {
	page, fit *render.Paper
}

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
// them: caption and alternative text say which sheet of how many. A view
// drawn on paper takes numbered files, however many pages it filled.
func sheetFiles(sh *pipeline.Sheet, single string, entry note.Sheet) ([]outFile, []note.Sheet) {
	paged := sh.Paper != nil
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
func parsePage(s string) (paging, error) {
	if strings.EqualFold(s, autoPage) {
		p, err := render.ParsePaper(autoPaper)
		return paging{fit: p}, err
	}
	p, err := render.ParsePaper(s)
	if err != nil {
		return paging{}, fmt.Errorf("--page: %w (or auto)", err)
	}
	return paging{page: p}, nil
}

// noteSmallText tells the user of each page that prints its text under
// render.MinTextMM: a stage bigger than the paper holds at that height is
// never cut through, so its page is drawn smaller. The sheets are still
// written; a larger paper or --page none shows the stage at full size.
func noteSmallText(e *env, cmd string, sheets []pipeline.Sheet) {
	for _, sh := range sheets {
		for i, mm := range sh.TextMM {
			if mm < render.MinTextMM-1e-9 && sh.Paper != nil {
				fmt.Fprintf(e.stderr, "%s: note: the %s sheet's page %d of %d prints its text %.2f mm high, under %g mm: a stage on it is bigger than a page of %s at that height (stages are never cut)\n",
					cmd, sh.View, i+1, len(sh.Pages), mm, render.MinTextMM, sh.Paper.Name)
			}
		}
	}
}
