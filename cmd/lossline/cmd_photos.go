package main

import (
	"github.com/spf13/cobra"

	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newPhotosCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "photos SURVEY",
		Short: "List every file of the photos folder and where it is placed",
		Long: "Prints, for every file under SURVEY/photos: time taken, latitude, longitude, orientation,\n" +
			"the CML, component or asset it is placed on, the distance, and the basis; or why it was skipped.",
		Example: "  lossline photos site-2026 --placement-radius-m 10",
		Args:    cobra.ExactArgs(1),
		RunE:    runPhotos,
	}
	c.Flags().Bool("csv", false, "print CSV instead of an aligned table")
	c.Flags().StringSlice("previous", nil, "earlier survey `DIR`s whose readings merge in")
	addSettingFlags(c)
	return c
}

func runPhotos(c *cobra.Command, args []string) error {
	dir := survey.FolderOf(args[0])
	set, err := loadSettings(c, dir)
	if err != nil {
		return err
	}
	previous, _ := c.Flags().GetStringSlice("previous")
	s, problems := survey.LoadSeries(dir, previous, set.Read)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	asCSV, _ := c.Flags().GetBool("csv")
	out, err := report.PhotoList(s, asCSV)
	if err != nil {
		return err
	}
	_, err = c.OutOrStdout().Write(out)
	return err
}
