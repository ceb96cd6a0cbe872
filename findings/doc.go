// Package findings runs the job once for a loaded survey: assess and rank
// every CML, compare each with its previous visit, score risk, and plan
// repairs for a budget. The report and the exports only render its value.
// It reads no files and no clock.
package findings
