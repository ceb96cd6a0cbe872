package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime/debug"
	"time"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
	"github.com/lossline/lossline/templates"
)

func newReportCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "report SURVEY",
		Short: "Write report.pdf, results.json and results.csv for a survey folder",
		Long: "Reads SURVEY/survey.md and SURVEY/photos, computes rates, remaining life and dates,\n" +
			"and writes OUTDIR/report.pdf, results.json, results.csv and locations.geojson;\n" +
			"with --detail assets also OUTDIR/detail-<asset>.pdf, with --photos separate OUTDIR/photos.pdf.\n" +
			"Above full-detail-max-cmls CMLs or full-detail-max-components components report.pdf\n" +
			"is summary-first; every CML stays in results.json and results.csv.\n" +
			"OUTDIR is replaced whole, in one rename, once every output is written; a second run\n" +
			"writing the same OUTDIR waits for the first. OUTDIR may not be the survey folder, lie in\n" +
			"its photos folder or an earlier survey folder, or hold files lossline did not write.\n" +
			"Input files are never changed.",
		Example: "  lossline report site-2026 -o site-2026/report --previous site-2022\n" +
			"  lossline report refinery -o refinery/report --detail assets --photos separate",
		Args: cobra.ExactArgs(1),
		RunE: runReport,
	}
	c.Flags().StringP("out", "o", "", "output `OUTDIR` (default SURVEY/report)")
	c.Flags().Bool("no-photo-cache", false, "reduce every photo again instead of reusing the cache in the user cache folder")
	c.Flags().StringSlice("previous", nil, "earlier survey `DIR`s whose readings merge in (besides the front matter's previous:)")
	c.Flags().String("detail", "", "`assets`: also write one detail PDF per asset (detail-<asset>.pdf), every component in full")
	c.Flags().String("photos", "inline", "`where` the photos go: inline (in report.pdf) or separate (in photos.pdf of their own, for e-mail)")
	addSettingFlags(c)
	return c
}

func runReport(c *cobra.Command, args []string) error {
	if os.Getenv("GOGC") == "" {
		// The survey and its findings stay live (about 1.6 KB a CML) while
		// the outputs are rendered item by item; collecting at half the live
		// heap again instead of the whole keeps the peak of a 300k-CML report
		// under 1 GB for about a quarter more CPU time in collection.
		defer debug.SetGCPercent(debug.SetGCPercent(50))
	}
	dir := survey.FolderOf(args[0])
	out, _ := c.Flags().GetString("out")
	if out == "" {
		out = filepath.Join(dir, "report")
	}
	set, err := loadSettings(c, dir)
	if err != nil {
		return err
	}
	if set.Templates, err = templates.Open(set.Templates.Override, templateRoots(c, dir)...); err != nil {
		return badInput{err}
	}
	previous, _ := c.Flags().GetStringSlice("previous")
	s, problems := survey.LoadSeries(dir, previous, set.Read)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	detail, _ := c.Flags().GetString("detail")
	photosWhere, _ := c.Flags().GetString("photos")
	if detail != "" && detail != "assets" {
		return badInput{fmt.Errorf("--detail %q: the only detail is assets", detail)}
	}
	if photosWhere != "inline" && photosWhere != "separate" {
		return badInput{fmt.Errorf("--photos %q: inline or separate", photosWhere)}
	}
	if err := report.CheckOutput(out, s); err != nil {
		return outputError(err)
	}
	if err := checkFailureCosts([]*survey.Survey{s}, set); err != nil {
		return err
	}
	stderr := c.ErrOrStderr()
	for _, p := range problems {
		fmt.Fprintln(stderr, p)
	}
	f := findings.Compute(s, set.findings())
	photos := set.Photos
	photos.Progress = progressBar(stderr, "photos")
	files, warnings := report.Streams(f, report.Options{
		Display: set.Display, Place: set.Read.Place, Photos: photos, Templates: set.Templates, Created: time.Now(), Version: version,
		Settings: set.Listing, Limits: set.Limits, Detail: detail == "assets", PhotosApart: photosWhere == "separate",
		PreparePhotos: func(srcs []photo.Source, use func(int, photo.Prepared, error)) { photo.Stage(srcs, photos, use) },
	})
	// The outputs are rendered as they are written, under the folder's lock.
	err = report.WriteFolder(out, files, report.WriteOptions{Wait: outputWait, Waiting: func() {
		fmt.Fprintf(stderr, "waiting for another lossline run writing %s\n", out)
	}})
	var tmplErr *templates.Error
	if errors.As(err, &tmplErr) {
		return badInput{err}
	} else if err != nil {
		return outputError(err)
	}
	for _, p := range warnings() {
		fmt.Fprintln(stderr, p)
	}
	below := 0
	for _, it := range f.Items {
		if it.Result.Class == wallloss.AtOrBelowRequired {
			below++
		}
	}
	w := c.OutOrStdout()
	for _, f := range files {
		fmt.Fprintf(w, "wrote %s (%d KB)\n", filepath.Join(out, f.Name), (f.Size+1023)/1024)
	}
	nw := len(problems) + len(warnings())
	fmt.Fprintf(w, "%d %s, %d at or below required thickness, %d %s\n", len(f.Items), plural(len(f.Items), "CML", "CMLs"), below, nw, plural(nw, "warning", "warnings"))
	return nil
}

// outputWait is how long a run waits for another one writing the same
// output folder.
const outputWait = 2 * time.Minute

// outputError makes a refused output folder bad input (exit 1).
func outputError(err error) error {
	var refused *report.OutputRefused
	if errors.As(err, &refused) {
		return badInput{err}
	}
	return err
}

// templateRoots are the folders a templates folder may lie in: the survey
// folder and the folders the user named outside any settings file
// (--templates, the folder of --config, LOSSLINE_TEMPLATES). A settings file
// in a survey folder from elsewhere cannot point the report at other files.
func templateRoots(c *cobra.Command, surveyDir string) []string {
	roots := []string{surveyDir}
	if f := c.Flags().Lookup("templates"); f != nil && f.Changed {
		roots = append(roots, f.Value.String())
	}
	if config := flagString(c, "config"); config != "" {
		roots = append(roots, filepath.Dir(config))
	}
	if env := os.Getenv("LOSSLINE_TEMPLATES"); env != "" {
		roots = append(roots, env)
	}
	return roots
}
