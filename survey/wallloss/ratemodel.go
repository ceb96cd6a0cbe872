package wallloss

import (
	"fmt"
	"strings"
)

// RateModel names how a CML's governing corrosion rate is chosen.
type RateModel string

// Rate models a component or the settings may choose.
const (
	ModelLong  RateModel = "long"  // long-term rate only
	ModelShort RateModel = "short" // short-term rate only
	ModelMax   RateModel = "max"   // the larger of the two (default)
	ModelFit   RateModel = "fit"   // least-squares line through all visits
)

// Single-visit estimates, chosen automatically when a CML has one visit.
const (
	ModelNominal RateModel = "nominal-based" // from nominal at the installed date
	ModelAssumed RateModel = "assumed"       // a rate the engineer wrote down
	ModelISO9224 RateModel = "iso-9224"      // ISO 9223 category and ISO 9224 model
)

// ChoosableRateModels are the models a checklist or the settings may name.
var ChoosableRateModels = []RateModel{ModelLong, ModelShort, ModelMax, ModelFit}

// ParseRateModel reads a model name as written in a checklist or settings
// (case and surrounding spaces ignored).
func ParseRateModel(s string) (RateModel, error) {
	m := RateModel(strings.ToLower(strings.TrimSpace(s)))
	for _, c := range ChoosableRateModels {
		if m == c {
			return m, nil
		}
	}
	names := make([]string, len(ChoosableRateModels))
	for i, c := range ChoosableRateModels {
		names[i] = string(c)
	}
	return "", fmt.Errorf("rate model %q is not one of %s", s, strings.Join(names, ", "))
}

// Describe says what the model does and where it comes from.
func (m RateModel) Describe() string {
	switch m {
	case ModelLong:
		return "long-term rate from the earliest reading (API 570 §7.1.1)"
	case ModelShort:
		return "short-term rate from the previous reading (API 570 §7.1.1)"
	case ModelFit:
		return "least-squares line through all visits (three or more), remaining life also at the rate's one-sided 95 % upper bound (Student t)"
	case ModelNominal:
		return "long-term rate from nominal thickness at the installed date (single-visit estimate)"
	case ModelAssumed:
		return "a rate written by the engineer (single-visit estimate)"
	case ModelCoupon:
		return "the largest mass-loss coupon rate on the component (ASTM G1 / G31)"
	case ModelProbe:
		return "the largest electrical-resistance or linear-polarisation probe rate on the component"
	case ModelISO9224:
		return "ISO 9223 first-year rate of the corrosivity category with the ISO 9224 long-term model (single-visit estimate)"
	}
	return "the larger of long- and short-term rate (API 570 §7.1.1; the conservative choice)"
}
