// Package actions builds a survey's register of actions: what must be done,
// by when, where and why. Some are computed from the assessment (a CML at or
// below its required thickness, the next inspection of each component,
// planned repairs, scope items not done, accelerating CMLs); others the
// inspector writes in the checklist, or carry over from earlier surveys until
// a survey closes them. It reads no files and keeps no clock: the survey date
// is the only "today".
package actions
