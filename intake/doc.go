// Package intake reads thickness readings from files other than survey.md —
// a gauge's CSV or text export, a spreadsheet, a filled field sheet — and
// merges them into a survey's checklist as a visit column.
//
// Reading (Read) turns a file into Readings: per CML and date the values as
// they will be written into survey.md, each checked by the survey's own
// thickness reader. A file has one of three shapes: long (a reading a row),
// wide (a column per visit date, like the checklist's tables) or grid (a
// column per point of one visit). Columns are found by a few header words, or
// named by a Map. Every problem names its place: `readings.csv:14` or
// `readings.xlsx:Sheet1!C14`.
//
// Merging (Plan) finds each CML's reading table in the checklist's source,
// adds or fills the date column and re-pads that table; every other byte of
// the file stays as it was. A date that already holds readings must hold the
// same ones. The change comes back as the new source and a unified diff;
// WriteChecklist writes it, keeping the previous version.
package intake
