package survey

import (
	"slices"
	"time"
)

// checkSignOrder warns when sig is dated before a signature of an earlier
// role (reviewed before prepared, approved before reviewed): a slip in a date
// the report prints on its cover.
func checkSignOrder(r *checklistReader, before []Signature, sig Signature, line int) {
	if sig.Date == nil {
		return
	}
	rank := slices.Index(SignOffRoles, sig.Role)
	for _, o := range before {
		if o.Date != nil && slices.Index(SignOffRoles, o.Role) < rank && sig.Date.Before(*o.Date) {
			r.problems.Warnf(r.file, line, "sign-off: %s on %s, before it was %s on %s: check the dates", sig.Role, sig.Date.Format(time.DateOnly), o.Role, o.Date.Format(time.DateOnly))
			return
		}
	}
}

// checkRevisionDate refuses a revision dated before the survey and warns at
// one dated before the revision listed above it.
func checkRevisionDate(r *checklistReader, before []Revision, rev Revision, line int) {
	if d := r.survey.Date; !d.IsZero() && rev.Date.Before(d) {
		r.problems.Errorf(r.file, line, "revisions: revision %s on %s, before the survey date %s", rev.Revision, rev.Date.Format(time.DateOnly), d.Format(time.DateOnly))
		return
	}
	if n := len(before); n > 0 && !before[n-1].Date.IsZero() && rev.Date.Before(before[n-1].Date) {
		r.problems.Warnf(r.file, line, "revisions: revision %s on %s, before revision %s above it (%s): list the revisions oldest first, or check the date", rev.Revision, rev.Date.Format(time.DateOnly), before[n-1].Revision, before[n-1].Date.Format(time.DateOnly))
	}
}
