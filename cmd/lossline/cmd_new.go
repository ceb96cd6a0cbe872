package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"time"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/templates"
)

func newNewCmd() *cobra.Command {
	c := &cobra.Command{
		Use:     "new DIR",
		Short:   "Write a ready-to-fill survey folder",
		Long:    "Creates DIR with survey.md, lossline.yaml and an empty photos folder. Existing files are never overwritten.",
		Example: "  lossline new site-2027",
		Args:    cobra.ExactArgs(1),
		RunE:    runNew,
	}
	c.Flags().String("templates", "", "`folder` whose scaffold/ files replace the built-in ones")
	return c
}

func runNew(c *cobra.Command, args []string) error {
	dir := args[0]
	tmplDir, _ := c.Flags().GetString("templates")
	set := templates.Set{Override: tmplDir}
	for _, name := range templates.Scaffold {
		if _, err := os.Stat(filepath.Join(dir, name)); err == nil {
			return badInput{fmt.Errorf("%s already exists: lossline new never overwrites a survey", filepath.Join(dir, name))}
		} else if !errors.Is(err, fs.ErrNotExist) {
			return err
		}
	}
	if err := os.MkdirAll(filepath.Join(dir, survey.PhotoDir), 0o755); err != nil {
		return err
	}
	data := map[string]string{"Title": filepath.Base(filepath.Clean(dir)), "Date": time.Now().Format("2006-01-02")}
	w := c.OutOrStdout()
	for _, name := range templates.Scaffold {
		text, err := set.Execute("scaffold/"+name, data)
		if err != nil {
			return badInput{err}
		}
		path := filepath.Join(dir, name)
		f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
		if err != nil {
			return err
		}
		if _, err := f.WriteString(text); err != nil {
			f.Close()
			return err
		}
		if err := f.Close(); err != nil {
			return err
		}
		fmt.Fprintf(w, "wrote %s\n", path)
	}
	fmt.Fprintf(w, "put photos in %s, fill in survey.md, then run: lossline check %s\n", filepath.Join(dir, survey.PhotoDir), dir)
	return nil
}
