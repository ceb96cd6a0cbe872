package wallloss

// Flag is a stable code a result carries; results.json writes it as is.
type Flag string

// Flags, in the order the methods appendix explains them.
const (
	FlagBelowRequired     Flag = "below-required"
	FlagThicknessIncrease Flag = "thickness-increase"
	FlagSingleVisit       Flag = "single-visit"
	FlagNominalBased      Flag = "nominal-based"
	FlagNoRate            Flag = "no-rate"
	FlagNoRequired        Flag = "no-required"
	FlagNoReadings        Flag = "no-readings"
	FlagNotMeasuredLatest Flag = "not-remeasured"
	FlagOutOfScope        Flag = "out-of-scope"
	FlagNoMeasurableLoss  Flag = "no-measurable-loss"
	FlagAboveNominal      Flag = "above-nominal"
	FlagEstimate          Flag = "estimate"
	FlagFitNeedsThree     Flag = "fit-needs-3-visits"
	FlagRatesDisagree     Flag = "rates-disagree"
)

// AllFlags lists every flag in the order the methods appendix explains them.
var AllFlags = []Flag{FlagBelowRequired, FlagThicknessIncrease, FlagSingleVisit, FlagNominalBased, FlagNoRate, FlagNoRequired,
	FlagNoReadings, FlagNotMeasuredLatest, FlagOutOfScope, FlagNoMeasurableLoss, FlagAboveNominal, FlagEstimate, FlagFitNeedsThree,
	FlagRatesDisagree}

var flagMeanings = map[Flag]string{
	FlagBelowRequired:     "the current thickness is at or below the required thickness; remaining life 0.",
	FlagThicknessIncrease: "a later reading is thicker than an earlier one; that rate is taken as zero. Re-measure.",
	FlagSingleVisit:       "the CML has readings from one visit only.",
	FlagNominalBased:      "the long-term rate starts from nominal thickness at the installed date, not from a measured reading.",
	FlagNoRate:            "no corrosion rate can be computed (one visit and no nominal thickness or installed date).",
	FlagNoRequired:        "the component has no required thickness, so no remaining life.",
	FlagNoReadings:        "the CML row holds no readings.",
	FlagNotMeasuredLatest: "the CML was not measured at the survey's latest visit; its results date from an earlier one.",
	FlagOutOfScope:        "the survey's scope left the CML's asset or component out of its latest visit; its results date from an earlier one.",
	FlagNoMeasurableLoss:  "the loss over the interval is within the gauge tolerance: no measurable loss, no retirement date.",
	FlagAboveNominal:      "a reading is more than the gauge tolerance above nominal: suspect (coating, calibration, location).",
	FlagEstimate:          "the rate is a single-visit estimate (nominal-based, assumed or ISO 9224), not a measured rate.",
	FlagFitNeedsThree:     "the fit model needs three or more visits; the larger of long- and short-term rate was used.",
	FlagRatesDisagree:     "the wall rate and a coupon or probe rate on the component differ by more than a factor of 3 (and by more than 0.025 mm/y): check the coupon's or probe's place and the readings.",
}

// Describe says what the flag means.
func (f Flag) Describe() string { return flagMeanings[f] }
