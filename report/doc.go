// Package report turns an assessed survey into its outputs: the PDF report,
// results.json, results.csv. Everything is rendered in memory first and then
// written atomically, so a failed run never leaves half a report.
package report
